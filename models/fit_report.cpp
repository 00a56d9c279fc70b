#include "models/fit_report.h"

#include <fmt/core.h>

#include <algorithm>
#include <cmath>
#include <limits>
#include <stdexcept>

#include "models/goodness.h"
#include "models/pythagorean.h"

namespace standfast::models {

std::optional<double> empirical_bayes_shrink(const JointFit& f, double info) {
  const int n = f.teams;
  double ss = 0.0, se2 = 0.0;
  for (int i = 0; i < n; ++i) {
    ss += f.log_offence[i] * f.log_offence[i] + f.log_defence[i] * f.log_defence[i];
    se2 += f.var(f.offence_index(i)) + f.var(f.defence_index(i));
  }
  // Each set of n ratings sums to zero: n - 1 degrees of freedom per set.
  const double tau2 = ss / (2.0 * (n - 1)) - se2 / (2.0 * n);
  if (!(tau2 > 0.0) || !(info > 0.0)) return std::nullopt;
  return 1.0 / (info * tau2);
}

double auto_shrink_games(const JointFit& mle, double info_per_side) {
  const std::optional<double> k = empirical_bayes_shrink(mle, info_per_side);
  return std::clamp(k.value_or(AUTO_SHRINK_MAX), AUTO_SHRINK_MIN, AUTO_SHRINK_MAX);
}

FitReport fit_report(const config::Season& season, double family_alpha) {
  if (!(family_alpha > 0.0 && family_alpha < 1.0)) {
    throw std::domain_error(
        fmt::format("fit_report: alpha must be in (0, 1), got {}", family_alpha));
  }
  const int n = static_cast<int>(season.teams.size());
  FitReport rep;
  rep.family = season.model.family;
  rep.family_alpha = family_alpha;
  rep.shrink_auto = season.model.shrink_auto;
  RatingsFit rf = fit_ratings_detail(season);
  const std::vector<Side>& sides = rf.sides;
  rep.ratings = rf.ratings;
  rep.shrink_games = rf.shrink_games;
  if (sides.empty()) {
    // Nothing to fit: the engine's defaults, with no diagnostics.
    constexpr double NOT_FITTED = std::numeric_limits<double>::quiet_NaN();
    rep.defaults = true;
    rep.test_family = rep.family;
    rep.plain_shape = rep.plain_shape_se = NOT_FITTED;
    rep.teams.resize(static_cast<std::size_t>(n));
    for (int i = 0; i < n; ++i) {
      TeamReport& t = rep.teams[static_cast<std::size_t>(i)];
      const TeamRating& r = rep.ratings.teams[static_cast<std::size_t>(i)];
      t.offence = r.offence;
      t.defence = r.defence;
      t.log_offence_se = r.log_offence_se;
      t.log_defence_se = r.log_defence_se;
      t.runs_scored = t.runs_allowed = t.plain_scored = t.plain_allowed = NOT_FITTED;
      t.plain_offence = t.plain_defence = t.mle_offence = t.mle_defence = NOT_FITTED;
      t.plain_scored_se = t.plain_allowed_se = NOT_FITTED;
      t.mle_log_offence_se = t.mle_log_defence_se = NOT_FITTED;
      t.chi_square = t.p_value = NOT_FITTED;
      t.expected_pct = t.expected_wins = t.wins_minus_expected = NOT_FITTED;
    }
    return rep;
  }
  rep.games_fitted = rf.ratings.games_fitted;
  rep.info_per_side = rf.info_per_side;

  // Diagnostics use the season's family, or the Weibull for log5 (which models no scores).
  rep.test_family = season.model.family == config::ScoreFamily::kLog5
                        ? config::ScoreFamily::kWeibull
                        : season.model.family;
  JointOptions base;
  base.home_edge = season.model.home_edge;
  base.adjust_shape = season.model.adjusted_shape;  // as the ratings' own fit (rf.mle)
  base.prior_precision = rf.shrink_games > 0.0 ? 1e-9 : 0.0;
  const auto shape_for = [&](config::ScoreFamily f) -> std::optional<double> {
    return f == season.model.family && f != config::ScoreFamily::kPoisson ? season.model.shape
                                                                          : std::nullopt;
  };
  // AIC of the three families (maximum likelihood, same data).
  for (auto f : {config::ScoreFamily::kWeibull, config::ScoreFamily::kNegativeBinomial,
                 config::ScoreFamily::kPoisson}) {
    JointFit fit;
    if (rf.mle && f == rep.test_family) {
      fit = *rf.mle;
    } else {
      JointOptions o = base;
      o.family = f;
      o.shape = shape_for(f);
      o.covariance = f == rep.test_family;
      fit = fit_joint(sides, n, o);
    }
    if (f == rep.test_family) rep.mle = fit;
    FamilyReport fr;
    fr.family = f;
    fr.shape = fit.shape;
    fr.log_lik = fit.log_lik;
    fr.parameters = fit.free_parameters;
    fr.aic = aic(fit.log_lik, fit.free_parameters);
    fr.converged = fit.converged;
    rep.families.push_back(fr);
  }
  double best = std::numeric_limits<double>::infinity();
  for (const auto& fr : rep.families) best = std::min(best, fr.aic);
  for (auto& fr : rep.families) fr.delta_aic = fr.aic - best;
  const JointFit& mle = *rep.mle;
  if (!rf.mle)
    rep.info_per_side = information_per_side(rep.test_family, std::exp(mle.log_mean), mle.shape);
  rep.suggested_shrink_games = empirical_bayes_shrink(mle, rep.info_per_side);

  // Plain fit (the league shape fixed when the season file fixes the Weibull shape).
  const std::optional<double> plain_fixed =
      season.model.family == config::ScoreFamily::kWeibull ? season.model.shape : std::nullopt;
  const PlainFit plain = fit_plain(sides, n, plain_fixed);
  rep.plain_shape = plain.shape;
  rep.plain_shape_se = plain.shape_se;

  const std::vector<TeamChiSquare> chi = team_chi_square(sides, n, mle, rep.test_family);
  for (const auto& c : chi) rep.tests += c.df > 0 ? 1 : 0;
  rep.per_test_alpha = rep.tests > 0 ? family_alpha / rep.tests : family_alpha;

  rep.teams.resize(n);
  double log_gm_s = 0.0, log_gm_a = 0.0;
  int with_games = 0;
  for (int i = 0; i < n; ++i) {
    if (plain.teams[i].scored.count > 0 && plain.teams[i].allowed.count > 0) {
      log_gm_s += std::log(plain.teams[i].scored.mean);
      log_gm_a += std::log(plain.teams[i].allowed.mean);
      ++with_games;
    }
  }
  if (with_games > 0) {
    log_gm_s /= with_games;
    log_gm_a /= with_games;
  }
  for (const Side& s : sides) {
    TeamReport& t = rep.teams[s.batting];
    t.runs_scored += s.runs;
    if (s.at_home) {
      ++rep.teams[s.batting].games;
      ++rep.teams[s.fielding].games;
    }
    (s.won ? t.wins : t.losses) += 1;
    rep.teams[s.fielding].runs_allowed += s.runs;
  }
  for (int i = 0; i < n; ++i) {
    TeamReport& t = rep.teams[i];
    const PlainTeam& p = plain.teams[i];
    if (t.games > 0) {
      t.runs_scored /= t.games;
      t.runs_allowed /= t.games;
    }
    t.plain_scored = p.scored.mean;
    t.plain_scored_se = p.scored.log_mean_se;
    t.plain_allowed = p.allowed.mean;
    t.plain_allowed_se = p.allowed.log_mean_se;
    if (p.scored.count > 0 && p.allowed.count > 0) {
      t.plain_offence = std::exp(std::log(p.scored.mean) - log_gm_s);
      t.plain_defence = std::exp(std::log(p.allowed.mean) - log_gm_a);
    }
    t.free_shape = p.free_shape;
    t.free_shape_se = p.free_shape_se;
    t.mle_offence = std::exp(mle.log_offence[i]);
    t.mle_defence = std::exp(mle.log_defence[i]);
    t.mle_log_offence_se = mle.se(mle.offence_index(i));
    t.mle_log_defence_se = mle.se(mle.defence_index(i));
    t.offence = rep.ratings.teams[i].offence;
    t.defence = rep.ratings.teams[i].defence;
    t.log_offence_se = rep.ratings.teams[i].log_offence_se;
    t.log_defence_se = rep.ratings.teams[i].log_defence_se;
    t.chi_square = chi[i].statistic;
    t.df = chi[i].df;
    t.bins_scored = chi[i].bins_scored;
    t.bins_allowed = chi[i].bins_allowed;
    t.p_value = chi[i].p_value;
    if (t.df > 0) {
      t.critical = chi_square_critical(t.df, rep.per_test_alpha);
      t.rejected = t.chi_square > t.critical;
      rep.rejected += t.rejected ? 1 : 0;
    }
    if (t.games > 0) {
      t.expected_pct = pythagorean_win_prob(t.runs_scored, t.runs_allowed, plain.shape);
      t.expected_wins = t.expected_pct * t.games;
      t.wins_minus_expected = t.wins - t.expected_wins;
    }
  }
  return rep;
}

}  // namespace standfast::models
