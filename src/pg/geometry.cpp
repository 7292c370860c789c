// SQL constructors, accessors and per-datum geometry of plane, lineation and
// fault_slip. Glue only: unpack, call src/core inside the guard, pack.
#include "datum.hpp"

using namespace striae;
using namespace striae_pg;

// ---- constructors ---------------------------------------------------------

STRIAE_FUNCTION(plane_make) {
  const double s = PG_GETARG_FLOAT8(0), d = PG_GETARG_FLOAT8(1);
  return result(guarded([&] { return make_plane_wrapping(s, d); }));
}

STRIAE_FUNCTION(plane_from_dip_direction) {
  const double dd = PG_GETARG_FLOAT8(0), d = PG_GETARG_FLOAT8(1);
  return result(guarded([&] { return make_plane_from_dip_direction_wrapping(dd, d); }));
}

STRIAE_FUNCTION(lineation_make) {
  const double t = PG_GETARG_FLOAT8(0), p = PG_GETARG_FLOAT8(1);
  return result(guarded([&] { return make_line_wrapping(t, p); }));
}

STRIAE_FUNCTION(fault_slip_make) {
  const double s = PG_GETARG_FLOAT8(0), d = PG_GETARG_FLOAT8(1), r = PG_GETARG_FLOAT8(2);
  return result(guarded([&] { return make_fault_slip_wrapping(s, d, r); }));
}

STRIAE_FUNCTION(fault_slip_from_plane) {
  const Plane p = *arg<Plane>(fcinfo, 0);
  const double r = PG_GETARG_FLOAT8(1);
  return result(guarded([&] { return make_fault_slip_wrapping(p.strike, p.dip, r); }));
}

STRIAE_FUNCTION(fault_slip_from_striation) {
  const Plane p = *arg<Plane>(fcinfo, 0);
  const Line l = *arg<Line>(fcinfo, 1);
  const char *sense = text_to_cstring(PG_GETARG_TEXT_PP(2));
  const double tol = PG_GETARG_FLOAT8(3);
  return result(guarded([&] {
    return fault_from_striation(p, line_vector(l), parse_sense(sense), tol);
  }));
}

// ---- accessors --------------------------------------------------------------

STRIAE_FUNCTION(plane_strike) { PG_RETURN_FLOAT8(arg<Plane>(fcinfo, 0)->strike); }
STRIAE_FUNCTION(plane_dip) { PG_RETURN_FLOAT8(arg<Plane>(fcinfo, 0)->dip); }
STRIAE_FUNCTION(plane_dip_direction) { PG_RETURN_FLOAT8(dip_direction(*arg<Plane>(fcinfo, 0))); }
STRIAE_FUNCTION(lineation_trend) { PG_RETURN_FLOAT8(arg<Line>(fcinfo, 0)->trend); }
STRIAE_FUNCTION(lineation_plunge) { PG_RETURN_FLOAT8(arg<Line>(fcinfo, 0)->plunge); }
STRIAE_FUNCTION(fault_slip_strike) { PG_RETURN_FLOAT8(arg<FaultSlip>(fcinfo, 0)->strike); }
STRIAE_FUNCTION(fault_slip_dip) { PG_RETURN_FLOAT8(arg<FaultSlip>(fcinfo, 0)->dip); }
STRIAE_FUNCTION(fault_slip_rake) { PG_RETURN_FLOAT8(arg<FaultSlip>(fcinfo, 0)->rake); }

STRIAE_FUNCTION(fault_slip_plane) {
  const FaultSlip f = *arg<FaultSlip>(fcinfo, 0);
  return result(guarded([&] { return fault_plane(f); }));
}

STRIAE_FUNCTION(fault_slip_sense) {
  return text_result(slip_sense(*arg<FaultSlip>(fcinfo, 0)));
}

STRIAE_FUNCTION(lineation_direction_cosines) {
  const Vec3 v = line_vector(*arg<Line>(fcinfo, 0));
  const double c[3] = {v.x(), v.y(), v.z()};
  return float8_array(c, 3);
}

// ---- geometry ---------------------------------------------------------------

STRIAE_FUNCTION(plane_pole) {
  const Plane p = *arg<Plane>(fcinfo, 0);
  return result(guarded([&] { return pole(p); }));
}

STRIAE_FUNCTION(plane_from_pole) {
  const Line l = *arg<Line>(fcinfo, 0);
  return result(guarded([&] { return striae::plane_from_pole(l); }));
}

STRIAE_FUNCTION(lineation_angle) {
  const Line a = *arg<Line>(fcinfo, 0), b = *arg<Line>(fcinfo, 1);
  PG_RETURN_FLOAT8(guarded([&] { return snap_angle(angle(a, b)); }));
}

STRIAE_FUNCTION(plane_angle) {
  const Plane a = *arg<Plane>(fcinfo, 0), b = *arg<Plane>(fcinfo, 1);
  PG_RETURN_FLOAT8(guarded([&] { return snap_angle(angle(a, b)); }));
}

STRIAE_FUNCTION(plane_intersection) {
  const Plane a = *arg<Plane>(fcinfo, 0), b = *arg<Plane>(fcinfo, 1);
  return result(guarded([&] { return intersection(a, b); }));
}

STRIAE_FUNCTION(lineation_plane_through) {
  const Line a = *arg<Line>(fcinfo, 0), b = *arg<Line>(fcinfo, 1);
  return result(guarded([&] { return plane_through(a, b); }));
}
