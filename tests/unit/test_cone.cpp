// Unit tests of cones of axes and the GiST key operations (src/core/cone.*).
// The reference is brute force over the same operator functions (angle(),
// the value of <->): an index built from these keys must return exactly what
// a scan computes, so every bound is checked against the exact distances.
#include <gtest/gtest.h>

#include <algorithm>
#include <functional>
#include <vector>

#include "cone.hpp"
#include "test_rng.hpp"

using namespace striae;
using striae_test::Rng;

namespace {

Line random_line(Rng &rng) {
  // Every fourth axis within 0.001 degree of the horizontal or the vertical:
  // the wrap-around of horizontal axes and the pole are the hard places.
  const double u = rng.uniform();
  const double trend = 360 * rng.uniform();
  if (u < 0.125) return make_line(trend, 0.001 * rng.uniform());
  if (u < 0.25) return make_line(trend, 90 - 0.001 * rng.uniform());
  return vector_line(rng.unit());
}

}  // namespace

TEST(Cone, AxialAngleIsAMetric) {
  // The index's exactness rests on the triangle inequality of the axial angle
  // (cone.hpp); checked on random triples, near-horizontal and vertical included.
  Rng rng(20261202);
  for (int i = 0; i < 20000; ++i) {
    const Line a = random_line(rng), b = random_line(rng), c = random_line(rng);
    EXPECT_LE(angle(a, c), angle(a, b) + angle(b, c) + 1e-12);
  }
  // u and -u are one axis: 000/00 and 180/00 (canonical 0/0) are 0 apart, 000/05 and 180/05 10.
  EXPECT_EQ(angle(make_line(0, 5), make_line(180, 5)), 10.0);
}

TEST(Cone, ContainmentIsTheDistanceOperator) {
  Rng rng(7);
  for (int i = 0; i < 5000; ++i) {
    const Line a = random_line(rng), b = random_line(rng);
    const double r = 90 * rng.uniform();
    EXPECT_EQ(cone_contains(make_cone(a, r), b), angle(a, b) <= r);
    const Plane p = plane_from_pole(a), q = plane_from_pole(b);
    EXPECT_EQ(cone_contains(make_cone(p, r), q), angle(p, q) <= r);
  }
  // The boundary belongs to the cone (<=), as l <-> v <= d does.
  EXPECT_TRUE(cone_contains(make_cone(make_line(0, 0), 90), make_line(90, 0)));
  EXPECT_TRUE(cone_contains(make_cone(make_line(0, 5), 10), make_line(180, 5)));
}

TEST(Cone, Errors) {
  auto kind = [](const std::function<void()> &f) {
    try {
      f();
    } catch (const Error &e) {
      return e.kind;
    }
    return static_cast<ErrorKind>(-1);
  };
  EXPECT_EQ(kind([] { make_cone(make_line(0, 0), 90.5); }), ErrorKind::OutOfRange);
  EXPECT_EQ(kind([] { make_cone(make_line(0, 0), -1); }), ErrorKind::OutOfRange);
  EXPECT_EQ(kind([] { make_cone(make_line(0, 0), std::nan("")); }), ErrorKind::OutOfRange);
  EXPECT_EQ(kind([] { cone_contains(make_cone(make_line(0, 0), 5), make_plane(0, 0)); }),
            ErrorKind::InvalidParameter);
  EXPECT_EQ(kind([] { cone_contains(make_cone(make_plane(0, 0), 5), make_line(0, 0)); }),
            ErrorKind::InvalidParameter);
  EXPECT_EQ(kind([] { parse_cone("line 120/30 within"); }), ErrorKind::InvalidText);
  EXPECT_EQ(kind([] { parse_cone("circle 120/30 within 5"); }), ErrorKind::InvalidText);
  EXPECT_EQ(kind([] { parse_cone("line 120/30 within 95"); }), ErrorKind::OutOfRange);
  const Cone c = parse_cone("Plane N70W 64SW within 7.5");
  EXPECT_EQ(c.kind, static_cast<int32_t>(ConeKind::Plane));
  EXPECT_EQ(c.a, 110);
  EXPECT_EQ(c.b, 64);
  EXPECT_EQ(c.radius, 7.5);
  EXPECT_NO_THROW(check_cone(c));
}

TEST(Cone, UnionBoundsEveryMember) {
  // A region from key_union must bound the exact distance of every member from
  // below, and may-overlap must be true whenever a member is inside the query.
  Rng rng(42);
  for (int trial = 0; trial < 300; ++trial) {
    const int n = 1 + static_cast<int>(rng.uniform() * 60);
    const Vec3 centre = rng.unit();
    const double spread = trial % 3 == 0 ? 90 : 30 * rng.uniform();
    std::vector<Cone> keys;
    std::vector<Line> lines;
    for (int i = 0; i < n; ++i) {
      const Line l = trial % 5 == 0 ? random_line(rng) : vector_line(rng.in_cone(centre, spread));
      lines.push_back(l);
      keys.push_back(leaf_key(l));
    }
    std::vector<const Cone *> ptr;
    for (const Cone &k : keys) ptr.push_back(&k);
    const Cone region = key_union(ptr.data(), n);  // (its half-angle is capped at 90 by construction)
    for (int q = 0; q < 20; ++q) {
      const Line ql = random_line(rng);
      double best = 90;
      for (const Line &l : lines) best = std::min(best, angle(l, ql));
      EXPECT_LE(key_distance(region, ql), best) << trial;
      const double r = 20 * rng.uniform();
      if (best <= r) {
        EXPECT_TRUE(key_may_overlap(region, make_cone(ql, r))) << trial;
      }
    }
  }
}

TEST(Cone, LeafDistanceIsTheOperatorValue) {
  Rng rng(3);
  for (int i = 0; i < 2000; ++i) {
    const Line a = random_line(rng), b = random_line(rng);
    EXPECT_EQ(key_distance(leaf_key(a), b), angle(a, b));
    const Plane p = plane_from_pole(a), q = plane_from_pole(b);
    EXPECT_EQ(key_distance(leaf_key(p), q), angle(p, q));
  }
}

TEST(Cone, PenaltyIsTheGrowthOfTheHalfAngle) {
  // cone.hpp: the penalty of adding a key to a cone is how much the half-angle
  // must grow to enclose it: max(0, angle between axes + key radius - radius)
  // (derived from the definition; axial angles along one horizontal ring are
  // the differences of trend).
  const Cone have = make_cone(make_line(0, 0), 20);
  EXPECT_NEAR(key_penalty(have, leaf_key(make_line(10, 0))), 0.0, 1e-12);
  EXPECT_NEAR(key_penalty(have, leaf_key(make_line(30, 0))), 10.0, 1e-12);
  EXPECT_NEAR(key_penalty(have, make_cone(make_line(15, 0), 4)), 0.0, 1e-12);
  EXPECT_NEAR(key_penalty(have, make_cone(make_line(15, 0), 8)), 3.0, 1e-12);
  EXPECT_NEAR(key_penalty(have, leaf_key(make_line(170, 0))), 0.0, 1e-12);  // axial: 10 degrees away
}

TEST(Cone, SplitKeepsAQuarterOnEachSide) {
  Rng rng(11);
  for (int n : {2, 3, 5, 40, 121}) {
    std::vector<Cone> keys;
    for (int i = 0; i < n; ++i) keys.push_back(leaf_key(random_line(rng)));
    std::vector<const Cone *> ptr;
    for (const Cone &k : keys) ptr.push_back(&k);
    std::vector<unsigned char> side(n);
    key_split(ptr.data(), n, side.data());
    const int left = static_cast<int>(std::count(side.begin(), side.end(), 0));
    EXPECT_GE(left, std::max(1, n / 4)) << n;
    EXPECT_GE(n - left, std::max(1, n / 4)) << n;
  }
  // One key far from 39 close together: the natural split (1 : 39) is pulled to
  // a quarter on each side (the rule of cone.hpp), 10 : 30.
  {
    std::vector<Cone> lop;
    lop.push_back(leaf_key(make_line(0, 0)));
    for (int i = 0; i < 39; ++i) lop.push_back(leaf_key(make_line(180 + 0.2 * i, 80)));
    std::vector<const Cone *> lp;
    for (const Cone &k : lop) lp.push_back(&k);
    std::vector<unsigned char> ls(40);
    key_split(lp.data(), 40, ls.data());
    const int left = static_cast<int>(std::count(ls.begin(), ls.end(), 0));
    EXPECT_GE(std::min(left, 40 - left), 10);
  }
  // Two tight clusters far apart are split between them.
  std::vector<Cone> keys;
  for (int i = 0; i < 20; ++i) keys.push_back(leaf_key(make_line(10 + 0.1 * i, 30)));
  for (int i = 0; i < 20; ++i) keys.push_back(leaf_key(make_line(200 + 0.1 * i, 60)));
  std::vector<const Cone *> ptr;
  for (const Cone &k : keys) ptr.push_back(&k);
  std::vector<unsigned char> side(40);
  key_split(ptr.data(), 40, side.data());
  for (int i = 1; i < 20; ++i) EXPECT_EQ(side[i], side[0]);
  for (int i = 21; i < 40; ++i) EXPECT_EQ(side[i], side[20]);
  EXPECT_NE(side[0], side[20]);
}

TEST(Cone, BranchAndBoundEqualsBruteForce) {
  // A small tree built with the key operations (recursive splits, unions as
  // parents) searched best-first as GiST does: the k nearest must be the brute
  // force answer, distances bit for bit.
  Rng rng(99);
  std::vector<Line> lines;
  for (int i = 0; i < 3000; ++i) lines.push_back(random_line(rng));
  struct Node {
    Cone key;
    std::vector<int> items;  // leaf: indices into lines
    std::vector<Node> kids;
  };
  std::function<Node(std::vector<int>)> build = [&](std::vector<int> idx) {
    Node node;
    std::vector<Cone> keys;
    for (int i : idx) keys.push_back(leaf_key(lines[i]));
    std::vector<const Cone *> ptr;
    for (const Cone &k : keys) ptr.push_back(&k);
    node.key = key_union(ptr.data(), static_cast<int>(ptr.size()));
    if (idx.size() <= 40) {
      node.items = idx;
      return node;
    }
    std::vector<unsigned char> side(idx.size());
    key_split(ptr.data(), static_cast<int>(ptr.size()), side.data());
    std::vector<int> a, b;
    for (size_t j = 0; j < idx.size(); ++j) (side[j] ? b : a).push_back(idx[j]);
    node.kids.push_back(build(a));
    node.kids.push_back(build(b));
    return node;
  };
  std::vector<int> all(lines.size());
  for (size_t i = 0; i < all.size(); ++i) all[i] = static_cast<int>(i);
  const Node root = build(all);
  for (int q = 0; q < 50; ++q) {
    const Line ql = random_line(rng);
    const int k = 10;
    // best-first: a node is opened only while its bound is below the k-th best
    std::vector<double> found;
    std::function<void(const Node &)> visit = [&](const Node &node) {
      if (found.size() == static_cast<size_t>(k) && key_distance(node.key, ql) > found.back()) return;
      for (int i : node.items) {
        found.push_back(key_distance(leaf_key(lines[i]), ql));
        std::sort(found.begin(), found.end());
        if (found.size() > static_cast<size_t>(k)) found.pop_back();
      }
      std::vector<const Node *> order;
      for (const Node &c : node.kids) order.push_back(&c);
      std::sort(order.begin(), order.end(), [&](const Node *x, const Node *y) {
        return key_distance(x->key, ql) < key_distance(y->key, ql);
      });
      for (const Node *c : order) visit(*c);
    };
    visit(root);
    std::vector<double> brute;
    for (const Line &l : lines) brute.push_back(angle(l, ql));
    std::sort(brute.begin(), brute.end());
    brute.resize(k);
    EXPECT_EQ(found, brute) << q;
  }
}

TEST(Cone, OrderTreatsOppositeHorizontalVectorsAlike) {
  // The Hilbert position is a function of the axis: a region key holding the
  // horizontal vector pointing south sorts with the leaf of 000/00.
  Cone south = leaf_key(make_line(0, 0));
  south.x = -south.x;
  south.kind = static_cast<int32_t>(ConeKind::Region);
  EXPECT_EQ(key_order(south), key_order(leaf_key(make_line(0, 0))));
  // Nearby axes, nearby codes (here: the same quadrant of the curve).
  EXPECT_EQ(key_order(leaf_key(make_line(30, 60))) >> 60, key_order(leaf_key(make_line(31, 61))) >> 60);
}
