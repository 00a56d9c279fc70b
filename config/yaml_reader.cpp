#include "config/yaml_reader.h"

#include <yaml-cpp/depthguard.h>
#include <yaml-cpp/eventhandler.h>
#include <yaml-cpp/parser.h>

#include <cmath>
#include <functional>
#include <set>
#include <sstream>
#include <string_view>

#include "config/postseason_reader.h"
#include "config/suggest.h"
#include "config/yaml_node.h"

namespace standfast::config::detail {

namespace {

std::string item(const std::string& path, std::size_t i) {
  return path + "[" + std::to_string(i) + "]";
}

std::string line_of(const SourcePos& p) { return "line " + std::to_string(p.line); }

bool valid_id(const std::string& id) {
  if (id.empty()) return false;
  for (const char c : id) {
    const bool ok = (c >= 'a' && c <= 'z') || (c >= 'A' && c <= 'Z') || (c >= '0' && c <= '9') ||
                    c == '_' || c == '-';
    if (!ok) return false;
  }
  return true;
}

void read_league(YamlContext& ctx, const YAML::Node& node, League& league, YamlResult& out) {
  MapView m(ctx, node, "league", {"name", "season", "innings", "extra_innings", "games_per_team"});
  if (!m.ok()) return;
  if (auto n = m.require("name")) league.name = ctx.text(*n, m.sub("name")).value_or("");
  if (auto n = m.require("season"))
    league.season_label = ctx.text(*n, m.sub("season")).value_or("");
  if (auto n = m.get("innings")) {
    league.regulation_innings = ctx.integer(*n, m.sub("innings"), 1, 99).value_or(9);
  }
  if (auto n = m.get("extra_innings")) {
    MapView e(ctx, *n, m.sub("extra_innings"), {"runner_on_second", "max_innings"});
    if (auto r = e.get("runner_on_second")) {
      league.extra_innings.runner_on_second =
          ctx.boolean(*r, e.sub("runner_on_second")).value_or(false);
    }
    if (auto c = e.get("max_innings")) {
      const auto cap = ctx.integer(*c, e.sub("max_innings"), 0, 999);
      if (cap && *cap > 0 && *cap < league.regulation_innings) {
        ctx.error(*c, e.sub("max_innings") + ": " + std::to_string(*cap) +
                          " is fewer than the regulation innings (" +
                          std::to_string(league.regulation_innings) + "); 0 means no cap");
      } else if (cap) {
        league.extra_innings.max_innings = *cap;
      }
    }
  }
  if (auto n = m.get("games_per_team")) {
    league.games_per_team = ctx.integer(*n, m.sub("games_per_team"), 1, 100000).value_or(0);
    out.games_per_team_pos = ctx.pos(*n);
  }
}

void read_teams(YamlContext& ctx, const YAML::Node& node, Season& season, TeamIds& ids) {
  if (!ctx.is_list(node, "teams")) return;
  if (node.size() < 2) {
    ctx.error(node, "teams: a league needs at least 2 teams, got " + std::to_string(node.size()));
  }
  for (std::size_t i = 0; i < node.size(); ++i) {
    const std::string path = item("teams", i);
    MapView m(ctx, node[i], path, {"id", "name", "venue", "run_factor"});
    if (!m.ok()) continue;
    Team team;
    team.pos = ctx.pos(node[i]);
    bool ok = true;
    if (auto n = m.require("id")) {
      const auto id = ctx.text(*n, m.sub("id"));
      if (id && !valid_id(*id)) {
        ctx.error(*n,
                  m.sub("id") + ": " + quoted(*id) + " may use only letters, digits, '_' and '-'");
        ok = false;
      } else if (id && ids.find(*id) >= 0) {
        const Team& first = season.teams[static_cast<std::size_t>(ids.find(*id))];
        ctx.error(*n, m.sub("id") + ": duplicate team id " + quoted(*id) + " (first defined at " +
                          line_of(first.pos) + ")");
        ok = false;
      } else if (id) {
        team.id = *id;
      } else {
        ok = false;
      }
    } else {
      ok = false;
    }
    if (auto n = m.require("name")) team.name = ctx.text(*n, m.sub("name")).value_or("");
    team.venue = team.name;
    if (auto n = m.get("venue")) team.venue = ctx.text(*n, m.sub("venue")).value_or(team.name);
    if (auto n = m.get("run_factor")) {
      team.run_factor =
          ctx.real_in(*n, m.sub("run_factor"), MIN_RUN_FACTOR, true, MAX_RUN_FACTOR).value_or(1.0);
    }
    if (!ok) continue;
    ids.index.emplace(team.id, static_cast<int>(season.teams.size()));
    ids.ids.push_back(team.id);
    season.teams.push_back(std::move(team));
  }
}

struct GroupReader {
  YamlContext& ctx;
  Season& season;
  const TeamIds& ids;
  std::vector<int> team_group;  // leaf group of each team, -1 when none yet
  std::vector<SourcePos> team_group_pos;

  void read(const YAML::Node& node, const std::string& path, int parent, int depth) {
    MapView m(ctx, node, path, {"id", "name", "groups", "teams"});
    if (!m.ok()) return;
    Group group;
    group.parent = parent;
    group.pos = ctx.pos(node);
    if (auto n = m.require("id")) {
      const auto id = ctx.text(*n, m.sub("id"));
      if (id) {
        for (const Group& g : season.groups) {
          if (g.id == *id) {
            ctx.error(*n, m.sub("id") + ": duplicate group id " + quoted(*id) +
                              " (first defined at " + line_of(g.pos) + ")");
          }
        }
        group.id = *id;
      }
    }
    group.name = group.id;
    if (auto n = m.get("name")) group.name = ctx.text(*n, m.sub("name")).value_or(group.id);
    const int index = static_cast<int>(season.groups.size());
    season.groups.push_back(group);
    if (parent < 0) {
      season.conferences.push_back(index);
    } else {
      season.groups[static_cast<std::size_t>(parent)].children.push_back(index);
    }
    const auto children = m.get("groups");
    const auto teams = m.get("teams");
    if (children && teams) {
      ctx.error(node, path + ": a group lists either `groups` or `teams`, not both");
    } else if (!children && !teams) {
      ctx.error(node, path + ": a group needs `groups` (sub-groups) or `teams` (a division)");
    }
    if (children && ctx.is_list(*children, m.sub("groups"))) {
      if (children->size() == 0) ctx.error(*children, m.sub("groups") + ": is empty");
      if (depth > 16) {
        ctx.error(*children, m.sub("groups") + ": groups nested too deep (more than 16 levels)");
        return;
      }
      for (std::size_t i = 0; i < children->size(); ++i) {
        read((*children)[i], item(m.sub("groups"), i), index, depth + 1);
      }
    }
    if (teams && !children && ctx.is_list(*teams, m.sub("teams"))) {
      season.divisions.push_back(index);
      if (teams->size() == 0) ctx.error(*teams, m.sub("teams") + ": lists no team");
      for (std::size_t i = 0; i < teams->size(); ++i) {
        const YAML::Node t = (*teams)[i];
        const auto id = ctx.text(t, item(m.sub("teams"), i));
        if (!id) continue;
        const int team = ids.find(*id);
        if (team < 0) {
          ctx.error(t, item(m.sub("teams"), i) + ": unknown team " + quoted(*id) +
                           did_you_mean(*id, ids.ids));
          continue;
        }
        const auto ti = static_cast<std::size_t>(team);
        if (team_group[ti] >= 0) {
          const Group& other = season.groups[static_cast<std::size_t>(team_group[ti])];
          ctx.error(t, item(m.sub("teams"), i) + ": team " + quoted(*id) + " is already in group " +
                           quoted(other.id) + " (" + line_of(team_group_pos[ti]) +
                           "); a team belongs to one division");
          continue;
        }
        team_group[ti] = index;
        team_group_pos[ti] = ctx.pos(t);
        season.groups[static_cast<std::size_t>(index)].teams.push_back(team);
      }
    }
  }
};

void read_groups(YamlContext& ctx, const YAML::Node& node, Season& season, const TeamIds& ids) {
  if (!ctx.is_list(node, "groups")) return;
  if (node.size() == 0) ctx.error(node, "groups: is empty");
  GroupReader r{ctx, season, ids, std::vector<int>(season.teams.size(), -1),
                std::vector<SourcePos>(season.teams.size())};
  for (std::size_t i = 0; i < node.size(); ++i) r.read(node[i], item("groups", i), -1, 0);
  for (std::size_t t = 0; t < season.teams.size(); ++t) {
    Team& team = season.teams[t];
    team.division = r.team_group[t];
    if (team.division < 0) {
      ctx.report().error(team.pos, "team " + quoted(team.id) +
                                       " is in no division: list it in the `teams` of one group");
      continue;
    }
    int g = team.division;
    while (season.groups[static_cast<std::size_t>(g)].parent >= 0) {
      g = season.groups[static_cast<std::size_t>(g)].parent;
    }
    team.conference = g;
  }
}

const std::vector<std::string> TIEBREAK_NAMES = {"head_to_head",      "division_record",
                                                 "conference_record", "run_differential",
                                                 "last_games",        "draw"};

void read_tiebreakers(YamlContext& ctx, const YAML::Node& node, Tiebreakers& tb) {
  MapView m(ctx, node, "tiebreakers", {"order", "extra_game"});
  if (!m.ok()) return;
  if (auto n = m.get("extra_game"))
    tb.extra_game = ctx.boolean(*n, m.sub("extra_game")).value_or(false);
  const auto order = m.get("order");
  if (!order || !ctx.is_list(*order, m.sub("order"))) return;
  tb.order.clear();
  for (std::size_t i = 0; i < order->size(); ++i) {
    const YAML::Node r = (*order)[i];
    const std::string path = item(m.sub("order"), i);
    TiebreakRule rule;
    rule.pos = ctx.pos(r);
    if (r.IsMap()) {
      MapView lm(ctx, r, path, {"last_games", "within"});
      if (!lm.ok()) continue;
      rule.kind = TiebreakKind::kLastGames;
      if (auto g = lm.require("last_games")) {
        rule.games = ctx.integer(*g, lm.sub("last_games"), 1, 1000).value_or(0);
      }
      if (auto w = lm.get("within")) {
        const auto s = ctx.text(*w, lm.sub("within"));
        if (s && *s == "league") {
          rule.scope = TiebreakScope::kLeague;
        } else if (s && *s == "conference") {
          rule.scope = TiebreakScope::kConference;
        } else if (s && *s == "division") {
          rule.scope = TiebreakScope::kDivision;
        } else if (s) {
          ctx.error(*w, lm.sub("within") + ": must be league, conference or division, got " +
                            quoted(*s) + did_you_mean(*s, {"league", "conference", "division"}));
        }
      }
      tb.order.push_back(rule);
      continue;
    }
    const auto name = ctx.text(r, path);
    if (!name) continue;
    if (*name == "head_to_head") {
      rule.kind = TiebreakKind::kHeadToHead;
    } else if (*name == "division_record") {
      rule.kind = TiebreakKind::kDivisionRecord;
    } else if (*name == "conference_record") {
      rule.kind = TiebreakKind::kConferenceRecord;
    } else if (*name == "run_differential") {
      rule.kind = TiebreakKind::kRunDifferential;
    } else if (*name == "draw") {
      rule.kind = TiebreakKind::kDraw;
    } else if (*name == "last_games") {
      ctx.error(r, path + ": last_games needs a count: write {last_games: 20, within: conference}");
      continue;
    } else {
      ctx.error(r, path + ": unknown tiebreaker " + quoted(*name) +
                       did_you_mean(*name, TIEBREAK_NAMES) +
                       "; known: head_to_head, division_record, conference_record, "
                       "run_differential, {last_games: N, within: SCOPE}, draw");
      continue;
    }
    tb.order.push_back(rule);
  }
  if (order->size() == 0) ctx.error(*order, m.sub("order") + ": is empty");
}

// `fit` or a number in [lo, hi].
std::optional<double> fit_or_number(YamlContext& ctx, const YAML::Node& n, const std::string& path,
                                    double lo, double hi, bool& bad) {
  if (n.IsScalar() && n.Scalar() == "fit") return std::nullopt;
  const auto v =
      n.IsScalar() && parse_real(n.Scalar()) ? ctx.real_in(n, path, lo, true, hi) : std::nullopt;
  if (!v && !(n.IsScalar() && parse_real(n.Scalar()))) {
    ctx.error(n, path + ": must be `fit` or a number, got " + describe(n));
  }
  bad = !v;
  return v;
}

}  // namespace

SourcePos read_model(YamlContext& ctx, const YAML::Node& node, ModelSpec& model,
                     const std::string& path) {
  SourcePos family_pos = ctx.pos(node);
  MapView m(ctx, node, path,
            {"family", "shape", "home_edge", "shrink_games", "lopsided", "strength_uncertainty"});
  model.pos = ctx.pos(node);
  if (!m.ok()) return family_pos;
  if (auto n = m.get("family")) {
    family_pos = ctx.pos(*n);
    const auto f = ctx.text(*n, m.sub("family"));
    if (f && *f == "weibull") {
      model.family = ScoreFamily::kWeibull;
    } else if (f && *f == "negative_binomial") {
      model.family = ScoreFamily::kNegativeBinomial;
    } else if (f && *f == "poisson") {
      model.family = ScoreFamily::kPoisson;
    } else if (f && *f == "log5") {
      model.family = ScoreFamily::kLog5;
    } else if (f) {
      ctx.error(*n, m.sub("family") + ": unknown family " + quoted(*f) +
                        did_you_mean(*f, {"weibull", "negative_binomial", "poisson", "log5"}) +
                        "; known: weibull, negative_binomial, poisson, log5");
    }
  }
  bool bad = false;
  if (auto n = m.get("shape"))
    model.shape = fit_or_number(ctx, *n, m.sub("shape"), MIN_SHAPE, MAX_SHAPE, bad);
  if (auto n = m.get("home_edge")) {
    model.home_edge = fit_or_number(ctx, *n, m.sub("home_edge"), MIN_HOME_EDGE, MAX_HOME_EDGE, bad);
  }
  if (auto n = m.get("shrink_games")) {
    if (n->IsScalar() && n->Scalar() == "auto") {
      model.shrink_auto = true;
    } else if (n->IsScalar() && parse_real(n->Scalar())) {
      model.shrink_games = ctx.real_in(*n, m.sub("shrink_games"), 0.0, true, 1e6).value_or(20.0);
    } else {
      ctx.error(*n, m.sub("shrink_games") + ": must be `auto` or a number, got " + describe(*n));
    }
  }
  if (auto n = m.get("lopsided")) {
    MapView l(ctx, *n, m.sub("lopsided"), {"margin", "weight"});
    if (l.ok()) {
      LopsidedRule rule;
      bool ok = true;
      if (auto g = l.require("margin")) {
        const auto v = ctx.integer(*g, l.sub("margin"), 1, 100);
        ok = ok && v.has_value();
        rule.margin = v.value_or(0);
      } else {
        ok = false;
      }
      if (auto w = l.require("weight")) {
        const auto v = ctx.real_in(*w, l.sub("weight"), 0.0, true, 1.0);
        ok = ok && v.has_value();
        rule.weight = v.value_or(1.0);
      } else {
        ok = false;
      }
      if (ok) model.lopsided = rule;
    }
  }
  if (auto n = m.get("strength_uncertainty")) {
    model.strength_uncertainty = ctx.boolean(*n, m.sub("strength_uncertainty")).value_or(true);
  }
  return family_pos;
}

void read_overrides(YamlContext& ctx, const YAML::Node& node, const std::string& list_path,
                    const TeamIds& ids, std::vector<TeamOverride>& out) {
  if (!ctx.is_list(node, list_path)) return;
  for (std::size_t i = 0; i < node.size(); ++i) {
    const std::string path = item(list_path, i);
    MapView m(ctx, node[i], path,
              {"team", "runs_scored", "runs_allowed", "win_pct", "blend", "add_runs_scored",
               "add_runs_allowed", "sd_runs", "from"});
    if (!m.ok()) continue;
    TeamOverride o;
    o.pos = ctx.pos(node[i]);
    bool ok = true;
    if (auto n = m.require("team")) {
      const auto id = ctx.text(*n, m.sub("team"));
      o.team = id ? ids.find(*id) : -1;
      if (id && o.team < 0) {
        ctx.error(*n, m.sub("team") + ": unknown team " + quoted(*id) + did_you_mean(*id, ids.ids));
      }
    }
    ok = o.team >= 0;
    const auto number = [&](const char* key, std::optional<double>& into, double lo, bool closed,
                            double hi) {
      if (auto n = m.get(key)) {
        into = ctx.real_in(*n, m.sub(key), lo, closed, hi);
        ok = ok && into.has_value();
      }
    };
    number("runs_scored", o.runs_scored, MIN_OVERRIDE_RUNS, true, MAX_OVERRIDE_RUNS);
    number("runs_allowed", o.runs_allowed, MIN_OVERRIDE_RUNS, true, MAX_OVERRIDE_RUNS);
    number("win_pct", o.win_pct, 0.0, false, 1.0);
    if (auto n = m.get("win_pct"); n && o.win_pct && *o.win_pct >= 1.0) {
      ctx.error(*n, m.sub("win_pct") + ": must be below 1, got 1");
      ok = false;
    }
    std::optional<double> blend;
    number("blend", blend, 0.0, false, 1.0);
    o.blend = blend.value_or(1.0);
    std::optional<double> add_scored, add_allowed;
    number("add_runs_scored", add_scored, -100.0, true, 100.0);
    number("add_runs_allowed", add_allowed, -100.0, true, 100.0);
    o.add_runs_scored = add_scored.value_or(0.0);
    o.add_runs_allowed = add_allowed.value_or(0.0);
    number("sd_runs", o.sd_runs, 0.0, true, 100.0);
    const bool runs = m.get("runs_scored") || m.get("runs_allowed");
    const bool adds = m.get("add_runs_scored") || m.get("add_runs_allowed");
    if (!runs && !m.get("win_pct") && !adds) {
      ctx.error(node[i], path +
                             ": an override needs runs_scored/runs_allowed, win_pct or "
                             "add_runs_scored/add_runs_allowed");
      ok = false;
    } else if (runs && m.get("win_pct")) {
      ctx.error(node[i], path + ": give runs_scored/runs_allowed or win_pct, not both");
      ok = false;
    }
    if (auto n = m.get("sd_runs"); n && !runs) {
      ctx.error(*n,
                m.sub("sd_runs") + ": applies to runs_scored/runs_allowed, which are not given");
      ok = false;
    }
    if (auto n = m.get("from")) {
      const auto text = ctx.text(*n, m.sub("from"));
      o.from = text ? parse_date(*text) : std::nullopt;
      if (text && !o.from) {
        ctx.error(*n, m.sub("from") + ": cannot read " + quoted(*text) + " as a date (YYYY-MM-DD)");
      }
      ok = ok && o.from.has_value();
    }
    if (ok) out.push_back(o);
  }
}

namespace {

void check_log5(YamlContext& ctx, const Season& season, const SourcePos& family_pos) {
  if (season.model.family != ScoreFamily::kLog5) return;
  std::vector<bool> has(season.teams.size(), false);
  for (const TeamOverride& o : season.overrides) {
    if (o.win_pct && o.team >= 0) has[static_cast<std::size_t>(o.team)] = true;
  }
  std::string missing;
  int count = 0;
  for (std::size_t t = 0; t < season.teams.size(); ++t) {
    if (has[t]) continue;
    if (++count <= 10) missing += (missing.empty() ? "" : ", ") + season.teams[t].id;
  }
  if (count == 0) return;
  if (count > 10) missing += " and " + std::to_string(count - 10) + " more";
  ctx.report().error(
      family_pos,
      "model.family: log5 needs a win_pct override for every team; missing for " + missing);
}

void read_games(YamlContext& ctx, const YAML::Node& node, Season& season, const TeamIds& ids) {
  if (!ctx.is_list(node, "games")) return;
  for (std::size_t i = 0; i < node.size(); ++i) {
    const std::string path = item("games", i);
    MapView m(ctx, node[i], path,
              {"date", "home", "away", "game", "home_runs", "away_runs", "innings", "shortened",
               "status"});
    if (!m.ok()) continue;
    GameFields g;
    g.where = path + ".";
    g.pos = ctx.pos(node[i]);
    bool ok = true;
    const auto field = [&](const char* key, GameField& f) {
      if (auto n = m.get(key)) {
        f.pos = ctx.pos(*n);
        if (n->IsNull()) return;
        if (!n->IsScalar()) {
          ctx.error(*n, m.sub(key) + ": must be a single value, got " + describe(*n));
          ok = false;
          return;
        }
        f.text = std::string(trim(n->Scalar()));
        f.given = !f.text.empty();
      }
    };
    field("date", g.date);
    field("home", g.home);
    field("away", g.away);
    field("game", g.number);
    field("home_runs", g.home_runs);
    field("away_runs", g.away_runs);
    field("innings", g.innings);
    field("status", g.status);
    if (auto n = m.get("shortened")) {
      const auto s = ctx.boolean(*n, m.sub("shortened"));
      if (!s) {
        ok = false;
      } else if (*s && g.status.given && g.status.text != "shortened") {
        ctx.error(*n, m.sub("shortened") + ": contradicts status " + quoted(g.status.text));
        ok = false;
      } else if (*s) {
        g.status = GameField{"shortened", true, ctx.pos(*n)};
      }
    }
    if (ok) add_game(g, ids, season, ctx.report());
  }
}

void read_all(YamlContext& ctx, const YAML::Node& root, Season& season, YamlResult& out) {
  if (root.IsNull() || !root.IsDefined()) {
    ctx.report().error(SourcePos{ctx.file(), 0, 0},
                       "the season file is empty: it needs at least standfast, league, teams "
                       "and groups");
    return;
  }
  MapView top(ctx, root, "",
              {"standfast", "league", "teams", "groups", "postseason", "tiebreakers", "model",
               "overrides", "games", "games_file"});
  if (!top.ok()) return;
  if (auto n = top.require("standfast")) {
    const auto v = n->IsScalar() ? parse_integer(n->Scalar()) : std::nullopt;
    if (!v || *v != SEASON_FORMAT_VERSION) {
      ctx.error(*n, "standfast: the format version must be " +
                        std::to_string(SEASON_FORMAT_VERSION) + ", got " + describe(*n));
    }
  }
  if (auto n = top.require("league")) read_league(ctx, *n, season.league, out);
  if (auto n = top.require("teams")) read_teams(ctx, *n, season, out.teams);
  if (auto n = top.require("groups")) read_groups(ctx, *n, season, out.teams);
  if (auto n = top.get("postseason")) read_postseason(ctx, *n, season);
  season.tiebreakers.order.clear();
  for (const TiebreakKind k : {TiebreakKind::kHeadToHead, TiebreakKind::kDivisionRecord,
                               TiebreakKind::kConferenceRecord, TiebreakKind::kDraw}) {
    TiebreakRule rule;
    rule.kind = k;
    season.tiebreakers.order.push_back(rule);
  }
  if (auto n = top.get("tiebreakers")) read_tiebreakers(ctx, *n, season.tiebreakers);
  SourcePos family_pos{ctx.file(), 0, 0};
  if (auto n = top.get("model")) family_pos = read_model(ctx, *n, season.model, "model");
  if (auto n = top.get("overrides"))
    read_overrides(ctx, *n, "overrides", out.teams, season.overrides);
  check_log5(ctx, season, family_pos);
  if (auto n = top.get("games")) read_games(ctx, *n, season, out.teams);
  if (auto n = top.get("games_file")) {
    out.games_file = ctx.text(*n, "games_file");
    out.games_file_pos = ctx.pos(*n);
  }
}

const char* const UNCLOSED_QUOTE =
    "the quoted value opened here is not closed on its line: add the closing quote (a quoted "
    "value must end on the line where it starts)";

// Offset of a node's first character in `text`, from its 0-based line and column (yaml-cpp's
// own stream offset skips a byte-order mark). npos when out of range.
std::size_t offset_of(std::string_view text, const YAML::Mark& mark) {
  std::size_t at = 0;
  for (int line = 0; line < mark.line; ++line) {
    at = text.find('\n', at);
    if (at == std::string_view::npos) return at;
    ++at;
  }
  if (mark.line == 0 && text.substr(0, 3) == "\xEF\xBB\xBF") at = 3;
  at += static_cast<std::size_t>(mark.column);
  return at < text.size() ? at : std::string_view::npos;
}

// YAML lets a quoted value run over several lines, so a quote left open swallows the keys that
// follow it (up to the next quote or the end of the file) and the file still parses. A season
// file never needs that: every quoted value must close on the line where it opens.
struct QuoteChecker {
  std::string_view text;
  YamlContext& ctx;
  std::set<int> seen;  // positions of the lists and maps visited (an alias revisits one)

  void scalar(const YAML::Node& n) {
    if (n.Tag() != "!") return;  // plain scalars carry the tag "?"
    const std::size_t at = offset_of(text, n.Mark());
    if (at == std::string_view::npos) return;
    const char quote = text[at];
    if (quote != '"' && quote != '\'') return;
    for (std::size_t i = at + 1; i < text.size(); ++i) {
      const char c = text[i];
      if (c == '\n' || c == '\r') break;
      if (quote == '"' && c == '\\') {
        ++i;
      } else if (c == quote) {
        if (quote == '\'' && i + 1 < text.size() && text[i + 1] == '\'') {
          ++i;
        } else {
          return;
        }
      }
    }
    ctx.error(n, UNCLOSED_QUOTE);
  }

  void walk(const YAML::Node& n) {
    if (n.IsScalar()) {
      scalar(n);
      return;
    }
    if (!n.IsMap() && !n.IsSequence()) return;
    if (!seen.insert(n.Mark().pos).second) return;
    if (n.IsMap()) {
      for (const auto& kv : n) {
        walk(kv.first);
        walk(kv.second);
      }
    } else {
      for (const auto& item : n) walk(item);
    }
  }
};

// After a syntax error: the first quote that opens a value and does not close on its line, at or
// before the error's line (0-based). A quote opens a value where YAML allows one: at the start
// of a line or after a space, `:`, `,`, `[`, `{` or `-`; an apostrophe inside a word does not.
// Comments (` #`) end the scan of a line.
std::optional<SourcePos> unclosed_quote(std::string_view text, int last_line,
                                        const std::string& file) {
  int line = 0;
  for (std::size_t start = 0; start <= text.size() && line <= last_line; ++line) {
    std::size_t end = text.find('\n', start);
    if (end == std::string_view::npos) end = text.size();
    const std::string_view l = text.substr(start, end - start);
    char before = ' ';
    for (std::size_t i = 0; i < l.size(); ++i) {
      const char c = l[i];
      if (c == '#' && (before == ' ' || before == '\t')) break;
      if ((c == '"' || c == '\'') &&
          std::string_view(" \t:,[{-").find(before) != std::string_view::npos) {
        std::size_t j = i + 1;
        for (; j < l.size(); ++j) {
          if (c == '"' && l[j] == '\\') {
            ++j;
          } else if (l[j] == c) {
            if (c == '\'' && j + 1 < l.size() && l[j + 1] == '\'') {
              ++j;
            } else {
              break;
            }
          }
        }
        if (j >= l.size()) return SourcePos{file, line + 1, static_cast<int>(i) + 1};
        i = j;
        before = c;
        continue;
      }
      before = c;
    }
    start = end + 1;
  }
  return std::nullopt;
}

// The line where the second document of a stream starts (its `---`), or the root's own line.
SourcePos second_document_pos(std::string_view text, const YAML::Mark& m, const std::string& file) {
  std::size_t at = m.is_null() ? text.size() : offset_of(text, m);
  if (at == std::string_view::npos) at = text.size();
  std::size_t start = text.rfind("\n---", at);
  start = start == std::string_view::npos ? 0 : start + 1;
  int line = 1;
  for (std::size_t i = 0; i < start; ++i) line += text[i] == '\n';
  return SourcePos{file, line, 1};
}

// Where each document of a stream starts, from the parser's events (nothing is built).
class DocumentStarts : public YAML::EventHandler {
 public:
  std::vector<YAML::Mark> starts;
  void OnDocumentStart(const YAML::Mark& mark) override { starts.push_back(mark); }
  void OnDocumentEnd() override {}
  void OnNull(const YAML::Mark&, YAML::anchor_t) override {}
  void OnAlias(const YAML::Mark&, YAML::anchor_t) override {}
  void OnScalar(const YAML::Mark&, const std::string&, YAML::anchor_t,
                const std::string&) override {}
  void OnSequenceStart(const YAML::Mark&, const std::string&, YAML::anchor_t,
                       YAML::EmitterStyle::value) override {}
  void OnSequenceEnd() override {}
  void OnMapStart(const YAML::Mark&, const std::string&, YAML::anchor_t,
                  YAML::EmitterStyle::value) override {}
  void OnMapEnd() override {}
};

// The start of at most the first two documents. yaml-cpp's LoadAll never ends on a stray flow
// entry (a lone `,` at the top level): the parser returns an empty document without consuming
// the token, again and again. Two starts at the same place mean exactly that.
std::vector<YAML::Mark> first_documents(const std::string& text) {
  std::istringstream in(text);
  YAML::Parser parser(in);
  DocumentStarts events;
  for (int i = 0; i < 2 && parser.HandleNextDocument(events); ++i) {
  }
  return events.starts;
}

SourcePos mark_pos(const std::string& file, const YAML::Mark& mark) {
  if (mark.is_null()) return SourcePos{file, 0, 0};
  return SourcePos{file, mark.line + 1, mark.column + 1};
}

}  // namespace

YamlResult read_season_yaml(const std::string& text, Season& season, Report& report) {
  YamlResult out;
  YamlContext ctx(season.file, report);
  YAML::Node root;
  try {
    const std::vector<YAML::Mark> starts = first_documents(text);
    if (starts.size() > 1 && starts[1].pos == starts[0].pos) {
      report.error(mark_pos(season.file, starts[1]),
                   "YAML syntax error: a ',' outside a [list] or {map}");
      return out;
    }
    if (starts.size() > 1) {
      report.error(second_document_pos(text, starts[1], season.file),
                   "a second YAML document starts here: a season file holds one document "
                   "(remove this `---` and what follows, or merge it into the first)");
      return out;
    }
    if (!starts.empty()) root = YAML::Load(text);
  } catch (const YAML::DeepRecursion& e) {
    report.error(mark_pos(season.file, e.mark),
                 "lists and maps nested too deeply for the YAML reader (hundreds of levels): a "
                 "season file needs only a few");
    return out;
  } catch (const YAML::Exception& e) {
    report.error(mark_pos(season.file, e.mark), "YAML syntax error: " + e.msg);
    // An open quote swallows what follows and the parser stumbles far below it: say where.
    const int last = e.mark.is_null() ? 1 << 30 : e.mark.line;
    if (auto q = unclosed_quote(text, last, season.file)) report.error(*q, UNCLOSED_QUOTE);
    return out;
  }
  const std::size_t errors_before = report.error_count();
  QuoteChecker{text, ctx, {}}.walk(root);
  if (report.error_count() != errors_before) return out;  // the keys after it are not to be trusted
  try {
    read_all(ctx, root, season, out);
  } catch (const YAML::Exception& e) {
    // Not expected: the readers check node types before use. Reported rather than crashing.
    report.error(mark_pos(season.file, e.mark), "cannot read this part of the file: " + e.msg);
  }
  return out;
}

}  // namespace standfast::config::detail
