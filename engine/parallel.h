// Parallel loops over seasons with one scratch Worker per thread: oneTBB in every normal build,
// and plain std::thread when STANDFAST_STD_THREADS is defined (the ThreadSanitizer build,
// tools/ci/sanitizers.sh). The prebuilt oneTBB library carries no TSan instrumentation, so the
// ordering its scheduler provides is invisible to TSan and every parallel loop would be reported;
// with std::thread (create, atomic chunk counter, join) TSan sees every edge, and a report is
// about our own code. Results do not depend on the backend: every season's random streams are
// keyed by its index and the tallies are integer sums.
#ifndef STANDFAST_ENGINE_PARALLEL_H
#define STANDFAST_ENGINE_PARALLEL_H

#include <cstdint>
#include <functional>
#include <optional>
#include <utility>

#ifdef STANDFAST_STD_THREADS
#include <algorithm>
#include <atomic>
#include <deque>
#include <mutex>
#include <thread>
#include <vector>
#else
#include <tbb/blocked_range.h>
#include <tbb/enumerable_thread_specific.h>
#include <tbb/global_control.h>
#include <tbb/parallel_for.h>
#endif

namespace standfast::engine {

// Workers created on first use by each thread, kept across loops, visited at the end.
template <class Worker>
class PerThread {
 public:
  // `threads`: the most threads the loops use (0 = all cores), for the object's lifetime.
  PerThread(std::function<Worker()> make, int threads)
#ifdef STANDFAST_STD_THREADS
      : make_(std::move(make)),
        threads_(threads > 0
                     ? threads
                     : static_cast<int>(std::max(1u, std::thread::hardware_concurrency()))){}
#else
      : workers_(std::move(make)) {
    if (threads > 0)
      control_.emplace(tbb::global_control::max_allowed_parallelism,
                       static_cast<std::size_t>(threads));
  }
#endif

        // Runs chunk(first, last, worker) over [begin, end) in chunks of exactly `grain` seasons
        // (the last may be shorter).
        template <class Chunk>
        void for_each_chunk(std::uint64_t begin, std::uint64_t end, std::uint64_t grain,
                            Chunk && chunk) {
    if (begin >= end) return;
#ifdef STANDFAST_STD_THREADS
    const int n = threads_;
    std::atomic<std::uint64_t> next{begin};
    auto work = [&] {
      Worker& w = claim();
      for (;;) {
        const std::uint64_t first = next.fetch_add(grain);
        if (first >= end) break;
        chunk(first, std::min(end, first + grain), w);
      }
      release(w);
    };
    std::vector<std::thread> pool;
    for (int t = 1; t < n; ++t) pool.emplace_back(work);
    work();
    for (auto& t : pool) t.join();
#else
    tbb::parallel_for(
        tbb::blocked_range<std::uint64_t>(begin, end, grain),
        [&](const tbb::blocked_range<std::uint64_t>& r) {
          chunk(r.begin(), r.end(), workers_.local());
        },
        tbb::simple_partitioner());
#endif
  }

  // Visits every worker created so far (after the loops; not concurrently with them).
  template <class Visit>
  void for_each_worker(Visit&& visit) const {
#ifdef STANDFAST_STD_THREADS
    for (const Worker& w : all_) visit(w);
#else
    for (const Worker& w : workers_) visit(w);
#endif
  }

 private:
#ifdef STANDFAST_STD_THREADS
  // A free worker, or a new one; a thread holds it for one loop.
  Worker& claim() {
    std::lock_guard<std::mutex> lock(mutex_);
    for (std::size_t i = 0; i < all_.size(); ++i) {
      if (!busy_[i]) {
        busy_[i] = true;
        return all_[i];
      }
    }
    all_.push_back(make_());
    busy_.push_back(true);
    return all_.back();
  }
  void release(Worker& w) {
    std::lock_guard<std::mutex> lock(mutex_);
    for (std::size_t i = 0; i < all_.size(); ++i) {
      if (&all_[i] == &w) busy_[i] = false;
    }
  }
  std::function<Worker()> make_;
  int threads_;
  std::deque<Worker> all_;  // stable addresses
  std::deque<bool> busy_;
  std::mutex mutex_;
#else
  std::optional<tbb::global_control> control_;
  tbb::enumerable_thread_specific<Worker> workers_;
#endif
};

}  // namespace standfast::engine

#endif  // STANDFAST_ENGINE_PARALLEL_H
