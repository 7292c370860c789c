-- Loading field data: checks that return the reason instead of raising, the
-- screening of a staging table, the field-book constructor, fixed-precision
-- display and JSON. Expected orientations follow the conventions of DESIGN.md
-- (right-hand rule, Aki & Richards rake; common practice, no source).
\i sql/include/setup.sql

-- A check says nothing for a literal the cast accepts ...
SELECT plane_input_error('110/64') AS p, lineation_input_error('S60E/30') AS l,
       fault_slip_input_error('N70W 64SW/75W R') AS f, slip_sense_input_error('normal-dextral') AS s,
       stress_tensor_input_error(stress_tensor('040/00', '130/00', 0.3)::text) AS t,
       sphere_grid_input_error((SELECT density_grid(l, 45) FROM (VALUES ('120/30'::lineation)) v(l))::text) AS g;
-- ... and gives the reason where the cast raises (the error beside it).
SELECT v, plane_input_error(v) AS reason, pg_temp.err(format('SELECT %L::plane', v)) AS cast_error
  FROM (VALUES ('110/64X'), ('110/95'), ('0/30S'), (''), ('N70W 64'), ('110/64/3')) t(v);
SELECT v, lineation_input_error(v) AS reason FROM (VALUES ('120'), ('120/30/5'), ('400/10'), ('30->S100E')) t(v);
SELECT v, fault_slip_input_error(v) AS reason
  FROM (VALUES ('110/64/75'), ('110/64/75 Q'), ('290/64S/-75'), ('110/64/75W'), ('110/64/75 N D')) t(v);
SELECT v, slip_sense_input_error(v) AS reason FROM (VALUES ('nd'), ('normal reverse'), ('up')) t(v);
SELECT stress_tensor_input_error('{"components": [1, 0, 0, 0, 0, 0], "n": 1}') AS trace,
       left(stress_tensor_input_error('{"components": [0.5, -0.5, 0, 0.5, 0, 0]}'), 33) AS no_n,
       sphere_grid_input_error('{"kind": "density", "spacing": 45, "n": 3, "values": [1, 1, 1]}') AS short,
       sphere_grid_input_error('{"kind": "right_dihedra", "spacing": 45, "n": 3, "values": [1,1,1,1,1,1,1,1,1,1,101]}') AS percent;
-- the generic form names the notation; an unknown one is an error, NULL is NULL
SELECT input_error('110/64', 'plane') AS ok, input_error('110/64', 'lineation') AS as_line, input_error(NULL, 'plane') AS null_value;
SELECT pg_temp.err($$SELECT input_error('110/64', 'planes')$$);
-- a reason never carries half a character: the echo of a long word of three-byte
-- characters is cut before a character that would not fit, "..." marking the cut
-- (DEVELOPERS.md, error text), so it is whole arrows and then "..."
SELECT r ~ '^unknown slip sense "(→)+\.\.\." \(Accepted: ' AS whole_characters
  FROM (SELECT slip_sense_input_error(repeat('→', 600)) AS r) s;

-- A CSV of field measurements loaded as text, line numbers from an identity column
CREATE TABLE staging (line int GENERATED ALWAYS AS IDENTITY, site text, bedding text, lineation text,
                      strike text, dip text, rake text, sense text);
COPY staging (site, bedding, lineation, strike, dip, rake, sense) FROM stdin WITH (FORMAT csv);
A1,110/64,120/30,110,64,75,N
A1,290/64S,300/-30,290,64S,75W,N
A1,N70W 64SW,S60E/30,N70W,64 SW,75W,R
A2,110/94,120/30,110,64,75,X
A2,200/64 dd,30-120,110,64,75 W,N
A2,110/64NW,120 30,110,64,175,normal-dextral
A3,,120/95,110,64,5,sinistral
A3,64->200,,110,64,85,thrust
\.
-- screening: every bad cell of a column, by line, without stopping at the first
SELECT * FROM input_errors('staging', 'bedding', 'plane', 'line');
SELECT * FROM input_errors('staging', 'lineation', 'lineation', 'line');
-- without a line column: the place in the table (its file order right after COPY)
SELECT * FROM input_errors('staging', 'bedding', 'plane');
-- the same over an array, and a WHERE clause with the scalar check
SELECT * FROM input_errors((SELECT array_agg(bedding ORDER BY line) FROM staging), 'plane');
SELECT line, site FROM staging WHERE plane_input_error(bedding) IS NULL ORDER BY line;
-- the four field-book columns
SELECT line, field_fault_slip_input_error(strike, dip, rake, sense) AS reason
  FROM staging WHERE field_fault_slip_input_error(strike, dip, rake, sense) IS NOT NULL ORDER BY line;
SELECT line, field_fault_slip(strike, dip, rake, sense) AS f, slip_sense(field_fault_slip(strike, dip, rake, sense)) AS sense
  FROM staging WHERE field_fault_slip_input_error(strike, dip, rake, sense) IS NULL ORDER BY line;
-- bad arguments of the screening function
SELECT pg_temp.err($$SELECT * FROM input_errors('staging', 'nosuch', 'plane')$$);
SELECT pg_temp.err($$SELECT * FROM input_errors('staging', 'bedding', 'plane', 'nosuch')$$);
SELECT pg_temp.err($$SELECT * FROM input_errors('nosuch', 'bedding', 'plane')$$);
SELECT pg_temp.err($$SELECT * FROM input_errors('staging', 'bedding', 'nonsense')$$);
-- identifiers are quoted, never spliced in as SQL
CREATE TABLE "odd name; DROP TABLE staging" ("x y" text);
INSERT INTO "odd name; DROP TABLE staging" VALUES ('110/64'), ('bad');
SELECT * FROM input_errors('"odd name; DROP TABLE staging"', 'x y', 'plane');
SELECT count(*) AS staging_still_there FROM staging;
-- and they run with the caller's privileges
CREATE ROLE striae_screen_nobody;
SET ROLE striae_screen_nobody;
SELECT pg_temp.err($$SELECT * FROM input_errors('staging', 'bedding', 'plane')$$);
RESET ROLE;
DROP ROLE striae_screen_nobody;
-- the field-book constructor raises as the cast does
SELECT pg_temp.err($$SELECT field_fault_slip('110', '64', '75', 'D')$$);
SELECT pg_temp.err($$SELECT field_fault_slip('110/64', '64', '75', 'N')$$);

-- A convention error made on every datum cannot be seen in the misfit: the
-- Wallace-Bott fit is unchanged by a rotation of the whole data set (dip
-- directions read as strikes turn every datum 90 degrees about the vertical,
-- left-hand-rule strikes 180 degrees) and by reversing every slip (the
-- footwall's motion given for the hanging wall's: rake + 180), which swaps
-- sigma1 and sigma3 and Phi with 1 - Phi (derived: the misfit is the angle
-- between two vectors that rotate, or change sign, together). Faults: slip
-- predicted by an invented tensor, rakes perturbed by up to 15 degrees.
CREATE FUNCTION pg_temp.turn(a float8) RETURNS float8 LANGUAGE sql AS
  'SELECT CASE WHEN a > 180 THEN a - 360 WHEN a <= -180 THEN a + 360 ELSE a END';
CREATE TABLE conv AS
  SELECT fault_slip(fault_plane(f), pg_temp.turn(rake(f) + 15 * sin(g * 1.7))) AS f
    FROM (SELECT g, resolved_slip(plane((g * 47) % 360, 30 + (g * 13) % 55), stress_tensor('020/10', '115/25', 0.4)) AS f
            FROM generate_series(1, 40) g) s;
CREATE TABLE conv_wrong AS
  SELECT f, fault_slip(CASE WHEN strike(f) < 270 THEN strike(f) + 90 ELSE strike(f) - 270 END, dip(f), rake(f)) AS dipdir,
         fault_slip(CASE WHEN strike(f) < 180 THEN strike(f) + 180 ELSE strike(f) - 180 END, dip(f), rake(f)) AS lhr,
         fault_slip(strike(f), dip(f), pg_temp.turn(rake(f) + 180)) AS footwall FROM conv;
WITH t AS (SELECT stress_inversion(f) AS right_t, stress_inversion(dipdir) AS dipdir_t, stress_inversion(lhr) AS lhr_t,
                  stress_inversion(footwall) AS footwall_t FROM conv_wrong),
     m AS (SELECT avg(misfit(f, right_t)) AS right_m, avg(misfit(dipdir, dipdir_t)) AS dipdir_m,
                  avg(misfit(lhr, lhr_t)) AS lhr_m, avg(misfit(footwall, footwall_t)) AS footwall_m FROM conv_wrong, t)
SELECT round(right_m::numeric, 3) AS misfit, round((dipdir_m - right_m)::numeric, 9) AS dipdir_minus_right,
       round((lhr_m - right_m)::numeric, 9) AS lhr_minus_right, round((footwall_m - right_m)::numeric, 9) AS footwall_minus_right,
       round(mod((trend(sigma1(dipdir_t)) - trend(sigma1(right_t)) + 360)::numeric, 360), 6) AS sigma1_turned_by,
       round((plunge(sigma1(dipdir_t)) - plunge(sigma1(right_t)))::numeric, 6) AS plunge_change,
       round((sigma1(right_t) <-> sigma3(footwall_t))::numeric, 6) AS sigma1_became_sigma3,
       round((shape_ratio(right_t) + shape_ratio(footwall_t))::numeric, 9) AS phi_sum
  FROM t, m;

-- Fixed-precision display: whole degrees by default, padded azimuths and dips
SELECT to_text('20.4/26.6'::lineation) AS l, to_text('359.7/5'::plane) AS p, to_text('110/64/-179.8'::fault_slip) AS f,
       to_text('110.123456/64.5/-75'::fault_slip, 2) AS f2, to_text('000/90'::lineation, 1) AS vertical;
SELECT to_text(stress_tensor('040/00', '130/00', 0.3)) AS t0, to_text(stress_tensor('040/00', '130/00', 0.3), 1) AS t1;
SELECT to_text(density_grid(l, 45), 3) AS g FROM (VALUES ('120/30'::lineation), ('125/35')) v(l);
SELECT pg_temp.err($$SELECT to_text('110/64'::plane, 11)$$);

-- JSON: stress_tensor and sphere_grid are objects in to_jsonb of a row, and cast directly
SELECT jsonb_typeof(j -> 'tensor') AS tensor, j -> 'tensor' -> 'n' AS n, jsonb_array_length(j -> 'tensor' -> 'components') AS components
  FROM (SELECT to_jsonb(r) AS j FROM (SELECT 'A1' AS site, stress_tensor('040/00', '130/00', 0.5) AS tensor) r) s;
SELECT to_jsonb('{"components": [0.5, -0.5, 0, 0.5, 0, 0], "n": 3, "misfit": 4.5}'::stress_tensor) AS j;
SELECT jsonb_typeof(g::jsonb) AS kind, (g::jsonb ->> 'spacing')::float8 AS spacing, jsonb_array_length(g::jsonb -> 'values') AS nodes
  FROM (SELECT density_grid(l, 45) AS g FROM (VALUES ('120/30'::lineation)) v(l)) s;
SELECT key, json_typeof(value) AS type
  FROM (SELECT to_json(s) AS j FROM (SELECT (fisher_mean(l)).* FROM (VALUES ('120/30'::lineation), ('122/31')) v(l)) s) t,
       json_each(j);
SELECT jsonb_object_keys(to_jsonb(o)) AS fabric_field
  FROM (SELECT (orientation_tensor(l)).* FROM (VALUES ('120/30'::lineation), ('122/31'), ('10/5')) v(l)) o;
