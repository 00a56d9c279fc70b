// The generator's games: doubleheaders, scores from the hidden truth, the cut-off between
// played and remaining games, postponements; and the check of every schedule constraint.
#ifndef STANDFAST_TOOLS_BIN_LEAGUE_GAMES_H
#define STANDFAST_TOOLS_BIN_LEAGUE_GAMES_H

#include <fmt/core.h>

#include <algorithm>
#include <cmath>
#include <cstdint>
#include <map>
#include <tuple>
#include <vector>

#include "tools/bin/league_sampling.h"
#include "tools/bin/league_schedule.h"
#include "tools/bin/league_types.h"

namespace standfast::tools::gen {

// ---------------------------------------------------------------------------------------------
// Games and scores

// A side's regulation score with the hidden truth's shape.
inline int side_score(double mean, Rng& rng) { return weibull_score(mean, SHAPE, rng); }

// Runs of one extra half-inning for a side whose game mean is `mean`.
inline int extra_half_inning(double mean, bool runner_on_second, Rng& rng) {
  const double m = mean / 9.0 + (runner_on_second ? RUNNER_ON_SECOND_BONUS : 0.0);
  return half_inning_runs(m, RUNS_GIVEN_SCORING, rng);
}

inline void play(const League& lg, Game& g, Rng& rng) {
  const Club& h = lg.clubs[static_cast<std::size_t>(g.home)];
  const Club& a = lg.clubs[static_cast<std::size_t>(g.away)];
  const double mu_h = LEAGUE_MEAN * h.offence * a.defence * h.run_factor * HOME_EDGE;
  const double mu_a = LEAGUE_MEAN * a.offence * h.defence * h.run_factor;
  g.played = true;
  if (g.shortened) {
    // Called after 5 to 8 innings; a tied game would be suspended, so redraw until decided.
    g.innings = 5 + static_cast<int>(uniform_below(rng, 4));
    const double f = g.innings / 9.0;
    do {
      g.home_runs = side_score(mu_h * f, rng);
      g.away_runs = side_score(mu_a * f, rng);
    } while (g.home_runs == g.away_runs);
    return;
  }
  g.home_runs = side_score(mu_h, rng);
  g.away_runs = side_score(mu_a, rng);
  g.innings = 9;
  while (g.home_runs == g.away_runs) {
    ++g.innings;
    const int ra = extra_half_inning(mu_a, lg.runner_on_second, rng);
    int rh = extra_half_inning(mu_h, lg.runner_on_second, rng);
    if (rh > ra) rh = ra + 1;  // the home side stops once it leads
    g.away_runs += ra;
    g.home_runs += rh;
  }
}

// Back to not played (scores, innings and the shortened mark cleared).
inline void unplay(Game& g) {
  g.played = false;
  g.home_runs = g.away_runs = 0;
  g.innings = 9;
  g.shortened = false;
}

inline Outcome make_games(const League& lg, std::uint64_t seed, double played_fraction) {
  Outcome out;
  out.series = make_schedule(lg, seed, out.schedule_attempts);
  Rng ev = make_rng(seed, kEventStream);
  std::vector<Game>& games = out.games;
  for (const Series& s : out.series) {
    for (int k = 0; k < s.length; ++k) games.push_back(Game{s.start + k, s.home, s.away});
  }
  // Rain: the first game of a chosen day pair moves to the next day as game 1 of a
  // doubleheader (the clubs are together in the series on both days).
  {
    std::vector<int> pool;
    for (std::size_t s = 0; s < out.series.size(); ++s) {
      if (out.series[s].length >= 3) pool.push_back(static_cast<int>(s));
    }
    for (int s : pick(pool, lg.doubleheaders, ev)) {
      const Series& sr = out.series[static_cast<std::size_t>(s)];
      const int k = static_cast<int>(uniform_below(ev, static_cast<std::uint64_t>(sr.length - 1)));
      for (Game& g : games) {
        if (g.home != sr.home || g.away != sr.away) continue;
        if (g.day == sr.start + k) {
          g.day = sr.start + k + 1;
          g.number = 1;
        } else if (g.day == sr.start + k + 1) {
          g.number = 2;
        }
      }
    }
  }
  std::sort(games.begin(), games.end(), [](const Game& a, const Game& b) {
    if (a.day != b.day) return a.day < b.day;
    if (a.home != b.home) return a.home < b.home;
    return a.number < b.number;
  });
  // Every game is played out first, so that a later cut-off continues the same season: the
  // games before an earlier cut-off keep their scores (apart from the few postponed there).
  // Shortened games: SHORTENED_RATE of each half of the season, at least one in each half.
  {
    Rng sh = make_rng(seed, kShortenedStream);
    const std::size_t half = games.size() / 2;
    std::vector<int> first, second;
    for (std::size_t i = 0; i < games.size(); ++i) {
      (i < half ? first : second).push_back(static_cast<int>(i));
    }
    for (const std::vector<int>* pool : {&first, &second}) {
      const int k = std::max(1, static_cast<int>(std::lround(SHORTENED_RATE * pool->size())));
      for (int i : pick(*pool, k, sh)) games[static_cast<std::size_t>(i)].shortened = true;
    }
    Rng sc = make_rng(seed, kScoreStream);
    for (Game& g : games) play(lg, g, sc);
  }
  // Cut-off: the first day whose games are not yet played, so that the games before it come
  // closest to the wanted fraction.
  const double want = played_fraction * static_cast<double>(games.size());
  int best_day = 0;
  double best_diff = 1e18;
  const int last_day = games.back().day + 1;
  for (int d = 0; d <= last_day; ++d) {
    double before = 0;
    for (const Game& g : games) before += g.day < d ? 1 : 0;
    if (std::abs(before - want) < best_diff) {
      best_diff = std::abs(before - want);
      best_day = d;
    }
  }
  out.cutoff = best_day;
  out.full_season = games;
  for (Game& g : games) {
    if (g.day >= out.cutoff) unplay(g);
  }
  // Postponements: games of the last two weeks before the cut-off that were rained out and
  // have no new date yet (never part of a doubleheader).
  if (out.cutoff > 0 && out.cutoff <= games.back().day) {
    std::vector<int> pool;
    std::map<std::tuple<int, int, int>, int> per_day;
    for (const Game& g : games) ++per_day[{g.day, g.home, g.away}];
    for (std::size_t i = 0; i < games.size(); ++i) {
      const Game& g = games[i];
      if (g.day < out.cutoff && g.day >= out.cutoff - 14 && per_day[{g.day, g.home, g.away}] == 1) {
        pool.push_back(static_cast<int>(i));
      }
    }
    for (int i : pick(pool, lg.postponements, ev)) {
      Game& g = games[static_cast<std::size_t>(i)];
      unplay(g);
      g.day = -1;
      g.postponed = true;
    }
  }
  // Postponed games go last.
  std::stable_partition(games.begin(), games.end(), [](const Game& g) { return g.day >= 0; });
  return out;
}

// ---------------------------------------------------------------------------------------------
// Checks

inline void check(const League& lg, const Outcome& out) {
  const int n = lg.n();
  // Series: 2 to 4 games, none across the break, all within the season.
  for (const Series& s : out.series) {
    require(s.length >= 2 && s.length <= 4, fmt::format("series of {} games", s.length));
    require(s.start >= 0 && s.start + s.length <= lg.max_days, "series outside the season");
    for (int d = s.start; d < s.start + s.length; ++d) {
      require(!lg.in_break(d), "series during the break");
    }
  }
  std::vector<int> games(static_cast<std::size_t>(n), 0), home(static_cast<std::size_t>(n), 0);
  std::vector<int> pair(static_cast<std::size_t>(n * n), 0);
  std::map<std::pair<int, int>, std::vector<const Game*>> by_club_day;
  std::map<std::tuple<int, int, int, int>, int> keys;
  int played = 0;
  for (const Game& g : out.games) {
    require(g.home != g.away, "a club plays itself");
    ++games[static_cast<std::size_t>(g.home)];
    ++games[static_cast<std::size_t>(g.away)];
    ++home[static_cast<std::size_t>(g.home)];
    ++pair[static_cast<std::size_t>(g.home * n + g.away)];
    if (g.day >= 0) {
      require(++keys[{g.day, g.home, g.away, g.number}] == 1, "the same game listed twice");
      by_club_day[{g.home, g.day}].push_back(&g);
      by_club_day[{g.away, g.day}].push_back(&g);
      require(!lg.in_break(g.day), "a game during the break");
    } else {
      require(g.postponed && !g.played, "an undated game that is not postponed");
    }
    if (g.played) {
      ++played;
      require(g.day >= 0 && g.day < out.cutoff, "a played game after the cut-off");
      require(g.home_runs >= 0 && g.away_runs >= 0, "negative score");
      require(g.home_runs != g.away_runs, "tied final score");
      if (g.shortened) {
        require(g.innings >= 5 && g.innings <= 8, "shortened game innings");
      } else {
        require(g.innings >= 9, "a regulation game under 9 innings");
      }
    } else {
      require(g.day < 0 || g.day >= out.cutoff, "an unplayed game before the cut-off");
    }
  }
  for (int i = 0; i < n; ++i) {
    require(games[static_cast<std::size_t>(i)] == lg.games_per_team,
            fmt::format("{} plays {} games", lg.clubs[static_cast<std::size_t>(i)].id,
                        games[static_cast<std::size_t>(i)]));
    require(2 * home[static_cast<std::size_t>(i)] == lg.games_per_team,
            fmt::format("{} has {} home games", lg.clubs[static_cast<std::size_t>(i)].id,
                        home[static_cast<std::size_t>(i)]));
    for (int j = 0; j < n; ++j) {
      require(pair[static_cast<std::size_t>(i * n + j)] == lg.at(i, j), "pair counts differ");
    }
  }
  // Longest run of days in a row with games, per club (by_club_day is ordered by club, day).
  {
    int club = -1, prev = -10, run = 0;
    for (const auto& [key, list] : by_club_day) {
      run = (key.first == club && key.second == prev + 1) ? run + 1 : 1;
      club = key.first;
      prev = key.second;
      require(run <= MAX_STRAIGHT, fmt::format("{} plays {} days in a row",
                                               lg.clubs[static_cast<std::size_t>(club)].id, run));
    }
  }
  for (const auto& [key, list] : by_club_day) {
    if (list.size() == 1) continue;
    require(list.size() == 2, "more than two games on a day");
    const Game& a = *list[0];
    const Game& b = *list[1];
    require(a.home == b.home && a.away == b.away && a.number + b.number == 3,
            "two games on a day that are not a doubleheader");
  }
  require(played == 0 || played < static_cast<int>(out.games.size()) || out.cutoff > 0,
          "played count");
}

}  // namespace standfast::tools::gen

#endif  // STANDFAST_TOOLS_BIN_LEAGUE_GAMES_H
