// Tests for models/likelihood.h.
// References: the per-score log-likelihoods against the log of the pmfs of models/score_dist.h
// (themselves checked against Boost.Math and SciPy in models_score_dist_test.cpp) and against
// std::lgamma closed forms; derivatives against central finite differences (truncation error
// O(h^2) with h = 1e-4, so agreement to about 1e-6 relative is expected).
#include <boost/math/special_functions/bessel.hpp>
#include <catch2/catch.hpp>
#include <cmath>

#include "models/likelihood.h"
#include "models/score_dist.h"

using namespace standfast::models;
using standfast::config::ScoreFamily;

TEST_CASE("score log-likelihoods equal the log pmf at the family's mean") {
  for (double mu : {0.7, 3.2, 4.5, 7.9, 15.0}) {
    for (int k : {0, 1, 4, 9, 20}) {
      const double eta = std::log(mu);
      // Weibull: the scale solved from the discretised mean (table interpolation in the fit).
      const double w = score_loglik(ScoreFamily::kWeibull, k, eta, 1.8).value;
      CHECK(w == Approx(std::log(pmf(weibull_for_mean(mu, 1.8), k))).epsilon(1e-8));
      const double nb = score_loglik(ScoreFamily::kNegativeBinomial, k, eta, 6.5).value;
      CHECK(nb == Approx(std::log(pmf(NegativeBinomial{mu, 6.5}, k))).epsilon(1e-11));
      const double po = score_loglik(ScoreFamily::kPoisson, k, eta, 0).value;
      CHECK(po == Approx(std::log(pmf(Poisson{mu}, k))).epsilon(1e-11));
    }
  }
}

TEST_CASE("derivatives with respect to log mean match finite differences") {
  const double h = 1e-4;
  for (auto f : {ScoreFamily::kWeibull, ScoreFamily::kNegativeBinomial, ScoreFamily::kPoisson}) {
    for (double shape : {1.3, 1.9, 2.6}) {
      for (double y : {0.0, 2.0, 5.5, 12.0}) {
        for (double eta : {0.2, 1.5, 2.2}) {
          const double s = f == ScoreFamily::kNegativeBinomial ? shape * 4 : shape;
          const LogLikTerms t = score_loglik(f, y, eta, s);
          const LogLikTerms p = score_loglik(f, y, eta + h, s);
          const LogLikTerms m = score_loglik(f, y, eta - h, s);
          CHECK(t.d1 == Approx((p.value - m.value) / (2 * h)).epsilon(1e-6).margin(1e-7));
          CHECK(t.d2 == Approx((p.d1 - m.d1) / (2 * h)).epsilon(1e-5).margin(1e-6));
        }
      }
    }
  }
  for (double y : {0.0, 3.0, 11.0}) {
    const LogLikTerms t = weibull_loglik_log_scale(y, 1.6, 1.8);
    const LogLikTerms p = weibull_loglik_log_scale(y, 1.6 + h, 1.8);
    const LogLikTerms m = weibull_loglik_log_scale(y, 1.6 - h, 1.8);
    CHECK(t.d1 == Approx((p.value - m.value) / (2 * h)).epsilon(1e-6));
    CHECK(t.d2 == Approx((p.d1 - m.d1) / (2 * h)).epsilon(1e-5));
  }
}

TEST_CASE("the chance of a tie after regulation: Skellam at zero, and direct sums") {
  // Poisson: the difference of two independent Poisson counts is Skellam distributed (Skellam
  // 1946, JRSS 109(3) 296), P(X = Y) = exp(-(m1 + m2)) I_0(2 sqrt(m1 m2)); I_0 from Boost.Math.
  for (double m1 : {0.5, 3.0, 4.5, 9.0}) {
    for (double m2 : {1.0, 4.5, 6.2}) {
      const double closed =
          std::exp(-(m1 + m2)) * boost::math::cyl_bessel_i(0, 2.0 * std::sqrt(m1 * m2));
      const TieTerms t = tie_loglik(ScoreFamily::kPoisson, std::log(m1), std::log(m2), 0.0);
      CHECK(std::exp(t.value) == Approx(closed).epsilon(1e-12));
    }
  }
  // Weibull and negative binomial: the sum of products of the pmfs of models/score_dist.h
  // (checked against Boost.Math and SciPy in models_score_dist_test.cpp).
  for (double m1 : {2.0, 4.5}) {
    for (double m2 : {3.5, 8.0}) {
      double w = 0.0, nb = 0.0;
      const DiscreteWeibull d1 = weibull_for_mean(m1, 1.8), d2 = weibull_for_mean(m2, 1.8);
      for (int k = 0; k < 400; ++k) {
        w += pmf(d1, k) * pmf(d2, k);
        nb += pmf(NegativeBinomial{m1, 6.5}, k) * pmf(NegativeBinomial{m2, 6.5}, k);
      }
      CHECK(tie_loglik(ScoreFamily::kWeibull, std::log(m1), std::log(m2), 1.8).value ==
            Approx(std::log(w)).epsilon(1e-8));
      CHECK(tie_loglik(ScoreFamily::kNegativeBinomial, std::log(m1), std::log(m2), 6.5).value ==
            Approx(std::log(nb)).epsilon(1e-11));
    }
  }
}

TEST_CASE("the tie's derivatives match finite differences, cross term included") {
  const double h = 1e-4;
  for (auto f : {ScoreFamily::kWeibull, ScoreFamily::kNegativeBinomial, ScoreFamily::kPoisson}) {
    const double shape = f == ScoreFamily::kNegativeBinomial ? 7.0 : 1.7;
    for (double eh : {0.4, 1.5, 2.1}) {
      for (double ea : {0.9, 1.5}) {
        const TieTerms t = tie_loglik(f, eh, ea, shape);
        const TieTerms hp = tie_loglik(f, eh + h, ea, shape), hm = tie_loglik(f, eh - h, ea, shape);
        const TieTerms ap = tie_loglik(f, eh, ea + h, shape), am = tie_loglik(f, eh, ea - h, shape);
        CHECK(t.dh == Approx((hp.value - hm.value) / (2 * h)).epsilon(1e-6).margin(1e-7));
        CHECK(t.da == Approx((ap.value - am.value) / (2 * h)).epsilon(1e-6).margin(1e-7));
        CHECK(t.dhh == Approx((hp.dh - hm.dh) / (2 * h)).epsilon(1e-5).margin(1e-6));
        CHECK(t.daa == Approx((ap.da - am.da) / (2 * h)).epsilon(1e-5).margin(1e-6));
        CHECK(t.dha == Approx((ap.dh - am.dh) / (2 * h)).epsilon(1e-5).margin(1e-6));
      }
    }
  }
}

TEST_CASE("the interpolated scale agrees with the direct solution across the table") {
  // The fit solves the Weibull scale from a Hermite table of the discretisation correction;
  // weibull_for_mean sums the series directly. Reference: the direct sum.
  for (double g : {0.9, 1.4, 1.83, 2.5, 4.0}) {
    for (double mu = 0.1; mu < 40.0; mu *= 1.13) {
      const double eta = std::log(mu);
      for (int k : {0, 3, 8}) {
        const double direct = std::log(pmf(weibull_for_mean(mu, g), k));
        INFO("g " << g << " mu " << mu << " k " << k);
        if (direct < -50.0) continue;  // P < 1e-21: scale errors of 1e-13 are amplified
        CHECK(score_loglik(ScoreFamily::kWeibull, k, eta, g).value ==
              Approx(direct).epsilon(1e-8).margin(1e-10));
      }
    }
  }
}

namespace {
standfast::config::Season two_team_season() {
  standfast::config::Season s;
  s.league.regulation_innings = 9;
  for (const char* id : {"AAA", "BBB"}) {
    standfast::config::Team t;
    t.id = id;
    s.teams.push_back(t);
  }
  s.teams[0].run_factor = 1.1;
  auto game = [](int home, int away, int hr, int ar, int innings, bool shortened) {
    standfast::config::Game g;
    g.home = home;
    g.away = away;
    g.played = true;
    g.home_runs = hr;
    g.away_runs = ar;
    g.innings = innings;
    g.shortened = shortened;
    return g;
  };
  s.games.push_back(game(0, 1, 12, 2, 9, false));
  s.games.push_back(game(1, 0, 3, 4, 6, true));
  s.games.push_back(game(1, 0, 5, 4, 11, false));
  standfast::config::Game unplayed;
  unplayed.home = 0;
  unplayed.away = 1;
  s.games.push_back(unplayed);
  return s;
}
}  // namespace

TEST_CASE("played sides: venue, shortened games, extra innings and lopsided weights") {
  auto s = two_team_season();
  auto sides = played_sides(s);
  REQUIRE(sides.size() == 6);
  CHECK(sides[0].batting == 0);
  CHECK(sides[0].at_home);
  CHECK(sides[0].won);
  CHECK(sides[0].offset == Approx(std::log(1.1)));
  CHECK(sides[1].batting == 1);
  CHECK(sides[1].offset == Approx(std::log(1.1)));
  // Shortened after 6 of 9 innings: exposure 6/9.
  CHECK(sides[2].offset == Approx(std::log(6.0 / 9.0)));
  // Extra innings: final score kept, no offset, both sides flagged (the joint fit takes the
  // regulation score as a tie); regulation games are not flagged.
  CHECK(sides[4].runs == 5);
  CHECK(sides[4].offset == 0.0);
  CHECK(sides[4].extra_innings);
  CHECK(sides[5].extra_innings);
  CHECK_FALSE(sides[0].extra_innings);
  CHECK_FALSE(sides[2].extra_innings);
  CHECK(sides[0].y == 12.0);
  // Lopsided: margin 4, weight 0.5: 12-2 leads by 10 > 4, so y = 2 + 4 + 0.5 * 6 = 9.
  s.model.lopsided = standfast::config::LopsidedRule{4, 0.5};
  sides = played_sides(s);
  CHECK(sides[0].y == 9.0);
  CHECK(sides[0].runs == 12);
  CHECK(sides[1].y == 2.0);
}

TEST_CASE("played sides reject bad data with the parameter and value") {
  auto s = two_team_season();
  s.games[0].home_runs = -1;
  CHECK_THROWS_WITH(played_sides(s), Catch::Contains("negative score"));
  s = two_team_season();
  s.games[1].away = 7;
  CHECK_THROWS_WITH(played_sides(s), Catch::Contains("out of range"));
  s = two_team_season();
  s.games[0].away_runs = 12;
  CHECK_THROWS_WITH(played_sides(s), Catch::Contains("tied final score"));
  s = two_team_season();
  s.teams[0].run_factor = 0.0;
  CHECK_THROWS_WITH(played_sides(s), Catch::Contains("run_factor"));
  CHECK_THROWS(score_loglik(ScoreFamily::kLog5, 1, 1, 1));
}

TEST_CASE("an absurd or undefined mean gives a non-finite log-likelihood at once, never a hang") {
  // Regression: a line-search trial with a mean of e^40 runs (or NaN) used to sum the
  // discretised Weibull mean for ever and then read past a table (found by the backtest at 20%
  // of the season). The fits now refuse such a step; the likelihood itself reports it.
  for (double eta : {40.0, 700.0, std::nan("")}) {
    const LogLikTerms t = score_loglik(ScoreFamily::kWeibull, 3.0, eta, 1.8);
    CHECK_FALSE(std::isfinite(t.value));
  }
  // A sane mean, and a vanishing one (P(3) tiny but defined), stay finite.
  CHECK(std::isfinite(score_loglik(ScoreFamily::kWeibull, 3.0, std::log(4.5), 1.8).value));
  CHECK(std::isfinite(score_loglik(ScoreFamily::kWeibull, 3.0, -800.0, 1.8).value));
}
