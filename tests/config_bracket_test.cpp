// Tests for config/bracket.h: rounds needed by a knockout bracket with byes.
// Ref: common practice (single-elimination arithmetic): each round halves the teams still in,
// so a field of 2^k with no byes needs k rounds; with B byes the first round is played by N - B
// teams and the (N - B)/2 + B left must be a power of two.
#include <catch2/catch.hpp>

#include "config/bracket.h"

using namespace standfast::config;

TEST_CASE("powers of two need log2 rounds") {
  CHECK(bracket_rounds(1, 0) == 0);
  CHECK(bracket_rounds(2, 0) == 1);
  CHECK(bracket_rounds(4, 0) == 2);
  CHECK(bracket_rounds(8, 0) == 3);
  CHECK(bracket_rounds(16, 0) == 4);
}

TEST_CASE("byes let other fields reduce to one") {
  CHECK(bracket_rounds(6, 2) == 3);   // 4 play, 2 + 2 = 4 left
  CHECK(bracket_rounds(12, 4) == 4);  // 8 play, 4 + 4 = 8 left
  CHECK(bracket_rounds(3, 1) == 2);   // 2 play, 1 + 1 = 2 left
  CHECK(bracket_rounds(5, 3) == 3);   // 2 play, 1 + 3 = 4 left
  CHECK(bracket_rounds(10, 6) == 4);  // 4 play, 2 + 6 = 8 left
}

TEST_CASE("fields that cannot reduce are refused") {
  CHECK(bracket_rounds(3, 0) == -1);  // odd first round
  CHECK(bracket_rounds(6, 0) == -1);  // 3 left
  CHECK(bracket_rounds(4, 2) == -1);  // 1 + 2 = 3 left
  CHECK(bracket_rounds(6, 1) == -1);  // 5 play: odd
  CHECK(bracket_rounds(4, 4) == -1);  // no first round at all
  CHECK(bracket_rounds(4, 5) == -1);
  CHECK(bracket_rounds(0, 0) == -1);
  CHECK(bracket_rounds(1, 1) == -1);
}

TEST_CASE("exact_log2 accepts powers of two only") {
  CHECK(exact_log2(1) == 0);
  CHECK(exact_log2(2) == 1);
  CHECK(exact_log2(1024) == 10);
  CHECK(exact_log2(3) == -1);
  CHECK(exact_log2(0) == -1);
  CHECK(exact_log2(-4) == -1);
}
