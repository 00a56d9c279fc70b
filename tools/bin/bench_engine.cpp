// Benchmark of the full simulation engine against a floor loop, in one run.
//
//   bench_engine [--season FILE] [--seasons N] [--seed S] [--full]
//
// Loads the season (default scenarios/demo/season.yaml: the invented 32-team demo league at
// midseason), fits the ratings, compiles the plan and prints:
//   - the full engine (strength draws, every remaining game with extra innings, standings,
//     tiebreakers, seeding, the postseason bracket, tallies) on 1 and on 2 threads: seasons per
//     second and regular-season games per second, and the 1 -> 2 thread speed-up;
//   - a floor loop over the same seasons and games: a PCG32 stream per season keyed like the
//     engine's games stream, two 32-bit draws per game, the winner tallied into a per-thread
//     per-team counter, in the same parallel batches; its seasons and games per second, and the
//     ratio engine / floor;
//   - the score sampler alone (Weibull model): nanoseconds per game for a 64-bit draw, and for
//     the draw turned into both scores;
//   - peak memory (getrusage ru_maxrss) after the N-season runs and, with --full, after a
//     1,000,000-season run on 2 threads whose wall time is set against the 10 s target.
// Figures depend on the machine and its load: the load average is printed alongside.
// This is a benchmark program, not a test: nothing here passes or fails.
#include <fmt/core.h>
#include <sys/resource.h>
#include <tbb/blocked_range.h>
#include <tbb/enumerable_thread_specific.h>
#include <tbb/global_control.h>
#include <tbb/parallel_for.h>

#include <CLI/CLI.hpp>
#include <algorithm>
#include <chrono>
#include <cmath>
#include <cstdint>
#include <exception>
#include <fstream>
#include <optional>
#include <string>
#include <thread>
#include <vector>

#include "config/load.h"
#include "engine/game.h"
#include "engine/plan.h"
#include "engine/rng.h"
#include "engine/simulate.h"
#include "models/ratings.h"
#include "tools/output.h"

namespace {

using namespace standfast;
using Clock = std::chrono::steady_clock;

constexpr std::uint64_t FULL_SEASONS = 1'000'000;
constexpr double FULL_TARGET_S = 10.0;
constexpr std::uint64_t GRAIN = 32;  // seasons per parallel task, as in the engine
constexpr std::uint64_t BATCH = 10000;

double seconds_since(Clock::time_point start) {
  return std::chrono::duration<double>(Clock::now() - start).count();
}

double peak_mib() {
  rusage usage{};
  ::getrusage(RUSAGE_SELF, &usage);
  return static_cast<double>(usage.ru_maxrss) / 1024.0;  // ru_maxrss is in KiB on Linux
}

// User plus system CPU time of the whole process so far, in seconds.
double cpu_seconds() {
  rusage usage{};
  ::getrusage(RUSAGE_SELF, &usage);
  return static_cast<double>(usage.ru_utime.tv_sec + usage.ru_stime.tv_sec) +
         1e-6 * static_cast<double>(usage.ru_utime.tv_usec + usage.ru_stime.tv_usec);
}

std::string load_average() {
  std::ifstream in("/proc/loadavg");
  std::string a, b, c;
  in >> a >> b >> c;
  return in ? fmt::format("{} {} {}", a, b, c) : "unknown";
}

struct Timing {
  double wall = 0;
  double cpu = 0;  // CPU seconds of all threads
  std::uint64_t seasons = 0, games = 0;
  std::uint64_t checksum = 0;  // keeps the floor loop's work observable
  double seasons_per_s() const { return static_cast<double>(seasons) / wall; }
  double games_per_s() const { return static_cast<double>(games) / wall; }
};

Timing time_engine(const engine::Plan& plan, std::uint64_t seasons, std::uint64_t seed,
                   int threads) {
  engine::RunOptions options;
  options.seed = seed;
  options.seasons = seasons;
  options.threads = threads;
  const double cpu0 = cpu_seconds();
  const auto start = Clock::now();
  const engine::SimulationResult result = engine::simulate(plan, options);
  Timing t;
  t.wall = seconds_since(start);
  t.cpu = cpu_seconds() - cpu0;
  t.seasons = result.seasons;
  t.games = result.games_simulated;
  return t;
}

// The floor: what any simulator of these games must at least do per season and game.
Timing time_floor(const engine::Plan& plan, std::uint64_t seasons, std::uint64_t seed,
                  int threads) {
  const tbb::global_control control(tbb::global_control::max_allowed_parallelism,
                                    static_cast<std::size_t>(threads));
  const std::size_t n_games = plan.remaining_games();
  const std::uint16_t* home = plan.home_team.data();
  const std::uint16_t* away = plan.away_team.data();
  tbb::enumerable_thread_specific<std::vector<std::uint64_t>> tallies(
      [&] { return std::vector<std::uint64_t>(static_cast<std::size_t>(plan.teams), 0); });
  const double cpu0 = cpu_seconds();
  const auto start = Clock::now();
  for (std::uint64_t done = 0; done < seasons;) {
    const std::uint64_t end = std::min(seasons, done + BATCH);
    tbb::parallel_for(
        tbb::blocked_range<std::uint64_t>(done, end, GRAIN),
        [&](const tbb::blocked_range<std::uint64_t>& range) {
          std::vector<std::uint64_t>& wins = tallies.local();
          for (std::uint64_t s = range.begin(); s < range.end(); ++s) {
            const pcg_extras::pcg128_t key =
                engine::stream_state(seed, s * engine::kPurposeCount +
                                               static_cast<std::uint64_t>(engine::Purpose::kGames));
            pcg32 rng(static_cast<std::uint64_t>(key), static_cast<std::uint64_t>(key >> 64));
            for (std::size_t g = 0; g < n_games; ++g) {
              const std::uint32_t a = rng();
              const std::uint32_t b = rng();
              ++wins[a > b ? home[g] : away[g]];
            }
          }
        },
        tbb::simple_partitioner());
    done = end;
  }
  Timing t;
  t.wall = seconds_since(start);
  t.cpu = cpu_seconds() - cpu0;
  t.seasons = seasons;
  t.games = seasons * n_games;
  for (const auto& wins : tallies) {
    for (std::uint64_t w : wins) t.checksum += w;
  }
  return t;
}

// The score sampler alone: nanoseconds per game for one 64-bit draw, and for the draw turned
// into both scores of a game (WeibullTable::score_pair at the league-mean scale), each over
// `games` games on one thread. The difference is the sampler's own cost.
struct SamplerTiming {
  double draw_ns = 0, scores_ns = 0;
  std::uint64_t checksum = 0;
};

SamplerTiming time_sampler(const engine::Plan& plan, std::uint64_t games, std::uint64_t seed) {
  SamplerTiming t;
  if (plan.model != engine::GameModel::kWeibull) return t;
  const engine::GameEngine engine(plan);
  const engine::Sides sides = engine.sides(plan.league_mean * plan.home_edge, plan.league_mean);
  engine::Rng rng = engine::make_stream(seed, 0, engine::Purpose::kGames);
  std::uint64_t sum = 0;
  auto start = Clock::now();
  for (std::uint64_t g = 0; g < games; ++g) sum += rng() >> 60;
  t.draw_ns = seconds_since(start) * 1e9 / static_cast<double>(games);
  start = Clock::now();
  for (std::uint64_t g = 0; g < games; ++g) {
    const engine::WeibullTable::Pair p = engine.weibull().score_pair(rng(), &sides.home);
    sum += static_cast<std::uint64_t>(p.home - p.away + 64);
  }
  t.scores_ns = seconds_since(start) * 1e9 / static_cast<double>(games);
  t.checksum = sum;
  return t;
}

// A rate or count, rounded, with grouped digits.
std::string with_commas(double x) { return tools::group_digits(std::llround(x)); }

void print_row(const std::string& what, int threads, const Timing& t) {
  fmt::print("{:<12} {:>7} {:>10} {:>8.3f} {:>8.3f} {:>11} {:>13} {:>17}\n", what, threads,
             with_commas(static_cast<double>(t.seasons)), t.wall, t.cpu,
             with_commas(t.seasons_per_s()), with_commas(t.games_per_s()),
             with_commas(static_cast<double>(t.games) / t.cpu));
}

int run(int argc, char** argv) {
  std::string season_file = "scenarios/demo/season.yaml";
  std::uint64_t seasons = 100000;
  std::uint64_t seed = 20260101;
  bool full = false;
  CLI::App app{"Benchmark of the simulation engine against a floor loop"};
  app.add_option("--season", season_file, "Season file (default scenarios/demo/season.yaml)");
  app.add_option("--seasons", seasons, "Seasons per timed run (default 100000)");
  app.add_option("--seed", seed, "Random seed (default 20260101)");
  app.add_flag("--full", full, "Also time 1,000,000 seasons on 2 threads (target: 10 s)");
  try {
    app.parse(argc, argv);
  } catch (const CLI::ParseError& e) {
    return app.exit(e) == 0 ? 0 : 2;
  }
  if (seasons == 0) {
    fmt::print(stderr, "--seasons: expected at least 1\n");
    return 2;
  }

  std::string command;
  for (int i = 0; i < argc; ++i) command += (i ? " " : "") + std::string(argv[i]);
  fmt::print("command: {}\n", command);

  auto start = Clock::now();
  const config::Season season = config::load_season(season_file);
  const double load_s = seconds_since(start);
  start = Clock::now();
  const models::LeagueRatings ratings = models::fit_ratings(season);
  const double fit_s = seconds_since(start);
  start = Clock::now();
  const engine::Plan plan = engine::compile_plan(season, ratings);
  const double compile_s = seconds_since(start);
  fmt::print("season: {} ({} teams, {} remaining games per season, postseason {})\n", season_file,
             plan.teams, plan.remaining_games(), plan.postseason ? "on" : "off");
  fmt::print("set-up: load {:.3f} s, fit {:.3f} s, compile {:.3f} s\n", load_s, fit_s, compile_s);
  fmt::print("hardware threads: {}; load average before the runs: {}\n",
             std::thread::hardware_concurrency(), load_average());

  // Warm-up (page faults, thread pool start): not reported.
  time_engine(plan, std::min<std::uint64_t>(seasons, 2000), seed, 2);
  time_floor(plan, std::min<std::uint64_t>(seasons, 2000), seed, 2);

  const Timing e1 = time_engine(plan, seasons, seed, 1);
  const Timing e2 = time_engine(plan, seasons, seed, 2);
  const Timing f1 = time_floor(plan, seasons, seed, 1);
  const Timing f2 = time_floor(plan, seasons, seed, 2);
  const double peak_after_n = peak_mib();

  fmt::print("\n{:<12} {:>7} {:>10} {:>8} {:>8} {:>11} {:>13} {:>17}\n", "loop", "threads",
             "seasons", "wall s", "cpu s", "seasons/s", "games/s", "games/cpu-s");
  print_row("full engine", 1, e1);
  print_row("full engine", 2, e2);
  print_row("floor loop", 1, f1);
  print_row("floor loop", 2, f2);
  fmt::print(
      "(games = regular-season games; the engine's postseason games are extra work;\n"
      " per-second figures use wall time; games/cpu-s uses the process CPU time, which\n"
      " is less sensitive to other load on the machine)\n");
  fmt::print("(floor checksum {} = games tallied)\n\n", f1.checksum + f2.checksum);

  const double speedup = e1.wall / e2.wall;
  fmt::print("engine speed-up 1 -> 2 threads:      {:.2f}  (target >= 1.8)\n", speedup);
  fmt::print(
      "floor speed-up 1 -> 2 threads:       {:.2f}  (the machine's own limit: the floor "
      "loop shares nothing,\n                                     so well below 2 means "
      "two cores were not free)\n",
      f1.wall / f2.wall);
  fmt::print("engine / floor games per second, 1 thread:  {:.3f}  (target >= 0.35)\n",
             e1.games_per_s() / f1.games_per_s());
  fmt::print("engine / floor games per second, 2 threads: {:.3f}  (target >= 0.35)\n",
             e2.games_per_s() / f2.games_per_s());
  fmt::print("engine / floor games per CPU second, 2 threads: {:.3f}\n",
             (static_cast<double>(e2.games) / e2.cpu) / (static_cast<double>(f2.games) / f2.cpu));
  fmt::print("peak memory after the {}-season runs: {:.1f} MiB  (target < 200)\n",
             with_commas(static_cast<double>(seasons)), peak_after_n);

  const SamplerTiming sampler = time_sampler(plan, 50'000'000, seed);
  if (sampler.scores_ns > 0)
    fmt::print(
        "score sampler, 1 thread: {:.2f} ns per game for the 64-bit draw alone, {:.2f} ns with "
        "both scores;\n  the sampler's own cost {:.2f} ns per game (checksum {})\n",
        sampler.draw_ns, sampler.scores_ns, sampler.scores_ns - sampler.draw_ns, sampler.checksum);

  if (full) {
    const Timing big = time_engine(plan, FULL_SEASONS, seed, 2);
    fmt::print(
        "\nfull engine, {} seasons on 2 threads: {:.2f} s wall  (target <= {:.0f} s), "
        "{:.2f} s CPU, {} seasons/s, {} games/s\n",
        with_commas(static_cast<double>(big.seasons)), big.wall, FULL_TARGET_S, big.cpu,
        with_commas(big.seasons_per_s()), with_commas(big.games_per_s()));
    fmt::print("(at the engine's games per CPU second, 2 idle cores would need about {:.1f} s)\n",
               big.cpu / 2.0);
    fmt::print("peak memory after the 1,000,000-season run: {:.1f} MiB  (target < 200)\n",
               peak_mib());
  }
  fmt::print("load average after the runs: {}\n", load_average());
  return 0;
}

}  // namespace

int main(int argc, char** argv) {
  try {
    return run(argc, argv);
  } catch (const config::ConfigError& e) {
    fmt::print(stderr, "{}\n", e.what());
    return 2;
  } catch (const std::exception& e) {
    fmt::print(stderr, "error: {}\n", e.what());
    return 1;
  }
}
