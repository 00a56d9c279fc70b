// The odds report: one value built from the season, the simulation result and the clinch marks,
// and the writers that turn it into a terminal table, CSV or JSON. Every format is written from
// the same OddsReport, so they never disagree. Columns and fields are documented in
// tools/ODDS.md.
#ifndef STANDFAST_TOOLS_ODDS_REPORT_H
#define STANDFAST_TOOLS_ODDS_REPORT_H

#include <cstdint>
#include <span>
#include <string>
#include <string_view>
#include <vector>

#include "config/season.h"
#include "engine/certainty.h"
#include "engine/clinch.h"
#include "engine/simulate.h"
#include "tools/provenance.h"

namespace standfast::tools {

// The one-line caution every output carries.
inline constexpr std::string_view ODDS_CAUTION =
    "Odds are model estimates under stated assumptions, not facts about the future, and not "
    "advice for wagering.";

// Version of the JSON layout (tools/ODDS.md); raised on any incompatible change.
inline constexpr int ODDS_SCHEMA_VERSION = 1;

struct OddsTeam {
  int index = -1;  // into Season::teams
  std::string id, name;
  std::string conference_id, conference_name;
  std::string division_id, division_name;
  int wins = 0, losses = 0, games_left = 0;  // from the played games and the schedule
  engine::ClinchMarks marks;                 // certain by the standings alone
  engine::TeamCertainty certainty;           // exact marks and numbers (attach_certainty)
  engine::TeamOdds odds;
};

// A division's teams in table order: winning percentage so far (best first), then projected
// mean wins, then file order.
struct OddsDivision {
  std::string conference_name, name;
  std::vector<int> rows;  // indexes into OddsReport::teams
};

struct OddsReport {
  Provenance run;  // what produced the report (set by the command)
  std::string league, season_label;
  std::uint64_t seed = 0, seasons = 0;
  double max_se = 0, target_se = 0;
  bool stopped_early = false;
  double extra_innings_share = 0;
  std::uint64_t games_simulated = 0, extra_innings_games = 0, drawn_games = 0;
  bool postseason = false;  // the season has a postseason (else only division odds)
  bool byes = false;        // some conference gives byes
  bool certainty = false;   // attach_certainty was called: exact marks, magic numbers
  std::vector<std::string> round_names;
  std::vector<OddsTeam> teams;          // Season::teams order (only the selected ones)
  std::vector<OddsDivision> divisions;  // Season::divisions order (only those with rows)
};

// Builds the report. `records` and `marks` have one entry per team (engine/clinch.h).
// `only_group`, when not empty, is the id of a conference or a division: only its teams are
// kept. Throws UsageError when no group has that id.
OddsReport make_odds_report(const config::Season& season, const engine::SimulationResult& result,
                            std::span<const engine::ClinchRecord> records,
                            std::span<const engine::ClinchMarks> marks, double target_se,
                            const std::string& only_group = {});

// Replaces the marks of every row by the exact ones (engine/exact_certainty; one entry per team
// of the season) and adds the magic and elimination numbers and the bye and title marks.
void attach_certainty(OddsReport& report, std::span<const engine::TeamCertainty> certainty);

// A probability as the table shows it: "clinched" / "eliminated" when certain by the standings;
// "100%*" / "0%*" when every (or no) simulated season gave it but the standings do not prove it;
// "<0.1%" and ">99.9%" near the ends; otherwise one decimal, e.g. "61.2%".
std::string format_chance(double p, engine::Certainty certainty);

std::string write_odds_table(const OddsReport& report);
std::string write_odds_csv(const OddsReport& report);
std::string write_odds_json(const OddsReport& report);

}  // namespace standfast::tools

#endif  // STANDFAST_TOOLS_ODDS_REPORT_H
