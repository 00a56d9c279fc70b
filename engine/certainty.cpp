#include "engine/certainty.h"

#include <algorithm>
#include <cstdint>
#include <limits>
#include <stdexcept>
#include <utility>

#include "engine/certainty_flow.h"

namespace standfast::engine {
namespace {

constexpr int NEVER = std::numeric_limits<int>::max() / 4;

// A winning percentage num/den; den = 0 (no games) counts .500, as pct_key does.
struct Pct {
  std::int64_t num = 0;
  std::int64_t den = 0;
};

Pct normal(Pct p) { return p.den == 0 ? Pct{1, 2} : p; }

// Most final wins of a team with `games` games that keep it at or below p (-1: none do).
int max_wins_at_most(int games, Pct p) {
  p = normal(p);
  if (games == 0) return 2 * p.num >= p.den ? 0 : -1;  // fixed at .500
  const std::int64_t w = p.num * games / p.den;
  return static_cast<int>(std::min<std::int64_t>(w, games));
}

// Fewest final wins of a team with `games` games that bring it to p or above (NEVER: none do).
int min_wins_at_least(int games, Pct p) {
  p = normal(p);
  if (games == 0) return 2 * p.num <= p.den ? 0 : NEVER;
  const std::int64_t w = (p.num * games + p.den - 1) / p.den;
  return w > games ? NEVER : static_cast<int>(w);
}

// One qualifying question: the teams that compete for it, their divisions, and the berths.
struct Contest {
  std::vector<int> teams;     // league team indexes
  std::vector<int> division;  // per entry: 0 .. divisions - 1
  int divisions = 1;
  int winners = 1;   // qualifying division winners (at most `divisions`)
  int at_large = 0;  // further berths
};

// The members of a set of rivals, counted per division, for the qualifying condition.
class RivalSet {
 public:
  RivalSet(const Contest& c, int x_division)
      : contest_(c),
        x_division_(x_division),
        per_division_(c.divisions, 0),
        member_(c.teams.size(), 0) {}

  void add(int i) {
    member_[i] = 1;
    ++size_;
    if (per_division_[contest_.division[i]]++ == 0) ++divisions_;
  }
  void remove(int i) {
    member_[i] = 0;
    --size_;
    if (--per_division_[contest_.division[i]] == 0) --divisions_;
  }
  bool has(int i) const { return member_[i] != 0; }

  // x qualifies when exactly these rivals finish on the wrong side of it (see certainty.h).
  bool x_qualifies() const {
    const bool own = per_division_[x_division_] > 0;
    const int other = divisions_ - (own ? 1 : 0);
    if (!own && other < contest_.winners) return true;
    return size_ - std::min(contest_.winners, divisions_) < contest_.at_large;
  }
  bool x_qualifies_with(int i) {
    add(i);
    const bool q = x_qualifies();
    remove(i);
    return q;
  }
  bool x_qualifies_without(int i) {
    remove(i);
    const bool q = x_qualifies();
    add(i);
    return q;
  }

 private:
  const Contest& contest_;
  int x_division_;
  std::vector<int> per_division_;
  std::vector<char> member_;
  int size_ = 0;
  int divisions_ = 0;
};

class Solver {
 public:
  Solver(const config::Season& season, std::span<const ClinchRecord> records,
         const CertaintyLimits& limits)
      : records_(records), limits_(limits), opponents_(records.size()) {
    const int n = static_cast<int>(records.size());
    std::vector<std::pair<int, int>> pairs;
    for (const auto& g : season.games) {
      if ((g.played && g.date) || g.home < 0 || g.away < 0 || g.home >= n || g.away >= n) continue;
      if (g.home == g.away) continue;
      pairs.emplace_back(std::min(g.home, g.away), std::max(g.home, g.away));
    }
    std::sort(pairs.begin(), pairs.end());
    for (std::size_t i = 0; i < pairs.size();) {
      std::size_t j = i;
      while (j < pairs.size() && pairs[j] == pairs[i]) ++j;
      const int count = static_cast<int>(j - i);
      opponents_[pairs[i].first].emplace_back(pairs[i].second, count);
      opponents_[pairs[i].second].emplace_back(pairs[i].first, count);
      i = j;
    }
  }

  int games(int t) const {
    const ClinchRecord& r = records_[t];
    return r.wins + r.losses + r.remaining;
  }

  // Sets the contest and the team x (its position in the contest) for the next questions.
  void focus(const Contest& c, int x) {
    contest_ = &c;
    x_ = x;
    if (c.teams == local_teams_) return;  // the games among them are already tabled
    local_teams_ = c.teams;
    const int m = static_cast<int>(c.teams.size());
    local_.assign(static_cast<std::size_t>(m) * m, 0);
    position_.resize(records_.size(), -1);
    for (int i = 0; i < m; ++i) position_[c.teams[i]] = i;
    for (int i = 0; i < m; ++i) {
      for (const auto& [o, count] : opponents_[c.teams[i]]) {
        if (position_[o] >= 0) local_[static_cast<std::size_t>(i) * m + position_[o]] = count;
      }
    }
    for (int i = 0; i < m; ++i) position_[c.teams[i]] = -1;
  }

  int r(int i, int j) const {
    return local_[static_cast<std::size_t>(i) * contest_->teams.size() + j];
  }

  bool exact() const { return exact_; }
  void reset_exact() { exact_ = true; }

  // True when x is sure to miss after exactly `losses` further losses (its other remaining
  // games won), whatever else happens. Sound: false when the search stops at its limits.
  bool eliminated(int losses) {
    const Contest& c = *contest_;
    const int m = static_cast<int>(c.teams.size());
    const int xt = c.teams[x_];
    const ClinchRecord& rx = records_[xt];
    const Pct p{rx.wins + rx.remaining - losses, games(xt)};
    cap_.assign(m, 0);
    RivalSet set(c, c.division[x_]);
    std::vector<int> open;
    for (int i = 0; i < m; ++i) {
      if (i == x_) continue;
      const ClinchRecord& ri = records_[c.teams[i]];
      const int most = max_wins_at_most(games(c.teams[i]), p);
      cap_[i] = most - ri.wins;
      if (cap_[i] < 0) {
        set.add(i);  // above x whatever happens
      } else if (cap_[i] < ri.remaining) {
        open.push_back(i);
      } else {
        cap_[i] = ri.remaining;  // never above x: its cap cannot bind
      }
    }
    if (!set.x_qualifies()) return true;
    for (int i : open) set.add(i);
    const bool all_above_fine = set.x_qualifies();  // then nobody needs holding: alive
    for (int i : open) set.remove(i);
    if (all_above_fine) return false;
    std::sort(open.begin(), open.end(), [&](int a, int b) {
      const int ea = records_[c.teams[a]].remaining - cap_[a];
      const int eb = records_[c.teams[b]].remaining - cap_[b];
      return ea != eb ? ea > eb : a < b;
    });
    flows_ = 0;
    nodes_ = 0;
    x_losses_ = losses;
    held_.clear();
    held_games_ = held_cap_ = held_x_ = 0;
    bool alive = false;
    const bool finished = search_alive(set, open, 0, alive);
    if (!finished) exact_ = false;
    return finished && !alive;
  }

  // True when x is sure to qualify after exactly `wins` further wins (its other remaining games
  // lost), whatever else happens. Sound: false when the search stops at its limits.
  bool clinched(int wins) {
    const Contest& c = *contest_;
    const int m = static_cast<int>(c.teams.size());
    const int xt = c.teams[x_];
    const ClinchRecord& rx = records_[xt];
    const Pct q{rx.wins + wins, games(xt)};
    need_.assign(m, 0);
    RivalSet set(c, c.division[x_]);
    std::vector<int> open;
    for (int i = 0; i < m; ++i) {
      if (i == x_) continue;
      const ClinchRecord& ri = records_[c.teams[i]];
      const int least = min_wins_at_least(games(c.teams[i]), q);
      if (least == NEVER) continue;
      need_[i] = least - ri.wins;
      if (need_[i] <= 0) {
        set.add(i);  // at or above x whatever happens
      } else if (need_[i] <= ri.remaining) {
        open.push_back(i);
      }
    }
    if (!set.x_qualifies()) return false;
    for (int i : open) set.add(i);
    const bool all_reach_fine = set.x_qualifies();  // no set of rivals can keep x out
    for (int i : open) set.remove(i);
    if (all_reach_fine) return true;
    std::sort(open.begin(), open.end(), [&](int a, int b) {
      const int sa = records_[c.teams[a]].remaining - need_[a];
      const int sb = records_[c.teams[b]].remaining - need_[b];
      return sa != sb ? sa > sb : a < b;
    });
    flows_ = 0;
    nodes_ = 0;
    x_losses_ = rx.remaining - wins;
    reaching_.clear();
    demand_ = supply_ = reach_x_ = 0;
    bool threat = false;
    const bool finished = search_threat(set, open, 0, threat);
    if (!finished) exact_ = false;
    return finished && !threat;
  }

 private:
  bool over_limit() const { return flows_ > limits_.flows || nodes_ > limits_.nodes; }

  // Looks for a maximal set of rivals above x with which x qualifies and whose complement can
  // be kept at or below x. Returns false when it stopped at a limit.
  bool search_alive(RivalSet& set, const std::vector<int>& open, std::size_t k, bool& alive) {
    if (++nodes_, over_limit()) return false;
    if (k == open.size()) {
      for (int i : open) {
        if (!set.has(i) && set.x_qualifies_with(i)) return true;  // not maximal
      }
      if (++flows_ > limits_.flows) return false;
      alive = can_hold(set);
      return true;
    }
    const int i = open[k];
    if (set.x_qualifies_with(i)) {
      set.add(i);
      const bool ok = search_alive(set, open, k + 1, alive);
      set.remove(i);
      if (!ok) return false;
      if (alive) return true;
    }
    // Keeping i at or below x too: a counting bound first (the games among the teams held so
    // far must fit under their caps, with x's losses that cannot go elsewhere).
    int games = 0;
    for (int j : held_) games += r(i, j);
    held_.push_back(i);
    held_games_ += games;
    held_cap_ += cap_[i];
    held_x_ += r(x_, i);
    const int forced_x =
        std::max(0, x_losses_ - (records_[contest_->teams[x_]].remaining - held_x_));
    bool ok = true;
    if (held_games_ + forced_x <= held_cap_) ok = search_alive(set, open, k + 1, alive);
    held_.pop_back();
    held_games_ -= games;
    held_cap_ -= cap_[i];
    held_x_ -= r(x_, i);
    return ok;
  }

  // Every contest rival outside `above` ends at or below x's final percentage (cap_), with x
  // losing exactly x_losses_ of its remaining games.
  bool can_hold(const RivalSet& above) const {
    const Contest& c = *contest_;
    const int m = static_cast<int>(c.teams.size());
    WinFlow flow;
    std::vector<int> node(m, -1);
    for (int i = 0; i < m; ++i) {
      if (i != x_ && !above.has(i)) node[i] = flow.add_team(cap_[i]);
    }
    for (int i = 0; i < m; ++i) {
      if (node[i] < 0) continue;
      for (int j = i + 1; j < m; ++j) {
        if (node[j] < 0 || r(i, j) == 0) continue;
        const int games = flow.add_supply(r(i, j));
        flow.connect(games, node[i]);
        flow.connect(games, node[j]);
      }
    }
    if (x_losses_ > 0) {
      const int losses = flow.add_supply(x_losses_);
      int to_capped = 0;
      for (int i = 0; i < m; ++i) {
        if (node[i] < 0 || r(x_, i) == 0) continue;
        flow.connect(losses, node[i], r(x_, i));
        to_capped += r(x_, i);
      }
      const int rest = records_[c.teams[x_]].remaining - to_capped;
      if (rest > 0) flow.connect(losses, flow.add_team(WinFlow::UNBOUNDED), rest);
    }
    return flow.max_flow() == flow.total_supply();
  }

  // Looks for a minimal set of rivals at or above x with which x misses and who can all get
  // there at once. Returns false when it stopped at a limit.
  bool search_threat(RivalSet& set, const std::vector<int>& open, std::size_t k, bool& threat) {
    if (++nodes_, over_limit()) return false;
    if (!set.x_qualifies()) {
      for (std::size_t j = 0; j < k; ++j) {
        const int i = open[j];
        if (set.has(i) && !set.x_qualifies_without(i)) return true;  // not minimal
      }
      if (++flows_ > limits_.flows) return false;
      threat = can_reach(set);
      return true;
    }
    if (k == open.size()) return true;
    const int i = open[k];
    // Adding i: a counting bound first (the wins the reaching teams need must fit in the games
    // they can win: their games, those among them once, and x's losses to them).
    int shared = 0;
    for (int j : reaching_) shared += r(i, j);
    const int supply = records_[contest_->teams[i]].remaining - r(x_, i) - shared;
    reaching_.push_back(i);
    demand_ += need_[i];
    supply_ += supply;
    reach_x_ += r(x_, i);
    bool ok = true;
    if (demand_ <= supply_ + std::min(x_losses_, reach_x_)) {
      set.add(i);
      ok = search_threat(set, open, k + 1, threat);
      set.remove(i);
    }
    reaching_.pop_back();
    demand_ -= need_[i];
    supply_ -= supply;
    reach_x_ -= r(x_, i);
    if (!ok) return false;
    if (threat) return true;
    return search_threat(set, open, k + 1, threat);
  }

  // Every member of `reach` gets to x's final percentage or above (need_) at once, with x
  // losing exactly x_losses_ of its remaining games.
  bool can_reach(const RivalSet& reach) const {
    const Contest& c = *contest_;
    const int m = static_cast<int>(c.teams.size());
    const int xt = c.teams[x_];
    WinFlow flow;
    std::vector<int> node(records_.size(), -1);
    std::vector<int> demanding;
    for (int i = 0; i < m; ++i) {
      if (i == x_ || !reach.has(i) || need_[i] <= 0) continue;
      node[c.teams[i]] = flow.add_team(need_[i]);
      demanding.push_back(c.teams[i]);
    }
    for (int t : demanding) {
      int own = 0;  // games against teams that need nothing: t may win them all
      for (const auto& [o, count] : opponents_[t]) {
        if (o == xt) continue;
        if (node[o] >= 0) {
          if (t < o) {
            const int games = flow.add_supply(count);
            flow.connect(games, node[t]);
            flow.connect(games, node[o]);
          }
        } else {
          own += count;
        }
      }
      if (own > 0) flow.connect(flow.add_supply(own), node[t]);
    }
    if (x_losses_ > 0) {
      const int losses = flow.add_supply(x_losses_);
      for (const auto& [o, count] : opponents_[xt]) {
        if (node[o] >= 0) flow.connect(losses, node[o], count);
      }
    }
    return flow.max_flow() == flow.total_cap();
  }

  std::span<const ClinchRecord> records_;
  CertaintyLimits limits_;
  std::vector<std::vector<std::pair<int, int>>> opponents_;  // per team: (opponent, games left)
  const Contest* contest_ = nullptr;
  int x_ = 0;
  std::vector<int> local_teams_;  // the contest whose games local_ holds
  std::vector<int> local_;        // games left between contest members, m x m
  std::vector<int> position_;     // league team -> contest position, -1 outside
  std::vector<int> cap_;          // eliminated(): wins each rival may still take
  std::vector<int> need_;         // clinched(): wins each rival still needs
  int x_losses_ = 0;
  std::vector<int> held_;  // search_alive: rivals kept at or below x on this branch
  int held_games_ = 0, held_cap_ = 0, held_x_ = 0;
  std::vector<int> reaching_;  // search_threat: rivals reaching x on this branch
  int demand_ = 0, supply_ = 0, reach_x_ = 0;
  int flows_ = 0;
  int nodes_ = 0;
  bool exact_ = true;
};

// Smallest k in [0, most] with test(k) true, or -1; test is monotone (false ... false true ...).
template <class Test>
int smallest(int most, Test test, bool at_zero) {
  if (at_zero) return 0;
  if (most <= 0 || !test(most)) return -1;
  int lo = 0, hi = most;  // test(lo) false, test(hi) true
  while (hi - lo > 1) {
    const int mid = lo + (hi - lo) / 2;
    (test(mid) ? hi : lo) = mid;
  }
  return hi;
}

OutcomeCertainty answer(Solver& solver, const Contest& c, int x, int remaining) {
  solver.focus(c, x);
  solver.reset_exact();
  OutcomeCertainty out;
  const bool clinched = solver.clinched(0);
  const bool eliminated = !clinched && solver.eliminated(0);
  out.mark = clinched     ? Certainty::kClinched
             : eliminated ? Certainty::kEliminated
                          : Certainty::kOpen;
  if (!solver.exact()) {  // the numbers would hit the same limit: not computed
    out.exact = false;
    return out;
  }
  out.magic = eliminated ? -1
                         : smallest(
                               remaining, [&](int k) { return solver.clinched(k); }, clinched);
  out.elimination = clinched
                        ? -1
                        : smallest(
                              remaining, [&](int k) { return solver.eliminated(k); }, eliminated);
  out.exact = solver.exact();
  return out;
}

int top_group(const config::Season& season, int g) {
  while (g >= 0 && season.groups[g].parent >= 0) g = season.groups[g].parent;
  return g;
}

}  // namespace

std::vector<TeamCertainty> exact_certainty(const config::Season& season,
                                           std::span<const ClinchRecord> records,
                                           const CertaintyLimits& limits) {
  const int n = static_cast<int>(season.teams.size());
  if (static_cast<int>(records.size()) != n) {
    throw std::invalid_argument("exact_certainty: one record per team is needed");
  }
  std::vector<TeamCertainty> out(n);
  Solver solver(season, records, limits);
  // Where a search stops at its limit, the counting marks (sufficient conditions) still hold.
  const std::vector<ClinchMarks> simple = simple_clinch(season, records);
  const auto fall_back = [&](OutcomeCertainty& o, Certainty counted) {
    if (!o.exact && o.mark == Certainty::kOpen) o.mark = counted;
  };

  // Divisions: one division, one winner, no at-large berth.
  for (int d : season.divisions) {
    Contest c;
    for (int t = 0; t < n; ++t) {
      if (season.teams[t].division == d) c.teams.push_back(t);
    }
    c.division.assign(c.teams.size(), 0);
    for (std::size_t x = 0; x < c.teams.size(); ++x) {
      const int t = c.teams[x];
      if (static_cast<int>(c.teams.size()) > limits.contest_size) {
        out[t].division.exact = false;  // too large to table: no mark (sound)
        continue;
      }
      out[t].division = answer(solver, c, static_cast<int>(x), records[t].remaining);
    }
    for (int t : c.teams) fall_back(out[t].division, simple[t].division);
  }
  if (!season.postseason.enabled) return out;

  int league_qualifiers = 0;
  for (const auto& q : season.postseason.qualifying) {
    league_qualifiers += q.division_winners + q.at_large;
  }
  const bool single = season.postseason.format == config::BracketFormat::kSingleBracket;

  for (int conf : season.conferences) {
    Contest c;
    std::vector<int> division_of_group(season.groups.size(), -1);
    for (int d : season.divisions) {
      if (top_group(season, d) == conf) division_of_group[d] = c.divisions++;
    }
    if (c.divisions == 0) c.divisions = 1;
    for (int t = 0; t < n; ++t) {
      const auto& team = season.teams[t];
      const int tc = team.conference >= 0 ? team.conference : top_group(season, team.division);
      if (tc != conf) continue;
      c.teams.push_back(t);
      const int d = team.division >= 0 ? division_of_group[team.division] : -1;
      c.division.push_back(d >= 0 ? d : 0);
    }
    const int m = static_cast<int>(c.teams.size());
    const config::Qualifying* rule = nullptr;
    for (const auto& q : season.postseason.qualifying) {
      if (q.conference == conf) rule = &q;
    }
    c.winners = rule ? std::clamp(rule->division_winners, 0, c.divisions) : 0;
    c.at_large = rule ? std::clamp(rule->at_large, 0, std::max(0, m - c.winners)) : 0;
    const int byes = rule ? rule->byes : 0;
    const bool exact_byes = !single && rule && rule->winners_first && byes <= c.winners;
    Contest bye_contest = c;
    bye_contest.winners = std::min(byes, c.winners);
    bye_contest.at_large = 0;

    for (int x = 0; x < m; ++x) {
      const int t = c.teams[x];
      TeamCertainty& tc = out[t];
      if (m > limits.contest_size) {
        tc.berth.exact = false;
        tc.bye_exact = false;
        fall_back(tc.berth, simple[t].berth);
        if (tc.berth.mark == Certainty::kEliminated) tc.bye = tc.title = Certainty::kEliminated;
        continue;
      }
      tc.berth = answer(solver, c, x, records[t].remaining);
      fall_back(tc.berth, simple[t].berth);
      const bool berth_out = tc.berth.mark == Certainty::kEliminated;
      tc.title = berth_out ? Certainty::kEliminated
                 : league_qualifiers == 1 && tc.berth.mark == Certainty::kClinched
                     ? Certainty::kClinched
                     : Certainty::kOpen;
      if (byes <= 0) {
        tc.bye = Certainty::kEliminated;  // there is no bye to win
        continue;
      }
      if (exact_byes) {
        solver.focus(bye_contest, x);
        solver.reset_exact();
        tc.bye = solver.clinched(0)     ? Certainty::kClinched
                 : solver.eliminated(0) ? Certainty::kEliminated
                                        : Certainty::kOpen;
        tc.bye_exact = solver.exact();
        continue;
      }
      // Sound bounds: seeds above x are qualifiers at or above x's worst percentage, plus the
      // division winners seeded first when x qualifies at large.
      tc.bye_exact = false;
      if (berth_out) {
        tc.bye = Certainty::kEliminated;
        continue;
      }
      if (single || tc.berth.mark != Certainty::kClinched) continue;
      const ClinchRecord& rx = records[t];
      const Pct worst{rx.wins, solver.games(t)};
      int threats = 0;  // rivals whose best percentage reaches x's worst
      for (int y : c.teams) {
        if (y != t &&
            min_wins_at_least(solver.games(y), worst) <= records[y].wins + records[y].remaining) {
          ++threats;
        }
      }
      const int ahead = threats + (rule->winners_first ? c.winners : 0);
      if (ahead < byes) tc.bye = Certainty::kClinched;
    }
  }
  return out;
}

std::vector<ClinchMarks> certainty_marks(std::span<const TeamCertainty> certainty) {
  std::vector<ClinchMarks> out(certainty.size());
  for (std::size_t t = 0; t < certainty.size(); ++t) {
    out[t].division = certainty[t].division.mark;
    out[t].berth = certainty[t].berth.mark;
  }
  return out;
}

}  // namespace standfast::engine
