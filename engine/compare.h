// Paired comparison of plans on common random numbers: every simulated season is played under
// the baseline plan and under each alternative with the same random streams (engine/rng.h:
// keyed by seed, season and purpose), and the joint outcome of each season is tallied, so a
// difference of chances comes with the standard error of the paired difference, usually far
// smaller than that of two independent runs. Plans of one season compiled with PlanEdits draw
// every random number for the same game, so a scenario that changes nothing differs by exactly
// zero. Counts are integers, merged exactly: the result does not depend on the thread count.
#ifndef STANDFAST_ENGINE_COMPARE_H
#define STANDFAST_ENGINE_COMPARE_H

#include <cstdint>
#include <span>
#include <vector>

#include "engine/plan.h"
#include "engine/simulate.h"

namespace standfast::engine {

// One chance of one team under the baseline and an alternative.
struct PairedChance {
  double base = 0, alt = 0;
  double diff = 0;         // alt - base
  double se_paired = 0;    // standard error of the paired difference
  double se_unpaired = 0;  // what it would be from two independent runs of the same size
};

struct TeamComparison {
  PairedChance division, postseason, bye, title;
  PairedChance wins;  // mean final wins (not a probability)
};

struct AlternativeResult {
  SimulationResult result;            // the alternative's own odds
  std::vector<TeamComparison> teams;  // Season::teams order
};

struct Comparison {
  SimulationResult baseline;
  std::vector<AlternativeResult> alternatives;  // in the order given
};

// Runs options.seasons seasons (options.target_se is not used) of the baseline and of every
// alternative on the same streams. Every plan must be of the same league (same teams). Throws
// std::invalid_argument when they differ or the options are bad.
Comparison compare_plans(const Plan& baseline, std::span<const Plan* const> alternatives,
                         const RunOptions& options);

// The paired and unpaired errors from joint counts of a 0/1 outcome over n seasons: base_only
// = seasons with the outcome under the baseline only, alt_only = under the alternative only.
PairedChance paired_chance(std::uint64_t base_count, std::uint64_t alt_count,
                           std::uint64_t base_only, std::uint64_t alt_only, std::uint64_t n);

}  // namespace standfast::engine

#endif  // STANDFAST_ENGINE_COMPARE_H
