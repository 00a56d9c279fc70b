// The postseason section of a season file, with the arithmetic checks of its bracket.
#ifndef STANDFAST_CONFIG_POSTSEASON_READER_H
#define STANDFAST_CONFIG_POSTSEASON_READER_H

#include "config/season.h"
#include "config/yaml_node.h"

namespace standfast::config::detail {

// Reads `node` into season.postseason; the groups must have been read.
void read_postseason(YamlContext& ctx, const YAML::Node& node, Season& season);

// The home pattern of a series when `hosts` is not given: 1 -> [1], 3 -> [1,1,1],
// 5 -> [2,2,1], 7 -> [2,3,2], otherwise one game each, alternating.
std::vector<int> default_hosts(int best_of);

}  // namespace standfast::config::detail

#endif  // STANDFAST_CONFIG_POSTSEASON_READER_H
