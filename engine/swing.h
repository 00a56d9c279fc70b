// Which remaining games matter: from the simulated seasons of one run, each chosen game's
// effect on every team's chances of the division and of the postseason, as the difference
// between the seasons in which the home side won the game and those in which it lost
// (conditional tallies: no extra seasons are simulated). Integer counts, merged exactly: the
// result does not depend on the thread count.
#ifndef STANDFAST_ENGINE_SWING_H
#define STANDFAST_ENGINE_SWING_H

#include <cstdint>
#include <span>
#include <vector>

#include "engine/plan.h"
#include "engine/simulate.h"

namespace standfast::engine {

// A chance of one team given the result of one game.
struct ConditionalChance {
  double if_home_wins = 0, if_away_wins = 0;
  double swing = 0;  // if_home_wins - if_away_wins
  double se = 0;     // standard error of the swing (two independent proportions)
};

struct GameSwing {
  std::uint32_t game = 0;     // index into the plan's remaining games
  double home_win_share = 0;  // share of seasons in which the home side won it
  std::vector<ConditionalChance> division, postseason;  // per team
};

struct SwingResult {
  SimulationResult odds;         // the plain run the tallies come from
  std::vector<GameSwing> games;  // in the order asked for
};

// Runs the plan as simulate() does (same seasons, same odds) and tallies, for each listed game
// (indexes into the plan's remaining games), every team's division and postseason chances
// given its result. Throws std::invalid_argument for a game index out of range or bad options.
SwingResult simulate_swings(const Plan& plan, std::span<const std::uint32_t> games,
                            const RunOptions& options);

}  // namespace standfast::engine

#endif  // STANDFAST_ENGINE_SWING_H
