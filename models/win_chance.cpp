#include "models/win_chance.h"

#include <algorithm>
#include <cmath>
#include <stdexcept>
#include <string>
#include <vector>

#include "models/score_dist.h"

namespace standfast::models {

RegulationChances regulation_chances(config::ScoreFamily family, double shape, double runs_for,
                                     double runs_against) {
  if (family == config::ScoreFamily::kLog5)
    throw std::domain_error("regulation_chances: the log5 model has no scores");
  for (double m : {runs_for, runs_against})
    if (!(m > 0) || !std::isfinite(m))
      throw std::domain_error(
          "regulation_chances: expected runs must be positive and finite, got " +
          std::to_string(m));
  const std::vector<double> x = score_cdf_table(family, runs_for, shape, 1e-15);
  const std::vector<double> y = score_cdf_table(family, runs_against, shape, 1e-15);
  // P(X = k) P(Y < k) and P(X = k) P(Y = k), summed over k.
  auto cdf = [](const std::vector<double>& c, std::size_t k) { return k < c.size() ? c[k] : 1.0; };
  RegulationChances r;
  double prev = 0;
  for (std::size_t k = 0; k < x.size(); ++k) {
    const double px = x[k] - prev;
    prev = x[k];
    const double below = k == 0 ? 0.0 : cdf(y, k - 1);
    r.win += px * below;
    r.tie += px * (cdf(y, k) - below);
  }
  r.loss = std::max(1.0 - r.win - r.tie, 0.0);
  return r;
}

double game_win_chance(config::ScoreFamily family, double shape, double runs_for,
                       double runs_against) {
  const RegulationChances r = regulation_chances(family, shape, runs_for, runs_against);
  const double decided = r.win + r.loss;
  return decided > 0 ? r.win + r.tie * r.win / decided : 0.5;
}

double log5_win_chance(double odds_for, double odds_against) {
  return odds_for / (odds_for + odds_against);
}

}  // namespace standfast::models
