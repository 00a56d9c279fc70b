// Building small invented seasons directly as config::Season values, for the standings,
// seeding and record tests (no loader needed).
#ifndef STANDFAST_TESTS_SMALL_LEAGUE_H
#define STANDFAST_TESTS_SMALL_LEAGUE_H

#include <string>

#include "config/season.h"

namespace standfast::testing {

class SmallLeague {
 public:
  // A conference (top-level group); returns its group index.
  int conference(const std::string& id) {
    config::Group g;
    g.id = id;
    g.name = id;
    season.groups.push_back(g);
    const int index = static_cast<int>(season.groups.size()) - 1;
    season.conferences.push_back(index);
    return index;
  }
  // A division inside a conference; returns its group index.
  int division(const std::string& id, int conf) {
    config::Group g;
    g.id = id;
    g.name = id;
    g.parent = conf;
    season.groups.push_back(g);
    const int index = static_cast<int>(season.groups.size()) - 1;
    season.groups[conf].children.push_back(index);
    season.divisions.push_back(index);
    return index;
  }
  // A team in a division (or in a conference that holds teams directly, which is then also a
  // division); returns its team index.
  int team(const std::string& id, int div) {
    if (season.groups[div].teams.empty() && season.groups[div].children.empty() &&
        season.groups[div].parent < 0) {
      season.divisions.push_back(div);
    }
    config::Team t;
    t.id = id;
    t.name = "Club " + id;
    t.division = div;
    int conf = div;
    while (season.groups[conf].parent >= 0) conf = season.groups[conf].parent;
    t.conference = conf;
    season.teams.push_back(t);
    const int index = static_cast<int>(season.teams.size()) - 1;
    season.groups[div].teams.push_back(index);
    return index;
  }
  // A played game on day `day`.
  void game(int day, int home, int away, int home_runs, int away_runs) {
    config::Game g;
    g.date = day;
    g.home = home;
    g.away = away;
    g.played = true;
    g.home_runs = home_runs;
    g.away_runs = away_runs;
    season.games.push_back(g);
  }
  // `count` played games on `day` that `winner` wins 5-3 (winner at home).
  void wins(int day, int winner, int loser, int count = 1) {
    for (int i = 0; i < count; ++i) game(day, winner, loser, 5, 3);
  }
  // An unplayed game.
  void remaining(int day, int home, int away) {
    config::Game g;
    g.date = day;
    g.home = home;
    g.away = away;
    season.games.push_back(g);
  }

  config::Season season;
};

}  // namespace standfast::testing

#endif  // STANDFAST_TESTS_SMALL_LEAGUE_H
