// Unit tests of orientation primitives (src/core/orientation.*).
#include <gtest/gtest.h>

#include <cmath>
#include <cstring>

#include "orientation.hpp"
#include "test_rng.hpp"

using namespace striae;

namespace {

void expect_error(ErrorKind k, void (*f)()) {
  try {
    f();
    ADD_FAILURE() << "no error";
  } catch (const Error &e) {
    EXPECT_EQ(static_cast<int>(e.kind), static_cast<int>(k)) << e.what();
  }
}

using striae_test::Rng;

}  // namespace

// Canonical forms (conventions of DESIGN.md; common practice, no source).
TEST(Canonical, PlaneNormalisation) {
  Plane p = make_plane(360, 30);
  EXPECT_EQ(p.strike, 0);
  p = make_plane(123, 0);  // horizontal: one plane whatever the strike
  EXPECT_EQ(p.strike, 0);
  EXPECT_EQ(p.dip, 0);
  p = make_plane(270, 90);  // vertical: 270/90 is 90/90
  EXPECT_EQ(p.strike, 90);
  p = make_plane(180, 90);  // the limit of [0,180): 180/90 is 0/90
  EXPECT_EQ(p.strike, 0);
  p = make_plane(179.5, 90);
  EXPECT_EQ(p.strike, 179.5);
  p = make_plane(-0.0, 10);
  EXPECT_FALSE(std::signbit(p.strike));
}

TEST(Canonical, LineNormalisation) {
  Line l = make_line(300, -30);  // upward: same axis as 120/30
  EXPECT_EQ(l.trend, 120);
  EXPECT_EQ(l.plunge, 30);
  l = make_line(200, 0);  // horizontal axes use trends [0,180)
  EXPECT_EQ(l.trend, 20);
  l = make_line(77, 90);  // vertical: trend 0
  EXPECT_EQ(l.trend, 0);
  l = make_line(360, 10);
  EXPECT_EQ(l.trend, 0);
}

TEST(Canonical, FaultSlipNormalisation) {
  FaultSlip f = make_fault_slip(10, 20, -180);
  EXPECT_EQ(f.rake, 180);
  f = make_fault_slip(270, 90, 30);  // (f,90,r) == (f-180,90,-r)
  EXPECT_EQ(f.strike, 90);
  EXPECT_EQ(f.rake, -30);
  f = make_fault_slip(180, 90, 30);  // the limit itself
  EXPECT_EQ(f.strike, 0);
  EXPECT_EQ(f.rake, -30);
  f = make_fault_slip(40, 0, 10);  // horizontal fault: rake from north
  EXPECT_EQ(f.strike, 0);
  EXPECT_EQ(f.rake, -30);
}

TEST(Canonical, Errors) {
  expect_error(ErrorKind::OutOfRange, [] { make_plane(361, 10); });
  expect_error(ErrorKind::OutOfRange, [] { make_plane(10, 91); });
  expect_error(ErrorKind::OutOfRange, [] { make_plane(NAN, 10); });
  expect_error(ErrorKind::OutOfRange, [] { make_plane(10, INFINITY); });
  expect_error(ErrorKind::OutOfRange, [] { make_line(10, -91); });
  expect_error(ErrorKind::OutOfRange, [] { make_line(-1, 10); });
  expect_error(ErrorKind::OutOfRange, [] { make_fault_slip(10, 10, 181); });
  expect_error(ErrorKind::OutOfRange, [] { make_fault_slip(10, 10, NAN); });
  expect_error(ErrorKind::OutOfRange, [] { make_plane_from_dip_direction(400, 10); });
}

TEST(Canonical, IsCanonical) {
  EXPECT_TRUE(is_canonical(Plane{110, 64}));
  EXPECT_FALSE(is_canonical(Plane{200, 90}));
  EXPECT_FALSE(is_canonical(Plane{-0.0, 10}));
  EXPECT_FALSE(is_canonical(Line{200, 0}));
  EXPECT_FALSE(is_canonical(FaultSlip{10, 10, -180}));
  EXPECT_TRUE(is_canonical(FaultSlip{10, 10, 180}));
  EXPECT_FALSE(is_canonical(Line{NAN, 0}));
}

// Vectors: METHODS.md section 1 (Aki & Richards 1980 conventions).
TEST(Vectors, LineVector) {
  Vec3 v = line_vector(Line{90, 0});  // east, horizontal
  EXPECT_NEAR(v.x(), 0, 1e-15);
  EXPECT_NEAR(v.y(), 1, 1e-15);
  v = line_vector(Line{0, 90});  // straight down
  EXPECT_NEAR(v.z(), 1, 1e-15);
}

TEST(Vectors, PlaneNormalPointsUp) {
  // 0/45 dips east: the upward normal leans east and up (derived from A&R).
  Vec3 n = plane_normal(Plane{0, 45});
  EXPECT_NEAR(n.y(), std::sqrt(0.5), 1e-15);
  EXPECT_NEAR(n.z(), -std::sqrt(0.5), 1e-15);
}

TEST(Vectors, PoleExactInDegrees) {
  Line p = pole(Plane{110, 64});  // trend strike - 90, plunge 90 - dip
  EXPECT_EQ(p.trend, 20);
  EXPECT_EQ(p.plunge, 26);
  Plane q = plane_from_pole(p);
  EXPECT_EQ(q.strike, 110);
  EXPECT_EQ(q.dip, 64);
  // Horizontal plane: pole vertical.
  EXPECT_EQ(pole(Plane{0, 0}).plunge, 90);
}

TEST(Vectors, RandomRoundTrips) {
  Rng r(42);
  for (int i = 0; i < 2000; ++i) {
    const double s = 360 * r.uniform(), d = 90 * r.uniform(), k = 360 * r.uniform() - 180;
    const FaultSlip f = make_fault_slip(s, d, k);
    Vec3 n, u;
    fault_vectors(f, n, u);
    EXPECT_NEAR(n.norm(), 1, 1e-14);
    EXPECT_NEAR(u.norm(), 1, 1e-14);
    EXPECT_NEAR(n.dot(u), 0, 1e-14);
    const FaultSlip g = fault_from_vectors(n, u);
    EXPECT_NEAR(g.strike, f.strike, 1e-9);
    EXPECT_NEAR(g.dip, f.dip, 1e-9);
    EXPECT_NEAR(g.rake, f.rake, 1e-9);
    const Line l = make_line(360 * r.uniform(), 90 * r.uniform());
    const Line m = vector_line(line_vector(l));
    EXPECT_LT(angle(l, m), 1e-9);
  }
}

TEST(Vectors, VectorLineLowerHemisphere) {
  Line l = vector_line(Vec3(0, 0, -2));  // up -> vertical down
  EXPECT_EQ(l.plunge, 90);
  EXPECT_EQ(l.trend, 0);
  l = vector_line(Vec3(-1, 0, 0));  // south, horizontal -> 0/0
  EXPECT_EQ(l.trend, 0);
  EXPECT_EQ(l.plunge, 0);
  expect_error(ErrorKind::DataError, [] { vector_line(Vec3(0, 0, 0)); });
}

TEST(Vectors, RakeSignConvention) {
  // Pure thrust on 0/45 (rake 90): hanging wall moves up-dip, i.e. west and up
  // (derived from Aki & Richards conventions: u = cos r s - sin r dd).
  Vec3 n, u;
  fault_vectors(FaultSlip{0, 45, 90}, n, u);
  EXPECT_NEAR(u.y(), -std::sqrt(0.5), 1e-15);
  EXPECT_NEAR(u.z(), -std::sqrt(0.5), 1e-15);
  // Rake 0: along strike (north) is sinistral.
  fault_vectors(FaultSlip{0, 45, 0}, n, u);
  EXPECT_NEAR(u.x(), 1, 1e-15);
}

// Geometry (derived; common practice, no source).
TEST(Geometry, AnglesAreAxial) {
  EXPECT_NEAR(angle(Line{0, 5}, Line{180, 5}), 10, 1e-12);
  EXPECT_NEAR(angle(Line{0, 0}, Line{90, 0}), 90, 1e-12);
  EXPECT_NEAR(angle(Plane{0, 30}, Plane{180, 30}), 60, 1e-12);
  EXPECT_NEAR(angle(Plane{10, 30}, Plane{10, 30}), 0, 1e-12);
}

TEST(Geometry, IntersectionAndPlaneThrough) {
  // Two vertical planes striking N and E meet in the vertical line.
  Line l = intersection(Plane{0, 90}, Plane{90, 90});
  EXPECT_EQ(l.plunge, 90);
  // A plane dipping 30 east and a vertical E-W plane meet in 090/30.
  l = intersection(Plane{0, 30}, Plane{90, 90});
  EXPECT_NEAR(l.trend, 90, 1e-9);
  EXPECT_NEAR(l.plunge, 30, 1e-9);
  Plane p = plane_through(Line{0, 0}, Line{90, 30});
  EXPECT_NEAR(p.strike, 0, 1e-9);
  EXPECT_NEAR(p.dip, 30, 1e-9);
  expect_error(ErrorKind::DataError, [] { intersection(Plane{10, 20}, Plane{10, 20}); });
  expect_error(ErrorKind::DataError, [] { plane_through(Line{10, 20}, Line{190, -20}); });
}

TEST(Geometry, SlipSense) {
  EXPECT_STREQ(slip_sense(FaultSlip{0, 60, -90}), "normal");
  EXPECT_STREQ(slip_sense(FaultSlip{0, 60, 90}), "reverse");
  EXPECT_STREQ(slip_sense(FaultSlip{0, 60, 0}), "sinistral");
  EXPECT_STREQ(slip_sense(FaultSlip{0, 60, 180}), "dextral");
  EXPECT_STREQ(slip_sense(FaultSlip{0, 60, -120}), "normal-dextral");
  EXPECT_STREQ(slip_sense(FaultSlip{0, 60, 30}), "sinistral-reverse");
  EXPECT_STREQ(slip_sense(FaultSlip{0, 60, -75}), "normal");
}

TEST(Geometry, SlipSenseClassLimits) {
  // Each limit of the documented rule (orientation.hpp, README) and a tenth of a
  // degree on either side: the pure senses include their limits (|rake| 22.5,
  // 67.5, 112.5, 157.5); where dip slip and strike slip are equal (|rake| 45,
  // 135) the dip-slip word comes first. The rule itself is common practice, no
  // source; the words on each side follow from it.
  struct Case { double rake; const char *sense; };
  const Case cases[] = {
      {0, "sinistral"},            {22.4, "sinistral"},          {22.5, "sinistral"},
      {22.6, "sinistral-reverse"}, {44.9, "sinistral-reverse"},  {45, "reverse-sinistral"},
      {45.1, "reverse-sinistral"}, {67.4, "reverse-sinistral"},  {67.5, "reverse"},
      {90, "reverse"},             {112.5, "reverse"},           {112.6, "reverse-dextral"},
      {134.9, "reverse-dextral"},  {135, "reverse-dextral"},     {135.1, "dextral-reverse"},
      {157.4, "dextral-reverse"},  {157.5, "dextral"},           {180, "dextral"},
      {-22.5, "sinistral"},        {-22.6, "sinistral-normal"},  {-44.9, "sinistral-normal"},
      {-45, "normal-sinistral"},   {-67.4, "normal-sinistral"},  {-67.5, "normal"},
      {-112.5, "normal"},          {-112.6, "normal-dextral"},   {-135, "normal-dextral"},
      {-135.1, "dextral-normal"},  {-157.4, "dextral-normal"},   {-157.5, "dextral"},
  };
  for (const Case &c : cases) {
    const FaultSlip f = make_fault_slip(30, 50, c.rake);
    EXPECT_STREQ(slip_sense(f), c.sense) << "rake " << c.rake;
  }
}

TEST(Sense, Parse) {
  Sense s = parse_sense("Normal");
  EXPECT_EQ(s.dip, 1);
  s = parse_sense("thrust-sinistral");
  EXPECT_EQ(s.dip, -1);
  EXPECT_EQ(s.strike, 1);
  s = parse_sense("right-lateral");
  EXPECT_EQ(s.strike, -1);
  s = parse_sense("n d");
  EXPECT_EQ(s.dip, 1);
  EXPECT_EQ(s.strike, -1);
  expect_error(ErrorKind::InvalidParameter, [] { parse_sense("normal reverse"); });
  expect_error(ErrorKind::InvalidParameter, [] { parse_sense("up"); });
  expect_error(ErrorKind::InvalidParameter, [] { parse_sense(""); });
  expect_error(ErrorKind::InvalidParameter, [] { parse_sense("d s"); });
}

TEST(Sense, FromStriation) {
  // Down-dip striation on 110/64 (trend 200, plunge 64), normal: rake -90.
  const Plane p{110, 64};
  FaultSlip f = fault_from_striation(p, line_vector(Line{200, 64}), parse_sense("normal"), 10);
  EXPECT_NEAR(f.rake, -90, 1e-9);
  f = fault_from_striation(p, line_vector(Line{200, 64}), parse_sense("reverse"), 10);
  EXPECT_NEAR(f.rake, 90, 1e-9);
  // Horizontal striation along strike, dextral: rake 180.
  f = fault_from_striation(p, line_vector(Line{110, 0}), parse_sense("dextral"), 10);
  EXPECT_NEAR(f.rake, 180, 1e-9);
  // 5 degrees off the plane: projected within the default tolerance.
  f = fault_from_striation(p, line_vector(Line{200, 59}), parse_sense("n"), 10);
  EXPECT_NEAR(f.rake, -90, 1e-9);
  // Either side of the tolerance: in the dip-direction plane the angle between
  // the line and the plane is the difference of plunges (derived).
  f = fault_from_striation(p, line_vector(Line{200, 54.5}), parse_sense("n"), 10);
  EXPECT_NEAR(f.rake, -90, 1e-9);
  expect_error(ErrorKind::DataError, [] {
    fault_from_striation(Plane{110, 64}, line_vector(Line{200, 53.5}), parse_sense("n"), 10);
  });
  expect_error(ErrorKind::DataError, [] {
    fault_from_striation(Plane{110, 64}, line_vector(Line{200, 40}), parse_sense("n"), 10);
  });
  expect_error(ErrorKind::DataError, [] {
    fault_from_striation(Plane{110, 64}, line_vector(Line{110, 0}), parse_sense("normal"), 10);
  });
  expect_error(ErrorKind::DataError, [] {
    fault_from_striation(Plane{110, 64}, line_vector(Line{200, 64}), parse_sense("dextral"), 10);
  });
  expect_error(ErrorKind::InvalidParameter, [] {
    fault_from_striation(Plane{110, 64}, line_vector(Line{200, 64}), parse_sense("n"), -1);
  });
  // Oblique striation: normal and sinistral hold together, normal and dextral cannot.
  const Vec3 obl = std::cos(rad(40)) * strike_vector(110) + std::sin(rad(40)) * dip_vector(110, 64);
  f = fault_from_striation(p, obl, parse_sense("normal sinistral"), 1);
  EXPECT_NEAR(f.rake, -40, 1e-9);
  expect_error(ErrorKind::DataError, [] {
    const Vec3 o = std::cos(rad(40)) * strike_vector(110) + std::sin(rad(40)) * dip_vector(110, 64);
    fault_from_striation(Plane{110, 64}, o, parse_sense("normal dextral"), 1);
  });
}

TEST(Trig, DegreesAgainstLongDouble) {
  // sincosd against long-double sinl/cosl of x * pi/180 (reference: the C
  // library in extended precision): within 1.5e-16 absolute (measured 1.1e-16,
  // under 1 ulp of 1), exact at multiples of 90 degrees.
  const long double pi = 3.141592653589793238462643383279502884L;
  Rng r(99);
  double worst = 0;
  for (int i = 0; i < 1000000; ++i) {
    const double x = i < 500000 ? 720 * r.uniform() - 360 : (i - 500000) * 0.00072;
    double s, c;
    sincosd(x, s, c);
    const long double t = x * pi / 180;
    worst = std::max(worst, static_cast<double>(std::max(fabsl(s - sinl(t)), fabsl(c - cosl(t)))));
  }
  EXPECT_LT(worst, 1.5e-16);
  // Whole degrees 0..90 are the long-double values rounded once to double
  // (correctly rounded unless a value lies within ~1e-19 of a rounding
  // boundary): sin 30 is exactly 0.5, cos 60 too. Other whole degrees follow
  // by exact symmetries, which hold bit for bit: periodicity, sin(180 - x) =
  // sin x, cos x = sin(90 - x), sin(-x) = -sin x.
  auto sd = [](int j) { double s, c; sincosd(j, s, c); return s; };
  auto cd = [](int j) { double s, c; sincosd(j, s, c); return c; };
  for (int j = 0; j <= 90; ++j) {
    const long double t = j * pi / 180;
    EXPECT_EQ(sd(j), j == 0 ? 0.0 : static_cast<double>(sinl(t))) << j;
    EXPECT_EQ(cd(j), j == 90 ? 0.0 : static_cast<double>(cosl(t))) << j;
  }
  EXPECT_EQ(sd(30), 0.5);
  EXPECT_EQ(cd(60), 0.5);
  for (int j = -360; j <= 720; ++j) {
    const int k = ((j % 360) + 360) % 360;
    EXPECT_EQ(sd(j), sd(k)) << j;
    EXPECT_EQ(cd(j), cd(k)) << j;
    EXPECT_EQ(sd(180 - j), sd(j)) << j;
    EXPECT_EQ(cd(90 - j), sd(j)) << j;
    EXPECT_EQ(sd(-j), -sd(j) + 0.0) << j;
  }
  // Non-finite input gives NaN (and reads no memory outside the table).
  for (double x : {std::nan(""), HUGE_VAL, -HUGE_VAL}) {
    double s = 0, c = 0;
    sincosd(x, s, c);
    EXPECT_TRUE(std::isnan(s) && std::isnan(c)) << x;
  }
  for (double x : {0.0, 90.0, 180.0, 270.0, 360.0, -90.0, -180.0}) {
    double s, c;
    sincosd(x, s, c);
    EXPECT_EQ(std::fabs(s) + std::fabs(c), 1.0) << x;
    EXPECT_EQ(s * c, 0.0) << x;
    EXPECT_FALSE(std::signbit(s) && s == 0) << x;
  }
}

TEST(Trig, TwoLanesBitIdenticalToScalar) {
  // sincosd2 (SIMD lanes) must give exactly sincosd's bits, or a vector would
  // depend on which path computed it: random angles in and beyond +-360,
  // whole and half degrees, signed zeros and non-finite values.
  Rng r(5);
  std::vector<double> xs = {0.0, -0.0, 0.5, -0.5, 359.5, 360.0, -360.0, 360.5, -360.5, 89.5, 1e6,
                            std::nan(""), HUGE_VAL, -HUGE_VAL};
  for (int j = -720; j <= 720; ++j) xs.push_back(j * 0.5);
  for (int i = 0; i < 200000; ++i) xs.push_back(i % 4 ? 720 * r.uniform() - 360 : 4000 * r.uniform() - 2000);
  auto same = [](double a, double b) { return std::memcmp(&a, &b, sizeof a) == 0 || (std::isnan(a) && std::isnan(b)); };
  for (size_t i = 0; i + 1 < xs.size(); ++i) {
    double s2[2], c2[2], s0, c0, s1, c1;
    sincosd2(xs[i], xs[i + 1], s2, c2);
    sincosd(xs[i], s0, c0);
    sincosd(xs[i + 1], s1, c1);
    ASSERT_TRUE(same(s2[0], s0) && same(c2[0], c0) && same(s2[1], s1) && same(c2[1], c1))
        << xs[i] << " " << xs[i + 1];
  }
}

TEST(Snap, Rounding) {
  EXPECT_EQ(snap_angle(179.99999999999997), 180);
  EXPECT_EQ(snap_angle(-1e-17), 0);
  EXPECT_FALSE(std::signbit(snap_angle(-1e-17)));
  EXPECT_EQ(norm360(-10), 350);
  EXPECT_EQ(norm180(190), -170);
  EXPECT_EQ(norm180(-180), 180);
}
