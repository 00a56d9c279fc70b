#include "models/ratings.h"

#include <fmt/core.h>

#include <cmath>
#include <stdexcept>

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

// Provisional: runs per game relative to the league (replaced by the maximum-likelihood fit).
LeagueRatings fit_ratings(const config::Season& season) {
  const int n = static_cast<int>(season.teams.size());
  LeagueRatings out;
  out.family = season.model.family;
  out.shape = season.model.shape.value_or(1.8);
  out.home_edge = season.model.home_edge.value_or(1.0);
  out.teams.assign(n, TeamRating{});
  out.cholesky.assign(4 * n * n, 0.0);
  if (out.family == config::ScoreFamily::kLog5) return out;
  std::vector<double> rs(n), ra(n), games(n);
  double total = 0;
  int sides = 0;
  for (const auto& g : season.games) {
    if (!g.played) continue;
    if (g.home < 0 || g.home >= n || g.away < 0 || g.away >= n) {
      throw std::domain_error("fit_ratings: game with a team index out of range");
    }
    rs[g.home] += g.home_runs;
    ra[g.home] += g.away_runs;
    rs[g.away] += g.away_runs;
    ra[g.away] += g.home_runs;
    games[g.home] += 1;
    games[g.away] += 1;
    total += g.home_runs + g.away_runs;
    sides += 2;
    ++out.games_fitted;
  }
  if (sides == 0) return out;
  out.league_mean = total / sides;
  const double k = season.model.shrink_games;
  for (int i = 0; i < n; ++i) {
    auto& t = out.teams[i];
    const double w = games[i] / (games[i] + k + 1e-300);
    if (games[i] > 0) {
      t.offence = std::pow(rs[i] / games[i] / out.league_mean, w);
      t.defence = std::pow(ra[i] / games[i] / out.league_mean, w);
    }
    t.log_offence_se = std::sqrt(0.4 / (games[i] + k + 1e-9));
    t.log_defence_se = t.log_offence_se;
    out.cholesky[i * 2 * n + i] = t.log_offence_se;
    out.cholesky[(n + i) * 2 * n + n + i] = t.log_defence_se;
  }
  return out;
}

}  // namespace standfast::models
