// The Pythagorean expectation at a Weibull shape (Miller 2007, Chance 20(1), 40-48): with runs
// scored X and allowed Y independent Weibull(alpha_X, beta, gamma) and Weibull(alpha_Y, beta,
// gamma) of means mu_X and mu_Y,
//   P(X > Y) = (mu_X - beta)^gamma / ((mu_X - beta)^gamma + (mu_Y - beta)^gamma).
#ifndef STANDFAST_MODELS_PYTHAGOREAN_H
#define STANDFAST_MODELS_PYTHAGOREAN_H

#include "models/score_dist.h"

namespace standfast::models {

// The formula above; throws std::domain_error unless runs_scored and runs_allowed exceed beta
// and gamma > 0.
double pythagorean_win_prob(double runs_scored, double runs_allowed, double gamma,
                            double beta = WEIBULL_LOCATION);

// The continuous Weibull mean beta + alpha Gamma(1 + 1/gamma) (what the formula's mu is).
double continuous_weibull_mean(double scale, double gamma, double beta = WEIBULL_LOCATION);

}  // namespace standfast::models

#endif  // STANDFAST_MODELS_PYTHAGOREAN_H
