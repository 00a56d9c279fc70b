// Reading YAML nodes with positions and typed checks; used only inside config/ (the only user of
// yaml-cpp). Every check reports into a Report and reading goes on, so that all problems of a
// file are found in one pass.
#ifndef STANDFAST_CONFIG_YAML_NODE_H
#define STANDFAST_CONFIG_YAML_NODE_H

#include <yaml-cpp/yaml.h>

#include <optional>
#include <string>
#include <string_view>
#include <utility>
#include <vector>

#include "config/report.h"
#include "config/season.h"

namespace standfast::config::detail {

// A number for a message, in its shortest exact form (1.04, nan, 1e+300).
std::string show_number(double x);

// What a node is, for messages: "a list", "a map", "nothing" or the quoted text.
std::string describe(const YAML::Node& n);

class YamlContext {
 public:
  YamlContext(std::string file, Report& report) : file_(std::move(file)), report_(report) {}

  const std::string& file() const { return file_; }
  Report& report() { return report_; }
  SourcePos pos(const YAML::Node& n) const;
  void error(const YAML::Node& n, std::string message) {
    report_.error(pos(n), std::move(message));
  }

  // Each returns nullopt after reporting a problem.
  std::optional<std::string> text(const YAML::Node& n, const std::string& path);
  std::optional<int> integer(const YAML::Node& n, const std::string& path, int min, int max);
  std::optional<double> real(const YAML::Node& n, const std::string& path);  // finite only
  std::optional<bool> boolean(const YAML::Node& n, const std::string& path);
  // A finite number with lo < x (or lo <= x when lo_closed) and x <= hi.
  std::optional<double> real_in(const YAML::Node& n, const std::string& path, double lo,
                                bool lo_closed, double hi);
  bool is_list(const YAML::Node& n, const std::string& path);

 private:
  std::string file_;
  Report& report_;
};

// The keys of one YAML map. Construction reports a node that is not a map, keys that are not
// plain names, unknown keys (with a suggestion) and keys given twice.
class MapView {
 public:
  MapView(YamlContext& ctx, const YAML::Node& node, std::string path,
          std::vector<std::string> allowed);

  bool ok() const { return ok_; }
  const YAML::Node& node() const { return node_; }
  const std::string& path() const { return path_; }
  // "PATH.key", or "key" at the top level.
  std::string sub(std::string_view key) const;
  // The value of a key, if present.
  std::optional<YAML::Node> get(std::string_view key) const;
  // The same, reporting "PATH.key: required" at the map when absent.
  std::optional<YAML::Node> require(std::string_view key);

 private:
  YamlContext& ctx_;
  YAML::Node node_;
  std::string path_;
  bool ok_ = false;
  std::vector<std::pair<std::string, YAML::Node>> entries_;
};

}  // namespace standfast::config::detail

#endif  // STANDFAST_CONFIG_YAML_NODE_H
