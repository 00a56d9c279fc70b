// Tests for models/win_chance.h: the regulation chances of one game under each score family.
// Sources:
//   Poisson: the difference of two independent Poisson counts is Skellam (Skellam 1946, JRSS
//     109, 296); SciPy 1.10.1 scipy.stats.skellam.
//   Negative binomial: SciPy 1.10.1 scipy.stats.nbinom (n = size, p = size / (size + mean)),
//     P(X > Y) and P(X = Y) summed over 0..399.
//   Discretised Weibull (location -1/2, Miller 2007, Chance 20(1)): SciPy 1.10.1
//     scipy.stats.weibull_min cdf differences at k +- 1/2, the scale solved with
//     scipy.optimize.brentq so that the discretised mean sum_{k>=1} exp(-(k/a)^g) is the mean.
//   log5: Bill James, Baseball Abstract 1981 (REFERENCE_VALUES.md section 5).
#include <catch2/catch.hpp>
#include <cmath>
#include <stdexcept>

#include "models/win_chance.h"

using namespace standfast;
using namespace standfast::models;

TEST_CASE("Poisson regulation chances equal the Skellam law") {
  // Ref: SciPy 1.10.1; skellam.sf(0, 4.6, 3.9) = 0.5259034119390037,
  // skellam.pmf(0, 4.6, 3.9) = 0.13528361480723683, skellam.cdf(-1, 4.6, 3.9) = 0.3388129732537596
  const RegulationChances r = regulation_chances(config::ScoreFamily::kPoisson, 0, 4.6, 3.9);
  CHECK(r.win == Approx(0.5259034119390037).epsilon(1e-10));
  CHECK(r.tie == Approx(0.13528361480723683).epsilon(1e-10));
  CHECK(r.loss == Approx(0.3388129732537596).epsilon(1e-10));
  // The tie split in proportion: win + tie * win / (win + loss).
  CHECK(game_win_chance(config::ScoreFamily::kPoisson, 0, 4.6, 3.9) ==
        Approx(0.5259034119390037 +
               0.13528361480723683 * 0.5259034119390037 / (0.5259034119390037 + 0.3388129732537596))
            .epsilon(1e-10));
}

TEST_CASE("negative binomial and Weibull regulation chances equal SciPy sums") {
  // Ref: SciPy 1.10.1; sum_k nbinom.pmf(k, 8, 8/12.6) nbinom.cdf(k-1, 8, 8/11.9) =
  // 0.5171464442785062, sum_k nbinom.pmf(k, 8, 8/12.6) nbinom.pmf(k, 8, 8/11.9) =
  // 0.11577022392126658
  const RegulationChances nb =
      regulation_chances(config::ScoreFamily::kNegativeBinomial, 8.0, 4.6, 3.9);
  CHECK(nb.win == Approx(0.5171464442785062).epsilon(1e-9));
  CHECK(nb.tie == Approx(0.11577022392126658).epsilon(1e-9));
  // Ref: SciPy 1.10.1; weibull_min(1.8, loc=-0.5, scale=a) binned, a = 5.734564674592449 (mean
  // 4.6) and 4.947303269880484 (mean 3.9): P(X > Y) = 0.5116118830469943,
  // P(X = Y) = 0.10762356650899116
  const RegulationChances wb = regulation_chances(config::ScoreFamily::kWeibull, 1.8, 4.6, 3.9);
  CHECK(wb.win == Approx(0.5116118830469943).epsilon(1e-8));
  CHECK(wb.tie == Approx(0.10762356650899116).epsilon(1e-8));
}

TEST_CASE("equal sides win half their games; the chance is symmetric") {
  for (auto f : {config::ScoreFamily::kWeibull, config::ScoreFamily::kPoisson,
                 config::ScoreFamily::kNegativeBinomial}) {
    CHECK(game_win_chance(f, 1.8, 4.4, 4.4) == Approx(0.5).margin(1e-12));
    CHECK(game_win_chance(f, 1.8, 5.1, 3.7) + game_win_chance(f, 1.8, 3.7, 5.1) ==
          Approx(1.0).margin(1e-12));
  }
  // Ref: log5, James 1981: .600 against .450 odds 1.5 / (1.5 + 0.8182) = 0.647059 (from the
  // formula p(1-q) / (p(1-q) + q(1-p)) = .33 / .51).
  CHECK(log5_win_chance(1.5, 0.45 / 0.55) == Approx(0.33 / 0.51).epsilon(1e-12));
}

TEST_CASE("bad parameters are refused") {
  CHECK_THROWS_AS(regulation_chances(config::ScoreFamily::kLog5, 1.8, 4, 4), std::domain_error);
  CHECK_THROWS_AS(regulation_chances(config::ScoreFamily::kWeibull, 1.8, 0, 4), std::domain_error);
  CHECK_THROWS_AS(regulation_chances(config::ScoreFamily::kPoisson, 1.8, 4, NAN),
                  std::domain_error);
}
