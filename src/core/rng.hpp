// The bootstrap's pseudo-random generator (bootstrap.hpp), in a header of its
// own so that the kernels (kernels.hpp) can draw resamples inside their loops.
#pragma once

#include <cstdint>

namespace striae {

// Pseudo-random generator of our own, identical on every platform: xoshiro256**
// (Blackman & Vigna 2021, ACM Trans. Math. Softw. 47(4):36), its state filled by
// splitmix64 (Steele, Lea & Flood 2014, OOPSLA) from a 64-bit seed. Constants from
// memory of the published algorithms. Bounded integers by Lemire's multiply-and-
// reject method (Lemire 2019, ACM TOMACS 29(1):3), which is exactly uniform.
class Rng {
 public:
  explicit Rng(uint64_t seed);
  inline uint64_t next();                 // 64 random bits
  inline uint32_t below(uint32_t bound);  // uniform in [0, bound), bound >= 1
  double uniform();                       // uniform in [0, 1), 53 random bits
  double normal();                        // standard normal (Marsaglia polar method), for tests and demos

 private:
  static uint64_t rotl(uint64_t x, int k) { return (x << k) | (x >> (64 - k)); }
  uint64_t s_[4];
};

// Inline: a bootstrap of 1000 resamples of 10^4 data draws 10^7 times, and
// as calls the draws took 40 % of its time.

// xoshiro256** step.
inline uint64_t Rng::next() {
  const uint64_t result = rotl(s_[1] * 5, 7) * 9;
  const uint64_t t = s_[1] << 17;
  s_[2] ^= s_[0];
  s_[3] ^= s_[1];
  s_[1] ^= s_[2];
  s_[0] ^= s_[3];
  s_[2] ^= t;
  s_[3] = rotl(s_[3], 45);
  return result;
}

// Lemire's unbiased bounded integer on the top 32 bits of a draw.
inline uint32_t Rng::below(uint32_t bound) {
  uint64_t m = (next() >> 32) * static_cast<uint64_t>(bound);
  uint32_t low = static_cast<uint32_t>(m);
  if (low < bound) {
    const uint32_t threshold = static_cast<uint32_t>(-bound) % bound;  // 2^32 mod bound
    while (low < threshold) {
      m = (next() >> 32) * static_cast<uint64_t>(bound);
      low = static_cast<uint32_t>(m);
    }
  }
  return static_cast<uint32_t>(m >> 32);
}

}  // namespace striae
