// Tests for engine/standings.h: the displayed standings of the played games.
// Reference: games back GB = ((W_leader - W) + (L - L_leader)) / 2 with the leader ranked first
// by winning percentage, last ten games and streaks are common practice; every expected number
// below is worked out by hand from the invented games listed in the test.
#include "engine/standings.h"

#include <catch2/catch.hpp>

#include "small_league.h"

using standfast::engine::compute_standings;
using standfast::engine::games_back_halves;
using standfast::engine::StandingsLine;

namespace {

struct Fixture {
  standfast::testing::SmallLeague lg;
  int A, B, C, X, Y;
  int d1, d2;
  Fixture() {
    const int conf = lg.conference("C1");
    d1 = lg.division("D1", conf);
    d2 = lg.division("D2", conf);
    A = lg.team("A", d1);
    B = lg.team("B", d1);
    C = lg.team("C", d1);
    X = lg.team("X", d2);
    Y = lg.team("Y", d2);
    // Day 1: A (home) beats B 4-2.
    lg.game(1, A, B, 4, 2);
    // A vs X: A wins 5-3 at home on days 2-6, loses 1-3 at X on days 7-8. A: 6-2.
    for (int d = 2; d <= 6; ++d) lg.game(d, A, X, 5, 3);
    for (int d = 7; d <= 8; ++d) lg.game(d, X, A, 3, 1);
    // B vs Y: B wins 5-3 at home on days 2-11, loses 1-3 at Y on days 12-14. B: 10-4.
    for (int d = 2; d <= 11; ++d) lg.game(d, B, Y, 5, 3);
    for (int d = 12; d <= 14; ++d) lg.game(d, Y, B, 3, 1);
    // C vs X: C wins 5-3 at home on days 2-4, loses 1-3 at X on days 5-13. C: 3-9.
    for (int d = 2; d <= 4; ++d) lg.game(d, C, X, 5, 3);
    for (int d = 5; d <= 13; ++d) lg.game(d, X, C, 3, 1);
    // Not counted: an unplayed game and a game with an unknown date.
    lg.remaining(20, A, B);
    lg.game(0, C, A, 9, 0);
    lg.season.games.back().date.reset();
  }
};

const StandingsLine& find(const standfast::engine::DivisionStandings& d, int team) {
  for (const auto& l : d.lines) {
    if (l.team == team) return l;
  }
  FAIL("team not in division");
  return d.lines.front();
}

}  // namespace

TEST_CASE("games back by the common formula") {
  // Ref: common practice; GB = ((W_leader - W) + (L - L_leader)) / 2; values worked by hand.
  // Leader 6-2, team 10-4: ((6 - 10) + (4 - 2)) / 2 = -1 game (-2 halves).
  REQUIRE(games_back_halves(6, 2, 10, 4) == -2);
  // Leader 90-60, team 84-66: (6 + 6) / 2 = 6 games.
  REQUIRE(games_back_halves(90, 60, 84, 66) == 12);
  // Half games: leader 11-9, team 3-10: (8 + 1) / 2 = 4.5.
  REQUIRE(games_back_halves(11, 9, 3, 10) == 9);
}

TEST_CASE("standings rank by winning percentage, not games back") {
  Fixture f;
  const auto s = compute_standings(f.lg.season);
  REQUIRE(s.games_played == 1 + 7 + 13 + 12);
  REQUIRE(s.through == 14);
  REQUIRE(s.conferences.size() == 1);
  const auto& d1 = s.conferences[0].divisions[0];
  REQUIRE(d1.division == f.d1);
  // A 6-2 (.750) leads B 10-4 (.714) although B is one game "ahead" by games back.
  REQUIRE(d1.lines[0].team == f.A);
  REQUIRE(d1.lines[1].team == f.B);
  REQUIRE(d1.lines[2].team == f.C);
  REQUIRE(d1.lines[0].division_leader);
  REQUIRE_FALSE(d1.lines[1].division_leader);
  const auto& a = find(d1, f.A);
  const auto& b = find(d1, f.B);
  const auto& c = find(d1, f.C);
  REQUIRE(a.wins == 6);
  REQUIRE(a.losses == 2);
  REQUIRE(a.win_pct() == Approx(0.75));
  REQUIRE(b.win_pct() == Approx(10.0 / 14.0));
  REQUIRE(a.games_back_halves == 0);
  REQUIRE(b.games_back_halves == -2);  // -1.0 game
  REQUIRE(b.games_back() == -1.0);
  REQUIRE(c.games_back_halves == 10);  // ((6 - 3) + (9 - 2)) / 2 = 5.0
  // Runs: A scored 4 + 5x5 + 2x1 = 31, allowed 2 + 5x3 + 2x3 = 23.
  REQUIRE(a.runs_for == 31);
  REQUIRE(a.runs_against == 23);
  REQUIRE(a.run_differential() == 8);
  // Home and road: A 6-0 at home, 0-2 on the road; B 10-0 at home, 0-4 on the road.
  REQUIRE(a.home_wins == 6);
  REQUIRE(a.home_losses == 0);
  REQUIRE(a.road_wins == 0);
  REQUIRE(a.road_losses == 2);
  REQUIRE(b.home_wins == 10);
  REQUIRE(b.road_losses == 4);
  // Within the division only A-B on day 1; within the conference every game.
  REQUIRE(a.division_wins == 1);
  REQUIRE(a.division_losses == 0);
  REQUIRE(b.division_losses == 1);
  REQUIRE(c.division_wins + c.division_losses == 0);
  REQUIRE(b.conference_wins == 10);
  REQUIRE(b.conference_losses == 4);
  // Last ten and streak. A: W x6, L x2 (only 8 games): 6-2, lost 2.
  REQUIRE(a.last10_wins == 6);
  REQUIRE(a.last10_losses == 2);
  REQUIRE(a.streak == -2);
  // B: L, W x10, L x3 -> last ten W x7, L x3; lost 3.
  REQUIRE(b.last10_wins == 7);
  REQUIRE(b.last10_losses == 3);
  REQUIRE(b.streak == -3);
  // C: W x3, L x9 -> last ten W, L x9; lost 9.
  REQUIRE(c.last10_wins == 1);
  REQUIRE(c.last10_losses == 9);
  REQUIRE(c.streak == -9);

  // D2: X 11-8 (.579: 2-5 against A, 9-3 against C) leads Y 3-10 (.231) by
  // ((11 - 3) + (10 - 8)) / 2 = 5.0 games.
  const auto& d2 = s.conferences[0].divisions[1];
  REQUIRE(d2.lines[0].team == f.X);
  REQUIRE(d2.lines[0].wins == 11);
  REQUIRE(d2.lines[0].losses == 8);
  REQUIRE(d2.lines[1].games_back_halves == 10);
  // X's last loss is at A on day 6, listed before X-C on day 6 (file order within a day). After
  // it X won C on days 6-13 (8) and A on days 7-8 (2): streak +10, last ten 10-0.
  REQUIRE(d2.lines[0].streak == 10);
  REQUIRE(d2.lines[0].last10_wins == 10);
}

TEST_CASE("standings seeds follow the season's qualifying rules") {
  Fixture f;
  standfast::config::Qualifying q;
  q.conference = f.lg.season.conferences[0];
  q.division_winners = 2;
  q.at_large = 1;
  f.lg.season.postseason.qualifying.push_back(q);
  f.lg.season.postseason.enabled = true;
  const auto s = compute_standings(f.lg.season);
  // Winners A (.750) and X (.579), then at-large B (.714).
  REQUIRE(s.conferences[0].seeds == std::vector<int>{f.A, f.X, f.B});
  REQUIRE(s.conferences[0].qualifying_winners == 2);
  REQUIRE(find(s.conferences[0].divisions[0], f.B).seed == 3);
  REQUIRE(find(s.conferences[0].divisions[0], f.C).seed == 0);
}

TEST_CASE("tied teams in the standings are ordered by the tiebreak procedure, reproducibly") {
  // P and Q both 1-1: they split their two games; no rules, so the draw decides with the fixed
  // stream, and two computations agree.
  standfast::testing::SmallLeague lg;
  const int conf = lg.conference("K");
  const int d = lg.division("K1", conf);
  const int p = lg.team("P", d);
  const int q = lg.team("Q", d);
  lg.game(1, p, q, 2, 1);
  lg.game(2, q, p, 2, 1);
  lg.season.tiebreakers.order.clear();
  const auto s1 = compute_standings(lg.season);
  const auto s2 = compute_standings(lg.season);
  REQUIRE(s1.conferences[0].divisions[0].lines[0].team ==
          s2.conferences[0].divisions[0].lines[0].team);
  REQUIRE(s1.conferences[0].divisions[0].lines[1].games_back_halves == 0);
}
