// Tests of the `standfast odds` command: runs the built program on the invented small league.
// References: exit statuses of the program's contract (0 success, 2 bad input; DESIGN.md and
// STYLE.md), JSON parsed back with nlohmann-json (3.11, Debian 12), and byte comparison of
// outputs for the determinism rule (same seed, any thread count, same bytes).
#include <sys/wait.h>

#include <catch2/catch.hpp>
#include <cstdio>
#include <filesystem>
#include <fstream>
#include <nlohmann/json.hpp>
#include <sstream>
#include <string>

#include "tests/process_support.h"

namespace fs = std::filesystem;

namespace {

const std::string PROGRAM = STANDFAST_BINARY_DIR "/tools/standfast";
const std::string SMALL = STANDFAST_SOURCE_DIR "/scenarios/small/season.yaml";

using Run = standfast::testing::ProcessResult;

// Runs the program with these arguments (standard error discarded) and captures its output.
Run run(const std::string& args) {
  return standfast::testing::run_process(PROGRAM + " " + args + " 2>/dev/null");
}

using standfast::testing::read_file;

fs::path fresh_dir(const std::string& name) {
  return standfast::testing::fresh_dir("odds_cli_test", name);
}

}  // namespace

TEST_CASE("odds on the small league prints the table with the caution") {
  const Run r = run("odds " + SMALL + " --seasons 2000");
  REQUIRE(r.status == 0);
  CHECK(r.out.find("not advice for wagering") != std::string::npos);
  CHECK(r.out.find("model estimates") != std::string::npos);
  CHECK(r.out.find("seed 20260101") != std::string::npos);
  CHECK(r.out.find("2,000 simulated seasons") != std::string::npos);
}

TEST_CASE("odds JSON parses and follows schema version 1") {
  const Run r = run("odds " + SMALL + " --seasons 2000 --seed 5 --format json");
  REQUIRE(r.status == 0);
  const auto doc = nlohmann::json::parse(r.out);
  CHECK(doc["schema_version"] == 1);
  CHECK(doc["run"]["seed"] == 5);
  CHECK(doc["run"]["seasons"] == 2000);
  CHECK(doc["caution"].get<std::string>().find("wagering") != std::string::npos);
  REQUIRE(doc["teams"].size() == 6);  // scenarios/small has six teams
  for (const auto& t : doc["teams"]) {
    const double p = t["postseason"]["p"].get<double>();
    CHECK(p >= 0.0);
    CHECK(p <= 1.0);
    // The wins histogram counts every simulated season once.
    std::uint64_t total = 0;
    for (const auto& c : t["wins_histogram"]["counts"]) total += c.get<std::uint64_t>();
    CHECK(total == 2000);
  }
}

TEST_CASE("the same seed gives the same bytes with 1, 2, 4 and all threads") {
  for (const char* format : {"table", "csv", "json"}) {
    const std::string args = "odds " + SMALL + " --seasons 3000 --seed 99 --format " + format;
    const Run one = run(args + " --threads 1");
    REQUIRE(one.status == 0);
    for (const char* threads : {"2", "4", "0"}) {
      const Run other = run(args + " --threads " + threads);
      INFO(format << " with --threads " << threads);
      REQUIRE(other.status == 0);
      CHECK(other.out == one.out);
    }
  }
}

TEST_CASE("--output writes the file whole, and an unwritable path exits 2 leaving nothing") {
  const fs::path dir = fresh_dir("output");
  const fs::path good = dir / "odds.csv";
  const Run to_file =
      run("odds " + SMALL + " --seasons 1000 --format csv --output " + good.string());
  REQUIRE(to_file.status == 0);
  CHECK(to_file.out.empty());
  const Run to_stdout = run("odds " + SMALL + " --seasons 1000 --format csv");
  CHECK(read_file(good) == to_stdout.out);

  // A path under a regular file cannot be created (ENOTDIR), whoever runs the test.
  std::ofstream(dir / "plain") << "x";
  const Run bad =
      run("odds " + SMALL + " --seasons 1000 --output " + (dir / "plain" / "odds.json").string());
  CHECK(bad.status == 2);
  std::size_t entries = 0;
  for (const auto& e : fs::recursive_directory_iterator(dir)) {
    (void)e;
    ++entries;
  }
  CHECK(entries == 2);  // odds.csv and plain, no temporary left behind
}

TEST_CASE("bad input exits 2") {
  CHECK(run("odds " + SMALL + " --seasons 0").status == 2);
  CHECK(run("odds " + SMALL + " --format xml").status == 2);
  CHECK(run("odds " + SMALL + " --group no-such-group").status == 2);
  CHECK(run("odds " + SMALL + " --target-se -1").status == 2);
  CHECK(run("odds " + std::string(STANDFAST_SOURCE_DIR) + "/no/such/season.yaml").status == 2);
}

TEST_CASE("standings marks and simulated chances agree on the late-season demo league") {
  // Two independent routes to certainty: the exact marks from the standings and the schedule
  // (engine/certainty.h) and the simulation. A team marked clinched must have won in every
  // simulated season and a team marked eliminated in none: the chance is exactly 1 or 0 (a mark
  // is a proof, so no Monte Carlo tolerance applies).
  const std::string late = STANDFAST_SOURCE_DIR "/scenarios/demo-late/season.yaml";
  const Run r = run("odds " + late + " --seasons 2000 --format json");
  REQUIRE(r.status == 0);
  const auto doc = nlohmann::json::parse(r.out);
  int marked = 0;
  for (const auto& t : doc["teams"]) {
    for (const char* key : {"division_title", "postseason", "bye", "title"}) {
      const auto& c = t[key];
      const std::string status = c["status"].get<std::string>();
      INFO(t["team_id"].get<std::string>() << " " << key);
      if (status == "clinched") CHECK(c["p"].get<double>() == 1.0);
      if (status == "eliminated") CHECK(c["p"].get<double>() == 0.0);
      if (!status.empty()) ++marked;
    }
  }
  CHECK(marked > 0);  // the late-season scenario has decided races
}
