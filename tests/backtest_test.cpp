// Tests for tools/backtest.h.
// References: the Brier score's definition (Brier 1950, Monthly Weather Review 78(1) 1-3:
// the mean of (forecast - outcome)^2), worked by hand; the normal 95% quantile
// Phi^-1(0.975) = 1.959963984540054 (REFERENCE_VALUES.md s8); league invariants (4 division
// winners, 6 berths and 1 champion in every season of the 16-club backtest league).
#include "tools/backtest.h"

#include <catch2/catch.hpp>
#include <cmath>

#include "models/fit_report.h"
#include "tools/commands.h"

using namespace standfast::tools;

TEST_CASE("Brier score and reliability bins by hand") {
  // Ref: Brier (1950) definition; ((0.7 - 1)^2 + (0.2 - 0)^2 + (0.95 - 1)^2) / 3, by hand:
  // (0.09 + 0.04 + 0.0025) / 3 = 0.044166...; relative 1e-12.
  CHECK(brier_score({0.7, 0.2, 0.95}, {1, 0, 1}) == Approx(0.1325 / 3).epsilon(1e-12));
  const auto bins = reliability_table({0.15, 0.25, 0.2, 0.95, 1.0}, {0, 1, 0, 1, 1});
  REQUIRE(bins.size() == 10);
  CHECK(bins[1].forecasts == 1);
  CHECK(bins[2].forecasts == 2);
  CHECK(bins[9].forecasts == 2);  // 1.0 falls in the last bin
  CHECK(bins[2].mean_forecast == Approx(0.225).epsilon(1e-12));
  CHECK(bins[2].observed == 0.5);
  // Ref: by hand, 0.225 + 1.959963984540054 * sqrt(0.25 * 0.75 + 0.2 * 0.8) / 2 = 0.802668...
  CHECK(bins[2].interval_hi == Approx(0.225 + 1.959963984540054 * std::sqrt(0.3475) / 2));
  CHECK(bins[2].inside);
  CHECK(bins[0].forecasts == 0);
}

TEST_CASE("the calibration test over the table: chi-square on 2 df in closed form") {
  // Two filled deciles: bin 1 {0.15, 0.15} with one success, bin 9 {0.95} with one success.
  // Statistic by hand: (1 - 0.3)^2 / (2 * 0.1275) + (1 - 0.95)^2 / 0.0475 = 1.921569 +
  // 0.052632; chi-square with 2 df has survival exp(-x / 2) (closed form).
  const CalibrationTest t = calibration_test(reliability_table({0.15, 0.15, 0.95}, {1, 0, 1}));
  const double x = 0.49 / 0.255 + 0.0025 / 0.0475;
  CHECK(t.df == 2);
  CHECK(t.chi_square == Approx(x).epsilon(1e-12));
  CHECK(t.p_value == Approx(std::exp(-x / 2)).epsilon(1e-10));
  // Forecasts of exactly 0 or 1 carry no variance and no degree of freedom.
  CHECK(calibration_test(reliability_table({0.0, 1.0}, {0, 1})).df == 0);
}

TEST_CASE("a reduced backtest: league invariants, determinism, bad options") {
  BacktestOptions o;
  o.runs = 6;
  o.seasons = 400;
  o.threads = 1;
  const BacktestResult a = run_backtest(o);
  REQUIRE(a.events.size() == 3);
  // Ref: league invariants (4 of 16 clubs win a division, 6 reach the postseason, 1 wins the
  // title in every season), exact.
  CHECK(a.events[0].observed == Approx(4.0 / 16).epsilon(1e-12));
  CHECK(a.events[1].observed == Approx(6.0 / 16).epsilon(1e-12));
  CHECK(a.events[2].observed == Approx(1.0 / 16).epsilon(1e-12));
  CHECK(a.events[0].mean_forecast == Approx(4.0 / 16).epsilon(1e-9));
  CHECK(a.events[1].mean_forecast == Approx(6.0 / 16).epsilon(1e-9));
  CHECK(a.events[2].mean_forecast == Approx(1.0 / 16).epsilon(1e-9));
  for (const auto& e : a.events) {
    CHECK(e.forecasts == 6u * 16u);
    CHECK(e.brier >= 0.0);
    CHECK(e.brier < 0.25);  // better than always forecasting 1/2
  }
  o.threads = 2;
  CHECK(write_backtest_json(run_backtest(o)) == write_backtest_json(a));
  o.at = 1.5;
  CHECK_THROWS_AS(run_backtest(o), UsageError);
  o.at = 0.5;
  o.runs = 0;
  CHECK_THROWS_AS(run_backtest(o), UsageError);
  o.runs = 6;
  for (const char* bad : {"", "-1", "lots", "20x"}) {
    o.shrink_games = bad;
    CHECK_THROWS_AS(run_backtest(o), UsageError);
  }
  // The fixed weight is what the forecasts used; auto records the mean of its estimates.
  o.shrink_games = "20";
  CHECK(run_backtest(o).mean_shrink_games == 20.0);
  CHECK(a.mean_shrink_games >= standfast::models::AUTO_SHRINK_MIN);
  CHECK(a.mean_shrink_games <= standfast::models::AUTO_SHRINK_MAX);
}
