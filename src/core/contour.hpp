// Filled contours of a sphere_grid on the projected disc. The grid's node
// values (grid.hpp layout) are interpolated on the sphere (linearly in trend
// along the two rings of constant plunge around a direction, then linearly in
// plunge), sampled on a square lattice over the disc and a little beyond it
// (beyond the primitive the inverse projection continues onto the upper
// hemisphere, whose axes are the lower ones: the field is continuous across
// the primitive), and traced with marching squares (saddles split by the cell's
// centre value). The region at or above a level is the even-odd fill of its
// closed loops; the figure clips it to the primitive circle.
#pragma once

#include "grid.hpp"
#include "projection.hpp"

#include <vector>

namespace striae {

// Value of the grid in the direction v (any sign: axial).
double grid_value_at(double spacing, const double *values, size_t count, const Vec3 &v);

// Levels chosen for a grid when none are given: density: multiples of a round
// step (0.5, 1, 2, 5, 10, ...) from the step up to the maximum, at most 6;
// right dihedra: 20, 40, 60, 80, 100 (percent).
std::vector<double> auto_levels(GridKind kind, const double *values, size_t count);

// Closed loops (disc coordinates) bounding the region where the value is at
// least level, on a lattice of cells x cells over [-1.04, 1.04]^2.
std::vector<std::vector<XY>> contour_loops(const std::vector<double> &lattice, int points, double level);

// The lattice of grid values: points x points values, row by row from
// (-1.04, -1.04), padded with one ring below every level.
std::vector<double> contour_lattice(double spacing, const double *values, size_t count, Projection proj, int points);

constexpr double kContourExtent = 1.04;

}  // namespace striae
