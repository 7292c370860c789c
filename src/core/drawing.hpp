// Drawing on the lower hemisphere: great and small circles, the regions they
// bound (a double couple's quadrants, confidence cones), and their images in
// the projected unit disc as paths of cubic Bezier segments and arcs of the
// primitive circle, or as polylines. Pure geometry: no pixels, no SVG (the
// SVG writer scales disc paths to pixels, svg.hpp).
//
// Conventions: NED unit vectors; the disc of projection.hpp (radius 1 at the
// horizon, x east, y north); angles in radians; disc polar angles measured
// from east, counter-clockwise (toward north).
//
// Regions are axial: a region of directions contains x exactly when it
// contains -x (a quadrant of a double couple, a cone about an axis), so its
// lower-hemisphere picture is the region itself cut at the horizon. Where a
// region's boundary leaves the lower hemisphere the picture follows the
// primitive circle to where it re-enters. A small circle drawn as a line
// continues on the opposite side where it crosses the horizon, as lower-
// hemisphere axial data require.
#pragma once

#include "orientation.hpp"
#include "projection.hpp"

#include <vector>

namespace striae {

// A circle on the unit sphere: at(phi) = cr c + sr (cos(phi) e1 + sin(phi) e2),
// c, e1, e2 orthonormal; cr = cos and sr = sin of the angular radius (a great
// circle has cr = 0, sr = 1).
struct SphereCircle {
  Vec3 c, e1, e2;
  double cr, sr;
  Vec3 at(double phi) const;
  Vec3 tangent(double phi) const;  // d at / d phi
};

// Great circle of the plane through e1 and e2 (unit, orthogonal).
SphereCircle great_circle(const Vec3 &e1, const Vec3 &e2);
// Small circle of angular radius r (0 < r <= pi/2) about the unit axis a.
SphereCircle small_circle(const Vec3 &axis, double r);

// The part of a circle between phi0 and phi1 (either order), drawn as it is
// (flip false) or through the centre (flip true: -at(phi)). An Arc always lies
// in the lower hemisphere after the flip.
struct Arc {
  SphereCircle circle;
  double phi0, phi1;
  bool flip;
  Vec3 at(double phi) const;
  Vec3 tangent(double phi) const;
};

// The lower half of a plane's great circle (from the strike direction through
// the down-dip direction to the opposite strike direction). A horizontal
// plane's great circle is the whole primitive circle (phi 0 .. 2 pi).
Arc plane_arc(const Plane &p);
// The same for the plane with unit normal n (either sign).
Arc normal_plane_arc(const Vec3 &n);

// A whole circle cut at the horizon into arcs: the parts below it as they are,
// the parts above it flipped through the centre. In order along the circle.
std::vector<Arc> axial_arcs(const SphereCircle &c);

// One edge of a region's outline: an arc, or a piece of the primitive circle
// from disc angle a0 to a1 (a1 - a0 is the signed sweep, |sweep| <= 2 pi).
struct Edge {
  bool rim;
  Arc arc;         // when !rim
  double a0, a1;   // when rim
};
// A closed outline: the edges follow each other end to start.
using Ring = std::vector<Edge>;

// Regions of the lower hemisphere where (x.n)(x.u) > 0 (positive = true) or
// < 0, n and u unit and orthogonal (a double couple: fault normal and slip, in
// either role). With n, u of a focal mechanism, positive gives the quadrants of
// compressional first motion, which contain the T axis and are the ones shaded
// in a focal-sphere diagram; negative gives the dilatational quadrants, which
// contain P, and are also the P (compressional) dihedra of the right-dihedra
// method (Angelier & Mechler 1977). Each ring is one connected region.
std::vector<Ring> double_couple_regions(const Vec3 &n, const Vec3 &u, bool positive);

// The axial cone of half-angle r (0 < r <= pi/2) about axis a: every x within r
// of a or of -a. r = pi/2 (or more) is the whole disc.
std::vector<Ring> cone_regions(const Vec3 &axis, double r);

// ---- paths in disc coordinates ------------------------------------------------

struct PathSeg {
  enum Op : unsigned char { Move, Line, Cubic, Rim, Close, CircleArc } op;
  XY p[3];       // Move/Line: p[0]; Cubic: controls p[0], p[1], end p[2]; Rim: end p[0];
                 // CircleArc: end p[0], centre p[1], p[2].x radius, p[2].y 1 if more
                 // than half the circle
  double sweep;  // Rim: signed angle along the unit circle (counter-clockwise > 0);
                 // CircleArc: > 0 counter-clockwise
};
using DiscPath = std::vector<PathSeg>;

// Append an arc's image. In the equal-angle projection every circle of the
// sphere is a circle (or a line) in the disc (the stereographic projection
// keeps circles), so the image is written as one or two exact circular arcs
// (or a line) when three more points confirm it within tol; otherwise, and in
// the equal-area projection, as cubic Bezier segments (Hermite: end points and end
// tangents of the true curve), split until the cubic is within tol of the
// curve at seven parameters per segment, to 0.85 tol so that the error between
// them stays within tol (tol in disc units: 0.1 px at a net
// radius of R px is 0.1 / R). start: begin with a Move to the arc's first point.
void append_arc(DiscPath &path, const Arc &arc, Projection proj, double tol, bool start);
// Append a closed ring (Move, its edges, Close).
void append_ring(DiscPath &path, const Ring &ring, Projection proj, double tol);

// A ring as a polygon: points along it within tol of the true outline, first
// point not repeated at the end, counter-clockwise (positive area, x east and y
// north). Curves are chords between points of the curve; pieces of the
// primitive are tangent polylines just outside the circle (within tol), so no
// outline crosses itself (a valid polygon for a GIS). For GIS output and tests.
std::vector<XY> ring_polygon(const Ring &ring, Projection proj, double tol);
// An arc as a polyline within tol, both ends included.
std::vector<XY> arc_polyline(const Arc &arc, Projection proj, double tol);

// ---- a focal mechanism in the disc, for maps and figures ----------------------

// Everything needed to draw the focal-sphere diagram of a double couple in
// either projection, in unit-disc coordinates (x east, y north, radius 1 at the
// horizon), as plain polygons and polylines within tol of the true curves:
//  - compressional: the quadrants of compressional first motion (they contain
//    T, shaded in a focal-sphere diagram), one counter-clockwise polygon each
//    (one or two in the lower hemisphere, first point not repeated);
//  - dilatational: the other quadrants (they contain P), likewise;
//  - nodal: the lower halves of both nodal planes, the given plane first;
//  - p, t: the P and T axes.
// A companion extension scales them to a symbol size and places them at an
// epicentre; the polygons cover the unit disc without overlap.
struct FocalDrawing {
  std::vector<std::vector<XY>> compressional;
  std::vector<std::vector<XY>> dilatational;
  std::vector<XY> nodal[2];
  XY p, t;
};
FocalDrawing focal_drawing(const FaultSlip &f, Projection proj, double tol);

}  // namespace striae
