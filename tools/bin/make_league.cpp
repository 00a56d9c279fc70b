// make_league: writes an invented league (season file, game list and the hidden true strengths)
// for demos and tests. Everything it writes is invented: clubs, places, venues and scores.
//
//   make_league --shape demo --seed 2031 --out scenarios/demo
//   make_league --shape small --seed 2031 --out scenarios/small
//
// The schedule is built from a table of games per pair of clubs (more inside the division),
// split into home and road series of 2 to 4 games, and laid on dates by a randomised greedy
// day-by-day pass with retries. The played part is simulated from true team strengths with
// the discretised Weibull scoring model (location -0.5). Every constraint is checked before
// anything is written; a violation exits with status 1.
//
// Parts (header-only, since every tools/bin/*.cpp is a program of its own): league_names.h
// (invented names), league_sampling.h (streams and samplers), league_types.h (data and hidden
// truth constants), league_shapes.h (the two leagues), league_schedule.h (series and dates),
// league_games.h (scores, cut-off, checks), league_write.h (YAML and CSV output).
#include <fmt/core.h>
#include <fmt/os.h>

#include <CLI/CLI.hpp>
#include <algorithm>
#include <cmath>
#include <cstdint>
#include <filesystem>
#include <map>
#include <string>
#include <system_error>
#include <vector>

#include "tools/bin/league_games.h"
#include "tools/bin/league_shapes.h"
#include "tools/bin/league_types.h"
#include "tools/bin/league_write.h"

namespace {

using namespace standfast::tools::gen;

void print_summary(const League& lg, const Outcome& out) {
  const int n = lg.n();
  int played = 0, shortened = 0, extra = 0, postponed = 0, doubleheaders = 0, home_wins = 0;
  long runs = 0;
  std::vector<int> home(static_cast<std::size_t>(n), 0), road(static_cast<std::size_t>(n), 0);
  std::vector<int> home_played(static_cast<std::size_t>(n), 0);
  std::vector<int> road_played(static_cast<std::size_t>(n), 0);
  std::map<int, int> dates;
  for (const Game& g : out.games) {
    ++home[static_cast<std::size_t>(g.home)];
    ++road[static_cast<std::size_t>(g.away)];
    if (g.day >= 0) ++dates[g.day];
    postponed += g.postponed ? 1 : 0;
    doubleheaders += g.number == 2 ? 1 : 0;
    if (!g.played) continue;
    ++played;
    ++home_played[static_cast<std::size_t>(g.home)];
    ++road_played[static_cast<std::size_t>(g.away)];
    shortened += g.shortened ? 1 : 0;
    extra += g.innings > 9 ? 1 : 0;
    home_wins += g.home_runs > g.away_runs ? 1 : 0;
    runs += g.home_runs + g.away_runs;
  }
  std::map<int, int> lengths;
  for (const Series& s : out.series) ++lengths[s.length];
  // Days with a game per club, and the longest run of them.
  std::vector<std::vector<int>> club_days(static_cast<std::size_t>(n));
  for (const Game& g : out.games) {
    if (g.day < 0) continue;
    for (int c : {g.home, g.away}) club_days[static_cast<std::size_t>(c)].push_back(g.day);
  }
  int min_game_days = 1 << 30, max_game_days = 0, longest = 0;
  for (auto& v : club_days) {
    std::sort(v.begin(), v.end());
    v.erase(std::unique(v.begin(), v.end()), v.end());
    min_game_days = std::min<int>(min_game_days, static_cast<int>(v.size()));
    max_game_days = std::max<int>(max_game_days, static_cast<int>(v.size()));
    int run = 0;
    for (std::size_t i = 0; i < v.size(); ++i) {
      run = (i > 0 && v[i] == v[i - 1] + 1) ? run + 1 : 1;
      longest = std::max(longest, run);
    }
  }
  auto [hmin, hmax] = std::minmax_element(home.begin(), home.end());
  auto [rmin, rmax] = std::minmax_element(road.begin(), road.end());
  auto [phmin, phmax] = std::minmax_element(home_played.begin(), home_played.end());
  auto [prmin, prmax] = std::minmax_element(road_played.begin(), road_played.end());
  fmt::print("league: {} ({}), {} clubs, {} games per club\n", lg.name, lg.season_label, n,
             lg.games_per_team);
  fmt::print("games: {}  played: {} ({:.1f}%)  postponed (tbd): {}  doubleheaders: {}\n",
             out.games.size(), played, 100.0 * played / static_cast<double>(out.games.size()),
             postponed, doubleheaders);
  fmt::print("home games per club: {}..{}  road games per club: {}..{}\n", *hmin, *hmax, *rmin,
             *rmax);
  fmt::print("played so far per club: home {}..{}  road {}..{}\n", *phmin, *phmax, *prmin, *prmax);
  std::string hist;
  for (const auto& [len, count] : lengths) hist += fmt::format("  {} games: {}", len, count);
  fmt::print("series: {}  lengths:{}\n", out.series.size(), hist);
  const int last = dates.rbegin()->first;
  fmt::print("days: {} ({} to {}), {} with games; schedule found on attempt {}\n", last + 1,
             date_text(lg, 0), date_text(lg, last), dates.size(), out.schedule_attempts);
  fmt::print("days with a game per club: {}..{}; longest run of days in a row: {}\n", min_game_days,
             max_game_days, longest);
  fmt::print("cut-off: games before {} are played\n", date_text(lg, out.cutoff));
  if (played > 0) {
    fmt::print(
        "played games: {:.3f} runs per side, home side won {:.1f}%, extra innings {}, "
        "shortened {}\n",
        runs / (2.0 * played), 100.0 * home_wins / played, extra, shortened);
  }
}

}  // namespace

int main(int argc, char** argv) {
  CLI::App app{"make_league: writes an invented league (season file, games, hidden truth)."};
  std::string shape = "demo";
  std::uint64_t seed = 2031;
  std::string out_dir;
  double fraction = 0.5;
  bool outcomes = false;
  app.add_option("--shape", shape, "small (6 clubs, games inline) or demo (32 clubs)")
      ->check(CLI::IsMember({"small", "demo"}));
  app.add_option("--seed", seed, "random seed");
  app.add_option("--out", out_dir, "output folder (created if missing)")->required();
  app.add_option("--played-fraction", fraction, "share of the games already played")
      ->check(CLI::Range(0.0, 1.0));
  app.add_flag("--outcomes", outcomes,
               "also write outcomes.csv: every game played out, the remaining ones too (the "
               "season's real end, for calibration)");
  try {
    app.parse(argc, argv);
  } catch (const CLI::ParseError& e) {
    const int code = app.exit(e);
    return code == 0 ? 0 : 2;
  }
  try {
    League lg = shape == "demo" ? make_demo() : make_small();
    draw_strengths(lg, seed);
    const Outcome out = make_games(lg, seed, fraction);
    check(lg, out);
    std::error_code ec;
    std::filesystem::create_directories(out_dir, ec);
    if (ec) {
      fmt::print(stderr, "error: cannot create {}: {}\n", out_dir, ec.message());
      return 2;
    }
    const std::filesystem::path dir(out_dir);
    std::string yaml = header_comment(lg, seed, fraction, out_dir, out) + league_yaml(lg);
    if (lg.small) {
      yaml += small_rules_yaml(lg, out);
    } else {
      yaml += demo_rules_yaml();
      write_file(dir / "games.csv", games_csv(lg, out.games));
    }
    if (outcomes) write_file(dir / "outcomes.csv", games_csv(lg, out.full_season));
    write_file(dir / "season.yaml", yaml);
    write_file(dir / "truth.csv", truth_csv(lg));
    print_summary(lg, out);
  } catch (const ConstraintError& e) {
    fmt::print(stderr, "make_league: constraint violated: {}\n", e.what());
    return 1;
  } catch (const std::system_error& e) {
    fmt::print(stderr, "error: {}\n", e.what());
    return 2;
  }
  return 0;
}
