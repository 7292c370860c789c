// SQL glue for focal-mechanism geometry of fault_slip values.
#include "datum.hpp"
#include "../core/focal.hpp"

using namespace striae;
using namespace striae_pg;

STRIAE_FUNCTION(fault_slip_auxiliary) {
  const FaultSlip f = *arg<FaultSlip>(fcinfo, 0);
  return result(guarded([&] { return auxiliary(f); }));
}

STRIAE_FUNCTION(fault_slip_auxiliary_plane) {
  const FaultSlip f = *arg<FaultSlip>(fcinfo, 0);
  return result(guarded([&] { return fault_plane(auxiliary(f)); }));
}

STRIAE_FUNCTION(fault_slip_p_axis) {
  const FaultSlip f = *arg<FaultSlip>(fcinfo, 0);
  return result(guarded([&] { return p_axis(f); }));
}

STRIAE_FUNCTION(fault_slip_t_axis) {
  const FaultSlip f = *arg<FaultSlip>(fcinfo, 0);
  return result(guarded([&] { return t_axis(f); }));
}

STRIAE_FUNCTION(fault_slip_b_axis) {
  const FaultSlip f = *arg<FaultSlip>(fcinfo, 0);
  return result(guarded([&] { return b_axis(f); }));
}

STRIAE_FUNCTION(fault_slip_moment_tensor) {
  const FaultSlip f = *arg<FaultSlip>(fcinfo, 0);
  const char *frame = text_to_cstring(PG_GETARG_TEXT_PP(1));
  int which = -1;
  if (pg_strcasecmp(frame, "ned") == 0) which = 0;
  else if (pg_strcasecmp(frame, "use") == 0) which = 1;
  if (which < 0)
    ereport(ERROR, (errcode(ERRCODE_INVALID_PARAMETER_VALUE),
                    errmsg("unknown moment tensor frame \"%s\"", echo_arg(frame)),
                    errhint("Accepted: 'ned' (nn, ee, dd, ne, nd, ed) or 'use' (rr, tt, pp, rt, rp, tp).")));
  const auto m = guarded([&] { return which == 0 ? moment_tensor_ned(f) : moment_tensor_use(f); });
  return float8_array(m.data(), 6);
}

STRIAE_FUNCTION(fault_slip_kagan_angle) {
  const FaultSlip a = *arg<FaultSlip>(fcinfo, 0), b = *arg<FaultSlip>(fcinfo, 1);
  PG_RETURN_FLOAT8(guarded([&] { return kagan_angle(a, b); }));
}

STRIAE_FUNCTION(fault_slip_mechanism_class) {
  const FaultSlip f = *arg<FaultSlip>(fcinfo, 0);
  return text_result(guarded([&] { return mechanism_class(f); }));
}
