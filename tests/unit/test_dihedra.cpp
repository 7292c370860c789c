// Unit tests of src/core/dihedra: right-dihedra counting (Angelier & Mechler 1977).
#include "bootstrap.hpp"
#include "dihedra.hpp"
#include "stress.hpp"

#include <gtest/gtest.h>

#include <chrono>
#include <cmath>
#include <cstdio>
#include <vector>

using namespace striae;

namespace {

// Uniform random unit vector (rejection from the cube).
Vec3 unit_vector(Rng &r) {
  for (;;) {
    const Vec3 v(2 * r.uniform() - 1, 2 * r.uniform() - 1, 2 * r.uniform() - 1);
    const double l = v.norm();
    if (l > 0.1 && l <= 1.0) return v / l;
  }
}

// Wallace-Bott data on random planes under t, optionally given as the auxiliary plane.
std::vector<SlipDatum> slip_data(const StressTensor &t, int count, uint64_t seed, bool swap_some = false) {
  Rng r(seed);
  std::vector<SlipDatum> out;
  while (static_cast<int>(out.size()) < count) {
    Vec3 n = unit_vector(r);
    if (n.z() > 0) n = -n;
    const auto s = resolved_slip(n, t);
    if (!s) continue;
    SlipDatum d;
    const bool sw = swap_some && r.uniform() < 0.5;
    for (int k = 0; k < 3; ++k) {
      d.n[k] = sw ? (*s)[k] : n[k];
      d.u[k] = sw ? n[k] : (*s)[k];
    }
    out.push_back(d);
  }
  return out;
}

// A state (header plus counts) for tests.
struct State {
  DihedraHeader h;
  std::vector<int64_t> counts;
  explicit State(double spacing) : h(dihedra_init(spacing)), counts(h.node_count, 0) {}
};

// Index of the node closest to a line (the node itself when the line is a node).
int node_of(double spacing, const Line &l) {
  const std::vector<Vec3> v = grid_node_vectors(spacing);
  const Vec3 x = line_vector(l);
  int best = 0;
  for (size_t i = 0; i < v.size(); ++i)
    if (axial_angle(v[i], x) < axial_angle(v[best], x)) best = static_cast<int>(i);
  EXPECT_LT(axial_angle(v[best], x), 1e-9) << "not a node";
  return best;
}

}  // namespace

TEST(Dihedra, NodeTableLayout) {
  // Structure of arrays: N block, E block, D block, in grid order (dihedra.hpp).
  const std::vector<Vec3> v = grid_node_vectors(10);
  const std::vector<double> t = dihedra_node_table(10);
  const size_t k = v.size();
  ASSERT_EQ(t.size(), 3 * k);
  for (size_t i = 0; i < k; ++i) {
    EXPECT_EQ(t[i], v[i].x());
    EXPECT_EQ(t[k + i], v[i].y());
    EXPECT_EQ(t[2 * k + i], v[i].z());
  }
  EXPECT_EQ(dihedra_init(10).node_count, static_cast<int32_t>(k));
  EXPECT_THROW(dihedra_node_table(7), Error);
  EXPECT_THROW(dihedra_init(0.1), Error);
}

TEST(Dihedra, PureThrustQuadrants) {
  // Pure thrust 000/45/90: P horizontal E-W, T vertical, B = the strike line N-S
  // (METHODS.md section 2; derived from Aki & Richards conventions). So the
  // horizontal node at 090 is compressional, the vertical node extensional, and
  // the node at 000/00 lies on both nodal planes: half (documented rule since 0.2.0;
  // counts are in half data: 2 compressional, 1 on a plane).
  const double sp = 5;
  State s(sp);
  const std::vector<double> nodes = dihedra_node_table(sp);
  Vec3 n, u;
  fault_vectors(make_fault_slip(0, 45, 90), n, u);
  const double nv[3] = {n.x(), n.y(), n.z()}, uv[3] = {u.x(), u.y(), u.z()};
  dihedra_add(s.h, s.counts.data(), nodes.data(), nv, uv);
  EXPECT_EQ(s.h.data_count, 1);
  EXPECT_EQ(s.counts[node_of(sp, make_line(90, 0))], 2);
  EXPECT_EQ(s.counts[node_of(sp, make_line(0, 90))], 0);
  EXPECT_EQ(s.counts[node_of(sp, make_line(0, 0))], 1);
  // The auxiliary plane (u, n) gives the same quadrants (the product is symmetric).
  State a(sp);
  dihedra_add(a.h, a.counts.data(), nodes.data(), uv, nv);
  EXPECT_EQ(a.counts, s.counts);
  // Exactly half of the sphere is compressional; on this grid the count of
  // compressional nodes is close to half (the grid is near-uniform).
  int64_t total = 0;
  for (int64_t c : s.counts) total += c;
  EXPECT_NEAR(static_cast<double>(total) / (2.0 * s.h.node_count), 0.5, 0.05);
}

TEST(Dihedra, VerticalSinistralQuadrantsAndPlaneNodes) {
  // Vertical sinistral 000/90/0: P 315/00 (= 135/00), T 225/00 (= 045/00)
  // (METHODS.md section 2, derived from Aki & Richards conventions). Every node of
  // trend 000 lies on the fault plane, the vertical node on both planes: half.
  const double sp = 5;
  State s(sp);
  const std::vector<double> nodes = dihedra_node_table(sp);
  Vec3 n, u;
  fault_vectors(make_fault_slip(0, 90, 0), n, u);
  const double nv[3] = {n.x(), n.y(), n.z()}, uv[3] = {u.x(), u.y(), u.z()};
  dihedra_add(s.h, s.counts.data(), nodes.data(), nv, uv);
  EXPECT_EQ(s.counts[node_of(sp, make_line(135, 0))], 2);
  EXPECT_EQ(s.counts[node_of(sp, make_line(45, 0))], 0);
  EXPECT_EQ(s.counts[node_of(sp, make_line(0, 90))], 1);
  const std::vector<Line> lines = grid_nodes(sp);
  int on_plane = 0;
  for (size_t i = 0; i < lines.size(); ++i)
    if (lines[i].trend == 0.0) {
      EXPECT_EQ(s.counts[i], 1) << lines[i].plunge;
      ++on_plane;
    }
  EXPECT_GE(on_plane, 18);  // one per ring (grid.hpp layout starts each ring at trend 0)
}

TEST(Dihedra, NoiseFreeDataLocateSigma1AndSigma3) {
  // For Wallace-Bott slip, sigma1 is always compressional and sigma3 always
  // extensional (derived: (e1.n)(e1.u) = -n1^2 (s1 - sn)/|tau| <= 0). With the
  // axes on nodes: 100 % at sigma1, 0 % at sigma3.
  const double sp = 5;
  const std::vector<double> nodes = dihedra_node_table(sp);
  struct Case { Line s1, s3; double phi; };
  const Case cases[] = {
      {make_line(0, 0), make_line(90, 0), 0.4},    // strike-slip
      {make_line(0, 90), make_line(0, 0), 0.6},    // extension
      {make_line(45, 0), make_line(0, 90), 0.2},   // compression
  };
  for (const Case &c : cases) {
    const StressTensor t = stress_from_axes(c.s1, c.s3, c.phi);
    State s(sp);
    for (const SlipDatum &d : slip_data(t, 500, 12, true)) dihedra_add(s.h, s.counts.data(), nodes.data(), d.n, d.u);
    std::vector<double> pct(s.h.node_count);
    ASSERT_TRUE(dihedra_finalise(s.h, s.counts.data(), pct.data()));
    EXPECT_DOUBLE_EQ(pct[node_of(sp, c.s1)], 100.0);
    EXPECT_DOUBLE_EQ(pct[node_of(sp, c.s3)], 0.0);
    for (double p : pct) EXPECT_LE(p, 100.0);  // a percentage of the data (half-data units count 50 each)
  }
}

TEST(Dihedra, CombineEqualsSerialAndValidate) {
  // Counts add exactly: any split gives the serial state (DESIGN.md: parallel
  // aggregates agree with serial ones).
  const double sp = 10;
  const std::vector<double> nodes = dihedra_node_table(sp);
  const std::vector<SlipDatum> data = slip_data(stress_from_axes(make_line(30, 60), make_line(210, 30), 0.3), 300, 13);
  State serial(sp), a(sp), b(sp);
  for (size_t i = 0; i < data.size(); ++i) {
    dihedra_add(serial.h, serial.counts.data(), nodes.data(), data[i].n, data[i].u);
    State &part = i % 3 ? a : b;
    dihedra_add(part.h, part.counts.data(), nodes.data(), data[i].n, data[i].u);
  }
  dihedra_combine(b.h, b.counts.data(), a.h, a.counts.data());
  EXPECT_EQ(b.h.data_count, serial.h.data_count);
  EXPECT_EQ(b.counts, serial.counts);
  EXPECT_NO_THROW(dihedra_validate(b.h, b.counts.data()));

  auto expect_bad = [](const DihedraHeader &h, const std::vector<int64_t> &c) {
    try {
      dihedra_validate(h, c.data());
      FAIL() << "accepted";
    } catch (const Error &e) {
      EXPECT_EQ(e.kind, ErrorKind::BadState);
    }
  };
  State bad = serial;
  bad.counts[3] = 2 * serial.h.data_count + 1;
  expect_bad(bad.h, bad.counts);
  bad = serial;
  bad.counts[0] = -1;
  expect_bad(bad.h, bad.counts);
  bad = serial;
  bad.h.spacing = 7;
  expect_bad(bad.h, bad.counts);
  bad = serial;
  bad.h.spacing = NAN;
  expect_bad(bad.h, bad.counts);
  bad = serial;
  bad.h.node_count -= 1;
  expect_bad(bad.h, bad.counts);
  bad = serial;
  bad.h.reserved = 1;
  expect_bad(bad.h, bad.counts);
  bad = serial;
  bad.h.data_count = -1;
  expect_bad(bad.h, bad.counts);

  State other(5);
  try {
    dihedra_combine(serial.h, serial.counts.data(), other.h, other.counts.data());
    FAIL();
  } catch (const Error &e) {
    EXPECT_EQ(e.kind, ErrorKind::InvalidParameter);
  }
}

TEST(Dihedra, EmptyAndBadData) {
  State s(10);
  std::vector<double> pct(s.h.node_count, -1);
  EXPECT_FALSE(dihedra_finalise(s.h, s.counts.data(), pct.data()));
  EXPECT_EQ(pct[0], -1);
  const std::vector<double> nodes = dihedra_node_table(10);
  const double n[3] = {0, 0, -1}, u[3] = {0, 0, 1};
  EXPECT_THROW(dihedra_add(s.h, s.counts.data(), nodes.data(), n, u), Error);
  EXPECT_EQ(s.h.data_count, 0);
}

TEST(Dihedra, AddSpeed) {
  // 10^5 data on the 5-degree grid; printed, checked loosely (machines differ).
  const double sp = 5;
  const std::vector<double> nodes = dihedra_node_table(sp);
  const std::vector<SlipDatum> data = slip_data(stress_from_axes(make_line(0, 90), make_line(0, 0), 0.5), 1000, 14);
  State s(sp);
  const auto t0 = std::chrono::steady_clock::now();
  for (int rep = 0; rep < 100; ++rep)
    for (const SlipDatum &d : data) dihedra_add(s.h, s.counts.data(), nodes.data(), d.n, d.u);
  const double secs = std::chrono::duration<double>(std::chrono::steady_clock::now() - t0).count();
  std::printf("[ timing   ] right dihedra: 1e5 data x %d nodes in %.3f s\n", s.h.node_count, secs);
  EXPECT_EQ(s.h.data_count, 100000);
  EXPECT_LT(secs, 5.0);
}
