// Unit tests of src/core/rotation, moment and phases: rotations and back-tilting,
// summed moment tensors, stress-phase separation and misfit summaries.
// Synthetic data from striae::Rng with fixed seeds (round-trip tests); hand-worked
// cases carry their working in the comments.
#include "focal.hpp"
#include "moment.hpp"
#include "phases.hpp"
#include "rotation.hpp"

#include <gtest/gtest.h>

#include <algorithm>
#include <cmath>
#include <cstring>
#include <vector>

using namespace striae;

namespace {

Vec3 random_unit(Rng &r) {
  for (;;) {
    const Vec3 v(2 * r.uniform() - 1, 2 * r.uniform() - 1, 2 * r.uniform() - 1);
    const double l = v.norm();
    if (l > 0.1 && l <= 1.0) return v / l;
  }
}

void expect_fault(const FaultSlip &got, double s, double d, double r, double tol = 1e-9) {
  EXPECT_NEAR(got.strike, s, tol);
  EXPECT_NEAR(got.dip, d, tol);
  EXPECT_NEAR(got.rake, r, tol);
}

// Axial angle between two lines, degrees.
double line_angle(const Line &a, const Line &b) { return angle(a, b); }

}  // namespace

// ---- rotations ------------------------------------------------------------------

TEST(Rotation, RightHandRuleAboutTheDownwardVertical) {
  // About 0/90 (pointing down) a positive angle turns north toward east
  // (derived from Rodrigues' formula: a x v = (0,0,1) x (1,0,0) = (0,1,0)).
  const Mat3 r = rotation_matrix(line_vector(make_line(0, 90)), 90);
  const Vec3 v = r * Vec3(1, 0, 0);
  EXPECT_NEAR((v - Vec3(0, 1, 0)).norm(), 0, 1e-15);
  const Plane p = rotate(make_plane(10, 40), rotation_matrix(Vec3(0, 0, 1), 30));
  EXPECT_NEAR(p.strike, 40, 1e-9);
  EXPECT_NEAR(p.dip, 40, 1e-9);
  const Plane q = rotate_vertical(make_plane(10, 40), 30);
  EXPECT_EQ(q.strike, 40);  // exact in degrees
  EXPECT_EQ(rotate_vertical(make_line(350, 20), 20).trend, 10);
  EXPECT_EQ(rotate_vertical(make_line(170, 0), 20).trend, 10);  // horizontal: canonical 0..180
}

TEST(Rotation, UntiltWorkedCases) {
  // Worked by hand (NED; angles in the vertical plane normal to the bedding strike).
  // Bed 270/30 dips north 30; its strike vector points west. Untilting turns the
  // north-down direction at 30 below north up to north, so in the north-down plane
  // every direction turns by 30 from down toward north... seen from the south side
  // a fault 090/60 (dipping south 60) has its down-dip vector at 120 degrees from
  // north (60 below south); it goes to 90: straight down. The fault becomes
  // vertical, striking 090; its upward normal (north 0.866? no: for 090/60,
  // n = (-sin60, 0, -cos60), up and south) goes to due south; the normal slip
  // (rake -90, u = down-dip) goes to straight down. With n = south and u = down,
  // strike = atan2(-n_N, n_E) = 90, dip 90, rake = atan2(-u.dd, u.s) = -90.
  expect_fault(rotate(make_fault_slip(90, 60, -90), untilt_matrix(make_plane(270, 30), false)), 90, 90, -90);
  // Bed 000/30 (dips east 30): the fault 180/60/-90 (dips west 60, hanging wall west)
  // turns vertical striking N-S, its hanging wall (west block) moves down. In
  // canonical form the vertical plane has strike 0 and the east block as hanging
  // wall, which moves up: 0/90/90 is the same relative motion.
  expect_fault(rotate(make_fault_slip(180, 60, -90), untilt_matrix(make_plane(0, 30), false)), 0, 90, 90);
  // Note: with bed 000/30 the fault 090/60/-90 does not become vertical: its normal
  // (-0.866, 0, -0.5) turns to (-0.866, -0.25, -0.433), a dip of acos(0.433) = 64.3.
  const FaultSlip g = rotate(make_fault_slip(90, 60, -90), untilt_matrix(make_plane(0, 30), false));
  EXPECT_NEAR(g.dip, deg(std::acos(0.5 * std::cos(rad(30)))), 1e-9);
  // The bed itself always restores to horizontal; the upward normal goes up.
  Rng rng(5);
  for (int i = 0; i < 200; ++i) {
    const Plane bed = make_plane(360 * rng.uniform(), 90 * rng.uniform());
    const Plane flat = rotate(bed, untilt_matrix(bed, false));
    EXPECT_EQ(flat.dip, 0);
    EXPECT_NEAR((untilt_matrix(bed, false) * plane_normal(bed) - Vec3(0, 0, -1)).norm(), 0, 1e-12);
    // Overturned: the younging direction is the downward pole; it must end up.
    EXPECT_NEAR((untilt_matrix(bed, true) * pole_vector(bed) - Vec3(0, 0, -1)).norm(), 0, 1e-12);
  }
}

TEST(Rotation, CompositionAndInverse) {
  Rng rng(11);
  for (int i = 0; i < 500; ++i) {
    const Vec3 a = random_unit(rng);
    const double w1 = 720 * rng.uniform() - 360, w2 = 720 * rng.uniform() - 360;
    const Mat3 r1 = rotation_matrix(a, w1), r2 = rotation_matrix(a, w2);
    EXPECT_LT((r2 * r1 - rotation_matrix(a, w1 + w2)).norm(), 1e-13);
    EXPECT_LT((r1.transpose() - rotation_matrix(a, -w1)).norm(), 1e-14);
    EXPECT_LT((rotation_matrix(-a, w1) - rotation_matrix(a, -w1)).norm(), 1e-14);
    const FaultSlip f = make_fault_slip(360 * rng.uniform(), 90 * rng.uniform(), 360 * rng.uniform() - 180);
    const FaultSlip back = rotate(rotate(f, r1), rotation_matrix(a, -w1));
    EXPECT_LT(kagan_angle(f, back), 1e-7);
    Vec3 n0, u0, n1, u1;
    fault_vectors(f, n0, u0);
    fault_vectors(back, n1, u1);
    // Same fault plane and the same slip (not the auxiliary): sense kept.
    EXPECT_LT(std::min((n0 - n1).norm() + (u0 - u1).norm(), (n0 + n1).norm() + (u0 + u1).norm()), 1e-9);
  }
}

TEST(Rotation, FaultKeepsItsSense) {
  // A rotation about the vertical keeps dip and rake, so the sense words stay.
  Rng rng(3);
  for (int i = 0; i < 200; ++i) {
    const FaultSlip f = make_fault_slip(360 * rng.uniform(), 5 + 80 * rng.uniform(), 360 * rng.uniform() - 180);
    const double w = 360 * rng.uniform();
    const FaultSlip g = rotate(f, rotation_matrix(Vec3(0, 0, 1), w));
    EXPECT_NEAR(g.rake, f.rake, 1e-9);
    EXPECT_STREQ(slip_sense(g), slip_sense(f));
    const FaultSlip h = rotate_vertical(f, w);
    EXPECT_NEAR(h.strike, g.strike, 1e-9);
  }
}

TEST(Rotation, PlungingFoldRestoration) {
  // Fold axis 030/20; a limb containing the axis: the plane through the axis and
  // the line 120+20.. built as the plane through the axis and a line 50 degrees
  // off it within the limb. After restoration the limb is horizontal and the fold
  // axis horizontal with its trend kept (step 1 keeps the trend; step 2 turns about it).
  const Line axis = make_line(30, 20);
  Rng rng(7);
  for (int i = 0; i < 100; ++i) {
    const Vec3 a = line_vector(axis);
    const Vec3 other = random_unit(rng);
    const Plane limb = normal_plane(a.cross(other));
    const Mat3 r = unfold_matrix(limb, axis, 1e-6);
    EXPECT_NEAR(rotate(limb, r).dip, 0, 1e-9);
    const Line a2 = rotate(axis, r);
    EXPECT_LT(angle(a2, make_line(30, 0)), 1e-9);  // axial: 030/00 = 210/00
  }
  // Step 1 alone (a horizontal limb is not needed): a limb that does not contain the
  // axis is refused.
  EXPECT_THROW(unfold_matrix(make_plane(0, 0), axis, 10), Error);
  EXPECT_NO_THROW(unfold_matrix(make_plane(0, 0), axis, 25));
  EXPECT_THROW(unfold_matrix(make_plane(0, 0), axis, 90), Error);
  EXPECT_THROW(rotation_matrix(Vec3(0, 0, 0), 10), Error);
  EXPECT_THROW(rotation_matrix(Vec3(0, 0, 1), NAN), Error);
  EXPECT_THROW(direction_vector(0, 91), Error);
}

TEST(Constructors, NumericAzimuthsWrap) {
  EXPECT_EQ(make_line_wrapping(-10, 30).trend, 350);
  EXPECT_EQ(make_plane_wrapping(370, 30).strike, 10);
  EXPECT_EQ(make_plane_wrapping(-725, 30).strike, 355);
  const FaultSlip f = make_fault_slip_wrapping(400, 50, 190);
  EXPECT_EQ(f.strike, 40);
  EXPECT_EQ(f.rake, -170);
  EXPECT_EQ(make_plane_from_dip_direction_wrapping(-90, 30).strike, 180);
  EXPECT_THROW(make_plane_wrapping(INFINITY, 30), Error);
  EXPECT_THROW(make_plane_wrapping(10, 91), Error);
  EXPECT_THROW(make_line_wrapping(10, -91), Error);
  EXPECT_THROW(make_plane(370, 30), Error);  // the strict form stays strict
}

// ---- summed moment tensors ----------------------------------------------------------

TEST(Moment, IdenticalMechanismsGiveThemselves) {
  const FaultSlip f = make_fault_slip(30, 60, 40);
  MomentAccum s;
  moment_init(s);
  for (int i = 0; i < 7; ++i) moment_add(s, f, 1.0, false);
  MomentSummary m;
  ASSERT_TRUE(moment_finalise(s, m));
  ASSERT_TRUE(m.has_axes);
  const auto ref = moment_tensor_ned(f);
  for (int i = 0; i < 6; ++i) EXPECT_NEAR(m.tensor[i], ref[i], 1e-14);
  EXPECT_EQ(m.epsilon, 0.0);
  EXPECT_NEAR(m.consistency, 1.0, 1e-14);
  EXPECT_NEAR(m.scalar_moment, 7.0, 1e-13);
  expect_fault(m.best_dc, 30, 60, 40, 1e-8);
  EXPECT_LT(line_angle(m.p, p_axis(f)), 1e-8);
  EXPECT_LT(line_angle(m.t, t_axis(f)), 1e-8);
  // The same mechanism given by its auxiliary plane: the auxiliary comes back.
  moment_init(s);
  const FaultSlip g = auxiliary(f);
  for (int i = 0; i < 3; ++i) moment_add(s, g, 1.0, false);
  ASSERT_TRUE(moment_finalise(s, m));
  expect_fault(m.best_dc, g.strike, g.dip, g.rake, 1e-8);
}

TEST(Moment, OppositeSlipsCancelAndClvd) {
  MomentAccum s;
  moment_init(s);
  moment_add(s, make_fault_slip(123, 47, 35), 1.0, false);
  moment_add(s, make_fault_slip(123, 47, 35 - 180), 1.0, false);
  MomentSummary m;
  ASSERT_TRUE(moment_finalise(s, m));
  EXPECT_FALSE(m.has_axes);
  EXPECT_EQ(m.count, 2);
  EXPECT_LT(m.consistency, 1e-12);
  // Two thrusts (0/45/90: P east-west, T vertical) and (90/45/90: P north-south,
  // T vertical) add to diag-like eigenvalues (-1, -1, 2): a pure CLVD, epsilon
  // = -(-1)/2 = 0.5 (Giardini 1984 definition as recalled).
  moment_init(s);
  moment_add(s, make_fault_slip(0, 45, 90), 1.0, false);
  moment_add(s, make_fault_slip(90, 45, 90), 1.0, false);
  ASSERT_TRUE(moment_finalise(s, m));
  EXPECT_NEAR(m.epsilon, 0.5, 1e-12);
  EXPECT_NEAR(m.t.plunge, 90, 1e-9);
}

TEST(Moment, WeightsCombineAndErrors) {
  // Hanks & Kanamori (1979) as IASPEI: Mw 6 is 10^18.1 N m.
  EXPECT_NEAR(moment_from_magnitude(6.0) / std::pow(10.0, 18.1), 1.0, 1e-14);
  EXPECT_THROW(moment_from_magnitude(13), Error);
  EXPECT_THROW(moment_from_magnitude(NAN), Error);
  Rng rng(17);
  MomentAccum all, a, b;
  moment_init(all);
  moment_init(a);
  moment_init(b);
  for (int i = 0; i < 300; ++i) {
    const FaultSlip f = make_fault_slip(360 * rng.uniform(), 90 * rng.uniform(), 360 * rng.uniform() - 180);
    const double m0 = moment_from_magnitude(2 + 5 * rng.uniform());
    moment_add(all, f, m0, true);
    moment_add(i % 3 ? a : b, f, m0, true);
  }
  moment_combine(a, b);
  MomentSummary x, y;
  ASSERT_TRUE(moment_finalise(all, x));
  ASSERT_TRUE(moment_finalise(a, y));
  for (int i = 0; i < 6; ++i) EXPECT_NEAR(x.tensor[i], y.tensor[i], 1e-12);
  EXPECT_NEAR(x.moment_sum / y.moment_sum, 1.0, 1e-15);
  MomentAccum u;
  moment_init(u);
  moment_add(u, make_fault_slip(0, 45, 90), 1.0, false);
  EXPECT_THROW(moment_combine(a, u), Error);
  EXPECT_THROW(moment_add(u, make_fault_slip(0, 45, 90), 1e18, true), Error);
  u.m[0] = NAN;
  EXPECT_THROW(moment_validate(u), Error);
  double rate[6];
  EXPECT_THROW(kostrov_strain_rate(x.summed, 0, 1, 3e10, rate), Error);
  kostrov_strain_rate(x.summed, 1e12, 3.15e7, 3e10, rate);
  EXPECT_NEAR(rate[2], x.summed[2] / (2 * 3e10 * 1e12 * 3.15e7), 1e-12 * std::fabs(rate[2]));
}

// ---- stress phases ----------------------------------------------------------------

namespace {

// Datum on a random plane with Wallace-Bott slip under t, the slip then turned
// about the normal by a normal variate of sd degrees (slip noise).
bool noisy_datum(Rng &rng, const StressTensor &t, double sd, SlipDatum &d) {
  Vec3 n = random_unit(rng);
  if (n.z() > 0) n = -n;
  const auto s = resolved_slip(n, t);
  if (!s) return false;
  const Vec3 u = rotation_matrix(n, sd * rng.normal()) * *s;
  for (int k = 0; k < 3; ++k) {
    d.n[k] = n[k];
    d.u[k] = u[k];
  }
  return true;
}

struct Mixture {
  std::vector<SlipDatum> data;
  std::vector<int> truth;
};

Mixture mixture(uint64_t seed, const std::vector<StressTensor> &ts, const std::vector<int> &counts, double sd) {
  Rng rng(seed);
  Mixture m;
  for (size_t j = 0; j < ts.size(); ++j)
    for (int i = 0; i < counts[j];) {
      SlipDatum d;
      if (!noisy_datum(rng, ts[j], sd, d)) continue;
      m.data.push_back(d);
      m.truth.push_back(static_cast<int>(j));
      ++i;
    }
  return m;
}

// Separate, match each true tensor to a recovered phase (distinct, by smallest
// sigma1 + sigma3 error over all permutations), check axes within tol_deg, Phi
// within tol_phi, and return the share of data assigned to their true phase.
double check_separation(const Mixture &m, const std::vector<StressTensor> &ts, double tol_deg, double tol_phi) {
  // Sorting changes the order: keep the truth with each datum.
  std::vector<std::pair<SlipDatum, int>> paired;
  for (size_t i = 0; i < m.data.size(); ++i) paired.push_back({m.data[i], m.truth[i]});
  std::vector<SlipDatum> data(m.data);
  sort_slip_data(data.data(), data.size());
  PhaseOptions o;
  o.phases = static_cast<int32_t>(ts.size());
  o.seed = 99;
  std::vector<StressTensor> out;
  std::vector<uint8_t> assign;
  EXPECT_EQ(separate_phases(data.data(), data.size(), o, out, &assign), StressStatus::Ok);
  if (out.size() != ts.size()) return 0.0;
  const size_t k = ts.size();
  std::vector<int> perm(k), best_perm;
  for (size_t j = 0; j < k; ++j) perm[j] = static_cast<int>(j);
  double best = 1e9;
  do {
    double e = 0;
    for (size_t j = 0; j < k; ++j)
      e += angle(stress_axis(ts[j], 1), stress_axis(out[perm[j]], 1)) +
           angle(stress_axis(ts[j], 3), stress_axis(out[perm[j]], 3));
    if (e < best) {
      best = e;
      best_perm = perm;
    }
  } while (std::next_permutation(perm.begin(), perm.end()));
  for (size_t j = 0; j < k; ++j) {
    const StressTensor &r = out[best_perm[j]];
    EXPECT_LT(angle(stress_axis(ts[j], 1), stress_axis(r, 1)), tol_deg) << "phase " << j;
    EXPECT_LT(angle(stress_axis(ts[j], 3), stress_axis(r, 3)), tol_deg) << "phase " << j;
    EXPECT_LT(std::fabs(shape_ratio(ts[j]) - shape_ratio(r)), tol_phi) << "phase " << j;
    EXPECT_TRUE(r.flags & kStressHasMisfit);
  }
  // Data are sorted: find each datum's truth through the same sort of the pairs.
  std::sort(paired.begin(), paired.end(), [](const auto &x, const auto &y) {
    const auto kx = std::tie(x.first.n[0], x.first.n[1], x.first.n[2], x.first.u[0], x.first.u[1], x.first.u[2]);
    const auto ky = std::tie(y.first.n[0], y.first.n[1], y.first.n[2], y.first.u[0], y.first.u[1], y.first.u[2]);
    return kx < ky;
  });
  size_t right = 0;
  for (size_t i = 0; i < data.size(); ++i)
    if (assign[i] == best_perm[paired[i].second]) ++right;
  // Each datum's phase from the per-datum rule agrees with the aggregate's.
  for (size_t i = 0; i < data.size(); ++i) {
    std::optional<double> mis;
    const Vec3 n(data[i].n[0], data[i].n[1], data[i].n[2]), u(data[i].u[0], data[i].u[1], data[i].u[2]);
    EXPECT_EQ(best_phase(n, u, out.data(), out.size(), mis), assign[i]);
  }
  return static_cast<double>(right) / static_cast<double>(data.size());
}

}  // namespace

// Invented stress states: compression E-W, extension N-S, strike-slip NE.
const StressTensor kCompression = stress_from_axes(make_line(90, 5), make_line(0, 85), 0.4);
const StressTensor kExtension = stress_from_axes(make_line(20, 80), make_line(0, 10), 0.5);
const StressTensor kStrikeSlip = stress_from_axes(make_line(45, 2), make_line(135, 3), 0.5);

// Tolerance stated in phases.hpp / README: sigma1, sigma3 within 10 degrees and Phi
// within 0.2 of the generating tensor (the linear inversion alone is biased by up
// to ~3 degrees and 0.12 on random planes, stress.hpp), >= 85 % assigned right.
TEST(Phases, TwoStressesHalfAndHalf) {
  for (double sd : {5.0, 10.0}) {
    const std::vector<StressTensor> ts = {kCompression, kExtension};
    const Mixture m = mixture(1, ts, {100, 100}, sd);
    const double share = check_separation(m, ts, 10.0, 0.2);
    EXPECT_GE(share, 0.85) << "slip noise " << sd;
    std::printf("  two phases 50/50, slip noise %g deg: %.1f %% assigned to their true phase\n", sd, 100 * share);
  }
}

TEST(Phases, TwoStressesSeventyThirty) {
  for (double sd : {5.0, 10.0}) {
    const std::vector<StressTensor> ts = {kCompression, kStrikeSlip};
    const Mixture m = mixture(2, ts, {140, 60}, sd);
    const double share = check_separation(m, ts, 10.0, 0.2);
    EXPECT_GE(share, 0.85) << "slip noise " << sd;
    std::printf("  two phases 70/30, slip noise %g deg: %.1f %% assigned to their true phase\n", sd, 100 * share);
  }
}

TEST(Phases, ThreeStresses) {
  const std::vector<StressTensor> ts = {kCompression, kExtension, kStrikeSlip};
  for (double sd : {5.0, 10.0}) {
    const Mixture m = mixture(3, ts, {150, 90, 60}, sd);
    const double share = check_separation(m, ts, 10.0, 0.2);
    EXPECT_GE(share, 0.85) << "slip noise " << sd;
    std::printf("  three phases 50/30/20, slip noise %g deg: %.1f %% assigned to their true phase\n", sd, 100 * share);
  }
}

TEST(Phases, DeterministicOrderFreeAndLimits) {
  const std::vector<StressTensor> ts = {kCompression, kExtension};
  Mixture m = mixture(4, ts, {40, 40}, 5);
  std::vector<SlipDatum> a(m.data), b(m.data);
  std::reverse(b.begin(), b.end());
  sort_slip_data(a.data(), a.size());
  sort_slip_data(b.data(), b.size());
  PhaseOptions o;
  o.seed = 5;
  std::vector<StressTensor> x, y;
  ASSERT_EQ(separate_phases(a.data(), a.size(), o, x), StressStatus::Ok);
  ASSERT_EQ(separate_phases(b.data(), b.size(), o, y), StressStatus::Ok);
  ASSERT_EQ(x.size(), 2u);
  EXPECT_EQ(std::memcmp(x.data(), y.data(), 2 * sizeof(StressTensor)), 0);
  EXPECT_EQ(x[0].data_count + x[1].data_count, 80);
  EXPECT_GE(x[0].data_count, x[1].data_count);
  // k = 1 is the plain inversion with its mean misfit.
  o.phases = 1;
  ASSERT_EQ(separate_phases(a.data(), a.size(), o, x), StressStatus::Ok);
  StressAccum acc;
  stress_init(acc);
  for (const auto &d : a) stress_add(acc, Vec3(d.n[0], d.n[1], d.n[2]), Vec3(d.u[0], d.u[1], d.u[2]));
  StressTensor plain;
  ASSERT_EQ(stress_finalise(acc, plain), StressStatus::Ok);
  EXPECT_NEAR(x[0].nn, plain.nn, 1e-12);
  EXPECT_NEAR(x[0].mean_misfit, *mean_misfit(a.data(), a.size(), plain), 1e-9);
  o.phases = 3;
  EXPECT_EQ(separate_phases(a.data(), 11, o, x), StressStatus::TooFewData);
  EXPECT_EQ(separate_phases(a.data(), 0, o, x), StressStatus::Empty);
  o.phases = 9;
  EXPECT_THROW(separate_phases(a.data(), a.size(), o, x), Error);
  o.phases = 2;
  o.starts = 0;
  EXPECT_THROW(separate_phases(a.data(), a.size(), o, x), Error);
}

TEST(Phases, CancellationIsPolled) {
  const std::vector<StressTensor> ts = {kCompression, kExtension};
  Mixture m = mixture(4, ts, {40, 40}, 5);
  interrupt_hook = [] { return true; };
  PhaseOptions o;
  std::vector<StressTensor> out;
  EXPECT_THROW(separate_phases(m.data.data(), m.data.size(), o, out), Cancelled);
  interrupt_hook = nullptr;
}

TEST(MisfitSummary, MeanMedianAbove) {
  std::vector<double> v = {10, 40, 20, 5};
  MisfitSummary s;
  ASSERT_TRUE(summarise_misfits(v.data(), v.size(), 1, 30, s));
  EXPECT_EQ(s.count, 4);
  EXPECT_EQ(s.undefined, 1);
  EXPECT_EQ(s.above, 1);
  EXPECT_DOUBLE_EQ(s.mean, 18.75);
  EXPECT_DOUBLE_EQ(s.median, 15);  // (10 + 20) / 2
  std::vector<double> w = {7, 3, 9};
  ASSERT_TRUE(summarise_misfits(w.data(), w.size(), 0, 8, s));
  EXPECT_DOUBLE_EQ(s.median, 7);
  EXPECT_EQ(s.above, 1);
  EXPECT_FALSE(summarise_misfits(w.data(), 0, 2, 8, s));
  EXPECT_THROW(summarise_misfits(w.data(), w.size(), 0, 181, s), Error);
  // "above" means strictly above the threshold (phases.hpp): a misfit equal to it is not.
  std::vector<double> e = {30, 30.000001, 29.999999, 0};
  ASSERT_TRUE(summarise_misfits(e.data(), e.size(), 0, 30, s));
  EXPECT_EQ(s.above, 1);
  std::vector<double> z = {0, 0, 0};
  ASSERT_TRUE(summarise_misfits(z.data(), z.size(), 0, 0, s));
  EXPECT_EQ(s.above, 0);
}

TEST(Phases, UndefinedMisfitCountsAsNinetyDegrees) {
  // phases.hpp: a datum whose plane is normal to a principal axis of a tensor has
  // no misfit under it and counts as 90 degrees there, so a tensor under which it
  // misfits by 60 degrees takes it, and one under which it misfits by 120 does not.
  const StressTensor a = stress_from_axes(make_line(30, 60), make_line(210, 30), 0.3);
  const StressTensor b = stress_from_axes(make_line(100, 10), make_line(5, 30), 0.6);
  Vec3 n = principal_stresses(a).axis[0];
  if (n.z() > 0) n = -n;
  const Vec3 tau = *resolved_slip(n, b);  // predicted slip under b, in the plane
  const Vec3 side = n.cross(tau);         // in the plane, at right angles to tau
  for (double want : {60.0, 120.0}) {
    const Vec3 u = std::cos(rad(want)) * tau + std::sin(rad(want)) * side;
    const StressTensor ts[2] = {a, b};
    std::optional<double> m;
    const int j = best_phase(n, u, ts, 2, m);
    if (want < 90) {
      EXPECT_EQ(j, 1);
      ASSERT_TRUE(m.has_value());
      EXPECT_NEAR(*m, 60.0, 1e-9);
    } else {
      EXPECT_EQ(j, 0);
    }
  }
}
