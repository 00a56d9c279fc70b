// Tests of tools/output.h: output files written whole or not at all, safely.
// References: POSIX.1-2017 (The Open Group Base Specifications Issue 7): rename() replaces the
// target atomically and acts on a symbolic link itself, not its target; mkstemp() creates the file
// with O_CREAT|O_EXCL and mode 0600; lstat() reports a link as S_IFLNK; st_dev and st_ino
// identify a file; a signal whose action is the default ends the process
// (WIFSIGNALED/WTERMSIG). Linux /dev/full fails every write with ENOSPC (full(4) man page).
#include "tools/output.h"

#include <sys/stat.h>
#include <sys/wait.h>
#include <unistd.h>

#include <catch2/catch.hpp>
#include <csignal>
#include <filesystem>
#include <fstream>
#include <functional>
#include <set>
#include <sstream>
#include <string>

#include "tools/commands.h"

namespace fs = std::filesystem;
using Catch::Matchers::Contains;
using standfast::tools::check_output_target;
using standfast::tools::UsageError;
using standfast::tools::write_output;

namespace {

fs::path fresh_dir(const std::string& name) {
  const fs::path dir = fs::path(STANDFAST_BINARY_DIR) / "output_test" / name;
  fs::remove_all(dir);
  fs::create_directories(dir);
  return dir;
}

std::string read_file(const fs::path& p) {
  std::ifstream in(p, std::ios::binary);
  std::ostringstream s;
  s << in.rdbuf();
  return s.str();
}

// Names in `dir` other than `keep`: leftovers such as temporary files.
int others_in(const fs::path& dir, const std::string& keep) {
  int n = 0;
  for (const auto& e : fs::directory_iterator(dir)) n += e.path().filename() != keep;
  return n;
}

std::string error_of(const std::function<void()>& f) {
  try {
    f();
  } catch (const UsageError& e) {
    return e.what();
  }
  return "";
}

}  // namespace

TEST_CASE("a new file is written whole, with the default mode, and nothing else is left") {
  const fs::path dir = fresh_dir("new");
  const fs::path out = dir / "odds.csv";
  write_output(out.string(), "a,b\n1,2\n");
  CHECK(read_file(out) == "a,b\n1,2\n");
  CHECK(others_in(dir, "odds.csv") == 0);
  const mode_t mask = ::umask(0);
  ::umask(mask);
  struct stat st {};
  REQUIRE(::stat(out.c_str(), &st) == 0);
  CHECK((st.st_mode & 0777) == (0666 & ~mask));
}

TEST_CASE("rewriting a file keeps its mode") {
  const fs::path dir = fresh_dir("mode");
  const fs::path out = dir / "report.txt";
  write_output(out.string(), "first\n");
  REQUIRE(::chmod(out.c_str(), 0640) == 0);
  write_output(out.string(), "second\n");
  struct stat st {};
  REQUIRE(::stat(out.c_str(), &st) == 0);
  CHECK((st.st_mode & 07777) == 0640);
  CHECK(read_file(out) == "second\n");
}

TEST_CASE("a symbolic link, a directory or a device is refused and left alone") {
  const fs::path dir = fresh_dir("links");
  const fs::path real = dir / "real.txt";
  write_output(real.string(), "keep\n");
  const fs::path link = dir / "link.txt";
  fs::create_symlink(real, link);
  CHECK_THAT(error_of([&] { write_output(link.string(), "x"); }),
             Contains("link.txt: is a symbolic link"));
  CHECK_THAT(error_of([&] { check_output_target(link.string()); }),
             Contains("link.txt: is a symbolic link"));
  CHECK(fs::is_symlink(link));
  CHECK(read_file(real) == "keep\n");
  CHECK_THAT(error_of([&] { write_output(dir.string(), "x"); }),
             Contains(": is a directory, not a regular file"));
  CHECK_THAT(error_of([&] { check_output_target("/dev/zero"); }),
             Contains("/dev/zero: is a character device, not a regular file"));
  CHECK(others_in(dir, "real.txt") == 1);  // the link only
}

TEST_CASE("an output that is an input of the run is refused, also through a hard link") {
  const fs::path dir = fresh_dir("inputs");
  const fs::path season = dir / "season.yaml";
  write_output(season.string(), "standfast: 1\n");
  const fs::path hard = dir / "other-name.yaml";
  fs::create_hard_link(season, hard);
  CHECK_THAT(error_of([&] { check_output_target(season.string(), {season.string()}); }),
             Contains("season.yaml: is the input file"));
  CHECK_THAT(error_of([&] {
               check_output_target(hard.string(), {"x.csv", season.string()});
             }),
             Contains("other-name.yaml: is the input file"));
  CHECK(error_of([&] { check_output_target((dir / "new.txt").string(), {season.string()}); }) ==
        "");
  CHECK(error_of([&] { check_output_target("-", {season.string()}); }) == "");
}

TEST_CASE("a folder that does not exist or cannot be written is found before any work") {
  const fs::path dir = fresh_dir("folders");
  CHECK_THAT(error_of([&] { check_output_target((dir / "no" / "such" / "x.csv").string()); }),
             Contains("cannot write in folder"));
  if (::geteuid() != 0) {  // root may write anywhere
    const fs::path locked = dir / "locked";
    fs::create_directory(locked);
    ::chmod(locked.c_str(), 0500);
    CHECK_THAT(error_of([&] { check_output_target((locked / "x.csv").string()); }),
               Contains("Permission denied"));
    ::chmod(locked.c_str(), 0700);
  }
}

TEST_CASE("a long but legal name works: the temporary name is short") {
  const fs::path dir = fresh_dir("long");
  const std::string name(255, 'n');  // NAME_MAX on Linux file systems
  write_output((dir / name).string(), "ok\n");
  CHECK(read_file(dir / name) == "ok\n");
  CHECK(others_in(dir, name) == 0);
}

TEST_CASE("temporary names are unpredictable and never replace what is there") {
  const fs::path dir = fresh_dir("temp");
  std::set<std::string> names;
  for (int i = 0; i < 3; ++i) {
    standfast::tools::detail::write_file((dir / "x").string(), "x", [&] {
      for (const auto& e : fs::directory_iterator(dir)) {
        if (e.path().filename() != "x") names.insert(e.path().filename().string());
      }
    });
  }
  CHECK(names.size() == 3);  // a fresh random name each time (mkstemp)
  CHECK(others_in(dir, "x") == 0);
}

TEST_CASE("SIGTERM or SIGINT during the write leaves no temporary file and the old file intact") {
  for (const int sig : {SIGTERM, SIGINT}) {
    const fs::path dir = fresh_dir("signal" + std::to_string(sig));
    const fs::path out = dir / "odds.json";
    write_output(out.string(), "old\n");
    const pid_t child = ::fork();
    REQUIRE(child >= 0);
    if (child == 0) {
      standfast::tools::detail::write_file(out.string(), "new\n", [sig] { ::raise(sig); });
      ::_exit(0);  // not reached: the signal ends the process
    }
    int status = 0;
    REQUIRE(::waitpid(child, &status, 0) == child);
    CHECK(WIFSIGNALED(status));
    CHECK(WTERMSIG(status) == sig);
    CHECK(read_file(out) == "old\n");
    CHECK(others_in(dir, "odds.json") == 0);
  }
}

TEST_CASE("a full device as standard output is an error, not a silent success") {
  if (!fs::exists("/dev/full")) return;
  const pid_t child = ::fork();
  REQUIRE(child >= 0);
  if (child == 0) {
    if (!std::freopen("/dev/full", "w", stdout)) ::_exit(3);
    try {
      write_output("", std::string(100000, 'x'));
    } catch (const UsageError& e) {
      ::_exit(std::string(e.what()).find("standard output: write failed: No space left on "
                                         "device") != std::string::npos
                  ? 2
                  : 4);
    }
    ::_exit(0);
  }
  int status = 0;
  REQUIRE(::waitpid(child, &status, 0) == child);
  REQUIRE(WIFEXITED(status));
  CHECK(WEXITSTATUS(status) == 2);
}
