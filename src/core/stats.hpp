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
// Add one datum (any non-zero finite vector; normalised here). Inline (below).
inline void tensor_add(TensorState &s, const Vec3 &x);
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

// Per row, the 13 signs are not computed one by one: the 13 planes normal to
// the reference axes cut the sphere into cells, and every datum inside one
// cell has the same sign against every reference axis. A row, first given the
// sign that puts it in the canonical half-sphere (D > 0; on the horizontal,
// E > 0; then N > 0: axial data, so -x and x are the same datum, bit for bit),
// is added to its cell's plain vector sum (a few comparisons pick the cell);
// at the end of each block the cell sums, signed per axis, join the aligned
// resultants. That is the same sum as signing each row (only data lying on a
// plane, exactly perpendicular to a reference axis, may take the other sign,
// and such an axis is never the one picked for data within the exactness
// bound). The cell of a canonical x: the quadrant of its N and E signs (4),
// the three comparisons |x|<|y|, |x|<|z|, |y|<|z| (8 bit patterns, 6 of them
// possible: the orders of the absolute components; these two give the cells
// of the coordinate and face-diagonal planes), and whether the largest
// |component| exceeds the sum of the other two (the one body-diagonal plane
// that crosses such a cell) (2): 64 slots, 48 of them cells, indexed without
// a table lookup (the cell index is on every row's critical path).
constexpr int kFisherCells = 64;

// The canonical sign of a datum, its cell (0..63), and the sign (+1 or -1)
// that every datum inside cell c has against reference axis k (+1 for the 16
// impossible slots); exposed for the unit tests.
Vec3 fisher_canonical(const Vec3 &x);
int fisher_cell(const Vec3 &canonical);
double fisher_cell_sign(int cell, int k);

struct FisherState {
  TensorState tensor;
  CompSum aligned[kFisherRefAxes][3];  // A_k, components N, E, D
  double cells[kFisherCells][3];       // the block's plain vector sum per cell (rows: tensor.pending)
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
// Inline (below).
inline void fisher_add(FisherState &s, const Vec3 &x);
// Merge b into a.
void fisher_combine(FisherState &a, const FisherState &b);
// Throw Error(BadState) unless s could come from init/add/combine.
void fisher_validate(const FisherState &s);
// Finalise (validates first).
FisherResult fisher_result(const FisherState &s);

// ---------------------------------------------------------------------------
// Per-row code, inline: the aggregates' transition functions run it for every
// row, and measured in the server one function with everything inlined costs
// far less than a chain of calls across files. Rare paths (errors, folding a
// full block) stay out of line in stats.cpp.
// ---------------------------------------------------------------------------

namespace detail {

// Largest row count a state may hold: counts must convert to double exactly.
constexpr int64_t kMaxCount = int64_t(1) << 53;

[[noreturn]] void too_many_rows();
Vec3 unit_datum_slow(const Vec3 &x);  // normalise, or DataError for zero / non-finite
void tensor_fold(TensorState &s);     // block into the compensated sums, pending = 0
void fisher_fold(FisherState &s);     // tensor block and cell sums likewise

// Unit vector of a datum. Line vectors from the SQL types are unit to rounding
// already: kept as they are (no square root, no division).
STRIAE_HOT Vec3 unit_datum(const Vec3 &x) {
  if (std::fabs(x.squaredNorm() - 1.0) <= 4e-16) return x;
  return unit_datum_slow(x);
}

// Count one row and add its outer product to the block (no folding).
STRIAE_HOT void tensor_add_block(TensorState &s, const Vec3 &x) {
  if (s.n >= kMaxCount) too_many_rows();
  ++s.n;
  ++s.pending;
  s.block[kXX] += x(0) * x(0);
  s.block[kYY] += x(1) * x(1);
  s.block[kZZ] += x(2) * x(2);
  s.block[kXY] += x(0) * x(1);
  s.block[kXZ] += x(0) * x(2);
  s.block[kYZ] += x(1) * x(2);
}

// The sign of an axial datum that puts it in the canonical half-sphere: D > 0,
// or D = 0 and E > 0, or D = E = 0 and N > 0 (see the Fisher state above).
STRIAE_HOT Vec3 canonical_of(const Vec3 &x) {
  const bool flip = x(2) < 0 || (x(2) == 0 && (x(1) < 0 || (x(1) == 0 && x(0) < 0)));
  return flip ? Vec3(-x) : x;
}

// Rank of the absolute components, from the three comparison bits
// (|x|<|y|) | (|x|<|z|) << 1 | (|y|<|z|) << 2: index into kFisherOrders. Bit
// patterns 2 and 5 are cyclic (impossible): -1.
constexpr int kFisherOrderOfBits[8] = {0, 1, -1, 2, 3, -1, 4, 5};
// Components from largest to smallest |value| for each order.
constexpr int kFisherOrders[6][3] = {{0, 1, 2}, {1, 0, 2}, {1, 2, 0}, {0, 2, 1}, {2, 0, 1}, {2, 1, 0}};

// Cell index of a canonical x (see the Fisher state above): quadrant * 16 +
// comparison bits * 2 + crossing bit. Branch-free; rounding decides only for
// data within ~1e-16 of a plane.
STRIAE_HOT int cell_of(const Vec3 &x) {
  const double ax = std::fabs(x(0)), ay = std::fabs(x(1)), az = std::fabs(x(2));
  const int quadrant = int(x(0) < 0) | (int(x(1) < 0) << 1);
  const int bits = int(ax < ay) | (int(ax < az) << 1) | (int(ay < az) << 2);
  const double big = std::fmax(std::fmax(ax, ay), az);
  const int cross = int(2.0 * big - (ax + ay + az) < 0);  // largest < sum of the other two
  return quadrant * 16 + bits * 2 + cross;
}

}  // namespace detail

// One datum adds its outer product; no division by n until the result, so the
// sums stay additive across combine.
STRIAE_HOT void tensor_add(TensorState &s, const Vec3 &x0) {
  detail::tensor_add_block(s, detail::unit_datum(x0));
  if (s.pending == kBlockRows) detail::tensor_fold(s);
}

// One datum updates the tensor and its cell's sum.
STRIAE_HOT void fisher_add(FisherState &s, const Vec3 &x0) {
  const Vec3 x = detail::canonical_of(detail::unit_datum(x0));
  detail::tensor_add_block(s.tensor, x);
  double *cell = s.cells[detail::cell_of(x)];
  cell[0] += x(0);
  cell[1] += x(1);
  cell[2] += x(2);
  if (s.tensor.pending == kBlockRows) detail::fisher_fold(s);
}

}  // namespace striae
