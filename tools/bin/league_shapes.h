// The two invented leagues the generator knows (demo: 32 clubs, small: 6 clubs), their
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

// 32 clubs, 4 conferences x 2 divisions x 4 (the project's own format). Per club: 14 games
// against each of the 3 division rivals (42), 10 against each of the 4 clubs of the other
// division of its conference (40) and one 3-game series against each of the 24 clubs of the
// other conferences (72): 154 games, 77 at home.
inline League make_demo() {
  League lg;
  lg.name = "Stonereach Baseball Union";
  lg.season_label = "Season 8";
  lg.clubs = clubs_from(standfast::tools::names::DEMO_CLUBS);
  lg.games_per_team = 154;
  lg.opening_day = *parse_date("2053-04-09");
  lg.target_days = 176;
  lg.min_days = 170;
  lg.max_days = 182;
  lg.break_start = 94;
  lg.break_length = 4;
  lg.doubleheaders = 6;
  lg.postponements = 5;
  lg.runner_on_second = true;
  constexpr int CONFERENCES = 4, DIVISIONS = 2, SIZE = 4, PER_CONFERENCE = DIVISIONS * SIZE;
  const char* conf_ids[CONFERENCES] = {"meridian", "lantern", "cinder", "tideway"};
  const char* conf_names[CONFERENCES] = {"Meridian", "Lantern", "Cinder", "Tideway"};
  const char* div_ids[DIVISIONS] = {"hill", "vale"};
  const char* div_names[DIVISIONS] = {"Hill", "Vale"};
  for (int c = 0; c < CONFERENCES; ++c) {
    Conference conf{conf_ids[c], fmt::format("{} Conference", conf_names[c]), {}};
    for (int v = 0; v < DIVISIONS; ++v) {
      Division d{fmt::format("{}-{}", conf_ids[c], div_ids[v]),
                 fmt::format("{} {} Division", conf_names[c], div_names[v]),
                 {}};
      for (int s = 0; s < SIZE; ++s) d.clubs.push_back(c * PER_CONFERENCE + v * SIZE + s);
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
      const int ci = i / PER_CONFERENCE, cj = j / PER_CONFERENCE;
      const int vi = (i % PER_CONFERENCE) / SIZE, vj = (j % PER_CONFERENCE) / SIZE;
      if (ci == cj && vi == vj) {
        lg.at(i, j) = 7;  // 14 games, 7 at each park
      } else if (ci == cj) {
        lg.at(i, j) = 5;  // 10 games, 5 at each park
      } else {
        // Other conferences: one 3-game series. For conferences a < b, the club at position p
        // (0..7) of a hosts the club at position q of b when (q - p) mod 8 is 0..3, so every
        // club hosts 4 of the 8 clubs of each other conference.
        const int p = i % PER_CONFERENCE, q = j % PER_CONFERENCE;
        const int d = ci < cj ? mod(q - p, PER_CONFERENCE) : mod(p - q, PER_CONFERENCE);
        const bool lower_hosts = d < PER_CONFERENCE / 2;
        lg.at(i, j) = (lower_hosts == (ci < cj)) ? 3 : 0;
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
