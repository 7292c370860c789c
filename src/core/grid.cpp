// Lower-hemisphere node layout shared by all grids (see grid.hpp).
#include "grid.hpp"

#include <cmath>

namespace striae {

void check_grid_spacing(double s) {
  if (!std::isfinite(s) || s < kMinGridSpacing || s > kMaxGridSpacing)
    throw Error(ErrorKind::InvalidParameter, "grid spacing must be between 0.5 and 45 degrees",
                "", "Use a spacing that divides 90, e.g. 1, 2, 2.5, 5 or 10.");
  const double rings = 90.0 / s;
  if (std::fabs(rings - std::round(rings)) > 1e-9)
    throw Error(ErrorKind::InvalidParameter, "grid spacing must divide 90 degrees into whole rings",
                "", "Use a spacing that divides 90, e.g. 1, 2, 2.5, 5 or 10.");
}

namespace {

// Nodes on the ring at plunge index i (plunge = i * s); the horizontal ring is halved.
int ring_size(int i, int rings, double s) {
  if (i == rings) return 1;
  const double p = i * s;
  int m = static_cast<int>(std::lround(360.0 * std::cos(rad(p)) / s));
  if (m < 1) m = 1;
  if (i == 0) m = (m + 1) / 2;  // trends [0,180) only
  return m;
}

template <class F>
void for_each_node(double s, F &&f) {
  check_grid_spacing(s);
  const int rings = static_cast<int>(std::lround(90.0 / s));
  for (int i = 0; i <= rings; ++i) {
    const int m = ring_size(i, rings, s);
    const double plunge = i == rings ? 90.0 : i * s;
    const double step = (i == 0) ? 180.0 / m : 360.0 / m;
    for (int j = 0; j < m; ++j) f(Line{i == rings ? 0.0 : j * step, plunge});
  }
}

}  // namespace

int grid_node_count(double s) {
  int n = 0;
  for_each_node(s, [&](const Line &) { ++n; });
  return n;
}

std::vector<Line> grid_nodes(double s) {
  std::vector<Line> out;
  for_each_node(s, [&](const Line &l) { out.push_back(l); });
  return out;
}

std::vector<Vec3> grid_node_vectors(double s) {
  std::vector<Vec3> out;
  for_each_node(s, [&](const Line &l) { out.push_back(line_vector(l)); });
  return out;
}

}  // namespace striae
