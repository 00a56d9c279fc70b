// The standings of the played games, as displayed: per conference and division, every team's
// record, winning percentage, games back, run differential, home and road records, records
// within the division and the conference, the last ten games and the current streak; and the
// conference seeds if the postseason started today.
//
// Teams are ranked by winning percentage (not by games back: the two disagree when teams have
// played different numbers of games), and ties are broken by the season's tiebreak procedure
// with the fixed random stream make_stream(0, 0, Purpose::kTiebreak), so the displayed
// standings are reproducible. Seeds come from the same Seeder the engine uses (engine/seeding.h);
// extra tiebreak games are not played here: the procedure orders those ties too.
#ifndef STANDFAST_ENGINE_STANDINGS_H
#define STANDFAST_ENGINE_STANDINGS_H

#include <optional>
#include <vector>

#include "config/season.h"

namespace standfast::engine {

struct StandingsLine {
  int team = -1;  // index into Season::teams
  int wins = 0;
  int losses = 0;
  int runs_for = 0;
  int runs_against = 0;
  int home_wins = 0;
  int home_losses = 0;
  int road_wins = 0;
  int road_losses = 0;
  int division_wins = 0;
  int division_losses = 0;
  int conference_wins = 0;
  int conference_losses = 0;
  int last10_wins = 0;  // over the team's last ten played games (fewer early on)
  int last10_losses = 0;
  int streak = 0;                // +n: won its last n games; -n: lost its last n; 0: no games
  int games_back_halves = 0;     // games back of the division leader, in half games (see below)
  int seed = 0;                  // seed in its conference if the postseason began now; 0 = out
  bool division_leader = false;  // ranked first in its division

  int games() const { return wins + losses; }
  int run_differential() const { return runs_for - runs_against; }
  // Winning percentage for display: wins / games, 0 with no games. (Ranking compares the exact
  // fractions and counts a team with no games as .500.)
  double win_pct() const { return games() == 0 ? 0.0 : static_cast<double>(wins) / games(); }
  double games_back() const { return games_back_halves / 2.0; }
};

struct DivisionStandings {
  int division = -1;                 // index into Season::groups
  std::vector<StandingsLine> lines;  // ranked, best first
};

struct ConferenceStandings {
  int conference = -1;                       // index into Season::groups
  std::vector<DivisionStandings> divisions;  // in Season::divisions order
  std::vector<int> seeds;                    // team indexes in seed order (empty: no postseason)
  int qualifying_winners = 0;                // the first this many seeds won their division
};

struct Standings {
  std::vector<ConferenceStandings> conferences;  // in Season::conferences order
  int games_played = 0;                          // played games with a known date
  std::optional<config::DayNumber> through;      // date of the last played game
};

// Games back, in half games, of a team (w-l) behind its division leader (lw-ll), by the common
// formula GB = ((lw - w) + (l - ll)) / 2. The leader is the team ranked first by winning
// percentage, so a team below it that has played fewer games can have a negative value.
inline int games_back_halves(int leader_wins, int leader_losses, int wins, int losses) {
  return (leader_wins - wins) + (losses - leader_losses);
}

// The standings of the season's played games (games with an unknown date count as unplayed).
Standings compute_standings(const config::Season& season);

}  // namespace standfast::engine

#endif  // STANDFAST_ENGINE_STANDINGS_H
