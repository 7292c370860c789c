// Lower-hemisphere projections of directions onto the unit disc (METHODS.md
// section 7). The disc has radius 1 at the horizontal; x points east, y north
// (mathematical orientation: a figure flips y when it writes pixels).
//
//   equal-area  (Lambert azimuthal, polar aspect): (x, y) = (v_E, v_N) / sqrt(1 + v_D)
//   equal-angle (stereographic, polar aspect):     (x, y) = (v_E, v_N) / (1 + v_D)
//
// with v = (v_N, v_E, v_D) a unit vector, v_D >= 0. These are Snyder's (1987,
// USGS Professional Paper 1395) polar azimuthal equal-area and stereographic
// projections of the sphere centred on the nadir, scaled so that the horizon
// has radius 1: PROJ's laea and stere with lat_0 = -90 on a sphere of radius
// 1/sqrt(2) and 1/2 respectively give the same numbers (tests/external).
#pragma once

#include "core.hpp"

#include <string>

namespace striae {

enum class Projection { EqualArea, EqualAngle };

// "equal-area" or "equal-angle" (case-insensitive); InvalidParameter otherwise.
Projection parse_projection(const std::string &name);
const char *projection_name(Projection p);

struct XY {
  double x, y;
};

// Projection of a lower-hemisphere unit vector. A down component within
// rounding of zero below the horizon (v_D > -1e-9) is read as on the horizon,
// never flipped: curves that end on the primitive circle stay on their side.
XY project(const Vec3 &v, Projection p);

// Projection of an axis: v or -v, whichever points down (upper-hemisphere
// vectors are flipped through the centre, as axial data are).
XY project_axis(const Vec3 &v, Projection p);

// Derivative of project() at v along the tangent vector dv (the image of a
// velocity on the sphere), for curve fitting.
XY project_derivative(const Vec3 &v, const Vec3 &dv, Projection p);

// Inverse projection: the unit vector whose image is (x, y). Defined on the
// unit disc (lower hemisphere) and beyond it, where it continues onto the
// upper hemisphere (equal-area up to radius sqrt(2), the zenith; larger radii
// are clamped to it; equal-angle for every radius).
Vec3 unproject(double x, double y, Projection p);

}  // namespace striae
