// One odds run at an as-of date, shared by the commands that simulate (odds, replay, report,
// movers): the season as known that morning, its fit, plan and simulation, and the report value
// every writer and the history are filled from.
#ifndef STANDFAST_TOOLS_ODDS_RUN_H
#define STANDFAST_TOOLS_ODDS_RUN_H

#include <string>

#include "config/season.h"
#include "engine/simulate.h"
#include "tools/history.h"
#include "tools/odds_report.h"
#include "tools/provenance.h"

namespace standfast::tools {

struct OddsRun {
  config::Season season;  // as known on the morning of as_of
  config::DayNumber as_of = 0;
  int games_played = 0;  // played games the fit used
  engine::SimulationResult result;
  OddsReport report;
  Provenance report_run;  // also in report.run
};

// The as-of date of a run: `text` (YYYY-MM-DD) when given, else config::default_as_of. Throws
// UsageError for a malformed date or a season with no dated game and no --as-of.
config::DayNumber resolve_as_of(const config::Season& season, const std::string& text);

// Fits the season as known on the morning of `as_of`, compiles the plan and simulates it.
// Problems the validator cannot see (nothing to fit, a plan that does not fit the ratings) are
// bad input: UsageError naming the season file.
OddsRun run_odds_at(const config::Season& full, config::DayNumber as_of,
                    const engine::RunOptions& run, double target_se,
                    const std::string& only_group = {});

// Only the simulation of `season` as it is (no as-of cut): used for counterfactual runs.
engine::SimulationResult simulate_season(const config::Season& season,
                                         const engine::RunOptions& run,
                                         double* shape_used = nullptr);

// The history record of a run (every team of the league, whatever group the report shows).
HistoryRun history_run(const OddsRun& run, const config::Season& full);

}  // namespace standfast::tools

#endif  // STANDFAST_TOOLS_ODDS_RUN_H
