// Reduced stress tensors, Michael (1984) linear inversion and Vavrycuk (2014)
// joint focal-mechanism inversion. Conventions and rules: stress.hpp.
#include "stress.hpp"

#include <algorithm>
#include <tuple>
#include <cmath>
#include <cstring>
#include <vector>

namespace striae {

namespace {

using Mat5 = Eigen::Matrix<double, 5, 5>;
using Vec5 = Eigen::Matrix<double, 5, 1>;

// Index of (i, j), i <= j, in the row-major upper triangle of a 5x5 matrix.
constexpr int kTri[5][5] = {
    {0, 1, 2, 3, 4}, {1, 5, 6, 7, 8}, {2, 6, 9, 10, 11}, {3, 7, 10, 12, 13}, {4, 8, 11, 13, 14}};

// Tolerance for "unit" and "orthogonal" input vectors and stored tensors.
constexpr double kUnitTol = 1e-9;

// Components of a tensor in the order they are stored.
void to_array(const StressTensor &t, double c[6]) {
  c[0] = t.nn; c[1] = t.ee; c[2] = t.dd; c[3] = t.ne; c[4] = t.nd; c[5] = t.ed;
}

// Frobenius norm of a symmetric tensor given as (nn, ee, dd, ne, nd, ed).
double frob(const double c[6]) {
  return std::sqrt(c[0] * c[0] + c[1] * c[1] + c[2] * c[2] +
                   2.0 * (c[3] * c[3] + c[4] * c[4] + c[5] * c[5]));
}

// A fresh tensor value from six compression-positive components that are
// already trace-free and unit norm; everything else undefined.
StressTensor make_tensor(const double c[6], int64_t count) {
  StressTensor t;
  std::memset(&t, 0, sizeof t);
  t.nn = c[0]; t.ee = c[1]; t.dd = c[2]; t.ne = c[3]; t.nd = c[4]; t.ed = c[5];
  t.data_count = count;
  t.flags = 0;
  t.version = kStressTensorVersion;
  clear_negative_zeros(t);
  return t;
}

// Remove the isotropic part and scale to unit norm; false if nothing is left.
bool normalise_deviator(double c[6]) {
  const double m = (c[0] + c[1] + c[2]) / 3.0;
  const double scale = frob(c);
  c[0] -= m; c[1] -= m; c[2] -= m;
  const double f = frob(c);
  if (!(f > 1e-12 * scale) || !std::isfinite(f)) return false;
  for (int i = 0; i < 6; ++i) c[i] /= f;
  return true;
}

// Phi from compression-positive descending values, clamped against rounding.
double phi_of(const double v[3]) {
  const double d = v[0] - v[2];
  if (!(d > 0)) return 0.0;  // cannot happen for a unit-norm deviator
  return std::clamp((v[1] - v[2]) / d, 0.0, 1.0);
}

// Direction cosines of unit n in the principal frame.
inline void cosines(const PrincipalStress &p, const Vec3 &n, double l[3]) {
  for (int i = 0; i < 3; ++i) l[i] = p.axis[i].dot(n);
}

// Principal frame and magnitudes of Vavrycuk's instability, prepared once per
// tensor so that scoring many planes is a few multiplications each.
struct InstabilityFrame {
  double axis[3][3];
  double s[3];      // 1, 1 - 2R = 2 Phi - 1, -1 (compression positive)
  double mu;
  double inv_norm;  // 1 / (mu + sqrt(1 + mu^2))
};

// Frame and magnitudes for scoring planes under one tensor and friction.
InstabilityFrame instability_frame(const StressTensor &t, double mu) {
  const PrincipalStress p = principal_stresses(t);
  InstabilityFrame f;
  for (int i = 0; i < 3; ++i)
    for (int j = 0; j < 3; ++j) f.axis[i][j] = p.axis[i][j];
  const double phi = phi_of(p.value);
  f.s[0] = 1.0;
  f.s[1] = 2.0 * phi - 1.0;
  f.s[2] = -1.0;
  f.mu = mu;
  f.inv_norm = 1.0 / (mu + std::sqrt(1.0 + mu * mu));
  return f;
}

// Instability of the plane with unit normal n under a prepared frame.
inline double instability_at(const InstabilityFrame &f, const double n[3]) {
  double sn = 0.0, ss = 0.0;
  for (int i = 0; i < 3; ++i) {
    const double l = f.axis[i][0] * n[0] + f.axis[i][1] * n[1] + f.axis[i][2] * n[2];
    const double l2 = l * l;
    sn += f.s[i] * l2;
    ss += f.s[i] * f.s[i] * l2;
  }
  const double tau = std::sqrt(std::max(0.0, ss - sn * sn));
  return std::clamp((tau - f.mu * (sn - 1.0)) * f.inv_norm, 0.0, 1.0);
}

// Eigenvalues of a symmetric 5x5 matrix by cyclic Jacobi rotations (Jacobi's
// method, textbook numerical linear algebra). Written out because Eigen's
// tridiagonalising solver for sizes above 3 trips GCC 12's -Wmaybe-uninitialized
// (a false positive that -Werror turns into a build failure); Jacobi is also
// accurate in the small eigenvalues, which is what the rank test looks at.
void jacobi_eigenvalues5(Mat5 a, double ev[5]) {
  for (int sweep = 0; sweep < 50; ++sweep) {
    double off = 0.0, diag = 0.0;
    for (int p = 0; p < 5; ++p) {
      diag += a(p, p) * a(p, p);
      for (int q = p + 1; q < 5; ++q) off += a(p, q) * a(p, q);
    }
    if (off <= 1e-36 * diag || off == 0.0) break;
    for (int p = 0; p < 4; ++p) {
      for (int q = p + 1; q < 5; ++q) {
        const double apq = a(p, q);
        if (apq == 0.0) continue;
        // Rotation angle that zeroes a(p,q): t = tan(theta), the smaller root.
        const double theta = (a(q, q) - a(p, p)) / (2.0 * apq);
        const double t = (theta >= 0 ? 1.0 : -1.0) / (std::fabs(theta) + std::sqrt(theta * theta + 1.0));
        const double c = 1.0 / std::sqrt(t * t + 1.0), s = t * c;
        for (int k = 0; k < 5; ++k) {  // columns p, q
          const double akp = a(k, p), akq = a(k, q);
          a(k, p) = c * akp - s * akq;
          a(k, q) = s * akp + c * akq;
        }
        for (int k = 0; k < 5; ++k) {  // rows p, q
          const double apk = a(p, k), aqk = a(q, k);
          a(p, k) = c * apk - s * aqk;
          a(q, k) = s * apk + c * aqk;
        }
        a(p, q) = a(q, p) = 0.0;
      }
    }
  }
  for (int i = 0; i < 5; ++i) ev[i] = a(i, i);
  std::sort(ev, ev + 5);
}

}  // namespace

// ---------------------------------------------------------------------------
// Tensor values
// ---------------------------------------------------------------------------

// Validate a stored tensor (binary recv and SQL inputs).
void check_stress_tensor(const StressTensor &t) {
  auto bad = [](const char *what) {
    throw Error(ErrorKind::DataError, std::string("invalid stress_tensor value: ") + what);
  };
  if (t.version != kStressTensorVersion) bad("unknown version");
  if (t.flags & ~kStressKnownFlags) bad("unknown flag bits");
  const double fields[] = {t.nn, t.ee, t.dd, t.ne, t.nd, t.ed, t.mean_misfit,
                           t.cone[0], t.cone[1], t.cone[2], t.phi_lo, t.phi_hi, t.friction};
  for (double v : fields)
    if (!std::isfinite(v)) bad("non-finite component");
  double c[6];
  to_array(t, c);
  if (std::fabs(c[0] + c[1] + c[2]) > kUnitTol) bad("trace is not zero");
  if (std::fabs(frob(c) - 1.0) > kUnitTol) bad("norm is not one");
  if (t.data_count < 0) bad("negative data count");
  if (t.flags & kStressHasMisfit) {
    if (t.mean_misfit < 0 || t.mean_misfit > 180) bad("mean misfit outside 0..180");
  } else if (t.mean_misfit != 0) {
    bad("undefined mean misfit is not zero");
  }
  for (double a : t.cone) {
    if (t.flags & kStressHasCones) {
      if (a < 0 || a > 90) bad("confidence cone outside 0..90");
    } else if (a != 0) {
      bad("undefined confidence cone is not zero");
    }
  }
  if (t.flags & kStressHasPhiInterval) {
    if (!(0 <= t.phi_lo && t.phi_lo <= t.phi_hi && t.phi_hi <= 1)) bad("shape ratio interval outside 0..1");
  } else if (t.phi_lo != 0 || t.phi_hi != 0) {
    bad("undefined shape ratio interval is not zero");
  }
  if (t.flags & kStressHasFriction) {
    if (!(t.friction >= kMinFriction && t.friction <= kMaxFriction)) bad("friction outside 0.001..5");
  } else if (t.friction != 0) {
    bad("undefined friction is not zero");
  }
}

void clear_negative_zeros(StressTensor &t) {
  double *f[] = {&t.nn, &t.ee, &t.dd, &t.ne, &t.nd, &t.ed, &t.mean_misfit,
                 &t.cone[0], &t.cone[1], &t.cone[2], &t.phi_lo, &t.phi_hi, &t.friction};
  for (double *v : f) *v += 0.0;  // -0 + 0 = +0; every other value is unchanged
}

// Symmetric matrix of the stored components (compression positive).
Mat3 stress_matrix(const StressTensor &t) {
  Mat3 m;
  m << t.nn, t.ne, t.nd,
       t.ne, t.ee, t.ed,
       t.nd, t.ed, t.dd;
  return m;
}

// Tensor from six user components: deviator, unit norm.
StressTensor stress_from_components(const double c0[6]) {
  double c[6];
  for (int i = 0; i < 6; ++i) {
    if (!std::isfinite(c0[i]))
      throw Error(ErrorKind::OutOfRange, "stress tensor components must be finite");
    c[i] = c0[i];
  }
  // Scale first so that huge or tiny units neither overflow nor underflow.
  double big = 0.0;
  for (double v : c) big = std::max(big, std::fabs(v));
  if (big > 0.0)
    for (double &v : c) v /= big;
  if (big == 0.0 || !normalise_deviator(c))
    throw Error(ErrorKind::DataError, "stress tensor is isotropic: it has no principal axes",
                "A reduced stress tensor needs unequal principal stresses.");
  return make_tensor(c, 0);
}

// Forward model from sigma1, sigma3 axes and Phi.
StressTensor stress_from_axes(const Line &l1, const Line &l3, double phi) {
  if (!std::isfinite(phi) || phi < 0.0 || phi > 1.0)
    throw Error(ErrorKind::OutOfRange, "shape ratio must be between 0 and 1",
                "Phi = (s2 - s3)/(s1 - s3).");
  const Vec3 e1 = line_vector(l1);
  Vec3 v3 = line_vector(l3);
  if (axial_angle(e1, v3) < kParallelLimitDeg)
    throw Error(ErrorKind::DataError, "sigma1 and sigma3 axes are parallel",
                "The axes are less than 1e-6 degree apart; give two (nearly) perpendicular axes.");
  // Gram-Schmidt: keep sigma1, make sigma3 perpendicular to it.
  const Vec3 e3 = (v3 - v3.dot(e1) * e1).normalized();
  const Vec3 e2 = e1.cross(e3);
  const Mat3 m = e1 * e1.transpose() + phi * (e2 * e2.transpose());  // magnitudes 1, Phi, 0
  double c[6] = {m(0, 0), m(1, 1), m(2, 2), m(0, 1), m(0, 2), m(1, 2)};
  normalise_deviator(c);  // never fails: magnitudes 1 and 0 differ
  return make_tensor(c, 0);
}

// Eigen-decomposition, descending compression-positive values.
PrincipalStress principal_stresses(const StressTensor &t) {
  Eigen::SelfAdjointEigenSolver<Mat3> es(stress_matrix(t));
  PrincipalStress p;
  for (int i = 0; i < 3; ++i) {
    p.value[i] = es.eigenvalues()(2 - i);  // Eigen sorts ascending
    Vec3 v = es.eigenvectors().col(2 - i);
    if (v.z() < 0) v = -v;
    p.axis[i] = v;
  }
  return p;
}

// One principal axis as a line.
Line stress_axis(const StressTensor &t, int i) {
  if (i < 1 || i > 3) throw Error(ErrorKind::InvalidParameter, "principal axis number must be 1, 2 or 3");
  return vector_line(principal_stresses(t).axis[i - 1]);
}

// Phi = (s2 - s3)/(s1 - s3).
double shape_ratio(const StressTensor &t) { return phi_of(principal_stresses(t).value); }

// SHmax azimuth, Lund & Townend (2007) eqs 10-11.
std::optional<double> shmax_azimuth(const StressTensor &t) {
  const PrincipalStress p = principal_stresses(t);
  const double phi = phi_of(p.value);  // = 1 - R
  const Vec3 &a = p.axis[0], &b = p.axis[1];
  const double num = 2.0 * (a.x() * a.y() + phi * b.x() * b.y());
  const double den = a.x() * a.x() - a.y() * a.y() + phi * (b.x() * b.x() - b.y() * b.y());
  // num/2 and den are the off-diagonal and the difference of the diagonal of the
  // horizontal block of (sigma - s3 I)/(s1 - s3) = e1 e1^T + Phi e2 e2^T, so the
  // maximum of the horizontal normal stress h^T sigma h is at 2a = atan2(num, den).
  if (std::hypot(num, den) < 1e-9) return std::nullopt;
  double az = snap_angle(deg(0.5 * std::atan2(num, den)));  // (-90, 90]
  if (az < 0) az += 180.0;
  if (az >= 180.0) az -= 180.0;
  return az;
}

// Zoback (1992) fault-regime classes (limits from memory, see header).
StressRegime stress_regime_from_plunges(double p1, double p2, double p3) {
  if (p1 >= 52 && p3 <= 35) return StressRegime::Normal;
  if (p1 >= 40 && p1 < 52 && p3 <= 20) return StressRegime::NormalStrikeSlip;
  if ((p1 < 40 && p2 >= 45 && p3 <= 20) || (p1 <= 20 && p2 >= 45 && p3 < 40)) return StressRegime::StrikeSlip;
  if (p1 <= 20 && p3 >= 40 && p3 < 52) return StressRegime::ThrustStrikeSlip;
  if (p1 <= 35 && p3 >= 52) return StressRegime::Thrust;
  return StressRegime::Unclassified;
}

// Regime of a tensor from its axis plunges.
StressRegime stress_regime(const StressTensor &t) {
  const PrincipalStress p = principal_stresses(t);
  double pl[3];
  for (int i = 0; i < 3; ++i) pl[i] = vector_line(p.axis[i]).plunge;  // snapped to 1e-10 degree
  return stress_regime_from_plunges(pl[0], pl[1], pl[2]);
}

// The scheme's wording in striae's spelling (see header).
const char *stress_regime_label(StressRegime r) {
  switch (r) {
    case StressRegime::Normal: return "normal";
    case StressRegime::NormalStrikeSlip: return "normal-strike-slip";
    case StressRegime::StrikeSlip: return "strike-slip";
    case StressRegime::ThrustStrikeSlip: return "thrust-strike-slip";
    case StressRegime::Thrust: return "thrust";
    case StressRegime::Unclassified: break;
  }
  return "unclassified";
}

// Simpson (1997) A-phi.
double regime_index(const StressTensor &t) {
  const PrincipalStress p = principal_stresses(t);
  int k = 0;
  for (int i = 1; i < 3; ++i)
    if (std::fabs(p.axis[i].z()) > std::fabs(p.axis[k].z())) k = i;
  const double phi = phi_of(p.value);
  return (k + 0.5) + ((k % 2) ? -1.0 : 1.0) * (phi - 0.5);
}

// ---------------------------------------------------------------------------
// Per-datum quantities
// ---------------------------------------------------------------------------

// Wallace-Bott predicted hanging-wall slip.
std::optional<Vec3> resolved_slip(const Vec3 &n0, const StressTensor &t) {
  const double len = n0.norm();
  if (!(len > 0) || !std::isfinite(len))
    throw Error(ErrorKind::DataError, "fault normal is a zero or non-finite vector");
  Vec3 n = n0 / len;
  if (n.z() > 0) n = -n;  // upward normal: the hanging wall is on its side
  const Vec3 tr = -(stress_matrix(t) * n);  // tension-positive traction
  const Vec3 tau = tr - tr.dot(n) * n;
  const double s = tau.norm();
  if (!(s >= kMinResolvedShear)) return std::nullopt;
  return Vec3(tau / s);
}

// Angle between observed and predicted slip.
std::optional<double> misfit(const Vec3 &n, const Vec3 &u, const StressTensor &t) {
  const Vec3 tr = -(stress_matrix(t) * n);
  const Vec3 tau = tr - tr.dot(n) * n;
  if (!(tau.norm() >= kMinResolvedShear)) return std::nullopt;
  return deg(std::atan2(u.cross(tau).norm(), u.dot(tau)));
}

// Friction parameter check.
void check_friction(double mu) {
  if (!std::isfinite(mu) || mu < kMinFriction || mu > kMaxFriction)
    throw Error(ErrorKind::InvalidParameter, "friction coefficient must be between 0.001 and 5",
                "", "Typical values for faults are 0.4 to 0.9.");
}

// Slip tendency normalised by its maximum mu (see header for the magnitude model).
double slip_tendency(const Vec3 &n0, const StressTensor &t, double mu) {
  check_friction(mu);
  const Vec3 n = n0.normalized();
  const PrincipalStress p = principal_stresses(t);
  const double phi = phi_of(p.value);
  const double q = mu + std::sqrt(mu * mu + 1.0);  // sqrt(sigma1/sigma3) at the frictional limit
  const double k = 1.0 / (q * q);
  const double s[3] = {1.0, k + phi * (1.0 - k), k};
  double l[3], sn = 0.0, ss = 0.0;
  cosines(p, n, l);
  for (int i = 0; i < 3; ++i) {
    sn += s[i] * l[i] * l[i];
    ss += s[i] * s[i] * l[i] * l[i];
  }
  const double tau = std::sqrt(std::max(0.0, ss - sn * sn));
  return std::clamp(tau / (sn * mu), 0.0, 1.0);  // sn >= k > 0
}

// Dilation tendency, magnitude free.
double dilation_tendency(const Vec3 &n0, const StressTensor &t) {
  const Vec3 n = n0.normalized();
  const PrincipalStress p = principal_stresses(t);
  double l[3];
  cosines(p, n, l);
  return std::clamp(l[2] * l[2] + (1.0 - phi_of(p.value)) * l[1] * l[1], 0.0, 1.0);
}

// Vavrycuk (2014) instability of one plane.
double instability(const Vec3 &n0, const StressTensor &t, double mu) {
  check_friction(mu);
  const Vec3 n = n0.normalized();
  const double v[3] = {n.x(), n.y(), n.z()};
  return instability_at(instability_frame(t, mu), v);
}

// ---------------------------------------------------------------------------
// Linear inversion
// ---------------------------------------------------------------------------

// Short reason for a status.
const char *stress_status_text(StressStatus s) {
  switch (s) {
    case StressStatus::Ok: return "ok";
    case StressStatus::Empty: return "no data";
    case StressStatus::TooFewData: return "fewer than 4 data";
    case StressStatus::Degenerate: return "data do not constrain a stress tensor (faults parallel, of one zone, or slips cancelling)";
  }
  return "unknown";
}

// Unit, orthogonal, finite.
void check_slip_datum(const double n[3], const double u[3]) {
  for (int i = 0; i < 3; ++i)
    if (!std::isfinite(n[i]) || !std::isfinite(u[i]))
      throw Error(ErrorKind::DataError, "fault-slip vectors must be finite");
  const double nn = n[0] * n[0] + n[1] * n[1] + n[2] * n[2];
  const double uu = u[0] * u[0] + u[1] * u[1] + u[2] * u[2];
  const double nu = n[0] * u[0] + n[1] * u[1] + n[2] * u[2];
  if (std::fabs(nn - 1.0) > kUnitTol || std::fabs(uu - 1.0) > kUnitTol || std::fabs(nu) > kUnitTol)
    throw Error(ErrorKind::DataError, "fault-slip vectors must be unit and orthogonal",
                "The normal and slip of a fault-slip datum are unit vectors at right angles.");
}

// 15 + 5 normal-equation terms of one datum, written out: the shear traction
// of each basis tensor is a_k = w_k - (n.w_k) n, with w_k = E_k n for
// E1 = diag(1,0,-1), E2 = sym(1,2), E3 = sym(1,3), E4 = diag(0,1,-1), E5 = sym(2,3)
// (s33 = -(s11 + s22)); out holds a_k.a_l (upper triangle, row-major, kTri
// order) and then a_k.u. With q_k = n.w_k, expanding the products gives
//   a_k.a_l = w_k.w_l - q_k q_l (2 - n.n),   a_k.u = w_k.u - q_k (n.u),
// and w_k.w_l, w_k.u are one or two products of components each (derived from
// the E_k above; the unit test compares with the a_k built explicitly). About
// 60 operations instead of 130: this runs for every row.
namespace {
STRIAE_HOT void contribution_terms(const double n[3], const double u[3], double out[20]) {
  const double n0 = n[0], n1 = n[1], n2 = n[2], u0 = u[0], u1 = u[1], u2 = u[2];
  const double s0 = n0 * n0, s1 = n1 * n1, s2 = n2 * n2;
  const double p01 = n0 * n1, p02 = n0 * n2, p12 = n1 * n2;
  const double q[5] = {s0 - s2, 2 * p01, 2 * p02, s1 - s2, 2 * p12};
  const double g = 2.0 - (s0 + s1 + s2);  // 1 for a unit normal
  const double qg[5] = {q[0] * g, q[1] * g, q[2] * g, q[3] * g, q[4] * g};
  // w_k.w_l, upper triangle in kTri order.
  const double ww[15] = {s0 + s2, p01, 0.0, s2,  -p12,  //
                         s0 + s1, p12, p01, p02,        //
                         s0 + s2, -p02, p01,            //
                         s1 + s2, 0.0,                  //
                         s1 + s2};
  int i = 0;
  for (int k = 0; k < 5; ++k)
    for (int l = k; l < 5; ++l, ++i) out[i] = ww[i] - q[k] * qg[l];
  const double nu = n0 * u0 + n1 * u1 + n2 * u2;
  const double wu[5] = {n0 * u0 - n2 * u2, n1 * u0 + n0 * u1, n2 * u0 + n0 * u2, n1 * u1 - n2 * u2,
                        n2 * u1 + n1 * u2};
  for (int k = 0; k < 5; ++k) out[15 + k] = wu[k] - q[k] * nu;
}


// Add one datum's terms to the normal equations (vectors already checked).
STRIAE_HOT void accumulate(StressAccum &s, const double n[3], const double u[3]) {
  double c[20];
  contribution_terms(n, u, c);
  for (int i = 0; i < 15; ++i) s.ata[i] += c[i];
  for (int i = 0; i < 5; ++i) s.atu[i] += c[15 + i];
  s.uu += u[0] * u[0] + u[1] * u[1] + u[2] * u[2];
  s.count += 1;
}
}  // namespace

void stress_contribution(const double n[3], const double u[3], double out[20]) { contribution_terms(n, u, out); }

// Empty state: all zero.
void stress_init(StressAccum &s) { std::memset(&s, 0, sizeof s); }

// Accumulate one checked datum.
void stress_add(StressAccum &s, const Vec3 &n, const Vec3 &u) {
  const double nv[3] = {n.x(), n.y(), n.z()}, uv[3] = {u.x(), u.y(), u.z()};
  check_slip_datum(nv, uv);
  accumulate(s, nv, uv);
}

void stress_add_fault(StressAccum &s, const FaultSlip &f) {
  if (!std::isfinite(f.strike) || !std::isfinite(f.dip) || !std::isfinite(f.rake))
    throw Error(ErrorKind::DataError, "fault-slip angles must be finite numbers",
                "NaN and infinite values are not orientations.");
  Vec3 n, u;
  fault_vectors(f, n, u);
  const double nv[3] = {n.x(), n.y(), n.z()}, uv[3] = {u.x(), u.y(), u.z()};
  accumulate(s, nv, uv);
}

// Parallel combine: plain sums.
void stress_combine(StressAccum &into, const StressAccum &from) {
  if (into.count > kMaxStressData - from.count)
    throw Error(ErrorKind::DataError, "too many data for a stress inversion (limit 2^53)");
  into.count += from.count;
  for (int i = 0; i < 15; ++i) into.ata[i] += from.ata[i];
  for (int i = 0; i < 5; ++i) into.atu[i] += from.atu[i];
  into.uu += from.uu;
}

// Reject states no sequence of adds could produce.
void stress_validate(const StressAccum &s) {
  auto bad = [](const char *what) {
    throw Error(ErrorKind::BadState, std::string("invalid stress inversion state: ") + what);
  };
  if (s.count < 0) bad("negative count");
  if (s.count > kMaxStressData) bad("count exceeds 2^53");
  for (double v : s.ata) if (!std::isfinite(v)) bad("non-finite sum");
  for (double v : s.atu) if (!std::isfinite(v)) bad("non-finite sum");
  if (!std::isfinite(s.uu)) bad("non-finite sum");
  const double cnt = static_cast<double>(s.count);
  if (s.count == 0) {
    for (double v : s.ata) if (v != 0) bad("empty state with non-zero sums");
    for (double v : s.atu) if (v != 0) bad("empty state with non-zero sums");
    if (s.uu != 0) bad("empty state with non-zero sums");
    return;
  }
  double trace = 0.0;
  for (int k = 0; k < 5; ++k) {
    const double d = s.ata[kTri[k][k]];
    if (d < 0) bad("negative diagonal");
    trace += d;
  }
  // 1e-6 rather than kUnitTol: each datum may be off unit by kUnitTol, and sums round.
  if (trace > 4.0 * cnt * (1.0 + 1e-6)) bad("sums too large for the count");
  if (std::fabs(s.uu - cnt) > 1e-6 * cnt) bad("slip norms do not match the count");
  // Cauchy-Schwarz on the sums over data: |sum a_k.a_l| <= sqrt(sum |a_k|^2 sum |a_l|^2)
  // and |sum a_k.u| <= sqrt(sum |a_k|^2 sum u.u), with the same relative slack.
  // Together with the trace this bounds every sum by a few times the count, so
  // sums of valid states stay finite (a fuzzed state with an off-diagonal sum
  // near 1e308 passed the older checks and combined into infinities).
  for (int k = 0; k < 5; ++k) {
    const double dk = s.ata[kTri[k][k]];
    for (int l = k + 1; l < 5; ++l)
      if (std::fabs(s.ata[kTri[k][l]]) > std::sqrt(dk * s.ata[kTri[l][l]]) * (1.0 + 1e-6) + 1e-12 * cnt)
        bad("off-diagonal sum larger than its diagonal sums allow");
    if (std::fabs(s.atu[k]) > std::sqrt(dk * s.uu) * (1.0 + 1e-6) + 1e-12 * cnt)
      bad("right-hand side larger than its sums allow");
  }
}

// Solve the normal equations (rules in the header).
StressStatus stress_solve(const double sums[20], double uu, int64_t count, StressTensor &out) {
  std::memset(&out, 0, sizeof out);
  if (count <= 0) return StressStatus::Empty;
  if (count < kMinStressData) return StressStatus::TooFewData;
  Mat5 m;
  Vec5 b;
  for (int k = 0; k < 5; ++k) {
    for (int l = 0; l < 5; ++l) m(k, l) = sums[kTri[k][l]];
    b(k) = sums[15 + k];
  }
  // Rank test on the eigenvalues, relative to the largest (kStressRankLimit).
  double ev[5];
  jacobi_eigenvalues5(m, ev);
  const double lmax = ev[4], lmin = ev[0];
  if (!(lmax > 0) || !(lmin >= kStressRankLimit * lmax)) return StressStatus::Degenerate;
  if (!(b.norm() >= kStressNullLimit * std::sqrt(m.trace() * uu))) return StressStatus::Degenerate;
  const Vec5 x = m.ldlt().solve(b);
  // Tension-positive solution -> compression-positive stored components.
  double c[6] = {-x(0), -x(3), x(0) + x(3), -x(1), -x(2), -x(4)};
  const double f = frob(c);
  if (!(f > 0) || !std::isfinite(f)) return StressStatus::Degenerate;
  for (double &v : c) v /= f;
  out = make_tensor(c, count);
  return StressStatus::Ok;
}

// Finalise the aggregate.
StressStatus stress_finalise(const StressAccum &s, StressTensor &out) {
  stress_validate(s);
  double sums[20];
  std::memcpy(sums, s.ata, sizeof s.ata);
  std::memcpy(sums + 15, s.atu, sizeof s.atu);
  return stress_solve(sums, s.uu, s.count, out);
}

// Mean of the defined misfits.
std::optional<double> mean_misfit(const SlipDatum *data, size_t count, const StressTensor &t) {
  const Mat3 sig = -stress_matrix(t);  // tension positive
  double sum = 0.0;
  size_t used = 0;
  for (size_t i = 0; i < count; ++i) {
    poll_every(i);
    const Vec3 n(data[i].n[0], data[i].n[1], data[i].n[2]);
    const Vec3 u(data[i].u[0], data[i].u[1], data[i].u[2]);
    const Vec3 tr = sig * n;
    const Vec3 tau = tr - tr.dot(n) * n;
    if (!(tau.norm() >= kMinResolvedShear)) continue;
    sum += deg(std::atan2(u.cross(tau).norm(), u.dot(tau)));
    ++used;
  }
  if (used == 0) return std::nullopt;
  return sum / static_cast<double>(used);
}

// ---------------------------------------------------------------------------
// Joint focal-mechanism inversion
// ---------------------------------------------------------------------------

// Friction grid check.
void check_friction_range(const FrictionRange &f) {
  check_friction(f.mu_min);
  check_friction(f.mu_max);
  if (f.mu_min > f.mu_max)
    throw Error(ErrorKind::InvalidParameter, "minimum friction must not exceed maximum friction");
  if (f.mu_min == f.mu_max) return;
  if (!std::isfinite(f.step) || !(f.step > 0))
    throw Error(ErrorKind::InvalidParameter, "friction step must be positive");
  if ((f.mu_max - f.mu_min) / f.step + 1.0 > kMaxFrictionSteps)
    throw Error(ErrorKind::InvalidParameter, "friction search has more than 1001 steps",
                "", "Use a larger step or a narrower range.");
}

// Steps 1-3 of the joint inversion at one friction value.
StressStatus focal_fixed_friction(const SlipDatum *data, size_t count, const uint32_t *weight,
                                  double mu, uint8_t *picked, StressTensor &out, double &score,
                                  int32_t &iterations, const double *terms) {
  check_friction(mu);
  iterations = 0;
  score = 0.0;
  auto w = [weight](size_t i) -> double { return weight ? static_cast<double>(weight[i]) : 1.0; };
  double wsum = 0.0;
  for (size_t i = 0; i < count; ++i) {
    poll_every(i);
    check_slip_datum(data[i].n, data[i].u);
    wsum += w(i);
  }
  const int64_t n_mech = static_cast<int64_t>(wsum);

  // Step 1: both nodal planes of every mechanism.
  double sums[20] = {0};
  double buf[20];
  // Terms of datum i's given plane (aux = false) or auxiliary plane (aux = true).
  auto term = [&](size_t i, bool aux) -> const double * {
    if (terms) return terms + 40 * i + (aux ? 20 : 0);
    if (aux) stress_contribution(data[i].u, data[i].n, buf);
    else stress_contribution(data[i].n, data[i].u, buf);
    return buf;
  };
  for (size_t i = 0; i < count; ++i) {
    poll_every(i);
    const double wi = w(i);
    if (wi == 0) continue;
    const double *c = term(i, false);
    for (int k = 0; k < 20; ++k) sums[k] += wi * c[k];
    c = term(i, true);
    for (int k = 0; k < 20; ++k) sums[k] += wi * c[k];
  }
  StressStatus st = stress_solve(sums, 2.0 * wsum, n_mech, out);
  if (st != StressStatus::Ok) return st;

  // Linear inversion of a set of picks.
  auto solve_picks = [&](const uint8_t *p, StressTensor &t) {
    std::fill(sums, sums + 20, 0.0);
    for (size_t i = 0; i < count; ++i) {
      poll_every(i);
      const double wi = w(i);
      if (wi == 0) continue;
      const double *c = term(i, p[i] != 0);
      for (int k = 0; k < 20; ++k) sums[k] += wi * c[k];
    }
    return stress_solve(sums, wsum, n_mech, t);
  };
  // Picks under t into `to`; if `from` (the picks that produced t) is given, also
  // whether they differ and their weighted mean instability under t.
  auto evaluate = [&](const StressTensor &t, const uint8_t *from, uint8_t *to, bool &changed, double &sc) {
    const InstabilityFrame f = instability_frame(t, mu);
    double total = 0.0;
    changed = from == nullptr;
    for (size_t i = 0; i < count; ++i) {
      poll_every(i);
      const double wi = w(i);
      if (wi == 0) continue;
      const double in = instability_at(f, data[i].n), iu = instability_at(f, data[i].u);
      to[i] = iu > in ? 1 : 0;  // tie: the given plane
      if (from) {
        total += wi * (from[i] ? iu : in);
        if (to[i] != from[i]) changed = true;
      }
    }
    sc = from ? total / wsum : 0.0;
  };
  // 64-bit FNV-1a hash of a pick set (mechanisms of weight 0 left out), to see cycles.
  auto hash = [&](const uint8_t *p) {
    uint64_t h = 1469598103934665603ULL;
    for (size_t i = 0; i < count; ++i)
      if (w(i) != 0) h = (h ^ p[i]) * 1099511628211ULL;
    return h;
  };

  // Steps 2-3. `picked` holds the picks that produced `out`; `next` those under it.
  std::vector<uint8_t> next(count);
  std::vector<uint64_t> seen;  // hashes of the pick sets used so far, in order
  bool settled = false;
  for (int iter = 0;; ++iter) {
    poll_interrupts();
    bool changed;
    evaluate(out, iter == 0 ? nullptr : picked, next.data(), changed, score);
    if (!changed) { settled = true; break; }
    if (iter == kFocalMaxIterations) break;
    const uint64_t h = hash(next.data());
    const auto hit = std::find(seen.begin(), seen.end(), h);
    if (hit != seen.end()) {
      // A cycle P_j -> T_j+1 -> .. -> P_k-1 -> T_k (= out) -> P_j: replay it and keep
      // the member tensor whose producing picks are the most unstable under it.
      std::vector<uint8_t> best(picked, picked + count), p(next), q(count);
      StressTensor t;
      double sc;
      bool ch;
      for (auto it = hit; it + 1 != seen.end(); ++it) {
        st = solve_picks(p.data(), t);
        if (st != StressStatus::Ok) return st;
        evaluate(t, p.data(), q.data(), ch, sc);
        if (sc > score) { score = sc; out = t; best = p; }
        p.swap(q);
      }
      for (size_t i = 0; i < count; ++i)
        if (w(i) != 0) picked[i] = best[i];
      break;
    }
    seen.push_back(h);
    for (size_t i = 0; i < count; ++i)
      if (w(i) != 0) picked[i] = next[i];
    st = solve_picks(picked, out);
    if (st != StressStatus::Ok) return st;
    iterations = iter + 1;
  }
  out.flags |= kStressFocalJoint | (settled ? 0u : kStressNotConverged);
  return StressStatus::Ok;
}

// Joint inversion with the friction search.
StressStatus invert_focal(const SlipDatum *data, size_t count, const FrictionRange &fr,
                          uint8_t *picked, FocalInversion &out) {
  check_friction_range(fr);
  std::memset(&out, 0, sizeof out);
  const int steps = fr.mu_min == fr.mu_max
                        ? 1
                        : static_cast<int>(std::floor((fr.mu_max - fr.mu_min) / fr.step + 1e-9)) + 1;
  std::vector<uint8_t> trial(count);
  bool have = false;
  int best_j = -1;
  StressStatus last = StressStatus::Ok;
  for (int j = 0; j < steps; ++j) {
    poll_interrupts();
    // Rounded to 1e-12 so a search over 0.2, 0.3, ... reports 0.3, not 0.30000000000000004.
    const double mu = std::min(fr.mu_max, std::round((fr.mu_min + j * fr.step) * 1e12) / 1e12);
    StressTensor t;
    double score;
    int32_t iters;
    last = focal_fixed_friction(data, count, nullptr, mu, trial.data(), t, score, iters);
    // The start does not depend on mu: a degenerate start ends the search. A
    // degenerate picked set only rules out this mu.
    if (last == StressStatus::Empty || last == StressStatus::TooFewData) return last;
    if (last != StressStatus::Ok) continue;
    if (!have || score > out.score) {
      have = true;
      out.tensor = t;
      out.friction = mu;
      out.score = score;
      out.iterations = iters;
      best_j = j;
      std::copy(trial.begin(), trial.end(), picked);
    }
  }
  if (!have) return last;
  // Exact mean misfit of the picked planes.
  std::vector<SlipDatum> faults(count);
  for (size_t i = 0; i < count; ++i) {
    faults[i] = data[i];
    if (picked[i]) {
      std::copy(data[i].u, data[i].u + 3, faults[i].n);
      std::copy(data[i].n, data[i].n + 3, faults[i].u);
    }
  }
  if (auto m = mean_misfit(faults.data(), count, out.tensor)) {
    out.tensor.mean_misfit = *m;
    out.tensor.flags |= kStressHasMisfit;
  }
  out.tensor.friction = out.friction;
  out.tensor.flags |= kStressHasFriction;
  if (steps > 1 && (best_j == 0 || best_j == steps - 1)) out.tensor.flags |= kStressFrictionAtLimit;
  return StressStatus::Ok;
}

SlipDatum slip_datum(const FaultSlip &f) {
  Vec3 n, u;
  fault_vectors(f, n, u);
  return SlipDatum{{n[0], n[1], n[2]}, {u[0], u[1], u[2]}};
}

void sort_slip_data(SlipDatum *data, size_t count) {
  // Polled from the comparison: a million data take ~10^8 ns to sort. Throwing
  // out of std::sort leaves the data permuted, never invalid (plain structs).
  size_t compared = 0;
  std::sort(data, data + count, [&compared](const SlipDatum &x, const SlipDatum &y) {
    poll_every(compared++);
    const auto kx = std::tie(x.n[0], x.n[1], x.n[2], x.u[0], x.u[1], x.u[2]);
    const auto ky = std::tie(y.n[0], y.n[1], y.n[2], y.u[0], y.u[1], y.u[2]);
    return kx < ky;
  });
}

}  // namespace striae
