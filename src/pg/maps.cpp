// Map symbols for GIS layers: the geodesic direct problem, SHmax bars and
// focal-sphere diagrams at a point on the WGS 84 ellipsoid, as well-known text.
// The geometry is in src/core (geodesic, map_symbol, drawing); this file
// unpacks arguments and returns points and text. The companion extension
// striae_gis (src/gis/) wraps the text into PostGIS geometries.
#include "datum.hpp"

#include "../core/map_symbol.hpp"
#include "../core/stress.hpp"

extern "C" {
#include "utils/geo_decls.h"
}

using namespace striae;
using namespace striae_pg;

namespace {

LonLat lonlat_args(FunctionCallInfo fcinfo, int k) {
  return LonLat{PG_GETARG_FLOAT8(k), PG_GETARG_FLOAT8(k + 1)};
}

// Text datum of ASCII well-known text. The string is released before any error
// is raised (palloc without its own out-of-memory error), so no longjmp leaves
// a frame that owns it.
Datum wkt_result(std::string &&s) {
  const Size size = VARHDRSZ + s.size();
  void *p = size <= MaxAllocSize ? palloc_extended(size, MCXT_ALLOC_NO_OOM) : nullptr;
  if (p == nullptr) {
    const Size want = s.size();
    std::string().swap(s);
    ereport(ERROR, (errcode(ERRCODE_OUT_OF_MEMORY), errmsg("out of memory"),
                    errdetail("A map symbol of %zu bytes of text could not be allocated.", static_cast<size_t>(want))));
  }
  SET_VARSIZE(p, size);
  std::memcpy(VARDATA(p), s.data(), s.size());
  std::string().swap(s);
  return PointerGetDatum(p);
}

}  // namespace

// geodesic_destination(longitude, latitude, azimuth, distance_m) -> point (x lon, y lat)
STRIAE_FUNCTION(geodesic_destination) {
  const LonLat from = lonlat_args(fcinfo, 0);
  const double azimuth = PG_GETARG_FLOAT8(2), distance = PG_GETARG_FLOAT8(3);
  const LonLat p = guarded([&] { return striae::geodesic_destination(from, azimuth, distance); });
  Point *out = static_cast<Point *>(palloc(sizeof(Point)));
  out->x = p.lon;
  out->y = p.lat;
  PG_RETURN_POINTER(out);
}

// shmax_bar_wkt(stress_tensor, longitude, latitude, length_m) -> text, NULL when
// the tensor has no SHmax (horizontal stress isotropic).
STRIAE_FUNCTION(stress_shmax_bar_wkt) {
  const StressTensor t = *arg<StressTensor>(fcinfo, 0);
  const LonLat c = lonlat_args(fcinfo, 1);
  const double length = PG_GETARG_FLOAT8(3);
  bool defined = true;
  std::string wkt = guarded([&] {
    check_stress_tensor(t);
    const std::optional<double> a = shmax_azimuth(t);
    if (!a) {
      // still report bad coordinates or lengths, whatever the tensor
      (void)shmax_bar(c, 0, length);
      defined = false;
      return std::string();
    }
    return wkt_linestring(shmax_bar(c, *a, length));
  });
  if (!defined) PG_RETURN_NULL();
  return wkt_result(std::move(wkt));
}

// shmax_bar_wkt(azimuth, longitude, latitude, length_m) -> text
STRIAE_FUNCTION(azimuth_shmax_bar_wkt) {
  const double azimuth = PG_GETARG_FLOAT8(0);
  const LonLat c = lonlat_args(fcinfo, 1);
  const double length = PG_GETARG_FLOAT8(3);
  return wkt_result(guarded([&] { return wkt_linestring(shmax_bar(c, azimuth, length)); }));
}

// focal_quadrants_wkt(fault_slip, longitude, latitude, radius_m, compressional,
// projection, tolerance) -> text MULTIPOLYGON
STRIAE_FUNCTION(focal_quadrants_wkt) {
  const FaultSlip f = *arg<FaultSlip>(fcinfo, 0);
  const LonLat c = lonlat_args(fcinfo, 1);
  const double radius = PG_GETARG_FLOAT8(3);
  const bool compressional = PG_GETARG_BOOL(4);
  const char *proj = text_to_cstring(PG_GETARG_TEXT_PP(5));
  const double tol = PG_GETARG_FLOAT8(6);
  return wkt_result(guarded([&] {
    return wkt_multipolygon(focal_symbol(f, c, radius, compressional, parse_projection(proj), tol));
  }));
}

// focal_disc_wkt(longitude, latitude, radius_m, tolerance) -> text POLYGON
STRIAE_FUNCTION(focal_disc_wkt) {
  const LonLat c = lonlat_args(fcinfo, 0);
  const double radius = PG_GETARG_FLOAT8(2), tol = PG_GETARG_FLOAT8(3);
  return wkt_result(guarded([&] { return wkt_polygon(symbol_disc(c, radius, tol)); }));
}
