// Cones of axes: the "within d degrees" search of lineations and planes, and the
// keys of the GiST operator class that serves it and the nearest-neighbour
// search (ORDER BY x <-> v LIMIT k).
//
// Metric. Lines and plane poles are axes (u and -u are the same), so the
// distance is the axial angle d(a, b) = min(angle(a, b), 180 - angle(a, b)),
// 0..90. It is a metric on the axes (the quotient metric of the sphere under
// u ~ -u: symmetric, zero only for equal axes, and it obeys the triangle
// inequality), which is what makes the index exact: a key that holds every
// axis within r of its centre c bounds the distance from a query q to any of
// them from below by d(q, c) - r.
//
// A Cone is the SQL type cone and, at the same time, the index key:
//  - kind Line: the axis is the lineation (a, b) = (trend, plunge);
//  - kind Plane: the axis is the pole of the plane (a, b) = (strike, dip);
//  - kind Region (index inner keys only): an enclosing cap, (a, b) a
//    trend/plunge of its centre for display; (x, y, z) is authoritative.
// (x, y, z) is the unit axis vector, NED, computed with the same functions as
// the operators <-> use, and radius the half-angle in degrees, 0..90.
// Leaf keys keep the exact (a, b) of the indexed value, so a leaf's distance
// and containment are computed by the very functions of the operators, and the
// index never needs a recheck.
#pragma once

#include "orientation.hpp"

#include <cstdint>
#include <type_traits>

namespace striae {

enum class ConeKind : int32_t { Region = 0, Line = 1, Plane = 2 };

struct Cone {
  double a, b;    // trend/plunge (Line, Region) or strike/dip (Plane)
  double radius;  // half-angle, degrees [0, 90]
  double x, y, z; // unit axis, NED
  int32_t kind;   // ConeKind
  int32_t reserved;
};
static_assert(sizeof(Cone) == 56, "cone layout is the SQL type's storage");
static_assert(std::is_trivially_copyable<Cone>::value && std::is_trivially_destructible<Cone>::value,
              "lives in palloc memory");

// Constructors (radius 0..90, finite; OutOfRange otherwise).
Cone make_cone(const Line &axis, double radius);
Cone make_cone(const Plane &plane, double radius);
// Text form: 'line 120/30 within 10', 'plane 110/64 within 10' (any notation
// of the axis that the type accepts; 'region T/P within R' for an index key).
// InvalidText with a detail on malformed text.
Cone parse_cone(const char *text);
// Re-check a value from binary input or an index page (kind, ranges, vector
// agreeing with (a, b)); throws DataError.
void check_cone(const Cone &c);

// Containment, exactly the operators' definitions:
//   line <@ cone(v, d)   is  angle(line, v) <= d   (the same value as line <-> v)
//   plane <@ cone(q, d)  is  angle(plane, q) <= d  (the same value as plane <-> q)
// A cone of lines applied to a plane (or the reverse) is InvalidParameter.
bool cone_contains(const Cone &c, const Line &l);
bool cone_contains(const Cone &c, const Plane &p);

// ---- index keys ----------------------------------------------------------------

Cone leaf_key(const Line &l);   // kind Line, radius 0
Cone leaf_key(const Plane &p);  // kind Plane, radius 0, axis = pole vector

// Smallest distance from the query axis q (unit) to any axis the key holds: for
// a leaf the exact operator value (query given again as q_line / q_plane), for a
// region d(q, c) - r clamped at 0. Never larger than the true distance.
double key_distance(const Cone &key, const Line &q);
double key_distance(const Cone &key, const Plane &q);

// May the key hold an axis inside the query cone? Exact for leaves; for
// regions true whenever some axis within the region could be inside.
bool key_may_overlap(const Cone &key, const Cone &query);

// A region enclosing every key (n >= 1): centre the sign-aligned mean of the
// axes, radius the largest reach, widened by a rounding margin so the bound
// stays a bound. Polls interrupts for long lists.
Cone key_union(const Cone *const *keys, int n);
// Radius growth of `have` when it must also enclose `add` (GiST penalty).
double key_penalty(const Cone &have, const Cone &add);
// Split keys into two groups for a page split: side[i] is 0 or 1. Each side gets
// at least a quarter of the keys.
void key_split(const Cone *const *keys, int n, unsigned char *side);
// Position of the key's axis along a Hilbert curve over an equal-area map of
// the lower hemisphere: nearby axes get nearby codes, so sorting leaf keys by it
// packs compact pages (GiST sorted build).
uint64_t key_order(const Cone &key);

}  // namespace striae
