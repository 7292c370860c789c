// Blocked SIMD kernels for the dense work of right dihedra, density grids and the
// bootstrap, with a run-time choice of instruction set.
//
// WHY BLOCKS. An aggregate sees one row at a time. Testing each row against all
// grid nodes as it arrives makes the per-row work a loop whose data (the row's
// six numbers) come from memory each time and whose counters are read and
// written per row. Instead the transition function copies the row into a block
// of the state (DihedraBlock, AxisBlock) and, when the block is full, one kernel
// tests the whole block against all nodes: a tile of nodes stays in registers,
// the block's rows stream past it from L1, and each node's counter is loaded and
// stored once per block. The counts are integers, so the order in which rows and
// nodes are visited cannot change them: the blocked result equals the row-by-row
// result exactly. A pending block is part of the state's value: every function
// that reads the counts (combine, serialize, final) flushes it first, so the
// serialized forms are those of agg_state.hpp, unchanged.
//
// WHY NO FMA, AND WHY THE RESULTS ARE BIT-IDENTICAL ACROSS PATHS. The baseline
// path must run on any x86-64 (SSE2); faster paths (AVX2, AVX-512) are chosen at
// run time by a CPU check (__builtin_cpu_supports), never by -march. Every path
// evaluates the same expression per lane with the same operations in the same
// order: a product is rounded, then added (no fused multiply-add, which the
// baseline has not got and which rounds once instead of twice; this file's
// kernels are compiled with contraction off). A lane of a wider vector is the
// same IEEE double arithmetic as a lane of a narrower one, so every path gives
// the same bits, and the dihedra products equal those of the scalar dihedra_add,
// so the node-on-plane rule (dihedra.hpp) is decided on the same numbers.
// Unit tests run every path the CPU has explicitly and compare bits.
#pragma once

#include "dihedra.hpp"
#include "rng.hpp"
#include "stress.hpp"  // check_slip_datum

#include <cstddef>
#include <cstdint>
#include <type_traits>

namespace striae {

// ---------------------------------------------------------------------------
// Instruction-set paths
// ---------------------------------------------------------------------------

enum class SimdPath : int32_t {
  Baseline = 0,  // SSE2, any x86-64 (and the generic vector code elsewhere)
  Avx2 = 1,      // 256-bit vectors
  Avx512 = 2,    // 512-bit vectors (AVX-512F with DQ)
};

// Whether this CPU can run a path (Baseline always).
bool simd_path_supported(SimdPath p);
// The widest supported path: the one the kernels use unless told otherwise.
SimdPath simd_best_path();
// Name for messages and benchmarks ("baseline", "avx2", "avx512").
const char *simd_path_name(SimdPath p);

// ---------------------------------------------------------------------------
// Right dihedra
// ---------------------------------------------------------------------------

// Rows per block: 64 rows x 48 bytes = 3 KB. The counters of a tile of nodes are
// loaded and stored once per block, so beyond a few dozen rows the block size
// hardly matters (measured: 16, 32, 64 and 256 rows within the noise of each
// other, 64 the best), and a small block keeps the state small for GROUP BY
// over many groups (3 KB beside the 6.6 KB of counts of a 5-degree grid). At
// ~0.36 ns per node-row pair a block takes 20 us over the 826 nodes of a
// 5-degree grid and 2 ms over the 82,000 of the finest (0.5-degree) grid, so
// polling for interrupts once per block keeps the 10 ms rule.
constexpr int32_t kDihedraBlockRows = 64;

// Pending rows of a right-dihedra state, structure of arrays: v[0..2] are the
// n components, v[3..5] the u components of rows 0..rows-1. Rows are checked
// (check_slip_datum) before they enter. Lives in palloc memory: plain, trivially
// destructible, only 8-byte alignment assumed (kernels load unaligned).
struct DihedraBlock {
  int32_t rows;      // 0 .. kDihedraBlockRows
  int32_t reserved;  // 0
  double v[6][kDihedraBlockRows];
};
static_assert(std::is_trivially_copyable<DihedraBlock>::value &&
                  std::is_trivially_destructible<DihedraBlock>::value,
              "aggregate state lives in palloc memory");

// counts[i] += 2 for each row of the block for which node i is compressional,
// += 1 where it lies on a nodal plane: exactly what dihedra_add does row by
// row. nodes is dihedra_node_table(spacing) (structure of arrays, node_count
// nodes). Polls for interrupts once per block. Does not touch the block.
void dihedra_count_block(const double *nodes, int32_t node_count, const DihedraBlock &b, int64_t *counts);
void dihedra_count_block(SimdPath path, const double *nodes, int32_t node_count, const DihedraBlock &b,
                         int64_t *counts);

// Count the pending rows into the state (data_count += rows) and empty the block.
void dihedra_flush(DihedraHeader &h, int64_t *counts, const double *nodes, DihedraBlock &b);

// Check one datum (check_slip_datum, DataError) and append it to the block;
// a full block is flushed. The per-row work is this copy.
STRIAE_HOT void dihedra_push(DihedraHeader &h, int64_t *counts, const double *nodes, DihedraBlock &b,
                             const double n[3], const double u[3]) {
  check_slip_datum(n, u);
  const int32_t r = b.rows;
  b.v[0][r] = n[0];
  b.v[1][r] = n[1];
  b.v[2][r] = n[2];
  b.v[3][r] = u[0];
  b.v[4][r] = u[1];
  b.v[5][r] = u[2];
  b.rows = r + 1;
  if (b.rows == kDihedraBlockRows) dihedra_flush(h, counts, nodes, b);
}

// ---------------------------------------------------------------------------
// Bootstrap: weighted sums of per-datum terms
// ---------------------------------------------------------------------------

// For each resample r < nres: out[r*20 + k] = sum over i of w[r*stride + i] *
// table[i*20 + k], summed in the order i = 0, 1, .., count-1, each product
// rounded and then added to the running sum (starting from +0), as the
// one-resample loop of stress_bootstrap did. The resamples of a batch are
// independent sums, which the kernel interleaves (two running sums in flight
// per element hide the latency of the additions) while each sum keeps its
// own order: the result is bit-identical to the plain loop on every path.
// Data are taken in blocks that stay in L1 while every resample of the batch
// passes over them. Polls for interrupts per block.
void weighted_term_sums(const double *table, size_t count, const double *w, size_t stride, int nres,
                        double *out);
void weighted_term_sums(SimdPath path, const double *table, size_t count, const double *w, size_t stride,
                        int nres, double *out);

// The same sums, with the next batch's draws made in the same pass. The sums are
// floating-point work and the draws integer work bound by the generator's serial
// chain of dependent operations; interleaved, each runs in the other's idle
// execution units (on this machine the pair costs 15 to 20 % more than the
// draws alone, against the sum of both before). The draws: next_nres resamples
// of count draws each from rng, in stream order, each draw adding 1 to
// w_next[r * stride + rng.below(count)] for its resample r (w_next zeroed by the
// caller); rng is left where next_nres x count draws leave it. Neither result
// depends on the interleaving: out is bit-identical to weighted_term_sums and
// w_next to drawing alone.
// w and w_next must not overlap. count < 2^32.
void weighted_term_sums_drawing(SimdPath path, const double *table, size_t count, const double *w, size_t stride,
                                int nres, double *out, Rng &rng, double *w_next, int next_nres);

}  // namespace striae
