// `standfast odds SEASON_FILE`: the main job. Loads and validates the season, fits the ratings
// (or takes the file's overrides), simulates the remaining season and the postseason many times,
// and writes the odds by division as a table, CSV or JSON (tools/ODDS.md).
#include <fmt/core.h>

#include <algorithm>
#include <cctype>
#include <cstdint>
#include <filesystem>
#include <limits>
#include <memory>
#include <optional>
#include <stdexcept>
#include <string>
#include <string_view>
#include <vector>

#include "config/load.h"
#include "config/suggest.h"
#include "engine/simulate.h"
#include "tools/cli.h"
#include "tools/commands.h"
#include "tools/history.h"
#include "tools/odds_report.h"
#include "tools/odds_run.h"
#include "tools/output.h"
#include "tools/processes.h"
#include "tools/progress.h"
#include "tools/provenance.h"

namespace standfast::tools {
namespace {

// The default seed: fixed, so two runs with the same options print the same numbers.
constexpr std::uint64_t DEFAULT_SEED = 20260101;
constexpr std::uint64_t DEFAULT_SEASONS = 100000;
constexpr std::uint64_t MAX_SEASONS = 1'000'000'000;

bool same_ignoring_case(std::string_view a, std::string_view b) {
  return std::equal(a.begin(), a.end(), b.begin(), b.end(), [](char x, char y) {
    return std::tolower(static_cast<unsigned char>(x)) ==
           std::tolower(static_cast<unsigned char>(y));
  });
}

struct OddsOptions {
  std::string season_file;
  std::uint64_t seasons = DEFAULT_SEASONS;
  std::uint64_t seed = DEFAULT_SEED;
  double target_se = 0.0;
  int threads = 0;
  ReportOptions report;
  ModelOptions model;
  std::string group;
  std::string as_of;
  bool record = false;
  std::string history;
};

void run_odds(const OddsOptions& opt) {
  // Every option is checked before the (possibly long) run: the numbers by their validators
  // while parsing, the format and the output path here.
  const Format format = check_report_options(opt.report);

  // In an MPI run every rank does the same work up to the simulation, plays its share of the
  // seasons, and rank 0 alone prints warnings, progress and the report.
  const bool lead = process_rank() == 0;
  config::Season season = config::load_season(opt.season_file);
  check_output_target(opt.report.output, season.input_files);
  if (lead) print_warnings(season);
  apply_model_options(opt.model, season);
  // --group: a conference or division id, in any case; the nearest id is suggested otherwise.
  std::string group;
  if (!opt.group.empty()) {
    std::vector<std::string> ids;
    for (const config::Group& g : season.groups) {
      ids.push_back(g.id);
      if (same_ignoring_case(g.id, opt.group)) group = g.id;
    }
    if (group.empty()) {
      throw UsageError(fmt::format("--group: no conference or division of {} has the id '{}'{}",
                                   opt.season_file, opt.group,
                                   config::did_you_mean(opt.group, ids)));
    }
  }

  const config::DayNumber as_of = resolve_as_of(season, opt.as_of);
  // Open the history before the (possibly long) run, so a bad file stops it at once.
  std::optional<History> history;
  if (lead && (opt.record || !opt.history.empty())) {
    history.emplace(History::open(
        opt.history.empty() ? default_history_path() : std::filesystem::path(opt.history), true));
  }

  ProgressBar bar;
  engine::RunOptions run;
  run.seed = opt.seed;
  run.seasons = opt.seasons;
  run.target_se = opt.target_se;
  run.threads = opt.threads;
  if (lead)
    run.progress = [&bar](std::uint64_t done, std::uint64_t total) { bar.update(done, total); };
  run.rank = process_rank();
  run.ranks = process_count();
  if (run.ranks > 1) run.combine = sum_over_processes;
  const OddsRun odds = run_odds_at(season, as_of, run, opt.target_se, group);
  if (!lead) return;
  bar.finish();
  if (history) history->record(history_run(odds, season));
  const OddsReport& report = odds.report;

  write_report(opt.report.output, format, report, &write_odds_table, &write_odds_csv,
               &write_odds_json);
}

}  // namespace

void add_odds_command(CLI::App& app) {
  auto opt = std::make_shared<OddsOptions>();
  auto* cmd = app.add_subcommand(
      "odds",
      "Simulate the rest of the season and print each team's chances of the division, a "
      "postseason berth, a bye and the title, with its projected record");
  add_season_file(*cmd, opt->season_file);
  cmd->add_option("--seasons", opt->seasons,
                  help_text(fmt::format("Simulated seasons, 1 to {}", MAX_SEASONS),
                            std::to_string(DEFAULT_SEASONS)))
      ->check(whole_number(1, MAX_SEASONS));
  add_seed_option(*cmd, opt->seed, DEFAULT_SEED);
  cmd->add_option("--target-se", opt->target_se,
                  help_text("Stop early once the largest standard error of any chance is below "
                            "this probability, e.g. 0.002; 0 runs every season",
                            "0"))
      ->check(real_number({0.0, 0.5, false, true}));
  add_threads_option(*cmd, opt->threads);
  add_report_options(*cmd, opt->report);
  add_model_options(*cmd, opt->model);
  cmd->add_option("--group", opt->group,
                  help_text("Only the teams of this conference or division (its id in the "
                            "season file)",
                            "every team"));
  cmd->add_option("--as-of", opt->as_of,
                  help_text("As-of date YYYY-MM-DD, the morning before its games: games on or "
                            "after it count as not yet played",
                            "the day after the last played game"));
  cmd->add_flag("--record", opt->record,
                help_text("Record the run in the odds history, the --history file or else "
                          "$XDG_DATA_HOME/standfast/history.sqlite or "
                          "~/.local/share/standfast/history.sqlite"));
  cmd->add_option("--history", opt->history,
                  help_text("Record the run in this odds history file (SQLite)"));
  cmd->callback([opt] { run_odds(*opt); });
}

}  // namespace standfast::tools
