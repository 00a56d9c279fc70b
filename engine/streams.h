// The random streams of consecutive simulated seasons, without an O(log n) jump per stream.
// make_stream (engine/rng.h) places purpose p of season s at block s * kPurposeCount + p of the
// base sequence, 2^64 steps per block. A jump of one block is an affine map of the generator's
// state, so once the first season of a range is placed, every further stream is one multiply
// and one add away. The streams are bit-identical to make_stream (tests/streams_test.cpp).
#ifndef STANDFAST_ENGINE_STREAMS_H
#define STANDFAST_ENGINE_STREAMS_H

#include <cstdint>

#include "engine/rng.h"

namespace standfast::engine {

class SeasonStreams {
 public:
  // Positioned at season `season` of the run with this seed.
  SeasonStreams(std::uint64_t seed, std::uint64_t season);

  // The stream of a purpose of the current season (a fresh copy on every call).
  Rng stream(Purpose purpose) const;

  // Moves to the next season.
  void next();

  std::uint64_t season() const { return season_; }

 private:
  class Access;
  using State = pcg_extras::pcg128_t;
  State base_state_{};                   // state of purpose 0 of the current season
  State mult_{}, plus_{};                // one block: state -> state * mult + plus
  State mult_season_{}, plus_season_{};  // kPurposeCount blocks
  std::uint64_t seed_ = 0, season_ = 0;
};

}  // namespace standfast::engine

#endif  // STANDFAST_ENGINE_STREAMS_H
