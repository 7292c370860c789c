// Map symbols on the WGS 84 ellipsoid, for GIS layers: the SHmax bar of a
// stress state and the focal-sphere diagram of a mechanism at a point, as
// longitude/latitude vertices (EPSG:4326) and as OGC well-known text. The
// companion extension striae_gis turns the text into PostGIS geometries; without
// PostGIS the text goes to any GIS as it is.
//
// Placement: a point (x, y) of a symbol's unit disc (x east, y north, 1 at the
// rim; drawing.hpp) of radius r metres goes to the end of the geodesic that
// leaves the centre at azimuth atan2(x, y) with length r * hypot(x, y)
// (geodesic polar coordinates about the centre: the ellipsoidal azimuthal
// equidistant projection, inverted). Directions and distances from the centre
// are thus true on the ellipsoid; a symbol of a few kilometres is undistorted
// far below anything a map shows. Longitudes are not wrapped: a symbol across
// the antimeridian keeps continuous longitudes beyond +-180.
#pragma once

#include "geodesic.hpp"
#include "orientation.hpp"
#include "projection.hpp"

#include <string>
#include <vector>

namespace striae {

using LonLatRing = std::vector<LonLat>;  // closed: first point repeated at the end

// Largest bar length and symbol radius, metres: a map symbol, not a survey line.
constexpr double kMaxSymbolMetres = 1.0e6;

// The SHmax bar: a geodesic of length length_m centred on c along azimuth
// (degrees, read as an axis: azimuth and azimuth + 180 are the same bar), as
// three vertices: the end at azimuth a + 180, the centre, the end at azimuth a,
// with a = azimuth reduced to [0, 180). The two halves continue each other (one
// geodesic), so the bar's azimuth at the centre is a and its length length_m.
std::vector<LonLat> shmax_bar(const LonLat &c, double azimuth, double length_m);

// A disc point of a symbol of radius_m at c, placed as described above.
LonLat place_disc_point(const LonLat &c, double radius_m, const XY &p);

// The quadrants of a focal mechanism, compressional (the quadrants of
// compressional first motion, containing T, shaded in a focal-sphere diagram)
// or dilatational (containing P), drawn as focal_drawing (drawing.hpp) draws
// them in the given projection within tol of the disc radius, placed at c with
// radius radius_m. One counter-clockwise ring per connected region; the points
// where regions meet are shared exactly, so the rings form a valid MultiPolygon.
std::vector<LonLatRing> focal_symbol(const FaultSlip &f, const LonLat &c, double radius_m, bool compressional,
                                     Projection proj, double tol);

// The outline of a symbol's disc, for the background of a focal-sphere
// diagram: a counter-clockwise polygon whose sides touch the rim and whose
// corners lie within tol of it (as the quadrants' pieces of the rim are drawn,
// drawing.hpp), so quadrants and outline cover the same ground.
LonLatRing symbol_disc(const LonLat &c, double radius_m, double tol);

// Checks of the symbol size (over 0 and at most kMaxSymbolMetres; what names
// the parameter in the message) and of the drawing tolerance ((0, 0.5]).
void check_symbol_size(double metres, const char *what);
void check_symbol_tolerance(double tol);

// Well-known text (OGC Simple Features), numbers in shortest round-trip form:
// LINESTRING(lon lat,...), POLYGON((...)), MULTIPOLYGON(((...)),...).
std::string wkt_linestring(const std::vector<LonLat> &points);
std::string wkt_polygon(const LonLatRing &ring);
std::string wkt_multipolygon(const std::vector<LonLatRing> &rings);

}  // namespace striae
