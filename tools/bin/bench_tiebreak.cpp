// Benchmark of the per-season ranking: every team by record, each division, and the conference
// seeds (engine::Seeder::rank), as the engine calls it once per simulated season.
//
//   bench_tiebreak [--season FILE] [--rankings N] [--records K]
//
// With a season file (default scenarios/demo/season.yaml when it exists) the league and its
// played games come from the file and K simulated season-ends are made by adding random
// results for its remaining games. Without one, a synthetic 32-team league shaped like the demo
// (4 conferences x 2 divisions x 4 teams, 2 division winners + 1 at-large per conference) with
// short records and many ties is used. Prints rankings per second and nanoseconds per ranking
// on one core.
#include <fmt/core.h>

#include <CLI/CLI.hpp>
#include <chrono>
#include <ctime>
#include <exception>
#include <filesystem>
#include <stdexcept>
#include <string>
#include <vector>

#include "config/load.h"
#include "config/season.h"
#include "engine/rng.h"
#include "engine/season_record.h"
#include "engine/seeding.h"
#include "engine/tiebreak.h"

namespace {

using namespace standfast;

config::Season synthetic_league() {
  config::Season s;
  s.file = "(synthetic)";
  const char* conf_ids[] = {"north", "south", "east", "west"};
  for (int c = 0; c < 4; ++c) {
    config::Group conf;
    conf.id = conf_ids[c];
    conf.name = conf.id;
    s.groups.push_back(conf);
    const int ci = static_cast<int>(s.groups.size()) - 1;
    s.conferences.push_back(ci);
    for (int d = 0; d < 2; ++d) {
      config::Group div;
      div.id = fmt::format("{}-{}", conf.id, d);
      div.name = div.id;
      div.parent = ci;
      s.groups.push_back(div);
      const int di = static_cast<int>(s.groups.size()) - 1;
      s.groups[ci].children.push_back(di);
      s.divisions.push_back(di);
      for (int t = 0; t < 4; ++t) {
        config::Team team;
        team.id = fmt::format("T{}{}{}", c, d, t);
        team.name = team.id;
        team.division = di;
        team.conference = ci;
        s.teams.push_back(team);
        s.groups[di].teams.push_back(static_cast<int>(s.teams.size()) - 1);
      }
    }
    config::Qualifying q;
    q.conference = ci;
    q.division_winners = 2;
    q.at_large = 1;
    q.byes = 1;
    s.postseason.qualifying.push_back(q);
  }
  s.postseason.enabled = true;
  using config::TiebreakKind;
  s.tiebreakers.order = {{TiebreakKind::kHeadToHead, 0, config::TiebreakScope::kLeague, {}},
                         {TiebreakKind::kDivisionRecord, 0, config::TiebreakScope::kLeague, {}},
                         {TiebreakKind::kConferenceRecord, 0, config::TiebreakScope::kLeague, {}},
                         {TiebreakKind::kRunDifferential, 0, config::TiebreakScope::kLeague, {}},
                         {TiebreakKind::kLastGames, 10, config::TiebreakScope::kConference, {}},
                         {TiebreakKind::kDraw, 0, config::TiebreakScope::kLeague, {}}};
  return s;
}

}  // namespace

int main(int argc, char** argv) {
  CLI::App app{"Benchmark of the per-season ranking and seeding"};
  std::string season_file;
  long rankings = 2'000'000;
  int records = 64;
  bool synthetic = false;
  app.add_option("--season", season_file, "season file (default: the demo scenario if present)");
  app.add_flag("--synthetic", synthetic, "use the synthetic league with many ties");
  app.add_option("--rankings", rankings, "rankings to time")->check(CLI::PositiveNumber);
  app.add_option("--records", records, "distinct simulated records to cycle through")
      ->check(CLI::Range(1, 100000));
  CLI11_PARSE(app, argc, argv);
  try {
    if (season_file.empty() && !synthetic) {
      for (const char* p : {"scenarios/demo/season.yaml", "../scenarios/demo/season.yaml"}) {
        if (std::filesystem::exists(p)) season_file = p;
      }
    }
    config::Season season =
        season_file.empty() ? synthetic_league() : config::load_season(season_file);
    const engine::SeasonRecord played = engine::played_record(season);

    const int n = static_cast<int>(season.teams.size());
    // K simulated season-ends: the played record plus random results for every remaining game
    // (synthetic league: 16 random games per team, so many records are equal).
    std::vector<engine::SeasonRecord> ends(records, played);
    auto rng = engine::make_stream(1, 0, engine::Purpose::kGames);
    std::vector<std::pair<int, int>> remaining;
    for (const auto& g : season.games) {
      if (!g.played || !g.date) remaining.emplace_back(g.home, g.away);
    }
    if (season_file.empty()) {
      for (int t = 0; t < n; ++t) {
        for (int k = 0; k < 8; ++k)
          remaining.emplace_back(t,
                                 static_cast<int>(engine::uniform_below(rng, n - 1) + t + 1) % n);
      }
    }
    for (auto& rec : ends) {
      for (const auto& [h, a] : remaining) {
        const bool home_wins = engine::uniform_below(rng, 2) == 0;
        const int hr = 1 + static_cast<int>(engine::uniform_below(rng, 8));
        const int lr = static_cast<int>(engine::uniform_below(rng, static_cast<std::uint64_t>(hr)));
        if (home_wins) {
          rec.add_result(h, a, hr, lr);
        } else {
          rec.add_result(a, h, hr, lr);
        }
      }
    }

    const engine::Seeder seeder(season);
    auto scratch = seeder.make_scratch();
    auto ranking = seeder.make_ranking();
    auto tie_rng = engine::make_stream(1, 0, engine::Purpose::kTiebreak);
    long checksum = 0;
    // Warm-up, then the timed loop.
    for (int i = 0; i < records; ++i) seeder.rank(ends[i], tie_rng, scratch, ranking);
    const auto start = std::chrono::steady_clock::now();
    const std::clock_t cpu_start = std::clock();
    for (long i = 0; i < rankings; ++i) {
      seeder.rank(ends[static_cast<std::size_t>(i % records)], tie_rng, scratch, ranking);
      checksum += ranking.seeds.empty() ? ranking.league[0] : ranking.seeds[0];
    }
    const double cpu = static_cast<double>(std::clock() - cpu_start) / CLOCKS_PER_SEC;
    const double wall =
        std::chrono::duration<double>(std::chrono::steady_clock::now() - start).count();
    // CPU time of this process: on a shared machine the wall time also counts other programs.
    const double secs = cpu;
    fmt::print("league: {} ({} teams, {} divisions, {} conferences, {} seeds)\n",
               season_file.empty() ? "synthetic" : season_file, n, season.divisions.size(),
               season.conferences.size(), ranking.seeds.size());
    fmt::print("rankings: {}  cpu time: {:.3f} s  wall time: {:.3f} s  checksum: {}\n", rankings,
               cpu, wall, checksum);
    fmt::print("rankings per second: {:.0f}\n", static_cast<double>(rankings) / secs);
    fmt::print("ns per ranking: {:.1f}\n", secs * 1e9 / static_cast<double>(rankings));
  } catch (const config::ConfigError& e) {
    fmt::print(stderr, "{}\n", e.what());
    return 2;
  } catch (const std::exception& e) {
    fmt::print(stderr, "error: {}\n", e.what());
    return 1;
  }
  return 0;
}
