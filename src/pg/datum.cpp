// Shared glue helpers: text formatting and array construction.
#include "datum.hpp"

namespace striae_pg {

char *format_numbers(const double *v, int n) {
  char *parts[8];
  size_t len = 0;
  for (int i = 0; i < n; ++i) {
    parts[i] = float8out_internal(v[i]);
    len += std::strlen(parts[i]) + 1;
  }
  char *out = static_cast<char *>(palloc(len));
  char *p = out;
  for (int i = 0; i < n; ++i) {
    size_t l = std::strlen(parts[i]);
    std::memcpy(p, parts[i], l);
    p += l;
    *p++ = i + 1 < n ? '/' : '\0';
    pfree(parts[i]);
  }
  return out;
}

const char *echo_arg(const char *s) {
  const int len = static_cast<int>(strnlen(s, striae::kEchoBytes + 1));
  if (len <= static_cast<int>(striae::kEchoBytes)) return pstrdup(s);
  const int keep = pg_mbcliplen(s, len, static_cast<int>(striae::kEchoBytes));
  return psprintf("%.*s...", keep, s);
}

MemoryContext agg_context(FunctionCallInfo fcinfo, const char *fn) {
  MemoryContext ctx;
  if (!AggCheckCallContext(fcinfo, &ctx))
    ereport(ERROR, (errcode(ERRCODE_FEATURE_NOT_SUPPORTED),
                    errmsg("%s called in non-aggregate context", fn)));
  return ctx;
}

bool agg_param(FunctionCallInfo fcinfo, int k, Datum &value, bool &isnull) {
  const Aggref *ref = AggGetAggref(fcinfo);
  if (ref == nullptr || k < 0 || k >= list_length(ref->args)) return false;
  const TargetEntry *te = static_cast<const TargetEntry *>(list_nth(ref->args, k));
  if (te == nullptr || !IsA(te->expr, Const)) return false;
  const Const *c = reinterpret_cast<const Const *>(te->expr);
  value = c->constvalue;
  isnull = c->constisnull;
  return true;
}

Datum float8_array(const double *v, int n) {
  Datum *elems = static_cast<Datum *>(palloc(sizeof(Datum) * n));
  for (int i = 0; i < n; ++i) elems[i] = Float8GetDatum(v[i]);
  ArrayType *a = construct_array(elems, n, FLOAT8OID, sizeof(float8), FLOAT8PASSBYVAL, TYPALIGN_DOUBLE);
  return PointerGetDatum(a);
}

}  // namespace striae_pg
