// Tests of the commands over the odds history (`standfast replay`, `movers`, `report`) and of the
// as-of date on the invented small league. References: byte comparison with a plain odds run
// (the replay's last date is that run, by construction of DESIGN.md's "replaying a season is
// running it at a series of as-of dates"); the variance of a difference of two independent
// estimates, se^2 = se1^2 + se2^2 (common practice); exit statuses of the program's contract
// (0 success, 2 bad input; DESIGN.md).
#include <catch2/catch.hpp>
#include <cmath>
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

Run run(const std::string& args) {
  return standfast::testing::run_process(PROGRAM + " " + args + " 2>/dev/null");
}
// The same, with standard error in the captured output.
Run run_err(const std::string& args) {
  return standfast::testing::run_process(PROGRAM + " " + args + " 2>&1");
}

using standfast::testing::read_file;

fs::path fresh_dir(const std::string& name) {
  return standfast::testing::fresh_dir("history_cli_test", name);
}

}  // namespace

TEST_CASE("replay records every date and its last date equals a plain odds run byte for byte") {
  const fs::path dir = fresh_dir("replay");
  const std::string h = (dir / "h.sqlite").string();
  const Run replay =
      run("replay " + SMALL + " --every 7 --seasons 3000 --seed 11 --format json --history " + h +
          " -o " + (dir / "last.json").string());
  REQUIRE(replay.status == 0);
  const Run odds = run("odds " + SMALL + " --seasons 3000 --seed 11 --format json -o " +
                       (dir / "odds.json").string());
  REQUIRE(odds.status == 0);
  const std::string a = read_file(dir / "last.json"), b = read_file(dir / "odds.json");
  REQUIRE(!a.empty());
  CHECK(a == b);

  // The small league is played from 2049-05-06 to 2049-05-30: as-of dates 05-31, 05-24, 05-17,
  // 05-10 (every 7 days back from the morning after the last played game).
  const std::string dates =
      standfast::testing::run_command("sqlite3 " + h + " 'SELECT as_of FROM run ORDER BY as_of'");
  CHECK(dates == "2049-05-10\n2049-05-17\n2049-05-24\n2049-05-31\n");
  const std::string teams =
      standfast::testing::run_command("sqlite3 " + h + " 'SELECT count(*) FROM team_odds'");
  CHECK(teams == "24\n");  // 6 teams x 4 dates

  // Replaying again replaces the rows of the same dates and settings.
  REQUIRE(run("replay " + SMALL + " --every 7 --seasons 3000 --seed 11 --history " + h).status ==
          0);
  CHECK(standfast::testing::run_command("sqlite3 " + h + " 'SELECT count(*) FROM run'") == "4\n");

  SECTION("movers between the last two dates") {
    const Run m = run("movers " + SMALL + " --history " + h +
                      " --format json --top 3 --game-seasons 2000 --seed 11");
    REQUIRE(m.status == 0);
    const auto doc = nlohmann::json::parse(m.out);
    CHECK(doc["from"] == "2049-05-24");
    CHECK(doc["to"] == "2049-05-31");
    REQUIRE(doc["by_postseason"].size() == 3);
    double previous = 2;
    for (const auto& t : doc["by_postseason"]) {
      const auto& c = t["postseason"];
      CHECK(std::abs(c["change"].get<double>()) <= previous);
      previous = std::abs(c["change"].get<double>());
      CHECK(c["change"].get<double>() == c["after"].get<double>() - c["before"].get<double>());
    }
    // The standard errors are those of the two recorded runs, combined as independent.
    const std::string id = doc["by_postseason"][0]["team_id"];
    auto se_at = [&](const std::string& date) {
      return std::stod(standfast::testing::run_command(
          "sqlite3 " + h + " \"SELECT postseason_se FROM team_odds JOIN run ON run.id = run_id " +
          "WHERE team = '" + id + "' AND as_of = '" + date + "'\""));
    };
    // Ref: common practice; var(X - Y) = var X + var Y for independent X, Y; 9 digits (sqlite3
    // prints 15 significant digits).
    CHECK(doc["by_postseason"][0]["postseason"]["se"].get<double>() ==
          Approx(std::hypot(se_at("2049-05-24"), se_at("2049-05-31"))).epsilon(1e-9));
    // Games weighed: played on 05-24..05-30, largest effect first.
    REQUIRE(doc["games"].size() == 3);
    for (const auto& g : doc["games"]) {
      CHECK(g["date"].get<std::string>() >= "2049-05-24");
      CHECK(g["date"].get<std::string>() <= "2049-05-30");
    }
  }
  SECTION("movers name the dates the history has when asked for another") {
    const Run m = run_err("movers " + SMALL + " --history " + h + " --from 2049-05-11");
    CHECK(m.status == 2);
    CHECK(m.out.find("2049-05-10, 2049-05-17, 2049-05-24, 2049-05-31") != std::string::npos);
  }
}

TEST_CASE("odds as of a date equal odds on the file with the later games left unscored") {
  const fs::path dir = fresh_dir("as_of");
  // The reference file: the small league with every game dated 2049-05-20 or later unscored.
  std::string text = read_file(SMALL);
  std::istringstream in(text);
  std::string line, cut;
  int unscored = 0;
  while (std::getline(in, line)) {
    const auto at = line.find("{date: 2049-05-");
    if (at != std::string::npos && line.compare(at + 15, 2, "20") >= 0 &&
        line.find("home_runs") != std::string::npos) {
      line = line.substr(0, line.find(", home_runs")) + "}";
      ++unscored;
    }
    cut += line + '\n';
  }
  REQUIRE(unscored > 10);
  // Beside the original, so that relative paths and the file name in messages stay alike.
  const fs::path copy = dir / "season.yaml";
  std::ofstream(copy) << cut;
  const Run a = run("odds " + SMALL + " --as-of 2049-05-20 --seasons 3000 --format json");
  const Run b = run("odds " + copy.string() + " --seasons 3000 --format json");
  REQUIRE(a.status == 0);
  REQUIRE(b.status == 0);
  // The same numbers; only the provenance names a different file with a different hash.
  auto ja = nlohmann::json::parse(a.out);
  auto jb = nlohmann::json::parse(b.out);
  for (auto* doc : {&ja, &jb}) {
    (*doc)["run"].erase("season_file");
    (*doc)["run"].erase("season_sha256");
  }
  CHECK(ja == jb);
}

TEST_CASE("history commands refuse bad input with exit status 2") {
  const fs::path dir = fresh_dir("bad");
  const fs::path junk = dir / "junk.sqlite";
  std::ofstream(junk) << "this is a text file, not a history\n";
  Run r = run_err("movers " + SMALL + " --history " + junk.string());
  CHECK(r.status == 2);
  CHECK(r.out.find(junk.string()) != std::string::npos);
  r = run_err("replay " + SMALL + " --seasons 100 --history " + junk.string());
  CHECK(r.status == 2);
  CHECK(read_file(junk) == "this is a text file, not a history\n");  // left as it was
  r = run_err("movers " + SMALL + " --history " + (dir / "none.sqlite").string());
  CHECK(r.status == 2);
  CHECK(r.out.find("no such history file") != std::string::npos);
  r = run_err("replay " + SMALL + " --every 0 --history " + (dir / "h.sqlite").string());
  CHECK(r.status == 2);
  r = run_err("report " + SMALL + " --as-of 2049-13-01 --history " + (dir / "h.sqlite").string());
  CHECK(r.status == 2);
  CHECK(r.out.find("--as-of") != std::string::npos);
}
