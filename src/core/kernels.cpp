// Blocked SIMD kernels (kernels.hpp): one generic body per kernel, written with
// GCC/Clang vector extensions, instantiated per instruction set in functions with
// a target attribute, and chosen at run time by a CPU check.
//
// No multiply-add may be fused anywhere in this file (kernels.hpp explains why):
// GCC contracts a*b+c into an FMA whenever the target has one (AVX-512F brings
// it) unless told not to, so contraction is switched off for the whole file.
#if defined(__clang__)
#pragma STDC FP_CONTRACT OFF
#elif defined(__GNUC__)
#pragma GCC optimize("fp-contract=off")
#endif

#include "kernels.hpp"

// The helpers below pass vectors by value; they are always inlined into the
// function of their own target, so no call with a wider-vector ABI exists.
#if defined(__clang__)
#pragma clang diagnostic ignored "-Wpsabi"
#elif defined(__GNUC__)
#pragma GCC diagnostic ignored "-Wpsabi"
#endif

#include <immintrin.h>

#include <algorithm>
#include <cstring>

namespace striae {

// ---------------------------------------------------------------------------
// Paths
// ---------------------------------------------------------------------------

// CPU check (the compiler runtime also checks that the OS saves the wide registers).
bool simd_path_supported(SimdPath p) {
  switch (p) {
    case SimdPath::Baseline:
      return true;
    case SimdPath::Avx2:
      return __builtin_cpu_supports("avx2");
    case SimdPath::Avx512:
      return __builtin_cpu_supports("avx512f") && __builtin_cpu_supports("avx512dq");
  }
  return false;
}

// Widest supported path, decided once.
SimdPath simd_best_path() {
  static const SimdPath best = simd_path_supported(SimdPath::Avx512) ? SimdPath::Avx512
                               : simd_path_supported(SimdPath::Avx2) ? SimdPath::Avx2
                                                                     : SimdPath::Baseline;
  return best;
}

const char *simd_path_name(SimdPath p) {
  switch (p) {
    case SimdPath::Baseline:
      return "baseline";
    case SimdPath::Avx2:
      return "avx2";
    case SimdPath::Avx512:
      return "avx512";
  }
  return "?";
}

namespace {

// A path the CPU lacks would crash with an illegal instruction: refuse it.
void require(SimdPath p) {
  if (!simd_path_supported(p))
    throw Error(ErrorKind::InvalidParameter, std::string("this CPU cannot run the ") + simd_path_name(p) + " kernels");
}

#define KERNEL_INLINE inline __attribute__((always_inline))
// Loops over the vectors of a tile must be unrolled for the vectors to stay in
// registers (-O2 does not unroll them on its own).
#define UNROLL _Pragma("GCC unroll 16")

// Vector types: L doubles, and the 64-bit integer lanes that comparisons yield.
typedef double D2 __attribute__((vector_size(16)));
typedef long long I2 __attribute__((vector_size(16)));
typedef double D4 __attribute__((vector_size(32)));
typedef long long I4 __attribute__((vector_size(32)));
typedef double D8 __attribute__((vector_size(64)));
typedef long long I8 __attribute__((vector_size(64)));

template <class V>
constexpr int lanes() {
  return static_cast<int>(sizeof(V) / sizeof(double));
}

// Unaligned load and store (palloc memory is only 8-byte aligned).
template <class V>
KERNEL_INLINE V load(const double *p) {
  V v;
  std::memcpy(&v, p, sizeof v);
  return v;
}
template <class V>
KERNEL_INLINE void store(double *p, const V &v) {
  std::memcpy(p, &v, sizeof v);
}

// Every lane = s, bit for bit (also -0.0).
template <class V>
KERNEL_INLINE V splat(double s) {
  V v;
  for (int l = 0; l < lanes<V>(); ++l) v[l] = s;
  return v;
}

// Every lane = *p. GCC compiles the element-wise splat above to a load and two
// shuffles; on the wide paths it gets one broadcast load (vbroadcastsd) from the
// intrinsic. Clang already emits the broadcast for the splat, and refuses calls
// from the generic kernel bodies into target-specific helpers, so it keeps the
// splat. Same bits either way.
#if defined(__clang__)
template <class V>
KERNEL_INLINE V splat_load(const double *p, V) {
  return splat<V>(*p);
}
#else
KERNEL_INLINE D2 splat_load(const double *p, D2) { return splat<D2>(*p); }
// Not always_inline: GCC inlines them once the generic body is inlined into its
// target function (checked in the disassembly: no calls remain).
__attribute__((target("avx2"))) inline D4 splat_load(const double *p, D4) {
  return reinterpret_cast<D4>(_mm256_broadcast_sd(p));
}
__attribute__((target("avx512f"))) inline D8 splat_load(const double *p, D8) {
  return reinterpret_cast<D8>(_mm512_set1_pd(*p));
}
#endif

// ---------------------------------------------------------------------------
// Right dihedra
// ---------------------------------------------------------------------------

// C -= 1 in each lane where ab < lo, and again where ab <= hi. A true vector
// comparison is -1 in its integer lane, so two additions do it; with AVX-512 a
// comparison yields a mask register, and a masked subtraction (the conditional
// form) saves the instruction that would widen the mask to a vector.
template <class V, class I>
KERNEL_INLINE void tally(I &C, const V &ab, const V &lo, const V &hi) {
  C += (I)(ab < lo);
  C += (I)(ab <= hi);
}
KERNEL_INLINE void tally(I8 &C, const D8 &ab, const D8 &lo, const D8 &hi) {
  const I8 one = {1, 1, 1, 1, 1, 1, 1, 1};
  C = ab < lo ? C - one : C;
  C = ab <= hi ? C - one : C;
}

// T vectors of nodes against every row of the block. a and b are evaluated as
// dihedra_add writes them, ((x n0 + y n1) + z n2), each product rounded, so the
// products ab are the same doubles. A true comparison is -1 in its integer
// lane: C counts minus (compressional + on-plane), in half data.
template <class V, class I, int T>
KERNEL_INLINE void dihedra_tile(const double *x, const double *y, const double *z, const DihedraBlock &b,
                                int64_t *counts) {
  constexpr int L = lanes<V>();
  V X[T], Y[T], Z[T];
  I C[T];
  UNROLL
  for (int t = 0; t < T; ++t) {
    X[t] = load<V>(x + t * L);
    Y[t] = load<V>(y + t * L);
    Z[t] = load<V>(z + t * L);
    C[t] = I{};
  }
  const V lo = splat<V>(-kDihedraOnPlane), hi = splat<V>(kDihedraOnPlane);
  const double *n0 = b.v[0], *n1 = b.v[1], *n2 = b.v[2], *u0 = b.v[3], *u1 = b.v[4], *u2 = b.v[5];
  const int32_t rows = b.rows;
  for (int32_t r = 0; r < rows; ++r) {
    const V N0 = splat_load(&n0[r], V{}), N1 = splat_load(&n1[r], V{}), N2 = splat_load(&n2[r], V{});
    const V U0 = splat_load(&u0[r], V{}), U1 = splat_load(&u1[r], V{}), U2 = splat_load(&u2[r], V{});
    UNROLL
    for (int t = 0; t < T; ++t) {
      const V a = X[t] * N0 + Y[t] * N1 + Z[t] * N2;
      const V c = X[t] * U0 + Y[t] * U1 + Z[t] * U2;
      tally(C[t], a * c, lo, hi);
    }
  }
  UNROLL
  for (int t = 0; t < T; ++t)
    UNROLL
    for (int l = 0; l < L; ++l) counts[t * L + l] -= C[t][l];
}

// All nodes: whole tiles, then the last partial tile through zero-padded copies
// (a zero node's counts are computed and dropped).
template <class V, class I, int T>
KERNEL_INLINE void dihedra_kernel(const double *nodes, int32_t k, const DihedraBlock &b, int64_t *counts) {
  constexpr int W = T * lanes<V>();
  const double *x = nodes, *y = nodes + k, *z = nodes + 2 * static_cast<size_t>(k);
  int32_t i = 0;
  for (; i + W <= k; i += W) dihedra_tile<V, I, T>(x + i, y + i, z + i, b, counts + i);
  if (i < k) {
    double tx[W] = {}, ty[W] = {}, tz[W] = {};
    int64_t tc[W] = {};
    const int32_t m = k - i;
    std::copy(x + i, x + k, tx);
    std::copy(y + i, y + k, ty);
    std::copy(z + i, z + k, tz);
    dihedra_tile<V, I, T>(tx, ty, tz, b, tc);
    for (int32_t j = 0; j < m; ++j) counts[i + j] += tc[j];
  }
}

void dihedra_baseline(const double *nodes, int32_t k, const DihedraBlock &b, int64_t *counts) {
  dihedra_kernel<D2, I2, 2>(nodes, k, b, counts);
}

__attribute__((target("avx2"))) void dihedra_avx2(const double *nodes, int32_t k, const DihedraBlock &b,
                                                  int64_t *counts) {
  dihedra_kernel<D4, I4, 2>(nodes, k, b, counts);
}

__attribute__((target("avx512f,avx512dq"))) void dihedra_avx512(const double *nodes, int32_t k,
                                                                const DihedraBlock &b, int64_t *counts) {
  dihedra_kernel<D8, I8, 2>(nodes, k, b, counts);
}

// ---------------------------------------------------------------------------
// Bootstrap sums
// ---------------------------------------------------------------------------

constexpr int kTerms = 20;          // per datum: 15 of A^T A, 5 of A^T u (stress.hpp)
constexpr size_t kSumBlock = 128;   // data per block: 20 KB of terms, kept in L1

// No draws beside the sums.
struct NoDraws {
  KERNEL_INLINE void step() {}
};

// Draws beside the sums (weighted_term_sums_drawing): a local copy of the
// generator, so that its state stays in registers; one draw per step until
// every resample has its count draws. Exact: the pass has exactly as many
// steps as draws to make (the next batch is as large as this one), so the
// check for the end of the draws is left out of the loop.
template <bool Exact>
struct Draws {
  Rng rng;
  double *w;           // the current resample's multiplicities
  size_t stride;
  uint32_t n;          // draws per resample, and their bound
  uint32_t left;       // draws left in the current resample
  int resamples;       // resamples left, the current one included
  KERNEL_INLINE void step() {
    if (!Exact && resamples == 0) return;
    w[rng.below(n)] += 1.0;
    if (--left == 0) {
      w += stride;
      left = n;
      --resamples;
    }
  }
};

template <class D>
struct IsDraws : std::false_type {};
template <bool E>
struct IsDraws<Draws<E>> : std::true_type {};

// R resamples over data [i0, i1): acc(r) = acc(r) + w(r, i) * t(i), i in order;
// R draws per datum beside them.
template <class V, int R, class D>
KERNEL_INLINE void wsum_pass(const double *table, size_t i0, size_t i1, const double *w, size_t stride,
                             double *out, D &draws) {
  constexpr int L = lanes<V>(), NV = kTerms / L;
  static_assert(kTerms % L == 0, "terms fill whole vectors");
  V acc[R][NV];
  UNROLL
  for (int r = 0; r < R; ++r)
    UNROLL
    for (int v = 0; v < NV; ++v) acc[r][v] = load<V>(out + r * kTerms + v * L);
  const double *c = table + i0 * kTerms;
  for (size_t i = i0; i < i1; ++i, c += kTerms) {
    UNROLL
    for (int r = 0; r < R; ++r) {
      const V s = splat_load(&w[r * stride + i], V{});
      UNROLL
      for (int v = 0; v < NV; ++v) acc[r][v] = acc[r][v] + s * load<V>(c + v * L);
    }
    UNROLL
    for (int r = 0; r < R; ++r) draws.step();
  }
  UNROLL
  for (int r = 0; r < R; ++r)
    UNROLL
    for (int v = 0; v < NV; ++v) store<V>(out + r * kTerms + v * L, acc[r][v]);
}

template <class V, int R, class D>
KERNEL_INLINE void wsum_kernel(const double *table, size_t count, const double *w, size_t stride, int nres,
                               double *out, D &draws_in) {
  D draws = draws_in;  // in registers, not behind a reference
  std::fill(out, out + static_cast<size_t>(nres) * kTerms, 0.0);
  for (size_t i0 = 0; i0 < count; i0 += kSumBlock) {
    poll_interrupts();
    const size_t i1 = std::min(count, i0 + kSumBlock);
    int r = 0;
    for (; r + R <= nres; r += R)
      wsum_pass<V, R>(table, i0, i1, w + static_cast<size_t>(r) * stride, stride, out + r * kTerms, draws);
    for (; r < nres; ++r)
      wsum_pass<V, 1>(table, i0, i1, w + static_cast<size_t>(r) * stride, stride, out + r * kTerms, draws);
  }
  // Draws the sums did not cover (a next batch larger than this one).
  if constexpr (IsDraws<D>::value) {
    while (draws.resamples > 0) {
      poll_interrupts();
      for (uint32_t k = draws.left; k > 0; --k) draws.step();
    }
  }
  draws_in = draws;
}

template <class D>
void wsum_baseline(const double *table, size_t count, const double *w, size_t stride, int nres, double *out,
                   D &draws) {
  wsum_kernel<D2, 1>(table, count, w, stride, nres, out, draws);
}

template <class D>
__attribute__((target("avx2"))) void wsum_avx2(const double *table, size_t count, const double *w, size_t stride,
                                               int nres, double *out, D &draws) {
  wsum_kernel<D4, 2>(table, count, w, stride, nres, out, draws);
}

template <class D>
void wsum(SimdPath path, const double *table, size_t count, const double *w, size_t stride, int nres, double *out,
          D &draws) {
  require(path);
  // No 512-bit variant: 20 terms do not fill 8-lane vectors, and two 256-bit
  // sums in flight already keep this machine's adders busy.
  if (path == SimdPath::Baseline) wsum_baseline(table, count, w, stride, nres, out, draws);
  else wsum_avx2(table, count, w, stride, nres, out, draws);
}

}  // namespace

// ---------------------------------------------------------------------------
// Entry points
// ---------------------------------------------------------------------------

void dihedra_count_block(SimdPath path, const double *nodes, int32_t node_count, const DihedraBlock &b,
                         int64_t *counts) {
  require(path);
  poll_interrupts();
  switch (path) {
    case SimdPath::Avx512:
      dihedra_avx512(nodes, node_count, b, counts);
      return;
    case SimdPath::Avx2:
      dihedra_avx2(nodes, node_count, b, counts);
      return;
    case SimdPath::Baseline:
      break;
  }
  dihedra_baseline(nodes, node_count, b, counts);
}

void dihedra_count_block(const double *nodes, int32_t node_count, const DihedraBlock &b, int64_t *counts) {
  dihedra_count_block(simd_best_path(), nodes, node_count, b, counts);
}

void dihedra_flush(DihedraHeader &h, int64_t *counts, const double *nodes, DihedraBlock &b) {
  if (b.rows == 0) return;
  dihedra_count_block(nodes, h.node_count, b, counts);
  h.data_count += b.rows;
  b.rows = 0;
}

void weighted_term_sums(SimdPath path, const double *table, size_t count, const double *w, size_t stride,
                        int nres, double *out) {
  NoDraws none;
  wsum(path, table, count, w, stride, nres, out, none);
}

void weighted_term_sums_drawing(SimdPath path, const double *table, size_t count, const double *w, size_t stride,
                                int nres, double *out, Rng &rng, double *w_next, int next_nres) {
  const int next = count == 0 ? 0 : std::max(next_nres, 0);
  const uint32_t n = static_cast<uint32_t>(count);
  if (next == nres) {
    Draws<true> d{rng, w_next, stride, n, n, next};
    wsum(path, table, count, w, stride, nres, out, d);
    rng = d.rng;
  } else {
    Draws<false> d{rng, w_next, stride, n, n, next};
    wsum(path, table, count, w, stride, nres, out, d);
    rng = d.rng;
  }
}

void weighted_term_sums(const double *table, size_t count, const double *w, size_t stride, int nres,
                        double *out) {
  weighted_term_sums(simd_best_path(), table, count, w, stride, nres, out);
}

}  // namespace striae
