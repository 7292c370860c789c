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
// within 8 MB, at least 2; two such buffers, as the next batch is drawn while
// this one is summed), then sums the B resamples' weighted terms in one pass
// (kernels.hpp); a resample costs N draws plus N x 20 multiply-adds; per resample
// it keeps 11 doubles. So at most about 420 bytes per datum (at 65,536 data; 192
// at the data bound) plus 88 bytes per resample: about 200 MB at the data bound.
// The focal bootstrap computes both planes' terms once (320 bytes per datum) and
// reuses them in every iteration of every resample: 326 bytes per datum plus 88
// per resample; it costs a few iterations of the joint inversion per resample.
#pragma once

#include "kernels.hpp"
#include "rng.hpp"
#include "stress.hpp"

#include <cstdint>

namespace striae {

constexpr size_t kMaxBootstrapData = 1000000;
constexpr int32_t kMaxResamples = 100000;
constexpr double kDefaultBootstrapLevel = 0.95;

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
