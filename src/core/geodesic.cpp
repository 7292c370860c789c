// The direct geodesic problem after Vincenty (1975); see geodesic.hpp.
#include "geodesic.hpp"

#include <cmath>

namespace striae {

GeodesicEnd geodesic_direct(const LonLat &from, double azimuth, double distance, const Ellipsoid &e) {
  const double a = e.a, f = e.f, b = a * (1 - f);
  const double alpha1 = rad(azimuth);
  const double sin_a1 = std::sin(alpha1), cos_a1 = std::cos(alpha1);
  // Reduced latitude U1 (tan U1 = (1 - f) tan phi1), from sine and cosine so
  // that nothing overflows near the poles.
  const double phi1 = rad(from.lat);
  const double su = (1 - f) * std::sin(phi1), cu = std::cos(phi1), h = std::hypot(su, cu);
  const double sin_u1 = su / h, cos_u1 = cu / h;
  // Vincenty (1975), eqs. 1-3 and 6-7 of the direct solution.
  const double sigma1 = std::atan2(sin_u1, cos_u1 * cos_a1);
  const double sin_alpha = cos_u1 * sin_a1;
  const double cos2_alpha = 1 - sin_alpha * sin_alpha;
  const double u2 = cos2_alpha * (a * a - b * b) / (b * b);
  const double A = 1 + u2 / 16384 * (4096 + u2 * (-768 + u2 * (320 - 175 * u2)));
  const double B = u2 / 1024 * (256 + u2 * (-128 + u2 * (74 - 47 * u2)));
  const double s_ba = distance / (b * A);
  double sigma = s_ba, sin_s = 0, cos_s = 1, cos_2sm = 1;
  // Iterate eqs. 5, 6 (sigma from the distance) until sigma settles; the
  // direct problem converges for every line, within a handful of rounds.
  for (int k = 0; k < 200; ++k) {
    cos_2sm = std::cos(2 * sigma1 + sigma);
    sin_s = std::sin(sigma);
    cos_s = std::cos(sigma);
    const double c2 = cos_2sm * cos_2sm;
    const double d_sigma =
        B * sin_s *
        (cos_2sm + B / 4 * (cos_s * (-1 + 2 * c2) - B / 6 * cos_2sm * (-3 + 4 * sin_s * sin_s) * (-3 + 4 * c2)));
    const double next = s_ba + d_sigma;
    const bool done = std::fabs(next - sigma) < 1e-14;
    sigma = next;
    if (done) break;
  }
  cos_2sm = std::cos(2 * sigma1 + sigma);
  sin_s = std::sin(sigma);
  cos_s = std::cos(sigma);
  // Eqs. 8-13: latitude, longitude difference and azimuth at the end.
  const double tmp = sin_u1 * sin_s - cos_u1 * cos_s * cos_a1;
  const double phi2 = std::atan2(sin_u1 * cos_s + cos_u1 * sin_s * cos_a1,
                                 (1 - f) * std::sqrt(sin_alpha * sin_alpha + tmp * tmp));
  const double lambda = std::atan2(sin_s * sin_a1, cos_u1 * cos_s - sin_u1 * sin_s * cos_a1);
  const double C = f / 16 * cos2_alpha * (4 + f * (4 - 3 * cos2_alpha));
  const double L =
      lambda -
      (1 - C) * f * sin_alpha * (sigma + C * sin_s * (cos_2sm + C * cos_s * (-1 + 2 * cos_2sm * cos_2sm)));
  double alpha2 = deg(std::atan2(sin_alpha, -tmp));
  if (alpha2 < 0) alpha2 += 360;
  if (alpha2 >= 360) alpha2 -= 360;
  GeodesicEnd end{LonLat{from.lon + deg(L), deg(phi2)}, alpha2};
  if (!std::isfinite(end.point.lon) || !std::isfinite(end.point.lat) || !std::isfinite(end.azimuth))
    throw Error(ErrorKind::DataError, "geodesic end point is not finite");
  return end;
}

void check_location(const LonLat &p) {
  if (!std::isfinite(p.lon))
    throw Error(ErrorKind::OutOfRange, "longitude must be a finite number",
                "NaN and infinite values are not coordinates.");
  if (!std::isfinite(p.lat))
    throw Error(ErrorKind::OutOfRange, "latitude must be a finite number",
                "NaN and infinite values are not coordinates.");
  if (p.lon < -180 || p.lon > 180)
    throw Error(ErrorKind::OutOfRange, "longitude must be in -180..180 degrees",
                "Coordinates are WGS 84 longitude and latitude in degrees (EPSG:4326), longitude first.");
  if (p.lat < -90 || p.lat > 90)
    throw Error(ErrorKind::OutOfRange, "latitude must be in -90..90 degrees",
                "Coordinates are WGS 84 longitude and latitude in degrees (EPSG:4326), longitude first.");
  if (std::fabs(p.lat) == 90)
    throw Error(ErrorKind::InvalidParameter, "azimuths are undefined at a pole",
                "Latitude must lie strictly between -90 and 90 degrees.");
}

LonLat geodesic_destination(const LonLat &from, double azimuth, double distance) {
  check_location(from);
  if (!std::isfinite(azimuth))
    throw Error(ErrorKind::OutOfRange, "azimuth must be a finite number",
                "NaN and infinite values are not angles.");
  if (!std::isfinite(distance) || distance < 0 || distance > kMaxGeodesicMetres)
    throw Error(ErrorKind::OutOfRange, "distance must be in 0..20000000 metres");
  LonLat p = geodesic_direct(from, azimuth, distance).point;
  p.lon = wrap_longitude(p.lon);
  return p;
}

double wrap_longitude(double lon) {
  double w = std::fmod(lon, 360.0);
  if (w <= -180) w += 360;
  if (w > 180) w -= 360;
  return w;
}

}  // namespace striae
