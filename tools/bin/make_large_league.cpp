// Writes an invented league of any size with a full 162-game schedule, for the scale benchmarks
// (README, section "Large leagues"): clubs in divisions of 5 and a power-of-two number of
// conferences; each club plays its 4 division rivals 12 times and the 56 clubs 5 to 32 places
// away round the league ring twice (and two more once), so each club meets only 62 others.
// Half of the season is played, with scores from the discretised Weibull model.
#include <fmt/core.h>
#include <fmt/os.h>

#include <CLI/CLI.hpp>
#include <algorithm>
#include <cmath>
#include <cstdint>
#include <filesystem>
#include <map>
#include <pcg_random.hpp>
#include <string>
#include <tuple>
#include <vector>

#include "config/season.h"
#include "models/score_dist.h"

namespace {

constexpr double LEAGUE_MEAN = 4.5, HOME_EDGE = 1.03, SHAPE = 1.8, STRENGTH_SD = 0.10;

double uniform01(pcg64& rng) { return static_cast<double>(rng() >> 11) * 0x1.0p-53; }

double standard_normal(pcg64& rng) {  // Marsaglia polar method, one value per call
  for (;;) {
    const double u = 2.0 * uniform01(rng) - 1.0, v = 2.0 * uniform01(rng) - 1.0;
    const double s = u * u + v * v;
    if (s > 0.0 && s < 1.0) return u * std::sqrt(-2.0 * std::log(s) / s);
  }
}

struct Game {
  int home, away;
};

}  // namespace

int main(int argc, char** argv) {
  CLI::App app{"Writes an invented league of N clubs (season.yaml and games.csv) for benchmarks"};
  int clubs = 100, conferences = 0;
  std::uint64_t seed = 7;
  std::string out;
  app.add_option("--clubs", clubs, "number of clubs, a multiple of 5, at least 70")->required();
  app.add_option("--conferences", conferences, "a power of two (default: about 50 clubs each)");
  app.add_option("--seed", seed, "random seed");
  app.add_option("--out", out, "output directory")->required();
  CLI11_PARSE(app, argc, argv);
  if (conferences == 0) {
    conferences = 1;
    while (clubs / (2 * conferences) >= 50 && clubs % (10 * conferences) == 0) conferences *= 2;
  }
  if (clubs < 70 || clubs % 5 != 0 || clubs % (5 * conferences) != 0 ||
      (conferences & (conferences - 1)) != 0 || clubs / conferences < 10) {
    fmt::print(stderr,
               "make_large_league: --clubs must be a multiple of 5 (and of 5 x conferences), at "
               "least 70; --conferences a power of two with at least 2 divisions each\n");
    return 2;
  }
  pcg64 rng(seed);
  const int n = clubs, per_conf = n / conferences;
  std::vector<double> lo(n), ld(n), rf(n);
  double mo = 0, md = 0;
  for (int i = 0; i < n; ++i) {
    lo[i] = STRENGTH_SD * standard_normal(rng);
    ld[i] = STRENGTH_SD * standard_normal(rng);
    mo += lo[i] / n;
    md += ld[i] / n;
    rf[i] = std::round(std::clamp(1.0 + 0.04 * standard_normal(rng), 0.92, 1.10) * 100) / 100;
  }
  // Schedule.
  std::vector<Game> games;
  for (int d = 0; d < n / 5; ++d)
    for (int a = 5 * d; a < 5 * d + 5; ++a)
      for (int b = a + 1; b < 5 * d + 5; ++b)
        for (int k = 0; k < 12; ++k) games.push_back(k % 2 ? Game{a, b} : Game{b, a});
  for (int i = 0; i < n; ++i) {
    for (int off = 5; off <= 32; ++off) {
      const int j = (i + off) % n;
      games.push_back({i, j});
      games.push_back({j, i});
    }
    games.push_back({i, (i + 33) % n});
  }
  // Dates: a shuffled order over 180 days (our own Fisher-Yates with an unbiased bound).
  for (std::size_t k = games.size(); k > 1; --k) std::swap(games[k - 1], games[rng(k)]);
  const auto opening = *standfast::config::parse_date("2051-04-01");
  const std::size_t total = games.size(), played = total / 2;
  std::filesystem::create_directories(out);
  auto csv = fmt::output_file((std::filesystem::path(out) / "games.csv").string());
  csv.print("date,home,away,game,home_runs,away_runs,innings,status\n");
  std::map<std::tuple<int, int, int>, int> count;
  for (std::size_t g = 0; g < total; ++g) {
    const int day = static_cast<int>(g * 180 / total);
    const Game& gm = games[g];
    const int number = ++count[{day, gm.home, gm.away}];
    const std::string date = standfast::config::format_date(opening + day);
    if (g >= played) {
      csv.print("{},C{:04d},C{:04d},{},,,,\n", date, gm.home, gm.away, number);
      continue;
    }
    const double mh =
        LEAGUE_MEAN * std::exp(lo[gm.home] - mo + ld[gm.away] - md) * rf[gm.home] * HOME_EDGE;
    const double ma = LEAGUE_MEAN * std::exp(lo[gm.away] - mo + ld[gm.home] - md) * rf[gm.home];
    int hr = standfast::models::sample(standfast::models::weibull_for_mean(mh, SHAPE), rng);
    int ar = standfast::models::sample(standfast::models::weibull_for_mean(ma, SHAPE), rng);
    int innings = 9;
    while (hr == ar) {  // a crude stand-in for extra innings: one run to a side, or none
      ++innings;
      const double u = uniform01(rng);
      if (u < 0.25) ++hr;
      if (u >= 0.25 && u < 0.5) ++ar;
    }
    csv.print("{},C{:04d},C{:04d},{},{},{},{},\n", date, gm.home, gm.away, number, hr, ar, innings);
  }
  csv.close();
  auto y = fmt::output_file((std::filesystem::path(out) / "season.yaml").string());
  y.print("# An invented league of {} clubs for the scale benchmarks; every club is made up.\n", n);
  y.print("# Generated by: build/tools/make_large_league --clubs {} --seed {} --out {}\n", n, seed,
          out);
  y.print("standfast: 1\nleague:\n  name: Broadwater Federation\n  season: \"Year {}\"\n", n);
  y.print("  innings: 9\n  extra_innings: {{runner_on_second: true, max_innings: 0}}\n");
  y.print("  games_per_team: 162\nteams:\n");
  for (int i = 0; i < n; ++i)
    y.print("  - {{id: C{:04d}, name: Club {}, venue: Ground {}, run_factor: {:.2f}}}\n", i, i, i,
            rf[i]);
  y.print("groups:\n");
  for (int c = 0; c < conferences; ++c) {
    y.print("  - id: conf{}\n    groups:\n", c);
    for (int d = c * per_conf / 5; d < (c + 1) * per_conf / 5; ++d)
      y.print("      - {{id: div{}, teams: [C{:04d}, C{:04d}, C{:04d}, C{:04d}, C{:04d}]}}\n", d,
              5 * d, 5 * d + 1, 5 * d + 2, 5 * d + 3, 5 * d + 4);
  }
  y.print("postseason:\n  format: conference_brackets\n");
  y.print("  qualify: {{division_winners: 2, at_large: 2, byes: 0, winners_first: true}}\n");
  y.print("  rounds:\n    - {{name: Semifinal, best_of: 5}}\n");
  y.print("    - {{name: Conference final, best_of: 7}}\n");
  for (int r = conferences; r > 1; r /= 2) y.print("    - {{name: Final of {}, best_of: 7}}\n", r);
  y.print("model:\n  family: weibull\n  shape: fit\n  home_edge: fit\n  shrink_games: 20\n");
  y.print("games_file: games.csv\n");
  y.close();
  return 0;
}
