// Generated leagues with known true parameters, for parameter-recovery measurements, tests and
// benchmarks. Scores are drawn by inversion with our own samplers from a pcg64 stream.
#ifndef STANDFAST_MODELS_SYNTHETIC_H
#define STANDFAST_MODELS_SYNTHETIC_H

#include <cstdint>
#include <vector>

#include "config/season.h"
#include "models/likelihood.h"

namespace standfast::models {

struct SyntheticLeague {
  config::ScoreFamily family = config::ScoreFamily::kWeibull;
  double league_mean = 4.5;
  double shape = 1.8;  // Weibull gamma or negative-binomial size
  double home_edge = 1.04;
  std::vector<double> log_offence, log_defence;  // true values, one per team
  std::vector<double> run_factor;                // per team (its venue); empty = all 1
  int divisions = 1;     // teams are split into this many equal divisions (team i in i % d)
  int games_within = 6;  // games between two teams of the same division (home alternating)
  int games_across = 2;  // games between two teams of different divisions
};

// The sides of every game of the schedule, with exact model scores (ties are kept: this is the
// model itself, used for recovery and coverage measurements).
std::vector<Side> synthetic_sides(const SyntheticLeague& league, std::uint64_t seed);

// The same schedule as a Season with played games. A tied score is settled by one run added to
// a side chosen by the stream (a crude stand-in for extra innings); all games are 9 innings.
config::Season synthetic_season(const SyntheticLeague& league, std::uint64_t seed);

// True ratings spread on the log scale: team i gets sd * z_i with z_i standard normal from the
// stream, then centred to sum 0.
std::vector<double> synthetic_log_ratings(int teams, double sd, std::uint64_t seed);

}  // namespace standfast::models

#endif  // STANDFAST_MODELS_SYNTHETIC_H
