// Tests for config/as_of.h: the season as known on a date. The reference for "what was known on
// the morning of D" is the same league written with the games of D and later left without
// scores (common practice: a results table as printed that morning); the two must load into the
// same games.
#include <catch2/catch.hpp>
#include <string>

#include "config/as_of.h"
#include "config/load.h"

using namespace standfast::config;

namespace {

const std::string BASE =
    "standfast: 1\n"
    "league: {name: Test League, season: Y1}\n"
    "teams:\n"
    "  - {id: AAA, name: Alpha}\n"
    "  - {id: BBB, name: Bravo}\n"
    "  - {id: CCC, name: Charlie}\n"
    "  - {id: DDD, name: Delta}\n"
    "groups:\n"
    "  - id: east\n"
    "    teams: [AAA, BBB, CCC, DDD]\n"
    "games:\n";

// Played through 2040-05-03; one game on 05-04 not yet played; one postponed without a date.
const std::string SCORED =
    BASE +
    "  - {date: 2040-05-01, home: AAA, away: BBB, home_runs: 5, away_runs: 3}\n"
    "  - {date: 2040-05-01, home: CCC, away: DDD, home_runs: 2, away_runs: 6}\n"
    "  - {date: 2040-05-02, home: BBB, away: CCC, home_runs: 4, away_runs: 5, innings: 10}\n"
    "  - {date: 2040-05-03, home: DDD, away: AAA, home_runs: 1, away_runs: 0, innings: 6, "
    "shortened: true}\n"
    "  - {date: 2040-05-04, home: AAA, away: CCC}\n"
    "  - {date: tbd, home: BBB, away: DDD}\n";

// The same league as printed on the morning of 2040-05-02.
const std::string MORNING_OF_0502 =
    BASE +
    "  - {date: 2040-05-01, home: AAA, away: BBB, home_runs: 5, away_runs: 3}\n"
    "  - {date: 2040-05-01, home: CCC, away: DDD, home_runs: 2, away_runs: 6}\n"
    "  - {date: 2040-05-02, home: BBB, away: CCC}\n"
    "  - {date: 2040-05-03, home: DDD, away: AAA}\n"
    "  - {date: 2040-05-04, home: AAA, away: CCC}\n"
    "  - {date: tbd, home: BBB, away: DDD}\n";

void require_same_games(const Season& a, const Season& b) {
  REQUIRE(a.games.size() == b.games.size());
  for (std::size_t i = 0; i < a.games.size(); ++i) {
    INFO("game " << i);
    const Game& x = a.games[i];
    const Game& y = b.games[i];
    CHECK(x.date == y.date);
    CHECK(x.home == y.home);
    CHECK(x.away == y.away);
    CHECK(x.number == y.number);
    CHECK(x.played == y.played);
    CHECK(x.home_runs == y.home_runs);
    CHECK(x.away_runs == y.away_runs);
    CHECK(x.innings == y.innings);
    CHECK(x.shortened == y.shortened);
    CHECK(x.postponed == y.postponed);
  }
}

}  // namespace

TEST_CASE("the default as-of date is the day after the last played game") {
  const Season s = load_season_text(SCORED, "t.yaml");
  REQUIRE(default_as_of(s) == parse_date("2040-05-04"));
  // As of the default date nothing changes.
  require_same_games(season_as_of(s, *default_as_of(s)), s);
  CHECK(games_played_before(s, *default_as_of(s)) == 4);
}

TEST_CASE("with nothing played the default is the first scheduled date; with no date, none") {
  const Season s = load_season_text(MORNING_OF_0502, "t.yaml");
  CHECK(default_as_of(season_as_of(s, *parse_date("2040-01-01"))) == parse_date("2040-05-01"));
  const Season undated =
      load_season_text(BASE + "  - {date: tbd, home: AAA, away: BBB}\n", "t.yaml");
  CHECK_FALSE(default_as_of(undated).has_value());
}

TEST_CASE("as of a date, the games of that day and later lose their scores") {
  const Season s = load_season_text(SCORED, "t.yaml");
  const Season reference = load_season_text(MORNING_OF_0502, "t.yaml");
  const Season known = season_as_of(s, *parse_date("2040-05-02"));
  require_same_games(known, reference);
  CHECK(games_played_before(s, *parse_date("2040-05-02")) == 2);
  // Everything but the games is untouched.
  CHECK(known.teams.size() == s.teams.size());
  CHECK(known.league.name == s.league.name);
  // The original is not modified.
  CHECK(s.games[2].played);
  CHECK(s.games[3].shortened);
}

TEST_CASE(
    "an as-of date before the first game leaves nothing played; a later one changes nothing") {
  const Season s = load_season_text(SCORED, "t.yaml");
  const Season before = season_as_of(s, *parse_date("2040-04-01"));
  for (const Game& g : before.games) CHECK_FALSE(g.played);
  CHECK(games_played_before(s, *parse_date("2040-04-01")) == 0);
  require_same_games(season_as_of(s, *parse_date("2041-01-01")), s);
}
