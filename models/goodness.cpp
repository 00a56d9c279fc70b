#include "models/goodness.h"

#include <fmt/core.h>

#include <algorithm>
#include <boost/math/distributions/chi_squared.hpp>
#include <cmath>
#include <stdexcept>

#include "models/score_dist.h"

namespace standfast::models {

ScoreBins pool_bins(const std::vector<double>& observed, const std::vector<double>& expected,
                    double min_expected) {
  if (observed.size() != expected.size() || expected.empty()) {
    throw std::domain_error(
        fmt::format("pool_bins: observed ({}) and expected ({}) sizes differ or are 0",
                    observed.size(), expected.size()));
  }
  ScoreBins out;
  double o = 0.0, e = 0.0;
  int first = 0;
  for (size_t k = 0; k < expected.size(); ++k) {
    o += observed[k];
    e += expected[k];
    if (e >= min_expected && k + 1 < expected.size()) {
      out.first.push_back(first);
      out.observed.push_back(o);
      out.expected.push_back(e);
      first = static_cast<int>(k) + 1;
      o = e = 0.0;
    }
  }
  if (e >= min_expected || out.first.empty()) {
    out.first.push_back(first);
    out.observed.push_back(o);
    out.expected.push_back(e);
  } else {
    out.observed.back() += o;
    out.expected.back() += e;
  }
  return out;
}

ChiSquare pearson(const ScoreBins& bins) {
  ChiSquare c;
  c.bins = static_cast<int>(bins.expected.size());
  for (size_t b = 0; b < bins.expected.size(); ++b) {
    if (bins.expected[b] <= 0.0) continue;
    const double d = bins.observed[b] - bins.expected[b];
    c.statistic += d * d / bins.expected[b];
  }
  return c;
}

double chi_square_upper_p(double x, int df) {
  if (df <= 0)
    throw std::domain_error(fmt::format("chi_square_upper_p: df must be > 0, got {}", df));
  if (!(x >= 0.0))
    throw std::domain_error(fmt::format("chi_square_upper_p: x must be >= 0, got {}", x));
  return boost::math::cdf(
      boost::math::complement(boost::math::chi_squared_distribution<double>(df), x));
}

double chi_square_critical(int df, double alpha) {
  if (df <= 0)
    throw std::domain_error(fmt::format("chi_square_critical: df must be > 0, got {}", df));
  if (!(alpha > 0.0 && alpha < 1.0)) {
    throw std::domain_error(
        fmt::format("chi_square_critical: alpha must be in (0, 1), got {}", alpha));
  }
  return boost::math::quantile(
      boost::math::complement(boost::math::chi_squared_distribution<double>(df), alpha));
}

double bonferroni_critical(int df, double family_alpha, int tests) {
  if (tests <= 0)
    throw std::domain_error(fmt::format("bonferroni_critical: tests must be > 0, got {}", tests));
  return chi_square_critical(df, family_alpha / tests);
}

double aic(double log_lik, int parameters) { return 2.0 * parameters - 2.0 * log_lik; }

namespace {

// pmf values for k = 0..K-2 and the tail P(Y >= K-1) last.
void add_expected(config::ScoreFamily family, double mu, double shape, std::vector<double>& e) {
  const int K = static_cast<int>(e.size());
  std::vector<double> p(K);
  switch (family) {
    case config::ScoreFamily::kWeibull: {
      const DiscreteWeibull d = weibull_for_mean(mu, shape);
      for (int k = 0; k < K - 1; ++k) p[k] = pmf(d, k);
      p[K - 1] = survival(d, K - 2);
      break;
    }
    case config::ScoreFamily::kNegativeBinomial: {
      const NegativeBinomial d = negative_binomial_for_mean(mu, shape);
      for (int k = 0; k < K - 1; ++k) p[k] = pmf(d, k);
      p[K - 1] = survival(d, K - 2);
      break;
    }
    case config::ScoreFamily::kPoisson: {
      const Poisson d = poisson_for_mean(mu);
      for (int k = 0; k < K - 1; ++k) p[k] = pmf(d, k);
      p[K - 1] = survival(d, K - 2);
      break;
    }
    case config::ScoreFamily::kLog5:
      throw std::domain_error("team_chi_square: family log5 has no score distribution");
  }
  for (int k = 0; k < K; ++k) e[k] += p[k];
}

}  // namespace

std::vector<TeamChiSquare> team_chi_square(const std::vector<Side>& sides, int n,
                                           const JointFit& fit, config::ScoreFamily family) {
  int max_runs = 0;
  for (const Side& s : sides) max_runs = std::max(max_runs, s.runs);
  const int K = std::max(max_runs, 30) + 2;  // scores 0..K-2 and "K-1 or more"
  std::vector<std::vector<double>> obs_s(n, std::vector<double>(K)), exp_s = obs_s, obs_a = obs_s,
                                                                     exp_a = obs_s;
  std::vector<double> e(K);
  for (const Side& s : sides) {
    std::fill(e.begin(), e.end(), 0.0);
    add_expected(family, std::exp(fit.eta(s)), fit.shape, e);
    const int k = std::min(s.runs, K - 1);
    obs_s[s.batting][k] += 1.0;
    obs_a[s.fielding][k] += 1.0;
    for (int j = 0; j < K; ++j) {
      exp_s[s.batting][j] += e[j];
      exp_a[s.fielding][j] += e[j];
    }
  }
  std::vector<TeamChiSquare> out(n);
  for (int i = 0; i < n; ++i) {
    const ScoreBins bs = pool_bins(obs_s[i], exp_s[i]);
    const ScoreBins ba = pool_bins(obs_a[i], exp_a[i]);
    const ChiSquare cs = pearson(bs), ca = pearson(ba);
    TeamChiSquare& t = out[i];
    t.statistic = cs.statistic + ca.statistic;
    t.bins_scored = cs.bins;
    t.bins_allowed = ca.bins;
    t.df = (cs.bins - 1) + (ca.bins - 1) - 2;
    t.p_value = t.df > 0 ? chi_square_upper_p(t.statistic, t.df) : 1.0;
  }
  return out;
}

}  // namespace standfast::models
