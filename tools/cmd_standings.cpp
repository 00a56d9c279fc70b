// `standfast standings FILE [--format table|csv|json] [--output FILE]`: the standings of the
// played games by conference and division, and the postseason field if the season ended today.
// Ranking is by winning percentage with the season's tiebreakers (a fixed random stream for
// draws, so the output is reproducible); see engine/standings.h.
#include <fmt/core.h>

#include <algorithm>
#include <memory>
#include <nlohmann/json.hpp>
#include <string>
#include <vector>

#include "config/load.h"
#include "engine/certainty.h"
#include "engine/clinch.h"
#include "engine/standings.h"
#include "tools/certainty_text.h"
#include "tools/cli.h"
#include "tools/commands.h"
#include "tools/output.h"
#include "tools/provenance.h"

namespace standfast::tools {

namespace {

using config::Season;
using engine::Standings;
using engine::StandingsLine;
using Certainties = std::vector<engine::TeamCertainty>;

constexpr int SCHEMA_VERSION = 1;

// ".617"; "1.000"; a team with no games shows ".000".
std::string pct_text(const StandingsLine& l) {
  if (l.games() == 0) return ".000";
  if (l.wins == l.games()) return "1.000";
  // Three decimals, rounded half up on the exact fraction: round(1000 w / g).
  // Below 1.000 the display stops at .999 (a record of 1999-1 would round up to 1000).
  const long thousandths = std::min(999L, (2000L * l.wins + l.games()) / (2L * l.games()));
  return fmt::format(".{:03d}", thousandths);
}

// Games back: "-" for the division leader, else "4.5", "-1.0" (ahead on games, behind on
// winning percentage).
std::string back_text(const StandingsLine& l) {
  if (l.division_leader) return "-";
  const int h = l.games_back_halves;
  const int whole = (h < 0 ? -h : h) / 2;
  return fmt::format("{}{}.{}", h < 0 ? "-" : "", whole, (h % 2 != 0) ? 5 : 0);
}

std::string record_text(int w, int l) { return fmt::format("{}-{}", w, l); }

std::string diff_text(int d) { return d > 0 ? fmt::format("+{}", d) : fmt::format("{}", d); }

// "won 3", "lost 2", "-" before the first game.
std::string streak_text(int s) {
  if (s == 0) return "-";
  return s > 0 ? fmt::format("won {}", s) : fmt::format("lost {}", -s);
}

std::string through_text(const Standings& st) {
  return st.through ? config::format_date(*st.through) : std::string("(no games played)");
}

std::string table(const Season& s, const Standings& st, const Certainties& cert,
                  const Provenance& run) {
  std::string out = fmt::format("{}, {}: standings through {} ({} games played)\n", s.league.name,
                                s.league.season_label, through_text(st), st.games_played);
  out += provenance_line(run) + "\n";
  std::size_t name_width = 4;
  for (const auto& t : s.teams) name_width = std::max(name_width, t.name.size());
  for (const auto& g : s.groups) name_width = std::max(name_width, g.name.size());
  const auto row = [&](const std::string& first, const std::vector<std::string>& cells) {
    std::string line = fmt::format("  {:<{}}", first, name_width);
    static constexpr int WIDTHS[] = {4, 5, 6, 5, 9, 7, 7, 9, 11, 8, 8, 5, 10, 10};
    for (std::size_t i = 0; i < cells.size(); ++i) {
      line += fmt::format(" {:>{}}", cells[i], WIDTHS[i]);
    }
    line.erase(line.find_last_not_of(' ') + 1);
    return line + "\n";
  };
  for (const auto& cs : st.conferences) {
    const auto& conf = s.groups[static_cast<std::size_t>(cs.conference)];
    out += fmt::format("\n{}\n", conf.name);
    for (const auto& ds : cs.divisions) {
      const auto& div = s.groups[static_cast<std::size_t>(ds.division)];
      out += "\n";
      std::vector<std::string> head = {"Won",    "Lost", "Pct",      "Back",       "Run diff",
                                       "Home",   "Road", "Division", "Conference", "Last 10",
                                       "Streak", "Seed", "Div M/E"};
      if (s.postseason.enabled) head.push_back("Post M/E");
      out += row(div.name == conf.name ? std::string("Team") : div.name, head);
      for (const auto& l : ds.lines) {
        const engine::TeamCertainty& c = cert[static_cast<std::size_t>(l.team)];
        std::vector<std::string> cells = {fmt::format("{}", l.wins),
                                          fmt::format("{}", l.losses),
                                          pct_text(l),
                                          back_text(l),
                                          diff_text(l.run_differential()),
                                          record_text(l.home_wins, l.home_losses),
                                          record_text(l.road_wins, l.road_losses),
                                          record_text(l.division_wins, l.division_losses),
                                          record_text(l.conference_wins, l.conference_losses),
                                          record_text(l.last10_wins, l.last10_losses),
                                          streak_text(l.streak),
                                          l.seed > 0 ? fmt::format("{}", l.seed) : std::string(),
                                          magic_cell(c.division, true)};
        if (s.postseason.enabled) cells.push_back(magic_cell(c.berth, true));
        out += row(s.teams[static_cast<std::size_t>(l.team)].name, cells);
      }
    }
    if (!cs.seeds.empty()) {
      out += fmt::format("\n  Postseason field of the {} if the season ended today:\n", conf.name);
      for (std::size_t i = 0; i < cs.seeds.size(); ++i) {
        const auto& team = s.teams[static_cast<std::size_t>(cs.seeds[i])];
        out += fmt::format(
            "  {:>4}. {} ({})\n", i + 1, team.name,
            static_cast<int>(i) < cs.qualifying_winners ? "division winner" : "at-large");
      }
    }
  }
  out +=
      "\nDiv M/E, Post M/E: magic number (further wins that make the division or a postseason "
      "spot certain whatever else happens) / elimination number (further losses that end the "
      "chance); -: the team's own results alone cannot decide it; ?: not computed (work limit). "
      "clinched/eliminated: certain "
      "from the standings and the remaining schedule (a possible tie is neither).\n";
  return out;
}

std::string csv(const Season& s, const Standings& st, const Certainties& cert,
                const Provenance& run) {
  std::string out =
      "conference,division,place,team_id,team_name,wins,losses,win_pct,games_back,runs_scored,"
      "runs_allowed,run_differential,home_wins,home_losses,road_wins,road_losses,division_wins,"
      "division_losses,conference_wins,conference_losses,last10_wins,last10_losses,streak,seed,"
      "division_status,division_magic,division_elimination,postseason_status,postseason_magic,"
      "postseason_elimination" +
      provenance_csv_header() + "\n";
  const std::string run_cells = provenance_csv_cells(run);
  for (const auto& cs : st.conferences) {
    const auto& conf = s.groups[static_cast<std::size_t>(cs.conference)];
    for (const auto& ds : cs.divisions) {
      const auto& div = s.groups[static_cast<std::size_t>(ds.division)];
      int place = 0;
      for (const auto& l : ds.lines) {
        const auto& team = s.teams[static_cast<std::size_t>(l.team)];
        const engine::TeamCertainty& c = cert[static_cast<std::size_t>(l.team)];
        out += fmt::format(
            "{},{},{},{},{},{},{},{},{:.1f},{},{},{},{},{},{},{},{},{},{},{},{},{},{},{},"
            "{},{},{},{},{},{}{}\n",
            csv_field(conf.id), csv_field(div.id), ++place, csv_field(team.id),
            csv_field(team.name), l.wins, l.losses, pct_text(l), l.games_back_halves / 2.0,
            l.runs_for, l.runs_against, l.run_differential(), l.home_wins, l.home_losses,
            l.road_wins, l.road_losses, l.division_wins, l.division_losses, l.conference_wins,
            l.conference_losses, l.last10_wins, l.last10_losses, l.streak,
            l.seed > 0 ? fmt::format("{}", l.seed) : std::string(), certainty_word(c.division.mark),
            number_field(c.division.magic), number_field(c.division.elimination),
            s.postseason.enabled ? certainty_word(c.berth.mark) : "",
            s.postseason.enabled ? number_field(c.berth.magic) : "",
            s.postseason.enabled ? number_field(c.berth.elimination) : "", run_cells);
      }
    }
  }
  return out;
}

// One outcome's certainty in JSON: its status and numbers (null when they do not exist).
nlohmann::ordered_json certainty_json(const engine::OutcomeCertainty& c) {
  using json = nlohmann::ordered_json;
  return {{"status", certainty_word(c.mark)},
          {"magic_number", c.magic >= 0 ? json(c.magic) : json(nullptr)},
          {"elimination_number", c.elimination >= 0 ? json(c.elimination) : json(nullptr)},
          {"proof_complete", c.exact}};
}

std::string json(const Season& s, const Standings& st, const Certainties& cert,
                 const Provenance& run) {
  using json = nlohmann::ordered_json;
  json doc;
  doc["schema_version"] = SCHEMA_VERSION;
  doc["run"] = provenance_json(run);
  doc["league"] = s.league.name;
  doc["season"] = s.league.season_label;
  doc["through"] = st.through ? json(config::format_date(*st.through)) : json(nullptr);
  doc["games_played"] = st.games_played;
  json confs = json::array();
  for (const auto& cs : st.conferences) {
    const auto& conf = s.groups[static_cast<std::size_t>(cs.conference)];
    json c;
    c["id"] = conf.id;
    c["name"] = conf.name;
    json seeds = json::array();
    for (std::size_t i = 0; i < cs.seeds.size(); ++i) {
      const auto& team = s.teams[static_cast<std::size_t>(cs.seeds[i])];
      seeds.push_back({{"seed", i + 1},
                       {"team_id", team.id},
                       {"team_name", team.name},
                       {"division_winner", static_cast<int>(i) < cs.qualifying_winners}});
    }
    c["postseason_field"] = seeds;
    json divs = json::array();
    for (const auto& ds : cs.divisions) {
      const auto& div = s.groups[static_cast<std::size_t>(ds.division)];
      json teams = json::array();
      for (const auto& l : ds.lines) {
        const auto& team = s.teams[static_cast<std::size_t>(l.team)];
        const engine::TeamCertainty& c = cert[static_cast<std::size_t>(l.team)];
        json certain = {{"division", certainty_json(c.division)}};
        if (s.postseason.enabled) certain["postseason"] = certainty_json(c.berth);
        teams.push_back({{"team_id", team.id},
                         {"team_name", team.name},
                         {"conference", conf.id},
                         {"division", div.id},
                         {"place", teams.size() + 1},
                         {"wins", l.wins},
                         {"losses", l.losses},
                         {"win_pct", l.win_pct()},
                         {"games_back", l.games_back()},
                         {"runs_scored", l.runs_for},
                         {"runs_allowed", l.runs_against},
                         {"run_differential", l.run_differential()},
                         {"home_wins", l.home_wins},
                         {"home_losses", l.home_losses},
                         {"road_wins", l.road_wins},
                         {"road_losses", l.road_losses},
                         {"division_wins", l.division_wins},
                         {"division_losses", l.division_losses},
                         {"conference_wins", l.conference_wins},
                         {"conference_losses", l.conference_losses},
                         {"last10_wins", l.last10_wins},
                         {"last10_losses", l.last10_losses},
                         {"streak", l.streak},
                         {"seed", l.seed > 0 ? json(l.seed) : json(nullptr)},
                         {"certainty", certain}});
      }
      divs.push_back({{"id", div.id}, {"name", div.name}, {"teams", teams}});
    }
    c["divisions"] = divs;
    confs.push_back(c);
  }
  doc["conferences"] = confs;
  return doc.dump(2) + "\n";
}

}  // namespace

void add_standings_command(CLI::App& app) {
  auto* cmd = app.add_subcommand(
      "standings", "Standings of the played games by conference and division, with the field");
  struct Options {
    std::string file;
    ReportOptions report;
  };
  auto opt = std::make_shared<Options>();
  add_season_file(*cmd, opt->file);
  add_report_options(*cmd, opt->report);
  cmd->callback([opt] {
    const Format format = check_report_options(opt->report);
    const Season season = load_season_file(opt->file);
    const Provenance run = make_provenance(season);
    check_output_target(opt->report.output, season.input_files);
    const Standings st = engine::compute_standings(season);
    const Certainties cert = engine::exact_certainty(season, engine::clinch_records(season));
    std::string text;
    switch (format) {
      case Format::kTable:
        text = table(season, st, cert, run);
        break;
      case Format::kCsv:
        text = csv(season, st, cert, run);
        break;
      case Format::kJson:
        text = json(season, st, cert, run);
        break;
    }
    write_output(opt->report.output, text);
  });
}

}  // namespace standfast::tools
