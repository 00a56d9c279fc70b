#include "engine/clinch.h"

#include <algorithm>
#include <cstdint>
#include <stdexcept>

namespace standfast::engine {
namespace {

// A final winning percentage num/den; den = 0 (no games at all) counts .500.
struct Pct {
  std::int64_t num = 0;
  std::int64_t den = 0;
};

// -1, 0, +1 as a < b, a == b, a > b.
int compare(Pct a, Pct b) {
  if (a.den == 0) a = {1, 2};
  if (b.den == 0) b = {1, 2};
  const std::int64_t lhs = a.num * b.den;
  const std::int64_t rhs = b.num * a.den;
  return (lhs > rhs) - (lhs < rhs);
}

Pct worst(const ClinchRecord& r) {
  return {r.wins, static_cast<std::int64_t>(r.wins) + r.losses + r.remaining};
}
Pct best(const ClinchRecord& r) {
  return {static_cast<std::int64_t>(r.wins) + r.remaining,
          static_cast<std::int64_t>(r.wins) + r.losses + r.remaining};
}

// b finishes strictly above a whatever happens.
bool surely_above(const ClinchRecord& b, const ClinchRecord& a) {
  return compare(worst(b), best(a)) > 0;
}
// b can still finish level with or above a's worst.
bool threat(const ClinchRecord& b, const ClinchRecord& a) {
  return compare(best(b), worst(a)) >= 0;
}

}  // namespace

std::vector<ClinchRecord> clinch_records(const config::Season& season) {
  std::vector<ClinchRecord> out(season.teams.size());
  for (const auto& g : season.games) {
    if (g.home < 0 || g.away < 0) continue;
    // As the engine's plan: a played game with no date is still to play.
    if (!g.played || !g.date) {
      ++out[g.home].remaining;
      ++out[g.away].remaining;
    } else if (g.home_runs > g.away_runs) {
      ++out[g.home].wins;
      ++out[g.away].losses;
    } else if (g.away_runs > g.home_runs) {
      ++out[g.away].wins;
      ++out[g.home].losses;
    }
  }
  return out;
}

std::vector<ClinchMarks> simple_clinch(const config::Season& season,
                                       std::span<const ClinchRecord> records) {
  const int n = static_cast<int>(season.teams.size());
  if (static_cast<int>(records.size()) != n) {
    throw std::invalid_argument("simple_clinch: one record per team is needed");
  }
  std::vector<ClinchMarks> marks(n);

  // Division marks.
  for (int a = 0; a < n; ++a) {
    const int div = season.teams[a].division;
    bool clinched = true;
    bool eliminated = false;
    for (int b = 0; b < n; ++b) {
      if (b == a || season.teams[b].division != div) continue;
      if (compare(worst(records[a]), best(records[b])) <= 0) clinched = false;
      if (surely_above(records[b], records[a])) eliminated = true;
    }
    marks[a].division = clinched     ? Certainty::kClinched
                        : eliminated ? Certainty::kEliminated
                                     : Certainty::kOpen;
  }

  if (!season.postseason.enabled) return marks;

  // Berth marks, conference by conference.
  for (const auto& q : season.postseason.qualifying) {
    const int conf = q.conference;
    std::vector<int> divisions;  // division group indexes of this conference
    for (int d : season.divisions) {
      bool in_conf = false;
      for (int t : season.groups[d].teams) in_conf = in_conf || season.teams[t].conference == conf;
      if (in_conf) divisions.push_back(d);
    }
    const int div_count = static_cast<int>(divisions.size());
    const int winners = std::min(q.division_winners, div_count);
    const bool all_winners = winners >= div_count;

    for (int a = 0; a < n; ++a) {
      if (season.teams[a].conference != conf) continue;
      const ClinchRecord& ra = records[a];
      int threats = 0;
      int other_divs_with_threat = 0;
      int other_divs_with_above = 0;
      int pool_above = 0;
      for (int d : divisions) {
        int div_threats = 0;
        int div_above = 0;
        for (int b : season.groups[d].teams) {
          if (b == a) continue;
          if (threat(records[b], ra)) ++div_threats;
          if (surely_above(records[b], ra)) ++div_above;
        }
        threats += div_threats;
        pool_above += std::max(0, div_above - 1);
        if (d != season.teams[a].division) {
          if (div_threats > 0) ++other_divs_with_threat;
          if (div_above > 0) ++other_divs_with_above;
        }
      }
      const bool div_clinched = marks[a].division == Certainty::kClinched;
      const bool div_out = marks[a].division == Certainty::kEliminated;
      const bool as_winner = div_clinched && other_divs_with_threat < winners;
      const bool at_large = threats < q.at_large + (all_winners ? 1 : 0);
      if (as_winner || at_large) {
        marks[a].berth = Certainty::kClinched;
        continue;
      }
      const bool winner_possible = !div_out && winners > 0 && other_divs_with_above < winners;
      const bool at_large_possible = pool_above < q.at_large;
      if (!winner_possible && !at_large_possible) marks[a].berth = Certainty::kEliminated;
    }
  }
  return marks;
}

}  // namespace standfast::engine
