// Tests for engine/tiebreak.h: the tiebreak procedure.
// References: the multi-team procedure (apply a rule to the whole tied set, then restart from
// the first rule on every group still tied) and the rules themselves are common practice of
// leagues; every expected order below is worked out by hand from the invented games written in
// each test. Exact fractions are closed-form; the random-draw frequencies are checked against
// the binomial distribution (mean N p, sd sqrt(N p (1 - p))).
#include "engine/tiebreak.h"

#include <array>
#include <catch2/catch.hpp>
#include <cmath>
#include <map>
#include <numeric>
#include <vector>

using standfast::config::Tiebreakers;
using standfast::config::TiebreakKind;
using standfast::config::TiebreakRule;
using standfast::config::TiebreakScope;
using standfast::engine::compare_pct;
using standfast::engine::LastGamesWindow;
using standfast::engine::make_stream;
using standfast::engine::pct_key;
using standfast::engine::Purpose;
using standfast::engine::SeasonRecord;
using standfast::engine::Tiebreaker;
using standfast::engine::TiebreakScratch;

namespace {

TiebreakRule rule(TiebreakKind kind, int games = 0, TiebreakScope scope = TiebreakScope::kLeague) {
  return TiebreakRule{kind, games, scope, {}};
}

Tiebreakers rules(std::initializer_list<TiebreakRule> list) {
  Tiebreakers t;
  t.order = list;
  return t;
}

// `count` wins of `winner` over `loser`, 4-2 each.
void beat(SeasonRecord& r, int winner, int loser, int count = 1) {
  for (int i = 0; i < count; ++i) r.add_result(winner, loser, 4, 2);
}

// A record for n teams, all in one division and conference unless given.
SeasonRecord record(int n, std::vector<int> div = {}, std::vector<int> conf = {},
                    std::vector<LastGamesWindow> windows = {}) {
  if (div.empty()) div.assign(n, 0);
  if (conf.empty()) conf.assign(n, 0);
  return SeasonRecord(div, conf, windows);
}

std::vector<int> order(const Tiebreaker& tb, std::vector<int> teams, const SeasonRecord& r,
                       std::uint64_t seed = 1) {
  auto rng = make_stream(seed, 0, Purpose::kTiebreak);
  TiebreakScratch scratch(r.team_count());
  tb.order_tied(teams, r, rng, scratch);
  return teams;
}

}  // namespace

TEST_CASE("winning percentages compare exactly") {
  // Ref: closed form (exact fractions); 1/3 == 2/6, 2/3 > 3/5, 0/0 taken as 1/2 (documented).
  REQUIRE(compare_pct(1, 2, 2, 4) == 0);
  REQUIRE(compare_pct(2, 1, 3, 2) == 1);
  REQUIRE(compare_pct(3, 2, 2, 1) == -1);
  REQUIRE(compare_pct(0, 0, 5, 5) == 0);
  REQUIRE(compare_pct(0, 0, 5, 4) == -1);
  REQUIRE(pct_key(0, 0) == pct_key(81, 81));
}

TEST_CASE("pct_key orders every pair of records up to 200 games as the exact fractions do") {
  // Ref: closed form; a/b vs c/d by a*d vs c*b in 64-bit integers (exact at these sizes).
  std::vector<std::pair<int, int>> recs;
  for (int g = 1; g <= 200; ++g) {
    for (int w = 0; w <= g; w += (g > 60 ? 7 : 1)) recs.emplace_back(w, g - w);
  }
  long mismatches = 0;
  for (const auto& [w1, l1] : recs) {
    for (const auto& [w2, l2] : recs) {
      const std::int64_t lhs = static_cast<std::int64_t>(w1) * (w2 + l2);
      const std::int64_t rhs = static_cast<std::int64_t>(w2) * (w1 + l1);
      const auto k1 = pct_key(w1, l1), k2 = pct_key(w2, l2);
      mismatches += (lhs > rhs) != (k1 > k2) || (lhs == rhs) != (k1 == k2);
    }
  }
  REQUIRE(recs.size() > 4000);
  REQUIRE(mismatches == 0);
}

TEST_CASE("PctKeyTable gives pct_key without dividing") {
  // Ref: closed form; floor(w * 2^32 / g) by 64-bit integer division (pct_key), compared for
  // every record of up to 3000 games and for sampled records up to 65535 games.
  const standfast::engine::PctKeyTable table(65535);
  long mismatches = 0;
  for (int g = 0; g <= 3000; ++g) {
    for (int w = 0; w <= g; ++w) mismatches += table.key(w, g - w) != pct_key(w, g - w);
  }
  for (int g = 3001; g <= 65535; g += 97) {
    for (int w = 0; w <= g; w += 1 + g / 500)
      mismatches += table.key(w, g - w) != pct_key(w, g - w);
    mismatches += table.key(g - 1, 1) != pct_key(g - 1, 1);
  }
  REQUIRE(mismatches == 0);
  const standfast::engine::PctKeyTable small(10);  // longer records fall back to pct_key
  REQUIRE(small.key(150, 12) == pct_key(150, 12));
}

TEST_CASE("two teams: head-to-head decides") {
  // A (0) beat B (1) 3 games to 2 in their season series.
  auto r = record(2);
  beat(r, 0, 1, 3);
  beat(r, 1, 0, 2);
  const Tiebreaker tb(rules({rule(TiebreakKind::kHeadToHead)}));
  REQUIRE(order(tb, {0, 1}, r) == std::vector<int>{0, 1});
  REQUIRE(order(tb, {1, 0}, r) == std::vector<int>{0, 1});
}

TEST_CASE("three teams, one sweeps the others; the other two restart and go to division record") {
  // A (0) swept B and C (4-0 each); B (1) and C (2) split 2-2.
  auto r = record(5, {0, 0, 0, 0, 0});
  beat(r, 0, 1, 4);
  beat(r, 0, 2, 4);
  beat(r, 1, 2, 2);
  beat(r, 2, 1, 2);
  // Head-to-head among {A,B,C}: A 8-0, B 2-6, C 2-6. Restart on {B,C}: 2-2 each, falls through.
  // Division record (everyone in one division): B and C are 2-6 so far; C beats team 3 once
  // (3-6) and B loses to team 4 once (2-7), so C is ahead. Order A, C, B.
  beat(r, 2, 3);
  beat(r, 4, 1);
  const Tiebreaker tb(
      rules({rule(TiebreakKind::kHeadToHead), rule(TiebreakKind::kDivisionRecord)}));
  REQUIRE(order(tb, {1, 2, 0}, r) == std::vector<int>{0, 2, 1});
  REQUIRE(order(tb, {2, 0, 1}, r) == std::vector<int>{0, 2, 1});
}

TEST_CASE("circular three-way head-to-head tie falls through to division record") {
  // A beat B 2-1, B beat C 2-1, C beat A 2-1: each is 3-3 against the other two.
  auto r = record(6, {0, 0, 0, 0, 0, 0});
  beat(r, 0, 1, 2);
  beat(r, 1, 0, 1);
  beat(r, 1, 2, 2);
  beat(r, 2, 1, 1);
  beat(r, 2, 0, 2);
  beat(r, 0, 2, 1);
  // Division records (all in one division): so far each is 3-3. Add: B beats team 3 twice
  // (5-3), C beats team 4 once (4-3), A loses to team 5 once (3-4). Order B, C, A.
  beat(r, 1, 3, 2);
  beat(r, 2, 4, 1);
  beat(r, 5, 0, 1);
  const Tiebreaker tb(
      rules({rule(TiebreakKind::kHeadToHead), rule(TiebreakKind::kDivisionRecord)}));
  REQUIRE(order(tb, {0, 1, 2}, r) == std::vector<int>{1, 2, 0});
  REQUIRE(order(tb, {2, 1, 0}, r) == std::vector<int>{1, 2, 0});
}

TEST_CASE("a rule separates one team from three, then the procedure restarts on the other two") {
  // Head-to-head among {A,B,C}: A-B 3-0, A-C 2-1, B-C 2-1 (B won).
  //   A 5-1; B 2-4 (0-3 vs A, 2-1 vs C); C 2-4 (1-2 vs A, 1-2 vs B). A first; B and C tied.
  // Restarting on {B,C} from the first rule: head-to-head between B and C only: B 2-1. So B.
  // Carrying on to the next rule instead (conference record) would put C first: C has the
  // better conference record. The expected order A, B, C shows the restart.
  auto r = record(4, {0, 0, 0, 1}, {0, 0, 0, 0});
  beat(r, 0, 1, 3);
  beat(r, 0, 2, 2);
  beat(r, 2, 0, 1);
  beat(r, 1, 2, 2);
  beat(r, 2, 1, 1);
  beat(r, 2, 3, 5);  // C's conference record improves
  beat(r, 3, 1, 5);  // B's worsens
  const Tiebreaker tb(
      rules({rule(TiebreakKind::kHeadToHead), rule(TiebreakKind::kConferenceRecord)}));
  REQUIRE(order(tb, {2, 1, 0}, r) == std::vector<int>{0, 1, 2});
}

TEST_CASE("four teams: one separated, the remaining three restart and split in turn") {
  // Rules: division record, then head-to-head. All five teams in one division; E (4) is filler.
  // Games among B (1), C (2), D (3): B-C 1-1, D-B 2-1, D-C 1-0. Among {B,C,D}:
  //   B 2-3 (.400), C 1-2 (.333), D 3-1 (.750).
  // Games against E bring B, C and D to 5-4 in the division and A (0) to 6-0.
  // Division record puts A first and leaves {B,C,D} tied; the restart on {B,C,D} finds the
  // division records still equal and head-to-head orders D, B, C.
  auto r = record(5, {0, 0, 0, 0, 0});
  beat(r, 1, 2, 1);
  beat(r, 2, 1, 1);
  beat(r, 3, 1, 2);
  beat(r, 1, 3, 1);
  beat(r, 3, 2, 1);
  beat(r, 0, 4, 6);
  beat(r, 1, 4, 3);  // B 2-3 -> 5-4
  beat(r, 4, 1, 1);
  beat(r, 2, 4, 4);  // C 1-2 -> 5-4
  beat(r, 4, 2, 2);
  beat(r, 3, 4, 2);  // D 3-1 -> 5-4
  beat(r, 4, 3, 3);
  for (int t = 1; t <= 3; ++t) {
    REQUIRE(r.division_wins(t) == 5);
    REQUIRE(r.division_losses(t) == 4);
  }
  const Tiebreaker tb(
      rules({rule(TiebreakKind::kDivisionRecord), rule(TiebreakKind::kHeadToHead)}));
  REQUIRE(order(tb, {1, 2, 3, 0}, r) == std::vector<int>{0, 3, 1, 2});
}

TEST_CASE("a team with no games among the tied set counts .500 in head-to-head") {
  // A beat C twice; B never met A or C. A 1.000, B .500, C .000.
  auto r = record(3);
  beat(r, 0, 2, 2);
  const Tiebreaker tb(rules({rule(TiebreakKind::kHeadToHead)}));
  REQUIRE(order(tb, {2, 1, 0}, r) == std::vector<int>{0, 1, 2});
}

TEST_CASE("run differential") {
  // A and B split 1-1: A won 10-1, B won 2-1. Run differential A 11-3 = +8, B 3-11 = -8.
  auto r = record(2);
  r.add_result(0, 1, 10, 1);
  r.add_result(1, 0, 2, 1);
  const Tiebreaker tb(
      rules({rule(TiebreakKind::kHeadToHead), rule(TiebreakKind::kRunDifferential)}));
  REQUIRE(order(tb, {1, 0}, r) == std::vector<int>{0, 1});
}

TEST_CASE("last N games within a scope") {
  // Window: last 4 games within the division. A (0) and B (1) in division 0, C (2) in 1.
  const std::vector<LastGamesWindow> windows{{4, TiebreakScope::kDivision}};
  auto r = record(4, {0, 0, 1, 0}, {0, 0, 0, 0}, windows);
  // Division games in order (D = team 3): A-B split 1-1 so head-to-head is level.
  beat(r, 0, 1);
  beat(r, 1, 0);
  beat(r, 0, 3, 2);  // A's division games: W L W W -> last 4: 3-1
  beat(r, 3, 1, 2);  // B's division games: L W L L -> last 4: 1-3
  beat(r, 2, 0, 3);  // A loses 3 to C: outside the division, not in the window
  beat(r, 1, 2, 3);  // B wins 3 over C: outside the division
  // Overall A 3-4, B 4-3 (order_tied treats them as tied all the same).
  REQUIRE(r.wins(0) == 3);
  REQUIRE(r.losses(0) == 4);
  const Tiebreaker tb(rules({rule(TiebreakKind::kHeadToHead),
                             rule(TiebreakKind::kLastGames, 4, TiebreakScope::kDivision)}));
  REQUIRE(order(tb, {1, 0}, r) == std::vector<int>{0, 1});
  // In a league-wide window of 4 games B is ahead: A's last 4 are W L L L (1-3), B's are
  // L W W W (3-1).
  const std::vector<LastGamesWindow> league{{4, TiebreakScope::kLeague}};
  auto r2 = record(4, {0, 0, 1, 0}, {0, 0, 0, 0}, league);
  beat(r2, 0, 1);
  beat(r2, 1, 0);
  beat(r2, 0, 3, 2);
  beat(r2, 3, 1, 2);
  beat(r2, 2, 0, 3);
  beat(r2, 1, 2, 3);
  const Tiebreaker tb2(rules({rule(TiebreakKind::kHeadToHead),
                              rule(TiebreakKind::kLastGames, 4, TiebreakScope::kLeague)}));
  REQUIRE(order(tb2, {0, 1}, r2) == std::vector<int>{1, 0});
}

TEST_CASE("random draw: every order equally likely") {
  // Three fully tied teams, only the draw: 6 orders with p = 1/6 each. Over N = 60000 draws a
  // count is Binomial(N, 1/6): mean 10000, sd sqrt(N p (1-p)) = 91.29. Bound 4.5 sd (410.8), so
  // a count passes when 9590 <= c <= 10410.
  // Ref: SciPy 1.10.1; binom.sf(10410, 60000, 1/6) + binom.cdf(9589, 60000, 1/6); 6.92e-06
  // (chance that one count fails with a fair draw; below 4.2e-5 for the six).
  const auto r = record(3);
  const Tiebreaker tb;
  TiebreakScratch scratch(3);
  auto rng = make_stream(2026, 0, Purpose::kTiebreak);
  std::map<std::vector<int>, int> counts;
  const int n = 60000;
  for (int i = 0; i < n; ++i) {
    std::vector<int> teams{0, 1, 2};
    tb.order_tied(teams, r, rng, scratch);
    ++counts[teams];
  }
  REQUIRE(counts.size() == 6);
  const double p = 1.0 / 6.0;
  const double sd = std::sqrt(n * p * (1 - p));
  for (const auto& [perm, c] : counts) REQUIRE(std::abs(c - n * p) < 4.5 * sd);
}

TEST_CASE("random draw after rules that separate no one; two teams about half and half") {
  // Two teams with identical records in everything: head-to-head 1-1, same division record.
  // N = 40000 draws: Binomial(N, 1/2), sd = 100. Bound 4 sd: 19601 <= count <= 20399.
  // Ref: SciPy 1.10.1; binom.sf(20399, 40000, 0.5) + binom.cdf(19600, 40000, 0.5); 6.47e-05
  auto r = record(2);
  r.add_result(0, 1, 3, 2);
  r.add_result(1, 0, 3, 2);
  const Tiebreaker tb(rules({rule(TiebreakKind::kHeadToHead), rule(TiebreakKind::kDivisionRecord),
                             rule(TiebreakKind::kRunDifferential)}));
  TiebreakScratch scratch(2);
  auto rng = make_stream(77, 0, Purpose::kTiebreak);
  int first0 = 0;
  const int n = 40000;
  for (int i = 0; i < n; ++i) {
    std::array<int, 2> teams{0, 1};
    tb.order_tied(teams, r, rng, scratch);
    first0 += teams[0] == 0;
  }
  REQUIRE(std::abs(first0 - n / 2) < 400);
}

TEST_CASE("rank sorts by winning percentage and breaks only the tied runs") {
  // E 6-2 (.750), A 4-2 and B 6-3 (.667, tied), C and D 0-0 (.500), F 1-7 (.125). A beat B.
  auto r = record(7);
  beat(r, 4, 6, 6);
  beat(r, 6, 4, 2);  // E 6-2, G 2-6
  beat(r, 0, 1, 1);  // A 1-0, B 0-1
  beat(r, 0, 6, 3);
  beat(r, 6, 0, 2);  // A 4-2, G 4-9
  beat(r, 1, 6, 6);
  beat(r, 6, 1, 2);  // B 6-3, G 6-15
  beat(r, 5, 6, 1);
  beat(r, 6, 5, 7);  // F 1-7, G 13-16
  REQUIRE(r.wins(0) == 4);
  REQUIRE(r.losses(1) == 3);
  const Tiebreaker tb(rules({rule(TiebreakKind::kHeadToHead)}));
  TiebreakScratch scratch(7);
  std::vector<int> teams{0, 1, 2, 3, 4, 5, 6};
  auto rng = make_stream(5, 0, Purpose::kTiebreak);
  tb.rank(teams, r, rng, scratch);
  REQUIRE(teams[0] == 4);
  REQUIRE(teams[1] == 0);
  REQUIRE(teams[2] == 1);
  REQUIRE(((teams[3] == 2 && teams[4] == 3) || (teams[3] == 3 && teams[4] == 2)));
  REQUIRE(teams[5] == 6);  // G 13-16 (.448)
  REQUIRE(teams[6] == 5);
}

TEST_CASE("the same stream gives the same ranking") {
  // 12 teams with many equal records and no rule but the draw.
  auto r = record(12);
  for (int t = 0; t < 12; t += 2) beat(r, t, t + 1, t % 4 == 0 ? 2 : 1);
  const Tiebreaker tb;
  TiebreakScratch s1(12), s2(12);
  for (std::uint64_t season = 0; season < 50; ++season) {
    auto a = make_stream(9, season, Purpose::kTiebreak);
    auto b = make_stream(9, season, Purpose::kTiebreak);
    std::vector<int> x(12), y(12);
    std::iota(x.begin(), x.end(), 0);
    std::iota(y.begin(), y.end(), 0);
    tb.rank(x, r, a, s1);
    tb.rank(y, r, b, s2);
    REQUIRE(x == y);
  }
}

TEST_CASE("extra-game rule: only two-team ties when the season asks for it") {
  Tiebreakers t;
  REQUIRE_FALSE(Tiebreaker(t).settled_by_extra_game(2));
  t.extra_game = true;
  const Tiebreaker tb(t);
  REQUIRE(tb.extra_game());
  REQUIRE(tb.settled_by_extra_game(2));
  REQUIRE_FALSE(tb.settled_by_extra_game(3));
}

TEST_CASE("scratch too small is refused, not overrun") {
  const auto r = record(4);
  const Tiebreaker tb;
  TiebreakScratch scratch(2);
  auto rng = make_stream(1, 0, Purpose::kTiebreak);
  std::vector<int> teams{0, 1, 2};
  REQUIRE_THROWS_AS(tb.order_tied(teams, r, rng, scratch), std::invalid_argument);
}
