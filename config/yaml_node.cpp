#include "config/yaml_node.h"

#include <charconv>
#include <cmath>

#include "config/suggest.h"

namespace standfast::config::detail {

std::string show_number(double x) {
  if (std::isnan(x)) return "nan";
  if (std::isinf(x)) return x > 0 ? "inf" : "-inf";
  char buf[64];
  const auto [end, ec] = std::to_chars(buf, buf + sizeof buf, x);
  return ec == std::errc{} ? std::string(buf, end) : std::string("?");
}

std::string describe(const YAML::Node& n) {
  switch (n.Type()) {
    case YAML::NodeType::Sequence:
      return "a list";
    case YAML::NodeType::Map:
      return "a map";
    case YAML::NodeType::Scalar:
      return quoted(n.Scalar());
    default:
      return "nothing";
  }
}

SourcePos YamlContext::pos(const YAML::Node& n) const {
  SourcePos p{file_, 0, 0};
  if (!n.IsDefined()) return p;
  const YAML::Mark m = n.Mark();
  if (!m.is_null() && m.line >= 0) {
    p.line = m.line + 1;
    p.column = m.column + 1;
  }
  return p;
}

std::optional<std::string> YamlContext::text(const YAML::Node& n, const std::string& path) {
  if (!n.IsScalar() || n.Scalar().empty()) {
    error(n, path + ": must be a text value, got " + describe(n));
    return std::nullopt;
  }
  return n.Scalar();
}

std::optional<int> YamlContext::integer(const YAML::Node& n, const std::string& path, int min,
                                        int max) {
  if (!n.IsScalar()) {
    error(n, path + ": must be a whole number, got " + describe(n));
    return std::nullopt;
  }
  const auto v = parse_integer(n.Scalar());
  if (!v) {
    error(n, path + ": " + not_integer_message(n.Scalar()));
    return std::nullopt;
  }
  if (*v < min || *v > max) {
    error(n, path + ": must be " +
                 (max == INT32_MAX
                      ? "at least " + std::to_string(min)
                      : "between " + std::to_string(min) + " and " + std::to_string(max)) +
                 ", got " + std::to_string(*v));
    return std::nullopt;
  }
  return static_cast<int>(*v);
}

std::optional<double> YamlContext::real(const YAML::Node& n, const std::string& path) {
  if (!n.IsScalar()) {
    error(n, path + ": must be a number, got " + describe(n));
    return std::nullopt;
  }
  const auto v = parse_real(n.Scalar());
  if (!v) {
    error(n, path + ": must be a number, got " + describe(n));
    return std::nullopt;
  }
  if (!std::isfinite(*v)) {
    error(n, path + ": must be finite, got " + show_number(*v));
    return std::nullopt;
  }
  return v;
}

std::optional<double> YamlContext::real_in(const YAML::Node& n, const std::string& path, double lo,
                                           bool lo_closed, double hi) {
  const auto v = real(n, path);
  if (!v) return std::nullopt;
  const bool low_ok = lo_closed ? *v >= lo : *v > lo;
  if (!low_ok || *v > hi) {
    std::string range = (lo_closed ? ">= " : "> ") + show_number(lo);
    if (std::isfinite(hi)) range += " and <= " + show_number(hi);
    error(n, path + ": must be " + range + ", got " + show_number(*v));
    return std::nullopt;
  }
  return v;
}

std::optional<bool> YamlContext::boolean(const YAML::Node& n, const std::string& path) {
  const auto v = n.IsScalar() ? parse_boolean(n.Scalar()) : std::nullopt;
  if (!v) error(n, path + ": must be true or false, got " + describe(n));
  return v;
}

bool YamlContext::is_list(const YAML::Node& n, const std::string& path) {
  if (n.IsSequence()) return true;
  error(n, path + ": must be a list, got " + describe(n));
  return false;
}

MapView::MapView(YamlContext& ctx, const YAML::Node& node, std::string path,
                 std::vector<std::string> allowed)
    : ctx_(ctx), node_(node), path_(std::move(path)) {
  if (!node.IsMap()) {
    ctx.error(node, (path_.empty() ? std::string("the season file") : path_) +
                        ": must be a map of keys, got " + describe(node));
    return;
  }
  ok_ = true;
  for (const auto& kv : node) {
    const YAML::Node& key = kv.first;
    if (!key.IsScalar()) {
      ctx.error(key, (path_.empty() ? std::string("the season file") : path_) +
                         ": keys must be plain names, got " + describe(key));
      continue;
    }
    const std::string& name = key.Scalar();
    bool known = false;
    for (const auto& a : allowed) known = known || a == name;
    if (!known) {
      std::string list;
      for (const auto& a : allowed) list += (list.empty() ? "" : ", ") + a;
      ctx.error(key, "unknown key " + quoted(name) +
                         (path_.empty() ? std::string(" at the top level") : " in " + path_) +
                         did_you_mean(name, allowed) + "; known keys: " + list);
      continue;
    }
    bool repeated = false;
    for (const auto& e : entries_) repeated = repeated || e.first == name;
    if (repeated) {
      ctx.error(key, "key " + quoted(name) + " is given twice" +
                         (path_.empty() ? std::string() : " in " + path_));
      continue;
    }
    entries_.emplace_back(name, kv.second);
  }
}

std::string MapView::sub(std::string_view key) const {
  return path_.empty() ? std::string(key) : path_ + "." + std::string(key);
}

std::optional<YAML::Node> MapView::get(std::string_view key) const {
  for (const auto& e : entries_) {
    if (e.first == key) return e.second;
  }
  return std::nullopt;
}

std::optional<YAML::Node> MapView::require(std::string_view key) {
  auto v = get(key);
  if (!v && ok_) ctx_.error(node_, sub(key) + ": required");
  return v;
}

}  // namespace standfast::config::detail
