#include "config/scenario.h"

#include <yaml-cpp/yaml.h>

#include <algorithm>
#include <fstream>
#include <set>
#include <sstream>
#include <utility>

#include "config/games.h"
#include "config/load.h"
#include "config/report.h"
#include "config/suggest.h"
#include "config/yaml_node.h"
#include "config/yaml_reader.h"

namespace standfast::config {

namespace {

using detail::describe;
using detail::MapView;

using detail::Report;
using detail::TeamIds;
using detail::YamlContext;

std::string item(const std::string& path, std::size_t i) {
  return path + "[" + std::to_string(i) + "]";
}

// "2044-05-10 PIN at GUL" (away at home), with the game number when not 1.
std::string describe_game(const Season& s, std::optional<DayNumber> date, int home, int away,
                          int number) {
  std::string out = date ? format_date(*date) : std::string("tbd");
  out += " " + s.teams[static_cast<std::size_t>(away)].id + " at " +
         s.teams[static_cast<std::size_t>(home)].id;
  if (number != 1) out += " (game " + std::to_string(number) + ")";
  return out;
}

class ScenarioReader {
 public:
  ScenarioReader(YamlContext& ctx, const Season& season) : ctx_(ctx), season_(season) {
    for (std::size_t t = 0; t < season.teams.size(); ++t) {
      ids_.index.emplace(season.teams[t].id, static_cast<int>(t));
      ids_.ids.push_back(season.teams[t].id);
    }
  }

  void read(const YAML::Node& root, ScenarioSet& out) {
    if (root.IsNull() || !root.IsDefined()) {
      ctx_.report().error(SourcePos{ctx_.file(), 0, 0},
                          "the scenario file is empty: it needs standfast_scenarios and scenarios");
      return;
    }
    MapView top(ctx_, root, "", {"standfast_scenarios", "scenarios"});
    if (!top.ok()) return;
    if (auto n = top.require("standfast_scenarios")) {
      const auto v = n->IsScalar() ? detail::parse_integer(n->Scalar()) : std::nullopt;
      if (!v || *v != 1)
        ctx_.error(*n, "standfast_scenarios: the format version must be 1, got " + describe(*n));
    }
    auto list = top.require("scenarios");
    if (!list || !ctx_.is_list(*list, "scenarios")) return;
    std::set<std::string> names;
    for (std::size_t i = 0; i < list->size(); ++i) {
      const YAML::Node node = (*list)[i];
      Scenario sc;
      if (read_scenario(node, item("scenarios", i), sc)) {
        if (!names.insert(sc.name).second) {
          ctx_.error(node, item("scenarios", i) + ".name: " + detail::quoted(sc.name) +
                               " is the name of an earlier scenario");
          continue;
        }
        out.scenarios.push_back(std::move(sc));
      }
    }
  }

 private:
  bool read_scenario(const YAML::Node& node, const std::string& path, Scenario& sc) {
    MapView m(ctx_, node, path, {"name", "teams", "results", "remove", "add", "model"});
    if (!m.ok()) return false;
    sc.pos = ctx_.pos(node);
    const std::size_t errors = ctx_.report().errors().size();
    if (auto n = m.require("name")) {
      const auto name = ctx_.text(*n, m.sub("name"));
      if (name && name->empty()) ctx_.error(*n, m.sub("name") + ": must not be empty");
      sc.name = name.value_or("");
    }
    if (auto n = m.get("teams")) detail::read_overrides(ctx_, *n, m.sub("teams"), ids_, sc.teams);
    std::set<int> touched;  // games decided or removed
    if (auto n = m.get("results"); n && ctx_.is_list(*n, m.sub("results"))) {
      for (std::size_t i = 0; i < n->size(); ++i) {
        const std::string p = item(m.sub("results"), i);
        MapView g(ctx_, (*n)[i], p, {"date", "home", "away", "game", "winner"});
        if (!g.ok()) continue;
        const int index = find_game(g, p);
        int winner = -1;
        if (auto w = g.require("winner")) winner = team(*w, g.sub("winner"));
        if (index < 0 || winner < 0) continue;
        const Game& game = season_.games[static_cast<std::size_t>(index)];
        if (winner != game.home && winner != game.away) {
          ctx_.error(*g.get("winner"), g.sub("winner") + ": " +
                                           season_.teams[static_cast<std::size_t>(winner)].id +
                                           " does not play in this game");
          continue;
        }
        if (!touched.insert(index).second) {
          ctx_.error((*n)[i], p + ": this game is already decided or removed in the scenario");
          continue;
        }
        sc.results.push_back(DecidedGame{index, winner == game.home, ctx_.pos((*n)[i])});
      }
    }
    if (auto n = m.get("remove"); n && ctx_.is_list(*n, m.sub("remove"))) {
      for (std::size_t i = 0; i < n->size(); ++i) {
        const std::string p = item(m.sub("remove"), i);
        MapView g(ctx_, (*n)[i], p, {"date", "home", "away", "game"});
        if (!g.ok()) continue;
        const int index = find_game(g, p);
        if (index < 0) continue;
        if (!touched.insert(index).second) {
          ctx_.error((*n)[i], p + ": this game is already decided or removed in the scenario");
          continue;
        }
        sc.removed.push_back(index);
      }
    }
    if (auto n = m.get("add"); n && ctx_.is_list(*n, m.sub("add"))) {
      Season scratch;  // add_game checks a game against the teams and appends it here
      scratch.league = season_.league;
      scratch.teams = season_.teams;
      for (std::size_t i = 0; i < n->size(); ++i) {
        const std::string p = item(m.sub("add"), i);
        MapView g(ctx_, (*n)[i], p, {"date", "home", "away", "game"});
        if (!g.ok()) continue;
        detail::GameFields f;
        f.where = p + ".";
        f.pos = ctx_.pos((*n)[i]);
        if (!field(g, "date", f.date) || !field(g, "home", f.home) || !field(g, "away", f.away) ||
            !field(g, "game", f.number))
          continue;
        if (!f.date.given) {
          ctx_.error((*n)[i], p + ".date: required (YYYY-MM-DD) for an added game");
          continue;
        }
        detail::add_game(f, ids_, scratch, ctx_.report());
      }
      sc.added = std::move(scratch.games);
    }
    if (auto n = m.get("model")) {
      ModelSpec model = season_.model;
      detail::read_model(ctx_, *n, model, m.sub("model"));
      // Another family is fitted afresh: the season's fixed shape belongs to its own family (a
      // Weibull shape means nothing as a negative-binomial size), unless the scenario states one.
      const YAML::Node& node = *n;
      if (model.family != season_.model.family && node.IsMap() && !node["shape"])
        model.shape.reset();
      if (model.family == ScoreFamily::kLog5 && season_.model.family != ScoreFamily::kLog5)
        ctx_.error(*n, m.sub("model.family") +
                           ": log5 needs a win_pct for every team; give it in the season file");
      sc.model = model;
    }
    return ctx_.report().errors().size() == errors;
  }

  // A scalar field of a game as text (empty when absent); false after reporting a problem.
  bool field(const MapView& g, const char* key, detail::GameField& f) {
    if (auto n = g.get(key)) {
      f.pos = ctx_.pos(*n);
      if (!n->IsScalar()) {
        ctx_.error(*n, g.sub(key) + ": must be a single value, got " + describe(*n));
        return false;
      }
      f.text = std::string(detail::trim(n->Scalar()));
      f.given = !f.text.empty();
    }
    return true;
  }

  int team(const YAML::Node& n, const std::string& path) {
    const auto id = ctx_.text(n, path);
    if (!id) return -1;
    const int t = ids_.find(*id);
    if (t < 0)
      ctx_.error(n, path + ": unknown team " + detail::quoted(*id) + did_you_mean(*id, ids_.ids));
    return t;
  }

  // The remaining game a reference names (date, home, away, game number); -1 after reporting.
  int find_game(MapView& g, const std::string& path) {
    std::optional<DayNumber> date;
    bool ok = true;
    if (auto n = g.require("date")) {
      const auto text = ctx_.text(*n, g.sub("date"));
      if (text && *text != "tbd") {
        date = parse_date(*text);
        if (!date) {
          ctx_.error(*n, g.sub("date") + ": cannot read " + detail::quoted(*text) +
                             " as a date (YYYY-MM-DD or tbd)");
          ok = false;
        }
      }
      ok = ok && text.has_value();
    } else {
      ok = false;
    }
    int home = -1, away = -1, number = 1;
    if (auto n = g.require("home")) home = team(*n, g.sub("home"));
    if (auto n = g.require("away")) away = team(*n, g.sub("away"));
    if (auto n = g.get("game")) {
      const auto v = ctx_.integer(*n, g.sub("game"), 1, 9);
      ok = ok && v.has_value();
      number = v.value_or(1);
    }
    if (!ok || home < 0 || away < 0) return -1;
    int found = -1;
    for (std::size_t i = 0; i < season_.games.size(); ++i) {
      const Game& x = season_.games[i];
      if (x.home == home && x.away == away && x.number == number && x.date == date) {
        found = static_cast<int>(i);
        if (!(x.played && x.date)) break;
      }
    }
    const std::string what = describe_game(season_, date, home, away, number);
    if (found < 0) {
      ctx_.error(g.node(), path + ": no game " + what + " in " + season_.file);
      return -1;
    }
    const Game& x = season_.games[static_cast<std::size_t>(found)];
    if (x.played && x.date) {
      ctx_.error(g.node(), path + ": the game " + what + " has been played");
      return -1;
    }
    return found;
  }

  YamlContext& ctx_;
  const Season& season_;
  TeamIds ids_;
};

}  // namespace

ScenarioSet load_scenarios_text(const std::string& yaml_text, const std::filesystem::path& file,
                                const Season& season) {
  ScenarioSet out;
  out.file = file.string();
  Report report;
  YamlContext ctx(out.file, report);
  YAML::Node root;
  try {
    root = YAML::Load(yaml_text);
    ScenarioReader(ctx, season).read(root, out);
  } catch (const YAML::Exception& e) {
    SourcePos pos{out.file, 0, 0};
    if (!e.mark.is_null()) pos = SourcePos{out.file, e.mark.line + 1, e.mark.column + 1};
    report.error(pos, "YAML syntax error: " + e.msg);
  }
  if (report.has_errors()) {
    auto& errors = report.errors();
    std::stable_sort(errors.begin(), errors.end(), [](const Diagnostic& a, const Diagnostic& b) {
      return std::pair(a.pos.line, a.pos.column) < std::pair(b.pos.line, b.pos.column);
    });
    throw ConfigError(std::move(errors));
  }
  return out;
}

ScenarioSet load_scenarios(const std::filesystem::path& file, const Season& season) {
  std::ifstream in(file, std::ios::binary);
  if (!in)
    throw ConfigError(
        {Diagnostic{SourcePos{file.string(), 0, 0},
                    "cannot read the scenario file " + detail::quoted(file.string(), 4096)}});
  std::ostringstream text;
  text << in.rdbuf();
  return load_scenarios_text(text.str(), file, season);
}

Season apply_scenario(const Season& season, const Scenario& scenario) {
  Season s = season;
  s.overrides.insert(s.overrides.end(), scenario.teams.begin(), scenario.teams.end());
  s.games.insert(s.games.end(), scenario.added.begin(), scenario.added.end());
  if (scenario.model) s.model = *scenario.model;
  return s;
}

}  // namespace standfast::config
