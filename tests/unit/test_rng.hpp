// Reproducible random test data shared by the unit tests: splitmix64, a
// fixed-sequence 64-bit mixer (public domain), so every platform draws the
// same numbers (std:: distributions do not guarantee that).
#pragma once

#include <algorithm>
#include <cmath>
#include <cstdint>

#include "core.hpp"

namespace striae_test {

struct Rng {
  uint64_t s;
  explicit Rng(uint64_t seed) : s(seed) {}
  // Next 64 random bits.
  uint64_t next() {
    uint64_t z = (s += 0x9E3779B97F4A7C15ull);
    z = (z ^ (z >> 30)) * 0xBF58476D1CE4E5B9ull;
    z = (z ^ (z >> 27)) * 0x94D049BB133111EBull;
    return z ^ (z >> 31);
  }
  // Uniform double in [0, 1).
  double uniform() { return static_cast<double>(next() >> 11) * 0x1.0p-53; }
  // Uniform unit vector on the sphere (z uniform in [-1,1]: Archimedes).
  striae::Vec3 unit() {
    const double z = 2 * uniform() - 1, ph = 2 * striae::kPi * uniform();
    const double r = std::sqrt(std::max(0.0, 1 - z * z));
    return striae::Vec3(r * std::cos(ph), r * std::sin(ph), z);
  }
  // Unit vector uniform within a cone of half-angle max_deg around unit axis a.
  striae::Vec3 in_cone(const striae::Vec3 &a, double max_deg) {
    const double cz = 1 - uniform() * (1 - std::cos(striae::rad(max_deg)));
    const double ph = 2 * striae::kPi * uniform();
    const striae::Vec3 u = a.unitOrthogonal(), w = a.cross(u);
    const double sz = std::sqrt(std::max(0.0, 1 - cz * cz));
    return cz * a + sz * (std::cos(ph) * u + std::sin(ph) * w);
  }
};

}  // namespace striae_test
