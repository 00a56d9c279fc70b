// Tests for config/games_csv.h: the games CSV named by `games_file`, read through load_season
// so that every message is checked with the CSV file name and its 1-based line (and field).
// Fixtures: tests/data/config/csv/ (invented clubs).
#include <catch2/catch.hpp>
#include <string>

#include "config/games_csv.h"
#include "config/load.h"

using namespace standfast::config;
using Catch::Matchers::Contains;

namespace {

const std::string DIR = STANDFAST_TEST_DATA "/config/csv";

// Four clubs; the season file is taken to live in DIR, so games_file names a fixture there.
const std::string BASE =
    "standfast: 1\n"
    "league: {name: Test League, season: Y1}\n"
    "teams: [{id: AAA, name: Alpha}, {id: BBB, name: Bravo}, {id: CCC, name: Charlie}]\n"
    "groups: [{id: all, teams: [AAA, BBB, CCC]}]\n";  // 4 lines

Season load_with(const std::string& csv, const std::string& more = "") {
  return load_season_text(BASE + more + "games_file: " + csv + "\n", DIR + "/season.yaml");
}

std::string errors_with(const std::string& csv, const std::string& more = "") {
  try {
    load_with(csv, more);
  } catch (const ConfigError& e) {
    return e.what();
  }
  return "";
}

}  // namespace

TEST_CASE("quoted fields, spaces and CRLF line ends are read") {
  const Season s = load_with("quoted.csv");
  REQUIRE(s.games.size() == 2);
  CHECK(s.games[0].home == 0);
  CHECK(s.games[0].away == 2);
  CHECK(s.games[0].innings == 9);
  CHECK(s.games[1].home == 2);
  CHECK(s.games[1].home_runs == 3);
  CHECK(s.games[1].pos.file == DIR + "/quoted.csv");
  CHECK(s.games[1].pos.line == 3);
}

TEST_CASE("a CSV without a required column is refused") {
  CHECK(errors_with("missing_column.csv") == DIR +
                                                 "/missing_column.csv:2: missing column 'away' "
                                                 "(the header must name date, home and away)");
}

TEST_CASE("a CSV line with too many or too few fields is refused") {
  CHECK(errors_with("field_count.csv") ==
        DIR + "/field_count.csv:3: this line has 6 fields but the header has 5\n" + DIR +
            "/field_count.csv:4: this line has 3 fields but the header has 5");
}

TEST_CASE("an unknown CSV column is reported with a suggestion and its field number") {
  CHECK(errors_with("unknown_column.csv") ==
        DIR +
            "/unknown_column.csv:1:4: unknown column 'hme_runs' (did you mean 'home_runs'?); "
            "known columns: date, home, away, game, home_runs, away_runs, innings, status");
}

TEST_CASE("every game problem of a CSV is reported with its line and field") {
  const std::string f = DIR + "/problems.csv:";
  CHECK(errors_with("problems.csv") ==
        f + "3:6: a played game cannot end tied (3-3): extra innings go on until one side leads\n" +
            f +
            "4:5: only one score given (home_runs 3, away_runs missing): a played game needs both, "
            "a game not played neither\n" +
            f + "5:5: home_runs: must be a whole number from 0 to 99, got -2\n" + f +
            "6:5: home_runs: must be a whole number, got 1.5\n" + f +
            "7:7: innings: 6 is fewer than the 9 of regulation; mark the game shortened if the "
            "officials ended it early\n" +
            f + "9:8: status: a postponed game cannot have a score\n" + f +
            "10:8: status: unknown status 'delayed', expected final, shortened or postponed\n" + f +
            "11:1: date: cannot read '2031-04-31' as a date (YYYY-MM-DD, or tbd when not known)\n" +
            f + "12:3: away: team 'AAA' cannot play itself (home and away are the same)\n" + f +
            "13:3: away: unknown team 'XYZ'\n" + f + "14:4: game: must be at least 1, got 0\n" + f +
            "16: the same game is listed twice (2031-04-13, CCC at AAA, game 1); first listed at " +
            f + "15");
}

TEST_CASE("the same game inline and in the CSV is a duplicate") {
  CHECK(errors_with("quoted.csv", "games: [{date: 2031-04-02, home: AAA, away: CCC}]\n") ==
        DIR +
            "/quoted.csv:2: the same game is listed twice (2031-04-02, CCC at AAA, game 1); "
            "first listed at " +
            DIR + "/season.yaml:5");
}

TEST_CASE("an empty or binary games file is refused without crashing") {
  CHECK(errors_with("empty.csv") ==
        DIR + "/empty.csv: the games file is empty: it needs a header line (date,home,away,...)");
  const std::string junk = errors_with("junk.csv");
  CHECK_THAT(junk, Contains(DIR + "/junk.csv:2"));
  CHECK(junk.find("the same game") == std::string::npos);
}

TEST_CASE("a missing games file names the season file line that names it") {
  CHECK(errors_with("absent.csv") == DIR + "/season.yaml:5:13: games_file: cannot read '" + DIR +
                                         "/absent.csv': No such file or directory");
}
