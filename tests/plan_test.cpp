// Tests for engine/plan.h: compiling a season and its ratings into flat arrays.
// Expected values are read off the invented games written out below (counting by hand);
// standard bracket order is common practice (1 v 8, 4 v 5, 2 v 7, 3 v 6).
#include "engine/plan.h"

#include <algorithm>
#include <catch2/catch.hpp>

#include "models/ratings.h"

using namespace standfast;
using namespace standfast::engine;

namespace {

config::Season league(int qualifiers, int byes) {
  config::Season s;
  s.file = "plan.yaml";
  config::Group g;
  g.id = "C";
  for (int t = 0; t < 8; ++t) {
    config::Team team;
    team.id = "T";
    team.id += std::to_string(t);
    team.division = 0;
    team.conference = 0;
    team.run_factor = t == 0 ? 1.10 : 1.0;
    s.teams.push_back(team);
    g.teams.push_back(t);
  }
  s.groups.push_back(g);
  s.conferences = {0};
  s.divisions = {0};
  auto game = [](std::optional<int> day, int h, int a, bool played) {
    config::Game x;
    if (day) x.date = 19000 + *day;
    x.home = h;
    x.away = a;
    x.played = played;
    x.home_runs = played ? 5 : 0;
    x.away_runs = played ? 2 : 0;
    return x;
  };
  s.games = {game(1, 0, 1, true), game(9, 2, 3, false), game(std::nullopt, 4, 5, false),
             game(3, 0, 6, false), game(5, 7, 0, false)};
  s.postseason.enabled = true;
  s.postseason.qualifying.push_back(config::Qualifying{0, 1, qualifiers - 1, byes, true});
  for (int r = 0; r < 3; ++r) {
    config::Round round;
    round.name = "R";
    round.name += std::to_string(r);
    round.best_of = 2 * r + 1;
    s.postseason.rounds.push_back(round);
  }
  return s;
}

models::LeagueRatings ratings(std::size_t n) {
  models::LeagueRatings r;
  r.league_mean = 4.4;
  r.shape = 1.8;
  r.home_edge = 1.05;
  r.teams.assign(n, models::TeamRating{});
  r.teams[1].offence = 1.2;
  r.teams[1].log_offence_se = 0.1;
  return r;
}

}  // namespace

TEST_CASE("remaining games in date order, undated last; venue and home factors") {
  const auto s = league(6, 2);
  const Plan p = compile_plan(s, ratings(8));
  REQUIRE(p.remaining_games() == 4);
  // Days 3, 5, 9, then the undated game.
  CHECK(p.game_index == std::vector<int>{3, 4, 1, 2});
  CHECK(p.home_team[0] == 0);
  CHECK(p.away_team[0] == 6);
  const auto matchup = [&](std::size_t g) { return p.matchups[p.game_matchup[g]]; };
  CHECK(matchup(0).home_factor == Approx(1.10 * 1.05).epsilon(1e-6));  // venue x home edge
  CHECK(matchup(0).away_factor == Approx(1.10).epsilon(1e-6));
  CHECK(matchup(1).away_factor == Approx(1.0).epsilon(1e-6));  // day 5: at team 7 (factor 1.0)
  CHECK(p.played.wins(0) == 1);
  CHECK(p.played.losses(1) == 1);
  CHECK(p.max_games == 3);  // team 0: one played game and two left
  CHECK(p.log_offence[1] == Approx(std::log(1.2)));
  // Standard errors without a covariance become a diagonal factor.
  REQUIRE(p.draw_strengths);
  CHECK(p.strengths.scale[1] == 0.1);
  CHECK(p.strengths.normals() == 16);
}

TEST_CASE("brackets: byes, round alignment and bad shapes") {
  const Plan p = compile_plan(league(6, 2), ratings(8));
  REQUIRE(p.brackets.size() == 1);
  CHECK(p.brackets[0].order == std::vector<int>{1, 8, 4, 5, 2, 7, 3, 6});
  CHECK(p.brackets[0].rounds == 3);
  CHECK(p.brackets[0].first_round == 0);
  CHECK(p.rounds[2].best_of == 5);
  CHECK(p.max_seed == 6);
  const Plan four = compile_plan(league(4, 0), ratings(8));
  CHECK(four.brackets[0].first_round == 1);  // two rounds, aligned to the end
  CHECK_THROWS_AS(compile_plan(league(6, 0), ratings(8)), std::invalid_argument);
  CHECK_THROWS_AS(compile_plan(league(6, 2), ratings(7)), std::invalid_argument);
  auto even = league(6, 2);
  even.postseason.rounds[1].best_of = 4;
  CHECK_THROWS_AS(compile_plan(even, ratings(8)), std::invalid_argument);
}

TEST_CASE("overrides switch a team to its override slot from their date on") {
  auto s = league(6, 2);
  config::TeamOverride o;
  o.team = 0;
  o.runs_scored = 6.6;
  o.from = 19000 + 4;
  s.overrides.push_back(o);
  const Plan p = compile_plan(s, ratings(8));
  REQUIRE(p.slots == 9);
  CHECK(p.matchups[p.game_matchup[0]].home_slot == 0);  // day 3: before the override
  CHECK(p.matchups[p.game_matchup[1]].away_slot == 8);  // day 5: team 0 away, override on
  REQUIRE(p.overrides.size() == 1);
  REQUIRE(p.overrides[0].steps.size() == 1);
  CHECK(p.overrides[0].steps[0].offence == Approx(6.6 / 4.4));
  CHECK(p.final_slot[0] == 8);
  CHECK(p.final_slot[1] == 1);
}

TEST_CASE("several overrides of a team apply in date order, each on top of the earlier ones") {
  auto s = league(6, 2);
  config::TeamOverride late;  // listed first, applies last
  late.team = 0;
  late.runs_allowed = 3.3;
  late.from = 19000 + 4;
  config::TeamOverride early;
  early.team = 0;
  early.add_runs_scored = 0.44;
  early.from = 19000 + 2;
  s.overrides = {late, early};
  const Plan p = compile_plan(s, ratings(8));
  REQUIRE(p.slots == 10);
  REQUIRE(p.overrides.size() == 2);
  CHECK(p.overrides[0].from == 19002);
  REQUIRE(p.overrides[0].steps.size() == 1);
  CHECK(p.overrides[0].steps[0].add_offence == Approx(0.1));
  CHECK(p.overrides[1].from == 19004);
  REQUIRE(p.overrides[1].steps.size() == 2);  // the added runs stay on
  CHECK(p.overrides[1].steps[1].defence == Approx(3.3 / 4.4));
  CHECK(p.matchups[p.game_matchup[0]].home_slot == 8);  // day 3: first period
  CHECK(p.matchups[p.game_matchup[1]].away_slot == 9);  // day 5: second period
  CHECK(p.final_slot[0] == 9);
}

TEST_CASE("matchups group games with the same slots and factors, at most 2047 games each") {
  auto s = league(6, 2);
  // Day 3 (0 v 6), day 5 (7 v 0), day 9 (2 v 3), undated (4 v 5): four matchups. Then 4,100
  // more games of 2 at 3, which with day 9's game make 4,101: matchups of 2047, 2047 and 7.
  for (int i = 0; i < 4100; ++i) {
    config::Game g;
    g.date = 19100 + i;
    g.home = 2;
    g.away = 3;
    s.games.push_back(g);
  }
  const Plan p = compile_plan(s, ratings(8));
  REQUIRE(p.remaining_games() == 4104);
  REQUIRE(p.game_matchup.size() == 4104);
  std::vector<int> size(p.matchups.size(), 0);
  for (std::size_t g = 0; g < p.remaining_games(); ++g) {
    // No overrides: a side's slot is its team; the venue is the home team's (team 0: 1.10).
    const Matchup& m = p.matchups[p.game_matchup[g]];
    REQUIRE(m.home_slot == p.home_team[g]);
    REQUIRE(m.away_slot == p.away_team[g]);
    const float rf = p.home_team[g] == 0 ? 1.10f : 1.0f;
    REQUIRE(m.home_factor == Approx(rf * 1.05).epsilon(1e-6));
    REQUIRE(m.away_factor == Approx(rf).epsilon(1e-6));
    ++size[p.game_matchup[g]];
  }
  REQUIRE(p.matchups.size() == 6);
  std::sort(size.begin(), size.end());
  CHECK(size == std::vector<int>{1, 1, 1, 7, 2047, 2047});
  CHECK(p.totals.groups() == 6);
}
