// Tests for config/scenario.h: reading scenario files against a season, and every problem
// reported as FILE:LINE:COLUMN: message. Expected values are read off the invented files below
// (common practice: hand-worked cases).
#include <catch2/catch.hpp>
#include <string>

#include "config/load.h"
#include "config/scenario.h"

using namespace standfast::config;

namespace {

const std::string SEASON = R"(standfast: 1
league: {name: Test League, season: Y1}
teams:
  - {id: AAA, name: A}
  - {id: BBB, name: B}
  - {id: CCC, name: C}
groups:
  - {id: L, teams: [AAA, BBB, CCC]}
model: {family: weibull}
games:
  - {date: 2031-04-01, home: AAA, away: BBB, home_runs: 3, away_runs: 2}
  - {date: 2031-04-02, home: BBB, away: CCC}
  - {date: 2031-04-03, home: CCC, away: AAA}
  - {date: 2031-04-03, home: CCC, away: AAA, game: 2}
  - {date: tbd, home: AAA, away: CCC}
)";

Season season() { return load_season_text(SEASON, "s.yaml"); }

std::string errors_of(const std::string& yaml) {
  try {
    (void)load_scenarios_text(yaml, "w.yaml", season());
  } catch (const ConfigError& e) {
    return e.what();
  }
  return "no error";
}

}  // namespace

TEST_CASE("a scenario file with every kind of change is read") {
  const Season s = season();
  const ScenarioSet set = load_scenarios_text(R"(standfast_scenarios: 1
scenarios:
  - name: empty
  - name: everything
    teams:
      - {team: AAA, add_runs_scored: 0.25, from: 2031-04-02}
      - {team: BBB, runs_allowed: 3.9, sd_runs: 0.2}
    results:
      - {date: 2031-04-03, home: CCC, away: AAA, game: 2, winner: AAA}
    remove:
      - {date: tbd, home: AAA, away: CCC}
    add:
      - {date: 2031-04-09, home: BBB, away: AAA}
    model: {family: poisson}
)",
                                              "w.yaml", s);
  REQUIRE(set.scenarios.size() == 2);
  CHECK(set.scenarios[0].name == "empty");
  CHECK(set.scenarios[0].teams.empty());
  const Scenario& e = set.scenarios[1];
  REQUIRE(e.teams.size() == 2);
  CHECK(e.teams[0].add_runs_scored == 0.25);
  CHECK(e.teams[1].sd_runs == 0.2);
  REQUIRE(e.results.size() == 1);
  CHECK(e.results[0].game == 3);
  CHECK_FALSE(e.results[0].home_wins);
  CHECK(e.removed == std::vector<int>{4});
  REQUIRE(e.added.size() == 1);
  CHECK(e.added[0].home == 1);
  CHECK_FALSE(e.added[0].played);
  REQUIRE(e.model.has_value());
  CHECK(e.model->family == ScoreFamily::kPoisson);

  const Season applied = apply_scenario(s, e);
  CHECK(applied.overrides.size() == 2);
  CHECK(applied.games.size() == s.games.size() + 1);
  CHECK(applied.games.back().home == 1);
  CHECK(applied.model.family == ScoreFamily::kPoisson);
}

TEST_CASE("scenario file problems name the file, line and column") {
  const std::string head = "standfast_scenarios: 1\nscenarios:\n";
  CHECK(errors_of(head + "  - name: a\n    teams: [{team: AAB, add_runs_scored: 1}]\n") ==
        "w.yaml:4:20: scenarios[0].teams[0].team: unknown team 'AAB' (did you mean 'AAA'?)");
  CHECK(errors_of(head + "  - name: a\n    remove: [{date: 2031-04-05, home: BBB, away: CCC}]\n") ==
        "w.yaml:4:14: scenarios[0].remove[0]: no game 2031-04-05 CCC at BBB in s.yaml");
  CHECK(errors_of(head + "  - name: a\n    remove: [{date: 2031-04-01, home: AAA, away: BBB}]\n") ==
        "w.yaml:4:14: scenarios[0].remove[0]: the game 2031-04-01 BBB at AAA has been played");
  CHECK(errors_of(head +
                  "  - name: a\n    results: [{date: 2031-04-02, home: BBB, away: CCC, winner: "
                  "AAA}]\n") ==
        "w.yaml:4:64: scenarios[0].results[0].winner: AAA does not play in this game");
  CHECK(errors_of(head +
                  "  - name: a\n    results: [{date: 2031-04-02, home: BBB, away: CCC, winner: "
                  "CCC}]\n    remove: [{date: 2031-04-02, home: BBB, away: CCC}]\n") ==
        "w.yaml:5:14: scenarios[0].remove[0]: this game is already decided or removed in the "
        "scenario");
  CHECK(errors_of(head + "  - name: a\n  - name: a\n") ==
        "w.yaml:4:5: scenarios[1].name: 'a' is the name of an earlier scenario");
  CHECK(errors_of(head + "  - name: a\n    colour: red\n") ==
        "w.yaml:4:5: unknown key 'colour' in scenarios[0]; known keys: name, teams, results, "
        "remove, add, model");
  CHECK(errors_of("standfast_scenarios: 2\nscenarios: []\n") ==
        "w.yaml:1:22: standfast_scenarios: the format version must be 1, got '2'");
  CHECK(errors_of(head + "  - name: a\n    add: [{home: AAA, away: BBB}]\n") ==
        "w.yaml:4:11: scenarios[0].add[0].date: required (YYYY-MM-DD) for an added game");
  CHECK(errors_of(head + "  - name: a\n    add: [{date: 2031-05-01, home: AAA, away: AAA}]\n")
            .find("w.yaml:4:") == 0);
  CHECK(errors_of(head + "  - {name: a\n").find("w.yaml:") == 0);
}

TEST_CASE("a scenario file that cannot be read is reported") {
  const Season s = season();
  CHECK_THROWS_AS(load_scenarios("/nonexistent/w.yaml", s), ConfigError);
}

TEST_CASE(
    "a scenario that switches the family drops the season's fixed shape unless it states one") {
  Season s = season();
  s.model.shape = 1.83;  // a fixed Weibull shape in the season file
  const ScenarioSet set = load_scenarios_text(R"(standfast_scenarios: 1
scenarios:
  - name: other family
    model: {family: negative_binomial}
  - name: other family and size
    model: {family: negative_binomial, shape: 12}
  - name: same family
    model: {home_edge: 1.02}
)",
                                              "w.yaml", s);
  REQUIRE(set.scenarios.size() == 3);
  CHECK_FALSE(set.scenarios[0].model->shape.has_value());
  CHECK(set.scenarios[1].model->shape == 12.0);
  CHECK(set.scenarios[2].model->shape == 1.83);
}
