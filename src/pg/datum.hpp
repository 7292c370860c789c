// Small helpers shared by the glue files: argument access, result packing and
// float8-convention text output.
#pragma once

#include "guard.hpp"
#include "../core/orientation.hpp"

namespace striae_pg {

// Fixed-size pass-by-reference types are never toasted: the pointer is the value.
template <class T>
inline const T *arg(FunctionCallInfo fcinfo, int n) {
  return reinterpret_cast<const T *>(PG_GETARG_POINTER(n));
}

template <class T>
inline Datum result(const T &v) {
  T *p = static_cast<T *>(palloc(sizeof(T)));
  *p = v;
  return PointerGetDatum(p);
}

// "a/b[/c]" with each number printed by float8out_internal, so output follows
// float8's conventions (shortest round-trip, or rounding when
// extra_float_digits <= 0).
char *format_numbers(const double *v, int n);

// A user argument as an error message quotes it: at most striae::kEchoBytes
// bytes, cut at a character boundary of the database encoding, "..." when cut
// (DEVELOPERS.md, "Errors"). palloc'd.
const char *echo_arg(const char *s);

// Text datum from a C string.
inline Datum text_result(const char *s) { return PointerGetDatum(cstring_to_text(s)); }

// The aggregate memory context, or an error if fn is not called as an aggregate
// support function (a user calling it directly from SQL).
MemoryContext agg_context(FunctionCallInfo fcinfo, const char *fn);

// Parameters of an aggregate over an empty group (DEVELOPERS.md, "Aggregates").
// With no rows the transition function never runs, so the final function
// checks the parameters itself: agg_param reads argument k (0-based, among the
// aggregate's own arguments) of the aggregate call being finalised when the
// planner has made it a constant (a literal, or a bound parameter of a custom
// plan): returns true and sets value and isnull. Returns false when the
// argument is not a constant (e.g. a column: over no rows it has no value) or
// the call is not known.
bool agg_param(FunctionCallInfo fcinfo, int k, Datum &value, bool &isnull);

// For a final function over an empty group (NULL state): checks the constant
// parameters of the aggregate being finalised, one-phase or *_partial, with
// the errors its transition function gives on a first row (src/pg/params.cpp).
void check_empty_group_params(FunctionCallInfo fcinfo);

// A float8[] of n values.
Datum float8_array(const double *v, int n);

}  // namespace striae_pg
