// `standfast check FILE`: reads and validates a season file and prints a short summary of it.
// Problems end the program through ConfigError (exit status 2, printed by main); warnings go to
// stderr as FILE:LINE:COLUMN: warning: ...  Nothing is written to any file.
#include <fmt/core.h>

#include <algorithm>
#include <limits>
#include <memory>
#include <string>
#include <utility>
#include <vector>

#include "config/load.h"
#include "tools/commands.h"

namespace standfast::tools {

namespace {

using config::Season;

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

const char* family_name(config::ScoreFamily f) {
  switch (f) {
    case config::ScoreFamily::kWeibull:
      return "Weibull";
    case config::ScoreFamily::kNegativeBinomial:
      return "negative binomial";
    case config::ScoreFamily::kPoisson:
      return "Poisson";
    case config::ScoreFamily::kLog5:
      return "log5 (win percentages only)";
  }
  return "?";
}

// Overrides per team in the order they apply, each with what it does to the team's strength
// uncertainty (config::TeamOverride).
void print_overrides(const Season& s) {
  if (s.overrides.empty()) return;
  fmt::print(
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
    fmt::print("  {} {}: {}\n", s.teams[static_cast<std::size_t>(o->team)].id,
               o->from ? "from " + config::format_date(*o->from) : "all remaining games", what);
  }
}

void print_groups(const Season& s, int g, int depth) {
  const config::Group& group = s.groups[static_cast<std::size_t>(g)];
  std::size_t teams = 0;  // teams of every division at or below this group
  for (const config::Team& t : s.teams) {
    for (int up = t.division; up >= 0; up = s.groups[static_cast<std::size_t>(up)].parent) {
      if (up == g) {
        ++teams;
        break;
      }
    }
  }
  fmt::print("  {:{}}{} ({}): {}\n", "", depth * 2, group.name, group.id,
             plural(teams, "team", "teams"));
  for (const int c : group.children) print_groups(s, c, depth + 1);
}

void print_summary(const Season& s) {
  fmt::print("{}: {}, {}\n", s.file, s.league.name, s.league.season_label);
  std::string extra = s.league.extra_innings.runner_on_second ? ", runner on second in extras" : "";
  if (s.league.extra_innings.max_innings > 0) {
    extra += fmt::format(", draw after {} innings", s.league.extra_innings.max_innings);
  }
  fmt::print("Rules: {} innings{}\n", s.league.regulation_innings, extra);
  fmt::print("Teams: {} in {} and {}\n", s.teams.size(),
             plural(s.conferences.size(), "conference", "conferences"),
             plural(s.divisions.size(), "division", "divisions"));
  for (const int c : s.conferences) print_groups(s, c, 0);

  std::size_t played = 0;
  std::size_t postponed = 0;
  for (const config::Game& g : s.games) {
    played += g.played ? 1 : 0;
    postponed += (!g.played && g.postponed) ? 1 : 0;
  }
  fmt::print("Games: {} ({} played, {} remaining, of which {} postponed)\n", s.games.size(), played,
             s.games.size() - played, postponed);
  if (s.league.games_per_team > 0) {
    fmt::print("Games per team: {} stated\n", s.league.games_per_team);
  }

  const config::Postseason& p = s.postseason;
  if (!p.enabled) {
    fmt::print("Postseason: none (regular-season odds only)\n");
  } else {
    int field = 0;
    for (const config::Qualifying& q : p.qualifying) field += q.division_winners + q.at_large;
    fmt::print(
        "Postseason: {} teams, {}{}\n", field,
        p.format == config::BracketFormat::kSingleBracket ? "one bracket" : "conference brackets",
        p.reseed ? ", reseeded after each round" : "");
    for (const config::Qualifying& q : p.qualifying) {
      fmt::print("  {}: {} division winners + {} at-large, {}{}\n",
                 s.groups[static_cast<std::size_t>(q.conference)].id, q.division_winners,
                 q.at_large, plural(static_cast<std::size_t>(q.byes), "bye", "byes"),
                 q.winners_first ? ", winners seeded first" : "");
    }
    std::string rounds;
    for (const config::Round& r : p.rounds) {
      if (!rounds.empty()) rounds += ", ";
      rounds += fmt::format("{} (best of {})", r.name, r.best_of);
    }
    fmt::print("Rounds: {}\n", rounds);
  }

  std::string order;
  for (const config::TiebreakRule& r : s.tiebreakers.order) {
    if (!order.empty()) order += ", ";
    order += tiebreak_name(r);
    if (r.kind == config::TiebreakKind::kLastGames) {
      order += fmt::format(" ({} within {})", r.games, scope_name(r.scope));
    }
  }
  fmt::print("Tiebreakers: {}{}\n",
             s.tiebreakers.extra_game ? "extra game for two-team ties, else " : "", order);

  const config::ModelSpec& m = s.model;
  fmt::print("Model: {}; shape {}; home edge {}; shrink {} games{}{}\n", family_name(m.family),
             m.shape ? fmt::format("{}", *m.shape) : "fitted",
             m.home_edge ? fmt::format("{}", *m.home_edge) : "fitted", m.shrink_games,
             m.lopsided ? fmt::format("; lopsided runs beyond {} weighted {}", m.lopsided->margin,
                                      m.lopsided->weight)
                        : "",
             m.strength_uncertainty ? "" : "; strengths fixed");
  print_overrides(s);
  fmt::print("OK{}\n", s.warnings.empty() ? ""
                                          : fmt::format(" with {}", plural(s.warnings.size(),
                                                                           "warning", "warnings")));
}

}  // namespace

void add_check_command(CLI::App& app) {
  auto* cmd = app.add_subcommand("check", "Validate a season file and print a short summary");
  auto file = std::make_shared<std::string>();
  cmd->add_option("FILE", *file, "The season file (YAML)")->required();
  cmd->callback([file] {
    const Season season = config::load_season(*file);
    for (const config::Diagnostic& w : season.warnings) {
      config::Diagnostic d = w;
      d.message = "warning: " + d.message;
      fmt::print(stderr, "{}\n", config::format_diagnostic(d));
    }
    print_summary(season);
  });
}

}  // namespace standfast::tools
