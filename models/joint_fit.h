// The schedule-adjusted scoring model, fitted jointly by maximum likelihood on the binned scores:
//   log E[runs of a side] = log M + log offence[batting] + log defence[fielding]
//                           + [batting at home] log H + side.offset
// with the sum of log offence and the sum of log defence over the teams fixed at 0, and the
// family's shape (Weibull gamma or negative-binomial size) shared by the league.
// A game that went to extra innings (Side::extra_innings on both its sides) enters as the
// chance of a tie after regulation (tie_loglik, models/likelihood.h) instead of two scores.
// Optional shrinkage: a normal prior N(0, 1/prior_precision) on every log offence and log
// defence (see ratings.h for how the precision follows from shrink_games).
// Method: a damped Newton's method over (ratings, log shape), with the analytic gradient and
// Hessian in the linear predictor and central differences (step 1e-5) in log(shape); the search
// for log(shape) is bounded (Weibull gamma in [0.6, 6], negative-binomial size in [0.2, 5000]).
// Each club meets only some others, so the Hessian is sparse: the fit works in a corner
// parameterisation (the last club's ratings fixed at 0, an exact reparameterisation of the
// sum-to-zero one), factors the sparse part with a sparse Cholesky factorisation (Eigen
// SimplicialLLT, approximate-minimum-degree ordering) and the two dense rank-one terms of the
// centred prior with the Woodbury identity. Standard errors from the observed information (the
// Hessian of the negative log-posterior at the estimate); the same factor gives the sampler of
// the ratings' joint uncertainty (models/strength_sampler.h).
#ifndef STANDFAST_MODELS_JOINT_FIT_H
#define STANDFAST_MODELS_JOINT_FIT_H

#include <optional>
#include <vector>

#include "config/season.h"
#include "models/likelihood.h"
#include "models/strength_sampler.h"

namespace standfast::models {

struct JointOptions {
  config::ScoreFamily family = config::ScoreFamily::kWeibull;
  std::optional<double> shape;      // fixed shape; empty = fitted (ignored for Poisson)
  std::optional<double> home_edge;  // fixed home multiplier; empty = fitted
  double prior_precision = 0.0;     // on each log rating; 0 = no shrinkage
  bool covariance = true;           // compute the standard errors and the strength sampler
  // A fitted shape: the maximum of the adjusted profile likelihood (Cox and Reid 1987) instead
  // of the plain likelihood. The plain estimate is biased upward when many ratings are fitted
  // from few games (the ratings absorb part of the scores' spread); see joint_fit.cpp.
  bool adjust_shape = false;
  const struct JointFit* start = nullptr;  // optional starting point (same teams and family)
};

struct JointFit {
  int teams = 0;
  double log_mean = 0.0;
  double log_home = 0.0;
  double shape = 0.0;                            // 0 for Poisson
  std::vector<double> log_offence, log_defence;  // n each, each summing to 0
  // Variances of (log M, log H, log offence_0..n-1, log defence_0..n-1, log shape), dimension
  // 2n + 3, from the observed information; 0 for fixed parameters. Empty when not requested.
  std::vector<double> variance;
  // Draws of (log offence, log defence) from their joint uncertainty (all other parameters
  // integrated out). Empty when not requested.
  StrengthSampler strengths;
  double log_lik = 0.0;  // without the prior
  int free_parameters = 0;
  int iterations = 0;
  bool converged = false;

  int dimension() const { return 2 * teams + 3; }
  double var(int i) const { return variance[static_cast<size_t>(i)]; }
  double se(int i) const;  // sqrt(var(i)), 0 when there are no variances
  static constexpr int LOG_MEAN = 0, LOG_HOME = 1, FIRST_OFFENCE = 2;
  int offence_index(int team) const { return FIRST_OFFENCE + team; }
  int defence_index(int team) const { return FIRST_OFFENCE + teams + team; }
  int log_shape_index() const { return 2 * teams + 2; }
  // log E[runs] of a side under the fit.
  double eta(const Side& s) const;
};

// Fits the model to `sides` of a league of `teams` teams. Throws std::domain_error for an empty
// data set, a family of log5, a team with no side when prior_precision is 0, or bad options.
JointFit fit_joint(const std::vector<Side>& sides, int teams, const JointOptions& options);

// Expected Fisher information about eta = log(mean) of one score with this mean and shape:
// E[(d log P / d eta)^2], summed over the scores.
double information_per_side(config::ScoreFamily family, double mean, double shape);

}  // namespace standfast::models

#endif  // STANDFAST_MODELS_JOINT_FIT_H
