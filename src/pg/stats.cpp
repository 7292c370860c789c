// Orientation-statistics aggregates: fisher_mean, orientation_tensor,
// mean_plane, fold_axis, density_grid. Each state is internal (palloc'd in the
// aggregate context), with combine, serialize and deserialize functions so the
// aggregates run in parallel plans. Every support function validates the
// state it is handed.
#include "grid.hpp"

#include "../core/density.hpp"
#include "../core/stats.hpp"

using namespace striae;
using namespace striae_pg;

namespace {

// The datum's unit vector: a lineation as is, a plane by its pole.
STRIAE_HOT Vec3 datum_vector(FunctionCallInfo fcinfo, int k, bool is_plane) {
  if (is_plane) return pole_vector(*arg<Plane>(fcinfo, k));
  return line_vector(*arg<Line>(fcinfo, k));
}

// ---- fixed-size states (Fisher, tensor) ------------------------------------

// Serialized form: a 4-byte magic, then the raw struct.
template <class S> struct StateInfo;
template <> struct StateInfo<FisherState> {
  static constexpr uint32 magic = 0x53464931;  // "SFI1"
  static void init(FisherState &s) { fisher_init(s); }
  static void add(FisherState &s, const Vec3 &v) { fisher_add(s, v); }
  static void combine(FisherState &a, const FisherState &b) { fisher_combine(a, b); }
  static void validate(const FisherState &s) { fisher_validate(s); }
};
template <> struct StateInfo<TensorState> {
  static constexpr uint32 magic = 0x53544e31;  // "STN1"
  static void init(TensorState &s) { tensor_init(s); }
  static void add(TensorState &s, const Vec3 &v) { tensor_add(s, v); }
  static void combine(TensorState &a, const TensorState &b) { tensor_combine(a, b); }
  static void validate(const TensorState &s) { tensor_validate(s); }
};

template <class S>
Datum accum(FunctionCallInfo fcinfo, bool is_plane, const char *fn) {
  S *s = PG_ARGISNULL(0) ? nullptr : reinterpret_cast<S *>(PG_GETARG_POINTER(0));
  if (s == nullptr) {
    // The aggregate-context check runs when the state is created, as in
    // PostgreSQL's own transition functions: a non-NULL internal state can
    // only come from a call that passed it (SQL cannot make one).
    MemoryContext ctx = agg_context(fcinfo, fn);
    s = static_cast<S *>(MemoryContextAlloc(ctx, sizeof(S)));
    StateInfo<S>::init(*s);
  }
  if (!PG_ARGISNULL(1)) {
    const Vec3 v = datum_vector(fcinfo, 1, is_plane);
    guarded([&] { StateInfo<S>::add(*s, v); });
  }
  PG_RETURN_POINTER(s);
}

template <class S>
Datum combine(FunctionCallInfo fcinfo, const char *fn) {
  MemoryContext ctx = agg_context(fcinfo, fn);
  S *a = PG_ARGISNULL(0) ? nullptr : reinterpret_cast<S *>(PG_GETARG_POINTER(0));
  S *b = PG_ARGISNULL(1) ? nullptr : reinterpret_cast<S *>(PG_GETARG_POINTER(1));
  if (b == nullptr) {
    if (a == nullptr) PG_RETURN_NULL();
    PG_RETURN_POINTER(a);
  }
  if (a == nullptr) {
    a = static_cast<S *>(MemoryContextAlloc(ctx, sizeof(S)));
    std::memcpy(a, b, sizeof(S));
    guarded([&] { StateInfo<S>::validate(*a); });
    PG_RETURN_POINTER(a);
  }
  guarded([&] {
    StateInfo<S>::validate(*a);
    StateInfo<S>::validate(*b);
    StateInfo<S>::combine(*a, *b);
  });
  PG_RETURN_POINTER(a);
}

template <class S>
Datum serialize(FunctionCallInfo fcinfo, const char *fn) {
  agg_context(fcinfo, fn);
  const S *s = reinterpret_cast<const S *>(PG_GETARG_POINTER(0));
  guarded([&] { StateInfo<S>::validate(*s); });
  bytea *out = static_cast<bytea *>(palloc(VARHDRSZ + 4 + sizeof(S)));
  SET_VARSIZE(out, VARHDRSZ + 4 + sizeof(S));
  const uint32 magic = StateInfo<S>::magic;
  std::memcpy(VARDATA(out), &magic, 4);
  std::memcpy(VARDATA(out) + 4, s, sizeof(S));
  PG_RETURN_BYTEA_P(out);
}

template <class S>
Datum deserialize(FunctionCallInfo fcinfo, const char *fn) {
  MemoryContext ctx = agg_context(fcinfo, fn);
  bytea *in = PG_GETARG_BYTEA_PP(0);
  uint32 magic = 0;
  if (VARSIZE_ANY_EXHDR(in) == 4 + sizeof(S)) std::memcpy(&magic, VARDATA_ANY(in), 4);
  if (magic != StateInfo<S>::magic)
    ereport(ERROR, (errcode(ERRCODE_DATA_EXCEPTION), errmsg("%s: not a serialized state of this aggregate", fn)));
  S *s = static_cast<S *>(MemoryContextAlloc(ctx, sizeof(S)));
  std::memcpy(s, VARDATA_ANY(in) + 4, sizeof(S));
  guarded([&] { StateInfo<S>::validate(*s); });
  PG_RETURN_POINTER(s);
}

// Build a composite result of the function's declared row type.
Datum composite(FunctionCallInfo fcinfo, Datum *values, bool *nulls) {
  TupleDesc desc;
  if (get_call_result_type(fcinfo, nullptr, &desc) != TYPEFUNC_COMPOSITE)
    ereport(ERROR, (errcode(ERRCODE_FEATURE_NOT_SUPPORTED), errmsg("function returning record called in context that cannot accept it")));
  desc = BlessTupleDesc(desc);
  return HeapTupleGetDatum(heap_form_tuple(desc, values, nulls));
}

Datum line_datum(const Line &l) { return result(l); }

}  // namespace

// ---- Fisher ------------------------------------------------------------------

STRIAE_FUNCTION(fisher_lineation_accum) { return accum<FisherState>(fcinfo, false, "fisher_lineation_accum"); }
STRIAE_FUNCTION(fisher_plane_accum) { return accum<FisherState>(fcinfo, true, "fisher_plane_accum"); }
STRIAE_FUNCTION(fisher_combine) { return combine<FisherState>(fcinfo, "fisher_combine"); }
STRIAE_FUNCTION(fisher_serialize) { return serialize<FisherState>(fcinfo, "fisher_serialize"); }
STRIAE_FUNCTION(fisher_deserialize) { return deserialize<FisherState>(fcinfo, "fisher_deserialize"); }

STRIAE_FUNCTION(fisher_final) {
  if (PG_ARGISNULL(0)) PG_RETURN_NULL();
  const FisherState *s = reinterpret_cast<const FisherState *>(PG_GETARG_POINTER(0));
  const FisherResult r = guarded([&] { return fisher_result(*s); });
  if (r.n == 0) PG_RETURN_NULL();
  // mean lineation, n bigint, resultant, kappa, alpha95, angular_sd
  Datum v[6] = {r.mean_valid ? line_datum(r.mean) : (Datum)0, Int64GetDatum(r.n),
                Float8GetDatum(r.resultant), Float8GetDatum(r.kappa), Float8GetDatum(r.alpha95),
                Float8GetDatum(r.angular_sd)};
  bool n[6] = {!r.mean_valid, false, false, !r.kappa_valid, !r.alpha95_valid, !r.angular_sd_valid};
  return composite(fcinfo, v, n);
}

// ---- orientation tensor, mean plane, fold axis ---------------------------------

STRIAE_FUNCTION(tensor_lineation_accum) { return accum<TensorState>(fcinfo, false, "tensor_lineation_accum"); }
STRIAE_FUNCTION(tensor_plane_accum) { return accum<TensorState>(fcinfo, true, "tensor_plane_accum"); }
STRIAE_FUNCTION(tensor_combine) { return combine<TensorState>(fcinfo, "tensor_combine"); }
STRIAE_FUNCTION(tensor_serialize) { return serialize<TensorState>(fcinfo, "tensor_serialize"); }
STRIAE_FUNCTION(tensor_deserialize) { return deserialize<TensorState>(fcinfo, "tensor_deserialize"); }

namespace {
FabricResult fabric_of(FunctionCallInfo fcinfo) {
  const TensorState *s = reinterpret_cast<const TensorState *>(PG_GETARG_POINTER(0));
  return guarded([&] { return tensor_result(*s); });
}
}  // namespace

STRIAE_FUNCTION(tensor_final) {
  if (PG_ARGISNULL(0)) PG_RETURN_NULL();
  const FabricResult r = fabric_of(fcinfo);
  if (r.n == 0) PG_RETURN_NULL();
  // e1, e2, e3, s1, s2, s3, woodcock_k, woodcock_c, point, girdle, random, n
  Datum v[12] = {line_datum(r.e1), line_datum(r.e2), line_datum(r.e3), Float8GetDatum(r.s1),
                 Float8GetDatum(r.s2), Float8GetDatum(r.s3), Float8GetDatum(r.woodcock_k),
                 Float8GetDatum(r.woodcock_c), Float8GetDatum(r.point), Float8GetDatum(r.girdle),
                 Float8GetDatum(r.random), Int64GetDatum(r.n)};
  bool n[12] = {false, false, false, false, false, false, !r.woodcock_k_valid, !r.woodcock_c_valid,
                false, false, false, false};
  return composite(fcinfo, v, n);
}

STRIAE_FUNCTION(mean_plane_final) {
  if (PG_ARGISNULL(0)) PG_RETURN_NULL();
  const FabricResult r = fabric_of(fcinfo);
  if (!r.mean_plane_valid) PG_RETURN_NULL();
  return result(r.mean_plane);
}

STRIAE_FUNCTION(fold_axis_final) {
  if (PG_ARGISNULL(0)) PG_RETURN_NULL();
  const FabricResult r = fabric_of(fcinfo);
  if (!r.fold_axis_valid) PG_RETURN_NULL();
  return result(r.fold_axis);
}

// ---- density grid ----------------------------------------------------------------
//
// State: the grid spacing (constant within a group) and a sparse bin list.
// New data are appended as (bin, 1) and the list is compacted (sorted, merged)
// whenever the buffer fills, so the state never exceeds twice the number of
// occupied bins plus a small buffer: at most about 2 x 165,000 entries of 12
// bytes (4 MB) per group, whatever the number of rows.

namespace {

struct DensityAgg {
  double spacing;
  size_t m;    // entries in use
  size_t cap;  // capacity
  uint32_t *ids;
  uint64_t *counts;
};
static_assert(std::is_trivially_destructible<DensityAgg>::value, "palloc'd state");

constexpr size_t kDensityInitialCap = 1024;
constexpr uint32 kDensityMagic = 0x53444e31;  // "SDN1"

DensityAgg *density_new(MemoryContext ctx, double spacing, size_t cap) {
  DensityAgg *a = static_cast<DensityAgg *>(MemoryContextAlloc(ctx, sizeof(DensityAgg)));
  a->spacing = spacing;
  a->m = 0;
  a->cap = cap;
  a->ids = static_cast<uint32_t *>(MemoryContextAlloc(ctx, sizeof(uint32_t) * cap));
  a->counts = static_cast<uint64_t *>(MemoryContextAlloc(ctx, sizeof(uint64_t) * cap));
  return a;
}

void density_compact(DensityAgg *a) {
  a->m = guarded([&] { return compact_bins(a->ids, a->counts, a->m); });
}

void check_spacing(double spacing) { guarded([&] { check_grid_spacing(spacing); }); }

Datum density_accum(FunctionCallInfo fcinfo, bool is_plane) {
  MemoryContext ctx = agg_context(fcinfo, "density_grid");
  DensityAgg *a = PG_ARGISNULL(0) ? nullptr : reinterpret_cast<DensityAgg *>(PG_GETARG_POINTER(0));
  if (PG_ARGISNULL(2))
    ereport(ERROR, (errcode(ERRCODE_NULL_VALUE_NOT_ALLOWED), errmsg("density_grid spacing must not be NULL")));
  const double spacing = PG_GETARG_FLOAT8(2);
  if (a == nullptr) {
    check_spacing(spacing);
    a = density_new(ctx, spacing, kDensityInitialCap);
  } else if (spacing != a->spacing) {
    ereport(ERROR, (errcode(ERRCODE_INVALID_PARAMETER_VALUE),
                    errmsg("density_grid spacing must be the same for every row of a group")));
  }
  if (PG_ARGISNULL(1)) PG_RETURN_POINTER(a);
  const Vec3 v = datum_vector(fcinfo, 1, is_plane);
  if (a->m == a->cap) {
    density_compact(a);
    if (a->m > a->cap / 2) {  // still crowded: grow
      const size_t cap = a->cap * 2;
      a->ids = static_cast<uint32_t *>(repalloc(a->ids, sizeof(uint32_t) * cap));
      a->counts = static_cast<uint64_t *>(repalloc(a->counts, sizeof(uint64_t) * cap));
      a->cap = cap;
    }
  }
  a->ids[a->m] = guarded([&] { return density_bin(v); });
  a->counts[a->m] = 1;
  ++a->m;
  PG_RETURN_POINTER(a);
}

}  // namespace

STRIAE_FUNCTION(density_lineation_accum) { return density_accum(fcinfo, false); }
STRIAE_FUNCTION(density_plane_accum) { return density_accum(fcinfo, true); }

STRIAE_FUNCTION(density_combine) {
  MemoryContext ctx = agg_context(fcinfo, "density_combine");
  DensityAgg *a = PG_ARGISNULL(0) ? nullptr : reinterpret_cast<DensityAgg *>(PG_GETARG_POINTER(0));
  DensityAgg *b = PG_ARGISNULL(1) ? nullptr : reinterpret_cast<DensityAgg *>(PG_GETARG_POINTER(1));
  if (b == nullptr) {
    if (a == nullptr) PG_RETURN_NULL();
    PG_RETURN_POINTER(a);
  }
  density_compact(b);
  if (a == nullptr) {
    DensityAgg *c = density_new(ctx, b->spacing, Max(b->m, kDensityInitialCap));
    std::memcpy(c->ids, b->ids, sizeof(uint32_t) * b->m);
    std::memcpy(c->counts, b->counts, sizeof(uint64_t) * b->m);
    c->m = b->m;
    PG_RETURN_POINTER(c);
  }
  if (a->spacing != b->spacing)
    ereport(ERROR, (errcode(ERRCODE_INVALID_PARAMETER_VALUE),
                    errmsg("density_grid spacing must be the same for every row of a group")));
  density_compact(a);
  DensityAgg *c = density_new(ctx, a->spacing, Max(a->m + b->m, kDensityInitialCap));
  c->m = guarded([&] {
    return merge_bins(a->ids, a->counts, a->m, b->ids, b->counts, b->m, c->ids, c->counts);
  });
  PG_RETURN_POINTER(c);
}

STRIAE_FUNCTION(density_serialize) {
  agg_context(fcinfo, "density_serialize");
  DensityAgg *a = reinterpret_cast<DensityAgg *>(PG_GETARG_POINTER(0));
  density_compact(a);
  const Size size = VARHDRSZ + 4 + 8 + 8 + a->m * (sizeof(uint32_t) + sizeof(uint64_t));
  bytea *out = static_cast<bytea *>(palloc(size));
  SET_VARSIZE(out, size);
  char *p = VARDATA(out);
  const uint64 m = a->m;
  std::memcpy(p, &kDensityMagic, 4);
  std::memcpy(p + 4, &a->spacing, 8);
  std::memcpy(p + 12, &m, 8);
  std::memcpy(p + 20, a->ids, sizeof(uint32_t) * m);
  std::memcpy(p + 20 + sizeof(uint32_t) * m, a->counts, sizeof(uint64_t) * m);
  PG_RETURN_BYTEA_P(out);
}

STRIAE_FUNCTION(density_deserialize) {
  MemoryContext ctx = agg_context(fcinfo, "density_deserialize");
  bytea *in = PG_GETARG_BYTEA_PP(0);
  const size_t len = VARSIZE_ANY_EXHDR(in);
  const char *p = VARDATA_ANY(in);
  uint32 magic = 0;
  uint64 m = 0;
  double spacing = 0;
  if (len >= 20) {
    std::memcpy(&magic, p, 4);
    std::memcpy(&spacing, p + 4, 8);
    std::memcpy(&m, p + 12, 8);
  }
  if (magic != kDensityMagic || m > (1u << 24) || len != 20 + m * (sizeof(uint32_t) + sizeof(uint64_t)))
    ereport(ERROR, (errcode(ERRCODE_DATA_EXCEPTION), errmsg("density_deserialize: not a serialized density_grid state")));
  check_spacing(spacing);
  DensityAgg *a = density_new(ctx, spacing, Max(static_cast<size_t>(m), kDensityInitialCap));
  std::memcpy(a->ids, p + 20, sizeof(uint32_t) * m);
  std::memcpy(a->counts, p + 20 + sizeof(uint32_t) * m, sizeof(uint64_t) * m);
  a->m = m;
  guarded([&] { validate_bins(a->ids, a->counts, a->m); });
  PG_RETURN_POINTER(a);
}

STRIAE_FUNCTION(density_final) {
  if (PG_ARGISNULL(0)) PG_RETURN_NULL();
  DensityAgg *a = reinterpret_cast<DensityAgg *>(PG_GETARG_POINTER(0));
  density_compact(a);
  if (a->m == 0) PG_RETURN_NULL();  // only NULL rows
  const uint64_t n = guarded([&] { return bins_total(a->counts, a->m); });
  const int count = guarded([&] { return grid_node_count(a->spacing); });
  GridDatum *g = grid_alloc(GridKind::Density, a->spacing, static_cast<int64>(n), count);
  guarded([&] { density_values(a->ids, a->counts, a->m, a->spacing, g->values); });
  PG_RETURN_POINTER(g);
}
