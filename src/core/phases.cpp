// Stress-phase separation by hard division, and misfit summaries (rules: phases.hpp).
#include "phases.hpp"

#include <algorithm>
#include <cmath>
#include <cstring>
#include <tuple>

namespace striae {

namespace {

// Poll for cancellation every this many data inside the loops over the data.
constexpr size_t kPollEvery = 1u << 15;

// Tension-positive matrix of a tensor, row major, for fast misfit cosines.
struct Prepared {
  double s[9];
};

Prepared prepare(const StressTensor &t) {
  const Mat3 m = -stress_matrix(t);
  Prepared p;
  for (int i = 0; i < 3; ++i)
    for (int j = 0; j < 3; ++j) p.s[3 * i + j] = m(i, j);
  return p;
}

// Cosine of the misfit angle of (n, u) under p; 0 (90 degrees) when undefined.
inline double fit_cosine(const Prepared &p, const double *n, const double *u) {
  const double t0 = p.s[0] * n[0] + p.s[1] * n[1] + p.s[2] * n[2];
  const double t1 = p.s[3] * n[0] + p.s[4] * n[1] + p.s[5] * n[2];
  const double t2 = p.s[6] * n[0] + p.s[7] * n[1] + p.s[8] * n[2];
  const double sn = t0 * n[0] + t1 * n[1] + t2 * n[2];
  const double a = t0 - sn * n[0], b = t1 - sn * n[1], c = t2 - sn * n[2];
  const double len = std::sqrt(a * a + b * b + c * c);
  if (!(len >= kMinResolvedShear)) return 0.0;
  return std::clamp((a * u[0] + b * u[1] + c * u[2]) / len, -1.0, 1.0);
}

// A random tensor: principal axes a uniformly random rotation (unit quaternion
// from four normal variates), magnitudes 1, Phi, 0 with Phi uniform.
StressTensor random_tensor(Rng &rng) {
  double q[4], len = 0.0;
  do {
    len = 0.0;
    for (double &v : q) {
      v = rng.normal();
      len += v * v;
    }
  } while (!(len > 1e-12));
  const Eigen::Quaterniond quat(q[0], q[1], q[2], q[3]);
  const Mat3 r = quat.normalized().toRotationMatrix();
  const double phi = rng.uniform();
  const Mat3 m = r.col(0) * r.col(0).transpose() + phi * (r.col(1) * r.col(1).transpose());
  const double c[6] = {m(0, 0), m(1, 1), m(2, 2), m(0, 1), m(0, 2), m(1, 2)};
  return stress_from_components(c);
}

// One division: phase per datum, phases' tensors and statuses.
struct Division {
  std::vector<uint8_t> phase;
  std::vector<StressTensor> tensor;
  std::vector<int64_t> size;
  bool ok = false;       // every phase has a tensor of its own data
  bool settled = false;
  double total = 0.0;    // total misfit (degrees) of the data under their phase tensors
};

// Assign every datum to its best tensor; returns whether anything changed.
bool assign(const SlipDatum *data, size_t count, const std::vector<Prepared> &pt, std::vector<uint8_t> &phase) {
  bool changed = false;
  const size_t k = pt.size();
  for (size_t i = 0; i < count; ++i) {
    if ((i & (kPollEvery - 1)) == kPollEvery - 1) poll_interrupts();
    double best = -2.0;
    uint8_t bj = 0;
    for (size_t j = 0; j < k; ++j) {
      const double c = fit_cosine(pt[j], data[i].n, data[i].u);
      if (c > best) {
        best = c;
        bj = static_cast<uint8_t>(j);
      }
    }
    if (phase[i] != bj) {
      phase[i] = bj;
      changed = true;
    }
  }
  return changed;
}

// Invert every phase of a division; a phase that cannot be inverted keeps its
// tensor and clears ok.
void invert_phases(const SlipDatum *data, size_t count, Division &d) {
  const size_t k = d.tensor.size();
  std::vector<double> sums(20 * k, 0.0);
  std::fill(d.size.begin(), d.size.end(), 0);
  double c[20];
  for (size_t i = 0; i < count; ++i) {
    if ((i & (kPollEvery - 1)) == kPollEvery - 1) poll_interrupts();
    const size_t j = d.phase[i];
    stress_contribution(data[i].n, data[i].u, c);
    double *s = &sums[20 * j];
    for (int m = 0; m < 20; ++m) s[m] += c[m];
    d.size[j] += 1;
  }
  d.ok = true;
  for (size_t j = 0; j < k; ++j) {
    StressTensor t;
    if (stress_solve(&sums[20 * j], static_cast<double>(d.size[j]), d.size[j], t) == StressStatus::Ok) {
      d.tensor[j] = t;
    } else {
      d.ok = false;
    }
  }
}

// Total misfit of the data under their own phase's tensor.
double total_misfit(const SlipDatum *data, size_t count, const Division &d) {
  std::vector<Prepared> pt;
  for (const auto &t : d.tensor) pt.push_back(prepare(t));
  double total = 0.0;
  for (size_t i = 0; i < count; ++i) {
    if ((i & (kPollEvery - 1)) == kPollEvery - 1) poll_interrupts();
    total += deg(std::acos(fit_cosine(pt[d.phase[i]], data[i].n, data[i].u)));
  }
  return total;
}

// One run from random tensors.
Division run(const SlipDatum *data, size_t count, int k, Rng &rng) {
  Division d;
  d.phase.assign(count, 0);
  d.size.assign(k, 0);
  for (int j = 0; j < k; ++j) d.tensor.push_back(random_tensor(rng));
  std::vector<Prepared> pt(k);
  for (int j = 0; j < k; ++j) pt[j] = prepare(d.tensor[j]);
  assign(data, count, pt, d.phase);
  for (int it = 0; it < kPhaseMaxIterations; ++it) {
    poll_interrupts();
    invert_phases(data, count, d);
    for (int j = 0; j < k; ++j) pt[j] = prepare(d.tensor[j]);
    if (!assign(data, count, pt, d.phase)) {
      d.settled = true;
      break;
    }
  }
  if (!d.settled) invert_phases(data, count, d);  // tensors of the final division
  if (d.ok) d.total = total_misfit(data, count, d);
  return d;
}

}  // namespace

void check_phase_options(const PhaseOptions &o) {
  if (o.phases < 1 || o.phases > kMaxPhases)
    throw Error(ErrorKind::InvalidParameter, "number of stress phases must be between 1 and 8");
  if (o.starts < 1 || o.starts > kMaxPhaseStarts)
    throw Error(ErrorKind::InvalidParameter, "number of starts must be between 1 and 10000");
}

StressStatus separate_phases(const SlipDatum *data, size_t count, const PhaseOptions &o,
                             std::vector<StressTensor> &out, std::vector<uint8_t> *assignment) {
  check_phase_options(o);
  if (count > kMaxBootstrapData)
    throw Error(ErrorKind::InvalidParameter, "too many data for a phase separation (at most 1000000)",
                "The separation keeps the data of a group in memory.", "Split the group.");
  for (size_t i = 0; i < count; ++i) {
    poll_every(i);
    check_slip_datum(data[i].n, data[i].u);
  }
  out.clear();
  if (count == 0) return StressStatus::Empty;
  const int k = o.phases;
  if (count < static_cast<size_t>(kMinStressData) * static_cast<size_t>(k)) return StressStatus::TooFewData;

  Rng rng(o.seed);
  Division best;
  bool have = false;
  for (int s = 0; s < o.starts; ++s) {
    poll_interrupts();
    Division d = run(data, count, k, rng);
    if (!d.ok) continue;
    if (!have || d.total < best.total) {
      best = std::move(d);
      have = true;
    }
  }
  if (!have) return StressStatus::Degenerate;

  // Report order: larger phases first, ties by components.
  std::vector<int> order(k);
  for (int j = 0; j < k; ++j) order[j] = j;
  std::sort(order.begin(), order.end(), [&best](int a, int b) {
    if (best.size[a] != best.size[b]) return best.size[a] > best.size[b];
    const StressTensor &x = best.tensor[a], &y = best.tensor[b];
    return std::tie(x.nn, x.ee, x.dd, x.ne, x.nd, x.ed) < std::tie(y.nn, y.ee, y.dd, y.ne, y.nd, y.ed);
  });
  std::vector<uint8_t> rank(k);
  for (int r = 0; r < k; ++r) rank[order[r]] = static_cast<uint8_t>(r);
  std::vector<std::vector<SlipDatum>> members(k);
  for (size_t i = 0; i < count; ++i) {
    poll_every(i);
    members[rank[best.phase[i]]].push_back(data[i]);
  }
  for (int r = 0; r < k; ++r) {
    StressTensor t = best.tensor[order[r]];
    if (auto m = mean_misfit(members[r].data(), members[r].size(), t)) {
      t.mean_misfit = *m;
      t.flags |= kStressHasMisfit;
    }
    if (!best.settled) t.flags |= kStressNotConverged;
    out.push_back(t);
  }
  if (assignment) {
    assignment->resize(count);
    for (size_t i = 0; i < count; ++i) (*assignment)[i] = rank[best.phase[i]];
  }
  return StressStatus::Ok;
}

int best_phase(const Vec3 &n, const Vec3 &u, const StressTensor *tensors, size_t k,
               std::optional<double> &misfit_deg) {
  const double nv[3] = {n.x(), n.y(), n.z()}, uv[3] = {u.x(), u.y(), u.z()};
  double best = -2.0;
  int bj = 0;
  for (size_t j = 0; j < k; ++j) {
    const double c = fit_cosine(prepare(tensors[j]), nv, uv);
    if (c > best) {
      best = c;
      bj = static_cast<int>(j);
    }
  }
  misfit_deg = k ? misfit(n, u, tensors[bj]) : std::nullopt;
  return bj;
}

void check_misfit_threshold(double threshold) {
  if (!std::isfinite(threshold) || threshold < 0 || threshold > 180)
    throw Error(ErrorKind::InvalidParameter, "misfit threshold must be between 0 and 180 degrees");
}

namespace {

// Sorts ascending, polling for interrupts between sorted runs and merges (a
// group may keep 10^7 misfits).
void sort_polled(double *v, size_t n) {
  constexpr size_t kRun = size_t(1) << 16;
  for (size_t i = 0; i < n; i += kRun) {
    std::sort(v + i, v + std::min(n, i + kRun));
    poll_interrupts();
  }
  for (size_t w = kRun; w < n; w *= 2)
    for (size_t i = 0; i + w < n; i += 2 * w) {
      std::inplace_merge(v + i, v + i + w, v + std::min(n, i + 2 * w));
      poll_interrupts();
    }
}

}  // namespace

// The misfits are sorted before they are summed, so the mean is a function of
// the set of misfits alone (not of the order rows arrived in: serial, parallel
// and two-phase runs give the same bits).
bool summarise_misfits(double *v, size_t count, int64_t undefined, double threshold, MisfitSummary &out) {
  check_misfit_threshold(threshold);
  std::memset(&out, 0, sizeof out);
  out.count = static_cast<int64_t>(count);
  out.undefined = undefined;
  if (count == 0) return false;
  sort_polled(v, count);
  double sum = 0.0;
  for (size_t i = 0; i < count; ++i) {
    if ((i & (kPollEvery - 1)) == kPollEvery - 1) poll_interrupts();
    sum += v[i];
    if (v[i] > threshold) out.above += 1;
  }
  out.mean = sum / static_cast<double>(count);
  const size_t mid = count / 2;
  out.median = count % 2 == 1 ? v[mid] : 0.5 * (v[mid - 1] + v[mid]);
  return true;
}

}  // namespace striae
