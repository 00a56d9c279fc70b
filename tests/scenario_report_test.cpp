// Tests for tools/scenario_report.h: the whatif writers on a hand-built comparison of an invented
// two-team league. References: CSV quoting by RFC 4180 section 2 (a field holding a comma is
// quoted); JSON parsed back with nlohmann-json (3.11, Debian 12); the numbers are the hand-built
// inputs, printed as stated in tools/SCENARIOS.md (common practice).
#include "tools/scenario_report.h"

#include <catch2/catch.hpp>
#include <nlohmann/json.hpp>
#include <string>

#include "tools/odds_report.h"

using namespace standfast;

namespace {

tools::ScenarioReport report() {
  tools::ScenarioReport r;
  r.league = "Test League";
  r.season_label = "Y1";
  r.season_file = "s.yaml";
  r.scenario_file = "w.yaml";
  r.seed = 7;
  r.seasons = 1000;
  r.team_ids = {"AAA", "BBB"};
  r.baseline_model = {"weibull", 1.8};
  r.names = {"same", "AAA, better"};
  r.models = {{"weibull", 1.8}, {"poisson", 0.0}};
  engine::AlternativeResult same, better;
  same.teams.resize(2);
  better.teams.resize(2);
  better.teams[0].postseason = engine::paired_chance(400, 450, 50, 100, 1000);
  better.teams[0].wins = {80.0, 81.5, 1.5, 0.01, 0.2};
  r.comparison.alternatives = {same, better};
  return r;
}

}  // namespace

TEST_CASE("the table states the caution, the model and only the teams that changed") {
  const std::string t = tools::write_scenario_table(report());
  CHECK(t.find(std::string(tools::ODDS_CAUTION)) != std::string::npos);
  CHECK(t.find("Baseline model: weibull, shape 1.800") != std::string::npos);
  CHECK(
      t.find("Scenario \"same\" (model: weibull, shape 1.800)\n  no chance of any team changed") !=
      std::string::npos);
  CHECK(t.find("poisson (no shape)") != std::string::npos);
  // Ref: paired_chance(400, 450, 50, 100, 1000): 40.00 -> 45.00, +5.00, paired 1.21, unpaired
  // 2.21 percentage points (tests/compare_test.cpp works the errors out).
  CHECK(t.find("  AAA      postseason      40.00     45.00    +5.00      1.21        2.21\n") !=
        std::string::npos);
  CHECK(t.find("(1 more teams: no chance changed)") != std::string::npos);
}

TEST_CASE("CSV has a row per scenario, team and chance") {
  const std::string c = tools::write_scenario_csv(report());
  CHECK(c.rfind("scenario,family,shape,team_id,team_name,chance,baseline,scenario_value,change,"
                "se_paired,se_unpaired,run_version,",
                0) == 0);
  CHECK(c.find("\"AAA, better\",poisson,0,AAA,AAA,postseason,0.400000,0.450000,0.050000,0.012145,"
               "0.022079,") != std::string::npos);
  std::size_t rows = 0;
  for (char ch : c) rows += ch == '\n';
  CHECK(rows == 1 + 2 * 2 * 5);
}

TEST_CASE("JSON carries the schema version, the caution, the models and every chance") {
  const auto j = nlohmann::json::parse(tools::write_scenario_json(report()));
  CHECK(j["schema_version"] == tools::SCENARIO_SCHEMA_VERSION);
  CHECK(j["caution"] == std::string(tools::ODDS_CAUTION));
  CHECK(j["baseline_model"]["family"] == "weibull");
  REQUIRE(j["scenarios"].size() == 2);
  const auto& s = j["scenarios"][1];
  CHECK(s["model"]["family"] == "poisson");
  CHECK(s["teams"][0]["postseason"]["change"].get<double>() == Approx(0.05));
  CHECK(s["teams"][0]["mean_wins"]["scenario"].get<double>() == 81.5);
  for (const char* k : {"division", "postseason", "bye", "title", "mean_wins"})
    CHECK(s["teams"][1].contains(k));
}
