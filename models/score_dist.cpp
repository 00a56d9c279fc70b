#include "models/score_dist.h"

#include <fmt/core.h>

#include <boost/math/distributions/negative_binomial.hpp>
#include <boost/math/distributions/poisson.hpp>
#include <boost/math/special_functions/gamma.hpp>
#include <cmath>
#include <limits>
#include <stdexcept>

namespace standfast::models {
namespace {

void check_positive(const char* function, const char* parameter, double value) {
  if (!(value > 0.0) || !std::isfinite(value)) {
    throw std::domain_error(
        fmt::format("{}: {} must be finite and > 0, got {}", function, parameter, value));
  }
}

void check(const DiscreteWeibull& d, const char* function) {
  check_positive(function, "scale", d.scale);
  check_positive(function, "shape", d.shape);
}
void check(const NegativeBinomial& d, const char* function) {
  check_positive(function, "mean", d.mean);
  check_positive(function, "size", d.size);
}
void check(const Poisson& d, const char* function) { check_positive(function, "mean", d.mean); }

// P(score > k) = exp(-((k+1)/scale)^shape) for k >= -1.
double weibull_tail(const DiscreteWeibull& d, double k) {
  return std::exp(-std::pow((k + 1.0) / d.scale, d.shape));
}

boost::math::negative_binomial_distribution<double> boost_nb(const NegativeBinomial& d) {
  return boost::math::negative_binomial_distribution<double>(d.size, d.size / (d.size + d.mean));
}

template <class Dist>
int search_quantile(const Dist& d, double u, const char* function) {
  if (!(u >= 0.0 && u < 1.0)) {
    throw std::domain_error(fmt::format("{}: u must be in [0, 1), got {}", function, u));
  }
  int k = 0;
  double c = cdf(d, 0);
  while (c < u) {
    ++k;
    c += pmf(d, k);
    if (k > 100000000) break;
  }
  return k;
}

}  // namespace

double pmf(const DiscreteWeibull& d, int k) {
  check(d, "pmf(DiscreteWeibull)");
  if (k < 0) return 0.0;
  // exp(-a) - exp(-b) = exp(-a) * (-expm1(a - b)): no cancellation far in the tail.
  const double a = std::pow(k / d.scale, d.shape);
  const double b = std::pow((k + 1.0) / d.scale, d.shape);
  return -std::exp(-a) * std::expm1(a - b);
}
double pmf(const NegativeBinomial& d, int k) {
  check(d, "pmf(NegativeBinomial)");
  if (k < 0) return 0.0;
  return boost::math::pdf(boost_nb(d), k);
}
double pmf(const Poisson& d, int k) {
  check(d, "pmf(Poisson)");
  if (k < 0) return 0.0;
  return boost::math::pdf(boost::math::poisson_distribution<double>(d.mean), k);
}

double cdf(const DiscreteWeibull& d, int k) {
  check(d, "cdf(DiscreteWeibull)");
  if (k < 0) return 0.0;
  return -std::expm1(-std::pow((k + 1.0) / d.scale, d.shape));
}
double cdf(const NegativeBinomial& d, int k) {
  check(d, "cdf(NegativeBinomial)");
  if (k < 0) return 0.0;
  return boost::math::cdf(boost_nb(d), k);
}
double cdf(const Poisson& d, int k) {
  check(d, "cdf(Poisson)");
  if (k < 0) return 0.0;
  return boost::math::cdf(boost::math::poisson_distribution<double>(d.mean), k);
}

double survival(const DiscreteWeibull& d, int k) {
  check(d, "survival(DiscreteWeibull)");
  if (k < 0) return 1.0;
  return weibull_tail(d, k);
}
double survival(const NegativeBinomial& d, int k) {
  check(d, "survival(NegativeBinomial)");
  if (k < 0) return 1.0;
  return boost::math::cdf(boost::math::complement(boost_nb(d), k));
}
double survival(const Poisson& d, int k) {
  check(d, "survival(Poisson)");
  if (k < 0) return 1.0;
  return boost::math::cdf(
      boost::math::complement(boost::math::poisson_distribution<double>(d.mean), k));
}

double mean(const DiscreteWeibull& d) {
  check(d, "mean(DiscreteWeibull)");
  // E[Y] = sum_{k>=0} P(Y > k) = sum_{k>=1} exp(-(k/scale)^shape).
  double sum = 0.0;
  for (int k = 1;; ++k) {
    const double term = std::exp(-std::pow(k / d.scale, d.shape));
    sum += term;
    if (term < 1e-18 * sum || term == 0.0) break;
  }
  return sum;
}
double mean(const NegativeBinomial& d) {
  check(d, "mean(NegativeBinomial)");
  return d.mean;
}
double mean(const Poisson& d) {
  check(d, "mean(Poisson)");
  return d.mean;
}

double variance(const DiscreteWeibull& d) {
  check(d, "variance(DiscreteWeibull)");
  // E[Y^2] = sum_{k>=0} (2k + 1) P(Y > k).
  double second = 0.0;
  for (int k = 0;; ++k) {
    const double term = (2.0 * k + 1.0) * weibull_tail(d, k);
    second += term;
    if (term < 1e-18 * second || term == 0.0) break;
  }
  const double m = mean(d);
  return second - m * m;
}
double variance(const NegativeBinomial& d) {
  check(d, "variance(NegativeBinomial)");
  return d.mean + d.mean * d.mean / d.size;
}
double variance(const Poisson& d) {
  check(d, "variance(Poisson)");
  return d.mean;
}

int quantile(const DiscreteWeibull& d, double u) {
  check(d, "quantile(DiscreteWeibull)");
  if (!(u >= 0.0 && u < 1.0)) {
    throw std::domain_error(
        fmt::format("quantile(DiscreteWeibull): u must be in [0, 1), got {}", u));
  }
  // cdf(k) >= u  <=>  k + 1 >= scale * (-log(1 - u))^(1/shape).
  const double x = d.scale * std::pow(-std::log1p(-u), 1.0 / d.shape);
  int k = std::max(0, static_cast<int>(std::ceil(x)) - 1);
  // Guard the rounding at bin edges with the cdf itself.
  while (k > 0 && cdf(d, k - 1) >= u) --k;
  while (cdf(d, k) < u) ++k;
  return k;
}
int quantile(const NegativeBinomial& d, double u) {
  check(d, "quantile(NegativeBinomial)");
  return search_quantile(d, u, "quantile(NegativeBinomial)");
}
int quantile(const Poisson& d, double u) {
  check(d, "quantile(Poisson)");
  return search_quantile(d, u, "quantile(Poisson)");
}

DiscreteWeibull weibull_for_mean(double mean_runs, double shape) {
  check_positive("weibull_for_mean", "mean", mean_runs);
  check_positive("weibull_for_mean", "shape", shape);
  // Continuous start: mean = beta + scale * Gamma(1 + 1/shape); then Newton on the discrete
  // mean m(a) = sum_k exp(-(k/a)^g), m'(a) = sum_k exp(-(k/a)^g) g (k/a)^g / a.
  const double g1 = boost::math::tgamma(1.0 + 1.0 / shape);
  double a = (mean_runs - WEIBULL_LOCATION) / g1;
  for (int iter = 0; iter < 100; ++iter) {
    double m = 0.0, dm = 0.0;
    for (int k = 1;; ++k) {
      const double t = std::pow(k / a, shape);
      const double e = std::exp(-t);
      m += e;
      dm += e * shape * t / a;
      if (e < 1e-18 * m || e == 0.0) break;
    }
    double step = (m - mean_runs) / dm;
    if (step > 0.5 * a) step = 0.5 * a;  // keep the scale positive for tiny means
    a -= step;
    if (std::abs(step) <= 1e-15 * a) break;
  }
  return DiscreteWeibull{a, shape};
}

NegativeBinomial negative_binomial_for_mean(double mean_runs, double size) {
  NegativeBinomial d{mean_runs, size};
  check(d, "negative_binomial_for_mean");
  return d;
}

Poisson poisson_for_mean(double mean_runs) {
  Poisson d{mean_runs};
  check(d, "poisson_for_mean");
  return d;
}

namespace {
template <class Dist>
std::vector<double> cdf_table(const Dist& d, double tail) {
  std::vector<double> out;
  for (int k = 0;; ++k) {
    out.push_back(cdf(d, k));
    if (survival(d, k) < tail || k > 100000) break;
  }
  return out;
}
}  // namespace

std::vector<double> score_cdf_table(config::ScoreFamily family, double mean_runs, double shape,
                                    double tail) {
  check_positive("score_cdf_table", "tail", tail);
  switch (family) {
    case config::ScoreFamily::kWeibull:
      return cdf_table(weibull_for_mean(mean_runs, shape), tail);
    case config::ScoreFamily::kNegativeBinomial:
      return cdf_table(negative_binomial_for_mean(mean_runs, shape), tail);
    case config::ScoreFamily::kPoisson:
      return cdf_table(poisson_for_mean(mean_runs), tail);
    case config::ScoreFamily::kLog5:
      break;
  }
  throw std::domain_error("score_cdf_table: family log5 has no score distribution");
}

const char* family_name(config::ScoreFamily family) {
  switch (family) {
    case config::ScoreFamily::kWeibull:
      return "weibull";
    case config::ScoreFamily::kNegativeBinomial:
      return "negative_binomial";
    case config::ScoreFamily::kPoisson:
      return "poisson";
    case config::ScoreFamily::kLog5:
      return "log5";
  }
  return "unknown";
}

}  // namespace standfast::models
