// `standfast families SEASON_FILE`: model sensitivity. Fits the season under every scoring
// family that applies to it, runs them all on the same random numbers (engine/compare.h) and
// prints each team's chances side by side with the spread between the families. Fields in
// tools/FAMILIES.md.
#include <fmt/core.h>

#include <cstdint>
#include <limits>
#include <memory>
#include <stdexcept>
#include <string>
#include <vector>

#include "config/as_of.h"
#include "config/load.h"
#include "engine/compare.h"
#include "engine/plan.h"
#include "models/ratings.h"
#include "tools/cli.h"
#include "tools/commands.h"
#include "tools/family_report.h"
#include "tools/odds_run.h"
#include "tools/output.h"
#include "tools/progress.h"
#include "tools/provenance.h"

namespace standfast::tools {
namespace {

constexpr std::uint64_t DEFAULT_SEED = 20260101;  // the same default as `standfast odds`
constexpr std::uint64_t DEFAULT_SEASONS = 20000;
constexpr std::uint64_t MAX_SEASONS = 100'000'000;
constexpr std::uint64_t MAX_THREADS = 1024;

struct FamiliesOptions {
  std::string season_file;
  std::string chance = "postseason";
  std::uint64_t seasons = DEFAULT_SEASONS;
  std::uint64_t seed = DEFAULT_SEED;
  int threads = 0;
  std::string as_of;
  ReportOptions report;
  ModelOptions model;
};

// A family's plan: the season under that family, fitted; `source` says where its shape came from.
struct FamilyPlan {
  engine::Plan plan;
  std::string source;
  double shape = 0;
};

FamilyPlan fit_family(const config::Season& season) {
  FamilyPlan out;
  const models::LeagueRatings ratings = models::fit_ratings(season);
  out.plan = engine::compile_plan(season, ratings);
  out.shape = ratings.shape;
  Provenance p;
  set_model(p, season, ratings.shape);
  out.source = p.shape_source;
  return out;
}

void run_families(const FamiliesOptions& opt) {
  const Format format = check_report_options(opt.report);
  config::Season full = config::load_season(opt.season_file);
  check_output_target(opt.report.output, full.input_files);
  print_warnings(full);
  apply_model_options(opt.model, full);
  const config::DayNumber as_of = resolve_as_of(full, opt.as_of);
  const config::Season season = config::season_as_of(full, as_of);

  FamiliesReport report;
  std::vector<std::unique_ptr<FamilyPlan>> plans;
  try {
    plans.push_back(std::make_unique<FamilyPlan>(fit_family(season)));
  } catch (const std::domain_error& e) {
    throw UsageError(fmt::format("{}: cannot fit the ratings: {}", opt.season_file, e.what()));
  } catch (const std::invalid_argument& e) {
    throw UsageError(fmt::format("{}: cannot build the simulation: {}", opt.season_file, e.what()));
  }
  report.models.push_back({model_used(plans.front()->plan), plans.front()->source});
  for (std::size_t f = 0; f < std::size(FAMILY_NAMES); ++f) {
    const auto family = static_cast<config::ScoreFamily>(f);
    if (family == season.model.family) continue;
    const std::string name(FAMILY_NAMES[f]);
    std::string why;
    if (!family_applies(season, family, &why)) {
      report.skipped.emplace_back(name, why);
      continue;
    }
    config::Season other = season;
    other.model.family = family;
    other.model.shape.reset();  // fitted: the file's shape belongs to its own family
    try {
      plans.push_back(std::make_unique<FamilyPlan>(fit_family(other)));
      report.models.push_back({model_used(plans.back()->plan), plans.back()->source});
    } catch (const std::exception& e) {
      report.skipped.emplace_back(name, fmt::format("cannot fit or simulate: {}", e.what()));
    }
  }

  std::vector<const engine::Plan*> alternatives;
  for (std::size_t p = 1; p < plans.size(); ++p) alternatives.push_back(&plans[p]->plan);
  ProgressBar bar;
  engine::RunOptions run;
  run.seed = opt.seed;
  run.seasons = opt.seasons;
  run.threads = opt.threads;
  run.progress = [&bar](std::uint64_t done, std::uint64_t total) { bar.update(done, total); };
  const engine::Comparison comparison =
      engine::compare_plans(plans.front()->plan, alternatives, run);
  bar.finish();

  report.league = season.league.name;
  report.season_label = season.league.season_label;
  report.shown = opt.chance;
  std::vector<std::string> ids, names;
  for (const config::Team& t : season.teams) {
    ids.push_back(t.id);
    names.push_back(t.name.empty() ? t.id : t.name);
  }
  fill_family_teams(report, comparison, ids, names);
  report.run = make_provenance(full);
  report.run.as_of = as_of;
  set_model(report.run, season, plans.front()->shape);
  report.run.seed = opt.seed;
  report.run.seasons = comparison.baseline.seasons;
  write_report(opt.report.output, format, report, &write_families_table, &write_families_csv,
               &write_families_json);
}

}  // namespace

void add_families_command(CLI::App& app) {
  auto opt = std::make_shared<FamiliesOptions>();
  auto* cmd = app.add_subcommand(
      "families",
      "Model sensitivity: each team's chances under every scoring family, all on the same random "
      "numbers, side by side with the spread between the families");
  add_season_file(*cmd, opt->season_file);
  cmd->add_option("--chance", opt->chance,
                  help_text("The chance the table shows: division, postseason, bye, title or "
                            "mean_wins",
                            "postseason"))
      ->check(CLI::IsMember({"division", "postseason", "bye", "title", "mean_wins"}));
  cmd->add_option("--seasons", opt->seasons,
                  help_text(fmt::format("Simulated seasons, the same for every family, 1 to {}",
                                        MAX_SEASONS),
                            std::to_string(DEFAULT_SEASONS)))
      ->check(whole_number(1, MAX_SEASONS));
  cmd->add_option("--seed", opt->seed,
                  help_text("Random seed, 0 to 2^64 - 1; the same seed gives the same output for "
                            "any thread count",
                            std::to_string(DEFAULT_SEED)))
      ->check(whole_number(0, std::numeric_limits<std::uint64_t>::max()));
  cmd->add_option(
         "--threads", opt->threads,
         help_text(fmt::format("Worker threads, 0 to {}; 0 uses every core", MAX_THREADS), "0"))
      ->check(whole_number(0, MAX_THREADS));
  cmd->add_option("--as-of", opt->as_of,
                  help_text("As-of date YYYY-MM-DD, the morning before its games: games on or "
                            "after it count as not yet played",
                            "the day after the last played game"));
  add_model_options(*cmd, opt->model);
  add_report_options(*cmd, opt->report);
  cmd->callback([opt] { run_families(*opt); });
}

}  // namespace standfast::tools
