// Tests of the `standfast stakes` command (the games that matter) through the built program, on
// the invented demo and small leagues. References: exit statuses of the program's contract (0
// success, 2 bad input; DESIGN.md and STYLE.md), JSON parsed back with nlohmann-json (3.11,
// Debian 12), byte comparison for the determinism rule (same seed, any thread count), and the
// odds of `standfast odds` with the same seed (the swing tallies come from the same seasons).
// The figures themselves are checked against exact enumeration in tests/stakes_report_test.cpp.
#include <algorithm>
#include <catch2/catch.hpp>
#include <filesystem>
#include <nlohmann/json.hpp>
#include <string>

#include "tests/process_support.h"

namespace fs = std::filesystem;

namespace {

const std::string PROGRAM = STANDFAST_BINARY_DIR "/tools/standfast";
const std::string DEMO = STANDFAST_SOURCE_DIR "/scenarios/demo/season.yaml";
const std::string SMALL = STANDFAST_SOURCE_DIR "/scenarios/small/season.yaml";

using Run = standfast::testing::ProcessResult;

Run run(const std::string& args) {
  return standfast::testing::run_process(PROGRAM + " " + args + " 2>&1");
}

nlohmann::json json_of(const Run& r) {
  return nlohmann::json::parse(r.out.substr(r.out.find('{')));
}

}  // namespace

TEST_CASE("stakes prints the league's next games and a team's games with the caution") {
  const Run league = run("stakes " + DEMO + " --seasons 2000");
  REQUIRE(league.status == 0);
  CHECK(league.out.find("Games that matter in Stonereach Baseball Union") != std::string::npos);
  CHECK(league.out.find("2053-06-30 to 2053-07-02") != std::string::npos);
  CHECK(league.out.find("not advice for wagering") != std::string::npos);
  CHECK(league.out.find("Run: standfast") != std::string::npos);
  const Run team = run("stakes " + DEMO + " --seasons 2000 --team elm --chance division");
  REQUIRE(team.status == 0);
  CHECK(team.out.find("Games that matter to Elmsreach Wardens (ELM)") != std::string::npos);
  CHECK(team.out.find("its division chance") != std::string::npos);
}

TEST_CASE("stakes JSON: the run's odds are those of `odds` with the same seed, games ranked") {
  const Run r = run("stakes " + SMALL + " --seasons 3000 --seed 5 --days 7 --format json");
  REQUIRE(r.status == 0);
  const auto j = json_of(r);
  CHECK(j["schema_version"] == 1);
  CHECK(j["kind"] == "league");
  CHECK(j["days"] == 7);
  CHECK(j["run"]["seed"] == 5);
  CHECK(j["run"]["seasons"] == 3000);
  CHECK(j["run"]["family"] == "weibull");
  REQUIRE_FALSE(j["games"].empty());
  double last = 1.0;
  for (const auto& g : j["games"]) {
    const double moved = g["postseason_moved"]["moved"];
    CHECK(moved <= last);
    last = moved;
  }
  const Run odds = run("odds " + SMALL + " --seasons 3000 --seed 5 --format json");
  REQUIRE(odds.status == 0);
  const auto o = json_of(odds);
  for (const auto& team : o["teams"]) {
    const std::string id = team.contains("team_id") ? team["team_id"] : team["id"];
    for (const auto& t : j["teams"])
      if (t["team_id"] == id) {
        INFO(id);
        CHECK(t["postseason"]["p"] == team["postseason"]["p"]);
      }
  }
}

TEST_CASE("stakes gives the same bytes for any thread count, and a team's CSV is rectangular") {
  const std::string args = "stakes " + DEMO + " --seasons 1000 --team BRK --format csv";
  const Run one = run(args + " --threads 1");
  const Run two = run(args + " --threads 2");
  REQUIRE(one.status == 0);
  CHECK(one.out == two.out);
  std::size_t rows = 0, fields = 0;
  std::size_t at = 0;
  while (at < one.out.size()) {
    const std::size_t end = one.out.find('\n', at);
    const std::string line = one.out.substr(at, end - at);
    const auto n = static_cast<std::size_t>(std::count(line.begin(), line.end(), ','));
    if (rows++ == 0) fields = n;
    CHECK(n == fields);
    at = end + 1;
  }
  CHECK(rows > 10);
}

TEST_CASE("stakes refuses bad options with exit status 2 and writes nothing") {
  const fs::path dir = standfast::testing::fresh_dir("stakes_cli_test", "bad");
  const fs::path out = dir / "out.json";
  const Run team = run("stakes " + DEMO + " --team ELX --seasons 100 -o " + out.string());
  CHECK(team.status == 2);
  CHECK(team.out.find("--team") != std::string::npos);
  CHECK(team.out.find("did you mean") != std::string::npos);
  CHECK_FALSE(fs::exists(out));
  for (const char* bad : {"--days 0", "--days -1", "--chance title", "--top x", "--seasons 0",
                          "--family poison", "--as-of 2053-13-01", "--format xml"}) {
    INFO(bad);
    CHECK(run("stakes " + DEMO + " --seasons 100 " + std::string(bad)).status == 2);
  }
}
