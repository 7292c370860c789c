// Per-datum focal-mechanism geometry of a double couple given as one nodal
// plane with its rake (METHODS.md section 2).
#pragma once

#include "orientation.hpp"

#include <array>

namespace striae {

// The other nodal plane with its rake: normal and slip swap roles (Aki &
// Richards 1980).
FaultSlip auxiliary(const FaultSlip &f);

// Pressure, tension and null axes: T = (n+u)/sqrt2, P = (n-u)/sqrt2, B = T x P,
// as lower-hemisphere lines.
Line p_axis(const FaultSlip &f);
Line t_axis(const FaultSlip &f);
Line b_axis(const FaultSlip &f);

// Unit vectors of the P, T, B axes forming a right-handed frame (columns T, P, B).
Mat3 ptb_frame(const FaultSlip &f);

// Moment tensor for unit scalar moment, M = n u^T + u n^T (Aki & Richards 1980,
// Box 4.4). NED order: nn, ee, dd, ne, nd, ed.
std::array<double, 6> moment_tensor_ned(const FaultSlip &f);
// Up-South-East order (r = up, t = south, p = east): rr, tt, pp, rt, rp, tp,
// with Mrr = Mdd, Mtt = Mnn, Mpp = Mee, Mrt = Mnd, Mrp = -Med, Mtp = -Mne.
std::array<double, 6> moment_tensor_use(const FaultSlip &f);

// Kagan (1991) angle: the smallest rotation taking one double couple to the
// other over the four symmetries of a double couple; degrees, 0..120, rounded
// to 1e-8 degree.
double kagan_angle(const FaultSlip &a, const FaultSlip &b);

// Mechanism class from the plunges of the T, B and P axes after Frohlich (1992,
// PEPI 75:193); thresholds recalled from memory (METHODS.md section 2), not
// checked against the paper here: "thrust" if plunge(T) > 50, "strike-slip" if
// plunge(B) > 60, "normal" if plunge(P) > 60, else "unclassified" (the paper's
// remaining class, which it calls odd as far as recalled). No two of the
// conditions can hold at once: the squared sines of the three plunges of an
// orthonormal frame add to 1, and sin^2 50 + sin^2 60 > 1, sin^2 60 + sin^2 60 > 1.
// The words are those of stress_regime for the same faulting (one vocabulary).
const char *mechanism_class(const FaultSlip &f);

}  // namespace striae
