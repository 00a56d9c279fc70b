// Score distributions of one side in one game: value types with checked parameters and free
// functions (pmf, cdf, survival, mean, variance, quantile, sample), after Boost.Math's design.
//
//   DiscreteWeibull{scale, shape}: a Weibull with location beta = -0.5 binned at the integers,
//     P(k) = F(k + 0.5) - F(k - 0.5) with F(x) = 1 - exp(-((x - beta)/scale)^shape), so
//     P(k) = exp(-(k/scale)^shape) - exp(-((k+1)/scale)^shape), k = 0, 1, 2, ...
//     (Miller 2007, Chance 20(1) 40-48). Its mean is sum_{k>=1} exp(-(k/scale)^shape), which
//     differs from the continuous mean beta + scale*Gamma(1 + 1/shape) by about 4e-4.
//   NegativeBinomial{mean, size}: variance mean + mean^2/size (size > 0, real).
//   Poisson{mean}.
//
// Every function throws std::domain_error naming the function, parameter and bad value.
#ifndef STANDFAST_MODELS_SCORE_DIST_H
#define STANDFAST_MODELS_SCORE_DIST_H

#include <cstdint>
#include <type_traits>
#include <vector>

#include "config/season.h"

namespace standfast::models {

inline constexpr double WEIBULL_LOCATION = -0.5;

struct DiscreteWeibull {
  double scale = 5.0;  // alpha > 0
  double shape = 1.8;  // gamma > 0
};

struct NegativeBinomial {
  double mean = 4.5;   // > 0
  double size = 10.0;  // r > 0
};

struct Poisson {
  double mean = 4.5;  // > 0
};

// P(score = k); 0 for k < 0.
double pmf(const DiscreteWeibull& d, int k);
double pmf(const NegativeBinomial& d, int k);
double pmf(const Poisson& d, int k);

// P(score <= k); 0 for k < 0.
double cdf(const DiscreteWeibull& d, int k);
double cdf(const NegativeBinomial& d, int k);
double cdf(const Poisson& d, int k);

// P(score > k), computed directly (not as 1 - cdf).
double survival(const DiscreteWeibull& d, int k);
double survival(const NegativeBinomial& d, int k);
double survival(const Poisson& d, int k);

double mean(const DiscreteWeibull& d);
double mean(const NegativeBinomial& d);
double mean(const Poisson& d);

double variance(const DiscreteWeibull& d);
double variance(const NegativeBinomial& d);
double variance(const Poisson& d);

// Smallest k with cdf(k) >= u, for u in [0, 1): the inversion sampler.
int quantile(const DiscreteWeibull& d, double u);
int quantile(const NegativeBinomial& d, double u);
int quantile(const Poisson& d, double u);

// One score drawn by inversion from a 64-bit generator (for example pcg64), using the top 53
// bits as a uniform on [0, 1). Our own sampler: no std:: distributions.
template <class Dist, class Urng>
int sample(const Dist& d, Urng& rng) {
  static_assert(sizeof(decltype(rng())) == 8, "sample() needs a 64-bit generator");
  const double u = static_cast<double>(static_cast<std::uint64_t>(rng()) >> 11) * 0x1.0p-53;
  return quantile(d, u);
}

// The distribution of a family with a given mean (runs per side per game).
// weibull_for_mean solves the scale so that the DISCRETISED mean equals `mean` (Newton's method
// from the continuous solution, converged to about 1e-14 relative).
DiscreteWeibull weibull_for_mean(double mean, double shape);
NegativeBinomial negative_binomial_for_mean(double mean, double size);
Poisson poisson_for_mean(double mean);

// cdf values P(score <= k) for k = 0, 1, ... of the family with this mean and shape (Weibull
// gamma, negative-binomial size; ignored for Poisson), until P(score > k) < tail. Throws for
// kLog5, which has no score distribution.
std::vector<double> score_cdf_table(config::ScoreFamily family, double mean, double shape,
                                    double tail = 1e-12);

// Name of a family as written in season files: weibull, negative_binomial, poisson, log5.
const char* family_name(config::ScoreFamily family);

}  // namespace standfast::models

#endif  // STANDFAST_MODELS_SCORE_DIST_H
