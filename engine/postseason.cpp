#include "engine/postseason.h"

#include <algorithm>
#include <stdexcept>

namespace standfast::engine {

std::vector<int> standard_bracket_order(int size) {
  if (size < 1 || (size & (size - 1)) != 0)
    throw std::invalid_argument("standard_bracket_order: size must be a power of two, got " +
                                std::to_string(size));
  std::vector<int> order{1};
  while (static_cast<int>(order.size()) < size) {
    const int m = static_cast<int>(order.size()) * 2;
    std::vector<int> next;
    next.reserve(static_cast<std::size_t>(m));
    for (int s : order) {
      next.push_back(s);
      next.push_back(m + 1 - s);
    }
    order.swap(next);
  }
  return order;
}

int play_series(int best_of, std::uint32_t higher_hosts, int higher, int lower, ExtraGame game,
                int* games_played) {
  const int need = best_of / 2 + 1;
  int wins_higher = 0, wins_lower = 0, g = 0;
  while (wins_higher < need && wins_lower < need) {
    const bool higher_home = g < 32 ? ((higher_hosts >> g) & 1u) != 0 : (g % 2 == 0);
    const int winner = higher_home ? game.play(game.context, higher, lower)
                                   : game.play(game.context, lower, higher);
    if (winner == higher)
      ++wins_higher;
    else
      ++wins_lower;
    ++g;
  }
  if (games_played) *games_played = g;
  return wins_higher == need ? higher : lower;
}

int play_bracket(const PlanBracket& bracket, std::span<const PlanRound> rounds, bool reseed,
                 std::span<const int> seeded, ExtraGame game, std::span<int> reached,
                 BracketScratch& scratch) {
  auto& cur = scratch.current;
  auto& next = scratch.next;
  const int q = static_cast<int>(seeded.size());
  cur.clear();
  for (int s : bracket.order) cur.push_back(s <= q ? s : 0);
  for (int k = 0; k < bracket.rounds; ++k) {
    const int r = bracket.first_round + k;
    if (k > 0 && reseed) {
      // Survivors by seed, then best against worst: positions (0, m-1), (1, m-2), ...
      next.clear();
      for (int s : cur)
        if (s) next.push_back(s);
      std::sort(next.begin(), next.end());
      const std::size_t m = next.size();
      cur.clear();
      for (std::size_t i = 0; i < m / 2; ++i) {
        cur.push_back(next[i]);
        cur.push_back(next[m - 1 - i]);
      }
      if (m % 2) cur.push_back(next[m / 2]), cur.push_back(0);
    }
    for (int s : cur)
      if (s) reached[static_cast<std::size_t>(seeded[s - 1])] = r;
    next.clear();
    for (std::size_t i = 0; i + 1 < cur.size(); i += 2) {
      const int a = cur[i], b = cur[i + 1];
      if (!a || !b) {
        next.push_back(a ? a : b);
        continue;
      }
      const int hi = std::min(a, b), lo = std::max(a, b);
      const PlanRound& round = rounds[static_cast<std::size_t>(r)];
      const int w =
          play_series(round.best_of, round.higher_hosts, seeded[hi - 1], seeded[lo - 1], game);
      next.push_back(w == seeded[hi - 1] ? hi : lo);
    }
    cur.swap(next);
  }
  for (int s : cur)
    if (s) return seeded[s - 1];
  return -1;
}

}  // namespace standfast::engine
