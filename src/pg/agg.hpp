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

}  // namespace striae_pg
