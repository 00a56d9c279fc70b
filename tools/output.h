// Writing command output whole or not at all: to stdout, or to a file through a temporary file
// in the same folder that is renamed into place only once everything is written and on disk.
#ifndef STANDFAST_TOOLS_OUTPUT_H
#define STANDFAST_TOOLS_OUTPUT_H

#include <cstdint>
#include <functional>
#include <string>
#include <string_view>
#include <vector>

namespace standfast::tools {

// Writes `content` to `path`, or to stdout when `path` is empty or "-". Throws UsageError when
// it cannot (a full disk or standard output included); an existing file is then left untouched.
// A file is written through a temporary file created in the target's folder with an
// unpredictable name (mkstemp: exclusive creation, never through a link), given the target's
// mode (or the default mode under the umask for a new file), flushed to disk (fsync) and renamed
// over the target; SIGINT, SIGTERM or SIGHUP during the write remove the temporary file.
// Symbolic links and anything but a regular file are refused as targets.
void write_output(const std::string& path, std::string_view content);

// Checks, before any work is done, that `path` (empty or "-": standard output) can take the
// output: it must not be a symbolic link, a directory or a device, nor the same file (device and
// inode) as any of `inputs`, and its folder must exist and be writable. Throws UsageError naming
// the path and the problem.
void check_output_target(const std::string& path, const std::vector<std::string>& inputs = {});

namespace detail {
// write_output for a file, calling `before_rename` (a test hook) once the temporary file is
// written and flushed, just before it is renamed into place.
void write_file(const std::string& path, std::string_view content,
                const std::function<void()>& before_rename);
}  // namespace detail

// Output formats shared by the commands.
enum class Format { kTable, kCsv, kJson };

// Writes `report` to `path` (write_output) in `format`, by the writer of that format.
template <class Report>
void write_report(const std::string& path, Format format, const Report& report,
                  std::string (*table)(const Report&), std::string (*csv)(const Report&),
                  std::string (*json)(const Report&)) {
  write_output(path, format == Format::kTable ? table(report)
                     : format == Format::kCsv ? csv(report)
                                              : json(report));
}

// Parses "table", "csv" or "json"; throws UsageError otherwise.
Format parse_format(const std::string& name);

// 1234567 -> "1,234,567", with no locale: the output must not depend on the environment.
std::string group_digits(std::uint64_t n);

// CSV field quoting (RFC 4180): quotes the field when it holds a comma, quote or line break.
std::string csv_field(std::string_view text);

}  // namespace standfast::tools

#endif  // STANDFAST_TOOLS_OUTPUT_H
