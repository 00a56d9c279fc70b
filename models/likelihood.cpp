#include "models/likelihood.h"

#include <fmt/core.h>

#include <boost/math/special_functions/gamma.hpp>
#include <cmath>
#include <limits>
#include <stdexcept>

namespace standfast::models {

std::vector<Side> played_sides(const config::Season& season) {
  const int n = static_cast<int>(season.teams.size());
  std::vector<Side> out;
  const auto& lop = season.model.lopsided;
  if (lop && (lop->margin < 0 || !(lop->weight >= 0.0 && lop->weight <= 1.0))) {
    throw std::domain_error(fmt::format("played_sides: lopsided margin {} / weight {} out of range",
                                        lop->margin, lop->weight));
  }
  const int regulation =
      season.league.regulation_innings > 0 ? season.league.regulation_innings : 9;
  for (size_t gi = 0; gi < season.games.size(); ++gi) {
    const auto& g = season.games[gi];
    if (!g.played) continue;
    const auto where = [&] {
      return g.pos.file.empty() ? fmt::format("game {}", gi + 1)
                                : fmt::format("{}:{}", g.pos.file, g.pos.line);
    };
    if (g.home < 0 || g.home >= n || g.away < 0 || g.away >= n || g.home == g.away) {
      throw std::domain_error(fmt::format(
          "played_sides: {}: team index out of range (home {}, away {})", where(), g.home, g.away));
    }
    if (g.home_runs < 0 || g.away_runs < 0) {
      throw std::domain_error(
          fmt::format("played_sides: {}: negative score {}-{}", where(), g.home_runs, g.away_runs));
    }
    if (g.home_runs == g.away_runs) {
      throw std::domain_error(fmt::format("played_sides: {}: tied final score {}-{}", where(),
                                          g.home_runs, g.away_runs));
    }
    const double factor = season.teams[g.home].run_factor;
    if (!(factor > 0.0) || !std::isfinite(factor)) {
      throw std::domain_error(fmt::format("played_sides: run_factor of team {} must be > 0, got {}",
                                          season.teams[g.home].id, factor));
    }
    double offset = std::log(factor);
    if (g.shortened && g.innings > 0 && g.innings < regulation) {
      offset += std::log(static_cast<double>(g.innings) / regulation);
    }
    for (int s = 0; s < 2; ++s) {
      Side side;
      side.at_home = s == 0;
      side.batting = side.at_home ? g.home : g.away;
      side.fielding = side.at_home ? g.away : g.home;
      side.runs = side.at_home ? g.home_runs : g.away_runs;
      const int opp = side.at_home ? g.away_runs : g.home_runs;
      side.won = side.runs > opp;
      side.y = side.runs;
      if (lop && side.runs - opp > lop->margin) {
        side.y = opp + lop->margin + lop->weight * (side.runs - opp - lop->margin);
      }
      side.offset = offset;
      side.extra_innings = !g.shortened && g.innings > regulation;
      out.push_back(side);
    }
  }
  return out;
}

namespace {

// log P(y) for the discretised Weibull with scale a, and derivatives with respect to a.
struct ScaleTerms {
  double value, da, daa;
};

ScaleTerms weibull_bin(double y, double a, double g) {
  // P = e^-u - e^-v, u = (y/a)^g, v = ((y+1)/a)^g; factor e^-u out: P = e^-u (1 - r),
  // r = e^-(v-u). dP/da = (g/a)(u e^-u - v e^-v); second derivative likewise.
  const double u = y > 0.0 ? std::pow(y / a, g) : 0.0;
  const double v = std::pow((y + 1.0) / a, g);
  const double r = std::exp(u - v);
  const double one_minus_r = -std::expm1(u - v);
  const double p1 = (g / a) * (u - v * r);          // P'/e^-u
  const double p2 = -(g / (a * a)) * (u - v * r) -  // P''/e^-u
                    (g * g / (a * a)) * (u * (1.0 - u) - v * (1.0 - v) * r);
  ScaleTerms t;
  t.value = -u + std::log(one_minus_r);
  t.da = p1 / one_minus_r;
  t.daa = p2 / one_minus_r - t.da * t.da;
  return t;
}

// The discretised mean m(a) = sum_k exp(-(k/a)^g) and its first two derivatives in a.
struct MeanTerms {
  double m, dm, dmm;
};

// log k for k = 1..LOG_TABLE-1 (the sums below rarely pass k = 200).
constexpr int LOG_TABLE = 4096;
const std::vector<double>& log_table() {
  static const std::vector<double> table = [] {
    std::vector<double> t(LOG_TABLE);
    for (int k = 1; k < LOG_TABLE; ++k) t[k] = std::log(static_cast<double>(k));
    return t;
  }();
  return table;
}

MeanTerms weibull_mean_terms(double a, double g, bool second) {
  MeanTerms t{0.0, 0.0, 0.0};
  // A scale that is not a finite positive number of sane size (the fits keep means within
  // e^+-10 runs; a scale of 1e6 would need millions of terms): not a number, which the fits
  // treat as a refused step.
  if (!(a > 0.0 && a <= 1e6) || !(g > 0.0)) {
    const double nan = std::numeric_limits<double>::quiet_NaN();
    return MeanTerms{nan, nan, nan};
  }
  const double log_a = std::log(a);
  const std::vector<double>& logk = log_table();
  double sum_et = 0.0, sum_ett = 0.0;
  for (int k = 1;; ++k) {
    const double lk = k < LOG_TABLE ? logk[k] : std::log(static_cast<double>(k));
    const double tk = std::exp(g * (lk - log_a));
    const double e = std::exp(-tk);
    t.m += e;
    sum_et += e * tk;
    if (second) sum_ett += e * tk * tk;
    if (e < 1e-17 * t.m || e == 0.0) break;
  }
  // m' = (g/a) sum e t;  m'' = (g/a^2) sum e t (g t - g - 1).
  t.dm = g * sum_et / a;
  if (second) t.dmm = g * (g * sum_ett - (g + 1.0) * sum_et) / (a * a);
  return t;
}

// The discretised mean is m(a) = a G - 1/2 + c(a), G = Gamma(1 + 1/g), with a small smooth
// correction c (about 4e-4 at a = 5, g = 1.8). For one shape at a time, c and dc/dlog(a) are
// tabulated at log(a) steps of 0.01 on [log 2, log 40] and interpolated by cubic Hermite
// polynomials (interpolation error below 1e-11 runs, checked against the direct sum in
// tests/models_likelihood_test.cpp; a log-likelihood agrees to 1e-8 relative); outside that range
// the direct sum is used.
class CorrectionTable {
 public:
  static constexpr double LO = 0.6931471805599453;  // log 2
  static constexpr double HI = 3.6888794541139363;  // log 40
  static constexpr double STEP = 0.01;

  void build(double g) {
    g_ = g;
    g1_ = boost::math::tgamma(1.0 + 1.0 / g);
    const int nodes = static_cast<int>((HI - LO) / STEP) + 2;
    c_.resize(nodes);
    dc_.resize(nodes);
    for (int i = 0; i < nodes; ++i) {
      const double a = std::exp(LO + i * STEP);
      const MeanTerms t = weibull_mean_terms(a, g, false);
      c_[i] = t.m - a * g1_ + 0.5;
      dc_[i] = a * (t.dm - g1_);
    }
  }
  double shape() const { return g_; }
  double g1() const { return g1_; }

  // c, dc/dx, d2c/dx2 at x = log(a); false when x is outside the table.
  bool eval(double x, double& c, double& dc, double& d2c) const {
    if (!(x >= LO && x < HI)) return false;
    const double pos = (x - LO) / STEP;
    const int i = static_cast<int>(pos);
    const double t = pos - i, h = STEP;
    const double y0 = c_[i], y1 = c_[i + 1], m0 = dc_[i] * h, m1 = dc_[i + 1] * h;
    const double t2 = t * t, t3 = t2 * t;
    c = (2 * t3 - 3 * t2 + 1) * y0 + (t3 - 2 * t2 + t) * m0 + (-2 * t3 + 3 * t2) * y1 +
        (t3 - t2) * m1;
    dc = ((6 * t2 - 6 * t) * y0 + (3 * t2 - 4 * t + 1) * m0 + (-6 * t2 + 6 * t) * y1 +
          (3 * t2 - 2 * t) * m1) /
         h;
    d2c = ((12 * t - 6) * y0 + (6 * t - 4) * m0 + (-12 * t + 6) * y1 + (6 * t - 2) * m1) / (h * h);
    return true;
  }

 private:
  double g_ = -1.0, g1_ = 0.0;
  std::vector<double> c_, dc_;
};

struct ScaleSolution {
  double a, dm, dmm;  // scale, m'(a), m''(a)
};

ScaleSolution solve_scale_direct(double mu, double g) {
  double a = (mu + 0.5) / boost::math::tgamma(1.0 + 1.0 / g);
  MeanTerms mt{};
  for (int iter = 0; iter < 50; ++iter) {
    mt = weibull_mean_terms(a, g, true);
    if (!std::isfinite(mt.m)) {
      const double nan = std::numeric_limits<double>::quiet_NaN();
      return ScaleSolution{nan, nan, nan};
    }
    double step = (mt.m - mu) / mt.dm;
    if (step > 0.5 * a) step = 0.5 * a;
    a -= step;
    // Newton converges quadratically: after a step below 1e-7 the error is below 1e-14.
    if (std::abs(step) <= 1e-7 * a) break;
  }
  return ScaleSolution{a, mt.dm, mt.dmm};
}

ScaleSolution solve_scale(double mu, double g) {
  // The fits ask for a few shapes in turn (the shape and its finite-difference neighbours):
  // keep the last four tables.
  thread_local CorrectionTable tables[4];
  thread_local int next = 0;
  CorrectionTable* found = nullptr;
  for (auto& t : tables) {
    if (t.shape() == g) found = &t;
  }
  if (found == nullptr) {
    found = &tables[next];
    next = (next + 1) % 4;
    found->build(g);
  }
  const CorrectionTable& table = *found;
  const double g1 = table.g1();
  // Newton's method on m(a) = a G - 1/2 + c(a) = mu from the continuous solution.
  double a = (mu + 0.5) / g1;
  double c = 0.0, dc = 0.0, d2c = 0.0;
  for (int iter = 0; iter < 30; ++iter) {
    if (!table.eval(std::log(a), c, dc, d2c)) return solve_scale_direct(mu, g);
    double step = (a * g1 - 0.5 + c - mu) / (g1 + dc / a);
    if (step > 0.5 * a) step = 0.5 * a;
    a -= step;
    if (std::abs(step) <= 1e-15 * a) break;
  }
  if (!table.eval(std::log(a), c, dc, d2c)) return solve_scale_direct(mu, g);
  // m'(a) = G + c'(a) with c'(a) = dc/dx / a; m''(a) = (d2c/dx2 - dc/dx) / a^2.
  return ScaleSolution{a, g1 + dc / a, (d2c - dc) / (a * a)};
}

}  // namespace

LogLikTerms weibull_loglik_log_scale(double y, double log_scale, double shape) {
  const double a = std::exp(log_scale);
  const ScaleTerms s = weibull_bin(y, a, shape);
  return LogLikTerms{s.value, a * s.da, a * a * s.daa + a * s.da};
}

LogLikTerms score_loglik(config::ScoreFamily family, double y, double eta, double shape) {
  const double mu = std::exp(eta);
  switch (family) {
    case config::ScoreFamily::kPoisson:
      return LogLikTerms{y * eta - mu - std::lgamma(y + 1.0), y - mu, -mu};
    case config::ScoreFamily::kNegativeBinomial: {
      const double r = shape;
      const double lrm = std::log(r + mu);
      LogLikTerms t;
      t.value = std::lgamma(y + r) - std::lgamma(r) - std::lgamma(y + 1.0) +
                r * (std::log(r) - lrm) + y * (eta - lrm);
      t.d1 = r * (y - mu) / (r + mu);
      t.d2 = -(y + r) * r * mu / ((r + mu) * (r + mu));
      return t;
    }
    case config::ScoreFamily::kWeibull: {
      // Scale a(mu) from the discretised mean by Newton's method from the continuous start.
      const double g = shape;
      const ScaleSolution sol = solve_scale(mu, g);
      const double a = sol.a;
      const MeanTerms mt{mu, sol.dm, sol.dmm};
      // da/deta = mu / m'(a); d2a/deta2 = da/deta - (da/deta)^2 m''/m'.
      const double ae = mu / mt.dm;
      const double aee = ae - ae * ae * mt.dmm / mt.dm;
      const ScaleTerms s = weibull_bin(y, a, g);
      return LogLikTerms{s.value, s.da * ae, s.daa * ae * ae + s.da * aee};
    }
    case config::ScoreFamily::kLog5:
      break;
  }
  throw std::domain_error("score_loglik: family log5 has no score likelihood");
}

namespace {

// Sums of p_h(k) p_a(k) weighted by 1, the eta derivatives and their products (TieTerms before
// the division by T). Poisson and negative binomial: from score_loglik per score.
struct TieSums {
  double t = 0.0, th = 0.0, ta = 0.0, thh = 0.0, taa = 0.0, tha = 0.0;
  void add(double ph, double ph1, double ph2, double pa, double pa1, double pa2) {
    t += ph * pa;
    th += ph1 * pa;
    ta += ph * pa1;
    thh += ph2 * pa;
    taa += ph * pa2;
    tha += ph1 * pa1;
  }
};

// The discretised Weibull pmf of every score with its first two derivatives in eta, score by
// score: with t_k = (k/a)^g and E_k = exp(-t_k), P(k) = E_k - E_{k+1}; dE/da = E g t / a and
// d2E/da2 = E (g / a^2)(g t^2 - (g + 1) t), chained to eta through a(eta). One pow and one exp
// per score (weibull_bin needs two of each and a log).
class WeibullScores {
 public:
  WeibullScores(double eta, double g) : g_(g) {
    const double mu = std::exp(eta);
    const ScaleSolution sol = solve_scale(mu, g);
    a_ = sol.a;
    ae_ = mu / sol.dm;
    aee_ = ae_ - ae_ * ae_ * sol.dmm / sol.dm;
    ok_ = std::isfinite(a_) && a_ > 0.0;
    if (ok_) edge(0.0, e0_, a0_, b0_);
  }
  bool ok() const { return ok_; }
  // P(k), dP/deta, d2P/deta2 for k = 0, 1, 2, ... in turn.
  void next(int k, double& p, double& p1, double& p2) {
    double e1, a1, b1;
    edge(k + 1.0, e1, a1, b1);
    p = e0_ - e1;
    const double pa = a0_ - a1, paa = b0_ - b1;
    p1 = pa * ae_;
    p2 = paa * ae_ * ae_ + pa * aee_;
    e0_ = e1, a0_ = a1, b0_ = b1;
  }

 private:
  void edge(double y, double& e, double& da, double& daa) const {
    const double t = y > 0.0 ? std::pow(y / a_, g_) : 0.0;
    e = std::exp(-t);
    da = e * g_ * t / a_;
    daa = e * (g_ / (a_ * a_)) * (g_ * t * t - (g_ + 1.0) * t);
  }
  double g_, a_ = 0.0, ae_ = 0.0, aee_ = 0.0;
  bool ok_ = false;
  double e0_ = 1.0, a0_ = 0.0, b0_ = 0.0;
};

}  // namespace

TieTerms tie_loglik(config::ScoreFamily family, double eta_home, double eta_away, double shape) {
  if (family == config::ScoreFamily::kLog5)
    throw std::domain_error("tie_loglik: family log5 has no score likelihood");
  const double nan = std::numeric_limits<double>::quiet_NaN();
  const TieTerms undefined{nan, nan, nan, nan, nan, nan};
  // Past both means the terms fall off faster than geometrically; stop when they no longer
  // change the sum (the fits keep the means below e^10 times the league's, so this ends).
  const double beyond = std::max(std::exp(eta_home), std::exp(eta_away));
  TieSums s;
  if (family == config::ScoreFamily::kWeibull) {
    WeibullScores home(eta_home, shape), away(eta_away, shape);
    if (!home.ok() || !away.ok()) return undefined;
    for (int k = 0; k < 1000000; ++k) {
      double ph, ph1, ph2, pa, pa1, pa2;
      home.next(k, ph, ph1, ph2);
      away.next(k, pa, pa1, pa2);
      s.add(ph, ph1, ph2, pa, pa1, pa2);
      if (k > beyond && !(ph * pa > 1e-17 * s.t)) break;
    }
  } else {
    // P(0) from score_loglik, then P(k + 1) = P(k) ratio(k); log P's eta derivatives in closed
    // form (as in score_loglik): Poisson d1 = k - mu, d2 = -mu; negative binomial
    // d1 = r (k - mu) / (r + mu), d2 = -(k + r) r mu / (r + mu)^2.
    const bool nb = family == config::ScoreFamily::kNegativeBinomial;
    const double r = shape, mh = std::exp(eta_home), ma = std::exp(eta_away);
    double ph = std::exp(score_loglik(family, 0, eta_home, shape).value);
    double pa = std::exp(score_loglik(family, 0, eta_away, shape).value);
    for (int k = 0; k < 1000000; ++k) {
      const double h1 = nb ? r * (k - mh) / (r + mh) : k - mh;
      const double h2 = nb ? -(k + r) * r * mh / ((r + mh) * (r + mh)) : -mh;
      const double a1 = nb ? r * (k - ma) / (r + ma) : k - ma;
      const double a2 = nb ? -(k + r) * r * ma / ((r + ma) * (r + ma)) : -ma;
      s.add(ph, ph * h1, ph * (h2 + h1 * h1), pa, pa * a1, pa * (a2 + a1 * a1));
      if (k > beyond && !(ph * pa > 1e-17 * s.t)) break;
      ph *= nb ? (k + r) / (k + 1.0) * mh / (r + mh) : mh / (k + 1.0);
      pa *= nb ? (k + r) / (k + 1.0) * ma / (r + ma) : ma / (k + 1.0);
    }
  }
  if (!(s.t > 0.0) || !std::isfinite(s.t)) return undefined;
  TieTerms r;
  r.value = std::log(s.t);
  r.dh = s.th / s.t;
  r.da = s.ta / s.t;
  r.dhh = s.thh / s.t - r.dh * r.dh;
  r.daa = s.taa / s.t - r.da * r.da;
  r.dha = s.tha / s.t - r.dh * r.da;
  return r;
}

}  // namespace standfast::models
