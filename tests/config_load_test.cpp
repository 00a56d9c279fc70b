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
  CHECK(errors_of("standfast: 1\nleague:\n  name: x\n   season: y\n") ==
        "t.yaml:4:10: YAML syntax error: illegal map value");
  CHECK(errors_of("standfast: 1\nleague: {name: x, season: y\nteams: []\n") ==
        "t.yaml:3:6: YAML syntax error: end of map flow not found");
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

namespace {

// Twelve clubs, two conferences of two divisions of three; 17 lines, postseason from line 18.
const std::string LEAGUE12 =
    "standfast: 1\n"                             // 1
    "league: {name: Test League, season: Y1}\n"  // 2
    "teams:\n"                                   // 3
    "  - {id: A1, name: A1}\n"                   // 4
    "  - {id: A2, name: A2}\n"                   // 5
    "  - {id: A3, name: A3}\n"                   // 6
    "  - {id: B1, name: B1}\n"                   // 7
    "  - {id: B2, name: B2}\n"                   // 8
    "  - {id: B3, name: B3}\n"                   // 9
    "  - {id: C1, name: C1}\n"                   // 10
    "  - {id: C2, name: C2}\n"                   // 11
    "  - {id: C3, name: C3}\n"                   // 12
    "  - {id: D1, name: D1}\n"                   // 13
    "  - {id: D2, name: D2}\n"                   // 14
    "  - {id: D3, name: D3}\n"                   // 15
    "groups:\n"                                  // 16
    "  - {id: east, groups: [{id: ea, teams: [A1, A2, A3]}, {id: eb, teams: [B1, B2, B3]}]}\n"
    "  - {id: west, groups: [{id: wc, teams: [C1, C2, C3]}, {id: wd, teams: [D1, D2, D3]}]}\n";

std::string postseason(const std::string& qualify, const std::string& rounds,
                       const std::string& extra = "") {
  return LEAGUE12 + "postseason:\n" + extra + "  qualify: " + qualify + "\n  rounds:\n" + rounds;
}

const std::string ROUND = "    - {best_of: 1}\n";

}  // namespace

TEST_CASE("a duplicate team id is refused") {
  std::string yaml = BASE;
  yaml.replace(yaml.find("id: DDD"), 7, "id: AAA");
  CHECK_THAT(
      errors_of(yaml),
      Contains("t.yaml:7:10: teams[3].id: duplicate team id 'AAA' (first defined at line 4)"));
}

TEST_CASE("a team in two divisions is refused") {
  std::string yaml = BASE;
  yaml.replace(yaml.find("[CCC, DDD]"), 10, "[CCC, DDD, AAA]");
  CHECK(errors_of(yaml) ==
        "t.yaml:13:23: groups[1].teams[2]: team 'AAA' is already in group 'east-a' (line 11); a "
        "team belongs to one division");
}

TEST_CASE("a team in no division is refused") {
  std::string yaml = BASE;
  yaml.replace(yaml.find("[CCC, DDD]"), 10, "[CCC]");
  CHECK(errors_of(yaml) ==
        "t.yaml:7:5: team 'DDD' is in no division: list it in the `teams` of one group");
}

TEST_CASE("a team playing itself is refused") {
  CHECK(errors_of(games("  - {date: 2031-04-02, home: AAA, away: AAA}\n")) ==
        "t.yaml:15:41: games[0].away: team 'AAA' cannot play itself (home and away are the same)");
}

TEST_CASE("a game with only one score is refused") {
  CHECK(errors_of(games("  - {date: 2031-04-02, home: AAA, away: CCC, home_runs: 4}\n")) ==
        "t.yaml:15:57: games[0]: only one score given (home_runs 4, away_runs missing): a played "
        "game needs both, a game not played neither");
}

TEST_CASE("negative and fractional scores are refused") {
  CHECK(errors_of(games(
            "  - {date: 2031-04-02, home: AAA, away: CCC, home_runs: -1, away_runs: 2.5}\n")) ==
        "t.yaml:15:57: games[0].home_runs: must be a whole number from 0 to 99, got -1\n"
        "t.yaml:15:72: games[0].away_runs: must be a whole number, got 2.5");
}

TEST_CASE("a played game shorter than regulation must be marked shortened") {
  const std::string row =
      "  - {date: 2031-04-02, home: AAA, away: CCC, home_runs: 4, away_runs: 1, innings: 7";
  CHECK(errors_of(games(row + "}\n")) ==
        "t.yaml:15:83: games[0].innings: 7 is fewer than the 9 of regulation; mark the game "
        "shortened if the officials ended it early");
  CHECK(errors_of(games(row + ", shortened: true}\n")).empty());
  CHECK(errors_of(games(row + ", status: shortened}\n")).empty());
}

TEST_CASE("an impossible or unreadable date is refused") {
  CHECK(errors_of(games("  - {date: 2031-02-30, home: AAA, away: CCC}\n")) ==
        "t.yaml:15:12: games[0].date: cannot read '2031-02-30' as a date (YYYY-MM-DD, or tbd "
        "when not known)");
  CHECK_THAT(errors_of(games("  - {date: April 2, home: AAA, away: CCC}\n")),
             Contains("t.yaml:15:12: games[0].date: cannot read 'April 2' as a date"));
}

TEST_CASE("the same game listed twice is refused; postponed games without a date are not") {
  const std::string row = "  - {date: 2031-04-02, home: AAA, away: CCC}\n";
  CHECK(errors_of(games(row + "  - {date: 2031-04-02, home: CCC, away: AAA}\n" + row)) ==
        "t.yaml:17:5: the same game is listed twice (2031-04-02, CCC at AAA, game 1); first "
        "listed at t.yaml:15");
  // A second game of a doubleheader is a different game.
  CHECK(errors_of(games(row + "  - {date: 2031-04-02, home: AAA, away: CCC, game: 2}\n")).empty());
  const std::string tbd = "  - {date: tbd, home: AAA, away: CCC}\n";
  CHECK(errors_of(games(tbd + tbd)).empty());
}

TEST_CASE("the postseason bracket must reduce the field to one team") {
  SECTION("a valid bracket with byes: 3 teams, 1 bye, 2 rounds per conference and a final") {
    const Season s = load_season_text(
        postseason("{division_winners: 2, at_large: 1, byes: 1}", ROUND + ROUND + ROUND), "t.yaml");
    REQUIRE(s.postseason.qualifying.size() == 2);
    CHECK(s.postseason.qualifying[1].byes == 1);
    CHECK(s.postseason.rounds.size() == 3);
  }
  SECTION("an odd number of teams in the first round") {
    CHECK(errors_of(postseason("{division_winners: 2, at_large: 1}", ROUND + ROUND + ROUND)) ==
          "t.yaml:20:3: postseason: the bracket of conference 'east' cannot reduce to one team: "
          "a field of 3 teams with 0 byes leaves 3 teams to play the first round, an odd number");
  }
  SECTION("a round count that disagrees with the field") {
    CHECK(errors_of(postseason("{division_winners: 2, at_large: 1, byes: 1}", ROUND + ROUND)) ==
          "t.yaml:22:5: postseason.rounds: 2 rounds are listed but the bracket needs 3 (2 rounds "
          "in each conference + 1 round between the 2 conference winners)");
  }
  SECTION("conferences that need different numbers of rounds") {
    CHECK(errors_of(postseason("{division_winners: 2, at_large: 2}", ROUND + ROUND + ROUND,
                               "  per_conference: {west: {at_large: 0}}\n")) ==
          "t.yaml:20:3: postseason: conference 'east' needs 2 rounds but conference 'west' needs "
          "1 round; every conference must need the same number");
  }
  SECTION("a single bracket seeds the whole league together") {
    // 6 qualifiers, 2 byes: 4 teams play the first round, 2 + 2 = 4 remain: 3 rounds.
    const Season s =
        load_season_text(postseason("{division_winners: 2, at_large: 1, byes: 1}",
                                    ROUND + ROUND + ROUND, "  format: single_bracket\n"),
                         "t.yaml");
    CHECK(s.postseason.format == BracketFormat::kSingleBracket);
    CHECK_THAT(errors_of(postseason("{division_winners: 2, at_large: 1, byes: 1}", ROUND + ROUND,
                                    "  format: single_bracket\n")),
               Contains("t.yaml:23:5: postseason.rounds: 2 rounds are listed but the bracket "
                        "needs 3 (6 teams with 2 byes)"));
  }
}

TEST_CASE("a postseason cannot need more qualifiers than a conference has teams") {
  CHECK(errors_of(postseason("{division_winners: 2, at_large: 5}", ROUND)) ==
        "t.yaml:20:44: postseason: 7 qualifiers (2 division winners + 5 at-large) but conference "
        "'east' has 6 teams\n"
        "t.yaml:20:44: postseason: 7 qualifiers (2 division winners + 5 at-large) but conference "
        "'west' has 6 teams");
}

TEST_CASE("a postseason cannot need more division winners than a conference has divisions") {
  CHECK(errors_of(postseason("{division_winners: 2}", ROUND + ROUND,
                             "  per_conference: {west: {division_winners: 3}}\n")) ==
        "t.yaml:20:45: postseason: 3 division winners qualify but conference 'west' has 2 "
        "divisions");
}

TEST_CASE("a bye count as large as the field is refused") {
  CHECK_THAT(errors_of(postseason("{at_large: 2, byes: 5}", ROUND)),
             Contains("t.yaml:20:32: postseason: 5 byes in conference 'east' but its field is 4 "
                      "teams; byes must be fewer than the field"));
}

TEST_CASE("an even series length is refused") {
  CHECK(errors_of(postseason("{}", "    - {best_of: 4}\n    - {best_of: 3}\n")) ==
        "t.yaml:22:17: postseason.rounds[0].best_of: a series length must be odd, got 4");
}

TEST_CASE("hosts blocks must add up to the series length") {
  CHECK(errors_of(postseason("{}", "    - {best_of: 5, hosts: [2, 2]}\n    - {best_of: 3}\n")) ==
        "t.yaml:22:27: postseason.rounds[0].hosts: the blocks add up to 4 games but the series is "
        "best of 5");
}

TEST_CASE("an unknown tiebreaker is reported with a suggestion") {
  CHECK(errors_of(BASE + "tiebreakers:\n  order: [head_to_head, run_diferential]\n") ==
        "t.yaml:15:25: tiebreakers.order[1]: unknown tiebreaker 'run_diferential' (did you mean "
        "'run_differential'?); known: head_to_head, division_record, conference_record, "
        "run_differential, {last_games: N, within: SCOPE}, draw");
}

TEST_CASE("an override naming an unknown team is refused") {
  CHECK(errors_of(BASE + "overrides:\n  - {team: BBC, win_pct: 0.6}\n") ==
        "t.yaml:15:12: overrides[0].team: unknown team 'BBC' (did you mean 'BBB'?)");
}

TEST_CASE("an override giving neither runs nor a win percentage is refused") {
  CHECK(errors_of(BASE +
                  "overrides:\n  - {team: AAA, win_pct: 0.6}\n  - {team: AAA, blend: 0.5}\n") ==
        "t.yaml:16:5: overrides[1]: an override needs runs_scored/runs_allowed, win_pct or "
        "add_runs_scored/add_runs_allowed");
}

TEST_CASE("the log5 family needs a win percentage for every team") {
  CHECK(errors_of(BASE + "model: {family: log5}\n"
                         "overrides: [{team: AAA, win_pct: 0.6}, {team: CCC, win_pct: 0.45}]\n") ==
        "t.yaml:14:17: model.family: log5 needs a win_pct override for every team; missing for "
        "BBB, DDD");
}

TEST_CASE("games per team disagreeing with the schedule is a warning, not an error") {
  std::string yaml = games(
      "  - {date: 2031-04-02, home: AAA, away: CCC}\n"
      "  - {date: 2031-04-02, home: BBB, away: DDD}\n"
      "  - {date: 2031-04-03, home: CCC, away: AAA}\n");
  yaml.replace(yaml.find("season: Y1}"), 11, "season: Y1, games_per_team: 2}");
  const Season s = load_season_text(yaml, "t.yaml");
  REQUIRE(s.warnings.size() == 1);
  CHECK(format_diagnostic(s.warnings[0]) ==
        "t.yaml:2:57: league.games_per_team is 2 but 2 of 4 teams have a different number of "
        "games on the schedule: BBB 1, DDD 1");
}

TEST_CASE("every problem of a file is reported at once, in file order") {
  std::string yaml = games(
      "  - {date: 2031-04-02, home: AAA, away: CCC, home_runs: 2, away_runs: 2}\n"
      "  - {date: 2031-13-02, home: EEE, away: CCC}\n");
  yaml.replace(yaml.find("season: Y1}"), 11, "season: Y1, innigs: 7}");
  yaml += "model: {family: weibul, shrink_games: -1}\n";
  try {
    load_season_text(yaml, "t.yaml");
    FAIL("no error");
  } catch (const ConfigError& e) {
    REQUIRE(e.problems().size() == 6);
    CHECK(format_diagnostic(e.problems()[0]).rfind("t.yaml:2:", 0) == 0);
    CHECK_THAT(e.what(), Contains("unknown key 'innigs' in league (did you mean 'innings'?)"));
    CHECK_THAT(e.what(), Contains("t.yaml:15:"));
    CHECK_THAT(e.what(), Contains("t.yaml:16:12: games[1].date"));
    CHECK_THAT(e.what(), Contains("t.yaml:16:30: games[1].home: unknown team 'EEE'"));
    CHECK_THAT(e.what(),
               Contains("model.family: unknown family 'weibul' (did you mean 'weibull'?)"));
    CHECK_THAT(e.what(), Contains("model.shrink_games: must be >= 0"));
  }
}

TEST_CASE("wrong types name the key and what was found") {
  CHECK(errors_of(BASE + "model: {shape: [1, 2], strength_uncertainty: maybe}\n") ==
        "t.yaml:14:16: model.shape: must be `fit` or a number, got a list\n"
        "t.yaml:14:46: model.strength_uncertainty: must be true or false, got 'maybe'");
  CHECK(errors_of("standfast: 2\nleague: {name: x, season: y}\nteams: []\ngroups: []\n") ==
        "t.yaml:1:12: standfast: the format version must be 1, got '2'\n"
        "t.yaml:3:8: teams: a league needs at least 2 teams, got 0\n"
        "t.yaml:4:9: groups: is empty");
}

TEST_CASE("bad input never crashes: empty, a list, binary junk") {
  CHECK(errors_of("") ==
        "t.yaml: the season file is empty: it needs at least standfast, league, teams and groups");
  CHECK(errors_of("# nothing but a comment\n") ==
        "t.yaml: the season file is empty: it needs at least standfast, league, teams and groups");
  CHECK(errors_of("- standfast\n- league\n") ==
        "t.yaml:1:1: the season file: must be a map of keys, got a list");
  CHECK(errors_of("just some words") ==
        "t.yaml:1:1: the season file: must be a map of keys, got 'just some words'");
  std::string junk;
  for (int i = 0; i < 4096; ++i) junk += static_cast<char>((i * 7919 + 13) % 256);
  CHECK_THAT(errors_of(junk), Contains("t.yaml:"));
  CHECK_THAT(errors_of(BASE + junk), Contains("t.yaml:"));
  const std::string bin = DATA + "/bad/junk.yaml";
  try {
    load_season(bin);
    FAIL("no error");
  } catch (const ConfigError& e) {
    CHECK_THAT(e.what(), Contains(bin + ":"));
  }
  try {
    load_season(DATA + "/bad/no-such-file.yaml");
    FAIL("no error");
  } catch (const ConfigError& e) {
    CHECK_THAT(e.what(), Contains("no-such-file.yaml: cannot read the season file"));
  }
}

TEST_CASE("keys given twice, huge numbers and malformed groups are refused") {
  std::string yaml = BASE;
  yaml.replace(yaml.find("season: Y1}"), 11, "season: Y1, innings: 99999999999999999999}");
  CHECK(errors_of(yaml) ==
        "t.yaml:2:50: league.innings: must be a whole number within range, got "
        "99999999999999999999");
  CHECK(errors_of(BASE + "model: {family: poisson, family: log5}\n") ==
        "t.yaml:14:26: key 'family' is given twice in model");
  yaml = BASE;
  yaml.replace(yaml.find("    teams: [CCC, DDD]"), 21,
               "    teams: [CCC, DDD]\n    groups: [{id: w1, teams: [CCC]}]");
  CHECK_THAT(
      errors_of(yaml),
      Contains("t.yaml:12:5: groups[1]: a group lists either `groups` or `teams`, not both"));
  yaml = BASE;
  yaml.replace(yaml.find("      - {id: east-a, teams: [AAA, BBB]}"), 39, "      - {id: east-a}");
  CHECK_THAT(errors_of(yaml), Contains("t.yaml:11:9: groups[0].groups[0]: a group needs `groups` "
                                       "(sub-groups) or `teams` (a division)"));
}

TEST_CASE("three conference brackets cannot end in one final") {
  const std::string yaml =
      "standfast: 1\n"
      "league: {name: Test League, season: Y1}\n"
      "teams: [{id: A, name: A}, {id: B, name: B}, {id: C, name: C}]\n"
      "groups: [{id: x, teams: [A]}, {id: y, teams: [B]}, {id: z, teams: [C]}]\n"
      "postseason: {format: conference_brackets, rounds: [{best_of: 1}]}\n";
  CHECK_THAT(errors_of(yaml),
             Contains("t.yaml:5:22: postseason.format: conference_brackets with 3 conferences "
                      "cannot end in one final"));
  std::string single = yaml;
  single.replace(single.find("conference_brackets"), 19, "single_bracket");
  single.replace(single.find("[{best_of: 1}]"), 14, "[{best_of: 1}, {best_of: 1}]");
  CHECK_THAT(errors_of(single),
             Contains("t.yaml:5:13: postseason: the bracket cannot reduce to one "
                      "team: a field of 3 teams with 0 byes"));
}

TEST_CASE("shrink_games: a number of games or auto") {
  CHECK(load_season_text(BASE + "model: {shrink_games: auto}\n", "t.yaml").model.shrink_auto);
  const Season s = load_season_text(BASE + "model: {shrink_games: 12.5}\n", "t.yaml");
  CHECK_FALSE(s.model.shrink_auto);
  CHECK(s.model.shrink_games == 12.5);
  CHECK(errors_of(BASE + "model: {shrink_games: sometimes}\n") ==
        "t.yaml:14:23: model.shrink_games: must be `auto` or a number, got 'sometimes'");
}
