#include "tools/cli.h"

#include <fmt/core.h>
#include <unistd.h>

#include <algorithm>
#include <cerrno>
#include <charconv>
#include <cmath>
#include <cstring>
#include <filesystem>
#include <limits>
#include <system_error>
#include <vector>

#include "config/load.h"
#include "config/suggest.h"
#include "tools/commands.h"

#ifndef STANDFAST_VERSION
#error "STANDFAST_VERSION must be defined by tools/CMakeLists.txt"
#endif

namespace standfast::tools {

std::string_view program_version() { return STANDFAST_VERSION; }

std::string version_text() {
  return fmt::format("standfast {} (season-file format {})", program_version(),
                     config::SEASON_FORMAT_VERSION);
}

void add_version_flag(CLI::App& app) {
  app.set_version_flag("--version", version_text(),
                       help_text("Print the program version and the season-file format version"));
}

std::string help_text(std::string_view what, std::string_view default_text) {
  std::string out(what);
  if (!default_text.empty()) out += fmt::format(" (default: {})", default_text);
  return out;
}

CLI::Option* add_season_file(CLI::App& cmd, std::string& file) {
  return cmd.add_option(std::string(SEASON_FILE_NAME), file, help_text("The season file (YAML)"))
      ->required();
}

void add_report_options(CLI::App& cmd, ReportOptions& options, std::string_view formats) {
  cmd.add_option("--format", options.format,
                 help_text(fmt::format("Report format: {}", formats), "table"));
  cmd.add_option(
      "-o,--output", options.output,
      help_text("Write the report to this file, whole or not at all", "standard output"));
}

Format check_report_options(const ReportOptions& options) {
  const Format format = parse_format(options.format);
  check_output_path(options.output);
  return format;
}

void check_output_path(const std::string& path) {
  if (path.empty() || path == "-") return;
  namespace fs = std::filesystem;
  const fs::path target{path};
  std::error_code ec;
  if (fs::is_directory(target, ec)) {
    throw UsageError(fmt::format("--output: '{}' is a folder, not a file", path));
  }
  if (!target.has_filename()) {
    throw UsageError(fmt::format("--output: '{}' names no file", path));
  }
  const fs::path folder = target.parent_path().empty() ? fs::path(".") : target.parent_path();
  const fs::file_status status = fs::status(folder, ec);
  if (!fs::exists(status)) {
    throw UsageError(fmt::format("--output: cannot write '{}': the folder '{}' does not exist",
                                 path, folder.string()));
  }
  if (!fs::is_directory(status)) {
    throw UsageError(
        fmt::format("--output: cannot write '{}': '{}' is not a folder", path, folder.string()));
  }
  if (::access(folder.c_str(), W_OK | X_OK) != 0) {
    throw UsageError(fmt::format("--output: cannot write '{}': the folder '{}': {}", path,
                                 folder.string(), std::strerror(errno)));
  }
}

namespace {

bool all_digits(std::string_view s) {
  if (s.empty()) return false;
  for (char c : s) {
    if (c < '0' || c > '9') return false;
  }
  return true;
}

}  // namespace

CLI::Validator whole_number(std::uint64_t min, std::uint64_t max) {
  return CLI::Validator(
      [min, max](std::string& text) -> std::string {
        const std::string range = fmt::format("a whole number from {} to {}", min, max);
        if (!text.empty() && text[0] == '-' && all_digits(std::string_view(text).substr(1))) {
          return fmt::format("expected {}, got {} (negative)", range, text);
        }
        if (!all_digits(text)) return fmt::format("expected {}, got '{}'", range, text);
        std::uint64_t value = 0;
        const auto [end, ec] = std::from_chars(text.data(), text.data() + text.size(), value);
        if (ec == std::errc::result_out_of_range || value > max) {
          return fmt::format("expected {}, got {} (too large)", range, text);
        }
        if (ec != std::errc{} || end != text.data() + text.size()) {
          return fmt::format("expected {}, got '{}'", range, text);
        }
        if (value < min) return fmt::format("expected {}, got {}", range, text);
        return {};
      },
      "");
}

CLI::Validator real_number(RealRange r) {
  return CLI::Validator(
      [r](std::string& text) -> std::string {
        const std::string range =
            fmt::format("a number in {}{:g}, {:g}{}", r.lower_open ? '(' : '[', r.lower, r.upper,
                        r.upper_open ? ')' : ']');
        double value = 0;
        const char* first = text.data();
        const char* last = text.data() + text.size();
        if (first != last && *first == '+') ++first;
        const auto [end, ec] = std::from_chars(first, last, value);
        if (text.empty() || ec != std::errc{} || end != last || !std::isfinite(value)) {
          return fmt::format("expected {}, got '{}'", range, text);
        }
        const bool below = r.lower_open ? !(value > r.lower) : !(value >= r.lower);
        const bool above = r.upper_open ? !(value < r.upper) : !(value <= r.upper);
        if (below || above) return fmt::format("expected {}, got {}", range, text);
        return {};
      },
      "");
}

namespace {
constexpr int MAX_THREAD_COUNT = 1024;  // --threads
}  // namespace

CLI::Option* add_seed_option(CLI::App& cmd, std::uint64_t& seed, std::uint64_t default_seed) {
  return cmd
      .add_option("--seed", seed,
                  help_text("Random seed, 0 to 2^64 - 1; the same seed gives the same output for "
                            "any thread count",
                            std::to_string(default_seed)))
      ->check(whole_number(0, std::numeric_limits<std::uint64_t>::max()));
}

CLI::Option* add_threads_option(CLI::App& cmd, int& threads) {
  return cmd
      .add_option(
          "--threads", threads,
          help_text(fmt::format("Worker threads, 0 to {}; 0 uses every core", MAX_THREAD_COUNT),
                    "0"))
      ->check(whole_number(0, MAX_THREAD_COUNT));
}

std::string warning_line(const config::Diagnostic& warning) {
  config::Diagnostic d = warning;
  d.message = "warning: " + d.message;
  return config::format_diagnostic(d);
}

void print_warnings(const config::Season& season) {
  for (const config::Diagnostic& w : season.warnings) {
    fmt::print(stderr, "{}\n", warning_line(w));
  }
}

config::Season load_season_file(const std::string& file) {
  config::Season season = config::load_season(file);
  print_warnings(season);
  return season;
}

namespace {

std::vector<std::string> family_names() {
  return {std::begin(FAMILY_NAMES), std::end(FAMILY_NAMES)};
}

bool has_shape(config::ScoreFamily f) {
  return f == config::ScoreFamily::kWeibull || f == config::ScoreFamily::kNegativeBinomial;
}

}  // namespace

void add_model_options(CLI::App& cmd, ModelOptions& options) {
  cmd.add_option("--family", options.family,
                 help_text("Scoring family for this run instead of the season file's: weibull, "
                           "negative_binomial, poisson or log5 (log5 needs a win_pct override "
                           "for every team)",
                           "the season file's"))
      ->check(CLI::Validator(
          [](std::string& text) -> std::string {
            for (std::string_view name : FAMILY_NAMES)
              if (text == name) return {};
            return fmt::format("expected weibull, negative_binomial, poisson or log5, got '{}'{}",
                               text, config::did_you_mean(text, family_names()));
          },
          ""));
  cmd.add_option("--shape", options.shape,
                 help_text(fmt::format("Shape of the family for this run: `fit` (fitted to the "
                                       "played games) or a number from {:g} to {:g} (Weibull "
                                       "shape, negative-binomial size)",
                                       config::MIN_SHAPE, config::MAX_SHAPE),
                           "the season file's; fitted when --family changes the family"))
      ->check(CLI::Validator(
          [](std::string& text) -> std::string {
            if (text == "fit") return {};
            std::string copy = text;
            const std::string problem =
                real_number({config::MIN_SHAPE, config::MAX_SHAPE, false, false})(copy);
            return problem.empty() ? problem : problem + " or 'fit'";
          },
          ""));
}

bool family_applies(const config::Season& season, config::ScoreFamily family, std::string* why) {
  if (family != config::ScoreFamily::kLog5) return true;
  std::vector<bool> has(season.teams.size(), false);
  for (const config::TeamOverride& o : season.overrides)
    if (o.win_pct && o.team >= 0 && static_cast<std::size_t>(o.team) < has.size())
      has[static_cast<std::size_t>(o.team)] = true;
  std::string missing;
  int count = 0;
  for (std::size_t t = 0; t < has.size(); ++t) {
    if (has[t]) continue;
    if (++count <= 5) missing += (missing.empty() ? "" : ", ") + season.teams[t].id;
  }
  if (count == 0) return true;
  if (count > 5) missing += fmt::format(" and {} more", count - 5);
  if (why != nullptr)
    *why = fmt::format("log5 needs a win_pct override for every team; {} has none for {}",
                       season.file, missing);
  return false;
}

void apply_model_options(const ModelOptions& options, config::Season& season) {
  config::ModelSpec& model = season.model;
  if (!options.family.empty()) {
    const auto* at = std::find(std::begin(FAMILY_NAMES), std::end(FAMILY_NAMES), options.family);
    if (at == std::end(FAMILY_NAMES))
      throw UsageError(fmt::format("--family: unknown family '{}'", options.family));
    const auto family = static_cast<config::ScoreFamily>(at - std::begin(FAMILY_NAMES));
    std::string why;
    if (!family_applies(season, family, &why)) throw UsageError("--family: " + why);
    if (family != model.family) model.shape.reset();  // the file's shape is its own family's
    model.family = family;
  }
  if (!options.shape.empty()) {
    if (!has_shape(model.family))
      throw UsageError(fmt::format("--shape: the {} family has no shape",
                                   FAMILY_NAMES[static_cast<int>(model.family)]));
    if (options.shape == "fit") {
      model.shape.reset();
    } else {
      double value = 0;
      const char* first = options.shape.data();
      const char* last = first + options.shape.size();
      if (first != last && *first == '+') ++first;
      const auto [end, ec] = std::from_chars(first, last, value);
      if (ec != std::errc{} || end != last || !(value >= config::MIN_SHAPE) ||
          !(value <= config::MAX_SHAPE))
        throw UsageError(
            fmt::format("--shape: expected `fit` or a number from {:g} to {:g}, got '{}'",
                        config::MIN_SHAPE, config::MAX_SHAPE, options.shape));
      model.shape = value;
    }
  }
}

}  // namespace standfast::tools
