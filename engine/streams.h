// The random streams of consecutive simulated seasons, as a cursor over the season index.
// Each stream is make_stream(seed, season, purpose) (engine/rng.h): a hash of the block number,
// so placing a stream costs a few multiplications, never a jump through the sequence.
#ifndef STANDFAST_ENGINE_STREAMS_H
#define STANDFAST_ENGINE_STREAMS_H

#include <cstdint>

#include "engine/rng.h"

namespace standfast::engine {

class SeasonStreams {
 public:
  // Positioned at season `season` of the run with this seed.
  SeasonStreams(std::uint64_t seed, std::uint64_t season) : seed_(seed), season_(season) {}

  // The stream of a purpose of the current season (a fresh copy on every call).
  Rng stream(Purpose purpose) const { return make_stream(seed_, season_, purpose); }

  // Moves to the next season.
  void next() { ++season_; }

  std::uint64_t season() const { return season_; }

 private:
  std::uint64_t seed_ = 0, season_ = 0;
};

}  // namespace standfast::engine

#endif  // STANDFAST_ENGINE_STREAMS_H
