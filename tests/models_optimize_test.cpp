// Tests for models/optimize.h.
// References: the Rosenbrock function f(x, y) = (1 - x)^2 + 100 (y - x^2)^2 has its only minimum
// at (1, 1) with f = 0 (Rosenbrock, H. H. (1960), The Computer Journal 3(3), 175-184; closed
// form); a convex quadratic 1/2 x'Ax - b'x has its minimum at A^-1 b (closed form); matrix
// factorisations are checked by multiplying back (L L^T = A, A A^-1 = I).
#include <catch2/catch.hpp>
#include <cmath>
#include <vector>

#include "models/optimize.h"

using namespace standfast::models;

TEST_CASE("Newton's method finds the Rosenbrock minimum from the classic start") {
  // Ref: closed form; argmin (1, 1), f = 0; classic start (-1.2, 1) (Rosenbrock 1960).
  const NewtonObjective rosen = [](const std::vector<double>& v, std::vector<double>* g,
                                   std::vector<double>* h) {
    const double x = v[0], y = v[1];
    if (g) *g = {-2 * (1 - x) - 400 * x * (y - x * x), 200 * (y - x * x)};
    if (h) *h = {2 - 400 * (y - x * x) + 800 * x * x, -400 * x, -400 * x, 200};
    return (1 - x) * (1 - x) + 100 * (y - x * x) * (y - x * x);
  };
  for (const auto& start : std::vector<std::vector<double>>{{-1.2, 1.0}, {2.0, -1.0}, {0.0, 3.0}}) {
    const NewtonResult r = minimize_newton(rosen, start);
    CHECK(r.converged);
    CHECK(r.x[0] == Approx(1.0).epsilon(1e-9));
    CHECK(r.x[1] == Approx(1.0).epsilon(1e-9));
    CHECK(r.value < 1e-18);
  }
}

TEST_CASE("Newton's method solves a convex quadratic in one step and damps a saddle") {
  // Ref: closed form; argmin of 1/2 x'Ax - b'x is A^-1 b = (1, -1) for A = [[4,1],[1,3]],
  // b = (3, -2).
  const NewtonObjective quad = [](const std::vector<double>& v, std::vector<double>* g,
                                  std::vector<double>* h) {
    if (g) *g = {4 * v[0] + v[1] - 3, v[0] + 3 * v[1] + 2};
    if (h) *h = {4, 1, 1, 3};
    return 0.5 * (4 * v[0] * v[0] + 2 * v[0] * v[1] + 3 * v[1] * v[1]) - 3 * v[0] + 2 * v[1];
  };
  const NewtonResult r = minimize_newton(quad, {10.0, 10.0});
  CHECK(r.converged);
  CHECK(r.iterations <= 2);
  CHECK(r.x[0] == Approx(1.0).epsilon(1e-12));
  CHECK(r.x[1] == Approx(-1.0).epsilon(1e-12));
  // f = x^4/4 - x^2/2 + y^2 has an indefinite Hessian at x = 0.1; minima at x = +-1, y = 0
  // (closed form).
  const NewtonObjective w = [](const std::vector<double>& v, std::vector<double>* g,
                               std::vector<double>* h) {
    if (g) *g = {v[0] * v[0] * v[0] - v[0], 2 * v[1]};
    if (h) *h = {3 * v[0] * v[0] - 1, 0, 0, 2};
    return std::pow(v[0], 4) / 4 - v[0] * v[0] / 2 + v[1] * v[1];
  };
  const NewtonResult s = minimize_newton(w, {0.1, 0.5});
  CHECK(s.converged);
  CHECK(std::abs(s.x[0]) == Approx(1.0).epsilon(1e-9));
  CHECK(s.x[1] == Approx(0.0).margin(1e-9));
}

TEST_CASE("Cholesky factor, solve, inverse and the semi-definite factor") {
  const int n = 3;
  const std::vector<double> a = {4, 2, 0.4, 2, 5, 1, 0.4, 1, 3};
  std::vector<double> l = a;
  REQUIRE(cholesky_factor(l, n));
  for (int i = 0; i < n; ++i) {
    for (int j = 0; j < n; ++j) {
      double s = 0;
      for (int k = 0; k < n; ++k) s += l[i * n + k] * l[j * n + k];
      CHECK(s == Approx(a[i * n + j]).epsilon(1e-14));
    }
  }
  std::vector<double> b = {1, 2, 3};
  cholesky_solve(l, n, b);
  for (int i = 0; i < n; ++i) {
    double s = 0;
    for (int k = 0; k < n; ++k) s += a[i * n + k] * b[k];
    CHECK(s == Approx(i + 1.0).epsilon(1e-14));
  }
  const std::vector<double> inv = spd_inverse(a, n);
  for (int i = 0; i < n; ++i) {
    for (int j = 0; j < n; ++j) {
      double s = 0;
      for (int k = 0; k < n; ++k) s += a[i * n + k] * inv[k * n + j];
      CHECK(s == Approx(i == j ? 1.0 : 0.0).margin(1e-14));
    }
  }
  std::vector<double> bad = {1, 2, 2, 1};
  CHECK_FALSE(cholesky_factor(bad, 2));
  CHECK_THROWS_WITH(spd_inverse({1, 2, 2, 1}, 2), Catch::Contains("not positive definite"));
  // A covariance of three values summing to zero (rank 2): I - J/3.
  std::vector<double> c(9);
  for (int i = 0; i < 3; ++i)
    for (int j = 0; j < 3; ++j) c[i * 3 + j] = (i == j ? 1.0 : 0.0) - 1.0 / 3.0;
  const std::vector<double> lc = psd_cholesky(c, 3);
  for (int i = 0; i < 3; ++i) {
    for (int j = 0; j < 3; ++j) {
      double s = 0;
      for (int k = 0; k < 3; ++k) s += lc[i * 3 + k] * lc[j * 3 + k];
      CHECK(s == Approx(c[i * 3 + j]).margin(1e-14));
    }
    for (int j = i + 1; j < 3; ++j) CHECK(lc[i * 3 + j] == 0.0);
  }
  CHECK_THROWS_WITH(psd_cholesky({1, 0, 0, -1}, 2), Catch::Contains("semi-definite"));
}
