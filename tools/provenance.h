// What produced a report: program version, season file and games file with their SHA-256, the
// as-of date, the model family and shape used, the seed and the number of simulated seasons.
// Every report carries it: a header line in tables, trailing `run_*` columns in CSV (the CSV
// stays one rectangular table), a "run" object in JSON. Fields that do not apply are empty.
#ifndef STANDFAST_TOOLS_PROVENANCE_H
#define STANDFAST_TOOLS_PROVENANCE_H

#include <cstdint>
#include <filesystem>
#include <nlohmann/json.hpp>
#include <optional>
#include <string>

#include "config/season.h"

namespace standfast::tools {

struct Provenance {
  std::string program_version;
  std::string season_file;    // as given on the command line
  std::string season_sha256;  // 64 lower-case hex digits; empty when the file cannot be read
  std::string games_file;     // the season's games CSV, or empty when the games are inline
  std::string games_sha256;
  // Games on or after this date count as not played (config/as_of.h). Default:
  // config::default_as_of, the day after the last played game. An --as-of option sets it.
  std::optional<config::DayNumber> as_of;
  std::optional<config::ScoreFamily> family;  // when a model was used
  std::optional<double> shape;                // Weibull gamma or negative-binomial size used
  std::string shape_source;  // "fitted" (from the games), "fixed" (in the file) or "default"
  std::optional<std::uint64_t> seed;     // for simulations
  std::optional<std::uint64_t> seasons;  // simulated seasons
};

// The provenance of a report on `season`: version, files and hashes, default as-of date.
// The model, seed and seasons are left for the command to fill in.
Provenance make_provenance(const config::Season& season);

// SHA-256 of a file's bytes as 64 lower-case hex digits; empty when it cannot be read.
std::string sha256_file(const std::filesystem::path& file);
// SHA-256 of bytes in memory.
std::string sha256_hex(std::string_view bytes);

// Records the model a command ran with: the season's family and, for the families with a shape
// (Weibull gamma, negative-binomial size), the shape used and where it came from: fixed in the
// file, fitted from the played games, or the documented default when no game is played.
void set_model(Provenance& p, const config::Season& season, double shape_used);

// One line for the head of a table, e.g.
// "Run: standfast 0.1.0; season.yaml sha256 3f2a9c01d4e5, games.csv sha256 ...; as of
// 2044-05-04; model weibull, shape 1.832 (fitted); seed 20260101; 100,000 seasons".
std::string provenance_line(const Provenance& p);

// CSV: the header columns (",run_version,..." with the leading comma) and the matching cells,
// appended to every row of a report's CSV.
std::string provenance_csv_header();
std::string provenance_csv_cells(const Provenance& p);

// JSON: the "run" object.
nlohmann::ordered_json provenance_json(const Provenance& p);

}  // namespace standfast::tools

#endif  // STANDFAST_TOOLS_PROVENANCE_H
