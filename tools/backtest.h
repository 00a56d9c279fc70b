// The calibration backtest: synthetic seasons from known true strengths, the odds at a chosen
// point of each, the real end of each season played from the truth, and how well the odds
// matched it: a reliability table by probability decile with 95% intervals, and the Brier score
// (Brier 1950, Monthly Weather Review 78(1) 1-3) with its skill against a naive forecast from
// the standings at that point, for division titles, postseason berths and titles.
#ifndef STANDFAST_TOOLS_BACKTEST_H
#define STANDFAST_TOOLS_BACKTEST_H

#include <cstdint>
#include <string>
#include <vector>

#include "tools/cli.h"

namespace standfast::tools {

struct BacktestOptions {
  int runs = 200;                 // synthetic seasons
  std::uint64_t seasons = 2000;   // simulated seasons behind each forecast
  double at = 0.5;                // share of each season's games played when the odds are made
  std::uint64_t seed = 20260101;  // truth, schedule, scores and simulations all follow from it
  int threads = 0;
  ModelOptions model;  // the forecasts' model (the truth is always the Weibull generator's)
  // The forecasts' model.shrink_games: "auto" (estimated from each season's played games, the
  // default) or a number of games (e.g. "20", the season file's default).
  std::string shrink_games = "auto";
};

struct ReliabilityBin {
  double lo = 0, hi = 0;  // forecasts in [lo, hi) (the last bin includes 1)
  std::uint64_t forecasts = 0;
  double mean_forecast = 0, observed = 0;
  // 95% interval of the observed share if the forecasts are calibrated: mean forecast
  // +- 1.959964 sqrt(sum p (1 - p)) / count (forecasts treated as independent).
  double interval_lo = 0, interval_hi = 0;
  bool inside = true;
  double variance = 0;  // sum p (1 - p) over the bin's forecasts
};

// One test of a whole reliability table: the statistic, its degrees of freedom (the deciles
// that count) and the chance of a statistic at least as large if the forecasts are calibrated.
struct CalibrationTest {
  double chi_square = 0, p_value = 1;
  int df = 0;
};

struct EventScore {
  std::string event;  // "division", "postseason", "title"
  std::vector<ReliabilityBin> bins;
  std::uint64_t forecasts = 0;
  double mean_forecast = 0, observed = 0;
  double brier = 0, naive_brier = 0, skill = 0;  // skill = 1 - brier / naive_brier
  CalibrationTest calibration;                   // of the whole table (calibration_test)
};

struct BacktestResult {
  BacktestOptions options;
  int teams = 0, games_per_team = 0;
  std::string family;  // the forecasts' scoring family
  std::string shape;   // its shape: "fit" (fitted in each synthetic season), a number, or empty
  double mean_shrink_games = 0;  // the prior weight the forecasts used, averaged over the runs
  std::vector<EventScore> events;
};

// Runs the backtest. Throws UsageError (tools/commands.h) for options out of range.
BacktestResult run_backtest(const BacktestOptions& options);

// Mean squared difference between forecasts and 0/1 outcomes (Brier 1950).
double brier_score(const std::vector<double>& forecast, const std::vector<int>& outcome);

// Ten bins of width 0.1 with the calibrated 95% interval of each (see ReliabilityBin).
std::vector<ReliabilityBin> reliability_table(const std::vector<double>& forecast,
                                              const std::vector<int>& outcome);

// Sum over the deciles of (observed - expected count)^2 / sum p(1 - p), chi-square with one
// degree of freedom per decile if the forecasts are calibrated and independent (the test of
// Hosmer and Lemeshow 1980, Communications in Statistics A9(10) 1043-1069, with each decile's
// variance from the forecasts themselves, so no degree of freedom is lost to a fit). Deciles
// whose variance is 0 (empty, or all forecasts 0 or 1) are left out.
CalibrationTest calibration_test(const std::vector<ReliabilityBin>& bins);

std::string write_backtest_table(const BacktestResult& r);
std::string write_backtest_csv(const BacktestResult& r);
std::string write_backtest_json(const BacktestResult& r);

}  // namespace standfast::tools

#endif  // STANDFAST_TOOLS_BACKTEST_H
