// Random streams and samplers of the league generator (tools/bin/make_league.cpp). They are the
// generator's own, independent of engine/rng.h, so that the committed scenarios stay the same
// when the simulation's streams change. Header-only so tests/make_league_test.cpp can check
// them against independent references.
#ifndef STANDFAST_TOOLS_BIN_LEAGUE_SAMPLING_H
#define STANDFAST_TOOLS_BIN_LEAGUE_SAMPLING_H

#include <algorithm>
#include <boost/math/special_functions/gamma.hpp>
#include <cmath>
#include <cstdint>
#include <pcg_random.hpp>

namespace standfast::tools::gen {

using Rng = pcg64;

// The SplitMix64 finaliser (Steele, Lea & Flood 2014).
inline std::uint64_t mix64(std::uint64_t z) {
  z = (z ^ (z >> 30)) * 0xbf58476d1ce4e5b9ull;
  z = (z ^ (z >> 27)) * 0x94d049bb133111ebull;
  return z ^ (z >> 31);
}

// Stream `stream` of the run with this seed: a pcg64 whose 128-bit state is a hash of both.
inline Rng make_rng(std::uint64_t seed, std::uint64_t stream) {
  constexpr std::uint64_t GOLDEN = 0x9e3779b97f4a7c15ull;
  const std::uint64_t hi = mix64(seed + GOLDEN * (2 * stream + 1));
  const std::uint64_t lo = mix64(hi ^ (seed + GOLDEN * (2 * stream + 2)));
  return Rng((static_cast<pcg_extras::pcg128_t>(hi) << 64) | lo);
}

// Uniform on [0, 1) with 53 random bits.
inline double uniform01(Rng& rng) { return static_cast<double>(rng() >> 11) * 0x1.0p-53; }

// Uniform integer on [0, n), unbiased (pcg's rejection method). n > 0.
inline std::uint64_t uniform_below(Rng& rng, std::uint64_t n) { return rng(n); }

// Standard normal by the Marsaglia polar method (the spare value is dropped).
inline double standard_normal(Rng& rng) {
  for (;;) {
    const double u = 2.0 * uniform01(rng) - 1.0;
    const double v = 2.0 * uniform01(rng) - 1.0;
    const double s = u * u + v * v;
    if (s > 0.0 && s < 1.0) return u * std::sqrt(-2.0 * std::log(s) / s);
  }
}

// Scale a of the Weibull with location -0.5 and shape `shape` whose mean is `mean`:
// mean = -0.5 + a * Gamma(1 + 1/shape).
inline double weibull_scale(double mean, double shape) {
  return (mean + 0.5) / boost::math::tgamma(1.0 + 1.0 / shape);
}

// A score from the discretised Weibull with location -0.5: P(k) = exp(-(k/a)^g) -
// exp(-((k+1)/a)^g) for k = 0, 1, ..., i.e. the unit bin [k - 0.5, k + 0.5) that holds the
// located continuous draw, which is the floor of a Weibull(a, g) draw (inverse cdf).
inline int weibull_score(double mean, double shape, Rng& rng) {
  const double a = weibull_scale(mean, shape);
  const double x = a * std::pow(-std::log1p(-uniform01(rng)), 1.0 / shape);
  return static_cast<int>(std::floor(x));
}

// Runs of one extra half-inning: the side scores with probability m / runs_if_scoring
// (at most 0.95) and then 1 + a geometric number of further runs with mean runs_if_scoring,
// so the expected runs are m.
inline int half_inning_runs(double m, double runs_if_scoring, Rng& rng) {
  const double p_score = std::min(0.95, m / runs_if_scoring);
  if (uniform01(rng) >= p_score) return 0;
  const double q_more = (runs_if_scoring - 1.0) / runs_if_scoring;
  int r = 1;
  while (uniform01(rng) < q_more) ++r;
  return r;
}

}  // namespace standfast::tools::gen

#endif  // STANDFAST_TOOLS_BIN_LEAGUE_SAMPLING_H
