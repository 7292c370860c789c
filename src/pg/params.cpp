// Parameters of an aggregate over an empty group (DEVELOPERS.md, "Aggregates").
// With no rows the transition function, which checks the parameters on the
// first row, never runs; the final function (one-phase or *_partial) calls
// check_empty_group_params, which finds the aggregate from the call being
// finalised and checks its constant arguments exactly as the first row would,
// with the same errors. A parameter taken from a column has no value over no
// rows and is not checked (the group gives NULL).
#include "datum.hpp"

#include "../core/bootstrap.hpp"
#include "../core/grid.hpp"
#include "../core/phases.hpp"
#include "../core/stress.hpp"

using namespace striae;

namespace striae_pg {

namespace {

// Argument k of the call if it is a constant; NULL raises 22004 with msg.
bool constant(FunctionCallInfo fcinfo, int k, Datum &v, const char *null_msg) {
  bool isnull;
  if (!agg_param(fcinfo, k, v, isnull)) return false;
  if (isnull) ereport(ERROR, (errcode(ERRCODE_NULL_VALUE_NOT_ALLOWED), errmsg("%s", null_msg)));
  return true;
}

// Bootstrap resamples and seed at arguments k, k + 1 (as stress_bootstrap_accum
// and focal_bootstrap_accum check them).
void resamples_and_seed(FunctionCallInfo fcinfo, int k, const char *null_msg) {
  Datum r, s;
  const bool have_r = constant(fcinfo, k, r, null_msg);
  constant(fcinfo, k + 1, s, null_msg);
  if (have_r)
    guarded([&] {
      BootstrapOptions o;
      o.resamples = DatumGetInt32(r);
      check_bootstrap_options(o);
    });
}

}  // namespace

void check_empty_group_params(FunctionCallInfo fcinfo) {
  const Aggref *ref = AggGetAggref(fcinfo);
  if (ref == nullptr) return;
  char *fname = get_func_name(ref->aggfnoid);
  if (fname == nullptr) return;
  // The two-phase forms take the one-phase form's arguments. (A plain buffer,
  // not a std::string: this frame can raise.)
  char name[NAMEDATALEN];
  strlcpy(name, fname, sizeof name);
  pfree(fname);
  const size_t len = std::strlen(name), suffix = std::strlen("_partial");
  if (len > suffix && std::strcmp(name + len - suffix, "_partial") == 0) name[len - suffix] = '\0';
  auto is = [&](const char *n) { return std::strcmp(name, n) == 0; };
  const int nargs = list_length(ref->args);
  Datum v;
  if (is("density_grid") || is("right_dihedra")) {
    const char *msg = is("density_grid") ? "density_grid spacing must not be NULL"
                                         : "right_dihedra spacing must not be NULL";
    if (nargs == 2 && constant(fcinfo, 1, v, msg)) guarded([&] { grid_spacing(DatumGetFloat8(v)); });
  } else if (is("stress_inversion")) {
    if (nargs == 3) resamples_and_seed(fcinfo, 1, "stress_inversion resamples and seed must not be NULL");
  } else if (is("focal_stress_inversion")) {
    if (nargs == 2) {
      if (constant(fcinfo, 1, v, "focal_stress_inversion friction must not be NULL"))
        guarded([&] { check_friction(DatumGetFloat8(v)); });
    } else if (nargs == 4) {
      bool isnull;  // NULL friction: the default search
      if (agg_param(fcinfo, 1, v, isnull) && !isnull) guarded([&] { check_friction(DatumGetFloat8(v)); });
      resamples_and_seed(fcinfo, 2, "focal_stress_inversion resamples and seed must not be NULL");
    }
  } else if (is("stress_phases")) {
    const char *msg = "stress_phases phases, seed and starts must not be NULL";
    Datum p, s, n;
    const bool have_p = constant(fcinfo, 1, p, msg);
    constant(fcinfo, 2, s, msg);
    const bool have_n = nargs == 4 && constant(fcinfo, 3, n, msg);
    guarded([&] {
      PhaseOptions o;
      if (have_p) o.phases = DatumGetInt32(p);
      if (have_n) o.starts = DatumGetInt32(n);
      check_phase_options(o);
    });
  } else if (is("misfit_summary")) {
    if (nargs == 3 && constant(fcinfo, 2, v, "misfit_summary threshold must not be NULL"))
      guarded([&] { check_misfit_threshold(DatumGetFloat8(v)); });
  }
}

}  // namespace striae_pg
