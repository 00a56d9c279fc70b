#include "tools/family_report.h"

#include <fmt/core.h>

#include <algorithm>
#include <cstring>
#include <nlohmann/json.hpp>

#include "tools/odds_report.h"
#include "tools/output.h"

namespace standfast::tools {

namespace {

using nlohmann::ordered_json;

constexpr engine::PairedChance engine::TeamComparison::*MEMBERS[] = {
    &engine::TeamComparison::division, &engine::TeamComparison::postseason,
    &engine::TeamComparison::bye, &engine::TeamComparison::title, &engine::TeamComparison::wins};

double odds_value(const engine::TeamOdds& o, std::size_t chance) {
  switch (chance) {
    case 0:
      return o.division.p;
    case 1:
      return o.postseason.p;
    case 2:
      return o.bye.p;
    case 3:
      return o.title.p;
    default:
      return o.mean_wins;
  }
}

bool is_probability(std::size_t chance) { return chance < 4; }

std::string model_text(const FamilyModel& m) {
  if (m.model.family == "poisson") return "poisson";
  if (m.model.family == "log5") return "log5 (win percentages)";
  const char* what = m.model.family == "negative_binomial" ? "size" : "shape";
  return fmt::format("{} ({} {:.3f}{})", m.model.family, what, m.model.shape,
                     m.shape_source.empty() ? "" : ", " + m.shape_source);
}

std::string value_text(double v, std::size_t chance) {
  return is_probability(chance) ? fmt::format("{:.1f}%", 100 * v) : fmt::format("{:.1f}", v);
}

std::string spread_text(double v, std::size_t chance) {
  return is_probability(chance) ? fmt::format("{:.1f}", 100 * v) : fmt::format("{:.2f}", v);
}

}  // namespace

int family_chance_index(const std::string& name) {
  for (std::size_t c = 0; c < std::size(FAMILY_CHANCES); ++c)
    if (name == FAMILY_CHANCES[c]) return static_cast<int>(c);
  return -1;
}

void fill_family_teams(FamiliesReport& report, const engine::Comparison& comparison,
                       const std::vector<std::string>& ids, const std::vector<std::string>& names) {
  report.teams.clear();
  const std::size_t families = 1 + comparison.alternatives.size();
  for (std::size_t t = 0; t < ids.size(); ++t) {
    FamilyTeam team;
    team.id = ids[t];
    team.name = names[t];
    for (std::size_t c = 0; c < std::size(FAMILY_CHANCES); ++c) {
      FamilySpread s;
      const double base = odds_value(comparison.baseline.teams[t], c);
      engine::PairedChance same;
      same.base = same.alt = base;
      s.values.push_back(base);
      s.changes.push_back(same);
      for (std::size_t a = 0; a + 1 < families; ++a) {
        const engine::PairedChance& p = comparison.alternatives[a].teams[t].*MEMBERS[c];
        s.values.push_back(p.alt);
        s.changes.push_back(p);
      }
      const auto [lo, hi] = std::minmax_element(s.values.begin(), s.values.end());
      s.lowest = static_cast<int>(lo - s.values.begin());
      s.highest = static_cast<int>(hi - s.values.begin());
      s.spread = *hi - *lo;
      s.spread_se_bound = s.changes[static_cast<std::size_t>(s.highest)].se_paired +
                          s.changes[static_cast<std::size_t>(s.lowest)].se_paired;
      team.chances.push_back(std::move(s));
    }
    report.teams.push_back(std::move(team));
  }
}

std::string write_families_table(const FamiliesReport& r) {
  const int ci = std::max(family_chance_index(r.shown), 0);
  const auto c = static_cast<std::size_t>(ci);
  const bool prob = is_probability(c);
  std::string out = fmt::format(
      "Model sensitivity of {} ({}): {} under each scoring family, every family on the same "
      "random numbers\n",
      r.league, r.season_label, prob ? r.shown + " chance" : std::string("mean final wins"));
  out += provenance_line(r.run) + "\n";
  out += std::string(ODDS_CAUTION) + "\n";
  out += "Families:";
  for (std::size_t m = 0; m < r.models.size(); ++m)
    out += fmt::format("{} {}{}", m ? ";" : "", model_text(r.models[m]),
                       m == 0 ? " (the reference)" : "");
  out += "\n";
  for (const auto& [family, why] : r.skipped) out += fmt::format("Left out: {}: {}\n", family, why);
  out += "\n";
  // Widest family name sets the column width.
  std::size_t width = 7;
  for (const FamilyModel& m : r.models) width = std::max(width, m.model.family.size());
  out += fmt::format("{:<28}", "Team");
  for (const FamilyModel& m : r.models) out += fmt::format(" {:>{}}", m.model.family, width);
  out += fmt::format(" {:>8} {:>8}\n", "spread", "± bound");
  std::vector<std::size_t> order(r.teams.size());
  for (std::size_t t = 0; t < order.size(); ++t) order[t] = t;
  std::stable_sort(order.begin(), order.end(), [&](std::size_t a, std::size_t b) {
    return r.teams[a].chances[c].spread > r.teams[b].chances[c].spread;
  });
  for (std::size_t t : order) {
    const FamilyTeam& team = r.teams[t];
    const FamilySpread& s = team.chances[c];
    out += fmt::format("{:<28}", team.name.substr(0, 28));
    for (double v : s.values) out += fmt::format(" {:>{}}", value_text(v, c), width);
    out +=
        fmt::format(" {:>8} {:>8}\n", spread_text(s.spread, c), spread_text(s.spread_se_bound, c));
  }
  out += fmt::format(
      "\nspread: highest - lowest over the families ({}); ± bound: at most this Monte Carlo "
      "standard error (the paired errors of the two against the reference, added). Teams by "
      "spread, largest first; --chance shows another chance, CSV and JSON have them all.\n",
      prob ? "percentage points" : "wins");
  return out;
}

std::string write_families_csv(const FamiliesReport& r) {
  std::string out =
      "team_id,team_name,chance,family,shape,value,change,se_paired,se_unpaired,spread,"
      "spread_se_bound";
  out += provenance_csv_header() + "\n";
  const std::string cells = provenance_csv_cells(r.run);
  for (const FamilyTeam& team : r.teams) {
    for (std::size_t c = 0; c < team.chances.size(); ++c) {
      const FamilySpread& s = team.chances[c];
      for (std::size_t m = 0; m < r.models.size(); ++m) {
        const FamilyModel& model = r.models[m];
        const bool shaped =
            model.model.family == "weibull" || model.model.family == "negative_binomial";
        const engine::PairedChance& p = s.changes[m];
        out += fmt::format(
            "{},{},{},{},{},{:.6f},{:.6f},{:.6f},{:.6f},{:.6f},{:.6f}{}\n", csv_field(team.id),
            csv_field(team.name), FAMILY_CHANCES[c], model.model.family,
            shaped ? fmt::format("{:.6f}", model.model.shape) : std::string(), s.values[m], p.diff,
            p.se_paired, p.se_unpaired, s.spread, s.spread_se_bound, cells);
      }
    }
  }
  return out;
}

std::string write_families_json(const FamiliesReport& r) {
  ordered_json doc;
  doc["schema_version"] = FAMILIES_SCHEMA_VERSION;
  doc["kind"] = "families";
  doc["caution"] = std::string(ODDS_CAUTION);
  doc["league"] = r.league;
  doc["season"] = r.season_label;
  ordered_json models = ordered_json::array();
  for (const FamilyModel& m : r.models) {
    const bool shaped = m.model.family == "weibull" || m.model.family == "negative_binomial";
    models.push_back(
        {{"family", m.model.family},
         {"shape", shaped ? ordered_json(m.model.shape) : ordered_json(nullptr)},
         {"shape_source", shaped ? ordered_json(m.shape_source) : ordered_json(nullptr)}});
  }
  doc["families"] = models;
  ordered_json skipped = ordered_json::array();
  for (const auto& [family, why] : r.skipped)
    skipped.push_back({{"family", family}, {"reason", why}});
  doc["left_out"] = skipped;
  ordered_json teams = ordered_json::array();
  for (const FamilyTeam& team : r.teams) {
    ordered_json t;
    t["team_id"] = team.id;
    t["team_name"] = team.name;
    for (std::size_t c = 0; c < team.chances.size(); ++c) {
      const FamilySpread& s = team.chances[c];
      ordered_json per = ordered_json::object();
      for (std::size_t m = 0; m < r.models.size(); ++m) {
        const engine::PairedChance& p = s.changes[m];
        per[r.models[m].model.family] = {{"value", s.values[m]},
                                         {"change", p.diff},
                                         {"se_paired", p.se_paired},
                                         {"se_unpaired", p.se_unpaired}};
      }
      t[FAMILY_CHANCES[c]] = {
          {"by_family", per},
          {"spread", s.spread},
          {"spread_se_bound", s.spread_se_bound},
          {"highest", r.models[static_cast<std::size_t>(s.highest)].model.family},
          {"lowest", r.models[static_cast<std::size_t>(s.lowest)].model.family}};
    }
    teams.push_back(std::move(t));
  }
  doc["teams"] = teams;
  doc["run"] = provenance_json(r.run);
  return doc.dump(2) + "\n";
}

}  // namespace standfast::tools
