#include "models/strength_sampler.h"

#include <algorithm>

namespace standfast::models {

void StrengthSampler::draw(const double* z, double* work, double* out) const {
  const int d = dimension, n = teams;
  double* y = work;  // factor positions
  double* latent = work + d;
  // Back substitution L^T y = z: y_j = (z_j - sum_{i > j} L_ij y_i) / L_jj, last to first.
  for (int j = d - 1; j >= 0; --j) {
    const int begin = col_start[static_cast<std::size_t>(j)];
    const int end = col_start[static_cast<std::size_t>(j) + 1];
    double s = z[j];
    for (int k = begin + 1; k < end; ++k) s -= value[k] * y[row[k]];
    y[j] = s / value[begin];
  }
  for (int p = 0; p < d; ++p) latent[order[static_cast<std::size_t>(p)]] = y[p];
  if (rank > 0) {
    const double* w = z + d;
    for (int i = 0; i < d; ++i) {
      const double* l = low_rank.data() + static_cast<std::size_t>(i) * rank;
      double s = 0.0;
      for (int r = 0; r < rank; ++r) s += l[r] * w[r];
      latent[i] += s;
    }
  }
  double mo = 0.0, md = 0.0;
  for (int t = 0; t < n; ++t) {
    const int io = offence[static_cast<std::size_t>(t)], id = defence[static_cast<std::size_t>(t)];
    out[t] = io < 0 ? 0.0 : latent[io];
    out[n + t] = id < 0 ? 0.0 : latent[id];
    mo += out[t];
    md += out[n + t];
  }
  if (!centre) mo = md = 0.0;
  mo /= n;
  md /= n;
  for (int t = 0; t < n; ++t) {
    out[t] = scale[static_cast<std::size_t>(t)] * (out[t] - mo);
    out[n + t] = scale[static_cast<std::size_t>(n + t)] * (out[n + t] - md);
  }
}

StrengthSampler diagonal_sampler(const std::vector<double>& offence_se,
                                 const std::vector<double>& defence_se) {
  StrengthSampler s;
  const int n = static_cast<int>(offence_se.size());
  s.teams = n;
  s.dimension = 2 * n;
  for (int j = 0; j <= 2 * n; ++j) s.col_start.push_back(j);
  s.row.assign(static_cast<std::size_t>(2 * n), 0);
  for (int j = 0; j < 2 * n; ++j) s.row[static_cast<std::size_t>(j)] = j;
  s.value.assign(static_cast<std::size_t>(2 * n), 1.0);
  for (int j = 0; j < 2 * n; ++j) s.order.push_back(j);
  for (int t = 0; t < n; ++t) {
    s.offence.push_back(t);
    s.defence.push_back(n + t);
  }
  s.scale = offence_se;
  s.scale.insert(s.scale.end(), defence_se.begin(), defence_se.end());
  return s;
}

std::vector<double> sampler_covariance(const StrengthSampler& s) {
  const std::size_t m = 2 * static_cast<std::size_t>(s.teams), k = s.normals();
  std::vector<double> cov(m * m, 0.0), z(k, 0.0), work(s.work_size()), out(m);
  for (std::size_t c = 0; c < k; ++c) {
    std::fill(z.begin(), z.end(), 0.0);
    z[c] = 1.0;
    s.draw(z.data(), work.data(), out.data());
    for (std::size_t a = 0; a < m; ++a) {
      if (out[a] == 0.0) continue;
      for (std::size_t b = 0; b < m; ++b) cov[a * m + b] += out[a] * out[b];
    }
  }
  return cov;
}

}  // namespace standfast::models
