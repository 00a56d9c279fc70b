// Small dense linear algebra and a damped Newton minimiser for the likelihood fits.
// Matrices are row-major std::vector<double> of dimension n x n. The one-dimensional searches
// use Boost.Math (boost::math::tools::brent_find_minima) in the fits themselves.
#ifndef STANDFAST_MODELS_OPTIMIZE_H
#define STANDFAST_MODELS_OPTIMIZE_H

#include <functional>
#include <vector>

namespace standfast::models {

// In-place Cholesky factorisation A = L L^T of a symmetric positive definite matrix; on success
// the lower triangle holds L and the strict upper triangle is zeroed. Returns false (A then
// unspecified) when a pivot is not positive.
bool cholesky_factor(std::vector<double>& a, int n);

// Solves L L^T x = b in place, with L from cholesky_factor.
void cholesky_solve(const std::vector<double>& l, int n, std::vector<double>& b);

// Inverse of a symmetric positive definite matrix; throws std::domain_error when it is not.
std::vector<double> spd_inverse(std::vector<double> a, int n);

// Lower-triangular L with L L^T = A for a symmetric positive SEMI-definite A (for example a
// covariance with a sum-to-zero constraint): a pivot below tol * (largest diagonal) gives a zero
// column. Throws std::domain_error when a pivot is clearly negative.
std::vector<double> psd_cholesky(const std::vector<double>& a, int n, double tol = 1e-10);

// Objective for minimize_newton: returns f(x); fills the gradient and the Hessian (row-major)
// when the pointers are not null.
using NewtonObjective = std::function<double(
    const std::vector<double>& x, std::vector<double>* gradient, std::vector<double>* hessian)>;

struct NewtonOptions {
  int max_iterations = 100;
  double gradient_tolerance = 1e-8;  // stop when max |gradient| falls below this
  double step_tolerance = 1e-12;     // ... or when the relative step falls below this
};

struct NewtonResult {
  std::vector<double> x;
  double value = 0.0;
  int iterations = 0;
  bool converged = false;
};

// Newton's method with Levenberg damping (a multiple of the identity is added while the Hessian
// is not positive definite) and a backtracking line search that never accepts an increase.
NewtonResult minimize_newton(const NewtonObjective& f, std::vector<double> x0,
                             const NewtonOptions& options = {});

}  // namespace standfast::models

#endif  // STANDFAST_MODELS_OPTIMIZE_H
