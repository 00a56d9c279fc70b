// The fuzz targets' bodies, shared by the libFuzzer programs (tests/fuzz/*_fuzz.cpp) and by the
// corpus replay in the ordinary test suite (tests/fuzz_corpus_test.cpp). Any input must end in
// a season or a ConfigError; any other exception or a crash is a bug.
#ifndef STANDFAST_TESTS_FUZZ_FUZZ_ENTRY_H
#define STANDFAST_TESTS_FUZZ_FUZZ_ENTRY_H

#include <cstddef>
#include <cstdint>
#include <string>
#include <string_view>

#include "config/games.h"
#include "config/games_csv.h"
#include "config/input_file.h"
#include "config/load.h"
#include "config/report.h"

namespace standfast::fuzzing {

// A season file's text through the whole loader. games_file entries are read from disk as
// named, relative to the working directory.
inline void season_input(const std::uint8_t* data, std::size_t size) {
  const std::string text(reinterpret_cast<const char*>(data), size);
  try {
    const config::Season s = config::load_season_text(text, "fuzz.yaml");
    (void)s;
  } catch (const config::ConfigError& e) {
    for (const auto& d : e.problems()) (void)config::format_diagnostic(d);
  }
}

// A small league the games CSV refers to.
inline const config::Season& csv_league() {
  static const config::Season season = config::load_season_text(
      "standfast: 1\n"
      "league: {name: Fuzz League, season: One, innings: 9,\n"
      "         extra_innings: {runner_on_second: false, max_innings: 12}}\n"
      "teams:\n"
      "  - {id: AAA, name: Alder}\n"
      "  - {id: BBB, name: Birch}\n"
      "  - {id: CCC, name: Cedar}\n"
      "  - {id: DDD, name: Damson}\n"
      "groups:\n"
      "  - {id: one, name: One, teams: [AAA, BBB]}\n"
      "  - {id: two, name: Two, teams: [CCC, DDD]}\n",
      "fuzz.yaml");
  return season;
}

// A games CSV's text through the same steps as load_season: text check, reader, duplicates.
inline void games_csv_input(const std::uint8_t* data, std::size_t size) {
  const std::string_view text(reinterpret_cast<const char*>(data), size);
  config::Season season = csv_league();
  config::detail::TeamIds ids;
  for (std::size_t t = 0; t < season.teams.size(); ++t) {
    ids.index.emplace(season.teams[t].id, static_cast<int>(t));
    ids.ids.push_back(season.teams[t].id);
  }
  config::detail::Report report;
  if (auto bad = config::check_text(text, "fuzz.csv")) {
    report.error(bad->pos, bad->message);
  } else {
    config::detail::read_games_csv(text, "fuzz.csv", ids, season, report);
  }
  config::detail::check_duplicate_games(season, ids, report);
  for (const auto& d : report.errors()) (void)config::format_diagnostic(d);
}

}  // namespace standfast::fuzzing

#endif  // STANDFAST_TESTS_FUZZ_FUZZ_ENTRY_H
