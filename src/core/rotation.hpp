// Rotations of orientation data: about any axis, about the vertical, back-tilting
// by a bedding plane, and the two-step restoration of a plunging fold.
//
// Conventions (METHODS.md section 10):
//  - NED axes. A rotation by angle w (degrees) about the unit axis a follows the
//    right-hand rule: with the thumb along a, the fingers curl in the positive
//    sense. Seen looking along a (from behind its tail toward its tip), positive
//    is clockwise. For a downward-pointing axis (any lower-hemisphere line), that
//    is clockwise as seen from above: about the vertical line 0/90 a positive
//    angle turns north toward east, i.e. adds w to every azimuth.
//  - Rodrigues' formula: v' = v cos w + (a x v) sin w + a (a.v)(1 - cos w) [pub].
//  - A plane turns with its normal, a lineation with its vector (then taken to
//    the lower hemisphere), a fault slip with its normal n and slip u together, so
//    the relative motion (the slip sense) is carried along; the result is put
//    back into canonical form (which may re-express it, e.g. a normal fault turned
//    vertical is written with the other block as hanging wall, a reverse rake).
//  - Back-tilting (untilt): rotate about the bedding strike by minus its dip, so
//    the bed becomes horizontal; an overturned bed turns by 180 - dip instead (the
//    short way past the vertical).
//  - Plunging fold (unfold), after Ramsay (1967, Folding and Fracturing of Rocks;
//    the description of the technique is recalled from memory): first rotate about
//    the horizontal line at right angles to the fold-axis trend by the plunge, so
//    the fold axis becomes horizontal; then untilt by the limb as it is after that
//    first step (its strike is then the fold axis when the limb contains it).
#pragma once

#include "orientation.hpp"

namespace striae {

// Rotation matrix about the direction a (any non-zero length; normalised here) by
// angle_deg degrees, right-hand rule. DataError for a zero or non-finite axis,
// OutOfRange for a non-finite angle. The sine and cosine come from sincosd, so
// multiples of 90 degrees give exact matrices.
Mat3 rotation_matrix(const Vec3 &axis, double angle_deg);

// The direction of trend/plunge as given (no lower-hemisphere flip): plunge -90..90,
// negative upward; trend any finite value. OutOfRange otherwise.
Vec3 direction_vector(double trend, double plunge);

// Apply a rotation matrix (orthonormal; not checked) to each kind of datum.
Plane rotate(const Plane &p, const Mat3 &r);
Line rotate(const Line &l, const Mat3 &r);
FaultSlip rotate(const FaultSlip &f, const Mat3 &r);

// Rotations about the vertical by angle_deg (positive clockwise seen from above,
// adding to azimuths). Exact in degrees: the azimuth is shifted and wrapped, the
// dip, plunge and rake are untouched.
Plane rotate_vertical(const Plane &p, double angle_deg);
Line rotate_vertical(const Line &l, double angle_deg);
FaultSlip rotate_vertical(const FaultSlip &f, double angle_deg);

// Back-tilting rotation of a bedding plane (see above). A horizontal bed gives the
// identity (or, overturned, a half turn about north). A vertical bed has no dip
// direction: it turns about its canonical strike (0..180) by -90 (+90 overturned).
Mat3 untilt_matrix(const Plane &bedding, bool overturned);

// Two-step restoration of a plunging fold (see above). DataError when the fold
// axis lies more than tolerance_deg (0 <= t < 90, InvalidParameter otherwise) off
// the limb plane: the limb then does not belong to a fold about that axis.
Mat3 unfold_matrix(const Plane &limb, const Line &fold_axis, double tolerance_deg);

}  // namespace striae
