#include "engine/simulate.h"

#include <algorithm>
#include <cmath>
#include <memory>
#include <optional>
#include <stdexcept>

#include "engine/parallel.h"
#include "engine/season_runner.h"
#include "engine/streams.h"
#include "engine/tally.h"

namespace standfast::engine {

namespace {

// Seasons per parallel task (tasks are cut to exactly this size: tbb::simple_partitioner). Any
// value gives the same result, as every season's streams are keyed by its index. Small tasks
// keep the wait at the end of each batch short (a task is about a millisecond); the per-task
// cost (a worker look-up) stays negligible.
constexpr std::uint64_t GRAIN = 32;

}  // namespace

SimulationResult simulate(const Plan& plan, const RunOptions& options) {
  using detail::SeasonRunner;
  using detail::Worker;
  if (options.batch == 0) throw std::invalid_argument("simulate: batch must be > 0");
  if (options.threads < 0)
    throw std::invalid_argument("simulate: threads must be >= 0, got " +
                                std::to_string(options.threads));
  if (plan.teams < 2) throw std::invalid_argument("simulate: the plan has no league");
  if (options.ranks < 1 || options.rank < 0 || options.rank >= options.ranks ||
      (options.ranks > 1 && !options.combine))
    throw std::invalid_argument("simulate: rank " + std::to_string(options.rank) + " of " +
                                std::to_string(options.ranks) + " (several need combine)");
  const SeasonRunner runner(plan, options.postseason);
  PerThread<Worker> workers([&] { return Worker(plan); }, options.threads);
  Tally total(plan.teams, static_cast<int>(plan.rounds.size()), plan.max_games,
              std::max(plan.max_seed, 1));

  SimulationResult result;
  std::uint64_t done = 0;
  while (done < options.seasons) {
    const std::uint64_t end = std::min(options.seasons, done + options.batch);
    // This process's share of the batch (all of it when alone).
    const auto ranks = static_cast<std::uint64_t>(options.ranks);
    const auto rank = static_cast<std::uint64_t>(options.rank);
    const std::uint64_t first = done + (end - done) * rank / ranks;
    const std::uint64_t last = done + (end - done) * (rank + 1) / ranks;
    workers.for_each_chunk(first, last, GRAIN,
                           [&](std::uint64_t from, std::uint64_t to, Worker& w) {
                             SeasonStreams streams(options.seed, from);
                             for (std::uint64_t s = from; s < to; ++s) {
                               runner.run(streams, w);
                               streams.next();
                             }
                           });
    done = end;
    // The totals are needed between batches only for the early stop; without it they are added
    // once, after the last batch (one all-reduce for an MPI run instead of one per batch, so the
    // ranks never wait for each other before the end).
    if (options.target_se <= 0 && done < options.seasons) {
      if (options.progress) options.progress(done, options.seasons);
      continue;
    }
    total.clear();
    workers.for_each_worker([&](const Worker& w) { total.merge(w.tally); });
    if (options.ranks > 1) {
      std::vector<std::uint64_t> counts = total.counts();
      options.combine(counts);
      total.set_counts(counts);
    }
    if (options.progress) options.progress(done, options.seasons);
    if (options.target_se > 0 && done < options.seasons && total.max_se() < options.target_se) {
      result.stopped_early = true;
      break;
    }
  }
  total.fill(result);
  result.seed = options.seed;
  for (const auto& r : plan.rounds) result.round_names.push_back(r.name);
  return result;
}

}  // namespace standfast::engine
