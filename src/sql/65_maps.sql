-- Maps without PostGIS: the geodesic direct problem on the WGS 84 ellipsoid,
-- SHmax bars and focal-sphere diagrams at a point as well-known text
-- (EPSG:4326 longitude/latitude), and one row per domain for a stress map.
-- The companion extension striae_gis turns the same text into PostGIS geometry.

CREATE FUNCTION geodesic_destination(longitude float8, latitude float8, azimuth float8, distance_m float8) RETURNS point
  AS 'MODULE_PATHNAME' LANGUAGE C IMMUTABLE STRICT PARALLEL SAFE;
COMMENT ON FUNCTION geodesic_destination(float8, float8, float8, float8) IS
  'end of the geodesic on the WGS 84 ellipsoid that leaves (longitude, latitude) at the azimuth (degrees clockwise from north) with length distance_m (0..20000000 m), as a point (x longitude in (-180, 180], y latitude); direct problem of Vincenty (1975)';

CREATE FUNCTION shmax_bar_wkt(stress_tensor, longitude float8, latitude float8, length_m float8) RETURNS text
  AS 'MODULE_PATHNAME', 'stress_shmax_bar_wkt' LANGUAGE C IMMUTABLE STRICT PARALLEL SAFE;
COMMENT ON FUNCTION shmax_bar_wkt(stress_tensor, float8, float8, float8) IS
  'SHmax bar of the tensor at (longitude, latitude), WGS 84: well-known text LINESTRING of three vertices (end, centre, end), a geodesic of length_m metres (over 0, at most 1000000) centred on the point whose azimuth at the centre is shmax_azimuth; NULL when horizontal stress is isotropic. Results are interpretive; where fault reactivation, induced seismicity, or slope or excavation stability matters, defer to site investigation, local codes and licensed professionals';
CREATE FUNCTION shmax_bar_wkt(azimuth float8, longitude float8, latitude float8, length_m float8) RETURNS text
  AS 'MODULE_PATHNAME', 'azimuth_shmax_bar_wkt' LANGUAGE C IMMUTABLE STRICT PARALLEL SAFE;
COMMENT ON FUNCTION shmax_bar_wkt(float8, float8, float8, float8) IS
  'bar along an azimuth (degrees, an axis: read modulo 180) at (longitude, latitude), WGS 84: well-known text LINESTRING of three vertices from the end at azimuth + 180 through the centre to the end at the azimuth, a geodesic of length_m metres (over 0, at most 1000000)';

CREATE FUNCTION focal_quadrants_wkt(mechanism fault_slip, longitude float8, latitude float8, radius_m float8,
                                    compressional boolean DEFAULT true, projection text DEFAULT 'equal-area',
                                    tolerance float8 DEFAULT 0.001) RETURNS text
  AS 'MODULE_PATHNAME' LANGUAGE C IMMUTABLE STRICT PARALLEL SAFE;
COMMENT ON FUNCTION focal_quadrants_wkt(fault_slip, float8, float8, float8, boolean, text, float8) IS
  'focal-sphere diagram of the mechanism at (longitude, latitude), WGS 84: well-known text MULTIPOLYGON of its quadrants of compressional first motion (containing T; the dilatational ones, containing P, when compressional is false), lower hemisphere in the projection of the figures (equal-area or equal-angle), in a disc of radius_m metres (over 0, at most 1000000); a disc point at polar angle and radius (azimuth, rho) is placed at the end of the geodesic from the epicentre at that azimuth with length rho * radius_m; curves within tolerance (1e-6..0.5) of the radius';
CREATE FUNCTION focal_disc_wkt(longitude float8, latitude float8, radius_m float8, tolerance float8 DEFAULT 0.001) RETURNS text
  AS 'MODULE_PATHNAME' LANGUAGE C IMMUTABLE STRICT PARALLEL SAFE;
COMMENT ON FUNCTION focal_disc_wkt(float8, float8, float8, float8) IS
  'outline of a focal-sphere diagram of radius_m metres at (longitude, latitude), WGS 84: well-known text POLYGON of rim points placed as focal_quadrants_wkt places them, chords within tolerance (1e-6..0.5) of the radius';

CREATE TYPE stress_map_row AS (
  n bigint,
  sigma1_trend float8, sigma1_plunge float8,
  sigma2_trend float8, sigma2_plunge float8,
  sigma3_trend float8, sigma3_plunge float8,
  phi float8, phi_low float8, phi_high float8,
  shmax_azimuth float8, regime text, a_phi float8, mean_misfit float8,
  sigma1_cone float8, sigma2_cone float8, sigma3_cone float8,
  longitude float8, latitude float8,
  shmax_bar text);
COMMENT ON TYPE stress_map_row IS
  'one domain of a stress map: data count, principal axes, shape ratio Phi with its bootstrap interval, SHmax azimuth, regime, A-phi, mean misfit, bootstrap cone half-angles, location and the SHmax bar as well-known text';

-- Not STRICT: a domain without a tensor keeps its location, one without a
-- location keeps its stress columns. SQL-standard body: bound at creation.
CREATE FUNCTION stress_map_row(t stress_tensor, longitude float8, latitude float8, bar_length_m float8)
  RETURNS stress_map_row LANGUAGE sql IMMUTABLE PARALLEL SAFE
BEGIN ATOMIC
  SELECT data_count(t),
         trend(sigma1(t)), plunge(sigma1(t)),
         trend(sigma2(t)), plunge(sigma2(t)),
         trend(sigma3(t)), plunge(sigma3(t)),
         shape_ratio(t), (shape_ratio_interval(t))[1], (shape_ratio_interval(t))[2],
         shmax_azimuth(t), stress_regime(t), regime_index(t), mean_misfit(t),
         sigma1_confidence(t), sigma2_confidence(t), sigma3_confidence(t),
         longitude, latitude,
         shmax_bar_wkt(t, longitude, latitude, bar_length_m);
END;
COMMENT ON FUNCTION stress_map_row(stress_tensor, float8, float8, float8) IS
  'the columns of a stress-map layer for one domain (see the type stress_map_row); use as CROSS JOIN LATERAL stress_map_row(t, lon, lat, bar_length_m); NULL arguments give NULL columns. Results are interpretive; where fault reactivation, induced seismicity, or slope or excavation stability matters, defer to site investigation, local codes and licensed professionals';
