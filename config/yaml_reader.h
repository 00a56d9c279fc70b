// The YAML part of a season file: every section except the games CSV it may name.
#ifndef STANDFAST_CONFIG_YAML_READER_H
#define STANDFAST_CONFIG_YAML_READER_H

#include <optional>
#include <string>
#include <vector>

#include "config/games.h"
#include "config/report.h"
#include "config/season.h"
#include "config/yaml_node.h"

namespace standfast::config::detail {

// What the YAML reader hands on to the steps that follow it.
struct YamlResult {
  std::optional<std::string> games_file;  // as written, relative to the season file
  SourcePos games_file_pos;
  SourcePos games_per_team_pos;
  TeamIds teams;
};

// The model section at `path` ("model" in a season file) into `model`, changing only the keys
// given; returns the position of the family (for messages about it).
SourcePos read_model(YamlContext& ctx, const YAML::Node& node, ModelSpec& model,
                     const std::string& path);

// A list of team overrides at `path` ("overrides" in a season file), appended to `out`.
void read_overrides(YamlContext& ctx, const YAML::Node& node, const std::string& path,
                    const TeamIds& ids, std::vector<TeamOverride>& out);

// Parses `text` (named season.file in messages) into `season`, reporting every problem. A YAML
// syntax error is reported at its position and ends the reading.
YamlResult read_season_yaml(const std::string& text, Season& season, Report& report);

}  // namespace standfast::config::detail

#endif  // STANDFAST_CONFIG_YAML_READER_H
