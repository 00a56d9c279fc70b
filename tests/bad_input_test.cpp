// The bad-input suite: malformed season files, games files and option sets run through the
// built program. Each case of tests/data/bad_input/cases.txt names its exit status and a line
// that standard error must hold exactly (file:line:column and the message); the cases in this
// file need bytes or file types a text manifest cannot hold (NUL, non-UTF-8, FIFOs, devices,
// huge files). Every run is bounded: `timeout` ends it after RUN_SECONDS (a bound, never a
// speed assertion: a case that hits it fails with status 124) and `ulimit -v` caps its memory
// at 4 GiB (left off under AddressSanitizer, which reserves more address space; the sanitizer
// CI sets STANDFAST_TEST_NO_ULIMIT). No case may end in "internal error" or a signal.
// References: the exit statuses and the FILE:LINE:COLUMN form are the program's contract
// (DESIGN.md, STYLE.md); UTF-8 validity: RFC 3629, section 4 (syntax of UTF-8 byte sequences);
// YAML 1.2 (2009) section 5.1 for the characters a YAML stream may hold.
#include <sys/stat.h>
#include <unistd.h>

#include <catch2/catch.hpp>
#include <cstdlib>
#include <filesystem>
#include <fstream>
#include <sstream>
#include <string>
#include <vector>

#include "tests/process_support.h"

namespace fs = std::filesystem;

namespace {

const std::string PROGRAM = STANDFAST_BINARY_DIR "/tools/standfast";
const std::string DATA = STANDFAST_TEST_DATA "/bad_input";
const std::string SMALL = STANDFAST_SOURCE_DIR "/scenarios/small/season.yaml";
constexpr int RUN_SECONDS = 120;

struct Outcome {
  int status = -1;
  std::string err;  // standard error
};

// Runs the program with `args` (shell words) under the time and memory bounds.
Outcome run(const std::string& args) {
  const bool limit = std::getenv("STANDFAST_TEST_NO_ULIMIT") == nullptr;
  std::string cmd = "(";
  if (limit) cmd += "ulimit -v 4194304; ";
  cmd += "exec timeout -k 5 " + std::to_string(RUN_SECONDS) + " " + PROGRAM + " " + args;
  cmd += ") 2>&1 >/dev/null";
  const auto r = standfast::testing::run_process(cmd);
  return Outcome{r.status, r.out};
}

bool has_line(const std::string& text, const std::string& line) {
  std::istringstream in(text);
  for (std::string l; std::getline(in, l);) {
    if (l == line) return true;
  }
  return false;
}

std::string read_file(const fs::path& p) {
  std::ifstream in(p, std::ios::binary);
  std::ostringstream s;
  s << in.rdbuf();
  return s.str();
}

void write_file(const fs::path& p, const std::string& text) {
  std::ofstream out(p, std::ios::binary | std::ios::trunc);
  out << text;
}

fs::path fresh_dir(const std::string& name) {
  const fs::path dir = fs::path(STANDFAST_BINARY_DIR) / "bad_input_test" / name;
  fs::remove_all(dir);
  fs::create_directories(dir);
  return dir;
}

std::string replace_all(std::string s, const std::string& from, const std::string& to) {
  for (std::size_t at = 0; (at = s.find(from, at)) != std::string::npos; at += to.size()) {
    s.replace(at, from.size(), to);
  }
  return s;
}

std::string trim(const std::string& s) {
  const auto b = s.find_first_not_of(" \t");
  if (b == std::string::npos) return "";
  return s.substr(b, s.find_last_not_of(" \t") - b + 1);
}

// Checks one run: its status, the expected line (when given), and never an internal error.
void expect(const Outcome& o, int status, const std::string& line) {
  INFO("standard error:\n" << o.err);
  CHECK(o.status == status);
  if (!line.empty()) CHECK(has_line(o.err, line));
  CHECK(o.err.find("internal error") == std::string::npos);
}

// A season file: the suite's base league with these lines appended.
fs::path season_with(const fs::path& dir, const std::string& name, const std::string& extra) {
  const fs::path p = dir / name;
  write_file(p, read_file(DATA + "/base.yaml") + extra);
  return p;
}

}  // namespace

TEST_CASE("every case of the bad-input manifest") {
  // Lines: STATUS | ARGUMENTS | EXPECTED LINE OF STANDARD ERROR. {d} is tests/data/bad_input.
  // `csv NAME` runs `check` on the base league with games_file: {d}/games/NAME.csv ({y} is that
  // season file).
  const fs::path dir = fresh_dir("manifest");
  std::ifstream in(DATA + "/cases.txt");
  REQUIRE(in);
  int cases = 0;
  for (std::string line; std::getline(in, line);) {
    line = trim(line);
    if (line.empty() || line[0] == '#') continue;
    if (line.back() == '|') line = trim(line.substr(0, line.size() - 1));  // no expected line
    const auto bar1 = line.find(" | ");
    const auto bar2 = line.find(" | ", bar1 + 3);
    REQUIRE(bar1 != std::string::npos);
    const int status = std::stoi(line.substr(0, bar1));
    std::string args = trim(
        line.substr(bar1 + 3, bar2 == std::string::npos ? std::string::npos : bar2 - bar1 - 3));
    std::string want = bar2 == std::string::npos ? "" : trim(line.substr(bar2 + 3));
    args = replace_all(args, "{d}", DATA);
    want = replace_all(want, "{d}", DATA);
    if (args.rfind("csv ", 0) == 0) {
      const std::string name = trim(args.substr(4));
      const fs::path yaml =
          season_with(dir, name + ".yaml", "games_file: " + DATA + "/games/" + name + ".csv\n");
      args = "check " + yaml.string();
      want = replace_all(want, "{y}", yaml.string());
    }
    INFO("case: " << line);
    expect(run(args), status, want);
    ++cases;
  }
  CHECK(cases >= 80);
}

TEST_CASE("bytes that are not text are refused at load with their position") {
  const fs::path dir = fresh_dir("bytes");
  const std::string base = read_file(DATA + "/base.yaml");
  const auto at_team = [&](const std::string& name, const std::string& text) {
    const fs::path p = dir / name;
    write_file(p, replace_all(base, "name: Belford Hares", "name: " + text));
    return p.string();
  };
  // Line 6 of base.yaml holds "  - {id: BEL, name: Belford Hares}"; the name starts at col 21.
  expect(
      run("check " + at_team("nul.yaml", std::string("Bel\0ford", 8))), 2,
      dir.string() + "/nul.yaml:6:24: a NUL byte (\\x00): the file must be text, not binary data");
  // Ref: RFC 3629 section 4: 0xE9 followed by ASCII is not a UTF-8 sequence (Latin-1 e-acute).
  expect(run("check " + at_team("latin1.yaml", "Belf\xE9rd")), 2,
         dir.string() +
             "/latin1.yaml:6:25: byte \\xE9 is not valid UTF-8: save the file as UTF-8 text");
  // Ref: RFC 3629 section 3: C0 80 is an overlong form of U+0000 and must be rejected.
  expect(run("check " + at_team("overlong.yaml", "Bel\xC0\x80")), 2,
         dir.string() +
             "/overlong.yaml:6:24: byte \\xC0 is not valid UTF-8: save the file as UTF-8 text");
  // Ref: RFC 3629 section 3: ED A0 80 encodes the surrogate U+D800 and must be rejected.
  expect(run("check " + at_team("surrogate.yaml", "Bel\xED\xA0\x80")), 2,
         dir.string() +
             "/surrogate.yaml:6:24: byte \\xED is not valid UTF-8: save the file as UTF-8 text");
  // Ref: YAML 1.2 section 5.1: C0 control characters other than tab, LF and CR are not printable.
  expect(run("check " + at_team("control.yaml",
                                "Bel\x07"
                                "ford")),
         2,
         dir.string() +
             "/control.yaml:6:24: control character \\x07 is not allowed in the text (only tab and "
             "line breaks)");
  // Valid UTF-8 passes and is carried through: a name with accents and a CJK character.
  const auto good = at_team("utf8.yaml", "B\xC3\xA9lford \xE6\xB2\xB3");
  expect(run("check " + good), 0, "");
  expect(run("standings " + good + " --format json"), 0, "");
  // The games CSV gets the same check.
  write_file(dir / "games.csv", "date,home,away\n2040-05-03,ASH,C" + std::string(1, '\0') + "R\n");
  const auto with_csv = season_with(dir, "csv.yaml", "games_file: games.csv\n");
  expect(
      run("check " + with_csv.string()), 2,
      dir.string() + "/games.csv:2:17: a NUL byte (\\x00): the file must be text, not binary data");
}

TEST_CASE("inputs that are not regular files, or too large, are refused without reading them") {
  const fs::path dir = fresh_dir("files");
  const std::string fifo = (dir / "season.fifo").string();
  REQUIRE(::mkfifo(fifo.c_str(), 0600) == 0);
  expect(run("check " + fifo), 2,
         fifo + ": cannot read the season file: is a FIFO (named pipe), not a regular file");
  expect(run("check /dev/zero"), 2,
         "/dev/zero: cannot read the season file: is a character device, not a regular file");
  expect(run("check " + dir.string()), 2,
         dir.string() + ": cannot read the season file: is a directory, not a regular file");
  expect(
      run("check " + (dir / "absent.yaml").string()), 2,
      (dir / "absent.yaml").string() + ": cannot read the season file: No such file or directory");
  // A sparse file of 1 GiB: refused by its size before a byte is read.
  const fs::path huge = dir / "huge.yaml";
  write_file(huge, "standfast: 1\n");
  fs::resize_file(huge, std::uintmax_t{1} << 30);
  expect(run("check " + huge.string()), 2,
         huge.string() +
             ": cannot read the season file: is 1073741824 bytes, more than the limit of 67108864 "
             "bytes");
  // A games file that is a FIFO with no writer: refused at once, never waited on.
  const std::string csv_fifo = (dir / "games.fifo").string();
  REQUIRE(::mkfifo(csv_fifo.c_str(), 0600) == 0);
  const auto season = season_with(dir, "fifo_games.yaml", "games_file: games.fifo\n");
  expect(run("check " + season.string()), 2,
         season.string() + ":17:13: games_file: cannot read '" + csv_fifo +
             "': is a FIFO (named pipe), not a regular file");
}
