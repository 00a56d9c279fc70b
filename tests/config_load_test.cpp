// Tests for config/load.h: reading valid season files and reporting every kind of problem with
// its file, line and column. Fixtures are invented clubs (tests/data/config/) or inline text.
// Line and column numbers below are counted by hand in the fixture text (1-based).
#include <catch2/catch.hpp>
#include <string>

#include "config/load.h"

using namespace standfast::config;
using Catch::Matchers::Contains;

namespace {

const std::string DATA = STANDFAST_TEST_DATA "/config";

// Four clubs, two conferences: 'east' holds division 'east-a', 'west' is its own division.
// Its 13 lines end with a newline; appended sections start on line 14.
const std::string BASE =
    "standfast: 1\n"                             // 1
    "league: {name: Test League, season: Y1}\n"  // 2
    "teams:\n"                                   // 3
    "  - {id: AAA, name: Alpha}\n"               // 4
    "  - {id: BBB, name: Bravo}\n"               // 5
    "  - {id: CCC, name: Charlie}\n"             // 6
    "  - {id: DDD, name: Delta}\n"               // 7
    "groups:\n"                                  // 8
    "  - id: east\n"                             // 9
    "    groups:\n"                              // 10
    "      - {id: east-a, teams: [AAA, BBB]}\n"  // 11
    "  - id: west\n"                             // 12
    "    teams: [CCC, DDD]\n";                   // 13

// The error text of loading `yaml` as t.yaml, or "" when it loads.
std::string errors_of(const std::string& yaml) {
  try {
    load_season_text(yaml, "t.yaml");
  } catch (const ConfigError& e) {
    return e.what();
  }
  return "";
}

std::string games(const std::string& rows) { return BASE + "games:\n" + rows; }

}  // namespace

TEST_CASE("a complete valid season file loads with every key") {
  const Season s = load_season(DATA + "/valid/season.yaml");
  REQUIRE(s.file == DATA + "/valid/season.yaml");
  REQUIRE(s.warnings.empty());
  CHECK(s.league.name == "Tidewater Circuit");
  CHECK(s.league.season_label == "Year 3");
  CHECK(s.league.regulation_innings == 9);
  CHECK(s.league.extra_innings.runner_on_second);
  CHECK(s.league.extra_innings.max_innings == 0);
  REQUIRE(s.teams.size() == 12);
  CHECK(s.teams[0].venue == "Reedbank Park");
  CHECK(s.teams[0].run_factor == 1.04);
  CHECK(s.teams[1].venue == "Brackwater Pilots");  // default: the team name
  CHECK(s.teams[1].run_factor == 1.0);
  CHECK(s.teams[0].pos.line == 12);
  REQUIRE(s.groups.size() == 6);
  REQUIRE(s.conferences == std::vector<int>{0, 3});
  REQUIRE(s.divisions == std::vector<int>{1, 2, 4, 5});
  CHECK(s.groups[1].id == "north-coast");
  CHECK(s.groups[1].parent == 0);
  CHECK(s.groups[0].children == std::vector<int>{1, 2});
  CHECK(s.groups[5].teams == std::vector<int>{9, 10, 11});
  CHECK(s.teams[4].division == 2);  // ELS: Hills Division
  CHECK(s.teams[4].conference == 0);
  CHECK(s.teams[11].division == 5);  // LOM: Plain Division
  CHECK(s.teams[11].conference == 3);

  const Postseason& p = s.postseason;
  REQUIRE(p.enabled);
  CHECK(p.format == BracketFormat::kConferenceBrackets);
  CHECK(p.reseed);
  REQUIRE(p.qualifying.size() == 2);
  CHECK(p.qualifying[0].conference == 0);
  CHECK(p.qualifying[0].division_winners == 2);
  CHECK(p.qualifying[0].at_large == 2);
  CHECK(p.qualifying[0].winners_first);
  CHECK(p.qualifying[1].conference == 3);
  CHECK_FALSE(p.qualifying[1].winners_first);  // per_conference override
  CHECK(p.qualifying[1].at_large == 2);        // inherited from qualify
  REQUIRE(p.rounds.size() == 3);
  CHECK(p.rounds[0].higher_hosts == std::vector<bool>{true, false, true});
  CHECK(p.rounds[1].best_of == 5);
  CHECK(p.rounds[1].higher_hosts == std::vector<bool>{true, true, false, false, true});
  CHECK(p.rounds[2].higher_hosts == std::vector<bool>{true, true, false, false, false, true, true});

  REQUIRE(s.tiebreakers.order.size() == 4);
  CHECK(s.tiebreakers.order[1].kind == TiebreakKind::kRunDifferential);
  CHECK(s.tiebreakers.order[2].kind == TiebreakKind::kLastGames);
  CHECK(s.tiebreakers.order[2].games == 10);
  CHECK(s.tiebreakers.order[2].scope == TiebreakScope::kConference);
  CHECK(s.tiebreakers.extra_game);

  CHECK(s.model.family == ScoreFamily::kWeibull);
  CHECK(s.model.shape == 1.83);
  CHECK_FALSE(s.model.home_edge.has_value());
  CHECK(s.model.shrink_games == 15.0);
  REQUIRE(s.model.lopsided.has_value());
  CHECK(s.model.lopsided->margin == 7);
  CHECK(s.model.lopsided->weight == 0.5);
  CHECK_FALSE(s.model.strength_uncertainty);

  REQUIRE(s.overrides.size() == 2);
  CHECK(s.overrides[0].team == 0);
  CHECK(s.overrides[0].runs_scored == 4.9);
  CHECK(s.overrides[0].blend == 0.5);
  CHECK(s.overrides[0].from == parse_date("2031-05-01"));
  CHECK(s.overrides[1].win_pct == 0.55);

  REQUIRE(s.games.size() == 9);  // 4 inline, then 5 from the CSV
  CHECK(s.games[0].played);
  CHECK(s.games[0].home_runs == 5);
  CHECK(s.games[1].shortened);
  CHECK(s.games[1].innings == 7);
  CHECK(s.games[2].number == 2);
  CHECK_FALSE(s.games[2].played);
  CHECK_FALSE(s.games[3].date.has_value());
  CHECK(s.games[3].postponed);
  CHECK(s.games[4].pos.file == DATA + "/valid/games.csv");
  CHECK(s.games[4].pos.line == 3);
  CHECK(s.games[4].innings == 10);
  CHECK(s.games[4].away_runs == 6);
  CHECK(s.games[7].pos.line == 7);  // blank line skipped, numbering kept
  CHECK(s.games[7].postponed);
  CHECK(s.games[7].date.has_value());
}

TEST_CASE("defaults apply when optional sections are absent") {
  const Season s = load_season_text(BASE, "t.yaml");
  CHECK(s.file == "t.yaml");
  CHECK_FALSE(s.postseason.enabled);
  REQUIRE(s.tiebreakers.order.size() == 4);
  CHECK(s.tiebreakers.order[0].kind == TiebreakKind::kHeadToHead);
  CHECK(s.tiebreakers.order[1].kind == TiebreakKind::kDivisionRecord);
  CHECK(s.tiebreakers.order[2].kind == TiebreakKind::kConferenceRecord);
  CHECK(s.tiebreakers.order[3].kind == TiebreakKind::kDraw);
  CHECK(s.model.family == ScoreFamily::kWeibull);
  CHECK(s.league.regulation_innings == 9);
  // 'west' lists teams directly: it is a conference and a division at once.
  CHECK(s.conferences == std::vector<int>{0, 2});
  CHECK(s.divisions == std::vector<int>{1, 2});
  CHECK(s.teams[2].division == 2);
  CHECK(s.teams[2].conference == 2);
}

TEST_CASE("a YAML syntax error names the file and line") {
  const std::string e = errors_of("standfast: 1\nleague: {name: x, season: y\nteams: []\n");
  CHECK_THAT(e, Contains("t.yaml:"));
  CHECK_THAT(e, Contains("YAML syntax error"));
}

TEST_CASE("an unknown key is reported with a suggestion") {
  CHECK(errors_of(BASE + "tiebreakerz: {order: [draw]}\n") ==
        "t.yaml:14:1: unknown key 'tiebreakerz' at the top level (did you mean 'tiebreakers'?); "
        "known keys: standfast, league, teams, groups, postseason, tiebreakers, model, "
        "overrides, games, games_file");
}

TEST_CASE("negative innings and a nan run factor are refused") {
  std::string yaml = BASE;
  yaml.replace(yaml.find("season: Y1}"), 11, "season: Y1, innings: -3}");
  yaml.replace(yaml.find("name: Alpha}"), 12, "name: Alpha, run_factor: nan}");
  const std::string e = errors_of(yaml);
  CHECK_THAT(e, Contains("t.yaml:2:50: league.innings: must be between 1 and 99, got -3"));
  CHECK_THAT(e, Contains("t.yaml:4:40: teams[0].run_factor: must be finite, got nan"));
}

TEST_CASE("a game naming an unknown team is reported with a suggestion") {
  CHECK(errors_of(games("  - {date: 2031-04-02, home: AAB, away: CCC}\n")) ==
        "t.yaml:15:30: games[0].home: unknown team 'AAB' (did you mean 'AAA'?)");
}

TEST_CASE("a played game with a tied score is refused") {
  CHECK(errors_of(
            games("  - {date: 2031-04-02, home: AAA, away: CCC, home_runs: 3, away_runs: 3}\n")) ==
        "t.yaml:15:71: games[0]: a played game cannot end tied (3-3): extra innings go on until "
        "one side leads");
}

TEST_CASE("a missing games file names the season file line") {
  CHECK_THAT(errors_of(BASE + "games_file: nowhere.csv\n"),
             Contains("t.yaml:14:13: games_file: cannot read 'nowhere.csv': No such file"));
}
