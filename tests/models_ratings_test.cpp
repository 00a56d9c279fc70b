// Tests for models/ratings.h (fit_ratings, LeagueRatings) and models/fit_report.h.
// References: the strength sampler's covariance against the standard errors (closed form);
// expected runs against the model formula; shrinkage against the precision-weighted mean (closed
// form for a normal prior); the report's records against counts of the games.
#include <catch2/catch.hpp>
#include <cmath>

#include "models/fit_report.h"
#include "models/ratings.h"
#include "models/synthetic.h"

using namespace standfast::models;
using standfast::config::ScoreFamily;

namespace {
SyntheticLeague league(int n) {
  SyntheticLeague l;
  l.log_offence = synthetic_log_ratings(n, 0.1, 701);
  l.log_defence = synthetic_log_ratings(n, 0.1, 702);
  l.games_within = 8;
  l.run_factor.assign(n, 1.0);
  l.run_factor[0] = 1.1;
  return l;
}
}  // namespace

TEST_CASE("fit_ratings: estimates, expected runs and the covariance factor") {
  const int n = 8;
  auto season = synthetic_season(league(n), 703);
  season.model.shrink_games = 0.0;
  const LeagueRatings r = fit_ratings(season);
  REQUIRE(r.teams.size() == static_cast<size_t>(n));
  REQUIRE(r.strengths.teams == n);
  CHECK(r.games_fitted == static_cast<int>(season.games.size()));
  CHECK(r.converged);
  CHECK(r.shape > 1.0);
  double so = 0, sd = 0;
  for (const auto& t : r.teams) {
    so += std::log(t.offence);
    sd += std::log(t.defence);
    CHECK(t.log_offence_se > 0.0);
  }
  CHECK(so == Approx(0.0).margin(1e-10));  // geometric mean 1
  CHECK(sd == Approx(0.0).margin(1e-10));
  // Ref: closed form (model definition, DESIGN.md "Schedule strength"): M x offence x defence
  // x venue x home edge; relative 1e-12 (Approx default scale).
  CHECK(r.expected_runs(2, 3, 1.1, true) ==
        Approx(r.league_mean * r.teams[2].offence * r.teams[3].defence * 1.1 * r.home_edge));
  CHECK(r.expected_runs(2, 3, 1.0, false) ==
        Approx(r.league_mean * r.teams[2].offence * r.teams[3].defence));
  CHECK_THROWS_WITH(r.expected_runs(9, 0, 1.0, true), Catch::Contains("out of range"));
  // Ref: closed form; the sampler's covariance sum_k draw(e_k) draw(e_k)^T has the squared
  // standard errors on its diagonal (both from the same observed information); relative 1e-9.
  const int m = 2 * n;
  const std::vector<double> cov = sampler_covariance(r.strengths);
  for (int i = 0; i < m; ++i) {
    const double se = i < n ? r.teams[i].log_offence_se : r.teams[i - n].log_defence_se;
    CHECK(std::sqrt(cov[i * m + i]) == Approx(se).epsilon(1e-9));
  }
  // The offences sum to zero in every draw: the covariance rows of the offences sum to zero.
  for (int k = 0; k < m; ++k) {
    double s = 0;
    for (int i = 0; i < n; ++i) s += cov[i * m + k];
    CHECK(s == Approx(0.0).margin(1e-10));
  }
}

TEST_CASE("shrinkage pulls ratings toward the league by n / (n + k) on the log scale") {
  // For a normal prior of precision k I on a log rating estimated with precision n I, the
  // posterior mode is n / (n + k) of the estimate (closed form). The joint fit is not exactly
  // separable (shrinking one team moves its opponents' adjustments), so the check is on the
  // least-squares slope of shrunk on raw log ratings, within 0.05 of n / (n + k).
  const int n = 8;
  auto season = synthetic_season(league(n), 704);
  season.model.shrink_games = 0.0;
  const LeagueRatings raw = fit_ratings(season);
  season.model.shrink_games = 20.0;
  const RatingsFit detail = fit_ratings_detail(season);
  const LeagueRatings& shrunk = detail.ratings;
  CHECK(detail.prior_precision == Approx(20.0 * detail.info_per_side));
  const double games = 8.0 * (n - 1);  // each team plays 8 games with each of 7 others
  const double factor = games / (games + 20.0);
  double ab = 0, aa = 0;
  for (int i = 0; i < n; ++i) {
    for (bool off : {true, false}) {
      const double a = std::log(off ? raw.teams[i].offence : raw.teams[i].defence);
      const double b = std::log(off ? shrunk.teams[i].offence : shrunk.teams[i].defence);
      ab += a * b;
      aa += a * a;
    }
    CHECK(shrunk.teams[i].log_offence_se < raw.teams[i].log_offence_se);
  }
  // Ref: closed form n / (n + k) for a normal prior (conjugate normal mean); margin 0.05.
  CHECK(ab / aa == Approx(factor).margin(0.05));
}

TEST_CASE("log5, no games and bad data") {
  const int n = 6;
  auto season = synthetic_season(league(n), 705);
  season.model.family = ScoreFamily::kLog5;
  LeagueRatings r = fit_ratings(season);
  for (const auto& t : r.teams) {
    CHECK(t.offence == 1.0);
    CHECK(t.log_offence_se == 0.0);
  }
  season.model.family = ScoreFamily::kWeibull;
  for (auto& g : season.games) g.played = false;
  r = fit_ratings(season);
  CHECK(r.games_fitted == 0);
  CHECK(r.league_mean == 4.5);
  CHECK(r.teams[0].log_offence_se > 0.0);  // the prior alone (shrink_games 20)
  season = synthetic_season(league(n), 705);
  season.model.shrink_games = 0.0;
  for (auto& g : season.games) g.played = g.played && g.home != 5 && g.away != 5;
  CHECK_THROWS_WITH(fit_ratings(season), Catch::Contains("team T05 has no played game"));
  season.model.shrink_games = 20.0;
  r = fit_ratings(season);  // with the prior, the team without games sits at the league
  CHECK(std::abs(std::log(r.teams[5].offence)) < 0.05);
  season = synthetic_season(league(n), 705);
  season.model.shrink_games = -1.0;
  CHECK_THROWS_WITH(fit_ratings(season), Catch::Contains("shrink_games"));
  season.model.shrink_games = 0.0;
  season.games[3].home_runs = -2;
  CHECK_THROWS_WITH(fit_ratings(season), Catch::Contains("negative score"));
}

TEST_CASE("fit report: records, families and tests") {
  const int n = 8;
  const auto season = synthetic_season(league(n), 706);
  const FitReport rep = fit_report(season);
  REQUIRE(rep.teams.size() == static_cast<size_t>(n));
  int wins = 0, losses = 0, games = 0;
  for (const auto& t : rep.teams) {
    wins += t.wins;
    losses += t.losses;
    games += t.games;
    CHECK(t.wins + t.losses == t.games);
    CHECK(t.expected_pct > 0.0);
    CHECK(t.expected_pct < 1.0);
    CHECK(t.df > 0);
    CHECK(t.critical > 0.0);
  }
  // Ref: counts of the generated games (one win and one loss per game).
  CHECK(wins == static_cast<int>(season.games.size()));
  CHECK(losses == wins);
  CHECK(games == 2 * wins);
  REQUIRE(rep.families.size() == 3);
  double best = 1e300;
  for (const auto& f : rep.families) best = std::min(best, f.delta_aic);
  CHECK(best == 0.0);
  CHECK(rep.families[2].family == ScoreFamily::kPoisson);
  CHECK(rep.families[2].delta_aic > 0.0);  // Weibull data: Poisson is not the best family
  CHECK(rep.tests == n);
  CHECK(rep.per_test_alpha == Approx(0.05 / n));
  CHECK(rep.plain_shape > 1.0);
}

TEST_CASE("empirical-Bayes shrinkage: the method-of-moments formula and shrink_games: auto") {
  // A hand-made fit: 4 teams, log ratings summing to 0, every variance 0.0004.
  JointFit f;
  f.teams = 4;
  f.log_offence = {0.2, -0.1, 0.0, -0.1};
  f.log_defence = {0.1, 0.1, -0.1, -0.1};
  f.variance.assign(static_cast<size_t>(f.dimension()), 0.0004);
  // Ref: Efron and Morris (1975), JASA 70(350), method of moments: tau^2 = sum x^2 / (2 (n - 1))
  // - mean(SE^2) = (0.06 + 0.04) / 6 - 0.0004 = 0.016267 (hand computation); weight 1 / (I tau^2)
  // with I = 2: 30.7377.
  CHECK(empirical_bayes_shrink(f, 2.0).value() == Approx(1.0 / (2.0 * (0.1 / 6.0 - 0.0004))));
  CHECK(auto_shrink_games(f, 2.0) == Approx(30.7377).epsilon(1e-5));
  // No spread beyond the noise: no estimate; auto takes the upper bound.
  f.variance.assign(static_cast<size_t>(f.dimension()), 0.1);
  CHECK_FALSE(empirical_bayes_shrink(f, 2.0).has_value());
  CHECK(auto_shrink_games(f, 2.0) == AUTO_SHRINK_MAX);
  // A huge spread: the lower bound.
  f.variance.assign(static_cast<size_t>(f.dimension()), 0.0);
  f.log_offence = {20, -10, 0, -10};
  CHECK(auto_shrink_games(f, 2.0) == AUTO_SHRINK_MIN);

  // On a league with known true spread (sd 0.1 on the log scale), `auto` fits with the weight
  // 1 / (I tau^2) of the maximum-likelihood fit, and it is the fit of that fixed weight.
  auto season = synthetic_season(league(12), 708);
  season.model.shrink_auto = true;
  const RatingsFit a = fit_ratings_detail(season);
  REQUIRE(a.mle.has_value());
  CHECK(a.shrink_games == Approx(auto_shrink_games(*a.mle, a.info_per_side)).epsilon(1e-12));
  CHECK(a.ratings.shrink_games == a.shrink_games);
  // Ref: closed form 1 / (I tau^2) at the true tau = 0.1, only as a sanity range: the estimate
  // from 12 teams has a wide sampling spread (common practice: a factor of 3 either way).
  const double truth = 1.0 / (a.info_per_side * 0.01);
  CHECK(a.shrink_games > truth / 3.0);
  CHECK(a.shrink_games < truth * 3.0);
  season.model.shrink_auto = false;
  season.model.shrink_games = a.shrink_games;
  const LeagueRatings fixed = fit_ratings(season);
  for (size_t i = 0; i < fixed.teams.size(); ++i) {
    CHECK(fixed.teams[i].offence == Approx(a.ratings.teams[i].offence).epsilon(1e-9));
    CHECK(fixed.teams[i].log_defence_se == Approx(a.ratings.teams[i].log_defence_se).epsilon(1e-9));
  }
  // Nothing played: auto falls back on shrink_games.
  season.model.shrink_auto = true;
  season.model.shrink_games = 20.0;
  for (auto& g : season.games) g.played = false;
  CHECK(fit_ratings(season).shrink_games == 20.0);
}
