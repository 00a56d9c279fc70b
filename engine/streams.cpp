#include "engine/streams.h"

namespace standfast::engine {

// Reads and sets the state of a pcg64 and computes its affine jump maps (protected in pcg).
class SeasonStreams::Access : public Rng {
 public:
  explicit Access(const Rng& rng) : Rng(rng) {}
  State state() const { return state_; }
  void set_state(State s) { state_ = s; }
  // The map state -> state * mult + plus of advancing `delta` steps.
  void jump_map(State delta, State& mult, State& plus) const {
    plus = Rng::advance(State(0), delta, this->multiplier(), this->increment());
    mult = Rng::advance(State(1), delta, this->multiplier(), this->increment()) - plus;
  }
};

SeasonStreams::SeasonStreams(std::uint64_t seed, std::uint64_t season)
    : seed_(seed), season_(season) {
  const Access first(make_stream(seed, season, Purpose::kStrengths));
  base_state_ = first.state();
  first.jump_map(State(1) << 64, mult_, plus_);
  first.jump_map(State(kPurposeCount) << 64, mult_season_, plus_season_);
}

Rng SeasonStreams::stream(Purpose purpose) const {
  State s = base_state_;
  for (std::uint32_t p = 0; p < static_cast<std::uint32_t>(purpose); ++p) s = s * mult_ + plus_;
  Access a{Rng(seed_)};
  a.set_state(s);
  return static_cast<Rng>(a);
}

void SeasonStreams::next() {
  base_state_ = base_state_ * mult_season_ + plus_season_;
  ++season_;
}

}  // namespace standfast::engine
