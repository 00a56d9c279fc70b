// The subcommands of the `standfast` program. Each tools/cmd_*.cpp defines one add_*_command that
// registers its options and its callback on the application. Callbacks throw on failure:
// config::ConfigError and UsageError end with exit status 2 (bad input), anything else with 1.
#ifndef STANDFAST_TOOLS_COMMANDS_H
#define STANDFAST_TOOLS_COMMANDS_H

#include <CLI/CLI.hpp>
#include <stdexcept>

namespace standfast::tools {

// Bad input that is not a season-file problem (a bad option value, an unreadable path).
class UsageError : public std::runtime_error {
 public:
  using std::runtime_error::runtime_error;
};

void add_check_command(CLI::App& app);      // validate a season file, print a summary
void add_standings_command(CLI::App& app);  // standings by division
void add_fit_command(CLI::App& app);        // fitted scoring models and diagnostics
void add_odds_command(CLI::App& app);       // the main job: simulated postseason odds
void add_backtest_command(CLI::App& app);   // calibration of the odds against outcomes
// replay, movers and report: the odds history and the report page (tools/cmd_history.cpp)
void add_history_commands(CLI::App& app);
void add_whatif_command(CLI::App& app);    // scenarios against the season, paired
void add_worth_command(CLI::App& app);     // the value of a win, team by team
void add_stakes_command(CLI::App& app);    // the games that matter, from one run's seasons
void add_families_command(CLI::App& app);  // model sensitivity: every scoring family, paired

}  // namespace standfast::tools

#endif  // STANDFAST_TOOLS_COMMANDS_H
