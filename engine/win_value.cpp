#include "engine/win_value.h"

#include <tbb/blocked_range.h>
#include <tbb/enumerable_thread_specific.h>
#include <tbb/global_control.h>
#include <tbb/parallel_for.h>

#include <algorithm>
#include <boost/math/tools/roots.hpp>
#include <cmath>
#include <limits>
#include <optional>
#include <stdexcept>
#include <string>

#include "engine/season_runner.h"
#include "engine/shift_replay.h"
#include "models/win_chance.h"

namespace standfast::engine {

namespace {

constexpr std::uint64_t GRAIN = 8;  // seasons per task (any value gives the same result)

config::ScoreFamily family_of(GameModel m) {
  switch (m) {
    case GameModel::kWeibull:
      return config::ScoreFamily::kWeibull;
    case GameModel::kNegativeBinomial:
      return config::ScoreFamily::kNegativeBinomial;
    case GameModel::kPoisson:
      return config::ScoreFamily::kPoisson;
    case GameModel::kLog5:
      break;
  }
  return config::ScoreFamily::kLog5;
}

// The season values at the point estimates (no strength drawn), overrides applied.
struct PointValues {
  std::vector<double> off, def, odds;
  double home_odds_factor = 1;
};

PointValues point_values(const Plan& plan) {
  detail::SeasonRunner runner(plan, false);
  detail::Worker w(plan);
  runner.draw_point_estimates(w);
  return PointValues{w.off, w.def, w.odds, runner.home_odds_factor()};
}

double expected_wins_at(const Plan& plan, const PointValues& base, int team, double shift) {
  PointValues v = base;
  const auto n = static_cast<std::size_t>(plan.teams);
  const auto team_of = [&](std::size_t slot) {
    return slot < n ? static_cast<int>(slot) : static_cast<int>(plan.overrides[slot - n].team);
  };
  for (std::size_t s = 0; s < v.off.size(); ++s)
    if (team_of(s) == team) shift_strength(plan, shift, v.off[s], v.def[s], v.odds[s]);
  std::vector<std::uint32_t> games(plan.matchups.size());
  for (std::size_t g = 0; g < plan.remaining_games(); ++g)
    if (plan.home_team[g] == team || plan.away_team[g] == team) ++games[plan.game_matchup[g]];
  const config::ScoreFamily family = family_of(plan.model);
  const double shape = plan.model == GameModel::kNegativeBinomial ? plan.nb_size : plan.shape;
  double sum = 0;
  for (std::size_t i = 0; i < plan.matchups.size(); ++i) {
    if (games[i] == 0) continue;
    const Matchup& m = plan.matchups[i];
    const bool home = team_of(m.home_slot) == team;
    double p_home;
    if (plan.model == GameModel::kLog5) {
      p_home =
          models::log5_win_chance(v.odds[m.home_slot] * base.home_odds_factor, v.odds[m.away_slot]);
    } else {
      const double hm =
          v.off[m.home_slot] * v.def[m.away_slot] * static_cast<double>(m.home_factor);
      const double am =
          v.off[m.away_slot] * v.def[m.home_slot] * static_cast<double>(m.away_factor);
      p_home = models::game_win_chance(family, shape, hm, am);
    }
    sum += static_cast<double>(games[i]) * (home ? p_home : 1 - p_home);
  }
  return sum;
}

void check_team(const Plan& plan, int team) {
  if (team < 0 || team >= plan.teams)
    throw std::invalid_argument("win value: no team " + std::to_string(team));
}

// The shift for `wins` added expected wins; NaN when out of reach.
double solve_shift(const Plan& plan, const PointValues& base, int team, double wins) {
  if (wins == 0) return 0;
  const double e0 = expected_wins_at(plan, base, team, 0);
  auto f = [&](double shift) { return expected_wins_at(plan, base, team, shift) - e0 - wins; };
  const double limit = plan.model == GameModel::kLog5 ? 30.0 : 4.0 * plan.league_mean;
  double lo = wins > 0 ? 0.0 : -limit, hi = wins > 0 ? limit : 0.0;
  double flo = wins > 0 ? -wins : f(lo), fhi = wins > 0 ? f(hi) : -wins;
  if (!(flo < 0 && fhi > 0)) return std::numeric_limits<double>::quiet_NaN();
  boost::uintmax_t iterations = 100;
  const auto r = boost::math::tools::toms748_solve(
      f, lo, hi, flo, fhi, boost::math::tools::eps_tolerance<double>(40), iterations);
  return (r.first + r.second) / 2;
}

// One thread's state: the replay and the tallies.
struct ThreadState {
  ShiftReplay replay;
  std::vector<TeamWinValue> teams;
  std::vector<TeamOutcome> outcomes;  // one team's points in the current season

  ThreadState(const Plan& plan, bool postseason, const std::vector<TeamWinValue>& shape)
      : replay(plan, postseason), teams(shape) {
    outcomes.resize(shape.empty() ? 0 : shape.front().points.size());
  }
};

bool chance_of(const TeamOutcome& o, int c) {
  switch (c) {
    case 0:
      return o.division;
    case 1:
      return o.postseason;
    case 2:
      return o.bye;
    default:
      return o.title;
  }
}

void add_joint(JointCounts& j, const TeamOutcome& a, const TeamOutcome& b) {
  for (int c = 0; c < WIN_VALUE_CHANCES; ++c) {
    const bool x = chance_of(a, c), y = chance_of(b, c);
    j.a_only[c] += x && !y;
    j.b_only[c] += y && !x;
  }
  const std::int64_t d = b.wins - a.wins;
  j.wins_diff += d;
  j.wins_diff_sq += static_cast<std::uint64_t>(d * d);
}

void merge_joint(JointCounts& into, const JointCounts& j) {
  for (int c = 0; c < WIN_VALUE_CHANCES; ++c) {
    into.a_only[c] += j.a_only[c];
    into.b_only[c] += j.b_only[c];
  }
  into.wins_diff += j.wins_diff;
  into.wins_diff_sq += j.wins_diff_sq;
}

void play_season(ThreadState& st, const SeasonStreams& streams, int span) {
  ShiftReplay& rep = st.replay;
  rep.baseline(streams);
  const int max_wins = rep.plan().max_games;
  for (std::size_t t = 0; t < st.teams.size(); ++t) {
    TeamWinValue& tv = st.teams[t];
    const int team = static_cast<int>(t);
    const TeamOutcome base = rep.baseline_outcome(team);
    const auto w = static_cast<std::size_t>(std::clamp(base.wins, 0, max_wins));
    ++tv.by_wins[w];
    tv.by_wins_postseason[w] += base.postseason;
    tv.by_wins_division[w] += base.division;
    for (std::size_t j = 0; j < tv.points.size(); ++j) {
      WinPoint& p = tv.points[j];
      if (!p.reachable) continue;
      const TeamOutcome o = static_cast<int>(j) == span ? base : rep.shifted(team, p.shift);
      st.outcomes[j] = o;
      for (int c = 0; c < WIN_VALUE_CHANCES; ++c) p.count[c] += chance_of(o, c);
      p.wins_sum += static_cast<std::uint64_t>(o.wins);
      p.wins_sq += static_cast<std::uint64_t>(o.wins) * static_cast<std::uint64_t>(o.wins);
      if (j > 0 && tv.points[j - 1].reachable) add_joint(tv.steps[j - 1], st.outcomes[j - 1], o);
    }
    if (span == 0) continue;
    const auto minus = static_cast<std::size_t>(span - 1),
               plus = static_cast<std::size_t>(span + 1);
    if (tv.points[minus].reachable && tv.points[plus].reachable)
      add_joint(tv.marginal, st.outcomes[minus], st.outcomes[plus]);
  }
}

}  // namespace

double expected_remaining_wins(const Plan& plan, int team, double shift) {
  check_team(plan, team);
  return expected_wins_at(plan, point_values(plan), team, shift);
}

double shift_for_wins(const Plan& plan, int team, double wins) {
  check_team(plan, team);
  return solve_shift(plan, point_values(plan), team, wins);
}

WinValueResult win_value(const Plan& plan, const RunOptions& options, int span) {
  if (span < 0 || span > 20)
    throw std::invalid_argument("win value: span must be 0 to 20, got " + std::to_string(span));
  if (options.threads < 0)
    throw std::invalid_argument("win value: threads must be >= 0, got " +
                                std::to_string(options.threads));
  if (options.batch == 0) throw std::invalid_argument("win value: batch must be > 0");
  if (plan.teams < 2) throw std::invalid_argument("win value: the plan has no league");
  std::optional<tbb::global_control> control;
  if (options.threads > 0)
    control.emplace(tbb::global_control::max_allowed_parallelism,
                    static_cast<std::size_t>(options.threads));

  // The shifts: the same for every season.
  const PointValues base = point_values(plan);
  std::vector<TeamWinValue> shape(static_cast<std::size_t>(plan.teams));
  for (int t = 0; t < plan.teams; ++t) {
    TeamWinValue& tv = shape[static_cast<std::size_t>(t)];
    for (int k = -span; k <= span; ++k) {
      WinPoint p;
      p.added_wins = k;
      const double s = solve_shift(plan, base, t, k);
      p.reachable = !std::isnan(s);
      p.shift = p.reachable ? s : 0.0;
      tv.points.push_back(p);
    }
    tv.steps.resize(static_cast<std::size_t>(2 * span));
    const auto wins = static_cast<std::size_t>(plan.max_games) + 1;
    tv.by_wins.assign(wins, 0);
    tv.by_wins_postseason.assign(wins, 0);
    tv.by_wins_division.assign(wins, 0);
  }

  tbb::enumerable_thread_specific<ThreadState> states(
      [&] { return ThreadState(plan, options.postseason, shape); });
  std::uint64_t done = 0;
  while (done < options.seasons) {
    const std::uint64_t end = std::min(options.seasons, done + options.batch);
    tbb::parallel_for(
        tbb::blocked_range<std::uint64_t>(done, end, GRAIN),
        [&](const tbb::blocked_range<std::uint64_t>& range) {
          ThreadState& st = states.local();
          for (std::uint64_t s = range.begin(); s < range.end(); ++s)
            play_season(st, SeasonStreams(options.seed, s), span);
        },
        tbb::simple_partitioner());
    done = end;
    if (options.progress) options.progress(done, options.seasons);
  }

  WinValueResult out;
  out.seasons = done;
  out.seed = options.seed;
  out.span = span;
  out.log_odds = plan.model == GameModel::kLog5;
  out.teams = shape;
  for (const ThreadState& st : states) {
    for (std::size_t t = 0; t < out.teams.size(); ++t) {
      TeamWinValue& into = out.teams[t];
      const TeamWinValue& from = st.teams[t];
      for (std::size_t j = 0; j < into.points.size(); ++j) {
        for (int c = 0; c < WIN_VALUE_CHANCES; ++c)
          into.points[j].count[c] += from.points[j].count[c];
        into.points[j].wins_sum += from.points[j].wins_sum;
        into.points[j].wins_sq += from.points[j].wins_sq;
      }
      for (std::size_t j = 0; j < into.steps.size(); ++j) merge_joint(into.steps[j], from.steps[j]);
      merge_joint(into.marginal, from.marginal);
      for (std::size_t w = 0; w < into.by_wins.size(); ++w) {
        into.by_wins[w] += from.by_wins[w];
        into.by_wins_postseason[w] += from.by_wins_postseason[w];
        into.by_wins_division[w] += from.by_wins_division[w];
      }
    }
  }
  return out;
}

Estimate point_estimate(const WinPoint& p, int chance, std::uint64_t n) {
  Estimate e;
  if (n == 0 || !p.reachable) return e;
  const double nn = static_cast<double>(n);
  if (chance >= WIN_VALUE_CHANCES) {
    e.value = static_cast<double>(p.wins_sum) / nn;
    const double var = std::max(static_cast<double>(p.wins_sq) / nn - e.value * e.value, 0.0);
    e.se = std::sqrt(var / nn);
    return e;
  }
  e.value = static_cast<double>(p.count[chance]) / nn;
  e.se = std::sqrt(e.value * (1 - e.value) / nn);
  return e;
}

PairedChance joint_change(const WinPoint& a, const WinPoint& b, const JointCounts& j, int chance,
                          std::uint64_t n) {
  if (n == 0 || !a.reachable || !b.reachable) return PairedChance{};
  if (chance < WIN_VALUE_CHANCES)
    return paired_chance(a.count[chance], b.count[chance], j.a_only[chance], j.b_only[chance], n);
  const double nn = static_cast<double>(n);
  const Estimate ea = point_estimate(a, chance, n), eb = point_estimate(b, chance, n);
  PairedChance c;
  c.base = ea.value;
  c.alt = eb.value;
  c.diff = static_cast<double>(j.wins_diff) / nn;
  c.se_paired =
      std::sqrt(std::max(static_cast<double>(j.wins_diff_sq) / nn - c.diff * c.diff, 0.0) / nn);
  c.se_unpaired = std::sqrt(ea.se * ea.se + eb.se * eb.se);
  return c;
}

Estimate marginal_value(const TeamWinValue& t, int chance, std::uint64_t n) {
  const std::size_t span = t.points.size() / 2;
  if (span == 0) return Estimate{std::numeric_limits<double>::quiet_NaN(), 0};
  const PairedChance c =
      joint_change(t.points[span - 1], t.points[span + 1], t.marginal, chance, n);
  if (!t.points[span - 1].reachable || !t.points[span + 1].reachable)
    return Estimate{std::numeric_limits<double>::quiet_NaN(), 0};
  return Estimate{c.diff / 2, c.se_paired / 2};
}

}  // namespace standfast::engine
