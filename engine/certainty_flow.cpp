#include "engine/certainty_flow.h"

#include <boost/graph/adjacency_list.hpp>
#include <boost/graph/push_relabel_max_flow.hpp>

namespace standfast::engine {

int WinFlow::add_team(std::int64_t cap) {
  const int node = nodes_++;
  edges_.push_back({node, 1, cap});
  total_cap_ += cap;
  return node;
}

int WinFlow::add_supply(std::int64_t supply) {
  const int node = nodes_++;
  edges_.push_back({0, node, supply});
  total_supply_ += supply;
  return node;
}

void WinFlow::connect(int supply, int team, std::int64_t cap) {
  edges_.push_back({supply, team, cap});
}

std::int64_t WinFlow::max_flow() const {
  using Traits = boost::adjacency_list_traits<boost::vecS, boost::vecS, boost::directedS>;
  using Graph = boost::adjacency_list<
      boost::vecS, boost::vecS, boost::directedS, boost::no_property,
      boost::property<
          boost::edge_capacity_t, std::int64_t,
          boost::property<boost::edge_residual_capacity_t, std::int64_t,
                          boost::property<boost::edge_reverse_t, Traits::edge_descriptor>>>>;
  Graph g(static_cast<std::size_t>(nodes_));
  auto capacity = boost::get(boost::edge_capacity, g);
  auto reverse = boost::get(boost::edge_reverse, g);
  for (const Edge& e : edges_) {
    if (e.cap <= 0) continue;
    const auto forward = boost::add_edge(e.from, e.to, g).first;
    const auto backward = boost::add_edge(e.to, e.from, g).first;
    capacity[forward] = e.cap;
    capacity[backward] = 0;
    reverse[forward] = backward;
    reverse[backward] = forward;
  }
  return boost::push_relabel_max_flow(g, 0, 1);
}

}  // namespace standfast::engine
