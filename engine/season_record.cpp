#include "engine/season_record.h"

#include <algorithm>
#include <stdexcept>
#include <string>

namespace standfast::engine {

std::vector<LastGamesWindow> last_games_windows(const config::Tiebreakers& tiebreakers) {
  std::vector<LastGamesWindow> out;
  for (const auto& rule : tiebreakers.order) {
    if (rule.kind != config::TiebreakKind::kLastGames) continue;
    const LastGamesWindow w{rule.games, rule.scope};
    if (std::find(out.begin(), out.end(), w) == out.end()) out.push_back(w);
  }
  return out;
}

SeasonRecord::SeasonRecord(std::span<const int> division, std::span<const int> conference,
                           std::span<const LastGamesWindow> windows)
    : n_(static_cast<int>(division.size())), windows_(windows.begin(), windows.end()) {
  if (conference.size() != division.size()) {
    throw std::invalid_argument("SeasonRecord: division and conference sizes differ");
  }
  const auto n = static_cast<std::size_t>(n_);
  std::size_t size = kBlockCount * n;
  h2h_ = size;
  size += n * n;
  for (const auto& w : windows_) {
    if (w.games < 1) {
      throw std::invalid_argument("SeasonRecord: last-games window of " + std::to_string(w.games) +
                                  " games; must be at least 1");
    }
    win_base_.push_back(size);
    size += (3 + static_cast<std::size_t>(w.games)) * n;
  }
  data_.assign(size, 0);
  for (int t = 0; t < n_; ++t) {
    at(kDivision, t) = division[t];
    at(kConference, t) = conference[t];
  }
}

SeasonRecord::SeasonRecord(const SeasonRecord& other)
    : n_(other.n_), h2h_(other.h2h_), windows_(other.windows_), win_base_(other.win_base_) {
  other.settle_windows();
  data_ = other.data_;
}

SeasonRecord& SeasonRecord::operator=(const SeasonRecord& other) {
  if (this == &other) return *this;
  other.settle_windows();
  fill_ = nullptr;  // this record's own deferred windows are overwritten
  fill_context_ = nullptr;
  n_ = other.n_;
  h2h_ = other.h2h_;
  windows_ = other.windows_;
  win_base_ = other.win_base_;
  data_ = other.data_;  // same size: reuses the storage
  return *this;
}

void SeasonRecord::clear() {
  fill_ = nullptr;
  fill_context_ = nullptr;
  std::fill(data_.begin() + static_cast<std::ptrdiff_t>(kWins) * n_, data_.end(), 0);
}

int SeasonRecord::find_window(const LastGamesWindow& w) const {
  for (std::size_t k = 0; k < windows_.size(); ++k) {
    if (windows_[k] == w) return static_cast<int>(k);
  }
  return -1;
}

void SeasonRecord::push_window(int k, int team, int won) {
  const auto n = static_cast<std::size_t>(n_);
  const auto games = static_cast<std::size_t>(windows_[k].games);
  std::int32_t* base = data_.data() + win_base_[k];
  std::int32_t& wins = base[team];
  std::int32_t& count = base[n + team];
  std::int32_t& head = base[2 * n + team];
  std::int32_t* ring = base + 3 * n + static_cast<std::size_t>(team) * games;
  if (static_cast<std::size_t>(count) == games) {
    wins -= ring[head];  // the oldest result leaves the window
  } else {
    ++count;
  }
  ring[head] = won;
  wins += won;
  head = (static_cast<std::size_t>(head) + 1 == games) ? 0 : head + 1;
}

void SeasonRecord::add_result(int winner, int loser, int winner_runs, int loser_runs) {
  settle_windows();
  ++at(kWins, winner);
  ++at(kLosses, loser);
  at(kRunsFor, winner) += winner_runs;
  at(kRunsAgainst, winner) += loser_runs;
  at(kRunsFor, loser) += loser_runs;
  at(kRunsAgainst, loser) += winner_runs;
  ++data_[h2h_ + static_cast<std::size_t>(winner) * n_ + loser];
  const bool same_div = at(kDivision, winner) == at(kDivision, loser);
  const bool same_conf = at(kConference, winner) == at(kConference, loser);
  if (same_div) {
    ++at(kDivWins, winner);
    ++at(kDivLosses, loser);
  }
  if (same_conf) {
    ++at(kConfWins, winner);
    ++at(kConfLosses, loser);
  }
  for (int k = 0; k < static_cast<int>(windows_.size()); ++k) {
    const auto scope = windows_[k].scope;
    if (scope == config::TiebreakScope::kDivision && !same_div) continue;
    if (scope == config::TiebreakScope::kConference && !same_conf) continue;
    push_window(k, winner, 1);
    push_window(k, loser, 0);
  }
}

void SeasonRecord::set_window(int k, int t, std::span<const std::int32_t> oldest_first) {
  settle_windows();
  const auto n = static_cast<std::size_t>(n_);
  const auto games = static_cast<std::size_t>(windows_[k].games);
  std::int32_t* base = data_.data() + win_base_[k];
  std::int32_t* ring = base + 3 * n + static_cast<std::size_t>(t) * games;
  const std::size_t m = std::min(games, oldest_first.size());
  const std::int32_t* from = oldest_first.data() + (oldest_first.size() - m);
  std::int32_t wins = 0;
  for (std::size_t j = 0; j < m; ++j) {
    ring[j] = from[j];
    wins += from[j];
  }
  // The state push_window leaves after pushing these m results into an empty ring.
  base[t] = wins;
  base[n + t] = static_cast<std::int32_t>(m);
  base[2 * n + t] = static_cast<std::int32_t>(m == games ? 0 : m);
}

std::vector<std::int32_t> SeasonRecord::window_results(int k, int t) const {
  settle_windows();
  const auto n = static_cast<std::size_t>(n_);
  const auto games = static_cast<std::size_t>(windows_[k].games);
  const std::int32_t* base = data_.data() + win_base_[k];
  const std::int32_t* ring = base + 3 * n + static_cast<std::size_t>(t) * games;
  const auto count = static_cast<std::size_t>(base[n + t]);
  const auto head = static_cast<std::size_t>(base[2 * n + t]);
  // The oldest result sits at head when the ring is full, at 0 otherwise.
  const std::size_t start = count == games ? head : 0;
  std::vector<std::int32_t> out;
  out.reserve(count);
  for (std::size_t j = 0; j < count; ++j) out.push_back(ring[(start + j) % games]);
  return out;
}

SeasonRecord make_record(const config::Season& season) {
  std::vector<int> division;
  std::vector<int> conference;
  division.reserve(season.teams.size());
  conference.reserve(season.teams.size());
  for (const auto& t : season.teams) {
    division.push_back(t.division);
    conference.push_back(t.conference);
  }
  const auto windows = last_games_windows(season.tiebreakers);
  return SeasonRecord(division, conference, windows);
}

std::vector<int> played_games_in_order(const config::Season& season) {
  std::vector<int> order;
  for (std::size_t g = 0; g < season.games.size(); ++g) {
    const auto& game = season.games[g];
    if (game.played && game.date.has_value()) order.push_back(static_cast<int>(g));
  }
  std::stable_sort(order.begin(), order.end(),
                   [&](int a, int b) { return *season.games[a].date < *season.games[b].date; });
  return order;
}

SeasonRecord played_record(const config::Season& season) {
  SeasonRecord record = make_record(season);
  for (int g : played_games_in_order(season)) {
    const auto& game = season.games[g];
    if (game.home_runs == game.away_runs) continue;  // never valid (the loader rejects it)
    if (game.home_runs > game.away_runs) {
      record.add_result(game.home, game.away, game.home_runs, game.away_runs);
    } else {
      record.add_result(game.away, game.home, game.away_runs, game.home_runs);
    }
  }
  return record;
}

}  // namespace standfast::engine
