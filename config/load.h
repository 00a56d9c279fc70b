// Reading a season file (YAML) and its game list (CSV or inline YAML) into a validated Season.
#ifndef STANDFAST_CONFIG_LOAD_H
#define STANDFAST_CONFIG_LOAD_H

#include <filesystem>
#include <stdexcept>
#include <string>
#include <vector>

#include "config/season.h"

namespace standfast::config {

// Every problem found in a season file, reported together. what() lists them one per line as
// `FILE:LINE:COLUMN: message`.
class ConfigError : public std::runtime_error {
 public:
  explicit ConfigError(std::vector<Diagnostic> problems);
  const std::vector<Diagnostic>& problems() const { return problems_; }

 private:
  std::vector<Diagnostic> problems_;
};

// The most problems a ConfigError lists; it then says how many more there were.
inline constexpr std::size_t MAX_PROBLEMS_SHOWN = 100;

// "FILE:LINE:COLUMN: message" (LINE and COLUMN left out when unknown).
std::string format_diagnostic(const Diagnostic& d);

// Reads and validates a season file (a regular file of at most MAX_INPUT_BYTES, UTF-8 text, one
// YAML document; config/input_file.h). Throws ConfigError listing every problem found; warnings
// (for example games per team disagreeing with the schedule) are returned in Season::warnings.
Season load_season(const std::filesystem::path& file);

// The same from text already in memory; `file` names it in messages and anchors relative paths.
Season load_season_text(const std::string& yaml_text, const std::filesystem::path& file);

}  // namespace standfast::config

#endif  // STANDFAST_CONFIG_LOAD_H
