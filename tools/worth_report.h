// The value-of-a-win report of `standfast worth`: per team, the marginal value of one more win
// and the curve of its chances against added wins (engine/win_value.h), or, with --by-wins, its
// chances of a berth and of the division by final win total and the totals that give 50% and
// 90%; as a terminal table, CSV or JSON (fields in tools/WORTH.md), with the provenance.
#ifndef STANDFAST_TOOLS_WORTH_REPORT_H
#define STANDFAST_TOOLS_WORTH_REPORT_H

#include <cstdint>
#include <optional>
#include <string>
#include <vector>

#include "engine/win_value.h"
#include "tools/provenance.h"

namespace standfast::tools {

inline constexpr int WORTH_SCHEMA_VERSION = 1;

struct WorthReport {
  std::string league, season_label;
  Provenance run;
  std::vector<std::string> team_ids, team_names;
  std::vector<int> wins, losses, games_left;  // the record so far, per team
  engine::WinValueResult result;
  bool by_wins = false;    // the chances by final win total instead of the curves
  bool postseason = true;  // the league has a postseason (else teams sort by the division)
};

// Teams by the value of one more win to their postseason chance (to their division chance in
// a league without a postseason), largest first (equal values and teams without one in league
// order).
std::vector<std::size_t> worth_order(const WorthReport& report);

// The smallest final win total from which every total seen in at least `min_seasons` seasons
// gives the chance at least `level` (hit[w] / all[w]); empty when there is none.
std::optional<int> wins_for(const std::vector<std::uint64_t>& all,
                            const std::vector<std::uint64_t>& hit, double level,
                            std::uint64_t min_seasons = 20);

std::string write_worth_table(const WorthReport& report);
std::string write_worth_csv(const WorthReport& report);
std::string write_worth_json(const WorthReport& report);

}  // namespace standfast::tools

#endif  // STANDFAST_TOOLS_WORTH_REPORT_H
