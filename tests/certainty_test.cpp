// Tests for engine/certainty.h: exact clinch and elimination marks, magic and elimination numbers.
// References: the worked elimination example of Schwartz, B. L., "Possible winners in partially
// completed tournaments", SIAM Review 8(3), 302-308, 1966 (max-flow formulation), as worked in
// REFERENCE_VALUES.md section 6 (made-up 4-team league, brute force over 2^13 outcomes and Boost
// push_relabel_max_flow, [computed]); the magic number M = G + 1 - W_leader - L_chaser (common
// practice; Wikipedia "Magic number (sports)", Derivation; REFERENCE_VALUES.md section 7); and
// exhaustive enumeration of every remaining outcome in thousands of random small leagues, with
// a plain qualifying rule written out below (brute force; independent of the method).
#include "engine/certainty.h"

#include <fmt/core.h>

#include <algorithm>
#include <catch2/catch.hpp>
#include <cstdint>
#include <stdexcept>
#include <string>
#include <utility>
#include <vector>

#include "engine/clinch.h"
#include "engine/rng.h"

using standfast::config::Game;
using standfast::config::Group;
using standfast::config::Qualifying;
using standfast::config::Season;
using standfast::config::Team;
using standfast::engine::Certainty;
using standfast::engine::ClinchRecord;
using standfast::engine::exact_certainty;
using standfast::engine::simple_clinch;
using standfast::engine::TeamCertainty;

namespace {

// A league whose conference c holds divisions of the sizes sizes[c][k]; teams are numbered in
// order. Every conference qualifies `winners` division winners and `at_large` more.
Season league(const std::vector<std::vector<int>>& sizes, int winners, int at_large,
              bool postseason = true) {
  Season s;
  int team = 0;
  for (std::size_t c = 0; c < sizes.size(); ++c) {
    const int conf = static_cast<int>(s.groups.size());
    Group cg;
    cg.id = fmt::format("c{}", c);
    s.groups.push_back(cg);
    s.conferences.push_back(conf);
    for (int size : sizes[c]) {
      const int div = static_cast<int>(s.groups.size());
      Group dg;
      dg.id = fmt::format("d{}", div);
      dg.parent = conf;
      for (int i = 0; i < size; ++i) {
        Team t;
        t.id = fmt::format("T{}", team);
        t.division = div;
        t.conference = conf;
        s.teams.push_back(t);
        dg.teams.push_back(team++);
      }
      s.groups[conf].children.push_back(div);
      s.groups.push_back(dg);
      s.divisions.push_back(div);
    }
    Qualifying q;
    q.conference = conf;
    q.division_winners = winners;
    q.at_large = at_large;
    s.postseason.qualifying.push_back(q);
  }
  s.postseason.enabled = postseason;
  return s;
}

// `count` unplayed games between a and b.
void add_games(Season& s, int a, int b, int count) {
  for (int i = 0; i < count; ++i) {
    Game g;
    g.home = i % 2 ? b : a;
    g.away = i % 2 ? a : b;
    g.number = 1 + i % 2;  // doubleheaders as well
    s.games.push_back(g);
  }
}

}  // namespace

TEST_CASE("the worked elimination example: D is out although it can reach the leader's wins") {
  // Ref: REFERENCE_VALUES.md section 6 (Schwartz 1966, SIAM Review 8(3); [computed] by brute
  // force over all 2^13 outcomes and Boost push_relabel_max_flow = 7 < 9): A 18-16, B 18-16,
  // C 17-16, D 16-21; left A-B 3, A-C 3, A-D 1, B-C 3, B-D 1, C-D 2. D is eliminated; A, B and
  // C can each finish first outright.
  Season s = league({{4}}, 1, 0);
  add_games(s, 0, 1, 3);
  add_games(s, 0, 2, 3);
  add_games(s, 0, 3, 1);
  add_games(s, 1, 2, 3);
  add_games(s, 1, 3, 1);
  add_games(s, 2, 3, 2);
  const std::vector<ClinchRecord> r = {{18, 16, 7}, {18, 16, 7}, {17, 16, 8}, {16, 21, 4}};
  const auto c = exact_certainty(s, r);
  CHECK(c[3].division.mark == Certainty::kEliminated);
  CHECK(c[3].division.exact);
  for (int t = 0; t < 3; ++t) CHECK(c[t].division.mark == Certainty::kOpen);
  // The simple marks miss it (20 >= 18): the case the exact test exists for.
  CHECK(simple_clinch(s, r)[3].division == Certainty::kOpen);
  // One winner, no at-large berth: the postseason is the division.
  CHECK(c[3].berth.mark == Certainty::kEliminated);
  CHECK(c[3].title == Certainty::kEliminated);
}

TEST_CASE("two teams: magic and elimination numbers are G + 1 - W_leader - L_chaser") {
  // Ref: REFERENCE_VALUES.md section 7 (common practice): G = 162, leader 90-60, chaser 84-66,
  // M = 163 - 90 - 66 = 7. Here X and Y share a division and play their remaining games against
  // the other division (they do not meet again), every team playing G games.
  for (int lw = 84; lw <= 96; ++lw) {
    for (int cl = 60; cl <= 72; ++cl) {
      const int left = 12;
      const int lead_w = lw, lead_l = 150 - lw;
      const int chase_w = 150 - cl, chase_l = cl;
      Season s = league({{2, 2}}, 1, 0);
      add_games(s, 0, 2, 6);
      add_games(s, 0, 3, 6);
      add_games(s, 1, 2, 6);
      add_games(s, 1, 3, 6);
      const std::vector<ClinchRecord> r = {
          {lead_w, lead_l, left}, {chase_w, chase_l, left}, {75, 75, 12}, {75, 75, 12}};
      const auto c = exact_certainty(s, r);
      const int m = 162 + 1 - lead_w - chase_l;
      INFO("leader " << lead_w << "-" << lead_l << ", chaser " << chase_w << "-" << chase_l
                     << ", M = " << m);
      const int expect = m <= 0 ? 0 : m <= left ? m : -1;
      CHECK(c[0].division.magic == expect);
      if (m <= 0) CHECK(c[0].division.mark == Certainty::kClinched);
      // The chaser's elimination number is the leader's magic number (common practice).
      CHECK(c[1].division.elimination == expect);
      if (lead_w == 90 && chase_l == 66) CHECK(c[0].division.magic == 7);  // the example
    }
  }
}

TEST_CASE("a search stopped at its work limit gives no mark and says so") {
  // The worked example of REFERENCE_VALUES.md section 6 again: D's elimination needs a search
  // (here the counting bound of the set {A, B, C} settles it: 53 + 9 > 3 x 20).
  Season s = league({{4}}, 1, 0);
  add_games(s, 0, 1, 3);
  add_games(s, 0, 2, 3);
  add_games(s, 0, 3, 1);
  add_games(s, 1, 2, 3);
  add_games(s, 1, 3, 1);
  add_games(s, 2, 3, 2);
  const std::vector<ClinchRecord> r = {{18, 16, 7}, {18, 16, 7}, {17, 16, 8}, {16, 21, 4}};
  standfast::engine::CertaintyLimits none;
  none.flows = 0;
  none.nodes = 0;
  const auto c = exact_certainty(s, r, none);
  CHECK(c[3].division.mark == Certainty::kOpen);
  CHECK_FALSE(c[3].division.exact);
  standfast::engine::CertaintyLimits small;
  small.contest_size = 3;  // the division has 4 teams
  const auto d = exact_certainty(s, r, small);
  CHECK(d[3].division.mark == Certainty::kOpen);
  CHECK_FALSE(d[3].division.exact);
}

TEST_CASE("edge cases: no postseason, a one-team division, a team with no games") {
  // Common practice: a one-team division is won; without a postseason there is no berth mark.
  Season s = league({{1, 2}}, 1, 0, false);
  add_games(s, 1, 2, 2);
  const std::vector<ClinchRecord> r = {{0, 0, 0}, {3, 1, 2}, {1, 3, 2}};
  const auto c = exact_certainty(s, r);
  CHECK(c[0].division.mark == Certainty::kClinched);
  CHECK(c[0].division.magic == 0);
  CHECK(c[0].berth.mark == Certainty::kOpen);
  CHECK(c[1].berth.magic == -1);
  // T1 3-1 and T2 1-3 with 2 games between them: T2 can only tie (3-3): T1 is not clinched,
  // T2 is not eliminated; one T1 win settles it (magic 1, T2's elimination number 1).
  CHECK(c[1].division.mark == Certainty::kOpen);
  CHECK(c[2].division.mark == Certainty::kOpen);
  CHECK(c[1].division.magic == 1);
  CHECK(c[2].division.elimination == 1);
  CHECK_THROWS_AS(exact_certainty(s, std::vector<ClinchRecord>(2)), std::invalid_argument);
}

namespace {

// Brute force: the final wins of every team in every outcome of the remaining games (outcomes
// that give the same wins to every team are listed once: per pair, how many the first wins).
struct Outcome {
  std::vector<int> wins;  // final wins
};

struct Truth {
  bool surely = true;     // in every outcome, even with every tie against the team
  bool possibly = false;  // in some outcome, with every tie for the team
  int max_wins_failing = -1;
  int max_losses_possible = -1;
};

// pct(a) vs pct(b) of final records w/g; g = 0 counts .500. -1, 0, +1.
int cmp_pct(std::int64_t wa, std::int64_t ga, std::int64_t wb, std::int64_t gb) {
  if (ga == 0) wa = 1, ga = 2;
  if (gb == 0) wb = 1, gb = 2;
  const std::int64_t l = wa * gb, r = wb * ga;
  return (l > r) - (l < r);
}

// The plain qualifying rule, with ties involving x broken for x (favour) or against it, ties
// between others by team number. Returns {qualified, seed position} of x (-1 when out).
std::pair<bool, int> place(const Season& s, const std::vector<int>& wins,
                           const std::vector<int>& games, int x, bool favour) {
  const int n = static_cast<int>(s.teams.size());
  const int conf = s.teams[x].conference;
  auto better = [&](int a, int b) {
    const int c = cmp_pct(wins[a], games[a], wins[b], games[b]);
    if (c != 0) return c > 0;
    if (a == x) return favour;
    if (b == x) return !favour;
    return a < b;
  };
  std::vector<int> order;
  for (int t = 0; t < n; ++t) {
    if (s.teams[t].conference == conf) order.push_back(t);
  }
  std::sort(order.begin(), order.end(), better);
  const Qualifying* q = nullptr;
  for (const auto& r : s.postseason.qualifying) {
    if (r.conference == conf) q = &r;
  }
  std::vector<int> winners;
  for (int d : s.divisions) {
    for (int t : order) {
      if (s.teams[t].division == d) {
        winners.push_back(t);
        break;
      }
    }
  }
  std::sort(winners.begin(), winners.end(), better);
  const int dw = std::min<int>(q->division_winners, static_cast<int>(winners.size()));
  std::vector<int> qualified(winners.begin(), winners.begin() + dw);
  std::vector<int> at_large;
  for (int t : order) {
    if (std::find(qualified.begin(), qualified.end(), t) != qualified.end()) continue;
    if (static_cast<int>(at_large.size()) < q->at_large) at_large.push_back(t);
  }
  std::vector<int> seeds = qualified;
  seeds.insert(seeds.end(), at_large.begin(), at_large.end());
  if (!q->winners_first) std::sort(seeds.begin(), seeds.end(), better);
  const auto it = std::find(seeds.begin(), seeds.end(), x);
  if (it == seeds.end()) return {false, -1};
  return {true, static_cast<int>(it - seeds.begin())};
}

bool division_first(const Season& s, const std::vector<int>& wins, const std::vector<int>& games,
                    int x, bool favour) {
  for (std::size_t t = 0; t < s.teams.size(); ++t) {
    const int y = static_cast<int>(t);
    if (y == x || s.teams[y].division != s.teams[x].division) continue;
    const int c = cmp_pct(wins[x], games[x], wins[y], games[y]);
    if (c < 0 || (c == 0 && !favour)) return false;
  }
  return true;
}

void record(Truth& t, bool surely, bool possibly, int own_wins, int own_losses) {
  if (!surely) t.max_wins_failing = std::max(t.max_wins_failing, own_wins);
  if (possibly) t.max_losses_possible = std::max(t.max_losses_possible, own_losses);
  t.surely = t.surely && surely;
  t.possibly = t.possibly || possibly;
}

Certainty mark_of(const Truth& t) {
  return t.surely ? Certainty::kClinched : !t.possibly ? Certainty::kEliminated : Certainty::kOpen;
}
int magic_of(const Truth& t, int left) {
  return t.max_wins_failing < 0 ? 0 : t.max_wins_failing >= left ? -1 : t.max_wins_failing + 1;
}
int elimination_of(const Truth& t, int left) {
  return t.max_losses_possible < 0       ? 0
         : t.max_losses_possible >= left ? -1
                                         : t.max_losses_possible + 1;
}

struct Tally {
  int decided = 0, marked = 0, wrong = 0;
  void add(Certainty truth, Certainty mark) {
    if (mark != Certainty::kOpen && mark != truth) ++wrong;
    if (truth != Certainty::kOpen) {
      ++decided;
      if (mark == truth) ++marked;
    }
  }
  std::string share() const {
    return fmt::format("{}/{} decided marked ({:.1f}%), {} wrong", marked, decided,
                       decided ? 100.0 * marked / decided : 100.0, wrong);
  }
};

}  // namespace

TEST_CASE("every mark and number agrees with enumerating every outcome of random leagues") {
  // Ref: brute force (exhaustive enumeration of the remaining games, qualifying rule written
  // out in place() above); the leagues are random (fixed seed), one conference of one or two
  // divisions, or two conferences; 3 to 6 teams; up to 16 games left, unequal game counts.
  standfast::engine::Rng rng(20261202);
  auto uniform = [&](int lo, int hi) { return lo + static_cast<int>(rng(hi - lo + 1)); };
  Tally div_exact, berth_exact, bye_exact, bye_bound, div_simple, berth_simple;
  int magic_checked = 0;
  const int leagues = 3000;
  for (int round = 0; round < leagues; ++round) {
    const int teams = uniform(3, 6);
    std::vector<std::vector<int>> sizes;
    const int shape = uniform(0, 2);
    if (shape == 0) {
      sizes = {{teams}};
    } else if (shape == 1) {
      const int a = uniform(1, teams - 1);
      sizes = {{a, teams - a}};
    } else {
      const int a = uniform(1, teams - 2);
      const int b = uniform(1, teams - a - 1);
      sizes = {{a, b}, {teams - a - b}};
    }
    Season s = league(sizes, 0, 0);
    for (auto& q : s.postseason.qualifying) {
      int divs = 0, members = 0;
      for (int d : s.divisions) divs += s.groups[d].parent == q.conference;
      for (const auto& t : s.teams) members += t.conference == q.conference;
      q.division_winners = uniform(0, divs);
      q.at_large = uniform(0, std::min(2, members - q.division_winners));
      q.byes = uniform(0, q.division_winners + q.at_large);
      q.winners_first = uniform(0, 3) != 0;
    }
    // Played games: random pairings with a random winner (close standings), plus a few
    // results against clubs outside the league for some teams (unequal game counts).
    std::vector<ClinchRecord> r(teams);
    const int played = uniform(0, 30);
    for (int g = 0; g < played; ++g) {
      const int a = uniform(0, teams - 1);
      int b = uniform(0, teams - 2);
      if (b >= a) ++b;
      ++r[a].wins;
      ++r[b].losses;
    }
    for (auto& rec : r) {
      rec.wins += uniform(0, 2);
      rec.losses += uniform(0, 2);
    }
    const int left = uniform(0, 10) == 0 ? uniform(13, 16) : uniform(0, 12);
    std::vector<std::pair<int, int>> pairs;  // (a, b) a < b, with counts below
    std::vector<int> count;
    for (int g = 0; g < left; ++g) {
      int a = uniform(0, teams - 1), b = uniform(0, teams - 2);
      if (b >= a) ++b;
      if (a > b) std::swap(a, b);
      ++r[a].remaining;
      ++r[b].remaining;
      const auto it = std::find(pairs.begin(), pairs.end(), std::make_pair(a, b));
      if (it == pairs.end()) {
        pairs.emplace_back(a, b);
        count.push_back(1);
      } else {
        ++count[it - pairs.begin()];
      }
    }
    for (std::size_t p = 0; p < pairs.size(); ++p) {
      add_games(s, pairs[p].first, pairs[p].second, count[p]);
    }

    std::vector<int> games(teams);
    for (int t = 0; t < teams; ++t) games[t] = r[t].wins + r[t].losses + r[t].remaining;
    std::vector<Truth> div_truth(teams), berth_truth(teams), bye_truth(teams);
    std::vector<int> split(pairs.size(), 0);
    std::vector<int> wins(teams);
    while (true) {
      for (int t = 0; t < teams; ++t) wins[t] = r[t].wins;
      for (std::size_t p = 0; p < pairs.size(); ++p) {
        wins[pairs[p].first] += split[p];
        wins[pairs[p].second] += count[p] - split[p];
      }
      for (int x = 0; x < teams; ++x) {
        const int own_wins = wins[x] - r[x].wins;
        const int own_losses = r[x].remaining - own_wins;
        record(div_truth[x], division_first(s, wins, games, x, false),
               division_first(s, wins, games, x, true), own_wins, own_losses);
        const auto against = place(s, wins, games, x, false);
        const auto favour = place(s, wins, games, x, true);
        record(berth_truth[x], against.first, favour.first, own_wins, own_losses);
        const int byes = [&] {
          for (const auto& q : s.postseason.qualifying) {
            if (q.conference == s.teams[x].conference) return q.byes;
          }
          return 0;
        }();
        record(bye_truth[x], against.first && against.second < byes,
               favour.first && favour.second < byes, own_wins, own_losses);
      }
      std::size_t p = 0;
      while (p < pairs.size() && split[p] == count[p]) split[p++] = 0;
      if (p == pairs.size()) break;
      ++split[p];
    }

    const auto exact = exact_certainty(s, r);
    const auto simple = simple_clinch(s, r);
    for (int x = 0; x < teams; ++x) {
      INFO("league " << round << " team " << x);
      const TeamCertainty& c = exact[x];
      REQUIRE(c.division.exact);
      REQUIRE(c.berth.exact);
      CHECK(c.division.mark == mark_of(div_truth[x]));
      CHECK(c.berth.mark == mark_of(berth_truth[x]));
      CHECK(c.division.magic == magic_of(div_truth[x], r[x].remaining));
      CHECK(c.division.elimination == elimination_of(div_truth[x], r[x].remaining));
      CHECK(c.berth.magic == magic_of(berth_truth[x], r[x].remaining));
      CHECK(c.berth.elimination == elimination_of(berth_truth[x], r[x].remaining));
      magic_checked += 4;
      div_exact.add(mark_of(div_truth[x]), c.division.mark);
      berth_exact.add(mark_of(berth_truth[x]), c.berth.mark);
      (c.bye_exact ? bye_exact : bye_bound).add(mark_of(bye_truth[x]), c.bye);
      if (c.bye_exact) CHECK(c.bye == mark_of(bye_truth[x]));
      div_simple.add(mark_of(div_truth[x]), simple[x].division);
      berth_simple.add(mark_of(berth_truth[x]), simple[x].berth);
      if (c.title == Certainty::kEliminated)
        CHECK(mark_of(berth_truth[x]) == Certainty::kEliminated);
    }
  }
  // The figures quoted in the README (section "Certain results").
  fmt::print("{} random leagues, {} magic/elimination numbers checked\n", leagues, magic_checked);
  fmt::print("division, exact:  {}\n", div_exact.share());
  fmt::print("postseason, exact: {}\n", berth_exact.share());
  fmt::print("bye, exact rule:  {}\n", bye_exact.share());
  fmt::print("bye, bound:       {}\n", bye_bound.share());
  fmt::print("division, simple: {}\n", div_simple.share());
  fmt::print("postseason, simple: {}\n", berth_simple.share());
  CHECK(div_exact.wrong == 0);
  CHECK(berth_exact.wrong == 0);
  CHECK(bye_exact.wrong == 0);
  CHECK(bye_bound.wrong == 0);
  CHECK(div_exact.marked == div_exact.decided);
  CHECK(berth_exact.marked == berth_exact.decided);
  CHECK(bye_exact.marked == bye_exact.decided);
}
