// Tests of the `standfast fit` command (tools/cmd_fit.cpp) on the committed small scenario.
// References: the JSON output is parsed with nlohmann-json and compared with the library's own
// fit_report (the numbers themselves are checked against SciPy and Boost.Math in the other
// models_*_test files); exit statuses as the common rules state (2 for bad input).
#include <fmt/core.h>
#include <sys/wait.h>

#include <catch2/catch.hpp>
#include <cstdio>
#include <filesystem>
#include <fstream>
#include <nlohmann/json.hpp>
#include <set>
#include <sstream>
#include <string>

#include "config/load.h"
#include "models/fit_report.h"
#include "tests/process_support.h"

namespace {

const std::string PROGRAM = STANDFAST_BINARY_DIR "/tools/standfast";
const std::string SMALL = STANDFAST_SOURCE_DIR "/scenarios/small/season.yaml";

using Run = standfast::testing::ProcessResult;

// Runs the program with these arguments and captures standard output and standard error.
Run run(const std::string& args) {
  return standfast::testing::run_process(PROGRAM + " " + args + " 2>&1");
}

}  // namespace

TEST_CASE("fit --format json carries the schema version and the library's numbers") {
  const Run r = run("fit " + SMALL + " --format json");
  REQUIRE(r.status == 0);
  const auto j = nlohmann::json::parse(r.out);
  // Ref: models::fit_report on the same file (library value); JSON parsed by nlohmann-json.
  CHECK(j["schema_version"] == 1);
  const auto season = standfast::config::load_season(SMALL);
  const auto rep = standfast::models::fit_report(season);
  REQUIRE(j["teams"].size() == season.teams.size());
  CHECK(j["league"]["shape"].get<double>() == Approx(rep.ratings.shape).epsilon(1e-12));
  CHECK(j["league"]["home_edge"].get<double>() == Approx(rep.ratings.home_edge).epsilon(1e-12));
  for (size_t i = 0; i < season.teams.size(); ++i) {
    CHECK(j["teams"][i]["team"] == season.teams[i].id);
    CHECK(j["teams"][i]["adjusted"]["offence"].get<double>() ==
          Approx(rep.teams[i].offence).epsilon(1e-12));
    CHECK(j["teams"][i]["wins"].get<int>() == rep.teams[i].wins);
  }
  CHECK(j["families"].size() == 3);
}

TEST_CASE("fit --format csv is one long table of league, team and family rows") {
  const Run r = run("fit " + SMALL + " --format csv");
  REQUIRE(r.status == 0);
  std::istringstream in(r.out);
  std::string line;
  std::getline(in, line);
  CHECK(line.rfind("table,id,field,value,run_version,", 0) == 0);
  std::set<std::string> league, team, family;
  int blank = 0;
  while (std::getline(in, line)) {
    if (line.empty()) ++blank;
    const auto id = [&](std::size_t start) {
      return line.substr(start, line.find(',', start) - start);
    };
    if (line.rfind("league,", 0) == 0) league.insert(id(7));
    if (line.rfind("team,", 0) == 0) team.insert(id(5));
    if (line.rfind("family,", 0) == 0) family.insert(id(7));
  }
  CHECK(league.size() == 1);
  CHECK(team.size() == 6);
  CHECK(family.size() == 3);
  CHECK(blank == 0);
  const Run t = run("fit " + SMALL);
  REQUIRE(t.status == 0);
  CHECK(t.out.find("Goodness of fit") != std::string::npos);
  CHECK(t.out.find("Pythagorean expectation") != std::string::npos);
  const std::string path = std::string(STANDFAST_BINARY_DIR) + "/models_fit_command_out.json";
  std::filesystem::remove(path);
  REQUIRE(run("fit " + SMALL + " --format json --output " + path).status == 0);
  std::ifstream f(path);
  REQUIRE(f.good());
  CHECK(nlohmann::json::parse(f)["schema_version"] == 1);
}

TEST_CASE("fit reports bad input with status 2 and names the file") {
  const Run missing = run("fit /nonexistent/season.yaml");
  CHECK(missing.status == 2);
  CHECK(missing.out.find("/nonexistent/season.yaml") != std::string::npos);
  const Run format = run("fit " + SMALL + " --format xml");
  CHECK(format.status == 2);
  CHECK(format.out.find("--format") != std::string::npos);
  const Run alpha = run("fit " + SMALL + " --alpha 2");
  CHECK(alpha.status == 2);
  CHECK(alpha.out.find("--alpha") != std::string::npos);
}
