// `standfast worth SEASON_FILE`: what one more win is worth to each team. Every team made
// stronger or weaker by -K..+K wins over its remaining games, all on the same simulated seasons
// (engine/win_value.h); the teams sorted by the value of a win to their postseason chance. With
// --by-wins: each team's chances of a berth and of the division by final win total.
#include <fmt/core.h>

#include <cstdint>
#include <limits>
#include <memory>
#include <stdexcept>
#include <string>

#include "config/as_of.h"
#include "config/load.h"
#include "engine/clinch.h"
#include "engine/plan.h"
#include "engine/win_value.h"
#include "models/ratings.h"
#include "tools/cli.h"
#include "tools/commands.h"
#include "tools/odds_run.h"
#include "tools/output.h"
#include "tools/progress.h"
#include "tools/provenance.h"
#include "tools/worth_report.h"

namespace standfast::tools {
namespace {

constexpr std::uint64_t DEFAULT_SEED = 20260101;
constexpr std::uint64_t DEFAULT_SEASONS = 20000;
constexpr std::uint64_t MAX_SEASONS = 100'000'000;
constexpr int DEFAULT_SPAN = 5;

struct WorthOptions {
  std::string season_file;
  std::uint64_t seasons = DEFAULT_SEASONS;
  std::uint64_t seed = DEFAULT_SEED;
  int threads = 0;
  int span = DEFAULT_SPAN;
  bool by_wins = false;
  std::string as_of;
  ModelOptions model;
  ReportOptions report;
};

void run_worth(const WorthOptions& opt) {
  const Format format = check_report_options(opt.report);
  config::Season full = config::load_season(opt.season_file);
  check_output_target(opt.report.output, full.input_files);
  print_warnings(full);
  apply_model_options(opt.model, full);
  const config::DayNumber as_of = resolve_as_of(full, opt.as_of);
  const config::Season season = config::season_as_of(full, as_of);

  engine::Plan plan;
  double shape = 0;
  try {
    const models::LeagueRatings ratings = models::fit_ratings(season);
    shape = ratings.shape;
    plan = engine::compile_plan(season, ratings);
  } catch (const std::domain_error& e) {
    throw UsageError(fmt::format("{}: cannot fit the ratings: {}", opt.season_file, e.what()));
  } catch (const std::invalid_argument& e) {
    throw UsageError(fmt::format("{}: cannot build the simulation: {}", opt.season_file, e.what()));
  }

  ProgressBar bar;
  engine::RunOptions run;
  run.seed = opt.seed;
  run.seasons = opt.seasons;
  run.threads = opt.threads;
  run.progress = [&bar](std::uint64_t done, std::uint64_t total) { bar.update(done, total); };
  WorthReport report;
  // --by-wins needs the baseline seasons only (span 0: a plain run).
  report.result = engine::win_value(plan, run, opt.by_wins ? 0 : opt.span);
  bar.finish();
  report.by_wins = opt.by_wins;
  report.postseason = plan.postseason;
  report.league = full.league.name;
  report.season_label = full.league.season_label;
  report.run = make_provenance(full);
  report.run.as_of = as_of;
  set_model(report.run, season, shape);
  report.run.seed = opt.seed;
  report.run.seasons = report.result.seasons;
  const auto records = engine::clinch_records(season);
  for (std::size_t t = 0; t < season.teams.size(); ++t) {
    report.team_ids.push_back(season.teams[t].id);
    report.team_names.push_back(season.teams[t].name.empty() ? season.teams[t].id
                                                             : season.teams[t].name);
    report.wins.push_back(records[t].wins);
    report.losses.push_back(records[t].losses);
    report.games_left.push_back(records[t].remaining);
  }
  write_report(opt.report.output, format, report, &write_worth_table, &write_worth_csv,
               &write_worth_json);
}

}  // namespace

void add_worth_command(CLI::App& app) {
  auto opt = std::make_shared<WorthOptions>();
  auto* cmd = app.add_subcommand(
      "worth",
      "What one more win is worth to each team: its chances against added wins over the rest of "
      "its season, on common random numbers, sorted by the value of a win");
  add_season_file(*cmd, opt->season_file);
  cmd->add_option("--seasons", opt->seasons,
                  help_text(fmt::format("Simulated seasons, the same for every team and point, "
                                        "1 to {}",
                                        MAX_SEASONS),
                            std::to_string(DEFAULT_SEASONS)))
      ->check(whole_number(1, MAX_SEASONS));
  add_seed_option(*cmd, opt->seed, DEFAULT_SEED);
  add_threads_option(*cmd, opt->threads);
  cmd->add_option("--span", opt->span,
                  help_text("Added wins from -K to +K, 1 to 20", std::to_string(DEFAULT_SPAN)))
      ->check(whole_number(1, 20));
  cmd->add_flag("--by-wins", opt->by_wins,
                "Instead of the curves: each team's chances of a berth and of the division by "
                "final win total, and the totals that give 50% and 90% (one plain run)");
  cmd->add_option("--as-of", opt->as_of,
                  help_text("As-of date YYYY-MM-DD, the morning before its games: games on or "
                            "after it count as not yet played",
                            "the day after the last played game"));
  add_model_options(*cmd, opt->model);
  add_report_options(*cmd, opt->report);
  cmd->callback([opt] { run_worth(*opt); });
}

}  // namespace standfast::tools
