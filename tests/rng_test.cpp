// Tests for engine/rng.h: streams depend only on (seed, season, purpose).
// Ref: O'Neill, M. E. (2014), "PCG: A family of simple fast space-efficient statistically good
// algorithms for random number generation", HMC-CS-2014-0905.
#include "engine/rng.h"

#include <catch2/catch.hpp>

using standfast::engine::make_stream;
using standfast::engine::Purpose;

TEST_CASE("a stream starts from the hashed state of its block") {
  // Ref: Steele, Lea & Flood (2014), "Fast splittable pseudorandom number generators", OOPSLA;
  // the SplitMix64 finaliser constants 0xbf58476d1ce4e5b9, 0x94d049bb133111eb (shifts 30, 27,
  // 31). Known answer: mix64(0) = 0 and mix64(1) = 0x5692161d100b05e5 (computed by hand from the
  // definition with Python 3 integers, masked to 64 bits).
  REQUIRE(standfast::engine::mix64(0) == 0);
  REQUIRE(standfast::engine::mix64(1) == 0x5692161d100b05e5ull);
  standfast::engine::Rng direct(standfast::engine::stream_state(12345u, 7 * 4 + 1));
  auto stream = make_stream(12345u, 7, Purpose::kGames);
  for (int i = 0; i < 8; ++i) REQUIRE(stream() == direct());
}

TEST_CASE("the k-th draws of consecutive seasons are independent uniforms") {
  // Regression test: jumping 2^64 steps per block left the low 64 bits of the LCG state equal
  // in every block and biased the first draw of each season (about 0.661 instead of 0.6923).
  // P(U < 0.6923) over 200000 seasons has sd sqrt(p(1-p)/n) = 0.00103 (binomial); 4.5 sigma.
  for (int k = 0; k < 3; ++k) {
    int below = 0;
    const int n = 200000;
    for (int s = 0; s < n; ++s) {
      auto r = make_stream(20261201u, static_cast<std::uint64_t>(s), Purpose::kGames);
      for (int j = 0; j < k; ++j) r();
      below += standfast::engine::uniform01(r) < 0.6923;
    }
    REQUIRE(std::abs(below / double(n) - 0.6923) < 4.5 * 0.00103);
  }
}

TEST_CASE("streams of different seasons and purposes differ and are reproducible") {
  auto a = make_stream(1, 0, Purpose::kGames);
  auto b = make_stream(1, 1, Purpose::kGames);
  auto c = make_stream(1, 0, Purpose::kPostseason);
  auto a2 = make_stream(1, 0, Purpose::kGames);
  const auto x = a();
  REQUIRE(x != b());
  REQUIRE(x != c());
  REQUIRE(x == a2());
}

TEST_CASE("uniform01 lies in [0,1) and its mean is near 1/2") {
  auto rng = make_stream(99, 3, Purpose::kStrengths);
  double sum = 0;
  const int n = 100000;
  for (int i = 0; i < n; ++i) {
    const double u = standfast::engine::uniform01(rng);
    REQUIRE(u >= 0.0);
    REQUIRE(u < 1.0);
    sum += u;
  }
  // Mean of U(0,1) is 1/2 with sd sqrt(1/12/n) = 0.000913 (closed form); allow 5 sigma.
  REQUIRE(std::abs(sum / n - 0.5) < 5 * 0.000913);
}

TEST_CASE("standard_normal has mean 0 and variance 1") {
  auto rng = make_stream(5, 0, Purpose::kStrengths);
  const int n = 200000;
  double s = 0, s2 = 0;
  for (int i = 0; i < n; ++i) {
    const double z = standfast::engine::standard_normal(rng);
    s += z;
    s2 += z * z;
  }
  // sd of the mean = 1/sqrt(n) = 0.002236; sd of the sample variance ~ sqrt(2/n) = 0.003162
  // (closed form for the normal). Bounds of 5 sigma.
  REQUIRE(std::abs(s / n) < 5 * 0.002236);
  REQUIRE(std::abs(s2 / n - 1.0) < 5 * 0.003162);
}
