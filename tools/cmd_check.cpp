// `standfast check SEASON_FILE`: reads and validates a season file and writes a short summary of
// it (table, CSV of the teams, or JSON). Problems end the program through ConfigError (exit
// status 2, printed by main); warnings go to stderr as FILE:LINE:COLUMN: warning: message.
#include <fmt/core.h>

#include <algorithm>
#include <cmath>
#include <limits>
#include <memory>
#include <nlohmann/json.hpp>
#include <optional>
#include <string>
#include <utility>
#include <vector>

#include "config/load.h"
#include "engine/plan.h"
#include "models/score_dist.h"
#include "tools/cli.h"
#include "tools/commands.h"
#include "tools/output.h"
#include "tools/provenance.h"

namespace standfast::tools {

namespace {

using config::Season;

constexpr int SCHEMA_VERSION = 1;

std::string plural(std::size_t n, const char* one, const char* many) {
  return fmt::format("{} {}", n, n == 1 ? one : many);
}

const char* tiebreak_name(const config::TiebreakRule& r) {
  switch (r.kind) {
    case config::TiebreakKind::kHeadToHead:
      return "head-to-head";
    case config::TiebreakKind::kDivisionRecord:
      return "division record";
    case config::TiebreakKind::kConferenceRecord:
      return "conference record";
    case config::TiebreakKind::kRunDifferential:
      return "run differential";
    case config::TiebreakKind::kLastGames:
      return "last games";
    case config::TiebreakKind::kDraw:
      return "draw";
  }
  return "?";
}

const char* scope_name(config::TiebreakScope s) {
  switch (s) {
    case config::TiebreakScope::kLeague:
      return "league";
    case config::TiebreakScope::kConference:
      return "conference";
    case config::TiebreakScope::kDivision:
      return "division";
  }
  return "?";
}

// What the engine will do with the model section (models/ratings.cpp, engine/plan.cpp):
// which values are fitted, fixed or defaults. Log5 fits nothing: it plays each game as one draw
// from the teams' win_pct overrides, the home odds multiplied by home_edge^shape.
std::string model_text(const Season& s) {
  const config::ModelSpec& m = s.model;
  const std::string family = models::family_name(m.family);
  const bool played =
      std::any_of(s.games.begin(), s.games.end(), [](const config::Game& g) { return g.played; });
  const auto fixed_or_fitted = [played](const std::optional<double>& v) {
    return v ? fmt::format("{:g} (fixed)", *v)
             : std::string(played ? "fitted" : "the documented default (no game played yet)");
  };
  if (m.family == config::ScoreFamily::kLog5) {
    const double g = m.shape.value_or(engine::Plan{}.shape);
    const double h = m.home_edge.value_or(1.0);
    return fmt::format(
        "Model: {} (win percentages from the win_pct overrides; no scores, no innings, nothing "
        "fitted, strengths not drawn); home odds multiplied by home edge {:g}{} raised to the "
        "shape {:g}{} = {:.4g}\n",
        family, h, m.home_edge ? " (fixed)" : " (none: log5 fits no home edge)", g,
        m.shape ? " (fixed)" : " (default)", std::pow(h, g));
  }
  std::string shape;
  if (m.family == config::ScoreFamily::kWeibull) {
    shape = "; shape gamma " + fixed_or_fitted(m.shape);
  } else if (m.family == config::ScoreFamily::kNegativeBinomial) {
    shape = "; size " + fixed_or_fitted(m.shape);
  } else {
    shape = "; no shape";
  }
  return fmt::format(
      "Model: {}{}; home edge {}; shrink {}{}{}\n", family, shape, fixed_or_fitted(m.home_edge),
      m.shrink_auto ? std::string("estimated from the played games (auto)")
                    : fmt::format("{:g} games", m.shrink_games),
      m.lopsided ? fmt::format("; lopsided runs beyond {} weighted {}", m.lopsided->margin,
                               m.lopsided->weight)
                 : "",
      m.strength_uncertainty ? "; strengths drawn from their uncertainty" : "; strengths fixed");
}

// Overrides per team in the order they apply, each with what it does to the team's strength
// uncertainty (config::TeamOverride).
std::string overrides_text(const Season& s) {
  if (s.overrides.empty()) return "";
  std::string out = fmt::format(
      "Overrides: {} (per team in date order, each on top of the earlier ones). A stated rate\n"
      "keeps the fitted strength's uncertainty (the same relative spread) unless sd_runs sets\n"
      "another; added runs shift the team's rate and keep its uncertainty.\n",
      s.overrides.size());
  std::vector<const config::TeamOverride*> list;
  for (const auto& o : s.overrides) list.push_back(&o);
  constexpr auto START = std::numeric_limits<config::DayNumber>::min();
  std::stable_sort(list.begin(), list.end(), [&](const auto* a, const auto* b) {
    return std::pair(a->team, a->from.value_or(START)) <
           std::pair(b->team, b->from.value_or(START));
  });
  for (const config::TeamOverride* o : list) {
    std::vector<std::string> parts;
    const std::string blend = o->blend < 1.0 ? fmt::format(" (blend {:g})", o->blend) : "";
    if (o->runs_scored)
      parts.push_back(fmt::format("runs scored {:g}/game{}", *o->runs_scored, blend));
    if (o->runs_allowed)
      parts.push_back(fmt::format("runs allowed {:g}/game{}", *o->runs_allowed, blend));
    if (o->win_pct) parts.push_back(fmt::format("win pct {:g}{}", *o->win_pct, blend));
    if (o->runs_scored || o->runs_allowed || o->win_pct) {
      parts.push_back(!s.model.strength_uncertainty || s.model.family == config::ScoreFamily::kLog5
                          ? "no uncertainty (strengths are not drawn)"
                      : o->sd_runs ? fmt::format("uncertainty sd {:g} runs/game", *o->sd_runs)
                                   : "fitted uncertainty kept");
    }
    if (o->add_runs_scored != 0)
      parts.push_back(fmt::format("{:+g} runs scored/game", o->add_runs_scored));
    if (o->add_runs_allowed != 0)
      parts.push_back(fmt::format("{:+g} runs allowed/game", o->add_runs_allowed));
    std::string what;
    for (const auto& p : parts) what += (what.empty() ? "" : "; ") + p;
    out += fmt::format("  {} {}: {}\n", s.teams[static_cast<std::size_t>(o->team)].id,
                       o->from ? "from " + config::format_date(*o->from) : "all remaining games",
                       what);
  }
  return out;
}

// Teams of every division at or below group `g`.
std::size_t teams_below(const Season& s, int g) {
  std::size_t teams = 0;
  for (const config::Team& t : s.teams) {
    for (int up = t.division; up >= 0; up = s.groups[static_cast<std::size_t>(up)].parent) {
      if (up == g) {
        ++teams;
        break;
      }
    }
  }
  return teams;
}

void print_groups(std::string& out, const Season& s, int g, int depth) {
  const config::Group& group = s.groups[static_cast<std::size_t>(g)];
  const std::size_t teams = teams_below(s, g);
  fmt::format_to(std::back_inserter(out), "  {:{}}{} ({}): {}\n", "", depth * 2, group.name,
                 group.id, plural(teams, "team", "teams"));
  for (const int c : group.children) print_groups(out, s, c, depth + 1);
}

std::string summary_table(const Season& s, const Provenance& run) {
  std::string out;
  out += fmt::format("{}: {}, {}\n", s.file, s.league.name, s.league.season_label);
  out += provenance_line(run) + "\n";
  std::string extra = s.league.extra_innings.runner_on_second ? ", runner on second in extras" : "";
  if (s.league.extra_innings.max_innings > 0) {
    extra += fmt::format(", draw after {} innings", s.league.extra_innings.max_innings);
  }
  out += fmt::format("Rules: {} innings{}\n", s.league.regulation_innings, extra);
  out += fmt::format("Teams: {} in {} and {}\n", s.teams.size(),
                     plural(s.conferences.size(), "conference", "conferences"),
                     plural(s.divisions.size(), "division", "divisions"));
  for (const int c : s.conferences) print_groups(out, s, c, 0);

  std::size_t played = 0;
  std::size_t postponed = 0;
  for (const config::Game& g : s.games) {
    played += g.played ? 1 : 0;
    postponed += (!g.played && g.postponed) ? 1 : 0;
  }
  out += fmt::format("Games: {} ({} played, {} remaining, of which {} postponed)\n", s.games.size(),
                     played, s.games.size() - played, postponed);
  if (s.league.games_per_team > 0) {
    out += fmt::format("Games per team: {} stated\n", s.league.games_per_team);
  }

  const config::Postseason& p = s.postseason;
  if (!p.enabled) {
    out += fmt::format("Postseason: none (regular-season odds only)\n");
  } else {
    int field = 0;
    for (const config::Qualifying& q : p.qualifying) field += q.division_winners + q.at_large;
    out += fmt::format(
        "Postseason: {} teams, {}{}\n", field,
        p.format == config::BracketFormat::kSingleBracket ? "one bracket" : "conference brackets",
        p.reseed ? ", reseeded after each round" : "");
    for (const config::Qualifying& q : p.qualifying) {
      out += fmt::format("  {}: {} division winners + {} at-large, {}{}\n",
                         s.groups[static_cast<std::size_t>(q.conference)].id, q.division_winners,
                         q.at_large, plural(static_cast<std::size_t>(q.byes), "bye", "byes"),
                         q.winners_first ? ", winners seeded first" : "");
    }
    std::string rounds;
    for (const config::Round& r : p.rounds) {
      if (!rounds.empty()) rounds += ", ";
      rounds += fmt::format("{} (best of {})", r.name, r.best_of);
    }
    out += fmt::format("Rounds: {}\n", rounds);
  }

  std::string order;
  for (const config::TiebreakRule& r : s.tiebreakers.order) {
    if (!order.empty()) order += ", ";
    order += tiebreak_name(r);
    if (r.kind == config::TiebreakKind::kLastGames) {
      order += fmt::format(" ({} within {})", r.games, scope_name(r.scope));
    }
  }
  out += fmt::format("Tiebreakers: {}{}\n",
                     s.tiebreakers.extra_game ? "extra game for two-team ties, else " : "", order);

  out += model_text(s);
  out += overrides_text(s);
  out += fmt::format(
      "OK{}\n", s.warnings.empty()
                    ? ""
                    : fmt::format(" with {}", plural(s.warnings.size(), "warning", "warnings")));
  return out;
}

// Games scheduled, played and left for every team.
struct TeamGames {
  int scheduled = 0, played = 0;
};
std::vector<TeamGames> team_games(const Season& s) {
  std::vector<TeamGames> out(s.teams.size());
  for (const config::Game& g : s.games) {
    for (const int t : {g.home, g.away}) {
      ++out[static_cast<std::size_t>(t)].scheduled;
      if (g.played) ++out[static_cast<std::size_t>(t)].played;
    }
  }
  return out;
}

// CSV: one row per team, in file order.
std::string summary_csv(const Season& s, const Provenance& run) {
  std::string out =
      "team_id,team_name,conference,division,venue,run_factor,games,games_played,games_left" +
      provenance_csv_header() + "\n";
  const std::string run_cells = provenance_csv_cells(run);
  const auto games = team_games(s);
  for (std::size_t i = 0; i < s.teams.size(); ++i) {
    const config::Team& t = s.teams[i];
    out += fmt::format("{},{},{},{},{},{:g},{},{},{}{}\n", csv_field(t.id), csv_field(t.name),
                       csv_field(s.groups[static_cast<std::size_t>(t.conference)].id),
                       csv_field(s.groups[static_cast<std::size_t>(t.division)].id),
                       csv_field(t.venue), t.run_factor, games[i].scheduled, games[i].played,
                       games[i].scheduled - games[i].played, run_cells);
  }
  return out;
}

std::string summary_json(const Season& s, const Provenance& run) {
  using json = nlohmann::ordered_json;
  json doc;
  doc["schema_version"] = SCHEMA_VERSION;
  doc["run"] = provenance_json(run);
  doc["league"] = {{"name", s.league.name},
                   {"season", s.league.season_label},
                   {"innings", s.league.regulation_innings},
                   {"runner_on_second", s.league.extra_innings.runner_on_second},
                   {"max_innings", s.league.extra_innings.max_innings},
                   {"games_per_team",
                    s.league.games_per_team > 0 ? json(s.league.games_per_team) : json(nullptr)}};
  json groups = json::array();
  for (const config::Group& g : s.groups) {
    groups.push_back(
        {{"id", g.id},
         {"name", g.name},
         {"parent",
          g.parent >= 0 ? json(s.groups[static_cast<std::size_t>(g.parent)].id) : json(nullptr)},
         {"teams", teams_below(s, static_cast<int>(&g - s.groups.data()))}});
  }
  doc["groups"] = groups;
  json teams = json::array();
  const auto games = team_games(s);
  for (std::size_t i = 0; i < s.teams.size(); ++i) {
    const config::Team& t = s.teams[i];
    teams.push_back({{"team_id", t.id},
                     {"team_name", t.name},
                     {"conference", s.groups[static_cast<std::size_t>(t.conference)].id},
                     {"division", s.groups[static_cast<std::size_t>(t.division)].id},
                     {"venue", t.venue},
                     {"run_factor", t.run_factor},
                     {"games", games[i].scheduled},
                     {"games_played", games[i].played},
                     {"games_left", games[i].scheduled - games[i].played}});
  }
  doc["teams"] = teams;
  std::size_t played = 0;
  for (const config::Game& g : s.games) played += g.played ? 1 : 0;
  doc["games"] = {
      {"total", s.games.size()}, {"played", played}, {"remaining", s.games.size() - played}};
  doc["postseason"] = s.postseason.enabled;
  json warnings = json::array();
  for (const config::Diagnostic& w : s.warnings) {
    warnings.push_back({{"file", w.pos.file},
                        {"line", w.pos.line > 0 ? json(w.pos.line) : json(nullptr)},
                        {"column", w.pos.column > 0 ? json(w.pos.column) : json(nullptr)},
                        {"message", w.message}});
  }
  doc["warnings"] = warnings;
  return doc.dump(2) + "\n";
}

}  // namespace

void add_check_command(CLI::App& app) {
  auto* cmd = app.add_subcommand("check", "Validate a season file and print a short summary");
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
    check_output_target(opt->report.output, season.input_files);
    const Provenance run = make_provenance(season);
    std::string text;
    switch (format) {
      case Format::kTable:
        text = summary_table(season, run);
        break;
      case Format::kCsv:
        text = summary_csv(season, run);
        break;
      case Format::kJson:
        text = summary_json(season, run);
        break;
    }
    write_output(opt->report.output, text);
  });
}

}  // namespace standfast::tools
