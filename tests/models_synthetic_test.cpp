// Tests for models/synthetic.h (generated leagues used by the recovery and coverage tests).
// References: schedule counts (closed form: C(n, 2) pairs x games per pair); the sample mean of
// the generated scores against the model mean (discretised-Weibull mean of models/score_dist.h,
// itself checked against REFERENCE_VALUES.md s3), Monte Carlo with a fixed seed and a 5 sigma
// bound; reproducibility for a fixed seed.
#include <catch2/catch.hpp>
#include <cmath>

#include "models/score_dist.h"
#include "models/synthetic.h"

using namespace standfast::models;

TEST_CASE("schedule size, home split and reproducibility") {
  SyntheticLeague l;
  const int n = 6;
  l.log_offence = synthetic_log_ratings(n, 0.1, 1);
  l.log_defence = synthetic_log_ratings(n, 0.1, 2);
  l.divisions = 2;
  l.games_within = 4;
  l.games_across = 2;
  // Ref: closed form; 2 divisions of 3: 6 pairs within x 4 + 9 pairs across x 2 = 42 games.
  const auto a = synthetic_sides(l, 7);
  REQUIRE(a.size() == 2 * 42);
  int home = 0;
  for (const Side& s : a) home += s.at_home ? 1 : 0;
  CHECK(home == 42);
  const auto b = synthetic_sides(l, 7);
  for (size_t i = 0; i < a.size(); ++i) CHECK(a[i].runs == b[i].runs);
  double sum = 0;
  for (double v : l.log_offence) sum += v;
  CHECK(sum == Approx(0.0).margin(1e-15));
  const auto season = synthetic_season(l, 7);
  REQUIRE(season.games.size() == 42);
  for (const auto& g : season.games) {
    CHECK(g.played);
    CHECK(g.home_runs != g.away_runs);  // ties settled by one run
  }
  SyntheticLeague bad = l;
  bad.log_defence.pop_back();
  CHECK_THROWS_WITH(synthetic_sides(bad, 1), Catch::Contains("matching ratings"));
}

TEST_CASE("generated scores have the model mean") {
  // Monte Carlo: 2 teams of average strength, no home edge, 20000 games = 40000 scores with
  // mean 4.5 (discretised) and variance variance(weibull_for_mean(4.5, 1.8)); 5 sigma bound.
  SyntheticLeague l;
  l.log_offence = {0.0, 0.0};
  l.log_defence = {0.0, 0.0};
  l.home_edge = 1.0;
  l.games_within = 20000;
  const auto sides = synthetic_sides(l, 99);
  double sum = 0;
  for (const Side& s : sides) sum += s.runs;
  const double var = variance(weibull_for_mean(4.5, 1.8));
  CHECK(std::abs(sum / sides.size() - 4.5) < 5 * std::sqrt(var / sides.size()));
}
