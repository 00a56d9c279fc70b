// The value of a win: every team's chances (division, postseason, bye, title) and mean final
// wins as a function of added strength, expressed in added wins over the rest of its season
// (-span .. +span), all points and all teams on the same simulated seasons (common random
// numbers), with the marginal value of one more win at the team's current strength (the
// central difference of the curve at 0) and its paired standard error. From the baseline
// seasons it also tallies each team's chances by final win total.
//
// Added wins are converted into a shift of the team's true strength (engine/shift_replay.h:
// runs per game, half scored and half prevented; log-odds for log5) by solving
//   sum over the team's remaining games of [P(win | shift) - P(win | 0)] = k
// at the fitted point estimates, P(win) the model's own chance of one game (models/win_chance.h:
// the score family's regulation chances, a tie split in proportion; log5 for log5). In the
// simulation the shift is added to each season's drawn strength, which keeps the fitted
// uncertainty, as an added-runs override of a what-if scenario does.
#ifndef STANDFAST_ENGINE_WIN_VALUE_H
#define STANDFAST_ENGINE_WIN_VALUE_H

#include <cstdint>
#include <vector>

#include "engine/compare.h"
#include "engine/plan.h"
#include "engine/simulate.h"

namespace standfast::engine {

inline constexpr int WIN_VALUE_CHANCES = 4;  // division, postseason, bye, title

// Counts of one point of a team's curve.
struct WinPoint {
  int added_wins = 0;
  bool reachable = true;  // false: no shift adds that many expected wins (too few games left)
  double shift = 0;       // runs per game (log-odds for log5); 0 when not reachable
  std::uint64_t count[WIN_VALUE_CHANCES] = {};  // seasons with the chance
  std::uint64_t wins_sum = 0, wins_sq = 0;      // final wins, summed and squared
};

// Joint counts of two points a and b on the same seasons.
struct JointCounts {
  std::uint64_t a_only[WIN_VALUE_CHANCES] = {}, b_only[WIN_VALUE_CHANCES] = {};
  std::int64_t wins_diff = 0;  // sum of wins(b) - wins(a)
  std::uint64_t wins_diff_sq = 0;
};

struct TeamWinValue {
  std::vector<WinPoint> points;    // added wins -span .. +span
  std::vector<JointCounts> steps;  // steps[j]: points[j] -> points[j + 1]
  JointCounts marginal;            // -1 -> +1
  // Baseline seasons by final win total w (0 .. Plan::max_games): all, with a berth, with the
  // division.
  std::vector<std::uint64_t> by_wins, by_wins_postseason, by_wins_division;
};

struct WinValueResult {
  std::uint64_t seasons = 0, seed = 0;
  int span = 5;
  bool log_odds = false;  // the shift is in log-odds (log5), not runs per game
  std::vector<TeamWinValue> teams;
};

// The shift of the team's strength that adds `wins` expected wins over its remaining games at
// the point estimates (formula above); NaN when none does. Throws std::invalid_argument for a
// team out of range.
double shift_for_wins(const Plan& plan, int team, double wins);
// The team's expected wins over its remaining games at the point estimates with this shift.
double expected_remaining_wins(const Plan& plan, int team, double shift);

// Runs options.seasons seasons (target_se, rank and ranks are not used; the result does not
// depend on options.threads). span: 0 to 20 (0: the baseline only). Throws std::invalid_argument
// for bad options or a plan with scenario edits.
WinValueResult win_value(const Plan& plan, const RunOptions& options, int span = 5);

// Figures from the counts (n seasons).
// A chance at a point: probability and binomial standard error; for c = WIN_VALUE_CHANCES, the
// mean final wins and its standard error.
struct Estimate {
  double value = 0, se = 0;
};
Estimate point_estimate(const WinPoint& p, int chance, std::uint64_t n);
// The change from a to b with its paired standard error (and the unpaired one for contrast);
// chance WIN_VALUE_CHANCES = mean final wins.
PairedChance joint_change(const WinPoint& a, const WinPoint& b, const JointCounts& j, int chance,
                          std::uint64_t n);
// The marginal value of one win: (b - a) / 2 over points -1 and +1, its paired error halved;
// NaN when either point is not reachable or the span is 0.
Estimate marginal_value(const TeamWinValue& t, int chance, std::uint64_t n);

}  // namespace standfast::engine

#endif  // STANDFAST_ENGINE_WIN_VALUE_H
