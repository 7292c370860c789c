// The sphere_grid varlena (shared by density and right-dihedra grids).
#pragma once

#include "datum.hpp"
#include "../core/grid.hpp"

namespace striae_pg {

struct GridDatum {
  int32 vl_len_;
  int32 kind;      // striae::GridKind
  double spacing;  // degrees
  int64 n;         // number of data the grid summarises
  int32 count;     // number of values = grid_node_count(spacing)
  int32 reserved;  // 0
  double values[FLEXIBLE_ARRAY_MEMBER];
};

// A new grid with room for count values (palloc'd, header filled).
GridDatum *grid_alloc(striae::GridKind kind, double spacing, int64 n, int32 count);

inline GridDatum *grid_arg(FunctionCallInfo fcinfo, int k) {
  return reinterpret_cast<GridDatum *>(PG_DETOAST_DATUM(PG_GETARG_DATUM(k)));
}

}  // namespace striae_pg
