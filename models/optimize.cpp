#include "models/optimize.h"

#include <fmt/core.h>

#include <algorithm>
#include <cmath>
#include <stdexcept>

namespace standfast::models {

bool cholesky_factor(std::vector<double>& a, int n) {
  for (int j = 0; j < n; ++j) {
    double d = a[j * n + j];
    for (int k = 0; k < j; ++k) d -= a[j * n + k] * a[j * n + k];
    if (!(d > 0.0) || !std::isfinite(d)) return false;
    const double ljj = std::sqrt(d);
    a[j * n + j] = ljj;
    for (int i = j + 1; i < n; ++i) {
      double s = a[i * n + j];
      for (int k = 0; k < j; ++k) s -= a[i * n + k] * a[j * n + k];
      a[i * n + j] = s / ljj;
    }
    for (int i = 0; i < j; ++i) a[i * n + j] = 0.0;
  }
  return true;
}

void cholesky_solve(const std::vector<double>& l, int n, std::vector<double>& b) {
  for (int i = 0; i < n; ++i) {
    double s = b[i];
    for (int k = 0; k < i; ++k) s -= l[i * n + k] * b[k];
    b[i] = s / l[i * n + i];
  }
  for (int i = n - 1; i >= 0; --i) {
    double s = b[i];
    for (int k = i + 1; k < n; ++k) s -= l[k * n + i] * b[k];
    b[i] = s / l[i * n + i];
  }
}

std::vector<double> spd_inverse(std::vector<double> a, int n) {
  if (!cholesky_factor(a, n)) {
    throw std::domain_error(
        fmt::format("spd_inverse: matrix of dimension {} is not positive definite", n));
  }
  std::vector<double> inv(static_cast<size_t>(n) * n);
  std::vector<double> col(n);
  for (int j = 0; j < n; ++j) {
    std::fill(col.begin(), col.end(), 0.0);
    col[j] = 1.0;
    cholesky_solve(a, n, col);
    for (int i = 0; i < n; ++i) inv[i * n + j] = col[i];
  }
  // Symmetrise against rounding.
  for (int i = 0; i < n; ++i) {
    for (int j = 0; j < i; ++j) {
      const double m = 0.5 * (inv[i * n + j] + inv[j * n + i]);
      inv[i * n + j] = inv[j * n + i] = m;
    }
  }
  return inv;
}

std::vector<double> psd_cholesky(const std::vector<double>& a, int n, double tol) {
  double scale = 0.0;
  for (int i = 0; i < n; ++i) scale = std::max(scale, a[i * n + i]);
  std::vector<double> l(static_cast<size_t>(n) * n, 0.0);
  for (int j = 0; j < n; ++j) {
    double d = a[j * n + j];
    for (int k = 0; k < j; ++k) d -= l[j * n + k] * l[j * n + k];
    if (d < -1e3 * tol * scale) {
      throw std::domain_error(
          fmt::format("psd_cholesky: matrix is not positive semi-definite (pivot {} is {})", j, d));
    }
    if (d <= tol * scale) continue;  // a zero column
    const double ljj = std::sqrt(d);
    l[j * n + j] = ljj;
    for (int i = j + 1; i < n; ++i) {
      double s = a[i * n + j];
      for (int k = 0; k < j; ++k) s -= l[i * n + k] * l[j * n + k];
      l[i * n + j] = s / ljj;
    }
  }
  return l;
}

NewtonResult minimize_newton(const NewtonObjective& f, std::vector<double> x0,
                             const NewtonOptions& options) {
  const int n = static_cast<int>(x0.size());
  NewtonResult r;
  r.x = std::move(x0);
  std::vector<double> g(n), h(static_cast<size_t>(n) * n), step(n), trial(n), l;
  r.value = f(r.x, &g, &h);
  if (!std::isfinite(r.value)) {
    throw std::domain_error("minimize_newton: objective is not finite at the start");
  }
  double damping = 0.0;
  for (r.iterations = 0; r.iterations < options.max_iterations; ++r.iterations) {
    double gmax = 0.0;
    for (double v : g) gmax = std::max(gmax, std::abs(v));
    if (gmax < options.gradient_tolerance) {
      r.converged = true;
      break;
    }
    double hmax = 0.0;
    for (int i = 0; i < n; ++i) hmax = std::max(hmax, std::abs(h[i * n + i]));
    // Damped Newton step: (H + mu I) step = -g, mu grown until the factorisation succeeds.
    for (int attempt = 0;; ++attempt) {
      l = h;
      for (int i = 0; i < n; ++i) l[i * n + i] += damping;
      if (cholesky_factor(l, n)) break;
      damping = std::max(damping * 10.0, 1e-8 * std::max(hmax, 1.0));
      if (attempt > 60) throw std::domain_error("minimize_newton: cannot damp the Hessian");
    }
    for (int i = 0; i < n; ++i) step[i] = -g[i];
    cholesky_solve(l, n, step);
    double slope = 0.0;
    for (int i = 0; i < n; ++i) slope += g[i] * step[i];
    // Backtracking (Armijo) line search.
    double t = 1.0, value = 0.0;
    bool accepted = false;
    for (int k = 0; k < 60; ++k) {
      for (int i = 0; i < n; ++i) trial[i] = r.x[i] + t * step[i];
      value = f(trial, nullptr, nullptr);
      if (std::isfinite(value) && value <= r.value + 1e-4 * t * slope) {
        accepted = true;
        break;
      }
      t *= 0.5;
    }
    double smax = 0.0, xmax = 1.0;
    for (int i = 0; i < n; ++i) {
      smax = std::max(smax, std::abs(t * step[i]));
      xmax = std::max(xmax, std::abs(r.x[i]));
    }
    if (!accepted) {
      // No decrease along the damped direction: at the limit of rounding, or damp more.
      if (smax < 1e3 * options.step_tolerance * xmax) {
        r.converged = gmax < 1e3 * options.gradient_tolerance;
        break;
      }
      damping = std::max(damping * 10.0, 1e-4 * std::max(hmax, 1.0));
      continue;
    }
    r.x = trial;
    const double previous = r.value;
    r.value = f(r.x, &g, &h);
    damping = t == 1.0 ? damping * 0.1 : damping;
    if (damping < 1e-12) damping = 0.0;
    if (smax < options.step_tolerance * xmax &&
        std::abs(previous - r.value) <= 1e-15 * std::abs(r.value)) {
      r.converged = true;
      ++r.iterations;
      break;
    }
  }
  return r;
}

}  // namespace standfast::models
