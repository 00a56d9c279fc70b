#include "engine/simulate.h"

#include <tbb/blocked_range.h>
#include <tbb/enumerable_thread_specific.h>
#include <tbb/global_control.h>
#include <tbb/parallel_for.h>

#include <algorithm>
#include <cmath>
#include <memory>
#include <optional>
#include <stdexcept>

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
  std::optional<tbb::global_control> control;
  if (options.threads > 0)
    control.emplace(tbb::global_control::max_allowed_parallelism,
                    static_cast<std::size_t>(options.threads));

  const SeasonRunner runner(plan, options.postseason);
  tbb::enumerable_thread_specific<Worker> workers([&] { return Worker(plan); });
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
    if (first < last)
      tbb::parallel_for(
          tbb::blocked_range<std::uint64_t>(first, last, GRAIN),
          [&](const tbb::blocked_range<std::uint64_t>& range) {
            Worker& w = workers.local();
            SeasonStreams streams(options.seed, range.begin());
            for (std::uint64_t s = range.begin(); s < range.end(); ++s) {
              runner.run(streams, w);
              streams.next();
            }
          },
          tbb::simple_partitioner());
    done = end;
    total.clear();
    for (const Worker& w : workers) total.merge(w.tally);
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
