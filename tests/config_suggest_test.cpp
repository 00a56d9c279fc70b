// Tests for config/suggest.h: edit distance and "did you mean" suggestions.
// Ref: python-Levenshtein 0.12.2 (Debian python3-levenshtein 0.12.2-2+b4), an independent C
// implementation of the Levenshtein distance; each value below quotes its call.
#include <catch2/catch.hpp>

#include "config/suggest.h"

using namespace standfast::config;

TEST_CASE("edit distance matches an independent implementation") {
  // Ref: python-Levenshtein 0.12.2; Levenshtein.distance('kitten', 'sitting'); 3
  CHECK(edit_distance("kitten", "sitting") == 3);
  // Ref: python-Levenshtein 0.12.2; Levenshtein.distance('flaw', 'lawn'); 2
  CHECK(edit_distance("flaw", "lawn") == 2);
  // Ref: python-Levenshtein 0.12.2; Levenshtein.distance('saturday', 'sunday'); 3
  CHECK(edit_distance("saturday", "sunday") == 3);
  // Ref: python-Levenshtein 0.12.2; Levenshtein.distance('', 'abc'); 3
  CHECK(edit_distance("", "abc") == 3);
  CHECK(edit_distance("abc", "") == 3);
  // Ref: python-Levenshtein 0.12.2; Levenshtein.distance('run_diferential', 'run_differential'); 1
  CHECK(edit_distance("run_diferential", "run_differential") == 1);
  // Ref: python-Levenshtein 0.12.2; Levenshtein.distance('GUL', 'PIN'); 3
  CHECK(edit_distance("GUL", "PIN") == 3);
  CHECK(edit_distance("same", "same") == 0);
}

TEST_CASE("suggestions are given for likely typos only") {
  const std::vector<std::string> keys = {"innings", "extra_innings", "games_per_team", "name"};
  CHECK(closest_match("innigs", keys) == "innings");
  CHECK(closest_match("INNINGS", keys) == "innings");  // case is ignored
  CHECK(closest_match("games_per_tem", keys) == "games_per_team");
  CHECK_FALSE(closest_match("colour", keys).has_value());
  CHECK_FALSE(closest_match("nme_of_club", keys).has_value());
  CHECK(did_you_mean("nme", keys) == " (did you mean 'name'?)");
  CHECK(did_you_mean("zzzzzz", keys).empty());
  CHECK_FALSE(closest_match(std::string(500, 'x'), keys).has_value());  // junk is not a typo
}

TEST_CASE("a swap of two adjacent characters is one edit in suggestions") {
  // Ref: Damerau (1964), "A technique for computer detection and correction of spelling errors",
  // CACM 7(3): a transposition of adjacent letters is one error; values worked from that
  // definition (optimal string alignment), and the Levenshtein values from python-Levenshtein
  // 0.12.2 Levenshtein.distance('PBE', 'PEB'); 2.
  CHECK(transposition_distance("PBE", "PEB") == 1);
  CHECK(edit_distance("PBE", "PEB") == 2);
  CHECK(transposition_distance("RHS", "RSH") == 1);
  CHECK(transposition_distance("kitten", "sitting") == 3);  // no swap: as Levenshtein
  CHECK(transposition_distance("abcd", "badc") == 2);       // two separate swaps
  CHECK(transposition_distance("", "abc") == 3);
  const std::vector<std::string> ids = {"PEB", "RSH", "GUL"};
  CHECK(closest_match("PBE", ids) == "PEB");
  CHECK(closest_match("RHS", ids) == "RSH");
  CHECK(closest_match("pbe", ids) == "PEB");
}
