// Checking one game, whichever file it comes from (inline YAML or the games CSV).
#ifndef STANDFAST_CONFIG_GAMES_H
#define STANDFAST_CONFIG_GAMES_H

#include <string>
#include <unordered_map>
#include <vector>

#include "config/report.h"
#include "config/season.h"

namespace standfast::config::detail {

// Team ids of the season with a hash look-up.
struct TeamIds {
  std::unordered_map<std::string, int> index;
  std::vector<std::string> ids;
  int find(const std::string& id) const {
    const auto it = index.find(id);
    return it == index.end() ? -1 : it->second;
  }
};

struct GameField {
  std::string text;
  bool given = false;  // present and not empty
  SourcePos pos;
};

// The raw text of one game as written in the file.
struct GameFields {
  std::string where;  // message prefix, e.g. "games[3]." (empty for CSV lines)
  SourcePos pos;      // the game itself
  GameField date, home, away, number, home_runs, away_runs, innings, status;
};

// Checks one game and appends it to season.games when it has no problem.
void add_game(const GameFields& g, const TeamIds& teams, Season& season, Report& report);

// The same game (date, home, away, game number) listed twice; games without a date are not
// compared (several postponed games between the same clubs are normal).
void check_duplicate_games(const Season& season, const TeamIds& teams, Report& report);

}  // namespace standfast::config::detail

#endif  // STANDFAST_CONFIG_GAMES_H
