// One team's strength shifted within a season already played: after the baseline season (the
// season loop's own draws), the season is replayed with the team's true strength moved by a
// stated amount, on the same random streams (common random numbers). Only the games of that
// team are played again, each with the random bits it drew in the baseline (games of other
// teams keep their results); standings, tiebreakers and the postseason are settled again from
// the same streams. The outcome is exactly that of the season loop (engine/season_runner.h)
// on a plan whose team carries the shift as an added-runs override from the first remaining
// game (a test compares the two).
//
// The shift is in runs per game for the score families, half added to the runs the team scores
// and half taken from the runs it allows (each against a league-average side at a neutral
// venue, as an added-runs override counts them); for log5, in log-odds (the team's odds
// p / (1 - p) multiplied by exp(shift)).
#ifndef STANDFAST_ENGINE_SHIFT_REPLAY_H
#define STANDFAST_ENGINE_SHIFT_REPLAY_H

#include <cstdint>
#include <vector>

#include "engine/plan.h"
#include "engine/season_runner.h"
#include "engine/streams.h"

namespace standfast::engine {

// Shifts one parameter slot's season values (off = league mean x offence, def, odds as in the
// season loop's Worker) by `shift` (units above), with the arithmetic of an added-runs override
// step.
void shift_strength(const Plan& plan, double shift, double& off, double& def, double& odds);

// A team's outcome in one simulated season.
struct TeamOutcome {
  bool division = false, postseason = false, bye = false, title = false;
  int wins = 0;
  friend bool operator==(const TeamOutcome&, const TeamOutcome&) = default;
};

class ShiftReplay {
 public:
  // The plan must have no scenario edits (PlanEdits). Throws std::invalid_argument otherwise.
  ShiftReplay(const Plan& plan, bool postseason);

  // Plays the season of these streams as the season loop does and keeps it.
  void baseline(const SeasonStreams& streams);
  // A team's outcome in the baseline season.
  TeamOutcome baseline_outcome(int team) const;
  // The season of the last baseline() with the team's strength shifted (units above). The
  // baseline is left as it was.
  TeamOutcome shifted(int team, double shift);

  const Plan& plan() const { return plan_; }
  // How many shifted seasons were decided by the team's record alone (out_of_it), for tests.
  std::uint64_t decided_by_record() const { return decided_by_record_; }

 private:
  struct TeamGames {
    std::vector<std::uint16_t> slots;     // the team's parameter slots
    std::vector<std::uint32_t> matchups;  // matchups with one of its slots
    std::vector<std::uint32_t> games;     // its remaining games, in draw order
  };

  TeamOutcome outcome_of(int team) const;
  // True when the team's record alone rules out the division and a berth: a team of its
  // division has a strictly better winning percentage, and at least `quota_` teams of its
  // conference do (the conference's division-winner and at-large berths together). The
  // standings and the postseason are then not settled again: the team's outcome is known.
  bool out_of_it(int team) const;

  const Plan& plan_;
  detail::SeasonRunner runner_;
  detail::Worker w_;
  SeasonStreams streams_{0, 0};
  int draws_per_game_ = 1;
  std::vector<std::uint64_t> bits_;  // the games stream of the season: per game, then the key
  std::vector<TeamGames> team_games_;
  std::vector<std::vector<int>> conference_mates_;  // per team: the other teams of its conference
  std::uint64_t decided_by_record_ = 0;
  std::vector<int> quota_;         // per team: berths of its conference; -1: no short cut
  std::vector<TeamOutcome> base_;  // per team
  SeasonRecord base_record_;       // the baseline's record before the ranking
  // Saved while a team is replayed.
  std::vector<double> saved_off_, saved_def_, saved_odds_;
  std::vector<Sides> saved_sides_;
  std::vector<std::uint64_t> saved_word_;
  std::vector<std::uint8_t> saved_won_;
  std::vector<std::uint32_t> ties_;
};

}  // namespace standfast::engine

#endif  // STANDFAST_ENGINE_SHIFT_REPLAY_H
