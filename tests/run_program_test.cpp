// Tests for tools/run_program.h: the exit status and message of every way a run can end. The
// statuses are the project's own contract (README "Commands": 0 success, 1 internal error, 2 the
// user's mistake); an internal error cannot be caused from the command line on purpose, so
// commands that throw stand in for one here.
#include "tools/run_program.h"

#include <fcntl.h>
#include <unistd.h>

#include <catch2/catch.hpp>
#include <cstdio>
#include <fstream>
#include <new>
#include <sstream>
#include <stdexcept>
#include <string>
#include <system_error>
#include <vector>

#include "tools/commands.h"

using standfast::tools::run_program;
using standfast::tools::UsageError;

namespace {

struct Outcome {
  int status = -1;
  std::string err;
};

// Runs `args` on an application whose command `fail` throws what `thrower` throws, with standard
// error captured.
template <class Thrower>
Outcome run(std::vector<const char*> args, Thrower thrower) {
  CLI::App app{"test"};
  app.require_subcommand(1);
  app.add_subcommand("fail", "throws")->callback(thrower);
  app.add_subcommand("pass", "does nothing");
  const std::string path = "run_program_test.err";
  std::fflush(stderr);
  const int saved = dup(2);
  const int fd = open(path.c_str(), O_WRONLY | O_CREAT | O_TRUNC, 0600);
  dup2(fd, 2);
  close(fd);
  args.insert(args.begin(), "standfast");
  Outcome o;
  o.status = run_program(app, static_cast<int>(args.size()), args.data());
  std::fflush(stderr);
  dup2(saved, 2);
  close(saved);
  std::ifstream in(path);
  std::stringstream ss;
  ss << in.rdbuf();
  o.err = ss.str();
  std::remove(path.c_str());
  return o;
}

}  // namespace

TEST_CASE("exit statuses: 0 success, 2 the user's mistake, 1 an internal error") {
  using Catch::Matchers::Contains;
  CHECK(run({"pass"}, [] {}).status == 0);
  CHECK(run({"--help"}, [] {}).status == 0);

  const Outcome unknown = run({"pas"}, [] {});
  CHECK(unknown.status == 2);
  CHECK_THAT(unknown.err, Contains("unknown command 'pas' (did you mean 'pass'?)"));
  CHECK(run({"pass", "--no-such-option"}, [] {}).status == 2);
  const Outcome usage = run({"fail"}, [] { throw UsageError("--seasons: must be at least 1"); });
  CHECK(usage.status == 2);
  CHECK(usage.err == "error: --seasons: must be at least 1\n");

  const Outcome bug = run({"fail"}, [] { throw std::logic_error("a broken invariant"); });
  CHECK(bug.status == 1);
  CHECK(bug.err == "internal error: a broken invariant\n");
  const Outcome memory = run({"fail"}, [] { throw std::bad_alloc(); });
  CHECK(memory.status == 1);
  CHECK_THAT(memory.err, Contains("internal error:"));
  const Outcome system = run({"fail"}, [] {
    throw std::system_error(std::make_error_code(std::errc::io_error), "reading");
  });
  CHECK(system.status == 1);  // standard output is fine, so not a failed write
  CHECK_THAT(system.err, Contains("internal error: reading"));
}
