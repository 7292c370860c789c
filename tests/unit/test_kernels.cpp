// Unit tests of src/core/kernels: the blocked right-dihedra kernel against the
// scalar dihedra_add (exact counts, also on nodal planes), the bootstrap's
// weighted sums against the one-resample loop (exact bits), and every
// instruction-set path the CPU has against the baseline path (exact bits).
#include "bootstrap.hpp"
#include "dihedra.hpp"
#include "kernels.hpp"
#include "stress.hpp"
#include "test_rng.hpp"

#include <gtest/gtest.h>

#include <cmath>
#include <cstring>
#include <vector>

using namespace striae;

namespace {

const SimdPath kAllPaths[] = {SimdPath::Baseline, SimdPath::Avx2, SimdPath::Avx512};

// Random fault-slip data (angles uniform), as the SQL constructor makes them.
std::vector<SlipDatum> random_faults(int count, uint64_t seed) {
  striae_test::Rng r(seed);
  std::vector<SlipDatum> out;
  for (int i = 0; i < count; ++i)
    out.push_back(slip_datum(FaultSlip{360 * r.uniform(), 90 * r.uniform(), 360 * r.uniform() - 180}));
  return out;
}

// Each datum's 20 normal-equation terms (stress_contribution), the bootstrap's table.
std::vector<double> term_table(const std::vector<SlipDatum> &data) {
  std::vector<double> table(data.size() * 20);
  for (size_t i = 0; i < data.size(); ++i) stress_contribution(data[i].n, data[i].u, &table[i * 20]);
  return table;
}

// Faults in whole multiples of `step` degrees: their nodal planes pass exactly
// (in exact arithmetic) through nodes of grids whose spacing divides the step,
// e.g. the horizontal ring of every vertical fault and the poles of both
// planes; the node-on-plane rule (dihedra.hpp) decides those nodes.
std::vector<SlipDatum> grid_faults(double step) {
  std::vector<SlipDatum> out;
  for (double s = 0; s < 360; s += step)
    for (double d = step; d <= 90; d += step)
      for (double r = -180 + step; r <= 180; r += step) out.push_back(slip_datum(FaultSlip{s, d, r}));
  return out;
}

// Counts of the scalar path (one datum at a time).
std::vector<int64_t> scalar_counts(double spacing, const std::vector<SlipDatum> &data, DihedraHeader &h) {
  h = dihedra_init(spacing);
  std::vector<int64_t> c(h.node_count, 0);
  const std::vector<double> nodes = dihedra_node_table(spacing);
  for (const SlipDatum &d : data) dihedra_add(h, c.data(), nodes.data(), d.n, d.u);
  return c;
}

// Counts of the blocked path on one instruction set: dihedra_push's copy into
// the block, then the kernel per full block and for the rest.
std::vector<int64_t> block_counts(SimdPath path, double spacing, const std::vector<SlipDatum> &data,
                                  DihedraHeader &h) {
  h = dihedra_init(spacing);
  std::vector<int64_t> c(h.node_count, 0);
  const std::vector<double> nodes = dihedra_node_table(spacing);
  DihedraBlock b;
  std::memset(&b, 0, sizeof b);
  for (const SlipDatum &d : data) {
    for (int k = 0; k < 3; ++k) {
      b.v[k][b.rows] = d.n[k];
      b.v[3 + k][b.rows] = d.u[k];
    }
    if (++b.rows == kDihedraBlockRows) {
      dihedra_count_block(path, nodes.data(), h.node_count, b, c.data());
      h.data_count += b.rows;
      b.rows = 0;
    }
  }
  dihedra_count_block(path, nodes.data(), h.node_count, b, c.data());
  h.data_count += b.rows;
  return c;
}

// Pairs (node, datum) decided by the on-plane rule: |(x.n)(x.u)| <= kDihedraOnPlane,
// computed as dihedra_add computes it.
int64_t on_plane_pairs(double spacing, const std::vector<SlipDatum> &data) {
  const std::vector<double> t = dihedra_node_table(spacing);
  const size_t k = t.size() / 3;
  int64_t m = 0;
  for (const SlipDatum &d : data)
    for (size_t i = 0; i < k; ++i) {
      const double a = t[i] * d.n[0] + t[k + i] * d.n[1] + t[2 * k + i] * d.n[2];
      const double b = t[i] * d.u[0] + t[k + i] * d.u[1] + t[2 * k + i] * d.u[2];
      if (std::fabs(a * b) <= kDihedraOnPlane) ++m;
    }
  return m;
}

}  // namespace

TEST(SimdPaths, BaselineAlwaysAndTheBestIsSupported) {
  EXPECT_TRUE(simd_path_supported(SimdPath::Baseline));
  EXPECT_TRUE(simd_path_supported(simd_best_path()));
  // A wider path implies the narrower one on every x86-64 CPU (common practice, no source).
  if (simd_path_supported(SimdPath::Avx512)) {
    EXPECT_TRUE(simd_path_supported(SimdPath::Avx2));
  }
  std::printf("[          ] kernels: best path on this CPU: %s\n", simd_path_name(simd_best_path()));
}

TEST(DihedraKernel, EqualsTheScalarPathOnNodalPlanes) {
  // 15-degree faults on the 5- and 15-degree grids (and the 45-degree grid, 7
  // nodes: one partial tile only): many node-datum pairs lie on a nodal plane.
  const std::vector<SlipDatum> data = grid_faults(15);
  for (double spacing : {5.0, 15.0, 45.0}) {
    const int64_t on = on_plane_pairs(spacing, data);
    ASSERT_GT(on, 100) << "the data must exercise the on-plane rule";
    DihedraHeader hs, hb;
    const std::vector<int64_t> s = scalar_counts(spacing, data, hs);
    for (SimdPath p : kAllPaths) {
      if (!simd_path_supported(p)) continue;
      const std::vector<int64_t> b = block_counts(p, spacing, data, hb);
      EXPECT_EQ(b, s) << simd_path_name(p) << " spacing " << spacing << " (" << on << " on-plane pairs)";
      EXPECT_EQ(hb.data_count, hs.data_count);
    }
  }
}

TEST(DihedraKernel, ProductsExactlyAtTheToleranceAreOnThePlane) {
  // The on-plane rule (dihedra.hpp): a node whose product a*c lies within
  // kDihedraOnPlane of zero, both ends included, counts half (1 in half-data
  // units); below -kDihedraOnPlane it is compressional (2), above extensional (0).
  // One node (1, 0, 0) and rows n = (p, 0, 0), u = (1, 0, 0) give a*c = p exactly.
  const double tol = kDihedraOnPlane;
  const struct {
    double p;
    int64_t half_units;
  } cases[] = {{std::nextafter(-tol, -1.0), 2}, {-tol, 1}, {0.0, 1}, {tol, 1}, {std::nextafter(tol, 1.0), 0},
               {-0.5, 2}, {0.5, 0}};
  const double node[3] = {1.0, 0.0, 0.0};
  for (SimdPath path : kAllPaths) {
    if (!simd_path_supported(path)) continue;
    for (const auto &c : cases) {
      DihedraBlock b;
      std::memset(&b, 0, sizeof b);
      b.v[0][0] = c.p;
      b.v[3][0] = 1.0;
      b.rows = 1;
      int64_t count = 0;
      dihedra_count_block(path, node, 1, b, &count);
      EXPECT_EQ(count, c.half_units) << simd_path_name(path) << " a*c = " << c.p;
    }
  }
}

TEST(DihedraKernel, EqualsTheScalarPathOnRandomData) {
  // 1000 data: 15 full blocks and a partial one; 5 degrees: 826 nodes, a partial tile.
  const std::vector<SlipDatum> data = random_faults(1000, 11);
  for (double spacing : {5.0, 2.0}) {
    DihedraHeader hs, hb;
    const std::vector<int64_t> s = scalar_counts(spacing, data, hs);
    for (SimdPath p : kAllPaths) {
      if (!simd_path_supported(p)) {
        std::printf("[          ] %s not on this CPU: skipped\n", simd_path_name(p));
        continue;
      }
      EXPECT_EQ(block_counts(p, spacing, data, hb), s) << simd_path_name(p) << " spacing " << spacing;
    }
  }
}

TEST(DihedraKernel, PushAndFlushEqualAddRowByRow) {
  // The transition path: dihedra_push (flushes every full block), then dihedra_flush.
  const std::vector<SlipDatum> data = random_faults(3 * kDihedraBlockRows + 5, 12);
  DihedraHeader hs;
  const std::vector<int64_t> s = scalar_counts(5, data, hs);
  DihedraHeader h = dihedra_init(5);
  std::vector<int64_t> c(h.node_count, 0);
  const std::vector<double> nodes = dihedra_node_table(5);
  DihedraBlock b;
  std::memset(&b, 0, sizeof b);
  for (size_t i = 0; i < data.size(); ++i) {
    dihedra_push(h, c.data(), nodes.data(), b, data[i].n, data[i].u);
    // Counted block by block: the header counts only flushed rows.
    EXPECT_EQ(h.data_count + b.rows, static_cast<int64_t>(i + 1));
  }
  EXPECT_EQ(b.rows, 5);
  dihedra_flush(h, c.data(), nodes.data(), b);
  EXPECT_EQ(b.rows, 0);
  EXPECT_EQ(h.data_count, hs.data_count);
  EXPECT_EQ(c, s);
  dihedra_validate(h, c.data());
  // A bad datum is refused before it enters the block.
  const double n[3] = {0, 0, 1}, u[3] = {0, 0, 1};
  EXPECT_THROW(dihedra_push(h, c.data(), nodes.data(), b, n, u), Error);
  EXPECT_EQ(b.rows, 0);
}

TEST(BootstrapSums, EveryPathEqualsTheOneResampleLoopBitForBit) {
  // 333 data (two blocks of 128 and a partial one), 7 resamples (pairs and a rest).
  const std::vector<SlipDatum> data = random_faults(333, 13);
  const size_t n = data.size();
  const std::vector<double> table = term_table(data);
  const int m = 7;
  // The reference: the loop stress_bootstrap ran before the kernel, one
  // resample at a time: multiplicities from the same generator stream, then
  // acc = acc + mult * term in data order.
  std::vector<double> ref(m * 20, 0.0);
  {
    Rng rng(99);
    std::vector<uint32_t> mult(n);
    for (int r = 0; r < m; ++r) {
      std::fill(mult.begin(), mult.end(), 0u);
      for (size_t k = 0; k < n; ++k) ++mult[rng.below(static_cast<uint32_t>(n))];
      for (size_t i = 0; i < n; ++i)
        for (int k = 0; k < 20; ++k) {
          const double prod = static_cast<double>(mult[i]) * table[i * 20 + k];
          ref[r * 20 + k] = ref[r * 20 + k] + prod;
        }
    }
  }
  for (SimdPath p : kAllPaths) {
    if (!simd_path_supported(p)) continue;
    Rng rng(99);
    std::vector<double> w(m * n), out(m * 20);
    bootstrap_batch_sums(rng, table.data(), n, m, w.data(), out.data(), p);
    EXPECT_EQ(std::memcmp(out.data(), ref.data(), sizeof(double) * out.size()), 0) << simd_path_name(p);
    // The generator is left where the one-at-a-time loop leaves it.
    Rng after(99);
    for (size_t k = 0; k < m * n; ++k) after.below(static_cast<uint32_t>(n));
    EXPECT_EQ(rng.next(), after.next()) << simd_path_name(p);
  }
}

TEST(BootstrapSums, WeightsOfOneSumToTheAggregateSums) {
  // All multiplicities 1: the sums are the plain sums of the terms in data
  // order, which is how the streaming aggregate sums them (derived).
  const std::vector<SlipDatum> data = random_faults(200, 14);
  std::vector<double> table(200 * 20), sums(20, 0.0), ones(200, 1.0), out(20);
  for (size_t i = 0; i < 200; ++i) {
    stress_contribution(data[i].n, data[i].u, &table[i * 20]);
    for (int k = 0; k < 20; ++k) sums[k] = sums[k] + 1.0 * table[i * 20 + k];
  }
  for (SimdPath p : kAllPaths) {
    if (!simd_path_supported(p)) continue;
    weighted_term_sums(p, table.data(), 200, ones.data(), 200, 1, out.data());
    EXPECT_EQ(out, sums) << simd_path_name(p);
  }
}

TEST(FocalBootstrapTerms, PrecomputedTermsGiveTheSameInversionToTheBit) {
  // The focal bootstrap computes both planes' terms once and hands them to
  // focal_fixed_friction; without them it recomputes the terms per iteration.
  const std::vector<SlipDatum> data = random_faults(300, 16);
  const size_t n = data.size();
  std::vector<double> terms(n * 40);
  for (size_t i = 0; i < n; ++i) {
    stress_contribution(data[i].n, data[i].u, &terms[40 * i]);
    stress_contribution(data[i].u, data[i].n, &terms[40 * i + 20]);
  }
  Rng rng(3);
  std::vector<uint32_t> mult(n, 0);
  for (size_t k = 0; k < n; ++k) ++mult[rng.below(static_cast<uint32_t>(n))];
  for (const uint32_t *w : {static_cast<const uint32_t *>(nullptr), static_cast<const uint32_t *>(mult.data())}) {
    std::vector<uint8_t> pa(n), pb(n);
    StressTensor ta, tb;
    std::memset(&ta, 0, sizeof ta);
    std::memset(&tb, 0, sizeof tb);
    double sa, sb;
    int32_t ia, ib;
    const StressStatus a = focal_fixed_friction(data.data(), n, w, 0.6, pa.data(), ta, sa, ia);
    const StressStatus b = focal_fixed_friction(data.data(), n, w, 0.6, pb.data(), tb, sb, ib, terms.data());
    ASSERT_EQ(a, StressStatus::Ok);
    EXPECT_EQ(a, b);
    EXPECT_EQ(std::memcmp(&ta, &tb, sizeof ta), 0);
    EXPECT_EQ(sa, sb);
    EXPECT_EQ(ia, ib);
    EXPECT_EQ(pa, pb);
  }
}

TEST(BootstrapSums, DrawingTheNextBatchDuringTheSumsChangesNothing) {
  // weighted_term_sums_drawing: the sums of one batch equal weighted_term_sums
  // bit for bit, the next batch's multiplicities equal drawing them alone, and
  // the generator ends where drawing alone leaves it; for a next batch as large
  // as this one (the exact pass), smaller (the last batch), empty and larger.
  const std::vector<SlipDatum> data = random_faults(333, 17);
  const size_t n = data.size();
  const std::vector<double> table = term_table(data);
  const int cur = 5;
  for (const int next : {5, 2, 0, 7}) {
    for (SimdPath p : kAllPaths) {
      if (!simd_path_supported(p)) continue;
      // Alone: draw this batch, sum it, then draw the next one.
      Rng a(123 + static_cast<uint64_t>(next));
      std::vector<double> wa(cur * n), outa(cur * 20), wa_next(next * n + 1, 0.0);
      bootstrap_batch_sums(a, table.data(), n, cur, wa.data(), outa.data(), p);
      for (int r = 0; r < next; ++r)
        for (size_t k = 0; k < n; ++k) wa_next[r * n + a.below(static_cast<uint32_t>(n))] += 1.0;
      // Together.
      Rng b(123 + static_cast<uint64_t>(next));
      std::vector<double> wb(cur * n, 0.0), outb(cur * 20), wb_next(next * n + 1, 0.0);
      for (int r = 0; r < cur; ++r)
        for (size_t k = 0; k < n; ++k) wb[r * n + b.below(static_cast<uint32_t>(n))] += 1.0;
      weighted_term_sums_drawing(p, table.data(), n, wb.data(), n, cur, outb.data(), b, wb_next.data(), next);
      EXPECT_EQ(wa, wb) << simd_path_name(p) << " next " << next;
      EXPECT_EQ(std::memcmp(outa.data(), outb.data(), sizeof(double) * outa.size()), 0)
          << simd_path_name(p) << " next " << next;
      EXPECT_EQ(wa_next, wb_next) << simd_path_name(p) << " next " << next;
      EXPECT_EQ(a.next(), b.next()) << simd_path_name(p) << " next " << next;
    }
  }
}
