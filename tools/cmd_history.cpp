// The commands over the odds history (tools/history.h):
//   `standfast replay FILE`  runs the season at every k days of its played games, records each
//                            date, and writes the last date's odds like `standfast odds`;
//   `standfast movers FILE`  the teams and games that moved the chances most between two dates;
//   `standfast report FILE`  one odds run, recorded, turned into an HTML page and Markdown.
#include <fmt/core.h>

#include <chrono>
#include <memory>
#include <nlohmann/json.hpp>
#include <string>
#include <string_view>
#include <vector>

#include "config/as_of.h"
#include "config/load.h"
#include "tools/cli.h"
#include "tools/commands.h"
#include "tools/history.h"
#include "tools/movers.h"
#include "tools/odds_report.h"
#include "tools/odds_run.h"
#include "tools/output.h"
#include "tools/provenance.h"
#include "tools/report_page.h"

namespace standfast::tools {
namespace {

constexpr std::uint64_t DEFAULT_SEED = 20260101;  // the same default as `standfast odds`
constexpr std::uint64_t DEFAULT_SEASONS = 100000;
constexpr std::uint64_t MAX_SEASONS = 1'000'000'000;
constexpr std::uint64_t DEFAULT_GAME_SEASONS = 10000;

struct RunFlags {
  std::string season_file;
  std::uint64_t seasons = DEFAULT_SEASONS;
  std::uint64_t seed = DEFAULT_SEED;
  int threads = 0;
  std::string history;
  ModelOptions model;
};

// The options every history command shares; `seasons_help`, when given, adds --seasons.
void add_run_flags(CLI::App* cmd, RunFlags& f, std::string_view seasons_help) {
  add_season_file(*cmd, f.season_file);
  if (!seasons_help.empty()) {
    cmd->add_option("--seasons", f.seasons,
                    help_text(fmt::format("{}, 1 to {}", seasons_help, MAX_SEASONS),
                              std::to_string(DEFAULT_SEASONS)))
        ->check(whole_number(1, MAX_SEASONS));
  }
  add_seed_option(*cmd, f.seed, DEFAULT_SEED);
  add_threads_option(*cmd, f.threads);
  cmd->add_option("--history", f.history,
                  help_text("The odds history file (SQLite)",
                            "$XDG_DATA_HOME/standfast/history.sqlite or "
                            "~/.local/share/standfast/history.sqlite"));
  add_model_options(*cmd, f.model);
}

void add_game_seasons(CLI::App* cmd, std::uint64_t& game_seasons, std::string_view what) {
  cmd->add_option("--game-seasons", game_seasons,
                  help_text(fmt::format("Simulated seasons per result weighed{}, 0 to {}; 0 does "
                                        "not weigh results",
                                        what, MAX_SEASONS),
                            std::to_string(DEFAULT_GAME_SEASONS)))
      ->check(whole_number(0, MAX_SEASONS));
}

void add_top(CLI::App* cmd, std::size_t& top, std::string_view what) {
  cmd->add_option("--top", top, help_text(fmt::format("{}, 1 to 1000", what), "5"))
      ->check(whole_number(1, 1000));
}

// The numbers were checked by their validators while parsing.
engine::RunOptions run_options(const RunFlags& f, std::uint64_t seasons) {
  engine::RunOptions run;
  run.seed = f.seed;
  run.seasons = seasons;
  run.threads = f.threads;
  return run;
}

std::filesystem::path history_path(const RunFlags& f) {
  return f.history.empty() ? default_history_path() : std::filesystem::path(f.history);
}

// Loads the season, prints its warnings, and refuses an output path that is a file the run
// reads (the season file, its games file or the history) before any work.
config::Season load(const RunFlags& f, const std::vector<std::string>& outputs) {
  config::Season season = config::load_season(f.season_file);
  std::vector<std::string> inputs = season.input_files;
  inputs.push_back(history_path(f).string());
  for (const std::string& out : outputs) check_output_target(out, inputs);
  print_warnings(season);
  apply_model_options(f.model, season);
  return season;
}

std::string write_report(const OddsReport& report, Format format) {
  switch (format) {
    case Format::kCsv:
      return write_odds_csv(report);
    case Format::kJson:
      return write_odds_json(report);
    case Format::kTable:
      break;
  }
  return write_odds_table(report);
}

// ---- replay ----

struct ReplayFlags : RunFlags {
  int every = 7;
  std::string from;
  ReportOptions report;
};

// The as-of dates of a replay: the default as-of date (the morning after the last played game)
// and every `every` days before it, down to the first date after the first played game (or
// `from`).
std::vector<config::DayNumber> replay_dates(const config::Season& season, int every,
                                            std::optional<config::DayNumber> from) {
  const auto last = config::default_as_of(season);
  std::optional<config::DayNumber> first_played;
  for (const config::Game& g : season.games) {
    if (g.played && g.date) first_played = std::min(first_played.value_or(*g.date), *g.date);
  }
  if (!last || !first_played) {
    throw UsageError(fmt::format("{}: no played game to replay", season.file));
  }
  const config::DayNumber earliest = from ? *from : *first_played + 1;
  std::vector<config::DayNumber> dates;
  for (config::DayNumber d = *last; d >= earliest; d -= every) dates.insert(dates.begin(), d);
  if (dates.empty()) dates.push_back(*last);
  return dates;
}

void run_replay(const ReplayFlags& f) {
  const Format format = check_report_options(f.report);
  std::optional<config::DayNumber> from;
  if (!f.from.empty()) {
    from = config::parse_date(f.from);
    if (!from)
      throw UsageError(fmt::format("--from: expected a date YYYY-MM-DD, got '{}'", f.from));
  }
  const engine::RunOptions run = run_options(f, f.seasons);
  const config::Season season = load(f, {f.report.output});
  const auto dates = replay_dates(season, f.every, from);
  History history = History::open(history_path(f), true);
  fmt::print(stderr, "replay: {} as-of dates, {} seasons each, into {}\n", dates.size(),
             group_digits(f.seasons), history.file().string());
  const auto start = std::chrono::steady_clock::now();
  std::string last_text;
  for (std::size_t i = 0; i < dates.size(); ++i) {
    const auto t0 = std::chrono::steady_clock::now();
    const OddsRun odds = run_odds_at(season, dates[i], run, 0.0);
    history.record(history_run(odds, season));
    const double secs =
        std::chrono::duration<double>(std::chrono::steady_clock::now() - t0).count();
    fmt::print(stderr, "  {}  {:>5} games played  largest SE {:.2f} pp  {:.1f} s\n",
               config::format_date(dates[i]), odds.games_played, 100.0 * odds.result.max_se, secs);
    if (i + 1 == dates.size()) last_text = write_report(odds.report, format);
  }
  fmt::print(stderr, "replay: {:.1f} s in all\n",
             std::chrono::duration<double>(std::chrono::steady_clock::now() - start).count());
  write_output(f.report.output, last_text);
}

// ---- movers ----

struct MoversFlags : RunFlags {
  std::string from, to;
  std::size_t top = 5;
  std::uint64_t game_seasons = DEFAULT_GAME_SEASONS;
  ReportOptions report;
};

// The two runs to compare: the named dates, else the last recorded date and the one before it
// (or before `to`).
std::pair<HistoryRun, HistoryRun> pick_runs(const std::vector<HistoryRun>& runs,
                                            const std::string& from_text,
                                            const std::string& to_text, const std::string& file) {
  auto dates_known = [&] {
    std::string s;
    for (const auto& r : runs) s += (s.empty() ? "" : ", ") + config::format_date(r.as_of);
    return s.empty() ? std::string("none") : s;
  };
  auto find = [&](const std::string& text, const char* option) -> std::size_t {
    const auto d = config::parse_date(text);
    if (!d) throw UsageError(fmt::format("{}: expected a date YYYY-MM-DD, got '{}'", option, text));
    for (std::size_t i = 0; i < runs.size(); ++i) {
      if (runs[i].as_of == *d) return i;
    }
    throw UsageError(fmt::format("{}: {} has no run as of {} for this season (dates: {})", option,
                                 file, text, dates_known()));
  };
  if (runs.size() < 2) {
    throw UsageError(fmt::format(
        "{}: movers need two recorded as-of dates of this season, the history has {} (dates: "
        "{}); run `standfast replay` or two odds runs with --record",
        file, runs.size(), dates_known()));
  }
  const std::size_t to = to_text.empty() ? runs.size() - 1 : find(to_text, "--to");
  std::size_t from = 0;
  if (from_text.empty()) {
    if (to == 0) {
      throw UsageError(fmt::format("--to: {} is the first recorded date; give --from", to_text));
    }
    from = to - 1;
  } else {
    from = find(from_text, "--from");
  }
  if (runs[from].as_of >= runs[to].as_of) {
    throw UsageError("--from: must be earlier than --to");
  }
  return {runs[from], runs[to]};
}

nlohmann::ordered_json change_json(const Change& c) {
  return {{"before", c.before}, {"after", c.after}, {"change", c.change}, {"se", c.se}};
}

nlohmann::ordered_json move_json(const TeamMove& mv) {
  return {{"team_id", mv.id},
          {"team_name", mv.name},
          {"postseason", change_json(mv.postseason)},
          {"title", change_json(mv.title)}};
}

std::string write_movers_json(const Movers& m, const Provenance& run) {
  using nlohmann::ordered_json;
  ordered_json teams_p = ordered_json::array(), teams_t = ordered_json::array(),
               games = ordered_json::array();
  for (const auto& mv : m.by_postseason) teams_p.push_back(move_json(mv));
  for (const auto& mv : m.by_title) teams_t.push_back(move_json(mv));
  for (const auto& g : m.games) {
    games.push_back({{"date", g.date},
                     {"home", g.home_id},
                     {"away", g.away_id},
                     {"home_runs", g.home_runs},
                     {"away_runs", g.away_runs},
                     {"team_id", g.team_id},
                     {"team_name", g.team_name},
                     {"postseason", change_json(g.postseason)}});
  }
  ordered_json doc = {{"schema_version", ODDS_SCHEMA_VERSION},
                      {"caution", std::string(ODDS_CAUTION)},
                      {"run", provenance_json(run)},
                      {"from", config::format_date(m.from)},
                      {"to", config::format_date(m.to)},
                      {"by_postseason", teams_p},
                      {"by_title", teams_t},
                      {"games", games}};
  return doc.dump(2) + '\n';
}

// CSV: one long table, one row per listed team or game: `table` (by_postseason, by_title or
// games), the game's cells (empty for a team row), the team, the chance and its change.
std::string write_movers_csv(const Movers& m, const Provenance& run) {
  std::string out =
      "table,from,to,date,home,away,home_runs,away_runs,team_id,team_name,chance,before,after,"
      "change,se" +
      provenance_csv_header() + "\n";
  const std::string run_cells = provenance_csv_cells(run);
  const std::string from = config::format_date(m.from), to = config::format_date(m.to);
  const auto row = [&](std::string_view table, std::string_view game, const std::string& id,
                       const std::string& name, std::string_view chance, const Change& c) {
    out += fmt::format("{},{},{},{},{},{},{},{:.6f},{:.6f},{:.6f},{:.6f}{}\n", table, from, to,
                       game, csv_field(id), csv_field(name), chance, c.before, c.after, c.change,
                       c.se, run_cells);
  };
  for (const auto& mv : m.by_postseason) {
    row("by_postseason", ",,,,", mv.id, mv.name, "postseason", mv.postseason);
    row("by_postseason", ",,,,", mv.id, mv.name, "title", mv.title);
  }
  for (const auto& mv : m.by_title) {
    row("by_title", ",,,,", mv.id, mv.name, "postseason", mv.postseason);
    row("by_title", ",,,,", mv.id, mv.name, "title", mv.title);
  }
  for (const auto& g : m.games) {
    const std::string game = fmt::format("{},{},{},{},{}", g.date, csv_field(g.home_id),
                                         csv_field(g.away_id), g.home_runs, g.away_runs);
    row("games", game, g.team_id, g.team_name, "postseason", g.postseason);
  }
  return out;
}

std::string write_movers_table(const Movers& m, const Provenance& run) {
  std::string out = fmt::format("Movers from {} to {}\n{}\n{}\n", config::format_date(m.from),
                                config::format_date(m.to), ODDS_CAUTION, provenance_line(run));
  auto block = [&](const char* title, const std::vector<TeamMove>& v, bool t) {
    out += fmt::format("\n{}\n{:<28} {:>8} {:>8} {:>16}\n", title, "Team", "Before", "After",
                       "Change (pp)");
    for (const auto& mv : v) {
      const Change& c = t ? mv.title : mv.postseason;
      out += fmt::format("{:<28} {:>7.1f}% {:>7.1f}% {:>+9.1f} ± {:.1f}\n", mv.name, 100 * c.before,
                         100 * c.after, 100 * c.change, 100 * c.se);
    }
  };
  block("Postseason chance", m.by_postseason, false);
  block("Title chance", m.by_title, true);
  if (!m.games.empty()) {
    out +=
        "\nResults that mattered (postseason chance with the result minus with the game to play)\n";
    for (const auto& g : m.games) {
      const std::string game =
          fmt::format("{} {}, {} {}", g.away_id, g.away_runs, g.home_id, g.home_runs);
      out += fmt::format("{}  {:<20} {:<28} {:>+6.1f} ± {:.1f}\n", g.date, game, g.team_name,
                         100 * g.postseason.change, 100 * g.postseason.se);
    }
  }
  out += "\nChanges in percentage points ± standard error (the two runs taken as independent).\n";
  return out;
}

void run_movers(const MoversFlags& f) {
  // Movers write Markdown too (the movers part of the report page).
  const bool markdown = f.report.format == "markdown";
  const Format format = markdown ? Format::kTable : parse_format(f.report.format);
  check_output_path(f.report.output);
  const config::Season season = load(f, {f.report.output});
  const History history = History::open(history_path(f), false);
  const auto runs = history.runs(season.league.name, season.league.season_label);
  const auto [before, after] = pick_runs(runs, f.from, f.to, history.file().string());
  Movers m = compare_runs(before, after, f.top);
  if (f.game_seasons > 0) add_game_effects(m, season, run_options(f, f.game_seasons), f.top);
  // The two runs compared were recorded earlier (their model, seed and seasons are in the
  // history); the seed and seasons here are those of the results weighed, if any.
  Provenance run = make_provenance(season);
  run.as_of = m.to;
  if (f.game_seasons > 0) {
    run.seed = f.seed;
    run.seasons = f.game_seasons;
  }
  std::string text;
  if (markdown) {
    ReportPage page;
    page.as_of = m.to;
    page.movers = m;
    text = write_report_markdown(page);
  } else if (format == Format::kJson) {
    text = write_movers_json(m, run);
  } else if (format == Format::kCsv) {
    text = write_movers_csv(m, run);
  } else {
    text = write_movers_table(m, run);
  }
  write_output(f.report.output, text);
}

// ---- report ----

struct ReportFlags : RunFlags {
  std::string as_of;
  double target_se = 0;
  std::size_t top = 5;
  std::uint64_t game_seasons = DEFAULT_GAME_SEASONS;
  std::string output;
  std::string markdown;
};

void run_report(const ReportFlags& f) {
  check_output_path(f.output);
  check_output_path(f.markdown);
  engine::RunOptions run = run_options(f, f.seasons);
  run.target_se = f.target_se;
  const config::Season season = load(f, {f.output, f.markdown});
  const config::DayNumber as_of = resolve_as_of(season, f.as_of);
  History history = History::open(history_path(f), true);

  const OddsRun odds = run_odds_at(season, as_of, run, f.target_se);
  history.record(history_run(odds, season));

  ReportPage page;
  page.report = odds.report;
  page.as_of = as_of;
  page.model = model_label(season.model);
  for (auto& r : history.runs(season.league.name, season.league.season_label)) {
    if (r.as_of <= as_of) page.series.push_back(std::move(r));
  }
  if (page.series.size() >= 2) {
    Movers m = compare_runs(page.series[page.series.size() - 2], page.series.back(), f.top);
    if (f.game_seasons > 0) add_game_effects(m, season, run_options(f, f.game_seasons), f.top);
    page.movers = std::move(m);
  }
  const std::string html = write_report_html(page);
  const std::string markdown = f.markdown.empty() ? std::string{} : write_report_markdown(page);
  write_output(f.output, html);
  if (!f.markdown.empty()) write_output(f.markdown, markdown);
}

}  // namespace

void add_history_commands(CLI::App& app) {
  {
    auto f = std::make_shared<ReplayFlags>();
    auto* cmd = app.add_subcommand(
        "replay",
        "Run the season at every few days of its played games (fitting on the games up to each "
        "date, simulating the rest), record each date in the history, and print the last "
        "date's odds");
    add_run_flags(cmd, *f, "Simulated seasons per as-of date");
    cmd->add_option("--every", f->every, help_text("Days between as-of dates, 1 to 366", "7"))
        ->check(whole_number(1, 366));
    cmd->add_option(
        "--from", f->from,
        help_text("Earliest as-of date (YYYY-MM-DD)", "the day after the first played game"));
    add_report_options(*cmd, f->report);
    cmd->callback([f] { run_replay(*f); });
  }
  {
    auto f = std::make_shared<MoversFlags>();
    auto* cmd = app.add_subcommand(
        "movers",
        "From the history: the teams whose postseason and title chances moved most between two "
        "as-of dates, and the results in between that moved them most");
    add_run_flags(cmd, *f, {});
    cmd->add_option("--from", f->from,
                    help_text("Earlier as-of date (YYYY-MM-DD)", "the recorded date before --to"));
    cmd->add_option("--to", f->to,
                    help_text("Later as-of date (YYYY-MM-DD)", "the last recorded date"));
    add_top(cmd, f->top, "Teams and games listed");
    add_game_seasons(cmd, f->game_seasons, "");
    add_report_options(*cmd, f->report, "table, csv, json or markdown");
    cmd->callback([f] { run_movers(*f); });
  }
  {
    auto f = std::make_shared<ReportFlags>();
    auto* cmd = app.add_subcommand(
        "report",
        "One odds run, recorded in the history, written as a self-contained HTML page (odds "
        "table, final-wins charts, chances through the season, movers) and optionally Markdown");
    add_run_flags(cmd, *f, "Simulated seasons");
    cmd->add_option("--as-of", f->as_of,
                    help_text("As-of date YYYY-MM-DD: games on or after it count as not yet "
                              "played",
                              "the day after the last played game"));
    cmd->add_option("--target-se", f->target_se,
                    help_text("Stop early once the largest standard error of any chance is below "
                              "this probability, e.g. 0.002; 0 runs every season",
                              "0"))
        ->check(real_number({0.0, 0.5, false, true}));
    add_top(cmd, f->top, "Teams and games in the movers");
    add_game_seasons(cmd, f->game_seasons, " in the movers");
    cmd->add_option(
        "-o,--output", f->output,
        help_text("Write the HTML page to this file, whole or not at all", "standard output"));
    cmd->add_option("--markdown", f->markdown,
                    help_text("Also write the table and movers as Markdown to this file"));
    cmd->callback([f] { run_report(*f); });
  }
}

}  // namespace standfast::tools
