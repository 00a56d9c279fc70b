// The plain (unadjusted) Weibull fit of Miller (2007): for every team one discretised-Weibull
// scale for its runs scored and one for its runs allowed, with the shape gamma shared by the
// league, by maximum likelihood on the binned scores; and, for diagnosis, each team's own free
// shape fitted to its runs scored and allowed alone.
// Method: Boost.Math brent_find_minima over log(gamma) on the profile log-likelihood; for each
// gamma, Newton's method in log(scale) per sample (analytic derivatives).
// Standard errors: observed information. Every score enters twice (as one team's runs scored
// and another's runs allowed), so the league shape's information is halved (a composite
// likelihood counted twice); a scale's variance includes the shape's through the Schur
// complement of the arrow-shaped Hessian.
#ifndef STANDFAST_MODELS_PLAIN_FIT_H
#define STANDFAST_MODELS_PLAIN_FIT_H

#include <optional>
#include <vector>

#include "models/likelihood.h"

namespace standfast::models {

struct PlainSample {
  int count = 0;           // scores in the sample
  double log_scale = 0.0;  // fitted log(alpha)
  double log_scale_se = 0.0;
  double mean = 0.0;  // discretised mean at the fitted scale and league shape
  double log_mean_se = 0.0;
};

struct PlainTeam {
  PlainSample scored, allowed;
  double free_shape = 0.0;  // the team's own gamma (0 when it has too few games)
  double free_shape_se = 0.0;
};

struct PlainFit {
  double shape = 0.0;
  double shape_se = 0.0;  // 0 when the shape is fixed
  std::vector<PlainTeam> teams;
  double log_lik = 0.0;  // of the runs-scored samples (each score once)
  bool converged = true;
};

// Fits the plain model; `fixed_shape` fixes the league gamma. Samples use Side::y (so the
// lopsided down-weighting applies). Throws std::domain_error for an empty data set.
PlainFit fit_plain(const std::vector<Side>& sides, int teams, std::optional<double> fixed_shape);

// Maximum-likelihood log(scale) of one sample at a fixed shape (Newton's method), with the
// log-likelihood at the maximum in `log_lik` and -d2/dlog(scale)^2 in `information`.
double fit_log_scale(const std::vector<double>& scores, double shape, double* log_lik = nullptr,
                     double* information = nullptr);

}  // namespace standfast::models

#endif  // STANDFAST_MODELS_PLAIN_FIT_H
