// Unit tests of src/core/stats: Fisher (1953) mean of axial data and the
// orientation tensor (fabric, mean plane, fold axis). Every check value names
// its source beside it. Random data come from a seeded splitmix64 of our own
// (std:: distributions differ between platforms).
#include "stats.hpp"
#include "test_rng.hpp"

#include <gtest/gtest.h>

#include <cmath>
#include <cstring>
#include <vector>

using namespace striae;

namespace {

using striae_test::Rng;

// Lower-hemisphere canonical line vector of any vector, as the SQL layer would pass it.
Vec3 as_line(const Vec3 &v) { return line_vector(vector_line(v)); }

Vec3 L(double trend, double plunge) { return line_vector(make_line(trend, plunge)); }

// Axial angle (degrees) between two lines.
double ang(const Line &a, const Line &b) { return angle(a, b); }

FisherState fisher_of(const std::vector<Vec3> &data) {
  FisherState s;
  fisher_init(s);
  for (const Vec3 &x : data) fisher_add(s, x);
  return s;
}

TensorState tensor_of(const std::vector<Vec3> &data) {
  TensorState s;
  tensor_init(s);
  for (const Vec3 &x : data) tensor_add(s, x);
  return s;
}

// N data evenly spaced on a cone of half-angle half_deg around axis a: their
// resultant is N cos(half) along a (the perpendicular parts cancel; derived).
std::vector<Vec3> cone(const Vec3 &a, double half_deg, int n) {
  std::vector<Vec3> out;
  const Vec3 u = a.unitOrthogonal(), w = a.cross(u);
  for (int i = 0; i < n; ++i) {
    const double ph = 2 * kPi * i / n;
    out.push_back(as_line(std::cos(rad(half_deg)) * a +
                          std::sin(rad(half_deg)) * (std::cos(ph) * u + std::sin(ph) * w)));
  }
  return out;
}

// Fisher (1953) alpha95 from N and R by the exact formula (test-side copy, p = 0.05).
double alpha95_of(double n, double r) {
  const double c = 1 - ((n - r) / r) * (std::pow(20.0, 1.0 / (n - 1)) - 1);
  return deg(std::acos(c));
}

}  // namespace

// ---------------------------------------------------------------------------
// Layout
// ---------------------------------------------------------------------------

TEST(StatsState, PlainStructsForPallocMemory) {
  // DESIGN/STYLE: aggregate states in palloc memory: trivially copyable and
  // destructible, 8-byte alignment at most (static_asserts hold; sizes pinned
  // so a layout change is noticed by the SQL serialisation).
  EXPECT_EQ(sizeof(TensorState), 8u + 6 * 16 + 8 + 6 * 8);  // n, sums, pending, block
  EXPECT_EQ(sizeof(FisherState), sizeof(TensorState) + 13 * 3 * 16 + 64 * 3 * 8);  // + aligned, cells
  EXPECT_LE(alignof(FisherState), 8u);
  // One datum, folded by a combine into an empty state, is A_k = sign(x . r_k) x
  // for every reference axis (the per-row definition in stats.hpp).
  {
    FisherState one, acc;
    fisher_init(one);
    fisher_init(acc);
    const Vec3 x = Vec3(0.3, -0.5, 0.8).normalized();
    fisher_add(one, x);
    fisher_combine(acc, one);
    for (int k = 0; k < kFisherRefAxes; ++k) {
      const double sg = fisher_reference_axis(k).dot(x) < 0 ? -1.0 : 1.0;
      for (int c = 0; c < 3; ++c) EXPECT_EQ(comp_value(acc.aligned[k][c]), sg * x(c)) << k;
    }
  }
}

TEST(FisherCells, EveryDatumInACellHasTheCellsSigns) {
  // The cell shortcut of fisher_add (stats.hpp) is exact when each datum's own
  // sign against each reference axis (once given the canonical sign) is its
  // cell's sign; only data within
  // rounding of a plane (|x . r_k| ~ 1e-16) may differ. 2 million random unit
  // vectors, plus points near every plane and on the planes' intersections.
  Rng g(77);
  std::vector<int> hits(kFisherCells, 0);
  int64_t mismatched = 0, near_plane = 0;
  auto check = [&](const Vec3 &x0) {
    const Vec3 x = fisher_canonical(x0);
    ASSERT_TRUE(x == x0 || x == -x0);
    ASSERT_TRUE(x(2) > 0 || (x(2) == 0 && (x(1) > 0 || (x(1) == 0 && x(0) > 0))));
    const int c = fisher_cell(x);
    ASSERT_GE(c, 0);
    ASSERT_LT(c, kFisherCells);
    ++hits[c];
    for (int k = 0; k < kFisherRefAxes; ++k) {
      const double d = fisher_reference_axis(k).dot(x);
      if (std::fabs(d) < 1e-14) {
        ++near_plane;
        continue;
      }
      if ((d < 0 ? -1.0 : 1.0) != fisher_cell_sign(c, k)) ++mismatched;
    }
  };
  for (int i = 0; i < 2000000; ++i) check(g.unit());
  for (int i = 0; i < 200000; ++i) {
    // Near plane k: the datum minus most of its component along r_k.
    const Vec3 r = fisher_reference_axis(i % kFisherRefAxes);
    const Vec3 u = g.unit();
    const Vec3 x = (u - (1.0 - 1e-9 * g.uniform()) * u.dot(r) * r).normalized();
    check(x);
  }
  EXPECT_EQ(mismatched, 0);
  EXPECT_GT(near_plane, 0);  // the boundary points were reached
  // The 48 cells are all reached; the 16 slots of impossible comparison
  // patterns (stats.hpp) never are.
  for (int c = 0; c < kFisherCells; ++c) {
    const bool possible = detail::kFisherOrderOfBits[(c % 16) / 2] >= 0;
    if (possible) EXPECT_GT(hits[c], 0) << "cell " << c << " never reached";
    else EXPECT_EQ(hits[c], 0) << "impossible slot " << c << " reached";
  }
  EXPECT_THROW(fisher_cell_sign(64, 0), Error);
  EXPECT_THROW(fisher_cell_sign(0, 13), Error);
}

TEST(StatsState, MemcpyRoundTripMidStream) {
  // A state copied byte for byte (as serialize/deserialize do) continues identically.
  Rng g(1);
  FisherState a;
  fisher_init(a);
  for (int i = 0; i < 50; ++i) fisher_add(a, g.unit());
  FisherState b;
  std::memcpy(&b, &a, sizeof a);
  for (int i = 0; i < 50; ++i) {
    const Vec3 x = g.unit();
    fisher_add(a, x);
    fisher_add(b, x);
  }
  EXPECT_EQ(0, std::memcmp(&a, &b, sizeof a));
}

// ---------------------------------------------------------------------------
// Fisher mean: small cases
// ---------------------------------------------------------------------------

TEST(FisherAxial, EmptyGroupHasNoMean) {
  // Documented rule (stats.hpp): n = 0 -> every field undefined, R = 0.
  FisherState s;
  fisher_init(s);
  const FisherResult r = fisher_result(s);
  EXPECT_EQ(r.n, 0);
  EXPECT_FALSE(r.mean_valid);
  EXPECT_FALSE(r.kappa_valid);
  EXPECT_FALSE(r.alpha95_valid);
  EXPECT_FALSE(r.angular_sd_valid);
  EXPECT_EQ(r.resultant, 0.0);
}

TEST(FisherAxial, SingleDatum) {
  // N = 1: the mean is the datum, R = 1; kappa, alpha95, sd undefined (N < 2).
  const FisherResult r = fisher_result(fisher_of({L(123, 45)}));
  ASSERT_TRUE(r.mean_valid);
  EXPECT_DOUBLE_EQ(r.mean.trend, 123.0);
  EXPECT_DOUBLE_EQ(r.mean.plunge, 45.0);
  EXPECT_NEAR(r.resultant, 1.0, 1e-15);
  EXPECT_FALSE(r.kappa_valid);
  EXPECT_FALSE(r.alpha95_valid);
  EXPECT_FALSE(r.angular_sd_valid);
}

TEST(FisherAxial, TwoLinesStraddlingHorizontal) {
  // 000/05 and 180/05 are axes 10 degrees apart across the horizontal; the
  // axial mean is 000/00 and R = 2 cos 5 (derived: aligned sum (2 cos5, 0, 0)).
  // Lower-hemisphere vectors alone would sum to the vertical: the failure
  // METHODS.md section 3 warns about.
  const FisherResult r = fisher_result(fisher_of({L(0, 5), L(180, 5)}));
  ASSERT_TRUE(r.mean_valid);
  EXPECT_LT(ang(r.mean, make_line(0, 0)), 1e-9);
  const double R = 2 * std::cos(rad(5));
  EXPECT_NEAR(r.resultant, R, 1e-14);
  // kappa = (N-1)/(N-R) (Fisher 1953).
  ASSERT_TRUE(r.kappa_valid);
  EXPECT_NEAR(r.kappa, 1 / (2 - R), 1e-9 * r.kappa);
  // alpha95 by the exact formula of Fisher (1953): cos a = 1 - 19 (2-R)/R for N = 2.
  ASSERT_TRUE(r.alpha95_valid);
  EXPECT_NEAR(r.alpha95, deg(std::acos(1 - 19 * (2 - R) / R)), 1e-9);
  // angular sd = 81/sqrt(kappa) [METHODS.md, from memory].
  ASSERT_TRUE(r.angular_sd_valid);
  EXPECT_NEAR(r.angular_sd, 81 / std::sqrt(1 / (2 - R)), 1e-9);
}

TEST(FisherAxial, TwoLinesStraddlingHorizontalOtherAzimuths) {
  // Same construction at trends 072/252 and 145/325 (derived: mean is the
  // horizontal bisector, R = 2 cos(half-angle)).
  for (double t : {72.0, 145.0, 17.5}) {
    for (double p : {1.0, 5.0, 20.0}) {
      const FisherResult r = fisher_result(fisher_of({L(t, p), L(t + 180, p)}));
      ASSERT_TRUE(r.mean_valid);
      EXPECT_LT(ang(r.mean, make_line(t, 0)), 1e-9) << t << " " << p;
      EXPECT_NEAR(r.resultant, 2 * std::cos(rad(p)), 1e-13);
    }
  }
}

TEST(FisherAxial, ClusterStraddlingHorizontalMatchesCentreAlignedSum) {
  // Axes scattered up to 8 degrees around 045/00 (half of them point upward and
  // are flipped to the lower hemisphere, trend near 225). Reference: sum of the
  // data each signed to agree with the known centre (METHODS.md section 3: align
  // before summing; all data are within 8 degrees, so any alignment axis that
  // near gives the same signs).
  Rng g(7);
  const Vec3 c = L(45, 0);
  std::vector<Vec3> data;
  Vec3 ref = Vec3::Zero();
  for (int i = 0; i < 200; ++i) {
    const Vec3 x = as_line(g.in_cone(c, 8));
    data.push_back(x);
    ref += x.dot(c) < 0 ? -x : x;
  }
  const FisherResult r = fisher_result(fisher_of(data));
  ASSERT_TRUE(r.mean_valid);
  EXPECT_LT(ang(r.mean, vector_line(ref)), 1e-9);
  EXPECT_NEAR(r.resultant, ref.norm(), 1e-11);
  EXPECT_LT(ang(r.mean, make_line(45, 0)), 2.0);  // near the centre (sampling)
}

TEST(FisherAxial, IdenticalData) {
  // Identical data: R = N, kappa and angular sd infinite (undefined), alpha95 = 0
  // (documented rule; Fisher 1953 formula gives cos a = 1).
  std::vector<Vec3> d(7, L(210, 33));
  const FisherResult r = fisher_result(fisher_of(d));
  ASSERT_TRUE(r.mean_valid);
  EXPECT_LT(ang(r.mean, make_line(210, 33)), 1e-9);
  EXPECT_LE(r.resultant, 7.0);
  EXPECT_NEAR(r.resultant, 7.0, 1e-12);
  EXPECT_FALSE(r.kappa_valid);
  EXPECT_FALSE(r.angular_sd_valid);
  ASSERT_TRUE(r.alpha95_valid);
  EXPECT_EQ(r.alpha95, 0.0);
}

TEST(FisherAxial, IdenticalHorizontalGivenWithBothSigns) {
  // The same horizontal axis given as +v and -v is identical data (axial).
  const Vec3 v = L(100, 0);
  const FisherResult r = fisher_result(fisher_of({v, -v, v, -v}));
  ASSERT_TRUE(r.mean_valid);
  EXPECT_LT(ang(r.mean, make_line(100, 0)), 1e-9);
  EXPECT_NEAR(r.resultant, 4.0, 1e-12);
  EXPECT_FALSE(r.kappa_valid);
  EXPECT_EQ(r.alpha95, 0.0);
}

TEST(FisherAxial, ConeOfKnownResultant) {
  // N data evenly on a cone of half-angle h: R = N cos h (derived), so
  // kappa = (N-1)/(N(1 - cos h)), alpha95 from the exact formula (Fisher 1953).
  struct Case {
    double trend, plunge, half;
    int n;
  };
  for (const Case &k : {Case{300, 20, 10, 8}, Case{90, 0, 15, 12}, Case{0, 90, 4, 5},
                        Case{33, 3, 25, 36}, Case{250, 60, 1, 3}}) {
    const auto data = cone(L(k.trend, k.plunge), k.half, k.n);
    const FisherResult r = fisher_result(fisher_of(data));
    const double R = k.n * std::cos(rad(k.half));
    ASSERT_TRUE(r.mean_valid);
    // Data pass through Line (angles rounded to 1e-10 degree by vector_line),
    // so the constructed R holds to about N * 2e-12.
    EXPECT_LT(ang(r.mean, make_line(k.trend, k.plunge)), 1e-8);
    EXPECT_NEAR(r.resultant, R, 1e-10);
    ASSERT_TRUE(r.kappa_valid);
    EXPECT_NEAR(r.kappa, (k.n - 1) / (k.n - R), 1e-9 * r.kappa);
    ASSERT_TRUE(r.alpha95_valid);
    EXPECT_NEAR(r.alpha95, alpha95_of(k.n, R), 1e-8);
    EXPECT_NEAR(r.angular_sd, 81 / std::sqrt(r.kappa), 1e-12);  // [from memory]
  }
}

TEST(FisherAxial, TightClusterIsNotIdentical) {
  // Data 0.002 degree around their mean are not identical: N - R = N (1 - cos h)
  // is 6e-10 N (derived, as in ConeOfKnownResultant), far above the rounding of
  // unit vectors, so kappa = (N-1)/(N-R) (Fisher 1953) is finite and defined;
  // only R within 1e-15 N of N counts as identical data (stats.cpp).
  const auto data = cone(L(120, 40), 0.002, 8);
  const FisherResult r = fisher_result(fisher_of(data));
  const double R = 8 * std::cos(rad(0.002));
  ASSERT_TRUE(r.kappa_valid);
  EXPECT_NEAR(r.kappa, 7 / (8 - R), 1e-4 * r.kappa);
  ASSERT_TRUE(r.alpha95_valid);
  EXPECT_NEAR(r.alpha95, alpha95_of(8, R), 1e-4 * r.alpha95);
}

TEST(FisherAxial, Alpha95UndefinedWhenTooScattered) {
  // 000/00 and 000/80: R = 2 cos 40 = 1.532; cos a = 1 - 19 (2-R)/R = -4.8 < -1,
  // so the exact formula has no solution (Fisher 1953; documented rule).
  const FisherResult r = fisher_result(fisher_of({L(0, 0), L(0, 80)}));
  EXPECT_NEAR(r.resultant, 2 * std::cos(rad(40)), 1e-14);
  EXPECT_LT(ang(r.mean, make_line(0, 40)), 1e-9);
  ASSERT_TRUE(r.kappa_valid);
  EXPECT_NEAR(r.kappa, 1 / (2 - 2 * std::cos(rad(40))), 1e-12);
  EXPECT_FALSE(r.alpha95_valid);
}

TEST(FisherAxial, Alpha95NearItsLargeSampleApproximation) {
  // For large N, alpha95 ~ 140/sqrt(kappa N) [METHODS.md, from memory]; a 400-datum
  // cone of half-angle 10 degrees must agree within 3 %.
  const auto data = cone(L(150, 40), 10, 400);
  const FisherResult r = fisher_result(fisher_of(data));
  ASSERT_TRUE(r.alpha95_valid);
  EXPECT_NEAR(r.alpha95, 140 / std::sqrt(r.kappa * 400), 0.03 * r.alpha95);
}

TEST(FisherAxial, SignOfInputIgnored) {
  // Axial data: adding -x is adding x (state bit-identical unless x.r_k = 0 for
  // some reference axis, which random data never hit).
  Rng g(3);
  FisherState a, b;
  fisher_init(a);
  fisher_init(b);
  for (int i = 0; i < 100; ++i) {
    const Vec3 x = g.unit();
    fisher_add(a, x);
    fisher_add(b, -x);
  }
  EXPECT_EQ(0, std::memcmp(&a, &b, sizeof a));
}

TEST(FisherAxial, NonUnitInputIsNormalised) {
  // A datum is a direction: its length does not matter.
  const FisherResult r1 = fisher_result(fisher_of({L(10, 20), L(20, 30)}));
  const FisherResult r2 = fisher_result(fisher_of({3.0 * L(10, 20), 0.25 * L(20, 30)}));
  EXPECT_NEAR(r1.resultant, r2.resultant, 1e-15);
  EXPECT_LT(ang(r1.mean, r2.mean), 1e-9);
}

TEST(FisherAxial, RejectsZeroAndNonFiniteData) {
  FisherState s;
  fisher_init(s);
  try {
    fisher_add(s, Vec3::Zero());
    FAIL() << "zero vector accepted";
  } catch (const Error &e) {
    EXPECT_EQ(e.kind, ErrorKind::DataError);
  }
  EXPECT_THROW(fisher_add(s, Vec3(NAN, 0, 1)), Error);
  EXPECT_THROW(fisher_add(s, Vec3(INFINITY, 0, 1)), Error);
  EXPECT_EQ(s.tensor.n, 0);  // nothing was added
}

// ---------------------------------------------------------------------------
// Fisher mean: the reference-axis alignment
// ---------------------------------------------------------------------------

TEST(FisherReference, AxesAreUnitAndDistinct) {
  // 13 axes of the cube (3 + 6 + 4), unit, pairwise non-parallel.
  for (int k = 0; k < kFisherRefAxes; ++k) {
    EXPECT_NEAR(fisher_reference_axis(k).norm(), 1.0, 1e-16);
    for (int j = 0; j < k; ++j)
      EXPECT_GT(axial_angle(fisher_reference_axis(j), fisher_reference_axis(k)), 30.0);
  }
  EXPECT_THROW(fisher_reference_axis(13), Error);
  EXPECT_THROW(fisher_reference_axis(-1), Error);
}

TEST(FisherReference, WorstCaseAngleOfThe13Axes) {
  // Derived: the point equidistant from (1,0,0), (1,1,0)/sqrt2, (1,1,1)/sqrt3 is
  // (1, sqrt2-1, sqrt3-sqrt2)/norm with cos = 1/sqrt(9 - 2 sqrt2 - 2 sqrt6).
  const double c = 1 / std::sqrt(9 - 2 * std::sqrt(2.0) - 2 * std::sqrt(6.0));
  EXPECT_NEAR(deg(std::acos(c)), kFisherWorstRefAngleDeg, 1e-12);
  const Vec3 p = Vec3(1, std::sqrt(2.0) - 1, std::sqrt(3.0) - std::sqrt(2.0)).normalized();
  double best = 90;
  for (int k = 0; k < kFisherRefAxes; ++k)
    best = std::min(best, axial_angle(p, fisher_reference_axis(k)));
  EXPECT_NEAR(best, kFisherWorstRefAngleDeg, 1e-9);
  // Dense search over the sphere (0.25 degree steps and 2e5 random directions):
  // no direction is farther from its nearest axis.
  Rng g(11);
  double worst = 0;
  auto probe = [&](const Vec3 &v) {
    double m = 90;
    for (int k = 0; k < kFisherRefAxes; ++k) m = std::min(m, axial_angle(v, fisher_reference_axis(k)));
    worst = std::max(worst, m);
  };
  for (double th = 0; th <= 90; th += 0.25)
    for (double ph = 0; ph < 360; ph += 0.25) probe(L(ph, th));
  for (int i = 0; i < 200000; ++i) probe(g.unit());
  EXPECT_LE(worst, kFisherWorstRefAngleDeg + 1e-9);
  EXPECT_GT(worst, kFisherWorstRefAngleDeg - 0.05);
}

TEST(FisherReference, ExactAgainstE1AlignedSumWithinBound) {
  // METHODS.md section 3 defines the resultant as the sum of data aligned with
  // e1; stats.hpp claims equality whenever all data lie within 90 - angle(r_k,
  // e1) of e1. Random cluster axes, cones up to 45 degrees: compare.
  Rng g(5);
  for (int trial = 0; trial < 60; ++trial) {
    const Vec3 c = g.unit();
    const double half = 5 + 40 * g.uniform();
    std::vector<Vec3> data;
    for (int i = 0; i < 80; ++i) data.push_back(as_line(g.in_cone(c, half)));
    const FisherState s = fisher_of(data);
    const FisherResult r = fisher_result(s);
    // e1 of the same tensor (the definition used by METHODS.md).
    double m[6], lam[3];
    Vec3 ev[3];
    for (int i = 0; i < 6; ++i) m[i] = (comp_value(s.tensor.t[i]) + s.tensor.block[i]) / 80;
    principal_axes(m, lam, ev);
    Vec3 ref = Vec3::Zero();
    double maxang = 0;
    for (const Vec3 &x : data) {
      ref += x.dot(ev[0]) < 0 ? -x : x;
      maxang = std::max(maxang, axial_angle(x, ev[0]));
    }
    ASSERT_LT(maxang, r.exact_within_deg);  // the bound applies
    EXPECT_GE(r.exact_within_deg, 90 - kFisherWorstRefAngleDeg - 1e-9);
    EXPECT_NEAR(r.resultant, ref.norm(), 1e-11);
    EXPECT_LT(ang(r.mean, vector_line(ref)), 1e-9);
  }
}

// ---------------------------------------------------------------------------
// Fisher mean: combine and validation
// ---------------------------------------------------------------------------

namespace {
// Compare two Fisher results field by field to relative tolerance tol.
void expect_same(const FisherResult &a, const FisherResult &b, double tol) {
  EXPECT_EQ(a.n, b.n);
  EXPECT_EQ(a.mean_valid, b.mean_valid);
  EXPECT_LT(ang(a.mean, b.mean), 1e-9);
  EXPECT_NEAR(a.resultant, b.resultant, tol * a.resultant);
  EXPECT_EQ(a.kappa_valid, b.kappa_valid);
  EXPECT_NEAR(a.kappa, b.kappa, tol * a.kappa);
  EXPECT_EQ(a.alpha95_valid, b.alpha95_valid);
  EXPECT_NEAR(a.alpha95, b.alpha95, tol * std::max(1.0, a.alpha95));
  EXPECT_NEAR(a.angular_sd, b.angular_sd, tol * std::max(1.0, a.angular_sd));
  EXPECT_EQ(a.reference_axis, b.reference_axis);
}
}  // namespace

TEST(FisherCombine, SplitHalvesEqualSerial) {
  // DESIGN.md: serial and parallel runs agree (1e-9 asked; 1e-12 checked here).
  Rng g(21);
  const Vec3 c = L(80, 10);
  std::vector<Vec3> data;
  for (int i = 0; i < 5000; ++i) data.push_back(as_line(g.in_cone(c, 3)));
  const FisherState serial = fisher_of(data);
  FisherState a = fisher_of({data.begin(), data.begin() + 2345});
  FisherState b = fisher_of({data.begin() + 2345, data.end()});
  FisherState ab = a, ba = b;
  fisher_combine(ab, b);
  fisher_combine(ba, a);
  expect_same(fisher_result(serial), fisher_result(ab), 1e-12);
  expect_same(fisher_result(serial), fisher_result(ba), 1e-12);
}

TEST(FisherCombine, ManyChunksTreeAndEmptyStates) {
  // Combining 17 uneven chunks pairwise (a tree, as parallel workers and
  // partitions do), with empty states mixed in, equals the serial run.
  Rng g(22);
  std::vector<Vec3> data;
  for (int i = 0; i < 3000; ++i) data.push_back(as_line(g.in_cone(L(200, 70), 20)));
  std::vector<FisherState> parts;
  size_t pos = 0;
  for (int k = 0; k < 17; ++k) {
    const size_t len = k == 16 ? data.size() - pos : (k * 37) % 300;
    parts.push_back(fisher_of({data.begin() + pos, data.begin() + pos + len}));
    pos += len;
    FisherState e;
    fisher_init(e);
    parts.push_back(e);
  }
  while (parts.size() > 1) {
    std::vector<FisherState> next;
    for (size_t i = 0; i + 1 < parts.size(); i += 2) {
      FisherState s = parts[i];
      fisher_combine(s, parts[i + 1]);
      next.push_back(s);
    }
    if (parts.size() % 2) next.push_back(parts.back());
    parts = next;
  }
  expect_same(fisher_result(fisher_of(data)), fisher_result(parts[0]), 1e-12);
}

TEST(FisherCombine, TightLargeClusterKappaStable) {
  // N - R is a small difference of large numbers; the compensated sums keep
  // kappa of a 200000-datum cluster identical (1e-12) between 1 and 8 chunks.
  Rng g(23);
  std::vector<Vec3> data;
  for (int i = 0; i < 200000; ++i) data.push_back(as_line(g.in_cone(L(10, 2), 0.5)));
  const FisherResult serial = fisher_result(fisher_of(data));
  FisherState acc;
  fisher_init(acc);
  for (int k = 0; k < 8; ++k) {
    FisherState p = fisher_of({data.begin() + k * 25000, data.begin() + (k + 1) * 25000});
    fisher_combine(acc, p);
  }
  expect_same(serial, fisher_result(acc), 1e-12);
}

TEST(FisherValidate, AcceptsRealStates) {
  Rng g(31);
  FisherState s;
  fisher_init(s);
  EXPECT_NO_THROW(fisher_validate(s));
  for (int i = 0; i < 1000; ++i) fisher_add(s, g.unit());
  EXPECT_NO_THROW(fisher_validate(s));
  std::vector<Vec3> same(1000, L(5, 5));
  EXPECT_NO_THROW(fisher_validate(fisher_of(same)));
}

TEST(FisherValidate, RejectsMalformedStates) {
  // Each corruption is one a user calling the support functions directly
  // could hand in; all must be BadState (documented in stats.hpp).
  Rng g(32);
  // 20 rows moved into the compensated sums by a combine (a combine folds the
  // other state's block), so the corruptions below hit the data.
  FisherState good, part;
  fisher_init(good);
  fisher_init(part);
  for (int i = 0; i < 20; ++i) fisher_add(part, g.unit());
  fisher_combine(good, part);
  ASSERT_EQ(good.tensor.pending, 0);
  auto expect_bad = [](const FisherState &s, const char *what) {
    try {
      fisher_validate(s);
      ADD_FAILURE() << "accepted: " << what;
    } catch (const Error &e) {
      EXPECT_EQ(e.kind, ErrorKind::BadState) << what;
    }
    EXPECT_THROW(fisher_result(s), Error) << what;
  };
  FisherState s = good;
  s.tensor.n = -1;
  expect_bad(s, "negative count");
  s = good;
  s.tensor.t[kXY].hi = NAN;
  expect_bad(s, "NaN tensor sum");
  s = good;
  s.aligned[4][1].lo = INFINITY;
  expect_bad(s, "infinite aligned sum");
  s = good;
  s.tensor.n = 40;
  expect_bad(s, "count does not match trace");
  s = good;
  s.tensor.t[kXX].hi = -3;
  expect_bad(s, "negative sum of squares");
  s = good;
  s.tensor.t[kXY].hi = 19;
  expect_bad(s, "off-diagonal sum too large");
  s = good;
  s.aligned[0][0].hi = 25;
  expect_bad(s, "aligned resultant longer than n");
  s = good;
  for (int c = 0; c < 3; ++c) s.aligned[9][c].hi = -s.aligned[9][c].hi;
  expect_bad(s, "aligned resultant pointing away from its axis");
  s = part;  // rows still in the block
  s.cells[37][1] = NAN;
  expect_bad(s, "NaN cell sum");
  s = part;
  s.cells[5][0] += 25;
  expect_bad(s, "cell sums longer than the pending rows");
  s = part;
  s.tensor.pending = kBlockRows;
  expect_bad(s, "pending rows out of range");
  s = part;
  s.tensor.pending = 21;
  expect_bad(s, "more pending rows than rows");
  s = part;
  for (auto &cell : s.cells)
    for (double &v : cell) v = -v;
  expect_bad(s, "cell sums pointing away from their axes");
  FisherState e;
  fisher_init(e);
  e.aligned[2][2].hi = 1;
  expect_bad(e, "empty state with a non-zero sum");
  e = FisherState{};
  e.tensor.n = int64_t(1) << 60;
  expect_bad(e, "absurd count");
}

// ---------------------------------------------------------------------------
// Orientation tensor
// ---------------------------------------------------------------------------

TEST(Fabric, EmptyGroup) {
  // n = 0: every flag false (the SQL final function returns NULL).
  TensorState s;
  tensor_init(s);
  const FabricResult r = tensor_result(s);
  EXPECT_FALSE(r.axes_valid);
  EXPECT_FALSE(r.mean_plane_valid);
  EXPECT_FALSE(r.fold_axis_valid);
  EXPECT_FALSE(r.woodcock_k_valid);
  EXPECT_FALSE(r.woodcock_c_valid);
}

TEST(Fabric, EigenvaluesMatchTheTensorInvariants) {
  // T = (1/N) sum x x^T has trace 1 (METHODS.md section 4), and Vollmer's
  // P + G + R = s1 + s2 + s3 = 1 (derived from Vollmer 1990). The eigenvalues are
  // checked against the other two invariants of T, built here from the data:
  // s1 s2 + s1 s3 + s2 s3 = sum of the principal 2x2 minors and s1 s2 s3 =
  // det T (characteristic polynomial, textbook linear algebra), with T's own
  // eigenvalues in descending order.
  Rng g(41);
  for (int trial = 0; trial < 50; ++trial) {
    std::vector<Vec3> data;
    const Vec3 c = g.unit();
    const int n = 2 + trial * 7;
    for (int i = 0; i < n; ++i) data.push_back(trial % 2 ? g.unit() : g.in_cone(c, 30));
    const FabricResult r = tensor_result(tensor_of(data));
    ASSERT_TRUE(r.axes_valid);
    Mat3 t = Mat3::Zero();
    for (const Vec3 &x : data) t += x.normalized() * x.normalized().transpose() / static_cast<double>(n);
    const double minors = t(0, 0) * t(1, 1) - t(0, 1) * t(0, 1) + t(0, 0) * t(2, 2) - t(0, 2) * t(0, 2) +
                          t(1, 1) * t(2, 2) - t(1, 2) * t(1, 2);
    EXPECT_NEAR(r.s1 * r.s2 + r.s1 * r.s3 + r.s2 * r.s3, minors, 1e-14) << trial;
    EXPECT_NEAR(r.s1 * r.s2 * r.s3, t.determinant(), 1e-14) << trial;
    // Descending: s1 is the largest root, so T - s1 I has no positive direction.
    EXPECT_NEAR(r.s1, t.selfadjointView<Eigen::Lower>().eigenvalues().maxCoeff(), 1e-14) << trial;
    EXPECT_NEAR(r.s3, t.selfadjointView<Eigen::Lower>().eigenvalues().minCoeff(), 1e-14) << trial;
    EXPECT_NEAR(r.s1 + r.s2 + r.s3, 1.0, 1e-15);
    EXPECT_NEAR(r.point + r.girdle + r.random, 1.0, 1e-15);
    // Eigenvectors are mutually perpendicular.
    EXPECT_NEAR(ang(r.e1, r.e2), 90.0, 1e-8);
    EXPECT_NEAR(ang(r.e1, r.e3), 90.0, 1e-8);
    EXPECT_NEAR(ang(r.e2, r.e3), 90.0, 1e-8);
  }
}

TEST(Fabric, WoodcockAndVollmerOfAKnownTensor) {
  // Three data along N, two along E, one down: T = diag(1/2, 1/3, 1/6) (derived).
  // Woodcock (1977) [from memory]: K = ln(1.5)/ln(2), C = ln(3).
  // Vollmer (1990) [from memory]: P = 1/6, G = 1/3, R = 1/2.
  const Vec3 n(1, 0, 0), e(0, 1, 0), d(0, 0, 1);
  const FabricResult r = tensor_result(tensor_of({n, n, n, e, e, d}));
  EXPECT_NEAR(r.s1, 0.5, 1e-15);
  EXPECT_NEAR(r.s2, 1.0 / 3, 1e-15);
  EXPECT_NEAR(r.s3, 1.0 / 6, 1e-15);
  ASSERT_TRUE(r.woodcock_k_valid);
  ASSERT_TRUE(r.woodcock_c_valid);
  EXPECT_NEAR(r.woodcock_k, std::log(1.5) / std::log(2.0), 1e-14);
  EXPECT_NEAR(r.woodcock_c, std::log(3.0), 1e-14);
  EXPECT_NEAR(r.point, 1.0 / 6, 1e-15);
  EXPECT_NEAR(r.girdle, 1.0 / 3, 1e-15);
  EXPECT_NEAR(r.random, 0.5, 1e-15);
  EXPECT_LT(ang(r.e1, make_line(0, 0)), 1e-9);
  EXPECT_LT(ang(r.e2, make_line(90, 0)), 1e-9);
  EXPECT_LT(ang(r.e3, make_line(0, 90)), 1e-9);
  // Mean plane: pole 000/00 -> vertical plane striking 090 (plane_from_pole convention).
  ASSERT_TRUE(r.mean_plane_valid);
  EXPECT_LT(angle(r.mean_plane, make_plane(90, 90)), 1e-9);
  ASSERT_TRUE(r.fold_axis_valid);
  EXPECT_LT(ang(r.fold_axis, make_line(0, 90)), 1e-9);
}

TEST(Fabric, IdenticalData) {
  // s = (1, 0, 0) exactly after the 1e-15 snap (documented): P = 1; Woodcock
  // undefined (zero eigenvalue); mean plane defined; fold axis undefined
  // (s2 - s3 = 0: no unique girdle).
  std::vector<Vec3> data(9, L(75, 62));
  const FabricResult r = tensor_result(tensor_of(data));
  EXPECT_EQ(r.s1, 1.0);
  EXPECT_EQ(r.s2, 0.0);
  EXPECT_EQ(r.s3, 0.0);
  EXPECT_EQ(r.point, 1.0);
  EXPECT_FALSE(r.woodcock_k_valid);
  EXPECT_FALSE(r.woodcock_c_valid);
  ASSERT_TRUE(r.mean_plane_valid);
  EXPECT_LT(angle(r.mean_plane, plane_from_pole(make_line(75, 62))), 1e-9);
  EXPECT_FALSE(r.fold_axis_valid);
  EXPECT_LT(ang(r.e1, make_line(75, 62)), 1e-9);
}

TEST(Fabric, IsotropicTensor) {
  // One datum on each axis: s = 1/3 each; K = 0/0 undefined, C = ln 1 = 0;
  // P = G = 0, R = 1; no unique mean plane or fold axis (derived).
  const FabricResult r = tensor_result(tensor_of({Vec3(1, 0, 0), Vec3(0, 1, 0), Vec3(0, 0, 1)}));
  EXPECT_NEAR(r.s1, 1.0 / 3, 1e-15);
  EXPECT_NEAR(r.s3, 1.0 / 3, 1e-15);
  EXPECT_FALSE(r.woodcock_k_valid);
  ASSERT_TRUE(r.woodcock_c_valid);
  EXPECT_NEAR(r.woodcock_c, 0.0, 1e-14);
  EXPECT_NEAR(r.random, 1.0, 1e-14);
  EXPECT_FALSE(r.mean_plane_valid);
  EXPECT_FALSE(r.fold_axis_valid);
}

TEST(Fabric, PerfectGirdle) {
  // Poles 000/00 and 090/00: s = (1/2, 1/2, 0): G = 1; mean plane undefined
  // (s1 = s2); fold axis vertical (pole of the girdle); Woodcock undefined.
  const FabricResult r = tensor_result(tensor_of({L(0, 0), L(90, 0)}));
  EXPECT_NEAR(r.girdle, 1.0, 1e-15);
  EXPECT_EQ(r.s3, 0.0);
  EXPECT_FALSE(r.mean_plane_valid);
  EXPECT_FALSE(r.woodcock_c_valid);
  EXPECT_FALSE(r.woodcock_k_valid);
  ASSERT_TRUE(r.fold_axis_valid);
  EXPECT_LT(ang(r.fold_axis, make_line(0, 90)), 1e-9);
}

TEST(Fabric, SingleDatumHasNoFoldAxis) {
  // Documented: fold axis undefined for n < 2.
  const FabricResult r = tensor_result(tensor_of({L(10, 10)}));
  EXPECT_TRUE(r.axes_valid);
  EXPECT_TRUE(r.mean_plane_valid);
  EXPECT_FALSE(r.fold_axis_valid);
}

TEST(Fabric, FoldAxisOfTwoPlanesIsTheirIntersection) {
  // Two poles: e3 is perpendicular to both, i.e. the line common to both planes
  // (derived), which orientation.hpp's intersection() computes directly.
  const Plane a = make_plane(40, 30), b = make_plane(250, 70);
  const FabricResult r =
      tensor_result(tensor_of({line_vector(pole(a)), line_vector(pole(b))}));
  ASSERT_TRUE(r.fold_axis_valid);
  EXPECT_LT(ang(r.fold_axis, intersection(a, b)), 1e-8);
}

TEST(Fabric, CylindricalFoldAxisRecovered) {
  // Bedding of a cylindrical fold: every plane contains the fold axis, so every
  // pole is perpendicular to it and e3 of the poles is the axis (METHODS.md
  // section 4). Planes built two ways: normals perpendicular to the axis, and
  // plane_through(axis, another line).
  for (const Line axis : {make_line(30, 20), make_line(300, 5), make_line(125, 60), make_line(0, 0)}) {
    const Vec3 a = line_vector(axis), u = a.unitOrthogonal(), w = a.cross(u);
    std::vector<Vec3> poles;
    for (double phi = -70; phi <= 70; phi += 10) {  // a limb-to-limb spread of dips
      const Plane bed = normal_plane(std::cos(rad(phi)) * u + std::sin(rad(phi)) * w);
      poles.push_back(line_vector(pole(bed)));
    }
    for (double t : {0.0, 77.0, 160.0, 245.0}) {
      const Line other = make_line(t, 35);
      if (angle(other, axis) < 5) continue;
      poles.push_back(line_vector(pole(plane_through(axis, other))));
    }
    const FabricResult r = tensor_result(tensor_of(poles));
    ASSERT_TRUE(r.fold_axis_valid);
    // Planes are rounded to 1e-10 degree (snap_angle), so "exact" is 1e-8 degree.
    EXPECT_LT(ang(r.fold_axis, axis), 1e-8) << axis.trend << "/" << axis.plunge;
    EXPECT_LT(r.s3, 1e-15);
  }
}

TEST(Fabric, MeanPlaneOfPolesAroundAPlane) {
  // Poles on a cone around the pole of 120/30: e1 is that pole (derived by
  // symmetry), so the mean plane is 120/30.
  const Plane p = make_plane(120, 30);
  const auto poles = cone(line_vector(pole(p)), 12, 10);
  const FabricResult r = tensor_result(tensor_of(poles));
  ASSERT_TRUE(r.mean_plane_valid);
  EXPECT_LT(angle(r.mean_plane, p), 1e-9);
}

TEST(Fabric, DeterministicAndSignFixed) {
  // Same input -> bit-identical output; principal_axes puts the largest
  // component of each eigenvector positive (documented rule).
  Rng g(43);
  std::vector<Vec3> data;
  for (int i = 0; i < 300; ++i) data.push_back(g.unit());
  const FabricResult r1 = tensor_result(tensor_of(data));
  const FabricResult r2 = tensor_result(tensor_of(data));
  EXPECT_EQ(0, std::memcmp(&r1, &r2, sizeof r1));
  const double m[6] = {0.2, 0.5, 0.3, -0.1, 0.05, 0.12};
  double lam[3];
  Vec3 ev[3];
  principal_axes(m, lam, ev);
  EXPECT_GE(lam[0], lam[1]);
  EXPECT_GE(lam[1], lam[2]);
  Mat3 a;
  a << 0.2, -0.1, 0.05, -0.1, 0.5, 0.12, 0.05, 0.12, 0.3;
  for (int i = 0; i < 3; ++i) {
    int big = 0;
    for (int j = 1; j < 3; ++j)
      if (std::fabs(ev[i](j)) > std::fabs(ev[i](big))) big = j;
    EXPECT_GT(ev[i](big), 0.0);
    EXPECT_LT((a * ev[i] - lam[i] * ev[i]).norm(), 1e-14);  // eigen-equation
  }
  const double bad[6] = {NAN, 0, 0, 0, 0, 0};
  EXPECT_THROW(principal_axes(bad, lam, ev), Error);
}

TEST(FabricCombine, SplitHalvesEqualSerial) {
  // DESIGN.md: serial and parallel agree (1e-12 checked).
  Rng g(44);
  std::vector<Vec3> data;
  for (int i = 0; i < 4000; ++i) data.push_back(g.in_cone(L(330, 45), 40));
  TensorState a = tensor_of({data.begin(), data.begin() + 1111});
  const TensorState b = tensor_of({data.begin() + 1111, data.end()});
  tensor_combine(a, b);
  const FabricResult s = tensor_result(tensor_of(data)), p = tensor_result(a);
  EXPECT_EQ(s.n, p.n);
  EXPECT_NEAR(s.s1, p.s1, 1e-12);
  EXPECT_NEAR(s.s2, p.s2, 1e-12);
  EXPECT_NEAR(s.s3, p.s3, 1e-12);
  EXPECT_NEAR(s.woodcock_k, p.woodcock_k, 1e-12 * std::fabs(s.woodcock_k));
  EXPECT_LT(ang(s.e1, p.e1), 1e-9);
  EXPECT_LT(ang(s.fold_axis, p.fold_axis), 1e-9);
}

TEST(FabricValidate, RejectsMalformedStates) {
  Rng g(45);
  TensorState good;
  tensor_init(good);
  for (int i = 0; i < 10; ++i) tensor_add(good, g.unit());
  EXPECT_NO_THROW(tensor_validate(good));
  auto expect_bad = [](const TensorState &s, const char *what) {
    try {
      tensor_validate(s);
      ADD_FAILURE() << "accepted: " << what;
    } catch (const Error &e) {
      EXPECT_EQ(e.kind, ErrorKind::BadState) << what;
    }
  };
  TensorState s = good;
  s.n = -5;
  expect_bad(s, "negative count");
  s = good;
  s.t[kZZ].lo = NAN;
  expect_bad(s, "NaN");
  s = good;
  s.n = 11;
  expect_bad(s, "trace mismatch");
  s = good;
  s.t[kYZ].hi = 8;
  expect_bad(s, "off-diagonal too large");
  TensorState e;
  tensor_init(e);
  e.t[kXX].hi = 1e-300;
  expect_bad(e, "empty with sums");
  EXPECT_THROW(tensor_result(s), Error);
}
