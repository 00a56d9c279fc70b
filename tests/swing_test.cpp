// Tests for engine/swing.h: each remaining game's effect on every team's chances, from
// conditional tallies of one run. Sources: exact enumeration of every outcome of the tiny
// league's remaining games with the game's result fixed (tests/tiny_league.h, independent of the
// engine); log5 (REFERENCE_VALUES.md section 5). Monte Carlo checks: fixed seed, 4 sigma.
#include "engine/swing.h"

#include <catch2/catch.hpp>
#include <cmath>
#include <vector>

#include "tests/tiny_league.h"

using namespace standfast;
using namespace standfast::engine;
using namespace standfast::testing;

TEST_CASE("game swings equal exact enumeration under each game's result") {
  const config::Season s = tiny_league();
  const Plan plan = compile_plan(s, neutral_ratings(s));
  RunOptions opt;
  opt.seed = 4242;
  opt.seasons = 100000;
  opt.batch = 25000;
  const std::vector<std::uint32_t> all = {0, 1, 2, 3, 4, 5, 6, 7};
  const SwingResult r = simulate_swings(plan, all, opt);
  REQUIRE(r.games.size() == 8);

  // The same seasons as a plain run: the odds are identical.
  const SimulationResult plain = simulate(plan, opt);
  for (std::size_t t = 0; t < 4; ++t)
    CHECK(r.odds.teams[t].postseason.p == plain.teams[t].postseason.p);

  const double n = static_cast<double>(opt.seasons);
  for (std::size_t g = 0; g < 8; ++g) {
    std::vector<int> home(8, 0), away(8, 0);
    home[g] = 1;
    away[g] = -1;
    const Exact if_home = enumerate(LEFT, home), if_away = enumerate(LEFT, away);
    const double ph = log5(PCT[LEFT[g][0]], PCT[LEFT[g][1]]);
    INFO("game " << g);
    CHECK(std::abs(r.games[g].home_win_share - ph) <= 4 * std::sqrt(ph * (1 - ph) / n));
    for (std::size_t t = 0; t < 4; ++t) {
      const ConditionalChance& c = r.games[g].postseason[t];
      const double e1 = if_home.post[t], e0 = if_away.post[t];
      INFO("team " << t << " if home wins " << c.if_home_wins << " exact " << e1
                   << ", if away wins " << c.if_away_wins << " exact " << e0);
      CHECK(std::abs(c.if_home_wins - e1) <= 4 * std::sqrt(e1 * (1 - e1) / (n * ph)) + 1e-12);
      CHECK(std::abs(c.if_away_wins - e0) <= 4 * std::sqrt(e0 * (1 - e0) / (n * (1 - ph))) + 1e-12);
      CHECK(std::abs(c.swing - (e1 - e0)) <= 4 * c.se + 1e-12);
    }
  }
}

TEST_CASE("a game index beyond the remaining games is refused") {
  const config::Season s = tiny_league();
  const Plan plan = compile_plan(s, neutral_ratings(s));
  const std::vector<std::uint32_t> bad = {8};
  RunOptions opt;
  opt.seasons = 10;
  CHECK_THROWS_AS(simulate_swings(plan, bad, opt), std::invalid_argument);
}
