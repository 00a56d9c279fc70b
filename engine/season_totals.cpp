#include "engine/season_totals.h"

#include <algorithm>
#include <stdexcept>
#include <string>
#include <utility>

namespace standfast::engine {

namespace {

bool in_scope(const SeasonRecord& r, config::TiebreakScope scope, int a, int b) {
  switch (scope) {
    case config::TiebreakScope::kDivision:
      return r.division_of(a) == r.division_of(b);
    case config::TiebreakScope::kConference:
      return r.conference_of(a) == r.conference_of(b);
    case config::TiebreakScope::kLeague:
      break;
  }
  return true;
}

}  // namespace

TotalsLayout::TotalsLayout(std::span<const std::uint16_t> home, std::span<const std::uint16_t> away,
                           std::span<const std::uint32_t> group, const SeasonRecord& base,
                           std::uint32_t counted, std::span<const std::uint32_t> chronological)
    : teams_(base.team_count()), games_(home.size()) {
  if (!chronological.empty() && chronological.size() != home.size())
    throw std::invalid_argument("TotalsLayout: the chronological order lists " +
                                std::to_string(chronological.size()) + " games, not " +
                                std::to_string(home.size()));
  if (home.size() != away.size() || home.size() != group.size())
    throw std::invalid_argument("TotalsLayout: home, away and group lists differ in length");
  const auto n = static_cast<std::size_t>(teams_);
  const std::size_t count = home.size();
  games_left_.assign(n, 0);
  division_left_.assign(n, 0);
  conference_left_.assign(n, 0);
  for (std::size_t g = 0; g < count; ++g) {
    const int h = home[g], a = away[g];
    const std::uint32_t k = group[g];
    if (h >= teams_ || a >= teams_ || h == a)
      throw std::invalid_argument("TotalsLayout: game " + std::to_string(g) +
                                  " has bad team indexes");
    if (k >= count)
      throw std::invalid_argument("TotalsLayout: game " + std::to_string(g) + " has group " +
                                  std::to_string(k) + "; groups are numbered from 0");
    all_groups_ = std::max<std::size_t>(all_groups_, k + 1);
    if (k >= counted) continue;  // counts for nobody
    const bool same_div = base.division_of(h) == base.division_of(a);
    const bool same_conf = base.conference_of(h) == base.conference_of(a);
    if (k >= groups_.size()) groups_.resize(k + 1, Group{0, 0, -1, 0});
    Group& gr = groups_[k];
    if (gr.games < 0) {
      gr = Group{home[g], away[g], 0,
                 1u | static_cast<std::uint64_t>(same_div) << 16 |
                     static_cast<std::uint64_t>(same_conf) << 32};
    } else if (gr.home != h || gr.away != a) {
      throw std::invalid_argument("TotalsLayout: game " + std::to_string(g) + " is in group " +
                                  std::to_string(k) + " but not between its teams");
    }
    if (++gr.games > static_cast<std::int32_t>(MAX_GROUP_GAMES))
      throw std::invalid_argument("TotalsLayout: group " + std::to_string(k) + " has more than " +
                                  std::to_string(MAX_GROUP_GAMES) + " games");
    for (int t : {h, a}) {
      const auto ut = static_cast<std::size_t>(t);
      division_left_[ut] += same_div;
      conference_left_[ut] += same_conf;
      if (++games_left_[ut] > 65535)
        throw std::invalid_argument("TotalsLayout: team " + std::to_string(t) +
                                    " has more than 65535 games left");
    }
  }
  for (std::size_t k = 0; k < groups_.size(); ++k)
    if (groups_[k].games < 0)
      throw std::invalid_argument("TotalsLayout: group " + std::to_string(k) + " has no games");
  for (int k = 0; k < base.window_count(); ++k) {
    const LastGamesWindow& w = base.window(k);
    const auto size = static_cast<std::size_t>(w.games);
    // One backward pass: each team's last `size` games in scope, newest first.
    std::vector<WindowTeam> per_team(n);
    for (std::size_t c = count; c-- > 0;) {
      const std::size_t g = chronological.empty() ? c : chronological[c];
      if (group[g] >= counted) continue;
      const int h = home[g], a = away[g];
      if (!in_scope(base, w.scope, h, a)) continue;
      for (int t : {h, a}) {
        auto& list = per_team[static_cast<std::size_t>(t)].games;
        if (list.size() < size) list.push_back(static_cast<std::uint32_t>(g) << 1 | (h == t));
      }
    }
    for (int t = 0; t < teams_; ++t) {
      WindowTeam& wt = per_team[static_cast<std::size_t>(t)];
      if (wt.games.empty()) continue;  // the window keeps its played results
      wt.window = k;
      wt.team = t;
      std::reverse(wt.games.begin(), wt.games.end());
      const std::vector<std::int32_t> played = base.window_results(k, t);
      const std::size_t keep = std::min(played.size(), size - wt.games.size());
      wt.played.assign(played.end() - static_cast<std::ptrdiff_t>(keep), played.end());
      windows_.push_back(std::move(wt));
    }
  }
}

SeasonTotals::SeasonTotals(const TotalsLayout& layout)
    : layout_(&layout),
      word_(std::max(layout.all_groups_, layout.groups_.size())),
      home_won_(layout.games()),
      team_credit_(static_cast<std::size_t>(layout.teams_)),
      team_runs_(static_cast<std::size_t>(layout.teams_)) {
  std::size_t longest = 0;
  for (const auto& w : layout.windows_)
    longest = std::max(longest, w.played.size() + w.games.size());
  window_.resize(longest);
}

void SeasonTotals::clear() { std::fill(word_.begin(), word_.end(), 0); }

void SeasonTotals::force(std::size_t g, std::uint32_t group, bool home_won) {
  constexpr std::uint64_t RUNS_MASK = (1u << 26) - 1u;
  const std::uint64_t w = word_[group];
  std::uint64_t home_runs = (w >> 26) & RUNS_MASK, away_runs = w & RUNS_MASK;
  if (home_won != (home_runs > away_runs)) std::swap(home_runs, away_runs);
  word_[group] = static_cast<std::uint64_t>(home_won) << 52 | home_runs << 26 | away_runs;
  home_won_[g] = static_cast<std::uint8_t>(home_won);
}

void SeasonTotals::add_to(SeasonRecord& record) {
  const TotalsLayout& l = *layout_;
  constexpr std::uint64_t RUNS_MASK = (1u << 26) - 1u;
  std::fill(team_credit_.begin(), team_credit_.end(), 0);
  std::fill(team_runs_.begin(), team_runs_.end(), 0);
  for (std::size_t k = 0; k < l.groups_.size(); ++k) {
    const TotalsLayout::Group& gr = l.groups_[k];
    const std::uint64_t w = word_[k];
    const std::uint64_t home_wins = w >> 52;
    const std::uint64_t away_wins = static_cast<std::uint64_t>(gr.games) - home_wins;
    const std::uint64_t home_runs = (w >> 26) & RUNS_MASK, away_runs = w & RUNS_MASK;
    team_credit_[gr.home] += home_wins * gr.credit;
    team_credit_[gr.away] += away_wins * gr.credit;
    team_runs_[gr.home] += home_runs << 32 | away_runs;
    team_runs_[gr.away] += away_runs << 32 | home_runs;
    record.add_h2h(gr.home, gr.away, static_cast<int>(home_wins));
    record.add_h2h(gr.away, gr.home, static_cast<int>(away_wins));
  }
  for (std::size_t t = 0; t < team_credit_.size(); ++t) {
    const std::uint64_t c = team_credit_[t];
    SeasonRecord::TeamResults r;
    r.wins = static_cast<int>(c & 0xffff);
    r.division_wins = static_cast<int>((c >> 16) & 0xffff);
    r.conference_wins = static_cast<int>((c >> 32) & 0xffff);
    r.losses = l.games_left_[t] - r.wins;
    r.division_losses = l.division_left_[t] - r.division_wins;
    r.conference_losses = l.conference_left_[t] - r.conference_wins;
    r.runs_for = static_cast<int>(team_runs_[t] >> 32);
    r.runs_against = static_cast<int>(team_runs_[t] & 0xffffffffu);
    record.add_team_results(static_cast<int>(t), r);
  }
  // The windows are filled only if a tiebreak reads one (SeasonRecord::defer_windows).
  if (!l.windows_.empty()) record.defer_windows(this, &SeasonTotals::fill_windows);
}

void SeasonTotals::update(SeasonRecord& record, std::span<const std::uint32_t> groups,
                          std::span<const std::uint64_t> old_words) {
  const TotalsLayout& l = *layout_;
  constexpr std::uint64_t RUNS_MASK = (1u << 26) - 1u;
  for (std::size_t i = 0; i < groups.size(); ++i) {
    const std::uint32_t k = groups[i];
    if (k >= l.groups_.size()) continue;  // a group that counts for nobody
    const TotalsLayout::Group& gr = l.groups_[k];
    const std::uint64_t w0 = old_words[i], w1 = word_[k];
    const int dh = static_cast<int>(w1 >> 52) - static_cast<int>(w0 >> 52);
    const int dhr =
        static_cast<int>((w1 >> 26) & RUNS_MASK) - static_cast<int>((w0 >> 26) & RUNS_MASK);
    const int dar = static_cast<int>(w1 & RUNS_MASK) - static_cast<int>(w0 & RUNS_MASK);
    const int div = static_cast<int>((gr.credit >> 16) & 1u),
              conf = static_cast<int>((gr.credit >> 32) & 1u);
    SeasonRecord::TeamResults h, a;
    h.wins = dh;
    h.losses = -dh;
    h.division_wins = dh * div;
    h.division_losses = -dh * div;
    h.conference_wins = dh * conf;
    h.conference_losses = -dh * conf;
    h.runs_for = dhr;
    h.runs_against = dar;
    a.wins = -dh;
    a.losses = dh;
    a.division_wins = -dh * div;
    a.division_losses = dh * div;
    a.conference_wins = -dh * conf;
    a.conference_losses = dh * conf;
    a.runs_for = dar;
    a.runs_against = dhr;
    record.add_team_results(gr.home, h);
    record.add_team_results(gr.away, a);
    record.add_h2h(gr.home, gr.away, dh);
    record.add_h2h(gr.away, gr.home, -dh);
  }
  if (!l.windows_.empty()) record.defer_windows(this, &SeasonTotals::fill_windows);
}

void SeasonTotals::fill_windows(void* self, SeasonRecord& record) {
  auto& totals = *static_cast<SeasonTotals*>(self);
  for (const TotalsLayout::WindowTeam& w : totals.layout_->windows_) {
    std::int32_t* out = totals.window_.data();
    for (std::int32_t r : w.played) *out++ = r;
    for (std::uint32_t code : w.games) *out++ = totals.home_won_[code >> 1] == (code & 1u) ? 1 : 0;
    record.set_window(w.window, w.team, std::span<const std::int32_t>(totals.window_.data(), out));
  }
}

}  // namespace standfast::engine
