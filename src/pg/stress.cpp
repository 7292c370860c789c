// Paleostress glue: the stress_tensor type (text and binary I/O, accessors,
// forward constructor), per-datum quantities under a tensor (misfit, resolved
// slip, slip and dilation tendency), and the aggregates stress_inversion,
// right_dihedra and focal_stress_inversion. All math is in src/core (stress.hpp,
// dihedra.hpp, bootstrap.hpp); every call into it goes through guarded().
//
// Text form of stress_tensor: see src/core/stress_text.hpp (parsed there,
// printed here with float8out_internal so it follows extra_float_digits).
#include "agg.hpp"
#include "grid.hpp"

#include "../core/bootstrap.hpp"
#include "../core/dihedra.hpp"
#include "../core/kernels.hpp"
#include "../core/stress.hpp"
#include "../core/stress_text.hpp"

#include <algorithm>
#include <charconv>
#include <string>

using namespace striae;
using namespace striae_pg;

namespace {

// ---- text form ------------------------------------------------------------------

void append_number(StringInfo b, double v) {
  char *s = float8out_internal(v + 0.0);  // never "-0" (a value stored before 0.2.0 may hold -0)
  appendStringInfoString(b, s);
  pfree(s);
}

void append_numbers(StringInfo b, const double *v, int n) {
  appendStringInfoChar(b, '[');
  for (int i = 0; i < n; ++i) {
    if (i) appendStringInfoString(b, ", ");
    append_number(b, v[i]);
  }
  appendStringInfoChar(b, ']');
}

// ---- arguments --------------------------------------------------------------------

// A tensor argument, validated (a user can hand in any bytes via binary input
// of another build; check_stress_tensor is cheap).
StressTensor tensor_arg(FunctionCallInfo fcinfo, int k) {
  const StressTensor t = *arg<StressTensor>(fcinfo, k);
  guarded([&] { check_stress_tensor(t); });
  return t;
}

// Wire format of send/recv: one version byte, then the 13 float8 fields in
// struct order, data_count as int8 and flags as int4.
constexpr int kWireVersion = 1;

}  // namespace

// ---- type I/O -----------------------------------------------------------------------

STRIAE_FUNCTION(stress_tensor_in) {
  const char *s = PG_GETARG_CSTRING(0);
  const StressTensor t = guarded([&] {
    StressTensor v = parse_stress_tensor(s);
    check_stress_tensor(v);
    return v;
  });
  return result(t);
}

STRIAE_FUNCTION(stress_tensor_out) {
  const StressTensor t = tensor_arg(fcinfo, 0);
  StringInfoData b;
  initStringInfo(&b);
  const double c[6] = {t.nn, t.ee, t.dd, t.ne, t.nd, t.ed};
  appendStringInfoString(&b, "{\"components\": ");
  append_numbers(&b, c, 6);
  appendStringInfo(&b, ", \"n\": " INT64_FORMAT, static_cast<int64>(t.data_count));
  if (t.flags & kStressHasMisfit) {
    appendStringInfoString(&b, ", \"misfit\": ");
    append_number(&b, t.mean_misfit);
  }
  if (t.flags & kStressHasCones) {
    appendStringInfoString(&b, ", \"cones\": ");
    append_numbers(&b, t.cone, 3);
  }
  if (t.flags & kStressHasPhiInterval) {
    const double v[2] = {t.phi_lo, t.phi_hi};
    appendStringInfoString(&b, ", \"phi_interval\": ");
    append_numbers(&b, v, 2);
  }
  if (t.flags & kStressHasFriction) {
    appendStringInfoString(&b, ", \"friction\": ");
    append_number(&b, t.friction);
  }
  if (t.flags & (kStressFocalJoint | kStressNotConverged | kStressFrictionAtLimit)) {
    const struct { uint32_t bit; const char *name; } names[] = {
        {kStressFocalJoint, kStressFlagFocal},
        {kStressNotConverged, kStressFlagNotConverged},
        {kStressFrictionAtLimit, kStressFlagFrictionAtLimit}};
    const char *sep = "";
    appendStringInfoString(&b, ", \"flags\": [");
    for (const auto &f : names)
      if (t.flags & f.bit) {
        appendStringInfo(&b, "%s\"%s\"", sep, f.name);
        sep = ", ";
      }
    appendStringInfoChar(&b, ']');
  }
  appendStringInfoChar(&b, '}');
  PG_RETURN_CSTRING(b.data);
}

STRIAE_FUNCTION(stress_tensor_recv) {
  StringInfo buf = reinterpret_cast<StringInfo>(PG_GETARG_POINTER(0));
  const int version = pq_getmsgbyte(buf);
  if (version != kWireVersion)
    ereport(ERROR, (errcode(ERRCODE_INVALID_BINARY_REPRESENTATION),
                    errmsg("invalid binary format version %d for type stress_tensor", version),
                    errdetail("This build reads version %d.", kWireVersion)));
  StressTensor t{};
  double *f[13] = {&t.nn, &t.ee, &t.dd, &t.ne, &t.nd, &t.ed, &t.mean_misfit,
                   &t.cone[0], &t.cone[1], &t.cone[2], &t.phi_lo, &t.phi_hi, &t.friction};
  for (double *p : f) *p = pq_getmsgfloat8(buf);
  t.data_count = pq_getmsgint64(buf);
  t.flags = static_cast<uint32_t>(pq_getmsgint(buf, 4));
  t.version = kStressTensorVersion;
  guarded([&] {
    clear_negative_zeros(t);
    check_stress_tensor(t);
  });
  return result(t);
}

STRIAE_FUNCTION(stress_tensor_send) {
  const StressTensor t = tensor_arg(fcinfo, 0);
  const double f[13] = {t.nn, t.ee, t.dd, t.ne, t.nd, t.ed, t.mean_misfit,
                        t.cone[0], t.cone[1], t.cone[2], t.phi_lo, t.phi_hi, t.friction};
  StringInfoData buf;
  pq_begintypsend(&buf);
  pq_sendbyte(&buf, kWireVersion);
  for (double v : f) pq_sendfloat8(&buf, v + 0.0);  // never -0, as in the text output
  pq_sendint64(&buf, t.data_count);
  pq_sendint32(&buf, t.flags);
  PG_RETURN_BYTEA_P(pq_endtypsend(&buf));
}

// ---- constructor and accessors ---------------------------------------------------------

STRIAE_FUNCTION(stress_tensor_from_axes) {
  const Line s1 = *arg<Line>(fcinfo, 0), s3 = *arg<Line>(fcinfo, 1);
  const double phi = PG_GETARG_FLOAT8(2);
  return result(guarded([&] { return stress_from_axes(s1, s3, phi); }));
}

namespace {
Datum axis(FunctionCallInfo fcinfo, int i) {
  const StressTensor t = tensor_arg(fcinfo, 0);
  return result(guarded([&] { return stress_axis(t, i); }));
}
Datum cone(FunctionCallInfo fcinfo, int i) {
  const StressTensor t = tensor_arg(fcinfo, 0);
  if (!(t.flags & kStressHasCones)) PG_RETURN_NULL();
  PG_RETURN_FLOAT8(t.cone[i]);
}
}  // namespace

STRIAE_FUNCTION(sigma1) { return axis(fcinfo, 1); }
STRIAE_FUNCTION(sigma2) { return axis(fcinfo, 2); }
STRIAE_FUNCTION(sigma3) { return axis(fcinfo, 3); }
STRIAE_FUNCTION(sigma1_confidence) { return cone(fcinfo, 0); }
STRIAE_FUNCTION(sigma2_confidence) { return cone(fcinfo, 1); }
STRIAE_FUNCTION(sigma3_confidence) { return cone(fcinfo, 2); }

STRIAE_FUNCTION(stress_shape_ratio) {
  const StressTensor t = tensor_arg(fcinfo, 0);
  PG_RETURN_FLOAT8(guarded([&] { return striae::shape_ratio(t); }));
}

STRIAE_FUNCTION(stress_shmax_azimuth) {
  const StressTensor t = tensor_arg(fcinfo, 0);
  const std::optional<double> a = guarded([&] { return striae::shmax_azimuth(t); });
  if (!a) PG_RETURN_NULL();
  PG_RETURN_FLOAT8(*a);
}

STRIAE_FUNCTION(stress_tensor_regime) {
  const StressTensor t = tensor_arg(fcinfo, 0);
  return text_result(guarded([&] { return stress_regime_label(striae::stress_regime(t)); }));
}

STRIAE_FUNCTION(stress_regime_index) {
  const StressTensor t = tensor_arg(fcinfo, 0);
  PG_RETURN_FLOAT8(guarded([&] { return striae::regime_index(t); }));
}

STRIAE_FUNCTION(stress_data_count) {
  const StressTensor t = tensor_arg(fcinfo, 0);
  PG_RETURN_INT64(t.data_count);
}

STRIAE_FUNCTION(stress_friction) {
  const StressTensor t = tensor_arg(fcinfo, 0);
  if (!(t.flags & kStressHasFriction)) PG_RETURN_NULL();
  PG_RETURN_FLOAT8(t.friction);
}

STRIAE_FUNCTION(stress_mean_misfit) {
  const StressTensor t = tensor_arg(fcinfo, 0);
  if (!(t.flags & kStressHasMisfit)) PG_RETURN_NULL();
  PG_RETURN_FLOAT8(t.mean_misfit);
}

STRIAE_FUNCTION(shape_ratio_interval) {
  const StressTensor t = tensor_arg(fcinfo, 0);
  if (!(t.flags & kStressHasPhiInterval)) PG_RETURN_NULL();
  const double v[2] = {t.phi_lo, t.phi_hi};
  return float8_array(v, 2);
}

STRIAE_FUNCTION(stress_components) {
  const StressTensor t = tensor_arg(fcinfo, 0);
  const double c[6] = {t.nn, t.ee, t.dd, t.ne, t.nd, t.ed};
  return float8_array(c, 6);
}

// ---- per-datum quantities ---------------------------------------------------------------

STRIAE_FUNCTION(stress_misfit) {
  const FaultSlip f = *arg<FaultSlip>(fcinfo, 0);
  const StressTensor t = tensor_arg(fcinfo, 1);
  const std::optional<double> m = guarded([&] {
    Vec3 n, u;
    fault_vectors(f, n, u);
    return striae::misfit(n, u, t);
  });
  if (!m) PG_RETURN_NULL();
  PG_RETURN_FLOAT8(*m);
}

STRIAE_FUNCTION(stress_resolved_slip) {
  const Plane p = *arg<Plane>(fcinfo, 0);
  const StressTensor t = tensor_arg(fcinfo, 1);
  bool defined = false;
  const FaultSlip f = guarded([&] {
    const Vec3 n = plane_normal(p);
    const std::optional<Vec3> u = striae::resolved_slip(n, t);
    defined = u.has_value();
    return defined ? fault_from_vectors(n, *u) : FaultSlip{0, 0, 0};
  });
  if (!defined) PG_RETURN_NULL();
  return result(f);
}

STRIAE_FUNCTION(stress_slip_tendency) {
  const Plane p = *arg<Plane>(fcinfo, 0);
  const StressTensor t = tensor_arg(fcinfo, 1);
  const double mu = PG_GETARG_FLOAT8(2);
  PG_RETURN_FLOAT8(guarded([&] {
    check_friction(mu);
    return striae::slip_tendency(plane_normal(p), t, mu);
  }));
}

STRIAE_FUNCTION(stress_dilation_tendency) {
  const Plane p = *arg<Plane>(fcinfo, 0);
  const StressTensor t = tensor_arg(fcinfo, 1);
  PG_RETURN_FLOAT8(guarded([&] { return striae::dilation_tendency(plane_normal(p), t); }));
}

// ---- aggregates: shared helpers -----------------------------------------------------------

namespace {

// The datum (n, u) of a fault_slip argument, as the core's data-keeping functions take it.
SlipDatum slip_datum(FunctionCallInfo fcinfo, int k) {
  const FaultSlip f = *arg<FaultSlip>(fcinfo, k);
  return guarded([&] { return striae::slip_datum(f); });
}

// ---- stress_inversion(fault_slip): normal equations (Michael 1984) -----------------------------

// In memory: the kind tag and the core's normal equations.
struct StressAgg {
  StateTag tag;  // StateKind::StressLinear
  StressAccum s;
};
static_assert(std::is_trivially_destructible<StressAgg>::value, "palloc'd state");

StressAgg *stress_new(MemoryContext ctx) {
  StressAgg *a = static_cast<StressAgg *>(MemoryContextAlloc(ctx, sizeof(StressAgg)));
  a->tag = state_tag(StateKind::StressLinear);
  return a;
}

StressAgg *stress_state(FunctionCallInfo fcinfo, int k, const char *fn) {
  return state_arg<StressAgg>(fcinfo, k, fn, StateKind::StressLinear);
}

}  // namespace

STRIAE_FUNCTION(stress_inversion_accum) {
  StressAgg *a = stress_state(fcinfo, 0, "stress_inversion_accum");
  if (a == nullptr) {
    // Checked when the state is created (see the statistics aggregates).
    MemoryContext ctx = agg_context(fcinfo, "stress_inversion_accum");
    a = stress_new(ctx);
    stress_init(a->s);
  }
  if (!PG_ARGISNULL(1)) {
    const FaultSlip f = *arg<FaultSlip>(fcinfo, 1);
    guarded([&] { stress_add_fault(a->s, f); });
  }
  PG_RETURN_POINTER(a);
}

namespace {

void *stress_read(MemoryContext ctx, const unsigned char *p, size_t n, const char *fn) {
  StressAgg *a = stress_new(ctx);
  guarded([&] { read_stress_state(p, n, a->s, fn); });
  return a;
}

void *stress_combine_states(MemoryContext, void *into, void *from, const char *) {
  StressAgg *a = static_cast<StressAgg *>(into);
  const StressAgg *b = static_cast<const StressAgg *>(from);
  guarded([&] {
    stress_validate(a->s);
    stress_validate(b->s);
    stress_combine(a->s, b->s);
  });
  return a;
}

size_t stress_size(void *, const char *) { return kStressSerialSize; }

void stress_write(void *s, unsigned char *out, const char *) {
  const StressAgg *a = static_cast<const StressAgg *>(s);
  guarded([&] { write_stress_state(a->s, out); });
}

}  // namespace

STRIAE_FUNCTION(stress_inversion_combine) {
  MemoryContext ctx = agg_context(fcinfo, "stress_inversion_combine");
  StressAgg *a = stress_state(fcinfo, 0, "stress_inversion_combine");
  StressAgg *b = stress_state(fcinfo, 1, "stress_inversion_combine");
  if (b == nullptr) {
    if (a == nullptr) PG_RETURN_NULL();
    PG_RETURN_POINTER(a);
  }
  if (a == nullptr) {
    a = stress_new(ctx);
    a->s = b->s;
    guarded([&] { stress_validate(a->s); });
    PG_RETURN_POINTER(a);
  }
  PG_RETURN_POINTER(stress_combine_states(ctx, a, b, "stress_inversion_combine"));
}

STRIAE_FUNCTION(stress_inversion_serialize) {
  agg_context(fcinfo, "stress_inversion_serialize");
  StressAgg *a = stress_state(fcinfo, 0, "stress_inversion_serialize");
  PG_RETURN_BYTEA_P(serialize_with(kStressOps, a, "stress_inversion_serialize"));
}

STRIAE_FUNCTION(stress_inversion_deserialize) {
  return deserialize_with(fcinfo, kStressOps, "stress_inversion_deserialize");
}

// NULL for an empty group, too few data or a degenerate set (stress.hpp, StressStatus).
STRIAE_FUNCTION(stress_inversion_final) {
  const StressAgg *a = stress_state(fcinfo, 0, "stress_inversion_final");
  if (a == nullptr) PG_RETURN_NULL();
  StressTensor t{};
  const StressStatus st = guarded([&] {
    stress_validate(a->s);
    return stress_finalise(a->s, t);
  });
  if (st != StressStatus::Ok) PG_RETURN_NULL();
  return result(t);
}

// ---- right_dihedra(fault_slip, spacing) (Angelier & Mechler 1977) ------------------------------
//
// State: DihedraHeader followed by node_count int64 counts, one palloc chunk in
// the aggregate context, and a block of pending rows (kernels.hpp), a second
// chunk allocated with the state. Rows are copied into the block and counted a
// block at a time; everything that reads the counts (combine, the serialized
// size and bytes of kDihedraOps, final) flushes the block first, so serialized
// states and partial_state values hold counts only. The node table depends only
// on the spacing and is kept per backend, for up to kNodeCacheSpacings spacings
// and kNodeCacheBytes in all, the least recently used dropped first: two
// right_dihedra of different spacings in one query take turns row by row, and a
// cache of one spacing rebuilt the table on every row (30 to 110 times slower
// than running them apart).

namespace {

struct DihedraAgg {
  StateTag tag;  // StateKind::RightDihedra
  DihedraHeader h;
  DihedraBlock *block;  // pending rows, counted into counts when full or flushed
  int64_t counts[FLEXIBLE_ARRAY_MEMBER];
};
static_assert(std::is_trivially_destructible<DihedraHeader>::value, "palloc'd state");

DihedraAgg *dihedra_new(MemoryContext ctx, const DihedraHeader &h) {
  const Size size = offsetof(DihedraAgg, counts) + sizeof(int64_t) * static_cast<Size>(h.node_count);
  DihedraAgg *a = static_cast<DihedraAgg *>(MemoryContextAllocZero(ctx, size));
  a->tag = state_tag(StateKind::RightDihedra);
  a->h = h;
  a->block = static_cast<DihedraBlock *>(MemoryContextAllocZero(ctx, sizeof(DihedraBlock)));
  return a;
}

constexpr int kNodeCacheSpacings = 8;
constexpr size_t kNodeCacheBytes = size_t(8) << 20;  // 4 tables of the finest grid (2 MB each)

struct NodeTable {
  double spacing = 0;
  uint64_t last_use = 0;  // 0: empty slot
  std::vector<double> table;
};

// Node table for a (checked) spacing, from the per-backend cache.
const double *dihedra_nodes(double spacing) {
  static NodeTable cache[kNodeCacheSpacings];
  static int last = 0;  // the slot the previous row used: the common case
  static uint64_t clock = 0;
  ++clock;
  NodeTable &hit = cache[last];
  if (hit.last_use != 0 && hit.spacing == spacing) {
    hit.last_use = clock;
    return hit.table.data();
  }
  for (int i = 0; i < kNodeCacheSpacings; ++i)
    if (cache[i].last_use != 0 && cache[i].spacing == spacing) {
      cache[i].last_use = clock;
      last = i;
      return cache[i].table.data();
    }
  guarded([&] {
    std::vector<double> t = dihedra_node_table(spacing);
    // Drop least recently used tables until the new one fits both bounds.
    auto bytes = [&] {
      size_t b = t.size() * sizeof(double);
      for (const NodeTable &e : cache)
        if (e.last_use != 0) b += e.table.size() * sizeof(double);
      return b;
    };
    auto lru = [&]() -> NodeTable * {
      NodeTable *v = nullptr;
      for (NodeTable &e : cache)
        if (e.last_use != 0 && (v == nullptr || e.last_use < v->last_use)) v = &e;
      return v;
    };
    NodeTable *slot = nullptr;
    for (NodeTable &e : cache)
      if (e.last_use == 0) slot = &e;
    if (slot == nullptr) slot = lru();
    slot->last_use = 0;
    std::vector<double>().swap(slot->table);
    while (bytes() > kNodeCacheBytes) {
      NodeTable *v = lru();
      if (v == nullptr) break;
      v->last_use = 0;
      std::vector<double>().swap(v->table);
    }
    slot->table = std::move(t);
    slot->spacing = spacing;
    slot->last_use = clock;
    last = static_cast<int>(slot - cache);
  });
  return cache[last].table.data();
}

DihedraAgg *dihedra_state(FunctionCallInfo fcinfo, int k, const char *fn) {
  return state_arg<DihedraAgg>(fcinfo, k, fn, StateKind::RightDihedra);
}

// Count the pending rows, so that counts and data_count are the state's value
// (the value does not change: rows move from the block into the counts).
void dihedra_settle(DihedraAgg *a) {
  if (a->block->rows == 0) return;
  const double *nodes = dihedra_nodes(a->h.spacing);
  guarded([&] { dihedra_flush(a->h, a->counts, nodes, *a->block); });
}

[[noreturn]] void dihedra_spacing_mismatch() {
  ereport(ERROR, (errcode(ERRCODE_INVALID_PARAMETER_VALUE),
                  errmsg("right_dihedra spacing must be the same for every row of a group")));
  pg_unreachable();
}

}  // namespace

STRIAE_FUNCTION(right_dihedra_accum) {
  MemoryContext ctx = agg_context(fcinfo, "right_dihedra_accum");
  DihedraAgg *a = dihedra_state(fcinfo, 0, "right_dihedra_accum");
  if (PG_ARGISNULL(2))
    ereport(ERROR, (errcode(ERRCODE_NULL_VALUE_NOT_ALLOWED), errmsg("right_dihedra spacing must not be NULL")));
  const double spacing = PG_GETARG_FLOAT8(2);
  if (a == nullptr) {
    const DihedraHeader h = guarded([&] { return dihedra_init(spacing); });
    a = dihedra_new(ctx, h);
  } else if (spacing != a->h.spacing && guarded([&] { return grid_spacing(spacing); }) != a->h.spacing) {
    dihedra_spacing_mismatch();
  }
  if (PG_ARGISNULL(1)) PG_RETURN_POINTER(a);
  const SlipDatum d = slip_datum(fcinfo, 1);
  const double *nodes = dihedra_nodes(a->h.spacing);
  guarded([&] { dihedra_push(a->h, a->counts, nodes, *a->block, d.n, d.u); });
  PG_RETURN_POINTER(a);
}

namespace {

void *dihedra_read(MemoryContext ctx, const unsigned char *p, size_t len, const char *fn) {
  const DihedraHeader h = guarded([&] { return read_dihedra_header(p, len, fn); });
  DihedraAgg *a = dihedra_new(ctx, h);
  guarded([&] { read_dihedra_counts(p, len, h, a->counts, fn); });
  return a;
}

void *dihedra_combine_states(MemoryContext, void *into, void *from, const char *) {
  DihedraAgg *a = static_cast<DihedraAgg *>(into);
  DihedraAgg *b = static_cast<DihedraAgg *>(from);
  if (a->h.spacing != b->h.spacing) dihedra_spacing_mismatch();
  dihedra_settle(a);
  dihedra_settle(b);
  guarded([&] {
    dihedra_validate(a->h, a->counts);
    dihedra_validate(b->h, b->counts);
    dihedra_combine(a->h, a->counts, b->h, b->counts);
  });
  return a;
}

size_t dihedra_bytes(void *s, const char *) {
  DihedraAgg *a = static_cast<DihedraAgg *>(s);
  dihedra_settle(a);
  return dihedra_serial_size(a->h);
}

void dihedra_write(void *s, unsigned char *out, const char *) {
  DihedraAgg *a = static_cast<DihedraAgg *>(s);
  dihedra_settle(a);
  guarded([&] { write_dihedra_state(a->h, a->counts, out); });
}

}  // namespace

STRIAE_FUNCTION(right_dihedra_combine) {
  MemoryContext ctx = agg_context(fcinfo, "right_dihedra_combine");
  DihedraAgg *a = dihedra_state(fcinfo, 0, "right_dihedra_combine");
  DihedraAgg *b = dihedra_state(fcinfo, 1, "right_dihedra_combine");
  if (b == nullptr) {
    if (a == nullptr) PG_RETURN_NULL();
    PG_RETURN_POINTER(a);
  }
  dihedra_settle(b);
  if (a == nullptr) {
    guarded([&] { dihedra_validate(b->h, b->counts); });
    a = dihedra_new(ctx, b->h);
    std::memcpy(a->counts, b->counts, sizeof(int64_t) * static_cast<Size>(b->h.node_count));
    PG_RETURN_POINTER(a);
  }
  PG_RETURN_POINTER(dihedra_combine_states(ctx, a, b, "right_dihedra_combine"));
}

STRIAE_FUNCTION(right_dihedra_serialize) {
  agg_context(fcinfo, "right_dihedra_serialize");
  DihedraAgg *a = dihedra_state(fcinfo, 0, "right_dihedra_serialize");
  PG_RETURN_BYTEA_P(serialize_with(kDihedraOps, a, "right_dihedra_serialize"));
}

STRIAE_FUNCTION(right_dihedra_deserialize) {
  return deserialize_with(fcinfo, kDihedraOps, "right_dihedra_deserialize");
}

// NULL for an empty group (or only NULL rows).
STRIAE_FUNCTION(right_dihedra_final) {
  DihedraAgg *a = dihedra_state(fcinfo, 0, "right_dihedra_final");
  if (a == nullptr) {
    check_empty_group_params(fcinfo);  // the spacing, as the first row would check it
    PG_RETURN_NULL();
  }
  dihedra_settle(a);
  if (a->h.data_count == 0) PG_RETURN_NULL();
  guarded([&] { dihedra_validate(a->h, a->counts); });
  GridDatum *g = grid_alloc(GridKind::RightDihedra, a->h.spacing, a->h.data_count, a->h.node_count);
  guarded([&] { dihedra_finalise(a->h, a->counts, g->values); });
  PG_RETURN_POINTER(g);
}

// ---- aggregates that keep the group's data -----------------------------------------------------
//
// stress_inversion(fault_slip, resamples, seed) (bootstrap, Michael 1987) and
// focal_stress_inversion(fault_slip [, friction]) (Vavrycuk 2014). State: the
// parameters and a growing SlipDatum array (48 bytes a datum) in the aggregate
// context, at most kMaxBootstrapData data (48 MB); combine concatenates. The final
// functions sort the data first, so the result does not depend on row order or
// on the plan (serial or parallel).

namespace {

constexpr int64 kKeepInitialCap = 64;
// Default friction search of focal_stress_inversion(fault_slip): striae's choice,
// covering the usual range of fault friction (common practice, no source).
constexpr double kFocalMuMin = 0.2, kFocalMuMax = 1.0, kFocalMuStep = 0.1;

struct KeepAgg {
  StateTag tag;     // keep_state_kind(kind)
  int32 kind;       // kKeepBootstrap, kKeepFocal or kKeepFocalBootstrap (agg_state.hpp)
  int32 resamples;  // bootstraps
  int64 seed;       // bootstraps
  double friction;  // focal: fixed value, or 0 = default search
  int64 count;
  int64 cap;
  SlipDatum *data;
};
static_assert(std::is_trivially_destructible<KeepAgg>::value, "palloc'd state");

KeepAgg *keep_new(MemoryContext ctx, int32 kind, int32 resamples, int64 seed, double friction, int64 cap) {
  KeepAgg *a = static_cast<KeepAgg *>(MemoryContextAlloc(ctx, sizeof(KeepAgg)));
  a->tag = state_tag(guarded([&] { return keep_state_kind(kind); }));
  a->kind = kind;
  a->resamples = resamples;
  a->seed = seed;
  a->friction = friction;
  a->count = 0;
  a->cap = Max(cap, kKeepInitialCap);
  a->data = static_cast<SlipDatum *>(MemoryContextAlloc(ctx, sizeof(SlipDatum) * a->cap));
  return a;
}

// State argument k of one keep kind.
KeepAgg *keep_state(FunctionCallInfo fcinfo, int k, const char *fn, StateKind kind) {
  return state_arg<KeepAgg>(fcinfo, k, fn, kind);
}

// State argument k of any keep kind (combine, serialize).
KeepAgg *keep_state_any(FunctionCallInfo fcinfo, int k, const char *fn) {
  StateKind found;
  return state_arg<KeepAgg>(fcinfo, k, fn,
                            {StateKind::KeepBootstrap, StateKind::KeepFocal, StateKind::KeepFocalBootstrap}, found);
}

KeepParams keep_params(const KeepAgg *a) {
  return KeepParams{a->kind, a->resamples, a->seed, a->friction, a->count};
}

[[noreturn]] void too_many_data() {
  ereport(ERROR, (errcode(ERRCODE_INVALID_PARAMETER_VALUE),
                  errmsg("too many data for a data-keeping stress inversion"),
                  errdetail("At most %d fault-slip data per group are kept.", static_cast<int>(kMaxBootstrapData)),
                  errhint("Use stress_inversion(fault_slip) for the streaming inversion without confidence.")));
  pg_unreachable();
}

void keep_reserve(KeepAgg *a, int64 need) {
  if (need > static_cast<int64>(kMaxBootstrapData)) too_many_data();
  if (need <= a->cap) return;
  int64 cap = a->cap;
  while (cap < need) cap *= 2;
  cap = Min(cap, static_cast<int64>(kMaxBootstrapData));
  a->data = static_cast<SlipDatum *>(repalloc(a->data, sizeof(SlipDatum) * cap));
  a->cap = cap;
}

void keep_append(KeepAgg *a, FunctionCallInfo fcinfo, int k) {
  if (PG_ARGISNULL(k)) return;
  const SlipDatum d = slip_datum(fcinfo, k);
  keep_reserve(a, a->count + 1);
  a->data[a->count++] = d;
}

void keep_same(const KeepAgg *a, int32 resamples, int64 seed, double friction, const char *fn) {
  if (a->resamples != resamples || a->seed != seed || a->friction != friction)
    ereport(ERROR, (errcode(ERRCODE_INVALID_PARAMETER_VALUE),
                    errmsg("%s parameters must be the same for every row of a group", fn)));
}

void keep_validate(const KeepAgg *a) {
  guarded([&] {
    check_keep_params(keep_params(a));
    if (a->count > a->cap) throw Error(ErrorKind::BadState, "invalid stress inversion state: bad count");
    check_keep_data(a->data, a->count);
  });
}

}  // namespace

STRIAE_FUNCTION(stress_bootstrap_accum) {
  MemoryContext ctx = agg_context(fcinfo, "stress_bootstrap_accum");
  KeepAgg *a = keep_state(fcinfo, 0, "stress_bootstrap_accum", StateKind::KeepBootstrap);
  if (PG_ARGISNULL(2) || PG_ARGISNULL(3))
    ereport(ERROR, (errcode(ERRCODE_NULL_VALUE_NOT_ALLOWED), errmsg("stress_inversion resamples and seed must not be NULL")));
  const int32 resamples = PG_GETARG_INT32(2);
  const int64 seed = PG_GETARG_INT64(3);
  if (a == nullptr) {
    guarded([&] {
      BootstrapOptions o;
      o.resamples = resamples;
      o.seed = static_cast<uint64_t>(seed);
      check_bootstrap_options(o);
    });
    a = keep_new(ctx, kKeepBootstrap, resamples, seed, 0, kKeepInitialCap);
  } else {
    keep_same(a, resamples, seed, 0, "stress_inversion");
  }
  keep_append(a, fcinfo, 1);
  PG_RETURN_POINTER(a);
}

namespace {
Datum focal_accum(FunctionCallInfo fcinfo, bool fixed) {
  MemoryContext ctx = agg_context(fcinfo, "focal_stress_inversion_accum");
  KeepAgg *a = keep_state(fcinfo, 0, fixed ? "focal_stress_inversion_friction_accum" : "focal_stress_inversion_accum",
                          StateKind::KeepFocal);
  if (fixed && PG_ARGISNULL(2))
    ereport(ERROR, (errcode(ERRCODE_NULL_VALUE_NOT_ALLOWED), errmsg("focal_stress_inversion friction must not be NULL")));
  const double mu = fixed ? PG_GETARG_FLOAT8(2) : 0.0;
  if (a == nullptr) {
    if (fixed) guarded([&] { check_friction(mu); });
    a = keep_new(ctx, kKeepFocal, 0, 0, mu, kKeepInitialCap);
  } else {
    keep_same(a, 0, 0, mu, "focal_stress_inversion");
  }
  keep_append(a, fcinfo, 1);
  PG_RETURN_POINTER(a);
}
}  // namespace

STRIAE_FUNCTION(focal_stress_inversion_accum) { return focal_accum(fcinfo, false); }

// focal_stress_inversion(fault_slip, friction, resamples, seed): friction NULL
// means the default search; resamples and seed must be given.
STRIAE_FUNCTION(focal_bootstrap_accum) {
  MemoryContext ctx = agg_context(fcinfo, "focal_bootstrap_accum");
  KeepAgg *a = keep_state(fcinfo, 0, "focal_bootstrap_accum", StateKind::KeepFocalBootstrap);
  if (PG_ARGISNULL(3) || PG_ARGISNULL(4))
    ereport(ERROR, (errcode(ERRCODE_NULL_VALUE_NOT_ALLOWED),
                    errmsg("focal_stress_inversion resamples and seed must not be NULL")));
  const double mu = PG_ARGISNULL(2) ? 0.0 : PG_GETARG_FLOAT8(2);
  const int32 resamples = PG_GETARG_INT32(3);
  const int64 seed = PG_GETARG_INT64(4);
  if (a == nullptr) {
    guarded([&] {
      // NULL means the default search; a given friction is checked as in the
      // plain form (0 or -0 is out of range, not "search").
      if (!PG_ARGISNULL(2)) check_friction(mu);
      BootstrapOptions o;
      o.resamples = resamples;
      o.seed = static_cast<uint64_t>(seed);
      check_bootstrap_options(o);
    });
    a = keep_new(ctx, kKeepFocalBootstrap, resamples, seed, mu, kKeepInitialCap);
  } else {
    keep_same(a, resamples, seed, mu, "focal_stress_inversion");
  }
  keep_append(a, fcinfo, 1);
  PG_RETURN_POINTER(a);
}
STRIAE_FUNCTION(focal_stress_inversion_friction_accum) { return focal_accum(fcinfo, true); }

namespace {

void *keep_read(MemoryContext ctx, const unsigned char *p, size_t len, const char *fn) {
  const KeepParams h = guarded([&] { return read_keep_header(p, len, fn); });
  KeepAgg *a = keep_new(ctx, h.kind, h.resamples, h.seed, h.friction, h.count);
  guarded([&] { read_keep_data(p, len, h, a->data, fn); });
  a->count = h.count;
  return a;
}

// Appends from's data to into (repalloc keeps into's data in its own context).
void *keep_combine_states(MemoryContext, void *into, void *from, const char *fn) {
  KeepAgg *a = static_cast<KeepAgg *>(into);
  const KeepAgg *b = static_cast<const KeepAgg *>(from);
  keep_validate(b);
  keep_validate(a);
  if (a->kind != b->kind) wrong_state_kind(b, fn, {keep_state_kind(a->kind)});
  keep_same(a, b->resamples, b->seed, b->friction, "stress inversion");
  keep_reserve(a, a->count + b->count);
  if (b->count > 0) std::memcpy(a->data + a->count, b->data, sizeof(SlipDatum) * b->count);
  a->count += b->count;
  return a;
}

size_t keep_size(void *s, const char *) {
  const KeepAgg *a = static_cast<const KeepAgg *>(s);
  keep_validate(a);
  return keep_serial_size(a->count);
}

void keep_write(void *s, unsigned char *out, const char *) {
  const KeepAgg *a = static_cast<const KeepAgg *>(s);
  guarded([&] { write_keep_state(keep_params(a), a->data, out); });
}

}  // namespace

STRIAE_FUNCTION(stress_keep_combine) {
  MemoryContext ctx = agg_context(fcinfo, "stress_keep_combine");
  KeepAgg *a = keep_state_any(fcinfo, 0, "stress_keep_combine");
  KeepAgg *b = keep_state_any(fcinfo, 1, "stress_keep_combine");
  if (b == nullptr) {
    if (a == nullptr) PG_RETURN_NULL();
    PG_RETURN_POINTER(a);
  }
  if (a == nullptr) {
    keep_validate(b);
    a = keep_new(ctx, b->kind, b->resamples, b->seed, b->friction, b->count);
  }
  PG_RETURN_POINTER(keep_combine_states(ctx, a, b, "stress_keep_combine"));
}

STRIAE_FUNCTION(stress_keep_serialize) {
  agg_context(fcinfo, "stress_keep_serialize");
  KeepAgg *a = keep_state_any(fcinfo, 0, "stress_keep_serialize");
  PG_RETURN_BYTEA_P(serialize_with(kKeepOps, a, "stress_keep_serialize"));
}

STRIAE_FUNCTION(stress_keep_deserialize) { return deserialize_with(fcinfo, kKeepOps, "stress_keep_deserialize"); }

// Bootstrap inversion: NULL for an empty group, too few data or a degenerate set.
STRIAE_FUNCTION(stress_bootstrap_final) {
  KeepAgg *a = keep_state(fcinfo, 0, "stress_bootstrap_final", StateKind::KeepBootstrap);
  if (a == nullptr) {
    check_empty_group_params(fcinfo);  // resamples and seed
    PG_RETURN_NULL();
  }
  if (a->count == 0) PG_RETURN_NULL();
  keep_validate(a);
  StressTensor t{};
  const StressStatus st = guarded([&] {
    sort_slip_data(a->data, static_cast<size_t>(a->count));
    BootstrapOptions o;
    o.resamples = a->resamples;
    o.seed = static_cast<uint64_t>(a->seed);
    return stress_bootstrap(a->data, static_cast<size_t>(a->count), o, t);
  });
  if (st != StressStatus::Ok) PG_RETURN_NULL();
  return result(t);
}

// Joint focal inversion: NULL for an empty group, too few mechanisms or a degenerate set.
STRIAE_FUNCTION(focal_stress_inversion_final) {
  StateKind kind;
  KeepAgg *a = state_arg<KeepAgg>(fcinfo, 0, "focal_stress_inversion_final",
                                  {StateKind::KeepFocal, StateKind::KeepFocalBootstrap}, kind);
  if (a == nullptr) {
    check_empty_group_params(fcinfo);  // friction, resamples and seed, when given
    PG_RETURN_NULL();
  }
  if (a->count == 0) PG_RETURN_NULL();
  keep_validate(a);
  uint8_t *picked = static_cast<uint8_t *>(palloc(static_cast<Size>(a->count)));
  FocalInversion r{};
  const StressStatus st = guarded([&] {
    sort_slip_data(a->data, static_cast<size_t>(a->count));
    FrictionRange f;
    if (a->friction != 0) {
      f.mu_min = f.mu_max = a->friction;
    } else {
      f.mu_min = kFocalMuMin;
      f.mu_max = kFocalMuMax;
      f.step = kFocalMuStep;
    }
    if (a->kind == kKeepFocalBootstrap) {
      BootstrapOptions o;
      o.resamples = a->resamples;
      o.seed = static_cast<uint64_t>(a->seed);
      return focal_bootstrap(a->data, static_cast<size_t>(a->count), f, o, picked, r);
    }
    return invert_focal(a->data, static_cast<size_t>(a->count), f, picked, r);
  });
  pfree(picked);
  if (st != StressStatus::Ok) PG_RETURN_NULL();
  return result(r.tensor);
}

// ---- state operations (agg.hpp) ------------------------------------------------------

namespace striae_pg {
const StateOps kStressOps = {stress_read, stress_combine_states, stress_size, stress_write};
const StateOps kDihedraOps = {dihedra_read, dihedra_combine_states, dihedra_bytes, dihedra_write};
const StateOps kKeepOps = {keep_read, keep_combine_states, keep_size, keep_write};
}  // namespace striae_pg
