#include "config/load.h"

#include <algorithm>

#include "config/games.h"
#include "config/games_csv.h"
#include "config/input_file.h"
#include "config/report.h"
#include "config/yaml_reader.h"

namespace standfast::config {

namespace {

std::string join(const std::vector<Diagnostic>& problems) {
  std::string out;
  for (const Diagnostic& d : problems) {
    if (!out.empty()) out += '\n';
    out += format_diagnostic(d);
  }
  return out;
}

void warn_games_per_team(const Season& season, const SourcePos& pos, detail::Report& report) {
  const int expected = season.league.games_per_team;
  if (expected <= 0) return;
  std::vector<int> count(season.teams.size(), 0);
  for (const Game& g : season.games) {
    ++count[static_cast<std::size_t>(g.home)];
    ++count[static_cast<std::size_t>(g.away)];
  }
  std::string list;
  int off = 0;
  for (std::size_t t = 0; t < season.teams.size(); ++t) {
    if (count[t] == expected) continue;
    if (++off <= 12) {
      list += (list.empty() ? "" : ", ") + season.teams[t].id + " " + std::to_string(count[t]);
    }
  }
  if (off == 0) return;
  if (off > 12) list += " and " + std::to_string(off - 12) + " more";
  report.warning(pos, "league.games_per_team is " + std::to_string(expected) + " but " +
                          std::to_string(off) + " of " + std::to_string(season.teams.size()) +
                          " teams have a different number of games on the schedule: " + list);
}

// Messages in file order: the season file first, then each other file, by line and column.
void sort_by_position(std::vector<Diagnostic>& list, const std::string& season_file) {
  std::stable_sort(list.begin(), list.end(), [&](const Diagnostic& a, const Diagnostic& b) {
    const bool a_other = a.pos.file != season_file;
    const bool b_other = b.pos.file != season_file;
    if (a_other != b_other) return !a_other;
    if (a.pos.file != b.pos.file) return a.pos.file < b.pos.file;
    if (a.pos.line != b.pos.line) return a.pos.line < b.pos.line;
    return a.pos.column < b.pos.column;
  });
}

}  // namespace

ConfigError::ConfigError(std::vector<Diagnostic> problems)
    : std::runtime_error(join(problems)), problems_(std::move(problems)) {}

std::string format_diagnostic(const Diagnostic& d) {
  std::string out = d.pos.file;
  if (!out.empty() && d.pos.line > 0) {
    out.append(1, ':').append(std::to_string(d.pos.line));
    if (d.pos.column > 0) out.append(1, ':').append(std::to_string(d.pos.column));
  }
  if (!out.empty()) out.append(": ");
  return out.append(d.message);
}

Season load_season(const std::filesystem::path& file) {
  std::string why;
  const auto text = read_input_file(file.string(), why);
  if (!text) {
    throw ConfigError(
        {Diagnostic{SourcePos{file.string(), 0, 0}, "cannot read the season file: " + why}});
  }
  return load_season_text(*text, file);
}

Season load_season_text(const std::string& yaml_text, const std::filesystem::path& file) {
  Season season;
  season.file = file.string();
  season.input_files.push_back(season.file);
  // Bytes that are not text stop the reading at once: the YAML parser would misreport them.
  if (auto bad = check_text(yaml_text, season.file)) throw ConfigError({std::move(*bad)});
  detail::Report report;
  detail::YamlResult yaml = detail::read_season_yaml(yaml_text, season, report);

  if (yaml.games_file) {
    const std::filesystem::path csv_path = file.parent_path() / *yaml.games_file;
    season.input_files.push_back(csv_path.string());
    std::string why;
    const auto csv = read_input_file(csv_path.string(), why);
    if (!csv) {
      report.error(yaml.games_file_pos, "games_file: cannot read " +
                                            detail::quoted(csv_path.string(), 4096) + ": " + why);
    } else if (auto bad = check_text(*csv, csv_path.string())) {
      report.error(bad->pos, bad->message);
    } else {
      season.games_file = csv_path.string();
      detail::read_games_csv(*csv, csv_path.string(), yaml.teams, season, report);
    }
  }
  detail::check_duplicate_games(season, yaml.teams, report);
  if (report.has_errors()) {
    std::vector<Diagnostic> errors = std::move(report.errors());
    sort_by_position(errors, season.file);
    const std::size_t total = report.error_count();
    if (total > MAX_PROBLEMS_SHOWN) {
      errors.resize(MAX_PROBLEMS_SHOWN);
      errors.push_back(Diagnostic{SourcePos{season.file, 0, 0},
                                  std::to_string(total - MAX_PROBLEMS_SHOWN) +
                                      " more problems not shown (fix the ones above first)"});
    }
    throw ConfigError(std::move(errors));
  }
  warn_games_per_team(season, yaml.games_per_team_pos, report);
  season.warnings = std::move(report.warnings());
  return season;
}

}  // namespace standfast::config
