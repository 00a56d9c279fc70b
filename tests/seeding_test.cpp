// Tests for engine/seeding.h: divisions, conference seeds by the Qualifying rules, extra games.
// Reference: seeding division winners first, then at-large teams by record, and one extra game
// for a two-team tie for a division title or the last berth, are common practice of leagues;
// every expected seed list below is worked out by hand from the invented records in each test.
#include "engine/seeding.h"

#include <catch2/catch.hpp>
#include <utility>
#include <vector>

#include "engine/season_record.h"
#include "small_league.h"

using standfast::config::TiebreakKind;
using standfast::config::TiebreakRule;
using standfast::config::TiebreakScope;
using standfast::engine::ExtraGame;
using standfast::engine::make_record;
using standfast::engine::make_stream;
using standfast::engine::Purpose;
using standfast::engine::SeasonRecord;
using standfast::engine::Seeder;

namespace {

// Two qualifying conferences E (divisions E1: A B C, E2: D E F) and W (W1: G H I, W2: J K L),
// and a filler conference X with one team Z that is every test's opponent.
struct League {
  standfast::testing::SmallLeague lg;
  int A, B, C, D, E, F, G, H, I, J, K, L, Z;
  int conf_e, conf_w;
  League(int at_large = 2, bool winners_first = true) {
    conf_e = lg.conference("E");
    const int e1 = lg.division("E1", conf_e);
    const int e2 = lg.division("E2", conf_e);
    conf_w = lg.conference("W");
    const int w1 = lg.division("W1", conf_w);
    const int w2 = lg.division("W2", conf_w);
    const int x = lg.conference("X");
    A = lg.team("A", e1);
    B = lg.team("B", e1);
    C = lg.team("C", e1);
    D = lg.team("D", e2);
    E = lg.team("E", e2);
    F = lg.team("F", e2);
    G = lg.team("G", w1);
    H = lg.team("H", w1);
    I = lg.team("I", w1);
    J = lg.team("J", w2);
    K = lg.team("K", w2);
    L = lg.team("L", w2);
    Z = lg.team("Z", x);
    auto& ps = lg.season.postseason;
    ps.enabled = true;
    for (int c : {conf_e, conf_w}) {
      standfast::config::Qualifying q;
      q.conference = c;
      q.division_winners = 2;
      q.at_large = at_large;
      q.winners_first = winners_first;
      ps.qualifying.push_back(q);
    }
    lg.season.tiebreakers.order = {
        TiebreakRule{TiebreakKind::kRunDifferential, 0, TiebreakScope::kLeague, {}}};
  }
};

// Team t beats Z `wins` times and loses to Z `losses` times; each win by `margin` runs.
void set_record(SeasonRecord& r, int t, int z, int wins, int losses, int margin = 1) {
  for (int i = 0; i < wins; ++i) r.add_result(t, z, 1 + margin, 1);
  for (int i = 0; i < losses; ++i) r.add_result(z, t, 2, 1);
}

std::vector<int> seeds_of(const standfast::engine::LeagueRanking& r, int c) {
  const auto s = r.conference_seeds(c);
  return {s.begin(), s.end()};
}

struct Recorder {
  std::vector<std::pair<int, int>> calls;
  bool away_wins = true;
  static int play(void* ctx, int home, int away) {
    auto* self = static_cast<Recorder*>(ctx);
    self->calls.emplace_back(home, away);
    return self->away_wins ? away : home;
  }
};

// The season's ranking with this record, from tiebreak stream 0 of seed 0.
standfast::engine::LeagueRanking rank_once(const standfast::config::Season& season,
                                           const SeasonRecord& r, ExtraGame extra = {}) {
  const Seeder seeder(season);
  auto out = seeder.make_ranking();
  auto scratch = seeder.make_scratch();
  auto rng = make_stream(0, 0, Purpose::kTiebreak);
  seeder.rank(r, rng, scratch, out, extra);
  return out;
}

}  // namespace

TEST_CASE("division winners first, then at-large teams by record") {
  League L;
  auto r = make_record(L.lg.season);
  // E1: A 8-2, B 6-4, C 2-8. E2: D 5-5, E 7-3, F 1-9.
  set_record(r, L.A, L.Z, 8, 2);
  set_record(r, L.B, L.Z, 6, 4);
  set_record(r, L.C, L.Z, 2, 8);
  set_record(r, L.D, L.Z, 5, 5);
  set_record(r, L.E, L.Z, 7, 3);
  set_record(r, L.F, L.Z, 1, 9);
  const auto out = rank_once(L.lg.season, r);
  REQUIRE(out.division(0).size() == 3);
  REQUIRE(out.division_winner(0) == L.A);
  REQUIRE(out.division_winner(1) == L.E);
  REQUIRE(std::vector<int>(out.division(1).begin(), out.division(1).end()) ==
          std::vector<int>{L.E, L.D, L.F});
  // Seeds: A (.800), E (.700) as division winners; at-large B (.600), D (.500).
  REQUIRE(seeds_of(out, 0) == std::vector<int>{L.A, L.E, L.B, L.D});
  REQUIRE(out.qualifying_winners[0] == 2);
  REQUIRE(out.conference_seeds(1).size() == 4);
  REQUIRE(out.conference_seeds(2).empty());  // X has no qualifying rules
  REQUIRE(out.league.size() == 13);
  // League: A (.800) first; Z is 31-29 (.517) from the games above.
  REQUIRE(out.league.front() == L.A);
  REQUIRE(out.extra_games == 0);
}

TEST_CASE("without winners_first every qualifier is seeded by record") {
  League L(2, false);
  auto r = make_record(L.lg.season);
  // A 9-1, B 8-2 (at-large, better than winner E), E 6-4, D 5-5.
  set_record(r, L.A, L.Z, 9, 1);
  set_record(r, L.B, L.Z, 8, 2);
  set_record(r, L.C, L.Z, 2, 8);
  set_record(r, L.D, L.Z, 5, 5);
  set_record(r, L.E, L.Z, 6, 4);
  set_record(r, L.F, L.Z, 1, 9);
  const auto out = rank_once(L.lg.season, r);
  REQUIRE(seeds_of(out, 0) == std::vector<int>{L.A, L.B, L.E, L.D});
}

TEST_CASE("a two-team tie for a division title goes to an extra game when the season says so") {
  League L;
  L.lg.season.tiebreakers.extra_game = true;
  auto r = make_record(L.lg.season);
  // A and B both 8-2; A has the better run differential, so the procedure ranks A first and A
  // is at home. The hook lets the visitor (B) win: B takes the division, A goes to the pool.
  set_record(r, L.A, L.Z, 8, 2, 5);
  set_record(r, L.B, L.Z, 8, 2, 1);
  set_record(r, L.C, L.Z, 2, 8);
  set_record(r, L.D, L.Z, 5, 5);
  set_record(r, L.E, L.Z, 7, 3);
  set_record(r, L.F, L.Z, 1, 9);
  Recorder rec;
  const auto out = rank_once(L.lg.season, r, ExtraGame{&rec, &Recorder::play});
  REQUIRE(rec.calls.size() == 1);
  REQUIRE(rec.calls[0] == std::pair<int, int>{L.A, L.B});
  REQUIRE(out.division_winner(0) == L.B);
  REQUIRE(out.extra_games == 1);
  // Winners B (.800), E (.700); at-large A (.800), D (.500).
  REQUIRE(seeds_of(out, 0) == std::vector<int>{L.B, L.E, L.A, L.D});

  // Without a hook the procedure decides: A (better run differential).
  const auto decided = rank_once(L.lg.season, r);
  REQUIRE(decided.division_winner(0) == L.A);
  REQUIRE(decided.extra_games == 0);
}

TEST_CASE("a two-team tie for the last at-large berth goes to an extra game; three do not") {
  League L;
  L.lg.season.tiebreakers.extra_game = true;
  auto r = make_record(L.lg.season);
  // Winners A (8-2) and E (7-3). Pool: B 6-4, then C and D both 5-5 for the second (last)
  // at-large berth; F 1-9. D has the better run differential: D is at home, and C wins.
  set_record(r, L.A, L.Z, 8, 2);
  set_record(r, L.B, L.Z, 6, 4);
  set_record(r, L.C, L.Z, 5, 5, 1);
  set_record(r, L.D, L.Z, 5, 5, 3);
  set_record(r, L.E, L.Z, 7, 3);
  set_record(r, L.F, L.Z, 1, 9);
  Recorder rec;
  const auto out = rank_once(L.lg.season, r, ExtraGame{&rec, &Recorder::play});
  REQUIRE(rec.calls == std::vector<std::pair<int, int>>{{L.D, L.C}});
  REQUIRE(seeds_of(out, 0) == std::vector<int>{L.A, L.E, L.B, L.C});

  // F also 5-5: three teams tie for one berth, so the rules decide and no game is played.
  // Run differential: C 5x1 - 5 = 0, D 5x3 - 5 = 10, F 5x2 - 5 = 5: D takes the berth.
  League L3;
  L3.lg.season.tiebreakers.extra_game = true;
  auto r3 = make_record(L3.lg.season);
  set_record(r3, L3.A, L3.Z, 8, 2);
  set_record(r3, L3.B, L3.Z, 6, 4);
  set_record(r3, L3.C, L3.Z, 5, 5, 1);
  set_record(r3, L3.D, L3.Z, 5, 5, 3);
  set_record(r3, L3.E, L3.Z, 7, 3);
  set_record(r3, L3.F, L3.Z, 5, 5, 2);
  Recorder rec3;
  const auto out3 = rank_once(L3.lg.season, r3, ExtraGame{&rec3, &Recorder::play});
  REQUIRE(rec3.calls.empty());
  REQUIRE(seeds_of(out3, 0) == std::vector<int>{L3.A, L3.E, L3.B, L3.D});
}

TEST_CASE("single bracket: every conference's division winners, then the at-large teams") {
  League L(1);
  L.lg.season.postseason.format = standfast::config::BracketFormat::kSingleBracket;
  auto r = make_record(L.lg.season);
  // E: A 8-2, E 7-3 win; at-large B 6-4. W: G 9-1, K 4-6 win (J 3-7, L 2-8); at-large H 7-3.
  set_record(r, L.A, L.Z, 8, 2);
  set_record(r, L.B, L.Z, 6, 4);
  set_record(r, L.E, L.Z, 7, 3);
  set_record(r, L.G, L.Z, 9, 1);
  set_record(r, L.H, L.Z, 7, 3);
  set_record(r, L.K, L.Z, 4, 6);
  set_record(r, L.J, L.Z, 3, 7);
  set_record(r, L.L, L.Z, 2, 8);
  const auto out = rank_once(L.lg.season, r);
  REQUIRE(seeds_of(out, 1) == std::vector<int>{L.G, L.K, L.H});
  // Winners G (.900), A (.800), E (.700), K (.400); then at-large H (.700), B (.600).
  REQUIRE(out.league_seeds == std::vector<int>{L.G, L.A, L.E, L.K, L.H, L.B});
}

TEST_CASE("the same record and stream give the same ranking") {
  League L;
  auto r = make_record(L.lg.season);
  L.lg.season.tiebreakers.order.clear();  // only the draw: every tie is random
  for (int t = 0; t < 12; ++t) set_record(r, t, L.Z, t % 3, 2);
  const Seeder seeder(L.lg.season);
  auto a = seeder.make_ranking();
  auto b = seeder.make_ranking();
  auto scratch = seeder.make_scratch();
  for (std::uint64_t s = 0; s < 20; ++s) {
    auto r1 = make_stream(3, s, Purpose::kTiebreak);
    auto r2 = make_stream(3, s, Purpose::kTiebreak);
    seeder.rank(r, r1, scratch, a);
    seeder.rank(r, r2, scratch, b);
    REQUIRE(a.league == b.league);
    REQUIRE(a.division_teams == b.division_teams);
    REQUIRE(a.seeds == b.seeds);
  }
}
