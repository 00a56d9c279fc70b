// Tests for engine/score_table.h: the fast score samplers against exact pmfs.
// Sources:
//   REFERENCE_VALUES.md section 3 (discretised Weibull, alpha = 5.0, gamma = 1.8, beta = -0.5;
//     Boost 1.74 weibull_distribution and SciPy 1.10.1 weibull_min agree to 8 digits).
//   SciPy 1.10.1 scipy.stats.poisson.pmf and scipy.stats.nbinom.pmf (values quoted below).
// Monte Carlo checks use a fixed seed and 4.5-sigma bounds per cell (STYLE.md asks at least 4
// sigma; the extra half sigma covers the many cells checked at once).
#include "engine/score_table.h"

#include <catch2/catch.hpp>
#include <cmath>
#include <vector>

#include "engine/rng.h"

using namespace standfast::engine;

namespace {

// Frequencies of scores 0..kmax-1 from `n` draws.
template <class Draw>
std::vector<double> frequencies(int n, int kmax, Draw draw) {
  std::vector<double> f(static_cast<std::size_t>(kmax), 0.0);
  for (int i = 0; i < n; ++i) {
    const int k = draw();
    if (k < kmax) f[static_cast<std::size_t>(k)] += 1.0;
  }
  for (auto& v : f) v /= n;
  return f;
}

void check_pmf(const std::vector<double>& freq, const std::vector<double>& pmf, int n) {
  for (std::size_t k = 0; k < pmf.size(); ++k) {
    const double se = std::sqrt(pmf[k] * (1 - pmf[k]) / n);
    INFO("k = " << k << " freq " << freq[k] << " pmf " << pmf[k]);
    CHECK(std::abs(freq[k] - pmf[k]) < 4.5 * se);
  }
}

}  // namespace

TEST_CASE("discrete Weibull mean matches the published value") {
  // Ref: REFERENCE_VALUES.md section 3; sum_{k>=1} exp(-(k/5)^1.8); 3.94685430
  CHECK(discrete_weibull_mean(5.0, 1.8) == Approx(3.94685430).epsilon(1e-8));
  // Ref: SciPy 1.10.1 / NumPy 1.24.2; np.sum(np.exp(-(np.arange(1,400)/4.5)**1.8)); 3.50230017
  CHECK(discrete_weibull_mean(4.5, 1.8) == Approx(3.502300170349888).epsilon(1e-10));
}

TEST_CASE("the scale table inverts the discretised mean") {
  const WeibullTable table(1.8);
  // Ref: REFERENCE_VALUES.md section 3; scale 5.0 has discretised mean 3.94685430 (the
  // continuous mean 3.94643366 must NOT be used: they differ by 4.2e-4).
  CHECK(table.scale_for_mean(3.94685430) == Approx(5.0).epsilon(2e-6));
  // Between grid points the scale is interpolated linearly: relative error in the mean below
  // 1e-5 from one run per game up (below it the relation bends; such means do not occur).
  double worst = 0;
  for (double mean = 1.0; mean < 39.0; mean += 0.0137)
    worst = std::max(worst,
                     std::abs(discrete_weibull_mean(table.scale_for_mean(mean), 1.8) / mean - 1));
  CHECK(worst < 1e-5);
  CHECK(discrete_weibull_mean(table.scale_for_mean(0.3), 1.8) == Approx(0.3).epsilon(1e-3));
}

TEST_CASE("the quantile table follows (-ln(1-u))^(1/gamma)") {
  const WeibullTable table(1.8);
  // Closed form of the quantile of E^(1/gamma), E ~ Exp(1); the linear interpolation error is
  // below 1e-4 absolute everywhere below the exact tail.
  double worst = 0, worst_low = 0;
  for (std::uint64_t b = 0; b < (1ull << 32); b += 999983) {
    const auto bits = static_cast<std::uint32_t>(b);
    const double u = (static_cast<double>(bits) + 0.5) * 0x1.0p-32;
    const double exact = std::pow(-std::log1p(-u), 1 / 1.8);
    (u < 1.0 / 256 ? worst_low : worst) =
        std::max(u < 1.0 / 256 ? worst_low : worst, std::abs(table.quantile(bits) - exact));
  }
  // Largest just below the exact tail (u near 1 - 1/256), where Q bends most.
  CHECK(worst < 1e-4);
  // Below u = 1/256 the quantile has a cusp (u^(1/gamma)); there a * Q < 0.1 for every scale
  // in use, far from the first bin edge at 1, so the error cannot move a score.
  CHECK(worst_low < 5e-3);
  CHECK(table.quantile(0xffffffffu) == Approx(std::pow(-std::log(0.5 * 0x1.0p-32), 1 / 1.8)));
}

TEST_CASE("the paired (SSE2) Weibull paths give exactly the scalar values") {
  // Self-consistency, not a reference: score_pair and scale_pair must equal two calls of score
  // and scale_for_mean bit for bit, including draws in the exact tail and means past the table.
  const WeibullTable table(1.83);
  Rng rng = make_stream(31, 0, Purpose::kGames);
  const double scale[2] = {5.3, 4.1};
  for (int i = 0; i < 200000; ++i) {
    std::uint64_t bits = rng();
    if (i % 50 == 0) bits |= 0xfff0000000000000ull;  // home draw in the exact tail
    if (i % 70 == 0) bits |= 0xfff00000ull;          // away draw in the exact tail
    const WeibullTable::Pair p = table.score_pair(bits, scale);
    REQUIRE(p.home == table.score(static_cast<std::uint32_t>(bits >> 32), scale[0]));
    REQUIRE(p.away == table.score(static_cast<std::uint32_t>(bits), scale[1]));
  }
  for (double m = 0.0; m < 45.0; m += 0.0137) {
    const double mean[2] = {m, 45.0 - m};
    double out[2];
    table.scale_pair(mean, out);
    REQUIRE(out[0] == table.scale_for_mean(mean[0]));
    REQUIRE(out[1] == table.scale_for_mean(mean[1]));
  }
}

TEST_CASE("Weibull scores follow the discretised pmf") {
  const WeibullTable table(1.8);
  // Ref: REFERENCE_VALUES.md section 3 (alpha 5.0, gamma 1.8); P(k) for k = 0..6.
  const std::vector<double> pmf = {0.05369390, 0.12114770, 0.15398240, 0.15906266,
                                   0.14423390, 0.11841458, 0.08944270};
  const int n = 1000000;
  Rng rng = make_stream(2024, 0, Purpose::kGames);
  const auto freq =
      frequencies(n, 7, [&] { return table.score(static_cast<std::uint32_t>(rng() >> 32), 5.0); });
  check_pmf(freq, pmf, n);
  // Ref: REFERENCE_VALUES.md section 3; P(score <= 10) = 0.98397985, so P(score > 10) = 0.01602015.
  Rng rng2 = make_stream(2024, 1, Purpose::kGames);
  int above = 0;
  for (int i = 0; i < n; ++i) above += table.score(static_cast<std::uint32_t>(rng2()), 5.0) > 10;
  const double p = 0.01602015, se = std::sqrt(p * (1 - p) / n);
  CHECK(std::abs(above / double(n) - p) < 4.5 * se);
}

TEST_CASE("Poisson scores follow the Poisson pmf") {
  const CountTable table(CountFamily::kPoisson, 0.0);
  // Ref: SciPy 1.10.1; scipy.stats.poisson.pmf(range(0, 9), 4.5)
  const std::vector<double> pmf = {0.0111089965, 0.0499904844, 0.1124785899,
                                   0.1687178849, 0.1898076205, 0.1708268585,
                                   0.1281201439, 0.0823629496, 0.0463291592};
  for (int k = 0; k < 9; ++k)
    CHECK(table.pmf(k, 4.5) == Approx(pmf[static_cast<std::size_t>(k)]).epsilon(1e-8));
  const int n = 1000000;
  Rng rng = make_stream(7, 0, Purpose::kGames);
  const auto freq = frequencies(n, 9, [&] { return table.score(rng(), 4.5); });
  check_pmf(freq, pmf, n);
}

TEST_CASE("negative binomial scores follow the pmf, also between grid means") {
  const CountTable table(CountFamily::kNegativeBinomial, 3.0);
  // Ref: SciPy 1.10.1; scipy.stats.nbinom.pmf(range(0, 9), 3.0, 3.0 / 7.5)  (mean 4.5, size 3)
  const std::vector<double> pmf = {0.064,      0.1152,      0.13824,      0.13824,     0.124416,
                                   0.10450944, 0.083607552, 0.0644972544, 0.0483729408};
  for (int k = 0; k < 9; ++k)
    CHECK(table.pmf(k, 4.5) == Approx(pmf[static_cast<std::size_t>(k)]).epsilon(1e-8));
  const int n = 1000000;
  Rng rng = make_stream(8, 0, Purpose::kGames);
  const auto freq = frequencies(n, 9, [&] { return table.score(rng(), 4.5); });
  check_pmf(freq, pmf, n);
  // A mean off the grid: the sample mean matches it (the grid mixture keeps the mean exact).
  // NB variance = m + m^2 / r (closed form); 4.5-sigma bound.
  const double m = 4.53125 + 0.01;
  Rng rng2 = make_stream(8, 1, Purpose::kGames);
  double sum = 0;
  for (int i = 0; i < n; ++i) sum += table.score(rng2(), m);
  const double se = std::sqrt((m + m * m / 3.0) / n);
  CHECK(std::abs(sum / n - m) < 4.5 * se);
}

TEST_CASE("bad shapes and sizes are refused") {
  CHECK_THROWS_AS(WeibullTable(0.0), std::domain_error);
  CHECK_THROWS_AS(WeibullTable(std::nan("")), std::domain_error);
  CHECK_THROWS_AS(CountTable(CountFamily::kNegativeBinomial, -1.0), std::domain_error);
}
