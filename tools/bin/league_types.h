// The league generator's data: clubs, groups, series, games, the generator's hidden truth
// constants and its constraint error (used only by tools/bin/make_league.cpp and its test).
#ifndef STANDFAST_TOOLS_BIN_LEAGUE_TYPES_H
#define STANDFAST_TOOLS_BIN_LEAGUE_TYPES_H

#include <algorithm>
#include <cstdint>
#include <stdexcept>
#include <string>
#include <vector>

#include "config/season.h"
#include "tools/bin/league_sampling.h"

namespace standfast::tools::gen {

using standfast::config::DayNumber;

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

inline void require(bool ok, const std::string& what) {
  if (!ok) throw ConstraintError(what);
}

struct Outcome {
  std::vector<Game> games;
  std::vector<Game> full_season;  // every game played out, on its first date (the future too)
  int cutoff = 0;                 // first day not yet played
  int schedule_attempts = 0;
  std::vector<Series> series;
};

// k distinct indexes drawn from `pool` (partial Fisher-Yates with our own sampler).
inline std::vector<int> pick(std::vector<int> pool, int k, Rng& rng) {
  k = std::min<int>(k, static_cast<int>(pool.size()));
  for (int i = 0; i < k; ++i) {
    const int j =
        i + static_cast<int>(uniform_below(rng, static_cast<std::uint64_t>(pool.size()) - i));
    std::swap(pool[static_cast<std::size_t>(i)], pool[static_cast<std::size_t>(j)]);
  }
  pool.resize(static_cast<std::size_t>(k));
  return pool;
}

}  // namespace standfast::tools::gen

#endif  // STANDFAST_TOOLS_BIN_LEAGUE_TYPES_H
