// Tests for engine/season_record.h: the per-team results a ranking needs.
// Every expected value is counted by hand from the invented games written out in each test
// (closed-form counts: wins, losses and runs are sums over the listed games).
#include "engine/season_record.h"

#include <catch2/catch.hpp>
#include <vector>

#include "small_league.h"

using standfast::config::TiebreakKind;
using standfast::config::TiebreakRule;
using standfast::config::TiebreakScope;
using standfast::engine::LastGamesWindow;
using standfast::engine::SeasonRecord;

TEST_CASE("add_result counts wins, runs, head-to-head, division and conference records") {
  // Teams 0,1 in division 10 (conference 1); team 2 in division 11 (conference 1); team 3 in
  // division 20 (conference 2).
  const std::vector<int> div{10, 10, 11, 20};
  const std::vector<int> conf{1, 1, 1, 2};
  SeasonRecord r(div, conf, {});
  r.add_result(0, 1, 5, 2);  // same division
  r.add_result(2, 0, 4, 3);  // same conference, other division
  r.add_result(0, 3, 7, 1);  // other conference
  r.add_result(1, 0, 2, 1);
  REQUIRE(r.team_count() == 4);
  REQUIRE(r.wins(0) == 2);
  REQUIRE(r.losses(0) == 2);
  REQUIRE(r.runs_for(0) == 5 + 3 + 7 + 1);
  REQUIRE(r.runs_against(0) == 2 + 4 + 1 + 2);
  REQUIRE(r.run_differential(0) == 16 - 9);
  REQUIRE(r.h2h_wins(0, 1) == 1);
  REQUIRE(r.h2h_wins(1, 0) == 1);
  REQUIRE(r.h2h_wins(2, 0) == 1);
  REQUIRE(r.h2h_wins(0, 2) == 0);
  REQUIRE(r.division_wins(0) == 1);
  REQUIRE(r.division_losses(0) == 1);
  REQUIRE(r.conference_wins(0) == 1);
  REQUIRE(r.conference_losses(0) == 2);
  REQUIRE(r.conference_wins(3) == 0);
  REQUIRE(r.conference_losses(3) == 0);
  REQUIRE(r.losses(3) == 1);

  r.clear();
  REQUIRE(r.wins(0) == 0);
  REQUIRE(r.h2h_wins(0, 1) == 0);
  REQUIRE(r.division_of(1) == 10);
  REQUIRE(r.conference_of(3) == 2);
}

TEST_CASE("last-games windows keep the most recent results within their scope") {
  const std::vector<int> div{0, 0, 1};
  const std::vector<int> conf{0, 0, 0};
  const std::vector<LastGamesWindow> windows{{3, TiebreakScope::kLeague},
                                             {2, TiebreakScope::kDivision}};
  SeasonRecord r(div, conf, windows);
  // Team 0, in order: W vs 1, W vs 2, L vs 1, L vs 2, W vs 2.
  r.add_result(0, 1, 1, 0);
  r.add_result(0, 2, 1, 0);
  r.add_result(1, 0, 1, 0);
  r.add_result(2, 0, 1, 0);
  r.add_result(0, 2, 1, 0);
  // Last 3 overall: L, L, W -> 1-2. Last 2 within the division (games vs 1): W, L -> 1-1.
  REQUIRE(r.last_wins(0, 0) == 1);
  REQUIRE(r.last_losses(0, 0) == 2);
  REQUIRE(r.last_wins(1, 0) == 1);
  REQUIRE(r.last_losses(1, 0) == 1);
  // Team 2 played 3 games (L, W, L): last 3 overall 1-2; no division games.
  REQUIRE(r.last_wins(0, 2) == 1);
  REQUIRE(r.last_losses(0, 2) == 2);
  REQUIRE(r.last_wins(1, 2) == 0);
  REQUIRE(r.last_losses(1, 2) == 0);
  REQUIRE(r.find_window({2, TiebreakScope::kDivision}) == 1);
  REQUIRE(r.find_window({2, TiebreakScope::kLeague}) == -1);
}

TEST_CASE("a copied record is independent and copying reuses storage") {
  const std::vector<int> div{0, 0};
  const std::vector<int> conf{0, 0};
  const std::vector<LastGamesWindow> windows{{2, TiebreakScope::kLeague}};
  SeasonRecord base(div, conf, windows);
  base.add_result(0, 1, 3, 2);
  SeasonRecord sim = base;
  sim.add_result(1, 0, 4, 0);
  sim.add_result(1, 0, 4, 0);
  REQUIRE(base.wins(1) == 0);
  REQUIRE(sim.wins(1) == 2);
  REQUIRE(sim.last_wins(0, 0) == 0);
  sim = base;  // same sizes: the vector keeps its buffer
  REQUIRE(sim.wins(1) == 0);
  REQUIRE(sim.last_wins(0, 0) == 1);
}

TEST_CASE("a window of fewer than one game is refused") {
  const std::vector<int> div{0};
  const std::vector<LastGamesWindow> windows{{0, TiebreakScope::kLeague}};
  REQUIRE_THROWS_AS(SeasonRecord(div, div, windows), std::invalid_argument);
}

TEST_CASE("played games go in by date, file order within a day; unknown dates are unplayed") {
  standfast::testing::SmallLeague lg;
  const int c = lg.conference("C");
  const int d = lg.division("D", c);
  const int a = lg.team("A", d);
  const int b = lg.team("B", d);
  lg.season.tiebreakers.order.push_back(
      TiebreakRule{TiebreakKind::kLastGames, 1, TiebreakScope::kLeague, {}});
  lg.game(5, a, b, 2, 1);  // file order 0, day 5: A wins
  lg.game(3, b, a, 6, 0);  // file order 1, day 3: B wins
  lg.game(5, b, a, 9, 8);  // file order 2, day 5: B wins (after game 0 on the same day)
  lg.game(4, a, b, 1, 0);  // day 4: A wins
  lg.remaining(6, a, b);
  lg.game(0, a, b, 3, 1);
  lg.season.games.back().date.reset();  // unknown date: counts as unplayed
  const auto order = standfast::engine::played_games_in_order(lg.season);
  REQUIRE(order == std::vector<int>{1, 3, 0, 2});
  const auto r = standfast::engine::played_record(lg.season);
  REQUIRE(r.wins(a) == 2);
  REQUIRE(r.wins(b) == 2);
  REQUIRE(r.runs_for(a) == 0 + 1 + 2 + 8);
  // The last game in order is game 2 (B won): last 1 game A 0-1, B 1-0.
  REQUIRE(r.window_count() == 1);
  REQUIRE(r.last_wins(0, a) == 0);
  REQUIRE(r.last_losses(0, a) == 1);
  REQUIRE(r.last_wins(0, b) == 1);
}

TEST_CASE("window_results and set_window round-trip a window's results in order") {
  // Closed-form check: a last-3 window after the results W L W W (oldest first) holds L W W.
  const std::vector<int> div{1, 1};
  const std::vector<int> conf{1, 1};
  const std::vector<LastGamesWindow> windows{{3, TiebreakScope::kLeague}};
  SeasonRecord r(div, conf, windows);
  for (int won : {1, 0, 1, 1}) won ? r.add_result(0, 1, 2, 1) : r.add_result(1, 0, 2, 1);
  REQUIRE(r.window_results(0, 0) == std::vector<std::int32_t>{0, 1, 1});
  REQUIRE(r.window_results(0, 1) == std::vector<std::int32_t>{1, 0, 0});
  // set_window keeps the last 3 of what it is given and leaves the state add_result would.
  SeasonRecord s(div, conf, windows);
  const std::vector<std::int32_t> five{1, 1, 0, 1, 1};
  s.set_window(0, 0, five);
  REQUIRE(s.window_results(0, 0) == std::vector<std::int32_t>{0, 1, 1});
  REQUIRE(s.last_wins(0, 0) == 2);
  REQUIRE(s.last_losses(0, 0) == 1);
  s.add_result(1, 0, 3, 0);  // a loss pushes out the oldest (the 0)
  REQUIRE(s.window_results(0, 0) == std::vector<std::int32_t>{1, 1, 0});
  const std::vector<std::int32_t> one{1};
  s.set_window(0, 1, one);  // a short window: not yet full
  REQUIRE(s.window_results(0, 1) == std::vector<std::int32_t>{1});
  s.add_result(1, 0, 3, 0);
  REQUIRE(s.window_results(0, 1) == std::vector<std::int32_t>{1, 1});
}
