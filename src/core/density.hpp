// Density of axial data (lineations, poles of planes) on the lower hemisphere,
// evaluated at the nodes of a grid.hpp layout. METHODS.md section 8.
//
// METHOD. Exponential (smoothed Kamb) weighting after Vollmer (1995) with k = 3
// [formula from memory, METHODS.md]: a datum x contributes to node g the weight
//     W(g, x) = exp(f (|g.x| - 1)),   f = 2 (1 + N / k^2),   k = 3,
// where N is the number of data. The weight is axial (|g.x|), so a datum near
// the horizontal counts on both sides of the primitive circle: there is no
// edge effect. f grows with N, so the kernel narrows as data accumulate, as
// the Kamb (1959) counting area A = k^2 / (N + k^2) shrinks.
//
// UNIT: multiples of uniform density ("MUD"). The value at node g is
//     D(g) = sum_x W(g, x) / (N E[W]),   E[W] = (1 - exp(-f)) / f,
// where E[W] is the mean of W over the sphere for one uniformly placed datum:
// for uniform x, c = g.x is uniform on [-1, 1] (Archimedes' hat-box theorem),
// so E[W] = (1/2) int_{-1}^{1} exp(f(|c| - 1)) dc = (1 - exp(-f)) / f [derived].
// Consequences [derived]: a uniform distribution has expected value exactly 1
// at every node; for any data the area-weighted mean of D over the hemisphere
// is exactly 1 (hemisphere integral 2 pi); and under uniformity D has standard
// deviation sqrt((f (1 - e^-2f) / (2 (1 - e^-f)^2) - 1) / N), which tends to
// 1/3 for large N, so with k = 3 a value of 2 is about three standard
// deviations above uniform, as in Kamb's choice of k.
//
// TRUNCATION: weights below exp(-kDensityCutoff) = exp(-50) ~ 2e-22 are
// skipped (this is what makes large groups fast). The error this makes is
// below f exp(-50) / (1 - exp(-f)) MUD, e.g. < 5e-14 MUD for N = 10^9.
//
// BINNING. A bounded aggregate state cannot keep the data, so data are binned
// first: every axis is replaced by the nearest node of the fixed fine layout
// grid_nodes(kDensityBinSpacing) (0.5 degree, grid_node_count(0.5) = bins; the
// bin id is the node index). The state is a sparse list of (bin id, count)
// pairs, sorted by id without duplicates, so its size is at most
// min(N, bin count). Binned density moves each datum to its bin centre, by at
// most kDensityMaxBinOffsetDeg = 0.36 degree (analytic figure for the
// mid-latitude cells: sqrt(2) * 0.25 = 0.354 degree; measured maximum 0.3543
// over 10^6 random axes plus dense sweeps of the polar cap and of the
// horizontal ring, test DensityBins.OffsetBoundMeasured). Its effect on D was
// measured against the unbinned density (density_values_axes) on a 1-degree
// grid, as max |binned - exact| / max(exact), test
// DensityValues.BinningErrorMeasured: clusters 20 degrees wide gave 0.12 % at
// N = 30, 0.3 % at N = 300, 1.8 % at N = 3000 and 4.2 % at N = 30000; a
// 5-degree cluster of 3000 gave 0.26 %. The error grows with N because the
// kernel (angular scale sqrt(2/f) ~ 3/sqrt(N) rad) narrows towards the bin
// size; beyond N ~ 10^5 the binned density is a picture at the 0.5-degree
// resolution of the bins, which is also the finest output grid.
//
// Everything here works on caller-owned plain arrays (the SQL layer keeps them
// in PostgreSQL memory). The 0.5-degree ring table (181 rings) is built once
// per process on first use; apart from that only density_values* and
// grid_extreme allocate (temporary std::vectors of the output grid).
#pragma once

#include "grid.hpp"

#include <cstddef>
#include <cstdint>

namespace striae {

constexpr double kDensityBinSpacing = 0.5;     // degrees: the bin layout
constexpr double kDensityK = 3.0;              // Kamb's k
constexpr double kDensityCutoff = 50.0;        // skip weights below exp(-50)
constexpr double kDensityMaxBinOffsetDeg = 0.36;  // bound on datum-to-bin-centre angle

// Number of bins (= grid_node_count(0.5)).
uint32_t density_bin_count();

// Id of the bin nearest to an axis (any sign, any non-zero length), in O(1):
// the two rings whose plunges bracket the axis, the nearest trend index in
// each (the horizontal half-ring is axial: trend 179.9 is next to trend 0),
// or the single vertical node; the closer candidate wins, the lower id on an
// exact tie. Throws DataError for a zero or non-finite vector.
uint32_t density_bin(const Vec3 &axis);

// Unit vector of a bin centre: bit-identical to grid_node_vectors(0.5)[id].
// Throws InvalidParameter for id >= density_bin_count().
Vec3 density_bin_center(uint32_t id);

// Sort (ids, counts) by id and merge duplicate ids by adding their counts, in
// place; entries with count 0 are dropped. Returns the new length m' <= m.
// No allocation (heap sort). Throws BadState for an id out of range and
// DataError if a merged count would overflow.
size_t compact_bins(uint32_t *ids, uint64_t *counts, size_t m);

// Merge two compacted lists (strictly increasing ids, counts > 0) into out,
// which must have room for na + nb entries (never more than
// density_bin_count() are used) and must not overlap the inputs. Returns the
// output length. Integer addition, so combine order never changes the result.
// DataError if the total count would exceed 2^53 (validate_bins' limit).
size_t merge_bins(const uint32_t *a_ids, const uint64_t *a_counts, size_t na,
                  const uint32_t *b_ids, const uint64_t *b_counts, size_t nb,
                  uint32_t *out_ids, uint64_t *out_counts);

// Throw BadState unless the list is compacted: ids strictly increasing and
// below density_bin_count(), counts > 0, total count below 2^53.
void validate_bins(const uint32_t *ids, const uint64_t *counts, size_t m);

// Total number of data in a list (sum of counts).
uint64_t bins_total(const uint64_t *counts, size_t m);

// Kernel concentration f = 2 (1 + N / k^2) for N data.
double density_kernel_f(uint64_t n);

// Factor turning a weight sum into MUD: f / (N (1 - exp(-f))).
double density_mud_factor(uint64_t n);

// Density in MUD at every node of grid_nodes(spacing) from a compacted bin
// list (validated here). out_values must hold grid_node_count(spacing)
// values. Throws InvalidParameter for a bad spacing, DataError for an empty
// list (the SQL layer returns NULL for an empty group instead).
void density_values(const uint32_t *ids, const uint64_t *counts, size_t m, double spacing,
                    double *out_values);

// The same density from unbinned axes (n vectors, any sign, non-zero): the
// exact reference against which binning was measured; also usable for small
// groups that keep their data.
void density_values_axes(const Vec3 *axes, size_t n, double spacing, double *out_values);

// Axial mean (principal eigenvector of the orientation tensor of the node
// vectors) of all nodes whose value is within 1e-9 * |extreme| of the
// maximum (want_max) or minimum; a single extreme node is returned exactly.
// Used for density maxima and the right-dihedra grid_max / grid_min. count
// must equal grid_node_count(spacing) (InvalidParameter otherwise); values
// must be finite (DataError). When the tied nodes have no unique axis (a
// ring, a constant grid) the result is a deterministic but arbitrary axis of
// the tie.
Line grid_extreme(const double *values, size_t count, double spacing, bool want_max);

}  // namespace striae
