// The chance that a side wins one game under a scoring family, from the expected runs of both
// sides: with X and Y the two regulation scores (independent, of the family with these means),
//   P(win) = P(X > Y) + P(X = Y) P(X > Y) / (P(X > Y) + P(X < Y)),
// a tie after regulation split in the proportion of regulation wins and losses (extra innings
// approximated; the simulation plays them). Used to convert added wins into runs per game.
#ifndef STANDFAST_MODELS_WIN_CHANCE_H
#define STANDFAST_MODELS_WIN_CHANCE_H

#include "config/season.h"

namespace standfast::models {

// The three regulation chances of a game.
struct RegulationChances {
  double win = 0, tie = 0, loss = 0;
};

// P(X > Y), P(X = Y), P(X < Y) for a side expecting `runs_for` against one expecting
// `runs_against` (shape: Weibull gamma or negative-binomial size; ignored for Poisson). Throws
// std::domain_error for log5 (no scores) or a mean that is not positive and finite.
RegulationChances regulation_chances(config::ScoreFamily family, double shape, double runs_for,
                                     double runs_against);

// The formula above.
double game_win_chance(config::ScoreFamily family, double shape, double runs_for,
                       double runs_against);

// log5 (Bradley-Terry): a side with odds a = p / (1 - p) against one with odds b wins with
// probability a / (a + b).
double log5_win_chance(double odds_for, double odds_against);

}  // namespace standfast::models

#endif  // STANDFAST_MODELS_WIN_CHANCE_H
