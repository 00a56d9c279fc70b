// libFuzzer target: season files (YAML) through config::load_season_text.
#include <cstddef>
#include <cstdint>

#include "tests/fuzz/fuzz_entry.h"

extern "C" int LLVMFuzzerTestOneInput(const std::uint8_t* data, std::size_t size) {
  standfast::fuzzing::season_input(data, size);
  return 0;
}
