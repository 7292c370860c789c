// Curves and regions on the lower hemisphere and their disc paths (see drawing.hpp).
#include "drawing.hpp"

#include <algorithm>
#include <cmath>
#include <functional>

namespace striae {

namespace {

constexpr double kTwoPi = 2 * kPi;
// A plane counts as horizontal when its normal is this close to vertical: its
// great circle is then the primitive circle itself.
constexpr double kHorizontalNormal = 1e-12;

// Disc polar angle of a horizontal direction (from east toward north).
double disc_angle(const Vec3 &h) { return std::atan2(h.x(), h.y()); }
// The horizontal direction at a disc polar angle.
Vec3 horizontal_at(double theta) { return Vec3(std::sin(theta), std::cos(theta), 0.0); }
XY rim_point(double theta) { return XY{std::cos(theta), std::sin(theta)}; }

Edge arc_edge(const Arc &a) { return Edge{false, a, 0, 0}; }
Edge rim_edge(double a0, double a1) { return Edge{true, Arc{}, a0, a1}; }

// The piece of the primitive circle from angle from to angle to (either way
// round) whose middle satisfies inside; the shorter one if both or neither do.
Edge rim_between(double from, double to, const std::function<bool(const Vec3 &)> &inside) {
  double d = std::fmod(to - from, kTwoPi);
  if (d < 0) d += kTwoPi;
  const double ccw = d, cw = d - kTwoPi;
  const bool in_ccw = inside(horizontal_at(from + ccw / 2));
  const bool in_cw = inside(horizontal_at(from + cw / 2));
  double s;
  if (in_ccw != in_cw)
    s = in_ccw ? ccw : cw;
  else
    s = std::fabs(ccw) <= std::fabs(cw) ? ccw : cw;
  return rim_edge(from, from + s);
}

Vec3 lower(const Vec3 &v) { return v.z() < 0 ? Vec3(-v) : v; }

}  // namespace

// ---- circles and arcs -----------------------------------------------------------

Vec3 SphereCircle::at(double phi) const {
  return cr * c + sr * (std::cos(phi) * e1 + std::sin(phi) * e2);
}
Vec3 SphereCircle::tangent(double phi) const { return sr * (-std::sin(phi) * e1 + std::cos(phi) * e2); }

SphereCircle great_circle(const Vec3 &e1, const Vec3 &e2) {
  return SphereCircle{e1.cross(e2), e1, e2, 0.0, 1.0};
}

SphereCircle small_circle(const Vec3 &axis, double r) {
  const Vec3 a = axis.normalized();
  const Vec3 ref = std::fabs(a.z()) < 0.9 ? Vec3(0, 0, 1) : Vec3(1, 0, 0);
  const Vec3 e1 = a.cross(ref).normalized();
  const Vec3 e2 = a.cross(e1);
  return SphereCircle{a, e1, e2, std::cos(r), std::sin(r)};
}

Vec3 Arc::at(double phi) const {
  const Vec3 v = circle.at(phi);
  return flip ? Vec3(-v) : v;
}
Vec3 Arc::tangent(double phi) const {
  const Vec3 t = circle.tangent(phi);
  return flip ? Vec3(-t) : t;
}

Arc normal_plane_arc(const Vec3 &n0) {
  const Vec3 n = n0.normalized();
  if (std::fabs(n.z()) >= 1.0 - kHorizontalNormal)  // horizontal plane: the primitive
    return Arc{great_circle(Vec3(1, 0, 0), Vec3(0, 1, 0)), 0.0, kTwoPi, false};
  const Vec3 h = Vec3(n.y(), -n.x(), 0.0).normalized();  // strike line
  Vec3 d = n.cross(h);
  if (d.z() < 0) d = -d;  // down-dip
  return Arc{great_circle(h, d.normalized()), 0.0, kPi, false};
}

Arc plane_arc(const Plane &p) {
  if (p.dip == 0) return Arc{great_circle(Vec3(1, 0, 0), Vec3(0, 1, 0)), 0.0, kTwoPi, false};
  return Arc{great_circle(strike_vector(p.strike), dip_vector(p.strike, p.dip)), 0.0, kPi, false};
}

std::vector<Arc> axial_arcs(const SphereCircle &c) {
  // down component along the circle: A cos phi + B sin phi + C
  const double A = c.sr * c.e1.z(), B = c.sr * c.e2.z(), C = c.cr * c.c.z();
  const double R = std::hypot(A, B);
  if (C - R >= -1e-12) return {Arc{c, 0.0, kTwoPi, false}};  // wholly below (or touching)
  if (C + R <= 1e-12) return {Arc{c, 0.0, kTwoPi, true}};    // wholly above: drawn through the centre
  const double psi = std::atan2(B, A), delta = std::acos(std::clamp(-C / R, -1.0, 1.0));
  const double r1 = psi - delta, r2 = psi + delta;  // down component positive between them
  return {Arc{c, r1, r2, false}, Arc{c, r2, r1 + kTwoPi, true}};
}

// ---- regions ----------------------------------------------------------------------

std::vector<Ring> double_couple_regions(const Vec3 &n0, const Vec3 &u0, bool positive) {
  const Vec3 n = n0.normalized(), u = u0.normalized();
  auto inside = [&](const Vec3 &x) {
    const double v = x.dot(n) * x.dot(u);
    return positive ? v > 0 : v < 0;
  };
  const Arc a1 = normal_plane_arc(n), a2 = normal_plane_arc(u);
  const bool flat1 = std::fabs(n.z()) >= 1.0 - kHorizontalNormal;
  const bool flat2 = std::fabs(u.z()) >= 1.0 - kHorizontalNormal;
  std::vector<Ring> out;

  if (flat1 || flat2) {
    // One nodal plane is the primitive, the other vertical: two half discs
    // split by the vertical plane's diameter. On the rim the horizontal plane
    // gives a zero product, so the test points are taken just below it.
    const Arc &v = flat1 ? a2 : a1;
    const double ta = disc_angle(v.circle.e1);
    for (double s : {kPi, -kPi}) {
      const Vec3 probe = (horizontal_at(ta + kPi + s / 2) + Vec3(0, 0, 1e-3)).normalized();
      if (!inside(probe)) continue;
      out.push_back({arc_edge(v), rim_edge(ta + kPi, ta + kPi + s)});
    }
    return out;
  }

  const Vec3 h1 = a1.circle.e1, h2 = a2.circle.e1;
  if (h1.cross(h2).norm() < 1e-9) {
    // B horizontal: both arcs run between the same two rim points P = h1 and
    // Q = -h1 and bulge to opposite sides (dips adding to 90 degrees): a lens
    // between them and one region between each arc and the rim.
    const bool same = h1.dot(h2) > 0;
    const double p2 = same ? 0.0 : kPi, q2 = same ? kPi : 0.0;  // P, Q on arc 2
    const double tp = disc_angle(h1), tq = disc_angle(-h1);
    const Arc a2pq{a2.circle, p2, q2, false}, a2qp{a2.circle, q2, p2, false};
    if (inside((a1.circle.e2 + a2.circle.e2).normalized())) out.push_back({arc_edge(a1), arc_edge(a2qp)});
    const Arc *arcs[2] = {&a1, &a2pq};
    for (const Arc *a : arcs) {
      const Vec3 dd = a->circle.e2;  // down-dip: the side the arc bulges to
      const Vec3 side = Vec3(dd.x(), dd.y(), 0).normalized();
      if (!inside(side)) continue;
      out.push_back({arc_edge(*a), rim_between(tq, tp, [&](const Vec3 &x) { return x.dot(side) > 0; })});
    }
    return out;
  }

  // General case: the arcs cross at B; their four rim ends alternate between
  // the two planes around the rim, and each sector between neighbouring ends
  // is bounded by the rim and the two half-arcs meeting at B.
  const Vec3 b = lower(n.cross(u).normalized());
  const Arc *arcs[2] = {&a1, &a2};
  double phib[2];
  for (int k = 0; k < 2; ++k)
    phib[k] = std::atan2(b.dot(arcs[k]->circle.e2), b.dot(arcs[k]->circle.e1));
  struct End {
    double theta;
    int arc;
    double phi;
  };
  End ends[4];
  for (int k = 0; k < 2; ++k) {
    const Vec3 h = arcs[k]->circle.e1;
    ends[2 * k] = End{disc_angle(h), k, 0.0};
    ends[2 * k + 1] = End{disc_angle(-h), k, kPi};
  }
  for (End &e : ends)
    if (e.theta < 0) e.theta += kTwoPi;
  std::sort(ends, ends + 4, [](const End &x, const End &y) { return x.theta < y.theta; });
  for (int k = 0; k < 4; ++k) {
    const End &e = ends[k], &f = ends[(k + 1) % 4];
    const double tf = f.theta + (k == 3 ? kTwoPi : 0.0);
    if (!inside(horizontal_at(0.5 * (e.theta + tf)))) continue;
    const Arc &fa = *arcs[f.arc], &ea = *arcs[e.arc];
    out.push_back({rim_edge(e.theta, tf), arc_edge(Arc{fa.circle, f.phi, phib[f.arc], false}),
                   arc_edge(Arc{ea.circle, phib[e.arc], e.phi, false})});
  }
  return out;
}

std::vector<Ring> cone_regions(const Vec3 &axis, double r) {
  if (r >= kPi / 2 - 1e-12) return {Ring{rim_edge(0.0, kTwoPi)}};
  const Vec3 a = lower(axis.normalized());
  const double cr = std::cos(r);
  auto inside = [&](const Vec3 &x) { return std::fabs(x.dot(a)) >= cr; };
  const std::vector<Arc> arcs = axial_arcs(small_circle(a, r));
  if (arcs.size() == 1) return {Ring{arc_edge(arcs[0])}};
  std::vector<Ring> out;
  for (const Arc &arc : arcs) {
    // The arc runs from rim point s to rim point e; close it along the rim
    // back from e to s on the side inside the cone.
    const double ts = disc_angle(arc.at(arc.phi0)), te = disc_angle(arc.at(arc.phi1));
    out.push_back({arc_edge(arc), rim_between(te, ts, inside)});
  }
  return out;
}

// ---- disc paths -----------------------------------------------------------------------

namespace {

struct Sampler {
  const Arc &arc;
  Projection proj;
  XY point(double phi) const { return project(arc.at(phi), proj); }
  XY deriv(double phi) const {
    // at and tangent from one sine and cosine
    const double c = std::cos(phi), sn = std::sin(phi);
    const SphereCircle &k = arc.circle;
    Vec3 v = k.cr * k.c + k.sr * (c * k.e1 + sn * k.e2), t = k.sr * (-sn * k.e1 + c * k.e2);
    if (arc.flip) {
      v = -v;
      t = -t;
    }
    return project_derivative(v, t, proj);
  }
};

// Distances here are well inside the double range: no need for hypot's care.
double dist(const XY &a, const XY &b) {
  const double dx = a.x - b.x, dy = a.y - b.y;
  return std::sqrt(dx * dx + dy * dy);
}

// Hermite cubic on [a, b]; split until it is within tol of the curve.
void fit(DiscPath &path, const Sampler &s, double a, double b, const XY &pa, const XY &da,
         const XY &pb, const XY &db, double tol, int depth) {
  const double h = b - a;
  const XY c1{pa.x + da.x * h / 3, pa.y + da.y * h / 3};
  const XY c2{pb.x - db.x * h / 3, pb.y - db.y * h / 3};
  double err = 0;
  if (depth < 30) {
    for (int k = 1; k < 8; ++k) {
      const double t = k / 8.0, m = 1 - t;
      const XY q{m * m * m * pa.x + 3 * m * m * t * c1.x + 3 * m * t * t * c2.x + t * t * t * pb.x,
                 m * m * m * pa.y + 3 * m * m * t * c1.y + 3 * m * t * t * c2.y + t * t * t * pb.y};
      err = std::max(err, dist(q, s.point(a + t * h)));
      if (err > tol) break;
    }
  }
  if (err > tol) {
    const double mid = 0.5 * (a + b);
    const XY pm = s.point(mid), dm = s.deriv(mid);
    fit(path, s, a, mid, pa, da, pm, dm, tol, depth + 1);
    fit(path, s, mid, b, pm, dm, pb, db, tol, depth + 1);
    return;
  }
  PathSeg seg{PathSeg::Cubic, {c1, c2, pb}, 0};
  path.push_back(seg);
}

// Error of the Hermite cubic on [a, b] (at seven parameters), or a value
// above tol as soon as one sample exceeds it.
double hermite_error(const Sampler &s, double a, double b, const XY &pa, const XY &da, const XY &pb,
                     const XY &db, double tol) {
  const double h = b - a;
  const XY c1{pa.x + da.x * h / 3, pa.y + da.y * h / 3};
  const XY c2{pb.x - db.x * h / 3, pb.y - db.y * h / 3};
  double err = 0;
  for (int k = 1; k < 8 && err <= tol; ++k) {
    const double t = k / 8.0, m = 1 - t;
    const XY q{m * m * m * pa.x + 3 * m * m * t * c1.x + 3 * m * t * t * c2.x + t * t * t * pb.x,
               m * m * m * pa.y + 3 * m * m * t * c1.y + 3 * m * t * t * c2.y + t * t * t * pb.y};
    err = std::max(err, dist(q, s.point(a + t * h)));
  }
  return err;
}

}  // namespace

namespace {

// The stereographic image of an arc as at most two circular arcs (or one
// line), checked against the curve at a few more points. False when the check
// fails (rounding near a degenerate circle): the caller fits cubics instead.
bool exact_circle(DiscPath &path, const Sampler &s, const Arc &arc, double tol) {
  const double span = arc.phi1 - arc.phi0;
  const int parts = std::fabs(span) > kPi ? 2 : 1;
  DiscPath out;
  for (int k = 0; k < parts; ++k) {
    const double a = arc.phi0 + span * k / parts, b = arc.phi0 + span * (k + 1) / parts;
    const XY p0 = s.point(a), pm = s.point(0.5 * (a + b)), p1 = s.point(b);
    // circumcentre of p0, pm, p1
    const double ax = pm.x - p0.x, ay = pm.y - p0.y, bx = p1.x - p0.x, by = p1.y - p0.y;
    const double d = 2 * (ax * by - ay * bx);
    const double chord = std::hypot(bx, by);
    bool line = std::fabs(d) < 1e-15;
    XY c{0, 0};
    double r = 0;
    if (!line) {
      const double a2 = ax * ax + ay * ay, b2 = bx * bx + by * by;
      c = XY{p0.x + (by * a2 - ay * b2) / d, p0.y + (ax * b2 - bx * a2) / d};
      r = std::hypot(p0.x - c.x, p0.y - c.y);
      // nearly straight: a line is within tol (sagitta of the arc)
      if (r > 1e3 && r - std::sqrt(std::max(0.0, r * r - chord * chord / 4)) < 0.25 * tol) line = true;
    }
    for (double t : {0.25, 0.75, 0.1, 0.9}) {
      const XY q = s.point(a + t * (b - a));
      const double e = line ? (chord > 0 ? std::fabs((q.x - p0.x) * by - (q.y - p0.y) * bx) / chord : dist(q, p0))
                            : std::fabs(std::hypot(q.x - c.x, q.y - c.y) - r);
      if (!(e <= 0.5 * tol)) return false;
    }
    if (line) {
      out.push_back(PathSeg{PathSeg::Line, {p1, {}, {}}, 0});
    } else {
      const double turn = ax * (p1.y - pm.y) - ay * (p1.x - pm.x);  // > 0: counter-clockwise
      // more than half the circle when the centre is on the same side of the chord as pm
      const double side_m = bx * (pm.y - p0.y) - by * (pm.x - p0.x), side_c = bx * (c.y - p0.y) - by * (c.x - p0.x);
      const bool large = side_m * side_c > 0;
      out.push_back(PathSeg{PathSeg::CircleArc, {p1, c, XY{r, large ? 1.0 : 0.0}}, turn > 0 ? 1.0 : -1.0});
    }
  }
  path.insert(path.end(), out.begin(), out.end());
  return true;
}

}  // namespace

void append_arc(DiscPath &path, const Arc &arc, Projection proj, double tol, bool start) {
  const Sampler s{arc, proj};
  const double span = arc.phi1 - arc.phi0;
  if (proj == Projection::EqualAngle) {
    if (start) path.push_back(PathSeg{PathSeg::Move, {s.point(arc.phi0), {}, {}}, 0});
    if (exact_circle(path, s, arc, tol)) return;
    start = false;
  }
  const double target = 0.85 * tol;  // margin for the error between the samples
  if (start) path.push_back(PathSeg{PathSeg::Move, {s.point(arc.phi0), {}, {}}, 0});
  // The fewest equal pieces (in the circle's angle) whose cubics all pass:
  // fewer segments than halving, so smaller documents. Beyond 16 pieces (never
  // seen at sizes up to 4000 px) the pieces are split by halving as needed.
  int pieces = std::max(1, static_cast<int>(std::ceil(std::fabs(span) / (kPi * 1.0001))));
  std::vector<XY> pt, dv;
  for (;; ++pieces) {
    pt.resize(pieces + 1);
    dv.resize(pieces + 1);
    for (int k = 0; k <= pieces; ++k) {
      const double phi = k == pieces ? arc.phi1 : arc.phi0 + span * k / pieces;
      pt[k] = s.point(phi);
      dv[k] = s.deriv(phi);
    }
    bool ok = true;
    for (int k = 0; k < pieces && ok; ++k) {
      const double a = arc.phi0 + span * k / pieces, b = k + 1 == pieces ? arc.phi1 : arc.phi0 + span * (k + 1) / pieces;
      ok = hermite_error(s, a, b, pt[k], dv[k], pt[k + 1], dv[k + 1], target) <= target;
    }
    if (ok || pieces >= 16) break;
  }
  for (int k = 0; k < pieces; ++k) {
    const double a = arc.phi0 + span * k / pieces, b = k + 1 == pieces ? arc.phi1 : arc.phi0 + span * (k + 1) / pieces;
    if (pieces < 16) {  // every piece passed above: its cubic as it is
      const double h = b - a;
      path.push_back(PathSeg{PathSeg::Cubic,
                             {XY{pt[k].x + dv[k].x * h / 3, pt[k].y + dv[k].y * h / 3},
                              XY{pt[k + 1].x - dv[k + 1].x * h / 3, pt[k + 1].y - dv[k + 1].y * h / 3}, pt[k + 1]},
                             0});
    } else {
      fit(path, s, a, b, pt[k], dv[k], pt[k + 1], dv[k + 1], target, 0);
    }
  }
}

void append_ring(DiscPath &path, const Ring &ring, Projection proj, double tol) {
  if (ring.empty()) return;
  const Edge &first = ring.front();
  const XY p0 = first.rim ? rim_point(first.a0) : project(first.arc.at(first.arc.phi0), proj);
  path.push_back(PathSeg{PathSeg::Move, {p0, {}, {}}, 0});
  for (const Edge &e : ring) {
    if (e.rim) {
      const double sweep = e.a1 - e.a0;
      if (std::fabs(sweep) > kPi) {  // an SVG arc is at most a half circle here
        const double mid = e.a0 + sweep / 2;
        path.push_back(PathSeg{PathSeg::Rim, {rim_point(mid), {}, {}}, sweep / 2});
        path.push_back(PathSeg{PathSeg::Rim, {rim_point(e.a1), {}, {}}, sweep / 2});
      } else {
        path.push_back(PathSeg{PathSeg::Rim, {rim_point(e.a1), {}, {}}, sweep});
      }
    } else {
      append_arc(path, e.arc, proj, tol, false);
    }
  }
  path.push_back(PathSeg{PathSeg::Close, {{}, {}, {}}, 0});
}

// ---- polylines ------------------------------------------------------------------------

namespace {

void refine(std::vector<XY> &out, const Sampler &s, double a, double b, const XY &pa, const XY &pb,
            double tol, int depth) {
  const double m = 0.5 * (a + b);
  const XY pm = s.point(m);
  // distance of the curve's midpoint from the chord
  const double dx = pb.x - pa.x, dy = pb.y - pa.y, len = std::hypot(dx, dy);
  const double off = len > 0 ? std::fabs((pm.x - pa.x) * dy - (pm.y - pa.y) * dx) / len : dist(pm, pa);
  if (off > tol && depth < 40) {
    refine(out, s, a, m, pa, pm, tol, depth + 1);
    refine(out, s, m, b, pm, pb, tol, depth + 1);
    return;
  }
  out.push_back(pb);
}

// The piece of the primitive from a0 to a1 (the point at a0 is already in out)
// as a polyline of tangents: corners where the tangents at n + 1 equally spaced
// points meet, at radius 1 / cos(h / 2) (within tol of the circle), then the end
// point. It lies on or outside the circle, and a polyline through points of the
// disc lies inside it (the disc is convex), so the outline of a region never
// crosses itself, however close a curve runs to the primitive (a nearly
// horizontal nodal plane): what a GIS requires of a valid polygon.
void rim_points(std::vector<XY> &out, double a0, double a1, double tol) {
  const double step = 2 * std::acos(1 / (1 + std::min(tol, 0.5)));
  const int n = std::max(1, static_cast<int>(std::ceil(std::fabs(a1 - a0) / step)));
  const double h = (a1 - a0) / n, r = 1 / std::cos(h / 2);
  for (int k = 1; k <= n; ++k) {
    const double t = a0 + h * (k - 0.5);
    out.push_back(XY{r * std::cos(t), r * std::sin(t)});
  }
  out.push_back(rim_point(a1));
}

}  // namespace

std::vector<XY> arc_polyline(const Arc &arc, Projection proj, double tol) {
  const Sampler s{arc, proj};
  std::vector<XY> out;
  // 16 starting pieces, so that no bend hides between two samples.
  const int pieces = 16;
  double a = arc.phi0;
  XY pa = s.point(a);
  out.push_back(pa);
  for (int k = 1; k <= pieces; ++k) {
    poll_interrupts();
    const double b = arc.phi0 + (arc.phi1 - arc.phi0) * k / pieces;
    const XY pb = s.point(b);
    refine(out, s, a, b, pa, pb, tol, 0);
    a = b;
    pa = pb;
  }
  return out;
}

std::vector<XY> ring_polygon(const Ring &ring, Projection proj, double tol) {
  std::vector<XY> out;
  for (const Edge &e : ring) {
    if (e.rim) {
      if (out.empty()) out.push_back(rim_point(e.a0));
      rim_points(out, e.a0, e.a1, tol);
    } else {
      std::vector<XY> pts = arc_polyline(e.arc, proj, tol);
      out.insert(out.end(), pts.begin() + (out.empty() ? 0 : 1), pts.end());
    }
  }
  if (out.size() > 1 && dist(out.front(), out.back()) < 1e-12) out.pop_back();
  double area = 0;
  for (size_t i = 0; i < out.size(); ++i) {
    const XY &p = out[i], &q = out[(i + 1) % out.size()];
    area += p.x * q.y - q.x * p.y;
  }
  if (area < 0) std::reverse(out.begin(), out.end());
  return out;
}

FocalDrawing focal_drawing(const FaultSlip &f, Projection proj, double tol) {
  if (!(tol > 0) || tol > 0.5)
    throw Error(ErrorKind::InvalidParameter, "drawing tolerance must be in (0, 0.5] of the net radius");
  Vec3 n, u;
  fault_vectors(f, n, u);
  FocalDrawing d;
  for (const Ring &r : double_couple_regions(n, u, true)) d.compressional.push_back(ring_polygon(r, proj, tol));
  for (const Ring &r : double_couple_regions(n, u, false)) d.dilatational.push_back(ring_polygon(r, proj, tol));
  d.nodal[0] = arc_polyline(normal_plane_arc(n), proj, tol);
  d.nodal[1] = arc_polyline(normal_plane_arc(u), proj, tol);
  d.t = project_axis((n + u) / std::sqrt(2.0), proj);
  d.p = project_axis((n - u) / std::sqrt(2.0), proj);
  return d;
}

}  // namespace striae
