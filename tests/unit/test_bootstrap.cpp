// Unit tests of src/core/bootstrap: the generator and the Michael (1987) bootstrap
// of the linear and the joint focal-mechanism inversions.
#include "bootstrap.hpp"
#include "stress.hpp"

#include <gtest/gtest.h>

#include <chrono>
#include <cmath>
#include <cstdio>
#include <cstring>
#include <vector>

using namespace striae;

namespace {

// Uniform random unit vector (rejection from the cube).
Vec3 sphere_point(Rng &r) {
  for (;;) {
    const Vec3 v(2 * r.uniform() - 1, 2 * r.uniform() - 1, 2 * r.uniform() - 1);
    const double l = v.norm();
    if (l > 0.1 && l <= 1.0) return v / l;
  }
}

// Wallace-Bott data on random planes with Gaussian noise of sd degrees on normal
// and slip. min_i > 0 keeps only planes at least that unstable (for focal data).
std::vector<SlipDatum> noisy_data(const StressTensor &t, int count, double sd, uint64_t seed,
                                  double min_i = 0.0) {
  Rng r(seed);
  std::vector<SlipDatum> out;
  while (static_cast<int>(out.size()) < count) {
    Vec3 n = sphere_point(r);
    if (n.z() > 0) n = -n;
    if (min_i > 0 && instability(n, t, 0.6) < min_i) continue;
    const auto s = resolved_slip(n, t);
    if (!s) continue;
    Vec3 u = *s;
    if (sd > 0) {
      n = (n + rad(sd) * Vec3(r.normal(), r.normal(), r.normal())).normalized();
      u = u + rad(sd) * Vec3(r.normal(), r.normal(), r.normal());
      u = (u - u.dot(n) * n).normalized();
    }
    SlipDatum d;
    for (int k = 0; k < 3; ++k) {
      d.n[k] = n[k];
      d.u[k] = u[k];
    }
    out.push_back(d);
  }
  return out;
}

StressTensor truth() { return stress_from_axes(make_line(30, 60), make_line(210, 30), 0.3); }

double axis_error(const StressTensor &a, const StressTensor &b, int k) {
  return axial_angle(principal_stresses(a).axis[k], principal_stresses(b).axis[k]);
}

}  // namespace

// ---------------------------------------------------------------------------
// Generator
// ---------------------------------------------------------------------------

TEST(Rng, ReproducibleAndSeedSensitive) {
  Rng a(123), b(123), c(124);
  bool differs = false;
  for (int i = 0; i < 1000; ++i) {
    const uint64_t x = a.next();
    EXPECT_EQ(x, b.next());
    differs |= x != c.next();
  }
  EXPECT_TRUE(differs);
  // Seed 0 is fine too (splitmix64 never yields an all-zero state from it).
  Rng z(0);
  uint64_t orv = 0;
  for (int i = 0; i < 8; ++i) orv |= z.next();
  EXPECT_NE(orv, 0u);
}

TEST(Rng, BoundedDrawsAreInRangeAndUniform) {
  Rng r(5);
  for (int i = 0; i < 100; ++i) EXPECT_EQ(r.below(1), 0u);
  // Chi-square of 60000 draws over 6 cells: 5 degrees of freedom, the 99.9 %
  // point is 20.5 (statistical tables, common practice no source).
  std::vector<int> cells(6, 0);
  for (int i = 0; i < 60000; ++i) {
    const uint32_t v = r.below(6);
    ASSERT_LT(v, 6u);
    ++cells[v];
  }
  double chi2 = 0;
  for (int c : cells) chi2 += (c - 10000.0) * (c - 10000.0) / 10000.0;
  EXPECT_LT(chi2, 20.5);
  // A bound near 2^32 where a biased modulo would show: draws stay below it.
  for (int i = 0; i < 1000; ++i) EXPECT_LT(r.below(4000000000u), 4000000000u);
  // Uniform doubles in [0, 1), mean 1/2; normals mean 0, variance 1 (4 sigma bounds).
  double su = 0, sn = 0, sn2 = 0;
  for (int i = 0; i < 100000; ++i) {
    const double u = r.uniform();
    ASSERT_GE(u, 0.0);
    ASSERT_LT(u, 1.0);
    su += u;
    const double g = r.normal();
    sn += g;
    sn2 += g * g;
  }
  EXPECT_NEAR(su / 1e5, 0.5, 4 * std::sqrt(1.0 / 12 / 1e5));
  EXPECT_NEAR(sn / 1e5, 0.0, 4 * std::sqrt(1.0 / 1e5));
  EXPECT_NEAR(sn2 / 1e5, 1.0, 4 * std::sqrt(2.0 / 1e5));
}

// ---------------------------------------------------------------------------
// Linear inversion bootstrap
// ---------------------------------------------------------------------------

TEST(Bootstrap, BestSolutionIsTheAggregateOne) {
  // The best tensor must be bit for bit the streaming aggregate's answer (same
  // sums in the same order), with the exact mean misfit over the data.
  const std::vector<SlipDatum> data = noisy_data(truth(), 200, 8.0, 1);
  StressAccum s;
  stress_init(s);
  for (const SlipDatum &d : data) stress_add(s, Vec3(d.n[0], d.n[1], d.n[2]), Vec3(d.u[0], d.u[1], d.u[2]));
  StressTensor agg, boot;
  ASSERT_EQ(stress_finalise(s, agg), StressStatus::Ok);
  BootstrapOptions o;
  o.resamples = 200;
  o.seed = 99;
  ASSERT_EQ(stress_bootstrap(data.data(), data.size(), o, boot), StressStatus::Ok);
  EXPECT_EQ(0, std::memcmp(&agg, &boot, 6 * sizeof(double)));
  EXPECT_EQ(boot.data_count, 200);
  ASSERT_TRUE(boot.flags & kStressHasMisfit);
  EXPECT_EQ(boot.mean_misfit, *mean_misfit(data.data(), data.size(), agg));
  EXPECT_TRUE(boot.flags & kStressHasCones);
  EXPECT_TRUE(boot.flags & kStressHasPhiInterval);
  check_stress_tensor(boot);
}

TEST(Bootstrap, ReproducibleWithASeed) {
  const std::vector<SlipDatum> data = noisy_data(truth(), 150, 10.0, 2);
  BootstrapOptions o;
  o.resamples = 300;
  o.seed = 2024;
  StressTensor a, b, c;
  ASSERT_EQ(stress_bootstrap(data.data(), data.size(), o, a), StressStatus::Ok);
  ASSERT_EQ(stress_bootstrap(data.data(), data.size(), o, b), StressStatus::Ok);
  EXPECT_EQ(0, std::memcmp(&a, &b, sizeof a));
  o.seed = 2025;
  ASSERT_EQ(stress_bootstrap(data.data(), data.size(), o, c), StressStatus::Ok);
  EXPECT_NE(a.cone[0], c.cone[0]);
}

TEST(Bootstrap, ConesShrinkWithLessNoiseAndHoldTheTruth) {
  // Less noise, tighter cones (the purpose of the method); and the true axes lie
  // within the 95 % cones of a moderately noisy set (simple check, fixed seeds).
  BootstrapOptions o;
  o.resamples = 500;
  o.seed = 7;
  StressTensor t[3];
  const double noise[3] = {20.0, 10.0, 3.0};
  for (int i = 0; i < 3; ++i) {
    const std::vector<SlipDatum> data = noisy_data(truth(), 100, noise[i], 30 + i);
    ASSERT_EQ(stress_bootstrap(data.data(), data.size(), o, t[i]), StressStatus::Ok);
    ASSERT_TRUE(t[i].flags & kStressHasCones);
    EXPECT_LE(t[i].phi_lo, shape_ratio(t[i]) + 1e-12);
    EXPECT_GE(t[i].phi_hi, shape_ratio(t[i]) - 1e-12);
  }
  for (int k = 0; k < 3; ++k) {
    EXPECT_GT(t[0].cone[k], t[1].cone[k]) << k;
    EXPECT_GT(t[1].cone[k], t[2].cone[k]) << k;
  }
  EXPECT_GT(t[0].phi_hi - t[0].phi_lo, t[2].phi_hi - t[2].phi_lo);
  for (int k = 0; k < 3; ++k) EXPECT_LE(axis_error(t[1], truth(), k), t[1].cone[k]) << k;
  EXPECT_LE(t[1].phi_lo, 0.3 + 0.05);  // the interval reaches the true Phi within the bias seen in test_stress
  EXPECT_GE(t[1].phi_hi, 0.3 - 0.05);
}

TEST(Bootstrap, LevelOneKeepsEverything) {
  // level 1: every resample is kept, so cones can only grow relative to 0.95.
  const std::vector<SlipDatum> data = noisy_data(truth(), 80, 10.0, 3);
  BootstrapOptions o;
  o.resamples = 400;
  o.seed = 1;
  StressTensor a, b;
  ASSERT_EQ(stress_bootstrap(data.data(), data.size(), o, a), StressStatus::Ok);
  o.level = 1.0;
  ASSERT_EQ(stress_bootstrap(data.data(), data.size(), o, b), StressStatus::Ok);
  for (int k = 0; k < 3; ++k) EXPECT_GE(b.cone[k], a.cone[k]);
  EXPECT_LE(b.phi_lo, a.phi_lo);
  EXPECT_GE(b.phi_hi, a.phi_hi);
}

TEST(Bootstrap, DegenerateResamplesMakeConfidenceUndefined) {
  // Five data: about 10 % of resamples draw at most two distinct faults, which
  // cannot constrain a tensor (305 of the 3125 equally likely draws; derived by
  // counting). Those are "infinitely far", so at level 0.95 one is kept and the
  // cones are undefined, while the best tensor is still given (bootstrap.hpp).
  const std::vector<SlipDatum> data = noisy_data(truth(), 5, 5.0, 4);
  BootstrapOptions o;
  o.resamples = 1000;
  o.seed = 3;
  StressTensor t;
  ASSERT_EQ(stress_bootstrap(data.data(), data.size(), o, t), StressStatus::Ok);
  EXPECT_FALSE(t.flags & kStressHasCones);
  EXPECT_FALSE(t.flags & kStressHasPhiInterval);
  EXPECT_EQ(t.cone[0], 0.0);
  EXPECT_TRUE(t.flags & kStressHasMisfit);
  check_stress_tensor(t);
  o.level = 0.5;
  ASSERT_EQ(stress_bootstrap(data.data(), data.size(), o, t), StressStatus::Ok);
  EXPECT_TRUE(t.flags & kStressHasCones);
  check_stress_tensor(t);
}

TEST(Bootstrap, LimitsAndDegenerateGroups) {
  const std::vector<SlipDatum> data = noisy_data(truth(), 20, 5.0, 5);
  StressTensor t;
  BootstrapOptions o;
  EXPECT_EQ(stress_bootstrap(data.data(), 0, o, t), StressStatus::Empty);
  EXPECT_EQ(stress_bootstrap(data.data(), 3, o, t), StressStatus::TooFewData);
  std::vector<SlipDatum> same(20, data[0]);
  EXPECT_EQ(stress_bootstrap(same.data(), same.size(), o, t), StressStatus::Degenerate);
  auto expect_param = [&](const BootstrapOptions &bad) {
    try {
      stress_bootstrap(data.data(), data.size(), bad, t);
      FAIL();
    } catch (const Error &e) {
      EXPECT_EQ(e.kind, ErrorKind::InvalidParameter);
    }
  };
  BootstrapOptions bad = o;
  bad.resamples = 0;
  expect_param(bad);
  bad.resamples = kMaxResamples + 1;
  expect_param(bad);
  bad = o;
  bad.level = 0.4;
  expect_param(bad);
  bad.level = NAN;
  expect_param(bad);
  std::vector<SlipDatum> broken = data;
  broken[7].u[0] += 0.1;
  try {
    stress_bootstrap(broken.data(), broken.size(), o, t);
    FAIL();
  } catch (const Error &e) {
    EXPECT_EQ(e.kind, ErrorKind::DataError);
  }
  o.resamples = 1;
  ASSERT_EQ(stress_bootstrap(data.data(), data.size(), o, t), StressStatus::Ok);  // one resample is allowed
}

TEST(Bootstrap, Speed1000ResamplesOf10000Data) {
  // Target (brief): well under 0.3 s on the development machine; checked loosely
  // here (machines differ), the measured time is printed.
  const std::vector<SlipDatum> data = noisy_data(truth(), 10000, 10.0, 6);
  BootstrapOptions o;
  o.resamples = 1000;
  o.seed = 11;
  StressTensor t;
  const auto t0 = std::chrono::steady_clock::now();
  ASSERT_EQ(stress_bootstrap(data.data(), data.size(), o, t), StressStatus::Ok);
  const double secs = std::chrono::duration<double>(std::chrono::steady_clock::now() - t0).count();
  std::printf("[ timing   ] bootstrap: 1000 resamples of 10000 data in %.3f s\n", secs);
  EXPECT_LT(secs, 2.0);
  EXPECT_LT(t.cone[0], 5.0);
}

// ---------------------------------------------------------------------------
// Focal-mechanism bootstrap
// ---------------------------------------------------------------------------

TEST(FocalBootstrap, ReproducibleAndConsistentWithTheInversion) {
  // Mechanisms of well-oriented faults, planes shuffled.
  std::vector<SlipDatum> data = noisy_data(truth(), 150, 5.0, 8, 0.9);
  Rng r(9);
  for (SlipDatum &d : data)
    if (r.uniform() < 0.5)
      for (int k = 0; k < 3; ++k) std::swap(d.n[k], d.u[k]);
  FrictionRange fr;
  fr.mu_min = 0.4;
  fr.mu_max = 0.8;
  fr.step = 0.2;
  BootstrapOptions o;
  o.resamples = 200;
  o.seed = 12;
  std::vector<uint8_t> p1(data.size()), p2(data.size()), p0(data.size());
  FocalInversion a, b, plain;
  ASSERT_EQ(focal_bootstrap(data.data(), data.size(), fr, o, p1.data(), a), StressStatus::Ok);
  ASSERT_EQ(focal_bootstrap(data.data(), data.size(), fr, o, p2.data(), b), StressStatus::Ok);
  EXPECT_EQ(0, std::memcmp(&a.tensor, &b.tensor, sizeof a.tensor));
  EXPECT_EQ(p1, p2);
  // The best solution is the plain joint inversion.
  ASSERT_EQ(invert_focal(data.data(), data.size(), fr, p0.data(), plain), StressStatus::Ok);
  EXPECT_EQ(p0, p1);
  EXPECT_EQ(0, std::memcmp(&plain.tensor, &a.tensor, 6 * sizeof(double)));
  EXPECT_EQ(plain.friction, a.friction);
  EXPECT_EQ(plain.tensor.mean_misfit, a.tensor.mean_misfit);
  ASSERT_TRUE(a.tensor.flags & kStressHasCones);
  EXPECT_TRUE(a.tensor.flags & kStressFocalJoint);
  for (int k = 0; k < 3; ++k) {
    EXPECT_GT(a.tensor.cone[k], 0.0);
    EXPECT_LT(a.tensor.cone[k], 20.0);
    EXPECT_LE(axis_error(a.tensor, truth(), k), a.tensor.cone[k]) << k;
  }
  check_stress_tensor(a.tensor);
}
