// Tests of tools/cli.h, the command-line layer every subcommand shares: numeric validators,
// output-path checks, help style, --version and the warning format, directly and through the
// built program.
// References: the program's own contract (README.md "Commands", DEVELOPERS.md): exit status 2
// for bad input; warnings as FILE:LINE:COLUMN: warning: message (the GNU Coding Standards,
// "Formatting Error Messages", 2023: `sourcefile:lineno:column: message`).
#include "tools/cli.h"

#include <catch2/catch.hpp>
#include <cstdint>
#include <filesystem>
#include <fstream>
#include <limits>
#include <string>
#include <vector>

#include "tests/process_support.h"
#include "tools/commands.h"

namespace fs = std::filesystem;
using standfast::tools::UsageError;

namespace {

const std::string PROGRAM = STANDFAST_BINARY_DIR "/tools/standfast";
const std::string SMALL = STANDFAST_SOURCE_DIR "/scenarios/small/season.yaml";

// Parses `--n VALUE` into an unsigned option checked by `validator`; returns the error text,
// or "" when it was accepted.
std::string parse_with(const CLI::Validator& validator, const std::string& value) {
  CLI::App app;
  std::uint64_t n = 0;
  app.add_option("--n", n)->check(validator);
  std::vector<std::string> args = {value, "--n"};  // CLI11 takes the arguments in reverse
  try {
    app.parse(args);
  } catch (const CLI::ParseError& e) {
    return e.what();
  }
  return "";
}

std::string parse_real(const standfast::tools::RealRange& range, const std::string& value) {
  CLI::App app;
  double x = 0;
  app.add_option("--x", x)->check(standfast::tools::real_number(range));
  std::vector<std::string> args = {value, "--x"};
  try {
    app.parse(args);
  } catch (const CLI::ParseError& e) {
    return e.what();
  }
  return "";
}

}  // namespace

TEST_CASE("whole_number refuses negative, zero below the minimum, junk and overflow") {
  const auto v = standfast::tools::whole_number(1, 1'000'000'000);
  CHECK(parse_with(v, "5").empty());
  CHECK(parse_with(v, "1000000000").empty());
  CHECK(parse_with(v, "-5").find("negative") != std::string::npos);
  CHECK(parse_with(v, "-5").find("--n") != std::string::npos);
  CHECK(parse_with(v, "0").find("from 1 to 1000000000") != std::string::npos);
  CHECK(parse_with(v, "1000000001").find("too large") != std::string::npos);
  // 2^64 does not fit an unsigned 64-bit number.
  // Ref: common practice (2^64 = 18446744073709551616, exact integer arithmetic).
  CHECK(parse_with(v, "18446744073709551616").find("too large") != std::string::npos);
  CHECK_FALSE(parse_with(v, "abc").empty());
  CHECK_FALSE(parse_with(v, "1e6").empty());
  CHECK_FALSE(parse_with(v, "2.5").empty());
  CHECK_FALSE(parse_with(v, "").empty());
  const auto any = standfast::tools::whole_number(0, std::numeric_limits<std::uint64_t>::max());
  CHECK(parse_with(any, "18446744073709551615").empty());
  CHECK(parse_with(any, "0").empty());
  CHECK_FALSE(parse_with(any, "-1").empty());
}

TEST_CASE("real_number refuses nan, inf, junk and values outside the range") {
  const standfast::tools::RealRange r{0.0, 0.5, false, true};  // [0, 0.5)
  CHECK(parse_real(r, "0").empty());
  CHECK(parse_real(r, "0.002").empty());
  CHECK(parse_real(r, "2e-3").empty());
  CHECK_FALSE(parse_real(r, "0.5").empty());
  CHECK_FALSE(parse_real(r, "-0.1").empty());
  CHECK_FALSE(parse_real(r, "nan").empty());
  CHECK_FALSE(parse_real(r, "inf").empty());
  CHECK_FALSE(parse_real(r, "x").empty());
  CHECK_FALSE(parse_real(r, "0.1x").empty());
  const standfast::tools::RealRange open{0.0, 1.0, true, true};
  CHECK_FALSE(parse_real(open, "0").empty());
  CHECK_FALSE(parse_real(open, "1").empty());
  CHECK(parse_real(open, "0.05").empty());
}

TEST_CASE("check_output_path finds unwritable paths before any work") {
  const fs::path dir = fs::path(STANDFAST_BINARY_DIR) / "cli_test" / "paths";
  fs::remove_all(dir);
  fs::create_directories(dir);
  std::ofstream(dir / "plain") << "x";
  using standfast::tools::check_output_path;
  CHECK_NOTHROW(check_output_path(""));
  CHECK_NOTHROW(check_output_path("-"));
  CHECK_NOTHROW(check_output_path((dir / "new.csv").string()));
  CHECK_NOTHROW(check_output_path((dir / "plain").string()));  // replaced whole
  CHECK_THROWS_AS(check_output_path(dir.string()), UsageError);
  CHECK_THROWS_AS(check_output_path((dir / "missing" / "x.csv").string()), UsageError);
  CHECK_THROWS_AS(check_output_path((dir / "plain" / "x.csv").string()), UsageError);
  try {
    check_output_path((dir / "missing" / "x.csv").string());
  } catch (const UsageError& e) {
    CHECK(std::string(e.what()).find("does not exist") != std::string::npos);
  }
}

TEST_CASE("help text, version and warning lines have one form") {
  using namespace standfast::tools;
  CHECK(help_text("Simulated seasons", "100000") == "Simulated seasons (default: 100000)");
  CHECK(help_text("The season file (YAML)") == "The season file (YAML)");
  CHECK(version_text().find("season-file format 1") != std::string::npos);
  standfast::config::Diagnostic d;
  d.pos.file = "league.yaml";
  d.pos.line = 12;
  d.pos.column = 7;
  d.message = "games_per_team: 160 stated";
  CHECK(warning_line(d) == "league.yaml:12:7: warning: games_per_team: 160 stated");
}

TEST_CASE("the program: --version, bad numbers exit 2, help shows one style") {
  using standfast::testing::run_process;
  const auto version = run_process(PROGRAM + " --version");
  CHECK(version.status == 0);
  CHECK(version.out.find("season-file format 1") != std::string::npos);

  const auto negative = run_process(PROGRAM + " odds " + SMALL + " --seasons -5 2>&1");
  CHECK(negative.status == 2);
  CHECK(negative.out.find("--seasons") != std::string::npos);
  CHECK(negative.out.find("negative") != std::string::npos);
  for (const char* bad :
       {"--seasons 0", "--seasons abc", "--seasons 99999999999", "--seed -1", "--threads -2",
        "--threads 100000", "--target-se -0.1", "--target-se nan"}) {
    INFO(bad);
    CHECK(run_process(PROGRAM + " odds " + SMALL + " " + bad + " 2>/dev/null").status == 2);
  }
  CHECK(run_process(PROGRAM + " fit " + SMALL + " --alpha 0 2>/dev/null").status == 2);
  CHECK(run_process(PROGRAM + " fit " + SMALL + " --alpha 1.5 2>/dev/null").status == 2);

  for (const char* command : {"check", "standings", "fit", "odds"}) {
    INFO(command);
    const auto help = run_process(PROGRAM + " " + command + " --help");
    CHECK(help.status == 0);
    CHECK(help.out.find("SEASON_FILE") != std::string::npos);
    CHECK(help.out.find("The season file (YAML)") != std::string::npos);
    CHECK(help.out.find("--format") != std::string::npos);
    CHECK(help.out.find("(default: table)") != std::string::npos);
    CHECK(help.out.find("-o,--output") != std::string::npos);
    CHECK(help.out.find("(default: standard output)") != std::string::npos);
  }
}
