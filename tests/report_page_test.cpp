// Tests for tools/report_page.h: the report page and its Markdown twin. The page is rendered in
// headless Chromium (Debian's `chromium`) by tests/browser/check_report.py, which compares the
// rendered DOM and every plotted value with the JSON of the same run (`standfast odds`, same
// seed and as-of date) and with the history file, and writes screenshots. References: the JSON
// and the SQLite history written by the program itself through other code paths
// (tools/odds_report.cpp, tools/history.cpp); Chromium 156 (Debian 12) as the renderer.
#include "tools/report_page.h"

#include <catch2/catch.hpp>
#include <filesystem>
#include <fstream>
#include <sstream>
#include <string>

#include "config/load.h"
#include "tests/process_support.h"
#include "tools/odds_run.h"

namespace fs = std::filesystem;
using namespace standfast;

namespace {

const std::string PROGRAM = STANDFAST_BINARY_DIR "/tools/standfast";
const std::string SMALL = STANDFAST_SOURCE_DIR "/scenarios/small/season.yaml";
const std::string CHECKER = STANDFAST_SOURCE_DIR "/tests/browser/check_report.py";

using standfast::testing::read_file;

fs::path fresh_dir(const std::string& name) {
  return standfast::testing::fresh_dir("report_page_test", name);
}

bool have_chromium() { return fs::exists("/usr/bin/chromium"); }

}  // namespace

TEST_CASE("the page is self-contained, escaped and carries the caution") {
  config::Season season = config::load_season(SMALL);
  season.teams[0].name = "Rock & <Roll> \"Club\"";
  engine::RunOptions run;
  run.seasons = 500;
  const tools::OddsRun odds = tools::run_odds_at(season, *config::parse_date("2049-05-20"), run, 0);
  tools::ReportPage page;
  page.report = odds.report;
  page.as_of = odds.as_of;
  page.model = tools::model_label(season.model);
  page.series.push_back(tools::history_run(odds, season));
  const std::string html = tools::write_report_html(page);
  CHECK(html.find("Rock &amp; &lt;Roll&gt; &quot;Club&quot;") != std::string::npos);
  CHECK(html.find("<Roll>") == std::string::npos);
  CHECK(html.find(std::string(tools::ODDS_CAUTION)) != std::string::npos);
  CHECK(html.find("2049-05-20") != std::string::npos);
  // Nothing that could be fetched: no script, no link, no URL of any scheme.
  CHECK(html.find("<script") == std::string::npos);
  CHECK(html.find("<link") == std::string::npos);
  CHECK(html.find("url(") == std::string::npos);
  CHECK(html.find("http:") == std::string::npos);
  CHECK(html.find("https:") == std::string::npos);
  CHECK(html.find("Content-Security-Policy") != std::string::npos);
  // One season chart and one final-wins chart per team.
  std::size_t charts = 0;
  for (std::size_t at = 0; (at = html.find("class=\"wins-chart\"", at)) != std::string::npos; ++at)
    ++charts;
  CHECK(charts == season.teams.size());

  const std::string md = tools::write_report_markdown(page);
  CHECK(md.find(std::string(tools::ODDS_CAUTION)) != std::string::npos);
  CHECK(md.find("| Club | Record |") != std::string::npos);
  CHECK(md.find("Rock & <Roll>") != std::string::npos);
}

TEST_CASE("the report renders in headless Chromium and shows the numbers of the JSON") {
  if (!have_chromium()) {
    WARN("chromium is not installed (tools/setup.sh installs it): browser checks skipped");
    return;
  }
  const fs::path dir = fresh_dir("browser");
  const std::string h = (dir / "h.sqlite").string();
  using standfast::testing::run_process;
  REQUIRE(
      run_process(PROGRAM + " replay " + SMALL + " --seasons 4000 --history " + h + " 2>/dev/null")
          .status == 0);
  REQUIRE(run_process(PROGRAM + " report " + SMALL + " --seasons 4000 --history " + h +
                      " --game-seasons 1000 -o " + (dir / "report.html").string() + " --markdown " +
                      (dir / "report.md").string() + " 2>/dev/null")
              .status == 0);
  REQUIRE(run_process(PROGRAM + " odds " + SMALL + " --seasons 4000 --format json -o " +
                      (dir / "odds.json").string() + " 2>/dev/null")
              .status == 0);
  const auto check = run_process("python3 " + CHECKER + " " + (dir / "report.html").string() + " " +
                                 (dir / "odds.json").string() + " " + h + " " +
                                 (dir / "shots").string() + " 2>&1");
  INFO(check.out);
  CHECK(check.status == 0);
  CHECK(fs::file_size(dir / "shots" / "report-desktop.png") > 10000);
  CHECK(fs::file_size(dir / "shots" / "report-phone.png") > 10000);
  const std::string md = read_file(dir / "report.md");
  CHECK(md.find("Biggest swings, 2049-05-24 to 2049-05-31") != std::string::npos);
}

TEST_CASE("the browser check catches a page that fetches something") {
  if (!have_chromium()) {
    WARN("chromium is not installed: browser checks skipped");
    return;
  }
  using standfast::testing::run_process;
  const fs::path dir = fresh_dir("controls");
  // Blocked by the page's own policy: a console error. Without the policy: a network request.
  std::ofstream(dir / "blocked.html")
      << "<!DOCTYPE html><html><head><meta http-equiv=\"Content-Security-Policy\" "
         "content=\"default-src 'none'\"></head><body><img src=\"http://example.invalid/a.png\">"
         "</body></html>\n";
  std::ofstream(dir / "fetches.html")
      << "<!DOCTYPE html><html><head></head><body><img src=\"http://example.invalid/a.png\">"
         "</body></html>\n";
  std::ofstream(dir / "clean.html") << "<!DOCTYPE html><html><head></head><body><p>x</p>"
                                       "</body></html>\n";
  for (const char* page : {"blocked.html", "fetches.html"}) {
    INFO(page);
    const auto r = run_process("python3 " + CHECKER + " --expect-failure " + (dir / page).string() +
                               " " + (dir / "out").string() + " 2>&1");
    CHECK(r.status == 0);  // the checker found a problem, as it must
    CHECK(r.out.find("example.invalid") != std::string::npos);
  }
  const auto clean =
      run_process("python3 " + CHECKER + " --expect-failure " + (dir / "clean.html").string() +
                  " " + (dir / "out").string() + " 2>&1");
  CHECK(clean.status == 1);  // nothing to find on a clean page
}
