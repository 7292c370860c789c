// Orientation-statistics aggregates: fisher_mean, orientation_tensor,
// mean_plane, fold_axis, density_grid. Each state is internal (palloc'd in the
// aggregate context), with combine, serialize and deserialize functions so the
// aggregates run in parallel plans. Every support function validates the
// state it is handed.
#include "agg.hpp"
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

// In memory a state is its kind tag and the core's struct (agg_state.hpp);
// serialized, the core's magic and the struct.
template <class S> struct StateInfo;
template <> struct StateInfo<FisherState> {
  static constexpr StateKind kind = StateKind::Fisher;
  static constexpr size_t serial_size = kFisherSerialSize;
  static void init(FisherState &s) { fisher_init(s); }
  static void add(FisherState &s, const Vec3 &v) { fisher_add(s, v); }
  static void combine(FisherState &a, const FisherState &b) { fisher_combine(a, b); }
  static void validate(const FisherState &s) { fisher_validate(s); }
  static void write(const FisherState &s, unsigned char *out) { write_fisher_state(s, out); }
  static void read(const unsigned char *p, size_t n, FisherState &s, const char *fn) { read_fisher_state(p, n, s, fn); }
};
template <> struct StateInfo<TensorState> {
  static constexpr StateKind kind = StateKind::Tensor;
  static constexpr size_t serial_size = kTensorSerialSize;
  static void init(TensorState &s) { tensor_init(s); }
  static void add(TensorState &s, const Vec3 &v) { tensor_add(s, v); }
  static void combine(TensorState &a, const TensorState &b) { tensor_combine(a, b); }
  static void validate(const TensorState &s) { tensor_validate(s); }
  static void write(const TensorState &s, unsigned char *out) { write_tensor_state(s, out); }
  static void read(const unsigned char *p, size_t n, TensorState &s, const char *fn) { read_tensor_state(p, n, s, fn); }
};

template <class S>
struct Tagged {
  StateTag tag;
  S s;
};
static_assert(std::is_trivially_destructible<Tagged<FisherState>>::value &&
                  std::is_trivially_destructible<Tagged<TensorState>>::value,
              "palloc'd state");

template <class S>
Tagged<S> *tagged_new(MemoryContext ctx) {
  Tagged<S> *t = static_cast<Tagged<S> *>(MemoryContextAlloc(ctx, sizeof(Tagged<S>)));
  t->tag = state_tag(StateInfo<S>::kind);
  return t;
}

template <class S>
Tagged<S> *tagged_arg(FunctionCallInfo fcinfo, int k, const char *fn) {
  return state_arg<Tagged<S>>(fcinfo, k, fn, StateInfo<S>::kind);
}

template <class S>
Datum accum(FunctionCallInfo fcinfo, bool is_plane, const char *fn) {
  Tagged<S> *t = tagged_arg<S>(fcinfo, 0, fn);
  if (t == nullptr) {
    // The aggregate-context check runs when the state is created, as in
    // PostgreSQL's own transition functions: a non-NULL internal state can
    // only come from a call that passed it (SQL cannot make one).
    MemoryContext ctx = agg_context(fcinfo, fn);
    t = tagged_new<S>(ctx);
    StateInfo<S>::init(t->s);
  }
  if (!PG_ARGISNULL(1)) {
    const Vec3 v = datum_vector(fcinfo, 1, is_plane);
    guarded([&] { StateInfo<S>::add(t->s, v); });
  }
  PG_RETURN_POINTER(t);
}

// ---- the state operations (agg.hpp, StateOps) of the fixed-size states ----

template <class S>
void *fixed_read(MemoryContext ctx, const unsigned char *p, size_t n, const char *fn) {
  Tagged<S> *t = tagged_new<S>(ctx);
  guarded([&] { StateInfo<S>::read(p, n, t->s, fn); });
  return t;
}

template <class S>
void *fixed_combine(MemoryContext, void *into, void *from, const char *) {
  Tagged<S> *a = static_cast<Tagged<S> *>(into);
  const Tagged<S> *b = static_cast<const Tagged<S> *>(from);
  guarded([&] {
    StateInfo<S>::validate(a->s);
    StateInfo<S>::validate(b->s);
    StateInfo<S>::combine(a->s, b->s);
  });
  return a;
}

template <class S>
size_t fixed_size(void *, const char *) {
  return StateInfo<S>::serial_size;
}

template <class S>
void fixed_write(void *s, unsigned char *out, const char *) {
  const Tagged<S> *t = static_cast<const Tagged<S> *>(s);
  guarded([&] { StateInfo<S>::write(t->s, out); });
}

template <class S>
constexpr StateOps fixed_ops() {
  return StateOps{fixed_read<S>, fixed_combine<S>, fixed_size<S>, fixed_write<S>};
}

template <class S>
Datum combine(FunctionCallInfo fcinfo, const char *fn) {
  MemoryContext ctx = agg_context(fcinfo, fn);
  Tagged<S> *a = tagged_arg<S>(fcinfo, 0, fn);
  Tagged<S> *b = tagged_arg<S>(fcinfo, 1, fn);
  if (b == nullptr) {
    if (a == nullptr) PG_RETURN_NULL();
    PG_RETURN_POINTER(a);
  }
  if (a == nullptr) {
    a = tagged_new<S>(ctx);
    a->s = b->s;
    guarded([&] { StateInfo<S>::validate(a->s); });
    PG_RETURN_POINTER(a);
  }
  PG_RETURN_POINTER(fixed_combine<S>(ctx, a, b, fn));
}

template <class S>
Datum serialize(FunctionCallInfo fcinfo, const char *fn) {
  agg_context(fcinfo, fn);
  Tagged<S> *t = tagged_arg<S>(fcinfo, 0, fn);
  constexpr StateOps ops = fixed_ops<S>();
  PG_RETURN_BYTEA_P(serialize_with(ops, t, fn));
}

template <class S>
Datum deserialize(FunctionCallInfo fcinfo, const char *fn) {
  constexpr StateOps ops = fixed_ops<S>();
  return deserialize_with(fcinfo, ops, fn);
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
  const Tagged<FisherState> *t = tagged_arg<FisherState>(fcinfo, 0, "fisher_final");
  if (t == nullptr) PG_RETURN_NULL();
  const FisherResult r = guarded([&] { return fisher_result(t->s); });
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
// The fabric of a non-NULL tensor state (argument 0, kind checked).
FabricResult fabric_of(const Tagged<TensorState> *t) {
  return guarded([&] { return tensor_result(t->s); });
}
}  // namespace

STRIAE_FUNCTION(tensor_final) {
  const Tagged<TensorState> *t = tagged_arg<TensorState>(fcinfo, 0, "tensor_final");
  if (t == nullptr) PG_RETURN_NULL();
  const FabricResult r = fabric_of(t);
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
  const Tagged<TensorState> *t = tagged_arg<TensorState>(fcinfo, 0, "mean_plane_final");
  if (t == nullptr) PG_RETURN_NULL();
  const FabricResult r = fabric_of(t);
  if (!r.mean_plane_valid) PG_RETURN_NULL();
  return result(r.mean_plane);
}

STRIAE_FUNCTION(fold_axis_final) {
  const Tagged<TensorState> *t = tagged_arg<TensorState>(fcinfo, 0, "fold_axis_final");
  if (t == nullptr) PG_RETURN_NULL();
  const FabricResult r = fabric_of(t);
  if (!r.fold_axis_valid) PG_RETURN_NULL();
  return result(r.fold_axis);
}

// ---- density grid ----------------------------------------------------------------
//
// State: the grid spacing (constant within a group) and a sparse bin list.
// New data are appended as (bin, 1) and the list is compacted (sorted, merged)
// whenever the buffer fills; the buffer doubles only while the compacted list
// fills more than half of it. With at most density_bin_count() = 82,508
// occupied bins (the 0.5-degree layout) it stops at 262,144 entries of 12
// bytes (3 MB) per group, whatever the number of rows.

namespace {

struct DensityAgg {
  StateTag tag;  // StateKind::Density
  double spacing;
  size_t m;    // entries in use
  size_t cap;  // capacity
  uint32_t *ids;
  uint64_t *counts;
};
static_assert(std::is_trivially_destructible<DensityAgg>::value, "palloc'd state");

constexpr size_t kDensityInitialCap = 1024;

DensityAgg *density_new(MemoryContext ctx, double spacing, size_t cap) {
  DensityAgg *a = static_cast<DensityAgg *>(MemoryContextAlloc(ctx, sizeof(DensityAgg)));
  a->tag = state_tag(StateKind::Density);
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


Datum density_accum(FunctionCallInfo fcinfo, bool is_plane) {
  MemoryContext ctx = agg_context(fcinfo, "density_grid");
  DensityAgg *a = state_arg<DensityAgg>(fcinfo, 0, is_plane ? "density_plane_accum" : "density_lineation_accum",
                                        StateKind::Density);
  if (PG_ARGISNULL(2))
    ereport(ERROR, (errcode(ERRCODE_NULL_VALUE_NOT_ALLOWED), errmsg("density_grid spacing must not be NULL")));
  const double spacing = PG_GETARG_FLOAT8(2);
  if (a == nullptr) {
    a = density_new(ctx, guarded([&] { return grid_spacing(spacing); }), kDensityInitialCap);
  } else if (spacing != a->spacing && guarded([&] { return grid_spacing(spacing); }) != a->spacing) {
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

namespace {

[[noreturn]] void density_spacing_mismatch() {
  ereport(ERROR, (errcode(ERRCODE_INVALID_PARAMETER_VALUE),
                  errmsg("density_grid spacing must be the same for every row of a group")));
  pg_unreachable();
}

void *density_read(MemoryContext ctx, const unsigned char *p, size_t len, const char *fn) {
  const DensitySerial h = guarded([&] { return read_density_header(p, len, fn); });
  DensityAgg *a = density_new(ctx, h.spacing, Max(static_cast<size_t>(h.m), kDensityInitialCap));
  guarded([&] { read_density_bins(p, len, h, a->ids, a->counts, fn); });
  a->m = h.m;
  return a;
}

// The merged list is a new state: merge_bins writes into fresh arrays.
void *density_combine_states(MemoryContext ctx, void *into, void *from, const char *) {
  DensityAgg *a = static_cast<DensityAgg *>(into);
  DensityAgg *b = static_cast<DensityAgg *>(from);
  if (a->spacing != b->spacing) density_spacing_mismatch();
  density_compact(b);
  density_compact(a);
  DensityAgg *c = density_new(ctx, a->spacing, Max(a->m + b->m, kDensityInitialCap));
  c->m = guarded([&] {
    return merge_bins(a->ids, a->counts, a->m, b->ids, b->counts, b->m, c->ids, c->counts);
  });
  return c;
}

size_t density_size(void *s, const char *) {
  DensityAgg *a = static_cast<DensityAgg *>(s);
  density_compact(a);
  return density_serial_size(a->m);
}

void density_write(void *s, unsigned char *out, const char *) {
  const DensityAgg *a = static_cast<const DensityAgg *>(s);
  guarded([&] { write_density_state(a->spacing, a->ids, a->counts, a->m, out); });
}

}  // namespace

STRIAE_FUNCTION(density_combine) {
  MemoryContext ctx = agg_context(fcinfo, "density_combine");
  DensityAgg *a = state_arg<DensityAgg>(fcinfo, 0, "density_combine", StateKind::Density);
  DensityAgg *b = state_arg<DensityAgg>(fcinfo, 1, "density_combine", StateKind::Density);
  if (b == nullptr) {
    if (a == nullptr) PG_RETURN_NULL();
    PG_RETURN_POINTER(a);
  }
  if (a == nullptr) {
    density_compact(b);
    DensityAgg *c = density_new(ctx, b->spacing, Max(b->m, kDensityInitialCap));
    std::memcpy(c->ids, b->ids, sizeof(uint32_t) * b->m);
    std::memcpy(c->counts, b->counts, sizeof(uint64_t) * b->m);
    c->m = b->m;
    PG_RETURN_POINTER(c);
  }
  PG_RETURN_POINTER(density_combine_states(ctx, a, b, "density_combine"));
}

STRIAE_FUNCTION(density_serialize) {
  agg_context(fcinfo, "density_serialize");
  DensityAgg *a = state_arg<DensityAgg>(fcinfo, 0, "density_serialize", StateKind::Density);
  PG_RETURN_BYTEA_P(serialize_with(kDensityOps, a, "density_serialize"));
}

STRIAE_FUNCTION(density_deserialize) { return deserialize_with(fcinfo, kDensityOps, "density_deserialize"); }

STRIAE_FUNCTION(density_final) {
  DensityAgg *a = state_arg<DensityAgg>(fcinfo, 0, "density_final", StateKind::Density);
  if (a == nullptr) {
    check_empty_group_params(fcinfo);  // the spacing, as the first row would check it
    PG_RETURN_NULL();
  }
  density_compact(a);
  if (a->m == 0) PG_RETURN_NULL();  // only NULL rows
  const uint64_t n = guarded([&] { return bins_total(a->counts, a->m); });
  const int count = guarded([&] { return grid_node_count(a->spacing); });
  GridDatum *g = grid_alloc(GridKind::Density, a->spacing, static_cast<int64>(n), count);
  guarded([&] { density_values(a->ids, a->counts, a->m, a->spacing, g->values); });
  PG_RETURN_POINTER(g);
}

// ---- state operations (agg.hpp) ------------------------------------------------------

namespace striae_pg {
const StateOps kFisherOps = fixed_ops<FisherState>();
const StateOps kTensorOps = fixed_ops<TensorState>();
const StateOps kDensityOps = {density_read, density_combine_states, density_size, density_write};
}  // namespace striae_pg
