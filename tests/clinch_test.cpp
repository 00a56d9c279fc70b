// Tests for engine/clinch.h: the simple (sufficient) clinch and elimination marks.
// References: the magic number M = G + 1 - W_leader - L_chaser (common practice; Wikipedia
// "Magic number (sports)", Derivation; REFERENCE_VALUES.md section 7), small standings worked
// by hand below (each case states the counting that decides it), and exhaustive enumeration of
// every remaining result in random small leagues (a mark must hold in every case).
#include "engine/clinch.h"

#include <fmt/core.h>

#include <algorithm>
#include <catch2/catch.hpp>
#include <string>
#include <vector>

#include "engine/rng.h"

using standfast::config::Game;
using standfast::config::Group;
using standfast::config::Qualifying;
using standfast::config::Season;
using standfast::config::Team;
using standfast::engine::Certainty;
using standfast::engine::clinch_records;
using standfast::engine::ClinchRecord;
using standfast::engine::simple_clinch;

namespace {

// A league whose conference c holds divisions of the sizes sizes[c][k]; teams are numbered in
// order. Every conference qualifies `winners` division winners and `at_large` more.
Season league(const std::vector<std::vector<int>>& sizes, int winners, int at_large,
              bool postseason = true) {
  Season s;
  int team = 0;
  for (std::size_t c = 0; c < sizes.size(); ++c) {
    const int conf = static_cast<int>(s.groups.size());
    Group cg;
    cg.id = fmt::format("c{}", c);
    s.groups.push_back(cg);
    s.conferences.push_back(conf);
    for (int size : sizes[c]) {
      const int div = static_cast<int>(s.groups.size());
      Group dg;
      dg.id = fmt::format("d{}", div);
      dg.parent = conf;
      for (int i = 0; i < size; ++i) {
        Team t;
        t.id = fmt::format("T{}", team);
        t.division = div;
        t.conference = conf;
        s.teams.push_back(t);
        dg.teams.push_back(team++);
      }
      s.groups[conf].children.push_back(div);
      s.groups.push_back(dg);
      s.divisions.push_back(div);
    }
    Qualifying q;
    q.conference = conf;
    q.division_winners = winners;
    q.at_large = at_large;
    s.postseason.qualifying.push_back(q);
  }
  s.postseason.enabled = postseason;
  return s;
}

}  // namespace

TEST_CASE("two-team division agrees with the magic number for every (x, y)") {
  // Ref: REFERENCE_VALUES.md section 7 (common practice): G = 162, leader 90-60, chaser 84-66,
  // M = 163 - 90 - 66 = 7; clinched outright iff x + y >= 7, where x = further leader wins and
  // y = further chaser losses (brute force over every (x, y) there, [computed]).
  const Season s = league({{2}}, 1, 0);
  for (int x = 0; x <= 12; ++x) {
    for (int y = 0; y <= 12; ++y) {
      const std::vector<ClinchRecord> r = {{90 + x, 60, 12 - x}, {84, 66 + y, 12 - y}};
      const auto m = simple_clinch(s, r);
      const bool clinched = x + y >= 7;
      INFO("x=" << x << " y=" << y);
      CHECK((m[0].division == Certainty::kClinched) == clinched);
      CHECK((m[1].division == Certainty::kEliminated) == clinched);
      // One division winner qualifies and no at-large team: the berth is the division.
      CHECK((m[0].berth == Certainty::kClinched) == clinched);
      CHECK((m[1].berth == Certainty::kEliminated) == clinched);
      if (!clinched) {
        CHECK(m[0].division == Certainty::kOpen);
        CHECK(m[1].division == Certainty::kOpen);
      }
    }
  }
}

TEST_CASE("a possible tie is never a clinch") {
  // Common practice: at M = 1 the leader can only be tied (96 wins each at most for the
  // chaser, 96 now for the leader), so neither mark is given.
  const Season s = league({{2}}, 1, 0);
  const std::vector<ClinchRecord> r = {{96, 60, 6}, {84, 66, 12}};
  const auto m = simple_clinch(s, r);
  CHECK(m[0].division == Certainty::kOpen);
  CHECK(m[1].division == Certainty::kOpen);
}

TEST_CASE("berths in a one-division conference count slots") {
  // Hand-worked: 5 teams, 10 games each in all, 1 division winner + 2 at-large = 3 slots.
  // Records (W-L, left): T0 9-0 (1), T1 7-2 (1), T2 6-3 (1), T3 3-6 (1), T4 2-7 (1).
  // Maximum wins: 10, 8, 7, 4, 3. T0's 9 beats every other maximum: division clinched.
  // T1 (7 now): only T0 and T2 (7 at most) can reach 7, fewer than 3: berth clinched.
  // T2 (6 now): T0, T1 reach 6; T3 (4), T4 (3) cannot: 2 < 3, berth clinched.
  // T3 (max 4): T0, T1, T2 already have more than 4 (3 teams = slots): eliminated.
  // T4 (max 3): the same.
  const Season s = league({{5}}, 1, 2);
  const std::vector<ClinchRecord> r = {{9, 0, 1}, {7, 2, 1}, {6, 3, 1}, {3, 6, 1}, {2, 7, 1}};
  const auto m = simple_clinch(s, r);
  CHECK(m[0].division == Certainty::kClinched);
  CHECK(m[1].division == Certainty::kEliminated);  // max 8 < T0's 9
  CHECK(m[0].berth == Certainty::kClinched);
  CHECK(m[1].berth == Certainty::kClinched);
  CHECK(m[2].berth == Certainty::kClinched);
  CHECK(m[3].berth == Certainty::kEliminated);
  CHECK(m[4].berth == Certainty::kEliminated);
}

TEST_CASE("one win less leaves the last berth open") {
  // Hand-worked variant: T2 is 5-4 (1 left), T3 is 4-5 (1 left). T2's 5 can be reached by T0,
  // T1 and T3 (max 5): 3 threats, not fewer than 3 slots, so open. T3 (max 5): only T0 (9) and
  // T1 (7) surely finish above 5, two teams < 3 slots, so open too.
  const Season s = league({{5}}, 1, 2);
  const std::vector<ClinchRecord> r = {{9, 0, 1}, {7, 2, 1}, {5, 4, 1}, {4, 5, 1}, {2, 7, 1}};
  const auto m = simple_clinch(s, r);
  CHECK(m[2].berth == Certainty::kOpen);
  CHECK(m[3].berth == Certainty::kOpen);
  CHECK(m[4].berth == Certainty::kEliminated);  // max 3: T0, T1, T2 (5) surely above
}

TEST_CASE("a team in a weak division is not eliminated by a count of better teams") {
  // Hand-worked: one conference, divisions {T0, T1, T2} and {T3, T4}; 2 division winners and
  // 1 at-large berth (3 slots). T0-T2 are 20-0 with 5 left; T3 is 5-15 (5 left, at most 10
  // wins), T4 4-16 (5 left, at most 9). Three teams are surely above T3, yet T3 can still win
  // its own division (T4 can reach 9, T3 has 5: neither is decided), so its berth stays open.
  // The plain "slots teams surely above" count would wrongly eliminate it.
  const Season s = league({{3, 2}}, 2, 1);
  const std::vector<ClinchRecord> r = {{20, 0, 5}, {20, 0, 5}, {20, 0, 5}, {5, 15, 5}, {4, 16, 5}};
  const auto m = simple_clinch(s, r);
  CHECK(m[3].berth == Certainty::kOpen);
  CHECK(m[4].berth == Certainty::kOpen);
  // T0 (20 now): T1 and T2 can reach 20 (2 threats, not fewer than 1 at-large + 1). Indeed if
  // T0 loses out and T1, T2 win out, T1 wins the division and T2 takes the one at-large berth.
  CHECK(m[0].berth == Certainty::kOpen);
  CHECK(m[0].division == Certainty::kOpen);
}

TEST_CASE("being fourth of a conference with three in its own division is not a clinch") {
  // Hand-worked: divisions {T0, T1, T2, T3}, {T4}, {T5}; 3 division winners + 1 at-large.
  // T0, T1, T2 are 18-0 with 2 left, T3 is 15-3 (2 left): T3 may finish 4th overall yet miss,
  // since the lone at-large berth can go to T1 or T2. T4 and T5 (0-18, 2 left) win their
  // one-team divisions whatever happens. Threats to T3 (15): T0, T1, T2 (3), not fewer than
  // 1 + 1, so open; surely above T3 (max 17): T0, T1, T2 in one division, minus one = 2 >= 1
  // at-large and T3 is eliminated from the division: eliminated.
  const Season s = league({{4, 1, 1}}, 3, 1);
  const std::vector<ClinchRecord> r = {{18, 0, 2}, {18, 0, 2}, {18, 0, 2},
                                       {15, 3, 2}, {0, 18, 2}, {0, 18, 2}};
  const auto m = simple_clinch(s, r);
  CHECK(m[3].division == Certainty::kEliminated);
  CHECK(m[3].berth == Certainty::kEliminated);
  CHECK(m[4].division == Certainty::kClinched);
  CHECK(m[4].berth == Certainty::kClinched);
  CHECK(m[5].berth == Certainty::kClinched);
  CHECK(m[0].berth == Certainty::kOpen);  // T1 and T2 can both tie or beat it; one berth left
}

TEST_CASE("uneven schedules compare winning percentages, not wins") {
  // Hand-worked: T0 60-40 with 0 left (.600 final); T1 55-40 with 5 left can finish 60-40 at
  // best (.600): a tie is possible, so open. With T1 at 54-41 (5 left) its best is 59-41
  // (.590 < .600): T0 clinches. With T1 at 58-34 and done (.630) against T0's 60-40 (.600):
  // T0 has more wins but the lower percentage, so T1 is surely above and T0 is eliminated.
  const Season s = league({{2}}, 1, 0);
  CHECK(simple_clinch(s, std::vector<ClinchRecord>{{60, 40, 0}, {55, 40, 5}})[0].division ==
        Certainty::kOpen);
  CHECK(simple_clinch(s, std::vector<ClinchRecord>{{60, 40, 0}, {54, 41, 5}})[0].division ==
        Certainty::kClinched);
  const auto m = simple_clinch(s, std::vector<ClinchRecord>{{60, 40, 0}, {58, 34, 0}});
  CHECK(m[0].division == Certainty::kEliminated);
  CHECK(m[1].division == Certainty::kClinched);
}

TEST_CASE("without a postseason only division marks are given") {
  const Season s = league({{2}}, 1, 0, false);
  const auto m = simple_clinch(s, std::vector<ClinchRecord>{{10, 0, 0}, {0, 10, 0}});
  CHECK(m[0].division == Certainty::kClinched);
  CHECK(m[0].berth == Certainty::kOpen);
  CHECK(m[1].berth == Certainty::kOpen);
}

TEST_CASE("records count played wins and losses and every unplayed game") {
  Season s = league({{3}}, 1, 0);
  auto game = [](int home, int away, bool played, int hr, int ar) {
    Game g;
    g.home = home;
    g.away = away;
    g.played = played;
    if (played) g.date = 1;  // a played game without a date counts as still to play
    g.home_runs = hr;
    g.away_runs = ar;
    return g;
  };
  s.games = {game(0, 1, true, 5, 3), game(1, 2, true, 2, 7), game(2, 0, false, 0, 0),
             game(0, 2, true, 1, 4)};
  const auto r = clinch_records(s);
  CHECK(r[0].wins == 1);
  CHECK(r[0].losses == 1);
  CHECK(r[0].remaining == 1);
  CHECK(r[1].wins == 0);
  CHECK(r[1].losses == 2);
  CHECK(r[1].remaining == 0);
  CHECK(r[2].wins == 2);
  CHECK(r[2].losses == 0);
  CHECK(r[2].remaining == 1);
}

namespace {

// Exact outcome of one finished season for team `a`, by brute force. The league ranks by
// winning percentage (a team with no games counts .500, as in engine/tiebreak.h); `a_wins_ties`
// puts team a above every team level with it (else below); other ties go by team index (which of
// two level teams wins a division cannot change how many teams rank above a, so their order does
// not matter to a).
struct Outcome {
  bool division = false;
  bool berth = false;
};

Outcome finish(const Season& s, const std::vector<int>& wins, const std::vector<int>& games, int a,
               bool a_wins_ties) {
  const int n = static_cast<int>(wins.size());
  auto above = [&](int x, int y) {  // x ranks above y; no games at all counts .500
    const long wx = games[x] ? 2L * wins[x] : 1, gx = games[x] ? 2L * games[x] : 2;
    const long wy = games[y] ? 2L * wins[y] : 1, gy = games[y] ? 2L * games[y] : 2;
    const long lhs = wx * gy;
    const long rhs = wy * gx;
    if (lhs != rhs) return lhs > rhs;
    if (x == a) return a_wins_ties;
    if (y == a) return !a_wins_ties;
    return x < y;
  };
  const Qualifying& q = s.postseason.qualifying[0];
  std::vector<int> winners;
  std::vector<bool> is_winner(n, false);
  for (int d : s.divisions) {
    int best = -1;
    for (int t : s.groups[d].teams) {
      if (best < 0 || above(t, best)) best = t;
    }
    winners.push_back(best);
  }
  Outcome o;
  o.division = std::find(winners.begin(), winners.end(), a) != winners.end();
  std::sort(winners.begin(), winners.end(), above);
  std::vector<bool> in(n, false);
  for (int k = 0; k < q.division_winners && k < static_cast<int>(winners.size()); ++k) {
    in[winners[k]] = true;
  }
  std::vector<int> pool;
  for (int t = 0; t < n; ++t) {
    if (!in[t]) pool.push_back(t);
  }
  std::sort(pool.begin(), pool.end(), above);
  for (int k = 0; k < q.at_large && k < static_cast<int>(pool.size()); ++k) in[pool[k]] = true;
  o.berth = in[a];
  return o;
}

}  // namespace

TEST_CASE("every mark is confirmed by enumerating all remaining results") {
  // Reference: exhaustive enumeration of every outcome of the remaining games (2^K cases) in
  // random small leagues, with ties resolved against the team (for clinches) or for it (for
  // eliminations). A mark must hold in every case; the marks are sufficient conditions, so the
  // converse is not required. The leagues are drawn from a fixed stream.
  auto rng = standfast::engine::make_stream(4242, 0, standfast::engine::Purpose::kGames);
  int clinch_marks = 0, elimination_marks = 0;
  for (int trial = 0; trial < 300; ++trial) {
    const bool few_winners = trial % 3 == 2;  // 1 of 2 division winners qualifies
    Season s = few_winners ? league({{3, 3}}, 1, 1) : league({{3, 2, 2}}, 3, 1);
    const int n = static_cast<int>(s.teams.size());
    std::vector<ClinchRecord> r(n);
    for (auto& x : r) {
      x.wins = static_cast<int>(standfast::engine::uniform_below(rng, 8));
      x.losses = static_cast<int>(standfast::engine::uniform_below(rng, 8));
    }
    const int k = 6 + static_cast<int>(standfast::engine::uniform_below(rng, 5));
    std::vector<std::pair<int, int>> left;
    while (static_cast<int>(left.size()) < k) {
      const int h = static_cast<int>(standfast::engine::uniform_below(rng, n));
      const int v = static_cast<int>(standfast::engine::uniform_below(rng, n));
      if (h == v) continue;
      left.emplace_back(h, v);
      ++r[h].remaining;
      ++r[v].remaining;
    }
    const auto marks = simple_clinch(s, r);
    std::vector<int> games(n);
    for (int t = 0; t < n; ++t) games[t] = r[t].wins + r[t].losses + r[t].remaining;
    for (int a = 0; a < n; ++a) {
      bool always_div = true, never_div = true, always_berth = true, never_berth = true;
      for (unsigned mask = 0; mask < (1u << k); ++mask) {
        std::vector<int> wins(n);
        for (int t = 0; t < n; ++t) wins[t] = r[t].wins;
        for (int g = 0; g < k; ++g) ++wins[(mask >> g) & 1u ? left[g].first : left[g].second];
        const Outcome worst = finish(s, wins, games, a, false);
        const Outcome best = finish(s, wins, games, a, true);
        always_div = always_div && worst.division;
        always_berth = always_berth && worst.berth;
        never_div = never_div && !best.division;
        never_berth = never_berth && !best.berth;
      }
      INFO("trial " << trial << " team " << a);
      if (marks[a].division == Certainty::kClinched) CHECK(always_div);
      if (marks[a].division == Certainty::kEliminated) CHECK(never_div);
      if (marks[a].berth == Certainty::kClinched) CHECK(always_berth);
      if (marks[a].berth == Certainty::kEliminated) CHECK(never_berth);
      clinch_marks +=
          (marks[a].division == Certainty::kClinched) + (marks[a].berth == Certainty::kClinched);
      elimination_marks += (marks[a].division == Certainty::kEliminated) +
                           (marks[a].berth == Certainty::kEliminated);
    }
  }
  // The check is not vacuous: both kinds of mark occur many times.
  CHECK(clinch_marks > 50);
  CHECK(elimination_marks > 50);
}
