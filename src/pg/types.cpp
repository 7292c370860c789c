// I/O and comparison support for the fixed-size types plane, lineation and
// fault_slip: text in/out, binary send/recv, exact = <> < <= > >= and hashing.
#include "datum.hpp"
#include "../core/parse.hpp"

using namespace striae;
using namespace striae_pg;

namespace {

// Wire format of send/recv: one version byte, then the float8 fields.
constexpr int kWireVersion = 1;

template <class T> struct Traits;
template <> struct Traits<Plane> {
  static constexpr int n = 2;
  static constexpr const char *name = "plane";
  static Plane parse(const char *s) { return parse_plane(s); }
  static Plane make(const double *v) { return make_plane(v[0], v[1]); }
};
template <> struct Traits<Line> {
  static constexpr int n = 2;
  static constexpr const char *name = "lineation";
  static Line parse(const char *s) { return parse_line(s); }
  static Line make(const double *v) { return make_line(v[0], v[1]); }
};
template <> struct Traits<FaultSlip> {
  static constexpr int n = 3;
  static constexpr const char *name = "fault_slip";
  static FaultSlip parse(const char *s) { return parse_fault_slip(s); }
  static FaultSlip make(const double *v) { return make_fault_slip(v[0], v[1], v[2]); }
};

template <class T>
const double *fields(const T *p) {
  static_assert(sizeof(T) == Traits<T>::n * sizeof(double), "types are packed float8 fields");
  return reinterpret_cast<const double *>(p);
}

template <class T>
Datum do_in(FunctionCallInfo fcinfo) {
  const char *s = PG_GETARG_CSTRING(0);
  T v = guarded([&] { return Traits<T>::parse(s); });
  return result(v);
}

template <class T>
Datum do_out(FunctionCallInfo fcinfo) {
  PG_RETURN_CSTRING(format_numbers(fields(arg<T>(fcinfo, 0)), Traits<T>::n));
}

template <class T>
Datum do_recv(FunctionCallInfo fcinfo) {
  StringInfo buf = reinterpret_cast<StringInfo>(PG_GETARG_POINTER(0));
  const int version = pq_getmsgbyte(buf);
  if (version != kWireVersion)
    ereport(ERROR, (errcode(ERRCODE_INVALID_BINARY_REPRESENTATION),
                    errmsg("invalid binary format version %d for type %s", version, Traits<T>::name),
                    errdetail("This build reads version %d.", kWireVersion)));
  double v[3];
  for (int i = 0; i < Traits<T>::n; ++i) v[i] = pq_getmsgfloat8(buf);
  T out = guarded([&] { return Traits<T>::make(v); });
  return result(out);
}

template <class T>
Datum do_send(FunctionCallInfo fcinfo) {
  const double *v = fields(arg<T>(fcinfo, 0));
  StringInfoData buf;
  pq_begintypsend(&buf);
  pq_sendbyte(&buf, kWireVersion);
  for (int i = 0; i < Traits<T>::n; ++i) pq_sendfloat8(&buf, v[i]);
  PG_RETURN_BYTEA_P(pq_endtypsend(&buf));
}

// Lexicographic order over the canonical fields: a total order because values
// are canonical and finite, so btree and hash opclasses agree with '='.
template <class T>
int compare(FunctionCallInfo fcinfo) {
  const double *a = fields(arg<T>(fcinfo, 0)), *b = fields(arg<T>(fcinfo, 1));
  for (int i = 0; i < Traits<T>::n; ++i) {
    if (a[i] < b[i]) return -1;
    if (a[i] > b[i]) return 1;
  }
  return 0;
}

template <class T>
Datum do_hash(FunctionCallInfo fcinfo) {
  return hash_any(reinterpret_cast<const unsigned char *>(arg<T>(fcinfo, 0)), sizeof(T));
}

template <class T>
Datum do_hash_extended(FunctionCallInfo fcinfo) {
  return hash_any_extended(reinterpret_cast<const unsigned char *>(arg<T>(fcinfo, 0)), sizeof(T),
                           PG_GETARG_INT64(1));
}

}  // namespace

#define STRIAE_TYPE_SUPPORT(sql, T)                                                   \
  STRIAE_FUNCTION(sql##_in) { return do_in<T>(fcinfo); }                               \
  STRIAE_FUNCTION(sql##_out) { return do_out<T>(fcinfo); }                             \
  STRIAE_FUNCTION(sql##_recv) { return do_recv<T>(fcinfo); }                           \
  STRIAE_FUNCTION(sql##_send) { return do_send<T>(fcinfo); }                           \
  STRIAE_FUNCTION(sql##_cmp) { PG_RETURN_INT32(compare<T>(fcinfo)); }                  \
  STRIAE_FUNCTION(sql##_eq) { PG_RETURN_BOOL(compare<T>(fcinfo) == 0); }               \
  STRIAE_FUNCTION(sql##_ne) { PG_RETURN_BOOL(compare<T>(fcinfo) != 0); }               \
  STRIAE_FUNCTION(sql##_lt) { PG_RETURN_BOOL(compare<T>(fcinfo) < 0); }                \
  STRIAE_FUNCTION(sql##_le) { PG_RETURN_BOOL(compare<T>(fcinfo) <= 0); }               \
  STRIAE_FUNCTION(sql##_gt) { PG_RETURN_BOOL(compare<T>(fcinfo) > 0); }                \
  STRIAE_FUNCTION(sql##_ge) { PG_RETURN_BOOL(compare<T>(fcinfo) >= 0); }               \
  STRIAE_FUNCTION(sql##_hash) { return do_hash<T>(fcinfo); }                           \
  STRIAE_FUNCTION(sql##_hash_extended) { return do_hash_extended<T>(fcinfo); }

STRIAE_TYPE_SUPPORT(plane, Plane)
STRIAE_TYPE_SUPPORT(lineation, Line)
STRIAE_TYPE_SUPPORT(fault_slip, FaultSlip)

extern "C" {
PG_MODULE_MAGIC;

void _PG_init(void);
// Library load: give src/core its cancellation hook.
void _PG_init(void) { striae::interrupt_hook = striae_pg::interrupt_pending; }
}
