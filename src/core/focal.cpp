// Focal-mechanism geometry: auxiliary plane, P/T/B axes, moment tensor, Kagan
// angle and mechanism class. Sign conventions: Aki & Richards (1980), NED.
#include "focal.hpp"

#include <algorithm>
#include <cmath>

namespace striae {

FaultSlip auxiliary(const FaultSlip &f) {
  Vec3 n, u;
  fault_vectors(f, n, u);
  return fault_from_vectors(u, n);  // fault_from_vectors flips the pair upward
}

namespace {

void tp_vectors(const FaultSlip &f, Vec3 &t, Vec3 &p) {
  Vec3 n, u;
  fault_vectors(f, n, u);
  t = (n + u) / std::sqrt(2.0);
  p = (n - u) / std::sqrt(2.0);
}

}  // namespace

Line p_axis(const FaultSlip &f) {
  Vec3 t, p;
  tp_vectors(f, t, p);
  return vector_line(p);
}

Line t_axis(const FaultSlip &f) {
  Vec3 t, p;
  tp_vectors(f, t, p);
  return vector_line(t);
}

Line b_axis(const FaultSlip &f) {
  Vec3 t, p;
  tp_vectors(f, t, p);
  return vector_line(t.cross(p));
}

Mat3 ptb_frame(const FaultSlip &f) {
  Vec3 t, p;
  tp_vectors(f, t, p);
  Mat3 m;
  m.col(0) = t;
  m.col(1) = p;
  m.col(2) = t.cross(p);
  return m;
}

std::array<double, 6> moment_tensor_ned(const FaultSlip &f) {
  // M = n u^T + u n^T written out in strike, dip and rake (Aki & Richards
  // 1980, Box 4.4, unit scalar moment, x north, y east, z down). The closed
  // form uses the double angles directly, so textbook mechanisms give exact
  // components (the 45-degree thrust: Mee = -1, Mdd = 1, not 1 +- 2e-16).
  double sf, cf, s2f, c2f, sd, cd, s2d, c2d, sl, cl;
  sincosd(f.strike, sf, cf);
  sincosd(2 * f.strike, s2f, c2f);
  sincosd(f.dip, sd, cd);
  sincosd(2 * f.dip, s2d, c2d);
  sincosd(f.rake, sl, cl);
  // Clean rounding residue of exact zeros; 1e-15 of unit moment.
  auto c = [](double v) { return std::fabs(v) < 1e-15 ? 0.0 : v; };
  const double nn = -(sd * cl * s2f + s2d * sl * sf * sf);
  const double ne = sd * cl * c2f + 0.5 * s2d * sl * s2f;
  const double nd = -(cd * cl * cf + c2d * sl * sf);
  const double ee = sd * cl * s2f - s2d * sl * cf * cf;
  const double ed = -(cd * cl * sf - c2d * sl * cf);
  const double dd = s2d * sl;
  return {c(nn), c(ee), c(dd), c(ne), c(nd), c(ed)};
}

std::array<double, 6> moment_tensor_use(const FaultSlip &f) {
  const auto m = moment_tensor_ned(f);  // nn ee dd ne nd ed
  auto neg = [](double v) { return v == 0.0 ? 0.0 : -v; };
  return {m[2], m[0], m[1], m[4], neg(m[5]), neg(m[3])};
}

double kagan_angle(const FaultSlip &a, const FaultSlip &b) {
  const Mat3 A = ptb_frame(a), B = ptb_frame(b);
  // The four rotations that map a double couple onto itself: identity and
  // 180-degree turns about T, P and B (diagonal sign patterns in the PTB frame).
  static const double signs[4][3] = {{1, 1, 1}, {1, -1, -1}, {-1, 1, -1}, {-1, -1, 1}};
  double best = 360.0;
  for (const auto &s : signs) {
    Mat3 As = A;
    for (int k = 0; k < 3; ++k) As.col(k) *= s[k];
    const Mat3 R = B * As.transpose();
    // Rotation angle from both its cosine (trace) and sine (skew part): atan2
    // keeps full precision near 0, where acos of the trace alone would not.
    const double c = (R.trace() - 1.0) / 2.0;
    const Vec3 w(R(2, 1) - R(1, 2), R(0, 2) - R(2, 0), R(1, 0) - R(0, 1));
    best = std::min(best, deg(std::atan2(w.norm() / 2.0, c)));
  }
  // Inputs carry up to 5e-11 degree of rounding each (snap_angle), so report
  // the angle to 1e-8 degree: a mechanism and its own auxiliary plane give 0.
  return std::round(best * 1e8) / 1e8 + 0.0;
}

const char *mechanism_class(const FaultSlip &f) {
  const double pt = t_axis(f).plunge, pb = b_axis(f).plunge, pp = p_axis(f).plunge;
  if (pt > 50.0) return "thrust";
  if (pb > 60.0) return "strike-slip";
  if (pp > 60.0) return "normal";
  return "unclassified";
}

}  // namespace striae
