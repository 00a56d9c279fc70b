#include "engine/tiebreak.h"

#include <algorithm>
#include <cstdint>
#include <stdexcept>
#include <string>
#include <utility>

namespace standfast::engine {

int compare_pct(std::int64_t w1, std::int64_t l1, std::int64_t w2, std::int64_t l2) {
  if (w1 + l1 == 0) w1 = l1 = 1;
  if (w2 + l2 == 0) w2 = l2 = 1;
  const std::int64_t lhs = w1 * (w2 + l2);
  const std::int64_t rhs = w2 * (w1 + l1);
  return (lhs > rhs) - (lhs < rhs);
}

PctKeyTable::PctKeyTable(int max_games) {
  const int top = std::min(max_games, (1 << 16) - 1);
  if (top < 2) return;
  recip_.assign(static_cast<std::size_t>(top) + 1, 0);
  for (int g = 2; g <= top; ++g) {
    recip_[static_cast<std::size_t>(g)] = UINT64_MAX / static_cast<std::uint64_t>(g) + 1;
  }
}

TiebreakScratch::TiebreakScratch(int team_count) {
  if (team_count >= (1 << 20)) {
    throw std::invalid_argument("TiebreakScratch: " + std::to_string(team_count) +
                                " teams; at most 1048575");
  }
  const auto n = static_cast<std::size_t>(team_count < 0 ? 0 : team_count);
  num_.assign(n, 0);
  den_.assign(n, 1);
  key_.assign(n, 0);
  comp_.assign(n + 8, 0);
  team_.assign(n, 0);
}

Tiebreaker::Tiebreaker(const config::Tiebreakers& tiebreakers)
    : extra_game_(tiebreakers.extra_game) {
  const auto windows = last_games_windows(tiebreakers);
  for (const auto& rule : tiebreakers.order) {
    rules_.push_back(rule);
    int w = -1;
    if (rule.kind == config::TiebreakKind::kLastGames) {
      for (std::size_t k = 0; k < windows.size(); ++k) {
        if (windows[k] == LastGamesWindow{rule.games, rule.scope}) w = static_cast<int>(k);
      }
    }
    window_.push_back(w);
    if (rule.kind == config::TiebreakKind::kDraw) break;  // nothing after a draw can apply
  }
}

Tiebreaker::Tiebreaker(const config::Season& season) : Tiebreaker(season.tiebreakers) {}

namespace {

// a/b > c/d for positive denominators.
inline bool greater(std::int64_t a, std::int64_t b, std::int64_t c, std::int64_t d) {
  return a * d > c * b;
}
inline bool equal(std::int64_t a, std::int64_t b, std::int64_t c, std::int64_t d) {
  return a * d == c * b;
}

// A winning percentage as a fraction; no games = 1/2.
inline void set_pct(std::int64_t& num, std::int64_t& den, std::int64_t w, std::int64_t l) {
  if (w + l == 0) {
    num = 1;
    den = 2;
  } else {
    num = w;
    den = w + l;
  }
}

void check_size(std::size_t k, const std::vector<std::int64_t>& tmp) {
  if (k > tmp.size()) [[unlikely]] {
    throw std::invalid_argument("Tiebreaker: " + std::to_string(k) +
                                " teams given, scratch sized for " + std::to_string(tmp.size()));
  }
}

}  // namespace

bool Tiebreaker::evaluate(std::size_t r, const int* teams, int k, const SeasonRecord& record,
                          std::int64_t* num, std::int64_t* den) const {
  const auto& rule = rules_[r];
  switch (rule.kind) {
    case config::TiebreakKind::kHeadToHead:
      for (int p = 0; p < k; ++p) {
        std::int64_t w = 0, l = 0;
        for (int q = 0; q < k; ++q) {
          w += record.h2h_wins(teams[p], teams[q]);
          l += record.h2h_wins(teams[q], teams[p]);
        }
        set_pct(num[p], den[p], w, l);
      }
      break;
    case config::TiebreakKind::kDivisionRecord:
      for (int p = 0; p < k; ++p) {
        set_pct(num[p], den[p], record.division_wins(teams[p]), record.division_losses(teams[p]));
      }
      break;
    case config::TiebreakKind::kConferenceRecord:
      for (int p = 0; p < k; ++p) {
        set_pct(num[p], den[p], record.conference_wins(teams[p]),
                record.conference_losses(teams[p]));
      }
      break;
    case config::TiebreakKind::kRunDifferential:
      for (int p = 0; p < k; ++p) {
        num[p] = record.run_differential(teams[p]);
        den[p] = 1;
      }
      break;
    case config::TiebreakKind::kLastGames: {
      const int w = window_[r];
      if (w < 0 || w >= record.window_count()) return false;
      for (int p = 0; p < k; ++p) {
        set_pct(num[p], den[p], record.last_wins(w, teams[p]), record.last_losses(w, teams[p]));
      }
      break;
    }
    case config::TiebreakKind::kDraw:
      return false;
  }
  for (int p = 1; p < k; ++p) {
    if (!equal(num[p], den[p], num[0], den[0])) return true;
  }
  return false;
}

void Tiebreaker::resolve(int* teams, int k, std::size_t first, const SeasonRecord& record, Rng& rng,
                         std::int64_t* num, std::int64_t* den) const {
  if (k <= 1) return;
  for (std::size_t r = first; r < rules_.size(); ++r) {
    if (rules_[r].kind == config::TiebreakKind::kDraw) break;
    if (!evaluate(r, teams, k, record, num, den)) continue;
    // Stable insertion sort, best value first.
    for (int i = 1; i < k; ++i) {
      const int t = teams[i];
      const std::int64_t a = num[i], b = den[i];
      int j = i;
      for (; j > 0 && greater(a, b, num[j - 1], den[j - 1]); --j) {
        teams[j] = teams[j - 1];
        num[j] = num[j - 1];
        den[j] = den[j - 1];
      }
      teams[j] = t;
      num[j] = a;
      den[j] = b;
    }
    // Restart the whole procedure on every group still tied. A group covers positions [i, j)
    // of this call's scratch, which this call no longer reads once it has moved past them.
    for (int i = 0; i < k;) {
      int j = i + 1;
      while (j < k && equal(num[j], den[j], num[i], den[i])) ++j;
      if (j - i >= 2) resolve(teams + i, j - i, 0, record, rng, num + i, den + i);
      i = j;
    }
    return;
  }
  // Random draw: a uniform permutation (Fisher-Yates).
  for (int i = k - 1; i > 0; --i) {
    const auto j = static_cast<int>(uniform_below(rng, static_cast<std::uint64_t>(i) + 1));
    std::swap(teams[i], teams[j]);
  }
}

void Tiebreaker::order_tied(std::span<int> teams, const SeasonRecord& record, Rng& rng,
                            TiebreakScratch& scratch) const {
  check_size(teams.size(), scratch.key_);
  resolve(teams.data(), static_cast<int>(teams.size()), 0, record, rng, scratch.num_.data(),
          scratch.den_.data());
}

void Tiebreaker::break_runs(std::span<int> teams, const SeasonRecord& record, Rng& rng,
                            TiebreakScratch& scratch) const {
  check_size(teams.size(), scratch.key_);
  const int k = static_cast<int>(teams.size());
  int* t = teams.data();
  for (int i = 0; i < k;) {
    const int wi = record.wins(t[i]), li = record.losses(t[i]);
    int j = i + 1;
    while (j < k && compare_pct(record.wins(t[j]), record.losses(t[j]), wi, li) == 0) ++j;
    if (j - i >= 2) {
      resolve(t + i, j - i, 0, record, rng, scratch.num_.data() + i, scratch.den_.data() + i);
    }
    i = j;
  }
}

void Tiebreaker::sort_and_break(int* t, int k, const SeasonRecord& record, Rng& rng,
                                TiebreakScratch& scratch) const {
  std::int64_t* key = scratch.key_.data();
  if (k <= 12) {
    // Stable insertion sort, best key first.
    for (int i = 1; i < k; ++i) {
      const int team = t[i];
      const std::int64_t kv = key[i];
      int j = i;
      for (; j > 0 && kv > key[j - 1]; --j) {
        t[j] = t[j - 1];
        key[j] = key[j - 1];
      }
      t[j] = team;
      key[j] = kv;
    }
  } else {
    // Stable sort by counting: the place of position p is the number of positions whose
    // (key, earlier position first) comes before it. Branch-free; keys are below 2^33 and
    // positions below 2^20 (check_size), so the composite fits in 64 bits.
    std::int64_t* comp = scratch.comp_.data();
    std::int64_t* placed_key = scratch.num_.data();  // free until the runs are resolved
    int* placed = scratch.team_.data();
    for (int p = 0; p < k; ++p) comp[p] = (key[p] << 20) | (0xFFFFF - p);
    // Padding up to a multiple of 8 with values below every composite lets the inner loop run
    // in fixed blocks of 8 (which the compiler vectorises).
    const int k8 = (k + 7) & ~7;
    for (int p = k; p < k8; ++p) comp[p] = -1;
    for (int p = 0; p < k; ++p) {
      const std::int64_t c = comp[p];
      int place = 0;
      for (int q = 0; q < k8; q += 8) {
        int block = 0;
        for (int u = 0; u < 8; ++u) block += comp[q + u] > c;
        place += block;
      }
      placed[place] = t[p];
      placed_key[place] = key[p];
    }
    for (int p = 0; p < k; ++p) {
      t[p] = placed[p];
      key[p] = placed_key[p];
    }
  }
  for (int i = 0; i < k;) {
    int j = i + 1;
    while (j < k && key[j] == key[i]) ++j;
    if (j - i >= 2) {
      resolve(t + i, j - i, 0, record, rng, scratch.num_.data() + i, scratch.den_.data() + i);
    }
    i = j;
  }
}

void Tiebreaker::rank(std::span<int> teams, const SeasonRecord& record, Rng& rng,
                      TiebreakScratch& scratch) const {
  check_size(teams.size(), scratch.key_);
  const int k = static_cast<int>(teams.size());
  for (int p = 0; p < k; ++p) {
    scratch.key_[p] = pct_key(record.wins(teams[p]), record.losses(teams[p]));
  }
  sort_and_break(teams.data(), k, record, rng, scratch);
}

void Tiebreaker::break_runs(std::span<int> teams, std::span<const std::int64_t> key,
                            const SeasonRecord& record, Rng& rng, TiebreakScratch& scratch) const {
  check_size(teams.size(), scratch.key_);
  const int k = static_cast<int>(teams.size());
  int* t = teams.data();
  for (int i = 0; i < k;) {
    const std::int64_t ki = key[t[i]];
    int j = i + 1;
    while (j < k && key[t[j]] == ki) ++j;
    if (j - i >= 2) {
      resolve(t + i, j - i, 0, record, rng, scratch.num_.data() + i, scratch.den_.data() + i);
    }
    i = j;
  }
}

void Tiebreaker::rank(std::span<int> teams, std::span<const std::int64_t> key,
                      const SeasonRecord& record, Rng& rng, TiebreakScratch& scratch) const {
  check_size(teams.size(), scratch.key_);
  const int k = static_cast<int>(teams.size());
  for (int p = 0; p < k; ++p) scratch.key_[p] = key[teams[p]];
  sort_and_break(teams.data(), k, record, rng, scratch);
}

}  // namespace standfast::engine
