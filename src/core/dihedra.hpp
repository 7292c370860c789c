// Right dihedra (Angelier & Mechler 1977, Bull. Soc. geol. France 19:1309): for
// each node x of a lower-hemisphere grid (grid.hpp), the percentage of fault-slip
// data for which x lies in the compressional (P) dihedron. sigma1 lies in the
// region of 100 % (or the maximum), sigma3 in the region of 0 % (or the minimum).
//
// Rule: x is compressional for the datum (n, u) when (x.n)(x.u) < 0, extensional
// when > 0 (METHODS.md section 5; the product is symmetric in n and u, so it does
// not matter which nodal plane is the fault, and focal mechanisms can be added as
// they are). A node ON a nodal plane (product exactly 0 in exact arithmetic) is on
// the boundary of the dihedra and counts as HALF compressional (0.5 of a datum), so
// that grids of data recorded in whole degrees, whose nodal planes pass through
// grid nodes, are not biased toward the extensional side (before 0.2.0 such nodes
// counted 0). Rounding would make such nodes (the horizontal ring of a vertical
// fault, the B axis) fall on either side at random, so "on the plane" is taken as
// |(x.n)(x.u)| <= kDihedraOnPlane, i.e. within about 1e-12 rad of a nodal plane.
//
// Aggregate state for SQL: a DihedraHeader (spacing, data count, node count) and
// one int64 count per node in HALF data (2 per compressional datum, 1 per datum
// whose nodal plane passes through the node), in the layout order of
// grid_nodes(spacing). The node
// count depends on the spacing, so the functions work on a caller-owned count
// array. All are PARALLEL SAFE: counts add exactly, in any order.
#pragma once

#include "grid.hpp"

#include <cstdint>
#include <type_traits>
#include <vector>

namespace striae {

constexpr double kDihedraOnPlane = 1e-12;

// Largest data count of a state (counts must convert to double exactly).
constexpr int64_t kMaxDihedraData = int64_t(1) << 53;

// Fixed part of the state; the glue stores node_count int64 counts right after it.
struct DihedraHeader {
  double spacing;       // degrees, as check_grid_spacing accepts
  int64_t data_count;   // data added
  int32_t node_count;   // grid_node_count(spacing)
  int32_t reserved;     // 0
};
static_assert(sizeof(DihedraHeader) == 24, "plain state header");
static_assert(std::is_trivially_copyable<DihedraHeader>::value &&
                  std::is_trivially_destructible<DihedraHeader>::value,
              "aggregate state lives in palloc memory");

// Node table for dihedra_add, structure of arrays: 3 * node_count doubles, all
// North components in layout order, then all East, then all Down. Depends only on
// the spacing, so the glue computes it once and caches it (e.g. per spacing in a
// static or in fn_extra). InvalidParameter for a bad spacing.
std::vector<double> dihedra_node_table(double spacing_deg);

// Fresh header for a spacing (checked); the caller zeroes its count array.
DihedraHeader dihedra_init(double spacing_deg);

// Add one datum: counts[i] += 2 where node i is compressional, += 1 where it lies
// on a nodal plane; data_count += 1.
// nodes is the table of dihedra_node_table(h.spacing). n, u as check_slip_datum
// accepts (DataError otherwise).
void dihedra_add(DihedraHeader &h, int64_t *counts, const double *nodes, const double n[3],
                 const double u[3]);

// into += from. InvalidParameter if the spacings differ (the spacing argument must
// be the same on every row of a group), DataError beyond kMaxDihedraData data.
void dihedra_combine(DihedraHeader &into, int64_t *into_counts, const DihedraHeader &from,
                     const int64_t *from_counts);

// BadState unless the spacing is valid, node_count matches it, reserved is 0,
// 0 <= data_count <= kMaxDihedraData and every (half) count is in 0..2 data_count.
void dihedra_validate(const DihedraHeader &h, const int64_t *counts);

// percent[i] = 50 * counts[i] / data_count (node_count values). Returns false
// (percent untouched) when data_count is 0: the grid is undefined (SQL NULL).
bool dihedra_finalise(const DihedraHeader &h, const int64_t *counts, double *percent);

}  // namespace striae
