#include "engine/plan.h"

#include <algorithm>
#include <cmath>
#include <limits>
#include <map>
#include <numeric>
#include <stdexcept>
#include <string>
#include <tuple>

#include "engine/postseason.h"
#include "models/ratings.h"

namespace standfast::engine {

namespace {

[[noreturn]] void fail(const std::string& what) {
  throw std::invalid_argument("compile_plan: " + what);
}

int next_pow2(int q) {
  int p = 1;
  while (p < q) p *= 2;
  return p;
}

int log2i(int p) {
  int r = 0;
  while ((1 << r) < p) ++r;
  return r;
}

GameModel game_model(config::ScoreFamily f) {
  switch (f) {
    case config::ScoreFamily::kWeibull:
      return GameModel::kWeibull;
    case config::ScoreFamily::kNegativeBinomial:
      return GameModel::kNegativeBinomial;
    case config::ScoreFamily::kPoisson:
      return GameModel::kPoisson;
    case config::ScoreFamily::kLog5:
      return GameModel::kLog5;
  }
  return GameModel::kWeibull;
}

void compile_postseason(const config::Season& season, Plan& plan) {
  const auto& ps = season.postseason;
  plan.postseason = ps.enabled && !ps.rounds.empty() && !ps.qualifying.empty();
  if (!plan.postseason) return;
  plan.reseed = ps.reseed;
  for (const auto& r : ps.rounds) {
    PlanRound pr;
    pr.name = r.name;
    pr.best_of = r.best_of;
    if (r.best_of < 1 || r.best_of % 2 == 0)
      fail("round '" + r.name + "': best_of must be odd and >= 1, got " +
           std::to_string(r.best_of));
    for (std::size_t g = 0; g < r.higher_hosts.size() && g < 32; ++g)
      if (r.higher_hosts[g]) pr.higher_hosts |= 1u << g;
    if (r.higher_hosts.empty())  // not stated: alternate, higher seed first
      for (int g = 0; g < r.best_of && g < 32; g += 2) pr.higher_hosts |= 1u << g;
    plan.rounds.push_back(pr);
  }
  const int total_rounds = static_cast<int>(plan.rounds.size());
  auto make_bracket = [&](int q, int byes, int rounds_available, const std::string& where) {
    PlanBracket b;
    b.qualifiers = q;
    const int p = next_pow2(q);
    b.rounds = log2i(p);
    if (p - q != byes)
      fail(where + ": " + std::to_string(q) + " qualifiers with " + std::to_string(byes) +
           " byes cannot fill a bracket (needs " + std::to_string(p - q) + " byes)");
    if (b.rounds > rounds_available)
      fail(where + ": " + std::to_string(q) + " qualifiers need " + std::to_string(b.rounds) +
           " rounds, only " + std::to_string(rounds_available) + " configured");
    b.byes = byes;
    b.order = standard_bracket_order(p);
    b.first_round = rounds_available - b.rounds;
    return b;
  };
  if (ps.format == config::BracketFormat::kSingleBracket) {
    int q = 0, byes = 0, winners = 0, at_large = 0;
    for (const auto& c : ps.qualifying) {
      q += c.division_winners + c.at_large;
      byes += c.byes;
      winners += c.division_winners;
      at_large += c.at_large;
    }
    PlanBracket b = make_bracket(q, byes, total_rounds, "single bracket");
    b.division_winners = winners;
    b.at_large = at_large;
    b.winners_first = ps.qualifying.front().winners_first;
    plan.brackets.push_back(b);
    plan.max_seed = q;
    return;
  }
  const int conferences = static_cast<int>(ps.qualifying.size());
  int final_rounds = 0;
  if (conferences > 1) {
    plan.final_stage = true;
    PlanBracket f;
    const int p = next_pow2(conferences);
    f.qualifiers = conferences;
    f.rounds = log2i(p);
    f.byes = p - conferences;
    f.order = standard_bracket_order(p);
    f.first_round = total_rounds - f.rounds;
    if (f.first_round < 0) fail("not enough rounds for a final between the conferences");
    final_rounds = f.rounds;
    plan.final_bracket = f;
  }
  for (int i = 0; i < conferences; ++i) {
    const auto& c = ps.qualifying[static_cast<std::size_t>(i)];
    std::string where = "conference";
    if (c.conference >= 0 && c.conference < static_cast<int>(season.groups.size()))
      where += " '" + season.groups[static_cast<std::size_t>(c.conference)].id + "'";
    PlanBracket b =
        make_bracket(c.division_winners + c.at_large, c.byes, total_rounds - final_rounds, where);
    b.conference = c.conference;
    const auto it = std::find(season.conferences.begin(), season.conferences.end(), c.conference);
    b.conference_position =
        it == season.conferences.end() ? i : static_cast<int>(it - season.conferences.begin());
    b.division_winners = c.division_winners;
    b.at_large = c.at_large;
    b.winners_first = c.winners_first;
    plan.max_seed = std::max(plan.max_seed, b.qualifiers);
    plan.brackets.push_back(b);
  }
}

}  // namespace

Plan compile_plan(const config::Season& season, const models::LeagueRatings& ratings,
                  const PlanEdits& edits) {
  Plan plan;
  const int n = static_cast<int>(season.teams.size());
  if (n < 2) fail("a league needs at least two teams, got " + std::to_string(n));
  if (n > 30000) fail("too many teams: " + std::to_string(n));
  if (static_cast<int>(ratings.teams.size()) != n)
    fail("ratings for " + std::to_string(ratings.teams.size()) + " teams, season has " +
         std::to_string(n));
  plan.teams = n;
  plan.model = game_model(ratings.family);
  plan.league_mean = ratings.league_mean;
  plan.home_edge = ratings.home_edge;
  if (plan.model == GameModel::kWeibull) plan.shape = ratings.shape;
  if (plan.model == GameModel::kNegativeBinomial) plan.nb_size = ratings.shape;
  if (season.model.shape && plan.model != GameModel::kWeibull) plan.shape = *season.model.shape;
  if (!(plan.league_mean > 0) || !std::isfinite(plan.league_mean))
    fail("league mean must be finite and > 0, got " + std::to_string(plan.league_mean));
  if (!(plan.home_edge > 0) || !std::isfinite(plan.home_edge))
    fail("home edge must be finite and > 0, got " + std::to_string(plan.home_edge));
  if (!(plan.shape > 0) || !std::isfinite(plan.shape))
    fail("shape must be finite and > 0, got " + std::to_string(plan.shape));
  plan.regulation_innings = season.league.regulation_innings;
  plan.extra_innings = season.league.extra_innings;

  // Strengths.
  const auto un = static_cast<std::size_t>(n);
  plan.log_offence.resize(un);
  plan.log_defence.resize(un);
  bool any_se = false;
  for (std::size_t t = 0; t < un; ++t) {
    const auto& r = ratings.teams[t];
    if (!(r.offence > 0) || !(r.defence > 0))
      fail("team '" + season.teams[t].id + "': offence and defence must be > 0");
    plan.log_offence[t] = std::log(r.offence);
    plan.log_defence[t] = std::log(r.defence);
    any_se = any_se || r.log_offence_se > 0 || r.log_defence_se > 0;
  }
  if (season.model.strength_uncertainty && plan.model != GameModel::kLog5) {
    if (!ratings.strengths.empty()) {
      if (ratings.strengths.teams != n) fail("strength sampler for a different number of teams");
      plan.strengths = ratings.strengths;
      plan.draw_strengths = true;
    } else if (any_se) {  // no joint uncertainty: independent draws from the standard errors
      std::vector<double> so(un), sd(un);
      for (std::size_t t = 0; t < un; ++t) {
        so[t] = ratings.teams[t].log_offence_se;
        sd[t] = ratings.teams[t].log_defence_se;
      }
      plan.strengths = models::diagonal_sampler(so, sd);
      plan.draw_strengths = true;
    }
  }
  // Log5 strengths: the Pythagorean expectation of the fitted runs against an average side.
  plan.win_pct.resize(un);
  for (std::size_t t = 0; t < un; ++t) {
    const double rs = std::pow(ratings.teams[t].offence, plan.shape);
    const double ra = std::pow(ratings.teams[t].defence, plan.shape);
    plan.win_pct[t] = rs / (rs + ra);
  }

  // Overrides: per team in date order (no `from` first, file order within a date); each
  // distinct date opens a period whose steps are every override of the team up to it.
  std::vector<std::vector<const config::TeamOverride*>> by_team(un);
  for (const auto& o : season.overrides) {
    if (o.team < 0 || o.team >= n) fail("override for team index " + std::to_string(o.team));
    by_team[static_cast<std::size_t>(o.team)].push_back(&o);
  }
  constexpr config::DayNumber FROM_START = std::numeric_limits<config::DayNumber>::min();
  auto from_of = [](const config::TeamOverride* o) { return o->from ? *o->from : FROM_START; };
  std::vector<int> first_period(un, -1), period_count(un, 0);
  for (std::size_t t = 0; t < un; ++t) {
    auto& list = by_team[t];
    std::stable_sort(list.begin(), list.end(),
                     [&](const auto* a, const auto* b) { return from_of(a) < from_of(b); });
    std::vector<OverrideStep> steps;
    for (std::size_t i = 0; i < list.size(); ++i) {
      const config::TeamOverride& o = *list[i];
      OverrideStep st;
      if (o.runs_scored) {
        st.has_runs_scored = true;
        st.offence = *o.runs_scored / plan.league_mean;
      }
      if (o.runs_allowed) {
        st.has_runs_allowed = true;
        st.defence = *o.runs_allowed / plan.league_mean;
      }
      if (o.win_pct) {
        st.has_win_pct = true;
        st.win_pct = *o.win_pct;
      }
      st.blend = o.blend;
      st.add_offence = o.add_runs_scored / plan.league_mean;
      st.add_defence = o.add_runs_allowed / plan.league_mean;
      const auto& r = ratings.teams[t];
      // sd_runs / runs is the stated standard deviation of the log rate; the drawn deviation has
      // the fitted one (no spread to scale when the fit has none).
      if (o.sd_runs && o.runs_scored && r.log_offence_se > 0)
        st.offence_scale = *o.sd_runs / *o.runs_scored / r.log_offence_se;
      if (o.sd_runs && o.runs_allowed && r.log_defence_se > 0)
        st.defence_scale = *o.sd_runs / *o.runs_allowed / r.log_defence_se;
      if (plan.model == GameModel::kLog5 && (o.add_runs_scored != 0 || o.add_runs_allowed != 0))
        fail("team '" + season.teams[t].id +
             "': added runs need a scoring family; the log5 model takes win_pct only");
      steps.push_back(st);
      const bool last_of_date = i + 1 == list.size() || from_of(list[i + 1]) != from_of(list[i]);
      if (!last_of_date) continue;
      if (plan.model == GameModel::kLog5 &&
          std::none_of(steps.begin(), steps.end(), [](const auto& x) { return x.has_win_pct; }))
        fail("team '" + season.teams[t].id + "': the log5 model needs a win_pct override");
      if (first_period[t] < 0) first_period[t] = static_cast<int>(plan.overrides.size());
      ++period_count[t];
      plan.overrides.push_back(SlotOverride{static_cast<std::uint16_t>(t), from_of(&o), steps});
    }
  }
  plan.slots = n + static_cast<int>(plan.overrides.size());
  if (plan.slots > 65535) fail("too many overrides: " + std::to_string(plan.overrides.size()));

  // Teams and groups.
  for (const auto& t : season.teams) {
    plan.team_ids.push_back(t.id);
    plan.team_division.push_back(t.division);
    plan.team_conference.push_back(t.conference);
    plan.run_factor.push_back(t.run_factor);
  }
  plan.divisions = season.divisions;
  plan.conferences = season.conferences;

  // Remaining games in date order (undated last, file order within a day).
  std::vector<int> order;
  std::vector<int> games(un, 0);
  plan.played_wins.assign(un, 0);
  plan.played_losses.assign(un, 0);
  for (std::size_t i = 0; i < season.games.size(); ++i) {
    const auto& g = season.games[i];
    if (g.home < 0 || g.home >= n || g.away < 0 || g.away >= n || g.home == g.away)
      fail("game " + std::to_string(i) + ": bad team indexes");
    ++games[static_cast<std::size_t>(g.home)];
    ++games[static_cast<std::size_t>(g.away)];
    // A played game with no date is left out of the record (engine/season_record.h); it is
    // treated as still to play.
    if (g.played && g.date) {
      const bool home_won = g.home_runs > g.away_runs;
      ++(home_won ? plan.played_wins : plan.played_losses)[static_cast<std::size_t>(g.home)];
      ++(home_won ? plan.played_losses : plan.played_wins)[static_cast<std::size_t>(g.away)];
      continue;
    }
    order.push_back(static_cast<int>(i));
  }
  plan.max_games = *std::max_element(games.begin(), games.end());
  constexpr auto UNDATED = std::numeric_limits<config::DayNumber>::max();
  auto day_of = [&](int i) {
    const auto& d = season.games[static_cast<std::size_t>(i)].date;
    return d ? *d : UNDATED;
  };
  // Draw order: by date, added games (PlanEdits) after all the others.
  const auto added = [&](int i) { return edits.added_from >= 0 && i >= edits.added_from; };
  std::stable_sort(order.begin(), order.end(), [&](int a, int b) {
    return std::pair(added(a), day_of(a)) < std::pair(added(b), day_of(b));
  });
  // Removed and forced games, by index into Season::games (0 = neither).
  std::vector<std::int8_t> edit(season.games.size(), 0);
  constexpr std::int8_t REMOVED = 1, HOME_WINS = 2, AWAY_WINS = 3;
  auto mark = [&](int i, std::int8_t what) {
    if (i < 0 || static_cast<std::size_t>(i) >= season.games.size())
      fail("scenario edit of game index " + std::to_string(i) + ": no such game");
    const auto& g = season.games[static_cast<std::size_t>(i)];
    if (g.played && g.date) fail("scenario edit of game " + std::to_string(i) + ": already played");
    if (edit[static_cast<std::size_t>(i)] != 0)
      fail("game " + std::to_string(i) + " is removed or decided twice");
    edit[static_cast<std::size_t>(i)] = what;
  };
  for (int i : edits.removed) mark(i, REMOVED);
  for (const auto& [i, home_wins] : edits.forced) mark(i, home_wins ? HOME_WINS : AWAY_WINS);
  // Matchups: games with the same slots and venue factors; a matchup is closed after
  // TotalsLayout::MAX_GROUP_GAMES games (the season's tally groups games by matchup). A forced
  // game has a matchup of its own; removed games have their own matchups, numbered last.
  std::map<std::tuple<std::uint16_t, std::uint16_t, float, float>, std::uint32_t> matchup_index,
      removed_index;
  std::vector<std::uint32_t> matchup_size;
  std::vector<Matchup> removed_matchups;
  std::vector<std::uint32_t> removed_size;
  constexpr std::uint32_t REMOVED_TAG = 1u << 31;
  for (int i : order) {
    const auto& g = season.games[static_cast<std::size_t>(i)];
    const config::DayNumber day = day_of(i);
    auto slot = [&](int team) {  // the team's latest period that has begun by `day`
      const auto t = static_cast<std::size_t>(team);
      int s = team;
      for (int k = first_period[t]; k >= 0 && k < first_period[t] + period_count[t]; ++k)
        if (plan.overrides[static_cast<std::size_t>(k)].from <= day) s = n + k;
      return static_cast<std::uint16_t>(s);
    };
    plan.home_team.push_back(static_cast<std::uint16_t>(g.home));
    plan.away_team.push_back(static_cast<std::uint16_t>(g.away));
    const double rf = season.teams[static_cast<std::size_t>(g.home)].run_factor;
    const Matchup m{slot(g.home), slot(g.away), static_cast<float>(rf * plan.home_edge),
                    static_cast<float>(rf)};
    const auto key = std::make_tuple(m.home_slot, m.away_slot, m.home_factor, m.away_factor);
    const std::int8_t what = edit[static_cast<std::size_t>(i)];
    if (what == REMOVED) {
      auto it = removed_index.find(key);
      if (it == removed_index.end() || removed_size[it->second] == TotalsLayout::MAX_GROUP_GAMES) {
        it =
            removed_index.insert_or_assign(key, static_cast<std::uint32_t>(removed_matchups.size()))
                .first;
        removed_matchups.push_back(m);
        removed_size.push_back(0);
      }
      ++removed_size[it->second];
      plan.game_matchup.push_back(it->second | REMOVED_TAG);
    } else if (what != 0) {
      plan.forced.push_back(ForcedGame{static_cast<std::uint32_t>(plan.game_matchup.size()),
                                       static_cast<std::uint32_t>(plan.matchups.size()),
                                       what == HOME_WINS});
      plan.game_matchup.push_back(static_cast<std::uint32_t>(plan.matchups.size()));
      plan.matchups.push_back(m);
      matchup_size.push_back(1);
    } else {
      auto it = matchup_index.find(key);
      if (it == matchup_index.end() || matchup_size[it->second] == TotalsLayout::MAX_GROUP_GAMES) {
        it = matchup_index.insert_or_assign(key, static_cast<std::uint32_t>(plan.matchups.size()))
                 .first;
        plan.matchups.push_back(m);
        matchup_size.push_back(0);
      }
      ++matchup_size[it->second];
      plan.game_matchup.push_back(it->second);
    }
    plan.day.push_back(day);
    plan.game_index.push_back(i);
  }

  for (std::size_t t = 0; t < un; ++t)
    plan.final_slot.push_back(static_cast<std::uint16_t>(
        period_count[t] > 0 ? n + first_period[t] + period_count[t] - 1 : static_cast<int>(t)));
  plan.counted_matchups = static_cast<std::uint32_t>(plan.matchups.size());
  for (auto& m : plan.game_matchup)
    if (m & REMOVED_TAG) m = (m & ~REMOVED_TAG) + plan.counted_matchups;
  plan.matchups.insert(plan.matchups.end(), removed_matchups.begin(), removed_matchups.end());
  plan.chronological.resize(order.size());
  std::iota(plan.chronological.begin(), plan.chronological.end(), 0u);
  std::stable_sort(plan.chronological.begin(), plan.chronological.end(),
                   [&](std::uint32_t a, std::uint32_t b) { return plan.day[a] < plan.day[b]; });
  plan.played = played_record(season);
  plan.totals = TotalsLayout(plan.home_team, plan.away_team, plan.game_matchup, plan.played,
                             plan.counted_matchups, plan.chronological);
  plan.seeder = Seeder(season);
  compile_postseason(season, plan);
  return plan;
}

}  // namespace standfast::engine
