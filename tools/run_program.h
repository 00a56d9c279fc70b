// Runs the command line on a configured CLI11 application and turns what happened into the
// program's exit status and message: 0 on success (and for --help, --version); 2 for the user's
// mistakes (a bad option or command, a bad season file, an output that cannot be written, a
// failed write to standard output); 1 for an internal error (any other exception: a bug, or the
// machine running out of memory), printed as "internal error: ...".
#ifndef STANDFAST_TOOLS_RUN_PROGRAM_H
#define STANDFAST_TOOLS_RUN_PROGRAM_H

#include <CLI/CLI.hpp>

namespace standfast::tools {

// Parses argv with `app` (whose commands do their work in callbacks) and returns the exit status.
int run_program(CLI::App& app, int argc, const char* const* argv);

}  // namespace standfast::tools

#endif  // STANDFAST_TOOLS_RUN_PROGRAM_H
