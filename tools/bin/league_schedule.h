// The generator's schedule: series of 2 to 4 games per pair of clubs, laid on dates by a
// randomised greedy day-by-day pass with retries.
#ifndef STANDFAST_TOOLS_BIN_LEAGUE_SCHEDULE_H
#define STANDFAST_TOOLS_BIN_LEAGUE_SCHEDULE_H

#include <algorithm>
#include <cstdint>
#include <utility>
#include <vector>

#include "tools/bin/league_sampling.h"
#include "tools/bin/league_types.h"

namespace standfast::tools::gen {

// Weights of the greedy's preferences (tuned by eye on the figures make_league prints).
constexpr double BALANCE_WEIGHT = 0.004;  // per squared game of home-minus-road so far
constexpr int STAND_SERIES = 2;           // series per homestand or road trip aimed at
constexpr double STAND_WEIGHT = 0.15;     // pull toward that

// ---------------------------------------------------------------------------------------------
// Schedule

// A random split of n >= 2 games into series of 2 to 4 (threes preferred).
inline std::vector<int> split_into_series(int n, Rng& rng) {
  std::vector<int> parts;
  while (n > 0) {
    if (n <= 4 && uniform01(rng) < 0.6) {
      parts.push_back(n);
      break;
    }
    std::vector<int> options;
    for (int p : {2, 3, 4}) {
      const int rest = n - p;
      if (rest == 0 || rest >= 2) options.push_back(p);
    }
    // Weights: 3 -> 3, 2 -> 1, 4 -> 1.
    int total = 0;
    for (int p : options) total += p == 3 ? 3 : 1;
    int r = static_cast<int>(uniform_below(rng, static_cast<std::uint64_t>(total)));
    int pick = options.front();
    for (int p : options) {
      r -= p == 3 ? 3 : 1;
      if (r < 0) {
        pick = p;
        break;
      }
    }
    parts.push_back(pick);
    n -= pick;
  }
  return parts;
}

inline std::vector<Series> make_series(const League& lg, Rng& rng) {
  std::vector<Series> out;
  for (int i = 0; i < lg.n(); ++i) {
    for (int j = 0; j < lg.n(); ++j) {
      if (i == j || lg.at(i, j) == 0) continue;
      for (int len : split_into_series(lg.at(i, j), rng)) out.push_back(Series{i, j, len, -1});
    }
  }
  return out;
}

// Lays the series on days. Returns false when some series found no room.
inline bool place_series(const League& lg, std::vector<Series>& series, Rng& rng) {
  const int n = lg.n();
  std::vector<int> busy(static_cast<std::size_t>(n), 0), remaining(static_cast<std::size_t>(n), 0);
  std::vector<std::vector<int>> by_club(static_cast<std::size_t>(n));
  std::vector<int> last_met(static_cast<std::size_t>(n * n), -1000);
  std::vector<int> home_minus_road(static_cast<std::size_t>(n), 0);
  // Homestands and road trips: the side (+1 home, -1 road) of each club's last series and how
  // many series in a row it has played on that side.
  std::vector<int> side(static_cast<std::size_t>(n), 0), side_run(static_cast<std::size_t>(n), 0);
  auto stand_score = [&](int club, int s) {
    const int last = side[static_cast<std::size_t>(club)];
    const int run = side_run[static_cast<std::size_t>(club)];
    if (last == 0) return 0.0;
    if (s == last) return run < STAND_SERIES ? STAND_WEIGHT : -STAND_WEIGHT * (run - 1);
    return run < STAND_SERIES ? -STAND_WEIGHT : STAND_WEIGHT;
  };
  std::vector<int> last_off(static_cast<std::size_t>(n), -1);  // last day without a game
  for (std::size_t s = 0; s < series.size(); ++s) {
    series[s].start = -1;
    remaining[static_cast<std::size_t>(series[s].home)] += series[s].length;
    remaining[static_cast<std::size_t>(series[s].away)] += series[s].length;
    by_club[static_cast<std::size_t>(series[s].home)].push_back(static_cast<int>(s));
    by_club[static_cast<std::size_t>(series[s].away)].push_back(static_cast<int>(s));
  }
  // Days still available for games from day d up to the target end (at least 1).
  auto days_left = [&](int d) {
    int k = 0;
    for (int x = d; x < lg.target_days; ++x) k += lg.in_break(x) ? 0 : 1;
    return std::max(k, 1);
  };
  auto fits = [&](int d, int len) {
    if (d + len > lg.max_days) return false;
    for (int x = d; x < d + len; ++x) {
      if (lg.in_break(x)) return false;
    }
    return true;
  };
  const int min_gap = lg.small ? 3 : 12;  // days before the same clubs meet again, if possible
  for (int d = 0; d < lg.max_days; ++d) {
    if (lg.in_break(d)) {
      std::fill(last_off.begin(), last_off.end(), d);
      continue;
    }
    const double left = days_left(d);
    std::vector<std::pair<double, int>> order;
    for (int t = 0; t < n; ++t) {
      if (busy[static_cast<std::size_t>(t)] <= d && remaining[static_cast<std::size_t>(t)] > 0) {
        order.emplace_back(remaining[static_cast<std::size_t>(t)] / left + 0.05 * uniform01(rng),
                           t);
      }
    }
    std::sort(order.begin(), order.end(), [](const auto& a, const auto& b) {
      return a.first != b.first ? a.first > b.first : a.second < b.second;
    });
    for (const auto& [need, t] : order) {
      if (busy[static_cast<std::size_t>(t)] > d) continue;
      // Rest when well ahead of the pace the target end asks for.
      if (need < 0.80 && uniform01(rng) < 0.5) continue;
      int best = -1;
      double best_score = -1e9;
      for (int s : by_club[static_cast<std::size_t>(t)]) {
        const Series& sr = series[static_cast<std::size_t>(s)];
        if (sr.start >= 0) continue;
        const int u = sr.home == t ? sr.away : sr.home;
        if (busy[static_cast<std::size_t>(u)] > d || !fits(d, sr.length)) continue;
        // At most MAX_STRAIGHT days in a row with games.
        const int last = d + sr.length - 1;
        if (last - std::min(last_off[static_cast<std::size_t>(t)],
                            last_off[static_cast<std::size_t>(u)]) >
            MAX_STRAIGHT) {
          continue;
        }
        double score = remaining[static_cast<std::size_t>(u)] / left + 0.3 * uniform01(rng);
        if (d - last_met[static_cast<std::size_t>(t * n + u)] < min_gap) score -= 2.0;
        // Keep home and road games close to even through the season.
        const int hs = home_minus_road[static_cast<std::size_t>(sr.home)] + sr.length;
        const int as = home_minus_road[static_cast<std::size_t>(sr.away)] - sr.length;
        score -= BALANCE_WEIGHT * (hs * hs + as * as);
        score += stand_score(sr.home, +1) + stand_score(sr.away, -1);
        if (score > best_score) {
          best_score = score;
          best = s;
        }
      }
      if (best < 0) continue;
      // Rather rest than meet the same club again so soon, unless behind the pace.
      if (best_score < -0.5 && need < 1.0) continue;
      Series& sr = series[static_cast<std::size_t>(best)];
      sr.start = d;
      for (const auto& [club, s] : {std::pair{sr.home, +1}, std::pair{sr.away, -1}}) {
        int& last = side[static_cast<std::size_t>(club)];
        int& run = side_run[static_cast<std::size_t>(club)];
        run = last == s ? run + 1 : 1;
        last = s;
      }
      home_minus_road[static_cast<std::size_t>(sr.home)] += sr.length;
      home_minus_road[static_cast<std::size_t>(sr.away)] -= sr.length;
      for (int c : {sr.home, sr.away}) {
        busy[static_cast<std::size_t>(c)] = d + sr.length;
        remaining[static_cast<std::size_t>(c)] -= sr.length;
      }
      last_met[static_cast<std::size_t>(sr.home * n + sr.away)] = d + sr.length;
      last_met[static_cast<std::size_t>(sr.away * n + sr.home)] = d + sr.length;
    }
    for (int t = 0; t < n; ++t) {
      if (busy[static_cast<std::size_t>(t)] <= d) last_off[static_cast<std::size_t>(t)] = d;
    }
  }
  for (const Series& s : series) {
    if (s.start < 0) return false;
  }
  return true;
}

inline int season_days(const std::vector<Series>& series) {
  int end = 0;
  for (const Series& s : series) end = std::max(end, s.start + s.length);
  return end;
}

// Tries schedules until one places every series and ends within [min_days, max_days].
inline std::vector<Series> make_schedule(const League& lg, std::uint64_t seed, int& attempts) {
  for (int attempt = 0; attempt < 2000; ++attempt) {
    Rng rng = make_rng(seed, kScheduleStream + attempt);
    std::vector<Series> series = make_series(lg, rng);
    if (!place_series(lg, series, rng)) continue;
    const int days = season_days(series);
    if (days < lg.min_days || days > lg.max_days) continue;
    attempts = attempt + 1;
    std::sort(series.begin(), series.end(), [](const Series& a, const Series& b) {
      if (a.start != b.start) return a.start < b.start;
      return a.home < b.home;
    });
    return series;
  }
  throw ConstraintError("no schedule found in 2000 attempts");
}

}  // namespace standfast::tools::gen

#endif  // STANDFAST_TOOLS_BIN_LEAGUE_SCHEDULE_H
