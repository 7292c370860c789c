// Text notations for planes, lines and fault-slip data (grammar in README.md,
// "Text notations"). Every parser returns the canonical form or throws
// Error(InvalidText) with a detail saying what was wrong and a hint listing
// what is accepted; a value out of range throws Error(OutOfRange).
#pragma once

#include "orientation.hpp"

namespace striae {

Plane parse_plane(const char *text);
Line parse_line(const char *text);
FaultSlip parse_fault_slip(const char *text);

// Azimuth of a compass letter group (n, ne, e, se, s, sw, w, nw; lower case),
// or a negative value if it is not one. Exposed for the unit tests.
double compass_azimuth(const char *letters, size_t len);

}  // namespace striae
