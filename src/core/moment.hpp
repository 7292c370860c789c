// Summed moment tensors of a fault population or an earthquake catalogue: the
// kinematic (P/T) analysis of field faults (Marrett & Allmendinger 1990, J.
// Struct. Geol. 12:973, from memory) and Kostrov's (1974) summation for
// catalogues. A streaming aggregate state (sums only), so combine is exact up
// to rounding and the aggregate runs in parallel plans.
//
// Conventions (METHODS.md sections 2 and 10):
//  - a datum's tensor is M = M0 (n u^T + u n^T) (Aki & Richards 1980, Box 4.4),
//    NED, n the upward normal and u the hanging-wall slip; M0 = 1 unweighted, or
//    M0 = 10^(1.5 Mw + 9.1) N m from the moment magnitude (Hanks & Kanamori 1979,
//    JGR 84:2348, in the IASPEI 2013 standard form; the constant is from memory:
//    Hanks & Kanamori's own dyne-cm form gives 9.05, 12 % less moment);
//  - scalar moment of a general tensor: M0 = |M|_F / sqrt 2 (Silver & Jordan
//    1982, from memory), so a double couple of unit moment has M0 = 1;
//  - eigenvalues of the sum: T axis the largest (extension positive in this
//    convention), P the smallest, B the middle one;
//  - non-double-couple measure epsilon = -lambda_absmin / |lambda_absmax| of the
//    (trace-free) eigenvalues: 0 for a double couple, +-0.5 for a pure CLVD
//    (Giardini 1984, Geophys. J. R. astr. Soc. 77:883, from memory); rounded to
//    1e-12 so that a sum of identical mechanisms prints 0;
//  - best double couple: the one with the P and T axes of the sum, n = (T + P)/sqrt2,
//    u = (T - P)/sqrt2 (common practice, no source); of its two nodal planes the
//    one nearer the data's planes is returned (larger n^T N n, N = sum of M0 n n^T
//    of the given planes; a tie takes the first), so the sum of identical
//    mechanisms gives back the given plane;
//  - consistency = M0(sum) / sum of M0, 0..1 (the seismic consistency of Frohlich
//    & Apperson 1992, Tectonics 11:279, from memory);
//  - Kostrov (1974) strain rate of a volume V over a duration T: sum M / (2 mu V T),
//    mu the shear modulus (from memory; about 3e10 Pa for the crust is common practice).
// When the sum cancels (M0(sum) <= 1e-12 sum of M0, e.g. opposite slips on one plane)
// the tensor has no axes: only the count, the moments and the consistency are defined.
#pragma once

#include "orientation.hpp"

#include <cstdint>
#include <type_traits>

namespace striae {

// Magnitudes accepted for weighting: -10 .. 12 (22003 beyond: no earthquake has
// them and 10^(1.5 Mw) overflows long before a typo like 7.5e3 would be caught).
constexpr double kMinMagnitude = -10.0, kMaxMagnitude = 12.0;
// Scalar moment in N m of moment magnitude mw (range-checked, OutOfRange).
double moment_from_magnitude(double mw);

// State: Neumaier-compensated sums. 224 bytes, plain.
struct MomentAccum {
  int64_t count;
  int32_t weighted;  // -1 empty (not yet known), 0 unit moments, 1 from magnitudes
  int32_t reserved;  // 0
  double m[6], mc[6];  // sum of M (nn, ee, dd, ne, nd, ed) and its compensation
  double m0, m0c;      // sum of M0 and its compensation
  double nn[6];        // sum of M0 n n^T of the given planes (nn, ee, dd, ne, nd, ed)
};
static_assert(std::is_trivially_copyable<MomentAccum>::value &&
                  std::is_trivially_destructible<MomentAccum>::value,
              "aggregate state lives in palloc memory");

// Largest count a state may hold (counts convert to double exactly; combine
// checks it, so states merged from partials cannot overflow).
constexpr int64_t kMaxMomentData = int64_t(1) << 53;

void moment_init(MomentAccum &s);
// Add one datum with scalar moment m0 (> 0, finite); weighted says whether m0 came
// from a magnitude. InvalidParameter if weighted differs from earlier rows (the two
// aggregates never share a state, so only a hand-made call can do that).
void moment_add(MomentAccum &s, const FaultSlip &f, double m0, bool weighted);
// into += from (InvalidParameter if one is weighted and the other not).
void moment_combine(MomentAccum &into, const MomentAccum &from);
// BadState unless the state could come from adds: count >= 0, finite sums, the
// empty state all zero with weighted = -1, m0 > 0 otherwise, reserved 0,
// count <= kMaxMomentData.
void moment_validate(const MomentAccum &s);

struct MomentSummary {
  int64_t count;
  bool weighted;
  bool has_axes;          // false when the sum cancels
  double tensor[6];       // normalised to unit scalar moment (has_axes)
  double summed[6];       // the sum itself (N m when weighted)
  Line p, b, t;           // has_axes
  FaultSlip best_dc;      // has_axes
  double epsilon;         // has_axes
  double scalar_moment;   // M0 of the sum
  double moment_sum;      // sum of the data's M0
  double consistency;     // scalar_moment / moment_sum
};
// false for an empty state (SQL NULL).
bool moment_finalise(const MomentAccum &s, MomentSummary &out);

// Kostrov strain rate (per second, NED order) from a weighted summed tensor (N m),
// volume (m^3), duration (s) and shear modulus (Pa); InvalidParameter unless all
// three are finite and positive.
void kostrov_strain_rate(const double summed[6], double volume, double duration, double shear_modulus,
                         double out[6]);

}  // namespace striae
