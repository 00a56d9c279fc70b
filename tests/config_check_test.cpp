// Tests for the `standfast check` command (tools/cmd_check.cpp): runs the built program on
// fixture files and checks its exit status, its messages and that it writes no file.
#include <sys/wait.h>
#include <unistd.h>

#include <catch2/catch.hpp>
#include <cstdlib>
#include <filesystem>
#include <fstream>
#include <sstream>
#include <string>

namespace fs = std::filesystem;
using Catch::Matchers::Contains;

namespace {

const std::string BINARY = STANDFAST_BINARY_DIR "/tools/standfast";
const std::string DATA = STANDFAST_TEST_DATA "/config";

struct Run {
  int status = -1;
  std::string out;
  std::string err;
  bool wrote_files = false;  // anything left in the (empty) working directory
};

std::string slurp(const fs::path& p) {
  std::ifstream in(p);
  std::stringstream s;
  s << in.rdbuf();
  return s.str();
}

// Runs `standfast check FILE` in an empty temporary directory.
Run check(const std::string& file) {
  const fs::path base = fs::temp_directory_path() / ("standfast_check_" + std::to_string(getpid()));
  const fs::path work = base / "work";
  fs::remove_all(base);
  fs::create_directories(work);
  const std::string cmd = "cd '" + work.string() + "' && '" + BINARY + "' check '" + file + "' >'" +
                          (base / "out").string() + "' 2>'" + (base / "err").string() + "'";
  Run r;
  const int raw = std::system(cmd.c_str());
  r.status = WIFEXITED(raw) ? WEXITSTATUS(raw) : -1;
  r.out = slurp(base / "out");
  r.err = slurp(base / "err");
  r.wrote_files = !fs::is_empty(work);
  fs::remove_all(base);
  return r;
}

}  // namespace

TEST_CASE("check exits 2 on a bad file and names file and line") {
  const Run r = check(DATA + "/bad/tied_score.yaml");
  CHECK(r.status == 2);
  CHECK_THAT(r.err, Contains(DATA + "/bad/tied_score.yaml:14:"));
  CHECK_THAT(r.err, Contains("a played game cannot end tied (3-3)"));
  CHECK(r.out.empty());
  CHECK_FALSE(r.wrote_files);
}

TEST_CASE("check exits 2 on a missing file and on binary junk") {
  Run r = check(DATA + "/bad/no-such-file.yaml");
  CHECK(r.status == 2);
  CHECK_THAT(r.err, Contains("no-such-file.yaml: cannot read the season file"));
  r = check(DATA + "/bad/junk.yaml");
  CHECK(r.status == 2);
  CHECK_THAT(r.err, Contains(DATA + "/bad/junk.yaml:"));
}

TEST_CASE("check prints a summary of a valid file and exits 0") {
  const Run r = check(DATA + "/valid/season.yaml");
  CHECK(r.status == 0);
  CHECK(r.err.empty());
  CHECK_THAT(r.out, Contains("Tidewater Circuit, Year 3"));
  CHECK_THAT(r.out, Contains("Teams: 12 in 2 conferences and 4 divisions"));
  CHECK_THAT(r.out, Contains("Coast Division (north-coast): 3 teams"));
  CHECK_THAT(r.out, Contains("Games: 9 (4 played, 5 remaining, of which 3 postponed)"));
  CHECK_THAT(r.out, Contains("Postseason: 8 teams, conference brackets"));
  CHECK_THAT(r.out, Contains("Rounds: Semifinal (best of 3), Conference final (best of 5), Final"));
  CHECK_THAT(r.out, Contains("head-to-head, run differential, last games (10 within conference)"));
  CHECK_THAT(r.out, Contains("Model: weibull"));
  CHECK_FALSE(r.wrote_files);
}

TEST_CASE("check prints warnings on stderr with file and line and still exits 0") {
  const Run r = check(DATA + "/valid/short_schedule.yaml");
  CHECK(r.status == 0);
  CHECK_THAT(r.err, Contains(DATA + "/valid/short_schedule.yaml:3:"));
  CHECK_THAT(r.err, Contains("warning: league.games_per_team is 3 but 2 of 2 teams"));
  CHECK_THAT(r.out, Contains("OK with 1 warning"));
}

TEST_CASE("check says what the engine does with family log5: nothing fitted, home odds x H^g") {
  const Run r = check(DATA + "/valid/log5.yaml");
  CHECK(r.status == 0);
  CHECK_THAT(r.out, Contains("Model: log5 (win percentages from the win_pct overrides; no scores, "
                             "no innings, nothing fitted, strengths not drawn)"));
  // Ref: closed form, 1.04^1.83 = exp(1.83 ln 1.04) = 1.0744124 (python3 -c 'print(1.04**1.83)':
  // 1.0744123974...); the shape is the engine's default exponent 1.83 (engine/plan.h).
  CHECK_THAT(r.out, Contains("home odds multiplied by home edge 1.04 (fixed) raised to the shape "
                             "1.83 (default) = 1.074"));
  CHECK_THAT(r.out, !Contains("fitted;"));
}
