#include "engine/simulate.h"

#include <stdexcept>

namespace standfast::engine {

SimulationResult simulate(const Plan& plan, const RunOptions& options) {
  SimulationResult result;
  result.seed = options.seed;
  result.teams.resize(static_cast<std::size_t>(plan.teams));
  throw std::logic_error("simulate: not built yet");
}

}  // namespace standfast::engine
