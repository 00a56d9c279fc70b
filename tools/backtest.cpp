#include "tools/backtest.h"

#include <fmt/core.h>

#include <algorithm>
#include <boost/math/distributions/chi_squared.hpp>
#include <cmath>
#include <cstdlib>
#include <map>
#include <nlohmann/json.hpp>
#include <pcg_random.hpp>
#include <tuple>

#include "config/load.h"
#include "engine/game.h"
#include "engine/plan.h"
#include "engine/simulate.h"
#include "models/ratings.h"
#include "models/score_dist.h"
#include "tools/commands.h"
#include "tools/odds_report.h"
#include "tools/output.h"

namespace standfast::tools {
namespace {

// The invented backtest league: 16 clubs, 2 conferences of 2 divisions of 4. Per club: 8 games
// against each division rival, 4 against each other club of its conference, 2 against each
// club of the other conference (56 games). Per conference 2 division winners and 1 at-large
// club qualify, the best division winner has a bye; conference rounds best of 3 and 5, a final
// best of 7.
constexpr int TEAMS = 16, GAMES_PER_TEAM = 56;
// The truth, as in the demo generator: league mean 4.5 runs, home edge 1.03, Weibull shape 1.8,
// log offence and log defence normal with sd 0.10, centred.
constexpr double LEAGUE_MEAN = 4.5, HOME_EDGE = 1.03, SHAPE = 1.8, STRENGTH_SD = 0.10;
constexpr double Z95 = 1.959963984540054;  // Phi^-1(0.975)

std::string league_yaml(const std::string& shrink_games) {
  std::string s =
      "standfast: 1\n"
      "league: {name: Heronmere Backtest League, season: synthetic, innings: 9,\n"
      "         extra_innings: {runner_on_second: true, max_innings: 0}}\n"
      "teams:\n";
  for (int i = 0; i < TEAMS; ++i)
    s += fmt::format("  - {{id: H{:02d}, name: Heron {:02d}}}\n", i, i);
  s += "groups:\n";
  for (int c = 0; c < 2; ++c) {
    s += fmt::format("  - id: c{}\n    groups:\n", c);
    for (int d = 0; d < 2; ++d) {
      const int first = 8 * c + 4 * d;
      s += fmt::format("      - {{id: c{}d{}, teams: [H{:02d}, H{:02d}, H{:02d}, H{:02d}]}}\n", c,
                       d, first, first + 1, first + 2, first + 3);
    }
  }
  s += "postseason:\n"
       "  format: conference_brackets\n"
       "  qualify: {division_winners: 2, at_large: 1, byes: 1, winners_first: true}\n"
       "  rounds:\n"
       "    - {name: Opening, best_of: 3}\n"
       "    - {name: Conference, best_of: 5}\n"
       "    - {name: Final, best_of: 7}\n"
       "model: {family: weibull, shape: fit, home_edge: fit, shrink_games: ";
  s += shrink_games + "}\n";
  return s;
}

std::uint64_t mix(std::uint64_t x) {  // SplitMix64 finaliser
  x += 0x9e3779b97f4a7c15ULL;
  x = (x ^ (x >> 30)) * 0xbf58476d1ce4e5b9ULL;
  x = (x ^ (x >> 27)) * 0x94d049bb133111ebULL;
  return x ^ (x >> 31);
}

double uniform01(pcg64& rng) { return static_cast<double>(rng() >> 11) * 0x1.0p-53; }

double standard_normal(pcg64& rng) {
  for (;;) {
    const double u = 2.0 * uniform01(rng) - 1.0, v = 2.0 * uniform01(rng) - 1.0;
    const double q = u * u + v * v;
    if (q > 0.0 && q < 1.0) return u * std::sqrt(-2.0 * std::log(q) / q);
  }
}

struct Truth {
  std::vector<double> lo, ld;
};

// One synthetic season: truth, a shuffled schedule over 150 days, and every game's score.
config::Season synthetic_season(const config::Season& base, std::uint64_t seed, Truth& truth) {
  pcg64 rng(mix(seed));
  truth.lo.assign(TEAMS, 0.0);
  truth.ld.assign(TEAMS, 0.0);
  double mo = 0, md = 0;
  for (int i = 0; i < TEAMS; ++i) {
    truth.lo[i] = STRENGTH_SD * standard_normal(rng);
    truth.ld[i] = STRENGTH_SD * standard_normal(rng);
    mo += truth.lo[i] / TEAMS;
    md += truth.ld[i] / TEAMS;
  }
  for (int i = 0; i < TEAMS; ++i) {
    truth.lo[i] -= mo;
    truth.ld[i] -= md;
  }
  std::vector<std::pair<int, int>> games;
  for (int a = 0; a < TEAMS; ++a) {
    for (int b = a + 1; b < TEAMS; ++b) {
      const int per_pair = a / 4 == b / 4 ? 8 : a / 8 == b / 8 ? 4 : 2;
      for (int k = 0; k < per_pair; ++k) games.emplace_back(k % 2 ? a : b, k % 2 ? b : a);
    }
  }
  for (std::size_t k = games.size(); k > 1; --k) std::swap(games[k - 1], games[rng(k)]);
  config::Season s = base;
  s.games.clear();
  const engine::ExtraInnings extras(base.league.regulation_innings, base.league.extra_innings);
  std::map<std::tuple<int, int, int>, int> number;
  for (std::size_t g = 0; g < games.size(); ++g) {
    config::Game game;
    const int day = static_cast<int>(g * 150 / games.size());
    game.date = 20000 + day;
    game.home = games[g].first;
    game.away = games[g].second;
    game.number = ++number[{day, game.home, game.away}];
    const double mh = LEAGUE_MEAN * std::exp(truth.lo[game.home] + truth.ld[game.away]) * HOME_EDGE;
    const double ma = LEAGUE_MEAN * std::exp(truth.lo[game.away] + truth.ld[game.home]);
    game.home_runs = models::sample(models::weibull_for_mean(mh, SHAPE), rng);
    game.away_runs = models::sample(models::weibull_for_mean(ma, SHAPE), rng);
    game.innings = 9;
    if (game.home_runs == game.away_runs) {
      // Extra innings by the law the engine plays (engine/game.h), with the true means: the
      // truth and the model then differ only in what the model must estimate.
      engine::GameResult extra;
      extras.play(rng, mh, ma, extra);
      game.home_runs += extra.home_runs;
      game.away_runs += extra.away_runs;
      // Still tied after the engine's cap of extra innings (chance below 1e-25): the draw's
      // winner gets the run.
      if (game.home_runs == game.away_runs) ++(extra.home_won ? game.home_runs : game.away_runs);
      game.innings = 10;
    }
    game.played = true;
    s.games.push_back(game);
  }
  return s;
}

models::LeagueRatings fixed_ratings(const std::vector<double>& lo, const std::vector<double>& ld,
                                    double home_edge) {
  models::LeagueRatings r;
  r.family = config::ScoreFamily::kWeibull;
  r.league_mean = LEAGUE_MEAN;
  r.shape = SHAPE;
  r.home_edge = home_edge;
  for (std::size_t i = 0; i < lo.size(); ++i) {
    models::TeamRating t;
    t.offence = std::exp(lo[i]);
    t.defence = std::exp(ld[i]);
    r.teams.push_back(t);
  }
  return r;
}

engine::SimulationResult run(const config::Season& s, const models::LeagueRatings& r,
                             std::uint64_t seasons, std::uint64_t seed, int threads) {
  const engine::Plan plan = engine::compile_plan(s, r);
  engine::RunOptions o;
  o.seed = seed;
  o.seasons = seasons;
  o.threads = threads;
  return engine::simulate(plan, o);
}

double chance(const engine::TeamOdds& t, int event) {
  return event == 0 ? t.division.p : event == 1 ? t.postseason.p : t.title.p;
}

}  // namespace

double brier_score(const std::vector<double>& forecast, const std::vector<int>& outcome) {
  if (forecast.empty()) return 0.0;
  double s = 0.0;
  for (std::size_t i = 0; i < forecast.size(); ++i) {
    const double d = forecast[i] - outcome[i];
    s += d * d;
  }
  return s / static_cast<double>(forecast.size());
}

std::vector<ReliabilityBin> reliability_table(const std::vector<double>& forecast,
                                              const std::vector<int>& outcome) {
  std::vector<ReliabilityBin> bins(10);
  std::vector<double> sum_p(10, 0.0), sum_var(10, 0.0), sum_o(10, 0.0);
  for (std::size_t i = 0; i < forecast.size(); ++i) {
    const int b = std::clamp(static_cast<int>(std::floor(forecast[i] * 10.0)), 0, 9);
    ++bins[b].forecasts;
    sum_p[b] += forecast[i];
    sum_var[b] += forecast[i] * (1.0 - forecast[i]);
    sum_o[b] += outcome[i];
  }
  for (int b = 0; b < 10; ++b) {
    ReliabilityBin& r = bins[b];
    r.lo = b / 10.0;
    r.hi = (b + 1) / 10.0;
    if (r.forecasts == 0) continue;
    const double n = static_cast<double>(r.forecasts);
    r.mean_forecast = sum_p[b] / n;
    r.observed = sum_o[b] / n;
    r.variance = sum_var[b];
    const double half = Z95 * std::sqrt(sum_var[b]) / n;
    r.interval_lo = std::max(0.0, r.mean_forecast - half);
    r.interval_hi = std::min(1.0, r.mean_forecast + half);
    r.inside = r.observed >= r.interval_lo - 1e-12 && r.observed <= r.interval_hi + 1e-12;
  }
  return bins;
}

CalibrationTest calibration_test(const std::vector<ReliabilityBin>& bins) {
  CalibrationTest t;
  for (const ReliabilityBin& b : bins) {
    if (!(b.variance > 0.0)) continue;
    const double n = static_cast<double>(b.forecasts);
    const double gap = n * (b.observed - b.mean_forecast);
    t.chi_square += gap * gap / b.variance;
    ++t.df;
  }
  if (t.df > 0)
    t.p_value =
        boost::math::cdf(boost::math::complement(boost::math::chi_squared(t.df), t.chi_square));
  return t;
}

BacktestResult run_backtest(const BacktestOptions& o) {
  if (o.runs < 1 || o.runs > 100000)
    throw UsageError(fmt::format("--runs: expected 1 to 100000, got {}", o.runs));
  if (o.seasons < 100 || o.seasons > 10'000'000)
    throw UsageError(fmt::format("--seasons: expected 100 to 10000000, got {}", o.seasons));
  if (!(o.at > 0.0 && o.at < 1.0))
    throw UsageError(fmt::format("--at: expected a share of the games in (0, 1), got {}", o.at));
  if (o.threads < 0)
    throw UsageError(fmt::format("--threads: expected 0 (all cores) or more, got {}", o.threads));
  if (o.shrink_games != "auto") {
    char* end = nullptr;
    const double k = std::strtod(o.shrink_games.c_str(), &end);
    if (o.shrink_games.empty() || *end != '\0' || !(k >= 0.0 && k <= 1e6))
      throw UsageError(
          fmt::format("--shrink-games: expected `auto` or a number of games from 0 "
                      "to 1000000, got {}",
                      o.shrink_games));
  }
  const config::Season base =
      config::load_season_text(league_yaml(o.shrink_games), "backtest-league.yaml");
  BacktestResult res;
  {
    config::Season check = base;  // refuses options that cannot apply, before any work
    apply_model_options(o.model, check);
    res.family = models::family_name(check.model.family);
    const bool shaped = check.model.family == config::ScoreFamily::kWeibull ||
                        check.model.family == config::ScoreFamily::kNegativeBinomial;
    res.shape = !shaped ? "" : check.model.shape ? fmt::format("{:g}", *check.model.shape) : "fit";
  }
  double shrink_sum = 0.0;
  const std::vector<double> zeros(TEAMS, 0.0);
  const models::LeagueRatings neutral = fixed_ratings(zeros, zeros, 1.0);
  std::vector<double> forecast[3], naive[3];
  std::vector<int> outcome[3];
  for (int r = 0; r < o.runs; ++r) {
    const std::uint64_t key = mix(o.seed ^ mix(static_cast<std::uint64_t>(r)));
    Truth truth;
    const config::Season full = synthetic_season(base, key, truth);
    // The season at the chosen point: later games not yet played.
    config::Season now = full;
    apply_model_options(o.model, now);
    const std::size_t cut = static_cast<std::size_t>(std::floor(o.at * full.games.size()));
    const config::DayNumber cut_day = *full.games[cut].date;
    for (auto& g : now.games) {
      if (*g.date < cut_day) continue;
      g.played = false;
      g.home_runs = g.away_runs = g.innings = 0;
    }
    const models::LeagueRatings fitted = models::fit_ratings(now);
    shrink_sum += fitted.shrink_games;
    const engine::SimulationResult odds = run(now, fitted, o.seasons, mix(key + 1), o.threads);
    // The real end: the generator's scores of the remaining games, then the postseason played
    // with the true strengths.
    const engine::SimulationResult end =
        run(full, fixed_ratings(truth.lo, truth.ld, HOME_EDGE), 1, mix(key + 2), o.threads);
    // Naive: the standings as they are (ties split by the tiebreakers), every postseason game
    // a toss-up between equal clubs.
    config::Season standing = now;
    std::erase_if(standing.games, [](const config::Game& g) { return !g.played; });
    const engine::SimulationResult flat = run(standing, neutral, 2000, mix(key + 3), o.threads);
    for (int t = 0; t < TEAMS; ++t) {
      for (int e = 0; e < 3; ++e) {
        forecast[e].push_back(chance(odds.teams[t], e));
        naive[e].push_back(chance(flat.teams[t], e));
        outcome[e].push_back(chance(end.teams[t], e) > 0.5 ? 1 : 0);
      }
    }
  }
  res.options = o;
  res.teams = TEAMS;
  res.games_per_team = GAMES_PER_TEAM;
  res.mean_shrink_games = shrink_sum / o.runs;
  const char* names[3] = {"division", "postseason", "title"};
  for (int e = 0; e < 3; ++e) {
    EventScore s;
    s.event = names[e];
    s.bins = reliability_table(forecast[e], outcome[e]);
    s.forecasts = forecast[e].size();
    for (std::size_t i = 0; i < forecast[e].size(); ++i) {
      s.mean_forecast += forecast[e][i] / static_cast<double>(s.forecasts);
      s.observed += outcome[e][i] / static_cast<double>(s.forecasts);
    }
    s.brier = brier_score(forecast[e], outcome[e]);
    s.naive_brier = brier_score(naive[e], outcome[e]);
    s.skill = s.naive_brier > 0 ? 1.0 - s.brier / s.naive_brier : 0.0;
    s.calibration = calibration_test(s.bins);
    res.events.push_back(s);
  }
  return res;
}

std::string write_backtest_table(const BacktestResult& r) {
  std::string s = fmt::format(
      "Calibration backtest: {} synthetic seasons of {} clubs ({} games each), odds after {:.0f}% "
      "of the games from {} simulated seasons each, seed {}; forecast model {}{}\nShrinkage of "
      "the forecasts' ratings: {} (mean {:.1f} games)\n{}\n",
      r.options.runs, r.teams, r.games_per_team, 100.0 * r.options.at,
      group_digits(r.options.seasons), r.options.seed, r.family,
      r.shape.empty() ? std::string()
                      : ", shape " + (r.shape == "fit" ? std::string("fitted") : r.shape),
      r.options.shrink_games == "auto" ? "auto, estimated from each season's games"
                                       : r.options.shrink_games + " games",
      r.mean_shrink_games, ODDS_CAUTION);
  for (const EventScore& e : r.events) {
    s += fmt::format(
        "\n{}: Brier {:.4f}, naive forecast from the standings {:.4f}, skill {:+.3f}; {} "
        "forecasts, mean {:.4f}, observed {:.4f}\n  calibration over the table: chi-square "
        "{:.2f} on {} df, p = {:.3f}\n",
        e.event, e.brier, e.naive_brier, e.skill, group_digits(e.forecasts), e.mean_forecast,
        e.observed, e.calibration.chi_square, e.calibration.df, e.calibration.p_value);
    s += fmt::format("  {:<9} {:>7} {:>9} {:>9}  {:<15} {}\n", "forecast", "count", "mean",
                     "observed", "95% if calibrated", "");
    for (const ReliabilityBin& b : e.bins) {
      if (b.forecasts == 0) continue;
      s += fmt::format("  {:.1f}-{:.1f}   {:>7} {:>9.4f} {:>9.4f}  {:.4f}-{:.4f}   {}\n", b.lo,
                       b.hi, b.forecasts, b.mean_forecast, b.observed, b.interval_lo, b.interval_hi,
                       b.inside ? "inside" : (b.observed > b.interval_hi ? "ABOVE" : "BELOW"));
    }
  }
  return s;
}

std::string write_backtest_csv(const BacktestResult& r) {
  std::string s =
      "event,bin_lo,bin_hi,forecasts,mean_forecast,observed,interval_lo,interval_hi,inside,"
      "brier,naive_brier,skill,chi_square,df,p_value,forecast_family,forecast_shape\n";
  for (const EventScore& e : r.events) {
    for (const ReliabilityBin& b : e.bins) {
      s += fmt::format(
          "{},{:.1f},{:.1f},{},{:.6f},{:.6f},{:.6f},{:.6f},{},{:.6f},{:.6f},{:.6f},"
          "{:.4f},{},{:.6f},{},{}\n",
          e.event, b.lo, b.hi, b.forecasts, b.mean_forecast, b.observed, b.interval_lo,
          b.interval_hi, b.inside ? "true" : "false", e.brier, e.naive_brier, e.skill,
          e.calibration.chi_square, e.calibration.df, e.calibration.p_value, r.family, r.shape);
    }
  }
  return s;
}

std::string write_backtest_json(const BacktestResult& r) {
  nlohmann::json j;
  j["schema_version"] = 1;
  j["kind"] = "backtest";
  j["caution"] = std::string(ODDS_CAUTION);
  j["runs"] = r.options.runs;
  j["seasons_per_forecast"] = r.options.seasons;
  j["at"] = r.options.at;
  j["seed"] = r.options.seed;
  j["shrink_games"] = r.options.shrink_games;
  j["mean_shrink_games"] = r.mean_shrink_games;
  j["teams"] = r.teams;
  j["games_per_team"] = r.games_per_team;
  j["forecast_model"] = {
      {"family", r.family},
      {"shape", r.shape.empty() ? nlohmann::json(nullptr) : nlohmann::json(r.shape)}};
  for (const EventScore& e : r.events) {
    nlohmann::json ej{{"event", e.event},
                      {"forecasts", e.forecasts},
                      {"mean_forecast", e.mean_forecast},
                      {"observed", e.observed},
                      {"brier", e.brier},
                      {"naive_brier", e.naive_brier},
                      {"skill", e.skill},
                      {"chi_square", e.calibration.chi_square},
                      {"df", e.calibration.df},
                      {"p_value", e.calibration.p_value}};
    for (const ReliabilityBin& b : e.bins) {
      ej["bins"].push_back({{"lo", b.lo},
                            {"hi", b.hi},
                            {"forecasts", b.forecasts},
                            {"mean_forecast", b.mean_forecast},
                            {"observed", b.observed},
                            {"interval_lo", b.interval_lo},
                            {"interval_hi", b.interval_hi},
                            {"inside", b.inside}});
    }
    j["events"].push_back(ej);
  }
  return j.dump(2) + "\n";
}

}  // namespace standfast::tools
