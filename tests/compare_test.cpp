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

using namespace standfast;
using namespace standfast::engine;

namespace {

config::Game game(int day, int home, int away, int hr = -1, int ar = -1) {
  config::Game g;
  g.date = 20000 + day;
  g.home = home;
  g.away = away;
  if (hr >= 0) {
    g.played = true;
    g.home_runs = hr;
    g.away_runs = ar;
  }
  return g;
}

// Four teams A..D in one division; 8 games played, 8 left; one division winner and one at-large
// team meet in a best-of-3 final; ties broken by a random draw only; log5 from win percentages
// .60, .45, .55, .40 (the league of tests/simulate_test.cpp).
constexpr double PCT[4] = {0.60, 0.45, 0.55, 0.40};

config::Season tiny_league() {
  config::Season s;
  s.file = "tiny.yaml";
  config::Group g;
  g.id = "L";
  g.teams = {0, 1, 2, 3};
  s.groups.push_back(g);
  s.conferences = {0};
  s.divisions = {0};
  for (const char* id : {"A", "B", "C", "D"}) {
    config::Team t;
    t.id = id;
    t.name = id;
    t.division = 0;
    t.conference = 0;
    s.teams.push_back(t);
  }
  const int A = 0, B = 1, C = 2, D = 3;
  s.games = {game(1, A, B, 3, 1), game(2, C, D, 2, 4), game(3, A, C, 1, 5), game(4, B, D, 6, 2),
             game(5, A, D, 3, 2), game(6, B, C, 0, 1), game(7, B, A, 4, 2), game(8, D, C, 1, 3),
             game(11, A, B),      game(12, C, D),      game(13, A, C),      game(14, B, D),
             game(15, A, D),      game(16, B, C),      game(17, B, A),      game(18, D, C)};
  s.postseason.enabled = true;
  s.postseason.qualifying.push_back(config::Qualifying{0, 1, 1, 0, true});
  config::Round final_round;
  final_round.name = "Final";
  final_round.best_of = 3;
  final_round.higher_hosts = {true, false, true};
  s.postseason.rounds.push_back(final_round);
  s.model.family = config::ScoreFamily::kLog5;
  for (int t = 0; t < 4; ++t) {
    config::TeamOverride o;
    o.team = t;
    o.win_pct = PCT[t];
    s.overrides.push_back(o);
  }
  return s;
}

models::LeagueRatings neutral_ratings(const config::Season& s) {
  models::LeagueRatings r;
  r.family = config::ScoreFamily::kLog5;
  r.league_mean = 4.5;
  r.shape = 1.83;
  r.home_edge = 1.0;
  r.teams.assign(s.teams.size(), models::TeamRating{});
  return r;
}

double log5(double pa, double pb) { return (pa - pa * pb) / (pa + pb - 2 * pa * pb); }

struct Exact {
  std::array<double, 4> post{}, title{}, wins{};
};

// Exact chances when the remaining games are `left` (home, away); a game with forced[g] = +1 is
// a home win, -1 an away win, 0 open. Wins after the 8 played games (4 each): A 2, B 2, C 3,
// D 1. Teams rank by winning percentage (common practice; teams may play unequal numbers of
// games once one is removed or added); equal percentages: every priority order equally
// likely. The top two meet in a best-of-3 (home edge 1).
Exact enumerate(const std::vector<std::array<int, 2>>& left, const std::vector<int>& forced) {
  Exact e;
  const int base_wins[4] = {2, 2, 3, 1};
  const std::size_t k = left.size();
  int games[4] = {4, 4, 4, 4};
  for (const auto& g : left) {
    ++games[g[0]];
    ++games[g[1]];
  }
  for (std::uint32_t mask = 0; mask < (1u << k); ++mask) {
    double prob = 1;
    int wins[4] = {base_wins[0], base_wins[1], base_wins[2], base_wins[3]};
    for (std::size_t g = 0; g < k; ++g) {
      const int h = left[g][0], a = left[g][1];
      const double ph = forced[g] > 0 ? 1.0 : forced[g] < 0 ? 0.0 : log5(PCT[h], PCT[a]);
      if (mask >> g & 1) {
        prob *= ph;
        ++wins[h];
      } else {
        prob *= 1 - ph;
        ++wins[a];
      }
    }
    if (prob == 0) continue;
    for (int t = 0; t < 4; ++t) e.wins[static_cast<std::size_t>(t)] += prob * wins[t];
    std::array<int, 4> prio = {0, 1, 2, 3};
    do {
      std::array<int, 4> order = {0, 1, 2, 3};
      std::sort(order.begin(), order.end(), [&](int x, int y) {
        const int cmp = wins[x] * games[y] - wins[y] * games[x];  // pct x - pct y, scaled
        return cmp != 0 ? cmp > 0 : prio[x] < prio[y];
      });
      const double w = prob / 24.0;
      const int a = order[0], b = order[1];
      e.post[static_cast<std::size_t>(a)] += w;
      e.post[static_cast<std::size_t>(b)] += w;
      // Ref: Boost.Math 1.74; ibeta(2, 2, p) = P(win a best-of-3) (REFERENCE_VALUES section 4).
      const double pa = boost::math::ibeta(2.0, 2.0, log5(PCT[a], PCT[b]));
      e.title[static_cast<std::size_t>(a)] += w * pa;
      e.title[static_cast<std::size_t>(b)] += w * (1 - pa);
    } while (std::next_permutation(prio.begin(), prio.end()));
  }
  return e;
}

const std::vector<std::array<int, 2>> LEFT = {{0, 1}, {2, 3}, {0, 2}, {1, 3},
                                              {0, 3}, {1, 2}, {1, 0}, {3, 2}};

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
