// Random streams for the simulation. Every simulated season owns one stream per purpose, keyed
// by the block number b = season * kPurposeCount + purpose: the stream is a pcg64 whose 128-bit
// starting state is a strong hash (the SplitMix64 finaliser, Steele, Lea & Flood 2014) of
// (seed, b), so a season's numbers depend only on (seed, season, purpose), never on the thread
// that runs it. (An earlier scheme jumped 2^64 steps per block; with a power-of-two LCG that
// leaves the low 64 state bits equal in every block and made the k-th draws of different
// seasons strongly correlated: see tests/rng_test.cpp.) Samplers here are our own: std::
// distributions differ between standard libraries.
#ifndef STANDFAST_ENGINE_RNG_H
#define STANDFAST_ENGINE_RNG_H

#include <cmath>
#include <cstddef>
#include <cstdint>
#include <pcg_random.hpp>

namespace standfast::engine {

using Rng = pcg64;

enum class Purpose : std::uint32_t {
  kStrengths = 0,   // the season's true team strengths
  kGames = 1,       // remaining regular-season games
  kTiebreak = 2,    // draws and extra tiebreak games
  kPostseason = 3,  // the bracket
};
inline constexpr std::uint64_t kPurposeCount = 4;

// The SplitMix64 finaliser (a bijection of 64-bit words with full avalanche).
inline std::uint64_t mix64(std::uint64_t z) {
  z = (z ^ (z >> 30)) * 0xbf58476d1ce4e5b9ull;
  z = (z ^ (z >> 27)) * 0x94d049bb133111ebull;
  return z ^ (z >> 31);
}

// 64 random bits for item (a, b) under `key`: output number a * 2^20 + b + 1 of the SplitMix64
// generator started at `key` (Steele, Lea & Flood 2014), so any item is reached without
// drawing the ones before it. a < 2^44, b < 2^20.
inline std::uint64_t keyed_bits(std::uint64_t key, std::uint64_t a, std::uint64_t b) {
  return mix64(key + ((a << 20 | b) + 1) * 0x9e3779b97f4a7c15ull);
}

// The 128-bit starting state of block `block` of the run with this seed.
pcg_extras::pcg128_t stream_state(std::uint64_t seed, std::uint64_t block);

// The stream of one purpose of one simulated season: pcg64(stream_state(seed, b)) with
// b = season * kPurposeCount + purpose.
Rng make_stream(std::uint64_t seed, std::uint64_t season, Purpose purpose);

// Uniform on [0, 1) with 53 random bits.
inline double uniform01(Rng& rng) { return static_cast<double>(rng() >> 11) * 0x1.0p-53; }

// Uniform integer on [0, n), unbiased (pcg's rejection method). n > 0.
inline std::uint64_t uniform_below(Rng& rng, std::uint64_t n) { return rng(n); }

// One accepted pair of the Marsaglia polar method: u f and v f are two independent standard
// normals.
struct PolarPair {
  double u, v, f;
};
inline PolarPair polar_pair(Rng& rng) {
  for (;;) {
    const double u = 2.0 * uniform01(rng) - 1.0;
    const double v = 2.0 * uniform01(rng) - 1.0;
    const double s = u * u + v * v;
    if (s > 0.0 && s < 1.0) return {u, v, std::sqrt(-2.0 * std::log(s) / s)};
  }
}

// Standard normal, one value per call: the pair's second value is dropped, so a call always
// uses one accepted pair of the stream.
inline double standard_normal(Rng& rng) {
  const PolarPair p = polar_pair(rng);
  return p.u * p.f;
}

// n standard normals, both values of each pair used (the last pair's second value is dropped
// when n is odd). Half the work of n calls to standard_normal.
inline void standard_normals(Rng& rng, double* out, std::size_t n) {
  for (std::size_t i = 0; i < n; i += 2) {
    const PolarPair p = polar_pair(rng);
    out[i] = p.u * p.f;
    if (i + 1 < n) out[i + 1] = p.v * p.f;
  }
}

}  // namespace standfast::engine

#endif  // STANDFAST_ENGINE_RNG_H
