// Tests for engine/shift_replay.h: a team's shifted season replayed from the baseline equals the
// season loop (engine/season_runner.h) run in full on a plan that carries the same shift as an
// added-runs override, season by season. The reference is the engine's own full season loop,
// an independent path through the code (it plays every game and settles everything afresh);
// the property is exact equality, so no tolerance applies.
#include "engine/shift_replay.h"

#include <catch2/catch.hpp>
#include <string>
#include <vector>

#include "config/load.h"
#include "engine/season_runner.h"
#include "models/ratings.h"
#include "tests/tiny_league.h"

using namespace standfast;
using namespace standfast::engine;

namespace {

// The season with one more override: `team` adds shift/2 runs scored and -shift/2 runs allowed
// over every remaining game.
config::Season with_shift(const config::Season& s, int team, double shift) {
  config::Season out = s;
  config::TeamOverride o;
  o.team = team;
  o.add_runs_scored = shift / 2;
  o.add_runs_allowed = -shift / 2;
  out.overrides.push_back(o);
  return out;
}

TeamOutcome outcome(const detail::Worker& w, int team) {
  const auto t = static_cast<std::size_t>(team);
  return TeamOutcome{w.division_winner[t] != 0, w.seed_of[t] > 0, w.is_bye[t] != 0,
                     w.champion == team, w.record.wins(team)};
}

// Every season of `seasons`, for each (team, shift): the replay equals the full season loop.
// `by_record`: some shifted seasons are decided by the team's record alone (conference brackets).
void check_equal(const config::Season& season, const std::vector<int>& teams,
                 const std::vector<double>& shifts, std::uint64_t seasons, bool by_record = false) {
  const models::LeagueRatings ratings = models::fit_ratings(season);
  const Plan plan = compile_plan(season, ratings);
  ShiftReplay replay(plan, true);
  const detail::SeasonRunner base_runner(plan, true);
  detail::Worker base_worker(plan);
  struct Alt {
    int team;
    double shift;
    Plan plan;
  };
  std::vector<Alt> alts;
  for (int t : teams)
    for (double d : shifts)
      alts.push_back(Alt{t, d, compile_plan(with_shift(season, t, d), ratings)});
  int differ = 0, moved = 0;
  for (std::uint64_t s = 0; s < seasons; ++s) {
    SeasonStreams streams(7, s);
    replay.baseline(streams);
    base_runner.run(streams, base_worker);
    for (int t : teams) CHECK(replay.baseline_outcome(t) == outcome(base_worker, t));
    for (const Alt& a : alts) {
      const detail::SeasonRunner runner(a.plan, true);
      detail::Worker w(a.plan);
      runner.run(streams, w);
      const TeamOutcome full = outcome(w, a.team);
      const TeamOutcome fast = replay.shifted(a.team, a.shift);
      differ += !(full == fast);
      moved += fast.wins != replay.baseline_outcome(a.team).wins;
    }
  }
  CHECK(differ == 0);
  CHECK(moved > 0);                                      // the shifts do change seasons
  if (by_record) CHECK(replay.decided_by_record() > 0);  // the short cut was taken
}

}  // namespace

TEST_CASE("a replayed shift equals the full season loop with an added-runs override") {
  const config::Season demo =
      config::load_season(STANDFAST_SOURCE_DIR "/scenarios/demo/season.yaml");
  check_equal(demo, {0, 5, 17, 22, 26, 31}, {-1.3, -0.25, 0.4, 2.0}, 15, true);
  // Without a postseason the record decides the division alone.
  config::Season regular = demo;
  regular.postseason.enabled = false;
  check_equal(regular, {3, 9}, {-0.5, 0.7}, 10, true);
}

TEST_CASE("the replay equals the season loop under the count families too") {
  config::Season small = config::load_season(STANDFAST_SOURCE_DIR "/scenarios/small/season.yaml");
  small.model.family = config::ScoreFamily::kPoisson;
  check_equal(small, {0, 1, 3}, {-0.8, 0.6}, 60);  // not PEB (2): it has a dated override
  small.model.family = config::ScoreFamily::kNegativeBinomial;
  check_equal(small, {0, 4}, {1.5}, 60);
}

TEST_CASE("the replay leaves the baseline as it was") {
  const config::Season s = testing::tiny_league();
  const Plan plan = compile_plan(s, testing::neutral_ratings(s));
  ShiftReplay replay(plan, true);
  for (std::uint64_t season = 0; season < 200; ++season) {
    replay.baseline(SeasonStreams(3, season));
    const TeamOutcome before = replay.baseline_outcome(1);
    CHECK(replay.shifted(1, 0.0) == before);  // log5: odds times exp(0)
    (void)replay.shifted(1, 2.5);
    (void)replay.shifted(2, -1.0);
    CHECK(replay.shifted(1, 0.0) == before);
  }
}

TEST_CASE("a plan with scenario edits is refused") {
  const config::Season s = testing::tiny_league();
  PlanEdits edits;
  edits.forced = {{8, true}};
  const Plan plan = compile_plan(s, testing::neutral_ratings(s), edits);
  CHECK_THROWS_AS(ShiftReplay(plan, true), std::invalid_argument);
}
