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

#include "config/as_of.h"
#include "config/load.h"
#include "models/fit_report.h"
#include "models/score_dist.h"
#include "tools/commands.h"
#include "tools/odds_run.h"
#include "tools/output.h"

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

std::string render_table(const config::Season& s, const FitReport& r) {
  std::string out;
  const auto& lr = r.ratings;
  out += fmt::format("Scoring model of {} ({}), from {}\n", s.league.name, s.league.season_label,
                     s.file);
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
      out += fmt::format("  Weibull shape gamma (adjusted fit)        {}\n",
                         with_se(lr.shape, lr.shape_se, 3));
    } else if (r.family == config::ScoreFamily::kNegativeBinomial) {
      out += fmt::format("  Negative-binomial size                    {}\n",
                         with_se(lr.shape, lr.shape_se, 3));
    }
    out += fmt::format("  Home edge (multiplier on home runs)       {}\n",
                       with_se(lr.home_edge, lr.home_edge_se, 3));
  }
  out += fmt::format("  Weibull shape gamma (plain fit)           {}\n",
                     with_se(r.plain_shape, r.plain_shape_se, 3));
  out += fmt::format("  Shrinkage toward the league: {:g} games", r.shrink_games);
  out += r.suggested_shrink_games
             ? fmt::format(" (empirical-Bayes estimate from these games: {:.0f})\n",
                           *r.suggested_shrink_games)
             : " (empirical-Bayes estimate: no spread beyond noise)\n";

  out +=
      "\nTeam ratings. Offence: runs scored relative to the league (higher is better);\n"
      "defence: runs allowed relative to the league (lower is better). ± is the standard\n"
      "error of the log, about the relative error. Plain = own runs only; adjusted = for\n"
      "opponents, venue and home edge, after shrinkage; free gamma = the team's own shape.\n";
  out += fmt::format("{:<8} {:>4} {:>5} {:>5}  {:>14} {:>14}  {:>14} {:>14}  {:>13}\n", "team", "G",
                     "RS/G", "RA/G", "plain off", "plain def", "adj off", "adj def", "free gamma");
  for (size_t i = 0; i < r.teams.size(); ++i) {
    const auto& t = r.teams[i];
    out += fmt::format(
        "{:<8} {:>4} {:>5.2f} {:>5.2f}  {:>14} {:>14}  {:>14} {:>14}  {:>13}\n", s.teams[i].id,
        t.games, t.runs_scored, t.runs_allowed, with_se(t.plain_offence, t.plain_scored_se, 3),
        with_se(t.plain_defence, t.plain_allowed_se, 3), with_se(t.offence, t.log_offence_se, 3),
        with_se(t.defence, t.log_defence_se, 3),
        t.free_shape > 0 ? with_se(t.free_shape, t.free_shape_se, 2) : "-");
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
  for (size_t i = 0; i < r.teams.size(); ++i) {
    const auto& t = r.teams[i];
    if (t.df <= 0) {
      out += fmt::format("{:<8} {:>9} {:>4} {:>9} {:>10}  too few games\n", s.teams[i].id, "-", "-",
                         "-", "-");
      continue;
    }
    out += fmt::format("{:<8} {:>9.2f} {:>4} {:>9.4f} {:>10.2f}  {}\n", s.teams[i].id, t.chi_square,
                       t.df, t.p_value, t.critical, t.rejected ? "poor fit" : "ok");
  }

  out +=
      "\nScoring families, adjusted model at maximum likelihood (AIC = 2k - 2 log L; lower is "
      "better)\n";
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
  for (size_t i = 0; i < r.teams.size(); ++i) {
    const auto& t = r.teams[i];
    out += fmt::format("{:<8} {:>4} {:>4} {:>5.2f} {:>5.2f} {:>8.3f} {:>7.1f} {:>+7.1f}\n",
                       s.teams[i].id, t.wins, t.losses, t.runs_scored, t.runs_allowed,
                       t.expected_pct, t.expected_wins, t.wins_minus_expected);
  }
  out += "\nModel estimates under stated assumptions, not advice for wagering.\n";
  return out;
}

// CSV: blocks separated by a blank line, each with its own header row; the first column names
// the block (league, team, family) so rows can be filtered.
std::string render_csv(const config::Season& s, const FitReport& r) {
  const auto& lr = r.ratings;
  std::string out =
      "block,family,games_fitted,league_mean,league_mean_se,shape,shape_se,home_edge,home_edge_se,"
      "plain_shape,plain_shape_se,shrink_games,suggested_shrink_games,family_alpha,tests,"
      "per_test_alpha,rejected\n";
  out += fmt::format(
      "league,{},{},{:.6g},{:.6g},{:.6g},{:.6g},{:.6g},{:.6g},{:.6g},{:.6g},{:g},{},{:g},{},{:.6g},"
      "{}\n",
      models::family_name(r.family), r.games_fitted, lr.league_mean, lr.league_mean_se, lr.shape,
      lr.shape_se, lr.home_edge, lr.home_edge_se, r.plain_shape, r.plain_shape_se, r.shrink_games,
      r.suggested_shrink_games ? fmt::format("{:.1f}", *r.suggested_shrink_games) : "",
      r.family_alpha, r.tests, r.per_test_alpha, r.rejected);
  out +=
      "\nblock,team,games,wins,losses,runs_scored_per_game,runs_allowed_per_game,"
      "plain_offence,plain_offence_log_se,plain_defence,plain_defence_log_se,free_shape,free_shape_"
      "se,"
      "mle_offence,mle_offence_log_se,mle_defence,mle_defence_log_se,"
      "offence,offence_log_se,defence,defence_log_se,chi_square,df,p_value,critical,poor_fit,"
      "expected_pct,expected_wins,wins_minus_expected\n";
  for (size_t i = 0; i < r.teams.size(); ++i) {
    const auto& t = r.teams[i];
    out += fmt::format(
        "team,{},{},{},{},{:.4f},{:.4f},{:.5f},{:.5f},{:.5f},{:.5f},{:.4f},{:.4f},{:.5f},{:.5f},{:."
        "5f},{:.5f},"
        "{:.5f},{:.5f},{:.5f},{:.5f},{:.4f},{},{:.6g},{:.4f},{},{:.5f},{:.3f},{:.3f}\n",
        csv_field(s.teams[i].id), t.games, t.wins, t.losses, t.runs_scored, t.runs_allowed,
        t.plain_offence, t.plain_scored_se, t.plain_defence, t.plain_allowed_se, t.free_shape,
        t.free_shape_se, t.mle_offence, t.mle_log_offence_se, t.mle_defence, t.mle_log_defence_se,
        t.offence, t.log_offence_se, t.defence, t.log_defence_se, t.chi_square, t.df, t.p_value,
        t.critical, t.rejected ? "yes" : "no", t.expected_pct, t.expected_wins,
        t.wins_minus_expected);
  }
  out += "\nblock,family,shape,parameters,log_lik,aic,delta_aic,converged\n";
  for (const auto& f : r.families) {
    out += fmt::format("family,{},{:.6g},{},{:.4f},{:.4f},{:.4f},{}\n",
                       models::family_name(f.family), f.shape, f.parameters, f.log_lik, f.aic,
                       f.delta_aic, f.converged ? "yes" : "no");
  }
  return out;
}

std::string render_json(const config::Season& s, const FitReport& r) {
  using nlohmann::json;
  const auto& lr = r.ratings;
  json j;
  j["schema_version"] = 1;
  j["kind"] = "fit";
  j["file"] = s.file;
  j["league"] = {{"name", s.league.name},
                 {"season", s.league.season_label},
                 {"family", models::family_name(r.family)},
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
  for (size_t i = 0; i < r.teams.size(); ++i) {
    const auto& t = r.teams[i];
    teams.push_back({{"team", s.teams[i].id},
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
                       {"defence_log_se", number(t.log_defence_se)}}},
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
    std::string file, format = "table", output, as_of;
    double alpha = 0.05;
  };
  auto opt = std::make_shared<Options>();
  cmd->add_option("FILE", opt->file, "season file (YAML)")->required();
  cmd->add_option("--format", opt->format, "table, csv or json")->capture_default_str();
  cmd->add_option("--output", opt->output, "write to this file instead of standard output");
  cmd->add_option("--alpha", opt->alpha, "family-wise level of the goodness-of-fit tests")
      ->capture_default_str();
  cmd->add_option("--as-of", opt->as_of,
                  "fit only the games played before this date (YYYY-MM-DD; default: every "
                  "played game)");
  cmd->callback([opt] {
    const Format format = parse_format(opt->format);
    if (!(opt->alpha > 0.0 && opt->alpha < 1.0)) {
      throw UsageError(fmt::format("--alpha: must be in (0, 1), got {}", opt->alpha));
    }
    const config::Season full = config::load_season(opt->file);
    const config::Season season = config::season_as_of(full, resolve_as_of(full, opt->as_of));
    check_output_target(opt->output, full.input_files);
    models::FitReport report;
    try {
      report = models::fit_report(season, opt->alpha);
    } catch (const std::domain_error& e) {
      throw UsageError(fmt::format("{}: cannot fit: {}", opt->file, e.what()));
    }
    std::string text;
    switch (format) {
      case Format::kTable:
        text = render_table(season, report);
        break;
      case Format::kCsv:
        text = render_csv(season, report);
        break;
      case Format::kJson:
        text = render_json(season, report);
        break;
    }
    write_output(opt->output, text);
  });
}

}  // namespace standfast::tools
