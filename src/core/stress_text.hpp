// Text form of stress_tensor (parsing; output is formatted by the glue with
// PostgreSQL's float8 output so that it follows extra_float_digits):
//   {"components": [nn, ee, dd, ne, nd, ed], "n": 12, "misfit": 4.5,
//    "cones": [c1, c2, c3], "phi_interval": [lo, hi], "friction": 0.6,
//    "flags": ["focal_joint", "not_converged", "friction_at_limit"]}
// "components" and "n" are required; the optional keys are printed only when
// defined and accepted in any order on input. Components are compression
// positive, NED, trace 0, unit Frobenius norm.
#pragma once

#include "stress.hpp"

namespace striae {

constexpr const char *kStressFlagFocal = "focal_joint";
constexpr const char *kStressFlagNotConverged = "not_converged";
constexpr const char *kStressFlagFrictionAtLimit = "friction_at_limit";

// Parse the text form; throws Error(InvalidText) naming what was wrong and
// listing the accepted keys. The result is not yet checked: call
// check_stress_tensor on it.
StressTensor parse_stress_tensor(const char *text);

}  // namespace striae
