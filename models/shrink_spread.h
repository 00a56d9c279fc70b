// The uncertainty of an estimated shrinkage (`shrink_games: auto`) carried into the strength
// draws. The empirical-Bayes prior variance tau^2 of the log ratings is estimated from the
// same games, and early in a season it is poorly known; plugging in one value makes the odds
// over-confident (Morris 1983, JASA 78(381) 47-55; Kass and Steffey 1989, JASA 84(407)
// 717-726). Here tau gets a flat prior and its posterior from the maximum-likelihood ratings
// (each log rating ~ N(0, tau^2 + se^2)); the share of each rating kept after shrinkage,
// tau^2 / (tau^2 + se^2), then varies with tau, and its posterior standard deviation becomes
// one more normal draw per simulated season that stretches or shrinks all ratings together.
#ifndef STANDFAST_MODELS_SHRINK_SPREAD_H
#define STANDFAST_MODELS_SHRINK_SPREAD_H

#include "models/joint_fit.h"
#include "models/strength_sampler.h"

namespace standfast::models {

struct ShrinkSpread {
  double mean_kept = 0.0;  // posterior mean of the share kept, averaged over the ratings
  double sd_kept = 0.0;    // its posterior standard deviation
};

// From the maximum-likelihood fit (estimates and variances of the log ratings). Integrates on
// a grid of 2,000 values of tau in (0, max(1, 3 max |rating|)]. Zero spread when the fit has
// no variances.
ShrinkSpread shrink_spread(const JointFit& mle);

// Adds the direction sd_kept x (the maximum-likelihood log ratings) to the sampler as one more
// low-rank column: every draw adds w sd_kept theta for one more standard normal w.
void add_shrink_spread(StrengthSampler& sampler, const JointFit& mle, double sd_kept);

}  // namespace standfast::models

#endif  // STANDFAST_MODELS_SHRINK_SPREAD_H
