// libFuzzer target: games CSV files through the CSV reader of config/games_csv.h.
#include <cstddef>
#include <cstdint>

#include "tests/fuzz/fuzz_entry.h"

extern "C" int LLVMFuzzerTestOneInput(const std::uint8_t* data, std::size_t size) {
  standfast::fuzzing::games_csv_input(data, size);
  return 0;
}
