#include "models/synthetic.h"

#include <fmt/core.h>

#include <cmath>
#include <pcg_random.hpp>
#include <stdexcept>

#include "models/score_dist.h"

namespace standfast::models {
namespace {

double uniform01(pcg64& rng) { return static_cast<double>(rng() >> 11) * 0x1.0p-53; }

double standard_normal(pcg64& rng) {
  for (;;) {  // Marsaglia polar method, one value per call
    const double u = 2.0 * uniform01(rng) - 1.0;
    const double v = 2.0 * uniform01(rng) - 1.0;
    const double s = u * u + v * v;
    if (s > 0.0 && s < 1.0) return u * std::sqrt(-2.0 * std::log(s) / s);
  }
}

int draw(const SyntheticLeague& l, double mean_runs, pcg64& rng) {
  const double u = uniform01(rng);
  switch (l.family) {
    case config::ScoreFamily::kWeibull:
      return quantile(weibull_for_mean(mean_runs, l.shape), u);
    case config::ScoreFamily::kNegativeBinomial:
      return quantile(negative_binomial_for_mean(mean_runs, l.shape), u);
    case config::ScoreFamily::kPoisson:
      return quantile(poisson_for_mean(mean_runs), u);
    case config::ScoreFamily::kLog5:
      break;
  }
  throw std::domain_error("synthetic league: family log5 has no scores");
}

struct Pairing {
  int home, away;
};

std::vector<Pairing> schedule(const SyntheticLeague& l, int n) {
  std::vector<Pairing> out;
  const int d = std::max(1, l.divisions);
  for (int i = 0; i < n; ++i) {
    for (int j = i + 1; j < n; ++j) {
      const int games = (i % d == j % d) ? l.games_within : l.games_across;
      for (int g = 0; g < games; ++g) out.push_back(g % 2 == 0 ? Pairing{i, j} : Pairing{j, i});
    }
  }
  return out;
}

void check(const SyntheticLeague& l) {
  if (l.log_offence.size() != l.log_defence.size() || l.log_offence.size() < 2) {
    throw std::domain_error(
        fmt::format("synthetic league: need matching ratings for >= 2 teams, got {} and {}",
                    l.log_offence.size(), l.log_defence.size()));
  }
}

}  // namespace

std::vector<double> synthetic_log_ratings(int teams, double sd, std::uint64_t seed) {
  pcg64 rng(seed);
  std::vector<double> out(teams);
  double sum = 0.0;
  for (double& v : out) {
    v = sd * standard_normal(rng);
    sum += v;
  }
  for (double& v : out) v -= sum / teams;
  return out;
}

std::vector<Side> synthetic_sides(const SyntheticLeague& l, std::uint64_t seed) {
  check(l);
  const int n = static_cast<int>(l.log_offence.size());
  pcg64 rng(seed);
  std::vector<Side> out;
  for (const Pairing& p : schedule(l, n)) {
    const double factor = l.run_factor.empty() ? 1.0 : l.run_factor[p.home];
    for (int s = 0; s < 2; ++s) {
      Side side;
      side.at_home = s == 0;
      side.batting = side.at_home ? p.home : p.away;
      side.fielding = side.at_home ? p.away : p.home;
      side.offset = std::log(factor);
      const double mu = l.league_mean *
                        std::exp(l.log_offence[side.batting] + l.log_defence[side.fielding]) *
                        factor * (side.at_home ? l.home_edge : 1.0);
      side.runs = draw(l, mu, rng);
      side.y = side.runs;
      out.push_back(side);
    }
    out[out.size() - 2].won = out[out.size() - 2].runs > out.back().runs;
    out.back().won = out.back().runs > out[out.size() - 2].runs;
  }
  return out;
}

config::Season synthetic_season(const SyntheticLeague& l, std::uint64_t seed) {
  check(l);
  const int n = static_cast<int>(l.log_offence.size());
  config::Season season;
  season.file = "generated";
  season.league.name = "Generated League";
  season.league.season_label = "test";
  season.model.family = l.family;
  config::Group div;
  div.id = "all";
  div.name = "All";
  for (int i = 0; i < n; ++i) {
    config::Team t;
    t.id = fmt::format("T{:02d}", i);
    t.name = fmt::format("Team {:02d}", i);
    t.venue = t.name;
    t.run_factor = l.run_factor.empty() ? 1.0 : l.run_factor[i];
    t.division = 0;
    t.conference = 0;
    season.teams.push_back(t);
    div.teams.push_back(i);
  }
  season.groups.push_back(div);
  season.conferences = {0};
  season.divisions = {0};
  const std::vector<Side> sides = synthetic_sides(l, seed);
  pcg64 tie_rng(seed ^ 0x9e3779b97f4a7c15ULL);
  for (size_t k = 0; k + 1 < sides.size(); k += 2) {
    config::Game g;
    g.date = static_cast<config::DayNumber>(k / 2);
    g.home = sides[k].batting;
    g.away = sides[k].fielding;
    g.played = true;
    g.home_runs = sides[k].runs;
    g.away_runs = sides[k + 1].runs;
    g.innings = 9;
    if (g.home_runs == g.away_runs) {
      (uniform01(tie_rng) < 0.5 ? g.home_runs : g.away_runs) += 1;
      g.innings = 10;
    }
    season.games.push_back(g);
  }
  return season;
}

}  // namespace standfast::models
