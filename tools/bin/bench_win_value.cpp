// Benchmark of the value-of-a-win table (engine/win_value.h), in one run.
//
//   bench_win_value [--season FILE] [--seasons N] [--span K] [--seed S] [--threads T]
//
// Loads the season (default scenarios/demo/season.yaml: the invented 32-team demo league at
// midseason), fits the ratings, compiles the plan and times the whole table: every team, 2K + 1
// points each (default K = 5: 11 points), N seasons a point (default 100,000), on T threads
// (default 2). The baseline of a season is played once and shared by every team and point;
// a shifted point replays only its team's games (engine/shift_replay.h). Prints the wall and
// CPU time, team-point-seasons per second, and, for scale, a plain run of N seasons
// (engine/simulate.h) on the same threads. The machine's load average is printed alongside:
// figures depend on it. A benchmark program, not a test: nothing here passes or fails.
#include <fmt/core.h>
#include <sys/resource.h>

#include <CLI/CLI.hpp>
#include <chrono>
#include <cstdint>
#include <exception>
#include <fstream>
#include <string>
#include <thread>

#include "config/load.h"
#include "engine/plan.h"
#include "engine/simulate.h"
#include "engine/win_value.h"
#include "models/ratings.h"

namespace {

using namespace standfast;
using Clock = std::chrono::steady_clock;

double seconds_since(Clock::time_point start) {
  return std::chrono::duration<double>(Clock::now() - start).count();
}

double cpu_seconds() {
  rusage u{};
  getrusage(RUSAGE_SELF, &u);
  return static_cast<double>(u.ru_utime.tv_sec + u.ru_stime.tv_sec) +
         static_cast<double>(u.ru_utime.tv_usec + u.ru_stime.tv_usec) * 1e-6;
}

std::string load_average() {
  std::ifstream in("/proc/loadavg");
  std::string a, b, c;
  in >> a >> b >> c;
  return in ? a + " " + b + " " + c : "unknown";
}

int run(int argc, char** argv) {
  CLI::App app{"Benchmark of the value-of-a-win table"};
  std::string season_file = "scenarios/demo/season.yaml";
  std::uint64_t seasons = 100000, seed = 20260101;
  int span = 5, threads = 2;
  app.add_option("--season", season_file, "Season file (default scenarios/demo/season.yaml)");
  app.add_option("--seasons", seasons, "Seasons per point (default 100000)");
  app.add_option("--span", span, "Points from -K to +K added wins (default 5)");
  app.add_option("--seed", seed, "Random seed (default 20260101)");
  app.add_option("--threads", threads, "Threads (default 2)");
  try {
    app.parse(argc, argv);
  } catch (const CLI::ParseError& e) {
    return app.exit(e) == 0 ? 0 : 2;
  }
  if (seasons == 0 || span < 1 || span > 20 || threads < 1) {
    fmt::print(stderr, "expected --seasons >= 1, --span 1 to 20, --threads >= 1\n");
    return 2;
  }
  std::string command;
  for (int i = 0; i < argc; ++i) command += (i ? " " : "") + std::string(argv[i]);
  fmt::print("command: {}\n", command);

  auto start = Clock::now();
  const config::Season season = config::load_season(season_file);
  const models::LeagueRatings ratings = models::fit_ratings(season);
  const engine::Plan plan = engine::compile_plan(season, ratings);
  fmt::print("season: {} ({} teams, {} remaining games per season); set-up {:.2f} s\n", season_file,
             plan.teams, plan.remaining_games(), seconds_since(start));
  fmt::print("hardware threads: {}; load average before the runs: {}\n",
             std::thread::hardware_concurrency(), load_average());

  engine::RunOptions opt;
  opt.seed = seed;
  opt.seasons = seasons;
  opt.threads = threads;

  double cpu = cpu_seconds();
  start = Clock::now();
  const engine::SimulationResult plain = engine::simulate(plan, opt);
  const double plain_wall = seconds_since(start), plain_cpu = cpu_seconds() - cpu;

  cpu = cpu_seconds();
  start = Clock::now();
  const engine::WinValueResult table = engine::win_value(plan, opt, span);
  const double wall = seconds_since(start), used = cpu_seconds() - cpu;

  const double points = static_cast<double>(plan.teams) * (2 * span + 1);
  const double work = points * static_cast<double>(table.seasons);
  fmt::print("\n{:<26} {:>9} {:>9} {:>9} {:>22}\n", "run", "seasons", "wall s", "cpu s",
             "team-point-seasons/s");
  fmt::print("{:<26} {:>9} {:>9.2f} {:>9.2f} {:>22}\n", "plain odds run", plain.seasons, plain_wall,
             plain_cpu, "");
  fmt::print("{:<26} {:>9} {:>9.2f} {:>9.2f} {:>22.0f}\n",
             fmt::format("value of a win ({} points)", static_cast<int>(points)), table.seasons,
             wall, used, work / wall);
  fmt::print(
      "\nthe table ({} teams x {} points x {} seasons) on {} threads: {:.1f} s wall "
      "(target < 60 s); {:.1f} plain runs' time\n",
      plan.teams, 2 * span + 1, table.seasons, threads, wall, wall / plain_wall);
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
