// Tests for engine/tally.h: integer tallies, their merge, and the statistics drawn from them.
// Sources: REFERENCE_VALUES.md section 8 (SE = sqrt(p(1-p)/N): p = 0.25, N = 1e4 gives
// 0.00433013; p = 0.5, N = 1e4 gives 0.005); percentiles of integer histograms counted by hand.
#include "engine/tally.h"

#include <catch2/catch.hpp>

#include "engine/simulate.h"

using namespace standfast::engine;

TEST_CASE("probability and its Monte Carlo standard error") {
  // Ref: REFERENCE_VALUES.md section 8; sqrt(0.25 * 0.75 / 1e4) = 0.00433013.
  CHECK(probability(2500, 10000).p == 0.25);
  CHECK(probability(2500, 10000).se == Approx(0.00433013).epsilon(1e-6));
  CHECK(probability(5000, 10000).se == Approx(0.005).epsilon(1e-12));
  CHECK(probability(0, 0).p == 0);
}

TEST_CASE("percentiles of an integer histogram") {
  // Counted by hand: values 1 (x2), 2 (x5), 3 (x3): cumulative 2, 7, 10.
  const std::vector<std::uint64_t> h = {0, 2, 5, 3};
  CHECK(histogram_percentile(h, 0.10) == 1);  // need 1 of 10
  CHECK(histogram_percentile(h, 0.20) == 1);  // need 2
  CHECK(histogram_percentile(h, 0.50) == 2);  // need 5
  CHECK(histogram_percentile(h, 0.70) == 2);  // need 7
  CHECK(histogram_percentile(h, 0.90) == 3);  // need 9
}

TEST_CASE("merging is order-free and the size does not grow with seasons") {
  Tally a(3, 2, 10, 4), b(3, 2, 10, 4), ab(3, 2, 10, 4), ba(3, 2, 10, 4);
  const std::size_t bytes = a.bytes();
  for (int s = 0; s < 1000; ++s) {
    a.add_team(s % 3, s % 11, 10 - s % 11, s % 5, s % 2 == 0, s % 7 == 0, s % 3 - 1, s % 13 == 0);
    a.add_season();
    b.add_team((s + 1) % 3, (s * 7) % 11, 3, (s * 3) % 5, false, false, 1, s % 2 == 0);
    b.add_season();
  }
  a.add_games(100, 9, 1);
  CHECK(a.bytes() == bytes);
  ab.merge(a);
  ab.merge(b);
  ba.merge(b);
  ba.merge(a);
  SimulationResult r1, r2;
  ab.fill(r1);
  ba.fill(r2);
  REQUIRE(r1.seasons == 2000);
  CHECK(r1.games_simulated == 100);
  CHECK(r1.extra_innings_share == Approx(0.09));
  for (std::size_t t = 0; t < 3; ++t) {
    CHECK(r1.teams[t].wins_histogram == r2.teams[t].wins_histogram);
    CHECK(r1.teams[t].seed_histogram == r2.teams[t].seed_histogram);
    CHECK(r1.teams[t].title.p == r2.teams[t].title.p);
    CHECK(r1.teams[t].mean_wins == r2.teams[t].mean_wins);
    CHECK(r1.teams[t].reached_round.size() == 2);
  }
  CHECK(r1.max_se == r2.max_se);
}
