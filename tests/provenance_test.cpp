// Tests of tools/provenance.h: the SHA-256 of the input files, the default as-of date and the
// provenance in table, CSV and JSON form.
// References: NIST FIPS 180-2 (2002), Appendix B.1 (SHA-256 of "abc"); the SHA-256 of the empty
// message as printed by GNU coreutils 9.1 `printf '' | sha256sum`; `sha256sum FILE` run by the
// test on a scenario file.
#include "tools/provenance.h"

#include <catch2/catch.hpp>
#include <string>

#include "config/load.h"
#include "tests/process_support.h"

using namespace standfast;

namespace {
const std::string SMALL = STANDFAST_SOURCE_DIR "/scenarios/small/season.yaml";
const std::string DEMO = STANDFAST_SOURCE_DIR "/scenarios/demo/season.yaml";

std::size_t count_commas(const std::string& s) {
  std::size_t n = 0;
  for (char c : s) n += c == ',' ? 1 : 0;
  return n;
}
}  // namespace

TEST_CASE("SHA-256 of known messages") {
  // Ref: NIST FIPS 180-2 (2002), Appendix B.1, message "abc";
  // ba7816bf 8f01cfea 414140de 5dae2223 b00361a3 96177a9c b410ff61 f20015ad
  CHECK(tools::sha256_hex("abc") ==
        "ba7816bf8f01cfea414140de5dae2223b00361a396177a9cb410ff61f20015ad");
  // Ref: GNU coreutils 9.1, `printf '' | sha256sum`;
  // e3b0c44298fc1c149afbf4c8996fb92427ae41e4649b934ca495991b7852b855
  CHECK(tools::sha256_hex("") ==
        "e3b0c44298fc1c149afbf4c8996fb92427ae41e4649b934ca495991b7852b855");
}

TEST_CASE("SHA-256 of a file agrees with sha256sum") {
  // Ref: GNU coreutils `sha256sum FILE` (first 64 characters of its output).
  const std::string expected = testing::run_command("sha256sum " + SMALL).substr(0, 64);
  REQUIRE(expected.size() == 64);
  CHECK(tools::sha256_file(SMALL) == expected);
  CHECK(tools::sha256_file(STANDFAST_SOURCE_DIR "/no/such/file").empty());
}

TEST_CASE("provenance of a season: files, hashes and the default as-of date") {
  const config::Season season = config::load_season(DEMO);
  const tools::Provenance p = tools::make_provenance(season);
  CHECK(p.season_file == DEMO);
  CHECK(p.season_sha256.size() == 64);
  REQUIRE_FALSE(p.games_file.empty());
  // Ref: GNU coreutils `sha256sum FILE` on the games file the season names.
  CHECK(p.games_sha256 == testing::run_command("sha256sum " + p.games_file).substr(0, 64));
  // The default as-of date is the day after the last played game.
  config::DayNumber last = 0;
  for (const auto& g : season.games) {
    if (g.played && g.date && *g.date > last) last = *g.date;
  }
  REQUIRE(p.as_of.has_value());
  CHECK(*p.as_of == last + 1);
  CHECK_FALSE(p.family.has_value());
  CHECK_FALSE(p.seed.has_value());
}

TEST_CASE("no played game: the as-of date is the first game's; the CSV cells match the header") {
  const config::Season season = config::load_season_text(
      "standfast: 1\n"
      "league: {name: L, season: S}\n"
      "teams: [{id: A, name: A}, {id: B, name: B}]\n"
      "groups: [{id: c, teams: [A, B]}]\n"
      "games: [{date: 2040-05-01, home: A, away: B}]\n",
      "inline.yaml");
  tools::Provenance p = tools::make_provenance(season);
  REQUIRE(p.as_of.has_value());  // config::default_as_of: the earliest dated game
  CHECK(config::format_date(*p.as_of) == "2040-05-01");
  CHECK(p.season_sha256.empty());  // the file does not exist on disk
  tools::set_model(p, season, 1.8);
  p.seed = 7;
  p.seasons = 1000;
  CHECK(count_commas(tools::provenance_csv_header()) ==
        count_commas(tools::provenance_csv_cells(p)));
  const auto j = tools::provenance_json(p);
  CHECK(j["as_of"] == "2040-05-01");
  CHECK(j["family"] == "weibull");
  CHECK(j["shape_source"] == "default");  // no game played
  CHECK(j["seed"] == 7);
  CHECK(j["seasons"] == 1000);
  const std::string line = tools::provenance_line(p);
  CHECK(line.find("model weibull, shape 1.800 (default)") != std::string::npos);
  CHECK(line.find("seed 7; 1,000 seasons") != std::string::npos);
  CHECK(line.find("as of 2040-05-01") != std::string::npos);

  // A shape fixed in the file is "fixed"; Poisson and log5 have no shape.
  config::Season fixed = season;
  fixed.model.shape = 2.0;
  tools::set_model(p, fixed, 2.0);
  CHECK(p.shape_source == "fixed");
  config::Season poisson = season;
  poisson.model.family = config::ScoreFamily::kPoisson;
  tools::set_model(p, poisson, 1.8);
  CHECK_FALSE(p.shape.has_value());
  CHECK(p.shape_source.empty());
}
