// One game: both regulation scores sampled from the league's scoring family, then, if tied,
// extra innings played half-inning by half-inning.
//
// Extra innings (our model; the constants are common practice / from memory, stated here):
// a half-inning's runs follow a zero-modified geometric law,
//   P(0) = 1 - s,  P(k) = s (1 - q) q^(k-1) for k >= 1,  q = RUN_CONTINUATION = 0.43,
// so a scoring half-inning averages 1/(1-q) = 1.75 runs. s is set so that the mean per
// half-inning is the side's expected runs per game / regulation innings: s = (mu / innings)(1-q).
// At 4.5 runs per game that gives s = 0.285 (about 71% of half-innings scoreless; from memory).
// With the automatic runner on second, s is multiplied by RUNNER_FACTOR = 2.2 (run-expectancy
// tables put the chance of scoring with a runner on second and nobody out near 0.6 against
// about 0.27 with the bases empty; from memory), capped at S_MAX = 0.95.
// A half-inning takes one 32-bit uniform (ExtraInnings::half_inning_runs).
// The visitors bat first; the home side bats in the bottom half and stops as soon as it leads
// (a walk-off counts only the runs up to the winning run). A game still tied after the innings
// cap (ExtraInningsRule::max_innings) is settled by a fair draw and counted as drawn.
// Bounded time for any input: a side's chance of scoring in a half-inning is at least
// S_MIN = 0.05 (it binds only below about 0.8 expected runs a game, far under any real side), and
// a game still tied after MAX_EXTRA_INNINGS = 100 extra innings is settled by the same draw,
// also in the postseason and with no league cap. At real scoring rates (s near 0.28) a tie
// lasts 100 innings with a chance below 1e-25; the longest professional games went a little
// over 30 innings (from memory).
//
// Log5 family: no scores and no innings; the home side wins with probability
// odds_h H^g / (odds_h H^g + odds_a), odds = p / (1 - p) of each side's win percentage: the home
// odds are multiplied by the home edge H (Plan::home_edge) raised to the shape g (Plan::shape);
// engine/season_runner.h computes the factor H^g once per season (Bradley-Terry / log5,
// REFERENCE_VALUES section 5).
#ifndef STANDFAST_ENGINE_GAME_H
#define STANDFAST_ENGINE_GAME_H

#include <cstdint>

#include "config/season.h"
#include "engine/plan.h"
#include "engine/rng.h"
#include "engine/score_table.h"

namespace standfast::engine {

struct GameResult {
  int home_runs = 0;
  int away_runs = 0;
  bool home_won = false;
  bool extra = false;  // went to extra innings
  bool drawn = false;  // tied at the innings cap, settled by a draw
};

// One pairing's parameters (home side at its venue against the away side), computed once and
// used for every game of the pairing: per side the Weibull scale or the count family's mean
// (log5: `home` is the home side's chance of winning), and each side's chance of scoring in an
// extra half-inning.
struct Sides {
  double home = 0, away = 0;  // adjacent: WeibullTable::score_pair reads both at once
  double home_chance = 0, away_chance = 0;
};

class ExtraInnings {
 public:
  static constexpr double RUN_CONTINUATION = 0.43;
  static constexpr double RUNNER_FACTOR = 2.2;
  static constexpr double S_MAX = 0.95;
  static constexpr double S_MIN = 0.05;
  static constexpr int MAX_EXTRA_INNINGS = 100;

  ExtraInnings() = default;
  ExtraInnings(int regulation_innings, const config::ExtraInningsRule& rule);

  // Chance that a side with `mean` expected runs per game scores in an extra half-inning.
  double scoring_chance(double mean) const {
    const double s = mean * per_inning_;
    return s < S_MAX ? (s > S_MIN ? s : S_MIN) : S_MAX;
  }

  // Runs of one half-inning from one 32-bit uniform u (0 when not scoring), at most `stop` (the
  // walk-off limit; stop >= 1). The side scores when u < s 2^32; given that, u / (s 2^32) is
  // again uniform, so counting the k = 0, 1, 2, ... with u < s q^k 2^32 gives P(runs > k |
  // scoring) = q^k, the geometric law above, from the same draw. The first six comparisons
  // are made without branches (more than six runs: q^5 = 1.5% of scoring half-innings). (The
  // 32-bit grain cuts the law off where s q^k 2^32 < 1: beyond 20 runs for any s >= 0.01.)
  static int half_inning_runs(std::uint32_t u, double s, int stop) {
    constexpr double q = RUN_CONTINUATION;
    const auto x = static_cast<double>(u);
    const double t = s * 0x1.0p32;
    int runs = (x < t) + (x < t * q) + (x < t * (q * q)) + (x < t * (q * q * q)) +
               (x < t * (q * q * q * q)) + (x < t * (q * q * q * q * q));
    if (runs == 6) [[unlikely]] {
      for (double tk = t * (q * q * q * q * q * q); x < tk; tk *= q) ++runs;
    }
    return runs < stop ? runs : stop;
  }

  // One extra inning from 64 random bits: the visitors' half from the high 32, the home half
  // from the low 32 (stopping once the home side leads).
  struct Inning {
    int home, away;
  };
  static Inning inning(std::uint64_t bits, double home_chance, double away_chance) {
    const int away = half_inning_runs(static_cast<std::uint32_t>(bits >> 32), away_chance, 1 << 30);
    const int home = half_inning_runs(static_cast<std::uint32_t>(bits), home_chance, away + 1);
    return {home, away};
  }

  // The same from the rng (its high 32 bits).
  static int half_inning(Rng& rng, double s, int stop) {
    return half_inning_runs(static_cast<std::uint32_t>(rng() >> 32), s, stop);
  }

  // Plays from a tie; adds the extra runs to `r` and sets home_won, extra and drawn. One draw
  // per inning: the visitors' half takes its high 32 bits, the home half its low 32 bits.
  // `cap_innings`: false in the postseason (a series game is played to a decision).
  void play(Rng& rng, double home_mean, double away_mean, GameResult& r,
            bool cap_innings = true) const {
    play_chances(rng, scoring_chance(home_mean), scoring_chance(away_mean), r, cap_innings);
  }

  // The same with the sides' scoring chances per half-inning (scoring_chance of their means):
  // play_all for one game.
  void play_chances(Rng& rng, double home_chance, double away_chance, GameResult& r,
                    bool cap_innings = true) const;

  // Extra innings of n tied games together. Each pass plays the next inning of every game still
  // tied, one draw per game in game order (inning()), and keeps the still-tied ones, without a
  // branch per game. With cap_innings, the games still tied after the league's innings cap are
  // settled by a fair draw (one draw each, in order); so are, always, the games still tied after
  // MAX_EXTRA_INNINGS extra innings. sides(i) gives game i's scoring chances
  // (a const Sides&); `open` is scratch space for n indexes; out[i] receives game i's extra runs
  // and winner. Returns the number of games settled by the draw.
  struct Outcome {
    std::uint32_t home_runs = 0, away_runs = 0;
    bool home_won = false;
  };
  template <class SidesOf>
  std::size_t play_all(Rng& rng, std::size_t n, SidesOf&& sides, std::uint32_t* open, Outcome* out,
                       bool cap_innings) const {
    return play_all_with([&rng](std::uint32_t, int) { return rng(); }, n, sides, open, out,
                         cap_innings);
  }

  // The same with the random bits of game i's inning `number` (0 for the draw at the cap) from
  // bits(i, number), called in the order play_all draws. A source keyed by the game rather than
  // a shared stream keeps every game's extra innings the same when other games' ties change
  // (common random numbers across scenarios, engine/compare.h).
  template <class Bits, class SidesOf>
  std::size_t play_all_with(Bits&& bits, std::size_t n, SidesOf&& sides, std::uint32_t* open,
                            Outcome* out, bool cap_innings) const {
    for (std::size_t i = 0; i < n; ++i) {
      open[i] = static_cast<std::uint32_t>(i);
      out[i] = Outcome{};
    }
    std::size_t still_open = n;
    const int last =
        cap_innings && max_innings_ > 0 ? max_innings_ : regulation_ + MAX_EXTRA_INNINGS;
    for (int number = regulation_ + 1; still_open > 0; ++number) {
      if (number > last) {
        for (std::size_t k = 0; k < still_open; ++k)
          out[open[k]].home_won = (bits(open[k], 0) >> 63) != 0;
        return still_open;
      }
      std::size_t next = 0;
      for (std::size_t k = 0; k < still_open; ++k) {
        const std::uint32_t i = open[k];
        const Sides& p = sides(i);
        const Inning x = inning(bits(i, number), p.home_chance, p.away_chance);
        out[i].home_runs += static_cast<std::uint32_t>(x.home);
        out[i].away_runs += static_cast<std::uint32_t>(x.away);
        out[i].home_won = x.home > x.away;
        open[next] = i;
        next += x.home == x.away;
      }
      still_open = next;
    }
    return 0;
  }

  int regulation_innings() const { return regulation_; }
  int max_innings() const { return max_innings_; }  // 0: no cap

 private:
  int regulation_ = 9;
  int max_innings_ = 0;
  double per_inning_ = 0;  // (1 - q) / innings, times RUNNER_FACTOR with the runner rule
};

// The run's game machinery: the model, its tables and the extra-innings rule.
class GameEngine {
 public:
  GameEngine() = default;
  explicit GameEngine(const Plan& plan);

  GameModel model() const { return model_; }
  const WeibullTable& weibull() const { return weibull_; }
  const CountTable& counts() const { return counts_; }
  const ExtraInnings& extra_innings() const { return extra_; }

  // The parameters of sides with these expected runs (score families) or, for log5, these odds
  // (p / (1 - p); the home odds already multiplied by home_edge^shape). A Weibull scale is capped
  // so that a regulation score is at most max_regulation_runs() (the cap is thousands of runs per
  // game, far outside any real league): the season loop then needs no clamp.
  Sides sides(double home_mean, double away_mean, double home_odds = 1.0,
              double away_odds = 1.0) const {
    Sides s;
    switch (model_) {
      case GameModel::kWeibull:
        set_sides<GameModel::kWeibull>(s, home_mean, away_mean, home_odds, away_odds);
        break;
      case GameModel::kNegativeBinomial:
      case GameModel::kPoisson:
        set_sides<GameModel::kPoisson>(s, home_mean, away_mean, home_odds, away_odds);
        break;
      case GameModel::kLog5:
        set_sides<GameModel::kLog5>(s, home_mean, away_mean, home_odds, away_odds);
        break;
    }
    return s;
  }
  // The same into `s`, for a model known at compile time (M must be the engine's model; the
  // negative binomial and the Poisson share their parameters). Writes in place: the season's
  // matchup loop calls it for every matchup.
  template <GameModel M>
  void set_sides(Sides& s, double home_mean, double away_mean, double home_odds,
                 double away_odds) const {
    if constexpr (M == GameModel::kWeibull) {
      const double mean[2] = {home_mean, away_mean};
      weibull_.scale_pair(mean, &s.home);
      s.home = s.home < scale_cap_ ? s.home : scale_cap_;
      s.away = s.away < scale_cap_ ? s.away : scale_cap_;
    } else if constexpr (M == GameModel::kLog5) {
      s.home = home_odds / (home_odds + away_odds);
    } else {
      s.home = home_mean;
      s.away = away_mean;
    }
    s.home_chance = extra_.scoring_chance(home_mean);
    s.away_chance = extra_.scoring_chance(away_mean);
  }
  // The largest regulation score of any family: Weibull scales are capped for it, and count
  // draws never exceed CountTable::MAX_SCORE. The season loop relies on it (no clamp).
  static constexpr int max_regulation_runs() { return 16383; }
  static_assert(CountTable::MAX_SCORE <= 16383, "count draws must stay within the bound");

  // One game: both regulation scores, then extra innings from a tie (score families); log5: the
  // winner only, no runs. `cap`: false plays extra innings to a decision (postseason).
  GameResult play(Rng& rng, const Sides& s, bool cap = true) const {
    GameResult r;
    switch (model_) {
      case GameModel::kWeibull: {
        const WeibullTable::Pair score = weibull_.score_pair(rng(), &s.home);
        r.home_runs = score.home;
        r.away_runs = score.away;
        break;
      }
      case GameModel::kNegativeBinomial:
      case GameModel::kPoisson:
        r.home_runs = counts_.score(rng(), s.home);
        r.away_runs = counts_.score(rng(), s.away);
        break;
      case GameModel::kLog5:
        r.home_won = uniform01(rng) < s.home;
        return r;
    }
    if (r.home_runs == r.away_runs) [[unlikely]] {
      extra_.play_chances(rng, s.home_chance, s.away_chance, r, cap);
      return r;
    }
    r.home_won = r.home_runs > r.away_runs;
    return r;
  }

 private:
  GameModel model_ = GameModel::kWeibull;
  WeibullTable weibull_;
  CountTable counts_;
  ExtraInnings extra_;
  double scale_cap_ = 0;
};

}  // namespace standfast::engine

#endif  // STANDFAST_ENGINE_GAME_H
