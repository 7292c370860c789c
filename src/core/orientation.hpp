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

// Re-check a value that arrived in binary form: it must already be canonical.
bool is_canonical(const Plane &p);
bool is_canonical(const Line &l);
bool is_canonical(const FaultSlip &f);

// Angles derived from vectors are rounded to 1e-10 degree (about 2e-12 rad, far
// below any measurement), so that exact cases such as the auxiliary plane of a
// pure thrust print exactly ('180/45/90', not '179.99999999999997/...').
double snap_angle(double degrees);
// Sine and cosine of degrees, exact at multiples of 90.
void sincosd(double degrees, double &s, double &c);
double sind(double degrees);
double cosd(double degrees);
// Reduce an azimuth to [0,360).
double norm360(double degrees);
// Reduce a rake to (-180,180].
double norm180(double degrees);

// Unit vectors, NED.
Vec3 line_vector(const Line &l);
// Lower-hemisphere line of a non-zero vector (any sign, any length).
Line vector_line(const Vec3 &v);
// Upward (hanging-wall) unit normal n of a plane (Aki & Richards 1980).
Vec3 plane_normal(const Plane &p);
Vec3 strike_vector(double strike_deg);
Vec3 dip_vector(double strike_deg, double dip_deg);
// Plane whose normal is v (either sign).
Plane normal_plane(const Vec3 &v);

Line pole(const Plane &p);             // exact in degrees: (strike-90, 90-dip)
Vec3 pole_vector(const Plane &p);      // lower-hemisphere unit pole, -plane_normal(p)
Plane plane_from_pole(const Line &l);  // exact inverse of pole()
double dip_direction(const Plane &p);

// Fault normal n (upward) and hanging-wall slip u, both unit.
void fault_vectors(const FaultSlip &f, Vec3 &n, Vec3 &u);
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
