// Draws of the teams' true strengths from the fitted uncertainty through a sparse factor of the
// precision (inverse covariance) matrix: x = P^T L^-T z has covariance (L L^T)^-1 when
// P Q P^T = L L^T (Rue 2001, JRSS-B 63(2) 325-338, section 2), plus a low-rank term for the
// part of the precision that is not sparse. Pure arithmetic on given standard normals: the
// caller supplies them from its own random streams.
#ifndef STANDFAST_MODELS_STRENGTH_SAMPLER_H
#define STANDFAST_MODELS_STRENGTH_SAMPLER_H

#include <cstddef>
#include <vector>

namespace standfast::models {

struct StrengthSampler {
  int teams = 0;
  int dimension = 0;  // length of the latent vector (the fit's free parameters)
  int rank = 0;       // extra normals of the low-rank part
  // Lower-triangular factor L in compressed columns: column j holds rows row[k] (> j) with
  // values value[k] for k in [col_start[j] + 1, col_start[j + 1]); value[col_start[j]] is L_jj.
  std::vector<int> col_start, row;
  std::vector<double> value;
  std::vector<int> order;        // order[p] = latent index of factor position p
  std::vector<double> low_rank;  // dimension x rank, row-major: latent += low_rank * w
  std::vector<int> offence;      // per team: latent index of its log offence; -1 = fixed at 0
  std::vector<int> defence;      // same for the log defence
  bool centre = false;           // subtract the mean over the teams (sum-to-zero ratings)
  std::vector<double> scale;     // 2n multipliers of the output (offences, then defences)

  bool empty() const { return dimension == 0; }
  // Standard normals a draw consumes: dimension + rank.
  std::size_t normals() const { return static_cast<std::size_t>(dimension + rank); }
  // Scratch space a draw needs: 2 * dimension doubles.
  std::size_t work_size() const { return 2 * static_cast<std::size_t>(dimension); }
  // out[0..n): deviations of the log offences from their estimates, out[n..2n): of the log
  // defences, from z (normals() standard normals). The arithmetic is fixed by the code, so the
  // same z gives the same out on every thread.
  void draw(const double* z, double* work, double* out) const;
};

// Independent draws with the given standard errors (a diagonal covariance), for ratings that
// carry standard errors but no joint uncertainty.
StrengthSampler diagonal_sampler(const std::vector<double>& offence_se,
                                 const std::vector<double>& defence_se);

// The covariance of the sampler's output (2n x 2n, row-major), computed column by column from
// unit normals: Sigma = sum_k draw(e_k) draw(e_k)^T. For tests and small leagues.
std::vector<double> sampler_covariance(const StrengthSampler& s);

}  // namespace standfast::models

#endif  // STANDFAST_MODELS_STRENGTH_SAMPLER_H
