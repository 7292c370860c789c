// Geodesics on an ellipsoid of revolution: the direct problem (from a point,
// an azimuth and a distance to the end point and the azimuth there), solved
// with the nested series of Vincenty (1975, "Direct and inverse solutions of
// geodesics on the ellipsoid with application of nested equations", Survey
// Review 23(176):88-93), iterated until sigma changes by less than 1e-14 rad
// (under 0.1 micrometre). Vincenty gives the error of the series as a fraction
// of a millimetre on the Earth's ellipsoid; tests/external/check_gis_geodesic.py
// measures it against pyproj.Geod (PROJ's implementation of Karney 2013).
//
// Conventions: degrees at this interface; latitude geodetic; azimuth clockwise
// from north; distance in metres along the ellipsoid. Map symbols (map_symbol.hpp)
// are built on it, so a GIS reading them sees the ellipsoid's geometry.
#pragma once

#include "core.hpp"

namespace striae {

struct Ellipsoid {
  double a;  // equatorial radius, metres
  double f;  // flattening
};
// WGS 84 (EPSG:4326's ellipsoid): a = 6378137 m, 1/f = 298.257223563 (NIMA TR8350.2).
constexpr Ellipsoid kWgs84{6378137.0, 1.0 / 298.257223563};

struct LonLat {
  double lon, lat;  // degrees
};

struct GeodesicEnd {
  LonLat point;    // longitude not wrapped: from.lon plus the change along the line
  double azimuth;  // forward azimuth at the end point, degrees [0, 360)
};

// The direct problem. from.lat must lie strictly between -90 and 90 (at a pole
// an azimuth has no meaning); distance >= 0. No range checks here beyond
// finiteness of the result (callers check their inputs: check_location).
GeodesicEnd geodesic_direct(const LonLat &from, double azimuth, double distance,
                            const Ellipsoid &e = kWgs84);

// Checks of a location read from SQL: finite, longitude in [-180, 180] and
// latitude in [-90, 90] (OutOfRange otherwise), and not a pole (azimuths have
// no meaning there: InvalidParameter).
void check_location(const LonLat &p);

// Longest distance geodesic_destination accepts, metres (about half a meridian).
constexpr double kMaxGeodesicMetres = 2.0e7;

// The direct problem for SQL: checks from (check_location), a finite azimuth
// and a distance in 0..kMaxGeodesicMetres; the end point with its longitude
// wrapped to (-180, 180].
LonLat geodesic_destination(const LonLat &from, double azimuth, double distance);

// Longitude in (-180, 180].
double wrap_longitude(double lon);

}  // namespace striae
