#include "config/season.h"

#include <chrono>
#include <cstdio>

namespace standfast::config {

int Season::team_index(std::string_view id) const {
  for (std::size_t i = 0; i < teams.size(); ++i) {
    if (teams[i].id == id) return static_cast<int>(i);
  }
  return -1;
}

std::string format_date(DayNumber day) {
  const std::chrono::year_month_day ymd{std::chrono::sys_days{std::chrono::days{day}}};
  char buf[16];
  std::snprintf(buf, sizeof buf, "%04d-%02u-%02u", static_cast<int>(ymd.year()),
                static_cast<unsigned>(ymd.month()), static_cast<unsigned>(ymd.day()));
  return buf;
}

std::optional<DayNumber> parse_date(std::string_view text) {
  // Exactly YYYY-MM-DD, digits only, and a real calendar day.
  if (text.size() != 10 || text[4] != '-' || text[7] != '-') return std::nullopt;
  int parts[3] = {0, 0, 0};
  const int starts[3] = {0, 5, 8};
  const int lengths[3] = {4, 2, 2};
  for (int p = 0; p < 3; ++p) {
    for (int i = 0; i < lengths[p]; ++i) {
      const char c = text[static_cast<std::size_t>(starts[p] + i)];
      if (c < '0' || c > '9') return std::nullopt;
      parts[p] = parts[p] * 10 + (c - '0');
    }
  }
  const std::chrono::year_month_day ymd{std::chrono::year{parts[0]},
                                        std::chrono::month{static_cast<unsigned>(parts[1])},
                                        std::chrono::day{static_cast<unsigned>(parts[2])}};
  if (!ymd.ok()) return std::nullopt;
  return static_cast<DayNumber>(std::chrono::sys_days{ymd}.time_since_epoch().count());
}

}  // namespace standfast::config
