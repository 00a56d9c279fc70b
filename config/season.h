// The season description: every value a season file can state, validated and cross-referenced.
// This is the value that flows from config/ into models/, engine/ and tools/ (see DESIGN.md).
// Teams, groups and games refer to each other by index into the vectors of `Season`; ids are
// kept only for display and for error messages.
#ifndef STANDFAST_CONFIG_SEASON_H
#define STANDFAST_CONFIG_SEASON_H

#include <cstdint>
#include <optional>
#include <string>
#include <string_view>
#include <vector>

namespace standfast::config {

// The version of the season-file format this program reads (the file's `standfast:` key).
inline constexpr int SEASON_FORMAT_VERSION = 1;

// Where a value came from: a file, a 1-based line and a 1-based column (0 when unknown).
struct SourcePos {
  std::string file;
  int line = 0;
  int column = 0;
};

// A calendar date as the number of days since 1970-01-01 (proleptic Gregorian calendar).
using DayNumber = std::int32_t;

struct ExtraInningsRule {
  bool runner_on_second = false;  // automatic runner on second base in every extra half-inning
  int max_innings = 0;            // 0 = no cap; otherwise a game tied after it is settled by a draw
};

struct League {
  std::string name;
  std::string season_label;
  int regulation_innings = 9;
  ExtraInningsRule extra_innings;
  int games_per_team = 0;  // 0 = not stated (then no schedule-length warning is given)
};

struct Team {
  std::string id;
  std::string name;
  std::string venue;
  double run_factor = 1.0;  // venue run factor: 1.0 = neutral, 1.05 = 5% more runs
  int division = -1;        // index into Season::groups of the leaf group holding the team
  int conference = -1;      // index into Season::groups of the top-level group above it
  SourcePos pos;
};

// A node of the group tree. Top-level groups are conferences; groups that list teams are
// divisions. A top-level group that lists teams directly is both.
struct Group {
  std::string id;
  std::string name;
  int parent = -1;            // index into Season::groups, -1 for a conference
  std::vector<int> children;  // indexes into Season::groups
  std::vector<int> teams;     // indexes into Season::teams, in file order (leaf groups only)
  SourcePos pos;
};

// Who qualifies from one conference and how they are seeded.
struct Qualifying {
  int conference = -1;        // index into Season::groups
  int division_winners = 0;   // how many division winners qualify (normally all divisions)
  int at_large = 0;           // further berths by record
  int byes = 0;               // top seeds that skip the first round
  bool winners_first = true;  // division winners are seeded above at-large teams
};

struct Round {
  std::string name;
  int best_of = 1;                 // odd
  std::vector<bool> higher_hosts;  // size best_of: true where the higher seed is at home
  SourcePos pos;
};

enum class BracketFormat {
  kConferenceBrackets,  // each conference plays its own bracket; the last round is a final
                        // between the conference winners (with two conferences)
  kSingleBracket,       // every qualifier of the league in one bracket, seeded together
};

struct Postseason {
  BracketFormat format = BracketFormat::kConferenceBrackets;
  std::vector<Qualifying> qualifying;  // one per conference, in conference order
  std::vector<Round> rounds;           // in playing order, the final last
  bool reseed = false;                 // after each round the best seed meets the worst
  bool enabled = false;                // false when the file has no postseason section
  SourcePos pos;
};

enum class TiebreakKind {
  kHeadToHead,        // winning percentage in games among the tied teams
  kDivisionRecord,    // winning percentage within the team's own division
  kConferenceRecord,  // winning percentage within the team's own conference
  kRunDifferential,   // runs scored minus runs allowed over the season
  kLastGames,         // winning percentage over the last `games` games within `scope`
  kDraw,              // a random draw
};

enum class TiebreakScope { kLeague, kConference, kDivision };

struct TiebreakRule {
  TiebreakKind kind = TiebreakKind::kDraw;
  int games = 0;                                 // kLastGames only
  TiebreakScope scope = TiebreakScope::kLeague;  // kLastGames only
  SourcePos pos;
};

struct Tiebreakers {
  std::vector<TiebreakRule> order;  // applied in order; a draw is implied after the last rule
  bool extra_game = false;          // a two-team tie for a division title or the last berth is
                                    // settled by one extra game instead of the rules
};

enum class ScoreFamily { kWeibull, kNegativeBinomial, kPoisson, kLog5 };

struct LopsidedRule {
  int margin = 0;       // runs scored while leading by more than this are down-weighted
  double weight = 1.0;  // weight of those runs in the fit (0..1)
};

struct ModelSpec {
  ScoreFamily family = ScoreFamily::kWeibull;
  std::optional<double> shape;      // fixed Weibull shape gamma; empty = fitted
  std::optional<double> home_edge;  // fixed multiplier on the home side's runs; empty = fitted
  double shrink_games = 20.0;       // prior weight toward the league mean, in games
  // `shrink_games: auto`: the weight is estimated from the played games (empirical Bayes,
  // models/fit_report.h); shrink_games then applies only while no game is played.
  bool shrink_auto = false;
  std::optional<LopsidedRule> lopsided;  // empty = off (the default)
  bool strength_uncertainty = true;      // draw true strengths per simulated season
  // A fitted shape from the adjusted profile likelihood (models/joint_fit.h, adjust_shape);
  // false = the plain maximum-likelihood shape. Not a season-file key: for tests that compare
  // with plain maximum-likelihood references.
  bool adjusted_shape = true;
  SourcePos pos;
};

// A user's own projection for one team, for games on or after `from`. Runs or a winning
// percentage replace (blend = 1) or blend with (0 < blend < 1) the team's values; the added runs
// then shift them. A replaced value keeps the season's random deviation of the fitted strength
// (the same relative deviation, or one scaled to `sd_runs` when given), so an override equal to
// the fitted values changes nothing. Several overrides of a team apply in date order, each on
// top of the ones before it (an override without `from` comes first).
struct TeamOverride {
  int team = -1;
  std::optional<double> runs_scored;   // per game
  std::optional<double> runs_allowed;  // per game
  std::optional<double> win_pct;
  double blend = 1.0;
  double add_runs_scored = 0.0;   // runs per game added to the team's rate (may be negative)
  double add_runs_allowed = 0.0;  // runs per game added to what it allows (may be negative)
  std::optional<double> sd_runs;  // standard deviation of the true rate, runs per game
  std::optional<DayNumber> from;  // empty = every remaining game
  SourcePos pos;
};

struct Game {
  std::optional<DayNumber> date;  // empty = not yet known (postponed)
  int home = -1;                  // index into Season::teams
  int away = -1;
  int number = 1;  // game of the day between the two clubs (doubleheaders)
  bool played = false;
  int home_runs = 0;  // valid when played
  int away_runs = 0;
  int innings = 0;         // innings played; 0 = not stated (regulation assumed)
  bool shortened = false;  // ended early by the officials (weather and the like)
  bool postponed = false;  // not played, marked postponed or with no date; a date, if
                           // any, is the make-up date
  SourcePos pos;
};

// The ranges a season file may state: ones the fit and the engine honour in bounded time
// (far outside them a venue or an override can make games tie for ever, and a gamma function
// overflow). Real values sit well inside: run factors 0.8 to 1.3, shapes 1.5 to 2.2 (Weibull;
// larger for the negative binomial), home edges 1.0 to 1.1, 2 to 8 runs a game, and final
// scores below 40 (common practice).
inline constexpr double MIN_RUN_FACTOR = 0.2, MAX_RUN_FACTOR = 5.0;
inline constexpr double MIN_SHAPE = 0.5, MAX_SHAPE = 20.0;
inline constexpr double MIN_HOME_EDGE = 0.5, MAX_HOME_EDGE = 2.0;
inline constexpr double MIN_OVERRIDE_RUNS = 0.5, MAX_OVERRIDE_RUNS = 30.0;
inline constexpr int MAX_GAME_RUNS = 99;

struct Diagnostic {
  SourcePos pos;
  std::string message;
};

struct Season {
  std::string file;        // the season file as given
  std::string games_file;  // the games CSV named by `games_file` (its path as read), or empty
  std::vector<std::string> input_files;  // every file read: the season file, then its games file
  League league;
  std::vector<Team> teams;
  std::vector<Group> groups;
  std::vector<int> conferences;  // indexes of top-level groups, in file order
  std::vector<int> divisions;    // indexes of groups that hold teams, in file order
  Postseason postseason;
  Tiebreakers tiebreakers;
  ModelSpec model;
  std::vector<TeamOverride> overrides;
  std::vector<Game> games;  // file order; played and remaining
  std::vector<Diagnostic> warnings;

  // Index of the team with this id, or -1.
  int team_index(std::string_view id) const;
};

// Formats a date as YYYY-MM-DD and parses it back (nullopt when malformed or impossible).
std::string format_date(DayNumber day);
std::optional<DayNumber> parse_date(std::string_view text);

}  // namespace standfast::config

#endif  // STANDFAST_CONFIG_SEASON_H
