#include "engine/shift_replay.h"

#include <algorithm>
#include <cmath>
#include <stdexcept>

#include "engine/tiebreak.h"

namespace standfast::engine {

ShiftReplay::ShiftReplay(const Plan& plan, bool postseason)
    : plan_(plan), runner_(plan, postseason), w_(plan) {
  if (!plan.forced.empty() || plan.counted_matchups < plan.matchups.size())
    throw std::invalid_argument("ShiftReplay: the plan has scenario edits");
  draws_per_game_ =
      plan.model == GameModel::kNegativeBinomial || plan.model == GameModel::kPoisson ? 2 : 1;
  bits_.resize(plan.remaining_games() * static_cast<std::size_t>(draws_per_game_) + 1);
  const auto n = static_cast<std::size_t>(plan.teams);
  team_games_.resize(n);
  for (std::size_t t = 0; t < n; ++t) team_games_[t].slots.push_back(static_cast<std::uint16_t>(t));
  for (std::size_t k = 0; k < plan.overrides.size(); ++k)
    team_games_[plan.overrides[k].team].slots.push_back(static_cast<std::uint16_t>(n + k));
  std::vector<int> team_of(static_cast<std::size_t>(plan.slots));
  for (std::size_t t = 0; t < n; ++t)
    for (std::uint16_t s : team_games_[t].slots) team_of[s] = static_cast<int>(t);
  for (std::size_t m = 0; m < plan.matchups.size(); ++m) {
    const Matchup& x = plan.matchups[m];
    team_games_[static_cast<std::size_t>(team_of[x.home_slot])].matchups.push_back(
        static_cast<std::uint32_t>(m));
    team_games_[static_cast<std::size_t>(team_of[x.away_slot])].matchups.push_back(
        static_cast<std::uint32_t>(m));
  }
  std::size_t most = 0;
  for (std::size_t g = 0; g < plan.remaining_games(); ++g) {
    team_games_[plan.home_team[g]].games.push_back(static_cast<std::uint32_t>(g));
    team_games_[plan.away_team[g]].games.push_back(static_cast<std::uint32_t>(g));
  }
  for (const TeamGames& tg : team_games_) most = std::max(most, tg.games.size());
  // The short cut of out_of_it: the seeding takes the best division winners of a conference
  // and then the best of the rest (engine/seeding.cpp), so a team that does not win its
  // division and trails at least (division-winner berths + at-large berths) teams of its
  // conference has no berth whatever the tiebreakers. Only for conference brackets (or no
  // postseason); -1 elsewhere.
  conference_mates_.resize(n);
  quota_.assign(n, -1);
  const bool by_conference = std::all_of(plan.brackets.begin(), plan.brackets.end(),
                                         [](const PlanBracket& b) { return b.conference >= 0; });
  for (std::size_t t = 0; t < n; ++t) {
    for (std::size_t u = 0; u < n; ++u)
      if (u != t && plan.team_conference[u] == plan.team_conference[t])
        conference_mates_[t].push_back(static_cast<int>(u));
    if (!plan.postseason) {
      quota_[t] = 0;
    } else if (by_conference) {
      for (const PlanBracket& b : plan.brackets)
        if (b.conference == plan.team_conference[t])
          quota_[t] = std::max(b.division_winners, 0) + std::max(b.at_large, 0);
    }
  }
  saved_won_.resize(most);
  ties_.resize(most);
  base_.resize(n);
}

void ShiftReplay::baseline(const SeasonStreams& streams) {
  streams_ = streams;
  runner_.draw(streams, w_);
  runner_.play(streams, w_);
  base_record_ = w_.record;  // settles its windows from the baseline's games
  runner_.settle(streams, w_, /*add_tally=*/false);
  for (int t = 0; t < plan_.teams; ++t) base_[static_cast<std::size_t>(t)] = outcome_of(t);
  // The bits each game drew (the season loop takes them from the games stream in game order,
  // then one key for the extra innings).
  Rng games = streams.stream(Purpose::kGames);
  for (std::uint64_t& b : bits_) b = games();
}

TeamOutcome ShiftReplay::baseline_outcome(int team) const {
  return base_[static_cast<std::size_t>(team)];
}

bool ShiftReplay::out_of_it(int team) const {
  const auto t = static_cast<std::size_t>(team);
  const int quota = quota_[t];
  if (quota < 0) return false;
  const SeasonRecord& r = w_.record;
  const int wins = r.wins(team), losses = r.losses(team);
  const int division = plan_.team_division[t];
  bool division_lost = false;
  int ahead = 0;
  for (int u : conference_mates_[t]) {
    if (compare_pct(r.wins(u), r.losses(u), wins, losses) <= 0) continue;
    ++ahead;
    division_lost |= plan_.team_division[static_cast<std::size_t>(u)] == division;
  }
  return division_lost && ahead >= quota;
}

TeamOutcome ShiftReplay::outcome_of(int team) const {
  const auto t = static_cast<std::size_t>(team);
  TeamOutcome o;
  o.division = w_.division_winner[t] != 0;
  o.postseason = w_.seed_of[t] > 0;
  o.bye = w_.is_bye[t] != 0;
  o.title = w_.champion == team;
  o.wins = w_.record.wins(team);
  return o;
}

// The same arithmetic as an added-runs override step (SeasonRunner::draw_strengths), so that
// the replay equals the season loop on such a plan bit for bit.
void shift_strength(const Plan& plan, double shift, double& off, double& def, double& odds) {
  constexpr double MIN_RATE = 0.01;
  if (plan.model == GameModel::kLog5) {
    odds *= std::exp(shift);
    return;
  }
  const double lm = plan.league_mean;
  const double add_offence = (shift / 2) / lm, add_defence = (-shift / 2) / lm;
  off = lm * std::max(off / lm + add_offence, MIN_RATE);
  def = std::max(def + add_defence, MIN_RATE);
}

TeamOutcome ShiftReplay::shifted(int team, double shift) {
  const TeamGames& tg = team_games_[static_cast<std::size_t>(team)];
  // Save what the replay changes.
  saved_off_.clear();
  saved_def_.clear();
  saved_odds_.clear();
  for (std::uint16_t s : tg.slots) {
    saved_off_.push_back(w_.off[s]);
    saved_def_.push_back(w_.def[s]);
    saved_odds_.push_back(w_.odds[s]);
  }
  for (std::uint16_t s : tg.slots) shift_strength(plan_, shift, w_.off[s], w_.def[s], w_.odds[s]);
  const SeasonTotals::Sink sink = w_.totals.sink();
  saved_sides_.clear();
  saved_word_.clear();
  for (std::uint32_t m : tg.matchups) {
    saved_sides_.push_back(w_.matchup[m]);
    saved_word_.push_back(sink.word[m]);
    w_.matchup[m] = runner_.matchup_sides(w_, m);
    sink.word[m] = 0;
  }
  // The team's games again, with the bits they drew, as SeasonRunner::play_regular plays them.
  const GameEngine& engine = runner_.games();
  const std::uint32_t* game_matchup = plan_.game_matchup.data();
  std::size_t tied = 0;
  for (std::size_t i = 0; i < tg.games.size(); ++i) {
    const std::uint32_t g = tg.games[i];
    const std::uint32_t m = game_matchup[g];
    const Sides& p = w_.matchup[m];
    saved_won_[i] = sink.home_won[g];
    std::uint32_t home_won, hr = 0, ar = 0;
    if (plan_.model == GameModel::kLog5) {
      home_won = static_cast<double>(bits_[g] >> 11) * 0x1.0p-53 < p.home;
    } else {
      int h, a;
      if (plan_.model == GameModel::kWeibull) {
        const WeibullTable::Pair score = engine.weibull().score_pair(bits_[g], &p.home);
        h = score.home;
        a = score.away;
      } else {
        h = engine.counts().score(bits_[2 * g], p.home);
        a = engine.counts().score(bits_[2 * g + 1], p.away);
      }
      home_won = h > a;
      hr = static_cast<std::uint32_t>(h);
      ar = static_cast<std::uint32_t>(a);
      ties_[tied] = g;
      tied += h == a;
    }
    sink.add(g, m, home_won, hr, ar);
  }
  if (tied > 0) {
    const std::uint64_t key = bits_.back();
    const std::uint32_t* ties = ties_.data();
    engine.extra_innings().play_all_with(
        [key, ties](std::uint32_t i, int number) {
          return keyed_bits(key, ties[i], static_cast<std::uint64_t>(number));
        },
        tied, [&](std::size_t i) -> const Sides& { return w_.matchup[game_matchup[ties[i]]]; },
        w_.tie_open.data(), w_.tie_outcome.data(), /*cap_innings=*/true);
    constexpr std::uint32_t room = TotalsLayout::MAX_RUNS - TotalsLayout::MAX_RUNS / 2;
    for (std::size_t i = 0; i < tied; ++i) {
      const std::uint32_t g = ties_[i];
      const ExtraInnings::Outcome& x = w_.tie_outcome[i];
      sink.add_extra(g, game_matchup[g], x.home_won, std::min(x.home_runs, room),
                     std::min(x.away_runs, room));
    }
  }
  w_.record = base_record_;
  w_.totals.update(w_.record, tg.matchups, saved_word_);
  TeamOutcome out;
  if (out_of_it(team)) {
    out.wins = w_.record.wins(team);
    ++decided_by_record_;
  } else {
    runner_.settle(streams_, w_, /*add_tally=*/false, team);
    out = outcome_of(team);
  }
  // Back to the baseline.
  for (std::size_t i = 0; i < tg.games.size(); ++i) sink.home_won[tg.games[i]] = saved_won_[i];
  for (std::size_t j = 0; j < tg.matchups.size(); ++j) {
    w_.matchup[tg.matchups[j]] = saved_sides_[j];
    sink.word[tg.matchups[j]] = saved_word_[j];
  }
  for (std::size_t j = 0; j < tg.slots.size(); ++j) {
    w_.off[tg.slots[j]] = saved_off_[j];
    w_.def[tg.slots[j]] = saved_def_[j];
    w_.odds[tg.slots[j]] = saved_odds_[j];
  }
  return out;
}

}  // namespace standfast::engine
