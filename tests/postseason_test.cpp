// Tests for engine/postseason.h: series and brackets.
// Sources:
//   Mosteller, F. (1952), "The World Series Competition", JASA: a best-of-(2m-1) series is won
//     with probability I_p(m, m); REFERENCE_VALUES.md section 4 (values and series lengths),
//     recomputed here with Boost.Math 1.74 ibeta(m, m, p).
//   Standard bracket order (1 v 8, 4 v 5, 2 v 7, 3 v 6): common practice.
// Monte Carlo checks: fixed seeds, 4-sigma bounds (STYLE.md: at least 4 sigma).
#include "engine/postseason.h"

#include <boost/math/special_functions/beta.hpp>
#include <catch2/catch.hpp>
#include <cmath>
#include <utility>
#include <vector>

#include "engine/rng.h"

using namespace standfast::engine;

namespace {

// The team with the smaller id wins each game with probability p.
struct Bernoulli {
  Rng rng;
  double p;
  static int play(void* c, int home, int away) {
    auto* b = static_cast<Bernoulli*>(c);
    const int better = std::min(home, away), worse = std::max(home, away);
    return uniform01(b->rng) < b->p ? better : worse;
  }
};

// Deterministic hooks.
int home_wins(void*, int home, int) { return home; }
struct Recorder {
  std::vector<std::pair<int, int>> games;  // (min, max) team of each game
  bool worse_wins = true;
  static int play(void* c, int home, int away) {
    auto* r = static_cast<Recorder*>(c);
    r->games.emplace_back(std::min(home, away), std::max(home, away));
    return r->worse_wins ? std::max(home, away) : std::min(home, away);
  }
};

}  // namespace

TEST_CASE("standard bracket order") {
  // Common practice: seeds meet 1-8, 4-5, 2-7, 3-6 so seeds 1 and 2 can meet only in the final.
  CHECK(standard_bracket_order(8) == std::vector<int>{1, 8, 4, 5, 2, 7, 3, 6});
  CHECK(standard_bracket_order(4) == std::vector<int>{1, 4, 2, 3});
  CHECK(standard_bracket_order(2) == std::vector<int>{1, 2});
  CHECK_THROWS_AS(standard_bracket_order(6), std::invalid_argument);
}

TEST_CASE("series win probability matches the negative-binomial closed form") {
  // Ref: REFERENCE_VALUES.md section 4; best-of-3/5/7 at p = 0.55: 0.57475000, 0.59312688,
  // 0.60828780; at p = 0.60: 0.64800000, 0.68256000, 0.71020800; Boost ibeta(m, m, p).
  const double table[2][3] = {{0.57475000, 0.59312688, 0.60828780},
                              {0.64800000, 0.68256000, 0.71020800}};
  const double ps[2] = {0.55, 0.60};
  for (int i = 0; i < 2; ++i) {
    for (int j = 0; j < 3; ++j) {
      const int best_of = 3 + 2 * j, m = best_of / 2 + 1;
      const double exact = boost::math::ibeta(double(m), double(m), ps[i]);
      REQUIRE(exact == Approx(table[i][j]).epsilon(1e-7));
      Bernoulli b{make_stream(31, static_cast<std::uint64_t>(3 * i + j), Purpose::kPostseason),
                  ps[i]};
      const int n = 200000;
      int won = 0;
      for (int k = 0; k < n; ++k)
        won += play_series(best_of, 0x55u, 1, 2, ExtraGame{&b, &Bernoulli::play}) == 1;
      const double se = std::sqrt(exact * (1 - exact) / n);
      INFO("best of " << best_of << " p " << ps[i]);
      CHECK(std::abs(won / double(n) - exact) <= 4 * se);
    }
  }
}

TEST_CASE("best-of-7 series lengths follow the closed form") {
  // Ref: REFERENCE_VALUES.md section 4; p = 0.6: P(4, 5, 6, 7 games) = 0.1552, 0.2688, 0.29952,
  // 0.27648 (C(n-1, 3)(p^4 q^(n-4) + q^4 p^(n-4))).
  const double expect[4] = {0.1552, 0.2688, 0.29952, 0.27648};
  Bernoulli b{make_stream(32, 0, Purpose::kPostseason), 0.6};
  const int n = 200000;
  int count[8] = {};
  for (int k = 0; k < n; ++k) {
    int games = 0;
    play_series(7, 0x63u, 1, 2, ExtraGame{&b, &Bernoulli::play}, &games);
    ++count[games];
  }
  for (int g = 4; g <= 7; ++g) {
    const double p = expect[g - 4];
    CHECK(std::abs(count[g] / double(n) - p) <= 4 * std::sqrt(p * (1 - p) / n));
  }
}

TEST_CASE("the home pattern decides who hosts each game") {
  // 2-3-2: the higher seed hosts games 1, 2, 6, 7 (bits 0, 1, 5, 6). With the host always
  // winning, the higher seed wins 1-2, loses 3-5, wins 6-7: 4-3 in seven games.
  int games = 0;
  CHECK(play_series(7, 0x63u, 1, 2, ExtraGame{nullptr, &home_wins}, &games) == 1);
  CHECK(games == 7);
  // Lower seed hosts the single game of a best-of-1 when bit 0 is clear.
  CHECK(play_series(1, 0u, 1, 2, ExtraGame{nullptr, &home_wins}) == 2);
}

TEST_CASE("a six-team bracket with two byes, fixed and reseeded") {
  PlanBracket b;
  b.qualifiers = 6;
  b.byes = 2;
  b.rounds = 3;
  b.first_round = 0;
  b.order = standard_bracket_order(8);
  std::vector<PlanRound> rounds(3);
  for (auto& r : rounds) r.best_of = 1, r.higher_hosts = 1;
  // Teams 10..15 are seeds 1..6; the worse seed (larger id) always wins.
  const std::vector<int> seeded = {10, 11, 12, 13, 14, 15};
  BracketScratch scratch;
  for (bool reseed : {false, true}) {
    Recorder rec;
    std::vector<int> reached(16, -1);
    const int champion =
        play_bracket(b, rounds, reseed, seeded, ExtraGame{&rec, &Recorder::play}, reached, scratch);
    // Round 1: 4 v 5 -> 5 (14), 3 v 6 -> 6 (15); byes for seeds 1 and 2.
    REQUIRE(rec.games.size() == 5);
    CHECK(rec.games[0] == std::pair(13, 14));
    CHECK(rec.games[1] == std::pair(12, 15));
    if (!reseed) {
      // Fixed: 1 meets the 4-5 winner, 2 meets the 3-6 winner.
      CHECK(rec.games[2] == std::pair(10, 14));
      CHECK(rec.games[3] == std::pair(11, 15));
    } else {
      // Reseeded: survivors 1, 2, 5, 6; best meets worst.
      CHECK(rec.games[2] == std::pair(10, 15));
      CHECK(rec.games[3] == std::pair(11, 14));
    }
    CHECK(champion == 15);
    CHECK(reached[10] == 1);  // a bye reaches round 1 and loses there
    CHECK(reached[12] == 0);
    CHECK(reached[15] == 2);
    CHECK(reached[14] == 2);
  }
}
