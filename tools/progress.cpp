#include "tools/progress.h"

#include <fmt/core.h>
#include <unistd.h>

#include <algorithm>
#include <cmath>
#include <cstdio>

#include "tools/output.h"

namespace standfast::tools {
namespace {

constexpr int BAR_CELLS = 24;
constexpr double SHOW_AFTER_S = 1.0;
constexpr double REDRAW_EVERY_S = 0.1;

}  // namespace

std::string render_progress(std::uint64_t done, std::uint64_t total, double elapsed_s) {
  const double frac =
      total == 0 ? 1.0
                 : std::clamp(static_cast<double>(done) / static_cast<double>(total), 0.0, 1.0);
  const int filled = static_cast<int>(std::floor(frac * BAR_CELLS));
  std::string bar = std::string(static_cast<std::size_t>(filled), '#') +
                    std::string(static_cast<std::size_t>(BAR_CELLS - filled), '-');
  std::string text = fmt::format("simulating [{}] {:3.0f}%  {} of {} seasons", bar,
                                 std::floor(100.0 * frac), group_digits(done), group_digits(total));
  if (done > 0 && done < total && elapsed_s > 0) {
    const double left = elapsed_s * static_cast<double>(total - done) / static_cast<double>(done);
    text += fmt::format(", about {:.0f} s left", std::ceil(left));
  }
  return text;
}

ProgressBar::ProgressBar() : ProgressBar(::isatty(STDERR_FILENO) == 1) {}

ProgressBar::ProgressBar(bool enabled)
    : enabled_(enabled), start_(Clock::now()), last_draw_(start_) {}

ProgressBar::~ProgressBar() { finish(); }

void ProgressBar::update(std::uint64_t done, std::uint64_t total) {
  if (!enabled_) return;
  const auto now = Clock::now();
  const double elapsed = std::chrono::duration<double>(now - start_).count();
  if (elapsed < SHOW_AFTER_S) return;
  if (drawn_ && std::chrono::duration<double>(now - last_draw_).count() < REDRAW_EVERY_S &&
      done < total) {
    return;
  }
  const std::string text = render_progress(done, total, elapsed);
  const std::size_t pad = width_ > text.size() ? width_ - text.size() : 0;
  std::fprintf(stderr, "\r%s%s", text.c_str(), std::string(pad, ' ').c_str());
  std::fflush(stderr);
  width_ = std::max(width_, text.size());
  drawn_ = true;
  last_draw_ = now;
}

void ProgressBar::finish() {
  if (!drawn_) return;
  std::fprintf(stderr, "\r%s\r", std::string(width_, ' ').c_str());
  std::fflush(stderr);
  drawn_ = false;
  width_ = 0;
}

}  // namespace standfast::tools
