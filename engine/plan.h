// The compiled simulation plan: everything a simulated season needs, in flat arrays indexed by
// team, parameter slot or remaining game, built once from the Season and the fitted ratings.
// Nothing in the hot loop looks up a map, a string or a virtual function.
#ifndef STANDFAST_ENGINE_PLAN_H
#define STANDFAST_ENGINE_PLAN_H

#include <cstdint>
#include <string>
#include <utility>
#include <vector>

#include "config/season.h"
#include "engine/season_record.h"
#include "engine/season_totals.h"
#include "engine/seeding.h"
#include "models/strength_sampler.h"

namespace standfast::models {
struct LeagueRatings;
}

namespace standfast::engine {

// How a game's outcome is drawn.
enum class GameModel { kWeibull, kNegativeBinomial, kPoisson, kLog5 };

// One override of a team as the season loop applies it (config::TeamOverride, in plan units).
struct OverrideStep {
  bool has_runs_scored = false, has_runs_allowed = false, has_win_pct = false;
  double offence = 1.0;  // runs scored / league mean (multiplier), when has_runs_scored
  double defence = 1.0;  // runs allowed / league mean (multiplier), when has_runs_allowed
  double win_pct = 0.5;  // when has_win_pct
  double blend = 1.0;    // weight of the stated values against the team's current ones
  double add_offence = 0.0, add_defence = 0.0;  // added runs per game / league mean
  // A stated value carries the season's deviation of the fitted strength: it is multiplied by
  // exp(scale x), x the drawn log deviation; 1 keeps the fitted spread, sd_runs sets another.
  double offence_scale = 1.0, defence_scale = 1.0;
};

// A team's parameter set over one period: slot teams + k holds overrides[k], the team's values
// from `from` (the date of one of its overrides) to its next override.
struct SlotOverride {
  std::uint16_t team = 0;
  config::DayNumber from = 0;       // first day of the period (INT32_MIN: from the start)
  std::vector<OverrideStep> steps;  // every override of the team in effect, in date order
};

// A distinct (home slot, away slot, venue factors) combination of the remaining games. A season
// computes each one's scoring parameters once, not once per game (a series shares one).
struct Matchup {
  std::uint16_t home_slot = 0, away_slot = 0;
  float home_factor = 1, away_factor = 1;
};

// A remaining game whose result a scenario states: it is drawn as usual (so every later draw
// stays the same) and then given this result; it has a matchup of its own.
struct ForcedGame {
  std::uint32_t game = 0;     // index into the plan's remaining games
  std::uint32_t matchup = 0;  // its own matchup
  bool home_won = false;
};

// What a scenario changes in the schedule, as compile_plan applies it. Games keep their place
// in the order of draws whatever the edits, so that two plans of one season use each random
// number for the same game (common random numbers): a removed game is still drawn but counts
// for nobody, a forced game is drawn and then given its result, and added games (the last ones
// of Season::games, from `added_from` on) are drawn after all the others.
struct PlanEdits {
  std::vector<int> removed;                  // indexes into Season::games (remaining games)
  std::vector<std::pair<int, bool>> forced;  // (index into Season::games, home wins)
  int added_from = -1;                       // -1: no added games
};

// One postseason round as the engine plays it.
struct PlanRound {
  std::string name;
  int best_of = 1;
  std::uint32_t higher_hosts = 0;  // bit g set: the higher seed hosts game g
};

// One bracket: a conference's, or the whole league's in a single bracket.
struct PlanBracket {
  int conference = -1;  // index into Season::groups; -1 for a single league-wide bracket
  int qualifiers = 0;   // seeds 1..qualifiers
  int division_winners = 0;
  int at_large = 0;
  int byes = 0;
  bool winners_first = true;
  int conference_position = -1;  // position in Season::conferences (-1: single bracket)
  int first_round = 0;           // index of the round this bracket starts in
  int rounds = 0;                // rounds played inside the bracket
  // Standard bracket order of seeds (1-based) padded to a power of two: positions 2i and 2i+1
  // meet in the first round; seeds above `qualifiers` are empty slots (a bye for the opponent).
  std::vector<int> order;
};

class Plan {
 public:
  int teams = 0;
  GameModel model = GameModel::kWeibull;
  // Model parameters.
  double league_mean = 4.5;  // runs per side per game
  // Weibull shape. Log5: the exponent g of the home edge (the home odds are multiplied by
  // home_edge^g) and of the Pythagorean win percentage from the ratings; model.shape, else 1.83.
  double shape = 1.83;
  double nb_size = 10.0;  // negative binomial size
  // Multiplier on the home side's expected runs. Log5: the home odds p / (1 - p) are multiplied
  // by home_edge^shape; model.home_edge when it is a number, else 1 (log5 fits nothing).
  double home_edge = 1.0;
  int regulation_innings = 9;
  config::ExtraInningsRule extra_innings;

  // Strengths: point estimates of the logs of the offence and defence multipliers, and the
  // sampler of their joint uncertainty (a sparse factor of the precision matrix).
  std::vector<double> log_offence, log_defence;
  models::StrengthSampler strengths;
  bool draw_strengths = false;
  std::vector<double> win_pct;  // log5 strengths (per team), from overrides or ratings

  // Overrides: slot t (t < teams) is team t's fitted values, slot teams + k is overrides[k].
  std::vector<SlotOverride> overrides;    // grouped by team, in date order within a team
  int slots = 0;                          // teams + overrides.size()
  std::vector<std::uint16_t> final_slot;  // per team: its slot after the last game (postseason)

  // Remaining games, in date order (undated last, in file order). A game's slots and venue
  // factors (x home edge for the home side) are those of its matchup.
  std::vector<std::uint16_t> home_team, away_team;
  std::vector<config::DayNumber> day;       // INT32_MAX when not known
  std::vector<int> game_index;              // index into Season::games
  std::vector<Matchup> matchups;            // distinct combinations, in first-game order
  std::vector<std::uint32_t> game_matchup;  // per remaining game: index into matchups
  // Matchups from counted_matchups on hold only removed games (PlanEdits): drawn, not counted.
  std::uint32_t counted_matchups = 0;
  std::vector<ForcedGame> forced;            // games with a stated result (PlanEdits)
  std::vector<std::uint32_t> chronological;  // remaining games by date (the draw order,
                                             // unless games were added)
  TotalsLayout totals;                       // how the season loop tallies its results

  // Teams and groups.
  std::vector<std::string> team_ids;
  std::vector<int> team_division, team_conference;  // indexes into Season::groups
  std::vector<int> divisions, conferences;
  std::vector<double> run_factor;               // venue run factor of each team's home venue
  std::vector<int> played_wins, played_losses;  // from the played games
  SeasonRecord played;                          // the record of the played games
  Seeder seeder;                                // standings, tiebreakers and seeding
  int max_games = 0;                            // most games any team plays (wins histogram size)

  // Postseason.
  bool postseason = false;
  std::vector<PlanBracket> brackets;
  std::vector<PlanRound> rounds;
  bool reseed = false;
  // With conference brackets and more than one conference, the conference winners meet in a
  // final stage: a bracket (standard order) seeded by regular-season record, in the last rounds.
  bool final_stage = false;
  PlanBracket final_bracket;
  int max_seed = 0;

  std::size_t remaining_games() const { return home_team.size(); }
};

// Compiles the season and the fitted ratings. Throws std::invalid_argument naming the problem
// when they do not fit together (team counts, a bracket that cannot be played).
Plan compile_plan(const config::Season& season, const models::LeagueRatings& ratings,
                  const PlanEdits& edits = {});

}  // namespace standfast::engine

#endif  // STANDFAST_ENGINE_PLAN_H
