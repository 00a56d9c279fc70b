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
#include <nlohmann/json.hpp>
#include <optional>
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

namespace {

// Parses `--family F` and/or `--shape S` as a command would; returns the error text or "".
std::string parse_model(const std::vector<std::string>& args_in,
                        standfast::tools::ModelOptions& options) {
  CLI::App app;
  standfast::tools::add_model_options(app, options);
  std::vector<std::string> args(args_in.rbegin(), args_in.rend());  // CLI11 takes them reversed
  try {
    app.parse(args);
  } catch (const CLI::ParseError& e) {
    return e.what();
  }
  return "";
}

standfast::config::Season two_teams(standfast::config::ScoreFamily family,
                                    std::optional<double> shape) {
  standfast::config::Season s;
  s.file = "two.yaml";
  for (const char* id : {"AAA", "BBB"}) {
    standfast::config::Team t;
    t.id = id;
    s.teams.push_back(t);
  }
  s.model.family = family;
  s.model.shape = shape;
  return s;
}

}  // namespace

TEST_CASE("--family and --shape switch the model of one run") {
  using namespace standfast::tools;
  using standfast::config::ScoreFamily;
  {
    ModelOptions o;
    CHECK(parse_model({"--family", "poisson"}, o).empty());
    CHECK(o.family == "poisson");
    ModelOptions bad;
    const std::string e = parse_model({"--family", "negativ_binomial"}, bad);
    CHECK(e.find("--family") != std::string::npos);
    CHECK(e.find("did you mean 'negative_binomial'") != std::string::npos);
    CHECK_FALSE(parse_model({"--shape", "0.1"}, bad).empty());
    CHECK_FALSE(parse_model({"--shape", "nan"}, bad).empty());
    CHECK_FALSE(parse_model({"--shape", "fitted"}, bad).empty());
    ModelOptions fit;
    CHECK(parse_model({"--shape", "fit"}, fit).empty());
    CHECK(parse_model({"--shape", "1.9"}, fit).empty());
  }
  // Another family drops the file's fixed shape (it belongs to the file's family) ...
  auto s = two_teams(ScoreFamily::kWeibull, 1.83);
  apply_model_options({"negative_binomial", ""}, s);
  CHECK(s.model.family == ScoreFamily::kNegativeBinomial);
  CHECK_FALSE(s.model.shape.has_value());
  // ... unless --shape states one; the same family keeps it; no option changes nothing.
  s = two_teams(ScoreFamily::kWeibull, 1.83);
  apply_model_options({"negative_binomial", "12"}, s);
  CHECK(s.model.shape == 12.0);
  s = two_teams(ScoreFamily::kWeibull, 1.83);
  apply_model_options({"weibull", ""}, s);
  CHECK(s.model.shape == 1.83);
  apply_model_options({"", "fit"}, s);
  CHECK_FALSE(s.model.shape.has_value());
  apply_model_options({}, s);
  CHECK(s.model.family == ScoreFamily::kWeibull);
  // A shape for a family that has none, and log5 without win percentages, are refused.
  s = two_teams(ScoreFamily::kWeibull, std::nullopt);
  CHECK_THROWS_AS(apply_model_options({"poisson", "1.8"}, s), UsageError);
  try {
    apply_model_options({"log5", ""}, s);
    FAIL("log5 without win_pct overrides was accepted");
  } catch (const UsageError& e) {
    CHECK(std::string(e.what()).find("two.yaml has none for AAA, BBB") != std::string::npos);
  }
  for (int t = 0; t < 2; ++t) {
    standfast::config::TeamOverride o;
    o.team = t;
    o.win_pct = 0.5;
    s.overrides.push_back(o);
  }
  apply_model_options({"log5", ""}, s);
  CHECK(s.model.family == ScoreFamily::kLog5);
}

TEST_CASE("the program: every run records the family and shape --family and --shape set") {
  using standfast::testing::run_process;
  const auto json = [](const std::string& args) {
    const auto r = run_process(PROGRAM + " " + args + " --format json");
    REQUIRE(r.status == 0);
    return nlohmann::json::parse(r.out);
  };
  const auto odds = json("odds " + SMALL + " --seasons 200 --family poisson");
  CHECK(odds["run"]["family"] == "poisson");
  CHECK(odds["run"]["shape"].is_null());
  const auto nb = json("odds " + SMALL + " --seasons 200 --family negative_binomial --shape 12");
  CHECK(nb["run"]["family"] == "negative_binomial");
  CHECK(nb["run"]["shape"] == 12.0);
  CHECK(nb["run"]["shape_source"] == "fixed");
  const auto fit = json("fit " + SMALL + " --family negative_binomial");
  CHECK(fit["run"]["family"] == "negative_binomial");
  CHECK(fit["run"]["shape_source"] == "fitted");
  const auto bt = json("backtest --runs 2 --seasons 100 --family poisson");
  const std::string demo = STANDFAST_SOURCE_DIR "/scenarios/demo/";
  const auto whatif =
      json("whatif " + demo + "season.yaml " + demo + "whatif.yaml --seasons 100 --family poisson");
  CHECK(whatif["baseline_model"]["family"] == "poisson");
  CHECK(bt["forecast_model"]["family"] == "poisson");

  // Refused before any work, exit status 2, the option named.
  for (const char* bad : {"--family log5", "--family poison", "--family poisson --shape 2",
                          "--shape 0.1", "--shape abc"}) {
    INFO(bad);
    const auto r = run_process(PROGRAM + " odds " + SMALL + " --seasons 200 " + bad + " 2>&1");
    CHECK(r.status == 2);
    CHECK((r.out.find("--family") != std::string::npos ||
           r.out.find("--shape") != std::string::npos));
  }
  for (const char* command : {"fit", "odds", "whatif", "replay", "movers", "report", "backtest",
                              "worth", "stakes", "families"}) {
    INFO(command);
    const auto help = run_process(PROGRAM + " " + command + " --help");
    CHECK(help.status == 0);
    CHECK(help.out.find("--family") != std::string::npos);
    CHECK(help.out.find("--shape") != std::string::npos);
  }
}
