// Tests for engine/season_totals.h: the engine's bulk tally of a season's remaining games must
// leave exactly the record that SeasonRecord::add_result leaves game by game (an equivalence
// check against the plain definition; invented random games, not reference data).
#include "engine/season_totals.h"

#include <catch2/catch.hpp>
#include <cstdint>
#include <vector>

using standfast::config::TiebreakScope;
using standfast::engine::LastGamesWindow;
using standfast::engine::SeasonRecord;
using standfast::engine::SeasonTotals;
using standfast::engine::TotalsLayout;

namespace {

void require_same(const SeasonRecord& a, const SeasonRecord& b) {
  const int n = a.team_count();
  for (int t = 0; t < n; ++t) {
    REQUIRE(a.wins(t) == b.wins(t));
    REQUIRE(a.losses(t) == b.losses(t));
    REQUIRE(a.runs_for(t) == b.runs_for(t));
    REQUIRE(a.runs_against(t) == b.runs_against(t));
    REQUIRE(a.division_wins(t) == b.division_wins(t));
    REQUIRE(a.division_losses(t) == b.division_losses(t));
    REQUIRE(a.conference_wins(t) == b.conference_wins(t));
    REQUIRE(a.conference_losses(t) == b.conference_losses(t));
    for (int u = 0; u < n; ++u) REQUIRE(a.h2h_wins(t, u) == b.h2h_wins(t, u));
    for (int k = 0; k < a.window_count(); ++k) {
      REQUIRE(a.last_wins(k, t) == b.last_wins(k, t));
      REQUIRE(a.last_losses(k, t) == b.last_losses(k, t));
      REQUIRE(a.window_results(k, t) == b.window_results(k, t));
    }
  }
}

}  // namespace

TEST_CASE("season totals added in bulk equal add_result game by game") {
  // Tied games go through add_extra as in the engine (a home loss at the tied score, then the
  // extra innings' runs and winner).
  // 7 teams in 3 divisions and 2 conferences, three window scopes (one longer than some teams'
  // remaining games in scope, so played results stay in it), a few played games first.
  const std::vector<int> div{1, 1, 2, 2, 3, 3, 3};
  const std::vector<int> conf{7, 7, 7, 7, 8, 8, 8};
  const std::vector<LastGamesWindow> windows{
      {3, TiebreakScope::kLeague}, {6, TiebreakScope::kConference}, {2, TiebreakScope::kDivision}};
  SeasonRecord base(div, conf, windows);
  std::uint64_t x = 12345;
  auto next = [&x] {
    x = x * 6364136223846793005ull + 1442695040888963407ull;
    return static_cast<int>(x >> 33);
  };
  for (int i = 0; i < 25; ++i) {
    const int a = next() % 7;
    const int b = (a + 1 + next() % 6) % 7;
    base.add_result(a, b, 4 + next() % 3, next() % 4);
  }
  for (int count : {0, 1, 9, 60}) {
    // Groups by (home, away) pair; a pair's games alternate between two groups, as a long
    // matchup split by the engine would.
    std::vector<std::uint16_t> home, away;
    std::vector<std::uint32_t> group;
    std::vector<std::int64_t> group_of(7 * 7 * 2, -1);
    std::uint32_t groups = 0;
    for (int i = 0; i < count; ++i) {
      const int a = next() % 7;
      const int b = (a + 1 + next() % 6) % 7;
      home.push_back(static_cast<std::uint16_t>(a));
      away.push_back(static_cast<std::uint16_t>(b));
      std::int64_t& k = group_of[static_cast<std::size_t>((a * 7 + b) * 2 + i % 2)];
      if (k < 0) k = groups++;
      group.push_back(static_cast<std::uint32_t>(k));
    }
    const TotalsLayout layout(home, away, group, base);
    REQUIRE(layout.groups() == groups);
    SeasonTotals totals(layout);
    for (int season = 0; season < 3; ++season) {  // the same totals reused after clear()
      totals.clear();
      const SeasonTotals::Sink sink = totals.sink();
      SeasonRecord one = base;
      for (int g = 0; g < count; ++g) {
        const auto h = home[static_cast<std::size_t>(g)], a = away[static_cast<std::size_t>(g)];
        const auto gi = static_cast<std::size_t>(g);
        auto hr = static_cast<std::uint32_t>(next() % 12);
        auto ar = static_cast<std::uint32_t>(next() % 12);
        std::uint32_t home_won = hr > ar;
        sink.add(gi, group[gi], home_won, hr, ar);
        if (hr == ar) {  // tallied as a home loss, then settled the way the engine settles ties
          home_won = static_cast<std::uint32_t>(next() % 2);
          const auto more = static_cast<std::uint32_t>(next() % 3);  // extra runs of both
          const std::uint32_t extra_home = more + home_won, extra_away = more + 1 - home_won;
          sink.add_extra(gi, group[gi], home_won, extra_home, extra_away);
          hr += extra_home;
          ar += extra_away;
        }
        if (home_won)
          one.add_result(h, a, static_cast<int>(hr), static_cast<int>(ar));
        else
          one.add_result(a, h, static_cast<int>(ar), static_cast<int>(hr));
      }
      SeasonRecord bulk = base;
      totals.add_to(bulk);  // windows deferred until read or copied
      SeasonRecord copy = bulk;
      require_same(copy, one);
      require_same(bulk, one);
      // Later single results keep agreeing (ring heads in the same place).
      one.add_result(5, 4, 2, 1);
      bulk.add_result(5, 4, 2, 1);
      one.add_result(0, 2, 2, 1);
      bulk.add_result(0, 2, 2, 1);
      require_same(bulk, one);
    }
  }
}

TEST_CASE("the totals layout refuses bad teams, bad groups and oversized groups") {
  const std::vector<int> div{1, 2, 2};
  const std::vector<int> conf{1, 1, 1};
  const SeasonRecord base(div, conf, {});
  const std::vector<std::uint16_t> h{0}, same{0}, out{5}, one{1};
  const std::vector<std::uint32_t> g0{0}, g1{1};
  REQUIRE_THROWS_AS(TotalsLayout(h, same, g0, base), std::invalid_argument);
  REQUIRE_THROWS_AS(TotalsLayout(h, out, g0, base), std::invalid_argument);
  REQUIRE_THROWS_AS(TotalsLayout(h, one, g1, base), std::invalid_argument);  // group 0 empty
  const std::vector<std::uint16_t> h2{0, 0}, a2{1, 2};
  const std::vector<std::uint32_t> g00{0, 0};
  REQUIRE_THROWS_AS(TotalsLayout(h2, a2, g00, base), std::invalid_argument);  // mixed teams
  const std::vector<std::uint16_t> hs(TotalsLayout::MAX_GROUP_GAMES + 1, 0),
      as(TotalsLayout::MAX_GROUP_GAMES + 1, 1);
  std::vector<std::uint32_t> gs(TotalsLayout::MAX_GROUP_GAMES + 1, 0);
  REQUIRE_THROWS_AS(TotalsLayout(hs, as, gs, base), std::invalid_argument);
  gs.back() = 1;
  REQUIRE_NOTHROW(TotalsLayout(hs, as, gs, base));
}

TEST_CASE("update after some groups change equals add_to afresh") {
  // The bulk path itself is checked against add_result above; here a record made by add_to and
  // then updated for two groups whose words changed must equal add_to on the new words.
  const std::vector<int> div{1, 1, 2, 2};
  const std::vector<int> conf{7, 7, 8, 8};
  const std::vector<LastGamesWindow> windows{{2, TiebreakScope::kLeague}};
  SeasonRecord base(div, conf, windows);
  base.add_result(0, 1, 3, 2);
  base.add_result(2, 3, 5, 1);
  // Six games in four groups: (0 at 1) x2, (2 at 0) x2, (3 at 1), (1 at 2).
  const std::vector<std::uint16_t> home{0, 2, 0, 3, 2, 1}, away{1, 0, 1, 1, 0, 2};
  const std::vector<std::uint32_t> group{0, 1, 0, 2, 1, 3};
  const TotalsLayout layout(home, away, group, base);
  SeasonTotals totals(layout);
  const SeasonTotals::Sink sink = totals.sink();
  const std::uint32_t runs[6][2] = {{4, 2}, {1, 3}, {2, 5}, {6, 0}, {3, 2}, {2, 7}};
  for (std::size_t g = 0; g < 6; ++g)
    sink.add(g, group[g], runs[g][0] > runs[g][1], runs[g][0], runs[g][1]);
  SeasonRecord updated = base;
  totals.add_to(updated);
  SeasonRecord settled = updated;  // windows of the old results
  // Groups 1 and 3 played again with other results.
  const std::vector<std::uint32_t> changed{1, 3};
  const std::vector<std::uint64_t> old_words{sink.word[1], sink.word[3]};
  sink.word[1] = 0;
  sink.word[3] = 0;
  sink.add(1, 1, 1, 8, 1);  // 2 beats 0
  sink.add(4, 1, 0, 0, 4);  // 0 beats 2
  sink.add(5, 3, 1, 9, 3);  // 1 beats 2
  totals.update(settled, changed, old_words);
  SeasonRecord fresh = base;
  totals.add_to(fresh);
  require_same(settled, fresh);
}
