#include "models/joint_fit.h"

#include <fmt/core.h>

#include <Eigen/SparseCholesky>
#include <Eigen/SparseCore>
#include <algorithm>
#include <array>
#include <cmath>
#include <cstdint>
#include <limits>
#include <stdexcept>

#include "models/score_dist.h"

namespace standfast::models {

double JointFit::se(int i) const {
  if (variance.empty()) return 0.0;
  return std::sqrt(std::max(0.0, var(i)));
}

double JointFit::eta(const Side& s) const {
  return log_mean + log_offence[s.batting] + log_defence[s.fielding] + s.offset +
         (s.at_home ? log_home : 0.0);
}

namespace {

using SparseMatrix = Eigen::SparseMatrix<double>;
using Factor = Eigen::SimplicialLLT<SparseMatrix, Eigen::Lower, Eigen::AMDOrdering<int>>;

// Free parameters in corner form: x = (log M', [log H], a'_0..a'_{n-2}, b'_0..b'_{n-2},
// [log shape]) with a'_{n-1} = b'_{n-1} = 0. The sum-to-zero parameters of JointFit are
// a_i = a'_i - mean(a'), b_i = b'_i - mean(b'), log M = log M' + mean(a') + mean(b'): the same
// likelihood, and the prior sum a_i^2 = a'^T (I - 1 1^T / n) a' is a sparse diagonal minus a
// rank-one term per rating set.
struct Layout {
  int n = 0, q = 0;
  int home = -1, shape = -1;  // -1 = fixed
  std::vector<int> off, def;  // -1 = the reference club (fixed at 0)

  Layout(int teams, bool home_free, bool shape_free) : n(teams), off(teams, -1), def(teams, -1) {
    int k = 1;  // 0 = log M'
    if (home_free) home = k++;
    for (int i = 0; i < n - 1; ++i) off[i] = k++;
    for (int i = 0; i < n - 1; ++i) def[i] = k++;
    if (shape_free) shape = k++;
    q = k;
  }
  int first_rating() const { return home < 0 ? 1 : 2; }
  // Free indexes of the a' block are [first_rating, first_rating + n - 1), then the b' block.
};

// The negative log-posterior in corner form and its derivatives. The Hessian is returned as
// sparse S plus the dense part -U U^T (U = sqrt(lambda / n) [1_a 1_b], only with a prior).
class Problem {
 public:
  Problem(const std::vector<Side>& sides, const Layout& layout, const JointOptions& o,
          double fixed_shape, double lo, double hi)
      : sides_(sides), l_(layout), opt_(o), fixed_shape_(fixed_shape), lo_(lo), hi_(hi) {
    fixed_home_ = o.home_edge ? std::log(*o.home_edge) : 0.0;
    // Sparsity pattern (lower triangle, every diagonal included), fixed for the whole fit.
    std::vector<Eigen::Triplet<double>> t;
    for (int k = 0; k < l_.q; ++k) t.emplace_back(k, k, 0.0);
    for (std::size_t i = 0; i < sides_.size(); ++i) {
      const Side& s = sides_[i];
      if (s.extra_innings && s.at_home && i + 1 < sides_.size() && sides_[i + 1].extra_innings &&
          !sides_[i + 1].at_home) {
        ties_.push_back(tie_game(i));
        ++i;
        continue;
      }
      singles_.push_back(i);
      int idx[5];
      const int m = indexes(s, idx);
      for (int a = 0; a < m; ++a)
        for (int b = 0; b < m; ++b)
          if (idx[a] > idx[b]) t.emplace_back(idx[a], idx[b], 0.0);
    }
    for (const TieGame& g : ties_)
      for (int a = 0; a < g.m; ++a)
        for (int b = 0; b < g.m; ++b)
          if (g.idx[a] > g.idx[b]) t.emplace_back(g.idx[a], g.idx[b], 0.0);
    if (l_.shape >= 0)
      for (int k = 0; k < l_.shape; ++k) t.emplace_back(l_.shape, k, 0.0);
    pattern_.resize(l_.q, l_.q);
    pattern_.setFromTriplets(t.begin(), t.end());
    pattern_.makeCompressed();
    // Position of each side's entries in the value array.
    slot_.reserve(singles_.size() * 10 + ties_.size() * 28);
    for (std::size_t i : singles_) {
      int idx[5];
      const int m = indexes(sides_[i], idx);
      for (int a = 0; a < m; ++a)
        for (int b = 0; b < m; ++b)
          if (idx[a] >= idx[b]) slot_.push_back(position(idx[a], idx[b]));
    }
    for (const TieGame& g : ties_)
      for (int a = 0; a < g.m; ++a)
        for (int b = 0; b < g.m; ++b)
          if (g.idx[a] >= g.idx[b]) slot_.push_back(position(g.idx[a], g.idx[b]));
  }

  int q() const { return l_.q; }
  const SparseMatrix& pattern() const { return pattern_; }
  double prior() const { return opt_.prior_precision; }
  const Layout& layout() const { return l_; }

  double shape_of(const std::vector<double>& x) const {
    return l_.shape >= 0 ? std::exp(x[l_.shape]) : fixed_shape_;
  }
  // The shape within its range, and every other parameter (log league mean, log home edge, log
  // ratings) finite and within +-MAX_LOG: a trial step of the line search beyond that (a rating
  // of e^10, 22,026 times the league) is refused like an uphill step, so the likelihood is
  // never asked for an absurd mean (whose score sums would run for ever).
  static constexpr double MAX_LOG = 10.0;
  bool in_bounds(const std::vector<double>& x) const {
    for (int i = 0; i < static_cast<int>(x.size()); ++i) {
      if (i != l_.shape && !(std::abs(x[i]) <= MAX_LOG)) return false;
    }
    return l_.shape < 0 || (x[l_.shape] >= lo_ && x[l_.shape] <= hi_);
  }

  double eta(const std::vector<double>& x, const Side& s) const {
    const int a = l_.off[s.batting], b = l_.def[s.fielding];
    return x[0] + (a >= 0 ? x[a] : 0.0) + (b >= 0 ? x[b] : 0.0) + s.offset +
           (s.at_home ? (l_.home >= 0 ? x[l_.home] : fixed_home_) : 0.0);
  }

  // Negative log-posterior at x with the given shape; gradient (length q, the shape entry left
  // 0) and the sparse Hessian values (pattern order, without the shape row) when asked.
  double value(const std::vector<double>& x, double shape, std::vector<double>* grad,
               std::vector<double>* hess, double* loglik = nullptr) const {
    double ll = 0.0;
    if (grad) grad->assign(l_.q, 0.0);
    if (hess) hess->assign(pattern_.nonZeros(), 0.0);
    std::size_t slot = 0;
    for (std::size_t i : singles_) {
      const Side& s = sides_[i];
      const LogLikTerms t = score_loglik(opt_.family, s.y, eta(x, s), shape);
      ll += t.value;
      if (!grad && !hess) continue;
      int idx[5];
      const int m = indexes(s, idx);
      for (int a = 0; a < m; ++a) {
        if (grad) (*grad)[idx[a]] -= t.d1;
        if (!hess) continue;
        for (int b = 0; b < m; ++b)
          if (idx[a] >= idx[b]) (*hess)[slot_[slot++]] -= t.d2;
      }
    }
    for (const TieGame& g : ties_) {
      const TieTerms t =
          tie_loglik(opt_.family, eta(x, sides_[g.side]), eta(x, sides_[g.side + 1]), shape);
      ll += t.value;
      if (!grad && !hess) continue;
      for (int a = 0; a < g.m; ++a) {
        const bool ha = g.mask[a] & 1, aa = g.mask[a] & 2;
        if (grad) (*grad)[g.idx[a]] -= (ha ? t.dh : 0.0) + (aa ? t.da : 0.0);
        if (!hess) continue;
        for (int b = 0; b < g.m; ++b) {
          if (g.idx[a] < g.idx[b]) continue;
          const bool hb = g.mask[b] & 1, ab = g.mask[b] & 2;
          (*hess)[slot_[slot++]] -= (ha && hb ? t.dhh : 0.0) + (aa && ab ? t.daa : 0.0) +
                                    ((ha && ab) + (aa && hb)) * t.dha;
        }
      }
    }
    double prior = 0.0;
    const double lambda = opt_.prior_precision;
    if (lambda > 0.0) {
      for (const std::vector<int>* set : {&l_.off, &l_.def}) {
        double mean = 0.0;
        for (int i = 0; i < l_.n - 1; ++i) mean += x[(*set)[i]];
        mean /= l_.n;
        for (int i = 0; i < l_.n; ++i) {
          const int k = (*set)[i];
          const double c = (k >= 0 ? x[k] : 0.0) - mean;
          prior += 0.5 * lambda * c * c;
          if (k < 0) continue;
          if (grad) (*grad)[k] += lambda * c;
          if (hess) (*hess)[position(k, k)] += lambda;
        }
      }
    }
    if (loglik) *loglik = ll;
    return -ll + prior;
  }

  // Value, gradient and Hessian values in x, with the shape derivatives by central differences.
  double derivatives(const std::vector<double>& x, std::vector<double>& g,
                     std::vector<double>& h) const {
    const double shape = shape_of(x);
    const double f0 = value(x, shape, &g, &h);
    if (l_.shape < 0) return f0;
    const double step = 1e-5, s = x[l_.shape];
    std::vector<double> gp, gm;
    const double fp = value(x, std::exp(s + step), &gp, nullptr);
    const double fm = value(x, std::exp(s - step), &gm, nullptr);
    g[l_.shape] = (fp - fm) / (2.0 * step);
    for (int k = 0; k < l_.shape; ++k) h[position(l_.shape, k)] = (gp[k] - gm[k]) / (2.0 * step);
    h[position(l_.shape, l_.shape)] = (fp - 2.0 * f0 + fm) / (step * step);
    return f0;
  }

  int position(int r, int c) const {
    const int* rows = pattern_.innerIndexPtr();
    const int* begin = rows + pattern_.outerIndexPtr()[c];
    const int* end = rows + pattern_.outerIndexPtr()[c + 1];
    return static_cast<int>(std::lower_bound(begin, end, r) - rows);
  }

 private:
  int indexes(const Side& s, int* idx) const {
    int m = 0;
    idx[m++] = 0;
    if (l_.off[s.batting] >= 0) idx[m++] = l_.off[s.batting];
    if (l_.def[s.fielding] >= 0) idx[m++] = l_.def[s.fielding];
    if (s.at_home && l_.home >= 0) idx[m++] = l_.home;
    return m;
  }

  // A game that went to extra innings: the union of the parameters of its two sides, each with
  // a mask of the side whose eta it enters (1 = home, 2 = away, 3 = both: the league mean).
  struct TieGame {
    std::size_t side = 0;  // the home side; the away side follows
    int m = 0;
    int idx[7];
    unsigned char mask[7];
  };
  TieGame tie_game(std::size_t i) const {
    TieGame g;
    g.side = i;
    for (int s = 0; s < 2; ++s) {
      int idx[5];
      const int m = indexes(sides_[i + s], idx);
      for (int k = 0; k < m; ++k) {
        int at = 0;
        while (at < g.m && g.idx[at] != idx[k]) ++at;
        if (at == g.m) {
          g.idx[g.m] = idx[k];
          g.mask[g.m++] = 0;
        }
        g.mask[at] |= static_cast<unsigned char>(1 << s);
      }
    }
    return g;
  }

  const std::vector<Side>& sides_;
  const Layout& l_;
  JointOptions opt_;
  double fixed_shape_, lo_, hi_, fixed_home_ = 0.0;
  SparseMatrix pattern_;
  std::vector<int> slot_;             // single sides' entries, then the tie games'
  std::vector<std::size_t> singles_;  // sides fitted by their own score
  std::vector<TieGame> ties_;         // games fitted as a tie after regulation
};

// Solves (S - U U^T) x = b for the sparse factor of S and the rank-one prior terms
// U = sqrt(lambda / n) [1_a 1_b] by the Woodbury identity:
//   (S - U U^T)^-1 = S^-1 + Y K^-1 Y^T,  Y = S^-1 U,  K = I - U^T Y.
class Solver {
 public:
  Solver(const Problem& p) : p_(p), matrix_(p.pattern()) { factor_.analyzePattern(matrix_); }

  // Factors S + damping I; false when it is not positive definite (nor the Woodbury K).
  bool factor(const std::vector<double>& hess, double damping) {
    std::copy(hess.begin(), hess.end(), matrix_.valuePtr());
    for (int k = 0; k < p_.q(); ++k) matrix_.valuePtr()[p_.position(k, k)] += damping;
    factor_.factorize(matrix_);
    if (factor_.info() != Eigen::Success) return false;
    rank_ = p_.prior() > 0.0 ? 2 : 0;
    if (rank_ == 0) return true;
    const Layout& l = p_.layout();
    const double u = std::sqrt(p_.prior() / l.n);
    y_.assign(2, Eigen::VectorXd::Zero(p_.q()));
    for (int set = 0; set < 2; ++set) {
      Eigen::VectorXd b = Eigen::VectorXd::Zero(p_.q());
      for (int i = 0; i < l.n - 1; ++i) b[set == 0 ? l.off[i] : l.def[i]] = u;
      y_[set] = factor_.solve(b);
    }
    for (int r = 0; r < 2; ++r)
      for (int c = 0; c < 2; ++c) k_[r][c] = (r == c ? 1.0 : 0.0) - ut(y_[c])[r];
    const double det = k_[0][0] * k_[1][1] - k_[0][1] * k_[1][0];
    if (!(k_[0][0] > 0.0) || !(det > 0.0)) return false;
    kinv_[0][0] = k_[1][1] / det;
    kinv_[1][1] = k_[0][0] / det;
    kinv_[0][1] = kinv_[1][0] = -k_[0][1] / det;
    return true;
  }

  Eigen::VectorXd solve(const Eigen::VectorXd& b) const {
    Eigen::VectorXd x = factor_.solve(b);
    if (rank_ == 0) return x;
    const std::array<double, 2> w = ut(x);
    for (int r = 0; r < 2; ++r) x += (kinv_[r][0] * w[0] + kinv_[r][1] * w[1]) * y_[r];
    return x;
  }

  // U^T v.
  std::array<double, 2> ut(const Eigen::VectorXd& v) const {
    const Layout& l = p_.layout();
    std::array<double, 2> s{0.0, 0.0};
    if (rank_ == 0) return s;
    for (int i = 0; i < l.n - 1; ++i) {
      s[0] += v[l.off[i]];
      s[1] += v[l.def[i]];
    }
    const double u = std::sqrt(p_.prior() / l.n);
    return {u * s[0], u * s[1]};
  }

  // log det (S - U U^T) = log det S + log det K of the last successful factor().
  double log_det() const {
    const SparseMatrix l = factor_.matrixL();
    double d = 0.0;
    for (int j = 0; j < l.outerSize(); ++j) d += 2.0 * std::log(l.valuePtr()[l.outerIndexPtr()[j]]);
    if (rank_ > 0) d += std::log(k_[0][0] * k_[1][1] - k_[0][1] * k_[1][0]);
    return d;
  }

  const Factor& sparse() const { return factor_; }
  int rank() const { return rank_; }
  const std::vector<Eigen::VectorXd>& y() const { return y_; }
  const std::array<std::array<double, 2>, 2>& kinv() const { return kinv_; }

 private:
  const Problem& p_;
  SparseMatrix matrix_;
  Factor factor_;
  int rank_ = 0;
  std::vector<Eigen::VectorXd> y_;
  std::array<std::array<double, 2>, 2> k_{}, kinv_{};
};

struct NewtonOutcome {
  std::vector<double> x;
  int iterations = 0;
  bool converged = false;
};

// Newton's method with Levenberg damping and a backtracking (Armijo) line search that never
// accepts an increase, as minimize_newton (models/optimize.h) but with the sparse solver.
NewtonOutcome newton(const Problem& p, std::vector<double> x, double gradient_tolerance) {
  const double step_tolerance = 1e-12;
  const int q = p.q();
  NewtonOutcome r;
  std::vector<double> g, h, trial(q);
  Solver solver(p);
  auto f = [&](const std::vector<double>& v) {
    return p.in_bounds(v) ? p.value(v, p.shape_of(v), nullptr, nullptr)
                          : std::numeric_limits<double>::infinity();
  };
  double value = p.derivatives(x, g, h);
  if (!std::isfinite(value)) throw std::domain_error("fit_joint: likelihood not finite at start");
  double damping = 0.0;
  for (r.iterations = 0; r.iterations < 200; ++r.iterations) {
    double gmax = 0.0, hmax = 0.0;
    for (double v : g) gmax = std::max(gmax, std::abs(v));
    if (gmax < gradient_tolerance) {
      r.converged = true;
      break;
    }
    for (int k = 0; k < q; ++k) hmax = std::max(hmax, std::abs(h[p.position(k, k)]));
    for (int attempt = 0;; ++attempt) {
      if (solver.factor(h, damping)) break;
      damping = std::max(damping * 10.0, 1e-8 * std::max(hmax, 1.0));
      if (attempt > 60) throw std::domain_error("fit_joint: cannot damp the Hessian");
    }
    const Eigen::VectorXd step = -solver.solve(Eigen::Map<const Eigen::VectorXd>(g.data(), q));
    double slope = 0.0;
    for (int i = 0; i < q; ++i) slope += g[i] * step[i];
    double t = 1.0, trial_value = 0.0;
    bool accepted = false;
    for (int k = 0; k < 60; ++k) {
      for (int i = 0; i < q; ++i) trial[i] = x[i] + t * step[i];
      trial_value = f(trial);
      if (std::isfinite(trial_value) && trial_value <= value + 1e-4 * t * slope) {
        accepted = true;
        break;
      }
      t *= 0.5;
    }
    double smax = 0.0, xmax = 1.0;
    for (int i = 0; i < q; ++i) {
      smax = std::max(smax, std::abs(t * step[i]));
      xmax = std::max(xmax, std::abs(x[i]));
    }
    if (!accepted) {
      if (smax < 1e3 * step_tolerance * xmax) {
        r.converged = gmax < 1e3 * gradient_tolerance;
        break;
      }
      damping = std::max(damping * 10.0, 1e-4 * std::max(hmax, 1.0));
      continue;
    }
    x = trial;
    const double previous = value;
    value = p.derivatives(x, g, h);
    damping = t == 1.0 ? damping * 0.1 : damping;
    if (damping < 1e-12) damping = 0.0;
    if (smax < step_tolerance * xmax && std::abs(previous - value) <= 1e-15 * std::abs(value)) {
      r.converged = true;
      ++r.iterations;
      break;
    }
  }
  r.x = std::move(x);
  return r;
}

// Diagonal of S^-1 from the factor P S P^T = L L^T: (S^-1)_kk = |L^-1 P e_k|^2, each by a
// forward substitution that starts at k's position.
std::vector<double> inverse_diagonal(const Factor& factor, int q) {
  const SparseMatrix l = factor.matrixL();
  const auto& perm = factor.permutationP().indices();
  std::vector<double> diag(q), w(q, 0.0);
  const int* outer = l.outerIndexPtr();
  const int* inner = l.innerIndexPtr();
  const double* val = l.valuePtr();
  for (int k = 0; k < q; ++k) {
    const int p = perm[k];
    w[p] = 1.0;
    double s = 0.0;
    for (int j = p; j < q; ++j) {
      if (w[j] == 0.0) continue;
      const double wj = w[j] / val[outer[j]];  // diagonal first in each column
      w[j] = 0.0;
      s += wj * wj;
      for (int e = outer[j] + 1; e < outer[j + 1]; ++e) w[inner[e]] -= val[e] * wj;
    }
    diag[k] = s;
  }
  return diag;
}

// The sampler of (a, b) in sum-to-zero form: latent x = P^T L^-T z + Y R w with
// R R^T = K^-1, so that cov(x) = S^-1 + Y K^-1 Y^T = (S - U U^T)^-1.
StrengthSampler make_sampler(const Solver& solver, const Layout& l) {
  StrengthSampler s;
  const SparseMatrix lf = solver.sparse().matrixL();
  const auto& perm = solver.sparse().permutationP().indices();
  s.teams = l.n;
  s.dimension = l.q;
  s.col_start.assign(lf.outerIndexPtr(), lf.outerIndexPtr() + l.q + 1);
  s.row.assign(lf.innerIndexPtr(), lf.innerIndexPtr() + lf.nonZeros());
  s.value.assign(lf.valuePtr(), lf.valuePtr() + lf.nonZeros());
  s.order.assign(l.q, 0);
  for (int k = 0; k < l.q; ++k) s.order[perm[k]] = k;
  s.rank = solver.rank();
  if (s.rank > 0) {
    const auto& ki = solver.kinv();
    // R = lower Cholesky factor of K^-1 (2 x 2).
    const double r00 = std::sqrt(ki[0][0]), r10 = ki[1][0] / r00;
    const double r11 = std::sqrt(std::max(0.0, ki[1][1] - r10 * r10));
    s.low_rank.assign(static_cast<std::size_t>(l.q) * 2, 0.0);
    for (int i = 0; i < l.q; ++i) {
      s.low_rank[2 * i] = solver.y()[0][i] * r00 + solver.y()[1][i] * r10;
      s.low_rank[2 * i + 1] = solver.y()[1][i] * r11;
    }
  }
  s.offence = l.off;
  s.defence = l.def;
  s.centre = true;
  s.scale.assign(2 * static_cast<std::size_t>(l.n), 1.0);
  return s;
}

bool has_shape(config::ScoreFamily f) { return f != config::ScoreFamily::kPoisson; }

// One Newton step from the maximum-likelihood log shape s^ on the adjusted profile
// log-likelihood of Cox and Reid (1987, JRSS-B 49(1) 1-39, eq. 4):
//   l_A(s) = l_p(s) - 1/2 log det j_rr(s),
// j_rr the observed information of all other parameters (prior included), taken at their
// estimates at s^ (first order, as the ratings and the shape are close to orthogonal). Since
// l_p'(s^) = 0, the step is s* = s^ - 1/2 var(s^) d/ds log det j_rr, the derivative by central
// differences. Returns s^ when an information matrix is not positive definite. var_shape: the
// variance of s^ (0 when not positive definite).
double adjusted_log_shape(const Problem& p, const std::vector<double>& x, double lo, double hi,
                          double& var_shape) {
  var_shape = 0.0;
  const int s = p.layout().shape;
  const int q = p.q();
  std::vector<double> g, h;
  p.derivatives(x, g, h);
  Solver full(p);
  if (!full.factor(h, 0.0)) return x[s];
  Eigen::VectorXd e = Eigen::VectorXd::Zero(q);
  e[s] = 1.0;
  const double var_s = full.solve(e)[s];
  var_shape = var_s;
  auto log_det = [&](double log_shape, double& out) {
    std::vector<double> hs;
    p.value(x, std::exp(log_shape), nullptr, &hs);
    hs[p.position(s, s)] = 1.0;  // the shape's own row left out: log det j_rr
    Solver rest(p);
    if (!rest.factor(hs, 0.0)) return false;
    out = rest.log_det();
    return true;
  };
  const double step = 1e-4;
  double up = 0.0, down = 0.0;
  if (!(var_s > 0.0) || !log_det(x[s] + step, up) || !log_det(x[s] - step, down)) return x[s];
  const double slope = (up - down) / (2.0 * step);
  const double adjusted = x[s] - 0.5 * var_s * slope;
  return std::isfinite(adjusted) ? std::clamp(adjusted, lo, hi) : x[s];
}

}  // namespace

double information_per_side(config::ScoreFamily family, double mean_runs, double shape) {
  if (!(mean_runs > 0.0)) {
    throw std::domain_error(
        fmt::format("information_per_side: mean must be > 0, got {}", mean_runs));
  }
  const double eta = std::log(mean_runs);
  std::vector<double> pmfs;
  switch (family) {
    case config::ScoreFamily::kPoisson:
      return mean_runs;  // closed form
    case config::ScoreFamily::kNegativeBinomial:
      return shape * mean_runs / (shape + mean_runs);  // closed form
    case config::ScoreFamily::kWeibull: {
      const DiscreteWeibull d = weibull_for_mean(mean_runs, shape);
      double info = 0.0;
      for (int k = 0;; ++k) {
        const double p = pmf(d, k);
        const double d1 = score_loglik(family, k, eta, shape).d1;
        info += p * d1 * d1;
        if (survival(d, k) < 1e-14) break;
      }
      return info;
    }
    case config::ScoreFamily::kLog5:
      break;
  }
  throw std::domain_error("information_per_side: family log5 has no score likelihood");
}

JointFit fit_joint(const std::vector<Side>& sides, int n, const JointOptions& o) {
  if (o.family == config::ScoreFamily::kLog5) {
    throw std::domain_error("fit_joint: family log5 has no score likelihood");
  }
  if (n < 2) throw std::domain_error(fmt::format("fit_joint: need at least 2 teams, got {}", n));
  if (sides.empty()) throw std::domain_error("fit_joint: no played games to fit");
  if (!(o.prior_precision >= 0.0) || !std::isfinite(o.prior_precision)) {
    throw std::domain_error(
        fmt::format("fit_joint: prior_precision must be >= 0, got {}", o.prior_precision));
  }
  if (o.shape && !(*o.shape > 0.0 && std::isfinite(*o.shape))) {
    throw std::domain_error(fmt::format("fit_joint: shape must be > 0, got {}", *o.shape));
  }
  if (o.home_edge && !(*o.home_edge > 0.0 && std::isfinite(*o.home_edge))) {
    throw std::domain_error(fmt::format("fit_joint: home_edge must be > 0, got {}", *o.home_edge));
  }
  std::vector<int> bat(n, 0), field(n, 0);
  double total = 0.0;
  int home_sides = 0;
  for (const Side& s : sides) {
    if (s.batting < 0 || s.batting >= n || s.fielding < 0 || s.fielding >= n) {
      throw std::domain_error(fmt::format("fit_joint: side with team index out of range ({}, {})",
                                          s.batting, s.fielding));
    }
    ++bat[s.batting];
    ++field[s.fielding];
    total += s.y;
    home_sides += s.at_home ? 1 : 0;
  }
  if (o.prior_precision == 0.0) {
    for (int i = 0; i < n; ++i) {
      if (bat[i] == 0 || field[i] == 0) {
        throw std::domain_error(fmt::format(
            "fit_joint: team {} has no played game; its rating needs shrink_games > 0", i));
      }
    }
  }
  if (total <= 0.0) throw std::domain_error("fit_joint: no runs scored in the played games");
  if (!o.home_edge && home_sides == 0) {
    throw std::domain_error("fit_joint: no home side to fit the home edge; fix home_edge");
  }

  JointFit fit;
  fit.teams = n;
  const bool shape_free = has_shape(o.family) && !o.shape;
  const double fixed_shape =
      o.family == config::ScoreFamily::kPoisson ? 0.0 : o.shape.value_or(0.0);
  // Search range of log(shape): Weibull gamma in [0.6, 6], negative-binomial size in [0.2, 5000].
  const double lo = o.family == config::ScoreFamily::kWeibull ? std::log(0.6) : std::log(0.2);
  const double hi = o.family == config::ScoreFamily::kWeibull ? std::log(6.0) : std::log(5000.0);
  const Layout layout(n, !o.home_edge, shape_free);
  const Problem problem(sides, layout, o, fixed_shape, lo, hi);
  const int q = layout.q;

  std::vector<double> x0(q, 0.0);
  x0[0] = std::log(total / sides.size());
  double start_shape = 1.8;
  if (o.family == config::ScoreFamily::kNegativeBinomial) {
    // Moment start: var = mu + mu^2 / r over all sides (team spread makes it a lower bound).
    double m = 0.0, v = 0.0;
    for (const Side& sd : sides) m += sd.y;
    m /= sides.size();
    for (const Side& sd : sides) v += (sd.y - m) * (sd.y - m);
    v /= sides.size();
    start_shape = v > m * 1.01 ? std::clamp(m * m / (v - m), 0.5, 1000.0) : 1000.0;
  }
  if (shape_free) x0[layout.shape] = std::log(start_shape);
  if (o.start != nullptr && o.start->teams == n) {
    // Warm start from an earlier fit of the same data (for example without the prior), mapped
    // to corner form.
    const double ra = o.start->log_offence[n - 1], rb = o.start->log_defence[n - 1];
    x0[0] = o.start->log_mean + ra + rb;
    if (layout.home >= 0) x0[layout.home] = o.start->log_home;
    for (int j = 0; j < n - 1; ++j) {
      x0[layout.off[j]] = o.start->log_offence[j] - ra;
      x0[layout.def[j]] = o.start->log_defence[j] - rb;
    }
    if (shape_free && o.start->shape > 0.0)
      x0[layout.shape] = std::clamp(std::log(o.start->shape), lo, hi);
  }
  const NewtonOutcome r = newton(problem, x0, 1e-9 * std::max<double>(1.0, sides.size()));
  const std::vector<double>& x = r.x;
  const double shape = problem.shape_of(x);
  fit.iterations = r.iterations;
  fit.converged = r.converged;

  // Back to sum-to-zero form.
  double ma = 0.0, mb = 0.0;
  for (int j = 0; j < n - 1; ++j) {
    ma += x[layout.off[j]];
    mb += x[layout.def[j]];
  }
  ma /= n;
  mb /= n;
  fit.log_mean = x[0] + ma + mb;
  fit.log_home = layout.home >= 0 ? x[layout.home] : std::log(*o.home_edge);
  fit.shape = shape;
  fit.log_offence.resize(n);
  fit.log_defence.resize(n);
  for (int i = 0; i < n; ++i) {
    fit.log_offence[i] = (layout.off[i] >= 0 ? x[layout.off[i]] : 0.0) - ma;
    fit.log_defence[i] = (layout.def[i] >= 0 ? x[layout.def[i]] : 0.0) - mb;
  }
  problem.value(x, shape, nullptr, nullptr, &fit.log_lik);
  fit.free_parameters = 1 + (o.home_edge ? 0 : 1) + 2 * (n - 1) + (shape_free ? 1 : 0);
  if (shape_free && o.adjust_shape && r.converged) {
    // The other parameters refitted at the adjusted shape; the shape keeps the standard error
    // of the maximum-likelihood fit.
    double var_s = 0.0;
    JointOptions fixed = o;
    fixed.adjust_shape = false;
    fixed.shape = std::exp(adjusted_log_shape(problem, x, lo, hi, var_s));
    fixed.start = &fit;
    JointFit adjusted = fit_joint(sides, n, fixed);
    adjusted.free_parameters = fit.free_parameters;
    adjusted.iterations += fit.iterations;
    adjusted.converged = adjusted.converged && fit.converged;
    if (o.covariance) adjusted.variance[adjusted.log_shape_index()] = var_s;
    return adjusted;
  }

  if (o.covariance) {
    // Observed information in corner form, S - U U^T, and the variance t^T (S - U U^T)^-1 t of
    // each reported parameter t^T x, where t = e_k + alpha 1_a + beta 1_b.
    std::vector<double> g, h;
    problem.derivatives(x, g, h);
    Solver solver(problem);
    if (!solver.factor(h, 0.0)) {
      throw std::domain_error(
          "fit_joint: the observed information is not positive definite (a club or a group of "
          "clubs not connected to the others by games, without shrinkage?)");
    }
    const std::vector<double> diag = inverse_diagonal(solver.sparse(), q);
    Eigen::VectorXd one_a = Eigen::VectorXd::Zero(q), one_b = Eigen::VectorXd::Zero(q);
    for (int j = 0; j < n - 1; ++j) {
      one_a[layout.off[j]] = 1.0;
      one_b[layout.def[j]] = 1.0;
    }
    const Eigen::VectorXd ca = solver.sparse().solve(one_a), cb = solver.sparse().solve(one_b);
    const double aa = one_a.dot(ca), ab = one_a.dot(cb), bb = one_b.dot(cb);
    const double u = solver.rank() > 0 ? std::sqrt(o.prior_precision / n) : 0.0;
    const auto& ki = solver.kinv();
    auto variance = [&](int k, double alpha, double beta) {
      const double dk = k >= 0 ? diag[k] : 0.0;
      const double cak = k >= 0 ? ca[k] : 0.0, cbk = k >= 0 ? cb[k] : 0.0;
      double v = dk + 2.0 * alpha * cak + 2.0 * beta * cbk + alpha * alpha * aa +
                 2.0 * alpha * beta * ab + beta * beta * bb;
      if (solver.rank() > 0) {
        const double sa = u * (cak + alpha * aa + beta * ab);
        const double sb = u * (cbk + alpha * ab + beta * bb);
        v += sa * (ki[0][0] * sa + ki[0][1] * sb) + sb * (ki[1][0] * sa + ki[1][1] * sb);
      }
      return v;
    };
    const double inv_n = 1.0 / n;
    fit.variance.assign(fit.dimension(), 0.0);
    fit.variance[JointFit::LOG_MEAN] = variance(0, inv_n, inv_n);
    if (layout.home >= 0) fit.variance[JointFit::LOG_HOME] = variance(layout.home, 0.0, 0.0);
    for (int i = 0; i < n; ++i) {
      fit.variance[fit.offence_index(i)] = variance(layout.off[i], -inv_n, 0.0);
      fit.variance[fit.defence_index(i)] = variance(layout.def[i], 0.0, -inv_n);
    }
    if (layout.shape >= 0) fit.variance[fit.log_shape_index()] = variance(layout.shape, 0.0, 0.0);
    fit.strengths = make_sampler(solver, layout);
  }
  return fit;
}

}  // namespace standfast::models
