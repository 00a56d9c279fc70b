#include "models/ratings.h"

#include <fmt/core.h>

#include <cmath>
#include <stdexcept>

#include "models/fit_report.h"
#include "models/shrink_spread.h"

namespace standfast::models {

double LeagueRatings::expected_runs(int batting, int fielding, double run_factor,
                                    bool batting_at_home) const {
  const int n = static_cast<int>(teams.size());
  if (batting < 0 || batting >= n || fielding < 0 || fielding >= n) {
    throw std::domain_error(
        fmt::format("expected_runs: team index out of range (batting {}, fielding {}, {} teams)",
                    batting, fielding, n));
  }
  return league_mean * teams[batting].offence * teams[fielding].defence * run_factor *
         (batting_at_home ? home_edge : 1.0);
}

namespace {

// Defaults when nothing can be fitted (no game played yet).
// league mean 4.5 runs per side: from memory (typical of professional baseball);
// Weibull gamma 1.82: Miller (2007) best fit, REFERENCE_VALUES.md section 11;
// negative-binomial size 10: from memory (variance about 1.5 x mean at 4.5 runs).
constexpr double DEFAULT_MEAN = 4.5;
constexpr double DEFAULT_GAMMA = 1.82;
constexpr double DEFAULT_SIZE = 10.0;

LeagueRatings from_fit(const JointFit& f, config::ScoreFamily family) {
  LeagueRatings r;
  const int n = f.teams;
  r.family = family;
  r.league_mean = std::exp(f.log_mean);
  r.shape = f.shape;
  r.home_edge = std::exp(f.log_home);
  r.league_mean_se = r.league_mean * f.se(JointFit::LOG_MEAN);
  r.home_edge_se = r.home_edge * f.se(JointFit::LOG_HOME);
  r.shape_se = r.shape * f.se(f.log_shape_index());
  r.log_lik = f.log_lik;
  r.converged = f.converged;
  r.teams.resize(n);
  for (int i = 0; i < n; ++i) {
    r.teams[i].offence = std::exp(f.log_offence[i]);
    r.teams[i].defence = std::exp(f.log_defence[i]);
    r.teams[i].log_offence_se = f.se(f.offence_index(i));
    r.teams[i].log_defence_se = f.se(f.defence_index(i));
  }
  r.strengths = f.strengths;
  return r;
}

}  // namespace

RatingsFit fit_ratings_detail(const config::Season& season) {
  const auto& spec = season.model;
  const int n = static_cast<int>(season.teams.size());
  if (!(spec.shrink_games >= 0.0) || !std::isfinite(spec.shrink_games)) {
    throw std::domain_error(
        fmt::format("fit_ratings: shrink_games must be >= 0, got {}", spec.shrink_games));
  }
  RatingsFit out;
  out.sides = played_sides(season);
  LeagueRatings& r = out.ratings;
  r.family = spec.family;
  r.teams.assign(n, TeamRating{});
  for (const auto& g : season.games) r.games_fitted += g.played ? 1 : 0;
  if (spec.family == config::ScoreFamily::kLog5) {
    r.shape = 0.0;
    r.home_edge = spec.home_edge.value_or(1.0);
    return out;
  }
  if (out.sides.empty()) {
    // Nothing played: league defaults; the prior alone gives the uncertainty.
    r.league_mean = DEFAULT_MEAN;
    r.shape = spec.family == config::ScoreFamily::kWeibull ? spec.shape.value_or(DEFAULT_GAMMA)
              : spec.family == config::ScoreFamily::kNegativeBinomial
                  ? spec.shape.value_or(DEFAULT_SIZE)
                  : 0.0;
    r.home_edge = spec.home_edge.value_or(1.0);
    if (spec.shrink_games > 0.0) {
      out.shrink_games = r.shrink_games = spec.shrink_games;
      out.info_per_side = information_per_side(spec.family, r.league_mean, r.shape);
      out.prior_precision = spec.shrink_games * out.info_per_side;
      const double se = 1.0 / std::sqrt(out.prior_precision);
      for (int i = 0; i < n; ++i) r.teams[i].log_offence_se = r.teams[i].log_defence_se = se;
      const std::vector<double> ses(static_cast<size_t>(n), se);
      r.strengths = diagonal_sampler(ses, ses);
    }
    return out;
  }
  if (spec.shrink_games == 0.0 && !spec.shrink_auto) {
    std::vector<int> sides_of(n, 0);
    for (const Side& s : out.sides) ++sides_of[s.batting];
    for (int i = 0; i < n; ++i) {
      if (sides_of[i] == 0) {
        throw std::domain_error(fmt::format(
            "fit_ratings: team {} has no played game; its rating needs model.shrink_games > 0",
            season.teams[i].id));
      }
    }
  }
  JointOptions o;
  o.family = spec.family;
  o.shape = spec.family == config::ScoreFamily::kPoisson ? std::nullopt : spec.shape;
  o.home_edge = spec.home_edge;
  o.adjust_shape = spec.adjusted_shape;
  // The maximum-likelihood fit (a vanishing prior keeps a team without games defined).
  o.prior_precision = spec.shrink_games > 0.0 || spec.shrink_auto ? 1e-9 : 0.0;
  out.mle = fit_joint(out.sides, n, o);
  out.info_per_side =
      information_per_side(spec.family, std::exp(out.mle->log_mean), out.mle->shape);
  out.shrink_games =
      spec.shrink_auto ? auto_shrink_games(*out.mle, out.info_per_side) : spec.shrink_games;
  if (out.shrink_games > 0.0) {
    // A prior worth `shrink_games` games of league-average scoring on each log rating.
    out.prior_precision = out.shrink_games * out.info_per_side;
    o.prior_precision = out.prior_precision;
    o.start = &*out.mle;
    out.shrunk = fit_joint(out.sides, n, o);
  }
  const JointFit& used = out.shrunk ? *out.shrunk : *out.mle;
  const int games = r.games_fitted;
  r = from_fit(used, spec.family);
  r.games_fitted = games;
  r.shrink_games = out.shrink_games;
  if (spec.shrink_auto && spec.strength_uncertainty) {
    // The estimated shrinkage's own uncertainty, one more draw per simulated season.
    add_shrink_spread(r.strengths, *out.mle, shrink_spread(*out.mle).sd_kept);
  }
  return out;
}

LeagueRatings fit_ratings(const config::Season& season) {
  return fit_ratings_detail(season).ratings;
}

}  // namespace standfast::models
