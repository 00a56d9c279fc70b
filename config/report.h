// Collects the problems and warnings found while reading a season, and small helpers shared by
// the YAML and CSV readers: scalar parsing and quoting of user text in messages.
#ifndef STANDFAST_CONFIG_REPORT_H
#define STANDFAST_CONFIG_REPORT_H

#include <optional>
#include <string>
#include <string_view>
#include <vector>

#include "config/season.h"

namespace standfast::config::detail {

// Keeps the first MAX_KEPT errors and warnings and counts the rest, so that a file of a
// million bad lines costs bounded memory.
class Report {
 public:
  static constexpr std::size_t MAX_KEPT = 1000;

  void error(SourcePos pos, std::string message);
  void warning(SourcePos pos, std::string message);
  bool has_errors() const { return error_count_ > 0; }
  // Every error reported, kept or not: compare two counts to learn whether a step added one.
  std::size_t error_count() const { return error_count_; }
  std::size_t warning_count() const { return warning_count_; }
  std::vector<Diagnostic>& errors() { return errors_; }
  std::vector<Diagnostic>& warnings() { return warnings_; }

 private:
  std::vector<Diagnostic> errors_;
  std::vector<Diagnostic> warnings_;
  std::size_t error_count_ = 0;
  std::size_t warning_count_ = 0;
};

// User text for a message: in single quotes, control and non-ASCII bytes escaped as \xNN, cut
// after `max_shown` characters.
std::string quoted(std::string_view text, std::size_t max_shown = 40);

// Strips spaces and tabs at both ends.
std::string_view trim(std::string_view text);

// A whole number in decimal, with an optional sign; nullopt for anything else.
std::optional<long long> parse_integer(std::string_view text);

// A real number (decimal or exponent notation; also nan and inf, which callers refuse by name).
std::optional<double> parse_real(std::string_view text);

// true/false, yes/no, on/off (lower, Capitalised or UPPER case).
std::optional<bool> parse_boolean(std::string_view text);

// Why `text` is not a whole number: "must be a whole number, got 2.5" and the like.
std::string not_integer_message(std::string_view text);

}  // namespace standfast::config::detail

#endif  // STANDFAST_CONFIG_REPORT_H
