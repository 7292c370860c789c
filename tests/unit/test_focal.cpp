// Unit tests of focal-mechanism geometry (src/core/focal.*).
#include <gtest/gtest.h>

#include <cmath>

#include "focal.hpp"
#include "test_rng.hpp"

using namespace striae;

namespace {

using striae_test::Rng;

void expect_fault(const FaultSlip &f, double s, double d, double r, double tol) {
  EXPECT_NEAR(f.strike, s, tol);
  EXPECT_NEAR(f.dip, d, tol);
  EXPECT_NEAR(f.rake, r, tol);
}

}  // namespace

TEST(Auxiliary, ShearerExample) {
  // Shearer, Introduction to Seismology, 2nd ed., sec. 9.3: (30, 60, 40) has
  // auxiliary plane (277.2, 56.2, 143.0) to the printed precision.
  expect_fault(auxiliary(FaultSlip{30, 60, 40}), 277.2, 56.2, 143.0, 0.06);
}

TEST(Auxiliary, CanonicalCases) {
  // Derived from Aki & Richards conventions (METHODS.md section 2).
  expect_fault(auxiliary(FaultSlip{0, 45, 90}), 180, 45, 90, 0);
  expect_fault(auxiliary(FaultSlip{0, 45, -90}), 180, 45, -90, 0);
  // Vertical sinistral on 0/90: the auxiliary is the vertical E-W plane, and
  // the canonical vertical form (strike in [0,180)) is 90/90/180.
  expect_fault(auxiliary(FaultSlip{0, 90, 0}), 90, 90, 180, 0);
}

TEST(Auxiliary, PublishedSolutionsFromMemory) {
  // Global CMT best double couples, recalled from memory (nodal planes as
  // commonly quoted, 1-degree precision): Tohoku 2011 203/10/88 with 25/80/90;
  // Sumatra-Andaman 2004 329/8/110 with 129/83/87.
  expect_fault(auxiliary(FaultSlip{203, 10, 88}), 25, 80, 90, 0.6);
  expect_fault(auxiliary(FaultSlip{329, 8, 110}), 129, 83, 87, 0.8);
}

TEST(Auxiliary, InvolutionOnRandomMechanisms) {
  Rng r(7);
  for (int i = 0; i < 3000; ++i) {
    const FaultSlip f = make_fault_slip(360 * r.uniform(), 1 + 88 * r.uniform(), 360 * r.uniform() - 180);
    const FaultSlip g = auxiliary(auxiliary(f));
    expect_fault(g, f.strike, f.dip, f.rake, 1e-8);
    // The two nodal planes are perpendicular.
    Vec3 n1, u1, n2, u2;
    fault_vectors(f, n1, u1);
    fault_vectors(auxiliary(f), n2, u2);
    EXPECT_NEAR(std::fabs(n1.dot(n2)), 0, 1e-9);
    EXPECT_LT(kagan_angle(f, auxiliary(f)), 1e-8);
  }
}

TEST(Axes, CanonicalCases) {
  // Pure thrust on 0/45: P horizontal E-W, T vertical (derived from A&R).
  Line p = p_axis(FaultSlip{0, 45, 90}), t = t_axis(FaultSlip{0, 45, 90});
  EXPECT_EQ(p.plunge, 0);
  EXPECT_EQ(p.trend, 90);
  EXPECT_EQ(t.plunge, 90);
  // Pure normal swaps P and T.
  p = p_axis(FaultSlip{0, 45, -90});
  t = t_axis(FaultSlip{0, 45, -90});
  EXPECT_EQ(p.plunge, 90);
  EXPECT_EQ(t.trend, 90);
  EXPECT_EQ(t.plunge, 0);
  // Vertical sinistral 0/90/0: P 315/00 (= 135/00 axially), T 225/00 (= 045/00).
  p = p_axis(FaultSlip{0, 90, 0});
  t = t_axis(FaultSlip{0, 90, 0});
  EXPECT_EQ(p.trend, 135);
  EXPECT_EQ(t.trend, 45);
  EXPECT_EQ(b_axis(FaultSlip{0, 90, 0}).plunge, 90);
}

TEST(MomentTensor, ThrustAndUse) {
  // M = n u^T + u n^T for the thrust 0/45/90: Mee = -1, Mdd = +1 (derived, A&R Box 4.4).
  // The closed form gives these exactly.
  auto m = moment_tensor_ned(FaultSlip{0, 45, 90});
  EXPECT_EQ(m[0], 0);
  EXPECT_EQ(m[1], -1);
  EXPECT_EQ(m[2], 1);
  auto u = moment_tensor_use(FaultSlip{0, 45, 90});
  EXPECT_EQ(u[0], 1);   // Mrr = Mdd
  EXPECT_EQ(u[2], -1);  // Mpp = Mee
  // Trace zero, unit Frobenius norm / sqrt2 on random mechanisms.
  Rng r(3);
  for (int i = 0; i < 500; ++i) {
    const FaultSlip f = make_fault_slip(360 * r.uniform(), 90 * r.uniform(), 360 * r.uniform() - 180);
    auto a = moment_tensor_ned(f);
    // The closed form is M = n u^T + u n^T of the fault's own unit vectors.
    Vec3 n, sl;
    fault_vectors(f, n, sl);
    const int ij[6][2] = {{0, 0}, {1, 1}, {2, 2}, {0, 1}, {0, 2}, {1, 2}};
    for (int k = 0; k < 6; ++k)
      EXPECT_NEAR(a[k], n[ij[k][0]] * sl[ij[k][1]] + sl[ij[k][0]] * n[ij[k][1]], 2e-15) << k;
    EXPECT_NEAR(a[0] + a[1] + a[2], 0, 1e-14);
    const double fro = a[0] * a[0] + a[1] * a[1] + a[2] * a[2] + 2 * (a[3] * a[3] + a[4] * a[4] + a[5] * a[5]);
    EXPECT_NEAR(fro, 2, 1e-13);
    auto b = moment_tensor_use(f);
    EXPECT_DOUBLE_EQ(b[0], a[2]);
    EXPECT_DOUBLE_EQ(b[3], a[4]);
    EXPECT_DOUBLE_EQ(b[4], a[5] == 0 ? 0 : -a[5]);
    // The auxiliary plane has the same moment tensor (the double-couple ambiguity).
    auto c = moment_tensor_ned(auxiliary(f));
    for (int k = 0; k < 6; ++k) EXPECT_NEAR(a[k], c[k], 1e-9);
  }
}

TEST(Kagan, Identities) {
  // Kagan (1991): identical double couples 0; thrust vs normal on the same
  // planes (P and T swapped) is a 90-degree rotation about B.
  EXPECT_EQ(kagan_angle(FaultSlip{30, 60, 40}, FaultSlip{30, 60, 40}), 0);
  EXPECT_NEAR(kagan_angle(FaultSlip{0, 45, 90}, FaultSlip{0, 45, -90}), 90, 1e-9);
  // Rotating a strike-slip mechanism about the vertical B axis by 30 degrees.
  EXPECT_NEAR(kagan_angle(FaultSlip{0, 90, 0}, FaultSlip{30, 90, 0}), 30, 1e-9);
  Rng r(11);
  for (int i = 0; i < 2000; ++i) {
    const FaultSlip a = make_fault_slip(360 * r.uniform(), 90 * r.uniform(), 360 * r.uniform() - 180);
    const FaultSlip b = make_fault_slip(360 * r.uniform(), 90 * r.uniform(), 360 * r.uniform() - 180);
    const double k = kagan_angle(a, b);
    EXPECT_LE(k, 120 + 1e-9);  // Kagan (1991): the maximum is 120 degrees
    EXPECT_NEAR(k, kagan_angle(b, a), 1e-8);
    EXPECT_NEAR(k, kagan_angle(auxiliary(a), b), 1e-7);
  }
}

TEST(MechanismClass, Frohlich) {
  // Thresholds of Frohlich (1992), from memory.
  EXPECT_STREQ(mechanism_class(FaultSlip{0, 45, 90}), "thrust");
  EXPECT_STREQ(mechanism_class(FaultSlip{0, 45, -90}), "normal");
  EXPECT_STREQ(mechanism_class(FaultSlip{0, 90, 0}), "strike-slip");
  // 0/70/30: plunges P 5.2, T 35.0, B 54.5 (numpy recomputation): none passes.
  EXPECT_STREQ(mechanism_class(FaultSlip{0, 70, 30}), "unclassified");
  // 0/60/45: T plunges 51.9 > 50, so thrust although oblique-looking.
  EXPECT_STREQ(mechanism_class(FaultSlip{0, 60, 45}), "thrust");
}
