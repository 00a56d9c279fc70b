// Team ratings for the simulation engine: the schedule-adjusted scoring model fitted by maximum
// likelihood from the played games, shrunk toward the league mean, with the covariance the
// engine draws true strengths from. See README.md, section "Scoring models", for the choices.
//
// Model: the runs of one side of one game follow the family of Season::model with mean
//   league_mean x offence[batting] x defence[fielding] x run_factor[home team's venue]
//   x home_edge (when batting at home) x innings/regulation (shortened games only),
// and the family's shape (Weibull gamma, negative-binomial size) shared by the league.
// Offence and defence are normalised so that their geometric means over the teams are 1.
// Games used: Season::games with played == true. A game whose innings exceed the regulation
// innings enters as a tie after regulation (models/likelihood.h, tie_loglik); other games by
// their final score. Shortened games count with their expected runs scaled by innings played /
// regulation innings. A fitted shape is the adjusted one (models/joint_fit.h, adjust_shape)
// unless ModelSpec::adjusted_shape is false.
// Family log5: no scores are modelled; every team gets offence = defence = 1 with zero
// uncertainty, and the engine takes win percentages from Season::overrides.
#ifndef STANDFAST_MODELS_RATINGS_H
#define STANDFAST_MODELS_RATINGS_H

#include <vector>

#include "config/season.h"
#include "models/strength_sampler.h"

namespace standfast::models {

struct TeamRating {      // one team, schedule-adjusted, after shrinkage
  double offence = 1.0;  // multiplicative, league average = 1
  double defence = 1.0;  // multiplicative on runs ALLOWED (lower is better), average 1
  // uncertainty on the log scale (what the engine draws true strengths from)
  double log_offence_se = 0.0, log_defence_se = 0.0;
};

struct LeagueRatings {
  config::ScoreFamily family = config::ScoreFamily::kWeibull;
  double league_mean = 4.5;  // runs per side per game at a neutral venue, average teams
  double shape = 1.8;      // Weibull gamma (weibull); size r (negative_binomial); unused otherwise
  double home_edge = 1.0;  // multiplier on the home side's expected runs
  std::vector<TeamRating> teams;  // Season::teams order
  // Draws of (log offence_0..n-1, log defence_0..n-1) around the estimates from their joint
  // uncertainty, through a sparse factor of the precision (models/strength_sampler.h). Empty
  // when there is no uncertainty (family log5, or nothing played and no shrinkage).
  StrengthSampler strengths;

  // Standard errors of the league values (0 when fixed by the season file or not fitted).
  double league_mean_se = 0.0, shape_se = 0.0, home_edge_se = 0.0;
  int games_fitted = 0;       // played games used by the fit
  double shrink_games = 0.0;  // prior weight used, in games (estimated under shrink_games: auto)
  double log_lik = 0.0;       // log-likelihood at the estimate (without the shrinkage prior)
  bool converged = true;      // the optimiser met its tolerance

  // expected runs of `batting` against `fielding` at the venue of `home`
  double expected_runs(int batting, int fielding, double run_factor, bool batting_at_home) const;
};

// Fits the ratings of Season::model from the played games of `season`.
// Throws std::domain_error on bad data (a team index out of range, a negative score, a team
// with no played game when shrink_games is 0).
LeagueRatings fit_ratings(const config::Season& season);

}  // namespace standfast::models

#endif  // STANDFAST_MODELS_RATINGS_H
