// Tests for models/pythagorean.h.
// References:
//  - Miller, S. J. (2007), "A derivation of the Pythagorean won-loss formula in baseball",
//    Chance 20(1), 40-48: P(X > Y) = (mu_X - beta)^g / ((mu_X - beta)^g + (mu_Y - beta)^g);
//    check values in REFERENCE_VALUES.md section 2 (Boost exp_sinh and SciPy quad, 8 digits).
//  - Direct numerical integration with Boost.Math 1.74 quadrature
//    (boost::math::quadrature::exp_sinh) of  int f_Y(y) (1 - F_X(y)) dy  with
//    boost::math::weibull_distribution, at parameters fitted here.
#include <boost/math/distributions/weibull.hpp>
#include <boost/math/quadrature/exp_sinh.hpp>
#include <catch2/catch.hpp>
#include <cmath>

#include "models/plain_fit.h"
#include "models/pythagorean.h"
#include "models/synthetic.h"

using namespace standfast::models;

namespace {
// P(X > Y) for X ~ Weibull(ax, beta, g), Y ~ Weibull(ay, beta, g), by quadrature over u = y - beta.
double win_prob_quadrature(double ax, double ay, double g) {
  const boost::math::weibull_distribution<double> x(g, ax), y(g, ay);
  boost::math::quadrature::exp_sinh<double> integrator;
  return integrator.integrate([&](double u) {
    return boost::math::pdf(y, u) * boost::math::cdf(boost::math::complement(x, u));
  });
}
}  // namespace

TEST_CASE("Pythagorean formula matches the published check values") {
  // Ref: REFERENCE_VALUES.md s2 (Miller 2007; Boost exp_sinh and SciPy quad agree); 8 digits.
  CHECK(pythagorean_win_prob(5.0, 4.2, 1.83) == Approx(0.57142062).margin(6e-9));
  CHECK(pythagorean_win_prob(4.6, 5.3, 1.83) == Approx(0.44142770).margin(6e-9));
  CHECK(pythagorean_win_prob(5.0, 4.2, 2.0) == Approx(0.57795185).margin(6e-9));
  CHECK(pythagorean_win_prob(4.5, 4.0, 2.0, 0.0) == Approx(20.25 / 36.25).epsilon(1e-15));
  // Ref: same table; alpha_X = (mu - beta) / Gamma(1 + 1/g) = 6.18941536 for mu 5, g 1.83.
  CHECK(continuous_weibull_mean(6.18941536, 1.83) == Approx(5.0).epsilon(1e-8));
  CHECK_THROWS_WITH(pythagorean_win_prob(-1.0, 4.0, 1.8), Catch::Contains("beta"));
  CHECK_THROWS_WITH(pythagorean_win_prob(4.0, 4.0, 0.0), Catch::Contains("gamma"));
}

TEST_CASE("the identity at fitted parameters agrees with Boost quadrature") {
  // Fit the plain model to a generated league, then for each team compare the closed form at
  // its fitted scales (continuous means) with the integral. Ref: Boost.Math 1.74 exp_sinh;
  // agreement to 1e-9 (the quadrature's own error is near 1e-12 for these smooth integrands).
  SyntheticLeague l;
  const int n = 6;
  l.log_offence = synthetic_log_ratings(n, 0.12, 31);
  l.log_defence = synthetic_log_ratings(n, 0.12, 32);
  l.games_within = 16;
  const PlainFit fit = fit_plain(synthetic_sides(l, 33), n, std::nullopt);
  for (int i = 0; i < n; ++i) {
    const double ax = std::exp(fit.teams[i].scored.log_scale);
    const double ay = std::exp(fit.teams[i].allowed.log_scale);
    const double closed = pythagorean_win_prob(continuous_weibull_mean(ax, fit.shape),
                                               continuous_weibull_mean(ay, fit.shape), fit.shape);
    CHECK(closed == Approx(win_prob_quadrature(ax, ay, fit.shape)).margin(1e-9));
  }
}
