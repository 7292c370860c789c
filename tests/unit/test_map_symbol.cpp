// Unit tests of src/core/geodesic and map_symbol: the direct geodesic problem
// in cases whose answer follows from the geometry (the equator, a sphere, a
// meridian, reversibility, mirror symmetry), SHmax bars, focal-sphere symbols
// placed on the ellipsoid, the disc outline, well-known text and the errors.
// The comparison with an outside implementation (pyproj.Geod, PostGIS) is in
// tests/external/check_gis_geodesic.py.
#include "drawing.hpp"
#include "focal.hpp"
#include "geodesic.hpp"
#include "map_symbol.hpp"
#include "test_rng.hpp"

#include <gtest/gtest.h>

#include <cmath>
#include <functional>
#include <string>
#include <vector>

using namespace striae;
using striae_test::Rng;

namespace {

double wrap180(double d) {
  d = std::fmod(d, 360.0);
  if (d > 180) d -= 360;
  if (d < -180) d += 360;
  return d;
}

// Point in a lon/lat ring (closed), planar test: fine for symbols of a few km.
bool in_ring(const LonLatRing &r, const LonLat &q) {
  bool in = false;
  for (size_t i = 0, j = r.size() - 2; i + 1 < r.size(); j = i++) {
    if ((r[i].lat > q.lat) != (r[j].lat > q.lat) &&
        q.lon < (r[j].lon - r[i].lon) * (q.lat - r[i].lat) / (r[j].lat - r[i].lat) + r[i].lon)
      in = !in;
  }
  return in;
}

double shoelace(const LonLatRing &r) {
  double a = 0;
  for (size_t i = 0; i + 1 < r.size(); ++i) a += r[i].lon * r[i + 1].lat - r[i + 1].lon * r[i].lat;
  return a / 2;
}

ErrorKind kind_of(const std::function<void()> &f) {
  try {
    f();
  } catch (const Error &e) {
    return e.kind;
  }
  ADD_FAILURE() << "no error";
  return ErrorKind::DataError;
}

}  // namespace

// Along the equator, a circle of radius a that is a geodesic: the longitude
// grows by s / a radians, latitude and azimuth stay [derived].
TEST(Geodesic, Equator) {
  for (double s : {1.0, 1000.0, 123456.789, 5.0e6}) {
    const GeodesicEnd e = geodesic_direct(LonLat{-20, 0}, 90, s);
    EXPECT_NEAR(e.point.lon, -20 + deg(s / kWgs84.a), 1e-12) << s;
    EXPECT_NEAR(e.point.lat, 0, 1e-12) << s;
    EXPECT_NEAR(e.azimuth, 90, 1e-10) << s;
  }
}

// With flattening 0 the ellipsoid is a sphere and the direct problem is
// spherical trigonometry: sin phi2 = sin phi1 cos d + cos phi1 sin d cos az,
// tan dlon = sin az sin d cos phi1 / (cos d - sin phi1 sin phi2) [derived:
// the spherical law of cosines and of sines].
TEST(Geodesic, SphereLimit) {
  Rng r(9);
  const Ellipsoid sphere{6371000.0, 0.0};
  for (int i = 0; i < 500; ++i) {
    const double lat = -89 + 178 * r.uniform(), lon = -180 + 360 * r.uniform();
    const double az = 360 * r.uniform(), s = 1.9e7 * r.uniform();
    const GeodesicEnd e = geodesic_direct(LonLat{lon, lat}, az, s, sphere);
    const double d = s / sphere.a, p1 = rad(lat), a1 = rad(az);
    const double p2 = std::asin(std::sin(p1) * std::cos(d) + std::cos(p1) * std::sin(d) * std::cos(a1));
    const double dl = std::atan2(std::sin(a1) * std::sin(d) * std::cos(p1), std::cos(d) - std::sin(p1) * std::sin(p2));
    EXPECT_NEAR(e.point.lat, deg(p2), 1e-9) << i;
    EXPECT_NEAR(wrap180(e.point.lon - lon - deg(dl)), 0, 1e-9) << i;
  }
}

// Due north from the equator, the WGS 84 quarter meridian, 10001965.729 m (from
// memory: the length of the meridian quadrant of WGS 84), reaches the pole.
TEST(Geodesic, QuarterMeridian) {
  const GeodesicEnd e = geodesic_direct(LonLat{0, 0}, 0, 10001965.729);
  EXPECT_NEAR(e.point.lat, 90, 1e-7);
  // half of it stays on the meridian
  const GeodesicEnd h = geodesic_direct(LonLat{7, 0}, 0, 5000982.8645);
  EXPECT_NEAR(h.point.lon, 7, 1e-12);
  EXPECT_NEAR(h.azimuth, 0, 1e-10);
}

// A geodesic walked back from its end, against the azimuth there, returns to
// its start; the mirror image in the equator (latitude and azimuth mirrored)
// is a geodesic too [derived: the ellipsoid's symmetry].
TEST(Geodesic, ReversibleAndSymmetric) {
  Rng r(10);
  for (int i = 0; i < 500; ++i) {
    const LonLat a{-180 + 360 * r.uniform(), -85 + 170 * r.uniform()};
    const double az = 360 * r.uniform(), s = (i % 2 ? 2.0e5 : 1.5e7) * r.uniform();
    const GeodesicEnd e = geodesic_direct(a, az, s);
    const GeodesicEnd back = geodesic_direct(e.point, e.azimuth + 180, s);
    EXPECT_NEAR(wrap180(back.point.lon - a.lon), 0, 1e-9) << i;
    EXPECT_NEAR(back.point.lat, a.lat, 1e-9) << i;
    EXPECT_NEAR(wrap180(back.azimuth - az - 180), 0, 1e-8) << i;
    const GeodesicEnd m = geodesic_direct(LonLat{a.lon, -a.lat}, 180 - az, s);
    EXPECT_NEAR(m.point.lat, -e.point.lat, 1e-12) << i;
    EXPECT_NEAR(wrap180(m.point.lon - e.point.lon), 0, 1e-12) << i;
  }
}

TEST(Geodesic, Destination) {
  const LonLat p = geodesic_destination(LonLat{179.9, 10}, 90, 50000);
  EXPECT_LT(p.lon, -179);  // wrapped into (-180, 180]
  EXPECT_EQ(geodesic_destination(LonLat{3, 4}, 77, 0).lon, 3);
  EXPECT_EQ(kind_of([] { geodesic_destination(LonLat{0, 0}, 0, -1); }), ErrorKind::OutOfRange);
  EXPECT_EQ(kind_of([] { geodesic_destination(LonLat{0, 0}, 0, 2.1e7); }), ErrorKind::OutOfRange);
  EXPECT_EQ(kind_of([] { geodesic_destination(LonLat{0, 0}, NAN, 1); }), ErrorKind::OutOfRange);
  EXPECT_EQ(kind_of([] { geodesic_destination(LonLat{181, 0}, 0, 1); }), ErrorKind::OutOfRange);
  EXPECT_EQ(kind_of([] { geodesic_destination(LonLat{0, -90.5}, 0, 1); }), ErrorKind::OutOfRange);
  EXPECT_EQ(kind_of([] { geodesic_destination(LonLat{0, 90}, 0, 1); }), ErrorKind::InvalidParameter);
  EXPECT_EQ(kind_of([] { geodesic_destination(LonLat{INFINITY, 0}, 0, 1); }), ErrorKind::OutOfRange);
}

// The bar: end at a + 180, centre, end at a; both halves one geodesic, so
// walking from the first end along the geodesic for the whole length reaches
// the last end [derived: a geodesic continues through the centre].
TEST(MapSymbol, ShmaxBar) {
  Rng r(11);
  for (int i = 0; i < 200; ++i) {
    const LonLat c{-180 + 360 * r.uniform(), -80 + 160 * r.uniform()};
    const double az = 720 * r.uniform() - 360, len = 100 + 1.0e5 * r.uniform();
    const std::vector<LonLat> b = shmax_bar(c, az, len);
    ASSERT_EQ(b.size(), 3u);
    EXPECT_EQ(b[1].lon, c.lon);
    EXPECT_EQ(b[1].lat, c.lat);
    double a = std::fmod(az, 180.0);
    if (a < 0) a += 180;
    const GeodesicEnd e0 = geodesic_direct(c, a + 180, len / 2);
    EXPECT_EQ(b[0].lon, e0.point.lon);
    EXPECT_EQ(b[2].lon, geodesic_direct(c, a, len / 2).point.lon);
    const GeodesicEnd through = geodesic_direct(b[0], e0.azimuth + 180, len);
    EXPECT_NEAR(through.point.lon, b[2].lon, 1e-9) << i;
    EXPECT_NEAR(through.point.lat, b[2].lat, 1e-9) << i;
  }
  // an axis: 200 and -160 are the bar of 20
  const auto b20 = shmax_bar(LonLat{5, 50}, 20, 1000), b200 = shmax_bar(LonLat{5, 50}, 200, 1000),
             bm = shmax_bar(LonLat{5, 50}, -160, 1000);
  EXPECT_EQ(b20[2].lon, b200[2].lon);
  EXPECT_EQ(b20[2].lat, bm[2].lat);
  // azimuth 0: from the south end to the north end along the meridian
  const auto n = shmax_bar(LonLat{5, 50}, 0, 2000);
  EXPECT_LT(n[0].lat, 50);
  EXPECT_GT(n[2].lat, 50);
  EXPECT_EQ(n[2].lon, 5);
}

// Vertical sinistral fault 0/90/0: P 315/00 and T 225/00 (METHODS.md, derived
// from Aki & Richards conventions), so the compressional quadrants (containing
// T) are the south-west and north-east ones, the dilatational ones the others.
TEST(MapSymbol, FocalQuadrantsOfAStrikeSlipFault) {
  const LonLat c{12.5, 41.9};
  const FaultSlip f{0, 90, 0};
  for (Projection p : {Projection::EqualArea, Projection::EqualAngle}) {
    const std::vector<LonLatRing> comp = focal_symbol(f, c, 5000, true, p, 1e-3);
    const std::vector<LonLatRing> dil = focal_symbol(f, c, 5000, false, p, 1e-3);
    ASSERT_EQ(comp.size(), 2u);
    ASSERT_EQ(dil.size(), 2u);
    // A geodesic leaving due east or west bends toward the equator: at 5 km
    // and latitude 42 by s^2 tan(lat) / 2R, about 2 m (1.6e-5 degree) [derived],
    // hence the margin on the latitude of the vertices.
    const double margin = 2e-5;
    for (const LonLatRing &r : comp) {
      EXPECT_EQ(r.front().lon, r.back().lon);
      EXPECT_EQ(r.front().lat, r.back().lat);
      EXPECT_GT(shoelace(r), 0);  // counter-clockwise
      double mx = 0, my = 0;
      for (const LonLat &q : r) mx += q.lon - c.lon, my += q.lat - c.lat;
      EXPECT_GT(mx * my, 0);  // north-east or south-west
      for (const LonLat &q : r) {
        const double dx = q.lon - c.lon, dy = q.lat - c.lat;
        EXPECT_GE(mx > 0 ? dx : -dx, -1e-12);
        EXPECT_GE(my > 0 ? dy : -dy, -margin);
      }
    }
    for (const LonLatRing &r : dil) {
      double mx = 0, my = 0;
      for (const LonLat &q : r) mx += q.lon - c.lon, my += q.lat - c.lat;
      EXPECT_LT(mx * my, 0);  // north-west or south-east
    }
  }
}

TEST(MapSymbol, FocalQuadrantsPlacedFromTheDrawing) {
  Rng r(12);
  const double radius = 3000;
  for (int i = 0; i < 100; ++i) {
    const FaultSlip f{360 * r.uniform(), 90 * r.uniform(), 360 * r.uniform() - 180};
    const LonLat c{-170 + 340 * r.uniform(), -70 + 140 * r.uniform()};
    const Projection p = i % 2 ? Projection::EqualAngle : Projection::EqualArea;
    const FocalDrawing d = focal_drawing(f, p, 1e-3);
    const std::vector<LonLatRing> comp = focal_symbol(f, c, radius, true, p, 1e-3);
    const std::vector<LonLatRing> dil = focal_symbol(f, c, radius, false, p, 1e-3);
    ASSERT_EQ(comp.size(), d.compressional.size());
    ASSERT_EQ(dil.size(), d.dilatational.size());
    for (size_t k = 0; k < comp.size(); ++k) {
      ASSERT_EQ(comp[k].size(), d.compressional[k].size() + 1);
      for (size_t j = 0; j < d.compressional[k].size(); ++j) {
        // equal but for the shared points, snapped to one copy (at most 1e-9 of the radius)
        const LonLat q = place_disc_point(c, radius, d.compressional[k][j]);
        EXPECT_NEAR(comp[k][j].lon, q.lon, 1e-9 * radius / 1e5);
        EXPECT_NEAR(comp[k][j].lat, q.lat, 1e-9 * radius / 1e5);
      }
    }
    const LonLat t = place_disc_point(c, radius, XY{0.999 * d.t.x, 0.999 * d.t.y});
    const LonLat pp = place_disc_point(c, radius, XY{0.999 * d.p.x, 0.999 * d.p.y});
    bool t_in = false, p_in = false, p_in_comp = false;
    for (const LonLatRing &q : comp) {
      t_in = t_in || in_ring(q, t);
      p_in_comp = p_in_comp || in_ring(q, pp);
    }
    for (const LonLatRing &q : dil) p_in = p_in || in_ring(q, pp);
    EXPECT_TRUE(t_in) << i;
    EXPECT_TRUE(p_in) << i;
    EXPECT_FALSE(p_in_comp) << i;
  }
}

namespace {

double orient(const LonLat &a, const LonLat &b, const LonLat &c) {
  return (b.lon - a.lon) * (c.lat - a.lat) - (b.lat - a.lat) * (c.lon - a.lon);
}
// Segments ab and cd cross at a point inside both (not at an end).
bool cross(const LonLat &a, const LonLat &b, const LonLat &c, const LonLat &d) {
  const double o1 = orient(a, b, c), o2 = orient(a, b, d), o3 = orient(c, d, a), o4 = orient(c, d, b);
  return ((o1 > 0 && o2 < 0) || (o1 < 0 && o2 > 0)) && ((o3 > 0 && o4 < 0) || (o3 < 0 && o4 > 0));
}
// Pairs of crossing edges of rings r and s (r == s: non-adjacent edges of one ring).
int crossings(const LonLatRing &r, const LonLatRing &s) {
  int n = 0;
  for (size_t i = 0; i + 1 < r.size(); ++i)
    for (size_t j = (&r == &s ? i + 2 : 0); j + 1 < s.size(); ++j) {
      if (&r == &s && i == 0 && j + 2 == s.size()) continue;  // first and last edge meet
      n += cross(r[i], r[i + 1], s[j], s[j + 1]);
    }
  return n;
}

}  // namespace

// OGC validity of the quadrants as a GIS checks it: no ring crosses itself or
// another ring of the same kind, even when a nodal plane runs within less than
// the tolerance of the primitive (nearly horizontal planes), and rings of one
// kind that meet at the B axis share that point exactly.
TEST(MapSymbol, FocalQuadrantsAreValidPolygons) {
  Rng r(13);
  std::vector<FaultSlip> fs = {{0, 0.001, 30}, {10, 0.1, -179.7}, {274.7, 0.1, -179.7}, {18.8, 0.4, -178.8},
                               {44.6, 71.8, 125.4}, {353, 19, -123}, {0, 90, 0}, {0, 45, 90}, {0, 0, 30},
                               {120, 89.999, 0.001}};
  for (int i = 0; i < 150; ++i) fs.push_back(FaultSlip{360 * r.uniform(), 90 * r.uniform(), 360 * r.uniform() - 180});
  const LonLat c{10, 45};
  for (const FaultSlip &f : fs)
    for (Projection p : {Projection::EqualArea, Projection::EqualAngle})
      for (bool comp : {true, false}) {
        const std::vector<LonLatRing> rings = focal_symbol(f, c, 3000, comp, p, 1e-3);
        for (size_t a = 0; a < rings.size(); ++a) {
          EXPECT_EQ(crossings(rings[a], rings[a]), 0) << f.strike << "/" << f.dip << "/" << f.rake;
          for (size_t b = a + 1; b < rings.size(); ++b)
            EXPECT_EQ(crossings(rings[a], rings[b]), 0) << f.strike << "/" << f.dip << "/" << f.rake;
        }
        // B inside the disc: the two rings of a kind meet there, in one point
        Vec3 n, u;
        fault_vectors(f, n, u);
        const Vec3 b = n.cross(u);
        if (rings.size() == 2 && std::fabs(b.z()) > 1e-3) {
          const LonLat pb = place_disc_point(c, 3000, project_axis(b, p));
          int shared = 0;
          for (const LonLat &q : rings[0])
            for (const LonLat &w : rings[1]) shared += q.lon == w.lon && q.lat == w.lat;
          EXPECT_EQ(shared, 1) << f.strike << "/" << f.dip << "/" << f.rake;
          bool at_b = false;
          for (const LonLat &q : rings[0]) at_b = at_b || (std::fabs(q.lon - pb.lon) < 1e-9 && std::fabs(q.lat - pb.lat) < 1e-9);
          EXPECT_TRUE(at_b) << f.strike << "/" << f.dip << "/" << f.rake;
        }
      }
}

// The disc outline: a tangent polygon of n = ceil(pi / acos(1 / (1 + tol)))
// sides, whose corners at 1 / cos(pi / n) stay within tol of the rim [derived],
// counter-clockwise from east, closed.
TEST(MapSymbol, Disc) {
  for (double tol : {0.5, 0.01, 1e-3, 1e-6}) {
    const LonLat c{-70, -33};
    const LonLatRing r = symbol_disc(c, 2000, tol);
    const int n = std::max(8, static_cast<int>(std::ceil(kPi / std::acos(1 / (1 + tol)))));
    ASSERT_EQ(r.size(), static_cast<size_t>(n + 1)) << tol;
    EXPECT_LE(1 / std::cos(kPi / n) - 1, tol);
    EXPECT_GT(shoelace(r), 0);
    EXPECT_EQ(r.front().lat, r.back().lat);
    EXPECT_GT(r[0].lon, c.lon);  // starts east of the centre
    EXPECT_GT(r[0].lat, r[n - 1].lat);
    // first corner: where the tangents at angles 0 and 2 pi / n meet, (1, tan(pi / n))
    const LonLat corner = place_disc_point(c, 2000, XY{1, std::tan(kPi / n)});
    EXPECT_NEAR(r[0].lon, corner.lon, 1e-11);
    EXPECT_NEAR(r[0].lat, corner.lat, 1e-11);
  }
}

TEST(MapSymbol, WellKnownText) {
  EXPECT_EQ(wkt_linestring({LonLat{1, 2}, LonLat{-0.0, 0.5}, LonLat{1e-7, -3.25}}),
            "LINESTRING(1 2,0 0.5,1e-07 -3.25)");
  EXPECT_EQ(wkt_polygon({LonLat{0, 0}, LonLat{1, 0}, LonLat{0, 1}, LonLat{0, 0}}), "POLYGON((0 0,1 0,0 1,0 0))");
  EXPECT_EQ(wkt_multipolygon({{LonLat{0, 0}, LonLat{1, 0}, LonLat{0, 1}, LonLat{0, 0}},
                              {LonLat{5, 5}, LonLat{6, 5}, LonLat{5, 6}, LonLat{5, 5}}}),
            "MULTIPOLYGON(((0 0,1 0,0 1,0 0)),((5 5,6 5,5 6,5 5)))");
  EXPECT_EQ(wkt_multipolygon({}), "MULTIPOLYGON EMPTY");
  // shortest round-trip numbers read back to the same doubles
  const double v = 10.040786242447561;
  EXPECT_EQ(wkt_linestring({LonLat{v, v}}), "LINESTRING(10.040786242447561 10.040786242447561)");
}

TEST(MapSymbol, Errors) {
  const LonLat c{0, 0};
  EXPECT_EQ(kind_of([&] { shmax_bar(c, 10, 0); }), ErrorKind::OutOfRange);
  EXPECT_EQ(kind_of([&] { shmax_bar(c, 10, 1.0e6 + 1); }), ErrorKind::OutOfRange);
  EXPECT_EQ(kind_of([&] { shmax_bar(c, NAN, 10); }), ErrorKind::OutOfRange);
  EXPECT_EQ(kind_of([&] { shmax_bar(c, 10, INFINITY); }), ErrorKind::OutOfRange);
  EXPECT_EQ(kind_of([&] { shmax_bar(LonLat{0, 90}, 10, 10); }), ErrorKind::InvalidParameter);
  EXPECT_EQ(kind_of([&] { focal_symbol(FaultSlip{0, 90, 0}, c, -5, true, Projection::EqualArea, 1e-3); }),
            ErrorKind::OutOfRange);
  EXPECT_EQ(kind_of([&] { focal_symbol(FaultSlip{0, 90, 0}, c, 5, true, Projection::EqualArea, 1e-7); }),
            ErrorKind::InvalidParameter);
  EXPECT_EQ(kind_of([&] { focal_symbol(FaultSlip{0, 90, 0}, c, 5, true, Projection::EqualArea, 0.6); }),
            ErrorKind::InvalidParameter);
  EXPECT_EQ(kind_of([&] { symbol_disc(LonLat{-180.5, 0}, 5, 1e-3); }), ErrorKind::OutOfRange);
  EXPECT_EQ(kind_of([&] { symbol_disc(c, 5, NAN); }), ErrorKind::InvalidParameter);
}
