// A season's remaining games as the game loop tallies them, and their addition to the played
// record.
//
// The remaining games fall into groups that share home team and away team (the engine groups them
// by matchup: a series is one group). Per game the loop does one read-modify-write, into its
// group's word: home wins in bits 52-63, home runs in bits 26-51, away runs in bits 0-25; and it
// stores who won, for the last-games windows. Everything else follows from the schedule (fixed
// for the run) once the season is over: SeasonTotals::add_to spreads each group's word over the
// two teams (wins, division and conference wins packed in one word, so a group adds its wins
// times the group's credit 1 | same division << 16 | same conference << 32; losses are the
// games left minus the wins), runs and the head-to-head matrix, and rebuilds the windows,
// leaving exactly the record that SeasonRecord::add_result would leave game by game (a test).
// Limits checked when the layout is built: at most 2,047 games per group, at most 65,535
// remaining games per team; the loop clamps runs to 32,767 per side per game.
#ifndef STANDFAST_ENGINE_SEASON_TOTALS_H
#define STANDFAST_ENGINE_SEASON_TOTALS_H

#include <cstdint>
#include <span>
#include <vector>

#include "engine/season_record.h"

namespace standfast::engine {

// What the schedule fixes about the remaining games: built once per run.
class TotalsLayout {
 public:
  static constexpr std::uint32_t MAX_RUNS = 32767;
  static constexpr std::uint32_t MAX_GROUP_GAMES = 2047;

  TotalsLayout() = default;
  // home[g], away[g]: the teams of remaining game g, in chronological order; group[g]: its group
  // (groups are numbered from 0; every game of a group has the same home and away teams).
  // `base` is the record the games are added to (its teams' divisions and conferences, its
  // windows and its results so far). Throws std::invalid_argument naming the game or group when
  // the lists disagree or a limit is passed.
  // Groups numbered `counted` or more hold games that are played but count for nobody (a
  // scenario's removed games). `chronological` lists the games by date when that is not their
  // order in the lists (a scenario's added games come last); empty = the lists' order.
  TotalsLayout(std::span<const std::uint16_t> home, std::span<const std::uint16_t> away,
               std::span<const std::uint32_t> group, const SeasonRecord& base,
               std::uint32_t counted = UINT32_MAX,
               std::span<const std::uint32_t> chronological = {});

  std::size_t games() const { return games_; }
  std::size_t groups() const { return groups_.size(); }   // counted groups
  std::size_t all_groups() const { return all_groups_; }  // with those that count for nobody
  int teams() const { return teams_; }

 private:
  friend class SeasonTotals;
  struct Group {
    std::uint16_t home = 0, away = 0;
    std::int32_t games = 0;
    std::uint64_t credit = 0;  // 1 | same division << 16 | same conference << 32
  };
  // The last games of one team within one window's scope: the played results that stay in the
  // window (oldest first) and the remaining games that enter it (chronological).
  struct WindowTeam {
    int window = 0, team = 0;
    std::vector<std::int32_t> played;
    std::vector<std::uint32_t> games;  // remaining game index << 1 | 1 when the team is at home
  };

  int teams_ = 0;
  std::size_t games_ = 0, all_groups_ = 0;
  std::vector<Group> groups_;
  std::vector<std::int32_t> games_left_, division_left_, conference_left_;  // per team
  std::vector<WindowTeam> windows_;  // only teams with games left in the window's scope
};

// One worker's tallies of the season being played. No allocation after construction.
class SeasonTotals {
 public:
  SeasonTotals() = default;
  explicit SeasonTotals(const TotalsLayout& layout);

  // Zero, for a new season.
  void clear();

  // The loop's view: raw pointers, to be held in a local variable so that the compiler keeps
  // them in registers (a store through the byte array could otherwise alias the vectors'
  // pointers and force a reload per game).
  struct Sink {
    std::uint64_t* word;     // per group
    std::uint8_t* home_won;  // per game

    // Remaining game g of group `group`: the result. Runs are at most TotalsLayout::MAX_RUNS
    // (the caller clamps).
    void add(std::size_t g, std::uint32_t group, std::uint32_t home_won_g, std::uint32_t home_runs,
             std::uint32_t away_runs) const {
      word[group] += static_cast<std::uint64_t>(home_won_g) << 52 |
                     static_cast<std::uint64_t>(home_runs) << 26 | away_runs;
      home_won[g] = static_cast<std::uint8_t>(home_won_g);
    }

    // Game g, added earlier as a home loss at a tied score, was settled in extra innings: adds
    // the home win, if it was one, and the extra runs (the total per side at most MAX_RUNS).
    void add_extra(std::size_t g, std::uint32_t group, std::uint32_t home_won_g,
                   std::uint32_t extra_home_runs, std::uint32_t extra_away_runs) const {
      word[group] += static_cast<std::uint64_t>(home_won_g) << 52 |
                     static_cast<std::uint64_t>(extra_home_runs) << 26 | extra_away_runs;
      home_won[g] = static_cast<std::uint8_t>(home_won_g);
    }
  };
  Sink sink() { return Sink{word_.data(), home_won_.data()}; }

  // Who won each remaining game of the season just played (1 = the home side).
  const std::uint8_t* home_won() const { return home_won_.data(); }

  // Game g, alone in its group and already added (and settled), is given this result instead:
  // the winner's runs are the larger of the two scores (a scenario's forced result).
  void force(std::size_t g, std::uint32_t group, bool home_won);

  // Adds the season's games to `record`, which holds the layout's base record. The last-games
  // windows are deferred (SeasonRecord::defer_windows): this object must stay unchanged until
  // the record is done with or copied.
  void add_to(SeasonRecord& record);

  // `record` holds the season's games as add_to left them when the words of `groups` were
  // `old_words`; brings it up to date with those groups' current words (and defers the windows
  // again). For a replay of a few groups (engine/shift_replay.h): the same record as add_to.
  void update(SeasonRecord& record, std::span<const std::uint32_t> groups,
              std::span<const std::uint64_t> old_words);

 private:
  static void fill_windows(void* self, SeasonRecord& record);

  const TotalsLayout* layout_ = nullptr;
  std::vector<std::uint64_t> word_;     // per group
  std::vector<std::uint8_t> home_won_;  // per game
  // add_to's per-team sums: wins, division wins and conference wins packed like a group's credit
  // (so a group adds wins x credit), and runs scored << 32 | runs allowed.
  std::vector<std::uint64_t> team_credit_, team_runs_;
  std::vector<std::int32_t> window_;  // scratch: one window's results
};

}  // namespace standfast::engine

#endif  // STANDFAST_ENGINE_SEASON_TOTALS_H
