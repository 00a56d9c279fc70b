#include "engine/seeding.h"

#include <algorithm>
#include <stdexcept>
#include <string>
#include <utility>

namespace standfast::engine {

namespace {

int top_group(const config::Season& season, int g) {
  while (g >= 0 && season.groups[g].parent >= 0) g = season.groups[g].parent;
  return g;
}

bool same_pct(const std::int64_t* key, int a, int b) { return key[a] == key[b]; }

// True when teams[i] and teams[i + 1] are tied and no other team of the list shares their
// winning percentage: exactly two teams tied across the boundary after position i.
bool two_team_tie_at(const std::int64_t* r, const int* teams, int size, int i) {
  if (i < 0 || i + 1 >= size) return false;
  if (!same_pct(r, teams[i], teams[i + 1])) return false;
  if (i > 0 && same_pct(r, teams[i - 1], teams[i])) return false;
  if (i + 2 < size && same_pct(r, teams[i + 2], teams[i])) return false;
  return true;
}

// Plays the extra game between teams[i] (home: ranked first by the procedure) and teams[i + 1]
// and puts the winner at i.
void settle_by_game(int* teams, int i, ExtraGame extra, int& played) {
  const int winner = extra.play(extra.context, teams[i], teams[i + 1]);
  ++played;
  if (winner == teams[i + 1]) std::swap(teams[i], teams[i + 1]);
}

}  // namespace

Seeder::Seeder(const config::Season& season)
    : team_count_(static_cast<int>(season.teams.size())), tiebreaker_(season) {
  const int n = team_count_;
  {
    std::vector<int> scheduled(season.teams.size(), 0);
    for (const auto& g : season.games) {
      if (g.home >= 0 && g.home < n) ++scheduled[g.home];
      if (g.away >= 0 && g.away < n) ++scheduled[g.away];
    }
    const int most = scheduled.empty() ? 0 : *std::max_element(scheduled.begin(), scheduled.end());
    key_table_ = PctKeyTable(most + 8);  // a few extra games (tiebreak games) fit too
  }
  std::vector<int> group_to_division(season.groups.size(), -1);
  std::vector<int> group_to_conference(season.groups.size(), -1);
  for (std::size_t d = 0; d < season.divisions.size(); ++d) {
    group_to_division[season.divisions[d]] = static_cast<int>(d);
  }
  for (std::size_t c = 0; c < season.conferences.size(); ++c) {
    group_to_conference[season.conferences[c]] = static_cast<int>(c);
  }
  team_division_.assign(n, 0);
  team_conference_.assign(n, 0);
  for (int t = 0; t < n; ++t) {
    const auto& team = season.teams[t];
    const int d = team.division >= 0 && team.division < static_cast<int>(season.groups.size())
                      ? group_to_division[team.division]
                      : -1;
    if (d < 0) {
      throw std::invalid_argument("Seeder: team " + team.id + " is in no division of the season");
    }
    team_division_[t] = d;
    const int conf = team.conference >= 0 ? team.conference : top_group(season, team.division);
    team_conference_[t] = conf >= 0 ? group_to_conference[conf] : 0;
  }
  const auto divisions = static_cast<int>(season.divisions.size());
  division_offset_.assign(divisions + 1, 0);
  for (int t = 0; t < n; ++t) ++division_offset_[team_division_[t] + 1];
  for (int d = 0; d < divisions; ++d) division_offset_[d + 1] += division_offset_[d];

  std::vector<int> conference_teams(season.conferences.size(), 0);
  for (int t = 0; t < n; ++t) ++conference_teams[team_conference_[t]];
  for (std::size_t c = 0; c < season.conferences.size(); ++c) {
    Conference conf;
    conf.divisions_begin = static_cast<int>(conference_divisions_.size());
    for (int d = 0; d < divisions; ++d) {
      if (top_group(season, season.divisions[d]) == season.conferences[c]) {
        conference_divisions_.push_back(d);
      }
    }
    conf.divisions_end = static_cast<int>(conference_divisions_.size());
    if (season.postseason.enabled) {
      for (const auto& q : season.postseason.qualifying) {
        if (q.conference != season.conferences[c]) continue;
        const int ndiv = conf.divisions_end - conf.divisions_begin;
        conf.division_winners = std::clamp(q.division_winners, 0, ndiv);
        conf.at_large = std::clamp(q.at_large, 0, conference_teams[c] - conf.division_winners);
        conf.winners_first = q.winners_first;
      }
    }
    conferences_.push_back(conf);
  }
  single_bracket_ = season.postseason.enabled &&
                    season.postseason.format == config::BracketFormat::kSingleBracket;
  league_winners_first_ = conferences_.empty() || season.postseason.qualifying.empty() ||
                          season.postseason.qualifying.front().winners_first;
}

LeagueRanking Seeder::make_ranking() const {
  LeagueRanking r;
  r.league.assign(team_count_, 0);
  r.division_teams.assign(team_count_, 0);
  r.division_offset = division_offset_;
  r.seed_offset.assign(conferences_.size() + 1, 0);
  std::size_t total = 0;
  for (std::size_t c = 0; c < conferences_.size(); ++c) {
    total += conferences_[c].division_winners + conferences_[c].at_large;
    r.seed_offset[c + 1] = static_cast<int>(total);
  }
  r.seeds.assign(total, 0);
  r.league_seeds.assign(single_bracket_ ? total : 0, 0);
  r.qualifying_winners.assign(conferences_.size(), 0);
  r.keys.assign(team_count_, 0);
  r.work.assign(2 * static_cast<std::size_t>(team_count_) + division_offset_.size(), 0);
  return r;
}

void Seeder::rank(const SeasonRecord& record, Rng& rng, TiebreakScratch& scratch,
                  LeagueRanking& out, ExtraGame extra) const {
  const int n = team_count_;
  const bool games = extra && tiebreaker_.extra_game();
  out.extra_games = 0;

  // Every team by record. The exact winning-percentage key of each team is computed once.
  std::int64_t* key = out.keys.data();
  for (int t = 0; t < n; ++t) {
    out.league[t] = t;
    key[t] = key_table_.key(record.wins(t), record.losses(t));
  }
  const std::span<const std::int64_t> keys(key, static_cast<std::size_t>(n));
  tiebreaker_.rank(out.league, keys, record, rng, scratch);

  // Divisions: the league order filtered per division keeps it sorted by winning percentage;
  // only the tied runs are ordered again, among the teams of the division.
  const auto divisions = static_cast<int>(division_offset_.size()) - 1;
  int* fill = out.work.data() + n;
  for (int d = 0; d < divisions; ++d) fill[d] = division_offset_[d];
  for (int t : out.league) out.division_teams[fill[team_division_[t]]++] = t;
  for (int d = 0; d < divisions; ++d) {
    int* seg = out.division_teams.data() + division_offset_[d];
    const int size = division_offset_[d + 1] - division_offset_[d];
    tiebreaker_.break_runs({seg, static_cast<std::size_t>(size)}, keys, record, rng, scratch);
    if (games && two_team_tie_at(key, seg, size, 0)) settle_by_game(seg, 0, extra, out.extra_games);
  }

  // Conference seeds.
  int* pool = out.work.data();
  int* qualified_winner = out.work.data() + n + division_offset_.size();  // per team: 0 or 1
  std::fill(qualified_winner, qualified_winner + n, 0);
  for (std::size_t c = 0; c < conferences_.size(); ++c) {
    const Conference& conf = conferences_[c];
    int* seeds = out.seeds.data() + out.seed_offset[c];
    const int nseeds = out.seed_offset[c + 1] - out.seed_offset[c];
    out.qualifying_winners[c] = conf.division_winners;
    if (nseeds == 0) continue;

    // Division winners ranked among themselves.
    int nwin = 0;
    for (int i = conf.divisions_begin; i < conf.divisions_end; ++i) {
      pool[nwin++] = out.division_winner(conference_divisions_[i]);
    }
    tiebreaker_.rank({pool, static_cast<std::size_t>(nwin)}, keys, record, rng, scratch);
    std::copy(pool, pool + conf.division_winners, seeds);
    for (int i = 0; i < conf.division_winners; ++i) qualified_winner[pool[i]] = 1;

    // The at-large pool: the rest of the conference, in league order (branch-free filter).
    int npool = 0;
    for (int t : out.league) {
      pool[npool] = t;
      npool +=
          static_cast<int>(team_conference_[t] == static_cast<int>(c)) & (1 - qualified_winner[t]);
    }
    tiebreaker_.break_runs({pool, static_cast<std::size_t>(npool)}, keys, record, rng, scratch);
    const int a = conf.at_large;
    if (games && a > 0 && two_team_tie_at(key, pool, npool, a - 1)) {
      settle_by_game(pool, a - 1, extra, out.extra_games);
    }
    std::copy(pool, pool + a, seeds + conf.division_winners);
    if (!conf.winners_first) {
      tiebreaker_.rank({seeds, static_cast<std::size_t>(nseeds)}, keys, record, rng, scratch);
    }
  }

  // One bracket for the league.
  if (single_bracket_ && !out.league_seeds.empty()) {
    int nw = 0;
    for (std::size_t c = 0; c < conferences_.size(); ++c) {
      const int* seeds = out.seeds.data() + out.seed_offset[c];
      const int nseeds = out.seed_offset[c + 1] - out.seed_offset[c];
      for (int i = 0; i < nseeds; ++i) {
        if (league_winners_first_ && qualified_winner[seeds[i]]) out.league_seeds[nw++] = seeds[i];
      }
    }
    int na = nw;
    for (std::size_t c = 0; c < conferences_.size(); ++c) {
      const int* seeds = out.seeds.data() + out.seed_offset[c];
      const int nseeds = out.seed_offset[c + 1] - out.seed_offset[c];
      for (int i = 0; i < nseeds; ++i) {
        if (!(league_winners_first_ && qualified_winner[seeds[i]]))
          out.league_seeds[na++] = seeds[i];
      }
    }
    int* ls = out.league_seeds.data();
    tiebreaker_.rank({ls, static_cast<std::size_t>(nw)}, keys, record, rng, scratch);
    tiebreaker_.rank({ls + nw, static_cast<std::size_t>(na - nw)}, keys, record, rng, scratch);
  }
}

}  // namespace standfast::engine
