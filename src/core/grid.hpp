// Near-uniform nodes on the lower hemisphere, shared by every grid result
// (density grids, right-dihedra grids). Nodes lie on rings of constant plunge
// 0, s, 2s, ... (s = spacing) up to a single node at plunge 90; a ring at
// plunge p holds max(1, round(360 cos(p) / s)) nodes evenly spaced in trend
// from trend 0. The horizontal ring keeps only trends in [0,180) because a
// horizontal axis and its opposite are the same node. The layout is a pure
// function of the spacing, so a stored grid keeps only spacing and values.
#pragma once

#include "orientation.hpp"

#include <vector>

namespace striae {

constexpr double kMinGridSpacing = 0.5;   // degrees
constexpr double kMaxGridSpacing = 45.0;  // degrees

// The spacing a grid uses for a requested one: InvalidParameter unless the
// request is finite, in [kMinGridSpacing, kMaxGridSpacing] and divides 90 into
// a whole number k of rings within 1e-9; then exactly 90 / k. So 2.50000000001
// is the grid of 2.5, stored and printed as 2.5, whichever way it came in (an
// aggregate's parameter, sphere_grid text or binary input); grid_spacing of its
// own result returns it unchanged.
double grid_spacing(double spacing_deg);

// Throws InvalidParameter unless spacing is a value grid_spacing returns
// (stored grids and aggregate states hold only such values).
void check_grid_spacing(double spacing_deg);

// Number of nodes for a spacing (as grid_spacing accepts; the layout is that of
// grid_spacing(spacing) in this and the next functions).
int grid_node_count(double spacing_deg);

// Node lines (trend, plunge), in layout order.
std::vector<Line> grid_nodes(double spacing_deg);

// The same nodes as NED unit vectors, in the same order.
std::vector<Vec3> grid_node_vectors(double spacing_deg);

}  // namespace striae

namespace striae {

// Node lines written into a caller-owned array of grid_node_count(spacing).
void grid_node_lines(double spacing_deg, Line *out);

// What a stored grid's values mean.
enum class GridKind : int32_t {
  Density = 1,       // multiples of uniform density (density_grid)
  RightDihedra = 2,  // percent of data for which the node is compressional
};
const char *grid_kind_name(GridKind k);

// Header of the text form of a sphere_grid:
//   {"kind": "density", "spacing": 5, "n": 120, "values": [v1, v2, ...]}
// (keys in this order, blanks anywhere between tokens). parse_grid_header
// reads up to the '[' and returns the offset of the first value;
// parse_grid_values reads exactly count values and the closing "]}".
struct GridHeader {
  GridKind kind;
  double spacing;
  int64_t n;
  size_t values_at;
};
GridHeader parse_grid_header(const char *text);
void parse_grid_values(const char *text, size_t at, double *out, size_t count);

// Check a grid's header fields and values (binary input, stored values):
// spacing valid, count matching, 1 <= n <= 2^53 (as text input), values finite
// and within the kind's range.
void check_grid(GridKind kind, double spacing, int64_t n, const double *values, size_t count);

}  // namespace striae
