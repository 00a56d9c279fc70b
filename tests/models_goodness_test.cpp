// Tests for models/goodness.h.
// References:
//  - NIST/SEMATECH e-Handbook of Statistical Methods, section 1.3.6.7.4 "Critical Values of the
//    Chi-Square Distribution" (values in REFERENCE_VALUES.md section 1, 3 decimals published,
//    8 digits recomputed there with Boost 1.74 and SciPy 1.10.1 chi2.isf).
//  - Bonferroni (Dunn 1961, JASA 56(293) 52-64 [from memory]): REFERENCE_VALUES.md section 1,
//    SciPy 1.10.1 chi2.isf(0.05/30, 20) = 43.668221 and chi2.isf(0.05/30, 10) = 28.216396.
//  - Pearson's statistic on a hand example (closed form); AIC = 2k - 2 log L (Akaike 1974,
//    IEEE Trans. Automatic Control 19(6) 716-723 [from memory]).
#include <catch2/catch.hpp>
#include <cmath>

#include "models/goodness.h"
#include "models/joint_fit.h"
#include "models/synthetic.h"

using namespace standfast::models;

TEST_CASE("chi-square critical values match the NIST/SEMATECH table") {
  // Ref: NIST/SEMATECH e-Handbook 1.3.6.7.4, upper-tail table; chi2(10, .05) = 18.307,
  // (10, .01) = 23.209, (20, .05) = 31.410, (20, .01) = 37.566, (30, .05) = 43.773,
  // (30, .01) = 50.892 (3 decimals); 8 digits from REFERENCE_VALUES.md s1 (SciPy chi2.isf).
  struct Row {
    int df;
    double alpha, published, digits8;
  };
  const Row rows[] = {{10, 0.05, 18.307, 18.307038}, {10, 0.01, 23.209, 23.209251},
                      {20, 0.05, 31.410, 31.410433}, {20, 0.01, 37.566, 37.566235},
                      {30, 0.05, 43.773, 43.772972}, {30, 0.01, 50.892, 50.892181}};
  for (const Row& r : rows) {
    const double c = chi_square_critical(r.df, r.alpha);
    CHECK(c == Approx(r.published).margin(0.0005));
    CHECK(c == Approx(r.digits8).margin(6e-7));
    CHECK(chi_square_upper_p(c, r.df) == Approx(r.alpha).epsilon(1e-12));
  }
}

TEST_CASE("Bonferroni-adjusted critical values") {
  // Ref: REFERENCE_VALUES.md s1 [computed, SciPy 1.10.1 chi2.isf(0.05/30, df)]; 8 digits.
  CHECK(bonferroni_critical(20, 0.05, 30) == Approx(43.668221).margin(6e-7));
  CHECK(bonferroni_critical(10, 0.05, 30) == Approx(28.216396).margin(6e-7));
  CHECK_THROWS_WITH(bonferroni_critical(10, 0.05, 0), Catch::Contains("tests"));
  CHECK_THROWS_WITH(chi_square_critical(0, 0.05), Catch::Contains("df"));
  CHECK_THROWS_WITH(chi_square_critical(5, 1.5), Catch::Contains("alpha"));
}

TEST_CASE("bins are pooled until each expects at least 5") {
  // Hand example (closed form): expected 1,2,3,6,8,4,1 and observed 0,3,2,7,9,2,2.
  // Pooling from 0 upward: {0,1,2} e=6, {3} e=6, {4} e=8, {5,6+} e=5.
  const ScoreBins b = pool_bins({0, 3, 2, 7, 9, 2, 2}, {1, 2, 3, 6, 8, 4, 1});
  REQUIRE(b.first == std::vector<int>{0, 3, 4, 5});
  CHECK(b.expected == std::vector<double>{6, 6, 8, 5});
  CHECK(b.observed == std::vector<double>{5, 7, 9, 4});
  // Pearson: (5-6)^2/6 + (7-6)^2/6 + (9-8)^2/8 + (4-5)^2/5 = 1/6 + 1/6 + 1/8 + 1/5.
  CHECK(pearson(b).statistic == Approx(1.0 / 6 + 1.0 / 6 + 1.0 / 8 + 1.0 / 5).epsilon(1e-15));
  CHECK(pearson(b).bins == 4);
  // A short top remainder joins the bin below: 6, 6, 2 -> {0}, {1, 2+}.
  const ScoreBins c = pool_bins({5, 5, 3}, {6, 6, 2});
  CHECK(c.first == std::vector<int>{0, 1});
  CHECK(c.expected == std::vector<double>{6, 8});
  CHECK_THROWS(pool_bins({1}, {1, 2}));
}

TEST_CASE("AIC") {
  // Ref: AIC = 2k - 2 log L (Akaike 1974) [from memory]; closed form.
  CHECK(aic(-100.0, 3) == 206.0);
}

TEST_CASE("per-team tests on data drawn from the fitted family") {
  // Data drawn from the model itself: expected counts sum to the number of sides of each team
  // (each side's probabilities sum to 1 with the open top bin), df as documented, and p-values
  // that are not concentrated near 0. Monte Carlo bound: under the null each of the 2 x 12 p
  // values is about uniform; P(more than 8 of 24 below 0.05) is below 1e-5 (binomial(24, .05)
  // tail, closed form), well beyond 4 sigma.
  SyntheticLeague l;
  const int n = 12;
  l.log_offence = synthetic_log_ratings(n, 0.1, 11);
  l.log_defence = synthetic_log_ratings(n, 0.1, 12);
  l.games_within = 14;
  int small_p = 0;
  for (std::uint64_t seed : {21u, 22u}) {
    const auto sides = synthetic_sides(l, seed);
    JointOptions o;
    const JointFit fit = fit_joint(sides, n, o);
    const auto tests = team_chi_square(sides, n, fit, standfast::config::ScoreFamily::kWeibull);
    REQUIRE(tests.size() == static_cast<size_t>(n));
    for (const auto& t : tests) {
      CHECK(t.df == t.bins_scored + t.bins_allowed - 4);
      CHECK(t.df > 5);
      CHECK(t.p_value >= 0.0);
      CHECK(t.p_value <= 1.0);
      small_p += t.p_value < 0.05 ? 1 : 0;
    }
  }
  CHECK(small_p <= 8);
}
