// Fast score samplers built once per run (the shape of the league does not change within a
// run, only the means do).
//
// Discretised Weibull (location -1/2): a score with scale a is floor(a * Q(u)), where
// Q(u) = (-ln(1 - u))^(1/gamma) is the quantile of E^(1/gamma), E ~ Exp(1): the bin of
// X = a * E^(1/gamma) - 1/2 that holds X is [k - 1/2, k + 1/2) exactly when floor(a * Q) = k.
// Q is tabulated on 4096 cells of u with linear interpolation on a 32-bit uniform: each cell holds
// its start value and its slope in float (32 KiB), so one 8-byte load serves a draw, and the two
// scores of a game are computed side by side in one SSE2 register (score_pair; the same
// arithmetic as score, so the results are identical). The top 16 cells (u > 1 - 1/256, where
// Q bends sharply) are computed exactly. The
// scale that makes the DISCRETISED mean equal a given mean is the continuous one,
// (mean + 1/2) / Gamma(1 + 1/gamma), plus a small correction tabulated on a grid of means (step
// 1/16 up to 40, linear interpolation; above 40 the correction is left out: below 1e-5).
// Both tables together stay well inside a core's L1 data cache.
//
// Negative binomial and Poisson: cdf rows on a grid of means (step 1/16); a draw picks one of
// the two rows around the mean at random with linear weights (so the mean is exact and the
// variance is off by at most (1/32)^2) and searches the row.
#ifndef STANDFAST_ENGINE_SCORE_TABLE_H
#define STANDFAST_ENGINE_SCORE_TABLE_H

#include <cstdint>
#include <vector>

#if defined(__SSE2__)
#include <emmintrin.h>
#endif

namespace standfast::engine {

// Discretised mean of the Weibull score with this scale and shape: sum_{k>=1} exp(-(k/a)^g).
double discrete_weibull_mean(double scale, double shape);

class WeibullTable {
 public:
  static constexpr int CELL_BITS = 12;
  static constexpr int FRAC_BITS = 32 - CELL_BITS;
  static constexpr std::uint32_t FRAC_MASK = (1u << FRAC_BITS) - 1u;
  static constexpr std::uint32_t TAIL_START = (4096u - 16u) << FRAC_BITS;
  static constexpr double MEAN_STEP = 1.0 / 16.0;
  static constexpr double MAX_TABLE_MEAN = 40.0;

  WeibullTable() = default;
  explicit WeibullTable(double shape);

  double shape() const { return shape_; }

  // Q(u) for u = (bits + 1/2) / 2^32: the cell's value at its first point plus frac x slope.
  double quantile(std::uint32_t bits) const {
    if (bits >= TAIL_START) [[unlikely]]
      return exact_quantile(bits);
    const float* c = cells_.data() + 2 * (bits >> FRAC_BITS);
    const double f = static_cast<double>(bits & FRAC_MASK) * (1.0 / (1 << FRAC_BITS));
    return static_cast<double>(c[0]) + f * static_cast<double>(c[1]);
  }
  double exact_quantile(std::uint32_t bits) const;

  // Scale whose discretised mean is `mean` (mean >= 0): the continuous scale plus the tabulated
  // correction, interpolated linearly, which within a cell of the grid is a line in the mean,
  // stored as intercept and slope.
  double scale_for_mean(double mean) const {
    const double x = mean * (1.0 / MEAN_STEP);
    if (!(x < last_index_)) [[unlikely]]
      return (mean + 0.5) * inv_gamma_;
    const double* line = lines_.data() + 2 * static_cast<std::size_t>(x);
    return line[0] + line[1] * mean;
  }

  // scale_for_mean of mean[0] and mean[1] into scale[0] and scale[1], side by side in one SSE2
  // register (the same values).
  void scale_pair(const double* mean, double* scale) const {
#if defined(__SSE2__)
    const __m128d m = _mm_loadu_pd(mean);
    const __m128d x = _mm_mul_pd(m, _mm_set1_pd(1.0 / MEAN_STEP));
    if (_mm_movemask_pd(_mm_cmplt_pd(x, _mm_set1_pd(last_index_))) != 3) [[unlikely]] {
      scale[0] = scale_for_mean(mean[0]);
      scale[1] = scale_for_mean(mean[1]);
      return;
    }
    const __m128i i = _mm_cvttpd_epi32(x);
    const __m128d l0 = _mm_loadu_pd(lines_.data() + 2 * _mm_cvtsi128_si32(i));
    const __m128d l1 = _mm_loadu_pd(lines_.data() + 2 * _mm_cvtsi128_si32(_mm_shuffle_epi32(i, 1)));
    const __m128d intercept = _mm_unpacklo_pd(l0, l1);
    const __m128d slope = _mm_unpackhi_pd(l0, l1);
    _mm_storeu_pd(scale, _mm_add_pd(intercept, _mm_mul_pd(slope, m)));
#else
    scale[0] = scale_for_mean(mean[0]);
    scale[1] = scale_for_mean(mean[1]);
#endif
  }

  // One score of a side with this scale.
  int score(std::uint32_t bits, double scale) const {
    return static_cast<int>(scale * quantile(bits));
  }

  // Both scores of a game from 64 random bits, home from the high 32 and away from the low 32,
  // with scale[0] (home) and scale[1] (away): the same values as two calls of score.
  struct Pair {
    int home, away;
  };
  Pair score_pair(std::uint64_t bits, const double* scale) const {
    const auto uh = static_cast<std::uint32_t>(bits >> 32);
    const auto ua = static_cast<std::uint32_t>(bits);
#if defined(__SSE2__)
    if ((uh >= TAIL_START) | (ua >= TAIL_START)) [[unlikely]]
      return {score(uh, scale[0]), score(ua, scale[1])};
    const float* ch = cells_.data() + 2 * (uh >> FRAC_BITS);
    const float* ca = cells_.data() + 2 * (ua >> FRAC_BITS);
    const __m128 cells = _mm_unpacklo_ps(  // start_h, start_a, slope_h, slope_a
        _mm_castsi128_ps(_mm_loadl_epi64(reinterpret_cast<const __m128i*>(ch))),
        _mm_castsi128_ps(_mm_loadl_epi64(reinterpret_cast<const __m128i*>(ca))));
    const __m128d start = _mm_cvtps_pd(cells);
    const __m128d slope = _mm_cvtps_pd(_mm_movehl_ps(cells, cells));
    const __m128d frac =
        _mm_mul_pd(_mm_cvtepi32_pd(_mm_set_epi32(0, 0, static_cast<int>(ua & FRAC_MASK),
                                                 static_cast<int>(uh & FRAC_MASK))),
                   _mm_set1_pd(1.0 / (1 << FRAC_BITS)));
    const __m128d q = _mm_add_pd(start, _mm_mul_pd(frac, slope));
    const __m128i s = _mm_cvttpd_epi32(_mm_mul_pd(_mm_loadu_pd(scale), q));
    return {_mm_cvtsi128_si32(s), _mm_cvtsi128_si32(_mm_shuffle_epi32(s, 1))};
#else
    return {score(uh, scale[0]), score(ua, scale[1])};
#endif
  }

 private:
  double shape_ = 0;
  double inv_shape_ = 0;
  double inv_gamma_ = 0;       // 1 / Gamma(1 + 1/shape)
  std::vector<float> cells_;   // per cell i < 4096: Q at (i 2^20 + 1/2) / 2^32, then slope
  std::vector<double> lines_;  // per cell of the mean grid: intercept, slope
  double last_index_ = 0;      // cells in the mean grid
};

enum class CountFamily { kNegativeBinomial, kPoisson };

class CountTable {
 public:
  static constexpr double MEAN_STEP = 1.0 / 16.0;
  static constexpr double MAX_MEAN = 40.0;
  static constexpr int MAX_SCORE = 2000;  // no draw is larger

  CountTable() = default;
  // size: negative-binomial size r (ignored for Poisson).
  CountTable(CountFamily family, double size);

  // One score with this mean (clamped to [0, MAX_MEAN]) from 64 random bits.
  int score(std::uint64_t bits, double mean) const {
    double x = mean * (1.0 / MEAN_STEP);
    if (x < 0) x = 0;
    if (x > MAX_MEAN / MEAN_STEP - 1e-9) x = MAX_MEAN / MEAN_STEP - 1e-9;
    auto row = static_cast<std::size_t>(x);
    const double f = x - static_cast<double>(row);
    const double pick = static_cast<double>(bits & 0xffffffffu) * 0x1.0p-32;
    if (pick < f) ++row;
    const double u = static_cast<double>(bits >> 32) * 0x1.0p-32;
    const double* c = cdf_.data() + offset_[row];
    const double* end = cdf_.data() + offset_[row + 1];
    const double* p = c;
    while (p < end - 1 && u >= *p) ++p;
    return static_cast<int>(p - c);
  }

  // Exact pmf used to build the rows.
  double pmf(int k, double mean) const;

 private:
  CountFamily family_ = CountFamily::kPoisson;
  double size_ = 0;
  std::vector<double> cdf_;          // rows of P(score <= k)
  std::vector<std::size_t> offset_;  // row starts; size rows + 1
};

}  // namespace standfast::engine

#endif  // STANDFAST_ENGINE_SCORE_TABLE_H
