// The results a ranking needs, as flat per-team integer arrays: wins, losses, runs, head-to-head
// wins, records within the division and the conference, and the last-games windows that the
// tiebreakers ask for. One SeasonRecord is built from the played games; the engine copies it at
// the start of every simulated season and adds the simulated results. Copying a record into
// another of the same league reuses its storage (one std::vector of int32), and add_result never
// allocates. The engine adds a season's remaining games in bulk (add_team_results, add_h2h,
// set_window; see engine/season_totals.h).
//
// Games have a winner and a loser (a game is never left tied; extra innings or the league's
// draw settle it). Results must be added in chronological order: the last-games windows are
// ring buffers that keep each team's most recent results within the window's scope.
#ifndef STANDFAST_ENGINE_SEASON_RECORD_H
#define STANDFAST_ENGINE_SEASON_RECORD_H

#include <cstdint>
#include <span>
#include <vector>

#include "config/season.h"

namespace standfast::engine {

// A window of a team's most recent games: the last `games` games it played within `scope`
// (kLeague: every game; kConference: games against teams of its own conference; kDivision:
// games against teams of its own division).
struct LastGamesWindow {
  int games = 0;
  config::TiebreakScope scope = config::TiebreakScope::kLeague;
  friend bool operator==(const LastGamesWindow&, const LastGamesWindow&) = default;
};

// The distinct last-games windows the tiebreak rules use, in rule order. SeasonRecord and
// Tiebreaker both build theirs with this function, so window k is the same in both.
std::vector<LastGamesWindow> last_games_windows(const config::Tiebreakers& tiebreakers);

class SeasonRecord {
 public:
  SeasonRecord() = default;
  // Copies settle deferred windows first (see defer_windows).
  SeasonRecord(const SeasonRecord& other);
  SeasonRecord& operator=(const SeasonRecord& other);
  SeasonRecord(SeasonRecord&&) = default;
  SeasonRecord& operator=(SeasonRecord&&) = default;

  // An empty record for teams whose division and conference indexes are given (any integers;
  // two teams share a division when the numbers are equal), with the given windows (games >= 1).
  SeasonRecord(std::span<const int> division, std::span<const int> conference,
               std::span<const LastGamesWindow> windows);

  int team_count() const { return n_; }

  // Sets every result to zero; the teams and windows stay. No allocation.
  void clear();

  // Adds one game: `winner` beat `loser`, scoring winner_runs to loser_runs. Call in
  // chronological order (the last-games windows depend on it). No allocation.
  void add_result(int winner, int loser, int winner_runs, int loser_runs);

  // Bulk additions for the simulation engine, which tallies a season's remaining games outside
  // the record (engine/season_totals.h) and then adds them here. Together they leave exactly the
  // record that add_result would leave called for each of those games in turn.
  struct TeamResults {
    int wins = 0, losses = 0, runs_for = 0, runs_against = 0;
    int division_wins = 0, division_losses = 0, conference_wins = 0, conference_losses = 0;
  };
  void add_team_results(int t, const TeamResults& r) {
    at(kWins, t) += r.wins;
    at(kLosses, t) += r.losses;
    at(kRunsFor, t) += r.runs_for;
    at(kRunsAgainst, t) += r.runs_against;
    at(kDivWins, t) += r.division_wins;
    at(kDivLosses, t) += r.division_losses;
    at(kConfWins, t) += r.conference_wins;
    at(kConfLosses, t) += r.conference_losses;
  }
  // Adds `wins` wins of team i over team j.
  void add_h2h(int i, int j, int wins) {
    data_[h2h_ + static_cast<std::size_t>(i) * n_ + j] += wins;
  }
  // Replaces team t's window k by these results (1 won, 0 lost), oldest first; only the last
  // window(k).games of them are kept.
  void set_window(int k, int t, std::span<const std::int32_t> oldest_first);
  // Team t's results in window k (1 won, 0 lost), oldest first.
  std::vector<std::int32_t> window_results(int k, int t) const;

  // Defers the last-games windows: the first read of a window (or a copy, add_result or
  // set_window) calls fill(context, *this) once, which must bring every window up to date with
  // set_window. The engine uses it because the windows are read only by ties that get that far
  // down the tiebreak rules, which few simulated seasons have. The context must outlive the
  // deferral; a copy of the record is made after filling, so it never shares the context.
  using WindowFill = void (*)(void* context, SeasonRecord& record);
  void defer_windows(void* context, WindowFill fill) {
    fill_context_ = context;
    fill_ = fill;
  }

  int wins(int t) const { return at(kWins, t); }
  int losses(int t) const { return at(kLosses, t); }
  int games(int t) const { return wins(t) + losses(t); }
  int runs_for(int t) const { return at(kRunsFor, t); }
  int runs_against(int t) const { return at(kRunsAgainst, t); }
  int run_differential(int t) const { return runs_for(t) - runs_against(t); }
  int division_wins(int t) const { return at(kDivWins, t); }
  int division_losses(int t) const { return at(kDivLosses, t); }
  int conference_wins(int t) const { return at(kConfWins, t); }
  int conference_losses(int t) const { return at(kConfLosses, t); }
  int division_of(int t) const { return at(kDivision, t); }
  int conference_of(int t) const { return at(kConference, t); }
  // Wins of team i over team j.
  int h2h_wins(int i, int j) const { return data_[h2h_ + static_cast<std::size_t>(i) * n_ + j]; }

  int window_count() const { return static_cast<int>(windows_.size()); }
  const LastGamesWindow& window(int k) const { return windows_[k]; }
  // Index of the window with these games and scope, or -1.
  int find_window(const LastGamesWindow& w) const;
  // Wins and losses of team t over its last window(k).games games in window(k).scope (fewer when
  // it has not played that many).
  int last_wins(int k, int t) const {
    settle_windows();
    return data_[win_base_[k] + t];
  }
  int last_losses(int k, int t) const {
    settle_windows();
    return data_[win_base_[k] + n_ + t] - data_[win_base_[k] + t];
  }

 private:
  // Blocks of n int32 values in data_, in this order; then the n*n head-to-head matrix; then per
  // window: wins[n], count[n], head[n], ring[n*games].
  enum Block {
    kDivision,
    kConference,
    kWins,
    kLosses,
    kRunsFor,
    kRunsAgainst,
    kDivWins,
    kDivLosses,
    kConfWins,
    kConfLosses,
    kBlockCount
  };
  int at(Block b, int t) const { return data_[static_cast<std::size_t>(b) * n_ + t]; }
  int& at(Block b, int t) { return data_[static_cast<std::size_t>(b) * n_ + t]; }
  void push_window(int k, int team, int won);
  // Runs a deferred window fill, if any (const: the windows are a cache of the games added).
  void settle_windows() const {
    if (fill_ != nullptr) [[unlikely]] {
      const WindowFill fill = fill_;
      fill_ = nullptr;
      fill(fill_context_, const_cast<SeasonRecord&>(*this));
    }
  }

  int n_ = 0;
  std::size_t h2h_ = 0;  // offset of the head-to-head matrix
  std::vector<LastGamesWindow> windows_;
  std::vector<std::size_t> win_base_;  // offset of each window's blocks
  std::vector<std::int32_t> data_;
  mutable void* fill_context_ = nullptr;
  mutable WindowFill fill_ = nullptr;
};

// An empty record for the season's teams, with the windows its tiebreakers need.
SeasonRecord make_record(const config::Season& season);

// The indexes into season.games of the played games in chronological order: by date, file order
// within a day. Games with an unknown date count as unplayed and are left out.
std::vector<int> played_games_in_order(const config::Season& season);

// The record of the season's played games (make_record plus every played game in order).
SeasonRecord played_record(const config::Season& season);

}  // namespace standfast::engine

#endif  // STANDFAST_ENGINE_SEASON_RECORD_H
