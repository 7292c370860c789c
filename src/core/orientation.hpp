// Orientation primitives: planes, lines and fault-slip data, their canonical
// forms and their direction vectors in North-East-Down coordinates.
//
// Conventions (DESIGN.md, METHODS.md section 1):
//  - angles are degrees in these structs, radians only inside computations;
//  - plane: right-hand-rule strike in [0,360), dip in [0,90];
//  - line: trend in [0,360), plunge in [0,90] (lower hemisphere, axial);
//  - fault slip: strike/dip as a plane, rake (Aki & Richards 1980) in (-180,180].
// Canonical forms make exact equality mean "same orientation":
//  - horizontal plane: strike 0; vertical plane: strike in [0,180);
//  - horizontal line: trend in [0,180); vertical line: trend 0;
//  - horizontal fault: strike 0 (rake re-measured from north);
//    vertical fault: strike in [0,180) ((f,90,r) is the same slip as (f+180,90,-r)).
#pragma once

#include <cfloat>
#include <cmath>
#include <cstdint>
#include <cstring>

#include "core.hpp"

namespace striae {

struct Plane {
  double strike;
  double dip;
};

struct Line {
  double trend;
  double plunge;
};

struct FaultSlip {
  double strike;
  double dip;
  double rake;
};

// Validating constructors: reject non-finite and out-of-range values
// (ErrorKind::OutOfRange) and return the canonical form.
//   strike, trend, dip direction: [0,360]; dip: [0,90]; plunge: [-90,90]
//   (a negative plunge is the same axis seen upward, flipped to the lower
//   hemisphere); rake: [-180,180].
Plane make_plane(double strike, double dip);
Plane make_plane_from_dip_direction(double dip_direction, double dip);
Line make_line(double trend, double plunge);
FaultSlip make_fault_slip(double strike, double dip, double rake);
// The numeric constructors of the SQL surface (plane(), lineation(),
// fault_slip(), plane_from_dip_direction()): any finite azimuth (strike, trend,
// dip direction) is wrapped into [0,360) and any finite rake into (-180,180],
// so computed values such as strike + 10 need no modulo; dip and plunge keep
// their ranges, and non-finite values are still OutOfRange. Text and binary
// input keep the strict ranges of make_* above (an out-of-range number typed
// in a literal is more likely a typo than a computation).
Plane make_plane_wrapping(double strike, double dip);
Plane make_plane_from_dip_direction_wrapping(double dip_direction, double dip);
Line make_line_wrapping(double trend, double plunge);
FaultSlip make_fault_slip_wrapping(double strike, double dip, double rake);

// Re-check a value that arrived in binary form: it must already be canonical.
bool is_canonical(const Plane &p);
bool is_canonical(const Line &l);
bool is_canonical(const FaultSlip &f);

// Angles derived from vectors are rounded to 1e-10 degree (about 2e-12 rad, far
// below any measurement), so that exact cases such as the auxiliary plane of a
// pure thrust print exactly ('180/45/90', not '179.99999999999997/...').
double snap_angle(double degrees);
namespace detail {
// sin and cos of the whole degrees 0..360, correctly rounded (orientation.cpp).
extern const double (*const kDegreeTrig)[2];

typedef double V2 __attribute__((vector_size(16)));
typedef int64_t V2l __attribute__((vector_size(16)));
typedef int V2i __attribute__((vector_size(8)));

// (a + kRound) - kRound rounds a in [0, 2^51] to the nearest integer (ties to
// even) in two additions; needs plain double arithmetic (no x87 excess precision).
static_assert(FLT_EVAL_METHOD == 0, "double arithmetic must round to double");
constexpr double kRound = 6755399441055744.0;  // 1.5 * 2^52
// Taylor coefficients in degrees: sin(r deg) = K r + S3 r^3 + S5 r^5 + ...,
// 1 - cos(r deg) = H2 r^2 + H4 r^4 + H6 r^6 - ..., K = pi/180. For |r| <= 0.5
// the first omitted terms are below 8e-19 (sin) and 1e-21 (cos).
constexpr double kK = kDeg;
constexpr double kS3 = -kK * kK * kK / 6, kS5 = kK * kK * kK * kK * kK / 120;
constexpr double kH2 = kK * kK / 2, kH4 = -kK * kK * kK * kK / 24, kH6 = kK * kK * kK * kK * kK * kK / 720;

// v with its sign flipped where x is negative (an exact sign-bit operation).
STRIAE_HOT double flip_sign(double v, double x) {
  uint64_t a, b;
  std::memcpy(&a, &v, 8);
  std::memcpy(&b, &x, 8);
  a ^= b & 0x8000000000000000ull;
  std::memcpy(&v, &a, 8);
  return v;
}
}  // namespace detail

// Sine and cosine of x degrees at once: correctly rounded at whole degrees
// (so exact at multiples of 90: axis-aligned data give exact 0 and 1), within
// about 1 ulp elsewhere (unit test against long double). The angle is taken as
// |x| (sin is odd, cos even: the sign goes back on at the end, exactly),
// reduced to [0, 360] in degrees, and split as i + r with i the nearest whole
// degree; that subtraction is exact (Sterbenz lemma), so nothing rounds before
// the polynomials. The table value of i is rotated by r (|r| <= 0.5 degree)
// with short Taylor polynomials in degrees. Inline, branch-free in the common
// case and short in latency, because every aggregate row converts two or
// three angles to vectors (measured: a pair of dependent calls 28 ns, the
// two-lane sincosd2 below 12 ns, against 43 ns for the octant-reduced
// polynomial of degree 17 this replaced).
STRIAE_HOT void sincosd(double x, double &s, double &c) {
  double ax = std::fabs(x);
  if (!(ax <= 360.0)) ax = std::fmod(ax, 360.0);  // NaN (and fmod of inf) stays NaN
  const double fi = (ax + detail::kRound) - detail::kRound;
  const int i = static_cast<int>(ax <= 360.0 ? fi : 0.0);  // NaN reads entry 0, stays NaN
  const double r = detail::flip_sign(ax - fi, x), z = r * r;
  const double sr = r * detail::kK + (r * z) * (detail::kS3 + z * detail::kS5);
  const double hm = z * detail::kH2 + (z * z) * (detail::kH4 + z * detail::kH6);  // 1 - cos r
  const double ti = detail::flip_sign(detail::kDegreeTrig[i][0], x), ci = detail::kDegreeTrig[i][1];
  // sin(i + r) = sin i + (cos i sin r - sin i (1 - cos r)); likewise cos: the
  // table value plus a small correction, so the result rounds close to it.
  s = ti + (ci * sr - ti * hm);
  c = ci - (ti * sr + ci * hm);
}

// sincosd of two angles at once, the two in SIMD lanes (GCC/Clang vector
// extensions: SSE2 on x86-64, NEON on arm64): the same operations in the same
// order as sincosd, so bit-identical to it lane by lane (unit test). Angles
// beyond +-360 (and NaN) take the scalar path.
STRIAE_HOT void sincosd2(double x0, double x1, double s[2], double c[2]) {
  using detail::V2;
  using detail::V2l;
  if (!(std::fabs(x0) <= 360.0 && std::fabs(x1) <= 360.0)) {
    sincosd(x0, s[0], c[0]);
    sincosd(x1, s[1], c[1]);
    return;
  }
  const V2 x = {x0, x1};
  // Vector casts reinterpret the bits (GCC/Clang vector extension).
  const V2l sign = (V2l)x & V2l{INT64_MIN, INT64_MIN};
  auto flip = [&sign](V2 v) { return (V2)((V2l)v ^ sign); };
  const V2 ax = flip(x);
  const V2 fi = (ax + detail::kRound) - detail::kRound;
  const detail::V2i i = __builtin_convertvector(fi, detail::V2i);
  const V2 r = flip(ax - fi), z = r * r;
  const V2 sr = r * detail::kK + (r * z) * (detail::kS3 + z * detail::kS5);
  const V2 hm = z * detail::kH2 + (z * z) * (detail::kH4 + z * detail::kH6);
  const double *t0 = detail::kDegreeTrig[i[0]], *t1 = detail::kDegreeTrig[i[1]];
  const V2 ti = flip(V2{t0[0], t1[0]}), ci = {t0[1], t1[1]};
  const V2 sv = ti + (ci * sr - ti * hm), cv = ci - (ti * sr + ci * hm);
  s[0] = sv[0];
  s[1] = sv[1];
  c[0] = cv[0];
  c[1] = cv[1];
}
double sind(double degrees);
double cosd(double degrees);
// Reduce an azimuth to [0,360).
double norm360(double degrees);
// Reduce a rake to (-180,180].
double norm180(double degrees);

// Unit vectors, NED.
// Inline, with fault_vectors below: the aggregates call them for every row.
STRIAE_HOT Vec3 line_vector(const Line &l) {
  double s[2], c[2];  // trend, plunge
  sincosd2(l.trend, l.plunge, s, c);
  return Vec3(c[1] * c[0], c[1] * s[0], s[1]);
}
// Lower-hemisphere line of a non-zero vector (any sign, any length).
Line vector_line(const Vec3 &v);
// Upward (hanging-wall) unit normal n of a plane (Aki & Richards 1980).
STRIAE_HOT Vec3 plane_normal(const Plane &p) {
  double s[2], c[2];  // strike, dip
  sincosd2(p.strike, p.dip, s, c);
  return Vec3(-s[1] * s[0], s[1] * c[0], -c[1]);
}
Vec3 strike_vector(double strike_deg);
Vec3 dip_vector(double strike_deg, double dip_deg);
// Plane whose normal is v (either sign).
Plane normal_plane(const Vec3 &v);

Line pole(const Plane &p);             // exact in degrees: (strike-90, 90-dip)
STRIAE_HOT Vec3 pole_vector(const Plane &p) { return -plane_normal(p); }  // lower-hemisphere unit pole
Plane plane_from_pole(const Line &l);  // exact inverse of pole()
double dip_direction(const Plane &p);

// Fault normal n (upward) and hanging-wall slip u, both unit (and orthogonal
// to rounding: products of sines and cosines of finite angles). One sincos
// per angle; inline because the stress aggregates run it for every row.
STRIAE_HOT void fault_vectors(const FaultSlip &f, Vec3 &n, Vec3 &u) {
  double s[2], c[2], sr, cr;
  sincosd2(f.strike, f.dip, s, c);
  sincosd(f.rake, sr, cr);
  const double sf = s[0], cf = c[0], sd = s[1], cd = c[1];
  n = Vec3(-sd * sf, sd * cf, -cd);
  // u = cos r s - sin r dd, s = (cf, sf, 0), dd = (-cd sf, cd cf, sd)
  u = Vec3(cr * cf + sr * cd * sf, cr * sf - sr * cd * cf, -sr * sd);
}
// Inverse of fault_vectors: n, u need not be unit or exactly orthogonal (u is
// projected onto the plane); the pair is flipped so that n points up.
FaultSlip fault_from_vectors(const Vec3 &n, const Vec3 &u);
inline Plane fault_plane(const FaultSlip &f) { return make_plane(f.strike, f.dip); }

// Axial angle between two lines or two planes (their poles), degrees 0..90.
double axial_angle(const Vec3 &a, const Vec3 &b);
double angle(const Line &a, const Line &b);
double angle(const Plane &a, const Plane &b);

// Line of intersection of two planes, plane through two lines. Both reject
// inputs closer than kParallelLimitDeg with ErrorKind::DataError.
constexpr double kParallelLimitDeg = 1e-6;
Line intersection(const Plane &a, const Plane &b);
Plane plane_through(const Line &a, const Line &b);

// Slip sense from a (canonical) rake: "normal", "reverse", "dextral",
// "sinistral", or two of them, dominant first ("normal-dextral"), when the
// rake is more than 22.5 degrees from a pure sense (common practice, no source).
// Limits, by |rake| (sign: reverse above 0, normal below): 0..22.5 sinistral,
// 67.5..112.5 reverse/normal, 157.5..180 dextral, all limits included in the
// pure sense; in between, the dip-slip word comes first for 45 <= |rake| <= 135
// (dip slip at least as large as strike slip), the strike-slip word otherwise.
// One vocabulary with mechanism_class and stress_regime: "normal" and
// "strike-slip" motion is named alike everywhere; the one word that differs is
// "reverse" here against "thrust" there, on purpose: a slip sense describes the
// motion on one fault of any dip, and a thrust is, in the trade's usage, a
// reverse fault of low dip, while the published mechanism and regime schemes
// (Frohlich 1992, Zoback 1992) name their class "thrust".
const char *slip_sense(const FaultSlip &f);

// Sense constraints given with a striation in the field.
struct Sense {
  int dip = 0;     // +1 normal, -1 reverse, 0 not given
  int strike = 0;  // +1 sinistral, -1 dextral, 0 not given
};
// Parse 'normal', 'reverse', 'thrust', 'dextral', 'sinistral', their one-letter
// forms n, r, t, d, s, the words right-lateral / left-lateral, or two of them
// joined by '-', ',', '+', '/' or spaces ("normal-dextral", "n d"). Throws
// InvalidParameter naming what was wrong.
Sense parse_sense(const std::string &text);

// Fault slip from a plane, a striation line on it and a sense. The line may be
// off the plane by at most tolerance_deg (it is then projected onto the plane);
// the sense picks one of the two opposite slip directions along it and must be
// expressible by the line (no normal/reverse on a horizontal line, no
// dextral/sinistral on a down-dip line) and not contradict itself.
FaultSlip fault_from_striation(const Plane &p, const Vec3 &line, const Sense &sense,
                               double tolerance_deg);

}  // namespace striae
