// Separation of a mixed fault-slip population into stress phases, and the
// misfit summary of a group of data under given tensors.
//
// Method: hard division of the data among k stress tensors, after Shan, Suen &
// Lin (2003, J. Struct. Geol. 25; the description below is striae's, recalled
// from memory of the paper's idea, not its exact objective function): each datum
// belongs to exactly one phase, the one whose tensor fits it best; each phase's
// tensor is the linear inversion (Michael 1984) of its data; the two steps
// alternate, k-means style, until the division no longer changes. The quantity
// minimised is the total misfit angle (Wallace-Bott: angle between slip and
// resolved shear traction) of the data under their phase tensors.
//
// striae's rules:
//  - a datum's phase is the tensor of smallest misfit angle (largest cosine
//    u.tau/|tau|); a misfit that is undefined (plane normal to a principal axis)
//    counts as 90 degrees; ties go to the lower index;
//  - starts: `starts` runs, each from k random tensors (axes uniformly random
//    rotations, Phi uniform in 0..1) drawn in order from one generator seeded with
//    `seed` (bootstrap.hpp's Rng); a run stops when the division repeats, or
//    after kPhaseMaxIterations re-inversions (then it is "not settled");
//  - a phase whose data are fewer than kMinStressData, or degenerate, keeps its
//    previous tensor during the iteration; a run ending with such a phase is not
//    eligible;
//  - the result is the eligible run of smallest total misfit (ties: the earlier
//    run); its phases are reported in order of decreasing data count (ties by
//    components), each tensor the inversion of its phase's data, with data_count
//    the phase's size, the exact mean misfit of its data (kStressHasMisfit), and
//    kStressNotConverged if the run did not settle;
//  - no eligible run: Empty / TooFewData (fewer than kMinStressData k data) /
//    Degenerate: SQL NULL.
// Data are caller-owned and sorted by the caller (sort_slip_data), so the result
// is a function of the set of data, k, starts and seed only.
// Cost: starts x iterations (typically 5-30) x N x k misfit cosines plus N
// normal-equation terms per iteration; memory 1 byte per datum twice beside the data.
//
// Choosing k: the total misfit always falls as k grows, so a larger k is
// justified only by a clear drop in mean misfit, by phases that each hold enough
// data (10 or more) and differ geologically, and by stability under other seeds
// (common practice, no source; see the README).
#pragma once

#include "bootstrap.hpp"
#include "stress.hpp"

#include <cstdint>
#include <vector>

namespace striae {

constexpr int32_t kMaxPhases = 8;
constexpr int32_t kMaxPhaseStarts = 10000;
constexpr int32_t kDefaultPhaseStarts = 20;
constexpr int kPhaseMaxIterations = 100;

struct PhaseOptions {
  int32_t phases = 2;                      // k, 1 .. kMaxPhases
  int32_t starts = kDefaultPhaseStarts;    // 1 .. kMaxPhaseStarts
  uint64_t seed = 0;
};
// InvalidParameter unless the options are in range.
void check_phase_options(const PhaseOptions &o);

// Separate count data (checked with check_slip_datum; at most kMaxBootstrapData,
// InvalidParameter beyond) into o.phases phases. On Ok, out holds the k tensors
// in report order and, if assignment is non-null, (*assignment)[i] the 0-based
// report index of datum i.
StressStatus separate_phases(const SlipDatum *data, size_t count, const PhaseOptions &o,
                             std::vector<StressTensor> &out, std::vector<uint8_t> *assignment = nullptr);

// 0-based index of the best-fitting of k tensors for the datum (n, u) by the rule
// above, and its misfit in degrees (nullopt when undefined under every tensor).
int best_phase(const Vec3 &n, const Vec3 &u, const StressTensor *tensors, size_t k,
               std::optional<double> &misfit_deg);

// Misfit summary of a group of data: mean and median of the defined misfits
// (degrees), how many exceed the threshold, how many were undefined. values is
// sorted ascending first, so the result depends on the set of misfits only,
// not on their order (the median of an even count is the mean of the two
// middle values).
struct MisfitSummary {
  int64_t count;      // defined misfits
  int64_t undefined;  // data whose misfit is undefined
  int64_t above;      // misfit > threshold
  double mean, median;
};
// false when no misfit is defined (mean and median undefined).
bool summarise_misfits(double *values, size_t count, int64_t undefined, double threshold, MisfitSummary &out);
// InvalidParameter unless 0 <= threshold <= 180.
void check_misfit_threshold(double threshold);

}  // namespace striae
