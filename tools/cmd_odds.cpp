// Placeholder until the owning work lands: the subcommand exists but refuses to run.
#include "tools/commands.h"

namespace standfast::tools {

void add_odds_command(CLI::App& app) {
  auto* cmd = app.add_subcommand("odds", "(not built yet)");
  cmd->callback([] { throw UsageError("the 'odds' command is not built yet"); });
}

}  // namespace standfast::tools
