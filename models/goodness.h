// Goodness of fit: Pearson's chi-square over score bins per team, with bins pooled until every
// expected count is at least 5 (common practice), upper-tail p-values and critical values from
// Boost.Math's chi_squared distribution, the Bonferroni-adjusted critical value across teams
// (Dunn 1961), and Akaike's information criterion.
#ifndef STANDFAST_MODELS_GOODNESS_H
#define STANDFAST_MODELS_GOODNESS_H

#include <vector>

#include "config/season.h"
#include "models/joint_fit.h"
#include "models/likelihood.h"

namespace standfast::models {

// Score bins after pooling. Bin b holds scores first[b] .. first[b+1]-1; the last bin is open
// (first.back() and above).
struct ScoreBins {
  std::vector<int> first;
  std::vector<double> observed, expected;
};

// Pools per-score counts: observed[k] and expected[k] for k = 0..K-1, where the last entry of
// `expected` (and `observed`) stands for K-1 and above. Adjacent bins are joined from score 0
// upward until each holds an expected count >= min_expected; a short remainder at the top joins
// the bin below it.
ScoreBins pool_bins(const std::vector<double>& observed, const std::vector<double>& expected,
                    double min_expected = 5.0);

struct ChiSquare {
  double statistic = 0.0;
  int bins = 0;
};
ChiSquare pearson(const ScoreBins& bins);

// P(X > x) for X ~ chi-square(df) (Boost.Math complement cdf).
double chi_square_upper_p(double x, int df);
// c with P(X > c) = alpha.
double chi_square_critical(int df, double alpha);
// Bonferroni: the critical value at alpha / tests.
double bonferroni_critical(int df, double family_alpha, int tests);

// AIC = 2 k - 2 log L.
double aic(double log_lik, int parameters);

// Per-team test of the joint fit: the runs the team scored and the runs it allowed, each binned
// and pooled separately, expected counts summed over the team's sides under the fitted model.
// statistic = sum of both Pearson sums; df = (bins scored - 1) + (bins allowed - 1) - 2 (the
// team's offence and defence were fitted; the few league-wide parameters are not subtracted).
struct TeamChiSquare {
  double statistic = 0.0;
  int df = 0;  // <= 0 when the team has too few games for a test
  int bins_scored = 0, bins_allowed = 0;
  double p_value = 1.0;
};
std::vector<TeamChiSquare> team_chi_square(const std::vector<Side>& sides, int teams,
                                           const JointFit& fit, config::ScoreFamily family);

}  // namespace standfast::models

#endif  // STANDFAST_MODELS_GOODNESS_H
