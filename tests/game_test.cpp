// Tests for engine/game.h: regulation scores, extra innings and the log5 game.
// Sources:
//   Miller, S. J. (2007), "A derivation of the Pythagorean won-loss formula in baseball",
//     Chance 20(1), 40-48: P(X > Y) = (muX - beta)^g / ((muX - beta)^g + (muY - beta)^g) for
//     independent Weibulls of one shape; REFERENCE_VALUES.md section 2 (Boost 1.74 quadrature and
//     SciPy 1.10.1 quad agree to 8 digits).
//   REFERENCE_VALUES.md section 3: two discretised Weibull scores (alpha 5.0 and 4.5, gamma 1.8)
//     give P(first > second) = 0.48602698, P(tie) = 0.12133295, P(first < second) = 0.39264007
//     (exact sums over score pairs; Boost and SciPy agree).
//   REFERENCE_VALUES.md section 5: log5, P(.60 beats .40) = 9/13.
//   The extra-innings law is our stated model (engine/game.h); its checks use closed-form sums
//   of that law (geometric series), computed here independently of the engine code.
// Monte Carlo checks: fixed seeds, 4-sigma bounds (STYLE.md: at least 4 sigma).
#include "engine/game.h"

#include <catch2/catch.hpp>
#include <cmath>

using namespace standfast;
using namespace standfast::engine;

namespace {

Plan weibull_plan(double shape, bool runner = false, int cap = 0) {
  Plan p;
  p.model = GameModel::kWeibull;
  p.shape = shape;
  p.regulation_innings = 9;
  p.extra_innings.runner_on_second = runner;
  p.extra_innings.max_innings = cap;
  return p;
}

void check_share(double observed, double p, double n) {
  const double se = std::sqrt(p * (1 - p) / n);
  INFO("observed " << observed << " expected " << p << " se " << se);
  CHECK(std::abs(observed - p) <= 4 * se);
}

}  // namespace

TEST_CASE("continuous Weibull scores from the engine's quantile table follow Miller's formula") {
  const double gamma = 1.83, beta = -0.5;
  const WeibullTable table(gamma);
  struct Row {
    double mu_x, mu_y, alpha_x, alpha_y, p;
  };
  // Ref: REFERENCE_VALUES.md section 2 rows 1-2; alpha = (mu - beta) / Gamma(1 + 1/g);
  // P(X > Y) = 0.57142062 and 0.44142770.
  const Row rows[] = {{5.0, 4.2, 6.18941536, 5.28913676, 0.57142062},
                      {4.6, 5.3, 5.73927606, 6.52701983, 0.44142770}};
  int seed = 0;
  for (const Row& r : rows) {
    const double closed = std::pow(r.mu_x - beta, gamma) /
                          (std::pow(r.mu_x - beta, gamma) + std::pow(r.mu_y - beta, gamma));
    REQUIRE(closed == Approx(r.p).epsilon(1e-7));
    Rng rng = make_stream(77, static_cast<std::uint64_t>(seed++), Purpose::kGames);
    const int n = 1000000;
    int wins = 0;
    for (int i = 0; i < n; ++i) {
      const std::uint64_t bits = rng();
      const double x = r.alpha_x * table.quantile(static_cast<std::uint32_t>(bits >> 32)) + beta;
      const double y = r.alpha_y * table.quantile(static_cast<std::uint32_t>(bits)) + beta;
      wins += x > y;
    }
    check_share(wins / double(n), r.p, n);
  }
}

TEST_CASE("discretised games: regulation outcomes match the exact sums over score pairs") {
  const GameEngine engine(weibull_plan(1.8));
  // Ref: REFERENCE_VALUES.md section 3; means of the discretised scores with alpha 5.0 and 4.5
  // (gamma 1.8): 3.94685430 and 3.50230017 (SciPy 1.10.1 / NumPy 1.24.2;
  // np.sum(np.exp(-(np.arange(1,400)/4.5)**1.8))).
  const double mean_home = 3.94685430, mean_away = 3.502300170349888;
  const Sides sides = engine.sides(mean_home, mean_away);
  Rng rng = make_stream(5, 0, Purpose::kGames);
  const int n = 1000000;
  int home_ahead = 0, tied = 0, away_ahead = 0, home_wins = 0;
  for (int i = 0; i < n; ++i) {
    const GameResult r = engine.play(rng, sides);
    if (r.extra)
      ++tied;
    else if (r.home_won)
      ++home_ahead;
    else
      ++away_ahead;
    home_wins += r.home_won;
    REQUIRE(r.home_runs != r.away_runs);  // no cap: every game is decided
  }
  // Ref: REFERENCE_VALUES.md section 3 tie check; 0.48602698, 0.12133295, 0.39264007.
  check_share(home_ahead / double(n), 0.48602698, n);
  check_share(tied / double(n), 0.12133295, n);
  check_share(away_ahead / double(n), 0.39264007, n);
  // Plausibility (common practice, from memory: under about a tenth of real games go to extra
  // innings; a model of final scores ties a little more often): the share stays below 0.15.
  CHECK(tied / double(n) < 0.15);
  // The better side also wins more than half of the extra-inning games, so its total share lies
  // between its regulation share and regulation share + all ties.
  CHECK(home_wins / double(n) > 0.48602698 + 0.5 * 0.12133295 - 0.005);
}

TEST_CASE("extra innings: the home side stops batting once it leads") {
  const GameEngine engine(weibull_plan(1.83));
  Rng rng = make_stream(6, 0, Purpose::kGames);
  int extra_home_wins = 0;
  for (int i = 0; i < 200000; ++i) {
    const GameResult r = engine.play(rng, engine.sides(4.5, 4.5));
    if (r.extra && r.home_won) {
      ++extra_home_wins;
      REQUIRE(r.home_runs - r.away_runs == 1);  // a walk-off ends at the winning run
    }
  }
  CHECK(extra_home_wins > 1000);
}

TEST_CASE("extra innings: drawn share at a 10-inning cap matches the stated per-inning law") {
  // Closed form of engine/game.h's law: one extra inning; the visitors score k with
  // P(0) = 1 - s_a, P(k) = s_a (1-q) q^(k-1); the home side ties only by scoring exactly k.
  // P(draw) = (1 - s_a)(1 - s_h) + sum_k s_a s_h (1-q)^2 q^(2k-2)
  //         = (1 - s_a)(1 - s_h) + s_a s_h (1-q)^2 / (1 - q^2).
  for (bool runner : {false, true}) {
    const ExtraInnings rule(9, config::ExtraInningsRule{runner, 10});
    const double q = ExtraInnings::RUN_CONTINUATION;
    const double mean_h = 4.8, mean_a = 4.1;
    const double factor = runner ? ExtraInnings::RUNNER_FACTOR : 1.0;
    const double s_h = mean_h / 9 * (1 - q) * factor, s_a = mean_a / 9 * (1 - q) * factor;
    const double p_draw = (1 - s_a) * (1 - s_h) + s_a * s_h * (1 - q) * (1 - q) / (1 - q * q);
    Rng rng = make_stream(9, runner, Purpose::kGames);
    const int n = 400000;
    int drawn = 0;
    for (int i = 0; i < n; ++i) {
      GameResult r;
      rule.play(rng, mean_h, mean_a, r);
      drawn += r.drawn;
    }
    check_share(drawn / double(n), p_draw, n);
  }
}

TEST_CASE("extra innings: runs of a scoring half-inning average 1/(1-q)") {
  // Closed form: a zero-truncated geometric with continuation q has mean 1/(1-q) and
  // variance q/(1-q)^2; 4-sigma bound on the sample mean.
  Rng rng = make_stream(10, 0, Purpose::kGames);
  const int n = 400000;
  double sum = 0;
  int scoring = 0;
  for (int i = 0; i < n; ++i) {
    const int runs = ExtraInnings::half_inning(rng, 1.0, 1 << 30);
    REQUIRE(runs >= 1);
    sum += runs;
    ++scoring;
  }
  const double q = ExtraInnings::RUN_CONTINUATION;
  const double sd = std::sqrt(q) / (1 - q);
  CHECK(std::abs(sum / scoring - 1 / (1 - q)) <= 4 * sd / std::sqrt(double(scoring)));
}

TEST_CASE("log5 games: the home side wins with the log5 probability") {
  Rng rng = make_stream(11, 0, Purpose::kGames);
  const int n = 400000;
  int wins = 0;
  // Ref: REFERENCE_VALUES.md section 5; log5(0.60, 0.40) = 9/13 = 0.69230769.
  const double p = 9.0 / 13.0;
  Plan plan;
  plan.model = GameModel::kLog5;
  const GameEngine engine(plan);
  // Odds 1.5 (a .600 side) against 2/3 (a .400 side): log5 = 1.5 / (1.5 + 2/3) = 9/13.
  const Sides sides = engine.sides(4.5, 4.5, 1.5, 2.0 / 3.0);
  REQUIRE(sides.home == Approx(p).epsilon(1e-12));
  for (int i = 0; i < n; ++i) wins += engine.play(rng, sides).home_won;
  check_share(wins / double(n), p, n);
}

TEST_CASE("extra innings end in bounded time even when neither side can score") {
  // A side that cannot score (mean 1e-300, as a venue factor of 1e-300 once gave) still gets
  // the floor S_MIN; with both chances forced to 0 every game stays tied and must be settled
  // by the draw after MAX_EXTRA_INNINGS, with no league cap and in the postseason alike.
  // Ref: the bound is our stated rule (engine/game.h); the zero-chance case follows from it.
  const ExtraInnings rule(9, config::ExtraInningsRule{false, 0});
  CHECK(rule.scoring_chance(1e-300) == ExtraInnings::S_MIN);
  CHECK(rule.scoring_chance(0.0) == ExtraInnings::S_MIN);
  Sides dead;
  dead.home_chance = 0.0;
  dead.away_chance = 0.0;
  constexpr std::size_t N = 64;
  std::uint32_t open[N];
  ExtraInnings::Outcome out[N];
  for (const bool cap : {true, false}) {
    Rng rng = make_stream(12, cap, Purpose::kGames);
    const std::size_t drawn = rule.play_all(
        rng, N, [&](std::size_t) -> const Sides& { return dead; }, open, out, cap);
    CHECK(drawn == N);
    for (const auto& o : out) CHECK(o.home_runs + o.away_runs == 0);
  }
  // A league cap above the hard bound is honoured as it is.
  const ExtraInnings long_cap(9, config::ExtraInningsRule{false, 300});
  Rng rng = make_stream(13, 0, Purpose::kGames);
  CHECK(long_cap.play_all(
            rng, N, [&](std::size_t) -> const Sides& { return dead; }, open, out, true) == N);
}
