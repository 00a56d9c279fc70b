// `standfast stakes SEASON_FILE`: the games that matter. With --team, that team's remaining
// games ranked by how much its chance differs between winning and losing each; without, the
// league's games of the next --days days ranked by the chance that changes hands between teams
// with their result. From the seasons of one odds run (engine/swing.h: conditional tallies, no
// extra seasons). Fields in tools/STAKES.md.
#include <fmt/core.h>

#include <algorithm>
#include <cctype>
#include <cstdint>
#include <limits>
#include <memory>
#include <stdexcept>
#include <string>
#include <vector>

#include "config/as_of.h"
#include "config/load.h"
#include "config/suggest.h"
#include "engine/plan.h"
#include "engine/swing.h"
#include "models/ratings.h"
#include "tools/cli.h"
#include "tools/commands.h"
#include "tools/odds_run.h"
#include "tools/output.h"
#include "tools/progress.h"
#include "tools/provenance.h"
#include "tools/stakes_report.h"

namespace standfast::tools {
namespace {

constexpr std::uint64_t DEFAULT_SEED = 20260101;  // the same default as `standfast odds`
constexpr std::uint64_t DEFAULT_SEASONS = 100000;
constexpr std::uint64_t MAX_SEASONS = 1'000'000'000;
constexpr int DEFAULT_DAYS = 3;
constexpr std::size_t DEFAULT_TOP = 15;

struct StakesOptions {
  std::string season_file;
  std::string team;
  int days = 0;  // 0: not given
  std::string chance = "postseason";
  std::size_t top = DEFAULT_TOP;
  std::uint64_t seasons = DEFAULT_SEASONS;
  std::uint64_t seed = DEFAULT_SEED;
  int threads = 0;
  std::string as_of;
  ReportOptions report;
  ModelOptions model;
};

int find_team(const config::Season& season, const std::string& text) {
  std::vector<std::string> ids;
  for (std::size_t t = 0; t < season.teams.size(); ++t) {
    const std::string& id = season.teams[t].id;
    ids.push_back(id);
    const bool same =
        std::equal(id.begin(), id.end(), text.begin(), text.end(), [](char a, char b) {
          return std::tolower(static_cast<unsigned char>(a)) ==
                 std::tolower(static_cast<unsigned char>(b));
        });
    if (same) return static_cast<int>(t);
  }
  throw UsageError(fmt::format("--team: {} has no team with the id '{}'{}", season.file, text,
                               config::did_you_mean(text, ids)));
}

void run_stakes(const StakesOptions& opt) {
  const Format format = check_report_options(opt.report);
  const StakeChance chance =
      opt.chance == "division" ? StakeChance::kDivision : StakeChance::kPostseason;
  config::Season full = config::load_season(opt.season_file);
  check_output_target(opt.report.output, full.input_files);
  print_warnings(full);
  apply_model_options(opt.model, full);
  const int team = opt.team.empty() ? -1 : find_team(full, opt.team);
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
  // A team report lists every remaining game of the team unless --days limits it; a league
  // report the games of the next --days days (default 3) from the as-of date.
  const int days = team < 0 && opt.days == 0 ? DEFAULT_DAYS : opt.days;
  std::vector<std::uint32_t> games;
  if (team >= 0) {
    games = engine::games_of_team(plan, team);
    if (days > 0) {
      const auto last = static_cast<std::int64_t>(as_of) + days;
      std::erase_if(games, [&](std::uint32_t g) {
        return plan.day[g] < as_of || static_cast<std::int64_t>(plan.day[g]) >= last;
      });
    }
  } else {
    games = engine::games_of_days(plan, as_of, days);
  }

  ProgressBar bar;
  engine::RunOptions run;
  run.seed = opt.seed;
  run.seasons = opt.seasons;
  run.threads = opt.threads;
  run.progress = [&bar](std::uint64_t done, std::uint64_t total) { bar.update(done, total); };
  const engine::SwingResult result = engine::simulate_swings(plan, games, run);
  bar.finish();

  StakesReport report = make_stakes_report(season, plan, result, team, chance);
  report.first_day = as_of;
  report.days = days;
  report.top = opt.top;
  report.run = make_provenance(full);
  report.run.as_of = as_of;
  set_model(report.run, season, shape);
  report.run.seed = opt.seed;
  report.run.seasons = result.odds.seasons;
  write_report(opt.report.output, format, report, &write_stakes_table, &write_stakes_csv,
               &write_stakes_json);
}

}  // namespace

void add_stakes_command(CLI::App& app) {
  auto opt = std::make_shared<StakesOptions>();
  auto* cmd = app.add_subcommand(
      "stakes",
      "The games that matter: a team's remaining games ranked by how much its chance differs "
      "between winning and losing each, or the league's games of the next days ranked by the "
      "chance that changes hands with their result");
  add_season_file(*cmd, opt->season_file);
  cmd->add_option("--team", opt->team,
                  help_text("Rank this team's remaining games (its id in the season file)",
                            "the league's games of the next days"));
  cmd->add_option(
         "--days", opt->days,
         help_text("Only the games of this many days from the as-of date, 1 to 366",
                   fmt::format("{} for the league; every remaining game for --team", DEFAULT_DAYS)))
      ->check(whole_number(1, 366));
  cmd->add_option("--chance", opt->chance,
                  help_text("The chance to rank by: postseason or division", "postseason"))
      ->check(CLI::IsMember({"postseason", "division"}));
  cmd->add_option("--top", opt->top,
                  help_text("Games the table shows, 0 for all (CSV and JSON list every game)",
                            std::to_string(DEFAULT_TOP)))
      ->check(whole_number(0, 100000));
  cmd->add_option("--seasons", opt->seasons,
                  help_text(fmt::format("Simulated seasons, 1 to {}", MAX_SEASONS),
                            std::to_string(DEFAULT_SEASONS)))
      ->check(whole_number(1, MAX_SEASONS));
  add_seed_option(*cmd, opt->seed, DEFAULT_SEED);
  add_threads_option(*cmd, opt->threads);
  cmd->add_option("--as-of", opt->as_of,
                  help_text("As-of date YYYY-MM-DD, the morning before its games: games on or "
                            "after it count as not yet played",
                            "the day after the last played game"));
  add_model_options(*cmd, opt->model);
  add_report_options(*cmd, opt->report);
  cmd->callback([opt] { run_stakes(*opt); });
}

}  // namespace standfast::tools
