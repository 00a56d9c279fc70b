// The complete season-file example in README.md must load without errors or warnings, so the
// documentation cannot drift from the reader.
#include <catch2/catch.hpp>
#include <fstream>
#include <sstream>
#include <string>

#include "config/load.h"

TEST_CASE("the README's complete season-file example loads cleanly") {
  std::ifstream in(STANDFAST_SOURCE_DIR "/README.md");
  REQUIRE(in);
  std::stringstream buffer;
  buffer << in.rdbuf();
  const std::string text = buffer.str();
  const std::string marker = "<!-- example: complete season file -->";
  const auto at = text.find(marker);
  REQUIRE(at != std::string::npos);
  const auto open = text.find("```yaml\n", at);
  REQUIRE(open != std::string::npos);
  const auto body = open + 8;
  const auto close = text.find("\n```", body);
  REQUIRE(close != std::string::npos);
  const std::string yaml = text.substr(body, close - body + 1);

  const auto season = standfast::config::load_season_text(yaml, STANDFAST_SOURCE_DIR "/README.md");
  CHECK(season.teams.size() == 4);
  CHECK(season.divisions.size() == 2);
  CHECK(season.games.size() == 12);
  CHECK(season.postseason.enabled);
  CHECK(season.overrides.size() == 1);
  CHECK(season.warnings.empty());
}
