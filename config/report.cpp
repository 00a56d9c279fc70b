#include "config/report.h"

#include <charconv>
#include <cmath>
#include <cstdio>

namespace standfast::config::detail {

void Report::error(SourcePos pos, std::string message) {
  if (++error_count_ <= MAX_KEPT) errors_.push_back(Diagnostic{std::move(pos), std::move(message)});
}

void Report::warning(SourcePos pos, std::string message) {
  if (++warning_count_ <= MAX_KEPT) {
    warnings_.push_back(Diagnostic{std::move(pos), std::move(message)});
  }
}

std::string quoted(std::string_view text, std::size_t max_shown) {
  std::string out = "'";
  std::size_t shown = 0;
  for (const char ch : text) {
    if (shown == max_shown) {
      out += "...";
      break;
    }
    const auto c = static_cast<unsigned char>(ch);
    if (c < 0x20 || c >= 0x7f) {
      char buf[8];
      std::snprintf(buf, sizeof buf, "\\x%02X", c);
      out += buf;
    } else {
      out += ch;
    }
    ++shown;
  }
  out += "'";
  return out;
}

std::string_view trim(std::string_view text) {
  while (!text.empty() && (text.front() == ' ' || text.front() == '\t')) text.remove_prefix(1);
  while (!text.empty() && (text.back() == ' ' || text.back() == '\t')) text.remove_suffix(1);
  return text;
}

std::optional<long long> parse_integer(std::string_view text) {
  text = trim(text);
  if (!text.empty() && text.front() == '+') text.remove_prefix(1);
  if (text.empty()) return std::nullopt;
  long long value = 0;
  const auto [end, ec] = std::from_chars(text.data(), text.data() + text.size(), value);
  if (ec != std::errc{} || end != text.data() + text.size()) return std::nullopt;
  return value;
}

std::optional<double> parse_real(std::string_view text) {
  text = trim(text);
  std::string lower;
  for (const char c : text) lower += static_cast<char>(c >= 'A' && c <= 'Z' ? c + 32 : c);
  if (lower == ".nan" || lower == "nan") return std::nan("");
  if (lower == ".inf" || lower == "inf" || lower == "+.inf" || lower == "+inf") return INFINITY;
  if (lower == "-.inf" || lower == "-inf") return -INFINITY;
  if (!text.empty() && text.front() == '+') text.remove_prefix(1);
  if (text.empty()) return std::nullopt;
  double value = 0;
  const auto [end, ec] = std::from_chars(text.data(), text.data() + text.size(), value);
  if (ec != std::errc{} || end != text.data() + text.size()) return std::nullopt;
  return value;
}

std::optional<bool> parse_boolean(std::string_view text) {
  text = trim(text);
  for (const std::string_view t : {"true", "True", "TRUE", "yes", "Yes", "YES", "on", "On", "ON"}) {
    if (text == t) return true;
  }
  for (const std::string_view f :
       {"false", "False", "FALSE", "no", "No", "NO", "off", "Off", "OFF"}) {
    if (text == f) return false;
  }
  return std::nullopt;
}

std::string not_integer_message(std::string_view text) {
  const auto real = parse_real(text);
  if (real && std::isnan(*real)) return "must be a whole number, got nan";
  if (real && *real == std::floor(*real)) {
    return "must be a whole number within range, got " + std::string(trim(text));
  }
  if (real) return "must be a whole number, got " + std::string(trim(text));
  if (trim(text).empty()) return "must be a whole number, got nothing";
  return "must be a whole number, got " + quoted(text);
}

}  // namespace standfast::config::detail
