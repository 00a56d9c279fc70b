// The games that matter (`standfast stakes`, fields in tools/STAKES.md): from the conditional
// tallies of one odds run (engine/swing.h), a team's remaining games ranked by how much its
// chance differs between winning and losing each, or the league's games of the next days ranked
// by the chance that changes hands between teams with their result; as a terminal table, CSV or
// JSON, each with the provenance and the caution line.
#ifndef STANDFAST_TOOLS_STAKES_REPORT_H
#define STANDFAST_TOOLS_STAKES_REPORT_H

#include <cstdint>
#include <optional>
#include <string>
#include <vector>

#include "config/season.h"
#include "engine/plan.h"
#include "engine/swing.h"
#include "tools/provenance.h"

namespace standfast::tools {

inline constexpr int STAKES_SCHEMA_VERSION = 1;

// The chance a report ranks by.
enum class StakeChance { kPostseason, kDivision };
const char* stake_chance_name(StakeChance c);

struct StakeTeam {
  std::string id, name;
  engine::Probability division, postseason;  // the run's chances
};

// One remaining game with every team's chances given its result.
struct StakeGame {
  std::optional<config::DayNumber> day;  // empty: not yet dated
  int number = 1;                        // game of the day between the two clubs
  int home = -1, away = -1;              // indexes into StakesReport::teams
  double home_win_share = 0;             // share of the simulated seasons the home side won it
  std::vector<engine::ConditionalChance> division, postseason;  // per team, home side's view
  engine::SwingTotal division_total, postseason_total;          // over all teams
};

struct StakesReport {
  Provenance run;
  std::string league, season_label;
  std::vector<StakeTeam> teams;  // Season::teams order
  StakeChance ranked_by = StakeChance::kPostseason;
  int team = -1;  // the team of a team report; -1 for the league's games of the next days
  config::DayNumber first_day = 0;  // league report (and a team report limited by days): the days
  int days = 0;                     // first_day .. first_day + days - 1; 0 = every remaining game
  std::vector<StakeGame> games;     // ranked: largest first; equal values by date
  std::size_t top = 0;              // rows the table shows (0 = all); CSV and JSON have all
};

// Builds the report from a swing run of `plan` (compiled from `season`) over the games chosen.
// `team` is an index into Season::teams, or -1 for a league report. Ranks the games.
StakesReport make_stakes_report(const config::Season& season, const engine::Plan& plan,
                                const engine::SwingResult& result, int team, StakeChance ranked_by);

// What a game means to the report's team (team reports only).
engine::TeamStake team_stake(const StakesReport& report, const StakeGame& game, StakeChance c);

std::string write_stakes_table(const StakesReport& report);
std::string write_stakes_csv(const StakesReport& report);
std::string write_stakes_json(const StakesReport& report);

}  // namespace standfast::tools

#endif  // STANDFAST_TOOLS_STAKES_REPORT_H
