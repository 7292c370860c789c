// Aggregate-state helpers shared by the aggregate glue (stats.cpp, stress.cpp):
// fetching a state argument checked for its kind tag, and bytea results of
// the serialize functions. The tags and serialized forms are in
// src/core/agg_state.hpp.
#pragma once

#include "datum.hpp"
#include "../core/agg_state.hpp"

#include <initializer_list>

namespace striae_pg {

// Raise the BadState error of a state of the wrong kind (22000).
[[noreturn]] inline void wrong_state_kind(const void *s, const char *fn,
                                          std::initializer_list<striae::StateKind> accepted) {
  guarded([&] { striae::check_state_kind(s, fn, accepted); });
  pg_unreachable();
}

// State argument k: NULL, or a state tagged with kind (any other state is an
// error: a support function of another aggregate made it).
template <class T>
STRIAE_HOT T *state_arg(FunctionCallInfo fcinfo, int k, const char *fn, striae::StateKind kind) {
  if (PG_ARGISNULL(k)) return nullptr;
  T *s = reinterpret_cast<T *>(PG_GETARG_POINTER(k));
  if (!striae::state_is(s, kind)) wrong_state_kind(s, fn, {kind});
  return s;
}

// The same for a support function shared by several kinds; kind_out receives
// the kind found.
template <class T>
T *state_arg(FunctionCallInfo fcinfo, int k, const char *fn, std::initializer_list<striae::StateKind> kinds,
             striae::StateKind &kind_out) {
  if (PG_ARGISNULL(k)) return nullptr;
  T *s = reinterpret_cast<T *>(PG_GETARG_POINTER(k));
  kind_out = guarded([&] { return striae::check_state_kind(s, fn, kinds); });
  return s;
}

// A bytea of n payload bytes (palloc'd, header set); its payload is VARDATA.
inline bytea *bytea_alloc(size_t n) {
  bytea *out = static_cast<bytea *>(palloc(VARHDRSZ + n));
  SET_VARSIZE(out, VARHDRSZ + n);
  return out;
}

// Payload of a bytea argument (detoasted).
inline const unsigned char *bytea_bytes(bytea *b) { return reinterpret_cast<const unsigned char *>(VARDATA_ANY(b)); }

// ---- operations on one kind's in-memory state ------------------------------
//
// The body of each aggregate's combine, serialize and deserialize functions,
// shared with the two-phase aggregates (partial.cpp), which move states
// between servers as partial_state values. Each validates what it reads;
// none runs a C++ destructor over palloc'd memory.
struct StateOps {
  // A new state of the kind, allocated in ctx, from its serialized bytes
  // (validated as the deserialize function validates them).
  void *(*read)(MemoryContext ctx, const unsigned char *p, size_t n, const char *fn);
  // into += from, both non-NULL states of the kind (validated here). from is
  // not kept (it may be compacted in place). Returns the state that holds the
  // sum: into, or a new state allocated in ctx.
  void *(*combine)(MemoryContext ctx, void *into, void *from, const char *fn);
  // Size of the serialized state (may compact the state first), then the bytes.
  size_t (*serial_size)(void *s, const char *fn);
  void (*write)(void *s, unsigned char *out, const char *fn);
};

// Defined beside each aggregate (stats.cpp, stress.cpp, analysis.cpp).
extern const StateOps kFisherOps, kTensorOps, kDensityOps, kStressOps, kDihedraOps, kKeepOps, kPhaseOps,
    kMisfitOps, kMomentOps;

// The operations of a kind that partial_state values carry; nullptr for the
// others (figure layers, the merge state).
inline const StateOps *state_ops(striae::StateKind k) {
  using striae::StateKind;
  switch (k) {
    case StateKind::Fisher: return &kFisherOps;
    case StateKind::Tensor: return &kTensorOps;
    case StateKind::Density: return &kDensityOps;
    case StateKind::StressLinear: return &kStressOps;
    case StateKind::RightDihedra: return &kDihedraOps;
    case StateKind::KeepBootstrap:
    case StateKind::KeepFocal:
    case StateKind::KeepFocalBootstrap: return &kKeepOps;
    case StateKind::Phases: return &kPhaseOps;
    case StateKind::MisfitSummary: return &kMisfitOps;
    case StateKind::MomentSum: return &kMomentOps;
    default: return nullptr;
  }
}

// A serialize function's result: a bytea of the state's serialized bytes.
inline bytea *serialize_with(const StateOps &ops, void *s, const char *fn) {
  const size_t n = ops.serial_size(s, fn);
  bytea *out = bytea_alloc(n);
  ops.write(s, reinterpret_cast<unsigned char *>(VARDATA(out)), fn);
  return out;
}

// A deserialize function's result: the state read from a bytea argument, in
// the aggregate context.
inline Datum deserialize_with(FunctionCallInfo fcinfo, const StateOps &ops, const char *fn) {
  MemoryContext ctx = agg_context(fcinfo, fn);
  bytea *in = PG_GETARG_BYTEA_PP(0);
  PG_RETURN_POINTER(ops.read(ctx, bytea_bytes(in), VARSIZE_ANY_EXHDR(in), fn));
}

}  // namespace striae_pg
