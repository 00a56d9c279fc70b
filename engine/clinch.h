// Simple clinch and elimination marks from the standings: certainties that follow from counting
// wins and games left, without simulating anything.
//
// These are SUFFICIENT conditions only. A team marked clinched has clinched and a team marked
// eliminated is eliminated, but a team may already be certain without being marked: the tests
// ignore that two rivals who still play each other cannot both win those games. The exact test
// (the max-flow formulation of the elimination problem, Schwartz 1966) is a later feature.
//
// Every team is assumed to play all its remaining scheduled games, so its final game count is
// G = W + L + R (wins, losses, games left). Its worst final winning percentage is W / G and its
// best is (W + R) / G. Comparisons are exact (integer cross-multiplication); with the usual
// equal schedules they reduce to counting wins. "Surely above" means strictly: a team that can
// only tie is never counted, so tiebreakers and extra games cannot undo a mark.
//
// Division (common practice):
//   clinched   when its worst percentage beats every division rival's best
//              (equal schedules: its current wins exceed every rival's maximum possible wins);
//   eliminated when some rival's worst percentage beats its best
//              (equal schedules: its maximum possible wins are below the leader's current wins).
// Postseason berth, per the conference's Qualifying rules (division_winners DW, at_large AL,
// D = divisions in the conference; a "threat" is a conference rival whose best percentage
// reaches the team's worst):
//   clinched   when it has clinched its division and fewer than DW other divisions of the
//              conference hold a threat (so it is among the qualifying division winners); or
//              when fewer than AL threats exist, plus one more allowed when every division
//              winner qualifies (DW >= D), since the team's own division winner, if not itself,
//              is then a threat that takes a division winner's berth, not an at-large one.
//              For a conference that is one division this is "fewer than slots = DW + AL other
//              teams can still reach its current wins".
//   eliminated when it cannot qualify as a division winner (eliminated from its division, or DW
//              or more other divisions each hold a team surely above it) and cannot qualify at
//              large: summed over the conference's divisions, the teams surely above it minus
//              one per division (at most one of them wins that division) number AL or more.
// A plain count of `slots` teams surely above a team is NOT sufficient with several divisions
// (a team in a weak division can still win it), hence the division-aware form above.
#ifndef STANDFAST_ENGINE_CLINCH_H
#define STANDFAST_ENGINE_CLINCH_H

#include <span>
#include <vector>

#include "config/season.h"

namespace standfast::engine {

enum class Certainty { kOpen, kClinched, kEliminated };

// One team's record so far and the games it has left on the schedule.
struct ClinchRecord {
  int wins = 0;
  int losses = 0;
  int remaining = 0;
};

struct ClinchMarks {
  Certainty division = Certainty::kOpen;
  Certainty berth = Certainty::kOpen;  // kOpen for every team when there is no postseason
};

// Wins and losses of the played games and the count of unplayed games (postponed ones with an
// unknown date included), per team of the season.
std::vector<ClinchRecord> clinch_records(const config::Season& season);

// The marks of every team (Season::teams order). `records` has one entry per team.
std::vector<ClinchMarks> simple_clinch(const config::Season& season,
                                       std::span<const ClinchRecord> records);

}  // namespace standfast::engine

#endif  // STANDFAST_ENGINE_CLINCH_H
