#include "models/joint_fit.h"

#include <fmt/core.h>

#include <algorithm>
#include <cmath>
#include <cstdint>
#include <limits>
#include <stdexcept>

#include "models/optimize.h"
#include "models/score_dist.h"

namespace standfast::models {

double JointFit::se(int i) const {
  if (covariance.empty()) return 0.0;
  return std::sqrt(std::max(0.0, var(i)));
}

double JointFit::eta(const Side& s) const {
  return log_mean + log_offence[s.batting] + log_defence[s.fielding] + s.offset +
         (s.at_home ? log_home : 0.0);
}

namespace {

// Full parameters phi = (log M, log H, a_0..a_{n-1}, b_0..b_{n-1}) (P = 2n + 2); reduced
// theta = (log M, log H, a_0..a_{n-2}, b_0..b_{n-2}) (p = 2n) with a_{n-1} = -sum a_j and
// b_{n-1} = -sum b_j.
class Problem {
 public:
  Problem(const std::vector<Side>& sides, int n, const JointOptions& o)
      : sides_(sides), n_(n), opt_(o) {}

  int reduced() const { return 2 * n_; }
  int full() const { return 2 * n_ + 2; }

  std::vector<double> expand(const std::vector<double>& theta) const {
    std::vector<double> phi(full());
    phi[0] = theta[0];
    phi[1] = theta[1];
    double sa = 0.0, sb = 0.0;
    for (int j = 0; j < n_ - 1; ++j) {
      phi[2 + j] = theta[2 + j];
      phi[2 + n_ + j] = theta[2 + n_ - 1 + j];
      sa += theta[2 + j];
      sb += theta[2 + n_ - 1 + j];
    }
    phi[2 + n_ - 1] = -sa;
    phi[2 + 2 * n_ - 1] = -sb;
    return phi;
  }

  // J: d phi / d theta (P x p).
  std::vector<double> jacobian() const {
    const int P = full(), p = reduced();
    std::vector<double> j(static_cast<size_t>(P) * p, 0.0);
    j[0 * p + 0] = 1.0;
    j[1 * p + 1] = 1.0;
    for (int t = 0; t < n_ - 1; ++t) {
      j[(2 + t) * p + 2 + t] = 1.0;
      j[(2 + n_ - 1) * p + 2 + t] = -1.0;
      j[(2 + n_ + t) * p + 2 + n_ - 1 + t] = 1.0;
      j[(2 + 2 * n_ - 1) * p + 2 + n_ - 1 + t] = -1.0;
    }
    return j;
  }

  // Negative log-posterior at theta and shape; gradient and Hessian in theta when asked.
  // `loglik` receives the log-likelihood without the prior.
  double value(const std::vector<double>& theta, double shape, std::vector<double>* grad,
               std::vector<double>* hess, double* loglik = nullptr) const {
    const std::vector<double> phi = expand(theta);
    const int P = full();
    std::vector<double> gf, hf;
    if (grad) gf.assign(P, 0.0);
    if (hess) hf.assign(static_cast<size_t>(P) * P, 0.0);
    double ll = 0.0;
    int idx[4];
    for (const Side& s : sides_) {
      const double eta = phi[0] + phi[2 + s.batting] + phi[2 + n_ + s.fielding] + s.offset +
                         (s.at_home ? phi[1] : 0.0);
      const LogLikTerms t = score_loglik(opt_.family, s.y, eta, shape);
      ll += t.value;
      if (!grad && !hess) continue;
      int m = 0;
      idx[m++] = 0;
      idx[m++] = 2 + s.batting;
      idx[m++] = 2 + n_ + s.fielding;
      if (s.at_home) idx[m++] = 1;
      for (int i = 0; i < m; ++i) {
        if (grad) gf[idx[i]] -= t.d1;
        if (hess) {
          for (int k = 0; k < m; ++k) hf[static_cast<size_t>(idx[i]) * P + idx[k]] -= t.d2;
        }
      }
    }
    double prior = 0.0;
    if (opt_.prior_precision > 0.0) {
      for (int i = 2; i < P; ++i) {
        prior += 0.5 * opt_.prior_precision * phi[i] * phi[i];
        if (grad) gf[i] += opt_.prior_precision * phi[i];
        if (hess) hf[static_cast<size_t>(i) * P + i] += opt_.prior_precision;
      }
    }
    if (loglik) *loglik = ll;
    if (grad || hess) reduce(gf, hf, grad, hess);
    return -ll + prior;
  }

  // g_theta = J^T g_phi, H_theta = J^T H_phi J; a fixed home edge gets a unit row.
  void reduce(const std::vector<double>& gf, const std::vector<double>& hf,
              std::vector<double>* grad, std::vector<double>* hess) const {
    const int P = full(), p = reduced();
    if (j_.empty()) j_ = jacobian();
    const bool fixed_home = opt_.home_edge.has_value();
    if (grad) {
      grad->assign(p, 0.0);
      for (int r = 0; r < P; ++r) {
        if (gf[r] == 0.0) continue;
        for (int c = 0; c < p; ++c) (*grad)[c] += j_[static_cast<size_t>(r) * p + c] * gf[r];
      }
      if (fixed_home) (*grad)[1] = 0.0;
    }
    if (hess) {
      std::vector<double> hj(static_cast<size_t>(P) * p, 0.0);  // H_phi J
      for (int r = 0; r < P; ++r) {
        for (int k = 0; k < P; ++k) {
          const double h = hf[static_cast<size_t>(r) * P + k];
          if (h == 0.0) continue;
          for (int c = 0; c < p; ++c)
            hj[static_cast<size_t>(r) * p + c] += h * j_[static_cast<size_t>(k) * p + c];
        }
      }
      hess->assign(static_cast<size_t>(p) * p, 0.0);
      for (int k = 0; k < P; ++k) {
        for (int r = 0; r < p; ++r) {
          const double jk = j_[static_cast<size_t>(k) * p + r];
          if (jk == 0.0) continue;
          for (int c = 0; c < p; ++c)
            (*hess)[static_cast<size_t>(r) * p + c] += jk * hj[static_cast<size_t>(k) * p + c];
        }
      }
      if (fixed_home) {
        for (int c = 0; c < p; ++c) (*hess)[1 * p + c] = (*hess)[c * p + 1] = 0.0;
        (*hess)[1 * p + 1] = 1.0;
      }
    }
  }

 private:
  const std::vector<Side>& sides_;
  int n_;
  JointOptions opt_;
  mutable std::vector<double> j_;
};

bool has_shape(config::ScoreFamily f) { return f != config::ScoreFamily::kPoisson; }

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

  const Problem problem(sides, n, o);
  const int p = problem.reduced();
  std::vector<double> theta(p, 0.0);
  theta[0] = std::log(total / sides.size());
  theta[1] = o.home_edge ? std::log(*o.home_edge) : 0.0;

  JointFit fit;
  fit.teams = n;
  const bool shape_free = has_shape(o.family) && !o.shape;
  const double fixed_shape =
      o.family == config::ScoreFamily::kPoisson ? 0.0 : o.shape.value_or(0.0);
  // Search range of log(shape): Weibull gamma in [0.6, 6], negative-binomial size in [0.2, 5000].
  const double lo = o.family == config::ScoreFamily::kWeibull ? std::log(0.6) : std::log(0.2);
  const double hi = o.family == config::ScoreFamily::kWeibull ? std::log(6.0) : std::log(5000.0);
  const double fd_step = 1e-5;
  const int q = p + 1;  // (theta, log shape)

  // Objective over x = (theta, log shape). The shape derivatives are central differences of the
  // analytic theta-gradient (cross terms) and of the value (step 1e-5 in log shape).
  const NewtonObjective objective = [&](const std::vector<double>& x, std::vector<double>* g,
                                        std::vector<double>* h) {
    const std::vector<double> theta_x(x.begin(), x.begin() + p);
    const double s = x[p];
    if (shape_free && !(s >= lo && s <= hi)) return std::numeric_limits<double>::infinity();
    const double shape = shape_free ? std::exp(s) : fixed_shape;
    std::vector<double> gt, ht;
    const double f0 = problem.value(theta_x, shape, g ? &gt : nullptr, h ? &ht : nullptr);
    if (!g && !h) return f0;
    std::vector<double> gp, gm;
    double fp = 0.0, fm = 0.0;
    if (shape_free) {
      fp = problem.value(theta_x, std::exp(s + fd_step), &gp, nullptr);
      fm = problem.value(theta_x, std::exp(s - fd_step), &gm, nullptr);
    }
    if (g) {
      g->assign(q, 0.0);
      std::copy(gt.begin(), gt.end(), g->begin());
      (*g)[p] = shape_free ? (fp - fm) / (2.0 * fd_step) : 0.0;
    }
    if (h) {
      h->assign(static_cast<size_t>(q) * q, 0.0);
      for (int r = 0; r < p; ++r) {
        for (int c = 0; c < p; ++c)
          (*h)[static_cast<size_t>(r) * q + c] = ht[static_cast<size_t>(r) * p + c];
      }
      if (shape_free) {
        for (int r = 0; r < p; ++r) {
          const double cross = (gp[r] - gm[r]) / (2.0 * fd_step);
          (*h)[static_cast<size_t>(r) * q + p] = (*h)[static_cast<size_t>(p) * q + r] = cross;
        }
        (*h)[static_cast<size_t>(p) * q + p] = (fp - 2.0 * f0 + fm) / (fd_step * fd_step);
      } else {
        (*h)[static_cast<size_t>(p) * q + p] = 1.0;
      }
    }
    return f0;
  };

  std::vector<double> x0(theta);
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
  x0.push_back(shape_free ? std::log(start_shape) : 0.0);
  if (o.start != nullptr && o.start->teams == n) {
    // Warm start from an earlier fit of the same data (for example without the prior).
    x0[0] = o.start->log_mean;
    if (!o.home_edge) x0[1] = o.start->log_home;
    for (int j = 0; j < n - 1; ++j) {
      x0[2 + j] = o.start->log_offence[j];
      x0[2 + n - 1 + j] = o.start->log_defence[j];
    }
    if (shape_free && o.start->shape > 0.0) x0[p] = std::clamp(std::log(o.start->shape), lo, hi);
  }
  NewtonOptions nopt;
  nopt.gradient_tolerance = 1e-9 * std::max<double>(1.0, sides.size());
  const NewtonResult r = minimize_newton(objective, x0, nopt);
  theta.assign(r.x.begin(), r.x.begin() + p);
  const double shape = shape_free ? std::exp(r.x[p]) : fixed_shape;
  fit.iterations = r.iterations;
  fit.converged = r.converged;

  const std::vector<double> phi = problem.expand(theta);
  fit.log_mean = phi[0];
  fit.log_home = phi[1];
  fit.shape = shape;
  fit.log_offence.assign(phi.begin() + 2, phi.begin() + 2 + n);
  fit.log_defence.assign(phi.begin() + 2 + n, phi.begin() + 2 + 2 * n);
  problem.value(theta, shape, nullptr, nullptr, &fit.log_lik);
  fit.free_parameters = 1 + (o.home_edge ? 0 : 1) + 2 * (n - 1) + (shape_free ? 1 : 0);

  if (o.covariance) {
    // Observed information in (theta, log shape).
    std::vector<double> g, info;
    objective(r.x, &g, &info);
    std::vector<double> cov_reduced = spd_inverse(info, q);
    // Zero the rows of fixed parameters.
    for (int k = 0; k < q; ++k) {
      if (o.home_edge)
        cov_reduced[static_cast<size_t>(1) * q + k] = cov_reduced[static_cast<size_t>(k) * q + 1] =
            0.0;
      if (!shape_free)
        cov_reduced[static_cast<size_t>(p) * q + k] = cov_reduced[static_cast<size_t>(k) * q + p] =
            0.0;
    }
    // Map to the full parameters: phi = J theta (log shape passes through).
    const std::vector<double> j = problem.jacobian();
    const int P = problem.full(), D = P + 1;
    std::vector<double> jx(static_cast<size_t>(D) * q, 0.0);
    for (int r = 0; r < P; ++r) {
      for (int c = 0; c < p; ++c)
        jx[static_cast<size_t>(r) * q + c] = j[static_cast<size_t>(r) * p + c];
    }
    jx[static_cast<size_t>(P) * q + p] = 1.0;
    std::vector<double> tmp(static_cast<size_t>(D) * q, 0.0);  // Jx C
    for (int r = 0; r < D; ++r) {
      for (int k = 0; k < q; ++k) {
        const double a = jx[static_cast<size_t>(r) * q + k];
        if (a == 0.0) continue;
        for (int c = 0; c < q; ++c)
          tmp[static_cast<size_t>(r) * q + c] += a * cov_reduced[static_cast<size_t>(k) * q + c];
      }
    }
    fit.covariance.assign(static_cast<size_t>(D) * D, 0.0);
    for (int r = 0; r < D; ++r) {
      for (int c = 0; c < D; ++c) {
        double s = 0.0;
        for (int k = 0; k < q; ++k)
          s += tmp[static_cast<size_t>(r) * q + k] * jx[static_cast<size_t>(c) * q + k];
        fit.covariance[static_cast<size_t>(r) * D + c] = s;
      }
    }
  }
  return fit;
}

}  // namespace standfast::models
