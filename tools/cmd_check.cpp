// Placeholder until the owning work lands: the subcommand exists but refuses to run.
#include "tools/commands.h"

namespace standfast::tools {

void add_check_command(CLI::App& app) {
  auto* cmd = app.add_subcommand("check", "(not built yet)");
  cmd->callback([] { throw UsageError("the 'check' command is not built yet"); });
}

}  // namespace standfast::tools
