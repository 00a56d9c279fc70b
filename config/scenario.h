// Scenarios: named what-ifs on a season (team changes, decided, removed and added games, another
// model), read from a scenario file (YAML) and checked against the season they apply to. The
// engine runs each against the season itself on common random numbers (engine/compare.h).
#ifndef STANDFAST_CONFIG_SCENARIO_H
#define STANDFAST_CONFIG_SCENARIO_H

#include <filesystem>
#include <optional>
#include <string>
#include <vector>

#include "config/season.h"

namespace standfast::config {

// A remaining game given a result by a scenario.
struct DecidedGame {
  int game = -1;  // index into Season::games (a game not yet played)
  bool home_wins = false;
  SourcePos pos;
};

struct Scenario {
  std::string name;
  std::vector<TeamOverride> teams;   // applied after the season's own overrides
  std::vector<DecidedGame> results;  // games given a result
  std::vector<int> removed;          // indexes into Season::games (games not yet played)
  std::vector<Game> added;           // games added to the schedule (not played)
  std::optional<ModelSpec> model;    // the season's model with the scenario's keys changed
  SourcePos pos;
};

struct ScenarioSet {
  std::string file;
  std::vector<Scenario> scenarios;  // file order
};

// Reads a scenario file for `season`. Throws ConfigError listing every problem (unknown team,
// no such remaining game, a game decided or removed twice, a scenario name given twice, ...)
// as FILE:LINE:COLUMN: message.
ScenarioSet load_scenarios(const std::filesystem::path& file, const Season& season);
ScenarioSet load_scenarios_text(const std::string& yaml_text, const std::filesystem::path& file,
                                const Season& season);

// The season as a scenario describes it: its team changes appended to the overrides, its added
// games appended to Season::games (after every game of `season`), its model in place. Results
// and removals are not applied here: the engine plays those games and then ignores or replaces
// their results (engine/plan.h, PlanEdits), to keep the random numbers in step.
Season apply_scenario(const Season& season, const Scenario& scenario);

}  // namespace standfast::config

#endif  // STANDFAST_CONFIG_SCENARIO_H
