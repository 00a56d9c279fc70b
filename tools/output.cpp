#include "tools/output.h"

#include <fmt/core.h>
#include <unistd.h>

#include <cerrno>
#include <cstdio>
#include <cstring>
#include <filesystem>
#include <fstream>

#include "tools/commands.h"

namespace standfast::tools {

std::string group_digits(std::uint64_t n) {
  const std::string digits = fmt::format("{}", n);
  std::string out;
  const std::size_t len = digits.size();
  for (std::size_t i = 0; i < len; ++i) {
    if (i > 0 && (len - i) % 3 == 0) out += ',';
    out += digits[i];
  }
  return out;
}

void write_output(const std::string& path, std::string_view content) {
  if (path.empty() || path == "-") {
    std::fwrite(content.data(), 1, content.size(), stdout);
    std::fflush(stdout);
    return;
  }
  namespace fs = std::filesystem;
  const fs::path target{path};
  const fs::path temp =
      target.parent_path() / fmt::format(".{}.tmp{}", target.filename().string(), ::getpid());
  {
    std::ofstream out(temp, std::ios::binary | std::ios::trunc);
    if (!out) {
      throw UsageError(fmt::format("{}: cannot write: {}", path, std::strerror(errno)));
    }
    out.write(content.data(), static_cast<std::streamsize>(content.size()));
    out.flush();
    if (!out) {
      std::error_code ignored;
      fs::remove(temp, ignored);
      throw UsageError(fmt::format("{}: write failed", path));
    }
  }
  std::error_code ec;
  fs::rename(temp, target, ec);
  if (ec) {
    std::error_code ignored;
    fs::remove(temp, ignored);
    throw UsageError(fmt::format("{}: cannot write: {}", path, ec.message()));
  }
}

Format parse_format(const std::string& name) {
  if (name == "table") return Format::kTable;
  if (name == "csv") return Format::kCsv;
  if (name == "json") return Format::kJson;
  throw UsageError(fmt::format("--format: expected table, csv or json, got '{}'", name));
}

std::string csv_field(std::string_view text) {
  if (text.find_first_of(",\"\r\n") == std::string_view::npos) return std::string{text};
  std::string out = "\"";
  for (char c : text) {
    if (c == '"') out += '"';
    out += c;
  }
  out += '"';
  return out;
}

}  // namespace standfast::tools
