-- The per-domain result table as a map layer: GeoJSON (RFC 7946), one Feature per row
-- of domain_result, ordered by its column `domain`; the geometry a Point at (lon,
-- lat), WGS 84 degrees (null for a domain without coordinates, which RFC 7946 allows,
-- so no domain is dropped); the properties every column of the row, in table order.
-- One SELECT printing one document: psql -At -f domain_geojson.sql -o domains.geojson.
--
-- This is the one step that turns the table into a layer. It uses nothing but
-- PostgreSQL's json functions; where the PostGIS companion extension is installed,
-- a GIS reads its per-domain view directly and this file can be swapped for it.
SELECT json_build_object(
         'type', 'FeatureCollection',
         'features', coalesce(json_agg(
           json_build_object(
             'type', 'Feature',
             'geometry', CASE WHEN d.lon IS NULL OR d.lat IS NULL THEN NULL
                              ELSE json_build_object('type', 'Point', 'coordinates', json_build_array(d.lon, d.lat)) END,
             'properties', row_to_json(d))
           ORDER BY d.domain), '[]'::json))
  FROM domain_result d;
