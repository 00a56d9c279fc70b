// Tests for models/shrink_spread.h.
// References: the posterior moments against Boost.Math's adaptive Gauss-Kronrod quadrature of
// the same integrals (an independent integrator); the added sampler direction against the
// closed form cov' = cov + sd^2 theta theta^T, with both covariances computed column by column
// (models/strength_sampler.h, sampler_covariance).
#include <boost/math/quadrature/gauss_kronrod.hpp>
#include <catch2/catch.hpp>
#include <cmath>

#include "models/shrink_spread.h"
#include "models/synthetic.h"

using namespace standfast::models;

namespace {

JointFit hand_fit() {
  JointFit f;
  f.teams = 4;
  f.log_offence = {0.12, -0.05, 0.02, -0.09};
  f.log_defence = {-0.04, 0.10, -0.01, -0.05};
  f.variance.assign(f.dimension(), 0.0);
  const double v[] = {0.004, 0.006, 0.005, 0.007};
  for (int i = 0; i < 4; ++i) {
    f.variance[f.offence_index(i)] = v[i];
    f.variance[f.defence_index(i)] = 1.5 * v[i];
  }
  return f;
}

}  // namespace

TEST_CASE("posterior mean and sd of the share kept, against Gauss-Kronrod quadrature") {
  const JointFit f = hand_fit();
  const double dof = 3.0 / 4.0;
  auto log_lik = [&](double tau) {
    double ll = 0.0;
    for (int i = 0; i < 4; ++i) {
      for (int set = 0; set < 2; ++set) {
        const double th = set ? f.log_defence[i] : f.log_offence[i];
        const double v = f.var(set ? f.defence_index(i) : f.offence_index(i));
        ll -= 0.5 * (dof * std::log(tau * tau + v) + th * th / (tau * tau + v));
      }
    }
    return ll;
  };
  auto kept = [&](double tau) {
    double k = 0.0;
    for (int i = 0; i < 4; ++i) {
      k += tau * tau / (tau * tau + f.var(f.offence_index(i)));
      k += tau * tau / (tau * tau + f.var(f.defence_index(i)));
    }
    return k / 8.0;
  };
  using boost::math::quadrature::gauss_kronrod;
  const double shift = log_lik(0.05), top = 1.0;  // max(1, 3 * 0.12)
  auto w = [&](double t) { return std::exp(log_lik(t) - shift); };
  const double z = gauss_kronrod<double, 61>::integrate(w, 0.0, top, 15, 1e-12);
  const double m1 = gauss_kronrod<double, 61>::integrate([&](double t) { return w(t) * kept(t); },
                                                         0.0, top, 15, 1e-12) /
                    z;
  const double m2 = gauss_kronrod<double, 61>::integrate(
                        [&](double t) { return w(t) * kept(t) * kept(t); }, 0.0, top, 15, 1e-12) /
                    z;
  const ShrinkSpread s = shrink_spread(f);
  // The 2,000-point midpoint rule against the adaptive quadrature: relative 1e-4.
  CHECK(s.mean_kept == Approx(m1).epsilon(1e-4));
  CHECK(s.sd_kept == Approx(std::sqrt(m2 - m1 * m1)).epsilon(1e-4));
  // Ref: the quadrature above gives 0.2568; 8 ratings say little about tau, so the spread is
  // far from negligible.
  CHECK(s.sd_kept > 0.2);
}

TEST_CASE("the added direction raises the covariance by sd^2 theta theta^T and nothing else") {
  SyntheticLeague l;
  const int n = 6;
  l.log_offence = synthetic_log_ratings(n, 0.1, 11);
  l.log_defence = synthetic_log_ratings(n, 0.1, 12);
  l.games_within = 4;
  const auto sides = synthetic_sides(l, 13);
  JointOptions o;
  o.prior_precision = 30.0;  // a prior: the sampler has its own low-rank part already
  const JointFit fit = fit_joint(sides, n, o);
  StrengthSampler s = fit.strengths;
  const int rank = s.rank;
  const std::vector<double> before = sampler_covariance(s);
  const double sd = 0.3;
  add_shrink_spread(s, fit, sd);
  CHECK(s.rank == rank + 1);
  const std::vector<double> after = sampler_covariance(s);
  std::vector<double> theta(fit.log_offence);
  theta.insert(theta.end(), fit.log_defence.begin(), fit.log_defence.end());
  for (int i = 0; i < 2 * n; ++i)
    for (int j = 0; j < 2 * n; ++j)
      CHECK(after[i * 2 * n + j] - before[i * 2 * n + j] ==
            Approx(sd * sd * theta[i] * theta[j]).margin(1e-12));
}
