// Right-dihedra counting grid (Angelier & Mechler 1977). Rules: dihedra.hpp.
#include "dihedra.hpp"

#include "stress.hpp"  // check_slip_datum

#include <cmath>

namespace striae {

// Structure-of-arrays node table.
std::vector<double> dihedra_node_table(double spacing) {
  const std::vector<Vec3> v = grid_node_vectors(spacing);  // checks the spacing
  const size_t k = v.size();
  std::vector<double> t(3 * k);
  for (size_t i = 0; i < k; ++i) {
    t[i] = v[i].x();
    t[k + i] = v[i].y();
    t[2 * k + i] = v[i].z();
  }
  return t;
}

// Header of an empty state.
DihedraHeader dihedra_init(double spacing) {
  DihedraHeader h;
  h.spacing = grid_spacing(spacing);
  h.data_count = 0;
  h.node_count = grid_node_count(spacing);  // checks the spacing
  h.reserved = 0;
  return h;
}

// One datum over all nodes: the hot loop, branch free so that it vectorises.
void dihedra_add(DihedraHeader &h, int64_t *counts, const double *nodes, const double n[3],
                 const double u[3]) {
  check_slip_datum(n, u);
  const int32_t k = h.node_count;
  const double *x = nodes, *y = nodes + k, *z = nodes + 2 * k;
  const double n0 = n[0], n1 = n[1], n2 = n[2], u0 = u[0], u1 = u[1], u2 = u[2];
  for (int32_t i = 0; i < k; ++i) {
    const double a = x[i] * n0 + y[i] * n1 + z[i] * n2;
    const double b = x[i] * u0 + y[i] * u1 + z[i] * u2;
    // 2 compressional, 1 on a nodal plane, 0 extensional (half-data units).
    const double ab = a * b;
    counts[i] += static_cast<int64_t>(ab < -kDihedraOnPlane) + static_cast<int64_t>(ab <= kDihedraOnPlane);
  }
  h.data_count += 1;
}

// Merge two states of the same grid.
void dihedra_combine(DihedraHeader &into, int64_t *into_counts, const DihedraHeader &from,
                     const int64_t *from_counts) {
  if (into.spacing != from.spacing || into.node_count != from.node_count)
    throw Error(ErrorKind::InvalidParameter, "grid spacing must be the same for every row of a group");
  if (into.data_count > kMaxDihedraData - from.data_count)
    throw Error(ErrorKind::DataError, "too many data for right_dihedra (limit 2^53)");
  for (int32_t i = 0; i < into.node_count; ++i) into_counts[i] += from_counts[i];
  into.data_count += from.data_count;
}

// Reject states no sequence of adds could produce.
void dihedra_validate(const DihedraHeader &h, const int64_t *counts) {
  auto bad = [](const char *what) {
    throw Error(ErrorKind::BadState, std::string("invalid right-dihedra state: ") + what);
  };
  try {
    check_grid_spacing(h.spacing);
  } catch (const Error &) {
    bad("invalid grid spacing");
  }
  if (h.node_count != grid_node_count(h.spacing)) bad("node count does not match the spacing");
  if (h.reserved != 0) bad("reserved field is not zero");
  if (h.data_count < 0) bad("negative data count");
  if (h.data_count > kMaxDihedraData) bad("data count exceeds 2^53");
  for (int32_t i = 0; i < h.node_count; ++i)
    if (counts[i] < 0 || counts[i] > 2 * h.data_count) bad("node count outside 0..2 data count");
}

// Percentages of compressional data per node.
bool dihedra_finalise(const DihedraHeader &h, const int64_t *counts, double *percent) {
  if (h.data_count == 0) return false;
  const double n = static_cast<double>(h.data_count);
  for (int32_t i = 0; i < h.node_count; ++i) percent[i] = 50.0 * static_cast<double>(counts[i]) / n;
  return true;
}

}  // namespace striae
