#include "engine/game.h"

namespace standfast::engine {

ExtraInnings::ExtraInnings(int regulation_innings, const config::ExtraInningsRule& rule)
    : regulation_(regulation_innings > 0 ? regulation_innings : 9), max_innings_(rule.max_innings) {
  per_inning_ = (1.0 - RUN_CONTINUATION) / regulation_;
  if (rule.runner_on_second) per_inning_ *= RUNNER_FACTOR;
}

void ExtraInnings::play_chances(Rng& rng, double home_chance, double away_chance, GameResult& r,
                                bool cap_innings) const {
  r.extra = true;
  for (int number = regulation_ + 1;; ++number) {
    if (cap_innings && max_innings_ > 0 && number > max_innings_) {
      r.drawn = true;
      r.home_won = (rng() >> 63) != 0;
      return;
    }
    const Inning x = inning(rng(), home_chance, away_chance);
    r.away_runs += x.away;
    r.home_runs += x.home;
    if (x.home != x.away) {
      r.home_won = x.home > x.away;
      return;
    }
  }
}

namespace {
CountFamily count_family(GameModel m) {
  return m == GameModel::kPoisson ? CountFamily::kPoisson : CountFamily::kNegativeBinomial;
}
}  // namespace

GameEngine::GameEngine(const Plan& plan)
    : model_(plan.model), extra_(plan.regulation_innings, plan.extra_innings) {
  if (model_ == GameModel::kWeibull) {
    weibull_ = WeibullTable(plan.shape);
    // The largest Q(u) is at the largest u: scale x Q stays within max_regulation_runs().
    scale_cap_ = max_regulation_runs() / weibull_.exact_quantile(0xffffffffu);
  }
  if (model_ == GameModel::kNegativeBinomial || model_ == GameModel::kPoisson)
    counts_ = CountTable(count_family(model_), plan.nb_size);
}

}  // namespace standfast::engine
