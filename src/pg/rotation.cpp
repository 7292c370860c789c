// SQL rotations of plane, lineation and fault_slip (rules: src/core/rotation.hpp):
// rotate about an axis, rotate_vertical, untilt (back-tilting by bedding) and
// unfold (two-step plunging-fold restoration). Glue only.
#include "datum.hpp"

#include "../core/rotation.hpp"

using namespace striae;
using namespace striae_pg;

namespace {

// One template per rotation kind, instantiated for the three types.
template <class T>
Datum by_axis(FunctionCallInfo fcinfo) {
  const T x = *arg<T>(fcinfo, 0);
  const Line axis = *arg<Line>(fcinfo, 1);
  const double w = PG_GETARG_FLOAT8(2);
  return result(guarded([&] { return rotate(x, rotation_matrix(line_vector(axis), w)); }));
}

template <class T>
Datum by_direction(FunctionCallInfo fcinfo) {
  const T x = *arg<T>(fcinfo, 0);
  const double t = PG_GETARG_FLOAT8(1), p = PG_GETARG_FLOAT8(2), w = PG_GETARG_FLOAT8(3);
  return result(guarded([&] { return rotate(x, rotation_matrix(direction_vector(t, p), w)); }));
}

template <class T>
Datum vertical(FunctionCallInfo fcinfo) {
  const T x = *arg<T>(fcinfo, 0);
  const double w = PG_GETARG_FLOAT8(1);
  return result(guarded([&] { return rotate_vertical(x, w); }));
}

template <class T>
Datum untilt(FunctionCallInfo fcinfo) {
  const T x = *arg<T>(fcinfo, 0);
  const Plane bed = *arg<Plane>(fcinfo, 1);
  const bool overturned = PG_GETARG_BOOL(2);
  return result(guarded([&] { return rotate(x, untilt_matrix(bed, overturned)); }));
}

template <class T>
Datum unfold(FunctionCallInfo fcinfo) {
  const T x = *arg<T>(fcinfo, 0);
  const Plane limb = *arg<Plane>(fcinfo, 1);
  const Line axis = *arg<Line>(fcinfo, 2);
  const double tol = PG_GETARG_FLOAT8(3);
  return result(guarded([&] { return rotate(x, unfold_matrix(limb, axis, tol)); }));
}

}  // namespace

#define STRIAE_ROTATIONS(sql, T)                                                      \
  STRIAE_FUNCTION(sql##_rotate) { return by_axis<T>(fcinfo); }                         \
  STRIAE_FUNCTION(sql##_rotate_direction) { return by_direction<T>(fcinfo); }          \
  STRIAE_FUNCTION(sql##_rotate_vertical) { return vertical<T>(fcinfo); }               \
  STRIAE_FUNCTION(sql##_untilt) { return untilt<T>(fcinfo); }                          \
  STRIAE_FUNCTION(sql##_unfold) { return unfold<T>(fcinfo); }

STRIAE_ROTATIONS(plane, Plane)
STRIAE_ROTATIONS(lineation, Line)
STRIAE_ROTATIONS(fault_slip, FaultSlip)
