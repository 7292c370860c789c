// Unit tests of src/core/projection, drawing and svg: projection formulas and
// their inverse, curve fitting within tolerance, regions of a double couple and
// of cones (areas checked through the equal-area property), path text.
#include "drawing.hpp"
#include "focal.hpp"
#include "projection.hpp"
#include "svg.hpp"
#include "test_rng.hpp"

#include <gtest/gtest.h>

#include <cmath>
#include <vector>

using namespace striae;
using striae_test::Rng;

namespace {

Vec3 random_unit(Rng &r) {
  for (;;) {
    const Vec3 v(2 * r.uniform() - 1, 2 * r.uniform() - 1, 2 * r.uniform() - 1);
    const double l = v.norm();
    if (l > 0.1 && l <= 1.0) return v / l;
  }
}

double polygon_area(const std::vector<XY> &p) {
  double a = 0;
  for (size_t i = 0; i < p.size(); ++i) {
    const XY &u = p[i], &v = p[(i + 1) % p.size()];
    a += u.x * v.y - v.x * u.y;
  }
  return a / 2;
}

bool in_polygon(const std::vector<XY> &p, const XY &q) {
  bool in = false;
  for (size_t i = 0, j = p.size() - 1; i < p.size(); j = i++) {
    if ((p[i].y > q.y) != (p[j].y > q.y) &&
        q.x < (p[j].x - p[i].x) * (q.y - p[i].y) / (p[j].y - p[i].y) + p[i].x)
      in = !in;
  }
  return in;
}

// Point of a cubic Bezier.
XY bezier(const XY &a, const XY &b, const XY &c, const XY &d, double t) {
  const double m = 1 - t;
  return XY{m * m * m * a.x + 3 * m * m * t * b.x + 3 * m * t * t * c.x + t * t * t * d.x,
            m * m * m * a.y + 3 * m * m * t * b.y + 3 * m * t * t * c.y + t * t * t * d.y};
}

double seg_dist(const XY &p, const XY &a, const XY &b) {
  const double dx = b.x - a.x, dy = b.y - a.y, l2 = dx * dx + dy * dy;
  double t = l2 > 0 ? ((p.x - a.x) * dx + (p.y - a.y) * dy) / l2 : 0;
  t = std::clamp(t, 0.0, 1.0);
  return std::hypot(p.x - a.x - t * dx, p.y - a.y - t * dy);
}

double poly_dist(const XY &p, const std::vector<XY> &poly) {
  double best = 1e300;
  for (size_t i = 0; i + 1 < poly.size(); ++i) best = std::min(best, seg_dist(p, poly[i], poly[i + 1]));
  return best;
}

}  // namespace

// Values derived from the formulas of METHODS.md section 7 (Snyder 1987):
// plunge 45 east has radius sqrt(1/2)/sqrt(1 + sqrt(1/2)) (equal-area) and
// tan(22.5 deg) (equal-angle).
TEST(Projection, KnownPoints) {
  const Vec3 e45 = line_vector(Line{90, 45});
  EXPECT_NEAR(project(e45, Projection::EqualArea).x, std::sqrt(0.5) / std::sqrt(1 + std::sqrt(0.5)), 1e-15);
  EXPECT_NEAR(project(e45, Projection::EqualAngle).x, std::tan(rad(22.5)), 1e-15);
  EXPECT_NEAR(project(e45, Projection::EqualArea).y, 0, 1e-15);
  const XY n = project(line_vector(Line{0, 0}), Projection::EqualArea);
  EXPECT_NEAR(n.x, 0, 1e-15);
  EXPECT_NEAR(n.y, 1, 1e-15);
  const XY c = project(Vec3(0, 0, 1), Projection::EqualAngle);
  EXPECT_EQ(c.x, 0);
  EXPECT_EQ(c.y, 0);
  // An upward axis is drawn through the centre: 300/-30 is 120/30.
  const XY a = project_axis(-line_vector(Line{120, 30}), Projection::EqualArea);
  const XY b = project(line_vector(Line{120, 30}), Projection::EqualArea);
  EXPECT_NEAR(a.x, b.x, 1e-15);
  EXPECT_NEAR(a.y, b.y, 1e-15);
  EXPECT_EQ(parse_projection("Equal-Angle"), Projection::EqualAngle);
  EXPECT_THROW(parse_projection("wulff"), Error);
}

TEST(Projection, InverseAndDerivative) {
  Rng r(81);
  for (Projection p : {Projection::EqualArea, Projection::EqualAngle}) {
    for (int i = 0; i < 2000; ++i) {
      Vec3 v = random_unit(r);
      if (v.z() < 0) v = -v;
      const XY q = project(v, p);
      EXPECT_LE((unproject(q.x, q.y, p) - v).norm(), 1e-12);
      // derivative against a central difference along a tangent
      Vec3 t = v.cross(random_unit(r)).normalized();
      const double h = 1e-6;
      Vec3 v1 = (v + h * t).normalized(), v0 = (v - h * t).normalized();
      if (v0.z() < 0 || v1.z() < 0) continue;
      const XY d = project_derivative(v, t, p), a = project(v1, p), b = project(v0, p);
      EXPECT_NEAR(d.x, (a.x - b.x) / (2 * h), 1e-6);
      EXPECT_NEAR(d.y, (a.y - b.y) / (2 * h), 1e-6);
    }
    // beyond the rim: the upper hemisphere
    EXPECT_LT(unproject(1.2, 0, p).z(), 0);
  }
}

// The fitted cubics stay within the tolerance of the true curve, both ways
// (every curve point near the drawn path and every drawn point near the curve).
TEST(Drawing, GreatAndSmallCirclesWithinTolerance) {
  Rng r(82);
  const double tol = 0.1 / 200;  // 0.1 px at a net radius of 200 px
  for (Projection p : {Projection::EqualArea, Projection::EqualAngle}) {
    for (int i = 0; i < 60; ++i) {
      std::vector<Arc> arcs;
      if (i % 2 == 0) {
        arcs.push_back(plane_arc(Plane{r.uniform() * 360, i % 20 == 0 ? 90.0 : r.uniform() * 90}));
      } else {
        arcs = axial_arcs(small_circle(random_unit(r), rad(1 + 88 * r.uniform())));
      }
      for (const Arc &arc : arcs) {
        DiscPath path;
        append_arc(path, arc, p, tol, true);
        ASSERT_GE(path.size(), 2u);
        std::vector<XY> drawn;
        XY cur = path[0].p[0];
        drawn.push_back(cur);
        for (size_t k = 1; k < path.size(); ++k) {
          const PathSeg &g = path[k];
          if (g.op == PathSeg::Cubic) {
            for (int j = 1; j <= 48; ++j) drawn.push_back(bezier(cur, g.p[0], g.p[1], g.p[2], j / 48.0));
            cur = g.p[2];
          } else if (g.op == PathSeg::Line) {
            for (int j = 1; j <= 48; ++j)
              drawn.push_back(XY{cur.x + (g.p[0].x - cur.x) * j / 48.0, cur.y + (g.p[0].y - cur.y) * j / 48.0});
            cur = g.p[0];
          } else {
            ASSERT_EQ(g.op, PathSeg::CircleArc);
            const XY c = g.p[1];
            const double rr = g.p[2].x, t0 = std::atan2(cur.y - c.y, cur.x - c.x);
            double d = std::atan2(g.p[0].y - c.y, g.p[0].x - c.x) - t0;
            if (g.sweep > 0 && d < 0) d += 2 * kPi;
            if (g.sweep < 0 && d > 0) d -= 2 * kPi;
            EXPECT_EQ(std::fabs(d) > kPi, g.p[2].y > 0);  // the large-arc flag agrees
            for (int j = 1; j <= 400; ++j)
              drawn.push_back(XY{c.x + rr * std::cos(t0 + d * j / 400.0), c.y + rr * std::sin(t0 + d * j / 400.0)});
            cur = g.p[0];
          }
        }
        std::vector<XY> truth;
        for (int j = 0; j <= 3000; ++j)
          truth.push_back(project(arc.at(arc.phi0 + (arc.phi1 - arc.phi0) * j / 3000.0), p));
        double worst = 0;
        for (const XY &q : truth) worst = std::max(worst, poly_dist(q, drawn));
        for (size_t j = 0; j < drawn.size(); j += 5) worst = std::max(worst, poly_dist(drawn[j], truth));
        EXPECT_LT(worst, tol) << "arc " << i;
      }
    }
  }
}

// Equal-area check of regions: the projection keeps areas (scaled: the lower
// hemisphere, 2 pi steradians, becomes the unit disc, area pi). A double
// couple's compressional quadrants are half the sphere: area pi / 2 [derived].
TEST(Drawing, DoubleCoupleRegionsHalveTheNet) {
  std::vector<FaultSlip> cases = {
      {30, 60, 40}, {0, 45, 90}, {0, 45, -90}, {0, 90, 0}, {0, 0, 90}, {0, 0, 0},
      {123, 90, 90}, {10, 89.9999, 1}, {200, 20, -170}, {77, 30, 90}};
  Rng r(83);
  for (int i = 0; i < 40; ++i) cases.push_back(FaultSlip{r.uniform() * 360, r.uniform() * 90, r.uniform() * 360 - 180});
  for (const FaultSlip &f : cases) {
    Vec3 n, u;
    fault_vectors(f, n, u);
    const FocalDrawing d = focal_drawing(f, Projection::EqualArea, 1e-5);
    double ac = 0, ad = 0;
    for (const auto &poly : d.compressional) ac += polygon_area(poly);
    for (const auto &poly : d.dilatational) ad += polygon_area(poly);
    EXPECT_NEAR(ac, kPi / 2, 1e-3) << f.strike << "/" << f.dip << "/" << f.rake;
    EXPECT_NEAR(ad, kPi / 2, 1e-3) << f.strike << "/" << f.dip << "/" << f.rake;
    // membership of random points agrees with the sign of (x.n)(x.u)
    for (int k = 0; k < 300; ++k) {
      const XY q{2 * r.uniform() - 1, 2 * r.uniform() - 1};
      if (q.x * q.x + q.y * q.y > 0.98) continue;
      const Vec3 x = unproject(q.x, q.y, Projection::EqualArea);
      const double v = x.dot(n) * x.dot(u);
      if (std::fabs(v) < 1e-3) continue;  // too near a nodal plane for a polygon within 1e-5
      bool inc = false;
      for (const auto &poly : d.compressional) inc = inc || in_polygon(poly, q);
      EXPECT_EQ(inc, v > 0);
    }
    // T in a compressional quadrant, P in a dilatational one
    bool t_in = false;
    for (const auto &poly : d.compressional) t_in = t_in || in_polygon(poly, XY{d.t.x * 0.999, d.t.y * 0.999});
    EXPECT_TRUE(t_in) << f.strike << "/" << f.dip << "/" << f.rake;
  }
}

// A cone of half-angle r about an axis covers pi (1 - cos r) of the equal-area
// disc, the caps about a and -a together [derived: cap area 2 pi (1 - cos r)].
TEST(Drawing, ConeAreas) {
  Rng r(84);
  for (int i = 0; i < 60; ++i) {
    const Vec3 a = random_unit(r);
    const double half = rad(i == 0 ? 90.0 : 1 + 88 * r.uniform());
    double area = 0;
    for (const Ring &ring : cone_regions(a, half)) area += polygon_area(ring_polygon(ring, Projection::EqualArea, 1e-5));
    EXPECT_NEAR(area, kPi * (1 - std::cos(half)), 1e-3) << i;
  }
  // axis on the primitive: half the cone on each side
  const auto rings = cone_regions(line_vector(Line{90, 0}), rad(20));
  ASSERT_EQ(rings.size(), 2u);
  const auto a = ring_polygon(rings[0], Projection::EqualArea, 1e-5), b = ring_polygon(rings[1], Projection::EqualArea, 1e-5);
  EXPECT_NEAR(polygon_area(a), polygon_area(b), 1e-4);
}

TEST(Svg, NumbersAndText) {
  SvgWriter w;
  w.num(12.5).raw(" ").num(-0.004).raw(" ").num(-0.005).raw(" ").num(3).raw(" ").num(0.07);
  EXPECT_EQ(w.out, "12.5 0 -0.01 3 0.07");
  SvgWriter t;
  t.text("a<b & \"c\" \xcf\x83\x31 \x01");
  EXPECT_EQ(t.out, "a&lt;b &amp; &quot;c&quot; &#963;1  ");
  SvgWriter bad;
  bad.text("\xff");
  EXPECT_EQ(bad.out, "&#65533;");
}
