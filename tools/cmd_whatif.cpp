// `standfast whatif SEASON_FILE SCENARIO_FILE`: runs every scenario of the scenario file
// against the season on common random numbers and prints, per team, each chance under the
// baseline and the scenario, the change, and its paired and unpaired standard errors.
#include <fmt/core.h>

#include <cstdint>
#include <memory>
#include <stdexcept>
#include <string>
#include <vector>

#include "config/load.h"
#include "config/scenario.h"
#include "engine/compare.h"
#include "engine/plan.h"
#include "models/ratings.h"
#include "tools/cli.h"
#include "tools/commands.h"
#include "tools/output.h"
#include "tools/progress.h"
#include "tools/provenance.h"
#include "tools/scenario_report.h"

namespace standfast::tools {
namespace {

constexpr std::uint64_t DEFAULT_SEED = 20260101;
constexpr std::uint64_t DEFAULT_SEASONS = 20000;
constexpr std::uint64_t MAX_SEASONS = 100'000'000;

struct WhatifOptions {
  std::string season_file, scenario_file;
  std::uint64_t seasons = DEFAULT_SEASONS;
  std::uint64_t seed = DEFAULT_SEED;
  int threads = 0;
  ReportOptions report;
  ModelOptions model;
};

void run_whatif(const WhatifOptions& opt) {
  // The numbers are checked by their validators while parsing; the format and the output path
  // here, before any work.
  const Format format = check_report_options(opt.report);
  config::Season season = config::load_season(opt.season_file);
  std::vector<std::string> inputs = season.input_files;
  inputs.push_back(opt.scenario_file);
  check_output_target(opt.report.output, inputs);
  print_warnings(season);
  apply_model_options(opt.model, season);
  const config::ScenarioSet set = config::load_scenarios(opt.scenario_file, season);
  if (set.scenarios.empty())
    throw UsageError(fmt::format("{}: the file lists no scenario", opt.scenario_file));

  engine::Plan baseline;
  std::vector<std::unique_ptr<engine::Plan>> plans;
  std::string where = opt.season_file;
  try {
    const models::LeagueRatings ratings = models::fit_ratings(season);
    baseline = engine::compile_plan(season, ratings);
    for (const config::Scenario& sc : set.scenarios) {
      where = fmt::format("{}: scenario \"{}\"", opt.scenario_file, sc.name);
      const config::Season changed = config::apply_scenario(season, sc);
      engine::PlanEdits edits;
      edits.removed = sc.removed;
      for (const config::DecidedGame& d : sc.results)
        edits.forced.emplace_back(d.game, d.home_wins);
      if (!sc.added.empty()) edits.added_from = static_cast<int>(season.games.size());
      // Another model is fitted again; otherwise the scenario keeps the season's fit, so that
      // only what the scenario states differs.
      const models::LeagueRatings own = sc.model ? models::fit_ratings(changed) : ratings;
      plans.push_back(std::make_unique<engine::Plan>(engine::compile_plan(changed, own, edits)));
    }
  } catch (const std::domain_error& e) {
    throw UsageError(fmt::format("{}: cannot fit the ratings: {}", where, e.what()));
  } catch (const std::invalid_argument& e) {
    throw UsageError(fmt::format("{}: cannot build the simulation: {}", where, e.what()));
  }

  std::vector<const engine::Plan*> alts;
  for (const auto& p : plans) alts.push_back(p.get());
  ProgressBar bar;
  engine::RunOptions run;
  run.seed = opt.seed;
  run.seasons = opt.seasons;
  run.threads = opt.threads;
  run.progress = [&bar](std::uint64_t done, std::uint64_t total) { bar.update(done, total); };
  ScenarioReport report;
  report.comparison = engine::compare_plans(baseline, alts, run);
  bar.finish();

  report.league = season.league.name;
  report.season_label = season.league.season_label;
  report.season_file = opt.season_file;
  report.scenario_file = opt.scenario_file;
  report.seed = opt.seed;
  report.seasons = report.comparison.baseline.seasons;
  for (const auto& t : season.teams) {
    report.team_ids.push_back(t.id);
    report.team_names.push_back(t.name.empty() ? t.id : t.name);
  }
  report.baseline_model = model_used(baseline);
  report.run = make_provenance(season);
  set_model(report.run, season, report.baseline_model.shape);
  report.run.seed = opt.seed;
  report.run.seasons = report.seasons;
  for (std::size_t k = 0; k < set.scenarios.size(); ++k) {
    report.names.push_back(set.scenarios[k].name);
    report.models.push_back(model_used(*plans[k]));
  }
  write_report(opt.report.output, format, report, &write_scenario_table, &write_scenario_csv,
               &write_scenario_json);
}

}  // namespace

void add_whatif_command(CLI::App& app) {
  auto opt = std::make_shared<WhatifOptions>();
  auto* cmd = app.add_subcommand(
      "whatif",
      "Run the scenarios of a scenario file against the season on common random numbers and "
      "print each team's change in chances with its paired standard error");
  add_season_file(*cmd, opt->season_file);
  cmd->add_option("SCENARIO_FILE", opt->scenario_file, help_text("The scenario file (YAML)"))
      ->required();
  cmd->add_option("--seasons", opt->seasons,
                  help_text(fmt::format("Simulated seasons, the same for the baseline and every "
                                        "scenario, 1 to {}",
                                        MAX_SEASONS),
                            std::to_string(DEFAULT_SEASONS)))
      ->check(whole_number(1, MAX_SEASONS));
  add_seed_option(*cmd, opt->seed, DEFAULT_SEED);
  add_threads_option(*cmd, opt->threads);
  add_report_options(*cmd, opt->report);
  add_model_options(*cmd, opt->model);
  cmd->callback([opt] { run_whatif(*opt); });
}

}  // namespace standfast::tools
