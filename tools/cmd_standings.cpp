// Placeholder until the owning work lands: the subcommand exists but refuses to run.
#include "tools/commands.h"

namespace standfast::tools {

void add_standings_command(CLI::App& app) {
  auto* cmd = app.add_subcommand("standings", "(not built yet)");
  cmd->callback([] { throw UsageError("the 'standings' command is not built yet"); });
}

}  // namespace standfast::tools
