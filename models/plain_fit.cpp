#include "models/plain_fit.h"

#include <fmt/core.h>

#include <boost/math/special_functions/gamma.hpp>
#include <boost/math/tools/minima.hpp>
#include <cmath>
#include <cstdint>
#include <stdexcept>

#include "models/score_dist.h"

namespace standfast::models {
namespace {

constexpr double SHAPE_LO = -0.5108256237659907;  // log 0.6
constexpr double SHAPE_HI = 1.791759469228055;    // log 6
constexpr int BRENT_BITS = 40;

double sample_loglik(const std::vector<double>& y, double log_scale, double shape,
                     double* d1 = nullptr, double* d2 = nullptr) {
  double v = 0.0, g = 0.0, h = 0.0;
  for (double s : y) {
    const LogLikTerms t = weibull_loglik_log_scale(s, log_scale, shape);
    v += t.value;
    g += t.d1;
    h += t.d2;
  }
  if (d1) *d1 = g;
  if (d2) *d2 = h;
  return v;
}

// d log m / d log a by central differences of the discretised mean.
double log_mean_slope(double log_scale, double shape) {
  const double h = 1e-5;
  const double up = std::log(mean(DiscreteWeibull{std::exp(log_scale + h), shape}));
  const double dn = std::log(mean(DiscreteWeibull{std::exp(log_scale - h), shape}));
  return (up - dn) / (2.0 * h);
}

// Profile log-likelihood of several samples sharing one shape.
double profile(const std::vector<const std::vector<double>*>& samples, double shape) {
  double total = 0.0;
  for (const auto* y : samples) {
    if (y->empty()) continue;
    double ll = 0.0;
    fit_log_scale(*y, shape, &ll);
    total += ll;
  }
  return total;
}

double best_shape(const std::vector<const std::vector<double>*>& samples, bool* converged) {
  std::uintmax_t iters = 200;
  const auto r = boost::math::tools::brent_find_minima(
      [&](double s) { return -profile(samples, std::exp(s)); }, SHAPE_LO, SHAPE_HI, BRENT_BITS,
      iters);
  if (converged && iters >= 200) *converged = false;
  return std::exp(r.first);
}

// Observed-information variances for samples sharing a shape (arrow Hessian in
// (log a_1..log a_m, log g)); `shape_weight` scales the shape's information (1/2 for the
// composite league fit). Returns var(log g) and fills var(log a_j).
double arrow_variances(const std::vector<const std::vector<double>*>& samples,
                       const std::vector<double>& log_scales, double shape, double shape_weight,
                       std::vector<double>& var_scales) {
  const double h = 1e-4, s = std::log(shape);
  double c = 0.0, schur = 0.0;
  std::vector<double> d(samples.size()), b(samples.size());
  for (size_t j = 0; j < samples.size(); ++j) {
    const auto& y = *samples[j];
    if (y.empty()) continue;
    double g0, h0, gp, gm;
    const double f0 = sample_loglik(y, log_scales[j], shape, &g0, &h0);
    const double fp = sample_loglik(y, log_scales[j], std::exp(s + h), &gp);
    const double fm = sample_loglik(y, log_scales[j], std::exp(s - h), &gm);
    d[j] = -h0;
    b[j] = -(gp - gm) / (2.0 * h);
    c += -(fp - 2.0 * f0 + fm) / (h * h);
  }
  for (size_t j = 0; j < samples.size(); ++j) {
    if (samples[j]->empty() || !(d[j] > 0.0)) continue;
    schur += b[j] * b[j] / d[j];
  }
  const double info_shape = shape_weight * c - shape_weight * schur;
  const double var_shape = info_shape > 0.0 ? 1.0 / info_shape : 0.0;
  var_scales.assign(samples.size(), 0.0);
  for (size_t j = 0; j < samples.size(); ++j) {
    if (samples[j]->empty() || !(d[j] > 0.0)) continue;
    var_scales[j] = 1.0 / d[j] + (b[j] / d[j]) * (b[j] / d[j]) * var_shape;
  }
  return var_shape;
}

}  // namespace

double fit_log_scale(const std::vector<double>& y, double shape, double* log_lik,
                     double* information) {
  if (y.empty()) throw std::domain_error("fit_log_scale: empty sample");
  double m = 0.0;
  for (double v : y) m += v;
  m /= y.size();
  double x = std::log((m + 0.5) / boost::math::tgamma(1.0 + 1.0 / shape));
  double d1 = 0.0, d2 = 0.0;
  double f = sample_loglik(y, x, shape, &d1, &d2);
  for (int iter = 0; iter < 100; ++iter) {
    double step = d2 < 0.0 ? -d1 / d2 : (d1 > 0.0 ? 0.5 : -0.5);
    step = std::clamp(step, -1.0, 1.0);
    double t = 1.0, fn = f, g1 = d1, g2 = d2;
    for (int k = 0; k < 50; ++k) {
      fn = sample_loglik(y, x + t * step, shape, &g1, &g2);
      if (fn >= f - 1e-12 * std::abs(f)) break;
      t *= 0.5;
    }
    x += t * step;
    f = fn;
    d1 = g1;
    d2 = g2;
    if (std::abs(t * step) < 1e-12) break;
  }
  if (log_lik) *log_lik = f;
  if (information) *information = -d2;
  return x;
}

PlainFit fit_plain(const std::vector<Side>& sides, int n, std::optional<double> fixed_shape) {
  if (sides.empty()) throw std::domain_error("fit_plain: no played games to fit");
  if (fixed_shape && !(*fixed_shape > 0.0 && std::isfinite(*fixed_shape))) {
    throw std::domain_error(fmt::format("fit_plain: shape must be > 0, got {}", *fixed_shape));
  }
  std::vector<std::vector<double>> scored(n), allowed(n);
  for (const Side& s : sides) {
    if (s.batting < 0 || s.batting >= n || s.fielding < 0 || s.fielding >= n) {
      throw std::domain_error(fmt::format("fit_plain: side with team index out of range ({}, {})",
                                          s.batting, s.fielding));
    }
    scored[s.batting].push_back(s.y);
    allowed[s.fielding].push_back(s.y);
  }
  std::vector<const std::vector<double>*> all;
  for (int i = 0; i < n; ++i) all.push_back(&scored[i]);
  for (int i = 0; i < n; ++i) all.push_back(&allowed[i]);

  PlainFit fit;
  fit.shape = fixed_shape ? *fixed_shape : best_shape(all, &fit.converged);
  std::vector<double> log_scales(2 * n, 0.0);
  for (int j = 0; j < 2 * n; ++j) {
    if (all[j]->empty()) continue;
    double ll = 0.0;
    log_scales[j] = fit_log_scale(*all[j], fit.shape, &ll);
    if (j < n) fit.log_lik += ll;
  }
  std::vector<double> var_scales;
  if (!fixed_shape) {
    const double var_shape = arrow_variances(all, log_scales, fit.shape, 0.5, var_scales);
    fit.shape_se = fit.shape * std::sqrt(var_shape);
  } else {
    // A fixed shape carries no uncertainty: conditional variances.
    var_scales.assign(2 * n, 0.0);
    for (int j = 0; j < 2 * n; ++j) {
      if (all[j]->empty()) continue;
      double info = 0.0;
      fit_log_scale(*all[j], fit.shape, nullptr, &info);
      var_scales[j] = info > 0.0 ? 1.0 / info : 0.0;
    }
  }
  fit.teams.resize(n);
  for (int i = 0; i < n; ++i) {
    for (int side = 0; side < 2; ++side) {
      const int j = side * n + i;
      PlainSample& ps = side == 0 ? fit.teams[i].scored : fit.teams[i].allowed;
      ps.count = static_cast<int>(all[j]->size());
      if (ps.count == 0) continue;
      ps.log_scale = log_scales[j];
      ps.log_scale_se = std::sqrt(var_scales[j]);
      ps.mean = mean(DiscreteWeibull{std::exp(ps.log_scale), fit.shape});
      ps.log_mean_se = log_mean_slope(ps.log_scale, fit.shape) * ps.log_scale_se;
    }
    // The team's own shape from its two samples (diagnosis only).
    if (scored[i].size() >= 5 && allowed[i].size() >= 5) {
      const std::vector<const std::vector<double>*> own{&scored[i], &allowed[i]};
      bool ok = true;
      const double g = best_shape(own, &ok);
      std::vector<double> own_scales{fit_log_scale(scored[i], g), fit_log_scale(allowed[i], g)};
      std::vector<double> unused;
      const double v = arrow_variances(own, own_scales, g, 1.0, unused);
      fit.teams[i].free_shape = g;
      fit.teams[i].free_shape_se = g * std::sqrt(v);
    }
  }
  return fit;
}

}  // namespace standfast::models
