// Replays the fuzz corpus (tests/fuzz/corpus/) through the fuzz targets' bodies
// (tests/fuzz/fuzz_entry.h) in the ordinary suite, so every input the fuzzers kept, crashes
// found and fixed included, stays a regression case in every build (and under the sanitizers).
// Reference: the loader's contract (DESIGN.md): any input ends in a season or a ConfigError.
#include <catch2/catch.hpp>
#include <filesystem>
#include <fstream>
#include <sstream>
#include <string>

#include "tests/fuzz/fuzz_entry.h"

namespace fs = std::filesystem;

namespace {

const fs::path CORPUS = fs::path(STANDFAST_SOURCE_DIR) / "tests" / "fuzz" / "corpus";

std::string read_file(const fs::path& p) {
  std::ifstream in(p, std::ios::binary);
  std::ostringstream s;
  s << in.rdbuf();
  return s.str();
}

template <class Entry>
int replay(const fs::path& dir, Entry entry) {
  int n = 0;
  for (const auto& e : fs::directory_iterator(dir)) {
    if (!e.is_regular_file()) continue;
    const std::string text = read_file(e.path());
    INFO("input " << e.path().string());
    CHECK_NOTHROW(entry(reinterpret_cast<const std::uint8_t*>(text.data()), text.size()));
    ++n;
  }
  return n;
}

}  // namespace

TEST_CASE("the season-file corpus replays without an error other than ConfigError") {
  CHECK(replay(CORPUS / "season", standfast::fuzzing::season_input) >= 10);
}

TEST_CASE("the games-CSV corpus replays without an error other than ConfigError") {
  CHECK(replay(CORPUS / "games_csv", standfast::fuzzing::games_csv_input) >= 10);
}
