-- striae_gis: striae results as PostGIS geometries (EPSG:4326, WGS 84).
-- SQL only. The geometry comes from striae's well-known-text functions
-- (shmax_bar_wkt, focal_quadrants_wkt, focal_disc_wkt, stress_map_row: geodesics
-- on the WGS 84 ellipsoid computed in striae, src/core/geodesic.*), so a layer
-- made with PostGIS and one made without it carry the same coordinates.
--
-- Name binding: the functions below have SQL-standard bodies (BEGIN ATOMIC),
-- which are bound to striae's and PostGIS's objects when this script runs
-- (CREATE EXTENSION puts their schemas on the search_path); the one PL/pgSQL
-- function keeps that search_path (SET search_path FROM CURRENT). Relocating
-- striae or PostGIS afterwards is not supported while striae_gis is installed.
\echo Use "CREATE EXTENSION striae_gis" to load this file. \quit

-- ---- locations -------------------------------------------------------------------

CREATE FUNCTION wgs84_lonlat(location geometry) RETURNS float8[]
  LANGUAGE plpgsql IMMUTABLE STRICT PARALLEL SAFE SET search_path FROM CURRENT AS $$
DECLARE
  p geometry := location;
BEGIN
  IF ST_GeometryType(p) <> 'ST_Point' THEN
    RAISE EXCEPTION 'location must be a point, not %', ST_GeometryType(p)
      USING ERRCODE = '22023', HINT = 'Use the point the symbol stands for, e.g. ST_PointOnSurface(area).';
  END IF;
  IF ST_IsEmpty(p) THEN
    RAISE EXCEPTION 'location is an empty point' USING ERRCODE = '22023';
  END IF;
  IF ST_SRID(p) = 0 THEN
    RAISE EXCEPTION 'location has no SRID'
      USING ERRCODE = '22023', HINT = 'Set it: ST_SetSRID(ST_MakePoint(longitude, latitude), 4326) for WGS 84 degrees.';
  END IF;
  IF ST_SRID(p) <> 4326 THEN
    IF NOT EXISTS (SELECT 1 FROM spatial_ref_sys WHERE srid = ST_SRID(p)) THEN
      RAISE EXCEPTION 'location has SRID %, which spatial_ref_sys does not define', ST_SRID(p)
        USING ERRCODE = '22023';
    END IF;
    p := ST_Transform(p, 4326);
  END IF;
  RETURN ARRAY[ST_X(p), ST_Y(p)];
END $$;
COMMENT ON FUNCTION wgs84_lonlat(geometry) IS
  'WGS 84 {longitude, latitude} of a point geometry (transformed to EPSG:4326 when it has another SRID); 22023 for a geometry that is not a point, an empty point or a point without SRID';

-- ---- symbols ---------------------------------------------------------------------

CREATE FUNCTION shmax_bar(stress_tensor, location geometry, length_m float8) RETURNS geometry
  LANGUAGE sql IMMUTABLE STRICT PARALLEL SAFE
BEGIN ATOMIC
  SELECT ST_GeomFromText(shmax_bar_wkt($1, (s.c)[1], (s.c)[2], length_m), 4326)
    FROM (SELECT wgs84_lonlat(location) AS c) s;
END;
COMMENT ON FUNCTION shmax_bar(stress_tensor, geometry, float8) IS
  'SHmax bar of the tensor at the point: LineString (EPSG:4326) of three vertices (end, centre, end), a geodesic on the WGS 84 ellipsoid of length_m metres centred on the point whose azimuth at the centre is shmax_azimuth; NULL when horizontal stress is isotropic. Results are interpretive; where fault reactivation, induced seismicity, or slope or excavation stability matters, defer to site investigation, local codes and licensed professionals';

CREATE FUNCTION shmax_bar(azimuth float8, location geometry, length_m float8) RETURNS geometry
  LANGUAGE sql IMMUTABLE STRICT PARALLEL SAFE
BEGIN ATOMIC
  SELECT ST_GeomFromText(shmax_bar_wkt(azimuth, (s.c)[1], (s.c)[2], length_m), 4326)
    FROM (SELECT wgs84_lonlat(location) AS c) s;
END;
COMMENT ON FUNCTION shmax_bar(float8, geometry, float8) IS
  'bar along an azimuth (degrees, read modulo 180) at the point: LineString (EPSG:4326) from the end at azimuth + 180 through the point to the end at the azimuth, a geodesic on the WGS 84 ellipsoid of length_m metres';

CREATE FUNCTION focal_quadrants(mechanism fault_slip, epicentre geometry, radius_m float8,
                                compressional boolean DEFAULT true, projection text DEFAULT 'equal-area',
                                tolerance float8 DEFAULT 0.001) RETURNS geometry
  LANGUAGE sql IMMUTABLE STRICT PARALLEL SAFE
BEGIN ATOMIC
  SELECT ST_GeomFromText(focal_quadrants_wkt(mechanism, (s.c)[1], (s.c)[2], radius_m, compressional, projection, tolerance), 4326)
    FROM (SELECT wgs84_lonlat(epicentre) AS c) s;
END;
COMMENT ON FUNCTION focal_quadrants(fault_slip, geometry, float8, boolean, text, float8) IS
  'focal-sphere diagram of the mechanism at the epicentre: MultiPolygon (EPSG:4326) of its quadrants of compressional first motion (containing T; the dilatational ones, containing P, when compressional is false), lower hemisphere in the projection of the figures (equal-area or equal-angle), in a disc of radius_m metres placed on the WGS 84 ellipsoid by geodesics from the epicentre (see focal_quadrants_wkt)';

CREATE FUNCTION focal_disc(epicentre geometry, radius_m float8, tolerance float8 DEFAULT 0.001) RETURNS geometry
  LANGUAGE sql IMMUTABLE STRICT PARALLEL SAFE
BEGIN ATOMIC
  SELECT ST_GeomFromText(focal_disc_wkt((s.c)[1], (s.c)[2], radius_m, tolerance), 4326)
    FROM (SELECT wgs84_lonlat(epicentre) AS c) s;
END;
COMMENT ON FUNCTION focal_disc(geometry, float8, float8) IS
  'outline of a focal-sphere diagram of radius_m metres at the epicentre: Polygon (EPSG:4326), the background under focal_quadrants';

-- ---- one row per domain ----------------------------------------------------------

CREATE TYPE stress_map_feature AS (
  geom geometry(Point, 4326),
  n bigint,
  sigma1_trend float8, sigma1_plunge float8,
  sigma2_trend float8, sigma2_plunge float8,
  sigma3_trend float8, sigma3_plunge float8,
  phi float8, phi_low float8, phi_high float8,
  shmax_azimuth float8, regime text, a_phi float8, mean_misfit float8,
  sigma1_cone float8, sigma2_cone float8, sigma3_cone float8,
  longitude float8, latitude float8,
  shmax_bar geometry(LineString, 4326));
COMMENT ON TYPE stress_map_feature IS
  'one domain of a stress map: the columns of striae''s stress_map_row with the location as a Point and the SHmax bar as a LineString (EPSG:4326)';

CREATE FUNCTION stress_map_feature(t stress_tensor, location geometry, bar_length_m float8)
  RETURNS stress_map_feature LANGUAGE sql IMMUTABLE PARALLEL SAFE
BEGIN ATOMIC
  SELECT CASE WHEN m.longitude IS NOT NULL AND m.latitude IS NOT NULL
              THEN ST_SetSRID(ST_MakePoint(m.longitude, m.latitude), 4326) END,
         m.n, m.sigma1_trend, m.sigma1_plunge, m.sigma2_trend, m.sigma2_plunge,
         m.sigma3_trend, m.sigma3_plunge, m.phi, m.phi_low, m.phi_high,
         m.shmax_azimuth, m.regime, m.a_phi, m.mean_misfit,
         m.sigma1_cone, m.sigma2_cone, m.sigma3_cone, m.longitude, m.latitude,
         ST_GeomFromText(m.shmax_bar, 4326)
    FROM (SELECT wgs84_lonlat(location) AS c) s,
         LATERAL stress_map_row(t, (s.c)[1], (s.c)[2], bar_length_m) m;
END;
COMMENT ON FUNCTION stress_map_feature(stress_tensor, geometry, float8) IS
  'the columns of a stress-map layer for one domain as PostGIS geometries; use as CROSS JOIN LATERAL stress_map_feature(t, location, bar_length_m); NULL arguments give NULL columns. Results are interpretive; where fault reactivation, induced seismicity, or slope or excavation stability matters, defer to site investigation, local codes and licensed professionals';
