// sphere_grid type: text (JSON-shaped) and binary I/O, grid_cells, grid_max, grid_min.
#include "grid.hpp"

#include "../core/density.hpp"

using namespace striae;
using namespace striae_pg;

namespace striae_pg {

GridDatum *grid_alloc(GridKind kind, double spacing, int64 n, int32 count) {
  const Size size = offsetof(GridDatum, values) + sizeof(double) * count;
  GridDatum *g = static_cast<GridDatum *>(palloc0(size));
  SET_VARSIZE(g, size);
  g->kind = static_cast<int32>(kind);
  g->spacing = spacing;
  g->n = n;
  g->count = count;
  return g;
}

}  // namespace striae_pg

namespace {

constexpr int kGridWireVersion = 1;

// Validate a grid coming from outside (text, binary).
void check(const GridDatum *g) {
  guarded([&] {
    check_grid(static_cast<GridKind>(g->kind), g->spacing, g->n, g->values, static_cast<size_t>(g->count));
  });
}

}  // namespace

STRIAE_FUNCTION(sphere_grid_in) {
  const char *s = PG_GETARG_CSTRING(0);
  const GridHeader h = guarded([&] { return parse_grid_header(s); });
  const int count = guarded([&] { return grid_node_count(h.spacing); });
  GridDatum *g = grid_alloc(h.kind, h.spacing, h.n, count);
  guarded([&] { parse_grid_values(s, h.values_at, g->values, static_cast<size_t>(count)); });
  check(g);
  PG_RETURN_POINTER(g);
}

STRIAE_FUNCTION(sphere_grid_out) {
  const GridDatum *g = grid_arg(fcinfo, 0);
  StringInfoData b;
  initStringInfo(&b);
  char *sp = float8out_internal(g->spacing);
  appendStringInfo(&b, "{\"kind\": \"%s\", \"spacing\": %s, \"n\": " INT64_FORMAT ", \"values\": [",
                   grid_kind_name(static_cast<GridKind>(g->kind)), sp, g->n);
  for (int k = 0; k < g->count; ++k) {
    char *v = float8out_internal(g->values[k]);
    if (k) appendStringInfoString(&b, ", ");
    appendStringInfoString(&b, v);
    pfree(v);
  }
  appendStringInfoString(&b, "]}");
  PG_RETURN_CSTRING(b.data);
}

STRIAE_FUNCTION(sphere_grid_recv) {
  StringInfo buf = reinterpret_cast<StringInfo>(PG_GETARG_POINTER(0));
  const int version = pq_getmsgbyte(buf);
  if (version != kGridWireVersion)
    ereport(ERROR, (errcode(ERRCODE_INVALID_BINARY_REPRESENTATION),
                    errmsg("invalid binary format version %d for type sphere_grid", version)));
  const int32 kind = pq_getmsgint(buf, 4);
  // Snapped as text input snaps it (grid_spacing), so both accept the same grids.
  const double raw_spacing = pq_getmsgfloat8(buf);
  const double spacing = guarded([&] { return grid_spacing(raw_spacing); });
  const int64 n = pq_getmsgint64(buf);
  const int32 count = pq_getmsgint(buf, 4);
  const int expected = guarded([&] { return grid_node_count(spacing); });
  if (count != expected)
    ereport(ERROR, (errcode(ERRCODE_INVALID_BINARY_REPRESENTATION),
                    errmsg("sphere_grid has %d values, but its spacing needs %d", count, expected)));
  GridDatum *g = grid_alloc(static_cast<GridKind>(kind), spacing, n, count);
  for (int k = 0; k < count; ++k) g->values[k] = pq_getmsgfloat8(buf);
  check(g);
  PG_RETURN_POINTER(g);
}

STRIAE_FUNCTION(sphere_grid_send) {
  const GridDatum *g = grid_arg(fcinfo, 0);
  StringInfoData buf;
  pq_begintypsend(&buf);
  pq_sendbyte(&buf, kGridWireVersion);
  pq_sendint32(&buf, g->kind);
  pq_sendfloat8(&buf, g->spacing);
  pq_sendint64(&buf, g->n);
  pq_sendint32(&buf, g->count);
  for (int k = 0; k < g->count; ++k) pq_sendfloat8(&buf, g->values[k]);
  PG_RETURN_BYTEA_P(pq_endtypsend(&buf));
}

// grid_cells(sphere_grid) -> TABLE(trend, plunge, value), in node order.
STRIAE_FUNCTION(sphere_grid_cells) {
  const GridDatum *g = grid_arg(fcinfo, 0);
  InitMaterializedSRF(fcinfo, 0);
  ReturnSetInfo *rsinfo = reinterpret_cast<ReturnSetInfo *>(fcinfo->resultinfo);
  Line *nodes = static_cast<Line *>(palloc(sizeof(Line) * g->count));
  guarded([&] { grid_node_lines(g->spacing, nodes); });
  for (int k = 0; k < g->count; ++k) {
    Datum v[3] = {Float8GetDatum(nodes[k].trend), Float8GetDatum(nodes[k].plunge),
                  Float8GetDatum(g->values[k])};
    bool nulls[3] = {false, false, false};
    tuplestore_putvalues(rsinfo->setResult, rsinfo->setDesc, v, nulls);
  }
  return (Datum)0;
}

STRIAE_FUNCTION(sphere_grid_max) {
  const GridDatum *g = grid_arg(fcinfo, 0);
  return result(guarded([&] { return grid_extreme(g->values, g->count, g->spacing, true); }));
}

STRIAE_FUNCTION(sphere_grid_min) {
  const GridDatum *g = grid_arg(fcinfo, 0);
  return result(guarded([&] { return grid_extreme(g->values, g->count, g->spacing, false); }));
}

STRIAE_FUNCTION(sphere_grid_spacing) { PG_RETURN_FLOAT8(grid_arg(fcinfo, 0)->spacing); }
STRIAE_FUNCTION(sphere_grid_data_count) { PG_RETURN_INT64(grid_arg(fcinfo, 0)->n); }
STRIAE_FUNCTION(sphere_grid_kind) {
  return text_result(grid_kind_name(static_cast<GridKind>(grid_arg(fcinfo, 0)->kind)));
}
