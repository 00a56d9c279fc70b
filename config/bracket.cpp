#include "config/bracket.h"

namespace standfast::config {

int exact_log2(int n) {
  if (n < 1) return -1;
  int k = 0;
  while (n > 1) {
    if (n % 2 != 0) return -1;
    n /= 2;
    ++k;
  }
  return k;
}

int bracket_rounds(int field, int byes) {
  if (field < 1 || byes < 0) return -1;
  if (field == 1) return byes == 0 ? 0 : -1;
  if (byes >= field) return -1;
  const int first_round = field - byes;
  if (first_round % 2 != 0) return -1;
  const int after = exact_log2(first_round / 2 + byes);
  return after < 0 ? -1 : 1 + after;
}

}  // namespace standfast::config
