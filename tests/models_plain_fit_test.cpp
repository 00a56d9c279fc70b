// Tests for models/plain_fit.h.
// References:
//  - SciPy 1.10.1: the same binned likelihood with scipy.stats.weibull_min(c, loc=-0.5, scale)
//    sf differences, maximised by scipy.optimize.minimize (BFGS) in
//    tests/data/models/fit_ref.py (mode plain), run with /usr/bin/python3 when present
//    (skipped with a warning otherwise); 4 significant digits.
//  - Recovery of a known shape on generated data (models/synthetic.h, fixed seeds).
#include <fmt/core.h>

#include <catch2/catch.hpp>
#include <cmath>
#include <cstdio>
#include <filesystem>
#include <fstream>
#include <map>
#include <sstream>

#include "models/plain_fit.h"
#include "models/synthetic.h"
#include "tests/process_support.h"

using namespace standfast::models;

namespace {

using standfast::testing::have_python_module;
using standfast::testing::run_command;

bool have_scipy() { return have_python_module("scipy.optimize"); }

double rel(double a, double b) { return std::abs(a - b) / std::abs(b); }

}  // namespace

TEST_CASE("plain fit agrees with an independent SciPy optimisation") {
  if (!have_scipy()) {
    WARN("SKIPPED: /usr/bin/python3 with scipy not available; SciPy check not run");
    SUCCEED();
    return;
  }
  SyntheticLeague l;
  const int n = 5;
  l.log_offence = synthetic_log_ratings(n, 0.15, 501);
  l.log_defence = synthetic_log_ratings(n, 0.15, 502);
  l.games_within = 8;
  const auto sides = synthetic_sides(l, 503);
  const PlainFit fit = fit_plain(sides, n, std::nullopt);
  const std::string path = std::string(STANDFAST_BINARY_DIR) + "/models_fit_ref_plain.txt";
  {
    std::ofstream f(path);
    f << n << "\n";
    for (const Side& s : sides) {
      f << s.batting << " " << s.fielding << " " << (s.at_home ? 1 : 0) << " " << s.y << " 0\n";
    }
  }
  // Ref: SciPy 1.10.1 via tests/data/models/fit_ref.py plain (weibull_min(c, loc=-0.5, scale)
  // sf differences; optimize.minimize BFGS); 4 significant digits.
  const std::string out =
      run_command("/usr/bin/python3 " STANDFAST_TEST_DATA "/models/fit_ref.py plain " + path);
  std::map<std::string, double> ref = standfast::testing::parse_reference_values(out);
  REQUIRE(ref.count("shape") == 1);
  CHECK(rel(fit.shape, ref["shape"]) < 1e-4);
  CHECK(rel(fit.log_lik, ref["loglik"]) < 1e-6);
  for (int i = 0; i < n; ++i) {
    CHECK(rel(std::exp(fit.teams[i].scored.log_scale), ref[fmt::format("scored{}", i)]) < 1e-4);
    CHECK(rel(std::exp(fit.teams[i].allowed.log_scale), ref[fmt::format("allowed{}", i)]) < 1e-4);
  }
  CHECK(rel(fit.teams[0].free_shape, ref["free0"]) < 1e-4);
}

TEST_CASE("plain fit recovers a known shape within its standard error") {
  // Balanced schedule, no home edge or venue: the plain model is then the true model for each
  // team's runs scored up to opponents' spread. 4 sigma bound on the shape (Monte Carlo, fixed
  // seed); the composite-likelihood SE of gamma is used.
  SyntheticLeague l;
  const int n = 10;
  l.home_edge = 1.0;
  l.shape = 1.9;
  l.log_offence = synthetic_log_ratings(n, 0.1, 601);
  l.log_defence = std::vector<double>(n, 0.0);
  l.games_within = 20;
  const auto sides = synthetic_sides(l, 602);
  const PlainFit fit = fit_plain(sides, n, std::nullopt);
  CHECK(fit.converged);
  CHECK(fit.shape_se > 0.0);
  CHECK(std::abs(fit.shape - 1.9) < 4 * fit.shape_se);
  for (int i = 0; i < n; ++i) {
    CHECK(fit.teams[i].scored.count == 180);
    CHECK(fit.teams[i].scored.log_scale_se > 0.0);
    CHECK(fit.teams[i].free_shape > 0.0);
    // Each team's own shape: 4 sigma around the truth.
    CHECK(std::abs(fit.teams[i].free_shape - 1.9) < 4 * fit.teams[i].free_shape_se);
  }
  const PlainFit fixed = fit_plain(sides, n, 1.9);
  CHECK(fixed.shape == 1.9);
  CHECK(fixed.shape_se == 0.0);
  CHECK_THROWS_WITH(fit_plain({}, n, std::nullopt), Catch::Contains("no played games"));
  CHECK_THROWS_WITH(fit_plain(sides, n, -2.0), Catch::Contains("shape must be > 0, got -2"));
}
