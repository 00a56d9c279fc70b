#include "engine/tally.h"

#include <algorithm>
#include <cmath>
#include <stdexcept>
#include <string>

#include "engine/simulate.h"

namespace standfast::engine {

Tally::Tally(int teams, int rounds, int max_wins, int max_seed)
    : teams_(teams), rounds_(rounds), max_wins_(max_wins), max_seed_(max_seed) {
  const auto n = static_cast<std::size_t>(teams);
  division_.assign(n, 0);
  postseason_.assign(n, 0);
  bye_.assign(n, 0);
  title_.assign(n, 0);
  losses_.assign(n, 0);
  reached_.assign(n * static_cast<std::size_t>(rounds), 0);
  wins_.assign(n * static_cast<std::size_t>(max_wins + 1), 0);
  seed_.assign(n * static_cast<std::size_t>(max_seed + 1), 0);
}

void Tally::clear() {
  seasons_ = games_ = extra_ = drawn_ = 0;
  for (auto* v : {&division_, &postseason_, &bye_, &title_, &losses_, &reached_, &wins_, &seed_})
    std::fill(v->begin(), v->end(), 0);
}

void Tally::merge(const Tally& o) {
  seasons_ += o.seasons_;
  games_ += o.games_;
  extra_ += o.extra_;
  drawn_ += o.drawn_;
  auto add = [](std::vector<std::uint64_t>& a, const std::vector<std::uint64_t>& b) {
    for (std::size_t i = 0; i < a.size() && i < b.size(); ++i) a[i] += b[i];
  };
  add(division_, o.division_);
  add(postseason_, o.postseason_);
  add(bye_, o.bye_);
  add(title_, o.title_);
  add(losses_, o.losses_);
  add(reached_, o.reached_);
  add(wins_, o.wins_);
  add(seed_, o.seed_);
}

std::vector<std::uint64_t> Tally::counts() const {
  std::vector<std::uint64_t> c{seasons_, games_, extra_, drawn_};
  for (const auto* v :
       {&division_, &postseason_, &bye_, &title_, &losses_, &reached_, &wins_, &seed_})
    c.insert(c.end(), v->begin(), v->end());
  return c;
}

void Tally::set_counts(const std::vector<std::uint64_t>& c) {
  if (c.size() != counts().size())
    throw std::invalid_argument("Tally::set_counts: " + std::to_string(c.size()) +
                                " counts for a tally of " + std::to_string(counts().size()));
  seasons_ = c[0];
  games_ = c[1];
  extra_ = c[2];
  drawn_ = c[3];
  auto it = c.begin() + 4;
  for (auto* v : {&division_, &postseason_, &bye_, &title_, &losses_, &reached_, &wins_, &seed_}) {
    std::copy(it, it + static_cast<std::ptrdiff_t>(v->size()), v->begin());
    it += static_cast<std::ptrdiff_t>(v->size());
  }
}

Probability probability(std::uint64_t count, std::uint64_t n) {
  Probability p;
  if (n == 0) return p;
  p.p = static_cast<double>(count) / static_cast<double>(n);
  p.se = std::sqrt(p.p * (1.0 - p.p) / static_cast<double>(n));
  return p;
}

double Tally::max_se() const {
  double m = 0;
  auto scan = [&](const std::vector<std::uint64_t>& v) {
    for (auto c : v) m = std::max(m, probability(c, seasons_).se);
  };
  scan(division_);
  scan(postseason_);
  scan(bye_);
  scan(title_);
  scan(reached_);
  return m;
}

std::size_t Tally::bytes() const {
  std::size_t b = sizeof(*this);
  for (auto* v : {&division_, &postseason_, &bye_, &title_, &losses_, &reached_, &wins_, &seed_})
    b += v->capacity() * sizeof(std::uint64_t);
  return b;
}

double histogram_percentile(const std::vector<std::uint64_t>& h, double q) {
  std::uint64_t total = 0;
  for (auto c : h) total += c;
  if (total == 0) return 0;
  // Smallest w whose cumulative count reaches q * total (integer arithmetic on the threshold).
  const auto need = static_cast<std::uint64_t>(std::ceil(q * static_cast<double>(total)));
  std::uint64_t cum = 0;
  for (std::size_t w = 0; w < h.size(); ++w) {
    cum += h[w];
    if (cum >= need && cum > 0) return static_cast<double>(w);
  }
  return static_cast<double>(h.size() - 1);
}

void Tally::fill(SimulationResult& r) const {
  r.seasons = seasons_;
  r.games_simulated = games_;
  r.extra_innings_games = extra_;
  r.drawn_games = drawn_;
  r.extra_innings_share = games_ ? static_cast<double>(extra_) / static_cast<double>(games_) : 0.0;
  r.max_se = max_se();
  r.teams.assign(static_cast<std::size_t>(teams_), TeamOdds{});
  for (std::size_t t = 0; t < r.teams.size(); ++t) {
    TeamOdds& o = r.teams[t];
    o.division = probability(division_[t], seasons_);
    o.postseason = probability(postseason_[t], seasons_);
    o.bye = probability(bye_[t], seasons_);
    o.title = probability(title_[t], seasons_);
    o.reached_round.resize(static_cast<std::size_t>(rounds_));
    for (int k = 0; k < rounds_; ++k)
      o.reached_round[static_cast<std::size_t>(k)] = probability(
          reached_[t * static_cast<std::size_t>(rounds_) + static_cast<std::size_t>(k)], seasons_);
    const auto w0 =
        wins_.begin() + static_cast<std::ptrdiff_t>(t * static_cast<std::size_t>(max_wins_ + 1));
    o.wins_histogram.assign(w0, w0 + max_wins_ + 1);
    const auto s0 =
        seed_.begin() + static_cast<std::ptrdiff_t>(t * static_cast<std::size_t>(max_seed_ + 1));
    o.seed_histogram.assign(s0, s0 + max_seed_ + 1);
    std::uint64_t sum = 0;
    for (std::size_t w = 0; w < o.wins_histogram.size(); ++w) sum += w * o.wins_histogram[w];
    if (seasons_) {
      o.mean_wins = static_cast<double>(sum) / static_cast<double>(seasons_);
      o.mean_losses = static_cast<double>(losses_[t]) / static_cast<double>(seasons_);
    }
    o.wins_p10 = histogram_percentile(o.wins_histogram, 0.10);
    o.wins_p50 = histogram_percentile(o.wins_histogram, 0.50);
    o.wins_p90 = histogram_percentile(o.wins_histogram, 0.90);
  }
}

}  // namespace standfast::engine
