// Unit tests of src/core/density: fine-bin mapping, sparse bin lists, the
// exponential-kernel density in multiples of uniform density, and
// grid_extreme. Every check value names its source beside it. Random data
// come from a seeded splitmix64 of our own.
#include "density.hpp"

#include "stats.hpp"
#include "test_rng.hpp"

#include <gtest/gtest.h>

#include <algorithm>
#include <cmath>
#include <cstring>
#include <map>
#include <vector>

using namespace striae;

namespace {

using striae_test::Rng;

Vec3 L(double trend, double plunge) { return line_vector(make_line(trend, plunge)); }

// Sparse bin list of a data set, built the way the aggregate will: bin, compact.
struct Bins {
  std::vector<uint32_t> ids;
  std::vector<uint64_t> counts;
};
Bins bins_of(const std::vector<Vec3> &data) {
  Bins b;
  for (const Vec3 &x : data) {
    b.ids.push_back(density_bin(x));
    b.counts.push_back(1);
  }
  const size_t m = compact_bins(b.ids.data(), b.counts.data(), b.ids.size());
  b.ids.resize(m);
  b.counts.resize(m);
  return b;
}

std::vector<double> density_of(const Bins &b, double spacing) {
  std::vector<double> v(grid_node_count(spacing));
  density_values(b.ids.data(), b.counts.data(), b.ids.size(), spacing, v.data());
  return v;
}

std::vector<double> exact_density(const std::vector<Vec3> &data, double spacing) {
  std::vector<double> v(grid_node_count(spacing));
  density_values_axes(data.data(), data.size(), spacing, v.data());
  return v;
}

// Brute force: every datum against every node, no cutoff, straight from the
// formula in density.hpp (Vollmer 1995 weights, MUD normalisation derived there).
std::vector<double> brute_density(const std::vector<Vec3> &data, const std::vector<double> &w,
                                  double spacing) {
  const auto g = grid_node_vectors(spacing);
  double n = 0;
  for (double x : w) n += x;
  const double f = 2 * (1 + n / 9);
  std::vector<double> v(g.size(), 0.0);
  for (size_t j = 0; j < g.size(); ++j) {
    double s = 0;
    for (size_t i = 0; i < data.size(); ++i)
      s += w[i] * std::exp(f * (std::fabs(g[j].dot(data[i].normalized())) - 1));
    v[j] = s * f / (n * (1 - std::exp(-f)));
  }
  return v;
}

// Area of the lower hemisphere represented by each node (ring bands between
// plunges q -+ s/2, shared equally by the ring's nodes; derived: the band
// areas 2 pi (sin b - sin a) sum to 2 pi).
std::vector<double> node_areas(double s) {
  const auto nodes = grid_nodes(s);
  std::map<double, int> ring;
  for (const Line &l : nodes) ring[l.plunge]++;
  std::vector<double> a;
  for (const Line &l : nodes) {
    const double q = l.plunge, h = s / 2;
    double band;
    if (q == 0) band = 2 * kPi * std::sin(rad(h));
    else if (q == 90) band = 2 * kPi * (1 - std::cos(rad(h)));
    else band = 2 * kPi * (std::sin(rad(q + h)) - std::sin(rad(q - h)));
    a.push_back(band / ring[q]);
  }
  return a;
}

// Area-weighted hemisphere integral of grid values.
double integral(const std::vector<double> &v, double s) {
  const auto a = node_areas(s);
  double t = 0;
  for (size_t j = 0; j < v.size(); ++j) t += a[j] * v[j];
  return t;
}

}  // namespace

// ---------------------------------------------------------------------------
// Bin layout and mapping
// ---------------------------------------------------------------------------

TEST(DensityBins, LayoutIsTheHalfDegreeGrid) {
  // density.hpp: bins are the nodes of grid_nodes(0.5), bit for bit.
  const auto g = grid_node_vectors(0.5);
  ASSERT_EQ(density_bin_count(), static_cast<uint32_t>(grid_node_count(0.5)));
  ASSERT_EQ(g.size(), density_bin_count());
  for (uint32_t b = 0; b < density_bin_count(); ++b) {
    const Vec3 c = density_bin_center(b);
    ASSERT_EQ(0, std::memcmp(c.data(), g[b].data(), sizeof(double) * 3)) << b;
  }
  EXPECT_THROW(density_bin_center(density_bin_count()), Error);
}

TEST(DensityBins, CenterRoundTripEveryBin) {
  // Each bin centre, and its antipode (same axis), maps back to its own bin.
  for (uint32_t b = 0; b < density_bin_count(); ++b) {
    const Vec3 c = density_bin_center(b);
    ASSERT_EQ(density_bin(c), b);
    ASSERT_EQ(density_bin(-c), b);
    ASSERT_EQ(density_bin(2.5 * c), b);
  }
}

TEST(DensityBins, RandomAxesMapToTheNearestBin) {
  // Brute-force nearest bin (largest |cos| over all bins) for random axes:
  // density_bin must find it (or an exact tie).
  Rng g(101);
  const auto centres = grid_node_vectors(0.5);
  for (int i = 0; i < 400; ++i) {
    const Vec3 x = g.unit();
    double best = -1;
    for (const Vec3 &c : centres) best = std::max(best, std::fabs(c.dot(x)));
    const double got = std::fabs(density_bin_center(density_bin(x)).dot(x));
    EXPECT_EQ(got, best) << i;
  }
}

TEST(DensityBins, OffsetBoundMeasured) {
  // density.hpp states kDensityMaxBinOffsetDeg as the largest datum-to-centre
  // angle: measured here over 10^6 random axes plus a dense sweep of the
  // polar cap (where ring sizes are rounded most) and of the horizontal ring.
  Rng g(102);
  double worst = 0;
  auto probe = [&](const Vec3 &x) {
    worst = std::max(worst, axial_angle(x, density_bin_center(density_bin(x))));
  };
  for (int i = 0; i < 1000000; ++i) probe(g.unit());
  for (double p = 87; p <= 90; p += 0.01)
    for (double t = 0; t < 360; t += 0.25) probe(L(t, p));
  for (double p = -1; p <= 1; p += 0.01)
    for (double t = 0; t < 360; t += 0.05) probe(line_vector(Line{t, p}));
  RecordProperty("max_bin_offset_deg", std::to_string(worst));
  std::printf("  measured max datum-to-bin-centre angle: %.4f degree\n", worst);
  EXPECT_LE(worst, kDensityMaxBinOffsetDeg);
  EXPECT_GT(worst, 0.34);  // the mid-latitude half-diagonal is 0.354 (derived)
}

TEST(DensityBins, HorizontalWrapAndVertical) {
  // The horizontal half-ring holds trends 0, 0.5, ..., 179.5 (grid.hpp); axes
  // near trend 180 are next to trend 0 (axial), the vertical is the last bin.
  const uint32_t last = density_bin_count() - 1;
  EXPECT_EQ(density_bin(L(179.9, 0)), 0u);
  EXPECT_EQ(density_bin(Vec3(-1, -1e-3, 0)), 0u);   // trend 180.06 seen upward too
  EXPECT_EQ(density_bin(L(359.9, 0)), 0u);
  EXPECT_EQ(density_bin(L(179.7, 0)), 359u);        // nearest is trend 179.5
  EXPECT_EQ(density_bin(L(0.3, 0)), 1u);
  EXPECT_EQ(density_bin(L(90, 0)), 180u);
  EXPECT_EQ(density_bin(L(180, 0.1)), 0u);          // 0.1 degree from 000/00's axis
  EXPECT_EQ(density_bin(line_vector(Line{0, -0.1})), 0u);
  EXPECT_EQ(density_bin(Vec3(0, 0, 1)), last);
  EXPECT_EQ(density_bin(Vec3(0, 0, -1)), last);
  EXPECT_EQ(density_bin(L(45, 89.9)), last);
  try {
    density_bin(Vec3::Zero());
    FAIL() << "zero vector accepted";
  } catch (const Error &e) {
    EXPECT_EQ(e.kind, ErrorKind::DataError);
  }
  EXPECT_THROW(density_bin(Vec3(NAN, 0, 1)), Error);
}

// ---------------------------------------------------------------------------
// Sparse lists
// ---------------------------------------------------------------------------

TEST(DensityLists, CompactSortsAndMerges) {
  // Reference: std::map of id -> total count.
  // Ids drawn from 700 scattered bins so that duplicates are frequent.
  Rng g(111);
  std::vector<uint32_t> ids;
  std::vector<uint64_t> counts;
  std::map<uint32_t, uint64_t> ref;
  for (int i = 0; i < 5000; ++i) {
    const uint32_t id = static_cast<uint32_t>(g.next() % 700) * 97 % density_bin_count();
    const uint64_t c = g.next() % 4;  // zeros included: they are dropped
    ids.push_back(id);
    counts.push_back(c);
    if (c) ref[id] += c;
  }
  const size_t m = compact_bins(ids.data(), counts.data(), ids.size());
  ASSERT_EQ(m, ref.size());
  size_t k = 0;
  for (const auto &e : ref) {
    EXPECT_EQ(ids[k], e.first);
    EXPECT_EQ(counts[k], e.second);
    ++k;
  }
  EXPECT_NO_THROW(validate_bins(ids.data(), counts.data(), m));
  EXPECT_EQ(compact_bins(nullptr, nullptr, 0), 0u);
  uint32_t one = 5;
  uint64_t c1 = 1;
  EXPECT_EQ(compact_bins(&one, &c1, 1), 1u);
}

TEST(DensityLists, CompactRejectsBadIdAndOverflow) {
  uint32_t ids[2] = {3, density_bin_count()};
  uint64_t c[2] = {1, 1};
  try {
    compact_bins(ids, c, 2);
    FAIL() << "out-of-range id accepted";
  } catch (const Error &e) {
    EXPECT_EQ(e.kind, ErrorKind::BadState);
  }
  uint32_t same[2] = {7, 7};
  uint64_t big[2] = {UINT64_MAX, 1};
  EXPECT_THROW(compact_bins(same, big, 2), Error);
}

TEST(DensityLists, MergeEqualsCompactOfConcatenation) {
  // Combine of two states equals the state of all data (integer counts: exact).
  Rng g(112);
  for (int trial = 0; trial < 20; ++trial) {
    std::vector<Vec3> a, b;
    const int na = static_cast<int>(g.next() % 300), nb = static_cast<int>(g.next() % 300);
    const Vec3 c = g.unit();
    for (int i = 0; i < na; ++i) a.push_back(g.in_cone(c, 10));
    for (int i = 0; i < nb; ++i) b.push_back(g.in_cone(c, 10));
    std::vector<Vec3> all = a;
    all.insert(all.end(), b.begin(), b.end());
    const Bins ba = bins_of(a), bb = bins_of(b), ref = bins_of(all);
    std::vector<uint32_t> oi(ba.ids.size() + bb.ids.size());
    std::vector<uint64_t> oc(oi.size());
    const size_t m = merge_bins(ba.ids.data(), ba.counts.data(), ba.ids.size(), bb.ids.data(),
                                bb.counts.data(), bb.ids.size(), oi.data(), oc.data());
    oi.resize(m);
    oc.resize(m);
    EXPECT_EQ(oi, ref.ids);
    EXPECT_EQ(oc, ref.counts);
    // Commutative.
    std::vector<uint32_t> oi2(oi.size() + 1);
    std::vector<uint64_t> oc2(oi2.size());
    const size_t m2 = merge_bins(bb.ids.data(), bb.counts.data(), bb.ids.size(), ba.ids.data(),
                                 ba.counts.data(), ba.ids.size(), oi2.data(), oc2.data());
    ASSERT_EQ(m2, m);
    EXPECT_TRUE(std::equal(oi.begin(), oi.end(), oi2.begin()));
    EXPECT_TRUE(std::equal(oc.begin(), oc.end(), oc2.begin()));
  }
}

TEST(DensityLists, ValidateRejectsMalformedLists) {
  // Documented in density.hpp: strictly increasing ids below the bin count,
  // counts > 0. All failures are BadState.
  auto expect_bad = [](std::vector<uint32_t> ids, std::vector<uint64_t> c, const char *what) {
    try {
      validate_bins(ids.data(), c.data(), ids.size());
      ADD_FAILURE() << "accepted: " << what;
    } catch (const Error &e) {
      EXPECT_EQ(e.kind, ErrorKind::BadState) << what;
    }
  };
  EXPECT_NO_THROW(validate_bins(nullptr, nullptr, 0));
  expect_bad({5, 3}, {1, 1}, "unsorted");
  expect_bad({5, 5}, {1, 1}, "duplicate");
  expect_bad({5, 6}, {1, 0}, "zero count");
  expect_bad({density_bin_count()}, {1}, "id out of range");
  expect_bad({1, 2}, {uint64_t(1) << 53, 1}, "total beyond 2^53");
  const double sp = 10;
  std::vector<double> out(grid_node_count(sp));
  uint32_t ids[2] = {9, 4};
  uint64_t c[2] = {1, 1};
  EXPECT_THROW(density_values(ids, c, 2, sp, out.data()), Error);
}

// ---------------------------------------------------------------------------
// Density values
// ---------------------------------------------------------------------------

TEST(DensityValues, KernelConstants) {
  // f = 2 (1 + N/k^2), k = 3 (Vollmer 1995, METHODS.md, from memory):
  // N = 9 -> f = 4; MUD factor f / (N (1 - e^-f)) (derived in density.hpp).
  EXPECT_DOUBLE_EQ(density_kernel_f(9), 4.0);
  EXPECT_DOUBLE_EQ(density_kernel_f(0), 2.0);
  EXPECT_NEAR(density_mud_factor(9), 4 / (9 * (1 - std::exp(-4.0))), 1e-15);
}

TEST(DensityValues, VerticalDataClosedForm) {
  // N vertical data: D at a node of plunge q is f exp(f (sin q - 1)) / (1 - e^-f)
  // (derived from the kernel and normalisation in density.hpp). N = 1 (kernel
  // over the whole sphere) and N = 2000 (narrow kernel, windowed path).
  for (uint64_t n : {uint64_t(1), uint64_t(2000), uint64_t(10000000)}) {
    const uint32_t id = density_bin_count() - 1;
    const double f = 2 * (1 + static_cast<double>(n) / 9);
    for (double sp : {5.0, 1.0}) {
      std::vector<double> v(grid_node_count(sp));
      density_values(&id, &n, 1, sp, v.data());
      const auto nodes = grid_nodes(sp);
      for (size_t j = 0; j < nodes.size(); ++j) {
        const double want = f * std::exp(f * (std::sin(rad(nodes[j].plunge)) - 1)) / -std::expm1(-f);
        ASSERT_NEAR(v[j], want, 1e-12 * std::max(1.0, want)) << n << " " << j;
      }
    }
  }
}

TEST(DensityValues, HemisphereIntegralIsTwoPi) {
  // derived (density.hpp): for ANY data the hemisphere integral of D is 2 pi
  // (area-weighted mean 1). Quadrature on the 1-degree grid, kernels wide
  // enough for it (N <= 300), tolerance 1e-3.
  Rng g(121);
  for (int n : {1, 7, 50, 300}) {
    std::vector<Vec3> data;
    const Vec3 c = g.unit();
    for (int i = 0; i < n; ++i) data.push_back(g.in_cone(c, 25));
    const auto v = exact_density(data, 1.0);
    EXPECT_NEAR(integral(v, 1.0) / (2 * kPi), 1.0, 1e-3) << n;
    const auto vb = density_of(bins_of(data), 1.0);
    EXPECT_NEAR(integral(vb, 1.0) / (2 * kPi), 1.0, 1e-3) << n;
  }
}

TEST(DensityValues, UniformSampleNearOneMud) {
  // Uniform axes: expected D = 1 at every node (derived), standard deviation
  // -> 1/3 for large N (derived in density.hpp: var = (f/2 - 1)/N -> 1/9).
  Rng g(122);
  std::vector<Vec3> data;
  for (int i = 0; i < 5000; ++i) data.push_back(g.unit());
  const double sp = 2.0;
  const auto v = density_of(bins_of(data), sp);
  const auto a = node_areas(sp);
  double m = 0, m2 = 0;
  for (size_t j = 0; j < v.size(); ++j) {
    m += a[j] * v[j];
    m2 += a[j] * v[j] * v[j];
  }
  m /= 2 * kPi;
  m2 /= 2 * kPi;
  const double sd = std::sqrt(m2 - m * m);
  std::printf("  uniform N=5000: area-weighted mean %.6f MUD, sd %.4f MUD\n", m, sd);
  EXPECT_NEAR(m, 1.0, 2e-3);
  EXPECT_NEAR(sd, 1.0 / 3, 0.05);
}

TEST(DensityValues, WindowedKernelEqualsBruteForce) {
  // The cutoff windows (weights below e^-50 skipped) must not change values
  // beyond the documented f e^-50 bound: compare with the full double loop.
  Rng g(123);
  struct Case {
    int n;
    double spread, spacing;
  };
  // Cases: tiny N at the finest grid; N + 3 = 213 and 219 on either side of
  // the switch from visiting every node (f <= 50, i.e. N <= 216) to windows;
  // odd spacings (90/7, 45); a spread of 90 (data everywhere).
  for (const Case &k : {Case{5, 40, 0.5}, Case{210, 20, 1.0}, Case{216, 20, 1.0}, Case{800, 30, 2.5},
                        Case{3000, 10, 90.0 / 7}, Case{4000, 60, 3.0}, Case{2000, 5, 45.0},
                        Case{3000, 90, 2.0}}) {
    std::vector<Vec3> data;
    const Vec3 c = g.unit();
    for (int i = 0; i < k.n; ++i) data.push_back(g.in_cone(c, k.spread));
    // Include exact horizontal and vertical axes: the special cases of the windows.
    data.push_back(Vec3(1, 0, 0));
    data.push_back(Vec3(0, 0, 1));
    data.push_back(L(179.99, 0.001));
    const std::vector<double> w(data.size(), 1.0);
    // Relative difference where D > 1, absolute below (tiny values far from data).
    const auto ex = exact_density(data, k.spacing);
    const auto bf = brute_density(data, w, k.spacing);
    double worst = 0;
    for (size_t j = 0; j < ex.size(); ++j)
      worst = std::max(worst, std::fabs(ex[j] - bf[j]) / std::max(1.0, bf[j]));
    EXPECT_LT(worst, 1e-12) << k.n << " " << k.spacing;
    // Binned values against brute force over the bin centres with their counts.
    const Bins b = bins_of(data);
    std::vector<Vec3> centres;
    std::vector<double> cw;
    for (size_t i = 0; i < b.ids.size(); ++i) {
      centres.push_back(density_bin_center(b.ids[i]));
      cw.push_back(static_cast<double>(b.counts[i]));
    }
    const auto bv = density_of(b, k.spacing);
    const auto bbf = brute_density(centres, cw, k.spacing);
    worst = 0;
    for (size_t j = 0; j < bv.size(); ++j)
      worst = std::max(worst, std::fabs(bv[j] - bbf[j]) / std::max(1.0, bbf[j]));
    EXPECT_LT(worst, 1e-12) << k.n << " " << k.spacing;
  }
}

TEST(DensityValues, BinningErrorMeasured) {
  // density.hpp documents the effect of binning (data moved <= 0.36 degree):
  // measured here as max |binned - exact| over the nodes, relative to the
  // maximum exact density, for clusters of growing N (spacing 1 degree).
  Rng g(124);
  struct Case {
    int n;
    double spread;
    double bound;
  };
  for (const Case &k : {Case{30, 20, 0.01}, Case{300, 20, 0.02}, Case{3000, 20, 0.05},
                        Case{3000, 5, 0.05}, Case{30000, 20, 0.2}}) {
    std::vector<Vec3> data;
    const Vec3 c = g.unit();
    for (int i = 0; i < k.n; ++i) data.push_back(g.in_cone(c, k.spread));
    const auto ex = exact_density(data, 1.0);
    const auto bv = density_of(bins_of(data), 1.0);
    double worst = 0, top = 0;
    for (size_t j = 0; j < ex.size(); ++j) {
      worst = std::max(worst, std::fabs(ex[j] - bv[j]));
      top = std::max(top, ex[j]);
    }
    std::printf("  binning: N=%d spread %.0f: max |binned-exact| = %.5f MUD = %.4f of max %.3f MUD\n",
                k.n, k.spread, worst, worst / top, top);
    EXPECT_LT(worst / top, k.bound) << k.n;
  }
}

TEST(DensityValues, SerialAndParallelBitIdentical) {
  // Combine adds integer counts, so chunked-and-merged bins give the very same
  // list and the very same density as the serial run.
  Rng g(125);
  std::vector<Vec3> data;
  for (int i = 0; i < 3000; ++i) data.push_back(g.in_cone(L(300, 30), 25));
  const Bins serial = bins_of(data);
  // Six chunks merged one by one, each new chunk first (order differs from serial).
  Bins acc;
  for (int k = 0; k < 6; ++k) {
    const Bins part = bins_of({data.begin() + k * 500, data.begin() + (k + 1) * 500});
    std::vector<uint32_t> oi(acc.ids.size() + part.ids.size());
    std::vector<uint64_t> oc(oi.size());
    const size_t m = merge_bins(part.ids.data(), part.counts.data(), part.ids.size(), acc.ids.data(),
                                acc.counts.data(), acc.ids.size(), oi.data(), oc.data());
    oi.resize(m);
    oc.resize(m);
    acc.ids = oi;
    acc.counts = oc;
  }
  const auto a = density_of(serial, 2.0), b = density_of(acc, 2.0);
  EXPECT_EQ(0, std::memcmp(a.data(), b.data(), a.size() * sizeof(double)));
}

TEST(DensityValues, NoEdgeEffectAtTheHorizontal) {
  // A data set symmetric under z -> -z (each axis with its mirror, which is the
  // same plunge at trend + 180) has D(t, q) = D(t + 180, q) (derived: axial
  // kernel), including data straddling the primitive circle.
  Rng g(126);
  std::vector<Vec3> data;
  for (int i = 0; i < 150; ++i) {
    const Vec3 x = g.in_cone(L(90, 0), 15);
    data.push_back(x);
    data.push_back(Vec3(x(0), x(1), -x(2)));
  }
  const double sp = 5.0;
  const auto v = exact_density(data, sp);
  const auto nodes = grid_nodes(sp);
  // Look nodes up by (trend, plunge) in thousandths of a degree.
  std::map<std::pair<long, long>, double> at;
  for (size_t j = 0; j < nodes.size(); ++j)
    at[{std::lround(nodes[j].trend * 1000), std::lround(nodes[j].plunge * 1000)}] = v[j];
  int checked = 0;
  for (size_t j = 0; j < nodes.size(); ++j) {
    const Line l = nodes[j];
    if (l.plunge == 0 || l.plunge == 90) continue;
    const auto it = at.find({std::lround(norm360(l.trend + 180) * 1000), std::lround(l.plunge * 1000)});
    if (it == at.end()) continue;  // ring sizes need not be even
    EXPECT_NEAR(v[j], it->second, 1e-11 * std::max(1.0, v[j]));
    ++checked;
  }
  EXPECT_GT(checked, 100);
  // The maximum is on the horizontal axis the data straddle.
  EXPECT_LT(angle(grid_extreme(v.data(), v.size(), sp, true), make_line(90, 0)), 5.01);
}

TEST(DensityValues, MaximumOfAPeakedClusterNearItsCentre) {
  // A cluster whose point density peaks at its centre 120/40 (angle from the
  // centre uniform in [0, 15] degrees, so density ~ 1/angle): the density
  // maximum found by grid_extreme lies near the centre (sampling: within 2
  // degrees on a 1-degree grid), binned and unbinned alike.
  Rng g(127);
  std::vector<Vec3> data;
  const Vec3 c = L(120, 40);
  for (int i = 0; i < 500; ++i) data.push_back(g.in_cone(c, 15 * g.uniform()));
  const auto v = density_of(bins_of(data), 1.0);
  EXPECT_LT(angle(grid_extreme(v.data(), v.size(), 1.0, true), make_line(120, 40)), 2.0);
  const auto e = exact_density(data, 1.0);
  EXPECT_LT(angle(grid_extreme(e.data(), e.size(), 1.0, true), make_line(120, 40)), 2.0);
}

TEST(DensityValues, Errors) {
  std::vector<double> out(grid_node_count(10));
  uint32_t id = 0;
  uint64_t c = 1;
  try {
    density_values(&id, &c, 0, 10, out.data());
    FAIL() << "empty list accepted";
  } catch (const Error &e) {
    EXPECT_EQ(e.kind, ErrorKind::DataError);
  }
  try {
    density_values(&id, &c, 1, 7, out.data());  // 7 does not divide 90
    FAIL() << "bad spacing accepted";
  } catch (const Error &e) {
    EXPECT_EQ(e.kind, ErrorKind::InvalidParameter);
  }
  EXPECT_THROW(density_values(&id, &c, 1, 0.25, out.data()), Error);
  EXPECT_THROW(density_values_axes(nullptr, 0, 10, out.data()), Error);
  const Vec3 z = Vec3::Zero();
  EXPECT_THROW(density_values_axes(&z, 1, 10, out.data()), Error);
}

// ---------------------------------------------------------------------------
// grid_extreme
// ---------------------------------------------------------------------------

TEST(GridExtreme, SingleExtremeNodeExact) {
  // One maximum / one minimum: that node, exactly.
  const double sp = 10;
  const auto nodes = grid_nodes(sp);
  std::vector<double> v(nodes.size(), 1.0);
  v[57] = 3.0;
  v[12] = -2.0;
  const Line mx = grid_extreme(v.data(), v.size(), sp, true);
  const Line mn = grid_extreme(v.data(), v.size(), sp, false);
  EXPECT_EQ(mx.trend, nodes[57].trend);
  EXPECT_EQ(mx.plunge, nodes[57].plunge);
  EXPECT_EQ(mn.trend, nodes[12].trend);
  EXPECT_EQ(mn.plunge, nodes[12].plunge);
}

TEST(GridExtreme, TiesAcrossTheHorizontalWrap) {
  // Ties at 000/00 and 170/00 (10-degree grid): the axial mean is their
  // bisector across the wrap, 175/00, not 085/00 (derived: e1 of the two axes).
  const double sp = 10;
  const auto nodes = grid_nodes(sp);
  std::vector<double> v(nodes.size(), 0.0);
  int i0 = -1, i170 = -1;
  for (size_t j = 0; j < nodes.size(); ++j) {
    if (nodes[j].plunge == 0 && nodes[j].trend == 0) i0 = static_cast<int>(j);
    if (nodes[j].plunge == 0 && std::fabs(nodes[j].trend - 170) < 1e-9) i170 = static_cast<int>(j);
  }
  ASSERT_GE(i0, 0);
  ASSERT_GE(i170, 0);
  v[i0] = 100.0;
  v[i170] = 100.0 * (1 - 5e-10);  // within 1e-9 relative: tied
  EXPECT_LT(angle(grid_extreme(v.data(), v.size(), sp, true), make_line(175, 0)), 1e-9);
  v[i170] = 100.0 * (1 - 2e-9);  // beyond 1e-9: not tied
  EXPECT_LT(angle(grid_extreme(v.data(), v.size(), sp, true), make_line(0, 0)), 1e-12);
  // Minimum: zero everywhere else -> all other nodes tie; a zero extreme ties exactly.
  std::vector<double> w(nodes.size(), 50.0);
  w[i0] = 0.0;
  w[i170] = 0.0;
  EXPECT_LT(angle(grid_extreme(w.data(), w.size(), sp, false), make_line(175, 0)), 1e-9);
}

TEST(GridExtreme, TiedPatchGivesItsCentre) {
  // A symmetric patch of tied nodes around the vertical: the mean is vertical
  // (derived by symmetry of complete rings).
  const double sp = 5;
  const auto nodes = grid_nodes(sp);
  std::vector<double> v(nodes.size(), 1.0);
  for (size_t j = 0; j < nodes.size(); ++j)
    if (nodes[j].plunge >= 80) v[j] = 7.0;
  EXPECT_LT(angle(grid_extreme(v.data(), v.size(), sp, true), make_line(0, 90)), 1e-9);
  // A constant grid is allowed (deterministic, arbitrary axis of the tie).
  std::vector<double> c(nodes.size(), 2.0);
  const Line a = grid_extreme(c.data(), c.size(), sp, true);
  const Line b = grid_extreme(c.data(), c.size(), sp, true);
  EXPECT_EQ(a.trend, b.trend);
  EXPECT_EQ(a.plunge, b.plunge);
}

TEST(GridExtreme, Errors) {
  const double sp = 10;
  std::vector<double> v(grid_node_count(sp), 1.0);
  try {
    grid_extreme(v.data(), v.size() - 1, sp, true);
    FAIL() << "wrong count accepted";
  } catch (const Error &e) {
    EXPECT_EQ(e.kind, ErrorKind::InvalidParameter);
  }
  v[3] = NAN;
  try {
    grid_extreme(v.data(), v.size(), sp, true);
    FAIL() << "NaN accepted";
  } catch (const Error &e) {
    EXPECT_EQ(e.kind, ErrorKind::DataError);
  }
  EXPECT_THROW(grid_extreme(v.data(), v.size(), 7, true), Error);
}
