// Two-phase aggregation (src/core/partial.hpp): the partial_state type (text
// and binary I/O, validated), the final functions of the *_partial aggregates
// (a state as a partial_state value), and the merge aggregates over
// partial_state values: X(partial_state) for every aggregate X that has a
// partial form, and merge_partial(partial_state) -> partial_state.
//
// A merge aggregate's state is a MergeAgg: the description of the group's
// first partial (kind, input, parameters) and the state of that kind, read
// with the kind's own deserialize code and merged with its own combine code
// (agg.hpp, StateOps). Its final function hands that state to the kind's own
// final function (fisher_final, stress_inversion_final, ...), so a merge of
// partials returns what the one-phase aggregate returns for the same rows.
#include "agg.hpp"

#include "../core/partial.hpp"

#include <cstdio>

using namespace striae;
using namespace striae_pg;

// The final functions of the one-phase aggregates (stats.cpp, stress.cpp,
// analysis.cpp), called by the merge aggregates' final functions.
extern "C" {
Datum fisher_final(PG_FUNCTION_ARGS);
Datum tensor_final(PG_FUNCTION_ARGS);
Datum mean_plane_final(PG_FUNCTION_ARGS);
Datum fold_axis_final(PG_FUNCTION_ARGS);
Datum density_final(PG_FUNCTION_ARGS);
Datum stress_inversion_final(PG_FUNCTION_ARGS);
Datum stress_bootstrap_final(PG_FUNCTION_ARGS);
Datum right_dihedra_final(PG_FUNCTION_ARGS);
Datum focal_stress_inversion_final(PG_FUNCTION_ARGS);
Datum stress_phases_final(PG_FUNCTION_ARGS);
Datum misfit_summary_final(PG_FUNCTION_ARGS);
Datum moment_tensor_sum_final(PG_FUNCTION_ARGS);
}

namespace {

// The bytes of a partial_state argument (detoasted).
struct Bytes {
  const unsigned char *p;
  size_t n;
};
Bytes partial_arg(FunctionCallInfo fcinfo, int k) {
  struct varlena *v = PG_GETARG_VARLENA_PP(k);
  return Bytes{reinterpret_cast<const unsigned char *>(VARDATA_ANY(v)), VARSIZE_ANY_EXHDR(v)};
}

// A new partial_state value of kind k and input in holding the state s
// (serialized with the kind's own code).
Datum partial_value(StateKind k, PartialInput in, const StateOps &ops, void *s, const char *fn) {
  const size_t n = ops.serial_size(s, fn);
  bytea *v = bytea_alloc(kPartialHeader + n);
  unsigned char *p = reinterpret_cast<unsigned char *>(VARDATA(v));
  guarded([&] { write_partial_header(k, in, p); });
  ops.write(s, p + kPartialHeader, fn);
  PG_RETURN_POINTER(v);
}

const StateOps &ops_of(StateKind k) {
  const StateOps *ops = state_ops(k);
  if (ops == nullptr)  // read_partial_info admits only kinds with operations
    ereport(ERROR, (errcode(ERRCODE_DATA_EXCEPTION), errmsg("partial_state of an unknown kind")));
  return *ops;
}

}  // namespace

// ---- type I/O ------------------------------------------------------------------------

STRIAE_FUNCTION(partial_state_in) {
  const char *s = PG_GETARG_CSTRING(0);
  const PartialText t = guarded([&] { return scan_partial_text(s); });
  bytea *v = bytea_alloc(t.size);
  unsigned char *p = reinterpret_cast<unsigned char *>(VARDATA(v));
  guarded([&] { decode_partial_text(s, t, p); });
  PG_RETURN_POINTER(v);
}

STRIAE_FUNCTION(partial_state_out) {
  const Bytes b = partial_arg(fcinfo, 0);
  const size_t n = guarded([&] {
    read_partial_info(b.p, b.n, "partial_state_out");
    return partial_text_size(b.p, b.n);
  });
  char *out = static_cast<char *>(palloc(n + 1));
  guarded([&] { write_partial_text(b.p, b.n, out); });
  PG_RETURN_CSTRING(out);
}

// Binary form: the value's bytes as they are (partial.hpp: a little-endian
// header and the serialized state), validated like the text form.
STRIAE_FUNCTION(partial_state_recv) {
  StringInfo buf = reinterpret_cast<StringInfo>(PG_GETARG_POINTER(0));
  const int n = buf->len - buf->cursor;
  const char *src = pq_getmsgbytes(buf, n);
  bytea *v = bytea_alloc(static_cast<size_t>(n));
  std::memcpy(VARDATA(v), src, static_cast<size_t>(n));
  const unsigned char *p = reinterpret_cast<const unsigned char *>(VARDATA(v));
  guarded([&] { check_partial_binary(p, static_cast<size_t>(n)); });
  PG_RETURN_POINTER(v);
}

STRIAE_FUNCTION(partial_state_send) {
  const Bytes b = partial_arg(fcinfo, 0);
  guarded([&] { read_partial_info(b.p, b.n, "partial_state_send"); });
  StringInfoData buf;
  pq_begintypsend(&buf);
  pq_sendbytes(&buf, reinterpret_cast<const char *>(b.p), static_cast<int>(b.n));
  PG_RETURN_BYTEA_P(pq_endtypsend(&buf));
}

// "stress_inversion/fault_slip": the aggregate that made the partial and its input type.
STRIAE_FUNCTION(partial_kind) {
  const Bytes b = partial_arg(fcinfo, 0);
  const PartialInfo info = guarded([&] { return read_partial_info(b.p, b.n, "partial_kind"); });
  char label[96];
  guarded([&] {
    const std::string l = partial_label(info.kind, info.input);
    snprintf(label, sizeof label, "%s", l.c_str());
  });
  return text_result(label);
}

// The number of data (non-NULL rows) the partial summarises.
STRIAE_FUNCTION(partial_count) {
  const Bytes b = partial_arg(fcinfo, 0);
  PG_RETURN_INT64(guarded([&] { return read_partial_info(b.p, b.n, "partial_count").count; }));
}

// ---- the *_partial aggregates' final functions ---------------------------------------
//
// One per input type (the state does not say whether its rows were planes or
// lineations); the kind comes from the state's tag. NULL for an empty group,
// as the one-phase final functions; a group of only NULL rows gives a partial
// of no data, which merges as nothing.

namespace {

Datum partial_final(FunctionCallInfo fcinfo, PartialInput in, const char *fn) {
  StateKind k;
  void *s;
  if (in == PartialInput::FaultSlip)
    s = state_arg<void>(fcinfo, 0, fn,
                        {StateKind::StressLinear, StateKind::RightDihedra, StateKind::KeepBootstrap,
                         StateKind::KeepFocal, StateKind::KeepFocalBootstrap, StateKind::Phases,
                         StateKind::MisfitSummary, StateKind::MomentSum},
                        k);
  else
    s = state_arg<void>(fcinfo, 0, fn, {StateKind::Fisher, StateKind::Tensor, StateKind::Density}, k);
  if (s == nullptr) {
    check_empty_group_params(fcinfo);  // as the one-phase final functions do
    PG_RETURN_NULL();
  }
  return partial_value(k, in, ops_of(k), s, fn);
}

}  // namespace

STRIAE_FUNCTION(partial_final_lineation) {
  return partial_final(fcinfo, PartialInput::Lineation, "partial_final_lineation");
}
STRIAE_FUNCTION(partial_final_plane) { return partial_final(fcinfo, PartialInput::Plane, "partial_final_plane"); }
STRIAE_FUNCTION(partial_final_fault_slip) {
  return partial_final(fcinfo, PartialInput::FaultSlip, "partial_final_fault_slip");
}

// ---- merge aggregates -------------------------------------------------------------------

namespace {

struct MergeAgg {
  StateTag tag;      // StateKind::PartialMerge
  PartialInfo info;  // the group's partials so far, merged (merge_partial_info)
  void *inner;       // the state of info.kind, in the aggregate context
  char name[72];     // the aggregate, for messages: "fisher_mean(partial_state)"
};
static_assert(std::is_trivially_destructible<MergeAgg>::value, "palloc'd state");

// "<aggregate>(partial_state)" of the aggregate this support function serves
// (PostgreSQL tells only plain aggregate calls, not window calls).
void merge_name(FunctionCallInfo fcinfo, char *out, size_t cap) {
  Aggref *ref = AggGetAggref(fcinfo);
  const char *n = ref != nullptr ? get_func_name(ref->aggfnoid) : nullptr;
  if (n != nullptr) snprintf(out, cap, "%s(partial_state)", n);
  else snprintf(out, cap, "merge of partial_state values");
}

MergeAgg *merge_new(MemoryContext ctx, const PartialInfo &info, void *inner, const char *name) {
  MergeAgg *m = static_cast<MergeAgg *>(MemoryContextAlloc(ctx, sizeof(MergeAgg)));
  m->tag = state_tag(StateKind::PartialMerge);
  m->info = info;
  m->inner = inner;
  snprintf(m->name, sizeof m->name, "%s", name);
  return m;
}

MergeAgg *merge_state(FunctionCallInfo fcinfo, int k, const char *fn) {
  return state_arg<MergeAgg>(fcinfo, k, fn, StateKind::PartialMerge);
}

// Calls a one-phase final function on the merged state, with this call's
// flinfo (the declared result type is the same) and aggregate context.
Datum call_final(FunctionCallInfo fcinfo, PGFunction final, void *inner) {
  LOCAL_FCINFO(fc, 1);
  InitFunctionCallInfoData(*fc, fcinfo->flinfo, 1, fcinfo->fncollation, fcinfo->context, fcinfo->resultinfo);
  fc->args[0].value = PointerGetDatum(inner);
  fc->args[0].isnull = false;
  const Datum r = final(fc);
  fcinfo->isnull = fc->isnull;
  return r;
}

struct FinalOf {
  StateKind kind;
  PGFunction final;
};

// The final function of merge aggregate `name`: the group's partials must be
// of one of the kinds it finalises (and, when planes_only, made from planes).
// maker names the partial aggregates for the message.
Datum merge_final(FunctionCallInfo fcinfo, const char *name, const char *maker, std::initializer_list<FinalOf> finals,
                  bool planes_only = false) {
  MergeAgg *m = merge_state(fcinfo, 0, name);
  if (m == nullptr) PG_RETURN_NULL();
  for (const FinalOf &f : finals) {
    if (f.kind != m->info.kind) continue;
    if (planes_only && m->info.input != PartialInput::Plane)
      ereport(ERROR, (errcode(ERRCODE_INVALID_PARAMETER_VALUE),
                      errmsg("%s takes partials of planes", name),
                      errdetail("These partials were made from %s rows.", partial_input_name(m->info.input)),
                      errhint("Make them with %s(plane).", maker)));
    return call_final(fcinfo, f.final, m->inner);
  }
  char label[96];
  guarded([&] {
    snprintf(label, sizeof label, "%s", partial_label(m->info.kind, m->info.input).c_str());
  });
  ereport(ERROR, (errcode(ERRCODE_INVALID_PARAMETER_VALUE), errmsg("%s cannot finish %s partials", name, label),
                  errdetail("%s merges the partials made by %s.", name, maker),
                  errhint("partial_kind(partial_state) says which aggregate made a partial.")));
  pg_unreachable();
}

}  // namespace

// Transition of every merge aggregate: the first partial of a group becomes
// the state; each further one must match it (kind, input, parameters) and is
// read into per-row memory and combined into the state.
STRIAE_FUNCTION(partial_merge_accum) {
  MergeAgg *m = merge_state(fcinfo, 0, "partial_merge_accum");
  if (PG_ARGISNULL(1)) {  // a NULL partial (an empty group's) adds nothing
    if (m == nullptr) PG_RETURN_NULL();
    PG_RETURN_POINTER(m);
  }
  MemoryContext ctx = agg_context(fcinfo, "partial_merge_accum");
  char first_name[72];
  const char *name = m != nullptr ? m->name : first_name;
  if (m == nullptr) merge_name(fcinfo, first_name, sizeof first_name);
  const Bytes b = partial_arg(fcinfo, 1);
  const PartialInfo info = guarded([&] { return read_partial_info(b.p, b.n, name); });
  const StateOps &ops = ops_of(info.kind);
  if (m == nullptr) {
    void *inner = ops.read(ctx, b.p + kPartialHeader, b.n - kPartialHeader, name);
    PG_RETURN_POINTER(merge_new(ctx, info, inner, name));
  }
  const PartialInfo merged = guarded([&] { return merge_partial_info(m->info, info, name); });
  void *from = ops.read(CurrentMemoryContext, b.p + kPartialHeader, b.n - kPartialHeader, name);
  m->inner = ops.combine(ctx, m->inner, from, name);
  m->info = merged;
  PG_RETURN_POINTER(m);
}

STRIAE_FUNCTION(partial_merge_combine) {
  MemoryContext ctx = agg_context(fcinfo, "partial_merge_combine");
  MergeAgg *a = merge_state(fcinfo, 0, "partial_merge_combine");
  MergeAgg *b = merge_state(fcinfo, 1, "partial_merge_combine");
  if (b == nullptr) {
    if (a == nullptr) PG_RETURN_NULL();
    PG_RETURN_POINTER(a);
  }
  if (a == nullptr) PG_RETURN_POINTER(b);  // made by partial_merge_deserialize in this context
  const PartialInfo merged = guarded([&] { return merge_partial_info(a->info, b->info, a->name); });
  a->inner = ops_of(a->info.kind).combine(ctx, a->inner, b->inner, a->name);
  a->info = merged;
  PG_RETURN_POINTER(a);
}

// Serialized, a merge state is the partial_state value of what it holds.
STRIAE_FUNCTION(partial_merge_serialize) {
  agg_context(fcinfo, "partial_merge_serialize");
  MergeAgg *m = merge_state(fcinfo, 0, "partial_merge_serialize");
  return partial_value(m->info.kind, m->info.input, ops_of(m->info.kind), m->inner, "partial_merge_serialize");
}

STRIAE_FUNCTION(partial_merge_deserialize) {
  MemoryContext ctx = agg_context(fcinfo, "partial_merge_deserialize");
  bytea *in = PG_GETARG_BYTEA_PP(0);
  const unsigned char *p = bytea_bytes(in);
  const size_t n = VARSIZE_ANY_EXHDR(in);
  const PartialInfo info = guarded([&] { return read_partial_info(p, n, "partial_merge_deserialize"); });
  void *inner = ops_of(info.kind).read(ctx, p + kPartialHeader, n - kPartialHeader, "partial_merge_deserialize");
  char name[72];
  merge_name(fcinfo, name, sizeof name);
  PG_RETURN_POINTER(merge_new(ctx, info, inner, name));
}

// merge_partial: the group's partials merged into one partial (hierarchical merging).
STRIAE_FUNCTION(merge_partial_final) {
  MergeAgg *m = merge_state(fcinfo, 0, "merge_partial_final");
  if (m == nullptr) PG_RETURN_NULL();
  return partial_value(m->info.kind, m->info.input, ops_of(m->info.kind), m->inner, "merge_partial_final");
}

STRIAE_FUNCTION(fisher_mean_merge_final) {
  return merge_final(fcinfo, "fisher_mean(partial_state)", "fisher_mean_partial", {{StateKind::Fisher, fisher_final}});
}
STRIAE_FUNCTION(orientation_tensor_merge_final) {
  return merge_final(fcinfo, "orientation_tensor(partial_state)",
                     "orientation_tensor_partial, mean_plane_partial and fold_axis_partial",
                     {{StateKind::Tensor, tensor_final}});
}
STRIAE_FUNCTION(mean_plane_merge_final) {
  return merge_final(fcinfo, "mean_plane(partial_state)", "mean_plane_partial",
                     {{StateKind::Tensor, mean_plane_final}}, true);
}
STRIAE_FUNCTION(fold_axis_merge_final) {
  return merge_final(fcinfo, "fold_axis(partial_state)", "fold_axis_partial", {{StateKind::Tensor, fold_axis_final}},
                     true);
}
STRIAE_FUNCTION(density_grid_merge_final) {
  return merge_final(fcinfo, "density_grid(partial_state)", "density_grid_partial",
                     {{StateKind::Density, density_final}});
}
STRIAE_FUNCTION(stress_inversion_merge_final) {
  return merge_final(fcinfo, "stress_inversion(partial_state)", "stress_inversion_partial",
                     {{StateKind::StressLinear, stress_inversion_final},
                      {StateKind::KeepBootstrap, stress_bootstrap_final}});
}
STRIAE_FUNCTION(right_dihedra_merge_final) {
  return merge_final(fcinfo, "right_dihedra(partial_state)", "right_dihedra_partial",
                     {{StateKind::RightDihedra, right_dihedra_final}});
}
STRIAE_FUNCTION(focal_stress_inversion_merge_final) {
  return merge_final(fcinfo, "focal_stress_inversion(partial_state)", "focal_stress_inversion_partial",
                     {{StateKind::KeepFocal, focal_stress_inversion_final},
                      {StateKind::KeepFocalBootstrap, focal_stress_inversion_final}});
}
STRIAE_FUNCTION(stress_phases_merge_final) {
  return merge_final(fcinfo, "stress_phases(partial_state)", "stress_phases_partial",
                     {{StateKind::Phases, stress_phases_final}});
}
STRIAE_FUNCTION(misfit_summary_merge_final) {
  return merge_final(fcinfo, "misfit_summary(partial_state)", "misfit_summary_partial",
                     {{StateKind::MisfitSummary, misfit_summary_final}});
}
STRIAE_FUNCTION(moment_tensor_sum_merge_final) {
  return merge_final(fcinfo, "moment_tensor_sum(partial_state)", "moment_tensor_sum_partial",
                     {{StateKind::MomentSum, moment_tensor_sum_final}});
}
