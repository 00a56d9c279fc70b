// The command-line matrix: every command x every format x standard output or --output FILE,
// through the built program. Checks that the report-writing commands share their option names
// and help wording, that the exit statuses are 0 (success) and 2 (a bad option value, a bad or
// missing season file, an output that cannot be written), that a failed run leaves no output
// file behind (and an existing one untouched), that a report written with --output is the bytes
// it prints on standard output, and that every CSV loads with Python's csv module into one
// header and rows of its length. Bounded: the six-club league and 200 simulated seasons.
// References: the program's own contract (README.md, "Commands" and "One vocabulary in every
// report"; tools/ODDS.md): exit status 2 for bad input, whole-or-nothing output; CSV per
// RFC 4180 (Shafranovich, "Common Format and MIME Type for CSV Files", 2005), read by Python 3's
// `csv.reader` with its default "excel" dialect (python3 -c 'import csv'; common practice).
#include <catch2/catch.hpp>
#include <filesystem>
#include <fstream>
#include <nlohmann/json.hpp>
#include <string>
#include <vector>

#include "tests/process_support.h"

namespace fs = std::filesystem;
using standfast::testing::fresh_dir;
using standfast::testing::read_file;
using standfast::testing::run_process;

namespace {

const std::string PROGRAM = STANDFAST_BINARY_DIR "/tools/standfast";
const std::string SMALL = STANDFAST_SOURCE_DIR "/scenarios/small/season.yaml";
const std::vector<std::string> FORMATS = {"table", "csv", "json"};

// One report-writing command as the matrix runs it: its name and the arguments after the name
// (season file, a small run); `seasons` and `simulates` say which shared options it has.
struct Command {
  std::string name, args;
  bool season_file = true, seasons = false, simulates = false;
};

// The files the commands need, made once per test case in `dir`: a scenario file for the small
// league and a history with two recorded dates (for movers).
struct Setup {
  fs::path dir, scenarios, history;
};

Setup make_setup(const std::string& name) {
  Setup s;
  s.dir = fresh_dir("cli_matrix_test", name);
  s.scenarios = s.dir / "whatif.yaml";
  std::ofstream(s.scenarios) << "standfast_scenarios: 1\n"
                                "scenarios:\n"
                                "  - name: LRK adds a hitter\n"
                                "    teams:\n"
                                "      - {team: LRK, add_runs_scored: 0.25}\n";
  s.history = s.dir / "history.sqlite";
  const auto replay = run_process(PROGRAM + " replay " + SMALL + " --every 14 --seasons 200 " +
                                  "--history " + s.history.string() + " 2>&1");
  REQUIRE(replay.status == 0);
  return s;
}

std::vector<Command> commands(const Setup& s) {
  const std::string h = " --history " + s.history.string();
  return {
      {"check", SMALL},
      {"standings", SMALL},
      {"fit", SMALL},
      {"odds", SMALL + " --seasons 200", true, true, true},
      {"whatif", SMALL + " " + s.scenarios.string() + " --seasons 200", true, true, true},
      {"replay", SMALL + " --every 14 --seasons 200" + h, true, true, true},
      {"movers", SMALL + " --game-seasons 200" + h, true, false, true},
      {"worth", SMALL + " --seasons 200 --span 1", true, true, true},
      {"stakes", SMALL + " --seasons 200", true, true, true},
      {"families", SMALL + " --seasons 200", true, true, true},
      {"backtest", "--runs 2 --seasons 100", false, true, true},
  };
}

std::string command_line(const Command& c, const std::string& extra) {
  return PROGRAM + " " + c.name + " " + c.args + " " + extra;
}

// Python's csv module reads `file` as one header and rows of the header's length; returns
// "rows columns" or a message starting with "bad".
std::string python_csv_shape(const fs::path& file) {
  const std::string script =
      "import csv, sys\n"
      "rows = list(csv.reader(open(sys.argv[1], newline='')))\n"
      "n = len(rows[0]) if rows else 0\n"
      "bad = [i for i, r in enumerate(rows) if len(r) != n]\n"
      "print('bad rows %s' % bad[:5] if bad or len(rows) < 2 else '%d %d' % (len(rows) - 1, n))\n";
  const fs::path py = file.parent_path() / "csv_shape.py";
  std::ofstream(py) << script;
  const auto r = run_process("/usr/bin/python3 " + py.string() + " " + file.string());
  return r.status == 0 ? r.out : "bad: python3 failed";
}

}  // namespace

TEST_CASE("every command x every format x standard output and --output FILE") {
  const Setup setup = make_setup("matrix");
  const bool python = fs::exists("/usr/bin/python3");
  if (!python) WARN("python3 not found: the CSV checks with Python's csv module are skipped");
  for (const Command& c : commands(setup)) {
    for (const std::string& format : FORMATS) {
      INFO(c.name << " --format " << format);
      const fs::path err = setup.dir / (c.name + "-" + format + ".err");
      const auto out = run_process(command_line(c, "--format " + format) + " 2>" + err.string());
      CHECK(out.status == 0);
      CHECK_FALSE(out.out.empty());
      const fs::path file = setup.dir / (c.name + "." + format);
      const auto to_file = run_process(
          command_line(c, "--format " + format + " -o " + file.string() + " 2>" + err.string()));
      CHECK(to_file.status == 0);
      CHECK(to_file.out.empty());
      // The same seed and options: the file holds exactly what standard output got.
      CHECK(read_file(file) == out.out);
      if (format == "json") {
        CHECK_NOTHROW(nlohmann::json::parse(out.out));
        const auto doc = nlohmann::json::parse(out.out);
        CHECK(doc.contains("run"));  // every report records what produced it
      }
      if (format == "csv") {
        // One header line; its provenance columns end every row.
        CHECK(out.out.find(",run_version,") != std::string::npos);
        if (python) {
          const std::string shape = python_csv_shape(file);
          INFO("python csv: " << shape);
          CHECK(shape.rfind("bad", 0) != 0);
        }
      }
      if (format == "table") CHECK(out.out.find("Run: standfast ") != std::string::npos);
    }
  }
  // report writes one HTML page (no --format): to standard output and to a file alike.
  const std::string report = PROGRAM + " report " + SMALL + " --seasons 200 --game-seasons 0 " +
                             "--history " + setup.history.string();
  const fs::path err = setup.dir / "report.err";
  const auto page = run_process(report + " 2>" + err.string());
  CHECK(page.status == 0);
  CHECK(page.out.find("<html") != std::string::npos);
  CHECK(page.out.find("Run: standfast ") != std::string::npos);
  const fs::path html = setup.dir / "page.html";
  CHECK(run_process(report + " -o " + html.string() + " 2>" + err.string()).status == 0);
  CHECK(read_file(html) == page.out);
}

TEST_CASE("the report-writing commands share their option names and help wording") {
  const Setup setup = make_setup("options");
  std::vector<Command> all = commands(setup);
  all.push_back({"report", SMALL, true, true, true});
  for (const Command& c : all) {
    INFO(c.name);
    const auto help = run_process(PROGRAM + " " + c.name + " --help");
    REQUIRE(help.status == 0);
    const std::string& h = help.out;
    if (c.season_file) {
      CHECK(h.find("SEASON_FILE") != std::string::npos);
      CHECK(h.find("The season file (YAML)") != std::string::npos);
    }
    CHECK(h.find("-o,--output") != std::string::npos);
    CHECK(h.find("(default: standard output)") != std::string::npos);
    if (c.name != "report") {
      CHECK(h.find("--format") != std::string::npos);
      CHECK(h.find("(default: table)") != std::string::npos);
    }
    if (c.simulates) {
      CHECK(h.find("--seed") != std::string::npos);
      CHECK(h.find("Random seed, 0 to 2^64 - 1") != std::string::npos);
      CHECK(h.find("Worker threads, 0 to 1024; 0 uses every core (default: 0)") !=
            std::string::npos);
    }
    if (c.seasons) CHECK(h.find("--seasons") != std::string::npos);
    // One help style: defaults as "(default: X)", never "(default X)" or "default = ".
    CHECK(h.find("(default ") == std::string::npos);
    CHECK(h.find("default =") == std::string::npos);
  }
}

TEST_CASE("exit status 2 for bad option values, bad files and unwritable outputs; no file left") {
  const Setup setup = make_setup("failures");
  const fs::path bad_season = setup.dir / "bad.yaml";
  std::ofstream(bad_season) << "standfast: 1\nleague: [unclosed\n";
  const fs::path err = setup.dir / "run.err";
  for (const Command& c : commands(setup)) {
    INFO(c.name);
    const fs::path out = setup.dir / (c.name + "-out.txt");
    const auto status = [&](const std::string& extra) {
      return run_process(command_line(c, extra) + " 2>" + err.string()).status;
    };
    // Bad option values, refused before any work and before any output file is made.
    CHECK(status("--format xml -o " + out.string()) == 2);
    CHECK_FALSE(fs::exists(out));
    CHECK(read_file(err).find("--format") != std::string::npos);
    if (c.seasons) {
      CHECK(status("--seasons -5 -o " + out.string()) == 2);
      CHECK(status("--seasons 0 -o " + out.string()) == 2);
      CHECK(status("--seasons abc -o " + out.string()) == 2);
    }
    if (c.simulates) {
      CHECK(status("--seed -1 -o " + out.string()) == 2);
      CHECK(status("--threads -2 -o " + out.string()) == 2);
    }
    CHECK_FALSE(fs::exists(out));
    // An output in a folder that does not exist: refused, nothing made.
    const fs::path nowhere = setup.dir / "no-such-folder" / "out.txt";
    CHECK(status("-o " + nowhere.string()) == 2);
    CHECK_FALSE(fs::exists(nowhere.parent_path()));
    // An output that is a folder.
    CHECK(status("-o " + setup.dir.string()) == 2);
    if (!c.season_file) continue;
    // A bad season file and a missing one: status 2, the existing output file untouched.
    std::ofstream(out) << "old";
    Command bad = c;
    bad.args.replace(0, SMALL.size(), bad_season.string());
    CHECK(run_process(command_line(bad, "-o " + out.string()) + " 2>" + err.string()).status == 2);
    CHECK(read_file(err).find(bad_season.string() + ":") != std::string::npos);
    Command missing = c;
    missing.args.replace(0, SMALL.size(), (setup.dir / "none.yaml").string());
    CHECK(run_process(command_line(missing, "-o " + out.string()) + " 2>" + err.string()).status ==
          2);
    CHECK(read_file(out) == "old");
    fs::remove(out);
    // The output may not be the season file itself.
    const std::string before = read_file(SMALL);
    CHECK(status("-o " + SMALL) == 2);
    CHECK(read_file(SMALL) == before);
  }
}
