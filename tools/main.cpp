// The `standfast` command-line program: a thin layer over the libraries.
#include <fmt/core.h>

#include <CLI/CLI.hpp>
#include <algorithm>
#include <cerrno>
#include <cstdio>
#include <cstring>
#include <exception>
#include <string>
#include <system_error>
#include <vector>

#include "config/load.h"
#include "config/suggest.h"
#include "tools/cli.h"
#include "tools/commands.h"
#include "tools/processes.h"

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
  // A first word that is neither an option nor a command: name it (CLI11 would only say that a
  // command is required).
  if (argc > 1 && argv[1][0] != '-') {
    std::vector<std::string> names;
    for (const CLI::App* sub : app.get_subcommands({})) names.push_back(sub->get_name());
    if (std::find(names.begin(), names.end(), argv[1]) == names.end()) {
      std::string list;
      for (const auto& n : names) list += (list.empty() ? "" : ", ") + n;
      fmt::print(stderr, "error: unknown command '{}'{}; the commands are {}\n", argv[1],
                 config::did_you_mean(argv[1], names), list);
      return 2;
    }
  }
  try {
    app.parse(argc, argv);
  } catch (const CLI::ParseError& e) {
    const int code = app.exit(e);
    return code == 0 ? 0 : 2;
  } catch (const config::ConfigError& e) {
    fmt::print(stderr, "{}\n", e.what());
    return 2;
  } catch (const tools::UsageError& e) {
    fmt::print(stderr, "error: {}\n", e.what());
    return 2;
  } catch (const std::system_error& e) {
    // fmt::print reports a failed write to standard output this way (a full disk, for example).
    if (std::ferror(stdout)) {
      fmt::print(stderr, "error: standard output: write failed: {}\n", e.code().message());
      return 2;
    }
    fmt::print(stderr, "internal error: {}\n", e.what());
    return 1;
  } catch (const std::exception& e) {
    fmt::print(stderr, "internal error: {}\n", e.what());
    return 1;
  }
  // What the commands printed must have reached its destination (a full disk, a closed pipe).
  if (std::fflush(stdout) != 0 || std::ferror(stdout)) {
    fmt::print(stderr, "error: standard output: write failed: {}\n", std::strerror(errno));
    return 2;
  }
  return 0;
}
