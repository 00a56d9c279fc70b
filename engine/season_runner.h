// One simulated season, step by step: the season's true strengths, the remaining games, the
// standings and tiebreakers, the postseason and the tally. SeasonRunner plays a season of a
// Plan into a Worker (per-thread scratch space and integer tallies, no random state); the
// parallel run (engine/simulate.h), the paired comparison of plans (engine/compare.h) and the
// replay of one team's shifted season (engine/shift_replay.h) drive it. After run(), the
// Worker holds the season's outcome (record, seeds, division winners, byes, rounds reached,
// champion) until the next run.
#ifndef STANDFAST_ENGINE_SEASON_RUNNER_H
#define STANDFAST_ENGINE_SEASON_RUNNER_H

#include <algorithm>
#include <cmath>
#include <cstdint>
#include <optional>
#include <span>
#include <vector>

#include "engine/game.h"
#include "engine/plan.h"
#include "engine/postseason.h"
#include "engine/season_record.h"
#include "engine/season_totals.h"
#include "engine/seeding.h"
#include "engine/streams.h"
#include "engine/tally.h"

namespace standfast::engine::detail {

// Regulation scores of at most max_regulation_runs() leave room for the extra innings' runs
// in a game's tally (at most TotalsLayout::MAX_RUNS per side).
static_assert(GameEngine::max_regulation_runs() <= TotalsLayout::MAX_RUNS / 2);

// Per-thread working space and tallies. Holds no random state.
struct Worker {
  std::vector<double> off, def, odds;   // per slot: league mean x offence, defence, log5 odds
  std::vector<double> z, x, work;       // normal draws, correlated log deviations, scratch
  std::vector<Sides> matchup;           // per matchup of the plan, for the season's strengths
  std::vector<std::uint32_t> ties;      // remaining games tied after regulation (this season)
  std::vector<std::uint32_t> tie_open;  // scratch of ExtraInnings::play_all
  std::vector<ExtraInnings::Outcome> tie_outcome;  // per tie: its extra innings
  SeasonTotals totals;
  SeasonRecord record;
  LeagueRanking ranking;
  TiebreakScratch scratch;
  BracketScratch bracket;
  std::vector<int> seed_of, reached, is_bye;
  std::vector<unsigned char> division_winner;
  std::vector<int> champions;
  std::vector<double> champion_key;
  int champion = -1;  // the season's title winner (-1 without a postseason)
  Tally tally;

  explicit Worker(const Plan& plan)
      : off(static_cast<std::size_t>(plan.slots)),
        def(static_cast<std::size_t>(plan.slots)),
        odds(static_cast<std::size_t>(plan.slots)),
        z(plan.strengths.normals()),
        x(2 * static_cast<std::size_t>(plan.teams)),
        work(plan.strengths.work_size()),
        matchup(plan.matchups.size()),
        ties(plan.remaining_games()),
        tie_open(plan.remaining_games()),
        tie_outcome(plan.remaining_games()),
        totals(plan.totals),
        record(plan.played),
        ranking(plan.seeder.make_ranking()),
        scratch(plan.seeder.make_scratch()),
        seed_of(static_cast<std::size_t>(plan.teams)),
        reached(static_cast<std::size_t>(plan.teams)),
        is_bye(static_cast<std::size_t>(plan.teams)),
        division_winner(static_cast<std::size_t>(plan.teams)),
        tally(plan.teams, static_cast<int>(plan.rounds.size()), plan.max_games,
              std::max(plan.max_seed, 1)) {
    champions.reserve(plan.brackets.size());
    champion_key.reserve(plan.brackets.size());
    bracket.current.reserve(64);
    bracket.next.reserve(64);
  }
};

class SeasonRunner {
 public:
  SeasonRunner(const Plan& plan, bool postseason)
      : plan_(plan), games_(plan), postseason_(postseason && plan.postseason) {
    home_odds_factor_ = std::pow(plan.home_edge, plan.shape);
  }

  void run(SeasonStreams& streams, Worker& w) const {
    draw(streams, w);
    play(streams, w);
    settle(streams, w);
  }

  // The steps of run(), public for engines that replay part of a season on the same streams
  // (engine/shift_replay.h).
  //
  // The season's true strengths, into w.off, w.def and w.odds (every slot).
  void draw(const SeasonStreams& streams, Worker& w) const {
    Rng strengths = streams.stream(Purpose::kStrengths);
    draw_strengths(strengths, w, /*point=*/false);
  }
  // The point estimates (no draw from the fitted uncertainty), with the overrides applied.
  void draw_point_estimates(Worker& w) const {
    Rng unused = make_stream(0, 0, Purpose::kStrengths);
    draw_strengths(unused, w, /*point=*/true);
  }
  // The regular season: every remaining game, into w.totals and w.record.
  void play(const SeasonStreams& streams, Worker& w) const {
    w.record = plan_.played;  // same size: copies without allocating
    Rng games = streams.stream(Purpose::kGames);
    switch (plan_.model) {
      case GameModel::kWeibull:
        play_regular<GameModel::kWeibull>(games, w);
        break;
      case GameModel::kNegativeBinomial:
        play_regular<GameModel::kNegativeBinomial>(games, w);
        break;
      case GameModel::kPoisson:
        play_regular<GameModel::kPoisson>(games, w);
        break;
      case GameModel::kLog5:
        play_regular<GameModel::kLog5>(games, w);
        break;
    }
  }
  // Standings, tiebreakers, seeds and the postseason from w.record; adds every team's season
  // to w.tally when `add_tally`. With `focus` >= 0 the postseason is played only when that team
  // has a berth (otherwise no team is champion): for engines that read one team's outcome.
  void settle(const SeasonStreams& streams, Worker& w, bool add_tally = true,
              int focus = -1) const {
    Rng tiebreak = streams.stream(Purpose::kTiebreak);
    HookContext tie_ctx{this, &w, &tiebreak};
    plan_.seeder.rank(w.record, tiebreak, w.scratch, w.ranking, ExtraGame{&tie_ctx, &hook_play});
    tally(streams, w, add_tally, focus);
  }

  const GameEngine& games() const { return games_; }
  // The parameters of matchup i of the plan from the season's values in w (w.off, w.def,
  // w.odds), as the season loop computes them.
  Sides matchup_sides(const Worker& w, std::size_t i) const {
    const Matchup& m = plan_.matchups[i];
    return games_.sides(
        w.off[m.home_slot] * w.def[m.away_slot] * static_cast<double>(m.home_factor),
        w.off[m.away_slot] * w.def[m.home_slot] * static_cast<double>(m.away_factor),
        w.odds[m.home_slot] * home_odds_factor_, w.odds[m.away_slot]);
  }
  double home_odds_factor() const { return home_odds_factor_; }

 private:
  struct HookContext {
    const SeasonRunner* runner;
    Worker* worker;
    Rng* rng;
  };

  static int hook_play(void* context, int home, int away) {
    auto* c = static_cast<HookContext*>(context);
    return c->runner->play_one(*c->rng, *c->worker, home, away);
  }

  // A game outside the regular schedule (extra tiebreak game or postseason) at home's venue,
  // with both teams' end-of-season parameters; played to a decision.
  int play_one(Rng& rng, const Worker& w, int home, int away) const {
    const auto hs = plan_.final_slot[static_cast<std::size_t>(home)];
    const auto as = plan_.final_slot[static_cast<std::size_t>(away)];
    const double rf = plan_.run_factor[static_cast<std::size_t>(home)];
    const Sides sides =
        games_.sides(w.off[hs] * w.def[as] * rf * plan_.home_edge, w.off[as] * w.def[hs] * rf,
                     w.odds[hs] * home_odds_factor_, w.odds[as]);
    return games_.play(rng, sides, /*cap=*/false).home_won ? home : away;
  }

  void draw_strengths(Rng& rng, Worker& w, bool point) const {
    const auto n = static_cast<std::size_t>(plan_.teams);
    if (plan_.draw_strengths && !point) {
      standard_normals(rng, w.z.data(), w.z.size());
      plan_.strengths.draw(w.z.data(), w.work.data(), w.x.data());
    } else {
      std::fill(w.x.begin(), w.x.end(), 0.0);
    }
    for (std::size_t t = 0; t < n; ++t) {
      const double off = std::exp(plan_.log_offence[t] + w.x[t]);
      const double def = std::exp(plan_.log_defence[t] + w.x[n + t]);
      w.off[t] = plan_.league_mean * off;
      w.def[t] = def;
      const double p = plan_.win_pct[t];
      w.odds[t] = p / (1.0 - p);
    }
    // Override periods: each step replaces (or blends) values, keeping the season's deviation
    // of the fitted strength, then adds runs. A period starts from the team's drawn values.
    const double lm = plan_.league_mean;
    constexpr double MIN_RATE = 0.01;  // runs per game / league mean: a floor for added runs
    for (std::size_t k = 0; k < plan_.overrides.size(); ++k) {
      const SlotOverride& period = plan_.overrides[k];
      const std::size_t t = period.team;
      double off = w.off[t] / lm, def = w.def[t];
      double p = plan_.win_pct[t];
      const double xo = w.x[t], xd = w.x[n + t];
      for (const OverrideStep& o : period.steps) {
        const double b = o.blend;
        if (o.has_win_pct) {
          // Runs whose Pythagorean share (exponent = shape) is the win percentage, around the
          // league mean: (L off + 1/2) / (L def + 1/2) = (w / (1 - w))^(1/shape).
          const double wp = std::clamp(o.win_pct, 1e-6, 1.0 - 1e-6);
          const double q = std::sqrt(std::pow(wp / (1.0 - wp), 1.0 / plan_.shape));
          const double o_runs = (lm + 0.5) * q - 0.5, d_runs = (lm + 0.5) / q - 0.5;
          off = (1 - b) * off + b * std::max(o_runs, 0.01) / lm * std::exp(xo);
          def = (1 - b) * def + b * std::max(d_runs, 0.01) / lm * std::exp(xd);
          p = (1 - b) * p + b * wp;
        }
        if (o.has_runs_scored) off = (1 - b) * off + b * o.offence * std::exp(o.offence_scale * xo);
        if (o.has_runs_allowed)
          def = (1 - b) * def + b * o.defence * std::exp(o.defence_scale * xd);
        off = std::max(off + o.add_offence, MIN_RATE);
        def = std::max(def + o.add_defence, MIN_RATE);
      }
      w.off[n + k] = lm * off;
      w.def[n + k] = def;
      p = std::clamp(p, 1e-9, 1.0 - 1e-9);
      w.odds[n + k] = p / (1.0 - p);
    }
  }

  // The season's parameters of every matchup (what the per-game loop would otherwise compute
  // once per game).
  template <GameModel M>
  void prepare_matchups(Worker& w) const {
    const double* off = w.off.data();
    const double* def = w.def.data();
    const double* odds = w.odds.data();
    for (std::size_t i = 0; i < plan_.matchups.size(); ++i) {
      const Matchup& m = plan_.matchups[i];
      games_.set_sides<M>(w.matchup[i],
                          off[m.home_slot] * def[m.away_slot] * static_cast<double>(m.home_factor),
                          off[m.away_slot] * def[m.home_slot] * static_cast<double>(m.away_factor),
                          odds[m.home_slot] * home_odds_factor_, odds[m.away_slot]);
    }
  }

  template <GameModel M>
  void play_regular(Rng& stream, Worker& w) const {
    prepare_matchups<M>(w);
    // The loop draws from a local copy whose address is never taken, so its state stays in
    // registers: the stream itself lives in memory, and every store of the loop could alias it,
    // which would put a store-to-load round trip on the chain from one draw to the next.
    Rng rng = stream;
    const std::size_t count = plan_.remaining_games();
    const std::uint32_t* game_matchup = plan_.game_matchup.data();
    const Sides* params = w.matchup.data();
    const WeibullTable& weibull = games_.weibull();
    const CountTable& counts = games_.counts();
    const ExtraInnings& extra_innings = games_.extra_innings();
    w.totals.clear();
    const SeasonTotals::Sink totals = w.totals.sink();
    // Regulation first, without a branch: a tied game is tallied as a home loss at the tied score
    // and its index noted; the ties then go to extra innings in a second pass (drawing on, in
    // order, from the same stream), which adds the home win, if any, and the extra runs.
    std::uint32_t* ties = w.ties.data();
    std::size_t tied = 0;
    for (std::size_t g = 0; g < count; ++g) {
      const std::uint32_t m = game_matchup[g];
      const Sides& p = params[m];
      std::uint32_t home_won, hr = 0, ar = 0;
      if constexpr (M == GameModel::kLog5) {
        home_won = uniform01(rng) < p.home;
      } else {
        int h, a;
        if constexpr (M == GameModel::kWeibull) {
          const WeibullTable::Pair score = weibull.score_pair(rng(), &p.home);
          h = score.home;
          a = score.away;
        } else {
          h = counts.score(rng(), p.home);
          a = counts.score(rng(), p.away);
        }
        home_won = h > a;
        hr = static_cast<std::uint32_t>(h);
        ar = static_cast<std::uint32_t>(a);
        ties[tied] = static_cast<std::uint32_t>(g);
        tied += h == a;
      }
      totals.add(g, m, home_won, hr, ar);
    }
    // Then extra innings for all the tied games together (ExtraInnings::play_all_with). One
    // draw of the stream keys them; each game's innings take their bits from that key and the
    // game's index (keyed_bits), so a game's extra innings do not depend on which other games
    // were tied (common random numbers across scenarios, engine/compare.h).
    stream = rng;
    const std::uint64_t key = stream();
    ExtraInnings::Outcome* outcome = w.tie_outcome.data();
    const std::uint64_t drawn = extra_innings.play_all_with(
        [key, ties](std::uint32_t i, int number) {
          return keyed_bits(key, ties[i], static_cast<std::uint64_t>(number));
        },
        tied, [&](std::size_t i) -> const Sides& { return params[game_matchup[ties[i]]]; },
        w.tie_open.data(), outcome, /*cap_innings=*/true);
    constexpr std::uint32_t room = TotalsLayout::MAX_RUNS - TotalsLayout::MAX_RUNS / 2;
    for (std::size_t i = 0; i < tied; ++i) {
      const std::uint32_t g = ties[i];
      totals.add_extra(g, game_matchup[g], outcome[i].home_won,
                       std::min(outcome[i].home_runs, room), std::min(outcome[i].away_runs, room));
    }
    const std::uint64_t extra = tied;
    // Games a scenario decides (engine/plan.h, PlanEdits): played and drawn like the others,
    // then given the stated result.
    for (const ForcedGame& f : plan_.forced) w.totals.force(f.game, f.matchup, f.home_won);
    w.totals.add_to(w.record);
    w.tally.add_games(count, extra, drawn);
  }

  void tally(const SeasonStreams& streams, Worker& w, bool add_tally, int focus) const {
    const auto n = static_cast<std::size_t>(plan_.teams);
    std::fill(w.seed_of.begin(), w.seed_of.end(), 0);
    std::fill(w.reached.begin(), w.reached.end(), -1);
    std::fill(w.is_bye.begin(), w.is_bye.end(), 0);
    std::fill(w.division_winner.begin(), w.division_winner.end(), 0);
    for (std::size_t d = 0; d < plan_.divisions.size(); ++d)
      w.division_winner[static_cast<std::size_t>(w.ranking.division_winner(static_cast<int>(d)))] =
          1;
    int& champion = w.champion;
    champion = -1;
    if (plan_.postseason) {
      std::optional<Rng> post;
      if (postseason_) post.emplace(streams.stream(Purpose::kPostseason));
      HookContext ctx{this, &w, post ? &*post : nullptr};
      const ExtraGame game{&ctx, &hook_play};
      auto seeds_of = [&](const PlanBracket& b) {
        return b.conference_position < 0 ? std::span<const int>(w.ranking.league_seeds)
                                         : w.ranking.conference_seeds(b.conference_position);
      };
      for (const PlanBracket& b : plan_.brackets) {
        const std::span<const int> seeds = seeds_of(b);
        for (std::size_t s = 0; s < seeds.size(); ++s) {
          const auto t = static_cast<std::size_t>(seeds[s]);
          w.seed_of[t] = static_cast<int>(s) + 1;
          w.is_bye[t] = static_cast<int>(s) < b.byes;
        }
      }
      const bool play_post =
          postseason_ && (focus < 0 || w.seed_of[static_cast<std::size_t>(focus)] > 0);
      w.champions.clear();
      if (play_post)
        for (const PlanBracket& b : plan_.brackets)
          w.champions.push_back(
              play_bracket(b, plan_.rounds, plan_.reseed, seeds_of(b), game, w.reached, w.bracket));
      if (play_post) {
        if (plan_.final_stage) {
          // Conference winners seeded by record; equal records by a random draw.
          w.champion_key.clear();
          for (int c : w.champions) {
            (void)c;
            w.champion_key.push_back(uniform01(*post));
          }
          auto better = [&](std::size_t i, std::size_t j) {
            const int a = w.champions[i], b = w.champions[j];
            const int cmp = compare_pct(w.record.wins(a), w.record.losses(a), w.record.wins(b),
                                        w.record.losses(b));
            if (cmp != 0) return cmp > 0;
            return w.champion_key[i] < w.champion_key[j];
          };
          // Insertion sort of indexes (few conferences), then the final stage.
          const std::size_t k = w.champions.size();
          int idx[64];
          for (std::size_t i = 0; i < k && i < 64; ++i) idx[i] = static_cast<int>(i);
          for (std::size_t i = 1; i < k && i < 64; ++i)
            for (std::size_t j = i; j > 0 && better(static_cast<std::size_t>(idx[j]),
                                                    static_cast<std::size_t>(idx[j - 1]));
                 --j)
              std::swap(idx[j], idx[j - 1]);
          int seeded[64];
          for (std::size_t i = 0; i < k && i < 64; ++i)
            seeded[i] = w.champions[static_cast<std::size_t>(idx[i])];
          champion = play_bracket(plan_.final_bracket, plan_.rounds, plan_.reseed,
                                  std::span<const int>(seeded, std::min<std::size_t>(k, 64)), game,
                                  w.reached, w.bracket);
        } else if (!w.champions.empty()) {
          champion = w.champions.front();
        }
      }
    }
    if (!add_tally) return;
    for (std::size_t t = 0; t < n; ++t) {
      const int ti = static_cast<int>(t);
      w.tally.add_team(ti, w.record.wins(ti), w.record.losses(ti), w.seed_of[t],
                       w.division_winner[t] != 0, w.is_bye[t] != 0, w.reached[t], ti == champion);
    }
    w.tally.add_season();
  }

  const Plan& plan_;
  GameEngine games_;
  bool postseason_;
  double home_odds_factor_ = 1.0;
};

}  // namespace standfast::engine::detail

#endif  // STANDFAST_ENGINE_SEASON_RUNNER_H
