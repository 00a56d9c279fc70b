// The scenario report: each scenario's chances against the baseline's, per team, with the
// standard error of the paired difference (common random numbers) and the unpaired one beside
// it, as a terminal table, CSV or JSON (fields in tools/SCENARIOS.md).
#ifndef STANDFAST_TOOLS_SCENARIO_REPORT_H
#define STANDFAST_TOOLS_SCENARIO_REPORT_H

#include <cstdint>
#include <string>
#include <vector>

#include "config/scenario.h"
#include "config/season.h"
#include "engine/compare.h"
#include "engine/plan.h"
#include "tools/provenance.h"

namespace standfast::tools {

inline constexpr int SCENARIO_SCHEMA_VERSION = 1;

// The model a plan runs: family name and shape (Weibull shape, negative-binomial size, or the
// exponent mapping win percentages to runs), as every report records it.
struct ModelUsed {
  std::string family;
  double shape = 0;
};
ModelUsed model_used(const engine::Plan& plan);

struct ScenarioReport {
  std::string league, season_label, season_file, scenario_file;
  std::uint64_t seed = 0, seasons = 0;
  std::vector<std::string> team_ids;
  std::vector<std::string> team_names;  // display names (the id when a team has none)
  Provenance run;                       // what produced the report (tools/provenance.h)
  ModelUsed baseline_model;
  std::vector<std::string> names;  // per scenario
  std::vector<ModelUsed> models;   // per scenario
  engine::Comparison comparison;
};

std::string write_scenario_table(const ScenarioReport& report);
std::string write_scenario_csv(const ScenarioReport& report);
std::string write_scenario_json(const ScenarioReport& report);

}  // namespace standfast::tools

#endif  // STANDFAST_TOOLS_SCENARIO_REPORT_H
