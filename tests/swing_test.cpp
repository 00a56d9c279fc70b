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

TEST_CASE("a team's stake and a game's total swing equal exact enumeration") {
  const config::Season s = tiny_league();
  const Plan plan = compile_plan(s, neutral_ratings(s));
  RunOptions opt;
  opt.seed = 777;
  opt.seasons = 100000;
  opt.batch = 25000;

  // Team A (index 0) plays remaining games 0, 2, 4 and 6 (home, home, home, away).
  const std::vector<std::uint32_t> a_games = games_of_team(plan, 0);
  REQUIRE(a_games == std::vector<std::uint32_t>{0, 2, 4, 6});
  const SwingResult r = simulate_swings(plan, a_games, opt);
  for (std::size_t i = 0; i < a_games.size(); ++i) {
    const std::uint32_t g = a_games[i];
    const bool a_home = LEFT[g][0] == 0;
    std::vector<int> a_wins(8, 0), a_loses(8, 0);
    a_wins[g] = a_home ? 1 : -1;
    a_loses[g] = a_home ? -1 : 1;
    // Ref: exact enumeration of the 2^8 outcomes with the game's result fixed
    // (tests/tiny_league.h; common practice).
    const Exact win = enumerate(LEFT, a_wins), lose = enumerate(LEFT, a_loses);
    const TeamStake post = for_team(r.games[i].postseason[0], a_home);
    INFO("game " << g << " postseason if A wins " << post.if_wins << " exact " << win.post[0]
                 << ", if A loses " << post.if_loses << " exact " << lose.post[0]);
    CHECK(std::abs(post.difference - (win.post[0] - lose.post[0])) <= 4 * post.se + 1e-12);
    CHECK(std::abs(post.if_wins - win.post[0]) <= 4 * post.se + 1e-12);
    CHECK(std::abs(post.if_loses - lose.post[0]) <= 4 * post.se + 1e-12);
  }

  // Total swing of each game over the four teams: the chance that changes hands.
  const std::vector<std::uint32_t> all = {0, 1, 2, 3, 4, 5, 6, 7};
  const SwingResult every = simulate_swings(plan, all, opt);
  for (std::uint32_t g = 0; g < 8; ++g) {
    std::vector<int> home(8, 0), away(8, 0);
    home[g] = 1;
    away[g] = -1;
    // Ref: exact enumeration as above (tests/tiny_league.h; common practice).
    const Exact e1 = enumerate(LEFT, home), e0 = enumerate(LEFT, away);
    double exact_moved = 0, sum = 0, bound = 0;
    for (std::size_t t = 0; t < 4; ++t) {
      exact_moved += std::abs(e1.post[t] - e0.post[t]) / 2;
      sum += every.games[g].postseason[t].swing;
      bound += 4 * every.games[g].postseason[t].se / 2;
    }
    const SwingTotal total = total_swing(every.games[g].postseason);
    INFO("game " << g << " moved " << total.moved << " exact " << exact_moved);
    // Two berths in every season: the swings add up to zero (to rounding).
    CHECK(std::abs(sum) < 1e-12);
    // |moved - exact| <= half the sum of the per-team errors, each within 4 SE.
    CHECK(std::abs(total.moved - exact_moved) <= bound + 1e-12);
    CHECK(total.noise > 0);
  }
}

TEST_CASE("games of a team and games of the next days") {
  const config::Season s = tiny_league();
  const Plan plan = compile_plan(s, neutral_ratings(s));
  // Remaining games are on days 11..18 (20011..20018), one a day.
  CHECK(games_of_days(plan, 20011, 3) == std::vector<std::uint32_t>{0, 1, 2});
  CHECK(games_of_days(plan, 20018, 5) == std::vector<std::uint32_t>{7});
  CHECK(games_of_days(plan, 20030, 5).empty());
  CHECK(games_of_team(plan, 3) == std::vector<std::uint32_t>{1, 3, 4, 7});
}

TEST_CASE("the total swing of swings that cancel is half their absolute sum") {
  std::vector<ConditionalChance> c(3);
  c[0].swing = 0.2;
  c[1].swing = -0.15;
  c[2].swing = -0.05;
  c[0].se = c[1].se = c[2].se = 0.01;
  const SwingTotal t = total_swing(c);
  CHECK(t.moved == Approx(0.2).epsilon(1e-12));
  // Ref: E|N(0, s)| = s sqrt(2/pi) (common practice); 0.5 * 0.03 * 0.7978845608 = 0.01196827.
  CHECK(t.noise == Approx(0.01196827).epsilon(1e-6));
}
