-- Maps without PostGIS: geodesic_destination, SHmax bars and focal-sphere
-- diagrams as well-known text, stress_map_row and the per-domain view pattern,
-- error paths. Coordinates are checked against pyproj and PostGIS in
-- tests/external/check_gis_geodesic.py; here: exact cases, structure, wiring.
\i sql/include/setup.sql

-- along the equator a geodesic of s metres turns the longitude by s / a radians
-- (derived: the equator is a circle of radius a = 6378137 m, WGS 84)
SELECT round(p[0]::numeric, 12) AS lon, round(p[1]::numeric, 12) AS lat
  FROM (SELECT geodesic_destination(-1, 0, 90, 6378137 * pi() / 180) p) s;
-- due south by nothing: the start; across the antimeridian: wrapped into (-180, 180]
SELECT geodesic_destination(12.5, -41, 180, 0) AS same,
       (geodesic_destination(179.99, 0, 90, 6378137 * pi() / 180 * 0.02))[0] AS wrapped_lon;

-- SHmax bar of a strike-slip state with sigma1 040/00: three vertices, the
-- middle one the point itself (shmax_azimuth 40, Lund & Townend 2007)
SELECT shmax_bar_wkt(stress_tensor('040/00', '130/00', 0.3), 10, 45, 10000);
SELECT shmax_bar_wkt(stress_tensor('040/00', '130/00', 0.3), 10, 45, 10000)
       = shmax_bar_wkt(40, 10, 45, 10000) AS same_as_azimuth,
       shmax_bar_wkt(220, 10, 45, 10000) = shmax_bar_wkt(40, 10, 45, 10000) AS axis,
       shmax_bar_wkt(-140, 10, 45, 10000) = shmax_bar_wkt(40, 10, 45, 10000) AS axis_negative;
-- due north: from the south end to the north end on the meridian 10
SELECT shmax_bar_wkt(0, 10, 45, 2000) ~ '^LINESTRING\(10 44\.99[0-9]+,10 45,10 45\.00[0-9]+\)$' AS meridian;
-- isotropic horizontal stress (vertical sigma1, Phi 0): no SHmax, no bar
SELECT shmax_bar_wkt(stress_tensor('000/90', '090/00', 0), 10, 45, 10000) IS NULL AS no_bar;

-- focal-sphere diagrams: a vertical strike-slip fault has two compressional
-- and two dilatational quadrants; a pure thrust (T vertical) one compressional
-- lens and two dilatational sides (Aki & Richards conventions, derived)
SELECT f, c,
       left(w, 15) AS kind,
       array_length(regexp_split_to_array(w, '\)\),\(\('), 1) AS polygons
  FROM (VALUES ('0/90/0'::fault_slip), ('0/45/90')) v(f),
       (VALUES (true), (false)) k(c),
       LATERAL focal_quadrants_wkt(f, 10, 45, 5000, c) w
 ORDER BY 1, 2 DESC;
-- both projections, the polygons close on themselves
SELECT p, bool_and(substring(r from '^[^,]+') = substring(r from '[^,]+$')) AS closed, count(*) AS rings
  FROM (VALUES ('equal-area'), ('equal-angle'), ('Equal-Angle')) v(p),
       LATERAL regexp_split_to_table(
         regexp_replace(focal_quadrants_wkt('30/60/40', 10, 45, 5000, true, p), '^MULTIPOLYGON\(\(\(|\)\)\)$', '', 'g'),
         '\)\),\(\(') r
 GROUP BY p ORDER BY p;
-- disc outline: a tangent polygon of ceil(pi / acos(1 / (1 + tol))) corners
-- (at least 8) within tol outside the rim, and the closing point (derived)
SELECT tol, array_length(regexp_split_to_array(focal_disc_wkt(-70, -33, 2000, tol), ','), 1) AS vertices,
       greatest(8, ceil(pi() / acos(1 / (1 + tol)))) + 1 AS expected
  FROM (VALUES (0.5), (0.001), (0.0001)) v(tol);

-- stress_map_row: every column is its accessor (bootstrap inversion of faults
-- whose slips a known tensor predicts: resolved_slip, Wallace 1951, Bott 1959)
CREATE TABLE maps_faults AS
  SELECT g, resolved_slip(plane((g * 47.3) % 360, 25 + (g * 13.1) % 60), stress_tensor('030/10', '125/25', 0.35)) AS f
    FROM generate_series(1, 40) g;
CREATE TABLE maps_tensor AS SELECT stress_inversion(f, 200, 7) AS t FROM maps_faults;
SELECT m.n = data_count(t) AS n,
       m.sigma1_trend = trend(sigma1(t)) AND m.sigma1_plunge = plunge(sigma1(t))
         AND m.sigma2_trend = trend(sigma2(t)) AND m.sigma2_plunge = plunge(sigma2(t))
         AND m.sigma3_trend = trend(sigma3(t)) AND m.sigma3_plunge = plunge(sigma3(t)) AS axes,
       m.phi = shape_ratio(t) AND ARRAY[m.phi_low, m.phi_high] = shape_ratio_interval(t) AS phi,
       m.shmax_azimuth = shmax_azimuth(t) AND m.regime = stress_regime(t) AND m.a_phi = regime_index(t) AS shmax_regime,
       m.mean_misfit = mean_misfit(t) AS misfit,
       m.sigma1_cone = sigma1_confidence(t) AND m.sigma2_cone = sigma2_confidence(t)
         AND m.sigma3_cone = sigma3_confidence(t) AS cones,
       m.longitude = 8.25 AND m.latitude = 46.5 AS location,
       m.shmax_bar = shmax_bar_wkt(t, 8.25, 46.5, 5000) AS bar,
       m.sigma1_cone IS NOT NULL AND m.phi_low IS NOT NULL AS bootstrapped
  FROM maps_tensor, LATERAL stress_map_row(t, 8.25, 46.5, 5000) m;
-- NULL arguments give NULL columns, the others stay
SELECT m.n IS NULL AS no_n, m.longitude, m.latitude, m.shmax_bar IS NULL AS no_bar
  FROM stress_map_row(NULL, 8.25, 46.5, 5000) m;
SELECT m.regime, m.longitude IS NULL AS no_lon, m.shmax_bar IS NULL AS no_bar
  FROM stress_map_row(stress_tensor('040/00', '130/00', 0.3), NULL, 46.5, 5000) m;

-- the view pattern without PostGIS: one row per domain with its location
CREATE TABLE maps_sites (site text PRIMARY KEY, lon float8, lat float8);
INSERT INTO maps_sites VALUES ('Alder Gap', 8.25, 46.5), ('Birch Knoll', 8.4, 46.55);
CREATE TABLE maps_site_faults AS
  SELECT CASE WHEN g % 2 = 0 THEN 'Alder Gap' ELSE 'Birch Knoll' END AS site, f FROM maps_faults;
CREATE VIEW maps_site_stress AS
  SELECT d.site, count_data, m.*
    FROM (SELECT site, count(*) AS count_data, stress_inversion(f) AS t FROM maps_site_faults GROUP BY site) d
    JOIN maps_sites s USING (site)
    CROSS JOIN LATERAL stress_map_row(d.t, s.lon, s.lat, 4000) m;
SELECT site, count_data, n, regime, shmax_bar LIKE 'LINESTRING(%,' || lon || ' ' || lat || ',%)' AS bar_through_site
  FROM maps_site_stress JOIN maps_sites USING (site) ORDER BY site;

-- errors
SELECT q, pg_temp.err(q) FROM (VALUES
  ('SELECT geodesic_destination(0, 0, 0, -1)'),
  ('SELECT geodesic_destination(0, 0, 0, 2.1e7)'),
  ('SELECT geodesic_destination(0, 0, ''NaN'', 1)'),
  ('SELECT geodesic_destination(181, 0, 0, 1)'),
  ('SELECT geodesic_destination(0, -91, 0, 1)'),
  ('SELECT geodesic_destination(0, 90, 0, 1)'),
  ('SELECT geodesic_destination(''Infinity'', 0, 0, 1)'),
  ('SELECT shmax_bar_wkt(10, 0, 0, 0)'),
  ('SELECT shmax_bar_wkt(10, 0, 0, 1000001)'),
  ('SELECT shmax_bar_wkt(''NaN'', 0, 0, 10)'),
  ('SELECT shmax_bar_wkt(stress_tensor(''000/90'', ''090/00'', 0), 0, 0, -5)'),
  ('SELECT shmax_bar_wkt(stress_tensor(''040/00'', ''130/00'', 0.3), 0, ''NaN'', 10)'),
  ('SELECT focal_quadrants_wkt(''0/90/0'', 0, 0, 0)'),
  ('SELECT focal_quadrants_wkt(''0/90/0'', 0, 0, 10, true, ''mercator'')'),
  ('SELECT focal_quadrants_wkt(''0/90/0'', 0, 0, 10, true, ''equal-area'', 1e-7)'),
  ('SELECT focal_quadrants_wkt(''0/90/0'', 0, 0, 10, true, ''equal-area'', 0.6)'),
  ('SELECT focal_disc_wkt(0, 0, 10, ''NaN'')'),
  ('SELECT focal_disc_wkt(0, 95, 10)')) t(q);
-- STRICT: NULL in, NULL out
SELECT geodesic_destination(NULL, 0, 0, 1) IS NULL AS a, shmax_bar_wkt(NULL::float8, 0, 0, 1) IS NULL AS b,
       focal_quadrants_wkt('0/90/0', 0, 0, 10, NULL) IS NULL AS c, focal_disc_wkt(0, 0, NULL) IS NULL AS d;

DROP VIEW maps_site_stress;
DROP TABLE maps_faults, maps_tensor, maps_sites, maps_site_faults;
