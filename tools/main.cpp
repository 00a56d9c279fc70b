// The `standfast` command-line program: a thin layer over the libraries.
#include <CLI/CLI.hpp>

#include "tools/cli.h"
#include "tools/commands.h"
#include "tools/processes.h"
#include "tools/run_program.h"

int main(int argc, char** argv) {
  using namespace standfast;
  const tools::ProcessGroup processes(&argc, &argv);  // MPI_Init/MPI_Finalize in an MPI build
  CLI::App app{
      "standfast: Monte Carlo season and standings simulator.\n"
      "Odds are model estimates under stated assumptions, not advice for wagering."};
  app.require_subcommand(1);
  tools::add_version_flag(app);
  tools::add_check_command(app);
  tools::add_standings_command(app);
  tools::add_fit_command(app);
  tools::add_odds_command(app);
  tools::add_backtest_command(app);
  tools::add_history_commands(app);
  tools::add_whatif_command(app);
  tools::add_worth_command(app);
  tools::add_stakes_command(app);
  tools::add_families_command(app);
  return tools::run_program(app, argc, argv);
}
