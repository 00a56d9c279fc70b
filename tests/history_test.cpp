// Tests for tools/history.h: the odds history in an SQLite file. References: SQLite's own
// documentation of atomic commit (https://www.sqlite.org/atomiccommit.html: a transaction
// interrupted by a crash is rolled back on the next open) and of the file header
// (https://www.sqlite.org/fileformat.html, section 1.3: a database starts with the 16 bytes
// "SQLite format 3\0"), checked here with a real SIGKILL and real damaged files.
#include "tools/history.h"

#include <fmt/core.h>
#include <signal.h>
#include <sys/wait.h>
#include <unistd.h>

#include <catch2/catch.hpp>
#include <cstdlib>
#include <filesystem>
#include <fstream>
#include <string>

#include "config/load.h"
#include "tools/commands.h"

using namespace standfast;
using namespace standfast::tools;
namespace fs = std::filesystem;

namespace {

fs::path fresh_file(const std::string& name) {
  const fs::path dir = fs::temp_directory_path() / fmt::format("standfast_history_{}", ::getpid());
  fs::create_directories(dir);
  const fs::path f = dir / name;
  fs::remove(f);
  return f;
}

HistoryRun sample_run(config::DayNumber as_of, int teams, double shift) {
  HistoryRun r;
  r.league = "Test League";
  r.season_label = "Y1";
  r.as_of = as_of;
  r.season_hash = "0123456789abcdef";
  r.model = "weibull shape=fit home_edge=fit shrink=20 uncertainty=on";
  r.seed = 0xfedcba9876543210ULL;  // above INT64_MAX: must survive the round trip
  r.seasons = 1000;
  r.max_se = 0.0158;
  r.games_played = 12;
  for (int i = 0; i < teams; ++i) {
    HistoryTeam t;
    t.id = fmt::format("T{:02}", i);
    t.name = fmt::format("Team {}", i);
    t.division_id = i % 2 ? "east" : "west";
    t.wins = i;
    t.losses = 10 - i;
    t.games_left = 20;
    t.division = {0.1 * shift + 0.01 * i, 0.003};
    t.postseason = {0.2 + 0.001 * i, 0.004};
    t.bye = {0.05, 0.002};
    t.title = {1.0 / 3.0, 0.001};
    t.mean_wins = 15.25 + i;
    t.wins_histogram = {0, 3, 997, 18446744073709551615ULL};
    r.teams.push_back(t);
  }
  return r;
}

std::string usage_error_of(const fs::path& f) {
  try {
    History::open(f, true);
  } catch (const UsageError& e) {
    return e.what();
  }
  return "";
}

}  // namespace

TEST_CASE("a run recorded in the history reads back exactly") {
  const fs::path f = fresh_file("roundtrip.sqlite");
  const config::DayNumber d = *config::parse_date("2040-05-02");
  {
    History h = History::open(f, true);
    h.record(sample_run(d, 4, 1.0));
  }
  History h = History::open(f, false);
  const auto runs = h.runs("Test League", "Y1");
  REQUIRE(runs.size() == 1);
  const HistoryRun want = sample_run(d, 4, 1.0);
  const HistoryRun& got = runs[0];
  CHECK(got.as_of == d);
  CHECK(got.seed == want.seed);
  CHECK(got.seasons == want.seasons);
  CHECK(got.model == want.model);
  CHECK(got.season_hash == want.season_hash);
  CHECK(got.max_se == want.max_se);  // SQLite REAL is an IEEE double: exact
  REQUIRE(got.teams.size() == 4);
  for (std::size_t i = 0; i < 4; ++i) {
    CHECK(got.teams[i].id == want.teams[i].id);
    CHECK(got.teams[i].division.p == want.teams[i].division.p);
    CHECK(got.teams[i].title.p == want.teams[i].title.p);
    CHECK(got.teams[i].mean_wins == want.teams[i].mean_wins);
    CHECK(got.teams[i].wins_histogram == want.teams[i].wins_histogram);
  }
  CHECK(h.runs("Other League", "Y1").empty());
  CHECK(h.run_at("Test League", "Y1", d).has_value());
  CHECK_FALSE(h.run_at("Test League", "Y1", d + 1).has_value());
}

TEST_CASE("re-recording the same date and settings replaces its rows; dates come back in order") {
  const fs::path f = fresh_file("replace.sqlite");
  const config::DayNumber d = *config::parse_date("2040-05-09");
  History h = History::open(f, true);
  h.record(sample_run(d, 4, 1.0));
  h.record(sample_run(d - 7, 4, 2.0));
  h.record(sample_run(d, 4, 3.0));
  const auto runs = h.runs("Test League", "Y1");
  REQUIRE(runs.size() == 2);
  CHECK(runs[0].as_of == d - 7);
  CHECK(runs[1].as_of == d);
  CHECK(runs[1].teams[0].division.p == Approx(0.3));
  CHECK(runs[1].teams.size() == 4);  // the old rows are gone, not added to
}

TEST_CASE("a run killed in the middle of writing leaves the history as it was") {
  const fs::path f = fresh_file("killed.sqlite");
  const config::DayNumber d = *config::parse_date("2040-05-02");
  {
    History h = History::open(f, true);
    h.record(sample_run(d, 30, 1.0));
  }
  const pid_t child = ::fork();
  REQUIRE(child >= 0);
  if (child == 0) {
    // The child replaces the same run and adds a new date, and is killed after 12 of 30 rows of
    // the replacement: SIGKILL cannot be caught, so no rollback code of ours runs.
    History h = History::open(f, false);
    h.record(sample_run(d, 30, 5.0), [](int written) {
      if (written == 12) ::raise(SIGKILL);
    });
    std::_Exit(0);  // not reached
  }
  int status = 0;
  REQUIRE(::waitpid(child, &status, 0) == child);
  REQUIRE(WIFSIGNALED(status));
  CHECK(WTERMSIG(status) == SIGKILL);

  History h = History::open(f, false);  // the quick check passes: the file is intact
  const auto runs = h.runs("Test League", "Y1");
  REQUIRE(runs.size() == 1);
  const HistoryRun before = sample_run(d, 30, 1.0);
  REQUIRE(runs[0].teams.size() == 30);
  for (std::size_t i = 0; i < 30; ++i) {
    CHECK(runs[0].teams[i].division.p == before.teams[i].division.p);
  }
  // And it still takes new runs.
  h.record(sample_run(d + 7, 30, 1.0));
  CHECK(h.runs("Test League", "Y1").size() == 2);
}

TEST_CASE("a file that is not a history is refused with a clear message") {
  SECTION("not an SQLite file") {
    const fs::path f = fresh_file("text.sqlite");
    std::ofstream(f) << "league: not a database, just a text file of some length\n";
    const std::string e = usage_error_of(f);
    CHECK_THAT(e, Catch::Matchers::Contains(f.string()));
    CHECK_THAT(e, Catch::Matchers::Contains("not a valid standfast history"));
  }
  SECTION("an SQLite file of another program") {
    const fs::path f = fresh_file("foreign.sqlite");
    REQUIRE(std::system(("sqlite3 " + f.string() + " 'CREATE TABLE notes (x TEXT)'").c_str()) == 0);
    const std::string e = usage_error_of(f);
    CHECK_THAT(e, Catch::Matchers::Contains("not a standfast history"));
  }
  SECTION("a history of another schema version") {
    const fs::path f = fresh_file("version.sqlite");
    History::open(f, true);
    REQUIRE(std::system(("sqlite3 " + f.string() + " 'PRAGMA user_version = 7'").c_str()) == 0);
    const std::string e = usage_error_of(f);
    CHECK_THAT(e, Catch::Matchers::Contains("schema version 7"));
  }
  SECTION("a damaged history") {
    const fs::path f = fresh_file("damaged.sqlite");
    {
      History h = History::open(f, true);
      for (int k = 0; k < 20; ++k) h.record(sample_run(k, 30, 1.0));
    }
    // Overwrite a stretch of the file after the first page (the header stays valid).
    {
      std::fstream io(f, std::ios::in | std::ios::out | std::ios::binary);
      io.seekp(4096 + 100);
      const std::string junk(3000, '\x5a');
      io.write(junk.data(), static_cast<std::streamsize>(junk.size()));
    }
    const std::string e = usage_error_of(f);
    CHECK_THAT(e, Catch::Matchers::Contains(f.string()));
    CHECK(!e.empty());
  }
  SECTION("a missing file when none may be created") {
    const fs::path f = fresh_file("missing.sqlite");
    CHECK_THROWS_AS(History::open(f, false), UsageError);
  }
}

TEST_CASE("the season hash changes with a score and the model label names the settings") {
  const std::string base =
      "standfast: 1\n"
      "league: {name: Test League, season: Y1}\n"
      "teams:\n"
      "  - {id: AAA, name: Alpha}\n"
      "  - {id: BBB, name: Bravo}\n"
      "groups:\n"
      "  - {id: one, teams: [AAA, BBB]}\n"
      "games:\n";
  const auto a = config::load_season_text(
      base + "  - {date: 2040-05-01, home: AAA, away: BBB, home_runs: 5, away_runs: 3}\n",
      "t.yaml");
  const auto b = config::load_season_text(
      base + "  - {date: 2040-05-01, home: AAA, away: BBB, home_runs: 5, away_runs: 4}\n",
      "t.yaml");
  CHECK(season_hash(a) != season_hash(b));
  CHECK(season_hash(a).size() == 16);
  CHECK(model_label(a.model) == "weibull shape=fit home_edge=fit shrink=20 uncertainty=on");
}
