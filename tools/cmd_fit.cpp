// Placeholder until the owning work lands: the subcommand exists but refuses to run.
#include "tools/commands.h"

namespace standfast::tools {

void add_fit_command(CLI::App& app) {
  auto* cmd = app.add_subcommand("fit", "(not built yet)");
  cmd->callback([] { throw UsageError("the 'fit' command is not built yet"); });
}

}  // namespace standfast::tools
