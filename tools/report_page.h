// The report page: one self-contained HTML file (inline CSS and SVG; no script, font or image
// from anywhere) and its Markdown twin, from one odds run and the history. The page holds a
// header (league, as-of date, seasons, seed, model, largest standard error), the caution line,
// the odds table by division with certainty marks, per team a chart of its final wins and its
// chances through the season, and the movers. Every plotted value is also an attribute of its
// SVG element (data-*), so a test can compare the picture with the JSON of the same run.
#ifndef STANDFAST_TOOLS_REPORT_PAGE_H
#define STANDFAST_TOOLS_REPORT_PAGE_H

#include <optional>
#include <string>
#include <vector>

#include "config/season.h"
#include "tools/history.h"
#include "tools/movers.h"
#include "tools/odds_report.h"

namespace standfast::tools {

struct ReportPage {
  OddsReport report;               // the run shown in the table and the final-wins charts
  config::DayNumber as_of = 0;     // its as-of date
  std::string model;               // model_label() of the season's model
  std::vector<HistoryRun> series;  // the history of this league and season, in date order
  std::optional<Movers> movers;    // between two dates of the history, when there are two
};

std::string write_report_html(const ReportPage& page);
std::string write_report_markdown(const ReportPage& page);

}  // namespace standfast::tools

#endif  // STANDFAST_TOOLS_REPORT_PAGE_H
