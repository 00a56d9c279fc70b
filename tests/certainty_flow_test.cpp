// Tests for engine/certainty_flow.h: the transport network and its maximum flow.
// References: REFERENCE_VALUES.md section 6, the made-up 4-team league worked with the network of
// Schwartz, B. L., "Possible winners in partially completed tournaments", SIAM Review 8(3),
// 302-308, 1966 ([computed] there with Boost.Graph push_relabel_max_flow and by brute force over
// all 2^13 outcomes); a flow bounded by a cut (max-flow min-cut theorem, common practice).
#include "engine/certainty_flow.h"

#include <catch2/catch.hpp>
#include <utility>
#include <vector>

using standfast::engine::WinFlow;

namespace {

struct PairGames {
  int a, b, games;
};

// The network testing one team: pairs of the other teams as supplies, the others as teams with
// cap M - w_i (REFERENCE_VALUES.md section 6, steps 2-5).
WinFlow network(const std::vector<int>& caps, const std::vector<PairGames>& pairs) {
  WinFlow flow;
  std::vector<int> node;
  for (int cap : caps) node.push_back(flow.add_team(cap));
  for (const auto& p : pairs) {
    const int s = flow.add_supply(p.games);
    flow.connect(s, node[p.a]);
    flow.connect(s, node[p.b]);
  }
  return flow;
}

}  // namespace

TEST_CASE("the worked example: max-flow 7 of 9 for D, saturated for A, B and C") {
  // Ref: REFERENCE_VALUES.md section 6; A 18-16, B 18-16, C 17-16, D 16-21, games left A-B 3,
  // A-C 3, A-D 1, B-C 3, B-D 1, C-D 2. For D: M = 20, caps A 2, B 2, C 3, supplies 3+3+3 = 9,
  // max-flow 7 ([computed], Boost push_relabel_max_flow). A: 6/6, B: 6/6, C: 5/5.
  const WinFlow d = network({2, 2, 3}, {{0, 1, 3}, {0, 2, 3}, {1, 2, 3}});
  CHECK(d.total_supply() == 9);
  CHECK(d.max_flow() == 7);
  // A: M = 25, others B (cap 7), C (8), D (9); pairs B-C 3, B-D 1, C-D 2.
  const WinFlow a = network({7, 8, 9}, {{0, 1, 3}, {0, 2, 1}, {1, 2, 2}});
  CHECK(a.max_flow() == 6);
  CHECK(a.total_supply() == 6);
  // B: the same as A with A and B exchanged: others A (7), C (8), D (9); A-C 3, A-D 1, C-D 2.
  CHECK(network({7, 8, 9}, {{0, 1, 3}, {0, 2, 1}, {1, 2, 2}}).max_flow() == 6);
  // C: M = 25, others A (7), B (7), D (9); pairs A-B 3, A-D 1, B-D 1.
  const WinFlow c = network({7, 7, 9}, {{0, 1, 3}, {0, 2, 1}, {1, 2, 1}});
  CHECK(c.max_flow() == 5);
}

TEST_CASE("a flow is bounded by each cut and edge capacities bind") {
  // Common practice (max-flow min-cut): one supply of 5 to two teams capped 1 and 2 carries 3;
  // an edge capped at 1 lowers it to 2; no supply, no flow.
  WinFlow f;
  const int t1 = f.add_team(1), t2 = f.add_team(2);
  const int s = f.add_supply(5);
  f.connect(s, t1);
  f.connect(s, t2, 1);
  CHECK(f.max_flow() == 2);
  CHECK(f.total_cap() == 3);
  WinFlow empty;
  empty.add_team(4);
  CHECK(empty.max_flow() == 0);
}
