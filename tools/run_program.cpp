#include "tools/run_program.h"

#include <fmt/core.h>

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
#include "tools/commands.h"

namespace standfast::tools {

int run_program(CLI::App& app, int argc, const char* const* argv) {
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
  } catch (const UsageError& e) {
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

}  // namespace standfast::tools
