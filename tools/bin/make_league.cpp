// make_league: writes an invented league (season file, game list and the hidden true strengths)
// for demos and tests. Everything it writes is invented: clubs, places, venues and scores.
//
//   make_league --shape demo --seed 2031 --out scenarios/demo
//   make_league --shape small --seed 2031 --out scenarios/small
//
// The schedule is built from a table of games per pair of clubs (more inside the division),
// split into home and road series of 2 to 4 games, and laid on dates by a randomised greedy
// day-by-day pass with retries. The played part is simulated from true team strengths with
// the discretised Weibull scoring model (location -0.5). Every constraint is checked before
// anything is written; a violation exits with status 1.
#include <fmt/core.h>
#include <fmt/os.h>

#include <CLI/CLI.hpp>
#include <algorithm>
#include <cmath>
#include <cstdint>
#include <filesystem>
#include <map>
#include <optional>
#include <stdexcept>
#include <string>
#include <vector>

#include "config/season.h"
#include "tools/bin/league_names.h"
#include "tools/bin/league_sampling.h"

namespace {

using standfast::config::DayNumber;
using standfast::config::format_date;
using standfast::config::parse_date;
using standfast::tools::gen::make_rng;
using standfast::tools::gen::Rng;
using standfast::tools::gen::standard_normal;
using standfast::tools::gen::uniform01;
using standfast::tools::gen::uniform_below;

// The generator's hidden truth (written into the files for checking fits).
constexpr double LEAGUE_MEAN = 4.5;   // runs per side per game before team factors
constexpr double HOME_EDGE = 1.03;    // multiplier on the home side's expected runs
constexpr double SHAPE = 1.8;         // Weibull shape gamma
constexpr double STRENGTH_SD = 0.10;  // sd of log offence and log defence
constexpr double SHORTENED_RATE = 0.02;
// Extra innings: expected runs in a half-inning are the side's game mean / 9, plus this much
// with a runner placed on second (from memory: run expectancy with a runner on second and nobody
// out is about 0.6 runs above that of an empty inning).
constexpr double RUNNER_ON_SECOND_BONUS = 0.6;
constexpr double RUNS_GIVEN_SCORING = 1.8;  // mean runs in a half-inning that scores
constexpr int MAX_STRAIGHT = 20;  // most days in a row with games for a club (common practice)

// Sub-streams of the generator (the `stream` argument of make_rng).
enum Stream : std::uint64_t {
  kStrengthStream = 1,
  kScoreStream = 2,
  kEventStream = 3,
  kShortenedStream = 4,
  kScheduleStream = 1000,  // + attempt number
};

struct Club {
  std::string id, name, venue;
  double run_factor = 1.0;
  double offence = 1.0;  // multiplies the runs the club scores
  double defence = 1.0;  // multiplies the runs the club allows (below 1 is better)
};

struct Division {
  std::string id, name;
  std::vector<int> clubs;
};

struct Conference {
  std::string id, name;
  std::vector<Division> divisions;
};

struct Series {
  int home = 0, away = 0, length = 0;
  int start = -1;  // day offset from opening day
};

struct Game {
  int day = -1;  // day offset from opening day; -1 = date unknown (postponed)
  int home = 0, away = 0, number = 1;
  bool played = false;
  int home_runs = 0, away_runs = 0, innings = 9;
  bool shortened = false, postponed = false;
};

struct League {
  bool small = false;
  std::string name, season_label;
  std::vector<Club> clubs;
  std::vector<Conference> conferences;
  int games_per_team = 0;
  std::vector<int> games_at;  // games_at[i * n + j]: games between i and j at i's park
  DayNumber opening_day = 0;
  int target_days = 0;  // the schedule should end near this many days after opening day
  int min_days = 0, max_days = 0;
  int break_start = 0, break_length = 0;  // a midseason break with no games
  int doubleheaders = 0, postponements = 0;
  bool runner_on_second = false;

  int n() const { return static_cast<int>(clubs.size()); }
  int& at(int i, int j) { return games_at[static_cast<std::size_t>(i * n() + j)]; }
  int at(int i, int j) const { return games_at[static_cast<std::size_t>(i * n() + j)]; }
  bool in_break(int day) const { return day >= break_start && day < break_start + break_length; }
};

// A violated constraint: the program exits with status 1 (a bug in the generator).
struct ConstraintError : std::runtime_error {
  using std::runtime_error::runtime_error;
};

void require(bool ok, const std::string& what) {
  if (!ok) throw ConstraintError(what);
}

// ---------------------------------------------------------------------------------------------
// Clubs and strengths

void draw_strengths(League& lg, std::uint64_t seed) {
  Rng rng = make_rng(seed, kStrengthStream);
  const int n = lg.n();
  std::vector<double> lo(static_cast<std::size_t>(n)), ld(static_cast<std::size_t>(n));
  double mo = 0, md = 0;
  for (int i = 0; i < n; ++i) {
    lo[static_cast<std::size_t>(i)] = STRENGTH_SD * standard_normal(rng);
    ld[static_cast<std::size_t>(i)] = STRENGTH_SD * standard_normal(rng);
    mo += lo[static_cast<std::size_t>(i)] / n;
    md += ld[static_cast<std::size_t>(i)] / n;
  }
  for (int i = 0; i < n; ++i) {
    Club& c = lg.clubs[static_cast<std::size_t>(i)];
    // Centred so that the geometric means of offence and defence are exactly 1.
    c.offence = std::exp(lo[static_cast<std::size_t>(i)] - mo);
    c.defence = std::exp(ld[static_cast<std::size_t>(i)] - md);
    c.run_factor = std::clamp(1.0 + 0.04 * standard_normal(rng), 0.92, 1.10);
    c.run_factor = std::round(c.run_factor * 100.0) / 100.0;
  }
}

template <std::size_t N>
std::vector<Club> clubs_from(const std::array<standfast::tools::names::ClubName, N>& names) {
  std::vector<Club> out;
  for (const auto& c : names) {
    out.push_back(Club{std::string(c.id), std::string(c.name), std::string(c.venue)});
  }
  return out;
}

// 30 clubs, 2 conferences x 3 divisions x 5. Per club: 13 games against each of the 4 division
// rivals (52), 7 against 4 and 6 against 6 of the other conference clubs (64), 3 against 14
// clubs of the other conference and 4 against one paired rival there (46): 162 games, 81 home.
League make_demo() {
  League lg;
  lg.name = "Tallwater Baseball League";
  lg.season_label = "Season 12";
  lg.clubs = clubs_from(standfast::tools::names::DEMO_CLUBS);
  lg.games_per_team = 162;
  lg.opening_day = *parse_date("2047-04-04");
  lg.target_days = 186;
  lg.min_days = 180;
  lg.max_days = 190;
  lg.break_start = 98;
  lg.break_length = 4;
  lg.doubleheaders = 6;
  lg.postponements = 5;
  lg.runner_on_second = true;
  const char* conf_ids[2] = {"meridian", "lantern"};
  const char* conf_names[2] = {"Meridian Conference", "Lantern Conference"};
  const char* div_ids[3] = {"north", "central", "south"};
  const char* div_names[3] = {"North Division", "Central Division", "South Division"};
  for (int c = 0; c < 2; ++c) {
    Conference conf{conf_ids[c], conf_names[c], {}};
    for (int v = 0; v < 3; ++v) {
      Division d{fmt::format("{}-{}", conf_ids[c], div_ids[v]),
                 fmt::format("{} {}", c == 0 ? "Meridian" : "Lantern", div_names[v]),
                 {}};
      for (int s = 0; s < 5; ++s) d.clubs.push_back(c * 15 + v * 5 + s);
      conf.divisions.push_back(d);
    }
    lg.conferences.push_back(conf);
  }
  const int n = lg.n();
  lg.games_at.assign(static_cast<std::size_t>(n * n), 0);
  auto mod = [](int a, int m) { return ((a % m) + m) % m; };
  for (int i = 0; i < n; ++i) {
    for (int j = 0; j < n; ++j) {
      if (i == j) continue;
      const int ci = i / 15, cj = j / 15, vi = (i % 15) / 5, vj = (j % 15) / 5;
      const int si = i % 5, sj = j % 5;
      if (ci == cj && vi == vj) {
        // 13 games: 7 at the club for which the rival is 1 or 2 slots ahead (mod 5).
        const int d = mod(sj - si, 5);
        lg.at(i, j) = (d == 1 || d == 2) ? 7 : 6;
      } else if (ci == cj) {
        // Divisions v < w: slot s of v meets slots s and s+1 of w seven times (a 10-cycle),
        // the other three six times. Seven-game pairs alternate the extra home game round the
        // cycle: v_s hosts 4 against w_s, w_{s+1} hosts 4 against v_s.
        const bool i_low = vi < vj;
        const int sv = i_low ? si : sj, sw = i_low ? sj : si;
        const int d = mod(sw - sv, 5);
        if (d == 0) {
          lg.at(i, j) = i_low ? 4 : 3;
        } else if (d == 1) {
          lg.at(i, j) = i_low ? 3 : 4;
        } else {
          lg.at(i, j) = 3;
        }
      } else {
        // Other conference: position p in 0..14; p == q is the paired rival (2 + 2), the rest
        // are one three-game series, hosted by conference 0 when (q - p) mod 15 is 1..7.
        const int p = i % 15, q = j % 15;
        if (p == q) {
          lg.at(i, j) = 2;
        } else {
          const int d = ci == 0 ? mod(q - p, 15) : mod(p - q, 15);
          const bool zero_hosts = d >= 1 && d <= 7;
          lg.at(i, j) = (zero_hosts == (ci == 0)) ? 3 : 0;
        }
      }
    }
  }
  return lg;
}

// 6 clubs, 1 conference x 2 divisions x 3. Per club: 10 games against each division rival,
// 8 against the paired club of the other division and 6 against the other two: 40 games.
League make_small() {
  League lg;
  lg.small = true;
  lg.name = "Fenmark Valley League";
  lg.season_label = "Season 3";
  lg.clubs = clubs_from(standfast::tools::names::SMALL_CLUBS);
  lg.games_per_team = 40;
  lg.opening_day = *parse_date("2049-05-06");
  lg.target_days = 48;
  lg.min_days = 44;
  lg.max_days = 52;
  lg.break_start = 0;
  lg.break_length = 0;
  lg.doubleheaders = 1;
  lg.postponements = 1;
  lg.runner_on_second = false;
  Conference conf{"valley", "Valley Conference", {}};
  conf.divisions.push_back(Division{"upper", "Upper Division", {0, 1, 2}});
  conf.divisions.push_back(Division{"lower", "Lower Division", {3, 4, 5}});
  lg.conferences.push_back(conf);
  const int n = lg.n();
  lg.games_at.assign(static_cast<std::size_t>(n * n), 0);
  for (int i = 0; i < n; ++i) {
    for (int j = 0; j < n; ++j) {
      if (i == j) continue;
      if (i / 3 == j / 3) {
        lg.at(i, j) = 5;
      } else {
        lg.at(i, j) = (i % 3 == j % 3) ? 4 : 3;
      }
    }
  }
  return lg;
}

// ---------------------------------------------------------------------------------------------
// Schedule

// A random split of n >= 2 games into series of 2 to 4 (threes preferred).
std::vector<int> split_into_series(int n, Rng& rng) {
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

std::vector<Series> make_series(const League& lg, Rng& rng) {
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
bool place_series(const League& lg, std::vector<Series>& series, Rng& rng) {
  const int n = lg.n();
  std::vector<int> busy(static_cast<std::size_t>(n), 0), remaining(static_cast<std::size_t>(n), 0);
  std::vector<std::vector<int>> by_club(static_cast<std::size_t>(n));
  std::vector<int> last_met(static_cast<std::size_t>(n * n), -1000);
  std::vector<int> home_minus_road(static_cast<std::size_t>(n), 0);
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
        score -= 0.01 * (hs * hs + as * as);
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

int season_days(const std::vector<Series>& series) {
  int end = 0;
  for (const Series& s : series) end = std::max(end, s.start + s.length);
  return end;
}

// Tries schedules until one places every series and ends within [min_days, max_days].
std::vector<Series> make_schedule(const League& lg, std::uint64_t seed, int& attempts) {
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

// ---------------------------------------------------------------------------------------------
// Games and scores

int weibull_score(double mean, Rng& rng) {
  return standfast::tools::gen::weibull_score(mean, SHAPE, rng);
}

// Runs of one extra half-inning for a side whose game mean is `mean`.
int half_inning_runs(double mean, bool runner_on_second, Rng& rng) {
  const double m = mean / 9.0 + (runner_on_second ? RUNNER_ON_SECOND_BONUS : 0.0);
  return standfast::tools::gen::half_inning_runs(m, RUNS_GIVEN_SCORING, rng);
}

void play(const League& lg, Game& g, Rng& rng) {
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
      g.home_runs = weibull_score(mu_h * f, rng);
      g.away_runs = weibull_score(mu_a * f, rng);
    } while (g.home_runs == g.away_runs);
    return;
  }
  g.home_runs = weibull_score(mu_h, rng);
  g.away_runs = weibull_score(mu_a, rng);
  g.innings = 9;
  while (g.home_runs == g.away_runs) {
    ++g.innings;
    const int ra = half_inning_runs(mu_a, lg.runner_on_second, rng);
    int rh = half_inning_runs(mu_h, lg.runner_on_second, rng);
    if (rh > ra) rh = ra + 1;  // the home side stops once it leads
    g.away_runs += ra;
    g.home_runs += rh;
  }
}

// Back to not played (scores, innings and the shortened mark cleared).
void unplay(Game& g) {
  g.played = false;
  g.home_runs = g.away_runs = 0;
  g.innings = 9;
  g.shortened = false;
}

// k distinct indexes drawn from `pool` (partial Fisher-Yates with our own sampler).
std::vector<int> pick(std::vector<int> pool, int k, Rng& rng) {
  k = std::min<int>(k, static_cast<int>(pool.size()));
  for (int i = 0; i < k; ++i) {
    const int j =
        i + static_cast<int>(uniform_below(rng, static_cast<std::uint64_t>(pool.size()) - i));
    std::swap(pool[static_cast<std::size_t>(i)], pool[static_cast<std::size_t>(j)]);
  }
  pool.resize(static_cast<std::size_t>(k));
  return pool;
}

struct Outcome {
  std::vector<Game> games;
  int cutoff = 0;  // first day not yet played
  int schedule_attempts = 0;
  std::vector<Series> series;
};

Outcome make_games(const League& lg, std::uint64_t seed, double played_fraction) {
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

void check(const League& lg, const Outcome& out) {
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

// ---------------------------------------------------------------------------------------------
// Output

std::string date_text(const League& lg, int day) {
  return day < 0 ? "tbd" : format_date(lg.opening_day + day);
}

std::string header_comment(const League& lg, std::uint64_t seed, double fraction,
                           const std::string& out_dir, const Outcome& out) {
  std::string s;
  s += fmt::format("# {} - {}: an invented league; every club, place and venue is made up.\n",
                   lg.name, lg.season_label);
  s += fmt::format(
      "# Generated by: build/tools/make_league --shape {} --seed {} --played-fraction {} "
      "--out {}\n",
      lg.small ? "small" : "demo", seed, fraction, out_dir);
  s += "# Do not edit by hand: regenerate instead (see scenarios/README.md).\n";
  s += fmt::format("# Games before {} are played.\n#\n", date_text(lg, out.cutoff));
  s += "# ---- HIDDEN TRUTH of the generator (for checking fits; standfast never reads it) ----\n";
  s += fmt::format(
      "# expected runs of a side = {} x offence(batting) x defence(fielding) x run_factor(venue)"
      "\n#   x {} for the home side; scores: discretised Weibull, location -0.5, shape {}.\n",
      LEAGUE_MEAN, HOME_EDGE, SHAPE);
  s += "# offence and defence are log-normal (sd 0.10), centred to geometric mean 1;\n";
  s += "# defence multiplies the runs a club allows (below 1 is better). Also in truth.csv.\n";
  s += "#   team  offence  defence\n";
  for (const Club& c : lg.clubs) {
    s += fmt::format("#   {:<4}  {:.4f}   {:.4f}\n", c.id, c.offence, c.defence);
  }
  s += "# ---- end of hidden truth ----\n\n";
  return s;
}

std::string league_yaml(const League& lg) {
  std::string s = "standfast: 1\n";
  s += "league:\n";
  s += fmt::format("  name: {}\n", lg.name);
  s += fmt::format("  season: \"{}\"\n", lg.season_label);
  s += "  innings: 9\n";
  s += "  extra_innings:\n";
  s += fmt::format("    runner_on_second: {}\n", lg.runner_on_second ? "true" : "false");
  s += "    max_innings: 0\n";
  s += fmt::format("  games_per_team: {}\n\n", lg.games_per_team);
  s += "teams:\n";
  for (const Club& c : lg.clubs) {
    s += fmt::format("  - id: {}\n    name: {}\n    venue: {}\n    run_factor: {:.2f}\n", c.id,
                     c.name, c.venue, c.run_factor);
  }
  s += "\ngroups:\n";
  for (const Conference& conf : lg.conferences) {
    s += fmt::format("  - id: {}\n    name: {}\n    groups:\n", conf.id, conf.name);
    for (const Division& d : conf.divisions) {
      std::vector<std::string> ids;
      for (int c : d.clubs) ids.push_back(lg.clubs[static_cast<std::size_t>(c)].id);
      std::string list;
      for (std::size_t i = 0; i < ids.size(); ++i) list += (i ? ", " : "") + ids[i];
      s += fmt::format("      - id: {}\n        name: {}\n        teams: [{}]\n", d.id, d.name,
                       list);
    }
  }
  return s;
}

std::string demo_rules_yaml() {
  return R"(
postseason:
  format: conference_brackets
  qualify:
    division_winners: 3
    at_large: 3
    byes: 2
    winners_first: true
  reseed: true
  rounds:
    - {name: First round, best_of: 3, hosts: [3]}
    - {name: Second round, best_of: 5, hosts: [2, 2, 1]}
    - {name: Conference final, best_of: 7, hosts: [2, 3, 2]}
    - {name: League final, best_of: 7, hosts: [2, 3, 2]}

tiebreakers:
  order:
    - head_to_head
    - division_record
    - conference_record
    - run_differential
    - {last_games: 20, within: conference}
    - draw
  extra_game: false

model:
  family: weibull
  shape: fit
  home_edge: fit
  shrink_games: 20

games_file: games.csv
)";
}

std::string small_rules_yaml(const League& lg, const Outcome& out) {
  std::string s = R"(
postseason:
  format: single_bracket
  qualify:
    division_winners: 2
    at_large: 2
    byes: 0
  reseed: false
  rounds:
    - {name: Semifinal, best_of: 5, hosts: [2, 2, 1]}
    - {name: Final, best_of: 7, hosts: [2, 3, 2]}

tiebreakers:
  order: [head_to_head, division_record, run_differential, draw]

model:
  family: weibull
  shape: fit
  home_edge: fit
  shrink_games: 20

# A user's own projection: from the cut-off on, the Skippers' runs are half fitted values and
# half these (say they signed a hitter). Delete this section to use the fitted values only.
overrides:
  - team: PEB
    runs_scored: 4.9
    runs_allowed: 4.4
    blend: 0.5
)";
  s += fmt::format("    from: {}\n", date_text(lg, out.cutoff));
  s += "\ngames:\n";
  for (const Game& g : out.games) {
    std::string line = fmt::format("  - {{date: {}, home: {}, away: {}", date_text(lg, g.day),
                                   lg.clubs[static_cast<std::size_t>(g.home)].id,
                                   lg.clubs[static_cast<std::size_t>(g.away)].id);
    if (g.number != 1) line += fmt::format(", game: {}", g.number);
    if (g.played) {
      line += fmt::format(", home_runs: {}, away_runs: {}", g.home_runs, g.away_runs);
      if (g.innings != 9) line += fmt::format(", innings: {}", g.innings);
      if (g.shortened) line += ", shortened: true";
    }
    s += line + "}\n";
  }
  return s;
}

std::string games_csv(const League& lg, const Outcome& out) {
  std::string s = "date,home,away,game,home_runs,away_runs,innings,status\n";
  for (const Game& g : out.games) {
    const std::string& h = lg.clubs[static_cast<std::size_t>(g.home)].id;
    const std::string& a = lg.clubs[static_cast<std::size_t>(g.away)].id;
    if (g.played) {
      s += fmt::format("{},{},{},{},{},{},{},{}\n", date_text(lg, g.day), h, a, g.number,
                       g.home_runs, g.away_runs, g.innings, g.shortened ? "shortened" : "");
    } else {
      s += fmt::format("{},{},{},{},,,,{}\n", date_text(lg, g.day), h, a, g.number,
                       g.postponed ? "postponed" : "");
    }
  }
  return s;
}

std::string truth_csv(const League& lg) {
  std::string s = "team,offence,defence\n";
  for (const Club& c : lg.clubs) s += fmt::format("{},{:.6f},{:.6f}\n", c.id, c.offence, c.defence);
  return s;
}

void write_file(const std::filesystem::path& path, const std::string& text) {
  auto f = fmt::output_file(path.string());
  f.print("{}", text);
}

void print_summary(const League& lg, const Outcome& out) {
  const int n = lg.n();
  int played = 0, shortened = 0, extra = 0, postponed = 0, doubleheaders = 0, home_wins = 0;
  long runs = 0;
  std::vector<int> home(static_cast<std::size_t>(n), 0), road(static_cast<std::size_t>(n), 0);
  std::vector<int> home_played(static_cast<std::size_t>(n), 0);
  std::vector<int> road_played(static_cast<std::size_t>(n), 0);
  std::map<int, int> dates;
  for (const Game& g : out.games) {
    ++home[static_cast<std::size_t>(g.home)];
    ++road[static_cast<std::size_t>(g.away)];
    if (g.day >= 0) ++dates[g.day];
    postponed += g.postponed ? 1 : 0;
    doubleheaders += g.number == 2 ? 1 : 0;
    if (!g.played) continue;
    ++played;
    ++home_played[static_cast<std::size_t>(g.home)];
    ++road_played[static_cast<std::size_t>(g.away)];
    shortened += g.shortened ? 1 : 0;
    extra += g.innings > 9 ? 1 : 0;
    home_wins += g.home_runs > g.away_runs ? 1 : 0;
    runs += g.home_runs + g.away_runs;
  }
  std::map<int, int> lengths;
  for (const Series& s : out.series) ++lengths[s.length];
  // Days with a game per club, and the longest run of them.
  std::vector<std::vector<int>> club_days(static_cast<std::size_t>(n));
  for (const Game& g : out.games) {
    if (g.day < 0) continue;
    for (int c : {g.home, g.away}) club_days[static_cast<std::size_t>(c)].push_back(g.day);
  }
  int min_game_days = 1 << 30, max_game_days = 0, longest = 0;
  for (auto& v : club_days) {
    std::sort(v.begin(), v.end());
    v.erase(std::unique(v.begin(), v.end()), v.end());
    min_game_days = std::min<int>(min_game_days, static_cast<int>(v.size()));
    max_game_days = std::max<int>(max_game_days, static_cast<int>(v.size()));
    int run = 0;
    for (std::size_t i = 0; i < v.size(); ++i) {
      run = (i > 0 && v[i] == v[i - 1] + 1) ? run + 1 : 1;
      longest = std::max(longest, run);
    }
  }
  auto [hmin, hmax] = std::minmax_element(home.begin(), home.end());
  auto [rmin, rmax] = std::minmax_element(road.begin(), road.end());
  auto [phmin, phmax] = std::minmax_element(home_played.begin(), home_played.end());
  auto [prmin, prmax] = std::minmax_element(road_played.begin(), road_played.end());
  fmt::print("league: {} ({}), {} clubs, {} games per club\n", lg.name, lg.season_label, n,
             lg.games_per_team);
  fmt::print("games: {}  played: {} ({:.1f}%)  postponed (tbd): {}  doubleheaders: {}\n",
             out.games.size(), played, 100.0 * played / static_cast<double>(out.games.size()),
             postponed, doubleheaders);
  fmt::print("home games per club: {}..{}  road games per club: {}..{}\n", *hmin, *hmax, *rmin,
             *rmax);
  fmt::print("played so far per club: home {}..{}  road {}..{}\n", *phmin, *phmax, *prmin, *prmax);
  std::string hist;
  for (const auto& [len, count] : lengths) hist += fmt::format("  {} games: {}", len, count);
  fmt::print("series: {}  lengths:{}\n", out.series.size(), hist);
  const int last = dates.rbegin()->first;
  fmt::print("days: {} ({} to {}), {} with games; schedule found on attempt {}\n", last + 1,
             date_text(lg, 0), date_text(lg, last), dates.size(), out.schedule_attempts);
  fmt::print("days with a game per club: {}..{}; longest run of days in a row: {}\n", min_game_days,
             max_game_days, longest);
  fmt::print("cut-off: games before {} are played\n", date_text(lg, out.cutoff));
  if (played > 0) {
    fmt::print(
        "played games: {:.3f} runs per side, home side won {:.1f}%, extra innings {}, "
        "shortened {}\n",
        runs / (2.0 * played), 100.0 * home_wins / played, extra, shortened);
  }
}

}  // namespace

int main(int argc, char** argv) {
  CLI::App app{"make_league: writes an invented league (season file, games, hidden truth)."};
  std::string shape = "demo";
  std::uint64_t seed = 2031;
  std::string out_dir;
  double fraction = 0.5;
  app.add_option("--shape", shape, "small (6 clubs, games inline) or demo (30 clubs)")
      ->check(CLI::IsMember({"small", "demo"}));
  app.add_option("--seed", seed, "random seed");
  app.add_option("--out", out_dir, "output folder (created if missing)")->required();
  app.add_option("--played-fraction", fraction, "share of the games already played")
      ->check(CLI::Range(0.0, 1.0));
  try {
    app.parse(argc, argv);
  } catch (const CLI::ParseError& e) {
    const int code = app.exit(e);
    return code == 0 ? 0 : 2;
  }
  try {
    League lg = shape == "demo" ? make_demo() : make_small();
    draw_strengths(lg, seed);
    const Outcome out = make_games(lg, seed, fraction);
    check(lg, out);
    std::error_code ec;
    std::filesystem::create_directories(out_dir, ec);
    if (ec) {
      fmt::print(stderr, "error: cannot create {}: {}\n", out_dir, ec.message());
      return 2;
    }
    const std::filesystem::path dir(out_dir);
    std::string yaml = header_comment(lg, seed, fraction, out_dir, out) + league_yaml(lg);
    if (lg.small) {
      yaml += small_rules_yaml(lg, out);
    } else {
      yaml += demo_rules_yaml();
      write_file(dir / "games.csv", games_csv(lg, out));
    }
    write_file(dir / "season.yaml", yaml);
    write_file(dir / "truth.csv", truth_csv(lg));
    print_summary(lg, out);
  } catch (const ConstraintError& e) {
    fmt::print(stderr, "make_league: constraint violated: {}\n", e.what());
    return 1;
  } catch (const std::system_error& e) {
    fmt::print(stderr, "error: {}\n", e.what());
    return 2;
  }
  return 0;
}
