// Paleostress from fault-slip data: the reduced stress tensor, the linear
// inversion of Michael (1984, JGR 89:11517) as a streaming aggregate, the
// iterative joint inversion of focal mechanisms (Vavrycuk 2014, GJI 199:69),
// and the per-datum and per-tensor quantities derived from a tensor.
//
// Conventions (METHODS.md sections 2 and 6):
//  - axes North-East-Down; angles in degrees in every struct and result;
//  - a fault-slip datum is (n, u) as fault_vectors() returns it: n the upward
//    (hanging-wall) unit normal, u the unit hanging-wall slip (Aki & Richards 1980);
//  - the inversion works in TENSION-positive stress, as Michael (1984) does; the
//    stored StressTensor is COMPRESSION-positive (geologists' sigma1 = most
//    compressive = largest value), trace 0, unit Frobenius norm;
//  - Phi = (s2 - s3)/(s1 - s3) with compression-positive s1 >= s2 >= s3
//    (Angelier 1979); R = 1 - Phi is the ratio of Gephart & Forsyth (1984) and
//    Lund & Townend (2007), used only inside the formulas that were written with it.
//
// Results that can be used for decisions about fault reactivation or induced
// seismicity are interpretive; they defer to site investigation, local codes and
// licensed professionals (DESIGN.md, Cautions).
#pragma once

#include "orientation.hpp"

#include <cstddef>
#include <cstdint>
#include <optional>
#include <type_traits>

namespace striae {

// ---------------------------------------------------------------------------
// The stored result: SQL type stress_tensor (fixed size, ALIGNMENT = double)
// ---------------------------------------------------------------------------

// flags bits. A field whose bit is clear is undefined (SQL NULL) and holds 0.
constexpr uint32_t kStressHasMisfit = 1u << 0;       // mean_misfit is defined
constexpr uint32_t kStressHasCones = 1u << 1;        // cone[0..2] are defined
constexpr uint32_t kStressHasPhiInterval = 1u << 2;  // phi_lo, phi_hi are defined
constexpr uint32_t kStressFocalJoint = 1u << 3;      // from the joint focal inversion
constexpr uint32_t kStressNotConverged = 1u << 4;    // focal plane picking cycled or hit its iteration limit
constexpr uint32_t kStressHasFriction = 1u << 5;     // friction is defined (joint focal inversion)
constexpr uint32_t kStressFrictionAtLimit = 1u << 6; // the friction search chose an end of its range (0.2.0)
constexpr uint32_t kStressKnownFlags = 0x7f;
constexpr uint32_t kStressTensorVersion = 1;

// A reduced stress tensor and its quality measures. 120 bytes, plain doubles and
// integers only (8-byte aligned, no Eigen members) so it can live in palloc memory
// and be sent in binary as it is.
struct StressTensor {
  // Components, COMPRESSION positive, NED: s_nn, s_ee, s_dd, s_ne, s_nd, s_ed.
  // nn + ee + dd = 0 and nn^2 + ee^2 + dd^2 + 2 (ne^2 + nd^2 + ed^2) = 1.
  double nn, ee, dd, ne, nd, ed;
  double mean_misfit;  // degrees 0..180 (kStressHasMisfit)
  double cone[3];      // 95 % confidence half-angles of sigma1..3, degrees 0..90 (kStressHasCones)
  double phi_lo;       // shape ratio Phi interval (kStressHasPhiInterval), 0 <= lo <= hi <= 1
  double phi_hi;
  double friction;     // friction coefficient used by the joint focal inversion (kStressHasFriction)
  int64_t data_count;  // data (fault-slip data or mechanisms) behind the tensor; 0 if built forward
  uint32_t flags;      // kStress* bits
  uint32_t version;    // kStressTensorVersion; binary recv checks it
};
static_assert(sizeof(StressTensor) == 120, "stress_tensor layout is part of the binary format");
static_assert(alignof(StressTensor) == 8, "stress_tensor must be double aligned");
static_assert(std::is_trivially_copyable<StressTensor>::value, "stored as raw bytes");
static_assert(std::is_trivially_destructible<StressTensor>::value, "lives in palloc memory");

// Throws DataError unless t is a well-formed stored value: version, known flags,
// finite fields, trace 0 and unit norm within 1e-9, ranges as above, undefined
// fields exactly 0. Used by binary recv and by every function taking a tensor from SQL.
void check_stress_tensor(const StressTensor &t);

// Turn every -0 field into +0: a stored tensor never holds -0, so it never
// prints "-0" and its text reads back to the same bytes (text and binary input,
// and every tensor the core makes, pass through this).
void clear_negative_zeros(StressTensor &t);

// The tensor as a symmetric 3x3 matrix, compression positive (no checks).
Mat3 stress_matrix(const StressTensor &t);

// A tensor from six components in any units and sign-consistent with the
// COMPRESSION-positive convention (nn, ee, dd, ne, nd, ed): the isotropic part is
// removed and the rest scaled to unit norm. OutOfRange for non-finite input,
// DataError for an isotropic tensor (no deviatoric part, nothing to orient).
StressTensor stress_from_components(const double c[6]);

// Forward model: sigma1 along s1, sigma3 along s3 (Gram-Schmidt orthogonalised
// against s1, so a slightly non-orthogonal pair is accepted), sigma2 = s1 x s3,
// magnitudes (compression positive) 1, Phi, 0, then made trace-free and unit norm.
// DataError if s1 and s3 are less than kParallelLimitDeg apart; OutOfRange unless
// 0 <= phi <= 1.
StressTensor stress_from_axes(const Line &s1, const Line &s3, double phi);

// Principal stresses, compression positive, value[0] >= value[1] >= value[2]
// (sigma1, sigma2, sigma3); axes unit, lower hemisphere (z >= 0). When two values
// are equal (Phi = 0 or 1) the two axes are any orthogonal pair in their plane.
// Holds Eigen vectors: a stack value only, never stored in palloc memory.
struct PrincipalStress {
  Vec3 axis[3];
  double value[3];
};
PrincipalStress principal_stresses(const StressTensor &t);

// sigma1 (i = 1), sigma2 (2) or sigma3 (3) as a lower-hemisphere line.
// InvalidParameter for other i.
Line stress_axis(const StressTensor &t, int i);

// Shape ratio Phi = (s2 - s3)/(s1 - s3) in [0,1] (Angelier 1979).
double shape_ratio(const StressTensor &t);

// Azimuth of the maximum horizontal compression, degrees [0,180), after Lund &
// Townend (2007, GJI 170:1328) eqs 10-11:
//   tan 2a = 2 (s1N s1E + (1-R) s2N s2E) / (s1N^2 - s1E^2 + (1-R)(s2N^2 - s2E^2)),
// with (s1N, s1E), (s2N, s2E) the North/East components of the sigma1, sigma2 unit
// axes and 1 - R = Phi; of the two roots the one that maximises horizontal
// compression is taken (a = atan2(numerator, denominator)/2 does exactly that).
// Undefined (nullopt) when horizontal stress is isotropic: numerator and
// denominator both below 1e-9 in units of s1 - s3 (e.g. vertical sigma1 with
// Phi = 0, or vertical sigma3 with Phi = 1).
std::optional<double> shmax_azimuth(const StressTensor &t);

// Stress regime from the plunges of the principal axes: the fault-regime classes
// of the World Stress Map scheme, Zoback (1992, JGR 97:11703, table 1). The
// limits below are recalled from memory (METHODS.md section 2); they have not
// been checked against the paper here. Plunges in degrees (pl1 of sigma1 ...):
//   Normal            normal faulting                pl1 >= 52 and pl3 <= 35
//   NormalStrikeSlip  normal with strike-slip        40 <= pl1 < 52 and pl3 <= 20
//   StrikeSlip        strike-slip faulting           (pl1 < 40, pl2 >= 45, pl3 <= 20) or
//                                                    (pl1 <= 20, pl2 >= 45, pl3 < 40)
//   ThrustStrikeSlip  thrust with strike-slip        pl1 <= 20 and 40 <= pl3 < 52
//   Thrust            thrust faulting                pl1 <= 35 and pl3 >= 52
//   Unclassified      anything else (the scheme's "unknown")
// The tests run in this order, so a state on a shared boundary takes the first
// class. Plunges are snapped to 1e-10 degree (snap_angle) before comparing.
// The labels spell the scheme's wording in striae's style (dominant motion
// first, joined by '-', as slip_sense does): "normal", "normal-strike-slip",
// "strike-slip", "thrust-strike-slip", "thrust", "unclassified".
enum class StressRegime { Normal, NormalStrikeSlip, StrikeSlip, ThrustStrikeSlip, Thrust, Unclassified };
StressRegime stress_regime(const StressTensor &t);
StressRegime stress_regime_from_plunges(double pl1, double pl2, double pl3);
const char *stress_regime_label(StressRegime r);

// Regime index A-phi (Simpson 1997, JGR 102:17909; recalled from memory in METHODS):
// A = (k + 0.5) + (-1)^k (Phi - 0.5), k = 0, 1, 2 when sigma1, sigma2, sigma3 is the
// most vertical axis (largest |down| component; a tie goes to the lower k).
// 0..1 extensional, 1..2 strike-slip, 2..3 compressional.
double regime_index(const StressTensor &t);

// ---------------------------------------------------------------------------
// Per-datum quantities under a given tensor
// ---------------------------------------------------------------------------

// Below this resolved shear traction (unit-norm tensor) the shear direction is
// rounding noise: the plane is (nearly) perpendicular to a principal axis.
constexpr double kMinResolvedShear = 1e-9;

// Hanging-wall slip direction the stress predicts on the plane with normal n (any
// length, either sign; it is normalised and taken as the upward normal): the unit
// resolved shear traction of the tension-positive tensor, Wallace (1951, J. Geol.
// 59:118) and Bott (1959, Geol. Mag. 96:109). nullopt when the shear traction is
// below kMinResolvedShear. Pair it with the upward normal in fault_from_vectors.
std::optional<Vec3> resolved_slip(const Vec3 &n, const StressTensor &t);

// Angle between the observed slip u and the predicted slip, degrees 0..180
// (0 = perfect fit, 180 = opposite sense). n upward unit normal, u unit slip;
// nullopt where resolved_slip is undefined.
std::optional<double> misfit(const Vec3 &n, const Vec3 &u, const StressTensor &t);

// Default friction and its accepted range (both tendency and focal inversion).
constexpr double kDefaultFriction = 0.6;
constexpr double kMinFriction = 0.001;
constexpr double kMaxFriction = 5.0;
// Throws InvalidParameter unless kMinFriction <= mu <= kMaxFriction.
void check_friction(double mu);

// Normalised slip tendency Ts / Ts_max in [0,1] of the plane with normal n
// (Morris et al. 1996, Geology 24:275: Ts = tau / sn). A reduced tensor has no
// absolute magnitudes, so striae assumes effective principal stresses (compression
// positive) sigma1 = 1, sigma3 = k, sigma2 = k + Phi (1 - k), with k chosen so
// that the optimally oriented plane is exactly at the frictional limit mu:
// sigma1/sigma3 = (sqrt(mu^2 + 1) + mu)^2 (Coulomb friction without cohesion, a
// common result of the theory; recalled from memory). Then Ts_max = mu and the
// value returned is Ts / mu. This is a relative measure of how close each plane is
// to the most unstable orientation, not a prediction of slip.
double slip_tendency(const Vec3 &n, const StressTensor &t, double mu = kDefaultFriction);

// Dilation tendency Td = (s1 - sn)/(s1 - s3) in [0,1] (Ferrill et al. 1999, GSA
// Today 9(5); recalled from memory in METHODS). It does not depend on the
// assumed magnitudes: with l the direction cosines of n in the principal frame,
// Td = l3^2 + (1 - Phi) l2^2.
double dilation_tendency(const Vec3 &n, const StressTensor &t);

// Instability of Vavrycuk (2014) in [0,1]: principal frame, compression positive,
// S = diag(1, 1 - 2R, -1) with R = 1 - Phi; I = (tau - mu (sn - 1)) / (mu + sqrt(1 + mu^2)).
// 1 for the optimally oriented plane, 0 for a plane normal to sigma1.
double instability(const Vec3 &n, const StressTensor &t, double mu);

// ---------------------------------------------------------------------------
// Linear inversion (Michael 1984) as an aggregate state
// ---------------------------------------------------------------------------
//
// Unknowns x = (s11, s12, s13, s22, s23) of the tension-positive tensor, s33 =
// -(s11 + s22). Assuming |tau| = 1 on every fault gives three linear rows per
// datum, A_i x = u_i, with column k of A_i the shear traction of the basis tensor
// E_k: a_k = E_k n - (n . E_k n) n. The state keeps the normal equations, which
// add across rows, groups, workers and servers.
// Accuracy: the answer is exact (to rounding) for error-free data only where all
// faults carry the same shear traction; otherwise the |tau| = 1 assumption biases
// it. For error-free data on uniformly random planes the unit tests see axes off
// by up to ~3 degrees and Phi by up to ~0.12 (overestimated); data from faults
// near the optimal orientation, as real faults tend to be, do much better.

// A fault-slip datum as the data-keeping functions take it: 48 bytes, plain.
struct SlipDatum {
  double n[3];  // upward unit normal
  double u[3];  // unit hanging-wall slip
};
static_assert(sizeof(SlipDatum) == 48 && std::is_trivially_copyable<SlipDatum>::value, "plain");

// The (n, u) pair of a fault-slip datum.
SlipDatum slip_datum(const FaultSlip &f);
// Sort data lexicographically by (n, u), so that results computed from kept
// data (bootstrap, focal inversion) do not depend on row order or plan.
void sort_slip_data(SlipDatum *data, size_t count);

// Normal equations of the linear inversion. 176 bytes, trivially copyable.
struct StressAccum {
  int64_t count;    // data added
  double ata[15];   // upper triangle of A^T A, row major: (0,0) (0,1) .. (0,4) (1,1) .. (4,4)
  double atu[5];    // A^T u
  double uu;        // sum u.u (= count for unit slips)
};
static_assert(std::is_trivially_copyable<StressAccum>::value, "aggregate state is raw bytes");
static_assert(std::is_trivially_destructible<StressAccum>::value, "aggregate state lives in palloc memory");

// Outcome of a solve. Everything but Ok means "no tensor" (SQL NULL).
enum class StressStatus {
  Ok,
  Empty,        // no data
  TooFewData,   // fewer than kMinStressData data
  Degenerate,   // normal equations rank deficient, or the slips cancel out
};
// Short English reason, e.g. for a NOTICE.
const char *stress_status_text(StressStatus s);

// Fewer data than this give no tensor. Four data are 12 equations for 5 unknowns;
// three would be enough algebraically but leave no redundancy against noise.
constexpr int64_t kMinStressData = 4;
// A^T A counts as rank deficient when its smallest eigenvalue is below this
// fraction of its largest. Exactly parallel faults (rank 2), faults of one zone
// (normals on a great circle: rank 4) and other exact degeneracies give ratios of
// order 1e-16 .. 1e-13 from rounding, even over 1e7 data; a real data set of
// distinct orientations gives ratios far above 1e-10 (the ratio scales as the
// square of the angular spread: 1e-10 is a spread of about 1e-5 rad).
constexpr double kStressRankLimit = 1e-10;
// The slips "cancel out" when |A^T u| < this * sqrt(trace(A^T A) * sum u.u)
// (the bound of |A^T u| by Cauchy-Schwarz): the least-squares tensor is zero.
constexpr double kStressNullLimit = 1e-12;

// DataError unless n, u are finite, unit and orthogonal within 1e-9 (what
// fault_vectors() returns always passes).
void check_slip_datum(const double n[3], const double u[3]);

// Largest data count of a state: counts must convert to double exactly.
constexpr int64_t kMaxStressData = int64_t(1) << 53;

void stress_init(StressAccum &s);
// Add one datum (checked with check_slip_datum).
void stress_add(StressAccum &s, const Vec3 &n, const Vec3 &u);
// Add one fault-slip datum: its vectors come from fault_vectors(), unit and
// orthogonal by construction, so the vector check is skipped (the angles must
// be finite: DataError otherwise). The per-row path of stress_inversion.
void stress_add_fault(StressAccum &s, const FaultSlip &f);
// into += from; exact sums, so commutative, and associative up to rounding.
// DataError if the count would exceed kMaxStressData.
void stress_combine(StressAccum &into, const StressAccum &from);
// BadState unless 0 <= count <= kMaxStressData, all fields finite, the empty
// state all zero, the diagonal of A^T A >= 0, trace(A^T A) <= 4 count, sum u.u =
// count, and every off-diagonal and right-hand-side sum within the
// Cauchy-Schwarz bound of its diagonal sums (all to 1e-6 relative). (A datum adds sum_k |a_k|^2 <= sum_k |E_k n|^2 = 3 + n3^2 <= 4 to the trace.)
void stress_validate(const StressAccum &s);
// Solve. On Ok, out holds the tensor with data_count set; mean misfit, cones and
// Phi interval are undefined (the state does not keep the data: the glue can add
// the misfit with a second pass over the data using misfit()). On any other status
// out is zeroed.
StressStatus stress_finalise(const StressAccum &s, StressTensor &out);

// The 20 numbers one datum adds to the state (15 of A^T A, then 5 of A^T u),
// weight 1. n, u are not checked. Exposed for the bootstrap.
void stress_contribution(const double n[3], const double u[3], double out[20]);
// Solve from 20 sums (as above) and a data count; shared by finalise and the bootstrap.
StressStatus stress_solve(const double sums[20], double uu, int64_t count, StressTensor &out);

// Exact mean misfit in degrees of a tensor over data (data with undefined misfit,
// planes normal to a principal axis, are left out). nullopt if none is left.
std::optional<double> mean_misfit(const SlipDatum *data, size_t count, const StressTensor &t);

// ---------------------------------------------------------------------------
// Joint inversion of focal mechanisms (Vavrycuk 2014)
// ---------------------------------------------------------------------------
//
// Each mechanism is given by one nodal plane (n, u); its auxiliary plane is (u, n)
// (the normal of one is the slip of the other; the same double couple). Which one
// is the fault is unknown. Procedure:
//  1. linear inversion of both nodal planes of every mechanism (2N data);
//  2. under the current tensor pick, per mechanism, the plane of larger
//     instability (ties: the given plane), re-invert with the picked planes;
//  3. stop as soon as the picks equal those that produced the current tensor
//     (converged); or when they repeat an earlier pick set (a cycle, in practice
//     one or two near-tied mechanisms flipping back and forth): then the cycle's
//     tensor whose producing picks have the highest mean instability under it is
//     returned; or after kFocalMaxIterations re-inversions (the last tensor is
//     returned). The last two set kStressNotConverged. Pick sets are compared by
//     a 64-bit hash.
// Friction: fixed (mu_min == mu_max) or a grid search mu = mu_min + j step,
// j = 0, 1, .. while mu <= mu_max (+1e-9); each mu runs the procedure above and
// is scored by the mean instability of the picked planes under its final tensor;
// the highest score wins, a tie goes to the smaller mu. The returned tensor has
// the exact mean misfit of the picked planes and kStressFocalJoint set; when a
// search ran (mu_min < mu_max) and chose its first or last value, also
// kStressFrictionAtLimit: the best friction may lie outside the range searched.
// What the search can tell: the score (mean instability) is usually flat in mu,
// and on synthetic data made with mu = 0.6 it ends at the top of 0.2..1.0 (the
// method's own behaviour, reproduced independently); the stress axes and Phi
// change little with mu, so the friction chosen is a weak by-product, not a
// measurement of the faults' friction.

constexpr int kFocalMaxIterations = 50;
constexpr int kMaxFrictionSteps = 1001;

struct FrictionRange {
  double mu_min = kDefaultFriction;
  double mu_max = kDefaultFriction;
  double step = 0.1;  // ignored when mu_min == mu_max
};
// InvalidParameter unless both limits pass check_friction, mu_min <= mu_max, and
// (if they differ) step > 0 gives at most kMaxFrictionSteps values.
void check_friction_range(const FrictionRange &f);

struct FocalInversion {
  StressTensor tensor;
  double friction;  // the mu used (chosen by the search, or the fixed one)
  double score;     // mean instability of the picked planes, 0..1
  int32_t iterations;  // re-inversions done for the chosen mu
  int32_t reserved;
};
static_assert(std::is_trivially_copyable<FocalInversion>::value, "plain result");

// One run of steps 1-3 at a fixed mu, shared with the bootstrap. weight (may be
// null = all 1) gives each mechanism a multiplicity; mechanisms of weight 0 are
// ignored and their picked byte left as it is. data_count of the result is the
// sum of the weights. score receives the mean instability (weighted) of the
// picked planes; iterations the re-inversions done; the tensor's flags carry
// kStressNotConverged when the limit was hit. No misfit is computed here.
// terms, if given, holds 40 doubles per datum: stress_contribution(n, u) then
// stress_contribution(u, n); they are used instead of recomputing the terms at
// every iteration (the bootstrap computes them once for all its resamples), with
// the same values and sums, so the result is the same to the bit.
StressStatus focal_fixed_friction(const SlipDatum *data, size_t count, const uint32_t *weight,
                                  double mu, uint8_t *picked, StressTensor &out, double &score,
                                  int32_t &iterations, const double *terms = nullptr);

// Joint inversion of count mechanisms (caller-owned data). picked (count bytes,
// caller-owned, written on Ok) receives 0 where the given plane (n, u) is taken as
// the fault and 1 where the auxiliary plane (u, n) is. Status as for the linear
// inversion, with the tests of too few data applied to the N mechanisms and the
// degeneracy test to the 2N-plane start and to every picked set; a friction value
// whose picked set is degenerate is skipped, and if all are, Degenerate.
StressStatus invert_focal(const SlipDatum *data, size_t count, const FrictionRange &friction,
                          uint8_t *picked, FocalInversion &out);

}  // namespace striae
