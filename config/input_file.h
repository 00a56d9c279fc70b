// Reading an input file (a season file, a games CSV) safely: regular files only, a size limit,
// and text checks (no NUL or control bytes, valid UTF-8) that name the line and column.
#ifndef STANDFAST_CONFIG_INPUT_FILE_H
#define STANDFAST_CONFIG_INPUT_FILE_H

#include <cstdint>
#include <optional>
#include <string>
#include <string_view>

#include "config/season.h"

namespace standfast::config {

// The largest input file read (season file or games file): 64 MiB, about a hundred times the
// inline schedule of a thousand-club league. Larger files are refused before they are read.
inline constexpr std::uint64_t MAX_INPUT_BYTES = std::uint64_t{64} << 20;

// Reads a whole regular file of at most `max_bytes`. Returns nullopt and sets `why` (for
// example "is a FIFO, not a regular file") when it cannot. Never blocks on a FIFO or a device
// and never reads more than max_bytes + 1 bytes.
std::optional<std::string> read_input_file(const std::string& path, std::string& why,
                                           std::uint64_t max_bytes = MAX_INPUT_BYTES);

// The first byte of `text` that a text input may not hold: a NUL or other control byte (tab,
// line feed and carriage return are allowed) or a byte that is not part of valid UTF-8. Its
// position is 1-based line and column (the column counts bytes). nullopt when the text is clean.
std::optional<Diagnostic> check_text(std::string_view text, const std::string& file);

}  // namespace standfast::config

#endif  // STANDFAST_CONFIG_INPUT_FILE_H
