-- The district as GIS layers (README, "Maps and GIS layers"): the documented view
-- pattern over the demo's per-domain tensors (demo/domains.sql) with the PostGIS
-- companion extension striae_gis. demo/run.sh has GDAL's ogr2ogr read the views into
-- GeoJSON, as any GIS client would read them over a PostgreSQL connection.
-- Interpretive results of an invented data set: see the caution in demo/README.md.
\set QUIET on
CREATE EXTENSION IF NOT EXISTS postgis;
CREATE EXTENSION IF NOT EXISTS striae_gis;
-- One row per domain: its point, every stress column and the SHmax bar, 5 km long.
CREATE OR REPLACE VIEW domain_stress AS
  SELECT d.domain, d.site, d.map_unit, d.age_class, d.data, m.*
    FROM domain_tensor d
    CROSS JOIN LATERAL stress_map_feature(d.t, ST_SetSRID(ST_MakePoint(d.lon, d.lat), 4326), 5000) m;
-- One row per focal mechanism: the compressional quadrants and the disc under them,
-- 600 m in radius, at the epicentre (the projection of the figures, equal-area).
CREATE OR REPLACE VIEW mechanism_symbols AS
  SELECT e.event_id, e.site, e.depth_km, e.mechanism::text AS mechanism,
         focal_quadrants(e.mechanism, ST_SetSRID(ST_MakePoint(e.lon, e.lat), 4326), 600)::geometry(MultiPolygon, 4326) AS compressional,
         focal_disc(ST_SetSRID(ST_MakePoint(e.lon, e.lat), 4326), 600)::geometry(Polygon, 4326) AS disc
    FROM focal_event e;
\set QUIET off
SELECT count(*) AS domains, count(shmax_bar) AS with_shmax_bar FROM domain_stress;
SELECT count(*) AS mechanisms, count(compressional) AS with_quadrants FROM mechanism_symbols;
