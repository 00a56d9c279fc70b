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
    CHECK(j["teams"][i]["team_id"] == season.teams[i].id);
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
  CHECK(line.rfind("table,team_id,team_name,family,field,value,run_version,", 0) == 0);
  std::set<std::string> league, team, family;
  int blank = 0;
  while (std::getline(in, line)) {
    if (line.empty()) ++blank;
    const auto id = [&](std::size_t start) {
      return line.substr(start, line.find(',', start) - start);
    };
    if (line.rfind("league,", 0) == 0) league.insert(id(7));  // empty team_id
    if (line.rfind("team,", 0) == 0) team.insert(id(5));      // team_id
    if (line.rfind("family,", 0) == 0) family.insert(line.substr(9, line.find(',', 9) - 9));
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

TEST_CASE("fit with no played game shows the defaults the odds run on, warns, and exits 0") {
  // As of a date before the first game nothing is played: `odds` runs on the documented
  // defaults (models/ratings.cpp), and `fit` shows them instead of failing.
  const std::filesystem::path dir =
      standfast::testing::fresh_dir("models_fit_command_test", "none");
  const std::string json = (dir / "fit.json").string();
  const Run r = run("fit " + SMALL + " --as-of 2049-01-01 --format json -o " + json);
  CHECK(r.status == 0);
  CHECK(r.out.find(SMALL + ": warning: no game played before 2049-01-01: nothing to fit") !=
        std::string::npos);
  const auto j = nlohmann::json::parse(standfast::testing::read_file(json));
  CHECK(j["league"]["defaults"] == true);
  CHECK(j["league"]["games_fitted"] == 0);
  // Ref: the documented defaults (README.md, "Choices and defaults"): league mean 4.5 (from
  // memory), Weibull gamma 1.82 (Miller 2007, REFERENCE_VALUES.md section 11), home edge 1.
  CHECK(j["league"]["league_mean"] == 4.5);
  CHECK(j["league"]["shape"] == 1.82);
  CHECK(j["league"]["home_edge"] == 1.0);
  CHECK(j["run"]["shape_source"] == "default");
  CHECK(j["families"].empty());
  REQUIRE(j["teams"].size() == 6);
  for (const auto& t : j["teams"]) CHECK(t["adjusted"]["offence"] == 1.0);
  const Run table = run("fit " + SMALL + " --as-of 2049-01-01");
  CHECK(table.status == 0);
  CHECK(table.out.find("nothing is fitted: these are the documented") != std::string::npos);
  // odds on the same date runs on those defaults too.
  CHECK(run("odds " + SMALL + " --as-of 2049-01-01 --seasons 200").status == 0);
}

TEST_CASE("fit lists the teams by conference and division, as standings and odds do") {
  const Run r = run("fit " + SMALL);
  REQUIRE(r.status == 0);
  const auto upper = r.out.find("Valley Conference - Upper Division");
  const auto lower = r.out.find("Valley Conference - Lower Division");
  REQUIRE(upper != std::string::npos);
  REQUIRE(lower != std::string::npos);
  CHECK(upper < lower);
  // The two adjusted shapes on one screen are told apart in one line.
  CHECK(r.out.find("Fitted without the shrinkage prior, so the weibull shape here") !=
        std::string::npos);
}
