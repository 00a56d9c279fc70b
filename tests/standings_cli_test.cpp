// Tests of the `standfast standings` command: runs the built program on the invented scenarios.
// References: exit statuses of the program's contract (0 success, 2 bad input; DESIGN.md), JSON
// and CSV parsed back (nlohmann-json 3.11, Debian 12), and wins, losses and runs recounted here
// straight from the season's game list (config loader), independently of engine/standings.
#include <sys/wait.h>

#include <catch2/catch.hpp>
#include <cstdio>
#include <filesystem>
#include <fstream>
#include <map>
#include <nlohmann/json.hpp>
#include <sstream>
#include <string>

#include "config/load.h"
#include "engine/certainty.h"
#include "engine/clinch.h"
#include "tests/process_support.h"

namespace fs = std::filesystem;

namespace {

const std::string PROGRAM = STANDFAST_BINARY_DIR "/tools/standfast";
const std::string DEMO = STANDFAST_SOURCE_DIR "/scenarios/demo/season.yaml";
const std::string SMALL = STANDFAST_SOURCE_DIR "/scenarios/small/season.yaml";

using Run = standfast::testing::ProcessResult;

// Runs the program with these arguments (standard error discarded) and captures its output.
Run run(const std::string& args) {
  return standfast::testing::run_process(PROGRAM + " " + args + " 2>/dev/null");
}

struct Count {
  int wins = 0, losses = 0, runs_for = 0, runs_against = 0;
};

// Wins, losses and runs per team id from the played games with a known date.
std::map<std::string, Count> recount(const standfast::config::Season& s) {
  std::map<std::string, Count> out;
  for (const auto& g : s.games) {
    if (!g.played || !g.date) continue;
    auto& h = out[s.teams[static_cast<std::size_t>(g.home)].id];
    auto& a = out[s.teams[static_cast<std::size_t>(g.away)].id];
    (g.home_runs > g.away_runs ? h.wins : h.losses)++;
    (g.home_runs > g.away_runs ? a.losses : a.wins)++;
    h.runs_for += g.home_runs;
    h.runs_against += g.away_runs;
    a.runs_for += g.away_runs;
    a.runs_against += g.home_runs;
  }
  return out;
}

}  // namespace

TEST_CASE("standings JSON agrees with a recount of the game list") {
  const Run r = run("standings " + DEMO + " --format json");
  REQUIRE(r.status == 0);
  const auto doc = nlohmann::json::parse(r.out);
  REQUIRE(doc.at("schema_version") == 1);
  const auto season = standfast::config::load_season(DEMO);
  const auto expected = recount(season);
  std::size_t teams = 0;
  for (const auto& c : doc.at("conferences")) {
    for (const auto& d : c.at("divisions")) {
      double prev_pct = 2.0;
      for (const auto& t : d.at("teams")) {
        ++teams;
        const auto& e = expected.at(t.at("team_id").get<std::string>());
        CHECK(t.at("wins") == e.wins);
        CHECK(t.at("losses") == e.losses);
        CHECK(t.at("runs_scored") == e.runs_for);
        CHECK(t.at("runs_allowed") == e.runs_against);
        // Ranked by winning percentage within the division.
        const double pct = t.at("win_pct").get<double>();
        CHECK(pct <= prev_pct);
        prev_pct = pct;
      }
      CHECK(d.at("teams").front().at("games_back") == 0.0);
    }
    // The field: the seeds of the conference's qualifying rules (2 division winners and 1
    // at-large team in the demo league).
    CHECK(c.at("postseason_field").size() == 3);
  }
  REQUIRE(teams == season.teams.size());
}

TEST_CASE("standings table and CSV") {
  const Run t = run("standings " + SMALL);
  REQUIRE(t.status == 0);
  CHECK(t.out.find("Won") != std::string::npos);
  CHECK(t.out.find("Postseason field") != std::string::npos);
  const Run c = run("standings " + SMALL + " --format csv");
  REQUIRE(c.status == 0);
  std::istringstream lines(c.out);
  std::string line;
  int rows = 0;
  std::getline(lines, line);
  CHECK(line.rfind("conference,division,place,team_id", 0) == 0);
  while (std::getline(lines, line)) ++rows;
  CHECK(rows == static_cast<int>(standfast::config::load_season(SMALL).teams.size()));
}

TEST_CASE("standings output goes to a file whole; bad input exits 2") {
  const fs::path dir = fs::path(STANDFAST_BINARY_DIR) / "standings_cli_test";
  fs::remove_all(dir);
  fs::create_directories(dir);
  const fs::path out = dir / "standings.json";
  REQUIRE(run("standings " + SMALL + " --format json --output " + out.string()).status == 0);
  std::ifstream in(out);
  std::stringstream text;
  text << in.rdbuf();
  REQUIRE(nlohmann::json::parse(text.str()).at("schema_version") == 1);
  CHECK(run("standings " + SMALL + " --format xml").status == 2);
  CHECK(run("standings " + (dir / "missing.yaml").string()).status == 2);
  CHECK(run("standings " + SMALL + " --output " + (dir / "no" / "such" / "dir.txt").string())
            .status == 2);
  CHECK_FALSE(fs::exists(dir / "no"));
}

TEST_CASE("standings carry the exact marks and the magic and elimination numbers") {
  // Plumbing: every team's certainty in the JSON and the CSV is what engine::exact_certainty
  // computes for the same season (the computation is checked in certainty_test.cpp against
  // enumeration). The late-season demo has decided races, so both kinds of value appear.
  const std::string late = STANDFAST_SOURCE_DIR "/scenarios/demo-late/season.yaml";
  const auto season = standfast::config::load_season(late);
  const auto expect =
      standfast::engine::exact_certainty(season, standfast::engine::clinch_records(season));
  const Run j = run("standings " + late + " --format json");
  REQUIRE(j.status == 0);
  const auto doc = nlohmann::json::parse(j.out);
  auto number = [](int n) { return n < 0 ? nlohmann::json(nullptr) : nlohmann::json(n); };
  auto word = [](standfast::engine::Certainty c) {
    return c == standfast::engine::Certainty::kClinched     ? std::string("clinched")
           : c == standfast::engine::Certainty::kEliminated ? std::string("eliminated")
                                                            : std::string();
  };
  int teams = 0, marked = 0;
  for (const auto& c : doc.at("conferences")) {
    for (const auto& d : c.at("divisions")) {
      for (const auto& t : d.at("teams")) {
        const int index = season.team_index(t.at("team_id").get<std::string>());
        REQUIRE(index >= 0);
        const auto& e = expect[static_cast<std::size_t>(index)];
        INFO(t.at("team_id").get<std::string>());
        const auto& div = t.at("certainty").at("division");
        const auto& post = t.at("certainty").at("postseason");
        CHECK(div.at("status") == word(e.division.mark));
        CHECK(div.at("magic_number") == number(e.division.magic));
        CHECK(div.at("elimination_number") == number(e.division.elimination));
        CHECK(post.at("status") == word(e.berth.mark));
        CHECK(post.at("magic_number") == number(e.berth.magic));
        CHECK(post.at("elimination_number") == number(e.berth.elimination));
        CHECK(post.at("proof_complete") == true);
        marked += e.division.mark != standfast::engine::Certainty::kOpen;
        ++teams;
      }
    }
  }
  CHECK(teams == static_cast<int>(season.teams.size()));
  CHECK(marked > 0);
  const Run c = run("standings " + late + " --format csv");
  REQUIRE(c.status == 0);
  CHECK(c.out.find("division_status,division_magic,division_elimination,postseason_status,"
                   "postseason_magic,postseason_elimination") != std::string::npos);
  const Run t = run("standings " + late);
  REQUIRE(t.status == 0);
  CHECK(t.out.find("Div M/E") != std::string::npos);
  CHECK(t.out.find("eliminated") != std::string::npos);
}
