// Ranking a whole league once per simulated season: every team by record, each division, and
// the postseason seeds of each conference by the season's Qualifying rules. The displayed
// standings (engine/standings.h) use the same code with a fixed random stream.
//
// Seeding of one conference (config::Qualifying):
//   1. Each division is ranked (winning percentage, then the tiebreak procedure on the teams of
//      that division). Its first team wins the division.
//   2. The division winners are ranked among themselves; the first `division_winners` of them
//      qualify as division winners (normally every division). Winners beyond that count join
//      the at-large pool.
//   3. The other teams of the conference are ranked (ties broken among the tied teams of that
//      pool); the first `at_large` qualify.
//   4. Seeds: with winners_first, the qualifying division winners in their order, then the
//      at-large teams; otherwise all qualifiers ranked together by record and the procedure.
// With a single bracket (BracketFormat::kSingleBracket) the qualifiers of every conference are
// also seeded together in league_seeds(): division winners first when the first conference's
// rules say winners_first, then the others, each part ranked by record and the procedure.
//
// Extra games (Tiebreakers::extra_game = true): when exactly two teams are tied for first in a
// division, or exactly two teams are tied for the last at-large berth of a conference (one
// qualifies, the other does not), the Seeder calls the ExtraGame hook with the two teams (home =
// the one the tiebreak procedure ranks first) and puts the winner ahead. Without a hook the
// procedure decides.
#ifndef STANDFAST_ENGINE_SEEDING_H
#define STANDFAST_ENGINE_SEEDING_H

#include <cstdint>
#include <span>
#include <vector>

#include "config/season.h"
#include "engine/rng.h"
#include "engine/season_record.h"
#include "engine/tiebreak.h"

namespace standfast::engine {

// The engine's way to play an extra tiebreak game: returns the winner (home or away). A plain
// function pointer and a context, so no allocation and no virtual call.
struct ExtraGame {
  void* context = nullptr;
  int (*play)(void* context, int home, int away) = nullptr;
  explicit operator bool() const { return play != nullptr; }
};

// The output of one ranking. Sized once for a season (by Seeder::make_ranking); reused.
struct LeagueRanking {
  std::vector<int> league;              // every team, best first
  std::vector<int> division_teams;      // per division (Season::divisions order), best first
  std::vector<int> division_offset;     // size divisions + 1
  std::vector<int> seeds;               // per conference (Season::conferences order), in seed order
  std::vector<int> seed_offset;         // size conferences + 1
  std::vector<int> league_seeds;        // single bracket only: every qualifier, in seed order
  std::vector<int> qualifying_winners;  // per conference: how many of its seeds won a division
  int extra_games = 0;                  // extra games played in this ranking
  std::vector<std::int64_t> keys;       // per team: pct_key of its record
  std::vector<int> work;                // working space of the Seeder

  std::span<const int> division(int d) const {
    return {division_teams.data() + division_offset[d],
            static_cast<std::size_t>(division_offset[d + 1] - division_offset[d])};
  }
  int division_winner(int d) const { return division_teams[division_offset[d]]; }
  std::span<const int> conference_seeds(int c) const {
    return {seeds.data() + seed_offset[c],
            static_cast<std::size_t>(seed_offset[c + 1] - seed_offset[c])};
  }
};

class Seeder {
 public:
  Seeder() = default;
  explicit Seeder(const config::Season& season);

  const Tiebreaker& tiebreaker() const { return tiebreaker_; }

  // A ranking sized for this season; pass it to rank() every time.
  LeagueRanking make_ranking() const;
  // Working space for one thread.
  TiebreakScratch make_scratch() const { return TiebreakScratch(team_count_); }

  // Ranks the league, its divisions and the conference seeds for this record. No allocation.
  void rank(const SeasonRecord& record, Rng& rng, TiebreakScratch& scratch, LeagueRanking& out,
            ExtraGame extra = {}) const;

 private:
  struct Conference {
    int divisions_begin = 0, divisions_end = 0;  // range of conference_divisions_
    int division_winners = 0;  // qualifying division winners (at most the division count)
    int at_large = 0;          // at-large berths (at most the teams left)
    bool winners_first = true;
  };
  int team_count_ = 0;
  Tiebreaker tiebreaker_;
  PctKeyTable key_table_;                  // exact winning-percentage keys without a division
  std::vector<int> team_division_;         // per team: position in Season::divisions
  std::vector<int> team_conference_;       // per team: position in Season::conferences
  std::vector<int> division_offset_;       // per division: start in division_teams; size D + 1
  std::vector<int> conference_divisions_;  // per conference: its divisions (positions), flat
  std::vector<Conference> conferences_;    // Season::conferences order
  bool single_bracket_ = false;
  bool league_winners_first_ = true;
};

}  // namespace standfast::engine

#endif  // STANDFAST_ENGINE_SEEDING_H
