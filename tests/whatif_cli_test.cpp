// Tests of the `standfast whatif` command: runs the built program on the invented demo league
// and its example scenario file. References: exit statuses of the program's contract (0 success,
// 2 bad input; DESIGN.md and STYLE.md), JSON parsed back with nlohmann-json (3.11, Debian 12),
// and byte comparison of outputs for the determinism rule (same seed, any thread count).
#include <catch2/catch.hpp>
#include <filesystem>
#include <fstream>
#include <nlohmann/json.hpp>
#include <string>

#include "tests/process_support.h"

namespace fs = std::filesystem;

namespace {

const std::string PROGRAM = STANDFAST_BINARY_DIR "/tools/standfast";
const std::string DEMO = STANDFAST_SOURCE_DIR "/scenarios/demo/season.yaml";
const std::string WHATIF = STANDFAST_SOURCE_DIR "/scenarios/demo/whatif.yaml";

using Run = standfast::testing::ProcessResult;

Run run(const std::string& args) {
  return standfast::testing::run_process(PROGRAM + " " + args + " 2>&1");
}

fs::path fresh_dir(const std::string& name) {
  const fs::path dir = fs::path(STANDFAST_BINARY_DIR) / "whatif_cli_test" / name;
  fs::remove_all(dir);
  fs::create_directories(dir);
  return dir;
}

}  // namespace

TEST_CASE("whatif on the demo scenarios prints every scenario with the caution") {
  const Run r = run("whatif " + DEMO + " " + WHATIF + " --seasons 400");
  REQUIRE(r.status == 0);
  CHECK(r.out.find("not advice for wagering") != std::string::npos);
  CHECK(r.out.find("Scenario \"nothing changes\" (model: weibull") != std::string::npos);
  CHECK(r.out.find("no chance of any team changed") != std::string::npos);
  CHECK(r.out.find("Scenario \"negative binomial scores\" (model: negative_binomial") !=
        std::string::npos);
}

TEST_CASE("whatif JSON parses, records the models and gives a zero change for no change") {
  const Run r = run("whatif " + DEMO + " " + WHATIF + " --seasons 400 --format json --threads 2");
  REQUIRE(r.status == 0);
  const auto j = nlohmann::json::parse(r.out.substr(r.out.find('{')));
  CHECK(j["schema_version"] == 1);
  CHECK(j["baseline_model"]["family"] == "weibull");
  REQUIRE(j["scenarios"].size() == 7);
  for (const auto& t : j["scenarios"][0]["teams"])
    for (const char* k : {"division", "postseason", "bye", "title", "mean_wins"}) {
      CHECK(t[k]["change"].get<double>() == 0.0);
      CHECK(t[k]["se_paired"].get<double>() == 0.0);
    }
}

TEST_CASE("whatif gives the same bytes for any thread count") {
  const std::string args = "whatif " + DEMO + " " + WHATIF + " --seasons 300 --format csv";
  const Run one = run(args + " --threads 1");
  const Run two = run(args + " --threads 2");
  REQUIRE(one.status == 0);
  CHECK(one.out == two.out);
}

TEST_CASE("a bad scenario file exits with 2, names file and line, and writes nothing") {
  const fs::path dir = fresh_dir("bad");
  const fs::path bad = dir / "bad.yaml";
  std::ofstream(bad) << "standfast_scenarios: 1\nscenarios:\n  - name: x\n    teams: [{team: "
                        "NOPE, add_runs_scored: 1}]\n";
  const fs::path out = dir / "out.csv";
  const Run r = run("whatif " + DEMO + " " + bad.string() + " --format csv -o " + out.string());
  CHECK(r.status == 2);
  CHECK(r.out.find(bad.string() + ":4:20: scenarios[0].teams[0].team: unknown team 'NOPE'") !=
        std::string::npos);
  CHECK_FALSE(fs::exists(out));
  const Run missing = run("whatif " + DEMO + " " + (dir / "none.yaml").string());
  CHECK(missing.status == 2);
  const Run format = run("whatif " + DEMO + " " + WHATIF + " --format xml");
  CHECK(format.status == 2);
}
