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
  scratch_.assign(3 * n, 0);
  for (int t = 0; t < n_; ++t) {
    at(kDivision, t) = division[t];
    at(kConference, t) = conference[t];
  }
}

void SeasonRecord::clear() {
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

void SeasonRecord::add_results(const std::uint16_t* winner, const std::uint16_t* loser,
                               const std::uint16_t* winner_runs, const std::uint16_t* loser_runs,
                               std::size_t count) {
  const auto n = static_cast<std::size_t>(n_);
  std::int32_t* d = data_.data();
  std::int32_t* wins = d + kWins * n;
  std::int32_t* losses = d + kLosses * n;
  std::int32_t* runs_for = d + kRunsFor * n;
  std::int32_t* runs_against = d + kRunsAgainst * n;
  std::int32_t* div_wins = d + kDivWins * n;
  std::int32_t* div_losses = d + kDivLosses * n;
  std::int32_t* conf_wins = d + kConfWins * n;
  std::int32_t* conf_losses = d + kConfLosses * n;
  const std::int32_t* division = d + kDivision * n;
  const std::int32_t* conference = d + kConference * n;
  std::int32_t* h2h = d + h2h_;
  for (std::size_t i = 0; i < count; ++i) {
    const std::size_t w = winner[i], l = loser[i];
    const std::int32_t wr = winner_runs[i], lr = loser_runs[i];
    ++wins[w];
    ++losses[l];
    runs_for[w] += wr;
    runs_against[w] += lr;
    runs_for[l] += lr;
    runs_against[l] += wr;
    ++h2h[w * n + l];
    const std::int32_t same_div = division[w] == division[l];
    const std::int32_t same_conf = conference[w] == conference[l];
    div_wins[w] += same_div;
    div_losses[l] += same_div;
    conf_wins[w] += same_conf;
    conf_losses[l] += same_conf;
  }
  std::int32_t* in_scope = scratch_.data();         // per team: the batch's games in scope
  std::int32_t* filled = scratch_.data() + n;       // per team: results written so far
  std::int32_t* end_pos = scratch_.data() + 2 * n;  // per team: ring head after the batch
  for (std::size_t k = 0; k < windows_.size(); ++k) {
    const auto scope = windows_[k].scope;
    const std::int32_t* group = scope == config::TiebreakScope::kDivision     ? division
                                : scope == config::TiebreakScope::kConference ? conference
                                                                              : nullptr;
    const auto games = static_cast<std::int32_t>(windows_[k].games);
    std::int32_t* base = d + win_base_[k];
    std::int32_t* w_wins = base;
    std::int32_t* w_count = base + n;
    std::int32_t* w_head = base + 2 * n;
    std::int32_t* rings = base + 3 * n;
    std::fill(in_scope, in_scope + 2 * n, 0);
    for (std::size_t i = 0; i < count; ++i) {
      const std::int32_t in = group ? group[winner[i]] == group[loser[i]] : 1;
      in_scope[winner[i]] += in;
      in_scope[loser[i]] += in;
    }
    // The last `games` in-scope results of each team, written where sequential pushes would
    // have put them: the j-th from the end goes to (new head - 1 - j) mod games. The scan
    // stops once every team's ring is full (or holds all of its games of the batch).
    std::size_t open = 0;
    for (std::size_t t = 0; t < n; ++t) {
      open += in_scope[t] > 0;
      end_pos[t] = (w_head[t] + in_scope[t]) % games;
    }
    auto place = [&](std::size_t t, std::int32_t won) {
      if (filled[t] >= games || filled[t] >= in_scope[t]) return;
      std::int32_t pos = end_pos[t] - 1 - filled[t];  // filled < games: one wrap at most
      if (pos < 0) pos += games;
      rings[t * static_cast<std::size_t>(games) + static_cast<std::size_t>(pos)] = won;
      ++filled[t];
      open -= filled[t] == games || filled[t] == in_scope[t];
    };
    for (std::size_t i = count; i-- > 0 && open > 0;) {
      if (group && group[winner[i]] != group[loser[i]]) continue;
      place(winner[i], 1);
      place(loser[i], 0);
    }
    for (std::size_t t = 0; t < n; ++t) {
      if (in_scope[t] == 0) continue;
      w_count[t] = std::min(games, w_count[t] + in_scope[t]);
      w_head[t] = end_pos[t];
      const std::int32_t* ring = rings + t * static_cast<std::size_t>(games);
      std::int32_t sum = 0;
      for (std::int32_t j = 0; j < games; ++j) sum += ring[j];
      w_wins[t] = sum;
    }
  }
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
