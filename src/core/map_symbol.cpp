// Map symbols on the WGS 84 ellipsoid; see map_symbol.hpp.
#include "map_symbol.hpp"

#include "drawing.hpp"

#include <algorithm>
#include <charconv>
#include <cmath>

namespace striae {

namespace {

// Smallest drawing tolerance: 1e-6 of the radius is a metre on the largest
// symbol, and keeps the rim at a few thousand vertices at most.
constexpr double kMinTolerance = 1e-6;

// Two regions of the same kind meet only in points: the B axis, where all
// four quadrants meet, and, when B is horizontal, its two ends on the
// primitive. Each ring computes such a point from its own curve, so the copies
// differ by rounding, and polygons that overlap by 1e-16 are not a valid
// MultiPolygon. Copies within 1e-9 of the disc radius become one point.
void snap_shared_points(std::vector<std::vector<XY>> &rings) {
  constexpr double eps = 1e-9;
  for (size_t i = 0; i < rings.size(); ++i)
    for (size_t j = i + 1; j < rings.size(); ++j)
      for (XY &q : rings[j])
        for (const XY &p : rings[i])
          if (std::fabs(p.x - q.x) < eps && std::fabs(p.y - q.y) < eps) q = p;
}

void close_ring(LonLatRing &r) {
  if (!r.empty()) r.push_back(r.front());
}

void number(std::string &s, double v) {
  if (v == 0) v = 0;  // no "-0"
  char buf[32];
  const auto r = std::to_chars(buf, buf + sizeof buf, v);
  s.append(buf, r.ptr);
}

void coordinates(std::string &s, const std::vector<LonLat> &points) {
  s += '(';
  for (size_t i = 0; i < points.size(); ++i) {
    if (i) s += ',';
    number(s, points[i].lon);
    s += ' ';
    number(s, points[i].lat);
  }
  s += ')';
}

}  // namespace

void check_symbol_size(double metres, const char *what) {
  if (!std::isfinite(metres))
    throw Error(ErrorKind::OutOfRange, std::string(what) + " must be a finite number");
  if (!(metres > 0) || metres > kMaxSymbolMetres)
    throw Error(ErrorKind::OutOfRange, std::string(what) + " must be over 0 and at most 1000000 metres",
                "A map symbol is at most 1000 km across.");
}

void check_symbol_tolerance(double tol) {
  if (!std::isfinite(tol) || tol < kMinTolerance || tol > 0.5)
    throw Error(ErrorKind::InvalidParameter, "drawing tolerance must be in 1e-6..0.5 of the symbol radius");
}

std::vector<LonLat> shmax_bar(const LonLat &c, double azimuth, double length_m) {
  check_location(c);
  if (!std::isfinite(azimuth))
    throw Error(ErrorKind::OutOfRange, "azimuth must be a finite number",
                "NaN and infinite values are not angles.");
  check_symbol_size(length_m, "bar length");
  double a = std::fmod(azimuth, 180.0);
  if (a < 0) a += 180;
  if (a >= 180) a -= 180;
  const double half = length_m / 2;
  return {geodesic_direct(c, a + 180, half).point, c, geodesic_direct(c, a, half).point};
}

LonLat place_disc_point(const LonLat &c, double radius_m, const XY &p) {
  const double r = std::hypot(p.x, p.y);
  if (r == 0) return c;
  return geodesic_direct(c, deg(std::atan2(p.x, p.y)), radius_m * r).point;
}

std::vector<LonLatRing> focal_symbol(const FaultSlip &f, const LonLat &c, double radius_m, bool compressional,
                                     Projection proj, double tol) {
  check_location(c);
  check_symbol_size(radius_m, "symbol radius");
  check_symbol_tolerance(tol);
  FocalDrawing d = focal_drawing(f, proj, tol);
  std::vector<std::vector<XY>> &parts = compressional ? d.compressional : d.dilatational;
  snap_shared_points(parts);
  std::vector<LonLatRing> out;
  for (const std::vector<XY> &poly : parts) {
    poll_interrupts();
    LonLatRing ring;
    ring.reserve(poly.size() + 1);
    for (const XY &p : poly) ring.push_back(place_disc_point(c, radius_m, p));
    close_ring(ring);
    out.push_back(std::move(ring));
  }
  return out;
}

LonLatRing symbol_disc(const LonLat &c, double radius_m, double tol) {
  check_location(c);
  check_symbol_size(radius_m, "symbol radius");
  check_symbol_tolerance(tol);
  // A tangent polygon, as drawing.cpp draws the quadrants' pieces of the rim:
  // n sides touching the circle, corners at radius 1 / cos(pi / n) <= 1 + tol.
  const int n = std::max(8, static_cast<int>(std::ceil(kPi / std::acos(1 / (1 + tol)))));
  const double r = 1 / std::cos(kPi / n);
  LonLatRing ring;
  ring.reserve(n + 1);
  for (int k = 0; k < n; ++k) {
    const double t = 2 * kPi * (k + 0.5) / n;  // counter-clockwise from east
    ring.push_back(place_disc_point(c, radius_m, XY{r * std::cos(t), r * std::sin(t)}));
  }
  close_ring(ring);
  return ring;
}

std::string wkt_linestring(const std::vector<LonLat> &points) {
  std::string s = "LINESTRING";
  coordinates(s, points);
  return s;
}

std::string wkt_polygon(const LonLatRing &ring) {
  std::string s = "POLYGON(";
  coordinates(s, ring);
  s += ')';
  return s;
}

std::string wkt_multipolygon(const std::vector<LonLatRing> &rings) {
  if (rings.empty()) return "MULTIPOLYGON EMPTY";
  std::string s = "MULTIPOLYGON(";
  for (size_t i = 0; i < rings.size(); ++i) {
    if (i) s += ',';
    s += '(';
    coordinates(s, rings[i]);
    s += ')';
  }
  s += ')';
  return s;
}

}  // namespace striae
