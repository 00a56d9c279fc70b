// Random streams and samplers of the league generator (tools/bin/make_league.cpp). Its streams
// are keyed its own way, independent of engine/rng.h's make_stream, so that the committed
// scenarios stay the same when the simulation's streams change. Header-only so
// tests/make_league_test.cpp can check them against independent references.
#ifndef STANDFAST_TOOLS_BIN_LEAGUE_SAMPLING_H
#define STANDFAST_TOOLS_BIN_LEAGUE_SAMPLING_H

#include <algorithm>
#include <boost/math/special_functions/gamma.hpp>
#include <cmath>
#include <cstdint>
#include <pcg_random.hpp>

#include "engine/rng.h"

namespace standfast::tools::gen {

// The samplers and the SplitMix64 finaliser are the engine's (engine/rng.h); only the way the
// generator keys its streams is its own.
using engine::mix64;
using engine::Rng;
using engine::standard_normal;
using engine::uniform01;
using engine::uniform_below;

// Stream `stream` of the run with this seed: a pcg64 whose 128-bit state is a hash of both.
inline Rng make_rng(std::uint64_t seed, std::uint64_t stream) {
  constexpr std::uint64_t GOLDEN = 0x9e3779b97f4a7c15ull;
  const std::uint64_t hi = mix64(seed + GOLDEN * (2 * stream + 1));
  const std::uint64_t lo = mix64(hi ^ (seed + GOLDEN * (2 * stream + 2)));
  return Rng((static_cast<pcg_extras::pcg128_t>(hi) << 64) | lo);
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
