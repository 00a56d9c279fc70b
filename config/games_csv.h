// The games CSV named by `games_file` in a season file (format in README.md, section "The season
// file").
#ifndef STANDFAST_CONFIG_GAMES_CSV_H
#define STANDFAST_CONFIG_GAMES_CSV_H

#include <string>
#include <string_view>

#include "config/games.h"
#include "config/report.h"
#include "config/season.h"

namespace standfast::config::detail {

// Reads the CSV text and appends its games to season.games; `file` names it in messages (each
// problem is reported at its 1-based line and field number).
void read_games_csv(std::string_view text, const std::string& file, const TeamIds& teams,
                    Season& season, Report& report);

}  // namespace standfast::config::detail

#endif  // STANDFAST_CONFIG_GAMES_CSV_H
