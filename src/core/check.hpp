// Screening of text literals before conversion, and the field-book form of a
// fault-slip datum.
//
// A staging table of text (a CSV loaded as it is) is screened row by row: each
// notation has a check that says nothing for a valid literal and the reason
// otherwise, without raising. The checks run the very parsers that the type
// input functions run (parse.hpp, stress_text.hpp, grid.hpp, parse_sense), so a
// literal passes the check exactly when the cast would accept it.
#pragma once

#include "orientation.hpp"

#include <cstddef>

namespace striae {

// The text notations that can be checked.
enum class Notation { Plane, Lineation, FaultSlip, StressTensor, SphereGrid, SlipSense };

// "plane", "lineation", "fault_slip", "stress_tensor", "sphere_grid",
// "slip_sense" (exact, lower case). Throws InvalidParameter for anything else.
Notation notation_named(const char *name);

// True when text is a valid literal of the notation. Otherwise false, and the
// reason is written into reason (NUL-terminated, at most cap - 1 bytes, cut at
// a character boundary of UTF-8 text). Only the parsers' own errors
// (striae::Error) are caught: an out-of-memory or a cancellation propagates.
// The reason is the error's detail when the message only repeats the literal
// ("invalid input syntax for type ..."), else the message with its detail.
bool check_literal(Notation kind, const char *text, char *reason, size_t cap);

// The fault-slip datum of a field book's four columns: strike (azimuth or
// quadrant bearing, with or without the dip quadrant on the dip), dip (a number,
// optionally with its dip quadrant: '64', '64SW'), an unsigned rake ('75',
// measured from the right-hand-rule strike) or a pitch with its strike end
// ('75W'), and the sense ('N', 'normal', 'n d', 'reverse-dextral', ...). The
// four are read as the fault_slip text notation 'strike/dip/rake-or-pitch sense'
// (README, "Text notations"), so every rule of that notation holds; each column
// must be a single field (InvalidText otherwise, naming the column).
FaultSlip field_fault_slip(const char *strike, const char *dip, const char *rake_or_pitch,
                           const char *sense);
// The check of the four columns: true when field_fault_slip accepts them, else
// false with the reason (as check_literal).
bool check_field_fault_slip(const char *strike, const char *dip, const char *rake_or_pitch,
                            const char *sense, char *reason, size_t cap);

// Cut s (length n) to at most cap - 1 bytes at a UTF-8 character boundary and
// NUL-terminate it in out. Exposed for the unit tests.
void copy_utf8_prefix(const char *s, size_t n, char *out, size_t cap);

}  // namespace striae
