#include "engine/plan.h"

#include <stdexcept>

namespace standfast::engine {

Plan compile_plan(const config::Season& season, const models::LeagueRatings& /*ratings*/) {
  Plan plan;
  plan.teams = static_cast<int>(season.teams.size());
  throw std::logic_error("compile_plan: not built yet");
}

}  // namespace standfast::engine
