// Streaming Fisher (1953) mean and orientation tensor for axial data (see stats.hpp).
#include "stats.hpp"

#include <algorithm>
#include <cmath>
#include <cstdio>

namespace striae {

namespace {

// ---------------------------------------------------------------------------
// Helpers
// ---------------------------------------------------------------------------

// Add x to a compensated sum (Knuth's TwoSum: err is the exact rounding error).
inline void comp_add(CompSum &s, double x) {
  const double t = s.hi + x;
  const double bp = t - s.hi;
  const double err = (s.hi - (t - bp)) + (x - bp);
  s.hi = t;
  s.lo += err;
}

// Merge compensated sum b into a.
inline void comp_merge(CompSum &a, const CompSum &b) {
  comp_add(a, b.hi);
  a.lo += b.lo;
}

// Move the tensor's block into its compensated sums (pending is left to the caller).
inline void fold_tensor_block(TensorState &s) {
  for (int i = 0; i < 6; ++i) {
    comp_add(s.t[i], s.block[i]);
    s.block[i] = 0.0;
  }
}

// Throw the BadState error for a malformed state, naming what is wrong.
[[noreturn]] void bad_state(const char *which, const std::string &what) {
  throw Error(ErrorKind::BadState, std::string("malformed ") + which + " aggregate state",
              what, "States are produced by the aggregate's own functions; do not edit them.");
}

// Format a number for an error detail (not for data output).
std::string num(double v) {
  char buf[40];
  std::snprintf(buf, sizeof buf, "%.17g", v);
  return buf;
}

// Checks shared by every compensated sum: both parts finite.
void check_comp(const CompSum &c, const char *which, const char *name) {
  if (!std::isfinite(c.hi) || !std::isfinite(c.lo))
    bad_state(which, std::string("sum ") + name + " is not finite");
}

// Tolerance for sums of n unit quantities (rounding is ~1e-16 per row; the
// compensated sums are far better still).
inline double sum_tol(int64_t n) { return 1e-9 * (static_cast<double>(n) + 1.0); }

// The tensor checks, reporting under the name of the enclosing state.
void validate_tensor_as(const TensorState &s0, const char *which) {
  if (s0.n < 0) bad_state(which, "row count " + std::to_string(s0.n) + " is negative");
  if (s0.n > detail::kMaxCount) bad_state(which, "row count " + std::to_string(s0.n) + " exceeds 2^53");
  if (s0.pending < 0 || s0.pending >= kBlockRows || s0.pending > s0.n)
    bad_state(which, "pending row count " + std::to_string(s0.pending) + " is out of range");
  for (int i = 0; i < 6; ++i)
    if (!std::isfinite(s0.block[i])) bad_state(which, "a block sum is not finite");
  TensorState s = s0;  // the checks below see block and compensated sums together
  fold_tensor_block(s);
  static const char *names[6] = {"xx", "yy", "zz", "xy", "xz", "yz"};
  for (int i = 0; i < 6; ++i) check_comp(s.t[i], which, names[i]);
  if (s.n == 0) {
    for (int i = 0; i < 6; ++i)
      if (s.t[i].hi != 0 || s.t[i].lo != 0) bad_state(which, "an empty state has non-zero sums");
    return;
  }
  const double n = static_cast<double>(s.n), tol = sum_tol(s.n);
  double v[6];
  for (int i = 0; i < 6; ++i) v[i] = comp_value(s.t[i]);
  // Diagonal sums of squares of unit-vector components lie in [0, n]; the
  // trace is exactly n; off-diagonal sums obey |sum xy| <= sqrt(sum xx sum yy).
  for (int i = 0; i < 3; ++i)
    if (v[i] < -tol || v[i] > n + tol)
      bad_state(which, std::string("sum ") + names[i] + " = " + num(v[i]) + " is outside [0, n]");
  if (std::fabs(v[kXX] + v[kYY] + v[kZZ] - n) > tol)
    bad_state(which, "trace of the tensor sums is " + num(v[kXX] + v[kYY] + v[kZZ]) +
                         ", not the row count " + std::to_string(s.n));
  const int pa[3] = {kXX, kXX, kYY}, pb[3] = {kYY, kZZ, kZZ};
  for (int i = 0; i < 3; ++i) {
    const double bound = std::sqrt(std::max(0.0, v[pa[i]]) * std::max(0.0, v[pb[i]]));
    if (std::fabs(v[3 + i]) > bound + tol)
      bad_state(which, std::string("sum ") + names[3 + i] + " is larger than its diagonal sums allow");
  }
}

// Merge the tensor part of b into a (count overflow is a data error: too many rows).
void combine_tensor(TensorState &a, const TensorState &b) {
  if (a.n > detail::kMaxCount - b.n)
    throw Error(ErrorKind::DataError, "too many rows for an orientation statistic (limit 2^53)");
  a.n += b.n;
  for (int i = 0; i < 6; ++i) {
    comp_merge(a.t[i], b.t[i]);
    comp_add(a.t[i], b.block[i]);  // b's pending rows join a's compensated sums
  }
}

// Tensor sums divided by n, in TensorComponent order.
void mean_tensor(const TensorState &s, double m[6]) {
  const double n = static_cast<double>(s.n);
  for (int i = 0; i < 6; ++i) m[i] = (comp_value(s.t[i]) + s.block[i]) / n;
}

// 1/sqrt2 and 1/sqrt3 to double precision (derived).
constexpr double kR2 = 0.70710678118654752440;
constexpr double kR3 = 0.57735026918962576451;

// The 13 reference axes of the Fisher alignment (see stats.hpp), fixed forever:
// changing them would change stored aggregate states' meaning.
const double kRefAxes[kFisherRefAxes][3] = {
    {1, 0, 0},        {0, 1, 0},         {0, 0, 1},                              // coordinate axes
    {kR2, kR2, 0},    {kR2, -kR2, 0},    {kR2, 0, kR2},    {kR2, 0, -kR2},       // face diagonals
    {0, kR2, kR2},    {0, kR2, -kR2},                                            //
    {kR3, kR3, kR3},  {kR3, kR3, -kR3},  {kR3, -kR3, kR3}, {kR3, -kR3, -kR3},    // body diagonals
};

// The signs of every cell against every reference axis, from a point well
// inside the cell; padded to 16 axes (zeros) so the fold loop vectorises.
struct CellSigns {
  double sg[kFisherCells][16];
  CellSigns() {
    for (int quadrant = 0; quadrant < 4; ++quadrant)  // D > 0: N and E signs only
      for (int bits = 0; bits < 8; ++bits)
        for (int cross = 0; cross < 2; ++cross) {
          const int c = quadrant * 16 + bits * 2 + cross, o = detail::kFisherOrderOfBits[bits];
          for (int k = 0; k < 16; ++k) sg[c][k] = k < kFisherRefAxes ? 1.0 : 0.0;
          if (o < 0) continue;  // impossible comparison pattern: never reached
          // Magnitudes largest first: 1 > 0.3 + 0.2, or 1 < 0.8 + 0.6.
          const double mag[3] = {1.0, cross ? 0.8 : 0.3, cross ? 0.6 : 0.2};
          Vec3 p;
          for (int r = 0; r < 3; ++r) {
            const int comp = detail::kFisherOrders[o][r];
            p(comp) = (quadrant >> comp) & 1 ? -mag[r] : mag[r];
          }
          for (int k = 0; k < kFisherRefAxes; ++k) {
            const double d = p(0) * kRefAxes[k][0] + p(1) * kRefAxes[k][1] + p(2) * kRefAxes[k][2];
            sg[c][k] = d < 0 ? -1.0 : 1.0;
          }
        }
  }
};
const CellSigns kCellSigns;

}  // namespace

namespace detail {

[[noreturn]] void too_many_rows() {
  throw Error(ErrorKind::DataError, "too many rows for an orientation statistic (limit 2^53)");
}

Vec3 unit_datum_slow(const Vec3 &x) {
  const double len = x.norm();
  if (!std::isfinite(len) || !(len > 0))
    throw Error(ErrorKind::DataError, "cannot add a zero or non-finite vector to an orientation statistic");
  return x / len;
}

void tensor_fold(TensorState &s) {
  fold_tensor_block(s);
  s.pending = 0;
}

// Move a Fisher state's cell sums into its aligned compensated sums: A_k +=
// sum over cells of sign(cell, k) * cell sum. Empty cells are skipped, so small
// groups fold cheaply.
void fisher_fold_cells(FisherState &s) {
  double acc[3][16] = {};
  bool any = false;
  for (int c = 0; c < kFisherCells; ++c) {
    const double x = s.cells[c][0], y = s.cells[c][1], z = s.cells[c][2];
    if (x == 0.0 && y == 0.0 && z == 0.0) continue;
    any = true;
    const double *sg = kCellSigns.sg[c];
    for (int k = 0; k < 16; ++k) {
      acc[0][k] += sg[k] * x;
      acc[1][k] += sg[k] * y;
      acc[2][k] += sg[k] * z;
    }
    s.cells[c][0] = s.cells[c][1] = s.cells[c][2] = 0.0;
  }
  if (!any) return;
  for (int k = 0; k < kFisherRefAxes; ++k)
    for (int c = 0; c < 3; ++c) comp_add(s.aligned[k][c], acc[c][k]);
}

void fisher_fold(FisherState &s) {
  fold_tensor_block(s.tensor);
  fisher_fold_cells(s);
  s.tensor.pending = 0;
}

}  // namespace detail

Vec3 fisher_canonical(const Vec3 &x) { return detail::canonical_of(x); }

int fisher_cell(const Vec3 &canonical) { return detail::cell_of(canonical); }

double fisher_cell_sign(int cell, int k) {
  if (cell < 0 || cell >= kFisherCells || k < 0 || k >= kFisherRefAxes)
    throw Error(ErrorKind::InvalidParameter, "Fisher cell index must be 0 to 63 and axis index 0 to 12");
  return kCellSigns.sg[cell][k];
}

// ---------------------------------------------------------------------------
// Eigen-decomposition
// ---------------------------------------------------------------------------

// Symmetric 3x3 eigen-decomposition with a fixed order and sign rule.
void principal_axes(const double m[6], double values[3], Vec3 vectors[3]) {
  for (int i = 0; i < 6; ++i)
    if (!std::isfinite(m[i])) throw Error(ErrorKind::DataError, "orientation tensor is not finite");
  Mat3 a;
  a << m[kXX], m[kXY], m[kXZ],  //
      m[kXY], m[kYY], m[kYZ],   //
      m[kXZ], m[kYZ], m[kZZ];
  // The iterative (QL) solver, not the closed form: it keeps small eigenvalues
  // and the eigenvectors of nearly tied pairs accurate. Only the lower triangle
  // is read; the result is a deterministic function of the input bits.
  Eigen::SelfAdjointEigenSolver<Mat3> es(a);
  if (es.info() != Eigen::Success)
    throw Error(ErrorKind::DataError, "eigen-decomposition of the orientation tensor failed");
  for (int i = 0; i < 3; ++i) {
    // Eigen sorts ascending; we report descending.
    values[i] = es.eigenvalues()(2 - i);
    Vec3 v = es.eigenvectors().col(2 - i).normalized();
    // Sign rule: the largest-magnitude component is positive (first on a tie).
    int big = 0;
    for (int j = 1; j < 3; ++j)
      if (std::fabs(v(j)) > std::fabs(v(big))) big = j;
    if (v(big) < 0) v = -v;
    vectors[i] = v;
  }
}

// ---------------------------------------------------------------------------
// Orientation tensor
// ---------------------------------------------------------------------------

// All sums start at exact zeros, so an empty state is recognisable in validate.
void tensor_init(TensorState &s) {
  s.n = 0;
  s.pending = 0;
  for (int i = 0; i < 6; ++i) {
    s.t[i] = CompSum{0.0, 0.0};
    s.block[i] = 0.0;
  }
}

// Combine is plain addition of counts and compensated sums.
void tensor_combine(TensorState &a, const TensorState &b) { combine_tensor(a, b); }

// Validation reports under the tensor's own name.
void tensor_validate(const TensorState &s) { validate_tensor_as(s, "orientation tensor"); }

// Finalise: eigen-decompose T = sums / n and derive the shape measures.
FabricResult tensor_result(const TensorState &s) {
  tensor_validate(s);
  FabricResult r{};
  r.n = s.n;
  if (s.n == 0) return r;  // every flag false: the SQL final function returns NULL

  double m[6], lam[3];
  Vec3 ev[3];
  mean_tensor(s, m);
  principal_axes(m, lam, ev);

  // Normalise eigenvalues to sum 1 (the trace is 1 up to rounding). Values
  // below 1e-15 are rounding noise of an exactly zero eigenvalue (planar or
  // identical data): set them to 0 so that such fabrics print cleanly.
  double sum = 0;
  for (double &l : lam) {
    if (l < 0) l = 0;
    sum += l;
  }
  for (double &l : lam) {
    l /= sum;
    if (l < 1e-15) l = 0;
  }
  sum = lam[0] + lam[1] + lam[2];
  for (double &l : lam) l /= sum;

  r.axes_valid = true;
  r.e1 = vector_line(ev[0]);
  r.e2 = vector_line(ev[1]);
  r.e3 = vector_line(ev[2]);
  r.s1 = lam[0];
  r.s2 = lam[1];
  r.s3 = lam[2];

  // Woodcock (1977) [METHODS.md, from memory]: a zero eigenvalue or a zero
  // denominator leaves the measure undefined rather than infinite.
  if (r.s3 >= kEigenTie) {
    r.woodcock_c_valid = true;
    r.woodcock_c = std::log(r.s1 / r.s3);
    if (r.s2 - r.s3 >= kEigenTie) {
      r.woodcock_k_valid = true;
      r.woodcock_k = std::log(r.s1 / r.s2) / std::log(r.s2 / r.s3);
    }
  }
  // Vollmer (1990) [METHODS.md, from memory].
  r.point = r.s1 - r.s2;
  r.girdle = 2.0 * (r.s2 - r.s3);
  r.random = 3.0 * r.s3;

  if (r.s1 - r.s2 >= kEigenTie) {
    r.mean_plane_valid = true;
    r.mean_plane = normal_plane(ev[0]);
  }
  if (s.n >= 2 && r.s2 - r.s3 >= kEigenTie) {
    r.fold_axis_valid = true;
    r.fold_axis = r.e3;
  }
  return r;
}

// ---------------------------------------------------------------------------
// Fisher mean of axial data
// ---------------------------------------------------------------------------

// Reference axis k from the fixed table.
Vec3 fisher_reference_axis(int k) {
  if (k < 0 || k >= kFisherRefAxes)
    throw Error(ErrorKind::InvalidParameter, "Fisher reference axis index must be 0 to 12");
  return Vec3(kRefAxes[k][0], kRefAxes[k][1], kRefAxes[k][2]);
}

// Empty Fisher state: empty tensor, 13 zero aligned resultants, empty cells.
void fisher_init(FisherState &s) {
  tensor_init(s.tensor);
  for (int k = 0; k < kFisherRefAxes; ++k)
    for (int c = 0; c < 3; ++c) s.aligned[k][c] = CompSum{0.0, 0.0};
  for (int c = 0; c < kFisherCells; ++c) s.cells[c][0] = s.cells[c][1] = s.cells[c][2] = 0.0;
}

// Combine adds everything: the alignment signs never depend on other rows.
// b's pending rows join a's compensated sums (its cells are folded on a copy).
void fisher_combine(FisherState &a, const FisherState &b0) {
  FisherState b = b0;
  detail::fisher_fold_cells(b);
  combine_tensor(a.tensor, b.tensor);
  for (int k = 0; k < kFisherRefAxes; ++k)
    for (int c = 0; c < 3; ++c) comp_merge(a.aligned[k][c], b.aligned[k][c]);
}

// Tensor checks plus the bounds every aligned resultant must obey.
void fisher_validate(const FisherState &s0) {
  static const char *which = "Fisher mean";
  validate_tensor_as(s0.tensor, which);
  // Each pending row adds one unit vector to one cell: the cell sums' lengths
  // add up to at most the pending row count, and are all zero without rows.
  double cell_len = 0.0;
  for (int c = 0; c < kFisherCells; ++c) {
    const Vec3 v(s0.cells[c][0], s0.cells[c][1], s0.cells[c][2]);
    if (!std::isfinite(v(0)) || !std::isfinite(v(1)) || !std::isfinite(v(2)))
      bad_state(which, "a cell sum is not finite");
    cell_len += v.norm();
  }
  if (cell_len > static_cast<double>(s0.tensor.pending) + sum_tol(s0.tensor.pending))
    bad_state(which, "cell sums are longer than the pending rows allow");
  FisherState s = s0;  // check block and compensated sums together
  detail::fisher_fold(s);
  for (int k = 0; k < kFisherRefAxes; ++k)
    for (int c = 0; c < 3; ++c) check_comp(s.aligned[k][c], which, "aligned resultant");
  if (s.tensor.n == 0) {
    for (int k = 0; k < kFisherRefAxes; ++k)
      for (int c = 0; c < 3; ++c)
        if (s.aligned[k][c].hi != 0 || s.aligned[k][c].lo != 0)
          bad_state(which, "an empty state has non-zero sums");
    return;
  }
  const double n = static_cast<double>(s.tensor.n), tol = sum_tol(s.tensor.n);
  double m[6];
  for (int i = 0; i < 6; ++i) m[i] = comp_value(s.tensor.t[i]);
  for (int k = 0; k < kFisherRefAxes; ++k) {
    const Vec3 r = fisher_reference_axis(k);
    const Vec3 a(comp_value(s.aligned[k][0]), comp_value(s.aligned[k][1]), comp_value(s.aligned[k][2]));
    // Every aligned datum has x.r >= 0, so a.r = sum |x.r| lies in [0, n], and by
    // Cauchy-Schwarz (sum |x.r|)^2 <= n sum (x.r)^2 = n r^T (sum x x^T) r.
    const double ar = a.dot(r);
    if (a.norm() > n + tol || ar < -tol)
      bad_state(which, "aligned resultant " + std::to_string(k) + " is inconsistent with the row count");
    const double rtr = r(0) * r(0) * m[kXX] + r(1) * r(1) * m[kYY] + r(2) * r(2) * m[kZZ] +
                       2 * (r(0) * r(1) * m[kXY] + r(0) * r(2) * m[kXZ] + r(1) * r(2) * m[kYZ]);
    if (ar * ar > n * std::max(0.0, rtr) + tol * (n + 1))
      bad_state(which, "aligned resultant " + std::to_string(k) + " is inconsistent with the tensor sums");
  }
}

// Finalise: pick the aligned resultant of the reference axis nearest to e1.
FisherResult fisher_result(const FisherState &s0) {
  fisher_validate(s0);
  FisherState s = s0;
  detail::fisher_fold(s);
  FisherResult r{};
  r.n = s.tensor.n;
  r.reference_axis = -1;
  if (r.n == 0) return r;  // every flag false: the SQL final function returns NULL

  double m[6], lam[3];
  Vec3 ev[3];
  mean_tensor(s.tensor, m);
  principal_axes(m, lam, ev);
  const Vec3 e1 = ev[0];

  // Nearest reference axis to e1 (first one on an exact tie: deterministic).
  int best = 0;
  double best_dot = -1;
  for (int k = 0; k < kFisherRefAxes; ++k) {
    const double d = std::fabs(fisher_reference_axis(k).dot(e1));
    if (d > best_dot) {
      best_dot = d;
      best = k;
    }
  }
  const Vec3 ref = fisher_reference_axis(best);
  r.reference_axis = best;
  r.exact_within_deg = 90.0 - axial_angle(ref, e1);

  Vec3 a(comp_value(s.aligned[best][0]), comp_value(s.aligned[best][1]),
         comp_value(s.aligned[best][2]));
  if (a.dot(e1) < 0) a = -a;  // agree with e1 (only the axis matters for the mean)
  const double n = static_cast<double>(r.n);
  double R = a.norm();
  // The data's unit vectors are unit only to rounding (|v| = 1 +- 2e-16), so
  // R within that of N means identical data: report R = N exactly (and never
  // a few ulps over N).
  if (R > n * (1.0 - 1e-15)) R = n;
  r.resultant = R;
  if (R > 0) {
    r.mean_valid = true;
    r.mean = vector_line(a);
  }
  if (r.n < 2) return r;

  const double d = n - R;
  if (d <= kFisherTiny * n) {
    // Identical data: kappa and the angular deviation are infinite (undefined);
    // the confidence cone has shrunk to nothing.
    r.alpha95_valid = true;
    r.alpha95 = 0.0;
    return r;
  }
  r.kappa_valid = true;
  r.kappa = (n - 1.0) / d;
  r.angular_sd_valid = true;
  r.angular_sd = 81.0 / std::sqrt(r.kappa);  // [from memory, METHODS.md]
  if (R > 0) {
    // Fisher (1953): cos a = 1 - ((N-R)/R) ((1/p)^(1/(N-1)) - 1), p = 0.05;
    // expm1 keeps (1/p)^(1/(N-1)) - 1 accurate for large N.
    const double c = 1.0 - (d / R) * std::expm1(std::log(20.0) / (n - 1.0));
    if (c >= -1.0) {
      r.alpha95_valid = true;
      r.alpha95 = deg(std::acos(std::min(1.0, c)));
    }
  }
  return r;
}

}  // namespace striae
