// Lower-hemisphere projections (see projection.hpp).
#include "projection.hpp"

#include <cctype>
#include <cmath>

namespace striae {

Projection parse_projection(const std::string &name) {
  std::string s;
  for (char c : name) s += static_cast<char>(std::tolower(static_cast<unsigned char>(c)));
  if (s == "equal-area") return Projection::EqualArea;
  if (s == "equal-angle") return Projection::EqualAngle;
  throw Error(ErrorKind::InvalidParameter, "unknown projection \"" + echo_text(name, 60) + "\"",
              "Accepted: equal-area (Lambert azimuthal, the default) or equal-angle (stereographic).");
}

const char *projection_name(Projection p) {
  return p == Projection::EqualArea ? "equal-area" : "equal-angle";
}

XY project(const Vec3 &v, Projection p) {
  const double d = v.z() > 0 ? v.z() : 0.0;  // rounding below the horizon reads as on it
  const double k = p == Projection::EqualArea ? 1.0 / std::sqrt(1.0 + d) : 1.0 / (1.0 + d);
  return XY{v.y() * k, v.x() * k};
}

XY project_axis(const Vec3 &v, Projection p) { return project(v.z() < 0 ? Vec3(-v) : v, p); }

XY project_derivative(const Vec3 &v, const Vec3 &dv, Projection p) {
  const double d = v.z() > 0 ? v.z() : 0.0;
  if (p == Projection::EqualArea) {
    // x = vE s^-1/2, s = 1 + vD: dx = dvE s^-1/2 - vE dvD s^-3/2 / 2
    const double s = 1.0 + d, r = 1.0 / std::sqrt(s), r3 = r / s;
    return XY{dv.y() * r - 0.5 * v.y() * dv.z() * r3, dv.x() * r - 0.5 * v.x() * dv.z() * r3};
  }
  const double s = 1.0 + d, r = 1.0 / s, r2 = r * r;
  return XY{dv.y() * r - v.y() * dv.z() * r2, dv.x() * r - v.x() * dv.z() * r2};
}

Vec3 unproject(double x, double y, Projection p) {
  const double r2 = x * x + y * y;
  if (r2 == 0) return Vec3(0, 0, 1);
  const double r = std::sqrt(r2);
  double down, horiz;
  if (p == Projection::EqualArea) {
    // r^2 = 1 - v_D, so v_D = 1 - r^2 (r <= sqrt 2)
    down = 1.0 - r2;
    if (down < -1.0) down = -1.0;
    horiz = std::sqrt(std::max(0.0, 1.0 - down * down));
  } else {
    // r = tan(chi / 2), chi the angle from the nadir
    down = (1.0 - r2) / (1.0 + r2);
    horiz = 2.0 * r / (1.0 + r2);
  }
  return Vec3(y / r * horiz, x / r * horiz, down);
}

}  // namespace striae
