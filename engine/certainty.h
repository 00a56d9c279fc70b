// Exact clinch and elimination marks, magic numbers and elimination numbers, from the standings
// and the real remaining schedule (unequal games left, postponed games, doubleheaders).
//
// Conventions (the same for every question below):
// - Every scheduled game is played and has a winner. A team's final game count is therefore
//   fixed, G = W + L + R, so "team i finishes at or below winning percentage p" is the cap
//   W_i_final <= floor(p G_i): winning percentage with unequal games left is still a cap on wins,
//   and the max-flow formulation applies unchanged.
// - A tie decides nothing: a team is ELIMINATED only when, in every outcome of the remaining
//   games, it misses even with every tie broken in its favour; CLINCHED only when, in every
//   outcome, it makes it even with every tie broken against it. So a tie that a tiebreaker or an
//   extra game could settle either way never produces a mark.
// - The qualifying rule is the Seeder's (engine/seeding.h): the best team of a division wins it;
//   the first `division_winners` division winners of a conference qualify as such; the first
//   `at_large` of the rest qualify at large.
//
// Method. For a team x the best case is x winning all its games (its rivals can only lose from
// that) and the worst case x losing all. With x's final percentage P fixed, let S be the set of
// conference rivals allowed to finish above P. Whether x qualifies depends only on S: x is in
// when (a) no division rival is in S and fewer than `division_winners` other divisions have a
// member in S, or (b) |S| - min(division_winners, divisions with a member in S) < at_large.
// That condition is monotone (fewer above is better), and "the teams outside S can all be kept
// at or below P" is a transport problem (WinFlow, engine/certainty_flow.h: each group of games
// between two capped teams must be won by one of them, within the caps; Schwartz 1966) that only
// gets easier as S grows. So x is alive iff some MAXIMAL set S satisfying the condition passes
// the flow test: the search enumerates those sets (branch and bound over the teams whose fate
// against P is still open) and stops at the first that passes. Clinching is the mirror image:
// x is certain iff no MINIMAL set T violating the condition can all reach at least x's worst
// percentage at once (a flow with demands). A division is the case of one division, one winner
// and no at-large berths, where the search is one flow per question (the classic test).
//
// The search is exact. On a league so large or so open that it would need more than the limits
// below, it stops and gives the sound answer (no mark); OutcomeCertainty::exact says so.
//
// Magic number of an outcome: the smallest number of further wins of the team that makes the
// outcome certain whatever else happens (0 once clinched; -1 when even winning every remaining
// game is not enough on its own, so the team needs help). Each loss of a rival that matters
// lowers it by one, so with two teams that play the same number of games (and do not meet again)
// it is the common-practice number G + 1 - W_leader - L_chaser. Elimination number: the smallest
// number of further losses that ends the team's chance whatever else happens (0 once eliminated;
// -1 when it cannot be eliminated by its own losses alone). Both come from the exact tests with
// the team's own results fixed (binary search: each test is monotone in that number).
//
// Byes: with division winners seeded first and byes <= division_winners a bye means "win the
// division and be among the first `byes` division winners", answered exactly the same way.
// Otherwise (byes reaching the at-large seeds, seeding by record, one bracket for the league)
// the bye marks are sound bounds only: eliminated when eliminated from the postseason; clinched
// when the postseason is clinched and fewer teams than the byes can still be seeded above.
// The title: eliminated iff eliminated from the postseason (any qualifier can win every round).
#ifndef STANDFAST_ENGINE_CERTAINTY_H
#define STANDFAST_ENGINE_CERTAINTY_H

#include <span>
#include <vector>

#include "config/season.h"
#include "engine/clinch.h"

namespace standfast::engine {

struct OutcomeCertainty {
  Certainty mark = Certainty::kOpen;
  int magic = -1;        // further wins that make it certain; 0 when clinched; -1 none
  int elimination = -1;  // further losses that end it; 0 when eliminated; -1 none
  bool exact = true;     // false: a search hit its limit, the answers are sound bounds
};

struct TeamCertainty {
  OutcomeCertainty division;
  OutcomeCertainty berth;  // kOpen and -1 throughout when the season has no postseason
  Certainty bye = Certainty::kOpen;
  bool bye_exact = true;
  Certainty title = Certainty::kOpen;
};

// Work limits of one question (one team, one outcome, one count of own results).
struct CertaintyLimits {
  int flows = 1024;        // flow tests
  int nodes = 1 << 15;     // branch-and-bound nodes
  int contest_size = 500;  // larger divisions or conferences get no mark (sound), exact = false
};

// Every team's marks and numbers (Season::teams order). `records` has one entry per team
// (engine::clinch_records); the remaining games are the season's unplayed games.
std::vector<TeamCertainty> exact_certainty(const config::Season& season,
                                           std::span<const ClinchRecord> records,
                                           const CertaintyLimits& limits = {});

// The division and postseason marks in the form of the simple marks (engine/clinch.h).
std::vector<ClinchMarks> certainty_marks(std::span<const TeamCertainty> certainty);

}  // namespace standfast::engine

#endif  // STANDFAST_ENGINE_CERTAINTY_H
