// Writing command output whole or not at all: to stdout, or to a file through a temporary file
// in the same folder that is renamed into place only once everything is written.
#ifndef STANDFAST_TOOLS_OUTPUT_H
#define STANDFAST_TOOLS_OUTPUT_H

#include <cstdint>
#include <string>
#include <string_view>

namespace standfast::tools {

// Writes `content` to `path`, or to stdout when `path` is empty or "-". Throws UsageError when
// the file cannot be written; an existing file is then left untouched.
void write_output(const std::string& path, std::string_view content);

// Output formats shared by the commands.
enum class Format { kTable, kCsv, kJson };

// Parses "table", "csv" or "json"; throws UsageError otherwise.
Format parse_format(const std::string& name);

// 1234567 -> "1,234,567", with no locale: the output must not depend on the environment.
std::string group_digits(std::uint64_t n);

// CSV field quoting (RFC 4180): quotes the field when it holds a comma, quote or line break.
std::string csv_field(std::string_view text);

}  // namespace standfast::tools

#endif  // STANDFAST_TOOLS_OUTPUT_H
