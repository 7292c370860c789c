// Streaming orientation statistics for axial data (lineations, poles of planes):
// the Fisher (1953) mean and the orientation tensor (fabric, mean plane, fold axis).
// Formulas: METHODS.md sections 3 and 4.
//
// Every statistic is an accumulator with the same five operations, so that the
// SQL layer can build PARALLEL SAFE aggregates with combine/serialize functions:
//   *_init      empty state
//   *_add       add one datum (a non-zero NED vector; it is normalised, and its
//               sign does not matter: data are axial)
//   *_combine   merge a second state into the first; commutative and associative
//               up to rounding, so serial and parallel runs agree (the unit
//               tests check 1e-12, inside the 1e-9 DESIGN.md asks; the
//               compensated sums below keep this true for 10^7-row groups)
//   *_validate  throw Error(BadState) for a state that no sequence of *_add and
//               *_combine can produce (negative count, non-finite sums, ...)
//   *_result    finalise into a result struct whose fields carry validity flags
//
// State layout rule: a state lives in palloc memory, which is only 8-byte
// aligned, is copied with memcpy and is never destroyed. So states are plain
// structs of int64_t and double (no Eigen members, no pointers), and the
// static_asserts below hold. Eigen objects appear only on the stack.
#pragma once

#include "orientation.hpp"

#include <cstdint>
#include <type_traits>

namespace striae {

// ---------------------------------------------------------------------------
// Compensated sums
// ---------------------------------------------------------------------------

// A double-double running sum: value = hi + lo. Each addition uses Knuth's
// TwoSum, which is exact, so the accumulated error no longer grows with the
// number of rows; this keeps N - R (the small difference every Fisher
// statistic depends on) accurate for groups of 10^7 rows and makes serial and
// parallel runs agree to a few ulps of the final sums.
struct CompSum {
  double hi;
  double lo;
};

// Value of a compensated sum.
inline double comp_value(const CompSum &s) { return s.hi + s.lo; }

// ---------------------------------------------------------------------------
// Orientation tensor
// ---------------------------------------------------------------------------

// Component order of the six independent tensor sums.
enum TensorComponent { kXX = 0, kYY = 1, kZZ = 2, kXY = 3, kXZ = 4, kYZ = 5 };

// Rows summed in plain doubles (the "block") before the block joins the
// compensated sums: per-row work stays a few plain additions, while the
// accumulated rounding error still does not grow with the number of rows (a
// block of 256 unit terms rounds by a few 1e-14 of its size; serial and
// chunked sums of a 200,000-datum cluster agree to 1e-12 in kappa, unit test
// FisherCombine.TightLargeClusterKappaStable).
constexpr int64_t kBlockRows = 256;

// Sums of x_i x_i^T over unit vectors (not yet divided by n). The value of
// sum i is comp_value(t[i]) + block[i]; pending counts the rows in the block
// (0 <= pending < kBlockRows, pending <= n).
struct TensorState {
  int64_t n;
  CompSum t[6];  // order: TensorComponent
  int64_t pending;
  double block[6];
};

static_assert(std::is_trivially_copyable<TensorState>::value, "state is memcpy'd");
static_assert(std::is_trivially_destructible<TensorState>::value, "state is never destroyed");
static_assert(alignof(TensorState) <= 8, "palloc memory is 8-byte aligned");

// Principal axes of the orientation tensor and the shape measures built on them.
// Each eigenvector is reported as a lower-hemisphere Line (sign is meaningless).
struct FabricResult {
  int64_t n;
  bool axes_valid;  // n >= 1 (when eigenvalues tie, the tied axes are an
                    // arbitrary but deterministic orthonormal pair)
  Line e1, e2, e3;
  double s1, s2, s3;  // normalised eigenvalues: s1 >= s2 >= s3 >= 0, sum 1
  // Woodcock (1977): K = ln(s1/s2)/ln(s2/s3), C = ln(s1/s3). Undefined when
  // s3 is zero (< kEigenTie) and, for K, when s2 - s3 < kEigenTie (0 denominator).
  bool woodcock_k_valid;
  double woodcock_k;
  bool woodcock_c_valid;
  double woodcock_c;
  // Vollmer (1990): point P = s1 - s2, girdle G = 2 (s2 - s3), random R = 3 s3
  // (they sum to 1). Valid whenever axes_valid.
  double point, girdle, random;
  // Mean plane: the plane whose pole is e1 of the poles. Undefined when n = 0
  // or s1 - s2 < kEigenTie (no unique cluster axis, e.g. a girdle).
  bool mean_plane_valid;
  Plane mean_plane;
  // Cylindrical best-fit fold axis: e3 of the poles (the pole to the girdle).
  // Undefined when n < 2 or s2 - s3 < kEigenTie (the poles do not define a
  // unique girdle, e.g. identical poles, or a uniform spread).
  bool fold_axis_valid;
  Line fold_axis;
};

// Eigenvalue gap (normalised eigenvalues, sum 1) below which two eigenvalues
// are treated as equal and an eigenvalue as zero. 1e-12 is far below any
// measured fabric (it is the spread of data a few 1e-6 rad apart) and far above
// the ~1e-16 rounding of the sums.
constexpr double kEigenTie = 1e-12;

// Start an empty tensor state.
void tensor_init(TensorState &s);
// Add one datum (any non-zero finite vector; normalised here).
void tensor_add(TensorState &s, const Vec3 &x);
// Merge b into a.
void tensor_combine(TensorState &a, const TensorState &b);
// Throw Error(BadState) unless s could come from init/add/combine.
void tensor_validate(const TensorState &s);
// Eigen-decompose and build the fabric result (validates first).
FabricResult tensor_result(const TensorState &s);

// Deterministic eigen-decomposition of a symmetric 3x3 matrix given by its six
// components (TensorComponent order): values descending, vectors unit, each
// with its largest-magnitude component positive (first such component on a
// tie), so identical input always gives identical, sign-fixed output.
void principal_axes(const double m[6], double values[3], Vec3 vectors[3]);

// ---------------------------------------------------------------------------
// Fisher (1953) mean of axial data
// ---------------------------------------------------------------------------

// Axial data must be given one sign before summing: METHODS.md asks for the
// sign that agrees with e1, the principal eigenvector of the orientation
// tensor, which is only known at the end of a streaming aggregate. The state
// therefore keeps, besides the tensor, one "aligned" resultant per fixed
// reference axis r_k: A_k = sum sign(x . r_k) x, with sign(0) = +1. At the end
// the reference axis nearest to e1 (largest |r_k . e1|) is picked and A_k,
// flipped to agree with e1, is the resultant.
//
// Exactness bound: sign(x . r_k) = sign(x . e1) for every datum x whose axial
// angle from e1 is below 90 - angle(r_k, e1), so A_k equals the e1-aligned
// resultant exactly whenever all data lie within that angle of e1. The 13 axes
// (3 coordinate axes, 6 face diagonals, 4 body diagonals of a cube) leave no
// direction farther than kFisherWorstRefAngleDeg from the nearest of them
// (the point equidistant from (1,0,0), (1,1,0)/sqrt2 and (1,1,1)/sqrt3, where
// cos = 1/sqrt(9 - 2 sqrt2 - 2 sqrt6); derived, and confirmed by a dense search
// in the unit tests), so the result is exact for every data set lying within
// 90 - 27.57 = 62.43 degrees of its e1, whatever e1 is. Wider spreads (girdles)
// get a resultant of a fixed, documented alignment instead; for them a Fisher
// mean is not a meaningful summary anyway.
constexpr int kFisherRefAxes = 13;
constexpr double kFisherWorstRefAngleDeg = 27.569276130480937;  // derived, see above

// Reference axis k (0..12), unit vector: coordinate axes, then face diagonals,
// then body diagonals.
Vec3 fisher_reference_axis(int k);

struct FisherState {
  TensorState tensor;
  CompSum aligned[kFisherRefAxes][3];  // A_k, components N, E, D
  double block[3][kFisherRefAxes];     // the block's A_k, component-major (N row, E row, D row)
};

static_assert(std::is_trivially_copyable<FisherState>::value, "state is memcpy'd");
static_assert(std::is_trivially_destructible<FisherState>::value, "state is never destroyed");
static_assert(alignof(FisherState) <= 8, "palloc memory is 8-byte aligned");

// Fisher (1953) statistics. Angles in degrees. Each *_valid flag says whether
// the field beside it is defined; an undefined field holds 0.
//   mean:        undefined for n = 0 (or, degenerately, R = 0)
//   resultant R: |aligned resultant|, clamped to <= n against rounding; always set
//   kappa = (N-1)/(N-R): undefined for N < 2, and when N - R <= kFisherTiny * N
//                (identical data: kappa is infinite)
//   alpha95, exact: cos a = 1 - ((N-R)/R) ((1/p)^(1/(N-1)) - 1), p = 0.05:
//                undefined for N < 2 and when the right side is below -1 (too
//                few or too scattered data); 0 for identical data
//   angular_sd = 81/sqrt(kappa) [from memory, METHODS.md]: defined with kappa
struct FisherResult {
  int64_t n;
  bool mean_valid;
  Line mean;
  double resultant;
  bool kappa_valid;
  double kappa;
  bool alpha95_valid;
  double alpha95;
  bool angular_sd_valid;
  double angular_sd;
  // Diagnostics of the alignment: index of the reference axis used, and the
  // axial angle from e1 within which every datum is aligned exactly
  // (90 - angle(r_k, e1); at least 90 - kFisherWorstRefAngleDeg).
  int reference_axis;
  double exact_within_deg;
};

// Relative size of N - R below which data count as identical.
constexpr double kFisherTiny = 1e-12;

// Start an empty Fisher state.
void fisher_init(FisherState &s);
// Add one axial datum (any non-zero finite vector; normalised, sign ignored).
void fisher_add(FisherState &s, const Vec3 &x);
// Merge b into a.
void fisher_combine(FisherState &a, const FisherState &b);
// Throw Error(BadState) unless s could come from init/add/combine.
void fisher_validate(const FisherState &s);
// Finalise (validates first).
FisherResult fisher_result(const FisherState &s);

}  // namespace striae
