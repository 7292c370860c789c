// Exponential-kernel density of axial data on grid nodes, from a sparse list of
// fine bins (see density.hpp for the method, units and error bounds).
#include "density.hpp"

#include "stats.hpp"

#include <algorithm>
#include <cmath>
#include <stdexcept>
#include <vector>

namespace striae {

namespace {

// ---------------------------------------------------------------------------
// Ring layout of grid.hpp
// ---------------------------------------------------------------------------

// The ring structure of grid_nodes(s), rebuilt from the layout rule stated in
// grid.hpp with the same arithmetic as grid.cpp (so node vectors agree to the
// bit), and checked against grid_node_count() when built. Ring i has plunge
// i*s (the last ring, i = J, is the single vertical node at plunge 90), cnt[i]
// nodes at trends k*step[i] from trend 0; ring 0 is the half-ring [0,180).
struct Layout {
  double s = 0;
  int J = 0;  // index of the vertical ring; there are J + 1 rings
  std::vector<int> off, cnt;
  std::vector<double> plunge, step;
  std::vector<double> sinq, cosq;  // of each ring's plunge, for quick dot products
  int total = 0;
};

// Build the layout for a spacing (as grid_spacing accepts and rounds it).
Layout make_layout(double s) {
  s = grid_spacing(s);
  Layout L;
  L.s = s;
  L.J = static_cast<int>(std::lround(90.0 / s));
  for (int i = 0; i <= L.J; ++i) {
    int m = 1;
    if (i < L.J) {
      m = static_cast<int>(std::lround(360.0 * std::cos(rad(i * s)) / s));
      if (m < 1) m = 1;
      if (i == 0) m = (m + 1) / 2;
    }
    L.off.push_back(L.total);
    L.cnt.push_back(m);
    L.plunge.push_back(i == L.J ? 90.0 : i * s);
    L.step.push_back(i == 0 ? 180.0 / m : 360.0 / m);
    L.sinq.push_back(std::sin(rad(L.plunge.back())));
    L.cosq.push_back(std::cos(rad(L.plunge.back())));
    L.total += m;
  }
  // Guard against the layout rule drifting away from grid.cpp.
  if (L.total != grid_node_count(s))
    throw std::logic_error("density grid layout disagrees with grid_node_count");
  return L;
}

// Line of node k of ring i (same expression as grid.cpp).
inline Line node_line(const Layout &L, int i, int k) {
  return Line{i == L.J ? 0.0 : k * L.step[i], L.plunge[i]};
}

// The fixed 0.5-degree bin layout, built once per process (C++11 guarantees a
// thread-safe one-time initialisation of function-local statics).
const Layout &bin_layout() {
  static const Layout L = make_layout(kDensityBinSpacing);
  return L;
}

// Ring index of a bin id (binary search over ring offsets).
int bin_ring(const Layout &L, uint32_t id) {
  auto it = std::upper_bound(L.off.begin(), L.off.end(), static_cast<int>(id));
  return static_cast<int>(it - L.off.begin()) - 1;
}

// Unit vector, lower hemisphere, of a datum; DataError for zero/non-finite.
Vec3 lower_unit(const Vec3 &v) {
  const double len = v.norm();
  if (!std::isfinite(len) || !(len > 0))
    throw Error(ErrorKind::DataError, "cannot place a zero or non-finite vector on the density grid");
  Vec3 u = v / len;
  if (u.z() < 0) u = -u;
  return u;
}

// Plunge and trend (degrees; plunge in [0,90], trend in [0,360)) of a lower unit vector.
void plunge_trend(const Vec3 &u, double &p, double &t) {
  p = deg(std::atan2(u.z(), std::hypot(u.x(), u.y())));
  t = deg(std::atan2(u.y(), u.x()));
  if (t < 0) t += 360.0;
  if (t >= 360.0) t -= 360.0;
}

// Positive remainder of k modulo m.
inline int pmod(long k, int m) {
  long r = k % m;
  return static_cast<int>(r < 0 ? r + m : r);
}

// Nearest node of ring i to trend t (degrees): nearest trend index, with the
// half-ring 0 taken modulo 180 (axial) and the vertical ring a single node.
// Also returns |cos| of the angle between that node and the axis (plunge p
// given by sin p, cos p): sin p sin q + cos p cos q cos(dt), no node vector needed.
int ring_candidate(const Layout &L, int i, double t, double sp, double cp, double &absdot) {
  if (i == L.J) {
    absdot = std::fabs(sp);
    return L.off[i];
  }
  const int m = L.cnt[i];
  const double tt = (i == 0) ? std::fmod(t, 180.0) : t;
  const long k = std::lround(tt / L.step[i]);
  const double dt = rad(tt - static_cast<double>(k) * L.step[i]);
  absdot = std::fabs(sp * L.sinq[i] + cp * L.cosq[i] * std::cos(dt));
  return L.off[i] + pmod(k, m);
}

// ---------------------------------------------------------------------------
// Heap sort of parallel arrays (no allocation)
// ---------------------------------------------------------------------------

// Swap entries i and j of the parallel arrays.
inline void swap_entry(uint32_t *ids, uint64_t *c, size_t i, size_t j) {
  std::swap(ids[i], ids[j]);
  std::swap(c[i], c[j]);
}

// Restore the max-heap property below root within [0, end).
void sift_down(uint32_t *ids, uint64_t *c, size_t root, size_t end) {
  for (;;) {
    size_t child = 2 * root + 1;
    if (child >= end) return;
    if (child + 1 < end && ids[child] < ids[child + 1]) ++child;
    if (!(ids[root] < ids[child])) return;
    swap_entry(ids, c, root, child);
    root = child;
  }
}

// Sort the parallel arrays by id (not stable; equal ids are merged afterwards).
void heap_sort(uint32_t *ids, uint64_t *c, size_t m) {
  if (m < 2) return;
  for (size_t start = m / 2; start-- > 0;) sift_down(ids, c, start, m);
  for (size_t end = m - 1; end > 0; --end) {
    poll_every(end);
    swap_entry(ids, c, 0, end);
    sift_down(ids, c, 0, end);
  }
}

// a + b, or DataError on overflow.
inline uint64_t add_count(uint64_t a, uint64_t b) {
  if (a > UINT64_MAX - b) throw Error(ErrorKind::DataError, "density bin count overflows");
  return a + b;
}

// ---------------------------------------------------------------------------
// Kernel evaluation
// ---------------------------------------------------------------------------

// The output grid: its layout and node vectors.
struct OutGrid {
  Layout L;
  std::vector<Vec3> g;
};

// Build the output grid for a spacing.
OutGrid make_out_grid(double spacing) {
  OutGrid G;
  G.L = make_layout(spacing);
  G.g.reserve(G.L.total);
  for (int i = 0; i <= G.L.J; ++i) {
    poll_interrupts();  // once a ring
    for (int k = 0; k < G.L.cnt[i]; ++k) G.g.push_back(line_vector(node_line(G.L, i, k)));
  }
  return G;
}

// Half the squared chord |a - b|^2 / 2 = 1 - a.b for unit vectors, without the
// cancellation of 1 - a.b near 1: the narrow kernels of large N need it.
inline double half_chord2(const Vec3 &a, const Vec3 &b) { return 0.5 * (a - b).squaredNorm(); }

// Accumulates the weights of one (binned or raw) datum into a node array.
struct Accumulator {
  const OutGrid &G;
  double f;     // kernel concentration
  double *acc;  // one slot per node

  // Add weight w * exp(-f (1 - |g.x|)) to node j, when above the cutoff.
  void axial(int j, const Vec3 &x, double w) const {
    const Vec3 &g = G.g[j];
    const double d = std::min(half_chord2(g, x), half_chord2(g, -x));
    if (f * d <= kDensityCutoff) acc[j] += w * std::exp(-f * d);
  }

  // As axial(), for node j seen through sign sg (+1 or -1) of the datum: only
  // counted when sg * g.x > 0, so that the two windows of a ring never both
  // count a node.
  void one_side(int j, const Vec3 &x, double sg, double w) const {
    const Vec3 &g = G.g[j];
    if (!(sg * g.dot(x) > 0)) return;
    const double d = half_chord2(g, sg * x);
    if (f * d <= kDensityCutoff) acc[j] += w * std::exp(-f * d);
  }

  // Every node of ring i, axially.
  void full_ring(int i, const Vec3 &x, double w) const {
    for (int k = 0; k < G.L.cnt[i]; ++k) axial(G.L.off[i] + k, x, w);
  }

  // Add datum x (lower unit vector, plunge p, trend t in degrees) with weight w.
  //
  // A node g gets a weight above the cutoff only if |g.x| >= cosc with
  // cosc = 1 - cutoff/f. When cosc <= 0 the kernel reaches every node and all
  // are visited. Otherwise only rings within acos(cosc) in plunge of x can
  // qualify, and on a ring at plunge q the nodes with g.x >= cosc lie in the
  // trend window |dt| <= acos((cosc - sin p sin q)/(cos p cos q)) around t,
  // those with -g.x >= cosc in the window acos((cosc + sin p sin q)/(cos p
  // cos q)) around t + 180. Windows get a small margin; the per-node cutoff
  // test, not the window, decides, so the margins never change the result.
  void add(const Vec3 &x, double p, double t, double w) const {
    const Layout &L = G.L;
    if (kDensityCutoff >= f) {
      for (int j = 0; j < L.total; ++j) axial(j, x, w);
      return;
    }
    const double cosc = 1.0 - kDensityCutoff / f;
    const double thc = deg(std::acos(cosc));
    constexpr double kMargin = 1e-6;   // degrees of plunge
    constexpr double kTMargin = 1e-3;  // degrees of trend
    const int jlo = std::max(0, static_cast<int>(std::ceil((p - thc - kMargin) / L.s)));
    const int jhi = std::min(L.J, static_cast<int>(std::floor((p + thc + kMargin) / L.s)));
    const double sp = std::sin(rad(p)), cp = std::cos(rad(p));
    for (int i = jlo; i <= jhi; ++i) {
      if (i == L.J) {
        axial(L.off[i], x, w);
        continue;
      }
      const double q = rad(L.plunge[i]);
      const double A = cp * std::cos(q), B = sp * std::sin(q);
      const int m = L.cnt[i];
      const double step = L.step[i];
      if (A < 1e-12) {  // x (nearly) vertical: the whole ring is equidistant
        full_ring(i, x, w);
        continue;
      }
      if (i == 0) {
        // Half-ring: walk the nominal full ring of 2m nodes around t only; a
        // nominal node k >= m is the antipode of real node k - m, so
        // every real axis is met once with the sign that faces x.
        const double arg = cosc / A;
        if (arg > 1.0) continue;
        const double wdt = arg <= -1.0 ? 360.0 : deg(std::acos(arg)) + kTMargin;
        if (2 * wdt / step + 2 >= 2 * m) {
          full_ring(i, x, w);
          continue;
        }
        const long klo = static_cast<long>(std::ceil((t - wdt) / step));
        const long khi = static_cast<long>(std::floor((t + wdt) / step));
        for (long k = klo; k <= khi; ++k) {
          const int kk = pmod(k, 2 * m);
          one_side(L.off[0] + kk % m, x, kk >= m ? -1.0 : 1.0, w);
        }
        continue;
      }
      const double argp = (cosc - B) / A, argm = (cosc + B) / A;
      const double wp = argp <= -1.0 ? 360.0 : argp > 1.0 ? -1.0 : deg(std::acos(argp)) + kTMargin;
      const double wm = argm <= -1.0 ? 360.0 : argm > 1.0 ? -1.0 : deg(std::acos(argm)) + kTMargin;
      if (2 * std::max(wp, wm) / step + 2 >= m) {
        full_ring(i, x, w);
        continue;
      }
      const double centre[2] = {t, t + 180.0}, half[2] = {wp, wm}, sg[2] = {1.0, -1.0};
      for (int side = 0; side < 2; ++side) {
        if (half[side] < 0) continue;
        const long klo = static_cast<long>(std::ceil((centre[side] - half[side]) / step));
        const long khi = static_cast<long>(std::floor((centre[side] + half[side]) / step));
        for (long k = klo; k <= khi; ++k) one_side(L.off[i] + pmod(k, m), x, sg[side], w);
      }
    }
  }
};

}  // namespace

// ---------------------------------------------------------------------------
// Bins
// ---------------------------------------------------------------------------

// Bin count of the fixed 0.5-degree layout.
uint32_t density_bin_count() { return static_cast<uint32_t>(bin_layout().total); }

// Nearest bin: two candidate rings, nearest trend in each (see header).
uint32_t density_bin(const Vec3 &axis) {
  const Layout &L = bin_layout();
  const Vec3 u = lower_unit(axis);
  double p, t;
  plunge_trend(u, p, t);
  // The nearest node lies within ~0.36 degree, less than one ring spacing, so
  // it is on one of the two rings that bracket the plunge; on a ring the
  // nearest node is the one nearest in trend.
  const int i0 = std::min(L.J, static_cast<int>(std::floor(p / L.s)));
  const int i1 = std::min(L.J, i0 + 1);
  const double sp = u.z(), cp = std::hypot(u.x(), u.y());
  double d0, d1;
  const int c0 = ring_candidate(L, i0, t, sp, cp, d0);
  if (i1 == i0) return static_cast<uint32_t>(c0);
  const int c1 = ring_candidate(L, i1, t, sp, cp, d1);
  // Larger |cos| is nearer; the lower id (c0, the lower ring) wins a tie.
  return static_cast<uint32_t>(d1 > d0 ? c1 : c0);
}

// Centre vector of a bin, computed exactly as grid.cpp computes node vectors.
Vec3 density_bin_center(uint32_t id) {
  const Layout &L = bin_layout();
  if (id >= static_cast<uint32_t>(L.total))
    throw Error(ErrorKind::InvalidParameter, "density bin id is out of range");
  const int i = bin_ring(L, id);
  return line_vector(node_line(L, i, static_cast<int>(id) - L.off[i]));
}

// Sort in place, then fold runs of equal ids into their first entry.
size_t compact_bins(uint32_t *ids, uint64_t *counts, size_t m) {
  const uint32_t nb = density_bin_count();
  for (size_t i = 0; i < m; ++i)
    if (ids[i] >= nb)
      throw Error(ErrorKind::BadState, "malformed density aggregate state", "a bin id is out of range");
  heap_sort(ids, counts, m);
  size_t out = 0;
  for (size_t i = 0; i < m; ++i) {
    if (counts[i] == 0) continue;
    if (out > 0 && ids[out - 1] == ids[i]) {
      counts[out - 1] = add_count(counts[out - 1], counts[i]);
    } else {
      ids[out] = ids[i];
      counts[out] = counts[i];
      ++out;
    }
  }
  return out;
}

// Two-pointer merge of sorted lists; equal ids add their counts.
size_t merge_bins(const uint32_t *a_ids, const uint64_t *a_counts, size_t na,
                  const uint32_t *b_ids, const uint64_t *b_counts, size_t nb,
                  uint32_t *out_ids, uint64_t *out_counts) {
  size_t i = 0, j = 0, o = 0;
  while (i < na || j < nb) {
    if (j >= nb || (i < na && a_ids[i] < b_ids[j])) {
      out_ids[o] = a_ids[i];
      out_counts[o++] = a_counts[i++];
    } else if (i >= na || b_ids[j] < a_ids[i]) {
      out_ids[o] = b_ids[j];
      out_counts[o++] = b_counts[j++];
    } else {  // same bin in both lists
      out_ids[o] = a_ids[i];
      out_counts[o++] = add_count(a_counts[i++], b_counts[j++]);
    }
  }
  // The same limit as validate_bins, so that a combined state can be
  // serialized and read back (a fuzzed pair of valid states exceeded it).
  if (bins_total(out_counts, o) > (uint64_t(1) << 53))
    throw Error(ErrorKind::DataError, "too many rows for density_grid (limit 2^53)");
  return o;
}

// Check the invariants compact_bins and merge_bins establish.
void validate_bins(const uint32_t *ids, const uint64_t *counts, size_t m) {
  const uint32_t nb = density_bin_count();
  auto bad = [](const char *what) {
    throw Error(ErrorKind::BadState, "malformed density aggregate state", what,
                "States are produced by the aggregate's own functions; do not edit them.");
  };
  if (m > nb) bad("the bin list is longer than the number of bins");
  uint64_t total = 0;
  for (size_t i = 0; i < m; ++i) {
    if (ids[i] >= nb) bad("a bin id is out of range");
    if (i > 0 && ids[i] <= ids[i - 1]) bad("bin ids are not strictly increasing");
    if (counts[i] == 0) bad("a bin has a zero count");
    if (counts[i] > (uint64_t(1) << 53) - total) bad("the total count exceeds 2^53");
    total += counts[i];
  }
}

// Sum of counts, overflow-checked.
uint64_t bins_total(const uint64_t *counts, size_t m) {
  uint64_t total = 0;
  for (size_t i = 0; i < m; ++i) total = add_count(total, counts[i]);
  return total;
}

// ---------------------------------------------------------------------------
// Density
// ---------------------------------------------------------------------------

// Kernel concentration for N data.
double density_kernel_f(uint64_t n) {
  // Vollmer (1995) [from memory, METHODS.md]: f = 2 (1 + N/k^2).
  return 2.0 * (1.0 + static_cast<double>(n) / (kDensityK * kDensityK));
}

// Normalisation to multiples of uniform density.
double density_mud_factor(uint64_t n) {
  // 1 / (N E[W]) with E[W] = (1 - e^-f)/f (derived in density.hpp).
  const double f = density_kernel_f(n);
  return f / (static_cast<double>(n) * -std::expm1(-f));
}

// Density from bins: each bin is one datum at its centre, weighted by its count.
// Bins are visited in id order, so the result is a pure function of the list.
void density_values(const uint32_t *ids, const uint64_t *counts, size_t m, double spacing,
                    double *out_values) {
  validate_bins(ids, counts, m);
  const OutGrid G = make_out_grid(spacing);  // checks the spacing
  if (m == 0) throw Error(ErrorKind::DataError, "density of an empty set of data is undefined");
  const uint64_t n = bins_total(counts, m);
  std::fill(out_values, out_values + G.L.total, 0.0);
  const Accumulator acc{G, density_kernel_f(n), out_values};
  const Layout &B = bin_layout();
  for (size_t b = 0; b < m; ++b) {
    poll_interrupts();  // a bin's kernel can reach every node of the output grid
    const int i = bin_ring(B, ids[b]);
    const Line l = node_line(B, i, static_cast<int>(ids[b]) - B.off[i]);
    acc.add(line_vector(l), l.plunge, l.trend, static_cast<double>(counts[b]));
  }
  const double k = density_mud_factor(n);
  for (int j = 0; j < G.L.total; ++j) out_values[j] *= k;
}

// Density from raw axes, same kernel and cutoff.
void density_values_axes(const Vec3 *axes, size_t n, double spacing, double *out_values) {
  const OutGrid G = make_out_grid(spacing);
  if (n == 0) throw Error(ErrorKind::DataError, "density of an empty set of data is undefined");
  std::fill(out_values, out_values + G.L.total, 0.0);
  const Accumulator acc{G, density_kernel_f(n), out_values};
  for (size_t b = 0; b < n; ++b) {
    poll_interrupts();
    const Vec3 u = lower_unit(axes[b]);
    double p, t;
    plunge_trend(u, p, t);
    acc.add(u, p, t, 1.0);
  }
  const double k = density_mud_factor(n);
  for (int j = 0; j < G.L.total; ++j) out_values[j] *= k;
}

// ---------------------------------------------------------------------------
// Extremes of a grid
// ---------------------------------------------------------------------------

// Axial mean of the nodes tied at the extreme value.
Line grid_extreme(const double *values, size_t count, double spacing, bool want_max) {
  const Layout L = make_layout(spacing);  // checks the spacing
  if (count != static_cast<size_t>(L.total))
    throw Error(ErrorKind::InvalidParameter, "grid has the wrong number of values for its spacing",
                "A grid at spacing " + std::to_string(spacing) + " has " + std::to_string(L.total) +
                    " nodes, this one has " + std::to_string(count) + ".");
  for (size_t j = 0; j < count; ++j)
    if (!std::isfinite(values[j])) throw Error(ErrorKind::DataError, "grid value is not finite");
  double ext = values[0];
  for (size_t j = 1; j < count; ++j) ext = want_max ? std::max(ext, values[j]) : std::min(ext, values[j]);
  const double tol = 1e-9 * std::fabs(ext);

  // Orientation tensor of the tied nodes; remember the node if there is one.
  double m[6] = {0, 0, 0, 0, 0, 0};
  int ties = 0;
  Line only{0, 0};
  for (int i = 0; i <= L.J; ++i)
    for (int k = 0; k < L.cnt[i]; ++k) {
      if (!(std::fabs(values[L.off[i] + k] - ext) <= tol)) continue;
      const Line l = node_line(L, i, k);
      const Vec3 v = line_vector(l);
      m[kXX] += v(0) * v(0);
      m[kYY] += v(1) * v(1);
      m[kZZ] += v(2) * v(2);
      m[kXY] += v(0) * v(1);
      m[kXZ] += v(0) * v(2);
      m[kYZ] += v(1) * v(2);
      if (ties++ == 0) only = l;
    }
  if (ties == 1) return make_line(only.trend, only.plunge);  // canonical, exact
  double lam[3];
  Vec3 ev[3];
  principal_axes(m, lam, ev);
  return vector_line(ev[0]);
}

}  // namespace striae
