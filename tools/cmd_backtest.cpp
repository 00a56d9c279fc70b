// `standfast backtest`: the calibration backtest (tools/backtest.h). Generates synthetic seasons
// with known true strengths, makes the odds at a chosen point of each, plays the real end, and
// prints the reliability table and Brier scores for division titles, berths and titles.
#include <fmt/core.h>

#include <memory>
#include <string>

#include "tools/backtest.h"
#include "tools/commands.h"
#include "tools/output.h"

namespace standfast::tools {

void add_backtest_command(CLI::App& app) {
  struct Options {
    BacktestOptions run;
    std::string format = "table", output;
  };
  auto opt = std::make_shared<Options>();
  auto* cmd = app.add_subcommand(
      "backtest",
      "Check the odds against outcomes: synthetic seasons with known strengths, odds at a chosen "
      "point, the real end played from the truth; reliability table and Brier scores.");
  cmd->add_option("--runs", opt->run.runs, "Synthetic seasons (default 200)");
  cmd->add_option("--seasons", opt->run.seasons,
                  "Simulated seasons behind each forecast (default 2000)");
  cmd->add_option("--at", opt->run.at,
                  "Share of each season's games played when the odds are made (default 0.5)");
  cmd->add_option("--seed", opt->run.seed, "Random seed (default 20260101)");
  cmd->add_option("--threads", opt->run.threads, "Worker threads (default 0 = all cores)");
  cmd->add_option("--shrink-games", opt->run.shrink_games,
                  "The forecasts' shrinkage: auto or a number of games (default auto)");
  cmd->add_option("--format", opt->format, "Output format: table, csv or json (default table)");
  cmd->add_option("-o,--output", opt->output,
                  "Write to this file (whole or not at all) instead of standard output");
  add_model_options(*cmd, opt->run.model);
  cmd->callback([opt] {
    const Format format = parse_format(opt->format);
    const BacktestResult r = run_backtest(opt->run);
    write_output(opt->output, format == Format::kTable ? write_backtest_table(r)
                              : format == Format::kCsv ? write_backtest_csv(r)
                                                       : write_backtest_json(r));
  });
}

}  // namespace standfast::tools
