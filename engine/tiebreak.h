// The tiebreak procedure: orders teams tied in winning percentage by the season's ordered rules
// (config::Tiebreakers), then by a random draw, which is always implied last.
//
// Multi-team ties are settled the way leagues do it: the current rule is applied to the whole
// tied set; if it separates the set into groups, the groups are ordered and the WHOLE procedure
// restarts from the first rule on every group of two or more teams that is still tied. A rule
// that separates no one falls through to the next rule.
//
// Rules (every comparison of winning percentages is exact: integer cross-multiplication):
//   head_to_head       winning percentage in the games among the tied teams only (for three or
//                      more, each team's combined record against all the others of the set); a
//                      team with no such games counts .500. A circular tie (A beat B, B beat C,
//                      C beat A) separates no one and falls through.
//   division_record    winning percentage in games within the team's own division (teams of
//                      different divisions are compared all the same); no games = .500.
//   conference_record  the same within the team's own conference.
//   run_differential   runs scored minus runs allowed over the season.
//   last_games         winning percentage over the team's last N games within the scope
//                      (league, conference or division); no games = .500.
//   draw               a uniform random order of the tied set (Fisher-Yates with uniform_below).
//                      Rules listed after a draw are never reached.
//
// Usage: build one Tiebreaker per season (it is immutable and may be shared by threads), and one
// TiebreakScratch per thread; then call order_tied or rank once per simulated season. Neither
// allocates.
#ifndef STANDFAST_ENGINE_TIEBREAK_H
#define STANDFAST_ENGINE_TIEBREAK_H

#include <cstdint>
#include <span>
#include <vector>

#include "config/season.h"
#include "engine/rng.h"
#include "engine/season_record.h"

namespace standfast::engine {

// Exact comparison of winning percentages w1/(w1+l1) and w2/(w2+l2): -1, 0 or +1. A record with
// no games counts .500.
int compare_pct(std::int64_t w1, std::int64_t l1, std::int64_t w2, std::int64_t l2);

// An integer key with the same order as the winning percentage w/(w+l) and equal exactly when
// the percentages are equal, for records of fewer than 65536 games: floor(w * 2^32 / (w+l)).
// (Two different fractions with denominators below 2^16 differ by more than 2^-32, so their keys
// differ.) No games gives the key of .500.
inline std::int64_t pct_key(int wins, int losses) {
  const std::int64_t g = static_cast<std::int64_t>(wins) + losses;
  if (g == 0) return std::int64_t{1} << 31;
  return (static_cast<std::int64_t>(wins) << 32) / g;
}

// pct_key without a division: floor(x * m / 2^64) with x = wins * 2^32 and m = floor(2^64 / g) + 1
// from a table by games g. Exact for g < 2^16: with m g = 2^64 + e, 0 < e <= g, the error term
// x e / (g 2^64) stays below 2^-16 < 1/g, too small to cross an integer. Falls back to pct_key
// for records longer than the table.
class PctKeyTable {
 public:
  explicit PctKeyTable(int max_games = 0);
  std::int64_t key(int wins, int losses) const {
    const int g = wins + losses;
    if (g < 2 || g >= static_cast<int>(recip_.size())) return pct_key(wins, losses);
    return mul_high(static_cast<std::uint64_t>(wins) << 32, recip_[static_cast<std::size_t>(g)]);
  }

 private:
  __extension__ typedef unsigned __int128 Wide;  // GCC and Clang
  static std::int64_t mul_high(std::uint64_t a, std::uint64_t b) {
    return static_cast<std::int64_t>((static_cast<Wide>(a) * b) >> 64);
  }
  std::vector<std::uint64_t> recip_;
};

// Per-thread working space for the procedure, sized for a league of `team_count` teams.
class TiebreakScratch {
 public:
  TiebreakScratch() = default;
  explicit TiebreakScratch(int team_count);

 private:
  friend class Tiebreaker;
  std::vector<std::int64_t> num_;   // per position: numerator of the rule's value
  std::vector<std::int64_t> den_;   // per position: denominator (> 0)
  std::vector<std::int64_t> key_;   // per position: winning-percentage key while sorting
  std::vector<std::int64_t> comp_;  // per position: key and position, for the counting sort
  std::vector<int> team_;           // per place: team, for the counting sort
};

class Tiebreaker {
 public:
  // Only the implied random draw.
  Tiebreaker() = default;

  // The season's rules; windows are located as last_games_windows(season.tiebreakers) lays
  // them out, which is the layout of make_record(season).
  explicit Tiebreaker(const config::Season& season);

  // Rules given directly (tests, what-if runs).
  explicit Tiebreaker(const config::Tiebreakers& tiebreakers);

  // Orders `teams` (treated as all tied, whatever their records) best first by the procedure.
  void order_tied(std::span<int> teams, const SeasonRecord& record, Rng& rng,
                  TiebreakScratch& scratch) const;

  // `teams` already sorted best first by winning percentage: orders every run of teams with
  // equal winning percentage by the procedure (the rest keeps its order).
  void break_runs(std::span<int> teams, const SeasonRecord& record, Rng& rng,
                  TiebreakScratch& scratch) const;

  // Full ranking: sorts `teams` best first by winning percentage, then orders every run of teams
  // with equal winning percentage by the procedure.
  void rank(std::span<int> teams, const SeasonRecord& record, Rng& rng,
            TiebreakScratch& scratch) const;

  // The same two, with the winning-percentage key of every team given: key[t] = pct_key of team
  // t's record (indexed by team, computed once per record). Saves recomputing the keys when one
  // record is ranked in several ways (league, divisions, conferences).
  void break_runs(std::span<int> teams, std::span<const std::int64_t> key,
                  const SeasonRecord& record, Rng& rng, TiebreakScratch& scratch) const;
  void rank(std::span<int> teams, std::span<const std::int64_t> key, const SeasonRecord& record,
            Rng& rng, TiebreakScratch& scratch) const;

  // The extra-game rule. With Tiebreakers::extra_game = true, a tie of exactly two teams for a
  // division title, or for the last postseason berth, is settled by one extra game that the
  // engine plays (the team the procedure ranks first is at home). Ties of three or more teams,
  // ties for places that do not decide who qualifies or wins the division, and every tie when
  // extra_game is false, go through the rules. The Seeder (engine/seeding.h) asks this and
  // calls the engine's ExtraGame hook.
  bool extra_game() const { return extra_game_; }
  bool settled_by_extra_game(int tied_teams) const { return extra_game_ && tied_teams == 2; }

  const std::vector<config::TiebreakRule>& rules() const { return rules_; }

 private:
  // Sorts teams[0..k) by scratch.key_ (by position), best first and stable, then resolves runs.
  void sort_and_break(int* t, int k, const SeasonRecord& record, Rng& rng,
                      TiebreakScratch& scratch) const;
  // Orders teams[0..k) (all tied), starting at rule `first`; num/den are scratch for k values.
  void resolve(int* teams, int k, std::size_t first, const SeasonRecord& record, Rng& rng,
               std::int64_t* num, std::int64_t* den) const;
  // Fills num/den for teams[0..k) under rule r; returns false when all values are equal.
  bool evaluate(std::size_t r, const int* teams, int k, const SeasonRecord& record,
                std::int64_t* num, std::int64_t* den) const;

  std::vector<config::TiebreakRule> rules_;  // up to the first draw
  std::vector<int> window_;                  // per rule: window index for kLastGames, else -1
  bool extra_game_ = false;
};

}  // namespace standfast::engine

#endif  // STANDFAST_ENGINE_TIEBREAK_H
