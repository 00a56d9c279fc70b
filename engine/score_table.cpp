#include "engine/score_table.h"

#include <cmath>
#include <stdexcept>
#include <string>

namespace standfast::engine {

double discrete_weibull_mean(double scale, double shape) {
  if (!(scale > 0)) return 0.0;
  double sum = 0;
  for (int k = 1;; ++k) {
    const double term = std::exp(-std::pow(k / scale, shape));
    sum += term;
    if (term < 1e-18 * (sum + 1e-300) || k > 100000) break;
  }
  return sum;
}

namespace {

void check_shape(double shape, const char* what) {
  if (!(shape > 0) || !std::isfinite(shape))
    throw std::domain_error(std::string(what) + ": shape must be finite and > 0, got " +
                            std::to_string(shape));
}

// Scale with discretised mean `mean`: secant steps from the continuous solution.
double solve_scale(double mean, double shape, double inv_gamma) {
  if (mean <= 0) return 0.0;
  double a0 = (mean + 0.5) * inv_gamma;
  double f0 = discrete_weibull_mean(a0, shape) - mean;
  double a1 = a0 * (1.0 + 1e-3) + 1e-6;
  double f1 = discrete_weibull_mean(a1, shape) - mean;
  for (int it = 0; it < 60 && std::abs(f1) > 1e-13 * (1 + mean); ++it) {
    if (f1 == f0) break;
    double a2 = a1 - f1 * (a1 - a0) / (f1 - f0);
    if (!(a2 > 0)) a2 = 0.5 * a1;
    a0 = a1;
    f0 = f1;
    a1 = a2;
    f1 = discrete_weibull_mean(a1, shape) - mean;
  }
  return a1;
}

}  // namespace

WeibullTable::WeibullTable(double shape) : shape_(shape), inv_shape_(0), inv_gamma_(0) {
  check_shape(shape, "WeibullTable");
  inv_shape_ = 1.0 / shape;
  inv_gamma_ = 1.0 / std::tgamma(1.0 + inv_shape_);
  constexpr int CELLS = 1 << CELL_BITS;
  // Q at the cell points u = i / 4096 (rounded to float, as the interpolation has always used
  // them), then per cell the start (shifted by half a unit of the 32-bit uniform, so that the
  // draw's fraction needs no offset) and the slope across the cell.
  std::vector<double> point(CELLS + 1);
  for (int i = 0; i <= CELLS; ++i) {
    const double u = static_cast<double>(i) / CELLS;
    point[i] = i == CELLS ? 0.0 : static_cast<float>(std::pow(-std::log1p(-u), inv_shape_));
  }
  cells_.resize(2 * CELLS);
  for (int i = 0; i < CELLS; ++i) {
    const double slope = point[i + 1] - point[i];
    cells_[2 * i] = static_cast<float>(point[i] + slope * (0.5 / (1 << FRAC_BITS)));
    cells_[2 * i + 1] = static_cast<float>(slope);
  }
  const auto n = static_cast<std::size_t>(MAX_TABLE_MEAN / MEAN_STEP) + 1;
  // The correction (exact scale - continuous scale) at the grid means i * MEAN_STEP; within
  // cell i the interpolated scale is intercept + slope * mean.
  std::vector<double> correction(n);
  for (std::size_t i = 0; i < n; ++i) {
    const double mean = static_cast<double>(i) * MEAN_STEP;
    correction[i] = solve_scale(mean, shape, inv_gamma_) - (mean + 0.5) * inv_gamma_;
  }
  lines_.resize(2 * (n - 1));
  for (std::size_t i = 0; i + 1 < n; ++i) {
    const double d = correction[i + 1] - correction[i];
    lines_[2 * i] = 0.5 * inv_gamma_ + correction[i] - static_cast<double>(i) * d;
    lines_[2 * i + 1] = inv_gamma_ + d * (1.0 / MEAN_STEP);
  }
  last_index_ = static_cast<double>(n - 1);
}

double WeibullTable::exact_quantile(std::uint32_t bits) const {
  const double s = (static_cast<double>(~bits) + 0.5) * 0x1.0p-32;  // 1 - u
  return std::pow(-std::log(s), inv_shape_);
}

CountTable::CountTable(CountFamily family, double size) : family_(family), size_(size) {
  if (family == CountFamily::kNegativeBinomial && (!(size > 0) || !std::isfinite(size)))
    throw std::domain_error("CountTable: negative binomial size must be finite and > 0, got " +
                            std::to_string(size));
  const auto rows = static_cast<std::size_t>(MAX_MEAN / MEAN_STEP) + 1;
  offset_.push_back(0);
  for (std::size_t r = 0; r < rows; ++r) {
    const double mean = static_cast<double>(r) * MEAN_STEP;
    double c = 0;
    for (int k = 0;; ++k) {
      c += pmf(k, mean);
      // The last entry of a row is 1 so the search always stops inside the row; the last index
      // (the largest draw) is at most MAX_SCORE.
      if (1.0 - c < 1e-13 || k >= MAX_SCORE) {
        cdf_.push_back(1.0);
        break;
      }
      cdf_.push_back(c);
    }
    offset_.push_back(cdf_.size());
  }
}

double CountTable::pmf(int k, double mean) const {
  if (mean <= 0) return k == 0 ? 1.0 : 0.0;
  if (family_ == CountFamily::kPoisson)
    return std::exp(k * std::log(mean) - mean - std::lgamma(k + 1.0));
  const double r = size_;
  const double p = r / (r + mean);  // success probability
  return std::exp(std::lgamma(k + r) - std::lgamma(r) - std::lgamma(k + 1.0) + r * std::log(p) +
                  k * std::log1p(-p));
}

}  // namespace standfast::engine
