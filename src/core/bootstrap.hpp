// Bootstrap confidence of a stress inversion (Michael 1987, JGR 92:357): resample
// the data with replacement, re-invert each resample, keep the resamples closest
// to the best solution, and report cones on the principal axes and an interval on
// the shape ratio Phi. Also the same for the joint focal-mechanism inversion.
//
// Rules (the METHODS.md summary of Michael 1987 is from memory; these are striae's):
//  - best solution: the linear inversion (stress.hpp) of all data; its exact mean
//    misfit over the data is reported (kStressHasMisfit);
//  - resample r = 0 .. M-1: N draws with replacement from the N data, from one
//    stream of the generator below seeded with `seed`, in order. The result is a
//    pure function of (data in their given order, M, seed, level);
//  - distance of a resample to the best: the angle between the two unit-norm
//    tensors, acos of their Frobenius inner product, degrees. A resample whose
//    inversion is undefined (e.g. it drew too few distinct faults) is infinitely far;
//  - kept: the ceil(level M) resamples of smallest distance (ties by resample
//    number); level defaults to 0.95. If a kept resample is undefined, the
//    confidence is undefined (flags clear) but the best tensor is still returned;
//  - cone k (k = sigma1..3): the largest axial angle between axis k of a kept
//    resample and axis k of the best, degrees 0..90; Phi interval: the smallest
//    and largest Phi of the kept resamples.
//  Axes whose principal values are (nearly) equal are not individually defined,
//  so Phi near 0 widens the sigma2/sigma3 cones and Phi near 1 the sigma1/sigma2
//  cones: that is the honest answer, not an artefact.
//
// Memory and time: data are caller-owned; at most kMaxBootstrapData data.
// The linear bootstrap precomputes each datum's 20 normal-equation terms once
// (160 bytes per datum) and draws B resamples at a time as multiplicities in
// doubles (8 B bytes per datum; B = 16, fewer above 65,536 data so that they stay
// within 8 MB, at least 2), then sums the B resamples' weighted terms in one pass
// (kernels.hpp); a resample costs N draws plus N x 20 multiply-adds; per resample
// it keeps 11 doubles. So at most about 300 bytes per datum plus 88 bytes per
// resample: 176 MB at the data bound. The focal bootstrap computes both planes'
// terms once (320 bytes per datum) and reuses them in every iteration of every
// resample: 326 bytes per datum plus 88 per resample; it costs a few iterations of
// the joint inversion per resample.
#pragma once

#include "kernels.hpp"
#include "stress.hpp"

#include <cstdint>

namespace striae {

constexpr size_t kMaxBootstrapData = 1000000;
constexpr int32_t kMaxResamples = 100000;
constexpr double kDefaultBootstrapLevel = 0.95;

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

// The resampled normal equations of a batch of the linear bootstrap: draws nres
// resamples of count data from rng (count draws each, in stream order, as
// multiplicities in w, nres x count doubles of scratch), then out[r*20 + k] =
// sum over i in data order of w[r][i] * table[i*20 + k] (weighted_term_sums,
// kernels.hpp: bit-identical on every path to summing one resample at a time).
// table holds each datum's 20 terms (stress_contribution). count >= 1.
void bootstrap_batch_sums(Rng &rng, const double *table, size_t count, int nres, double *w, double *out,
                          SimdPath path = simd_best_path());

struct BootstrapOptions {
  int32_t resamples = 1000;  // 1 .. kMaxResamples
  uint64_t seed = 0;
  double level = kDefaultBootstrapLevel;  // fraction kept, 0.5 .. 1
};
// InvalidParameter unless the options are in range.
void check_bootstrap_options(const BootstrapOptions &o);

// Linear inversion of all data plus bootstrap confidence. count > kMaxBootstrapData
// is InvalidParameter; data are checked with check_slip_datum (DataError). Status
// as for stress_finalise; on Ok out has the tensor, its exact mean misfit and, if
// defined, kStressHasCones and kStressHasPhiInterval with their fields.
StressStatus stress_bootstrap(const SlipDatum *data, size_t count, const BootstrapOptions &opt,
                              StressTensor &out);

// Joint focal-mechanism inversion (invert_focal, with its friction search) plus a
// bootstrap of it: each resample reruns the plane picking from its own 2N-plane
// start at the friction chosen for the best solution (fixed, not searched again).
// picked as for invert_focal (picks of the best solution).
StressStatus focal_bootstrap(const SlipDatum *data, size_t count, const FrictionRange &friction,
                             const BootstrapOptions &opt, uint8_t *picked, FocalInversion &out);

}  // namespace striae
