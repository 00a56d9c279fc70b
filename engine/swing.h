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

// The remaining games (indexes into the plan's remaining games, in date order) in which `team`
// plays, home or away.
std::vector<std::uint32_t> games_of_team(const Plan& plan, int team);

// The remaining games dated on days first .. first + days - 1, in date order.
std::vector<std::uint32_t> games_of_days(const Plan& plan, config::DayNumber first, int days);

// One team's view of a game it plays: its chance if it wins the game, if it loses it, and the
// difference (win - lose) with its standard error.
struct TeamStake {
  double if_wins = 0, if_loses = 0;
  double difference = 0;  // if_wins - if_loses
  double se = 0;
};
TeamStake for_team(const ConditionalChance& home_view, bool team_is_home);

// What one game moves over all teams. Every simulated season has the same number of division
// winners and of berths, so the teams' swings of a chance add up to zero: `moved` is the sum of
// the rises (= half the sum of the absolute swings), the chance that changes hands between
// teams with the game's result. `noise` is sqrt(2/pi) x half the sum of the standard errors,
// what `moved` would be on average from Monte Carlo noise alone if the game moved nothing
// (E|X| = sigma sqrt(2/pi) for a normal X of mean 0; common practice).
struct SwingTotal {
  double moved = 0, noise = 0;
};
SwingTotal total_swing(std::span<const ConditionalChance> teams);

}  // namespace standfast::engine

#endif  // STANDFAST_ENGINE_SWING_H
