// Tests for engine/simulate.h: the whole season simulation.
// Sources:
//   Log5 / Bradley-Terry: REFERENCE_VALUES.md section 5 (Bill James, Baseball Abstract, 1981;
//     Bradley & Terry 1952, Biometrika 39, 324-345).
//   Best-of-n series: REFERENCE_VALUES.md section 4 (Mosteller 1952, JASA), recomputed with
//     Boost.Math 1.74 ibeta(m, m, p).
//   Exact enumeration of every outcome of a tiny league, written here independently of the
//     engine (no engine code is used to compute the expected values).
// Monte Carlo checks use a fixed seed and 4-sigma bounds (STYLE.md: at least 4 sigma, so a
// correct engine fails a single check with probability below 1e-4).
#include "engine/simulate.h"

#include <algorithm>
#include <array>
#include <boost/math/special_functions/beta.hpp>
#include <catch2/catch.hpp>
#include <cmath>
#include <numeric>

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

config::Team team(const std::string& id, int division, int conference, double rf = 1.0) {
  config::Team t;
  t.id = id;
  t.name = id;
  t.division = division;
  t.conference = conference;
  t.run_factor = rf;
  return t;
}

// Four teams A..D in one division of one conference; 8 games played (each team 4), 8 left (each
// team 4); one division winner and one at-large team meet in a best-of-3 final; ties broken by
// a random draw only; log5 model from win percentages .60, .45, .55, .40.
config::Season tiny_league() {
  config::Season s;
  s.file = "tiny.yaml";
  s.league.name = "Tiny";
  config::Group g;
  g.id = "L";
  g.teams = {0, 1, 2, 3};
  s.groups.push_back(g);
  s.conferences = {0};
  s.divisions = {0};
  for (const char* id : {"A", "B", "C", "D"}) s.teams.push_back(team(id, 0, 0));
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
  const double pct[4] = {0.60, 0.45, 0.55, 0.40};
  for (int t = 0; t < 4; ++t) {
    config::TeamOverride o;
    o.team = t;
    o.win_pct = pct[t];
    s.overrides.push_back(o);
  }
  return s;
}

models::LeagueRatings neutral_ratings(const config::Season& s, config::ScoreFamily family) {
  models::LeagueRatings r;
  r.family = family;
  r.league_mean = 4.5;
  r.shape = 1.83;
  r.home_edge = 1.0;
  r.teams.assign(s.teams.size(), models::TeamRating{});
  return r;
}

double log5(double pa, double pb) { return (pa - pa * pb) / (pa + pb - 2 * pa * pb); }

}  // namespace

TEST_CASE("tiny league: postseason and title chances match exact enumeration") {
  const config::Season season = tiny_league();
  const Plan plan = compile_plan(season, neutral_ratings(season, config::ScoreFamily::kLog5));
  REQUIRE(plan.remaining_games() == 8);

  // Ref: REFERENCE_VALUES.md section 5; log5(0.60, 0.40) = 9/13 = 0.69230769.
  REQUIRE(log5(0.60, 0.40) == Approx(9.0 / 13.0).epsilon(1e-12));

  // Exact enumeration: 2^8 outcomes of the remaining games; ties in wins broken by a uniformly
  // random order (all 4! priority orders equally likely); the top two meet in a best-of-3 whose
  // probability is I_p(2, 2) (home edge 1, so hosting does not matter).
  const double pct[4] = {0.60, 0.45, 0.55, 0.40};
  const int base_wins[4] = {2, 2, 3, 1};
  const int left[8][2] = {{0, 1}, {2, 3}, {0, 2}, {1, 3}, {0, 3}, {1, 2}, {1, 0}, {3, 2}};
  std::array<double, 4> exact_post{}, exact_title{};
  std::array<std::array<double, 9>, 4> exact_wins{};
  for (int mask = 0; mask < 256; ++mask) {
    double prob = 1;
    int wins[4] = {base_wins[0], base_wins[1], base_wins[2], base_wins[3]};
    for (int g = 0; g < 8; ++g) {
      const int h = left[g][0], a = left[g][1];
      const double ph = log5(pct[h], pct[a]);
      if (mask >> g & 1) {
        prob *= ph;
        ++wins[h];
      } else {
        prob *= 1 - ph;
        ++wins[a];
      }
    }
    for (int t = 0; t < 4; ++t) exact_wins[t][wins[t]] += prob;
    std::array<int, 4> prio = {0, 1, 2, 3};
    do {
      std::array<int, 4> order = {0, 1, 2, 3};
      std::sort(order.begin(), order.end(), [&](int x, int y) {
        return wins[x] != wins[y] ? wins[x] > wins[y] : prio[x] < prio[y];
      });
      const double w = prob / 24.0;
      const int a = order[0], b = order[1];
      exact_post[a] += w;
      exact_post[b] += w;
      // Ref: Boost.Math 1.74; ibeta(2, 2, p) = P(win a best-of-3) (REFERENCE_VALUES section 4).
      const double pa = boost::math::ibeta(2.0, 2.0, log5(pct[a], pct[b]));
      exact_title[a] += w * pa;
      exact_title[b] += w * (1 - pa);
    } while (std::next_permutation(prio.begin(), prio.end()));
  }

  RunOptions opt;
  opt.seed = 20261201;
  opt.seasons = 200000;
  opt.batch = 50000;
  const SimulationResult r = simulate(plan, opt);
  REQUIRE(r.seasons == 200000);
  REQUIRE(r.games_simulated == 8 * 200000);
  double sum_title = 0, sum_post = 0;
  for (int t = 0; t < 4; ++t) {
    const auto& o = r.teams[static_cast<std::size_t>(t)];
    const double n = 200000;
    INFO("team " << t << " postseason " << o.postseason.p << " exact " << exact_post[t] << " title "
                 << o.title.p << " exact " << exact_title[t]);
    const double se_post = std::sqrt(exact_post[t] * (1 - exact_post[t]) / n);
    const double se_title = std::sqrt(exact_title[t] * (1 - exact_title[t]) / n);
    CHECK(std::abs(o.postseason.p - exact_post[t]) <= 4 * se_post);
    CHECK(std::abs(o.title.p - exact_title[t]) <= 4 * se_title);
    CHECK(o.postseason.se == Approx(std::sqrt(o.postseason.p * (1 - o.postseason.p) / n)));
    for (int w = 0; w <= 8; ++w) {
      const double e = exact_wins[t][w];
      const double f = static_cast<double>(o.wins_histogram[static_cast<std::size_t>(w)]) / n;
      INFO("wins " << w << " freq " << f << " exact " << e);
      CHECK(std::abs(f - e) <= 4 * std::sqrt(e * (1 - e) / n) + 1e-12);
    }
    sum_title += o.title.p;
    sum_post += o.postseason.p;
    // Every team plays 8 games: wins + losses = 8 in every season.
    CHECK(o.mean_wins + o.mean_losses == Approx(8.0));
  }
  // Invariants: one title per season; two berths per season.
  CHECK(sum_title == Approx(1.0).epsilon(1e-12));
  CHECK(sum_post == Approx(2.0).epsilon(1e-12));
}
