#include "engine/swing.h"

#include <tbb/blocked_range.h>
#include <tbb/enumerable_thread_specific.h>
#include <tbb/global_control.h>
#include <tbb/parallel_for.h>

#include <algorithm>
#include <cmath>
#include <optional>
#include <stdexcept>
#include <string>

#include "engine/season_runner.h"
#include "engine/streams.h"
#include "engine/tally.h"

namespace standfast::engine {

namespace {

using detail::SeasonRunner;
using detail::Worker;

constexpr std::uint64_t GRAIN = 32;  // seasons per task (any value gives the same result)

// One thread's state. Counts per team are laid out over the chosen games, so a team's row is
// added in one pass over the season's results of those games.
struct SwingWorker {
  Worker worker;
  std::size_t games;
  std::vector<std::uint8_t> won;         // this season: 1 where the home side won chosen game k
  std::vector<std::uint64_t> home_wins;  // per chosen game
  std::vector<std::uint64_t> division, postseason;  // [team * games + k]: home won and chance

  SwingWorker(const Plan& plan, std::size_t k)
      : worker(plan),
        games(k),
        won(k),
        home_wins(k),
        division(static_cast<std::size_t>(plan.teams) * k),
        postseason(static_cast<std::size_t>(plan.teams) * k) {}

  void add_row(std::uint64_t* row) const {
    for (std::size_t k = 0; k < games; ++k) row[k] += won[k];
  }
};

ConditionalChance conditional(std::uint64_t both, std::uint64_t chance, std::uint64_t home,
                              std::uint64_t n) {
  ConditionalChance c;
  const std::uint64_t away = n - home;
  const double p1 = home ? static_cast<double>(both) / static_cast<double>(home) : 0.0;
  const double p0 = away ? static_cast<double>(chance - both) / static_cast<double>(away) : 0.0;
  c.if_home_wins = p1;
  c.if_away_wins = p0;
  c.swing = p1 - p0;
  const double v1 = home ? p1 * (1 - p1) / static_cast<double>(home) : 0.0;
  const double v0 = away ? p0 * (1 - p0) / static_cast<double>(away) : 0.0;
  c.se = std::sqrt(v1 + v0);
  return c;
}

}  // namespace

SwingResult simulate_swings(const Plan& plan, std::span<const std::uint32_t> games,
                            const RunOptions& options) {
  if (options.batch == 0) throw std::invalid_argument("simulate_swings: batch must be > 0");
  if (options.threads < 0)
    throw std::invalid_argument("simulate_swings: threads must be >= 0, got " +
                                std::to_string(options.threads));
  if (plan.teams < 2) throw std::invalid_argument("simulate_swings: the plan has no league");
  for (std::uint32_t g : games)
    if (g >= plan.remaining_games())
      throw std::invalid_argument("simulate_swings: game " + std::to_string(g) +
                                  " is not a remaining game");
  std::optional<tbb::global_control> control;
  if (options.threads > 0)
    control.emplace(tbb::global_control::max_allowed_parallelism,
                    static_cast<std::size_t>(options.threads));

  const SeasonRunner runner(plan, options.postseason);
  const std::size_t k = games.size();
  const auto teams = static_cast<std::size_t>(plan.teams);
  tbb::enumerable_thread_specific<SwingWorker> workers([&] { return SwingWorker(plan, k); });
  std::uint64_t done = 0;
  while (done < options.seasons) {
    const std::uint64_t end = std::min(options.seasons, done + options.batch);
    tbb::parallel_for(
        tbb::blocked_range<std::uint64_t>(done, end, GRAIN),
        [&](const tbb::blocked_range<std::uint64_t>& range) {
          SwingWorker& sw = workers.local();
          Worker& w = sw.worker;
          SeasonStreams streams(options.seed, range.begin());
          for (std::uint64_t s = range.begin(); s < range.end(); ++s) {
            runner.run(streams, w);
            streams.next();
            const std::uint8_t* home_won = w.totals.home_won();
            for (std::size_t i = 0; i < k; ++i) sw.won[i] = home_won[games[i]];
            sw.add_row(sw.home_wins.data());
            // Only the rows of teams that won the chance this season change.
            for (std::size_t t = 0; t < teams; ++t) {
              if (w.division_winner[t]) sw.add_row(sw.division.data() + t * k);
              if (w.seed_of[t] > 0) sw.add_row(sw.postseason.data() + t * k);
            }
          }
        },
        tbb::simple_partitioner());
    done = end;
    if (options.progress) options.progress(done, options.seasons);
  }

  SwingResult out;
  Tally total(plan.teams, static_cast<int>(plan.rounds.size()), plan.max_games,
              std::max(plan.max_seed, 1));
  std::vector<std::uint64_t> home_wins(k), division(teams * k), postseason(teams * k);
  for (const SwingWorker& sw : workers) {
    total.merge(sw.worker.tally);
    for (std::size_t i = 0; i < k; ++i) home_wins[i] += sw.home_wins[i];
    for (std::size_t i = 0; i < teams * k; ++i) {
      division[i] += sw.division[i];
      postseason[i] += sw.postseason[i];
    }
  }
  total.fill(out.odds);
  out.odds.seed = options.seed;
  for (const auto& r : plan.rounds) out.odds.round_names.push_back(r.name);
  const std::uint64_t n = out.odds.seasons;
  const auto count = [n](const Probability& p) {
    return static_cast<std::uint64_t>(std::llround(p.p * static_cast<double>(n)));
  };
  for (std::size_t i = 0; i < k; ++i) {
    GameSwing g;
    g.game = games[i];
    g.home_win_share = n ? static_cast<double>(home_wins[i]) / static_cast<double>(n) : 0.0;
    for (std::size_t t = 0; t < teams; ++t) {
      const TeamOdds& o = out.odds.teams[t];
      g.division.push_back(conditional(division[t * k + i], count(o.division), home_wins[i], n));
      g.postseason.push_back(
          conditional(postseason[t * k + i], count(o.postseason), home_wins[i], n));
    }
    out.games.push_back(std::move(g));
  }
  return out;
}

std::vector<std::uint32_t> games_of_team(const Plan& plan, int team) {
  std::vector<std::uint32_t> out;
  for (std::size_t g = 0; g < plan.remaining_games(); ++g)
    if (plan.home_team[g] == team || plan.away_team[g] == team)
      out.push_back(static_cast<std::uint32_t>(g));
  return out;
}

std::vector<std::uint32_t> games_of_days(const Plan& plan, config::DayNumber first, int days) {
  std::vector<std::uint32_t> out;
  const auto last = static_cast<std::int64_t>(first) + days;  // exclusive
  for (std::size_t g = 0; g < plan.remaining_games(); ++g) {
    const config::DayNumber d = plan.day[g];
    if (d >= first && static_cast<std::int64_t>(d) < last)
      out.push_back(static_cast<std::uint32_t>(g));
  }
  return out;
}

TeamStake for_team(const ConditionalChance& home_view, bool team_is_home) {
  TeamStake t;
  t.if_wins = team_is_home ? home_view.if_home_wins : home_view.if_away_wins;
  t.if_loses = team_is_home ? home_view.if_away_wins : home_view.if_home_wins;
  t.difference = t.if_wins - t.if_loses;
  t.se = home_view.se;
  return t;
}

SwingTotal total_swing(std::span<const ConditionalChance> teams) {
  SwingTotal t;
  double abs_sum = 0, se_sum = 0;
  for (const ConditionalChance& c : teams) {
    abs_sum += std::abs(c.swing);
    se_sum += c.se;
  }
  t.moved = abs_sum / 2;
  t.noise = std::sqrt(2.0 / std::acos(-1.0)) * se_sum / 2;
  return t;
}

}  // namespace standfast::engine
