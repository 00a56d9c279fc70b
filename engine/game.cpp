#include "engine/game.h"

namespace standfast::engine {

ExtraInnings::ExtraInnings(int regulation_innings, const config::ExtraInningsRule& rule)
    : regulation_(regulation_innings > 0 ? regulation_innings : 9), max_innings_(rule.max_innings) {
  per_inning_ = (1.0 - RUN_CONTINUATION) / regulation_;
  if (rule.runner_on_second) per_inning_ *= RUNNER_FACTOR;
}

void ExtraInnings::play_chances(Rng& rng, double home_chance, double away_chance, GameResult& r,
                                bool cap_innings) const {
  Sides sides;
  sides.home_chance = home_chance;
  sides.away_chance = away_chance;
  std::uint32_t open = 0;
  Outcome out;
  const std::size_t drawn = play_all(
      rng, 1, [&](std::size_t) -> const Sides& { return sides; }, &open, &out, cap_innings);
  r.extra = true;
  r.drawn = drawn > 0;
  r.home_runs += static_cast<int>(out.home_runs);
  r.away_runs += static_cast<int>(out.away_runs);
  r.home_won = out.home_won;
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
