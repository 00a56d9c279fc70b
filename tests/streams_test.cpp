// Tests for engine/streams.h: the per-season cursor gives exactly make_stream (engine/rng.h),
// whose scheme is checked in tests/rng_test.cpp.
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
