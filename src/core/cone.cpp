// Cones of axes and the GiST key operations on them (cone.hpp).
#include "cone.hpp"

#include "parse.hpp"

#include <algorithm>
#include <charconv>
#include <cstdio>
#include <string>
#include <vector>

namespace striae {

namespace {

// Rounding margin, degrees, added to every enclosing radius and to the reach of
// an overlap test: far above the error of an axial angle computed in double
// (about 1e-13 degree) and far below any measurement.
constexpr double kMargin = 1e-9;

inline Vec3 axis_of(const Cone &c) { return Vec3(c.x, c.y, c.z); }

void require_radius(double r) {
  if (!std::isfinite(r) || r < 0 || r > 90) {
    char buf[64];
    std::snprintf(buf, sizeof buf, "%.17g", r);
    throw Error(ErrorKind::OutOfRange, std::string("cone half-angle ") + buf + " is out of range",
                "Accepted: 0 to 90 degrees (axes are at most 90 degrees apart).");
  }
}

Cone with_axis(ConeKind kind, double a, double b, double radius, const Vec3 &v) {
  Cone c{};
  c.a = a;
  c.b = b;
  c.radius = radius == 0.0 ? 0.0 : radius;  // no -0
  c.x = v.x();
  c.y = v.y();
  c.z = v.z();
  c.kind = static_cast<int32_t>(kind);
  c.reserved = 0;
  return c;
}

}  // namespace

Cone make_cone(const Line &axis, double radius) {
  require_radius(radius);
  return with_axis(ConeKind::Line, axis.trend, axis.plunge, radius, line_vector(axis));
}

Cone make_cone(const Plane &plane, double radius) {
  require_radius(radius);
  return with_axis(ConeKind::Plane, plane.strike, plane.dip, radius, pole_vector(plane));
}

Cone parse_cone(const char *text) {
  const std::string t(text);
  auto fail = [&](const std::string &detail) -> Cone {
    const std::string shown = echo_text(t);
    throw Error(ErrorKind::InvalidText, "invalid input syntax for type cone: \"" + shown + "\"", detail,
                "Accepted: 'line 120/30 within 10' (lineations within 10 degrees of 120/30) or "
                "'plane 110/64 within 10'; cone(axis, half_angle) builds the same.");
  };
  std::string low;
  for (char ch : t) low.push_back(ch >= 'A' && ch <= 'Z' ? static_cast<char>(ch - 'A' + 'a') : ch);
  size_t p = low.find_first_not_of(" \t\n\r");
  if (p == std::string::npos) return fail("the value is empty");
  const size_t kw = low.find_first_of(" \t\n\r", p);
  if (kw == std::string::npos) return fail("expected a kind, an axis, 'within' and a half-angle");
  const std::string kind = low.substr(p, kw - p);
  const size_t w = low.rfind(" within ");
  if (w == std::string::npos || w < kw) return fail("expected 'within' and a half-angle after the axis");
  const std::string axis = t.substr(kw, w - kw);
  size_t r0 = low.find_first_not_of(" \t\n\r", w + 8);
  size_t r1 = low.find_last_not_of(" \t\n\r");
  if (r0 == std::string::npos || r1 < r0) return fail("expected a half-angle after 'within'");
  double radius;
  const char *b = low.data() + r0, *e = low.data() + r1 + 1;
  const auto res = std::from_chars(b, e, radius);
  if (res.ec != std::errc() || res.ptr != e) return fail("the half-angle is not a number");
  if (kind == "line" || kind == "lineation") return make_cone(parse_line(axis.c_str()), radius);
  if (kind == "plane") return make_cone(parse_plane(axis.c_str()), radius);
  if (kind == "region") {
    Cone c = make_cone(parse_line(axis.c_str()), radius);
    c.kind = static_cast<int32_t>(ConeKind::Region);
    return c;
  }
  return fail("the kind is 'line' or 'plane'");
}

void check_cone(const Cone &c) {
  auto bad = [](const char *what) {
    throw Error(ErrorKind::DataError, std::string("invalid cone value: ") + what);
  };
  if (c.reserved != 0) bad("reserved field is not zero");
  if (!(std::isfinite(c.a) && std::isfinite(c.b) && std::isfinite(c.x) && std::isfinite(c.y) &&
        std::isfinite(c.z)))
    bad("non-finite field");
  if (!(c.radius >= 0 && c.radius <= 90)) bad("half-angle outside 0..90");
  const Vec3 v = axis_of(c);
  if (std::fabs(v.norm() - 1.0) > 1e-12) bad("axis is not a unit vector");
  switch (static_cast<ConeKind>(c.kind)) {
    case ConeKind::Line:
      if (!is_canonical(Line{c.a, c.b})) bad("axis is not a canonical lineation");
      if (axis_of(make_cone(Line{c.a, c.b}, c.radius)) != v) bad("axis vector does not match the lineation");
      return;
    case ConeKind::Plane:
      if (!is_canonical(Plane{c.a, c.b})) bad("axis is not a canonical plane");
      if (axis_of(make_cone(Plane{c.a, c.b}, c.radius)) != v) bad("axis vector does not match the plane");
      return;
    case ConeKind::Region: return;
  }
  bad("unknown kind");
}

bool cone_contains(const Cone &c, const Line &l) {
  if (static_cast<ConeKind>(c.kind) != ConeKind::Line)
    throw Error(ErrorKind::InvalidParameter, "a lineation can only be tested against a cone around a lineation",
                "Build the cone with cone(lineation, half_angle); cone(plane, half_angle) selects planes.");
  return angle(l, Line{c.a, c.b}) <= c.radius;
}

bool cone_contains(const Cone &c, const Plane &p) {
  if (static_cast<ConeKind>(c.kind) != ConeKind::Plane)
    throw Error(ErrorKind::InvalidParameter, "a plane can only be tested against a cone around a plane",
                "Build the cone with cone(plane, half_angle); cone(lineation, half_angle) selects lineations.");
  return angle(p, Plane{c.a, c.b}) <= c.radius;
}

Cone leaf_key(const Line &l) { return with_axis(ConeKind::Line, l.trend, l.plunge, 0.0, line_vector(l)); }
Cone leaf_key(const Plane &p) { return with_axis(ConeKind::Plane, p.strike, p.dip, 0.0, pole_vector(p)); }

double key_distance(const Cone &key, const Line &q) {
  if (static_cast<ConeKind>(key.kind) == ConeKind::Line) return angle(Line{key.a, key.b}, q);
  return std::max(0.0, axial_angle(line_vector(q), axis_of(key)) - key.radius);
}

double key_distance(const Cone &key, const Plane &q) {
  if (static_cast<ConeKind>(key.kind) == ConeKind::Plane) return angle(Plane{key.a, key.b}, q);
  return std::max(0.0, axial_angle(pole_vector(q), axis_of(key)) - key.radius);
}

bool key_may_overlap(const Cone &key, const Cone &query) {
  switch (static_cast<ConeKind>(key.kind)) {
    case ConeKind::Line: return cone_contains(query, Line{key.a, key.b});
    case ConeKind::Plane: return cone_contains(query, Plane{key.a, key.b});
    case ConeKind::Region: break;
  }
  return axial_angle(axis_of(query), axis_of(key)) - key.radius <= query.radius + kMargin;
}

namespace {

// Sign-aligned sum of unit axes, normalised; fallback if it vanishes.
Vec3 aligned_centre(const Cone *const *keys, const int *idx, int n, const Vec3 &fallback) {
  Vec3 c = Vec3::Zero();
  for (int k = 0; k < n; ++k) {
    const Vec3 v = axis_of(*keys[idx ? idx[k] : k]);
    c += c.dot(v) < 0 ? Vec3(-v) : v;
  }
  const double len = c.norm();
  return len > 1e-12 ? Vec3(c / len) : fallback;
}

Cone region(const Vec3 &c, double reach) {
  double r = reach + kMargin + reach * 1e-12;
  if (r > 90.0) r = 90.0;
  const Line shown = vector_line(c);
  return with_axis(ConeKind::Region, shown.trend, shown.plunge, r, c);
}

}  // namespace

Cone key_union(const Cone *const *keys, int n) {
  const Vec3 c = aligned_centre(keys, nullptr, n, axis_of(*keys[0]));
  double reach = 0;
  for (int k = 0; k < n; ++k) {
    if ((k & 1023) == 1023) poll_interrupts();
    reach = std::max(reach, axial_angle(c, axis_of(*keys[k])) + keys[k]->radius);
  }
  return region(c, reach);
}

double key_penalty(const Cone &have, const Cone &add) {
  const double need = axial_angle(axis_of(have), axis_of(add)) + add.radius;
  return std::max(0.0, need - have.radius);
}

void key_split(const Cone *const *keys, int n, unsigned char *side) {
  // Two seeds far apart (farthest from key 0, then farthest from that one),
  // then a few rounds of two-means on the axial angle, then a split of the keys
  // ordered by how much nearer they are to one centre than to the other, at the
  // natural point but keeping at least a quarter of the keys on each side.
  auto reach = [&](const Vec3 &c, int i) { return axial_angle(c, axis_of(*keys[i])) + keys[i]->radius; };
  int s1 = 0, s2 = 0;
  double far = -1;
  for (int i = 0; i < n; ++i)
    if (reach(axis_of(*keys[0]), i) > far) far = reach(axis_of(*keys[0]), i), s1 = i;
  far = -1;
  for (int i = 0; i < n; ++i)
    if (i != s1 && reach(axis_of(*keys[s1]), i) > far) far = reach(axis_of(*keys[s1]), i), s2 = i;
  Vec3 c1 = axis_of(*keys[s1]), c2 = axis_of(*keys[s2]);
  std::vector<double> diff(static_cast<size_t>(n));
  std::vector<int> order(static_cast<size_t>(n)), g1, g2;
  for (int round = 0; round < 4; ++round) {
    g1.clear();
    g2.clear();
    for (int i = 0; i < n; ++i) {
      diff[i] = reach(c1, i) - reach(c2, i);
      (diff[i] <= 0 ? g1 : g2).push_back(i);
    }
    if (round == 3 || g1.empty() || g2.empty()) break;
    c1 = aligned_centre(keys, g1.data(), static_cast<int>(g1.size()), c1);
    c2 = aligned_centre(keys, g2.data(), static_cast<int>(g2.size()), c2);
  }
  for (int i = 0; i < n; ++i) order[i] = i;
  std::stable_sort(order.begin(), order.end(), [&](int a, int b) { return diff[a] < diff[b]; });
  const int lo = std::max(1, n / 4), hi = std::min(n - 1, n - n / 4);
  const int cut = std::clamp(static_cast<int>(g1.size()), lo, hi);
  for (int j = 0; j < n; ++j) side[order[j]] = j < cut ? 0 : 1;
}

uint64_t key_order(const Cone &key) {
  // Canonical lower-hemisphere representative (a horizontal axis: trend in
  // [0, 180)), then the polar Lambert equal-area map onto the unit disk
  // (X east, Y north), then a Hilbert curve of order 32 on the square.
  Vec3 v = axis_of(key);
  if (v.z() < 0 || (v.z() == 0 && (v.y() < 0 || (v.y() == 0 && v.x() < 0)))) v = -v;
  const double s = 1.0 / std::sqrt(1.0 + v.z());
  auto cell = [](double t) {  // [-1, 1] -> [0, 2^32 - 1]
    const double u = std::clamp((t + 1.0) * 0.5, 0.0, 1.0) * 4294967295.0;
    return static_cast<uint32_t>(u);
  };
  uint32_t x = cell(v.y() * s), y = cell(v.x() * s);
  uint64_t d = 0;
  for (uint32_t q = 1u << 31; q > 0; q >>= 1) {
    const uint32_t rx = (x & q) ? 1 : 0, ry = (y & q) ? 1 : 0;
    d += static_cast<uint64_t>(q) * q * ((3 * rx) ^ ry);
    if (ry == 0) {
      if (rx == 1) {
        x = ~x;
        y = ~y;
      }
      std::swap(x, y);
    }
  }
  return d;
}

}  // namespace striae
