#include "tools/scenario_report.h"

#include <fmt/core.h>

#include <algorithm>
#include <cmath>
#include <nlohmann/json.hpp>

#include "tools/odds_report.h"
#include "tools/output.h"

namespace standfast::tools {

namespace {

struct ChanceRef {
  const char* key;    // CSV and JSON name
  const char* label;  // table
  bool percent;       // a probability (shown in %), or mean wins
  engine::PairedChance engine::TeamComparison::*member;
};

constexpr ChanceRef CHANCES[] = {
    {"division", "division", true, &engine::TeamComparison::division},
    {"postseason", "postseason", true, &engine::TeamComparison::postseason},
    {"bye", "bye", true, &engine::TeamComparison::bye},
    {"title", "title", true, &engine::TeamComparison::title},
    {"mean_wins", "mean wins", false, &engine::TeamComparison::wins},
};

std::string team_name(const ScenarioReport& r, std::size_t t) {
  return t < r.team_names.size() && !r.team_names[t].empty() ? r.team_names[t] : r.team_ids[t];
}

bool changed(const engine::TeamComparison& t) {
  for (const auto& c : CHANCES)
    if ((t.*c.member).diff != 0.0) return true;
  return false;
}

}  // namespace

ModelUsed model_used(const engine::Plan& plan) {
  switch (plan.model) {
    case engine::GameModel::kWeibull:
      return {"weibull", plan.shape};
    case engine::GameModel::kNegativeBinomial:
      return {"negative_binomial", plan.nb_size};
    case engine::GameModel::kPoisson:
      return {"poisson", 0.0};
    case engine::GameModel::kLog5:
      return {"log5", plan.shape};
  }
  return {"?", 0.0};
}

namespace {

std::string model_text(const ModelUsed& m) {
  if (m.family == "poisson") return "poisson (no shape)";
  if (m.family == "negative_binomial")
    return fmt::format("negative_binomial, size {:.3f}", m.shape);
  if (m.family == "log5") return "log5 (win percentages)";
  return fmt::format("{}, shape {:.3f}", m.family, m.shape);
}

}  // namespace

std::string write_scenario_table(const ScenarioReport& r) {
  std::string out;
  out += fmt::format("Scenarios for {} ({}): {} against {}\n", r.league, r.season_label,
                     r.scenario_file, r.season_file);
  out += provenance_line(r.run) + "\n";
  out += fmt::format(
      "Seed {}, {} seasons, every scenario on the same random numbers as the baseline.\n"
      "Baseline model: {}.\n",
      r.seed, group_digits(r.seasons), model_text(r.baseline_model));
  out +=
      "Change = scenario - baseline (percentage points; wins for mean wins). Paired se: the\n"
      "standard error of the change on common random numbers; unpaired: what it would be from\n"
      "two independent runs of this size.\n";
  out += ODDS_CAUTION;
  out += "\n";
  for (std::size_t k = 0; k < r.names.size(); ++k) {
    const auto& alt = r.comparison.alternatives[k];
    out += fmt::format("\nScenario \"{}\" (model: {})\n", r.names[k], model_text(r.models[k]));
    std::vector<std::size_t> order;
    for (std::size_t t = 0; t < alt.teams.size(); ++t)
      if (changed(alt.teams[t])) order.push_back(t);
    std::stable_sort(order.begin(), order.end(), [&](std::size_t a, std::size_t b) {
      return std::abs(alt.teams[a].postseason.diff) > std::abs(alt.teams[b].postseason.diff);
    });
    if (order.empty()) {
      out += "  no chance of any team changed\n";
      continue;
    }
    out += fmt::format("  {:<8} {:<11} {:>9} {:>9} {:>8} {:>9} {:>11}\n", "team", "chance",
                       "baseline", "scenario", "change", "paired se", "unpaired se");
    for (std::size_t t : order) {
      bool first = true;
      for (const auto& c : CHANCES) {
        const engine::PairedChance& p = alt.teams[t].*c.member;
        if (p.diff == 0.0 && p.base == 0.0 && c.percent) continue;
        const double f = c.percent ? 100.0 : 1.0;
        out += fmt::format("  {:<8} {:<11} {:>9.2f} {:>9.2f} {:>+8.2f} {:>9.2f} {:>11.2f}\n",
                           first ? r.team_ids[t] : "", c.label, f * p.base, f * p.alt, f * p.diff,
                           f * p.se_paired, f * p.se_unpaired);
        first = false;
      }
    }
    const std::size_t same = alt.teams.size() - order.size();
    if (same > 0) out += fmt::format("  ({} more teams: no chance changed)\n", same);
  }
  return out;
}

std::string write_scenario_csv(const ScenarioReport& r) {
  std::string out =
      "scenario,family,shape,team_id,team_name,chance,baseline,scenario_value,change,se_paired,"
      "se_unpaired" +
      provenance_csv_header() + "\n";
  const std::string run_cells = provenance_csv_cells(r.run);
  for (std::size_t k = 0; k < r.names.size(); ++k) {
    const auto& alt = r.comparison.alternatives[k];
    for (std::size_t t = 0; t < alt.teams.size(); ++t) {
      for (const auto& c : CHANCES) {
        const engine::PairedChance& p = alt.teams[t].*c.member;
        out += fmt::format("{},{},{:.6g},{},{},{},{:.6f},{:.6f},{:.6f},{:.6f},{:.6f}{}\n",
                           csv_field(r.names[k]), r.models[k].family, r.models[k].shape,
                           csv_field(r.team_ids[t]), csv_field(team_name(r, t)), c.key, p.base,
                           p.alt, p.diff, p.se_paired, p.se_unpaired, run_cells);
      }
    }
  }
  return out;
}

std::string write_scenario_json(const ScenarioReport& r) {
  using nlohmann::json;
  auto model = [](const ModelUsed& m) { return json{{"family", m.family}, {"shape", m.shape}}; };
  json j;
  j["schema_version"] = SCENARIO_SCHEMA_VERSION;
  j["caution"] = std::string(ODDS_CAUTION);
  j["run"] = json::parse(provenance_json(r.run).dump());
  j["league"] = r.league;
  j["season"] = r.season_label;
  j["season_file"] = r.season_file;
  j["scenario_file"] = r.scenario_file;
  j["seed"] = r.seed;
  j["seasons"] = r.seasons;
  j["baseline_model"] = model(r.baseline_model);
  json scenarios = json::array();
  for (std::size_t k = 0; k < r.names.size(); ++k) {
    const auto& alt = r.comparison.alternatives[k];
    json teams = json::array();
    for (std::size_t t = 0; t < alt.teams.size(); ++t) {
      json team{{"team_id", r.team_ids[t]}, {"team_name", team_name(r, t)}};
      for (const auto& c : CHANCES) {
        const engine::PairedChance& p = alt.teams[t].*c.member;
        team[c.key] = {{"baseline", p.base},
                       {"scenario", p.alt},
                       {"change", p.diff},
                       {"se_paired", p.se_paired},
                       {"se_unpaired", p.se_unpaired}};
      }
      teams.push_back(team);
    }
    scenarios.push_back({{"name", r.names[k]}, {"model", model(r.models[k])}, {"teams", teams}});
  }
  j["scenarios"] = scenarios;
  return j.dump(2) + "\n";
}

}  // namespace standfast::tools
