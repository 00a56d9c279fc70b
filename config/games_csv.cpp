#include "config/games_csv.h"

#include <array>
#include <vector>

#include "config/suggest.h"

namespace standfast::config::detail {

namespace {

enum Column { kDate, kHome, kAway, kGame, kHomeRuns, kAwayRuns, kInnings, kStatus, kColumns };

const std::array<std::string, kColumns> COLUMN_NAMES = {
    "date", "home", "away", "game", "home_runs", "away_runs", "innings", "status"};

struct Cell {
  std::string text;
  int column = 0;  // 1-based field number
};

// Splits one line into fields; double quotes protect commas, "" is a quote inside quotes.
// Returns false when a quote is left open.
bool split_line(std::string_view line, std::vector<Cell>& cells) {
  cells.clear();
  Cell cell{{}, 1};
  bool in_quotes = false;
  for (std::size_t i = 0; i < line.size(); ++i) {
    const char c = line[i];
    if (in_quotes) {
      if (c == '"' && i + 1 < line.size() && line[i + 1] == '"') {
        cell.text += '"';
        ++i;
      } else if (c == '"') {
        in_quotes = false;
      } else {
        cell.text += c;
      }
    } else if (c == '"') {
      in_quotes = true;
    } else if (c == ',') {
      cell.text = std::string(trim(cell.text));
      cells.push_back(std::move(cell));
      cell = Cell{{}, static_cast<int>(cells.size()) + 1};
    } else {
      cell.text += c;
    }
  }
  cell.text = std::string(trim(cell.text));
  cells.push_back(std::move(cell));
  return !in_quotes;
}

}  // namespace

void read_games_csv(std::string_view text, const std::string& file, const TeamIds& teams,
                    Season& season, Report& report) {
  if (text.size() >= 3 && text.substr(0, 3) == "\xEF\xBB\xBF") text.remove_prefix(3);
  const std::vector<std::string> names(COLUMN_NAMES.begin(), COLUMN_NAMES.end());
  std::array<int, kColumns> where{};  // 0-based field index of each column, -1 when absent
  where.fill(-1);
  std::size_t header_fields = 0;
  bool have_header = false;
  std::vector<Cell> cells;
  int line_no = 0;
  std::size_t start = 0;
  while (start < text.size()) {
    std::size_t end = text.find('\n', start);
    if (end == std::string_view::npos) end = text.size();
    std::string_view line = text.substr(start, end - start);
    start = end + 1;
    ++line_no;
    if (!line.empty() && line.back() == '\r') line.remove_suffix(1);
    if (trim(line).empty() || trim(line).front() == '#') continue;
    const SourcePos line_pos{file, line_no, 0};
    if (!split_line(line, cells)) {
      report.error(line_pos, "a quoted field is not closed on this line");
      if (!have_header) return;
      continue;
    }
    if (!have_header) {
      have_header = true;
      header_fields = cells.size();
      bool bad = false;
      for (std::size_t i = 0; i < cells.size(); ++i) {
        const SourcePos pos{file, line_no, cells[i].column};
        int known = -1;
        for (int c = 0; c < kColumns; ++c) {
          if (cells[i].text == COLUMN_NAMES[static_cast<std::size_t>(c)]) known = c;
        }
        if (known < 0) {
          report.error(pos, "unknown column " + quoted(cells[i].text) +
                                did_you_mean(cells[i].text, names) +
                                "; known columns: date, home, away, game, home_runs, "
                                "away_runs, innings, status");
          bad = true;
        } else if (where[static_cast<std::size_t>(known)] >= 0) {
          report.error(pos, "column " + quoted(cells[i].text) + " appears twice in the header");
          bad = true;
        } else {
          where[static_cast<std::size_t>(known)] = static_cast<int>(i);
        }
      }
      for (const int required : {kDate, kHome, kAway}) {
        if (where[static_cast<std::size_t>(required)] < 0) {
          report.error(line_pos, "missing column " +
                                     quoted(COLUMN_NAMES[static_cast<std::size_t>(required)]) +
                                     " (the header must name date, home and away)");
          bad = true;
        }
      }
      if (bad) return;  // the rows cannot be read without a sound header
      continue;
    }
    if (cells.size() != header_fields) {
      report.error(line_pos, "this line has " + std::to_string(cells.size()) +
                                 " fields but the header has " + std::to_string(header_fields));
      continue;
    }
    GameFields g;
    g.pos = line_pos;
    GameField* fields[kColumns] = {&g.date,      &g.home,      &g.away,    &g.number,
                                   &g.home_runs, &g.away_runs, &g.innings, &g.status};
    for (int c = 0; c < kColumns; ++c) {
      const int at = where[static_cast<std::size_t>(c)];
      if (at < 0) continue;
      Cell& cell = cells[static_cast<std::size_t>(at)];
      fields[c]->given = !cell.text.empty();
      fields[c]->text = std::move(cell.text);
      fields[c]->pos = SourcePos{file, line_no, cell.column};
    }
    add_game(g, teams, season, report);
  }
  if (!have_header) {
    report.error(SourcePos{file, 0, 0},
                 "the games file is empty: it needs a header line (date,home,away,...)");
  }
}

}  // namespace standfast::config::detail
