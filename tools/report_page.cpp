#include "tools/report_page.h"

#include <fmt/core.h>

#include <algorithm>
#include <cmath>
#include <map>

#include "tools/output.h"
#include "tools/provenance.h"

namespace standfast::tools {
namespace {

using engine::Certainty;

std::string esc(std::string_view s) {
  std::string out;
  out.reserve(s.size());
  for (char c : s) {
    switch (c) {
      case '&':
        out += "&amp;";
        break;
      case '<':
        out += "&lt;";
        break;
      case '>':
        out += "&gt;";
        break;
      case '"':
        out += "&quot;";
        break;
      default:
        out += c;
    }
  }
  return out;
}

// Markdown table cells: a bar would end the cell.
std::string md(std::string_view s) {
  std::string out;
  for (char c : s) {
    if (c == '|') out += '\\';
    out += c;
  }
  return out;
}

// A number exactly as JSON writes it (shortest text that reads back to the same double).
std::string exact(double v) { return fmt::format("{}", v); }

std::string pp(double change) { return fmt::format("{:+.1f}", 100.0 * change); }

// Bye and title are lost for sure once the berth is; the exact computation may say more (the
// same rule as the odds table, tools/odds_report.cpp).
Certainty follows_berth(const OddsTeam& t, Certainty exact) {
  return t.marks.berth == Certainty::kEliminated ? Certainty::kEliminated : exact;
}

const char* css_class(double p, Certainty c) {
  if (c == Certainty::kClinched) return "chance sure";
  if (c == Certainty::kEliminated) return "chance out";
  if (p >= 1.0 || p <= 0.0) return "chance unproven";
  return "chance";
}

struct Column {
  const char* label;
  const char* field;
};

// The chances the table shows, in order.
std::vector<Column> chance_columns(const OddsReport& r) {
  std::vector<Column> cols = {{"Division", "division"}};
  if (r.postseason) {
    cols.push_back({"Postseason", "postseason"});
    if (r.byes) cols.push_back({"Bye", "bye"});
    cols.push_back({"Title", "title"});
  }
  return cols;
}

engine::Probability chance_of(const OddsTeam& t, const std::string& field) {
  if (field == "division") return t.odds.division;
  if (field == "postseason") return t.odds.postseason;
  if (field == "bye") return t.odds.bye;
  return t.odds.title;
}

Certainty mark_of(const OddsTeam& t, const std::string& field) {
  if (field == "division") return t.marks.division;
  if (field == "postseason") return t.marks.berth;
  if (field == "bye") return follows_berth(t, t.certainty.bye);
  return follows_berth(t, t.certainty.title);
}

std::string division_title(const OddsDivision& d) {
  if (d.conference_name.empty() || d.conference_name == d.name) return d.name;
  return d.conference_name + " · " + d.name;
}

constexpr const char* STYLE = R"css(
:root { --ink: #1d2a33; --paper: #fbf8f2; --rule: #d9d2c3; --muted: #66757e;
        --berth: #11707a; --crown: #c8641c; --sure: #0d5e52; --out: #8d979d; }
* { box-sizing: border-box; }
body { margin: 0; background: var(--paper); color: var(--ink);
       font: 15px/1.45 system-ui, -apple-system, "Segoe UI", Roboto, sans-serif; }
.masthead { background: var(--ink); color: var(--paper); padding: 1.2rem 1rem 1rem; }
.masthead h1 { margin: 0; font-size: 1.7rem; letter-spacing: 0.01em; }
.kicker { margin: 0; text-transform: uppercase; font-size: 0.75rem; letter-spacing: 0.12em;
          color: #f2c89b; }
.asof { margin: 0.2rem 0 0.8rem; font-size: 1.05rem; }
.facts { display: flex; flex-wrap: wrap; gap: 0.4rem 1.4rem; margin: 0; }
.facts div { min-width: 8rem; }
.facts dt { font-size: 0.7rem; text-transform: uppercase; letter-spacing: 0.08em;
            color: #b9c4ca; }
.facts dd { margin: 0; font-variant-numeric: tabular-nums; }
.caution { margin: 0; padding: 0.55rem 1rem; background: #f4e3c9; border-bottom: 1px solid
           var(--rule); font-size: 0.9rem; }
main { padding: 0 1rem 2rem; max-width: 72rem; margin: 0 auto; }
h2 { margin: 1.8rem 0 0.6rem; font-size: 1.25rem; border-bottom: 3px solid var(--crown);
     display: inline-block; padding-bottom: 0.1rem; }
h3 { margin: 1.1rem 0 0.3rem; font-size: 1rem; }
.scroll { overflow-x: auto; }
table { border-collapse: collapse; width: 100%; font-variant-numeric: tabular-nums; }
th, td { padding: 0.3rem 0.5rem; text-align: right; border-bottom: 1px solid var(--rule);
         white-space: nowrap; }
.team, thead th:first-child { text-align: left; }
thead th { font-size: 0.75rem; text-transform: uppercase; letter-spacing: 0.06em;
           color: var(--muted); font-weight: 600; }
tbody th { font-weight: 600; }
.sure { color: var(--sure); font-weight: 700; }
.out { color: var(--out); }
.unproven { font-style: italic; }
.legend, .note { font-size: 0.82rem; color: var(--muted); margin: 0.5rem 0; }
.cards { display: grid; grid-template-columns: repeat(auto-fill, minmax(16rem, 1fr));
         gap: 0.8rem; }
.card { background: #fff; border: 1px solid var(--rule); border-radius: 6px;
        padding: 0.6rem 0.7rem; break-inside: avoid; }
.card h3 { margin: 0 0 0.3rem; }
figure { margin: 0.3rem 0; }
figcaption { font-size: 0.75rem; color: var(--muted); }
svg { width: 100%; height: auto; display: block; }
.bar { fill: #9bb8bd; }
.bar.mode { fill: var(--berth); }
.mean { stroke: var(--crown); stroke-width: 1.5; }
.axis { font-size: 9px; fill: var(--muted); }
.grid { stroke: var(--rule); stroke-width: 0.6; }
.line { fill: none; stroke-width: 1.8; }
.line.postseason, .line.division { stroke: var(--berth); }
.line.title { stroke: var(--crown); stroke-dasharray: 4 2; }
.pt.postseason, .pt.division { fill: var(--berth); }
.pt.title { fill: var(--crown); }
.key-berth { color: var(--berth); font-weight: 700; }
.key-title { color: var(--crown); font-weight: 700; }
.up { color: var(--sure); }
.down { color: #a23b2a; }
footer { padding: 1rem; font-size: 0.8rem; color: var(--muted); border-top: 1px solid
         var(--rule); }
@media (max-width: 40rem) {
  body { font-size: 14px; }
  th, td { padding: 0.25rem 0.3rem; }
  thead th { letter-spacing: 0; font-size: 0.68rem; }
  main, .masthead { padding-left: 0.6rem; padding-right: 0.6rem; }
  .hide-narrow { display: none; }
}
@media print {
  body { background: #fff; font-size: 10pt; }
  .masthead { background: none; color: #000; border-bottom: 2px solid #000; }
  .kicker, .facts dt { color: #444; }
  .caution { background: none; border: 1px solid #000; }
  .card { border-color: #999; }
  h2 { break-after: avoid; }
  table, .card { break-inside: avoid; }
}
)css";

// Final wins: one bar per win count between the lowest and highest seen; the most frequent in
// the accent colour, the mean as a vertical line.
std::string wins_chart(const OddsTeam& t, std::uint64_t seasons) {
  const auto& h = t.odds.wins_histogram;
  std::size_t first = 0, last = h.size();
  while (first < last && h[first] == 0) ++first;
  while (last > first && h[last - 1] == 0) --last;
  constexpr double W = 240, H = 84, LEFT = 6, RIGHT = 234, TOP = 6, BASE = 66;
  std::string out = fmt::format(
      "<svg class=\"wins-chart\" data-team=\"{}\" data-first=\"{}\" data-seasons=\"{}\" "
      "viewBox=\"0 0 {} {}\" role=\"img\" aria-label=\"Final wins of {}\">",
      esc(t.id), first, seasons, W, H, esc(t.name));
  if (first == last) return out + "</svg>";
  const std::uint64_t top =
      *std::max_element(h.begin() + static_cast<long>(first), h.begin() + static_cast<long>(last));
  const double step = (RIGHT - LEFT) / static_cast<double>(last - first);
  for (std::size_t w = first; w < last; ++w) {
    const double height = (BASE - TOP) * static_cast<double>(h[w]) / static_cast<double>(top);
    out += fmt::format(
        "<rect class=\"bar{}\" data-wins=\"{}\" data-count=\"{}\" x=\"{:.2f}\" y=\"{:.2f}\" "
        "width=\"{:.2f}\" height=\"{:.2f}\"/>",
        h[w] == top ? " mode" : "", w, h[w], LEFT + step * static_cast<double>(w - first),
        BASE - height, std::max(step - 0.6, 0.4), height);
  }
  const double mean_x = LEFT + step * (t.odds.mean_wins - static_cast<double>(first) + 0.5);
  out += fmt::format(
      "<line class=\"mean\" data-mean=\"{}\" x1=\"{:.2f}\" x2=\"{:.2f}\" y1=\"{}\" y2=\"{}\"/>",
      exact(t.odds.mean_wins), mean_x, mean_x, TOP - 2, BASE);
  out += fmt::format(
      "<text class=\"axis\" x=\"{}\" y=\"{}\">{}</text>"
      "<text class=\"axis\" x=\"{}\" y=\"{}\" text-anchor=\"end\">{}</text>"
      "<text class=\"axis\" x=\"{:.2f}\" y=\"{}\" text-anchor=\"middle\">mean {:.1f}</text>",
      LEFT, BASE + 12, first, RIGHT, BASE + 12, last - 1, std::clamp(mean_x, 40.0, 200.0),
      BASE + 12, t.odds.mean_wins);
  return out + "</svg>";
}

struct Point {
  config::DayNumber day;
  double p;
};

// Chances through the season: one line per kind over the as-of dates of the history.
std::string season_chart(const OddsTeam& t, const std::vector<HistoryRun>& series,
                         bool postseason) {
  constexpr double W = 240, H = 96, LEFT = 30, RIGHT = 232, TOP = 6, BOTTOM = 76;
  std::vector<std::pair<std::string, std::vector<Point>>> lines;
  if (postseason) {
    lines = {{"postseason", {}}, {"title", {}}};
  } else {
    lines = {{"division", {}}};
  }
  for (const HistoryRun& run : series) {
    for (const HistoryTeam& ht : run.teams) {
      if (ht.id != t.id) continue;
      for (auto& [kind, pts] : lines) {
        const double p = kind == "postseason" ? ht.postseason.p
                         : kind == "title"    ? ht.title.p
                                              : ht.division.p;
        pts.push_back({run.as_of, p});
      }
    }
  }
  std::string out = fmt::format(
      "<svg class=\"season-chart\" data-team=\"{}\" viewBox=\"0 0 {} {}\" role=\"img\" "
      "aria-label=\"Chances of {} by as-of date\">",
      esc(t.id), W, H, esc(t.name));
  for (double g : {0.0, 0.5, 1.0}) {
    const double y = BOTTOM - g * (BOTTOM - TOP);
    out += fmt::format(
        "<line class=\"grid\" x1=\"{}\" x2=\"{}\" y1=\"{:.2f}\" y2=\"{:.2f}\"/>"
        "<text class=\"axis\" x=\"{}\" y=\"{:.2f}\" text-anchor=\"end\">{}%</text>",
        LEFT, RIGHT, y, y, LEFT - 3, y + 3, static_cast<int>(g * 100));
  }
  const auto& pts0 = lines.front().second;
  if (pts0.empty()) return out + "</svg>";
  const config::DayNumber d0 = pts0.front().day, d1 = pts0.back().day;
  auto x_of = [&](config::DayNumber d) {
    return d1 == d0
               ? (LEFT + RIGHT) / 2
               : LEFT + (RIGHT - LEFT) * static_cast<double>(d - d0) / static_cast<double>(d1 - d0);
  };
  auto y_of = [&](double p) { return BOTTOM - p * (BOTTOM - TOP); };
  for (const auto& [kind, pts] : lines) {
    std::string points;
    for (const Point& pt : pts) {
      points += fmt::format("{}{:.2f},{:.2f}", points.empty() ? "" : " ", x_of(pt.day), y_of(pt.p));
    }
    out += fmt::format("<polyline class=\"line {}\" points=\"{}\"/>", kind, points);
    for (const Point& pt : pts) {
      out += fmt::format(
          "<circle class=\"pt {}\" data-kind=\"{}\" data-date=\"{}\" data-p=\"{}\" cx=\"{:.2f}\" "
          "cy=\"{:.2f}\" r=\"2\"/>",
          kind, kind, config::format_date(pt.day), exact(pt.p), x_of(pt.day), y_of(pt.p));
    }
  }
  out += fmt::format(
      "<text class=\"axis\" x=\"{}\" y=\"{}\">{}</text>"
      "<text class=\"axis\" x=\"{}\" y=\"{}\" text-anchor=\"end\">{}</text>",
      LEFT, BOTTOM + 14, config::format_date(d0).substr(5), RIGHT, BOTTOM + 14,
      config::format_date(d1).substr(5));
  return out + "</svg>";
}

std::string change_cell(const Change& c) {
  return fmt::format(
      "<td class=\"{}\" data-change=\"{}\" data-se=\"{}\">{} <span class=\"note\">± {:.1f}</span>"
      "</td>",
      c.change >= 0 ? "up" : "down", exact(c.change), exact(c.se), pp(c.change), 100.0 * c.se);
}

}  // namespace

namespace {
// The provenance line of the run shown (tools/provenance.h), empty when the page holds no run.
std::string run_text(const OddsReport& r) {
  if (r.run.program_version.empty()) return {};
  Provenance p = r.run;
  p.seed = r.seed;
  p.seasons = r.seasons;
  return provenance_line(p);
}
}  // namespace

std::string write_report_html(const ReportPage& page) {
  const OddsReport& r = page.report;
  const std::string as_of = config::format_date(page.as_of);
  std::string out;
  out += "<!DOCTYPE html>\n<html lang=\"en\">\n<head>\n<meta charset=\"utf-8\">\n";
  out += "<meta name=\"viewport\" content=\"width=device-width, initial-scale=1\">\n";
  // Nothing may be fetched: no script, font, image or style from anywhere.
  out +=
      "<meta http-equiv=\"Content-Security-Policy\" content=\"default-src 'none'; style-src "
      "'unsafe-inline'\">\n";
  out += fmt::format("<title>{} {}: odds as of {}</title>\n", esc(r.league), esc(r.season_label),
                     as_of);
  out += fmt::format("<style>{}</style>\n</head>\n<body>\n", STYLE);

  out += "<header class=\"masthead\">\n";
  out += fmt::format("<p class=\"kicker\">{}</p>\n<h1 id=\"league\">{}</h1>\n", esc(r.season_label),
                     esc(r.league));
  out += fmt::format(
      "<p class=\"asof\">Odds as of the morning of <time id=\"as-of\" datetime=\"{0}\">{0}</time>"
      "</p>\n",
      as_of);
  out += "<dl class=\"facts\">\n";
  out += fmt::format(
      "<div><dt>Simulated seasons</dt><dd id=\"seasons\" data-value=\"{}\">{}</dd></div>\n",
      r.seasons, group_digits(r.seasons));
  out += fmt::format("<div><dt>Seed</dt><dd id=\"seed\">{}</dd></div>\n", r.seed);
  out += fmt::format("<div><dt>Model</dt><dd id=\"model\">{}</dd></div>\n", esc(page.model));
  out += fmt::format(
      "<div><dt>Largest standard error</dt><dd id=\"max-se\" data-value=\"{}\">{:.2f} "
      "percentage points</dd></div>\n",
      exact(r.max_se), 100.0 * r.max_se);
  out += "</dl>\n</header>\n";
  out += fmt::format("<p class=\"caution\" id=\"caution\">{}</p>\n<main>\n", esc(ODDS_CAUTION));

  // The table.
  const auto cols = chance_columns(r);
  out += "<section id=\"odds\">\n<h2>Where the race stands</h2>\n";
  for (const OddsDivision& d : r.divisions) {
    out += fmt::format("<h3>{}</h3>\n<div class=\"scroll\"><table class=\"odds\">\n",
                       esc(division_title(d)));
    out +=
        "<thead><tr><th scope=\"col\">Club</th><th scope=\"col\">Record</th>"
        "<th scope=\"col\" class=\"hide-narrow\">To play</th><th scope=\"col\" "
        "class=\"hide-narrow\">Wins expected</th>";
    for (const Column& c : cols) out += fmt::format("<th scope=\"col\">{}</th>", c.label);
    out += "</tr></thead>\n<tbody>\n";
    for (int row : d.rows) {
      const OddsTeam& t = r.teams[static_cast<std::size_t>(row)];
      out += fmt::format(
          "<tr data-team=\"{}\"><th scope=\"row\" class=\"team\">{}</th><td>{}-{}</td>"
          "<td class=\"hide-narrow\">{}</td><td class=\"hide-narrow\" "
          "data-mean-wins=\"{}\">{:.1f}</td>",
          esc(t.id), esc(t.name), t.wins, t.losses, t.games_left, exact(t.odds.mean_wins),
          t.odds.mean_wins);
      for (const Column& c : cols) {
        const engine::Probability p = chance_of(t, c.field);
        const Certainty mark = mark_of(t, c.field);
        out += fmt::format(
            "<td class=\"{}\" data-field=\"{}\" data-p=\"{}\" data-se=\"{}\">{}</td>",
            css_class(p.p, mark), c.field, exact(p.p), exact(p.se), format_chance(p.p, mark));
      }
      out += "</tr>\n";
    }
    out += "</tbody></table></div>\n";
  }
  out +=
      "<p class=\"legend\"><span class=\"sure\">clinched</span> and <span "
      "class=\"out\">eliminated</span>: certain from the standings alone. <i>100%*</i> and "
      "<i>0%*</i>: in every or in none of the simulated seasons, but not yet certain. Wins "
      "expected: mean final wins over the simulated seasons.</p>\n</section>\n";

  // Club by club.
  out += "<section id=\"clubs\">\n<h2>Club by club</h2>\n";
  out += fmt::format(
      "<p class=\"note\">Left: share of simulated seasons ending with each number of wins (the "
      "most frequent darker, the mean as a line). Right: {} at each as-of date in the "
      "history.</p>\n",
      r.postseason ? "chance of a <span class=\"key-berth\">postseason berth</span> (solid) and "
                     "of the <span class=\"key-title\">title</span> (dashed)"
                   : "chance of the <span class=\"key-berth\">division</span>");
  out += "<div class=\"cards\">\n";
  for (const OddsDivision& d : r.divisions) {
    for (int row : d.rows) {
      const OddsTeam& t = r.teams[static_cast<std::size_t>(row)];
      out += fmt::format("<article class=\"card\" data-team=\"{}\">\n<h3>{}</h3>\n", esc(t.id),
                         esc(t.name));
      out +=
          "<figure><figcaption>Final wins</figcaption>" + wins_chart(t, r.seasons) + "</figure>\n";
      out += "<figure><figcaption>Through the season</figcaption>" +
             season_chart(t, page.series, r.postseason) + "</figure>\n</article>\n";
    }
  }
  out += "</div>\n</section>\n";

  // Movers.
  out += "<section id=\"movers\">\n";
  if (!page.movers) {
    out +=
        "<h2>Biggest swings</h2>\n<p class=\"note\">The history holds one as-of date of this "
        "season so far: swings need two.</p>\n";
  } else {
    const Movers& m = *page.movers;
    out += fmt::format(
        "<h2>Biggest swings, {} to {}</h2>\n<p class=\"note\">Change in percentage points ± its "
        "standard error (the two runs taken as independent).</p>\n",
        config::format_date(m.from), config::format_date(m.to));
    auto team_table = [&](const char* caption, const std::vector<TeamMove>& v, bool title) {
      out += fmt::format(
          "<h3>{}</h3>\n<div class=\"scroll\"><table class=\"swings\" data-kind=\"{}\">"
          "<thead><tr><th scope=\"col\">Club</th><th scope=\"col\">Before</th><th "
          "scope=\"col\">After</th><th scope=\"col\">Change</th></tr></thead><tbody>\n",
          caption, title ? "title" : "postseason");
      for (const TeamMove& mv : v) {
        const Change& c = title ? mv.title : mv.postseason;
        out += fmt::format(
            "<tr data-team=\"{}\"><th scope=\"row\" class=\"team\">{}</th><td>{:.1f}%</td>"
            "<td>{:.1f}%</td>{}</tr>\n",
            esc(mv.id), esc(mv.name), 100.0 * c.before, 100.0 * c.after, change_cell(c));
      }
      out += "</tbody></table></div>\n";
    };
    if (r.postseason) {
      team_table("Postseason chance", m.by_postseason, false);
      team_table("Title chance", m.by_title, true);
    }
    if (!m.games.empty()) {
      out +=
          "<h3>Results that mattered</h3>\n<p class=\"note\">What a result was worth to a club: "
          "its postseason chance with the result, minus its chance had the game still been to "
          "play.</p>\n<div class=\"scroll\"><table class=\"swing-games\"><thead><tr><th "
          "scope=\"col\">Date</th><th scope=\"col\">Game</th><th scope=\"col\">Club</th><th "
          "scope=\"col\">Change</th></tr></thead><tbody>\n";
      for (const GameEffect& g : m.games) {
        out += fmt::format(
            "<tr><td>{}</td><td class=\"team\">{} {}, {} {}</td><td class=\"team\">{}</td>{}"
            "</tr>\n",
            g.date, esc(g.away_name), g.away_runs, esc(g.home_name), g.home_runs, esc(g.team_name),
            change_cell(g.postseason));
      }
      out += "</tbody></table></div>\n";
    }
  }
  out += "</section>\n</main>\n";
  out += fmt::format(
      "<footer>Made by standfast from {} simulated seasons (seed {}). {}<br><span "
      "id=\"run\">{}</span></footer>\n</body>\n"
      "</html>\n",
      group_digits(r.seasons), r.seed, esc(ODDS_CAUTION), esc(run_text(r)));
  return out;
}

std::string write_report_markdown(const ReportPage& page) {
  const OddsReport& r = page.report;
  std::string out;
  out += fmt::format("# {}, {}: odds as of {}\n\n", md(r.league), md(r.season_label),
                     config::format_date(page.as_of));
  out += fmt::format("_{}_\n\n", ODDS_CAUTION);
  out += fmt::format(
      "{} simulated seasons, seed {}, model `{}`, largest standard error {:.2f} percentage "
      "points.\n",
      group_digits(r.seasons), r.seed, page.model, 100.0 * r.max_se);
  if (!r.run.program_version.empty()) out += fmt::format("\n{}\n", md(run_text(r)));
  const auto cols = chance_columns(r);
  for (const OddsDivision& d : r.divisions) {
    out += fmt::format("\n## {}\n\n| Club | Record | To play | Wins expected |",
                       md(division_title(d)));
    std::string rule = "| --- | ---: | ---: | ---: |";
    for (const Column& c : cols) {
      out += fmt::format(" {} |", c.label);
      rule += " ---: |";
    }
    out += "\n" + rule + "\n";
    for (int row : d.rows) {
      const OddsTeam& t = r.teams[static_cast<std::size_t>(row)];
      out += fmt::format("| {} | {}-{} | {} | {:.1f} |", md(t.name), t.wins, t.losses, t.games_left,
                         t.odds.mean_wins);
      for (const Column& c : cols) {
        out += fmt::format(" {} |", format_chance(chance_of(t, c.field).p, mark_of(t, c.field)));
      }
      out += '\n';
    }
  }
  out +=
      "\nclinched / eliminated: certain from the standings alone; 100%* / 0%*: in every or in "
      "none of the simulated seasons, not yet certain.\n";
  if (page.movers) {
    const Movers& m = *page.movers;
    out += fmt::format("\n## Biggest swings, {} to {}\n\n", config::format_date(m.from),
                       config::format_date(m.to));
    out += "Change in percentage points ± its standard error.\n";
    auto team_table = [&](const char* caption, const std::vector<TeamMove>& v, bool title) {
      out += fmt::format(
          "\n### {}\n\n| Club | Before | After | Change |\n| --- | ---: | ---: | ---: |\n",
          caption);
      for (const TeamMove& mv : v) {
        const Change& c = title ? mv.title : mv.postseason;
        out += fmt::format("| {} | {:.1f}% | {:.1f}% | {} ± {:.1f} |\n", md(mv.name),
                           100.0 * c.before, 100.0 * c.after, pp(c.change), 100.0 * c.se);
      }
    };
    if (r.postseason) {
      team_table("Postseason chance", m.by_postseason, false);
      team_table("Title chance", m.by_title, true);
    }
    if (!m.games.empty()) {
      out +=
          "\n### Results that mattered\n\nA club's postseason chance with the result, minus its "
          "chance had the game still been to play.\n\n| Date | Game | Club | Change |\n| --- | "
          "--- | --- | ---: |\n";
      for (const GameEffect& g : m.games) {
        out += fmt::format("| {} | {} {}, {} {} | {} | {} ± {:.1f} |\n", g.date, md(g.away_name),
                           g.away_runs, md(g.home_name), g.home_runs, md(g.team_name),
                           pp(g.postseason.change), 100.0 * g.postseason.se);
      }
    }
  }
  return out;
}

}  // namespace standfast::tools
