// Tests for engine/streams.h: the fast per-season streams equal make_stream (engine/rng.h),
// whose block scheme is itself checked against pcg's own advance in tests/rng_test.cpp.
// Ref: O'Neill, M. E. (2014), "PCG: A family of simple fast space-efficient statistically good
// algorithms for random number generation", HMC-CS-2014-0905 (LCG jump-ahead is affine).
#include "engine/streams.h"

#include <catch2/catch.hpp>

using namespace standfast::engine;

TEST_CASE("season streams are bit-identical to make_stream") {
  for (std::uint64_t seed : {1ull, 42ull, 0xdeadbeefcafeull}) {
    SeasonStreams streams(seed, 1000);
    for (std::uint64_t s = 1000; s < 1010; ++s) {
      REQUIRE(streams.season() == s);
      for (auto p :
           {Purpose::kStrengths, Purpose::kGames, Purpose::kTiebreak, Purpose::kPostseason}) {
        Rng a = streams.stream(p);
        Rng b = make_stream(seed, s, p);
        for (int i = 0; i < 4; ++i) REQUIRE(a() == b());
      }
      streams.next();
    }
  }
}
