// Everything the `fit` command shows: the engine's ratings (schedule-adjusted, shrunk), the
// same model at its maximum-likelihood values, the plain per-team Weibull fit of Miller (2007)
// with each team's free shape, per-team chi-square tests with the Bonferroni threshold, AIC of
// the three scoring families, and the Pythagorean expectation per team.
#ifndef STANDFAST_MODELS_FIT_REPORT_H
#define STANDFAST_MODELS_FIT_REPORT_H

#include <optional>
#include <string>
#include <vector>

#include "config/season.h"
#include "models/joint_fit.h"
#include "models/likelihood.h"
#include "models/plain_fit.h"
#include "models/ratings.h"

namespace standfast::models {

// The two joint fits behind fit_ratings.
struct RatingsFit {
  LeagueRatings ratings;           // what the engine uses (after shrinkage)
  std::optional<JointFit> mle;     // maximum likelihood, no shrinkage (empty for log5 / no games)
  std::optional<JointFit> shrunk;  // with the shrinkage prior (empty when shrink_games is 0)
  double info_per_side = 0.0;      // Fisher information about log(mean) of one average score
  double prior_precision = 0.0;    // shrink_games * info_per_side
  double shrink_games = 0.0;       // the prior weight used, in games (estimated when auto)
  std::vector<Side> sides;
};

// fit_ratings with its intermediate fits.
RatingsFit fit_ratings_detail(const config::Season& season);

// Empirical-Bayes prior weight, in games, from a maximum-likelihood fit (method of moments,
// Efron and Morris 1975, JASA 70(350)): the spread of the estimated log ratings is the spread of
// the true ones plus the estimation noise, var(estimates) = tau^2 + mean(SE^2), and a normal
// prior of variance tau^2 is worth 1 / (I tau^2) games when one score carries information I
// about a log rating. Empty when tau^2 comes out <= 0 (no spread beyond noise) or I <= 0.
std::optional<double> empirical_bayes_shrink(const JointFit& mle, double info_per_side);

// The weight `shrink_games: auto` uses: the estimate above kept within
// [AUTO_SHRINK_MIN, AUTO_SHRINK_MAX] games (the upper end also when tau^2 <= 0: every team close
// to the league), so a few games can never remove the prior or make it absolute.
inline constexpr double AUTO_SHRINK_MIN = 5.0, AUTO_SHRINK_MAX = 500.0;
double auto_shrink_games(const JointFit& mle, double info_per_side);

struct TeamReport {
  int games = 0, wins = 0, losses = 0;
  double runs_scored = 0.0, runs_allowed = 0.0;  // per game, as played
  // Plain: discretised-Weibull means of runs scored and allowed per game, SE of their logs.
  double plain_scored = 0.0, plain_scored_se = 0.0, plain_allowed = 0.0, plain_allowed_se = 0.0;
  double plain_offence = 1.0, plain_defence = 1.0;  // relative to the league (geometric mean 1)
  double free_shape = 0.0, free_shape_se = 0.0;
  // Adjusted at maximum likelihood (before shrinkage), and the engine's ratings after it.
  double mle_offence = 1.0, mle_defence = 1.0, mle_log_offence_se = 0.0, mle_log_defence_se = 0.0;
  double offence = 1.0, defence = 1.0, log_offence_se = 0.0, log_defence_se = 0.0;
  // Goodness of fit of the adjusted maximum-likelihood fit.
  double chi_square = 0.0;
  int df = 0;
  int bins_scored = 0, bins_allowed = 0;
  double p_value = 1.0;
  double critical = 0.0;  // Bonferroni-adjusted critical value at this df
  bool rejected = false;
  // Pythagorean expectation at the plain league shape.
  double expected_pct = 0.0, expected_wins = 0.0, wins_minus_expected = 0.0;
};

struct FamilyReport {
  config::ScoreFamily family = config::ScoreFamily::kWeibull;
  double shape = 0.0;
  double log_lik = 0.0;
  int parameters = 0;
  double aic = 0.0;
  double delta_aic = 0.0;  // AIC minus the smallest of the three
  bool converged = false;
};

struct FitReport {
  // No played game: nothing is fitted. `ratings` holds the documented defaults the engine runs
  // on (models/ratings.cpp: league mean, shape, home edge, the prior's uncertainty), `teams` the
  // average ratings with that uncertainty; the diagnostics (plain fit, goodness of fit, families,
  // Pythagorean expectation) are empty or NaN.
  bool defaults = false;
  config::ScoreFamily family = config::ScoreFamily::kWeibull;       // of the ratings
  config::ScoreFamily test_family = config::ScoreFamily::kWeibull;  // of the diagnostics
  LeagueRatings ratings;
  std::optional<JointFit> mle;
  int games_fitted = 0;
  double plain_shape = 0.0, plain_shape_se = 0.0;
  double shrink_games = 0.0;  // the prior weight used (estimated from the data when auto)
  bool shrink_auto = false;   // `shrink_games: auto`
  double info_per_side = 0.0;
  // Empirical-Bayes shrinkage strength from the maximum-likelihood ratings: 1 / (I tau^2) with
  // tau^2 = var(log ratings) - mean(se^2); empty when the spread is all noise.
  std::optional<double> suggested_shrink_games;
  double family_alpha = 0.05;
  int tests = 0;  // teams with a chi-square test (df > 0)
  double per_test_alpha = 0.0;
  int rejected = 0;
  std::vector<TeamReport> teams;
  std::vector<FamilyReport> families;
};

// Throws std::domain_error on bad data (see fit_ratings). With no played game it returns the
// defaults (FitReport::defaults) rather than throwing, as the engine runs on them.
FitReport fit_report(const config::Season& season, double family_alpha = 0.05);

}  // namespace standfast::models

#endif  // STANDFAST_MODELS_FIT_REPORT_H
