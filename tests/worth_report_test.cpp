// Tests of tools/worth_report.h and the `standfast worth` command: the win totals that give a
// chance (hand-worked tallies), and the program on the invented small and demo leagues.
// References: exit statuses of the program's contract (0 success, 2 bad input; DESIGN.md and
// STYLE.md), JSON parsed back with nlohmann-json (3.11, Debian 12), CSV rows counted, byte
// comparison of outputs for the determinism rule (same seed, any thread count), and the plain
// odds run (`standfast odds`, same seed and seasons) for the baseline chances, which must be
// the same seasons.
#include "tools/worth_report.h"

#include <catch2/catch.hpp>
#include <cmath>
#include <nlohmann/json.hpp>
#include <sstream>
#include <string>

#include "tests/process_support.h"

using namespace standfast;
using standfast::testing::fresh_dir;
using standfast::testing::read_file;
using standfast::testing::run_process;

namespace {

const std::string PROGRAM = STANDFAST_BINARY_DIR "/tools/standfast";
const std::string SMALL = STANDFAST_SOURCE_DIR "/scenarios/small/season.yaml";
const std::string DEMO = STANDFAST_SOURCE_DIR "/scenarios/demo/season.yaml";

standfast::testing::ProcessResult run(const std::string& args) {
  return run_process(PROGRAM + " " + args + " 2>&1");
}

}  // namespace

TEST_CASE("wins_for: the total from which every well-seen total reaches the level") {
  // Hand-worked: totals 0..6 seen 0, 30, 40, 50, 5, 40, 25 times; berths 0, 3, 19, 30, 1, 39,
  // 25: shares -, .10, .475, .60, (.20 on 5 seasons: ignored), .975, 1.
  const std::vector<std::uint64_t> all{0, 30, 40, 50, 5, 40, 25};
  const std::vector<std::uint64_t> hit{0, 3, 19, 30, 1, 39, 25};
  CHECK(tools::wins_for(all, hit, 0.5) == 3);
  CHECK(tools::wins_for(all, hit, 0.9) == 5);
  CHECK(tools::wins_for(all, hit, 0.99) == 6);
  CHECK(!tools::wins_for(all, std::vector<std::uint64_t>(7, 0), 0.5).has_value());
  // With every total counted, the 5-season total (share .20) stops the run at 5.
  CHECK(tools::wins_for(all, hit, 0.5, 1) == 5);
}

TEST_CASE("worth prints the curves sorted by the value of a win, with the caution and the run") {
  const auto r = run("worth " + SMALL + " --seasons 600 --span 3");
  REQUIRE(r.status == 0);
  CHECK(r.out.find("What one more win is worth") != std::string::npos);
  CHECK(r.out.find("not advice for wagering") != std::string::npos);
  CHECK(r.out.find("Run: standfast") != std::string::npos);
  CHECK(r.out.find("seed 20260101; 600 seasons") != std::string::npos);
  CHECK(r.out.find("  -3   -2   -1    0   +1   +2   +3") != std::string::npos);

  const auto j = run_process(PROGRAM + " worth " + SMALL + " --seasons 600 --span 3 --format json");
  REQUIRE(j.status == 0);
  const auto doc = nlohmann::json::parse(j.out);
  CHECK(doc["schema_version"] == 1);
  CHECK(doc["report"] == "curves");
  CHECK(doc["span"] == 3);
  CHECK(doc["shift_unit"] == "runs_per_game");
  CHECK(doc["run"]["seasons"] == 600);
  CHECK(doc["run"]["family"] == "weibull");
  REQUIRE(doc["teams"].size() == 6);
  double last = 1e9;
  for (const auto& t : doc["teams"]) {
    REQUIRE(t["points"].size() == 7);
    CHECK(t["points"][3]["added_wins"] == 0);
    CHECK(t["points"][3]["shift"] == 0.0);
    // Sorted by the value of a win to the postseason chance, largest first.
    const double v = t["per_win"]["postseason"]["value"];
    CHECK(v <= last);
    last = v;
    // The central difference of the curve at 0.
    const double up = t["points"][4]["postseason"]["value"];
    const double down = t["points"][2]["postseason"]["value"];
    CHECK(v == Approx((up - down) / 2).margin(1e-12));
    CHECK(t["per_win"]["postseason"]["se"] >= 0.0);
    CHECK(t["shift_per_win"] > 0.0);
  }

  const auto c = run_process(PROGRAM + " worth " + SMALL + " --seasons 600 --span 3 --format csv");
  REQUIRE(c.status == 0);
  std::istringstream lines(c.out);
  std::string line;
  int rows = 0;
  std::getline(lines, line);
  CHECK(line.rfind("team_id,team_name,added_wins,reachable,shift,shift_unit,division,division_se",
                   0) == 0);
  CHECK(line.find(",run_version,") != std::string::npos);
  const auto commas = std::count(line.begin(), line.end(), ',');
  while (std::getline(lines, line)) {
    ++rows;
    CHECK(std::count(line.begin(), line.end(), ',') == commas);
  }
  CHECK(rows == 6 * 7);
}

TEST_CASE("worth --by-wins gives the plain run's chances by final win total") {
  const auto j =
      run_process(PROGRAM + " worth " + SMALL + " --seasons 2000 --by-wins --format json");
  REQUIRE(j.status == 0);
  const auto doc = nlohmann::json::parse(j.out);
  CHECK(doc["report"] == "by_wins");
  const auto odds = run_process(PROGRAM + " odds " + SMALL + " --seasons 2000 --format json");
  REQUIRE(odds.status == 0);
  const auto plain = nlohmann::json::parse(odds.out);
  REQUIRE(doc["teams"].size() == 6);
  for (std::size_t t = 0; t < 6; ++t) {
    const auto& team = doc["teams"][t];
    double seasons = 0, berths = 0;
    for (const auto& row : team["by_final_wins"]) {
      seasons += row["seasons"].get<double>();
      berths += row["seasons"].get<double>() * row["postseason"].get<double>();
    }
    CHECK(seasons == 2000);
    // The same seasons as the plain run: the berth count is the same.
    const std::string id = team["team_id"];
    bool found = false;
    for (const auto& o : plain["teams"])
      if (o["team_id"] == id) {
        found = true;
        CHECK(berths == Approx(o["postseason"]["p"].get<double>() * 2000).margin(1e-6));
      }
    CHECK(found);
    if (!team["postseason_90_from"].is_null() && !team["postseason_50_from"].is_null())
      CHECK(team["postseason_90_from"] >= team["postseason_50_from"]);
  }
  const auto table = run("worth " + SMALL + " --seasons 500 --by-wins");
  REQUIRE(table.status == 0);
  CHECK(table.out.find("Chances by final win total") != std::string::npos);
  CHECK(table.out.find("not advice for wagering") != std::string::npos);
}

TEST_CASE("worth: the same output for any thread count; bad input exits 2 and writes nothing") {
  const auto one =
      run_process(PROGRAM + " worth " + SMALL + " --seasons 300 --span 2 --threads 1 --format csv");
  const auto two =
      run_process(PROGRAM + " worth " + SMALL + " --seasons 300 --span 2 --threads 2 --format csv");
  REQUIRE(one.status == 0);
  CHECK(one.out == two.out);

  for (const char* bad : {"--seasons 0", "--seasons -5", "--span 0", "--span 21", "--span x",
                          "--threads -1", "--format xml", "--as-of 2049-13-40"}) {
    INFO(bad);
    const auto r = run("worth " + SMALL + " " + bad);
    CHECK(r.status == 2);
  }
  const auto missing = run("worth /no/such/season.yaml");
  CHECK(missing.status == 2);
  CHECK(missing.out.find("/no/such/season.yaml") != std::string::npos);

  const auto dir = fresh_dir("worth_report_test", "outputs");
  const auto target = dir / "worth.json";
  CHECK(run("worth " + SMALL + " --seasons 200 --span 1 --format json -o " + target.string())
            .status == 0);
  CHECK(nlohmann::json::parse(read_file(target))["run"]["seasons"] == 200);
  // The season file itself is refused as the output, before any work.
  const auto self = run("worth " + SMALL + " --seasons 200 -o " + SMALL);
  CHECK(self.status == 2);
}

TEST_CASE("worth --help shows the common options in the one style") {
  const auto help = run_process(PROGRAM + " worth --help");
  REQUIRE(help.status == 0);
  CHECK(help.out.find("SEASON_FILE") != std::string::npos);
  CHECK(help.out.find("--format") != std::string::npos);
  CHECK(help.out.find("(default: table)") != std::string::npos);
  CHECK(help.out.find("(default: standard output)") != std::string::npos);
  CHECK(help.out.find("--span") != std::string::npos);
  CHECK(help.out.find("(default: 5)") != std::string::npos);
  CHECK(help.out.find("--by-wins") != std::string::npos);
}

TEST_CASE("worth runs under another family and records it") {
  const auto j = run_process(PROGRAM + " worth " + SMALL +
                             " --seasons 200 --span 1 --family poisson --format json");
  REQUIRE(j.status == 0);
  const auto doc = nlohmann::json::parse(j.out);
  CHECK(doc["run"]["family"] == "poisson");
  CHECK(doc["shift_unit"] == "runs_per_game");
  // log5 needs a win_pct override for every team: refused with status 2.
  CHECK(run("worth " + SMALL + " --seasons 200 --family log5").status == 2);
}
