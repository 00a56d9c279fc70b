// A small transport network for the certainty tests: supplies (games to be won) flow to teams
// (wins they may take or must get) and on to the sink; the maximum flow comes from Boost.Graph.
//
// The elimination problem (Schwartz 1966) and its relatives are all of this shape: a source
// node per group of games with the number of games as its supply, an edge from it to each team
// that can win those games, and an edge from each team to the sink whose capacity is the number
// of wins the team may take (or must get). The question is then whether the maximum flow
// saturates every supply (nobody passes its cap) or every team edge (everybody gets its due).
#ifndef STANDFAST_ENGINE_CERTAINTY_FLOW_H
#define STANDFAST_ENGINE_CERTAINTY_FLOW_H

#include <cstdint>
#include <vector>

namespace standfast::engine {

class WinFlow {
 public:
  // Capacity that never binds.
  static constexpr std::int64_t UNBOUNDED = std::int64_t{1} << 40;

  // A team node with an edge of capacity `cap` to the sink. Returns its handle.
  int add_team(std::int64_t cap);
  // A supply node with an edge of capacity `supply` from the source. Returns its handle.
  int add_supply(std::int64_t supply);
  // An edge from supply node `supply` to team node `team`.
  void connect(int supply, int team, std::int64_t cap = UNBOUNDED);

  // The maximum flow from the source to the sink (Boost.Graph push_relabel_max_flow).
  std::int64_t max_flow() const;

  // Sums of the source and sink capacities, to compare the flow with.
  std::int64_t total_supply() const { return total_supply_; }
  std::int64_t total_cap() const { return total_cap_; }

 private:
  struct Edge {
    int from = 0, to = 0;  // node numbers: 0 source, 1 sink, 2.. the others
    std::int64_t cap = 0;
  };
  int nodes_ = 2;
  std::vector<Edge> edges_;
  std::int64_t total_supply_ = 0;
  std::int64_t total_cap_ = 0;
};

}  // namespace standfast::engine

#endif  // STANDFAST_ENGINE_CERTAINTY_FLOW_H
