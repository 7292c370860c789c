-- search_path safety: objects of a schema placed first on the caller's
-- search_path must not stand in for what striae's SQL uses. The hostile schema
-- below has domains named text, json and jsonb whose checks report when they
-- run, and same-named functions and operators; with it first on search_path
-- every result of striae is unchanged and no hostile code runs.
\set VERBOSITY terse
\i sql/include/setup.sql

CREATE SCHEMA hostile;
CREATE FUNCTION hostile.ran(v anyelement) RETURNS boolean LANGUAGE plpgsql AS $$
BEGIN
  RAISE NOTICE 'hostile code ran';
  RETURN true;
END $$;
CREATE DOMAIN hostile.text AS pg_catalog.text CHECK (hostile.ran(VALUE));
CREATE DOMAIN hostile.json AS pg_catalog.json CHECK (hostile.ran(VALUE));
CREATE DOMAIN hostile.jsonb AS pg_catalog.jsonb CHECK (hostile.ran(VALUE));
-- same-named functions and operators
CREATE FUNCTION hostile.row_number() RETURNS bigint LANGUAGE sql AS 'SELECT 0::pg_catalog.int8';
CREATE FUNCTION hostile.strike(plane) RETURNS float8 LANGUAGE sql AS 'SELECT -1::pg_catalog.float8';
CREATE FUNCTION hostile.eq_any(pg_catalog.text, pg_catalog.text) RETURNS boolean LANGUAGE sql
  AS 'SELECT hostile.ran(1)';
CREATE OPERATOR hostile.= (LEFTARG = pg_catalog.text, RIGHTARG = pg_catalog.text, FUNCTION = hostile.eq_any);
CREATE FUNCTION hostile.lt_any(plane, plane) RETURNS boolean LANGUAGE sql AS 'SELECT hostile.ran(1)';
CREATE OPERATOR hostile.< (LEFTARG = plane, RIGHTARG = plane, FUNCTION = hostile.lt_any);

CREATE TABLE sp_data (i int, s stress_tensor, g sphere_grid, lit text);
INSERT INTO sp_data VALUES
  (1, stress_tensor('10/5'::lineation, '100/20'::lineation, 0.4),
   '{"kind": "density", "spacing": 45, "n": 3, "values": [1, 2, 3, 4, 5, 6, 7, 8, 9, 10, 11]}', '110/64'),
  (2, NULL, NULL, '110/95'),
  (3, NULL, NULL, 'xyz');

-- The results without the hostile schema ...
CREATE TEMP TABLE sp_before AS
  SELECT (SELECT json_agg(to_json(d) ORDER BY i)::pg_catalog.text FROM sp_data d) AS j,
         (SELECT jsonb_agg(jsonb_build_object('s', s::jsonb, 'g', g::jsonb) ORDER BY i)::pg_catalog.text FROM sp_data) AS jb,
         (SELECT string_agg(line || ':' || value || ':' || reason, ';' ORDER BY line)
            FROM input_errors('sp_data', 'lit', 'plane')) AS errs;

-- ... and with it first on search_path (pg_catalog after it, as a caller may set).
SET search_path = hostile, pg_catalog, public;
SELECT (SELECT pg_catalog.json_agg(pg_catalog.to_json(d) ORDER BY i)::pg_catalog.text FROM public.sp_data d)
         OPERATOR(pg_catalog.=) (SELECT j FROM sp_before) AS json_unchanged,
       (SELECT pg_catalog.jsonb_agg(pg_catalog.jsonb_build_object('s', s::pg_catalog.jsonb, 'g', g::pg_catalog.jsonb)
                                    ORDER BY i)::pg_catalog.text FROM public.sp_data)
         OPERATOR(pg_catalog.=) (SELECT jb FROM sp_before) AS jsonb_unchanged;
-- the casts themselves (the hostile domains would say so if the casts' SQL
-- bodies named text, json or jsonb through the search_path)
SELECT s::pg_catalog.json::pg_catalog.text OPERATOR(pg_catalog.=) ((SELECT j FROM sp_before)::pg_catalog.json->0->>'s')
         AS cast_json,
       (s::pg_catalog.jsonb->'components')::pg_catalog.text AS cast_jsonb,
       g::pg_catalog.json->>'spacing' AS grid_json, g::pg_catalog.jsonb->'values'->>10 AS grid_jsonb
  FROM public.sp_data WHERE i OPERATOR(pg_catalog.=) 1;
-- input_errors builds and runs a query of its own
SELECT pg_catalog.string_agg(line || ':' || value || ':' || reason, ';' ORDER BY line)
         OPERATOR(pg_catalog.=) (SELECT errs FROM sp_before) AS input_errors_unchanged
  FROM public.input_errors('public.sp_data', 'lit', 'plane');
SELECT pg_catalog.string_agg(line || ':' || value, ';' ORDER BY line) AS with_line_column
  FROM public.input_errors('public.sp_data', 'lit', 'plane', 'i');
-- striae's operators and functions resolve to striae's, not to the schema's
SELECT public.strike('110/64'::public.plane) AS strike,
       '110/64'::public.plane OPERATOR(public.<) '120/64'::public.plane AS lt;
RESET search_path;

DROP TABLE sp_data;
DROP SCHEMA hostile CASCADE;
