#include "tools/odds_report.h"

#include <fmt/core.h>

#include <algorithm>
#include <cmath>
#include <cstdint>
#include <nlohmann/json.hpp>

#include "tools/certainty_text.h"
#include "tools/commands.h"
#include "tools/output.h"

namespace standfast::tools {
namespace {

using engine::Certainty;

// True when group `g` or one of its ancestors has this id.
bool within_group(const config::Season& season, int g, const std::string& id) {
  for (; g >= 0; g = season.groups[g].parent) {
    if (season.groups[g].id == id) return true;
  }
  return false;
}

// Projected final record from the mean wins and losses, rounded so that the two add up to the
// rounded mean number of decided games.
std::string projected_record(const engine::TeamOdds& o) {
  const long w = std::lround(o.mean_wins);
  const long l = std::lround(o.mean_wins + o.mean_losses) - w;
  return fmt::format("{}-{}", w, l);
}

std::string win_range(const engine::TeamOdds& o) {
  return fmt::format("{}-{}", std::lround(o.wins_p10), std::lround(o.wins_p90));
}

// Bye and title are lost for sure once the berth is; the exact computation may say more.
Certainty follows_berth(const OddsTeam& t, Certainty exact) {
  return t.marks.berth == Certainty::kEliminated ? Certainty::kEliminated : exact;
}
Certainty bye_mark(const OddsTeam& t) { return follows_berth(t, t.certainty.bye); }
Certainty title_mark(const OddsTeam& t) { return follows_berth(t, t.certainty.title); }

const char* status_name(Certainty c) {
  switch (c) {
    case Certainty::kClinched:
      return "clinched";
    case Certainty::kEliminated:
      return "eliminated";
    case Certainty::kOpen:
      break;
  }
  return "";
}

std::string pad_left(const std::string& s, std::size_t width) {
  return s.size() >= width ? s : std::string(width - s.size(), ' ') + s;
}
std::string pad_right(const std::string& s, std::size_t width) {
  return s.size() >= width ? s : s + std::string(width - s.size(), ' ');
}

// The report's provenance with the seed and season count of the run it holds.
Provenance run_of(const OddsReport& r) {
  Provenance p = r.run;
  p.seed = r.seed;
  p.seasons = r.seasons;
  return p;
}

}  // namespace

OddsReport make_odds_report(const config::Season& season, const engine::SimulationResult& result,
                            std::span<const engine::ClinchRecord> records,
                            std::span<const engine::ClinchMarks> marks, double target_se,
                            const std::string& only_group) {
  const std::size_t n = season.teams.size();
  if (result.teams.size() != n || records.size() != n || marks.size() != n) {
    throw std::invalid_argument("make_odds_report: team counts of season and result differ");
  }
  if (!only_group.empty()) {
    const bool known = std::any_of(season.groups.begin(), season.groups.end(),
                                   [&](const config::Group& g) { return g.id == only_group; });
    if (!known) {
      throw UsageError(fmt::format("no conference or division has the id '{}'", only_group));
    }
  }

  OddsReport r;
  r.league = season.league.name;
  r.season_label = season.league.season_label;
  r.seed = result.seed;
  r.seasons = result.seasons;
  r.max_se = result.max_se;
  r.target_se = target_se;
  r.stopped_early = result.stopped_early;
  r.extra_innings_share = result.extra_innings_share;
  r.games_simulated = result.games_simulated;
  r.extra_innings_games = result.extra_innings_games;
  r.drawn_games = result.drawn_games;
  r.postseason = season.postseason.enabled;
  for (const auto& q : season.postseason.qualifying) r.byes = r.byes || q.byes > 0;
  r.byes = r.byes && r.postseason;
  r.round_names = result.round_names;

  std::vector<int> row_of(n, -1);
  for (std::size_t t = 0; t < n; ++t) {
    const config::Team& team = season.teams[t];
    if (!only_group.empty() && !within_group(season, team.division, only_group)) continue;
    OddsTeam row;
    row.index = static_cast<int>(t);
    row.id = team.id;
    row.name = team.name.empty() ? team.id : team.name;
    if (team.conference >= 0) {
      row.conference_id = season.groups[team.conference].id;
      row.conference_name = season.groups[team.conference].name;
    }
    if (team.division >= 0) {
      row.division_id = season.groups[team.division].id;
      row.division_name = season.groups[team.division].name;
    }
    row.wins = records[t].wins;
    row.losses = records[t].losses;
    row.games_left = records[t].remaining;
    row.marks = marks[t];
    if (!r.postseason) row.marks.berth = Certainty::kOpen;
    row.odds = result.teams[t];
    row_of[t] = static_cast<int>(r.teams.size());
    r.teams.push_back(std::move(row));
  }

  for (int d : season.divisions) {
    OddsDivision div;
    div.name = season.groups[d].name.empty() ? season.groups[d].id : season.groups[d].name;
    for (int t : season.groups[d].teams) {
      if (row_of[t] >= 0) div.rows.push_back(row_of[t]);
    }
    if (div.rows.empty()) continue;
    div.conference_name = r.teams[div.rows.front()].conference_name;
    std::stable_sort(div.rows.begin(), div.rows.end(), [&](int a, int b) {
      const OddsTeam& x = r.teams[a];
      const OddsTeam& y = r.teams[b];
      // Winning percentage so far, exact; no games counts .500.
      const std::int64_t xg = x.wins + x.losses, yg = y.wins + y.losses;
      const std::int64_t lhs = (xg == 0 ? 1 : 2 * std::int64_t{x.wins}) * (yg == 0 ? 2 : yg);
      const std::int64_t rhs = (yg == 0 ? 1 : 2 * std::int64_t{y.wins}) * (xg == 0 ? 2 : xg);
      if (lhs != rhs) return lhs > rhs;
      if (x.odds.mean_wins != y.odds.mean_wins) return x.odds.mean_wins > y.odds.mean_wins;
      return x.index < y.index;
    });
    r.divisions.push_back(std::move(div));
  }
  return r;
}

void attach_certainty(OddsReport& report, std::span<const engine::TeamCertainty> certainty) {
  for (OddsTeam& t : report.teams) {
    if (t.index < 0 || static_cast<std::size_t>(t.index) >= certainty.size()) {
      throw std::invalid_argument("attach_certainty: one entry per team of the season is needed");
    }
    t.certainty = certainty[static_cast<std::size_t>(t.index)];
    t.marks.division = t.certainty.division.mark;
    t.marks.berth = report.postseason ? t.certainty.berth.mark : Certainty::kOpen;
  }
  report.certainty = true;
}

std::string format_chance(double p, Certainty certainty) {
  if (certainty == Certainty::kClinched) return "clinched";
  if (certainty == Certainty::kEliminated) return "eliminated";
  if (p >= 1.0) return "100%*";
  if (p <= 0.0) return "0%*";
  const std::string text = fmt::format("{:.1f}", 100.0 * p);
  if (text == "0.0") return "<0.1%";
  if (text == "100.0") return ">99.9%";
  return text + "%";
}

std::string write_odds_table(const OddsReport& r) {
  std::string out;
  out += fmt::format("{}, {}: odds from {} simulated seasons\n", r.league, r.season_label,
                     group_digits(r.seasons));
  out += ODDS_CAUTION;
  out += '\n';
  out += provenance_line(run_of(r)) + '\n';
  out += fmt::format("Largest standard error {:.2f} percentage points", 100.0 * r.max_se);
  out +=
      fmt::format("; extra innings in {:.1f}% of simulated games\n", 100.0 * r.extra_innings_share);
  if (r.stopped_early) {
    out += fmt::format(
        "Stopped early: the largest standard error fell below the target of {:.2f} percentage "
        "points.\n",
        100.0 * r.target_se);
  }

  std::size_t name_width = 4;
  for (const auto& t : r.teams) name_width = std::max(name_width, t.name.size());

  struct Column {
    const char* label;
    std::size_t width;
  };
  std::vector<Column> cols = {
      {"Record", 7}, {"Left", 4}, {"Projected", 9}, {"Win range", 9}, {"Division", 10}};
  if (r.postseason) {
    cols.push_back({"Postseason", 10});
    if (r.byes) cols.push_back({"Bye", 10});
    cols.push_back({"Title", 10});
  }
  if (r.certainty) {
    cols.push_back({"Div M/E", 7});
    if (r.postseason) cols.push_back({"Post M/E", 8});
  }

  for (const auto& div : r.divisions) {
    out += '\n';
    if (div.conference_name.empty() || div.conference_name == div.name) {
      out += fmt::format("{}\n", div.name);
    } else {
      out += fmt::format("{} - {}\n", div.conference_name, div.name);
    }
    std::string head = pad_right("Team", name_width);
    for (const auto& c : cols) head += "  " + pad_left(c.label, c.width);
    out += head + '\n';
    for (int row : div.rows) {
      const OddsTeam& t = r.teams[row];
      std::vector<std::string> cells = {fmt::format("{}-{}", t.wins, t.losses),
                                        fmt::format("{}", t.games_left), projected_record(t.odds),
                                        win_range(t.odds),
                                        format_chance(t.odds.division.p, t.marks.division)};
      if (r.postseason) {
        cells.push_back(format_chance(t.odds.postseason.p, t.marks.berth));
        if (r.byes) cells.push_back(format_chance(t.odds.bye.p, bye_mark(t)));
        cells.push_back(format_chance(t.odds.title.p, title_mark(t)));
      }
      if (r.certainty) {
        cells.push_back(magic_cell(t.certainty.division, false));
        if (r.postseason) cells.push_back(magic_cell(t.certainty.berth, false));
      }
      std::string line = pad_right(t.name, name_width);
      for (std::size_t i = 0; i < cols.size(); ++i)
        line += "  " + pad_left(cells[i], cols[i].width);
      line.erase(line.find_last_not_of(' ') + 1);
      out += line + '\n';
    }
  }

  out += '\n';
  out +=
      "Record: wins-losses so far. Left: games still to play. Projected: mean final record. "
      "Win range: 10th to 90th percentile of final wins.\n";
  out +=
      "clinched/eliminated: certain from the standings alone. 100%*/0%*: in all/none of the "
      "simulated seasons, but not yet certain from the standings.\n";
  if (r.certainty) {
    out +=
        "M/E: magic number (further wins that make it certain whatever else happens) / "
        "elimination number (further losses that end it); -: its own results alone cannot "
        "decide it; ?: not computed (work limit).\n";
  }
  return out;
}

std::string write_odds_csv(const OddsReport& r) {
  std::string out =
      "team_id,team_name,conference,division,wins,losses,games_left,mean_wins,mean_losses,"
      "wins_p10,wins_p50,wins_p90,division_p,division_se,division_status,division_magic,"
      "division_elimination";
  if (r.postseason) {
    out +=
        ",postseason_p,postseason_se,postseason_status,postseason_magic,postseason_elimination,"
        "bye_p,bye_se,bye_status,title_p,title_se,title_status";
    for (std::size_t k = 0; k < r.round_names.size(); ++k) {
      out += fmt::format(",round{}_p,round{}_se", k + 1, k + 1);
    }
  }
  out += provenance_csv_header();
  out += '\n';
  const std::string run_cells = provenance_csv_cells(run_of(r));
  for (const auto& div : r.divisions) {
    for (int row : div.rows) {
      const OddsTeam& t = r.teams[row];
      const auto& o = t.odds;
      const auto& c = t.certainty;
      out += fmt::format("{},{},{},{},{},{},{},{:.3f},{:.3f},{:g},{:g},{:g},{:.6f},{:.6f},{},{},{}",
                         csv_field(t.id), csv_field(t.name), csv_field(t.conference_id),
                         csv_field(t.division_id), t.wins, t.losses, t.games_left, o.mean_wins,
                         o.mean_losses, o.wins_p10, o.wins_p50, o.wins_p90, o.division.p,
                         o.division.se, status_name(t.marks.division),
                         r.certainty ? number_field(c.division.magic) : "",
                         r.certainty ? number_field(c.division.elimination) : "");
      if (r.postseason) {
        out += fmt::format(",{:.6f},{:.6f},{},{},{},{:.6f},{:.6f},{},{:.6f},{:.6f},{}",
                           o.postseason.p, o.postseason.se, status_name(t.marks.berth),
                           r.certainty ? number_field(c.berth.magic) : "",
                           r.certainty ? number_field(c.berth.elimination) : "", o.bye.p, o.bye.se,
                           status_name(bye_mark(t)), o.title.p, o.title.se,
                           status_name(title_mark(t)));
        for (std::size_t k = 0; k < r.round_names.size(); ++k) {
          const engine::Probability p =
              k < o.reached_round.size() ? o.reached_round[k] : engine::Probability{};
          out += fmt::format(",{:.6f},{:.6f}", p.p, p.se);
        }
      }
      out += run_cells;
      out += '\n';
    }
  }
  return out;
}

std::string write_odds_json(const OddsReport& r) {
  using nlohmann::ordered_json;
  auto chance = [](const engine::Probability& p) { return ordered_json{{"p", p.p}, {"se", p.se}}; };

  ordered_json run = provenance_json(run_of(r));
  const ordered_json details = {
      {"league", r.league},
      {"season", r.season_label},
      {"seed", r.seed},
      {"seasons", r.seasons},
      {"max_se", r.max_se},
      {"target_se", r.target_se},
      {"stopped_early", r.stopped_early},
      {"games_simulated", r.games_simulated},
      {"extra_innings_games", r.extra_innings_games},
      {"extra_innings_share", r.extra_innings_share},
      {"drawn_games", r.drawn_games},
      {"postseason", r.postseason},
      {"rounds", r.round_names},
  };
  for (const auto& [key, value] : details.items()) run[key] = value;

  ordered_json teams = ordered_json::array();
  for (const auto& div : r.divisions) {
    for (int row : div.rows) {
      const OddsTeam& t = r.teams[row];
      const auto& o = t.odds;
      ordered_json team = {
          {"team_id", t.id},
          {"team_name", t.name},
          {"conference", t.conference_id},
          {"division", t.division_id},
          {"record", {{"wins", t.wins}, {"losses", t.losses}, {"games_left", t.games_left}}},
          {"projected",
           {{"mean_wins", o.mean_wins},
            {"mean_losses", o.mean_losses},
            {"wins_p10", o.wins_p10},
            {"wins_p50", o.wins_p50},
            {"wins_p90", o.wins_p90}}},
      };
      ordered_json division = chance(o.division);
      // Magic and elimination numbers: null when they do not exist (or were not computed).
      auto numbers = [&](ordered_json& j, const engine::OutcomeCertainty& c) {
        if (!r.certainty) return;
        j["magic_number"] = c.magic >= 0 ? ordered_json(c.magic) : ordered_json(nullptr);
        j["elimination_number"] =
            c.elimination >= 0 ? ordered_json(c.elimination) : ordered_json(nullptr);
        j["proof_complete"] = c.exact;
      };
      division["status"] = status_name(t.marks.division);
      numbers(division, t.certainty.division);
      team["division_title"] = division;
      if (r.postseason) {
        ordered_json berth = chance(o.postseason);
        berth["status"] = status_name(t.marks.berth);
        numbers(berth, t.certainty.berth);
        team["postseason"] = berth;
        ordered_json bye = chance(o.bye);
        bye["status"] = status_name(bye_mark(t));
        team["bye"] = bye;
        ordered_json title = chance(o.title);
        title["status"] = status_name(title_mark(t));
        team["title"] = title;
        ordered_json rounds = ordered_json::array();
        for (std::size_t k = 0; k < r.round_names.size(); ++k) {
          const engine::Probability p =
              k < o.reached_round.size() ? o.reached_round[k] : engine::Probability{};
          ordered_json round = {{"name", r.round_names[k]}};
          round["p"] = p.p;
          round["se"] = p.se;
          rounds.push_back(round);
        }
        team["reached_round"] = rounds;
        team["seed_histogram"] = o.seed_histogram;
      }
      // Wins histogram from the lowest to the highest final win count seen.
      std::size_t first = 0, last = o.wins_histogram.size();
      while (first < last && o.wins_histogram[first] == 0) ++first;
      while (last > first && o.wins_histogram[last - 1] == 0) --last;
      team["wins_histogram"] = {
          {"first", first},
          {"counts", std::vector<std::uint64_t>(o.wins_histogram.begin() + first,
                                                o.wins_histogram.begin() + last)}};
      teams.push_back(team);
    }
  }

  ordered_json doc = {{"schema_version", ODDS_SCHEMA_VERSION},
                      {"caution", std::string(ODDS_CAUTION)},
                      {"run", run},
                      {"teams", teams}};
  return doc.dump(2) + '\n';
}

}  // namespace standfast::tools
