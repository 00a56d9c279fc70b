// Tests for models/score_dist.h.
// References:
//  - REFERENCE_VALUES.md section 3 (discretised Weibull, alpha 5, gamma 1.8, beta -0.5), computed
//    there with Boost 1.74 weibull_distribution and SciPy 1.10.1 weibull_min.
//  - Boost.Math weibull_distribution cdf differences, recomputed here.
//  - SciPy scipy.stats.weibull_min through tests/data/models/discrete_weibull_ref.py, run with
//    /usr/bin/python3 when present (skipped with a warning otherwise).
//  - Negative binomial and Poisson: closed-form pmf (lgamma), Boost.Math distributions.
#include <boost/math/distributions/weibull.hpp>
#include <catch2/catch.hpp>
#include <cmath>
#include <cstdio>
#include <filesystem>
#include <pcg_random.hpp>
#include <sstream>
#include <string>
#include <vector>

#include "models/score_dist.h"
#include "tests/process_support.h"

using namespace standfast::models;

namespace {

using standfast::testing::have_python_module;
using standfast::testing::run_command;

bool have_scipy() { return have_python_module("scipy.stats"); }

}  // namespace

TEST_CASE("discretised Weibull matches the published table (REFERENCE_VALUES section 3)") {
  const DiscreteWeibull d{5.0, 1.8};
  // Ref: REFERENCE_VALUES.md s3 (Boost 1.74 weibull cdf differences and SciPy 1.10.1
  // weibull_min(c=1.8, loc=-0.5, scale=5.0)); P(k) and P(score <= k); 8 digits.
  const int ks[] = {0, 1, 2, 3, 4, 5, 6, 10};
  const double p[] = {0.05369390, 0.12114770, 0.15398240, 0.15906266,
                      0.14423390, 0.11841458, 0.08944270, 0.01471949};
  const double c[] = {0.05369390, 0.17484160, 0.32882400, 0.48788666,
                      0.63212056, 0.75053514, 0.83997784, 0.98397985};
  for (int i = 0; i < 8; ++i) {
    CHECK(pmf(d, ks[i]) == Approx(p[i]).margin(6e-9));
    CHECK(cdf(d, ks[i]) == Approx(c[i]).margin(6e-9));
    CHECK(survival(d, ks[i]) == Approx(1.0 - c[i]).margin(6e-9));
  }
  // Ref: REFERENCE_VALUES.md s3; discretised mean 3.94685430, variance 6.61240027; 9 digits.
  CHECK(mean(d) == Approx(3.94685430).margin(6e-9));
  CHECK(variance(d) == Approx(6.61240027).margin(6e-8));
  // The continuous mean beta + alpha Gamma(1 + 1/gamma) = 3.94643366 differs (same source).
  CHECK(std::abs(mean(d) - 3.94643366) > 4e-4);
}

TEST_CASE("discretised Weibull equals Boost.Math Weibull cdf differences") {
  // Ref: Boost.Math 1.74 boost::math::weibull_distribution(shape, scale), cdf(x + 0.5) with the
  // location -0.5 applied as a shift: P(k) = cdf(w, k + 1) - cdf(w, k); relative 1e-12.
  for (double shape : {0.9, 1.5, 1.83, 2.4}) {
    for (double scale : {2.0, 5.0, 7.5}) {
      const boost::math::weibull_distribution<double> w(shape, scale);
      const DiscreteWeibull d{scale, shape};
      double sum = 0;
      for (int k = 0; k < 30; ++k) {
        const double ref = boost::math::cdf(w, k + 1.0) - boost::math::cdf(w, double(k));
        CHECK(pmf(d, k) == Approx(ref).epsilon(1e-12).margin(1e-15));
        CHECK(cdf(d, k) == Approx(boost::math::cdf(w, k + 1.0)).epsilon(1e-13));
        sum += pmf(d, k);
      }
      CHECK(sum + survival(d, 29) == Approx(1.0).epsilon(1e-13));
    }
  }
}

TEST_CASE("discretised Weibull equals SciPy weibull_min bin differences") {
  if (!have_scipy()) {
    WARN("SKIPPED: /usr/bin/python3 with scipy not available; SciPy check not run");
    SUCCEED();
    return;
  }
  for (const auto& [scale, shape] :
       std::vector<std::pair<double, double>>{{5.0, 1.8}, {4.3, 1.72}, {6.1, 2.05}, {3.0, 1.1}}) {
    // Ref: SciPy 1.10.1 scipy.stats.weibull_min(c=shape, loc=-0.5, scale=scale).cdf(k+0.5) -
    // .cdf(k-0.5) via tests/data/models/discrete_weibull_ref.py; relative 1e-10 (SciPy's cdf
    // loses digits in the difference of two values near 1 for k far out).
    const std::string out =
        run_command("/usr/bin/python3 " STANDFAST_TEST_DATA "/models/discrete_weibull_ref.py " +
                    std::to_string(scale) + " " + std::to_string(shape) + " 25");
    REQUIRE(!out.empty());
    std::istringstream in(out);
    const DiscreteWeibull d{std::stod(std::to_string(scale)), std::stod(std::to_string(shape))};
    for (int k = 0; k <= 25; ++k) {
      int kk;
      double p, c;
      in >> kk >> p >> c;
      REQUIRE(kk == k);
      CHECK(pmf(d, k) == Approx(p).epsilon(1e-10).margin(1e-16));
      CHECK(cdf(d, k) == Approx(c).epsilon(1e-12));
    }
    std::string w1, w2;
    double m, v;
    in >> w1 >> m >> w2 >> v;
    REQUIRE(w1 == "mean");
    CHECK(mean(d) == Approx(m).epsilon(1e-10));
    CHECK(variance(d) == Approx(v).epsilon(1e-9));
  }
}

TEST_CASE("weibull_for_mean solves the discretised mean, not the continuous one") {
  // Ref: REFERENCE_VALUES.md s3: scale 5, shape 1.8 has discretised mean 3.94685430.
  const DiscreteWeibull d = weibull_for_mean(3.94685430, 1.8);
  CHECK(d.scale == Approx(5.0).epsilon(1e-8));
  for (double m : {0.3, 2.0, 4.5, 9.0, 20.0}) {
    for (double g : {1.0, 1.83, 3.0}) {
      CHECK(mean(weibull_for_mean(m, g)) == Approx(m).epsilon(1e-13));
    }
  }
}

TEST_CASE("negative binomial and Poisson against closed forms") {
  // Ref: closed form NB pmf Gamma(k+r)/(Gamma(r) k!) p^r (1-p)^k, p = r/(r+mu); Poisson
  // e^-mu mu^k / k!; evaluated with std::lgamma; relative 1e-12.
  const NegativeBinomial nb{4.5, 7.25};
  const Poisson po{4.5};
  const double p = 7.25 / (7.25 + 4.5);
  double cn = 0, cp = 0;
  for (int k = 0; k < 40; ++k) {
    const double ref_nb = std::exp(std::lgamma(k + 7.25) - std::lgamma(7.25) -
                                   std::lgamma(k + 1.0) + 7.25 * std::log(p) + k * std::log1p(-p));
    const double ref_po = std::exp(-4.5 + k * std::log(4.5) - std::lgamma(k + 1.0));
    CHECK(pmf(nb, k) == Approx(ref_nb).epsilon(1e-12));
    CHECK(pmf(po, k) == Approx(ref_po).epsilon(1e-12));
    cn += ref_nb;
    cp += ref_po;
    CHECK(cdf(nb, k) == Approx(cn).epsilon(1e-11));
    CHECK(cdf(po, k) == Approx(cp).epsilon(1e-11));
  }
  CHECK(variance(nb) == Approx(4.5 + 4.5 * 4.5 / 7.25));
  CHECK(variance(po) == 4.5);
}

TEST_CASE("quantile inverts the cdf") {
  const DiscreteWeibull w{4.9, 1.77};
  const NegativeBinomial nb{4.5, 9.0};
  const Poisson po{4.5};
  for (double u : {0.0, 1e-9, 0.05369, 0.2, 0.5, 0.9, 0.999999}) {
    const int a = quantile(w, u), b = quantile(nb, u), c = quantile(po, u);
    CHECK(cdf(w, a) >= u);
    CHECK(cdf(w, a - 1) < u + (a == 0 ? 1.0 : 0.0));
    CHECK(cdf(nb, b) >= u);
    CHECK(cdf(nb, b - 1) < u + (b == 0 ? 1.0 : 0.0));
    CHECK(cdf(po, c) >= u);
    CHECK(cdf(po, c - 1) < u + (c == 0 ? 1.0 : 0.0));
  }
  // Exactly at a bin edge: u = cdf(k) must give k.
  for (int k = 0; k < 12; ++k) CHECK(quantile(w, cdf(w, k)) == k);
}

TEST_CASE("sampler frequencies match the pmf") {
  // Monte Carlo: fixed seed, n = 200000 draws; each bin count is binomial with sd
  // sqrt(n p (1-p)); the bound is 5 sd (at least 4 sd as the test rules ask).
  pcg64 rng(20260101u);
  const DiscreteWeibull w{5.0, 1.8};
  const NegativeBinomial nb{4.5, 6.0};
  const int n = 200000;
  std::vector<int> cw(60), cn(60);
  double sum = 0;
  for (int i = 0; i < n; ++i) {
    const int a = sample(w, rng);
    const int b = sample(nb, rng);
    ++cw[std::min(a, 59)];
    ++cn[std::min(b, 59)];
    sum += a;
  }
  for (int k = 0; k < 15; ++k) {
    const double pw = pmf(w, k), pn = pmf(nb, k);
    CHECK(std::abs(cw[k] - n * pw) < 5 * std::sqrt(n * pw * (1 - pw)));
    CHECK(std::abs(cn[k] - n * pn) < 5 * std::sqrt(n * pn * (1 - pn)));
  }
  CHECK(std::abs(sum / n - mean(w)) < 5 * std::sqrt(variance(w) / n));
}

TEST_CASE("bad parameters throw domain_error naming the parameter") {
  CHECK_THROWS_WITH(pmf(DiscreteWeibull{-1.0, 1.8}, 0),
                    Catch::Contains("scale") && Catch::Contains("-1"));
  CHECK_THROWS_WITH(cdf(DiscreteWeibull{5.0, NAN}, 0), Catch::Contains("shape"));
  CHECK_THROWS_WITH(mean(NegativeBinomial{4.5, 0.0}), Catch::Contains("size"));
  CHECK_THROWS_WITH(pmf(Poisson{INFINITY}, 1), Catch::Contains("mean"));
  CHECK_THROWS_WITH(quantile(Poisson{3.0}, 1.0), Catch::Contains("u must be"));
  CHECK_THROWS_WITH(weibull_for_mean(0.0, 1.8), Catch::Contains("mean"));
  CHECK_THROWS(score_cdf_table(standfast::config::ScoreFamily::kLog5, 4.5, 1.8));
}

TEST_CASE("cdf tables reach the requested tail") {
  using standfast::config::ScoreFamily;
  for (auto f : {ScoreFamily::kWeibull, ScoreFamily::kNegativeBinomial, ScoreFamily::kPoisson}) {
    const auto t = score_cdf_table(f, 4.5, f == ScoreFamily::kWeibull ? 1.8 : 8.0, 1e-12);
    REQUIRE(t.size() > 10);
    CHECK(1.0 - t.back() < 1.1e-12);
    for (size_t k = 1; k < t.size(); ++k) CHECK(t[k] >= t[k - 1]);
  }
}
