#include "tools/odds_run.h"

#include <fmt/core.h>

#include <stdexcept>

#include "config/as_of.h"
#include "engine/certainty.h"
#include "engine/clinch.h"
#include "engine/plan.h"
#include "models/ratings.h"
#include "tools/commands.h"

namespace standfast::tools {

config::DayNumber resolve_as_of(const config::Season& season, const std::string& text) {
  if (!text.empty()) {
    const auto day = config::parse_date(text);
    if (!day) throw UsageError(fmt::format("--as-of: expected a date YYYY-MM-DD, got '{}'", text));
    return *day;
  }
  const auto day = config::default_as_of(season);
  if (!day) {
    throw UsageError(
        fmt::format("{}: no game has a date; give the date with --as-of", season.file));
  }
  return *day;
}

engine::SimulationResult simulate_season(const config::Season& season,
                                         const engine::RunOptions& run, double* shape_used) {
  engine::Plan plan;
  try {
    const models::LeagueRatings ratings = models::fit_ratings(season);
    plan = engine::compile_plan(season, ratings);
    if (shape_used != nullptr) *shape_used = ratings.shape;
  } catch (const std::domain_error& e) {
    throw UsageError(fmt::format("{}: cannot fit the ratings: {}", season.file, e.what()));
  } catch (const std::invalid_argument& e) {
    throw UsageError(fmt::format("{}: cannot build the simulation: {}", season.file, e.what()));
  }
  return engine::simulate(plan, run);
}

OddsRun run_odds_at(const config::Season& full, config::DayNumber as_of,
                    const engine::RunOptions& run, double target_se,
                    const std::string& only_group) {
  OddsRun out;
  out.as_of = as_of;
  out.season = config::season_as_of(full, as_of);
  out.games_played = config::games_played_before(full, as_of);
  double shape = 0;
  out.result = simulate_season(out.season, run, &shape);
  // What produced the report (tools/provenance.h): the files as given, this as-of date.
  out.report_run = make_provenance(full);
  out.report_run.as_of = as_of;
  set_model(out.report_run, out.season, shape);
  const auto records = engine::clinch_records(out.season);
  // Exact marks and magic numbers (engine/certainty.h; milliseconds).
  const auto certainty = engine::exact_certainty(out.season, records);
  const auto marks = engine::certainty_marks(certainty);
  out.report = make_odds_report(out.season, out.result, records, marks, target_se, only_group);
  attach_certainty(out.report, certainty);
  out.report.run = out.report_run;
  return out;
}

HistoryRun history_run(const OddsRun& run, const config::Season& full) {
  HistoryRun h;
  h.league = full.league.name;
  h.season_label = full.league.season_label;
  h.as_of = run.as_of;
  h.season_hash = season_hash(full);
  h.model = model_label(full.model);
  h.seed = run.result.seed;
  h.seasons = run.result.seasons;
  h.max_se = run.result.max_se;
  h.games_played = run.games_played;
  const auto records = engine::clinch_records(run.season);
  for (std::size_t t = 0; t < run.season.teams.size(); ++t) {
    const config::Team& team = run.season.teams[t];
    const engine::TeamOdds& o = run.result.teams[t];
    HistoryTeam ht;
    ht.id = team.id;
    ht.name = team.name.empty() ? team.id : team.name;
    ht.division_id = team.division >= 0 ? run.season.groups[team.division].id : std::string{};
    ht.wins = records[t].wins;
    ht.losses = records[t].losses;
    ht.games_left = records[t].remaining;
    ht.division = o.division;
    ht.postseason = o.postseason;
    ht.bye = o.bye;
    ht.title = o.title;
    ht.mean_wins = o.mean_wins;
    ht.wins_histogram = o.wins_histogram;
    h.teams.push_back(std::move(ht));
  }
  return h;
}

}  // namespace standfast::tools
