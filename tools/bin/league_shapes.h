// The two invented leagues the generator knows (demo: 30 clubs, small: 6 clubs), their
// games per pair of clubs, and the hidden true strengths of their clubs.
#ifndef STANDFAST_TOOLS_BIN_LEAGUE_SHAPES_H
#define STANDFAST_TOOLS_BIN_LEAGUE_SHAPES_H

#include <fmt/core.h>

#include <array>
#include <cmath>
#include <cstdint>
#include <string>
#include <vector>

#include "config/season.h"
#include "tools/bin/league_names.h"
#include "tools/bin/league_sampling.h"
#include "tools/bin/league_types.h"

namespace standfast::tools::gen {

using standfast::config::parse_date;

// ---------------------------------------------------------------------------------------------
// Clubs and strengths

inline void draw_strengths(League& lg, std::uint64_t seed) {
  Rng rng = make_rng(seed, kStrengthStream);
  const int n = lg.n();
  std::vector<double> lo(static_cast<std::size_t>(n)), ld(static_cast<std::size_t>(n));
  double mo = 0, md = 0;
  for (int i = 0; i < n; ++i) {
    lo[static_cast<std::size_t>(i)] = STRENGTH_SD * standard_normal(rng);
    ld[static_cast<std::size_t>(i)] = STRENGTH_SD * standard_normal(rng);
    mo += lo[static_cast<std::size_t>(i)] / n;
    md += ld[static_cast<std::size_t>(i)] / n;
  }
  for (int i = 0; i < n; ++i) {
    Club& c = lg.clubs[static_cast<std::size_t>(i)];
    // Centred so that the geometric means of offence and defence are exactly 1.
    c.offence = std::exp(lo[static_cast<std::size_t>(i)] - mo);
    c.defence = std::exp(ld[static_cast<std::size_t>(i)] - md);
    c.run_factor = std::clamp(1.0 + 0.04 * standard_normal(rng), 0.92, 1.10);
    c.run_factor = std::round(c.run_factor * 100.0) / 100.0;
  }
}

template <std::size_t N>
inline std::vector<Club> clubs_from(const std::array<standfast::tools::names::ClubName, N>& names) {
  std::vector<Club> out;
  for (const auto& c : names) {
    out.push_back(Club{std::string(c.id), std::string(c.name), std::string(c.venue)});
  }
  return out;
}

// 30 clubs, 2 conferences x 3 divisions x 5. Per club: 13 games against each of the 4 division
// rivals (52), 7 against 4 and 6 against 6 of the other conference clubs (64), 3 against 14
// clubs of the other conference and 4 against one paired rival there (46): 162 games, 81 home.
inline League make_demo() {
  League lg;
  lg.name = "Tallwater Baseball League";
  lg.season_label = "Season 12";
  lg.clubs = clubs_from(standfast::tools::names::DEMO_CLUBS);
  lg.games_per_team = 162;
  lg.opening_day = *parse_date("2047-04-04");
  lg.target_days = 186;
  lg.min_days = 180;
  lg.max_days = 190;
  lg.break_start = 98;
  lg.break_length = 4;
  lg.doubleheaders = 6;
  lg.postponements = 5;
  lg.runner_on_second = true;
  const char* conf_ids[2] = {"meridian", "lantern"};
  const char* conf_names[2] = {"Meridian Conference", "Lantern Conference"};
  const char* div_ids[3] = {"north", "central", "south"};
  const char* div_names[3] = {"North Division", "Central Division", "South Division"};
  for (int c = 0; c < 2; ++c) {
    Conference conf{conf_ids[c], conf_names[c], {}};
    for (int v = 0; v < 3; ++v) {
      Division d{fmt::format("{}-{}", conf_ids[c], div_ids[v]),
                 fmt::format("{} {}", c == 0 ? "Meridian" : "Lantern", div_names[v]),
                 {}};
      for (int s = 0; s < 5; ++s) d.clubs.push_back(c * 15 + v * 5 + s);
      conf.divisions.push_back(d);
    }
    lg.conferences.push_back(conf);
  }
  const int n = lg.n();
  lg.games_at.assign(static_cast<std::size_t>(n * n), 0);
  auto mod = [](int a, int m) { return ((a % m) + m) % m; };
  for (int i = 0; i < n; ++i) {
    for (int j = 0; j < n; ++j) {
      if (i == j) continue;
      const int ci = i / 15, cj = j / 15, vi = (i % 15) / 5, vj = (j % 15) / 5;
      const int si = i % 5, sj = j % 5;
      if (ci == cj && vi == vj) {
        // 13 games: 7 at the club for which the rival is 1 or 2 slots ahead (mod 5).
        const int d = mod(sj - si, 5);
        lg.at(i, j) = (d == 1 || d == 2) ? 7 : 6;
      } else if (ci == cj) {
        // Divisions v < w: slot s of v meets slots s and s+1 of w seven times (a 10-cycle),
        // the other three six times. Seven-game pairs alternate the extra home game round the
        // cycle: v_s hosts 4 against w_s, w_{s+1} hosts 4 against v_s.
        const bool i_low = vi < vj;
        const int sv = i_low ? si : sj, sw = i_low ? sj : si;
        const int d = mod(sw - sv, 5);
        if (d == 0) {
          lg.at(i, j) = i_low ? 4 : 3;
        } else if (d == 1) {
          lg.at(i, j) = i_low ? 3 : 4;
        } else {
          lg.at(i, j) = 3;
        }
      } else {
        // Other conference: position p in 0..14; p == q is the paired rival (2 + 2), the rest
        // are one three-game series, hosted by conference 0 when (q - p) mod 15 is 1..7.
        const int p = i % 15, q = j % 15;
        if (p == q) {
          lg.at(i, j) = 2;
        } else {
          const int d = ci == 0 ? mod(q - p, 15) : mod(p - q, 15);
          const bool zero_hosts = d >= 1 && d <= 7;
          lg.at(i, j) = (zero_hosts == (ci == 0)) ? 3 : 0;
        }
      }
    }
  }
  return lg;
}

// 6 clubs, 1 conference x 2 divisions x 3. Per club: 10 games against each division rival,
// 8 against the paired club of the other division and 6 against the other two: 40 games.
inline League make_small() {
  League lg;
  lg.small = true;
  lg.name = "Fenmark Valley League";
  lg.season_label = "Season 3";
  lg.clubs = clubs_from(standfast::tools::names::SMALL_CLUBS);
  lg.games_per_team = 40;
  lg.opening_day = *parse_date("2049-05-06");
  lg.target_days = 48;
  lg.min_days = 44;
  lg.max_days = 52;
  lg.break_start = 0;
  lg.break_length = 0;
  lg.doubleheaders = 1;
  lg.postponements = 1;
  lg.runner_on_second = false;
  Conference conf{"valley", "Valley Conference", {}};
  conf.divisions.push_back(Division{"upper", "Upper Division", {0, 1, 2}});
  conf.divisions.push_back(Division{"lower", "Lower Division", {3, 4, 5}});
  lg.conferences.push_back(conf);
  const int n = lg.n();
  lg.games_at.assign(static_cast<std::size_t>(n * n), 0);
  for (int i = 0; i < n; ++i) {
    for (int j = 0; j < n; ++j) {
      if (i == j) continue;
      if (i / 3 == j / 3) {
        lg.at(i, j) = 5;
      } else {
        lg.at(i, j) = (i % 3 == j % 3) ? 4 : 3;
      }
    }
  }
  return lg;
}

}  // namespace standfast::tools::gen

#endif  // STANDFAST_TOOLS_BIN_LEAGUE_SHAPES_H
