#include "engine/rng.h"

namespace standfast::engine {

Rng make_stream(std::uint64_t seed, std::uint64_t season, Purpose purpose) {
  Rng rng(seed);
  const pcg_extras::pcg128_t block = static_cast<pcg_extras::pcg128_t>(season) * kPurposeCount +
                                     static_cast<std::uint32_t>(purpose);
  rng.advance(block << 64);
  return rng;
}

}  // namespace standfast::engine
