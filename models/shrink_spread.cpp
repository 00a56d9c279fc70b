#include "models/shrink_spread.h"

#include <algorithm>
#include <cmath>
#include <vector>

namespace standfast::models {

ShrinkSpread shrink_spread(const JointFit& mle) {
  ShrinkSpread out;
  const int n = mle.teams;
  if (mle.variance.empty() || n < 2) return out;
  std::vector<double> theta2, v;
  double largest = 0.0;
  for (int i = 0; i < n; ++i) {
    for (const auto& [est, var] : {std::pair{mle.log_offence[i], mle.var(mle.offence_index(i))},
                                   std::pair{mle.log_defence[i], mle.var(mle.defence_index(i))}}) {
      theta2.push_back(est * est);
      v.push_back(std::max(var, 1e-12));
      largest = std::max(largest, std::abs(est));
    }
  }
  // Each set of n ratings sums to zero: n - 1 degrees of freedom in n ratings.
  const double dof = (n - 1.0) / n;
  const double top = std::max(1.0, 3.0 * largest);
  const int points = 2000;
  std::vector<double> log_w(points), kept(points);
  double most = -INFINITY;
  for (int p = 0; p < points; ++p) {
    const double tau = top * (p + 0.5) / points, t2 = tau * tau;
    double ll = 0.0, k = 0.0;
    for (std::size_t j = 0; j < v.size(); ++j) {
      ll -= 0.5 * (dof * std::log(t2 + v[j]) + theta2[j] / (t2 + v[j]));
      k += t2 / (t2 + v[j]);
    }
    log_w[p] = ll;
    kept[p] = k / static_cast<double>(v.size());
    most = std::max(most, ll);
  }
  double sw = 0.0, sk = 0.0, skk = 0.0;
  for (int p = 0; p < points; ++p) {
    const double w = std::exp(log_w[p] - most);
    sw += w;
    sk += w * kept[p];
    skk += w * kept[p] * kept[p];
  }
  out.mean_kept = sk / sw;
  out.sd_kept = std::sqrt(std::max(0.0, skk / sw - out.mean_kept * out.mean_kept));
  return out;
}

void add_shrink_spread(StrengthSampler& s, const JointFit& mle, double sd_kept) {
  if (s.empty() || !(sd_kept > 0.0)) return;
  const int n = s.teams, d = s.dimension;
  // Latent direction whose output (centred per set when the sampler centres) is
  // sd_kept x theta: a club fixed at 0 (index -1) is the reference its set is measured from.
  std::vector<double> delta(static_cast<std::size_t>(d), 0.0);
  for (int set = 0; set < 2; ++set) {
    const std::vector<int>& index = set == 0 ? s.offence : s.defence;
    const std::vector<double>& theta = set == 0 ? mle.log_offence : mle.log_defence;
    double ref = 0.0;
    if (s.centre)
      for (int t = 0; t < n; ++t)
        if (index[t] < 0) ref = theta[t];
    for (int t = 0; t < n; ++t)
      if (index[t] >= 0) delta[index[t]] += sd_kept * (theta[t] - ref);
  }
  const int rank = s.rank + 1;
  std::vector<double> low(static_cast<std::size_t>(d) * rank, 0.0);
  for (int i = 0; i < d; ++i) {
    for (int r = 0; r < s.rank; ++r)
      low[static_cast<std::size_t>(i) * rank + r] =
          s.low_rank[static_cast<std::size_t>(i) * s.rank + r];
    low[static_cast<std::size_t>(i) * rank + s.rank] = delta[i];
  }
  s.low_rank = std::move(low);
  s.rank = rank;
}

}  // namespace standfast::models
