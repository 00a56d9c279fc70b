#include "models/pythagorean.h"

#include <fmt/core.h>

#include <boost/math/special_functions/gamma.hpp>
#include <cmath>
#include <stdexcept>

namespace standfast::models {

double pythagorean_win_prob(double rs, double ra, double gamma, double beta) {
  if (!(rs > beta) || !(ra > beta) || !std::isfinite(rs) || !std::isfinite(ra)) {
    throw std::domain_error(
        fmt::format("pythagorean_win_prob: runs must exceed beta = {}, got scored {} allowed {}",
                    beta, rs, ra));
  }
  if (!(gamma > 0.0) || !std::isfinite(gamma)) {
    throw std::domain_error(fmt::format("pythagorean_win_prob: gamma must be > 0, got {}", gamma));
  }
  // x^g / (x^g + y^g) = 1 / (1 + (y/x)^g), stable for large gamma.
  return 1.0 / (1.0 + std::pow((ra - beta) / (rs - beta), gamma));
}

double continuous_weibull_mean(double scale, double gamma, double beta) {
  if (!(scale > 0.0) || !(gamma > 0.0)) {
    throw std::domain_error(fmt::format(
        "continuous_weibull_mean: scale and gamma must be > 0, got {} and {}", scale, gamma));
  }
  return beta + scale * boost::math::tgamma(1.0 + 1.0 / gamma);
}

}  // namespace standfast::models
