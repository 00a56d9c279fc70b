#include "tools/stakes_report.h"

#include <fmt/core.h>

#include <algorithm>
#include <cmath>
#include <limits>
#include <nlohmann/json.hpp>

#include "tools/odds_report.h"
#include "tools/output.h"

namespace standfast::tools {

const char* stake_chance_name(StakeChance c) {
  return c == StakeChance::kDivision ? "division" : "postseason";
}

namespace {

using nlohmann::ordered_json;

const std::vector<engine::ConditionalChance>& chances(const StakeGame& g, StakeChance c) {
  return c == StakeChance::kDivision ? g.division : g.postseason;
}

const engine::SwingTotal& total(const StakeGame& g, StakeChance c) {
  return c == StakeChance::kDivision ? g.division_total : g.postseason_total;
}

// The value a game is ranked by.
double rank_value(const StakesReport& r, const StakeGame& g) {
  if (r.team >= 0) return std::abs(team_stake(r, g, r.ranked_by).difference);
  return total(g, r.ranked_by).moved;
}

std::string date_text(const StakeGame& g) {
  return g.day ? config::format_date(*g.day) : std::string("not dated");
}

std::string pct(double p) { return fmt::format("{:.1f}%", 100 * p); }
std::string pp(double d) { return fmt::format("{:+.1f}", 100 * d); }

// The team that a game moves most (largest absolute swing of the chance), with its swing.
std::pair<int, double> most_moved(const StakeGame& g, StakeChance c) {
  const auto& v = chances(g, c);
  int best = -1;
  double swing = 0;
  for (std::size_t t = 0; t < v.size(); ++t) {
    if (best < 0 || std::abs(v[t].swing) > std::abs(swing)) {
      best = static_cast<int>(t);
      swing = v[t].swing;
    }
  }
  return {best, swing};
}

std::size_t shown(const StakesReport& r) {
  return r.top == 0 ? r.games.size() : std::min(r.top, r.games.size());
}

std::string days_text(const StakesReport& r) {
  if (r.days == 0) return "every remaining game";
  const config::DayNumber last = r.first_day + r.days - 1;
  if (r.days == 1) return config::format_date(r.first_day);
  return fmt::format("{} to {}", config::format_date(r.first_day), config::format_date(last));
}

ordered_json conditional_json(const engine::ConditionalChance& c) {
  return {{"if_home_wins", c.if_home_wins},
          {"if_away_wins", c.if_away_wins},
          {"swing", c.swing},
          {"se", c.se}};
}

ordered_json stake_json(const engine::TeamStake& s) {
  return {
      {"if_wins", s.if_wins}, {"if_loses", s.if_loses}, {"difference", s.difference}, {"se", s.se}};
}

ordered_json total_json(const engine::SwingTotal& t) {
  return {{"moved", t.moved}, {"noise", t.noise}};
}

}  // namespace

engine::TeamStake team_stake(const StakesReport& r, const StakeGame& g, StakeChance c) {
  const auto t = static_cast<std::size_t>(r.team);
  return engine::for_team(chances(g, c)[t], g.home == r.team);
}

StakesReport make_stakes_report(const config::Season& season, const engine::Plan& plan,
                                const engine::SwingResult& result, int team,
                                StakeChance ranked_by) {
  StakesReport r;
  r.league = season.league.name;
  r.season_label = season.league.season_label;
  r.ranked_by = ranked_by;
  r.team = team;
  for (std::size_t t = 0; t < season.teams.size(); ++t) {
    StakeTeam st;
    st.id = season.teams[t].id;
    st.name = season.teams[t].name.empty() ? st.id : season.teams[t].name;
    st.division = result.odds.teams[t].division;
    st.postseason = result.odds.teams[t].postseason;
    r.teams.push_back(std::move(st));
  }
  for (const engine::GameSwing& gs : result.games) {
    StakeGame g;
    const config::DayNumber d = plan.day[gs.game];
    if (d != std::numeric_limits<config::DayNumber>::max()) g.day = d;
    const auto source = static_cast<std::size_t>(plan.game_index[gs.game]);
    if (source < season.games.size()) g.number = season.games[source].number;
    g.home = plan.home_team[gs.game];
    g.away = plan.away_team[gs.game];
    g.home_win_share = gs.home_win_share;
    g.division = gs.division;
    g.postseason = gs.postseason;
    g.division_total = engine::total_swing(g.division);
    g.postseason_total = engine::total_swing(g.postseason);
    r.games.push_back(std::move(g));
  }
  // Largest first; equal values keep the date order of the plan (stable sort).
  std::stable_sort(r.games.begin(), r.games.end(), [&](const StakeGame& a, const StakeGame& b) {
    return rank_value(r, a) > rank_value(r, b);
  });
  return r;
}

std::string write_stakes_table(const StakesReport& r) {
  const char* chance = stake_chance_name(r.ranked_by);
  std::string out;
  if (r.team >= 0) {
    const StakeTeam& t = r.teams[static_cast<std::size_t>(r.team)];
    out += fmt::format(
        "Games that matter to {} ({}), {} ({}): {}, ranked by the difference in "
        "its {} chance between winning and losing the game\n",
        t.name, t.id, r.league, r.season_label, days_text(r), chance);
  } else {
    out += fmt::format(
        "Games that matter in {} ({}): {}, ranked by the {} chance that changes "
        "hands between teams with the result\n",
        r.league, r.season_label, days_text(r), chance);
  }
  out += provenance_line(r.run) + "\n";
  out += std::string(ODDS_CAUTION) + "\n";
  if (r.games.empty()) {
    out += r.team >= 0 ? "\nThe team has no remaining game in these days.\n"
                       : "\nNo remaining game is dated in these days.\n";
    return out;
  }
  if (r.team >= 0) {
    const StakeTeam& t = r.teams[static_cast<std::size_t>(r.team)];
    out +=
        fmt::format("Now: division {}, postseason {}.\n\n", pct(t.division.p), pct(t.postseason.p));
    out += fmt::format("{:<10}  {:<12}  {:>7}  {:>21}  {:>21}\n", "", "", "", "Postseason chance",
                       "Division chance");
    out += fmt::format("{:<10}  {:<12}  {:>7}  {:>6} {:>6} {:>7}  {:>6} {:>6} {:>7}\n", "Date",
                       "Game", "Wins it", "win", "loss", "diff", "win", "loss", "diff");
    for (std::size_t i = 0; i < shown(r); ++i) {
      const StakeGame& g = r.games[i];
      const bool home = g.home == r.team;
      const StakeTeam& opp = r.teams[static_cast<std::size_t>(home ? g.away : g.home)];
      const std::string game = fmt::format("{} {}{}", home ? "vs" : "at", opp.id,
                                           g.number > 1 ? fmt::format(" ({})", g.number) : "");
      const double wins = home ? g.home_win_share : 1 - g.home_win_share;
      const engine::TeamStake p = team_stake(r, g, StakeChance::kPostseason);
      const engine::TeamStake d = team_stake(r, g, StakeChance::kDivision);
      out += fmt::format("{:<10}  {:<12}  {:>7}  {:>6} {:>6} {:>7}  {:>6} {:>6} {:>7}\n",
                         date_text(g), game, pct(wins), pct(p.if_wins), pct(p.if_loses),
                         pp(p.difference), pct(d.if_wins), pct(d.if_loses), pp(d.difference));
    }
    out += fmt::format(
        "\nWins it: share of the simulated seasons in which {} won the game. win / loss: its "
        "chance "
        "in the seasons it won / lost the game; diff = win - loss in percentage points (standard "
        "errors in CSV and JSON).\n",
        t.id);
  } else {
    out += "\n";
    out += fmt::format("{:<10}  {:<16}  {:>8}  {:>17}  {:>17}  {}\n", "Date", "Game", "Home win",
                       "Postseason moved", "Division moved", "Moves most");
    for (std::size_t i = 0; i < shown(r); ++i) {
      const StakeGame& g = r.games[i];
      const std::string game =
          fmt::format("{} at {}{}", r.teams[static_cast<std::size_t>(g.away)].id,
                      r.teams[static_cast<std::size_t>(g.home)].id,
                      g.number > 1 ? fmt::format(" ({})", g.number) : "");
      const auto [who, swing] = most_moved(g, r.ranked_by);
      const auto moved = [](const engine::SwingTotal& t) {
        return fmt::format("{:.1f} ({:.1f})", 100 * t.moved, 100 * t.noise);
      };
      out += fmt::format("{:<10}  {:<16}  {:>8}  {:>17}  {:>17}  {} {:.1f}\n", date_text(g), game,
                         pct(g.home_win_share), moved(g.postseason_total), moved(g.division_total),
                         r.teams[static_cast<std::size_t>(who)].id, 100 * std::abs(swing));
    }
    out +=
        "\nHome win: share of the simulated seasons the home side won the game. moved: the chance "
        "that changes hands between teams with the game's result, in percentage points (half the "
        "sum over teams of |chance if the home side wins - chance if it loses|); in brackets, "
        "what Monte Carlo noise alone would give. Moves most: the team whose chance the result "
        "moves most, and by how much.\n";
  }
  if (shown(r) < r.games.size())
    out += fmt::format("{} of {} games shown (--top); CSV and JSON list them all.\n", shown(r),
                       r.games.size());
  return out;
}

std::string write_stakes_csv(const StakesReport& r) {
  std::string out;
  if (r.team >= 0) {
    out +=
        "rank,team_id,date,game_number,home_id,away_id,opponent_id,at_home,win_share,"
        "postseason_if_win,postseason_if_loss,postseason_difference,postseason_se,"
        "division_if_win,division_if_loss,division_difference,division_se,ranked_by";
  } else {
    out +=
        "rank,date,game_number,home_id,away_id,home_win_share,postseason_moved,postseason_noise,"
        "division_moved,division_noise,most_moved_id,most_moved_swing,ranked_by";
  }
  out += provenance_csv_header() + "\n";
  const std::string cells = provenance_csv_cells(r.run);
  for (std::size_t i = 0; i < r.games.size(); ++i) {
    const StakeGame& g = r.games[i];
    const std::string date = g.day ? config::format_date(*g.day) : std::string();
    const std::string& home = r.teams[static_cast<std::size_t>(g.home)].id;
    const std::string& away = r.teams[static_cast<std::size_t>(g.away)].id;
    if (r.team >= 0) {
      const bool at_home = g.home == r.team;
      const engine::TeamStake p = team_stake(r, g, StakeChance::kPostseason);
      const engine::TeamStake d = team_stake(r, g, StakeChance::kDivision);
      out += fmt::format(
          "{},{},{},{},{},{},{},{},{:.6f},{:.6f},{:.6f},{:.6f},{:.6f},{:.6f},{:.6f},{:.6f},{:.6f},"
          "{}",
          i + 1, csv_field(r.teams[static_cast<std::size_t>(r.team)].id), date, g.number,
          csv_field(home), csv_field(away), csv_field(at_home ? away : home),
          at_home ? "true" : "false", at_home ? g.home_win_share : 1 - g.home_win_share, p.if_wins,
          p.if_loses, p.difference, p.se, d.if_wins, d.if_loses, d.difference, d.se,
          stake_chance_name(r.ranked_by));
    } else {
      const auto [who, swing] = most_moved(g, r.ranked_by);
      out +=
          fmt::format("{},{},{},{},{},{:.6f},{:.6f},{:.6f},{:.6f},{:.6f},{},{:.6f},{}", i + 1, date,
                      g.number, csv_field(home), csv_field(away), g.home_win_share,
                      g.postseason_total.moved, g.postseason_total.noise, g.division_total.moved,
                      g.division_total.noise, csv_field(r.teams[static_cast<std::size_t>(who)].id),
                      swing, stake_chance_name(r.ranked_by));
    }
    out += cells + "\n";
  }
  return out;
}

std::string write_stakes_json(const StakesReport& r) {
  ordered_json doc;
  doc["schema_version"] = STAKES_SCHEMA_VERSION;
  doc["kind"] = r.team >= 0 ? "team" : "league";
  doc["caution"] = std::string(ODDS_CAUTION);
  doc["league"] = r.league;
  doc["season"] = r.season_label;
  doc["ranked_by"] = stake_chance_name(r.ranked_by);
  doc["team_id"] = r.team >= 0 ? ordered_json(r.teams[static_cast<std::size_t>(r.team)].id)
                               : ordered_json(nullptr);
  if (r.days > 0) {
    doc["first_day"] = config::format_date(r.first_day);
    doc["days"] = r.days;
  } else {
    doc["first_day"] = nullptr;
    doc["days"] = nullptr;
  }
  ordered_json teams = ordered_json::array();
  for (const StakeTeam& t : r.teams) {
    teams.push_back({{"team_id", t.id},
                     {"team_name", t.name},
                     {"division", {{"p", t.division.p}, {"se", t.division.se}}},
                     {"postseason", {{"p", t.postseason.p}, {"se", t.postseason.se}}}});
  }
  doc["teams"] = teams;
  ordered_json games = ordered_json::array();
  for (std::size_t i = 0; i < r.games.size(); ++i) {
    const StakeGame& g = r.games[i];
    ordered_json j;
    j["rank"] = i + 1;
    j["date"] = g.day ? ordered_json(config::format_date(*g.day)) : ordered_json(nullptr);
    j["game_number"] = g.number;
    j["home_id"] = r.teams[static_cast<std::size_t>(g.home)].id;
    j["away_id"] = r.teams[static_cast<std::size_t>(g.away)].id;
    j["home_win_share"] = g.home_win_share;
    if (r.team >= 0) {
      j["at_home"] = g.home == r.team;
      j["postseason"] = stake_json(team_stake(r, g, StakeChance::kPostseason));
      j["division"] = stake_json(team_stake(r, g, StakeChance::kDivision));
    } else {
      j["postseason_moved"] = total_json(g.postseason_total);
      j["division_moved"] = total_json(g.division_total);
      ordered_json per = ordered_json::array();
      for (std::size_t t = 0; t < r.teams.size(); ++t) {
        if (g.postseason[t].swing == 0 && g.division[t].swing == 0) continue;
        per.push_back({{"team_id", r.teams[t].id},
                       {"postseason", conditional_json(g.postseason[t])},
                       {"division", conditional_json(g.division[t])}});
      }
      j["teams"] = per;
    }
    games.push_back(std::move(j));
  }
  doc["games"] = games;
  doc["run"] = provenance_json(r.run);
  return doc.dump(2) + "\n";
}

}  // namespace standfast::tools
