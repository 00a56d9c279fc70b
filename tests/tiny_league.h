// The four-team league of the paired-comparison and game-swing tests, with an exact
// enumeration of every outcome of its remaining games under stated conditions (written
// independently of the engine). Sources: log5 / Bradley-Terry, REFERENCE_VALUES.md section 5;
// best-of-3 series, REFERENCE_VALUES.md section 4 (Mosteller 1952), Boost.Math 1.74 ibeta(2, 2, p).
#ifndef STANDFAST_TESTS_TINY_LEAGUE_H
#define STANDFAST_TESTS_TINY_LEAGUE_H

#include <algorithm>
#include <array>
#include <boost/math/special_functions/beta.hpp>
#include <cstdint>
#include <vector>

#include "config/season.h"
#include "models/ratings.h"

namespace standfast::testing {

inline config::Game game(int day, int home, int away, int hr = -1, int ar = -1) {
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

inline config::Season tiny_league() {
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

inline models::LeagueRatings neutral_ratings(const config::Season& s) {
  models::LeagueRatings r;
  r.family = config::ScoreFamily::kLog5;
  r.league_mean = 4.5;
  r.shape = 1.83;
  r.home_edge = 1.0;
  r.teams.assign(s.teams.size(), models::TeamRating{});
  return r;
}

inline double log5(double pa, double pb) { return (pa - pa * pb) / (pa + pb - 2 * pa * pb); }

struct Exact {
  std::array<double, 4> post{}, title{}, wins{};
};

// Exact chances when the remaining games are `left` (home, away); a game with forced[g] = +1 is
// a home win, -1 an away win, 0 open. Wins after the 8 played games (4 each): A 2, B 2, C 3,
// D 1. Teams rank by winning percentage (common practice; teams may play unequal numbers of
// games once one is removed or added); equal percentages: every priority order equally
// likely. The top two meet in a best-of-3 (home edge 1).
inline Exact enumerate(const std::vector<std::array<int, 2>>& left,
                       const std::vector<int>& forced) {
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

inline const std::vector<std::array<int, 2>> LEFT = {{0, 1}, {2, 3}, {0, 2}, {1, 3},
                                                     {0, 3}, {1, 2}, {1, 0}, {3, 2}};

}  // namespace standfast::testing

#endif  // STANDFAST_TESTS_TINY_LEAGUE_H
