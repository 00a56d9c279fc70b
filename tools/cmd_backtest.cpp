// `standfast backtest`: the calibration backtest (tools/backtest.h). Generates synthetic seasons
// with known true strengths, makes the odds at a chosen point of each, plays the real end, and
// prints the reliability table and Brier scores for division titles, berths and titles.
#include <fmt/core.h>

#include <iterator>
#include <memory>
#include <nlohmann/json.hpp>
#include <string>

#include "tools/backtest.h"
#include "tools/cli.h"
#include "tools/commands.h"
#include "tools/output.h"
#include "tools/provenance.h"

namespace standfast::tools {
namespace {

// What produced the report (tools/provenance.h): no season file (the seasons are synthetic),
// the seed and the simulated seasons behind each forecast.
// The forecasts' model is the family and shape the backtest reports (fitted per season unless
// --shape fixes it).
Provenance backtest_provenance(const BacktestResult& r) {
  Provenance p;
  p.program_version = std::string(program_version());
  p.seed = r.options.seed;
  p.seasons = r.options.seasons;
  for (std::size_t k = 0; k < std::size(FAMILY_NAMES); ++k) {
    if (FAMILY_NAMES[k] == r.family) p.family = static_cast<config::ScoreFamily>(k);
  }
  if (!r.shape.empty()) {
    p.shape_source = r.shape == "fit" ? "fitted" : "fixed";
    if (r.shape != "fit") p.shape = std::stod(r.shape);
  }
  return p;
}

// The report with its provenance: a `Run:` line under the title of the table, the `run_*`
// columns at the end of every CSV row, the "run" object in JSON.
std::string write_report(const BacktestResult& r, Format format) {
  const Provenance run = backtest_provenance(r);
  switch (format) {
    case Format::kTable: {
      std::string text = write_backtest_table(r);
      const std::size_t eol = text.find('\n');
      return text.insert(eol == std::string::npos ? text.size() : eol + 1,
                         provenance_line(run) + '\n');
    }
    case Format::kCsv: {
      const std::string text = write_backtest_csv(r);
      const std::string cells = provenance_csv_cells(run);
      std::string out;
      bool header = true;
      for (std::size_t start = 0; start < text.size();) {
        std::size_t eol = text.find('\n', start);
        if (eol == std::string::npos) eol = text.size();
        out.append(text, start, eol - start);
        out += header ? provenance_csv_header() : cells;
        out += '\n';
        header = false;
        start = eol + 1;
      }
      return out;
    }
    case Format::kJson: {
      nlohmann::json doc = nlohmann::json::parse(write_backtest_json(r));
      doc["run"] = nlohmann::json::parse(provenance_json(run).dump());
      return doc.dump(2) + "\n";
    }
  }
  return {};
}

}  // namespace

void add_backtest_command(CLI::App& app) {
  struct Options {
    BacktestOptions run;
    ReportOptions report;
  };
  auto opt = std::make_shared<Options>();
  auto* cmd = app.add_subcommand(
      "backtest",
      "Check the odds against outcomes: synthetic seasons with known strengths, odds at a chosen "
      "point, the real end played from the truth; reliability table and Brier scores");
  cmd->add_option("--runs", opt->run.runs, help_text("Synthetic seasons, 1 to 100000", "200"))
      ->check(whole_number(1, 100000));
  cmd->add_option("--seasons", opt->run.seasons,
                  help_text("Simulated seasons behind each forecast, 100 to 10000000", "2000"))
      ->check(whole_number(100, 10000000));
  cmd->add_option("--at", opt->run.at,
                  help_text("Share of each season's games played when the odds are made, "
                            "between 0 and 1",
                            "0.5"))
      ->check(real_number({0.0, 1.0, true, true}));
  add_seed_option(*cmd, opt->run.seed, BacktestOptions{}.seed);
  add_threads_option(*cmd, opt->run.threads);
  cmd->add_option("--shrink-games", opt->run.shrink_games,
                  help_text("The forecasts' shrinkage: auto or a number of games", "auto"));
  add_report_options(*cmd, opt->report);
  add_model_options(*cmd, opt->run.model);
  cmd->callback([opt] {
    const Format format = check_report_options(opt->report);
    const BacktestResult r = run_backtest(opt->run);
    write_output(opt->report.output, write_report(r, format));
  });
}

}  // namespace standfast::tools
