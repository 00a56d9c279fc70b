// Integer tallies of simulated seasons. A thread keeps its own Tally; merging adds integers, so
// the merged counts, and every probability, mean and percentile computed from them, are the
// same whatever the number of threads and the order of merging. The size depends on the
// league only, never on the number of seasons.
#ifndef STANDFAST_ENGINE_TALLY_H
#define STANDFAST_ENGINE_TALLY_H

#include <cstdint>
#include <string>
#include <vector>

#include "engine/plan.h"

namespace standfast::engine {

struct SimulationResult;

class Tally {
 public:
  Tally() = default;
  Tally(int teams, int rounds, int max_wins, int max_seed);

  void clear();
  void merge(const Tally& other);
  // Every counter in a fixed order (for adding the tallies of several processes), and back.
  std::vector<std::uint64_t> counts() const;
  void set_counts(const std::vector<std::uint64_t>& counts);  // throws if the size differs

  // One team's season.
  void add_team(int team, int wins, int losses, int seed, bool division, bool bye,
                int last_round_reached, bool title) {
    const auto t = static_cast<std::size_t>(team);
    if (wins > max_wins_) wins = max_wins_;
    ++wins_[t * static_cast<std::size_t>(max_wins_ + 1) + static_cast<std::size_t>(wins)];
    losses_[t] += static_cast<std::uint64_t>(losses);
    if (seed > max_seed_) seed = max_seed_;
    ++seed_[t * static_cast<std::size_t>(max_seed_ + 1) + static_cast<std::size_t>(seed)];
    // Added without branches: which teams win what varies from season to season, so branches
    // here would mispredict often.
    division_[t] += division;
    postseason_[t] += seed > 0;
    bye_[t] += bye;
    title_[t] += title;
    std::uint64_t* reached = reached_.data() + t * static_cast<std::size_t>(rounds_);
    for (int r = 0; r < rounds_; ++r) reached[r] += r <= last_round_reached;
  }
  void add_season() { ++seasons_; }
  void add_games(std::uint64_t games, std::uint64_t extra, std::uint64_t drawn) {
    games_ += games;
    extra_ += extra;
    drawn_ += drawn;
  }

  std::uint64_t seasons() const { return seasons_; }
  // Largest Monte Carlo standard error of any reported probability.
  double max_se() const;
  // Bytes held (for the memory test): depends on the league only.
  std::size_t bytes() const;

  // The result value (round names and seed filled in by the caller).
  void fill(SimulationResult& result) const;

 private:
  int teams_ = 0, rounds_ = 0, max_wins_ = 0, max_seed_ = 0;
  std::uint64_t seasons_ = 0, games_ = 0, extra_ = 0, drawn_ = 0;
  std::vector<std::uint64_t> division_, postseason_, bye_, title_, losses_;
  std::vector<std::uint64_t> reached_;  // team * rounds + r
  std::vector<std::uint64_t> wins_;     // team * (max_wins + 1) + w
  std::vector<std::uint64_t> seed_;     // team * (max_seed + 1) + s
};

// p and sqrt(p (1 - p) / n) from a count.
struct Probability;
Probability probability(std::uint64_t count, std::uint64_t n);

// The smallest w with cumulative count >= q * total (a percentile of an integer histogram).
double histogram_percentile(const std::vector<std::uint64_t>& histogram, double q);

}  // namespace standfast::engine

#endif  // STANDFAST_ENGINE_TALLY_H
