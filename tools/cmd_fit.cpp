// `standfast fit FILE [--format table|csv|json] [--output FILE] [--alpha A]`: fits the scoring
// model of the season file to its played games and prints the league values, the team ratings
// (plain and schedule-adjusted, with standard errors), the per-team goodness of fit, the AIC of
// the three scoring families and the Pythagorean expectation. See README.md, section "Scoring
// models".
#include <fmt/core.h>

#include <cmath>
#include <nlohmann/json.hpp>
#include <stdexcept>
#include <string>
#include <vector>

#include "config/as_of.h"
#include "config/load.h"
#include "models/fit_report.h"
#include "models/score_dist.h"
#include "tools/cli.h"
#include "tools/commands.h"
#include "tools/odds_run.h"
#include "tools/output.h"
#include "tools/provenance.h"

namespace standfast::tools {
namespace {

using models::FitReport;

// JSON has no infinity or NaN: write null.
nlohmann::json number(double v) {
  if (!std::isfinite(v)) return nullptr;
  return v;
}

std::string with_se(double value, double se, int digits) {
  return fmt::format("{:.{}f} ± {:.{}f}", value, digits, se, digits);
}

// The teams by conference and division, as `standings` and `odds` list them: one block per
// division in file order, titled "Conference - Division" (the division's name alone when it is
// the conference), the teams in file order.
struct DivisionBlock {
  std::string title;
  std::vector<std::size_t> teams;
};
std::vector<DivisionBlock> by_division(const config::Season& s) {
  std::vector<DivisionBlock> blocks;
  std::vector<bool> listed(s.teams.size(), false);
  for (const int d : s.divisions) {
    const config::Group& div = s.groups[static_cast<std::size_t>(d)];
    DivisionBlock b;
    const std::string name = div.name.empty() ? div.id : div.name;
    b.title = name;
    if (div.parent >= 0) {
      const config::Group& conf = s.groups[static_cast<std::size_t>(div.parent)];
      const std::string conf_name = conf.name.empty() ? conf.id : conf.name;
      if (conf_name != name) b.title = conf_name + " - " + name;
    }
    for (const int t : div.teams) {
      b.teams.push_back(static_cast<std::size_t>(t));
      listed[static_cast<std::size_t>(t)] = true;
    }
    if (!b.teams.empty()) blocks.push_back(std::move(b));
  }
  DivisionBlock rest{"Other teams", {}};
  for (std::size_t t = 0; t < s.teams.size(); ++t)
    if (!listed[t]) rest.teams.push_back(t);
  if (!rest.teams.empty()) blocks.push_back(std::move(rest));
  return blocks;
}

// The conference and division ids of a team (empty when it has none).
std::string group_id(const config::Season& s, int g) {
  return g >= 0 ? s.groups[static_cast<std::size_t>(g)].id : std::string();
}

// "1.820 (fixed)" or "1.820 (default)": a league value that was not fitted.
std::string not_fitted(double value, bool fixed) {
  return fmt::format("{:.3f} ({})", value, fixed ? "fixed in the season file" : "default");
}

// No played game: the defaults the engine runs on (what `standfast odds` uses), and the
// ratings they give every team.
std::string render_defaults_table(const config::Season& s, const FitReport& r,
                                  const Provenance& run) {
  std::string out;
  const auto& lr = r.ratings;
  const config::ModelSpec& m = s.model;
  out += fmt::format("Scoring model of {} ({}), from {}\n", s.league.name, s.league.season_label,
                     s.file);
  out += provenance_line(run) + "\n";
  out += fmt::format("Family: {}   games fitted: 0\n", models::family_name(r.family));
  out +=
      "No game is played before the as-of date, so nothing is fitted: these are the documented\n"
      "defaults that `standfast odds` runs on (README.md, \"Choices and defaults\").\n";
  if (r.family == config::ScoreFamily::kLog5) {
    out +=
        "Family log5 models no scores: every team is rated 1.00 and the engine takes win\n"
        "percentages from the overrides.\n";
  } else {
    out += fmt::format("  League mean, runs per side (neutral venue) {}\n",
                       not_fitted(lr.league_mean, false));
    if (r.family == config::ScoreFamily::kWeibull) {
      out += fmt::format("  Weibull shape gamma                       {}\n",
                         not_fitted(lr.shape, m.shape.has_value()));
    } else if (r.family == config::ScoreFamily::kNegativeBinomial) {
      out += fmt::format("  Negative-binomial size                    {}\n",
                         not_fitted(lr.shape, m.shape.has_value()));
    }
    out += fmt::format("  Home edge (multiplier on home runs)       {}\n",
                       not_fitted(lr.home_edge, m.home_edge.has_value()));
    out += fmt::format(
        "  Shrinkage toward the league: {:g} games; the prior alone gives each rating its "
        "uncertainty\n",
        r.shrink_games);
  }
  out += "\nTeam ratings: every team average (1.000), ± the standard error of the log.\n";
  out += fmt::format("{:<8} {:<28} {:>14} {:>14}  {:>8} {:>8}\n", "team", "name", "offence",
                     "defence", "model RS", "model RA");
  for (const DivisionBlock& b : by_division(s)) {
    out += fmt::format("{}\n", b.title);
    for (const std::size_t i : b.teams) {
      const auto& t = r.teams[i];
      out += fmt::format("{:<8} {:<28} {:>14} {:>14}  {:>8.3f} {:>8.3f}\n", s.teams[i].id,
                         s.teams[i].name, with_se(t.offence, t.log_offence_se, 3),
                         with_se(t.defence, t.log_defence_se, 3), lr.league_mean * t.offence,
                         lr.league_mean * t.defence);
    }
  }
  out += "\nModel estimates under stated assumptions, not advice for wagering.\n";
  return out;
}

std::string render_table(const config::Season& s, const FitReport& r, const Provenance& run) {
  if (r.defaults) return render_defaults_table(s, r, run);
  std::string out;
  const auto& lr = r.ratings;
  const auto blocks = by_division(s);
  out += fmt::format("Scoring model of {} ({}), from {}\n", s.league.name, s.league.season_label,
                     s.file);
  out += provenance_line(run) + "\n";
  out +=
      fmt::format("Family: {}   games fitted: {}\n", models::family_name(r.family), r.games_fitted);
  if (r.family == config::ScoreFamily::kLog5) {
    out +=
        "Family log5 models no scores: every team is rated 1.00 and the engine takes win\n"
        "percentages from the overrides. The diagnostics below use the Weibull.\n";
  } else {
    out += fmt::format("  League mean, runs per side (neutral venue) {}\n",
                       with_se(lr.league_mean, lr.league_mean_se, 3));
    if (r.family == config::ScoreFamily::kWeibull) {
      out += fmt::format("  Weibull shape gamma (engine: adjusted fit with shrinkage) {}\n",
                         with_se(lr.shape, lr.shape_se, 3));
    } else if (r.family == config::ScoreFamily::kNegativeBinomial) {
      out += fmt::format("  Negative-binomial size (engine: adjusted fit with shrinkage) {}\n",
                         with_se(lr.shape, lr.shape_se, 3));
    }
    out += fmt::format("  Home edge (multiplier on home runs)       {}\n",
                       with_se(lr.home_edge, lr.home_edge_se, 3));
  }
  out += fmt::format("  Weibull shape gamma (plain fit)           {}\n",
                     with_se(r.plain_shape, r.plain_shape_se, 3));
  out += fmt::format("  Shrinkage toward the league: {:.4g} games{}", r.shrink_games,
                     r.shrink_auto ? " (shrink_games: auto)" : "");
  out += r.suggested_shrink_games
             ? fmt::format(" (empirical-Bayes estimate from these games: {:.0f})\n",
                           *r.suggested_shrink_games)
             : " (empirical-Bayes estimate: no spread beyond noise)\n";

  out +=
      "\nTeam ratings. Offence: runs scored relative to the league (higher is better);\n"
      "defence: runs allowed relative to the league (lower is better). ± is the standard\n"
      "error of the log, about the relative error. Plain = own runs only; adjusted = for\n"
      "opponents, venue and home edge, after shrinkage; free gamma = the team's own shape.\n"
      "Model RS, model RA: the adjusted ratings in runs per game (league mean x rating, at a\n"
      "neutral venue against an average opponent), the units an override takes.\n";
  out += fmt::format("{:<8} {:>4} {:>5} {:>5}  {:>14} {:>14}  {:>14} {:>14}  {:>8} {:>8}  {:>13}\n",
                     "team", "G", "RS/G", "RA/G", "plain off", "plain def", "adj off", "adj def",
                     "model RS", "model RA", "free gamma");
  for (const DivisionBlock& b : blocks) {
    out += fmt::format("{}\n", b.title);
    for (const std::size_t i : b.teams) {
      const auto& t = r.teams[i];
      out += fmt::format(
          "{:<8} {:>4} {:>5.2f} {:>5.2f}  {:>14} {:>14}  {:>14} {:>14}  {:>8.3f} {:>8.3f}  "
          "{:>13}\n",
          s.teams[i].id, t.games, t.runs_scored, t.runs_allowed,
          with_se(t.plain_offence, t.plain_scored_se, 3),
          with_se(t.plain_defence, t.plain_allowed_se, 3), with_se(t.offence, t.log_offence_se, 3),
          with_se(t.defence, t.log_defence_se, 3), lr.league_mean * t.offence,
          lr.league_mean * t.defence,
          t.free_shape > 0 ? with_se(t.free_shape, t.free_shape_se, 2) : "-");
    }
  }

  out += fmt::format(
      "\nGoodness of fit ({} family, adjusted maximum-likelihood fit). Pearson chi-square over\n"
      "score bins, runs scored and allowed binned separately, bins pooled until each expects\n"
      "at least 5; df = (bins scored - 1) + (bins allowed - 1) - 2. Bonferroni: family alpha\n"
      "{:g} over {} teams, per-team alpha {:.5f}. Rejected: {} of {}.\n",
      models::family_name(r.test_family), r.family_alpha, r.tests, r.per_test_alpha, r.rejected,
      r.tests);
  out += fmt::format("{:<8} {:>9} {:>4} {:>9} {:>10}  {}\n", "team", "chi-sq", "df", "p-value",
                     "critical", "verdict");
  for (const DivisionBlock& b : blocks) {
    out += fmt::format("{}\n", b.title);
    for (const std::size_t i : b.teams) {
      const auto& t = r.teams[i];
      if (t.df <= 0) {
        out += fmt::format("{:<8} {:>9} {:>4} {:>9} {:>10}  too few games\n", s.teams[i].id, "-",
                           "-", "-", "-");
        continue;
      }
      out += fmt::format("{:<8} {:>9.2f} {:>4} {:>9.4f} {:>10.2f}  {}\n", s.teams[i].id,
                         t.chi_square, t.df, t.p_value, t.critical, t.rejected ? "poor fit" : "ok");
    }
  }

  out +=
      "\nScoring families, adjusted model at maximum likelihood (AIC = 2k - 2 log L; lower is "
      "better)\n";
  // The one line that says why the Weibull shape here is not the engine's shape above.
  if (r.mle && (r.family == config::ScoreFamily::kWeibull ||
                r.family == config::ScoreFamily::kNegativeBinomial)) {
    out += fmt::format(
        "(Fitted without the shrinkage prior, so the {} shape here, {:.3f}, differs from the "
        "engine's {:.3f} above by the prior alone.)\n",
        models::family_name(r.family), r.mle->shape, lr.shape);
  }
  out += fmt::format("{:<18} {:>8} {:>4} {:>12} {:>11} {:>9}\n", "family", "shape", "k", "log L",
                     "AIC", "dAIC");
  for (const auto& f : r.families) {
    out += fmt::format(
        "{:<18} {:>8} {:>4} {:>12.2f} {:>11.2f} {:>9.2f}{}\n", models::family_name(f.family),
        f.family == config::ScoreFamily::kPoisson ? "-" : fmt::format("{:.3f}", f.shape),
        f.parameters, f.log_lik, f.aic, f.delta_aic, f.converged ? "" : "  (not converged)");
  }

  out += fmt::format(
      "\nPythagorean expectation at the plain gamma {:.3f} (beta = -0.5, Miller 2007):\n"
      "expected winning percentage = (RS/G + 0.5)^g / ((RS/G + 0.5)^g + (RA/G + 0.5)^g).\n",
      r.plain_shape);
  out += fmt::format("{:<8} {:>4} {:>4} {:>5} {:>5} {:>8} {:>7} {:>7}\n", "team", "W", "L", "RS/G",
                     "RA/G", "exp pct", "exp W", "W-exp");
  for (const DivisionBlock& b : blocks) {
    out += fmt::format("{}\n", b.title);
    for (const std::size_t i : b.teams) {
      const auto& t = r.teams[i];
      out += fmt::format("{:<8} {:>4} {:>4} {:>5.2f} {:>5.2f} {:>8.3f} {:>7.1f} {:>+7.1f}\n",
                         s.teams[i].id, t.wins, t.losses, t.runs_scored, t.runs_allowed,
                         t.expected_pct, t.expected_wins, t.wins_minus_expected);
    }
  }
  out += "\nModel estimates under stated assumptions, not advice for wagering.\n";
  return out;
}

// CSV: one long table, one value per row: `table` (league, team or family), `team_id` and
// `team_name` (team rows), `family` (family rows), `field`, `value`, then the run columns of
// every report.
std::string render_csv(const config::Season& s, const FitReport& r, const Provenance& run) {
  const auto& lr = r.ratings;
  const std::string run_cells = provenance_csv_cells(run);
  std::string out = "table,team_id,team_name,family,field,value" + provenance_csv_header() + "\n";
  std::string team_id, team_name, family;  // the key cells of the rows being written
  const auto row = [&](std::string_view table, std::string_view field, const std::string& value) {
    out += fmt::format("{},{},{},{},{},{}{}\n", table, csv_field(team_id), csv_field(team_name),
                       family, field, csv_field(value), run_cells);
  };
  const auto num = [](double v, int significant = 6) {
    return std::isfinite(v) ? fmt::format("{:.{}g}", v, significant) : std::string();
  };
  row("league", "family", models::family_name(r.family));
  row("league", "defaults", r.defaults ? "true" : "false");
  row("league", "games_fitted", fmt::format("{}", r.games_fitted));
  row("league", "league_mean", num(lr.league_mean));
  row("league", "league_mean_se", num(lr.league_mean_se));
  row("league", "shape", num(lr.shape));
  row("league", "shape_se", num(lr.shape_se));
  row("league", "home_edge", num(lr.home_edge));
  row("league", "home_edge_se", num(lr.home_edge_se));
  row("league", "plain_shape", num(r.plain_shape));
  row("league", "plain_shape_se", num(r.plain_shape_se));
  row("league", "shrink_games", num(r.shrink_games));
  row("league", "shrink_auto", r.shrink_auto ? "true" : "false");
  row("league", "suggested_shrink_games",
      r.suggested_shrink_games ? fmt::format("{:.1f}", *r.suggested_shrink_games) : "");
  row("league", "family_alpha", num(r.family_alpha));
  row("league", "tests", fmt::format("{}", r.tests));
  row("league", "per_test_alpha", num(r.per_test_alpha));
  row("league", "rejected", fmt::format("{}", r.rejected));
  std::vector<std::size_t> order;
  for (const DivisionBlock& b : by_division(s))
    order.insert(order.end(), b.teams.begin(), b.teams.end());
  for (const std::size_t i : order) {
    const auto& t = r.teams[i];
    team_id = s.teams[i].id;
    team_name = s.teams[i].name;
    const auto team = [&](std::string_view field, const std::string& value) {
      row("team", field, value);
    };
    team("conference", group_id(s, s.teams[i].conference));
    team("division", group_id(s, s.teams[i].division));
    team("games", fmt::format("{}", t.games));
    team("wins", fmt::format("{}", t.wins));
    team("losses", fmt::format("{}", t.losses));
    team("runs_scored_per_game", num(t.runs_scored));
    team("runs_allowed_per_game", num(t.runs_allowed));
    team("plain_offence", num(t.plain_offence));
    team("plain_offence_log_se", num(t.plain_scored_se));
    team("plain_defence", num(t.plain_defence));
    team("plain_defence_log_se", num(t.plain_allowed_se));
    team("free_shape", t.free_shape > 0 ? num(t.free_shape) : "");
    team("free_shape_se", t.free_shape > 0 ? num(t.free_shape_se) : "");
    team("mle_offence", num(t.mle_offence));
    team("mle_offence_log_se", num(t.mle_log_offence_se));
    team("mle_defence", num(t.mle_defence));
    team("mle_defence_log_se", num(t.mle_log_defence_se));
    team("offence", num(t.offence));
    team("offence_log_se", num(t.log_offence_se));
    team("defence", num(t.defence));
    team("defence_log_se", num(t.log_defence_se));
    team("chi_square", t.df > 0 ? num(t.chi_square) : "");
    team("df", fmt::format("{}", t.df));
    team("p_value", t.df > 0 ? num(t.p_value) : "");
    team("critical", t.df > 0 ? num(t.critical) : "");
    team("poor_fit", t.rejected ? "true" : "false");
    team("expected_pct", num(t.expected_pct));
    team("expected_wins", num(t.expected_wins));
    team("wins_minus_expected", num(t.wins_minus_expected));
    team("model_runs_scored", num(lr.league_mean * t.offence));
    team("model_runs_allowed", num(lr.league_mean * t.defence));
  }
  team_id.clear();
  team_name.clear();
  for (const auto& f : r.families) {
    family = models::family_name(f.family);
    row("family", "shape", f.family == config::ScoreFamily::kPoisson ? "" : num(f.shape));
    row("family", "parameters", fmt::format("{}", f.parameters));
    row("family", "log_lik", num(f.log_lik, 10));
    row("family", "aic", num(f.aic, 10));
    row("family", "delta_aic", num(f.delta_aic));
    row("family", "converged", f.converged ? "true" : "false");
  }
  return out;
}

std::string render_json(const config::Season& s, const FitReport& r, const Provenance& run) {
  using nlohmann::json;
  const auto& lr = r.ratings;
  json j;
  j["schema_version"] = 1;
  j["kind"] = "fit";
  j["run"] = json::parse(provenance_json(run).dump());
  j["file"] = s.file;
  j["league"] = {{"name", s.league.name},
                 {"season", s.league.season_label},
                 {"family", models::family_name(r.family)},
                 {"defaults", r.defaults},
                 {"games_fitted", r.games_fitted},
                 {"league_mean", number(lr.league_mean)},
                 {"league_mean_se", number(lr.league_mean_se)},
                 {"shape", number(lr.shape)},
                 {"shape_se", number(lr.shape_se)},
                 {"home_edge", number(lr.home_edge)},
                 {"home_edge_se", number(lr.home_edge_se)},
                 {"plain_shape", number(r.plain_shape)},
                 {"plain_shape_se", number(r.plain_shape_se)},
                 {"shrink_games", r.shrink_games},
                 {"shrink_auto", r.shrink_auto},
                 {"suggested_shrink_games",
                  r.suggested_shrink_games ? number(*r.suggested_shrink_games) : json(nullptr)},
                 {"log_lik", number(lr.log_lik)},
                 {"converged", lr.converged}};
  j["goodness_of_fit"] = {{"family", models::family_name(r.test_family)},
                          {"family_alpha", r.family_alpha},
                          {"tests", r.tests},
                          {"per_test_alpha", r.per_test_alpha},
                          {"rejected", r.rejected},
                          {"min_expected_per_bin", 5}};
  json teams = json::array();
  std::vector<std::size_t> order;
  for (const DivisionBlock& b : by_division(s))
    order.insert(order.end(), b.teams.begin(), b.teams.end());
  for (const std::size_t i : order) {
    const auto& t = r.teams[i];
    teams.push_back({{"team_id", s.teams[i].id},
                     {"team_name", s.teams[i].name},
                     {"conference", group_id(s, s.teams[i].conference)},
                     {"division", group_id(s, s.teams[i].division)},
                     {"games", t.games},
                     {"wins", t.wins},
                     {"losses", t.losses},
                     {"runs_scored_per_game", number(t.runs_scored)},
                     {"runs_allowed_per_game", number(t.runs_allowed)},
                     {"plain",
                      {{"offence", number(t.plain_offence)},
                       {"offence_log_se", number(t.plain_scored_se)},
                       {"defence", number(t.plain_defence)},
                       {"defence_log_se", number(t.plain_allowed_se)},
                       {"runs_scored_mean", number(t.plain_scored)},
                       {"runs_allowed_mean", number(t.plain_allowed)},
                       {"free_shape", number(t.free_shape)},
                       {"free_shape_se", number(t.free_shape_se)}}},
                     {"adjusted_mle",
                      {{"offence", number(t.mle_offence)},
                       {"offence_log_se", number(t.mle_log_offence_se)},
                       {"defence", number(t.mle_defence)},
                       {"defence_log_se", number(t.mle_log_defence_se)}}},
                     {"adjusted",
                      {{"offence", number(t.offence)},
                       {"offence_log_se", number(t.log_offence_se)},
                       {"defence", number(t.defence)},
                       {"defence_log_se", number(t.log_defence_se)},
                       {"runs_scored_per_game", number(lr.league_mean * t.offence)},
                       {"runs_allowed_per_game", number(lr.league_mean * t.defence)}}},
                     {"chi_square",
                      {{"statistic", number(t.chi_square)},
                       {"df", t.df},
                       {"bins_scored", t.bins_scored},
                       {"bins_allowed", t.bins_allowed},
                       {"p_value", t.df > 0 ? number(t.p_value) : json(nullptr)},
                       {"critical", t.df > 0 ? number(t.critical) : json(nullptr)},
                       {"poor_fit", t.rejected}}},
                     {"pythagorean",
                      {{"expected_pct", number(t.expected_pct)},
                       {"expected_wins", number(t.expected_wins)},
                       {"wins_minus_expected", number(t.wins_minus_expected)}}}});
  }
  j["teams"] = teams;
  json fams = json::array();
  for (const auto& f : r.families) {
    fams.push_back(
        {{"family", models::family_name(f.family)},
         {"shape", f.family == config::ScoreFamily::kPoisson ? json(nullptr) : number(f.shape)},
         {"parameters", f.parameters},
         {"log_lik", number(f.log_lik)},
         {"aic", number(f.aic)},
         {"delta_aic", number(f.delta_aic)},
         {"converged", f.converged}});
  }
  j["families"] = fams;
  return j.dump(2) + "\n";
}

}  // namespace

void add_fit_command(CLI::App& app) {
  auto* cmd =
      app.add_subcommand("fit", "Fit the scoring model to the played games and show diagnostics");
  struct Options {
    std::string file, as_of;
    ReportOptions report;
    ModelOptions model;
    double alpha = 0.05;
  };
  auto opt = std::make_shared<Options>();
  add_season_file(*cmd, opt->file);
  add_report_options(*cmd, opt->report);
  add_model_options(*cmd, opt->model);
  cmd->add_option(
         "--alpha", opt->alpha,
         help_text("Family-wise level of the goodness-of-fit tests, between 0 and 1", "0.05"))
      ->check(real_number({0.0, 1.0, true, true}));
  cmd->add_option(
      "--as-of", opt->as_of,
      help_text("Fit only the games played before this date (YYYY-MM-DD)", "every played game"));
  cmd->callback([opt] {
    const Format format = check_report_options(opt->report);
    config::Season full = load_season_file(opt->file);
    apply_model_options(opt->model, full);
    const config::DayNumber as_of = resolve_as_of(full, opt->as_of);
    const config::Season season = config::season_as_of(full, as_of);
    check_output_target(opt->report.output, full.input_files);
    models::FitReport report;
    try {
      report = models::fit_report(season, opt->alpha);
    } catch (const std::domain_error& e) {
      throw UsageError(fmt::format("{}: cannot fit: {}", opt->file, e.what()));
    }
    if (report.defaults) {
      // The same as `odds` on such a file: it runs on these defaults; say so, exit 0.
      config::Diagnostic warning;
      warning.pos.file = opt->file;
      warning.message = fmt::format(
          "no game played before {}: nothing to fit; showing the documented defaults the "
          "simulation runs on",
          config::format_date(as_of));
      fmt::print(stderr, "{}\n", warning_line(warning));
    }
    Provenance run = make_provenance(season);
    run.as_of = as_of;
    set_model(run, season, report.ratings.shape);
    std::string text;
    switch (format) {
      case Format::kTable:
        text = render_table(season, report, run);
        break;
      case Format::kCsv:
        text = render_csv(season, report, run);
        break;
      case Format::kJson:
        text = render_json(season, report, run);
        break;
    }
    write_output(opt->report.output, text);
  });
}

}  // namespace standfast::tools
