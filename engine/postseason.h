// The postseason: series of the configured lengths and home patterns, and brackets with byes,
// a fixed bracket in standard order or reseeding after every round.
//
// A bracket of Q qualifiers is padded to P = the next power of two; round one pairs the seeds in
// standard bracket order (1-P, P/2-(P/2+1), ... so that seeds 1 and 2 can meet only in the
// last round), and a seed whose opponent slot is empty (seed > Q) advances without playing: the
// top P - Q seeds get byes. Fixed bracket: winners keep their places. Reseeding: after every
// round the survivors are ordered by seed and the best meets the worst.
// A team "reaches round r" when it is still alive at the start of round r (so a team with a
// bye reaches the round it skips).
#ifndef STANDFAST_ENGINE_POSTSEASON_H
#define STANDFAST_ENGINE_POSTSEASON_H

#include <cstdint>
#include <span>
#include <vector>

#include "engine/plan.h"
#include "engine/seeding.h"

namespace standfast::engine {

// Seeds (1-based) of a bracket of `size` (a power of two) slots in standard order.
std::vector<int> standard_bracket_order(int size);

// A best-of series: the higher seed hosts game g when bit g of higher_hosts is set. Plays games
// through `game` (home first, away second; returns the winner) until one side has
// best_of / 2 + 1 wins. Returns the winner.
int play_series(int best_of, std::uint32_t higher_hosts, int higher, int lower, ExtraGame game,
                int* games_played = nullptr);

// Working space for play_bracket (one per thread).
struct BracketScratch {
  std::vector<int> current, next;  // seeds alive, in bracket position order (0 = empty slot)
};

// Plays one bracket. `seeded` are the qualifiers best first (seed s = seeded[s - 1]).
// For every team that takes part, reached[team] is raised to the global index of the last round
// it is alive at the start of (bracket.first_round + k). Returns the bracket's winner.
int play_bracket(const PlanBracket& bracket, std::span<const PlanRound> rounds, bool reseed,
                 std::span<const int> seeded, ExtraGame game, std::span<int> reached,
                 BracketScratch& scratch);

}  // namespace standfast::engine

#endif  // STANDFAST_ENGINE_POSTSEASON_H
