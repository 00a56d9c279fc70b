// The data and the per-observation likelihood of the fits: the sides of the played games (one
// side = one team batting in one game) and the binned log-likelihood of one score with its
// derivatives with respect to the log of the expected runs.
#ifndef STANDFAST_MODELS_LIKELIHOOD_H
#define STANDFAST_MODELS_LIKELIHOOD_H

#include <vector>

#include "config/season.h"

namespace standfast::models {

struct Side {
  int batting = -1;
  int fielding = -1;
  bool at_home = false;
  int runs = 0;         // runs as played (final score, extra innings included)
  double y = 0.0;       // runs used by the fit: `runs`, down-weighted in lopsided games
  double offset = 0.0;  // log(venue run factor) + log(innings / regulation) for shortened games
  bool won = false;     // this side's team won the game
  // The game went past regulation (innings stated and more than the league's regulation
  // innings): its regulation score was a tie, and the joint fit takes it as such (tie_loglik)
  // instead of the final score, whose extra-inning runs no family models. Both sides of such a
  // game carry the flag and follow each other, home side first.
  bool extra_innings = false;
};

// The two sides of every played game of the season, in game order (home side first).
// Lopsided down-weighting (ModelSpec::lopsided, off by default): when a side's final margin
// r - o exceeds `margin`, its fitted runs are y = o + margin + weight * (r - o - margin), a
// non-integer score whose unit bin [y - 0.5, y + 0.5) enters the likelihood.
// Throws std::domain_error for a team index out of range, a negative score, a tied final score,
// a venue run factor that is not positive and finite.
std::vector<Side> played_sides(const config::Season& season);

// Log-likelihood of one binned score and its first two derivatives with respect to
// eta = log(expected runs).
struct LogLikTerms {
  double value = 0.0;
  double d1 = 0.0;
  double d2 = 0.0;
};

// Family `family` (not log5) with mean exp(eta) and shape `shape` (Weibull gamma, negative
// binomial size; ignored for Poisson). For the Weibull the scale is solved so that the
// discretised mean equals exp(eta) (see weibull_for_mean).
LogLikTerms score_loglik(config::ScoreFamily family, double y, double eta, double shape);

// Log-probability that the two sides of a game are level after regulation,
//   log T = log sum_k P(k | eta_home) P(k | eta_away),
// and its derivatives with respect to the two eta = log(expected runs), cross term included:
// the likelihood of a game known only to have gone to extra innings.
struct TieTerms {
  double value = 0.0;
  double dh = 0.0, da = 0.0;               // d/d eta_home, d/d eta_away
  double dhh = 0.0, daa = 0.0, dha = 0.0;  // second derivatives
};
TieTerms tie_loglik(config::ScoreFamily family, double eta_home, double eta_away, double shape);

// Discretised Weibull log P(y) = log(exp(-(y/a)^g) - exp(-((y+1)/a)^g)) and its derivatives
// with respect to log a (the plain per-team fit works on the scale directly).
LogLikTerms weibull_loglik_log_scale(double y, double log_scale, double shape);

}  // namespace standfast::models

#endif  // STANDFAST_MODELS_LIKELIHOOD_H
