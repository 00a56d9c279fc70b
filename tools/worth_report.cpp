#include "tools/worth_report.h"

#include <fmt/core.h>

#include <algorithm>
#include <cmath>
#include <nlohmann/json.hpp>
#include <numeric>

#include "tools/odds_report.h"
#include "tools/output.h"

namespace standfast::tools {

namespace {

using nlohmann::ordered_json;

struct ChanceName {
  const char* key;
  const char* label;
};
// Index c of engine/win_value.h (WIN_VALUE_CHANCES = mean final wins).
constexpr ChanceName CHANCES[] = {{"division", "division"},
                                  {"postseason", "postseason"},
                                  {"bye", "bye"},
                                  {"title", "title"},
                                  {"mean_wins", "mean wins"}};
constexpr int CHANCE_COUNT = engine::WIN_VALUE_CHANCES + 1;

const char* unit_key(const WorthReport& r) {
  return r.result.log_odds ? "log_odds" : "runs_per_game";
}

std::size_t middle(const engine::TeamWinValue& t) { return t.points.size() / 2; }

// The shift of one added win (the +1 point), or NaN.
double shift_per_win(const engine::TeamWinValue& t) {
  const engine::WinPoint& p = t.points[middle(t) + 1];
  return p.reachable ? p.shift : std::nan("");
}

std::string signed_fixed(double v, int decimals) {
  if (std::isnan(v)) return "-";
  return fmt::format("{:+.{}f}", v, decimals);
}

std::string number_or_empty(double v, int decimals) {
  return std::isnan(v) ? std::string{} : fmt::format("{:.{}f}", v, decimals);
}

ordered_json number_or_null(double v) {
  return std::isnan(v) ? ordered_json(nullptr) : ordered_json(v);
}

ordered_json wins_or_null(const std::optional<int>& w) {
  return w ? ordered_json(*w) : ordered_json(nullptr);
}

std::string wins_text(const std::optional<int>& w) { return w ? std::to_string(*w) : "-"; }

struct Thresholds {
  std::optional<int> berth50, berth90, division50, division90;
};

Thresholds thresholds(const engine::TeamWinValue& t) {
  return Thresholds{wins_for(t.by_wins, t.by_wins_postseason, 0.5),
                    wins_for(t.by_wins, t.by_wins_postseason, 0.9),
                    wins_for(t.by_wins, t.by_wins_division, 0.5),
                    wins_for(t.by_wins, t.by_wins_division, 0.9)};
}

std::string header(const WorthReport& r, const char* title) {
  std::string out = fmt::format("{}: {} ({})\n", title, r.league, r.season_label);
  out += provenance_line(r.run) + '\n';
  out += ODDS_CAUTION;
  out += "\n\n";
  return out;
}

std::string curves_table(const WorthReport& r) {
  const engine::WinValueResult& res = r.result;
  std::string out = header(r, "What one more win is worth");
  const char* unit = res.log_odds ? "log-odds" : "runs per game";
  out += fmt::format(
      "Each team made stronger or weaker by k wins over its remaining games (k = -{0} to +{0}),\n"
      "the wins converted to {1} by the fitted model{2};\n"
      "every point on the same {3} simulated seasons. Per win: the change of a chance for one\n"
      "more win (central difference at 0, in percentage points; mean wins in wins) with its\n"
      "paired standard error. Teams on the steep part of the postseason curve (buyers) first,\n"
      "those on its flat parts (sellers) last.\n\n",
      res.span, unit, res.log_odds ? "" : " (half scored, half prevented)",
      group_digits(res.seasons));
  out += fmt::format(
      "{:<6} {:>7} {:>4} {:>7} | {:>11} {:>5} {:>8} {:>6} {:>6} | postseason % "
      "at added wins\n",
      "", "", "", "", "per win:", "", "", "", "");
  out += fmt::format("{:<6} {:>7} {:>4} {:>7} | {:>11} {:>5} {:>8} {:>6} {:>6} |", "team", "W-L",
                     "left", res.log_odds ? "lo/win" : "rpg/win", "postseason", "se", "division",
                     "title", "wins");
  const engine::TeamWinValue& first = res.teams.front();
  for (const engine::WinPoint& p : first.points)
    out += fmt::format(" {:>4}",
                       p.added_wins == 0 ? std::string("0") : fmt::format("{:+d}", p.added_wins));
  out += '\n';
  for (std::size_t t : worth_order(r)) {
    const engine::TeamWinValue& tv = res.teams[t];
    const engine::Estimate post = engine::marginal_value(tv, 1, res.seasons);
    const engine::Estimate div = engine::marginal_value(tv, 0, res.seasons);
    const engine::Estimate title = engine::marginal_value(tv, 3, res.seasons);
    const engine::Estimate wins =
        engine::marginal_value(tv, engine::WIN_VALUE_CHANCES, res.seasons);
    const double per_win = shift_per_win(tv);
    out += fmt::format(
        "{:<6} {:>7} {:>4} {:>7} | {:>11} {:>5} {:>8} {:>6} {:>6} |", r.team_ids[t],
        fmt::format("{}-{}", r.wins[t], r.losses[t]), r.games_left[t],
        std::isnan(per_win) ? std::string("-") : fmt::format("{:.3f}", per_win),
        signed_fixed(100 * post.value, 2),
        std::isnan(post.value) ? std::string("-") : fmt::format("{:.2f}", 100 * post.se),
        signed_fixed(100 * div.value, 2), signed_fixed(100 * title.value, 2),
        signed_fixed(wins.value, 2));
    for (const engine::WinPoint& p : tv.points) {
      if (!p.reachable) {
        out += fmt::format(" {:>4}", "-");
        continue;
      }
      const double v = 100 * engine::point_estimate(p, 1, res.seasons).value;
      out += fmt::format(" {:>4.0f}", v);
    }
    out += '\n';
  }
  out +=
      "\n\"-\": not reachable (too few games left for that many added wins). All figures in CSV "
      "and\nJSON (--format), fields in tools/WORTH.md.\n";
  return out;
}

std::string by_wins_table(const WorthReport& r) {
  const engine::WinValueResult& res = r.result;
  std::string out = header(r, "Chances by final win total");
  out += fmt::format(
      "From {} simulated seasons: for each team, the final win total from which its chance of a\n"
      "berth (of the division) is at least 50% and 90% (every total seen in at least 20 seasons\n"
      "from there on); \"-\": no such total. Per-total chances in CSV and JSON (--format).\n\n",
      group_digits(res.seasons));
  out += fmt::format("{:<6} {:>7} {:>4} {:>9} | {:>9} {:>9} | {:>9} {:>9}\n", "", "", "", "",
                     "berth", "", "division", "");
  out += fmt::format("{:<6} {:>7} {:>4} {:>9} | {:>9} {:>9} | {:>9} {:>9}\n", "team", "W-L", "left",
                     "mean wins", "50%", "90%", "50%", "90%");
  for (std::size_t t = 0; t < res.teams.size(); ++t) {
    const engine::TeamWinValue& tv = res.teams[t];
    const Thresholds th = thresholds(tv);
    const double mean =
        engine::point_estimate(tv.points[middle(tv)], engine::WIN_VALUE_CHANCES, res.seasons).value;
    out += fmt::format("{:<6} {:>7} {:>4} {:>9.1f} | {:>9} {:>9} | {:>9} {:>9}\n", r.team_ids[t],
                       fmt::format("{}-{}", r.wins[t], r.losses[t]), r.games_left[t], mean,
                       wins_text(th.berth50), wins_text(th.berth90), wins_text(th.division50),
                       wins_text(th.division90));
  }
  return out;
}

}  // namespace

std::vector<std::size_t> worth_order(const WorthReport& r) {
  std::vector<std::size_t> order(r.result.teams.size());
  std::iota(order.begin(), order.end(), std::size_t{0});
  std::vector<double> key(order.size());
  for (std::size_t t = 0; t < order.size(); ++t) {
    const double v =
        engine::marginal_value(r.result.teams[t], r.postseason ? 1 : 0, r.result.seasons).value;
    key[t] = std::isnan(v) ? -1.0 : v;
  }
  std::stable_sort(order.begin(), order.end(),
                   [&](std::size_t a, std::size_t b) { return key[a] > key[b]; });
  return order;
}

std::optional<int> wins_for(const std::vector<std::uint64_t>& all,
                            const std::vector<std::uint64_t>& hit, double level,
                            std::uint64_t min_seasons) {
  std::optional<int> from;
  for (std::size_t w = all.size(); w-- > 0;) {
    if (all[w] < min_seasons || all[w] == 0) continue;
    if (static_cast<double>(hit[w]) < level * static_cast<double>(all[w])) break;
    from = static_cast<int>(w);
  }
  return from;
}

std::string write_worth_table(const WorthReport& r) {
  return r.by_wins ? by_wins_table(r) : curves_table(r);
}

std::string write_worth_csv(const WorthReport& r) {
  const engine::WinValueResult& res = r.result;
  std::string out;
  const std::string run_cells = provenance_csv_cells(r.run);
  if (r.by_wins) {
    out +=
        "team_id,team_name,final_wins,seasons,postseason,division,postseason_50_from,postseason_90_"
        "from,"
        "division_50_from,division_90_from";
    out += provenance_csv_header() + '\n';
    for (std::size_t t = 0; t < res.teams.size(); ++t) {
      const engine::TeamWinValue& tv = res.teams[t];
      const Thresholds th = thresholds(tv);
      auto cell = [](const std::optional<int>& w) {
        return w ? std::to_string(*w) : std::string{};
      };
      for (std::size_t w = 0; w < tv.by_wins.size(); ++w) {
        if (tv.by_wins[w] == 0) continue;
        const auto n = static_cast<double>(tv.by_wins[w]);
        out += fmt::format("{},{},{},{},{:.6f},{:.6f},{},{},{},{}", csv_field(r.team_ids[t]),
                           csv_field(r.team_names[t]), w, tv.by_wins[w],
                           static_cast<double>(tv.by_wins_postseason[w]) / n,
                           static_cast<double>(tv.by_wins_division[w]) / n, cell(th.berth50),
                           cell(th.berth90), cell(th.division50), cell(th.division90));
        out += run_cells + '\n';
      }
    }
    return out;
  }
  out += "team_id,team_name,added_wins,reachable,shift,shift_unit";
  for (int c = 0; c < CHANCE_COUNT; ++c) out += fmt::format(",{0},{0}_se", CHANCES[c].key);
  for (int c = 0; c < CHANCE_COUNT; ++c)
    out += fmt::format(",per_win_{0},per_win_{0}_se", CHANCES[c].key);
  out += provenance_csv_header() + '\n';
  for (std::size_t t : worth_order(r)) {
    const engine::TeamWinValue& tv = res.teams[t];
    std::string per_win;
    for (int c = 0; c < CHANCE_COUNT; ++c) {
      const engine::Estimate m = engine::marginal_value(tv, c, res.seasons);
      per_win += fmt::format(",{},{}", number_or_empty(m.value, 6),
                             std::isnan(m.value) ? std::string{} : fmt::format("{:.6f}", m.se));
    }
    for (const engine::WinPoint& p : tv.points) {
      out += fmt::format("{},{},{},{},{},{}", csv_field(r.team_ids[t]), csv_field(r.team_names[t]),
                         p.added_wins, p.reachable ? "true" : "false",
                         p.reachable ? fmt::format("{:.6f}", p.shift) : std::string{}, unit_key(r));
      for (int c = 0; c < CHANCE_COUNT; ++c) {
        if (!p.reachable) {
          out += ",,";
          continue;
        }
        const engine::Estimate e = engine::point_estimate(p, c, res.seasons);
        out += fmt::format(",{:.6f},{:.6f}", e.value, e.se);
      }
      out += per_win + run_cells + '\n';
    }
  }
  return out;
}

std::string write_worth_json(const WorthReport& r) {
  const engine::WinValueResult& res = r.result;
  ordered_json j;
  j["schema_version"] = WORTH_SCHEMA_VERSION;
  j["caution"] = std::string(ODDS_CAUTION);
  j["league"] = r.league;
  j["season"] = r.season_label;
  j["run"] = provenance_json(r.run);
  j["report"] = r.by_wins ? "by_wins" : "curves";
  ordered_json teams = ordered_json::array();
  if (r.by_wins) {
    for (std::size_t t = 0; t < res.teams.size(); ++t) {
      const engine::TeamWinValue& tv = res.teams[t];
      const Thresholds th = thresholds(tv);
      ordered_json team;
      team["team_id"] = r.team_ids[t];
      team["team_name"] = r.team_names[t];
      team["wins"] = r.wins[t];
      team["losses"] = r.losses[t];
      team["games_left"] = r.games_left[t];
      team["postseason_50_from"] = wins_or_null(th.berth50);
      team["postseason_90_from"] = wins_or_null(th.berth90);
      team["division_50_from"] = wins_or_null(th.division50);
      team["division_90_from"] = wins_or_null(th.division90);
      ordered_json rows = ordered_json::array();
      for (std::size_t w = 0; w < tv.by_wins.size(); ++w) {
        if (tv.by_wins[w] == 0) continue;
        const auto n = static_cast<double>(tv.by_wins[w]);
        rows.push_back({{"final_wins", w},
                        {"seasons", tv.by_wins[w]},
                        {"postseason", static_cast<double>(tv.by_wins_postseason[w]) / n},
                        {"division", static_cast<double>(tv.by_wins_division[w]) / n}});
      }
      team["by_final_wins"] = rows;
      teams.push_back(team);
    }
    j["teams"] = teams;
    return j.dump(2) + '\n';
  }
  j["span"] = res.span;
  j["shift_unit"] = unit_key(r);
  for (std::size_t t : worth_order(r)) {
    const engine::TeamWinValue& tv = res.teams[t];
    ordered_json team;
    team["team_id"] = r.team_ids[t];
    team["team_name"] = r.team_names[t];
    team["wins"] = r.wins[t];
    team["losses"] = r.losses[t];
    team["games_left"] = r.games_left[t];
    team["shift_per_win"] = number_or_null(shift_per_win(tv));
    ordered_json per_win;
    for (int c = 0; c < CHANCE_COUNT; ++c) {
      const engine::Estimate m = engine::marginal_value(tv, c, res.seasons);
      per_win[CHANCES[c].key] = {
          {"value", number_or_null(m.value)},
          {"se", std::isnan(m.value) ? ordered_json(nullptr) : ordered_json(m.se)}};
    }
    team["per_win"] = per_win;
    ordered_json points = ordered_json::array();
    for (const engine::WinPoint& p : tv.points) {
      ordered_json point;
      point["added_wins"] = p.added_wins;
      point["reachable"] = p.reachable;
      point["shift"] = p.reachable ? ordered_json(p.shift) : ordered_json(nullptr);
      for (int c = 0; c < CHANCE_COUNT; ++c) {
        if (!p.reachable) {
          point[CHANCES[c].key] = nullptr;
          continue;
        }
        const engine::Estimate e = engine::point_estimate(p, c, res.seasons);
        point[CHANCES[c].key] = {{"value", e.value}, {"se", e.se}};
      }
      points.push_back(point);
    }
    team["points"] = points;
    teams.push_back(team);
  }
  j["teams"] = teams;
  return j.dump(2) + '\n';
}

}  // namespace standfast::tools
