// Summed moment tensors (rules: moment.hpp).
#include "moment.hpp"

#include <cmath>
#include <cstring>

namespace striae {

namespace {

// Neumaier's compensated addition: sum + comp carries the exact running total
// to about twice the working precision.
inline void neumaier(double &sum, double &comp, double x) {
  const double t = sum + x;
  if (std::fabs(sum) >= std::fabs(x)) comp += (sum - t) + x;
  else comp += (x - t) + sum;
  sum = t;
}

// Components (nn, ee, dd, ne, nd, ed) of a symmetric matrix and back.
void to6(const Mat3 &m, double c[6]) {
  c[0] = m(0, 0); c[1] = m(1, 1); c[2] = m(2, 2); c[3] = m(0, 1); c[4] = m(0, 2); c[5] = m(1, 2);
}
Mat3 from6(const double c[6]) {
  Mat3 m;
  m << c[0], c[3], c[4],
       c[3], c[1], c[5],
       c[4], c[5], c[2];
  return m;
}

}  // namespace

double moment_from_magnitude(double mw) {
  if (!std::isfinite(mw) || mw < kMinMagnitude || mw > kMaxMagnitude)
    throw Error(ErrorKind::OutOfRange, "moment magnitude is out of range",
                "Accepted: finite magnitudes from -10 to 12.");
  return std::pow(10.0, 1.5 * mw + 9.1);
}

void moment_init(MomentAccum &s) {
  std::memset(&s, 0, sizeof s);
  s.weighted = -1;
}

void moment_add(MomentAccum &s, const FaultSlip &f, double m0, bool weighted) {
  if (!std::isfinite(f.strike) || !std::isfinite(f.dip) || !std::isfinite(f.rake))
    throw Error(ErrorKind::DataError, "fault-slip angles must be finite numbers");
  if (!(m0 > 0) || !std::isfinite(m0)) throw Error(ErrorKind::DataError, "scalar moment must be positive and finite");
  const int32_t w = weighted ? 1 : 0;
  if (s.weighted != -1 && s.weighted != w)
    throw Error(ErrorKind::InvalidParameter, "cannot mix weighted and unweighted moment sums");
  s.weighted = w;
  Vec3 n, u;
  fault_vectors(f, n, u);
  const Mat3 m = m0 * (n * u.transpose() + u * n.transpose());
  const Mat3 a = m0 * (n * n.transpose());
  double c[6], d[6];
  to6(m, c);
  to6(a, d);
  for (int i = 0; i < 6; ++i) {
    neumaier(s.m[i], s.mc[i], c[i]);
    s.nn[i] += d[i];
  }
  neumaier(s.m0, s.m0c, m0);
  s.count += 1;
}

void moment_combine(MomentAccum &into, const MomentAccum &from) {
  if (from.count == 0) return;
  if (into.count == 0) {
    into = from;
    return;
  }
  if (into.weighted != from.weighted)
    throw Error(ErrorKind::InvalidParameter, "cannot mix weighted and unweighted moment sums");
  if (into.count > kMaxMomentData - from.count)
    throw Error(ErrorKind::DataError, "too many data for a moment sum (limit 2^53)");
  for (int i = 0; i < 6; ++i) {
    neumaier(into.m[i], into.mc[i], from.m[i]);
    into.mc[i] += from.mc[i];
    into.nn[i] += from.nn[i];
  }
  neumaier(into.m0, into.m0c, from.m0);
  into.m0c += from.m0c;
  into.count += from.count;
}

void moment_validate(const MomentAccum &s) {
  auto bad = [](const char *what) {
    throw Error(ErrorKind::BadState, std::string("invalid moment sum state: ") + what);
  };
  if (s.count < 0) bad("negative count");
  if (s.count > kMaxMomentData) bad("count exceeds 2^53");
  if (s.reserved != 0) bad("reserved field is not zero");
  double all[20];
  std::memcpy(all, s.m, sizeof s.m);
  std::memcpy(all + 6, s.mc, sizeof s.mc);
  all[12] = s.m0;
  all[13] = s.m0c;
  std::memcpy(all + 14, s.nn, sizeof s.nn);
  for (double v : all)
    if (!std::isfinite(v)) bad("non-finite sum");
  if (s.count == 0) {
    if (s.weighted != -1) bad("empty state with a weighting");
    for (double v : all)
      if (v != 0) bad("empty state with non-zero sums");
    return;
  }
  if (s.weighted != 0 && s.weighted != 1) bad("unknown weighting");
  if (!(s.m0 > 0)) bad("non-positive moment sum");
  if (s.weighted == 0 && std::fabs(s.m0 - static_cast<double>(s.count)) > 1e-6 * static_cast<double>(s.count))
    bad("unit moments do not match the count");
}

bool moment_finalise(const MomentAccum &s, MomentSummary &out) {
  moment_validate(s);
  std::memset(&out, 0, sizeof out);
  if (s.count == 0) return false;
  out.count = s.count;
  out.weighted = s.weighted == 1;
  for (int i = 0; i < 6; ++i) out.summed[i] = s.m[i] + s.mc[i];
  out.moment_sum = s.m0 + s.m0c;
  const Mat3 sum = from6(out.summed);
  out.scalar_moment = sum.norm() / std::sqrt(2.0);
  out.consistency = out.scalar_moment / out.moment_sum;
  if (!(out.scalar_moment > 1e-12 * out.moment_sum)) return true;  // cancelled: no axes
  out.has_axes = true;
  const Mat3 m = sum / out.scalar_moment;
  to6(m, out.tensor);
  Eigen::SelfAdjointEigenSolver<Mat3> es(m);
  const Eigen::Vector3d lam = es.eigenvalues();  // ascending: P, B, T
  Vec3 p = es.eigenvectors().col(0), b = es.eigenvectors().col(1), t = es.eigenvectors().col(2);
  out.p = vector_line(p);
  out.b = vector_line(b);
  out.t = vector_line(t);
  // epsilon: eigenvalue of smallest modulus over the modulus of the largest.
  int imin = 0, imax = 0;
  for (int i = 1; i < 3; ++i) {
    if (std::fabs(lam(i)) < std::fabs(lam(imin))) imin = i;
    if (std::fabs(lam(i)) > std::fabs(lam(imax))) imax = i;
  }
  const double eps = -lam(imin) / std::fabs(lam(imax));
  out.epsilon = std::round(eps * 1e12) / 1e12 + 0.0;
  // Best double couple with these P and T axes; the nodal plane nearer the data's.
  if (p.z() < 0) p = -p;
  if (t.z() < 0) t = -t;
  const Vec3 n1 = (t + p) / std::sqrt(2.0), u1 = (t - p) / std::sqrt(2.0);
  const Mat3 nn = from6(s.nn);
  const double w1 = n1.dot(nn * n1), w2 = u1.dot(nn * u1);
  out.best_dc = w2 > w1 ? fault_from_vectors(u1, n1) : fault_from_vectors(n1, u1);
  return true;
}

void kostrov_strain_rate(const double summed[6], double volume, double duration, double mu, double out[6]) {
  auto positive = [](double v, const char *what) {
    if (!std::isfinite(v) || !(v > 0))
      throw Error(ErrorKind::InvalidParameter, std::string(what) + " must be a positive finite number");
  };
  positive(volume, "volume");
  positive(duration, "duration");
  positive(mu, "shear modulus");
  // Divided in turn: the product of the three can overflow where the quotient does not.
  for (int i = 0; i < 6; ++i) out[i] = summed[i] / 2.0 / mu / volume / duration;
}

}  // namespace striae
