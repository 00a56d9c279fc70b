// Tests for models/strength_sampler.h.
// References: closed forms. A diagonal sampler has covariance diag(se^2); a sampler built from a
// lower-triangular factor L of a precision Q draws with covariance Q^-1 (Rue 2001, JRSS-B 63(2),
// section 2), checked against the inverse of a 2 x 2 matrix written out by hand.
#include <catch2/catch.hpp>
#include <cmath>
#include <vector>

#include "models/strength_sampler.h"

using namespace standfast::models;

TEST_CASE("diagonal sampler: covariance diag(se^2), no centring") {
  const StrengthSampler s = diagonal_sampler({0.1, 0.2}, {0.3, 0.0});
  CHECK(s.normals() == 4);
  const std::vector<double> c = sampler_covariance(s);
  // Ref: closed form; exact in floating point (one product per entry).
  CHECK(c[0] == 0.1 * 0.1);
  CHECK(c[1 * 4 + 1] == 0.2 * 0.2);
  CHECK(c[2 * 4 + 2] == 0.3 * 0.3);
  CHECK(c[3 * 4 + 3] == 0.0);
  CHECK(c[1] == 0.0);
}

TEST_CASE("sparse factor of a precision: covariance Q^-1, centring, low-rank part") {
  // One team pair: latent (a0, b0) with precision Q = [[4, 1], [1, 2]] (team 1 is the reference,
  // fixed at 0). L = [[2, 0], [0.5, sqrt(1.75)]].
  StrengthSampler s;
  s.teams = 2;
  s.dimension = 2;
  s.col_start = {0, 2, 3};
  s.row = {0, 1, 1};
  s.value = {2.0, 0.5, std::sqrt(1.75)};
  s.order = {0, 1};
  s.offence = {0, -1};
  s.defence = {1, -1};
  s.scale = {1.0, 1.0, 1.0, 1.0};
  std::vector<double> c = sampler_covariance(s);
  // Ref: closed form; Q^-1 = [[2, -1], [-1, 4]] / 7; relative 1e-14.
  CHECK(c[0 * 4 + 0] == Approx(2.0 / 7).epsilon(1e-14));
  CHECK(c[0 * 4 + 2] == Approx(-1.0 / 7).epsilon(1e-14));
  CHECK(c[2 * 4 + 2] == Approx(4.0 / 7).epsilon(1e-14));
  CHECK(c[1 * 4 + 1] == 0.0);
  // Centred: offence deviations (a0 - a0/2, -a0/2), so var = var(a0) / 4 each, covariance -1/4.
  s.centre = true;
  c = sampler_covariance(s);
  CHECK(c[0 * 4 + 0] == Approx(0.5 / 7).epsilon(1e-14));
  CHECK(c[0 * 4 + 1] == Approx(-0.5 / 7).epsilon(1e-14));
  // A low-rank column (0.3, 0) adds 0.09 to var(a0): var of a0 - mean = (2/7 + 0.09) / 4.
  s.rank = 1;
  s.low_rank = {0.3, 0.0};
  c = sampler_covariance(s);
  CHECK(s.normals() == 3);
  CHECK(c[0 * 4 + 0] == Approx((2.0 / 7 + 0.09) / 4).epsilon(1e-14));
}
