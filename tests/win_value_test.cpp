// Tests for engine/win_value.h: the value-of-a-win curves.
// Sources:
//   Log5 / Bradley-Terry: REFERENCE_VALUES.md section 5 (Bill James, Baseball Abstract, 1981;
//     Bradley & Terry 1952, Biometrika 39, 324-345): a side of odds a against odds b wins with
//     probability a / (a + b); a shift s of the log-odds moves p to 1 / (1 + (1/p - 1) e^-s).
//   Best-of-3 series: REFERENCE_VALUES.md section 4 (Mosteller 1952, JASA), Boost.Math 1.74
//     ibeta(2, 2, p).
//   Exact enumeration of every outcome of the tiny league's remaining games (below, written
//     independently of the engine, after tests/tiny_league.h) at the shifted win percentage.
//   Variance of a paired difference of 0/1 outcomes: P(Y != X) - (P(Y) - P(X))^2 (common
//     practice; McNemar 1947, Psychometrika 12).
//   The plain odds run (engine/simulate.h) on the same seed: its baseline seasons are the same
//     seasons, so its win histogram must equal the curve's by-wins tallies exactly.
// Monte Carlo checks use a fixed seed and 4-sigma bounds.
#include "engine/win_value.h"

#include <algorithm>
#include <array>
#include <boost/math/special_functions/beta.hpp>
#include <catch2/catch.hpp>
#include <cmath>
#include <iostream>
#include <numeric>
#include <vector>

#include "config/load.h"
#include "models/ratings.h"
#include "tests/tiny_league.h"

using namespace standfast;
using namespace standfast::engine;
using namespace standfast::testing;

namespace {

double shifted_pct(double p, double shift) {
  return 1.0 / (1.0 + (1.0 / p - 1.0) * std::exp(-shift));
}

// Exact chances of the tiny league (8 games left, tests/tiny_league.h) with these win
// percentages: the top two by winning percentage (equal: every priority order equally likely)
// meet in a best-of-3, home edge 1.
Exact enumerate_with(const std::array<double, 4>& pct) {
  Exact e;
  const int base_wins[4] = {2, 2, 3, 1};
  const std::size_t k = LEFT.size();
  for (std::uint32_t mask = 0; mask < (1u << k); ++mask) {
    double prob = 1;
    int wins[4] = {base_wins[0], base_wins[1], base_wins[2], base_wins[3]};
    for (std::size_t g = 0; g < k; ++g) {
      const int h = LEFT[g][0], a = LEFT[g][1];
      const double ph = log5(pct[static_cast<std::size_t>(h)], pct[static_cast<std::size_t>(a)]);
      if (mask >> g & 1) {
        prob *= ph;
        ++wins[h];
      } else {
        prob *= 1 - ph;
        ++wins[a];
      }
    }
    for (int t = 0; t < 4; ++t) e.wins[static_cast<std::size_t>(t)] += prob * wins[t];
    std::array<int, 4> prio = {0, 1, 2, 3};
    do {
      std::array<int, 4> order = {0, 1, 2, 3};
      std::sort(order.begin(), order.end(), [&](int x, int y) {
        return wins[x] != wins[y] ? wins[x] > wins[y] : prio[x] < prio[y];  // 8 games each
      });
      const double w = prob / 24.0;
      const int a = order[0], b = order[1];
      e.post[static_cast<std::size_t>(a)] += w;
      e.post[static_cast<std::size_t>(b)] += w;
      // Ref: Boost.Math 1.74; ibeta(2, 2, p) = P(win a best-of-3) (REFERENCE_VALUES section 4).
      const double pa = boost::math::ibeta(
          2.0, 2.0, log5(pct[static_cast<std::size_t>(a)], pct[static_cast<std::size_t>(b)]));
      e.title[static_cast<std::size_t>(a)] += w * pa;
      e.title[static_cast<std::size_t>(b)] += w * (1 - pa);
    } while (std::next_permutation(prio.begin(), prio.end()));
  }
  return e;
}

}  // namespace

TEST_CASE("on the tiny log5 league the conversion is the log5 closed form") {
  const config::Season s = tiny_league();
  const Plan plan = compile_plan(s, neutral_ratings(s));
  for (int t = 0; t < 4; ++t) {
    // Expected wins over the team's 4 remaining games, by the log5 formula (independent of the
    // engine's code).
    auto expected = [&](double shift) {
      double sum = 0;
      for (const auto& g : LEFT) {
        if (g[0] != t && g[1] != t) continue;
        const int opp = g[0] == t ? g[1] : g[0];
        sum += log5(shifted_pct(PCT[t], shift), PCT[opp]);
      }
      return sum;
    };
    for (double shift : {-2.0, -0.5, 0.0, 0.7, 3.0})
      CHECK(expected_remaining_wins(plan, t, shift) == Approx(expected(shift)).epsilon(1e-12));
    const double e0 = expected(0);
    for (int k = -3; k <= 3; ++k) {
      const double shift = shift_for_wins(plan, t, k);
      INFO("team " << t << " added wins " << k << " shift " << shift);
      // Reachable exactly when 0 <= e0 + k <= 4 games (strictly: an infinite shift is needed
      // at the ends).
      if (e0 + k > 0 && e0 + k < 4) {
        REQUIRE(!std::isnan(shift));
        CHECK(expected(shift) - e0 == Approx(k).margin(1e-9));
      } else {
        CHECK(std::isnan(shift));
      }
    }
  }
}

TEST_CASE("the curve matches exact enumeration on the tiny log5 league") {
  const config::Season s = tiny_league();
  const Plan plan = compile_plan(s, neutral_ratings(s));
  RunOptions opt;
  opt.seed = 20261203;
  opt.seasons = 200000;
  opt.batch = 50000;
  const WinValueResult r = win_value(plan, opt, 2);
  REQUIRE(r.seasons == opt.seasons);
  REQUIRE(r.log_odds);
  const double n = static_cast<double>(r.seasons);
  int checked = 0;
  for (int t = 0; t < 4; ++t) {
    const TeamWinValue& tv = r.teams[static_cast<std::size_t>(t)];
    REQUIRE(tv.points.size() == 5);
    for (const WinPoint& p : tv.points) {
      if (!p.reachable) continue;
      std::array<double, 4> pct = {PCT[0], PCT[1], PCT[2], PCT[3]};
      pct[static_cast<std::size_t>(t)] = shifted_pct(PCT[t], p.shift);
      const Exact e = enumerate_with(pct);
      const auto ts = static_cast<std::size_t>(t);
      const Estimate post = point_estimate(p, 1, r.seasons);
      const Estimate title = point_estimate(p, 3, r.seasons);
      const Estimate wins = point_estimate(p, WIN_VALUE_CHANCES, r.seasons);
      INFO("team " << t << " added wins " << p.added_wins << " postseason " << post.value
                   << " exact " << e.post[ts] << " title " << title.value << " exact "
                   << e.title[ts] << " wins " << wins.value << " exact " << e.wins[ts]);
      CHECK(std::abs(post.value - e.post[ts]) <= 4 * std::sqrt(e.post[ts] * (1 - e.post[ts]) / n));
      CHECK(std::abs(title.value - e.title[ts]) <=
            4 * std::sqrt(e.title[ts] * (1 - e.title[ts]) / n));
      // Final wins lie in [2, 10]: a standard deviation of at most 4.
      CHECK(std::abs(wins.value - e.wins[ts]) <= 4 * 4 / std::sqrt(n));
      ++checked;
    }
  }
  CHECK(checked >= 12);
}

TEST_CASE("curves rise with added strength on common random numbers") {
  // The small league, fitted Weibull. Final wins cannot fall as a team's strength rises: every
  // game keeps its random bits and the score quantiles move the team's way, so the mean wins
  // curve rises season by season (checked exactly). A chance can fall in a season: the tied
  // teams or the postseason opponents change, and with them the draws of the tiebreak and
  // postseason streams. So a step of a chance may go down only by Monte Carlo noise (within 4
  // paired standard errors); such exceptions are counted and printed.
  const config::Season s = config::load_season(STANDFAST_SOURCE_DIR "/scenarios/small/season.yaml");
  const Plan plan = compile_plan(s, models::fit_ratings(s));
  RunOptions opt;
  opt.seed = 99;
  opt.seasons = 4000;
  const WinValueResult r = win_value(plan, opt, 5);
  int steps = 0, dips = 0;
  for (std::size_t t = 0; t < r.teams.size(); ++t) {
    const TeamWinValue& tv = r.teams[t];
    for (std::size_t j = 0; j + 1 < tv.points.size(); ++j) {
      if (!tv.points[j].reachable || !tv.points[j + 1].reachable) continue;
      for (int c = 0; c <= WIN_VALUE_CHANCES; ++c) {
        const PairedChance d =
            joint_change(tv.points[j], tv.points[j + 1], tv.steps[j], c, r.seasons);
        INFO("team " << t << " step " << tv.points[j].added_wins << " chance " << c << " change "
                     << d.diff << " se " << d.se_paired);
        if (c == WIN_VALUE_CHANCES) {
          CHECK(tv.steps[j].wins_diff >= 0);
          CHECK(d.diff > 0);
        } else {
          CHECK(d.diff >= -4 * d.se_paired);
        }
        ++steps;
        dips += d.diff < 0;
      }
    }
  }
  std::cout << "win value curves of the small league: " << dips << " of " << steps
            << " steps fall (within Monte Carlo noise)\n";
  CHECK(steps > 200);
}

TEST_CASE("the baseline tallies by final wins are the plain run's seasons") {
  const config::Season s = config::load_season(STANDFAST_SOURCE_DIR "/scenarios/small/season.yaml");
  const Plan plan = compile_plan(s, models::fit_ratings(s));
  RunOptions opt;
  opt.seed = 5;
  opt.seasons = 1500;
  const SimulationResult plain = simulate(plan, opt);
  opt.threads = 1;
  const WinValueResult one = win_value(plan, opt, 1);
  opt.threads = 2;
  const WinValueResult two = win_value(plan, opt, 1);
  for (std::size_t t = 0; t < one.teams.size(); ++t) {
    const TeamWinValue& tv = one.teams[t];
    const TeamOdds& odds = plain.teams[t];
    for (std::size_t w = 0; w < tv.by_wins.size(); ++w)
      CHECK(tv.by_wins[w] == (w < odds.wins_histogram.size() ? odds.wins_histogram[w] : 0));
    const auto berths = std::accumulate(tv.by_wins_postseason.begin(), tv.by_wins_postseason.end(),
                                        std::uint64_t{0});
    CHECK(static_cast<double>(berths) == Approx(odds.postseason.p * 1500).margin(1e-6));
    // The middle point is the baseline itself.
    CHECK(static_cast<double>(tv.points[1].count[1]) ==
          Approx(odds.postseason.p * 1500).margin(1e-6));
    // The same numbers on any thread count.
    const TeamWinValue& tw = two.teams[t];
    for (std::size_t j = 0; j < tv.points.size(); ++j) {
      CHECK(tv.points[j].wins_sum == tw.points[j].wins_sum);
      for (int c = 0; c < WIN_VALUE_CHANCES; ++c)
        CHECK(tv.points[j].count[c] == tw.points[j].count[c]);
    }
    CHECK(tv.marginal.wins_diff == tw.marginal.wins_diff);
    // The marginal value is the central difference.
    const Estimate m = marginal_value(tv, 1, one.seasons);
    CHECK(m.value == Approx((static_cast<double>(tv.points[2].count[1]) -
                             static_cast<double>(tv.points[0].count[1])) /
                            1500.0 / 2)
                         .margin(1e-12));
  }
}

TEST_CASE("bad options are refused") {
  const config::Season s = tiny_league();
  const Plan plan = compile_plan(s, neutral_ratings(s));
  RunOptions opt;
  opt.seasons = 10;
  CHECK_THROWS_AS(win_value(plan, opt, -1), std::invalid_argument);
  CHECK_THROWS_AS(win_value(plan, opt, 21), std::invalid_argument);
  CHECK_THROWS_AS(shift_for_wins(plan, 4, 1), std::invalid_argument);
  opt.threads = -1;
  CHECK_THROWS_AS(win_value(plan, opt, 2), std::invalid_argument);
}
