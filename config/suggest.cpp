#include "config/suggest.h"

#include <algorithm>
#include <numeric>

namespace standfast::config {

int edit_distance(std::string_view a, std::string_view b) {
  // Wagner-Fischer with one row.
  std::vector<int> row(b.size() + 1);
  std::iota(row.begin(), row.end(), 0);
  for (std::size_t i = 1; i <= a.size(); ++i) {
    int diagonal = row[0];
    row[0] = static_cast<int>(i);
    for (std::size_t j = 1; j <= b.size(); ++j) {
      const int above = row[j];
      const int cost = a[i - 1] == b[j - 1] ? 0 : 1;
      row[j] = std::min({row[j] + 1, row[j - 1] + 1, diagonal + cost});
      diagonal = above;
    }
  }
  return row[b.size()];
}

int transposition_distance(std::string_view a, std::string_view b) {
  // Optimal string alignment: Wagner-Fischer with a third row for the transposition step.
  const std::size_t n = b.size();
  std::vector<int> before(n + 1), previous(n + 1), row(n + 1);
  std::iota(previous.begin(), previous.end(), 0);
  for (std::size_t i = 1; i <= a.size(); ++i) {
    row[0] = static_cast<int>(i);
    for (std::size_t j = 1; j <= n; ++j) {
      const int cost = a[i - 1] == b[j - 1] ? 0 : 1;
      row[j] = std::min({previous[j] + 1, row[j - 1] + 1, previous[j - 1] + cost});
      if (i > 1 && j > 1 && a[i - 1] == b[j - 2] && a[i - 2] == b[j - 1]) {
        row[j] = std::min(row[j], before[j - 2] + 1);
      }
    }
    std::swap(before, previous);
    std::swap(previous, row);
  }
  return previous[n];
}

namespace {

std::string lower(std::string_view s) {
  std::string out(s);
  for (char& c : out) {
    if (c >= 'A' && c <= 'Z') c = static_cast<char>(c + 32);
  }
  return out;
}

}  // namespace

std::optional<std::string> closest_match(std::string_view word,
                                         const std::vector<std::string>& candidates) {
  if (word.size() > 64) return std::nullopt;  // junk, not a typo
  const std::string w = lower(word);
  const int limit = std::max(1, std::min(3, static_cast<int>(w.size()) / 3));
  int best = limit + 1;
  const std::string* found = nullptr;
  for (const auto& c : candidates) {
    if (c.size() > 64) continue;
    const int d = transposition_distance(w, lower(c));
    if (d < best) {
      best = d;
      found = &c;
    }
  }
  if (found == nullptr) return std::nullopt;
  return *found;
}

std::string did_you_mean(std::string_view word, const std::vector<std::string>& candidates) {
  const auto m = closest_match(word, candidates);
  return m ? " (did you mean '" + *m + "'?)" : std::string();
}

}  // namespace standfast::config
