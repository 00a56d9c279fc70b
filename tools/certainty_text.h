// How the exact certainty (engine/certainty.h) reads in reports: the status words and the
// compact "magic / elimination" cell shared by `standings` and `odds`.
#ifndef STANDFAST_TOOLS_CERTAINTY_TEXT_H
#define STANDFAST_TOOLS_CERTAINTY_TEXT_H

#include <string>

#include "engine/certainty.h"

namespace standfast::tools {

// "clinched", "eliminated", or "" while open.
const char* certainty_word(engine::Certainty c);

// The table cell of one outcome: "M/E" with the magic number M and the elimination number E,
// "-" for a number that does not exist (the team's own results cannot decide it alone), "?"
// for one not computed (a search stopped at its work limit, OutcomeCertainty::exact false). A
// decided outcome gives its word ("clinched", "eliminated") when `words` is set, else "".
std::string magic_cell(const engine::OutcomeCertainty& c, bool words);

// A number for CSV: "" when it does not exist (-1).
std::string number_field(int n);

}  // namespace standfast::tools

#endif  // STANDFAST_TOOLS_CERTAINTY_TEXT_H
