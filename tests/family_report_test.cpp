// Tests for tools/family_report.h (model sensitivity, `standfast families`): the spread and its
// error bound from a comparison, the writers, and the command through the built program.
// References: sd(X - Y) <= sd(X - B) + sd(Y - B) (Minkowski's inequality; common practice);
// exit statuses of the program's contract (0 success, 2 bad input); JSON parsed back with
// nlohmann-json (3.11, Debian 12); each family's column equals `standfast odds --family F` with
// the same seed, since the paired run plays every family on the streams a plain run of it uses
// (engine/compare.h); byte comparison for the determinism rule.
#include "tools/family_report.h"

#include <algorithm>
#include <catch2/catch.hpp>
#include <nlohmann/json.hpp>
#include <string>
#include <vector>

#include "tests/process_support.h"

using namespace standfast;
using namespace standfast::tools;

namespace {

const std::string PROGRAM = STANDFAST_BINARY_DIR "/tools/standfast";
const std::string SMALL = STANDFAST_SOURCE_DIR "/scenarios/small/season.yaml";

using Run = standfast::testing::ProcessResult;

Run run(const std::string& args) {
  return standfast::testing::run_process(PROGRAM + " " + args + " 2>&1");
}

nlohmann::json json_of(const Run& r) {
  return nlohmann::json::parse(r.out.substr(r.out.find('{')));
}

// A comparison of one team under a reference and two other families.
engine::Comparison three_families() {
  engine::Comparison c;
  c.baseline.teams.resize(1);
  c.baseline.teams[0].postseason.p = 0.40;
  c.baseline.teams[0].mean_wins = 80.0;
  c.alternatives.resize(2);
  const double alt[2] = {0.47, 0.35};
  const double se[2] = {0.004, 0.003};
  for (int a = 0; a < 2; ++a) {
    engine::TeamComparison t;
    t.postseason.base = 0.40;
    t.postseason.alt = alt[a];
    t.postseason.diff = alt[a] - 0.40;
    t.postseason.se_paired = se[a];
    t.postseason.se_unpaired = 0.01;
    t.wins.base = t.wins.alt = 80.0;
    c.alternatives[static_cast<std::size_t>(a)].teams.push_back(t);
  }
  return c;
}

}  // namespace

TEST_CASE("the spread is highest - lowest with the paired errors of the two added as a bound") {
  FamiliesReport r;
  r.league = "L";
  r.season_label = "S";
  for (const char* family : {"weibull", "negative_binomial", "poisson"}) {
    FamilyModel m;
    m.model.family = family;
    m.model.shape = m.model.family == "poisson" ? 0.0 : 1.8;
    m.shape_source = m.model.family == "poisson" ? "" : "fitted";
    r.models.push_back(m);
  }
  r.skipped = {{"log5", "log5 needs a win_pct override for every team"}};
  fill_family_teams(r, three_families(), {"AAA"}, {"Alpha"});
  REQUIRE(r.teams.size() == 1);
  const FamilySpread& p = r.teams[0].chances[1];  // postseason
  CHECK(p.values == std::vector<double>{0.40, 0.47, 0.35});
  CHECK(p.spread == Approx(0.12).epsilon(1e-12));
  CHECK(p.highest == 1);
  CHECK(p.lowest == 2);
  // Ref: Minkowski, sd(X - Y) <= sd(X - B) + sd(Y - B) (common practice): 0.004 + 0.003.
  CHECK(p.spread_se_bound == Approx(0.007).epsilon(1e-12));
  // With the reference at an end, its own error is 0: the bound is the other's paired error.
  const FamilySpread& w = r.teams[0].chances[4];  // mean wins: all equal
  CHECK(w.spread == 0.0);

  const std::string table = write_families_table(r);
  CHECK(table.find("not advice for wagering") != std::string::npos);
  CHECK(table.find("Left out: log5") != std::string::npos);
  CHECK(table.find("12.0") != std::string::npos);
  const std::string csv = write_families_csv(r);
  // One header and a row per chance and family: 5 x 3.
  CHECK(std::count(csv.begin(), csv.end(), '\n') == 16);
  const auto j = nlohmann::json::parse(write_families_json(r));
  CHECK(j["kind"] == "families");
  CHECK(j["families"].size() == 3);
  CHECK(j["families"][2]["shape"].is_null());
  CHECK(j["left_out"][0]["family"] == "log5");
  CHECK(j["teams"][0]["postseason"]["highest"] == "negative_binomial");
  CHECK(j["teams"][0]["postseason"]["by_family"]["poisson"]["value"] == 0.35);
}

TEST_CASE("families on the small league: every column is that family's own odds run") {
  const Run r = run("families " + SMALL + " --seasons 2000 --seed 7 --format json");
  REQUIRE(r.status == 0);
  const auto j = json_of(r);
  REQUIRE(j["families"].size() == 3);  // no win_pct overrides: log5 is left out
  CHECK(j["families"][0]["family"] == "weibull");
  CHECK(j["left_out"][0]["family"] == "log5");
  CHECK(j["run"]["family"] == "weibull");
  for (const auto& family : j["families"]) {
    const std::string name = family["family"];
    const Run odds =
        run("odds " + SMALL + " --seasons 2000 --seed 7 --format json --family " + name);
    REQUIRE(odds.status == 0);
    const auto o = json_of(odds);
    for (const auto& team : o["teams"]) {
      const std::string id = team.contains("team_id") ? team["team_id"] : team["id"];
      for (const auto& t : j["teams"])
        if (t["team_id"] == id) {
          INFO(name << " " << id);
          CHECK(t["postseason"]["by_family"][name]["value"] == team["postseason"]["p"]);
        }
    }
  }
  const Run table = run("families " + SMALL + " --seasons 500 --chance title");
  REQUIRE(table.status == 0);
  CHECK(table.out.find("title chance under each scoring family") != std::string::npos);
  CHECK(table.out.find("not advice for wagering") != std::string::npos);
  CHECK(table.out.find("Run: standfast") != std::string::npos);
}

TEST_CASE("families: same bytes for any thread count; bad options exit 2 and write nothing") {
  const std::string args = "families " + SMALL + " --seasons 500 --format csv";
  const Run one = run(args + " --threads 1");
  const Run two = run(args + " --threads 2");
  REQUIRE(one.status == 0);
  CHECK(one.out == two.out);
  const auto dir = standfast::testing::fresh_dir("family_report_test", "bad");
  const auto out = dir / "out.csv";
  for (const char* bad : {"--chance wins", "--seasons 0", "--family log5", "--shape 99"}) {
    INFO(bad);
    CHECK(run("families " + SMALL + " " + bad + " -o " + out.string()).status == 2);
    CHECK_FALSE(std::filesystem::exists(out));
  }
}
