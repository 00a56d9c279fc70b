// Tests for config/season.h: dates and team look-up.
#include "config/season.h"

#include <catch2/catch.hpp>

using namespace standfast::config;

TEST_CASE("dates convert to day numbers and back") {
  // Ref: python3 datetime; date(2000,1,1).toordinal() - date(1970,1,1).toordinal() = 10957
  REQUIRE(parse_date("2000-01-01") == 10957);
  // Ref: python3 datetime; date(2031,7,1).toordinal() - date(1970,1,1).toordinal() = 22461
  REQUIRE(parse_date("2031-07-01") == 22461);
  REQUIRE(format_date(22461) == "2031-07-01");
  REQUIRE(parse_date("1970-01-01") == 0);
}

TEST_CASE("impossible or malformed dates are refused") {
  REQUIRE_FALSE(parse_date("2031-02-29"));  // not a leap year (common practice: Gregorian rule)
  REQUIRE(parse_date("2032-02-29"));
  REQUIRE_FALSE(parse_date("2031-13-01"));
  REQUIRE_FALSE(parse_date("2031-4-01"));
  REQUIRE_FALSE(parse_date("tbd"));
  REQUIRE_FALSE(parse_date("2031-04-0x"));
}

TEST_CASE("team_index finds ids") {
  Season s;
  s.teams.resize(2);
  s.teams[0].id = "AAA";
  s.teams[1].id = "BBB";
  REQUIRE(s.team_index("BBB") == 1);
  REQUIRE(s.team_index("CCC") == -1);
}
