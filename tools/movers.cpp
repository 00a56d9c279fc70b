#include "tools/movers.h"

#include <algorithm>
#include <cmath>
#include <map>
#include <set>

#include "config/as_of.h"
#include "tools/odds_run.h"

namespace standfast::tools {
namespace {

Change change_of(const engine::Probability& before, const engine::Probability& after) {
  return {before.p, after.p, after.p - before.p, std::hypot(before.se, after.se)};
}

// Largest |change| first; equal ones keep their input order (league order).
template <class T, class Key>
void sort_by_size(std::vector<T>& v, Key key) {
  std::stable_sort(v.begin(), v.end(), [&](const T& a, const T& b) {
    const double x = std::abs(key(a).change), y = std::abs(key(b).change);
    return x > y;
  });
}

}  // namespace

Movers compare_runs(const HistoryRun& from, const HistoryRun& to, std::size_t top) {
  Movers m;
  m.from = from.as_of;
  m.to = to.as_of;
  std::map<std::string, const HistoryTeam*> before;
  for (const HistoryTeam& t : from.teams) before[t.id] = &t;
  std::vector<TeamMove> all;
  for (const HistoryTeam& t : to.teams) {
    const auto it = before.find(t.id);
    if (it == before.end()) continue;
    TeamMove mv;
    mv.id = t.id;
    mv.name = t.name;
    mv.postseason = change_of(it->second->postseason, t.postseason);
    mv.title = change_of(it->second->title, t.title);
    all.push_back(mv);
  }
  m.by_postseason = all;
  sort_by_size(m.by_postseason, [](const TeamMove& x) { return x.postseason; });
  if (m.by_postseason.size() > top) m.by_postseason.resize(top);
  m.by_title = all;
  sort_by_size(m.by_title, [](const TeamMove& x) { return x.title; });
  if (m.by_title.size() > top) m.by_title.resize(top);
  return m;
}

void add_game_effects(Movers& movers, const config::Season& season, const engine::RunOptions& run,
                      std::size_t top) {
  movers.games.clear();
  if (top == 0 || movers.by_postseason.empty()) return;
  // The movers and the divisions they play in.
  std::vector<int> movers_idx;
  std::set<int> divisions;
  for (const TeamMove& mv : movers.by_postseason) {
    const int t = season.team_index(mv.id);
    if (t < 0) continue;
    movers_idx.push_back(t);
    divisions.insert(season.teams[static_cast<std::size_t>(t)].division);
  }
  auto in_race = [&](int team) {
    return divisions.count(season.teams[static_cast<std::size_t>(team)].division) > 0;
  };

  const config::Season after = config::season_as_of(season, movers.to);
  const engine::SimulationResult base = simulate_season(after, run);
  for (std::size_t g = 0; g < after.games.size(); ++g) {
    const config::Game& game = after.games[g];
    if (!game.played || !game.date || *game.date < movers.from || *game.date >= movers.to) continue;
    if (!in_race(game.home) && !in_race(game.away)) continue;
    config::Season open = after;
    config::Game& undo = open.games[g];
    undo.played = false;
    undo.home_runs = undo.away_runs = undo.innings = 0;
    undo.shortened = false;
    const engine::SimulationResult without = simulate_season(open, run);
    for (int t : movers_idx) {
      const auto ti = static_cast<std::size_t>(t);
      GameEffect e;
      e.date = config::format_date(*game.date);
      const config::Team& home = season.teams[static_cast<std::size_t>(game.home)];
      const config::Team& away = season.teams[static_cast<std::size_t>(game.away)];
      e.home_id = home.id;
      e.home_name = home.name.empty() ? home.id : home.name;
      e.away_id = away.id;
      e.away_name = away.name.empty() ? away.id : away.name;
      e.home_runs = game.home_runs;
      e.away_runs = game.away_runs;
      e.team_id = season.teams[ti].id;
      e.team_name = season.teams[ti].name.empty() ? e.team_id : season.teams[ti].name;
      e.postseason = change_of(without.teams[ti].postseason, base.teams[ti].postseason);
      movers.games.push_back(e);
    }
  }
  sort_by_size(movers.games, [](const GameEffect& x) { return x.postseason; });
  if (movers.games.size() > top) movers.games.resize(top);
}

}  // namespace standfast::tools
