// Movers: between two recorded as-of dates, the teams whose postseason and title chances moved
// most (each change with its standard error), and the games played in between that moved them
// most (what each result was worth to a team: its chance with the result, minus its chance had
// that game still been to play).
#ifndef STANDFAST_TOOLS_MOVERS_H
#define STANDFAST_TOOLS_MOVERS_H

#include <cstddef>
#include <cstdint>
#include <string>
#include <vector>

#include "config/season.h"
#include "engine/simulate.h"
#include "tools/history.h"

namespace standfast::tools {

struct Change {
  double before = 0, after = 0;
  double change = 0;  // after - before
  double se = 0;      // sqrt(se_before^2 + se_after^2): the two runs taken as independent
};

struct TeamMove {
  std::string id, name;
  Change postseason, title;
};

// One played game's effect on one team's postseason chance.
struct GameEffect {
  std::string date, home_id, home_name, away_id, away_name;
  int home_runs = 0, away_runs = 0;
  std::string team_id, team_name;  // the team it moved
  Change postseason;               // before: the game still to play; after: with its result
};

struct Movers {
  config::DayNumber from = 0, to = 0;
  std::vector<TeamMove> by_postseason;  // largest |change| first
  std::vector<TeamMove> by_title;       // largest |change| first
  std::vector<GameEffect> games;        // largest |change| first
};

// The teams of both runs (matched by id) whose postseason and title chances changed most,
// `top` of each. Teams absent from either run are skipped.
Movers compare_runs(const HistoryRun& from, const HistoryRun& to, std::size_t top);

// Fills movers.games: for every game played on a date in [movers.from, movers.to) that involves
// a team of the division of a team in movers.by_postseason, runs the season as of movers.to
// with that game turned back into a game still to play (same seed, `run.seasons` seasons) and
// compares each listed team's postseason chance with the run as of movers.to. Keeps the `top`
// largest effects. Throws UsageError when a run cannot be fitted.
void add_game_effects(Movers& movers, const config::Season& season, const engine::RunOptions& run,
                      std::size_t top);

}  // namespace standfast::tools

#endif  // STANDFAST_TOOLS_MOVERS_H
