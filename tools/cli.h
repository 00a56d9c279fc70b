// The command-line layer every subcommand shares: the season-file positional, the report
// options (--format, -o/--output, checked before any work), checked numeric options, one help
// style ("(default: X)"), --version, and warnings printed as FILE:LINE:COLUMN: warning: message.
// DEVELOPERS.md, "How to add a command", shows how a command uses it.
#ifndef STANDFAST_TOOLS_CLI_H
#define STANDFAST_TOOLS_CLI_H

#include <CLI/CLI.hpp>
#include <cstdint>
#include <string>
#include <string_view>

#include "config/season.h"
#include "tools/output.h"

namespace standfast::tools {

// The program version (CMake's project version).
std::string_view program_version();

// What `standfast --version` prints: the program version and the season-file format version.
std::string version_text();

// Adds --version to the top-level application.
void add_version_flag(CLI::App& app);

// Help text in the one style: `what` starts with a capital letter and has no final full stop;
// a default, when given, is appended as " (default: X)".
std::string help_text(std::string_view what, std::string_view default_text = {});

// The season-file positional, the same name and help on every command.
inline constexpr std::string_view SEASON_FILE_NAME = "SEASON_FILE";
CLI::Option* add_season_file(CLI::App& cmd, std::string& file);

// --format table|csv|json and -o/--output FILE of a command that writes a report.
struct ReportOptions {
  std::string format = "table";
  std::string output;  // empty or "-" = standard output
};
// `formats` is the text of the --format help (a command with a format of its own, such as
// Markdown, checks that one itself and the others with check_report_options).
void add_report_options(CLI::App& cmd, ReportOptions& options,
                        std::string_view formats = "table, csv or json");

// Checks the report options before any work: the format is known and the output path can be
// written (its folder exists and is writable; the path is not a folder). Throws UsageError.
Format check_report_options(const ReportOptions& options);

// Throws UsageError when `path` (not empty, not "-") cannot receive an output file: the folder
// does not exist or is not writable, or the path names a folder.
void check_output_path(const std::string& path);

// Validators for numeric options. They read the text as given, before CLI11 converts it, so
// "-5" is refused for an unsigned option instead of wrapping around. A refused value ends the
// program with exit status 2 and "--option: message".
//
// A whole number in [min, max] (digits only; no sign, no fraction, no exponent).
CLI::Validator whole_number(std::uint64_t min, std::uint64_t max);
// A finite real number in the range described by `lower`..`upper`, each end open or closed.
struct RealRange {
  double lower = 0, upper = 0;
  bool lower_open = false, upper_open = false;
};
CLI::Validator real_number(RealRange range);

// --seed and --threads, the same name, help and checks on every command that simulates
// (--threads: 0 to 1024, 0 = every core).
CLI::Option* add_seed_option(CLI::App& cmd, std::uint64_t& seed, std::uint64_t default_seed);
CLI::Option* add_threads_option(CLI::App& cmd, int& threads);

// Prints the season's warnings to standard error, one per line, as
// FILE:LINE:COLUMN: warning: message.
void print_warnings(const config::Season& season);

// The one text of a warning line (used by print_warnings; exposed for tests).
std::string warning_line(const config::Diagnostic& warning);

// Loads and validates the season file and prints its warnings. Throws config::ConfigError.
config::Season load_season_file(const std::string& file);

// --family and --shape: the scoring model of a run, switched without editing the season file.
// Every command that fits or simulates takes them, with the same names and help.
struct ModelOptions {
  std::string family;  // empty: the season file's family
  std::string shape;   // empty: the file's shape (fitted after a family switch); "fit" or a number
};
void add_model_options(CLI::App& cmd, ModelOptions& options);

// The family names the options (and the season file) take, in the order of config::ScoreFamily.
inline constexpr std::string_view FAMILY_NAMES[] = {"weibull", "negative_binomial", "poisson",
                                                    "log5"};

// Applies the options to the season's model. A family other than the file's is fitted afresh:
// the file's fixed shape (which belongs to its own family) is dropped unless --shape states one.
// Throws UsageError when the options cannot apply: --shape for a family without a shape
// (poisson, log5), or log5 for a season without a win_pct override for every team.
void apply_model_options(const ModelOptions& options, config::Season& season);

// Whether the season can run under `family` as it stands (log5 needs a win_pct override for
// every team); when not, `why` says what is missing.
bool family_applies(const config::Season& season, config::ScoreFamily family, std::string* why);

}  // namespace standfast::tools

#endif  // STANDFAST_TOOLS_CLI_H
