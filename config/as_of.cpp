#include "config/as_of.h"

#include <algorithm>

namespace standfast::config {

std::optional<DayNumber> default_as_of(const Season& season) {
  std::optional<DayNumber> last_played, first_dated;
  for (const Game& g : season.games) {
    if (!g.date) continue;
    if (g.played) last_played = std::max(last_played.value_or(*g.date), *g.date);
    first_dated = std::min(first_dated.value_or(*g.date), *g.date);
  }
  if (last_played) return *last_played + 1;
  return first_dated;
}

Season season_as_of(const Season& season, DayNumber as_of) {
  Season known = season;
  for (Game& g : known.games) {
    if (!g.played || !g.date || *g.date < as_of) continue;
    g.played = false;
    g.home_runs = 0;
    g.away_runs = 0;
    g.innings = 0;
    g.shortened = false;
  }
  return known;
}

int games_played_before(const Season& season, DayNumber as_of) {
  return static_cast<int>(
      std::count_if(season.games.begin(), season.games.end(),
                    [&](const Game& g) { return g.played && g.date && *g.date < as_of; }));
}

}  // namespace standfast::config
