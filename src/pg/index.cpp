// The cone type (lineations or planes within a half-angle of an axis), its
// containment operators <@, and the GiST operator classes on lineation and
// plane that serve "x <@ cone(v, d)" and "ORDER BY x <-> v" (nearest first).
// All geometry is in src/core/cone.*: keys are cones of axes, leaf keys keep
// the exact indexed value, so leaf tests and distances are the operators' own
// and no recheck is needed (cone.hpp explains why the bounds are exact).
#include "datum.hpp"

#include "../core/cone.hpp"

extern "C" {
#include "access/gist.h"
#include "access/stratnum.h"
#include "utils/sortsupport.h"
}

using namespace striae;
using namespace striae_pg;

namespace {

constexpr int kConeWireVersion = 1;
constexpr StrategyNumber kContainedStrategy = RTContainedByStrategyNumber;  // <@ cone
constexpr StrategyNumber kDistanceStrategy = 15;                            // <-> (ordering)

inline const Cone *cone_datum(Datum d) { return reinterpret_cast<const Cone *>(DatumGetPointer(d)); }

Datum cone_copy(const Cone &c) { return result(c); }

}  // namespace

// ---- the type -----------------------------------------------------------------

STRIAE_FUNCTION(cone_in) {
  const char *s = PG_GETARG_CSTRING(0);
  return result(guarded([&] { return parse_cone(s); }));
}

STRIAE_FUNCTION(cone_out) {
  const Cone *c = arg<Cone>(fcinfo, 0);
  const double axis[2] = {c->a, c->b};
  char *ax = format_numbers(axis, 2);
  char *r = float8out_internal(c->radius);
  const char *kind = c->kind == static_cast<int32>(ConeKind::Plane)    ? "plane"
                     : c->kind == static_cast<int32>(ConeKind::Region) ? "region"
                                                                         : "line";
  PG_RETURN_CSTRING(psprintf("%s %s within %s", kind, ax, r));
}

STRIAE_FUNCTION(cone_recv) {
  StringInfo buf = reinterpret_cast<StringInfo>(PG_GETARG_POINTER(0));
  const int version = pq_getmsgbyte(buf);
  if (version != kConeWireVersion)
    ereport(ERROR, (errcode(ERRCODE_INVALID_BINARY_REPRESENTATION),
                    errmsg("invalid binary format version %d for type cone", version),
                    errdetail("This build reads version %d.", kConeWireVersion)));
  const int32 kind = pq_getmsgint(buf, 4);
  const double a = pq_getmsgfloat8(buf), b = pq_getmsgfloat8(buf), r = pq_getmsgfloat8(buf);
  return result(guarded([&] {
    Cone c;
    if (kind == static_cast<int32>(ConeKind::Plane)) {
      c = make_cone(make_plane(a, b), r);
    } else {
      c = make_cone(make_line(a, b), r);
      if (kind == static_cast<int32>(ConeKind::Region)) c.kind = kind;
      else if (kind != static_cast<int32>(ConeKind::Line))
        throw Error(ErrorKind::DataError, "invalid cone value: unknown kind");
    }
    check_cone(c);
    return c;
  }));
}

STRIAE_FUNCTION(cone_send) {
  const Cone *c = arg<Cone>(fcinfo, 0);
  StringInfoData buf;
  pq_begintypsend(&buf);
  pq_sendbyte(&buf, kConeWireVersion);
  pq_sendint32(&buf, c->kind);
  pq_sendfloat8(&buf, c->a);
  pq_sendfloat8(&buf, c->b);
  pq_sendfloat8(&buf, c->radius);
  PG_RETURN_BYTEA_P(pq_endtypsend(&buf));
}

STRIAE_FUNCTION(cone_from_lineation) {
  const Line l = *arg<Line>(fcinfo, 0);
  const double r = PG_GETARG_FLOAT8(1);
  return result(guarded([&] { return make_cone(l, r); }));
}

STRIAE_FUNCTION(cone_from_plane) {
  const Plane p = *arg<Plane>(fcinfo, 0);
  const double r = PG_GETARG_FLOAT8(1);
  return result(guarded([&] { return make_cone(p, r); }));
}

STRIAE_FUNCTION(cone_half_angle) { PG_RETURN_FLOAT8(arg<Cone>(fcinfo, 0)->radius); }

STRIAE_FUNCTION(lineation_in_cone) {
  const Line l = *arg<Line>(fcinfo, 0);
  const Cone c = *arg<Cone>(fcinfo, 1);
  PG_RETURN_BOOL(guarded([&] { return cone_contains(c, l); }));
}

STRIAE_FUNCTION(plane_in_cone) {
  const Plane p = *arg<Plane>(fcinfo, 0);
  const Cone c = *arg<Cone>(fcinfo, 1);
  PG_RETURN_BOOL(guarded([&] { return cone_contains(c, p); }));
}

// ---- GiST support ---------------------------------------------------------------
// Functions named lineation_gist_* and plane_gist_* know the indexed type;
// cone_gist_* work on keys only and serve both operator classes.

namespace {

template <class T>
Datum gist_compress(FunctionCallInfo fcinfo) {
  GISTENTRY *entry = reinterpret_cast<GISTENTRY *>(PG_GETARG_POINTER(0));
  if (!entry->leafkey) PG_RETURN_POINTER(entry);
  const T v = *reinterpret_cast<const T *>(DatumGetPointer(entry->key));
  const Cone key = guarded([&] { return leaf_key(v); });
  GISTENTRY *out = static_cast<GISTENTRY *>(palloc(sizeof(GISTENTRY)));
  gistentryinit(*out, cone_copy(key), entry->rel, entry->page, entry->offset, false);
  PG_RETURN_POINTER(out);
}

template <class T>
Datum gist_consistent(FunctionCallInfo fcinfo, ConeKind expect) {
  GISTENTRY *entry = reinterpret_cast<GISTENTRY *>(PG_GETARG_POINTER(0));
  const Cone query = *cone_datum(PG_GETARG_DATUM(1));
  const StrategyNumber strategy = static_cast<StrategyNumber>(PG_GETARG_UINT16(2));
  bool *recheck = reinterpret_cast<bool *>(PG_GETARG_POINTER(4));
  *recheck = false;  // leaves are tested exactly (cone.hpp)
  if (strategy != kContainedStrategy)
    ereport(ERROR, (errcode(ERRCODE_FEATURE_NOT_SUPPORTED), errmsg("unsupported GiST strategy %d", strategy)));
  const Cone key = *cone_datum(entry->key);
  // The same error as the operator for a cone of the other kind, whether or
  // not the scan reaches a leaf.
  if (query.kind != static_cast<int32>(expect)) {
    T probe{};
    guarded([&] { return cone_contains(query, probe); });
  }
  PG_RETURN_BOOL(guarded([&] { return key_may_overlap(key, query); }));
}

template <class T>
Datum gist_distance(FunctionCallInfo fcinfo) {
  GISTENTRY *entry = reinterpret_cast<GISTENTRY *>(PG_GETARG_POINTER(0));
  const T query = *arg<T>(fcinfo, 1);
  const StrategyNumber strategy = static_cast<StrategyNumber>(PG_GETARG_UINT16(2));
  bool *recheck = reinterpret_cast<bool *>(PG_GETARG_POINTER(4));
  *recheck = false;  // leaf distances are the operator's own value
  if (strategy != kDistanceStrategy)
    ereport(ERROR, (errcode(ERRCODE_FEATURE_NOT_SUPPORTED), errmsg("unsupported GiST strategy %d", strategy)));
  const Cone key = *cone_datum(entry->key);
  PG_RETURN_FLOAT8(guarded([&] { return key_distance(key, query); }));
}

}  // namespace

STRIAE_FUNCTION(lineation_gist_compress) { return gist_compress<Line>(fcinfo); }
STRIAE_FUNCTION(plane_gist_compress) { return gist_compress<Plane>(fcinfo); }
STRIAE_FUNCTION(lineation_gist_consistent) { return gist_consistent<Line>(fcinfo, ConeKind::Line); }
STRIAE_FUNCTION(plane_gist_consistent) { return gist_consistent<Plane>(fcinfo, ConeKind::Plane); }
STRIAE_FUNCTION(lineation_gist_distance) { return gist_distance<Line>(fcinfo); }
STRIAE_FUNCTION(plane_gist_distance) { return gist_distance<Plane>(fcinfo); }

STRIAE_FUNCTION(cone_gist_union) {
  GistEntryVector *v = reinterpret_cast<GistEntryVector *>(PG_GETARG_POINTER(0));
  int *size = reinterpret_cast<int *>(PG_GETARG_POINTER(1));
  const int n = v->n;
  const Cone **keys = static_cast<const Cone **>(palloc(sizeof(Cone *) * n));
  for (int i = 0; i < n; ++i) keys[i] = cone_datum(v->vector[i].key);
  const Cone u = guarded([&] { return key_union(keys, n); });
  *size = sizeof(Cone);
  return cone_copy(u);
}

STRIAE_FUNCTION(cone_gist_penalty) {
  const GISTENTRY *orig = reinterpret_cast<GISTENTRY *>(PG_GETARG_POINTER(0));
  const GISTENTRY *add = reinterpret_cast<GISTENTRY *>(PG_GETARG_POINTER(1));
  float *penalty = reinterpret_cast<float *>(PG_GETARG_POINTER(2));
  const Cone &a = *cone_datum(orig->key), &b = *cone_datum(add->key);
  *penalty = static_cast<float>(guarded([&] { return key_penalty(a, b); }));
  PG_RETURN_POINTER(penalty);
}

STRIAE_FUNCTION(cone_gist_picksplit) {
  GistEntryVector *v = reinterpret_cast<GistEntryVector *>(PG_GETARG_POINTER(0));
  GIST_SPLITVEC *split = reinterpret_cast<GIST_SPLITVEC *>(PG_GETARG_POINTER(1));
  const int n = v->n - FirstOffsetNumber;  // entries FirstOffsetNumber .. v->n - 1
  const Cone **keys = static_cast<const Cone **>(palloc(sizeof(Cone *) * n));
  for (int i = 0; i < n; ++i) keys[i] = cone_datum(v->vector[i + FirstOffsetNumber].key);
  unsigned char *side = static_cast<unsigned char *>(palloc(n));
  guarded([&] { key_split(keys, n, side); });
  split->spl_left = static_cast<OffsetNumber *>(palloc(sizeof(OffsetNumber) * n));
  split->spl_right = static_cast<OffsetNumber *>(palloc(sizeof(OffsetNumber) * n));
  const Cone **left = static_cast<const Cone **>(palloc(sizeof(Cone *) * n));
  const Cone **right = static_cast<const Cone **>(palloc(sizeof(Cone *) * n));
  int nl = 0, nr = 0;
  for (int i = 0; i < n; ++i) {
    if (side[i] == 0) {
      split->spl_left[nl] = static_cast<OffsetNumber>(i + FirstOffsetNumber);
      left[nl++] = keys[i];
    } else {
      split->spl_right[nr] = static_cast<OffsetNumber>(i + FirstOffsetNumber);
      right[nr++] = keys[i];
    }
  }
  split->spl_nleft = nl;
  split->spl_nright = nr;
  const Cone lu = guarded([&] { return key_union(left, nl); });
  const Cone ru = guarded([&] { return key_union(right, nr); });
  split->spl_ldatum = cone_copy(lu);
  split->spl_rdatum = cone_copy(ru);
  PG_RETURN_POINTER(split);
}

STRIAE_FUNCTION(cone_gist_same) {
  const Cone *a = arg<Cone>(fcinfo, 0), *b = arg<Cone>(fcinfo, 1);
  bool *same = reinterpret_cast<bool *>(PG_GETARG_POINTER(2));
  *same = std::memcmp(a, b, sizeof(Cone)) == 0;
  PG_RETURN_POINTER(same);
}

// Sorted build: leaf keys in Hilbert order of their axes (cone.hpp,
// key_order), abbreviated to the 64-bit code itself.
namespace {

int compare_codes(uint64_t a, uint64_t b) { return a < b ? -1 : a > b ? 1 : 0; }

int cone_full_cmp(Datum x, Datum y, SortSupport) {
  const Cone &a = *cone_datum(x), &b = *cone_datum(y);
  return guarded([&] { return compare_codes(key_order(a), key_order(b)); });
}

int cone_abbrev_cmp(Datum x, Datum y, SortSupport) {
  return compare_codes(static_cast<uint64_t>(x), static_cast<uint64_t>(y));
}

Datum cone_abbrev_convert(Datum original, SortSupport) {
  const Cone &c = *cone_datum(original);
  return static_cast<Datum>(guarded([&] { return key_order(c); }));
}

bool cone_abbrev_abort(int, SortSupport) { return false; }

}  // namespace

STRIAE_FUNCTION(cone_gist_sortsupport) {
  SortSupport ssup = reinterpret_cast<SortSupport>(PG_GETARG_POINTER(0));
  static_assert(sizeof(Datum) == sizeof(uint64_t), "abbreviated keys are 64-bit codes");
  if (ssup->abbreviate) {
    ssup->comparator = cone_abbrev_cmp;
    ssup->abbrev_converter = cone_abbrev_convert;
    ssup->abbrev_abort = cone_abbrev_abort;
    ssup->abbrev_full_comparator = cone_full_cmp;
  } else {
    ssup->comparator = cone_full_cmp;
  }
  PG_RETURN_VOID();
}
