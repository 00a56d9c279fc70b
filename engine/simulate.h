// The parallel season simulation: runs many remaining seasons from a compiled Plan and tallies,
// per team, division titles, postseason berths, byes, rounds reached, titles, and the spread of
// final wins and seeds. Every season draws from its own random streams (engine/rng.h), so the
// result depends only on the seed and the number of seasons, never on the number of threads.
#ifndef STANDFAST_ENGINE_SIMULATE_H
#define STANDFAST_ENGINE_SIMULATE_H

#include <cstdint>
#include <functional>
#include <string>
#include <vector>

#include "engine/plan.h"

namespace standfast::engine {

struct RunOptions {
  std::uint64_t seed = 1;
  std::uint64_t seasons = 100000;  // maximum number of simulated seasons
  double target_se = 0.0;          // stop once the largest standard error is below this; 0 = off
  std::uint64_t batch = 10000;     // seasons per batch; batch boundaries never depend on threads
  int threads = 0;                 // 0 = all cores (tbb::global_control when > 0)
  bool postseason = true;          // false: regular season and standings only (benchmarks)
  // Called between batches on the caller's thread with the seasons done so far and the maximum.
  std::function<void(std::uint64_t done, std::uint64_t total)> progress;
  // One run shared by several processes (MPI ranks): this process plays its share, rank of
  // ranks, of every batch, and `combine` replaces its integer counts (Tally::counts) by their
  // sum over the processes (an all-reduce): after every batch when target_se is set, else once
  // after the last. Every process then holds the totals of a single-process run, and takes the
  // same stop decision.
  int rank = 0, ranks = 1;
  std::function<void(std::vector<std::uint64_t>& counts)> combine;
};

struct Probability {
  double p = 0;
  double se = 0;  // Monte Carlo standard error sqrt(p(1-p)/N)
};

struct TeamOdds {
  Probability division, postseason, bye, title;
  std::vector<Probability> reached_round;     // [r] = still alive at the start of round r
  std::vector<std::uint64_t> wins_histogram;  // [w] = seasons ending with w wins
  std::vector<std::uint64_t> seed_histogram;  // [0] = missed the postseason, [s] = seed s
  double mean_wins = 0, wins_p10 = 0, wins_p50 = 0, wins_p90 = 0;
  double mean_losses = 0;
};

struct SimulationResult {
  std::uint64_t seed = 0, seasons = 0;
  std::vector<TeamOdds> teams;  // Season::teams order
  std::vector<std::string> round_names;
  double max_se = 0;
  double extra_innings_share = 0;     // of simulated regular-season games
  std::uint64_t games_simulated = 0;  // regular-season games, all seasons
  std::uint64_t extra_innings_games = 0;
  std::uint64_t drawn_games = 0;  // regular-season games left tied at the innings cap
  bool stopped_early = false;
};

// compile_plan(season, ratings) is declared in engine/plan.h.

// Runs up to options.seasons seasons in batches of options.batch (the last may be shorter), in
// parallel with oneTBB. Throws std::invalid_argument for a zero batch, negative threads, or a
// rank outside 0..ranks-1 (or several ranks without `combine`).
SimulationResult simulate(const Plan& plan, const RunOptions& options);

}  // namespace standfast::engine

#endif  // STANDFAST_ENGINE_SIMULATE_H
