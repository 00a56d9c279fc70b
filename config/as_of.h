// The season as it was known on a date: games on or after the as-of date are treated as not yet
// played (their scores dropped), so the fit and the simulation see only what was known then.
#ifndef STANDFAST_CONFIG_AS_OF_H
#define STANDFAST_CONFIG_AS_OF_H

#include <optional>

#include "config/season.h"

namespace standfast::config {

// An as-of date D stands for the morning of D: every game dated before D that has a score
// counts as played; every game dated D or later counts as not played.
//
// The default as-of date of a season: the day after its last played game. With no played
// game, the date of its earliest dated game; with no dated game at all, nullopt.
std::optional<DayNumber> default_as_of(const Season& season);

// A copy of `season` as known on the morning of `as_of`: every played game dated `as_of` or
// later loses its scores, innings and shortened mark and becomes a remaining game. Everything
// else (teams, rules, overrides, unplayed games, warnings) is kept as it is. Played games always
// have a date (a game without one is postponed and cannot have a score), so none is ambiguous.
Season season_as_of(const Season& season, DayNumber as_of);

// Number of games played before `as_of` (what a run at that date fits on).
int games_played_before(const Season& season, DayNumber as_of);

}  // namespace standfast::config

#endif  // STANDFAST_CONFIG_AS_OF_H
