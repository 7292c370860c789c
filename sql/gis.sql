-- The companion extension striae_gis (requires striae and PostGIS): creation,
-- symbols as geometries, their validity and geometry against PostGIS's own
-- geodesics (ST_Project on the spheroid), areas, axes inside their quadrants,
-- the per-domain feature, locations in other SRIDs, errors. PostGIS is removed
-- at the end, so the files after this one run on striae alone.
\i sql/include/setup.sql

-- PostGIS missing: CREATE EXTENSION names it (PostgreSQL's own check of requires)
SELECT pg_temp.err('CREATE EXTENSION striae_gis');
SET client_min_messages = warning;
CREATE EXTENSION striae_gis CASCADE;
RESET client_min_messages;
SELECT extname, extrelocatable FROM pg_extension WHERE extname IN ('striae', 'striae_gis', 'postgis') ORDER BY 1;

CREATE TABLE gis_pt AS SELECT ST_SetSRID(ST_MakePoint(10, 45), 4326) AS p;

-- the geometries are striae's well-known text, coordinate for coordinate
SELECT ST_OrderingEquals(shmax_bar(stress_tensor('040/00', '130/00', 0.3), p, 10000),
                         ST_GeomFromText(shmax_bar_wkt(stress_tensor('040/00', '130/00', 0.3), 10, 45, 10000), 4326)) AS bar,
       ST_OrderingEquals(shmax_bar(40.0, p, 10000), ST_GeomFromText(shmax_bar_wkt(40, 10, 45, 10000), 4326)) AS bar_azimuth,
       ST_OrderingEquals(focal_quadrants('30/60/40', p, 5000, false, 'equal-angle', 0.002),
                         ST_GeomFromText(focal_quadrants_wkt('30/60/40', 10, 45, 5000, false, 'equal-angle', 0.002), 4326)) AS quadrants,
       ST_OrderingEquals(focal_disc(p, 5000), ST_GeomFromText(focal_disc_wkt(10, 45, 5000), 4326)) AS disc,
       ST_SRID(shmax_bar(40.0, p, 10000)) AS srid,
       GeometryType(shmax_bar(40.0, p, 10000)) AS bar_type,
       GeometryType(focal_quadrants('30/60/40', p, 5000)) AS quadrants_type,
       GeometryType(focal_disc(p, 5000)) AS disc_type
  FROM gis_pt;

-- bar ends against PostGIS's geodesic on the WGS 84 spheroid (ST_Project on
-- geography; PostGIS 3 solves it with PROJ's geodesic routines, Karney 2013):
-- within a micrometre; length and the azimuths at the centre from ST_Distance
-- and ST_Azimuth on the spheroid
SELECT a, len,
       round(ST_Distance(ST_PointN(b, 3)::geography, ST_Project(p::geography, len / 2, radians(a)))::numeric, 6) AS end_off_m,
       round(ST_Distance(ST_PointN(b, 1)::geography, ST_Project(p::geography, len / 2, radians(a + 180)))::numeric, 6) AS start_off_m,
       round((ST_Distance(ST_PointN(b, 1)::geography, p::geography) + ST_Distance(p::geography, ST_PointN(b, 3)::geography))::numeric, 4) AS length_m,
       round(degrees(ST_Azimuth(p::geography, ST_PointN(b, 3)::geography))::numeric, 8) AS azimuth_at_centre
  FROM gis_pt, (VALUES (0.0, 1000.0), (40, 10000), (123.4, 50000), (179.9, 200000)) v(a, len),
       LATERAL shmax_bar(a, p, len) b
 ORDER BY a;

-- validity: quadrants of 300 mechanisms, both projections (ST_IsValid, OGC rules),
-- among them a vertical and a horizontal nodal plane, and one with B vertical
SELECT proj, count(*) AS mechanisms,
       count(*) FILTER (WHERE ST_IsValid(c) AND ST_IsValid(d)) AS valid,
       count(*) FILTER (WHERE ST_IsValid(focal_disc(p, 3000))) AS disc_valid
  FROM gis_pt, (VALUES ('equal-area'), ('equal-angle')) v(proj),
       (SELECT fault_slip((g * 71.3) % 360, (g * 37.9) % 90, (g * 113.7) % 360 - 180) AS f
          FROM generate_series(1, 146) g
        UNION ALL VALUES ('0/90/0'::fault_slip), ('0/45/90'), ('0/0/30'), ('10/90/90')) m,
       LATERAL (SELECT focal_quadrants(f, p, 3000, true, proj) c, focal_quadrants(f, p, 3000, false, proj) d) q
 GROUP BY proj ORDER BY proj;

-- areas on the spheroid: the compressional quadrants of a vertical strike-slip
-- fault are half the disc in either projection (symmetry); in the equal-area
-- projection those of any double couple are half (areas are solid angles, and
-- compressional directions are half the sphere: derived); quadrants and the
-- disc cover the same area (within the drawing tolerance)
SELECT f, proj,
       round((ST_Area(focal_quadrants(f, p, 4000, true, proj, 1e-5)::geography)
              / ST_Area(focal_disc(p, 4000, 1e-5)::geography))::numeric, 4) AS compressional_fraction,
       round(((ST_Area(focal_quadrants(f, p, 4000, true, proj, 1e-5)::geography)
               + ST_Area(focal_quadrants(f, p, 4000, false, proj, 1e-5)::geography))
              / ST_Area(focal_disc(p, 4000, 1e-5)::geography))::numeric, 4) AS both
  FROM gis_pt, (VALUES ('0/90/0'::fault_slip, 'equal-angle'), ('0/90/0', 'equal-area'),
                       ('30/60/40', 'equal-area'), ('312/23/-71', 'equal-area'), ('75/80/165', 'equal-area')) v(f, proj)
 ORDER BY 1, 2;

-- T lies in the compressional quadrants and P in the dilatational ones (Aki &
-- Richards: compressional first motion around T); each axis placed at 0.999 of
-- its disc position (net_xy) by geodesic_destination
CREATE FUNCTION pg_temp.axis_at(xy point) RETURNS geometry LANGUAGE sql AS $$
  SELECT ST_SetSRID(geodesic_destination(10, 45, degrees(atan2(xy[0], xy[1])),
                                         3000 * 0.999 * sqrt(xy[0]^2 + xy[1]^2))::geometry, 4326) $$;
SELECT proj, count(*) AS mechanisms,
       count(*) FILTER (WHERE ST_Contains(c, pg_temp.axis_at(t)) AND NOT ST_Contains(c, pg_temp.axis_at(pp))) AS t_in_not_p,
       count(*) FILTER (WHERE ST_Contains(d, pg_temp.axis_at(pp)) AND NOT ST_Contains(d, pg_temp.axis_at(t))) AS p_in_not_t
  FROM gis_pt, (VALUES ('equal-area'), ('equal-angle')) v(proj),
       generate_series(1, 60) g,
       LATERAL (SELECT fault_slip((g * 53.1) % 360, 1 + (g * 29.3) % 89, (g * 97.1) % 360 - 180) AS f) m,
       LATERAL (SELECT focal_quadrants(f, p, 3000, true, proj) c, focal_quadrants(f, p, 3000, false, proj) d,
                       net_xy(t_axis(f), proj) t, net_xy(p_axis(f), proj) pp) q
 GROUP BY proj ORDER BY proj;
-- every vertex within one radius (3000 m) of the epicentre, on the spheroid,
-- but for the corners of the rim, drawn outside it by at most the tolerance
-- (0.001 of the radius: 3 m)
SELECT round(max(ST_Distance((dp).geom::geography, p::geography))::numeric, 3) AS farthest_m
  FROM gis_pt, generate_series(1, 20) g,
       LATERAL ST_DumpPoints(focal_quadrants(fault_slip(g * 17, g * 4, g * 9 - 90), p, 3000)) dp;

-- one row per domain: the feature is stress_map_row with geometries
SELECT ST_AsText(m.geom) AS geom, m.n, m.regime, m.shmax_azimuth,
       ST_OrderingEquals(m.shmax_bar, ST_GeomFromText(r.shmax_bar, 4326)) AS same_bar,
       (m.sigma1_trend, m.sigma1_plunge, m.sigma2_trend, m.sigma2_plunge, m.sigma3_trend, m.sigma3_plunge,
        m.phi, m.phi_low, m.phi_high, m.a_phi, m.mean_misfit, m.sigma1_cone, m.sigma2_cone, m.sigma3_cone,
        m.longitude, m.latitude)
       IS NOT DISTINCT FROM
       (r.sigma1_trend, r.sigma1_plunge, r.sigma2_trend, r.sigma2_plunge, r.sigma3_trend, r.sigma3_plunge,
        r.phi, r.phi_low, r.phi_high, r.a_phi, r.mean_misfit, r.sigma1_cone, r.sigma2_cone, r.sigma3_cone,
        r.longitude, r.latitude) AS same_columns
  FROM gis_pt, LATERAL (SELECT stress_tensor('040/00', '130/00', 0.3) t) s,
       LATERAL stress_map_feature(t, p, 8000) m, LATERAL stress_map_row(t, 10, 45, 8000) r;
-- column types a GIS reads from a view over it (geometry_columns)
CREATE VIEW gis_domains AS
  SELECT 'Cedar Flat'::text AS domain, m.* FROM gis_pt, LATERAL stress_map_feature(stress_tensor('040/00', '130/00', 0.3), p, 8000) m;
SELECT f_geometry_column, type, srid FROM geometry_columns WHERE f_table_name = 'gis_domains' ORDER BY 1;
DROP VIEW gis_domains;
-- NULL tensor: location kept; NULL location: stress kept
SELECT ST_AsText(m.geom) AS geom, m.n, m.shmax_bar IS NULL AS no_bar
  FROM gis_pt, LATERAL stress_map_feature(NULL, p, 8000) m;
SELECT m.geom IS NULL AS no_geom, m.regime, m.shmax_bar IS NULL AS no_bar
  FROM stress_map_feature(stress_tensor('040/00', '130/00', 0.3), NULL, 8000) m;

-- locations in another SRID are transformed to EPSG:4326 (Web Mercator here)
SELECT ST_AsText(ST_PointN(shmax_bar(40.0, ST_Transform(p, 3857), 10000), 2), 9) AS centre_from_3857,
       ST_OrderingEquals(focal_disc(ST_Transform(p, 3857), 3000), focal_disc(ST_Transform(ST_Transform(p, 3857), 4326), 3000)) AS disc
  FROM gis_pt;

-- errors
SELECT q, pg_temp.err(q) FROM (VALUES
  ('SELECT shmax_bar(10.0, ST_MakeLine(ST_MakePoint(0, 0), ST_MakePoint(1, 1)), 100)'),
  ('SELECT shmax_bar(10.0, ST_SetSRID(''POINT EMPTY''::geometry, 4326), 100)'),
  ('SELECT shmax_bar(10.0, ST_MakePoint(10, 45), 100)'),
  ('SELECT shmax_bar(10.0, ST_SetSRID(ST_MakePoint(10, 45), 999999), 100)'),
  ('SELECT shmax_bar(10.0, ST_SetSRID(ST_MakePoint(10, 95), 4326), 100)'),
  ('SELECT focal_quadrants(''0/90/0'', ST_SetSRID(ST_MakePoint(10, 45), 4326), 0)'),
  ('SELECT focal_quadrants(''0/90/0'', ST_SetSRID(ST_MakePoint(10, 45), 4326), 10, true, ''mercator'')'),
  ('SELECT focal_disc(ST_SetSRID(ST_MakePoint(10, 45), 4326), 10, 0.9)')) t(q);

DROP FUNCTION pg_temp.axis_at(point);
DROP TABLE gis_pt;
DROP EXTENSION striae_gis;
DROP EXTENSION postgis;
SELECT extname FROM pg_extension WHERE extname <> 'plpgsql' ORDER BY 1;
