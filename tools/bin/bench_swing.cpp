// Benchmark of the game-swing tallies (engine/swing.h, `standfast stakes`) against a plain odds
// run of the same seasons, in one run.
//
//   bench_swing [--season FILE] [--seasons N] [--seed S] [--threads T] [--team ID] [--days D]
//
// Loads the season (default scenarios/demo/season.yaml, the invented 32-team demo league at
// midseason), fits the ratings, compiles the plan, and times on the same seasons:
//   - a plain odds run (engine::simulate), twice: first and last, to see the load drift;
//   - the tallies of the league's games of the next D days (default 3) from the default as-of
//     date, as `standfast stakes` runs them;
//   - the tallies of one team's remaining games (default: the first team), as
//     `standfast stakes --team ID` runs them;
//   - the tallies of every remaining game (a bound, not what the command does).
// For each it prints CPU and wall seconds and the extra cost over the mean of the two plain runs,
// from CPU time (the figure the target "< 25% on top of a plain odds run" is set against), and
// checks that the swing runs gave the plain run's odds bit for bit. Figures depend on the
// machine and its load: the load average is printed alongside.
// This is a benchmark program, not a test: nothing here passes or fails.
#include <fmt/core.h>
#include <sys/resource.h>

#include <CLI/CLI.hpp>
#include <chrono>
#include <cstdint>
#include <exception>
#include <fstream>
#include <functional>
#include <string>
#include <vector>

#include "config/as_of.h"
#include "config/load.h"
#include "engine/plan.h"
#include "engine/simulate.h"
#include "engine/swing.h"
#include "models/ratings.h"
#include "tools/output.h"

namespace {

using namespace standfast;
using Clock = std::chrono::steady_clock;

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
  double cpu = 0, wall = 0;
};

Timing timed(const std::function<void()>& work) {
  const double c0 = cpu_seconds();
  const auto w0 = Clock::now();
  work();
  return {cpu_seconds() - c0, std::chrono::duration<double>(Clock::now() - w0).count()};
}

bool same_odds(const engine::SimulationResult& a, const engine::SimulationResult& b) {
  if (a.seasons != b.seasons || a.teams.size() != b.teams.size()) return false;
  for (std::size_t t = 0; t < a.teams.size(); ++t) {
    if (a.teams[t].division.p != b.teams[t].division.p ||
        a.teams[t].postseason.p != b.teams[t].postseason.p ||
        a.teams[t].title.p != b.teams[t].title.p ||
        a.teams[t].wins_histogram != b.teams[t].wins_histogram)
      return false;
  }
  return true;
}

}  // namespace

int main(int argc, char** argv) {
  CLI::App app{"Game-swing tallies against a plain odds run of the same seasons"};
  std::string season_file = "scenarios/demo/season.yaml";
  std::uint64_t seasons = 100000, seed = 20260101;
  int threads = 2, days = 3;
  std::string team_id;
  app.add_option("--season", season_file, "Season file (default: scenarios/demo/season.yaml)");
  app.add_option("--seasons", seasons, "Simulated seasons per run (default: 100000)");
  app.add_option("--seed", seed, "Random seed (default: 20260101)");
  app.add_option("--threads", threads, "Worker threads (default: 2)");
  app.add_option("--team", team_id, "Team of the team run (default: the first team)");
  app.add_option("--days", days, "Days of the league run (default: 3)");
  CLI11_PARSE(app, argc, argv);
  try {
    const config::Season full = config::load_season(season_file);
    const config::DayNumber as_of = *config::default_as_of(full);
    const config::Season season = config::season_as_of(full, as_of);
    const engine::Plan plan = engine::compile_plan(season, models::fit_ratings(season));
    int team = 0;
    for (std::size_t t = 0; t < season.teams.size(); ++t)
      if (season.teams[t].id == team_id) team = static_cast<int>(t);
    const std::vector<std::uint32_t> league = engine::games_of_days(plan, as_of, days);
    const std::vector<std::uint32_t> own = engine::games_of_team(plan, team);
    std::vector<std::uint32_t> every(plan.remaining_games());
    for (std::size_t g = 0; g < every.size(); ++g) every[g] = static_cast<std::uint32_t>(g);

    engine::RunOptions run;
    run.seed = seed;
    run.seasons = seasons;
    run.threads = threads;
    fmt::print("{}: {} teams, {} games left, as of {}; {} seasons, {} threads; load average {}\n",
               season_file, plan.teams, plan.remaining_games(), config::format_date(as_of),
               tools::group_digits(seasons), threads, load_average());

    engine::SimulationResult plain;
    engine::SwingResult swings;
    const Timing plain1 = timed([&] { plain = engine::simulate(plan, run); });
    bool same = true;
    const Timing t_league = timed([&] { swings = engine::simulate_swings(plan, league, run); });
    same = same && same_odds(plain, swings.odds);
    const Timing t_team = timed([&] { swings = engine::simulate_swings(plan, own, run); });
    same = same && same_odds(plain, swings.odds);
    const Timing t_every = timed([&] { swings = engine::simulate_swings(plan, every, run); });
    same = same && same_odds(plain, swings.odds);
    const Timing plain2 = timed([&] { plain = engine::simulate(plan, run); });
    const double base_cpu = (plain1.cpu + plain2.cpu) / 2;

    fmt::print("{:<44} {:>8} {:>8} {:>10}\n", "run", "CPU s", "wall s", "extra CPU");
    const auto row = [&](const std::string& name, const Timing& t, bool with_extra) {
      fmt::print("{:<44} {:>8.2f} {:>8.2f} {:>10}\n", name, t.cpu, t.wall,
                 with_extra ? fmt::format("{:+.1f}%", 100 * (t.cpu / base_cpu - 1)) : "");
    };
    row("plain odds run (first)", plain1, false);
    row(fmt::format("league, next {} days ({} games)", days, league.size()), t_league, true);
    row(fmt::format("team {} ({} games)", season.teams[static_cast<std::size_t>(team)].id,
                    own.size()),
        t_team, true);
    row(fmt::format("every remaining game ({} games)", every.size()), t_every, true);
    row("plain odds run (last)", plain2, false);
    fmt::print(
        "extra CPU against the mean of the two plain runs ({:.2f} s); plain runs differ "
        "by {:.1f}%\n",
        base_cpu, 100 * (plain2.cpu - plain1.cpu) / base_cpu);
    fmt::print("swing runs give the plain run's odds bit for bit: {}\n", same ? "yes" : "NO");
    fmt::print("load average after: {}\n", load_average());
    return same ? 0 : 1;
  } catch (const std::exception& e) {
    fmt::print(stderr, "bench_swing: {}\n", e.what());
    return 1;
  }
}
