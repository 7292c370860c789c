// Rotations of orientation data (rules: rotation.hpp).
#include "rotation.hpp"

#include <cmath>
#include <cstdio>

namespace striae {

namespace {

Vec3 apply(const Mat3 &r, const Vec3 &v) { return r * v; }

void require_finite_angle(double w, const char *what) {
  if (!std::isfinite(w))
    throw Error(ErrorKind::OutOfRange, std::string(what) + " must be a finite number",
                "NaN and infinite values are not angles.");
}

}  // namespace

// R = cos w I + sin w [a]x + (1 - cos w) a a^T (Rodrigues).
Mat3 rotation_matrix(const Vec3 &axis, double angle_deg) {
  require_finite_angle(angle_deg, "rotation angle");
  const double len = axis.norm();
  if (!(len > 0) || !std::isfinite(len))
    throw Error(ErrorKind::DataError, "rotation axis is a zero or non-finite vector");
  const Vec3 a = axis / len;
  double s, c;
  sincosd(angle_deg, s, c);
  Mat3 k;
  k << 0, -a.z(), a.y(),
       a.z(), 0, -a.x(),
       -a.y(), a.x(), 0;
  return c * Mat3::Identity() + s * k + (1.0 - c) * (a * a.transpose());
}

Vec3 direction_vector(double trend, double plunge) {
  require_finite_angle(trend, "axis trend");
  require_finite_angle(plunge, "axis plunge");
  if (plunge < -90.0 || plunge > 90.0)
    throw Error(ErrorKind::OutOfRange, "axis plunge is out of range",
                "Accepted: plunge from -90 to 90 degrees (negative points upward).");
  double st, ct, sp, cp;
  sincosd(trend, st, ct);
  sincosd(plunge, sp, cp);
  return Vec3(cp * ct, cp * st, sp);
}

Plane rotate(const Plane &p, const Mat3 &r) { return normal_plane(apply(r, plane_normal(p))); }

Line rotate(const Line &l, const Mat3 &r) { return vector_line(apply(r, line_vector(l))); }

FaultSlip rotate(const FaultSlip &f, const Mat3 &r) {
  Vec3 n, u;
  fault_vectors(f, n, u);
  return fault_from_vectors(apply(r, n), apply(r, u));
}

// Exact shifts of the azimuth; canonical forms redo the special cases.
Plane rotate_vertical(const Plane &p, double w) {
  require_finite_angle(w, "rotation angle");
  return make_plane(norm360(p.strike + norm360(w)), p.dip);
}

Line rotate_vertical(const Line &l, double w) {
  require_finite_angle(w, "rotation angle");
  return make_line(norm360(l.trend + norm360(w)), l.plunge);
}

FaultSlip rotate_vertical(const FaultSlip &f, double w) {
  require_finite_angle(w, "rotation angle");
  return make_fault_slip(norm360(f.strike + norm360(w)), f.dip, f.rake);
}

Mat3 untilt_matrix(const Plane &bed, bool overturned) {
  const double angle = overturned ? 180.0 - bed.dip : -bed.dip;
  return rotation_matrix(strike_vector(bed.strike), angle);
}

Mat3 unfold_matrix(const Plane &limb, const Line &axis, double tol) {
  if (!std::isfinite(tol) || tol < 0 || tol >= 90)
    throw Error(ErrorKind::InvalidParameter, "fold-axis tolerance must be at least 0 and below 90 degrees");
  const Vec3 a = line_vector(axis);
  const double off = 90.0 - axial_angle(plane_normal(limb), a);  // axis to plane
  if (off > tol + 1e-9) {
    char buf[200];
    std::snprintf(buf, sizeof buf,
                  "fold axis lies %.3g degrees off the limb, more than the tolerance of %.3g degrees", off, tol);
    throw Error(ErrorKind::DataError, buf, "A limb of a cylindrical fold contains the fold axis.",
                "Check that the limb and the fold axis belong together, or raise the tolerance.");
  }
  // Step 1: about the horizontal line at trend + 90 by +plunge (turns the axis up
  // to the horizontal: that line x the axis trend is the upward vertical).
  const Mat3 r1 = rotation_matrix(strike_vector(axis.trend + 90.0), axis.plunge);
  // Step 2: untilt by the limb as step 1 left it.
  const Plane limb1 = rotate(limb, r1);
  return untilt_matrix(limb1, false) * r1;
}

}  // namespace striae
