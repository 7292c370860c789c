// Analysis aggregates and their per-row companions (issue 12): stress_phases and
// stress_phase (hard division into stress phases, src/core/phases.hpp),
// misfit_summary, moment_tensor_sum and kostrov_strain_rate (src/core/moment.hpp).
// Glue only: unpack, call src/core inside guarded(), pack.
#include "agg.hpp"
#include "datum.hpp"

#include "../core/moment.hpp"
#include "../core/phases.hpp"
#include "../core/stress.hpp"

#include <vector>

using namespace striae;
using namespace striae_pg;

namespace {

// Build a composite result of the function's declared row type.
Datum composite(FunctionCallInfo fcinfo, Datum *values, bool *nulls) {
  TupleDesc desc;
  if (get_call_result_type(fcinfo, nullptr, &desc) != TYPEFUNC_COMPOSITE)
    ereport(ERROR, (errcode(ERRCODE_FEATURE_NOT_SUPPORTED),
                    errmsg("function returning record called in context that cannot accept it")));
  desc = BlessTupleDesc(desc);
  return HeapTupleGetDatum(heap_form_tuple(desc, values, nulls));
}

// Elements of a stress_tensor[] argument, validated, in a palloc'd array (no
// C++ container in a frame that can raise); NULL elements are an error.
struct Tensors {
  const StressTensor *t;
  size_t n;
};
Tensors tensor_array(FunctionCallInfo fcinfo, int k) {
  ArrayType *a = PG_GETARG_ARRAYTYPE_P(k);
  Datum *elems;
  bool *nulls;
  int n;
  deconstruct_array(a, ARR_ELEMTYPE(a), sizeof(StressTensor), false, TYPALIGN_DOUBLE, &elems, &nulls, &n);
  StressTensor *out = static_cast<StressTensor *>(palloc(sizeof(StressTensor) * Max(n, 1)));
  for (int i = 0; i < n; ++i) {
    if (nulls[i])
      ereport(ERROR, (errcode(ERRCODE_NULL_VALUE_NOT_ALLOWED), errmsg("stress_phase: the array of tensors contains a NULL")));
    out[i] = *reinterpret_cast<const StressTensor *>(DatumGetPointer(elems[i]));
  }
  guarded([&] {
    for (int i = 0; i < n; ++i) check_stress_tensor(out[i]);
  });
  return Tensors{out, static_cast<size_t>(n)};
}

// ---- stress_phases: state keeping the data ----------------------------------------

constexpr int64 kPhaseInitialCap = 64;

struct PhaseAgg {
  StateTag tag;  // StateKind::Phases
  int32 phases;
  int32 starts;
  int64 seed;
  int64 count;
  int64 cap;
  SlipDatum *data;
};
static_assert(std::is_trivially_destructible<PhaseAgg>::value, "palloc'd state");

PhaseAgg *phase_new(MemoryContext ctx, int32 phases, int32 starts, int64 seed, int64 cap) {
  PhaseAgg *a = static_cast<PhaseAgg *>(MemoryContextAlloc(ctx, sizeof(PhaseAgg)));
  a->tag = state_tag(StateKind::Phases);
  a->phases = phases;
  a->starts = starts;
  a->seed = seed;
  a->count = 0;
  a->cap = Max(cap, kPhaseInitialCap);
  a->data = static_cast<SlipDatum *>(MemoryContextAlloc(ctx, sizeof(SlipDatum) * a->cap));
  return a;
}

PhaseAgg *phase_state(FunctionCallInfo fcinfo, int k, const char *fn) {
  return state_arg<PhaseAgg>(fcinfo, k, fn, StateKind::Phases);
}

void phase_reserve(PhaseAgg *a, int64 need) {
  if (need > static_cast<int64>(kMaxBootstrapData))
    ereport(ERROR, (errcode(ERRCODE_INVALID_PARAMETER_VALUE), errmsg("too many data for stress_phases"),
                    errdetail("At most %d fault-slip data per group are kept.", static_cast<int>(kMaxBootstrapData)),
                    errhint("Split the group.")));
  if (need <= a->cap) return;
  int64 cap = a->cap;
  while (cap < need) cap *= 2;
  cap = Min(cap, static_cast<int64>(kMaxBootstrapData));
  a->data = static_cast<SlipDatum *>(repalloc(a->data, sizeof(SlipDatum) * cap));
  a->cap = cap;
}

void phase_same(const PhaseAgg *a, int32 phases, int32 starts, int64 seed) {
  if (a->phases != phases || a->starts != starts || a->seed != seed)
    ereport(ERROR, (errcode(ERRCODE_INVALID_PARAMETER_VALUE),
                    errmsg("stress_phases parameters must be the same for every row of a group")));
}

PhaseParams phase_params(const PhaseAgg *a) { return PhaseParams{a->phases, a->starts, a->seed, a->count}; }

void phase_validate(const PhaseAgg *a) {
  guarded([&] {
    check_phase_params(phase_params(a));
    if (a->count > a->cap) throw Error(ErrorKind::BadState, "invalid stress_phases state: bad count");
    check_phase_data(a->data, a->count);
  });
}

Datum phases_accum(FunctionCallInfo fcinfo, bool with_starts) {
  MemoryContext ctx = agg_context(fcinfo, "stress_phases_accum");
  PhaseAgg *a = phase_state(fcinfo, 0, with_starts ? "stress_phases_starts_accum" : "stress_phases_accum");
  if (PG_ARGISNULL(2) || PG_ARGISNULL(3) || (with_starts && PG_ARGISNULL(4)))
    ereport(ERROR, (errcode(ERRCODE_NULL_VALUE_NOT_ALLOWED),
                    errmsg("stress_phases phases, seed and starts must not be NULL")));
  const int32 phases = PG_GETARG_INT32(2);
  const int64 seed = PG_GETARG_INT64(3);
  const int32 starts = with_starts ? PG_GETARG_INT32(4) : kDefaultPhaseStarts;
  if (a == nullptr) {
    guarded([&] {
      PhaseOptions o;
      o.phases = phases;
      o.starts = starts;
      check_phase_options(o);
    });
    a = phase_new(ctx, phases, starts, seed, kPhaseInitialCap);
  } else {
    phase_same(a, phases, starts, seed);
  }
  if (!PG_ARGISNULL(1)) {
    const FaultSlip f = *arg<FaultSlip>(fcinfo, 1);
    const SlipDatum d = guarded([&] { return slip_datum(f); });
    phase_reserve(a, a->count + 1);
    a->data[a->count++] = d;
  }
  PG_RETURN_POINTER(a);
}

// ---- misfit_summary: state keeping the misfits -----------------------------------------

// Misfits kept per group: 8 bytes each, at most kMaxMisfits = 10^7 (80 MB, agg_state.hpp).

struct MisfitAgg {
  StateTag tag;  // StateKind::MisfitSummary
  double threshold;
  int64 undefined;
  int64 count;
  int64 cap;
  double *values;
};
static_assert(std::is_trivially_destructible<MisfitAgg>::value, "palloc'd state");

MisfitAgg *misfit_new(MemoryContext ctx, double threshold, int64 cap) {
  MisfitAgg *a = static_cast<MisfitAgg *>(MemoryContextAlloc(ctx, sizeof(MisfitAgg)));
  a->tag = state_tag(StateKind::MisfitSummary);
  a->threshold = threshold;
  a->undefined = 0;
  a->count = 0;
  a->cap = Max(cap, static_cast<int64>(64));
  a->values = static_cast<double *>(MemoryContextAlloc(ctx, sizeof(double) * a->cap));
  return a;
}

MisfitAgg *misfit_state(FunctionCallInfo fcinfo, int k, const char *fn) {
  return state_arg<MisfitAgg>(fcinfo, k, fn, StateKind::MisfitSummary);
}

void misfit_reserve(MisfitAgg *a, int64 need) {
  if (need > kMaxMisfits)
    ereport(ERROR, (errcode(ERRCODE_INVALID_PARAMETER_VALUE), errmsg("too many data for misfit_summary"),
                    errdetail("At most 10000000 misfits per group are kept."), errhint("Split the group.")));
  if (need <= a->cap) return;
  int64 cap = a->cap;
  while (cap < need) cap *= 2;
  cap = Min(cap, kMaxMisfits);
  a->values = static_cast<double *>(repalloc(a->values, sizeof(double) * cap));
  a->cap = cap;
}

MisfitParams misfit_params(const MisfitAgg *a) { return MisfitParams{a->threshold, a->undefined, a->count}; }

void misfit_validate(const MisfitAgg *a) {
  guarded([&] {
    check_misfit_params(misfit_params(a));
    if (a->count > a->cap) throw Error(ErrorKind::BadState, "invalid misfit_summary state: bad count");
    check_misfit_values(a->values, a->count);
  });
}

// ---- moment_tensor_sum: fixed state -----------------------------------------------------

// In memory: the kind tag and the core's sums.
struct MomentAgg {
  StateTag tag;  // StateKind::MomentSum
  MomentAccum s;
};
static_assert(std::is_trivially_destructible<MomentAgg>::value, "palloc'd state");

MomentAgg *moment_new(MemoryContext ctx) {
  MomentAgg *a = static_cast<MomentAgg *>(MemoryContextAlloc(ctx, sizeof(MomentAgg)));
  a->tag = state_tag(StateKind::MomentSum);
  return a;
}

MomentAgg *moment_state(FunctionCallInfo fcinfo, int k, const char *fn) {
  return state_arg<MomentAgg>(fcinfo, k, fn, StateKind::MomentSum);
}

Datum moment_accum(FunctionCallInfo fcinfo, bool weighted) {
  MomentAgg *a = moment_state(fcinfo, 0, weighted ? "moment_tensor_sum_weighted_accum" : "moment_tensor_sum_accum");
  if (a == nullptr) {
    MemoryContext ctx = agg_context(fcinfo, "moment_tensor_sum_accum");
    a = moment_new(ctx);
    moment_init(a->s);
  }
  // A row without a mechanism, or (weighted) without a magnitude, is skipped.
  if (PG_ARGISNULL(1) || (weighted && PG_ARGISNULL(2))) PG_RETURN_POINTER(a);
  const FaultSlip f = *arg<FaultSlip>(fcinfo, 1);
  const double mw = weighted ? PG_GETARG_FLOAT8(2) : 0.0;
  guarded([&] { moment_add(a->s, f, weighted ? moment_from_magnitude(mw) : 1.0, weighted); });
  PG_RETURN_POINTER(a);
}

}  // namespace

// ---- stress_phases ------------------------------------------------------------------------

STRIAE_FUNCTION(stress_phases_accum) { return phases_accum(fcinfo, false); }
STRIAE_FUNCTION(stress_phases_starts_accum) { return phases_accum(fcinfo, true); }

namespace {

void *phase_read(MemoryContext ctx, const unsigned char *p, size_t len, const char *fn) {
  const PhaseParams h = guarded([&] { return read_phase_header(p, len, fn); });
  PhaseAgg *a = phase_new(ctx, h.phases, h.starts, h.seed, h.count);
  guarded([&] { read_phase_data(p, len, h, a->data, fn); });
  a->count = h.count;
  return a;
}

// Appends from's data to into (repalloc keeps into's data in its own context).
void *phase_combine_states(MemoryContext, void *into, void *from, const char *) {
  PhaseAgg *a = static_cast<PhaseAgg *>(into);
  const PhaseAgg *b = static_cast<const PhaseAgg *>(from);
  phase_validate(b);
  phase_validate(a);
  phase_same(a, b->phases, b->starts, b->seed);
  phase_reserve(a, a->count + b->count);
  if (b->count > 0) std::memcpy(a->data + a->count, b->data, sizeof(SlipDatum) * b->count);
  a->count += b->count;
  return a;
}

size_t phase_size(void *s, const char *) {
  const PhaseAgg *a = static_cast<const PhaseAgg *>(s);
  phase_validate(a);
  return phase_serial_size(a->count);
}

void phase_write(void *s, unsigned char *out, const char *) {
  const PhaseAgg *a = static_cast<const PhaseAgg *>(s);
  guarded([&] { write_phase_state(phase_params(a), a->data, out); });
}

}  // namespace

STRIAE_FUNCTION(stress_phases_combine) {
  MemoryContext ctx = agg_context(fcinfo, "stress_phases_combine");
  PhaseAgg *a = phase_state(fcinfo, 0, "stress_phases_combine");
  PhaseAgg *b = phase_state(fcinfo, 1, "stress_phases_combine");
  if (b == nullptr) {
    if (a == nullptr) PG_RETURN_NULL();
    PG_RETURN_POINTER(a);
  }
  if (a == nullptr) {
    phase_validate(b);
    a = phase_new(ctx, b->phases, b->starts, b->seed, b->count);
  }
  PG_RETURN_POINTER(phase_combine_states(ctx, a, b, "stress_phases_combine"));
}

STRIAE_FUNCTION(stress_phases_serialize) {
  agg_context(fcinfo, "stress_phases_serialize");
  PhaseAgg *a = phase_state(fcinfo, 0, "stress_phases_serialize");
  PG_RETURN_BYTEA_P(serialize_with(kPhaseOps, a, "stress_phases_serialize"));
}

STRIAE_FUNCTION(stress_phases_deserialize) {
  return deserialize_with(fcinfo, kPhaseOps, "stress_phases_deserialize");
}

// NULL for an empty group, fewer than 4 k data, or no eligible division (phases.hpp).
STRIAE_FUNCTION(stress_phases_final) {
  PhaseAgg *a = phase_state(fcinfo, 0, "stress_phases_final");
  if (a == nullptr) {
    check_empty_group_params(fcinfo);  // phases, seed and starts, as the first row would check them
    PG_RETURN_NULL();
  }
  if (a->count == 0) PG_RETURN_NULL();
  phase_validate(a);
  const Oid array_type = get_fn_expr_rettype(fcinfo->flinfo);
  const Oid elem_type = OidIsValid(array_type) ? get_element_type(array_type) : InvalidOid;
  if (!OidIsValid(elem_type))
    ereport(ERROR, (errcode(ERRCODE_FEATURE_NOT_SUPPORTED), errmsg("stress_phases_final: cannot determine the result type")));
  StressTensor *tensors = static_cast<StressTensor *>(palloc(sizeof(StressTensor) * kMaxPhases));
  int k = 0;
  const StressStatus st = guarded([&] {
    sort_slip_data(a->data, static_cast<size_t>(a->count));
    PhaseOptions o;
    o.phases = a->phases;
    o.starts = a->starts;
    o.seed = static_cast<uint64_t>(a->seed);
    std::vector<StressTensor> out;
    const StressStatus s = separate_phases(a->data, static_cast<size_t>(a->count), o, out);
    k = static_cast<int>(out.size());
    std::copy(out.begin(), out.end(), tensors);
    return s;
  });
  if (st != StressStatus::Ok) PG_RETURN_NULL();
  Datum *elems = static_cast<Datum *>(palloc(sizeof(Datum) * k));
  for (int i = 0; i < k; ++i) elems[i] = PointerGetDatum(&tensors[i]);
  PG_RETURN_ARRAYTYPE_P(construct_array(elems, k, elem_type, sizeof(StressTensor), false, TYPALIGN_DOUBLE));
}

// 1-based index of the best-fitting tensor; NULL for an empty array.
STRIAE_FUNCTION(stress_phase) {
  const FaultSlip f = *arg<FaultSlip>(fcinfo, 0);
  const Tensors ts = tensor_array(fcinfo, 1);
  if (ts.n == 0) PG_RETURN_NULL();
  const int j = guarded([&] {
    Vec3 n, u;
    fault_vectors(f, n, u);
    std::optional<double> m;
    return best_phase(n, u, ts.t, ts.n, m);
  });
  PG_RETURN_INT32(j + 1);
}

// ---- misfit_summary ------------------------------------------------------------------------

STRIAE_FUNCTION(misfit_summary_accum) {
  MemoryContext ctx = agg_context(fcinfo, "misfit_summary_accum");
  MisfitAgg *a = misfit_state(fcinfo, 0, "misfit_summary_accum");
  if (PG_ARGISNULL(3))
    ereport(ERROR, (errcode(ERRCODE_NULL_VALUE_NOT_ALLOWED), errmsg("misfit_summary threshold must not be NULL")));
  const double threshold = PG_GETARG_FLOAT8(3);
  if (a == nullptr) {
    guarded([&] { check_misfit_threshold(threshold); });
    a = misfit_new(ctx, threshold, 64);
  } else if (a->threshold != threshold) {
    ereport(ERROR, (errcode(ERRCODE_INVALID_PARAMETER_VALUE),
                    errmsg("misfit_summary threshold must be the same for every row of a group")));
  }
  if (PG_ARGISNULL(1) || PG_ARGISNULL(2)) PG_RETURN_POINTER(a);  // rows without a datum or tensor: skipped
  const FaultSlip f = *arg<FaultSlip>(fcinfo, 1);
  const StressTensor t = *arg<StressTensor>(fcinfo, 2);
  const std::optional<double> m = guarded([&] {
    check_stress_tensor(t);
    Vec3 n, u;
    fault_vectors(f, n, u);
    return misfit(n, u, t);
  });
  if (!m) {
    a->undefined += 1;
  } else {
    misfit_reserve(a, a->count + 1);
    a->values[a->count++] = *m;
  }
  PG_RETURN_POINTER(a);
}

namespace {

[[noreturn]] void misfit_threshold_mismatch() {
  ereport(ERROR, (errcode(ERRCODE_INVALID_PARAMETER_VALUE),
                  errmsg("misfit_summary threshold must be the same for every row of a group")));
  pg_unreachable();
}

void *misfit_read(MemoryContext ctx, const unsigned char *p, size_t len, const char *fn) {
  const MisfitParams h = guarded([&] { return read_misfit_header(p, len, fn); });
  MisfitAgg *a = misfit_new(ctx, h.threshold, h.count);
  guarded([&] { read_misfit_values(p, len, h, a->values, fn); });
  a->count = h.count;
  a->undefined = h.undefined;
  return a;
}

void *misfit_combine_states(MemoryContext, void *into, void *from, const char *) {
  MisfitAgg *a = static_cast<MisfitAgg *>(into);
  const MisfitAgg *b = static_cast<const MisfitAgg *>(from);
  misfit_validate(b);
  misfit_validate(a);
  if (a->threshold != b->threshold) misfit_threshold_mismatch();
  if (a->undefined > kMaxMisfitUndefined - b->undefined)
    ereport(ERROR, (errcode(ERRCODE_INVALID_PARAMETER_VALUE), errmsg("too many data for misfit_summary")));
  misfit_reserve(a, a->count + b->count);
  if (b->count > 0) std::memcpy(a->values + a->count, b->values, sizeof(double) * b->count);
  a->count += b->count;
  a->undefined += b->undefined;
  return a;
}

size_t misfit_size(void *s, const char *) {
  const MisfitAgg *a = static_cast<const MisfitAgg *>(s);
  misfit_validate(a);
  return misfit_serial_size(a->count);
}

void misfit_write(void *s, unsigned char *out, const char *) {
  const MisfitAgg *a = static_cast<const MisfitAgg *>(s);
  guarded([&] { write_misfit_state(misfit_params(a), a->values, out); });
}

}  // namespace

STRIAE_FUNCTION(misfit_summary_combine) {
  MemoryContext ctx = agg_context(fcinfo, "misfit_summary_combine");
  MisfitAgg *a = misfit_state(fcinfo, 0, "misfit_summary_combine");
  MisfitAgg *b = misfit_state(fcinfo, 1, "misfit_summary_combine");
  if (b == nullptr) {
    if (a == nullptr) PG_RETURN_NULL();
    PG_RETURN_POINTER(a);
  }
  if (a == nullptr) {
    misfit_validate(b);
    a = misfit_new(ctx, b->threshold, b->count);
  }
  PG_RETURN_POINTER(misfit_combine_states(ctx, a, b, "misfit_summary_combine"));
}

STRIAE_FUNCTION(misfit_summary_serialize) {
  agg_context(fcinfo, "misfit_summary_serialize");
  MisfitAgg *a = misfit_state(fcinfo, 0, "misfit_summary_serialize");
  PG_RETURN_BYTEA_P(serialize_with(kMisfitOps, a, "misfit_summary_serialize"));
}

STRIAE_FUNCTION(misfit_summary_deserialize) {
  return deserialize_with(fcinfo, kMisfitOps, "misfit_summary_deserialize");
}

// misfit_stats row: n, undefined, mean, median, above, threshold. NULL for an
// empty group; mean and median NULL when no misfit is defined.
STRIAE_FUNCTION(misfit_summary_final) {
  MisfitAgg *a = misfit_state(fcinfo, 0, "misfit_summary_final");
  if (a == nullptr) {
    check_empty_group_params(fcinfo);  // the threshold, as the first row would check it
    PG_RETURN_NULL();
  }
  if (a->count == 0 && a->undefined == 0) PG_RETURN_NULL();
  misfit_validate(a);
  MisfitSummary s{};
  const bool defined = guarded([&] {
    return summarise_misfits(a->values, static_cast<size_t>(a->count), a->undefined, a->threshold, s);
  });
  Datum v[6] = {Int64GetDatum(s.count), Int64GetDatum(s.undefined), Float8GetDatum(s.mean),
                Float8GetDatum(s.median), Int64GetDatum(s.above), Float8GetDatum(a->threshold)};
  bool nulls[6] = {false, false, !defined, !defined, false, false};
  return composite(fcinfo, v, nulls);
}

// ---- moment_tensor_sum -------------------------------------------------------------------

STRIAE_FUNCTION(moment_tensor_sum_accum) { return moment_accum(fcinfo, false); }
STRIAE_FUNCTION(moment_tensor_sum_weighted_accum) { return moment_accum(fcinfo, true); }

namespace {

void *moment_read(MemoryContext ctx, const unsigned char *p, size_t n, const char *fn) {
  MomentAgg *a = moment_new(ctx);
  guarded([&] { read_moment_state(p, n, a->s, fn); });
  return a;
}

void *moment_combine_states(MemoryContext, void *into, void *from, const char *) {
  MomentAgg *a = static_cast<MomentAgg *>(into);
  const MomentAgg *b = static_cast<const MomentAgg *>(from);
  guarded([&] {
    moment_validate(a->s);
    moment_validate(b->s);
    moment_combine(a->s, b->s);
  });
  return a;
}

size_t moment_size(void *, const char *) { return kMomentSerialSize; }

void moment_write(void *s, unsigned char *out, const char *) {
  const MomentAgg *a = static_cast<const MomentAgg *>(s);
  guarded([&] { write_moment_state(a->s, out); });
}

}  // namespace

STRIAE_FUNCTION(moment_tensor_sum_combine) {
  MemoryContext ctx = agg_context(fcinfo, "moment_tensor_sum_combine");
  MomentAgg *a = moment_state(fcinfo, 0, "moment_tensor_sum_combine");
  MomentAgg *b = moment_state(fcinfo, 1, "moment_tensor_sum_combine");
  if (b == nullptr) {
    if (a == nullptr) PG_RETURN_NULL();
    PG_RETURN_POINTER(a);
  }
  if (a == nullptr) {
    a = moment_new(ctx);
    a->s = b->s;
    guarded([&] { moment_validate(a->s); });
    PG_RETURN_POINTER(a);
  }
  PG_RETURN_POINTER(moment_combine_states(ctx, a, b, "moment_tensor_sum_combine"));
}

STRIAE_FUNCTION(moment_tensor_sum_serialize) {
  agg_context(fcinfo, "moment_tensor_sum_serialize");
  MomentAgg *a = moment_state(fcinfo, 0, "moment_tensor_sum_serialize");
  PG_RETURN_BYTEA_P(serialize_with(kMomentOps, a, "moment_tensor_sum_serialize"));
}

STRIAE_FUNCTION(moment_tensor_sum_deserialize) {
  return deserialize_with(fcinfo, kMomentOps, "moment_tensor_sum_deserialize");
}

// moment_summary row (60_analysis.sql); NULL for an empty group.
STRIAE_FUNCTION(moment_tensor_sum_final) {
  const MomentAgg *a = moment_state(fcinfo, 0, "moment_tensor_sum_final");
  if (a == nullptr) PG_RETURN_NULL();
  const MomentAccum *s = &a->s;
  MomentSummary m{};
  const bool any = guarded([&] { return moment_finalise(*s, m); });
  if (!any) PG_RETURN_NULL();
  const bool ax = m.has_axes;
  Datum v[12] = {Int64GetDatum(m.count),
                 ax ? float8_array(m.tensor, 6) : Datum(0),
                 ax ? result(m.p) : Datum(0),
                 ax ? result(m.b) : Datum(0),
                 ax ? result(m.t) : Datum(0),
                 ax ? result(m.best_dc) : Datum(0),
                 Float8GetDatum(m.epsilon),
                 Float8GetDatum(m.scalar_moment),
                 Float8GetDatum(m.moment_sum),
                 Float8GetDatum(m.consistency),
                 float8_array(m.summed, 6),
                 BoolGetDatum(m.weighted)};
  bool nulls[12] = {false, !ax, !ax, !ax, !ax, !ax, !ax, false, false, false, false, false};
  return composite(fcinfo, v, nulls);
}

// Kostrov strain rate from a moment_summary (its summed tensor in N m).
STRIAE_FUNCTION(kostrov_strain_rate) {
  HeapTupleHeader row = PG_GETARG_HEAPTUPLEHEADER(0);
  bool null_summed = true, null_weighted = true;
  const Datum summed = GetAttributeByName(row, "summed", &null_summed);
  const Datum weighted = GetAttributeByName(row, "weighted", &null_weighted);
  if (null_summed || null_weighted) PG_RETURN_NULL();
  if (!DatumGetBool(weighted))
    ereport(ERROR, (errcode(ERRCODE_INVALID_PARAMETER_VALUE),
                    errmsg("kostrov_strain_rate needs moments from magnitudes"),
                    errhint("Use moment_tensor_sum(mechanism, magnitude); the unweighted sum has no physical moment.")));
  ArrayType *arr = DatumGetArrayTypeP(summed);
  if (ARR_NDIM(arr) != 1 || ArrayGetNItems(ARR_NDIM(arr), ARR_DIMS(arr)) != 6 || ARR_HASNULL(arr) ||
      ARR_ELEMTYPE(arr) != FLOAT8OID)
    ereport(ERROR, (errcode(ERRCODE_DATA_EXCEPTION), errmsg("kostrov_strain_rate: summed must be 6 float8 values")));
  const double *c = reinterpret_cast<const double *>(ARR_DATA_PTR(arr));
  const double volume = PG_GETARG_FLOAT8(1), duration = PG_GETARG_FLOAT8(2), mu = PG_GETARG_FLOAT8(3);
  double out[6];
  guarded([&] {
    for (int i = 0; i < 6; ++i)
      if (!std::isfinite(c[i])) throw Error(ErrorKind::DataError, "summed moment tensor must be finite");
    kostrov_strain_rate(c, volume, duration, mu, out);
  });
  return float8_array(out, 6);
}

// ---- state operations (agg.hpp) ------------------------------------------------------

namespace striae_pg {
const StateOps kPhaseOps = {phase_read, phase_combine_states, phase_size, phase_write};
const StateOps kMisfitOps = {misfit_read, misfit_combine_states, misfit_size, misfit_write};
const StateOps kMomentOps = {moment_read, moment_combine_states, moment_size, moment_write};
}  // namespace striae_pg
