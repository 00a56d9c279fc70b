#include "engine/rng.h"

namespace standfast::engine {

pcg_extras::pcg128_t stream_state(std::uint64_t seed, std::uint64_t block) {
  // Two chained hashes: the seed is hashed first so that (seed, block) pairs never collide
  // through seed + block arithmetic.
  const std::uint64_t key = mix64(seed + 0x9e3779b97f4a7c15ull);
  const std::uint64_t hi = mix64(key ^ mix64(block + 0x243f6a8885a308d3ull));
  const std::uint64_t lo = mix64(hi + 0x9e3779b97f4a7c15ull * (block + 1));
  return (static_cast<pcg_extras::pcg128_t>(hi) << 64) | lo;
}

Rng make_stream(std::uint64_t seed, std::uint64_t season, Purpose purpose) {
  return Rng(stream_state(seed, season * kPurposeCount + static_cast<std::uint32_t>(purpose)));
}

}  // namespace standfast::engine
