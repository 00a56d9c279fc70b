#include "engine/standings.h"

#include <algorithm>

#include "engine/rng.h"
#include "engine/season_record.h"
#include "engine/seeding.h"

namespace standfast::engine {

namespace {

constexpr int LAST_GAMES = 10;

// Per team: results of its played games in order, 1 = won, 0 = lost.
std::vector<std::vector<char>> results_by_team(const config::Season& season,
                                               const std::vector<int>& order) {
  std::vector<std::vector<char>> out(season.teams.size());
  for (int g : order) {
    const auto& game = season.games[g];
    if (game.home_runs == game.away_runs) continue;
    const bool home_won = game.home_runs > game.away_runs;
    out[game.home].push_back(home_won ? 1 : 0);
    out[game.away].push_back(home_won ? 0 : 1);
  }
  return out;
}

}  // namespace

Standings compute_standings(const config::Season& season) {
  const int n = static_cast<int>(season.teams.size());
  const auto order = played_games_in_order(season);
  SeasonRecord record = make_record(season);
  std::vector<StandingsLine> line(n);
  for (int t = 0; t < n; ++t) line[t].team = t;
  Standings out;
  for (int g : order) {
    const auto& game = season.games[g];
    if (game.home_runs == game.away_runs) continue;  // never valid (the loader rejects it)
    const bool home_won = game.home_runs > game.away_runs;
    const int winner = home_won ? game.home : game.away;
    const int loser = home_won ? game.away : game.home;
    record.add_result(winner, loser, std::max(game.home_runs, game.away_runs),
                      std::min(game.home_runs, game.away_runs));
    auto& h = line[game.home];
    auto& a = line[game.away];
    (home_won ? h.home_wins : h.home_losses)++;
    (home_won ? a.road_losses : a.road_wins)++;
    ++out.games_played;
    out.through = *game.date;
  }
  const auto results = results_by_team(season, order);
  for (int t = 0; t < n; ++t) {
    auto& l = line[t];
    l.wins = record.wins(t);
    l.losses = record.losses(t);
    l.runs_for = record.runs_for(t);
    l.runs_against = record.runs_against(t);
    l.division_wins = record.division_wins(t);
    l.division_losses = record.division_losses(t);
    l.conference_wins = record.conference_wins(t);
    l.conference_losses = record.conference_losses(t);
    const auto& r = results[t];
    const int first = std::max(0, static_cast<int>(r.size()) - LAST_GAMES);
    for (int i = first; i < static_cast<int>(r.size()); ++i)
      (r[i] ? l.last10_wins : l.last10_losses)++;
    if (!r.empty()) {
      const char last = r.back();
      int count = 0;
      for (auto it = r.rbegin(); it != r.rend() && *it == last; ++it) ++count;
      l.streak = last ? count : -count;
    }
  }

  const Seeder seeder(season);
  auto ranking = seeder.make_ranking();
  auto scratch = seeder.make_scratch();
  Rng rng = make_stream(0, 0, Purpose::kTiebreak);
  seeder.rank(record, rng, scratch, ranking);

  for (std::size_t c = 0; c < season.conferences.size(); ++c) {
    ConferenceStandings cs;
    cs.conference = season.conferences[c];
    const auto seeds = ranking.conference_seeds(static_cast<int>(c));
    cs.seeds.assign(seeds.begin(), seeds.end());
    cs.qualifying_winners = ranking.qualifying_winners[c];
    for (std::size_t i = 0; i < cs.seeds.size(); ++i)
      line[cs.seeds[i]].seed = static_cast<int>(i) + 1;
    for (std::size_t d = 0; d < season.divisions.size(); ++d) {
      const int group = season.divisions[d];
      int top = group;
      while (season.groups[top].parent >= 0) top = season.groups[top].parent;
      if (top != cs.conference) continue;
      DivisionStandings ds;
      ds.division = group;
      const auto teams = ranking.division(static_cast<int>(d));
      for (std::size_t i = 0; i < teams.size(); ++i) {
        StandingsLine l = line[teams[i]];
        const StandingsLine& leader = line[teams[0]];
        l.games_back_halves = games_back_halves(leader.wins, leader.losses, l.wins, l.losses);
        l.division_leader = i == 0;
        ds.lines.push_back(l);
      }
      cs.divisions.push_back(std::move(ds));
    }
    out.conferences.push_back(std::move(cs));
  }
  return out;
}

}  // namespace standfast::engine
