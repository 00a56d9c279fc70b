// Tests for engine/compare.h: scenarios on common random numbers, with paired standard errors.
// Sources:
//   Log5 / Bradley-Terry: REFERENCE_VALUES.md section 5 (Bill James, Baseball Abstract, 1981;
//     Bradley & Terry 1952, Biometrika 39, 324-345).
//   Best-of-3 series: REFERENCE_VALUES.md section 4 (Mosteller 1952, JASA), Boost.Math 1.74
//     ibeta(2, 2, p).
//   Exact enumeration of every outcome of the remaining games of a tiny league under each
//     scenario's condition, written here independently of the engine.
//   Variance of a paired difference of 0/1 outcomes: Var(Y - X) = P(Y != X) - (P(Y) - P(X))^2
//     (common practice; any textbook on paired proportions, e.g. McNemar 1947, Psychometrika 12).
// Monte Carlo checks use a fixed seed and 4-sigma bounds.
#include "engine/compare.h"

#include <algorithm>
#include <array>
#include <boost/math/special_functions/beta.hpp>
#include <catch2/catch.hpp>
#include <cmath>
#include <iostream>
#include <vector>

#include "config/load.h"
#include "models/ratings.h"
#include "tests/tiny_league.h"

using namespace standfast;
using namespace standfast::engine;
using namespace standfast::testing;

namespace {

// Every chance of the alternative within 4 standard errors of the exact value.
void check_exact(const AlternativeResult& alt, const Exact& e, double n) {
  for (std::size_t t = 0; t < 4; ++t) {
    const auto& c = alt.teams[t];
    INFO("team " << t << " postseason " << c.postseason.alt << " exact " << e.post[t] << " title "
                 << c.title.alt << " exact " << e.title[t] << " wins " << c.wins.alt << " exact "
                 << e.wins[t]);
    CHECK(std::abs(c.postseason.alt - e.post[t]) <= 4 * std::sqrt(e.post[t] * (1 - e.post[t]) / n));
    CHECK(std::abs(c.title.alt - e.title[t]) <= 4 * std::sqrt(e.title[t] * (1 - e.title[t]) / n));
    // Final wins lie in [2, 10]: a standard deviation of at most 4.
    CHECK(std::abs(c.wins.alt - e.wins[t]) <= 4 * 4 / std::sqrt(n));
  }
}

}  // namespace

TEST_CASE("a scenario that changes nothing differs by exactly zero") {
  const config::Season s = tiny_league();
  const Plan base = compile_plan(s, neutral_ratings(s));
  const Plan same = compile_plan(s, neutral_ratings(s), PlanEdits{});
  RunOptions opt;
  opt.seed = 11;
  opt.seasons = 5000;
  const Plan* alts[] = {&same};
  const Comparison c = compare_plans(base, alts, opt);
  REQUIRE(c.alternatives.size() == 1);
  for (const auto& t : c.alternatives[0].teams) {
    for (const PairedChance* p : {&t.division, &t.postseason, &t.bye, &t.title, &t.wins}) {
      CHECK(p->diff == 0.0);
      CHECK(p->se_paired == 0.0);
      CHECK(p->base == p->alt);
    }
    CHECK(t.postseason.se_unpaired > 0);
  }
}

TEST_CASE("forced, removed and added games match exact enumeration under that condition") {
  const config::Season s = tiny_league();
  const Plan base = compile_plan(s, neutral_ratings(s));
  // Game 8 of the season (A at home to B, the first game left) forced: A wins; then B wins.
  PlanEdits a_wins, b_wins, removed;
  a_wins.forced = {{8, true}};
  b_wins.forced = {{8, false}};
  // Game 13 (B at home to D) removed.
  removed.removed = {13};
  const Plan plan_a = compile_plan(s, neutral_ratings(s), a_wins);
  const Plan plan_b = compile_plan(s, neutral_ratings(s), b_wins);
  const Plan plan_removed = compile_plan(s, neutral_ratings(s), removed);
  // An added game: D at home to A on day 12, drawn after every other game.
  config::Season with_added = s;
  with_added.games.push_back(game(12, 3, 0));
  PlanEdits added;
  added.added_from = static_cast<int>(with_added.games.size()) - 1;
  const Plan plan_added = compile_plan(with_added, neutral_ratings(with_added), added);
  REQUIRE(plan_added.remaining_games() == 9);
  CHECK(plan_added.chronological[2] == 8);  // by date, after the two games of days 11 and 12

  RunOptions opt;
  opt.seed = 20261202;
  opt.seasons = 100000;
  opt.batch = 25000;
  const Plan* alts[] = {&plan_a, &plan_b, &plan_removed, &plan_added};
  const Comparison c = compare_plans(base, alts, opt);
  const double n = static_cast<double>(opt.seasons);

  // The baseline against the unconditional enumeration.
  const Exact plain = enumerate(LEFT, std::vector<int>(8, 0));
  for (std::size_t t = 0; t < 4; ++t)
    CHECK(std::abs(c.baseline.teams[t].postseason.p - plain.post[t]) <=
          4 * std::sqrt(plain.post[t] * (1 - plain.post[t]) / n));
  std::vector<int> home(8, 0), away(8, 0);
  home[0] = 1;
  away[0] = -1;
  check_exact(c.alternatives[0], enumerate(LEFT, home), n);
  check_exact(c.alternatives[1], enumerate(LEFT, away), n);
  auto fewer = LEFT;
  fewer.erase(fewer.begin() + 5);  // game 13 is the sixth game left
  check_exact(c.alternatives[2], enumerate(fewer, std::vector<int>(7, 0)), n);
  auto more = LEFT;
  more.push_back({3, 0});
  check_exact(c.alternatives[3], enumerate(more, std::vector<int>(9, 0)), n);

  // A forced win changes A's wins by exactly +1 or 0 in every season: the paired error of the
  // wins difference is that of a 0/1 variable, far below the unpaired one.
  const auto& wa = c.alternatives[0].teams[0].wins;
  CHECK(wa.diff == Approx(1 - log5(0.60, 0.45)).margin(4 * 0.5 / std::sqrt(n)));
  CHECK(wa.se_paired < wa.se_unpaired / 2);
  // Every season with A winning game 8 under the baseline is the same season under the forced
  // scenario: A's postseason chance cannot fall (paired outcomes only move up).
  CHECK(c.alternatives[0].teams[0].postseason.diff > 0);
}

TEST_CASE("paired errors come from the joint counts") {
  // Ref: Var(Y - X) = P(Y != X) - (P(Y) - P(X))^2 for 0/1 outcomes (common practice). 1000
  // seasons: baseline 400, alternative 450, 100 alternative-only and 50 baseline-only:
  // diff 0.05, var = 0.15 - 0.0025 = 0.1475, se = sqrt(0.1475 / 1000) = 0.012145;
  // unpaired sqrt((0.24 + 0.2475) / 1000) = 0.022079.
  const PairedChance p = paired_chance(400, 450, 50, 100, 1000);
  CHECK(p.diff == Approx(0.05));
  CHECK(p.se_paired == Approx(0.0121449578));
  CHECK(p.se_unpaired == Approx(0.0220794022));
}

TEST_CASE("on the demo league the paired error is far below the unpaired one") {
  // The demo league (invented data, a realistic league, not a reference): one team adds 0.25
  // runs per game from now on. The issue asks for a paired error at least 5 times smaller than
  // the unpaired one; measured and printed here for mean wins and for the chances.
  const config::Season base =
      config::load_season(STANDFAST_SOURCE_DIR "/scenarios/demo/season.yaml");
  const models::LeagueRatings ratings = models::fit_ratings(base);
  config::Season s = base;
  config::TeamOverride o;
  o.team = 4;
  o.add_runs_scored = 0.25;
  s.overrides.push_back(o);
  const Plan p0 = compile_plan(base, ratings);
  const Plan p1 = compile_plan(s, ratings);
  RunOptions opt;
  opt.seed = 9;
  opt.seasons = 5000;
  const Plan* alts[] = {&p1};
  const Comparison c = compare_plans(p0, alts, opt);
  const TeamComparison& t = c.alternatives[0].teams[4];
  auto ratio = [](const PairedChance& x) { return x.se_unpaired / std::max(x.se_paired, 1e-300); };
  std::cout << "demo league, team " << base.teams[4].id << " +0.25 runs scored per game, "
            << opt.seasons << " seasons: unpaired / paired standard error: mean wins "
            << ratio(t.wins) << ", division " << ratio(t.division) << ", postseason "
            << ratio(t.postseason) << ", title " << ratio(t.title) << "\n";
  CHECK(t.wins.diff > 0);
  CHECK(ratio(t.wins) >= 5);
  CHECK(ratio(t.postseason) > 1.5);
  // A team that does not meet this one in the rest of the season keeps its final record in
  // every season (keyed extra innings): its paired error of mean wins is zero.
  int unchanged = 0;
  for (const auto& x : c.alternatives[0].teams) unchanged += x.wins.se_paired == 0.0;
  std::cout << "  teams with the same final wins in every season: " << unchanged << " of "
            << c.alternatives[0].teams.size() << "\n";
  CHECK(unchanged > 0);
}

TEST_CASE("plans of different leagues are refused") {
  const config::Season s = tiny_league();
  const Plan base = compile_plan(s, neutral_ratings(s));
  config::Season other = s;
  other.teams[0].id = "Z";
  const Plan p = compile_plan(other, neutral_ratings(other));
  const Plan* alts[] = {&p};
  RunOptions opt;
  opt.seasons = 10;
  CHECK_THROWS_AS(compare_plans(base, alts, opt), std::invalid_argument);
}
