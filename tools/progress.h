// A progress bar on standard error for long runs. It draws nothing unless standard error is a
// terminal and the run has lasted more than a second, redraws at most ten times a second, and
// clears its line when the run ends (or the bar is destroyed), so piped or redirected output
// never contains it. Not thread-safe: call update() from one thread (engine::RunOptions::progress
// is called on the caller's thread between batches).
#ifndef STANDFAST_TOOLS_PROGRESS_H
#define STANDFAST_TOOLS_PROGRESS_H

#include <chrono>
#include <cstdint>
#include <string>

namespace standfast::tools {

// The text of the bar (without carriage return), e.g.
//   "simulating [##########----------]  50%  500,000 of 1,000,000 seasons, about 3 s left"
// `elapsed_s` is the time since the start; the time left is extrapolated from it.
std::string render_progress(std::uint64_t done, std::uint64_t total, double elapsed_s);

class ProgressBar {
 public:
  // enabled = false draws nothing ever; the default asks isatty(2).
  ProgressBar();
  explicit ProgressBar(bool enabled);
  ~ProgressBar();
  ProgressBar(const ProgressBar&) = delete;
  ProgressBar& operator=(const ProgressBar&) = delete;

  void update(std::uint64_t done, std::uint64_t total);
  // Clears the bar's line if anything was drawn.
  void finish();

 private:
  using Clock = std::chrono::steady_clock;
  bool enabled_;
  bool drawn_ = false;
  std::size_t width_ = 0;  // length of the last line drawn
  Clock::time_point start_;
  Clock::time_point last_draw_;
};

}  // namespace standfast::tools

#endif  // STANDFAST_TOOLS_PROGRESS_H
