#include "tools/certainty_text.h"

#include <fmt/core.h>

namespace standfast::tools {

const char* certainty_word(engine::Certainty c) {
  switch (c) {
    case engine::Certainty::kClinched:
      return "clinched";
    case engine::Certainty::kEliminated:
      return "eliminated";
    case engine::Certainty::kOpen:
      break;
  }
  return "";
}

std::string magic_cell(const engine::OutcomeCertainty& c, bool words) {
  if (c.mark != engine::Certainty::kOpen) return words ? certainty_word(c.mark) : "";
  // "?": not computed (a search stopped at its work limit); "-": the number does not exist.
  auto part = [&](int n) {
    return n >= 0 ? fmt::format("{}", n) : std::string(c.exact ? "-" : "?");
  };
  return part(c.magic) + "/" + part(c.elimination);
}

std::string number_field(int n) { return n < 0 ? std::string() : fmt::format("{}", n); }

}  // namespace standfast::tools
