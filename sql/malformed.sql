-- A catalogue of malformed input: every type's text input, the constructors,
-- the functions' parameters and the aggregates' parameters (with rows and over
-- an empty group), multi-byte characters and over-long text. Each case shows
-- the SQLSTATE and message it raises: class 22 for bad data (22P02 syntax,
-- 22003 a number out of range, 22023 a bad parameter, 22000 other data
-- errors), 22004 for a NULL parameter; never a crash, never XX000. The
-- backend is alive at the end.
\set VERBOSITY terse
\i sql/include/setup.sql

-- SQLSTATE and message of the error q raises (or 'no error').
CREATE FUNCTION pg_temp.st(q text) RETURNS text LANGUAGE plpgsql AS $$
BEGIN
  EXECUTE q;
  RETURN 'no error';
EXCEPTION WHEN OTHERS THEN
  RETURN SQLSTATE || ': ' || SQLERRM;
END $$;
-- SQLSTATE and the byte lengths of message and detail: for over-long input.
CREATE FUNCTION pg_temp.st_len(q text) RETURNS text LANGUAGE plpgsql AS $$
DECLARE d text;
BEGIN
  EXECUTE q;
  RETURN 'no error';
EXCEPTION WHEN OTHERS THEN
  GET STACKED DIAGNOSTICS d = PG_EXCEPTION_DETAIL;
  RETURN SQLSTATE || ': message ' || octet_length(SQLERRM) || ' bytes, detail ' || octet_length(d) || ' bytes';
END $$;

CREATE TABLE mf_cases (id serial, q text);
CREATE TABLE mf_f (f fault_slip);
INSERT INTO mf_f SELECT fault_slip(10 * i, 30 + i, -90 + 7 * i) FROM generate_series(1, 12) i;
CREATE TABLE mf_l (l lineation);
INSERT INTO mf_l SELECT lineation(20 * i, 5 * i) FROM generate_series(1, 12) i;

-- ---- plane text input ---------------------------------------------------------
INSERT INTO mf_cases (q) VALUES
  ($$SELECT ''::plane$$),
  ($$SELECT '   '::plane$$),
  ($$SELECT '/'::plane$$),
  ($$SELECT '110'::plane$$),
  ($$SELECT '110/'::plane$$),
  ($$SELECT '/64'::plane$$),
  ($$SELECT '110//64'::plane$$),
  ($$SELECT '110/64/'::plane$$),
  ($$SELECT '110/64/3'::plane$$),
  ($$SELECT 'abc'::plane$$),
  ($$SELECT '110/abc'::plane$$),
  ($$SELECT 'NaN/64'::plane$$),
  ($$SELECT 'Infinity/64'::plane$$),
  ($$SELECT '110/-64'::plane$$),
  ($$SELECT '-110/64'::plane$$),
  ($$SELECT '361/64'::plane$$),
  ($$SELECT '110/91'::plane$$),
  ($$SELECT '1e309/45'::plane$$),
  ($$SELECT '110/1e-400'::plane$$),
  ($$SELECT '0/30S'::plane$$),
  ($$SELECT '30/40NE'::plane$$),
  ($$SELECT 'N70W 64'::plane$$),
  ($$SELECT 'N95W 64SW'::plane$$),
  ($$SELECT '110/64X'::plane$$),
  ($$SELECT '110/64 SSW'::plane$$),
  ($$SELECT '64->'::plane$$),
  ($$SELECT '->200'::plane$$),
  ($$SELECT '64->200->10'::plane$$),
  ($$SELECT '110/64;'::plane$$),
  ($$SELECT '1.2.3/64'::plane$$),
  ($$SELECT '--110/64'::plane$$),
  ($$SELECT '0x10/64'::plane$$),
  ($$SELECT '200/64 dd dd'::plane$$),
  ($$SELECT 'N70W 64SW extra'::plane$$);

-- ---- lineation text input -------------------------------------------------------
INSERT INTO mf_cases (q) VALUES
  ($$SELECT ''::lineation$$),
  ($$SELECT '120'::lineation$$),
  ($$SELECT '120/30/4'::lineation$$),
  ($$SELECT '120/30SE'::lineation$$),
  ($$SELECT '-30->120'::lineation$$),
  ($$SELECT '120/91'::lineation$$),
  ($$SELECT '120/-91'::lineation$$),
  ($$SELECT '361/30'::lineation$$),
  ($$SELECT '-120/30'::lineation$$),
  ($$SELECT 'S95E/30'::lineation$$),
  ($$SELECT 'N60X/30'::lineation$$),
  ($$SELECT '30->'::lineation$$),
  ($$SELECT '1e999/30'::lineation$$),
  ($$SELECT '120/3O'::lineation$$);

-- ---- fault_slip text input -------------------------------------------------------
INSERT INTO mf_cases (q) VALUES
  ($$SELECT '110/64'::fault_slip$$),
  ($$SELECT '110/64/'::fault_slip$$),
  ($$SELECT '110/64/75 X'::fault_slip$$),
  ($$SELECT '110/64/30E D N'::fault_slip$$),
  ($$SELECT '110/64/-75 N'::fault_slip$$),
  ($$SELECT '110/64/75 D'::fault_slip$$),
  ($$SELECT '110/64/75 N D'::fault_slip$$),
  ($$SELECT '110/64/0 N'::fault_slip$$),
  ($$SELECT '110/64/90 S R'::fault_slip$$),
  ($$SELECT '110/64/75SN'::fault_slip$$),
  ($$SELECT '110/64/0W N'::fault_slip$$),
  ($$SELECT '110/64/95W N'::fault_slip$$),
  ($$SELECT '110/64/195 N'::fault_slip$$),
  ($$SELECT '290/64S/-75'::fault_slip$$),
  ($$SELECT '290/64S/75 N'::fault_slip$$),
  ($$SELECT '0/64/75E N'::fault_slip$$),
  ($$SELECT '110/64/190'::fault_slip$$),
  ($$SELECT '110/64/-181'::fault_slip$$),
  ($$SELECT '64->200/30'::fault_slip$$),
  ($$SELECT '110/64/75 N R'::fault_slip$$),
  ($$SELECT '110/64/75 nomral'::fault_slip$$),
  ($$SELECT '110/64/1e400'::fault_slip$$),
  ($$SELECT '200/64 dd/30'::fault_slip$$);

-- ---- cone text input -----------------------------------------------------------
INSERT INTO mf_cases (q) VALUES
  ($$SELECT ''::cone$$),
  ($$SELECT 'line'::cone$$),
  ($$SELECT 'line 120/30'::cone$$),
  ($$SELECT 'line 120/30 within'::cone$$),
  ($$SELECT 'line 120/30 within x'::cone$$),
  ($$SELECT 'line 120/30 within 91'::cone$$),
  ($$SELECT 'line 120/30 within -1'::cone$$),
  ($$SELECT 'circle 120/30 within 10'::cone$$),
  ($$SELECT 'plane 110/95 within 10'::cone$$),
  ($$SELECT 'line 120/30 within 1e999'::cone$$),
  ($$SELECT 'line 120/30 within nan'::cone$$);

-- ---- stress_tensor text input -----------------------------------------------------
INSERT INTO mf_cases (q) VALUES
  ($$SELECT ''::stress_tensor$$),
  ($$SELECT '{}'::stress_tensor$$),
  ($$SELECT '{"components": [0.5, -0.5, 0, 0, 0, 0]}'::stress_tensor$$),
  ($$SELECT '{"components": [1, 0, 0, 0, 0, 0], "n": 3}'::stress_tensor$$),
  ($$SELECT '{"components": [0.5, -0.5, 0, 0, 0, 0], "n": 3}'::stress_tensor$$),
  ($$SELECT '{"components": [0.7071067811865476, -0.7071067811865476, 0, 0, 0, 0], "n": -1}'::stress_tensor$$),
  ($$SELECT '{"components": [0.7071067811865476, -0.7071067811865476, 0, 0, 0, 0], "n": 1.5}'::stress_tensor$$),
  ($$SELECT '{"components": [0.7071067811865476, -0.7071067811865476, 0, 0, 0, 0], "n": 99999999999999999999}'::stress_tensor$$),
  ($$SELECT '{"components": [0.7071067811865476, -0.7071067811865476, 0, 0, 0, 0], "n": 3, "colour": 1}'::stress_tensor$$),
  ($$SELECT '{"components": [0.7071067811865476, -0.7071067811865476, 0, 0, 0, 0], "n": 3, "n": 4}'::stress_tensor$$),
  ($$SELECT '{"components": [0.7071067811865476, -0.7071067811865476, 0, 0, 0, 0], "n": 3, "flags": ["shiny"]}'::stress_tensor$$),
  ($$SELECT '{"components": [0.7071067811865476, -0.7071067811865476, 0, 0, 0, 0], "n": 3, "misfit": 200}'::stress_tensor$$),
  ($$SELECT '{"components": [0.7071067811865476, -0.7071067811865476, 0, 0, 0, 0], "n": 3, "cones": [100, 0, 0]}'::stress_tensor$$),
  ($$SELECT '{"components": [0.7071067811865476, -0.7071067811865476, 0, 0, 0, 0], "n": 3, "phi_interval": [0.8, 0.2]}'::stress_tensor$$),
  ($$SELECT '{"components": [0.7071067811865476, -0.7071067811865476, 0, 0, 0, 0], "n": 3, "friction": 6}'::stress_tensor$$),
  ($$SELECT '{"components": [0.7071067811865476, -0.7071067811865476, 0, 0, 0, 0], "n": 3} x'::stress_tensor$$),
  ($$SELECT '{"components": [1e400, 0, 0, 0, 0, 0], "n": 3}'::stress_tensor$$),
  ($$SELECT '{"components": [1, 2], "n": 3}'::stress_tensor$$),
  ($$SELECT '{"comp'::stress_tensor$$);

-- ---- sphere_grid text input (spacing 45: 11 nodes) --------------------------------
INSERT INTO mf_cases (q) VALUES
  ($$SELECT ''::sphere_grid$$),
  ($$SELECT '{}'::sphere_grid$$),
  ($$SELECT '{"kind": "heat", "spacing": 45, "n": 3, "values": [0,0,0,0,0,0,0,0,0,0,0]}'::sphere_grid$$),
  ($$SELECT '{"kind": "density", "spacing": 7, "n": 3, "values": [0,0,0,0,0,0,0,0,0,0,0]}'::sphere_grid$$),
  ($$SELECT '{"kind": "density", "spacing": 0.4, "n": 3, "values": [0,0,0,0,0,0,0,0,0,0,0]}'::sphere_grid$$),
  ($$SELECT '{"kind": "density", "spacing": 46, "n": 3, "values": [0,0,0,0,0,0,0,0,0,0,0]}'::sphere_grid$$),
  ($$SELECT '{"kind": "density", "spacing": 45, "n": 0, "values": [0,0,0,0,0,0,0,0,0,0,0]}'::sphere_grid$$),
  ($$SELECT '{"kind": "density", "spacing": 45, "n": -1, "values": [0,0,0,0,0,0,0,0,0,0,0]}'::sphere_grid$$),
  ($$SELECT '{"kind": "density", "spacing": 45, "n": 1.5, "values": [0,0,0,0,0,0,0,0,0,0,0]}'::sphere_grid$$),
  ($$SELECT '{"kind": "density", "spacing": 45, "n": 1e3, "values": [0,0,0,0,0,0,0,0,0,0,0]}'::sphere_grid$$),
  ($$SELECT '{"kind": "density", "spacing": 45, "n": 9007199254740993, "values": [0,0,0,0,0,0,0,0,0,0,0]}'::sphere_grid$$),
  ($$SELECT '{"kind": "density", "spacing": 45, "n": 99999999999999999999, "values": [0,0,0,0,0,0,0,0,0,0,0]}'::sphere_grid$$),
  ($$SELECT '{"kind": "density", "spacing": 45, "n": 3, "values": [0,0,0]}'::sphere_grid$$),
  ($$SELECT '{"kind": "density", "spacing": 45, "n": 3, "values": [0,0,0,0,0,0,0,0,0,0,0,0]}'::sphere_grid$$),
  ($$SELECT '{"kind": "density", "spacing": 45, "n": 3, "values": [-1,0,0,0,0,0,0,0,0,0,0]}'::sphere_grid$$),
  ($$SELECT '{"kind": "right_dihedra", "spacing": 45, "n": 3, "values": [101,0,0,0,0,0,0,0,0,0,0]}'::sphere_grid$$),
  ($$SELECT '{"kind": "density", "spacing": 45, "n": 3, "values": [1e999,0,0,0,0,0,0,0,0,0,0]}'::sphere_grid$$),
  ($$SELECT '{"kind": "density", "spacing": 45, "n": 3, "values": [0,0,0,0,0,0,0,0,0,0,0]} x'::sphere_grid$$);

-- ---- net_figure text input ---------------------------------------------------------
INSERT INTO mf_cases (q) VALUES
  ($$SELECT ''::net_figure$$),
  ($$SELECT '{}'::net_figure$$),
  ($$SELECT '{"layers": [{"kind": "bogus", "label": "", "params": [], "data": []}]}'::net_figure$$),
  ($$SELECT '{"layers": [{"kind": "poles", "label": "", "params": [], "data": [110, 95]}]}'::net_figure$$),
  ($$SELECT '{"layers": [{"kind": "poles", "label": "", "params": [], "data": [110, 1e999]}]}'::net_figure$$),
  ($$SELECT '{"layers": [{"kind": "poles", "label": "a\u0001b", "params": [], "data": []}]}'::net_figure$$),
  ($$SELECT '{"layers": [{"kind": "poles", "label": "unterminated'::net_figure$$);

-- ---- constructors -------------------------------------------------------------------
INSERT INTO mf_cases (q) VALUES
  ($$SELECT plane(10, 91)$$),
  ($$SELECT plane(10, -1)$$),
  ($$SELECT plane('NaN', 10)$$),
  ($$SELECT plane(10, 'Infinity')$$),
  ($$SELECT plane_from_dip_direction(10, 95)$$),
  ($$SELECT lineation(10, 91)$$),
  ($$SELECT lineation('-Infinity', 0)$$),
  ($$SELECT fault_slip(10, 95, 10)$$),
  ($$SELECT fault_slip('110/64'::plane, 'NaN')$$),
  ($$SELECT fault_slip('110/64'::plane, '20/64'::lineation, 'normal')$$),
  ($$SELECT fault_slip('110/64'::plane, '110/0'::lineation, 'sideways')$$),
  ($$SELECT fault_slip('110/64'::plane, '110/0'::lineation, 'normal')$$),
  ($$SELECT fault_slip('110/64'::plane, '110/0'::lineation, 'dextral', 90)$$),
  ($$SELECT fault_slip('110/64'::plane, '110/0'::lineation, 'dextral', -1)$$),
  ($$SELECT field_fault_slip('abc', '64', '75', 'N')$$),
  ($$SELECT field_fault_slip('110', '64', '75', 'Q')$$),
  ($$SELECT field_fault_slip('110', '95', '75', 'N')$$),
  ($$SELECT stress_tensor('10/5'::lineation, '10/5'::lineation, 0.4)$$),
  ($$SELECT stress_tensor('10/5'::lineation, '100/20'::lineation, 1.5)$$),
  ($$SELECT stress_tensor('10/5'::lineation, '100/20'::lineation, 'NaN')$$),
  ($$SELECT cone('120/30'::lineation, 91)$$),
  ($$SELECT cone('110/64'::plane, -1)$$),
  ($$SELECT cone('110/64'::plane, 'NaN')$$),
  ($$SELECT plane_through('10/5'::lineation, '10/5'::lineation)$$),
  ($$SELECT intersection('110/64'::plane, '110/64'::plane)$$);

-- ---- parameters of functions ------------------------------------------------------------
INSERT INTO mf_cases (q) VALUES
  ($$SELECT slip_tendency('110/64', stress_tensor('10/5', '100/20', 0.4), 0)$$),
  ($$SELECT slip_tendency('110/64', stress_tensor('10/5', '100/20', 0.4), 6)$$),
  ($$SELECT slip_tendency('110/64', stress_tensor('10/5', '100/20', 0.4), 'NaN')$$),
  ($$SELECT moment_tensor('110/64/30', 'xyz')$$),
  ($$SELECT to_text('110/64'::plane, -1)$$),
  ($$SELECT to_text('110/64'::plane, 11)$$),
  ($$SELECT to_text(stress_tensor('10/5', '100/20', 0.4), 11)$$),
  ($$SELECT net_xy('120/30', 'mercator')$$),
  ($$SELECT net_svg(net_poles('110/64'::plane), 'bogus')$$),
  ($$SELECT net_svg(net_poles('110/64'::plane), 'equal-area', 0)$$),
  ($$SELECT net_svg(net_poles('110/64'::plane), 'equal-area', 100000)$$),
  ($$SELECT rotate('110/64'::plane, '10/5'::lineation, 'Infinity')$$),
  ($$SELECT rotate('110/64'::plane, 10, 100, 30)$$),
  ($$SELECT rotate_vertical('120/30'::lineation, 'NaN')$$),
  ($$SELECT unfold('110/64'::plane, '0/30'::plane, '270/60'::lineation)$$),
  ($$SELECT unfold('110/64'::plane, '0/30'::plane, '0/0'::lineation, 95)$$),
  ($$SELECT input_error('110/64', 'bogus')$$),
  ($$SELECT * FROM input_errors(ARRAY['110/64'], 'bogus')$$),
  ($$SELECT kostrov_strain_rate(moment_tensor_sum(f, 5.0), 0, 1) FROM mf_f$$),
  ($$SELECT kostrov_strain_rate(moment_tensor_sum(f, 5.0), 1e9, -1) FROM mf_f$$),
  ($$SELECT kostrov_strain_rate(moment_tensor_sum(f), 1e9, 1) FROM mf_f$$),
  ($$SELECT net_contours(right_dihedra(f, 10), '{}') FROM mf_f$$),
  ($$SELECT net_contours(right_dihedra(f, 10), '{1, NULL}') FROM mf_f$$),
  ($$SELECT net_contours(right_dihedra(f, 10), '{2, 1}') FROM mf_f$$),
  ($$SELECT net_contours(right_dihedra(f, 10), '{1, Infinity}') FROM mf_f$$),
  ($$SELECT net_label(net_poles('110/64'::plane), E'a\tb')$$),
  ($$SELECT stress_phase('110/64/30', ARRAY[NULL::stress_tensor])$$),
  ($$SELECT net_cone('120/30', 0)$$);

-- ---- aggregate parameters, with rows and over an empty group ---------------------------
INSERT INTO mf_cases (q) VALUES
  ($$SELECT density_grid(l, 7) FROM mf_l$$),
  ($$SELECT density_grid(l, 7) FROM mf_l WHERE false$$),
  ($$SELECT density_grid(l, NULL) FROM mf_l$$),
  ($$SELECT density_grid(l, NULL) FROM mf_l WHERE false$$),
  ($$SELECT density_grid('110/64'::plane, 0.4) FROM mf_l WHERE false$$),
  ($$SELECT density_grid(l, CASE WHEN trend(l) < 100 THEN 10 ELSE 5 END) FROM mf_l$$),
  ($$SELECT right_dihedra(f, 0.4) FROM mf_f$$),
  ($$SELECT right_dihedra(f, 0.4) FROM mf_f WHERE false$$),
  ($$SELECT right_dihedra(f, 'NaN') FROM mf_f WHERE false$$),
  ($$SELECT right_dihedra(f, NULL) FROM mf_f WHERE false$$),
  ($$SELECT stress_inversion(f, 0, 1) FROM mf_f$$),
  ($$SELECT stress_inversion(f, 0, 1) FROM mf_f WHERE false$$),
  ($$SELECT stress_inversion(f, 100001, 1) FROM mf_f WHERE false$$),
  ($$SELECT stress_inversion(f, NULL, 1) FROM mf_f$$),
  ($$SELECT stress_inversion(f, 10, NULL) FROM mf_f WHERE false$$),
  ($$SELECT focal_stress_inversion(f, 0) FROM mf_f$$),
  ($$SELECT focal_stress_inversion(f, 0) FROM mf_f WHERE false$$),
  ($$SELECT focal_stress_inversion(f, 6) FROM mf_f WHERE false$$),
  ($$SELECT focal_stress_inversion(f, NULL) FROM mf_f WHERE false$$),
  ($$SELECT focal_stress_inversion(f, 0, 10, 1) FROM mf_f$$),
  ($$SELECT focal_stress_inversion(f, '-0', 10, 1) FROM mf_f$$),
  ($$SELECT focal_stress_inversion(f, 0, 10, 1) FROM mf_f WHERE false$$),
  ($$SELECT focal_stress_inversion(f, NULL, 0, 1) FROM mf_f WHERE false$$),
  ($$SELECT focal_stress_inversion(f, NULL, 10, NULL) FROM mf_f$$),
  ($$SELECT stress_phases(f, 0, 1) FROM mf_f$$),
  ($$SELECT stress_phases(f, 0, 1) FROM mf_f WHERE false$$),
  ($$SELECT stress_phases(f, 9, 1) FROM mf_f WHERE false$$),
  ($$SELECT stress_phases(f, 2, 1, 0) FROM mf_f WHERE false$$),
  ($$SELECT stress_phases(f, 2, NULL) FROM mf_f WHERE false$$),
  ($$SELECT misfit_summary(f, stress_tensor('10/5', '100/20', 0.4), -1) FROM mf_f$$),
  ($$SELECT misfit_summary(f, stress_tensor('10/5', '100/20', 0.4), -1) FROM mf_f WHERE false$$),
  ($$SELECT misfit_summary(f, stress_tensor('10/5', '100/20', 0.4), 181) FROM mf_f WHERE false$$),
  ($$SELECT misfit_summary(f, stress_tensor('10/5', '100/20', 0.4), NULL) FROM mf_f WHERE false$$),
  ($$SELECT moment_tensor_sum(f, 'NaN') FROM mf_f$$),
  ($$SELECT moment_tensor_sum(f, 'Infinity') FROM mf_f$$);

-- ---- the two-phase forms: the same parameters, the same checks; partial_state input ------
INSERT INTO mf_cases (q) VALUES
  ($$SELECT density_grid_partial(l, 7) FROM mf_l$$),
  ($$SELECT density_grid_partial(l, 7) FROM mf_l WHERE false$$),
  ($$SELECT right_dihedra_partial(f, NULL) FROM mf_f WHERE false$$),
  ($$SELECT stress_inversion_partial(f, 0, 1) FROM mf_f WHERE false$$),
  ($$SELECT focal_stress_inversion_partial(f, 0) FROM mf_f WHERE false$$),
  ($$SELECT focal_stress_inversion_partial(f, 0, 10, 1) FROM mf_f$$),
  ($$SELECT focal_stress_inversion_partial(f, 0, 10, 1) FROM mf_f WHERE false$$),
  ($$SELECT stress_phases_partial(f, 2, 1, 0) FROM mf_f WHERE false$$),
  ($$SELECT misfit_summary_partial(f, stress_tensor('10/5', '100/20', 0.4), 181) FROM mf_f WHERE false$$),
  ($$SELECT ''::partial_state$$),
  ($$SELECT 'bogus'::partial_state$$),
  ($$SELECT 'stress_inversion/fault_slip:'::partial_state$$),
  ($$SELECT 'stress_inversion/fault_slip:U1NUMQ='::partial_state$$),
  ($$SELECT 'stress_inversion/plane:U1NUMQ=='::partial_state$$),
  ($$SELECT 'heat/fault_slip:U1NUMQ=='::partial_state$$);

-- ---- map symbols ---------------------------------------------------------------------------
INSERT INTO mf_cases (q) VALUES
  ($$SELECT geodesic_destination(0, 91, 0, 1000)$$),
  ($$SELECT geodesic_destination(0, 0, 'NaN', 1000)$$),
  ($$SELECT geodesic_destination(0, 0, 0, -1)$$),
  ($$SELECT shmax_bar_wkt(10, 0, 0, 0)$$),
  ($$SELECT focal_quadrants_wkt('110/64/30', 0, 0, 0)$$),
  ($$SELECT focal_disc_wkt(0, 0, 1000, 'Infinity')$$),
  ($$SELECT stress_map_row(stress_tensor('10/5', '100/20', 0.4), 181, 0, 1000)$$);

SELECT id, pg_temp.st(q) AS result FROM mf_cases ORDER BY id;

-- ---- multi-byte characters: quoted whole, in the message and in the detail ----------------
CREATE TABLE mf_mb (id serial, q text);
INSERT INTO mf_mb (q) VALUES
  ($$SELECT (E'110/64\u00a0SW')::plane$$),
  ($$SELECT (E'110\u00b0/64\u00b0x')::plane$$),
  ($$SELECT (E'\u20ac110/64')::plane$$),
  ($$SELECT (E'110/64/75 N\U0001F600')::fault_slip$$),
  ($$SELECT (E'\u0661\u0661\u0660/64')::plane$$),
  ($$SELECT (E'110/\uff16\uff14')::plane$$),
  ($$SELECT (E'120/30\u00a0')::lineation$$),
  ($$SELECT (E'line 120/30 within 1\u00b0x')::cone$$),
  ($$SELECT field_fault_slip('110', '64', '75', E'\u043d\u043e\u0440\u043c')$$),
  ($$SELECT input_error('110/64', E'pl\u00e2ne')$$),
  ($$SELECT moment_tensor('110/64/30', E'n\u00e9d')$$),
  ($$SELECT net_xy('120/30', E'equal\u2011area')$$),
  ($$SELECT (repeat(E'\u20ac', 30) || '/fault_slip:AAAA')::partial_state$$),
  ($$SELECT (E'{"components": [0.7071067811865476, -0.7071067811865476, 0, 0, 0, 0], "n": 3, "\u00e9": 1}')::stress_tensor$$);
SELECT id, pg_temp.err(q) AS result FROM mf_mb ORDER BY id;

-- ---- over-long input: messages quote at most 200 bytes of it, cut at a character ----------
SELECT v, pg_temp.st_len(q) FROM (VALUES
  ('plane, 1 MB', $$SELECT (repeat('1', 1000000))::plane$$),
  ('plane, 1 MB of e-acute', $$SELECT ('110/' || repeat(E'\u00e9', 500000))::plane$$),
  ('lineation, 1 MB', $$SELECT ('120/' || repeat('3', 1000000))::lineation$$),
  ('fault_slip, 1 MB', $$SELECT ('110/64/' || repeat('x', 1000000))::fault_slip$$),
  ('cone, 1 MB', $$SELECT ('line 120/30 within ' || repeat('9', 1000000))::cone$$),
  ('stress_tensor, 1 MB', $$SELECT ('{"components": [' || repeat('1,', 500000) || ']}')::stress_tensor$$),
  ('stress_tensor key, 1 MB', $$SELECT ('{"' || repeat(E'\u00e9', 500000) || '": 1}')::stress_tensor$$),
  ('sphere_grid, 1 MB', $$SELECT ('{"kind": "' || repeat(E'\u00e9', 500000) || '"}')::sphere_grid$$),
  ('net_figure kind, 1 MB', $$SELECT ('{"layers": [{"kind": "' || repeat(E'\u00e9', 500000) || '", "label": ""}]}')::net_figure$$),
  ('moment tensor frame, 1 MB', $$SELECT moment_tensor('110/64/30', repeat(E'\u00e9', 500000))$$),
  ('projection name, 1 MB', $$SELECT net_xy('120/30', repeat(E'\u00e9', 500000))$$),
  ('notation name, 1 MB', $$SELECT input_error('110/64', repeat(E'\u00e9', 500000))$$),
  ('slip sense, 1 MB', $$SELECT fault_slip('110/64'::plane, '110/0'::lineation, repeat(E'\u00e9', 500000))$$),
  ('field strike, 1 MB', $$SELECT field_fault_slip(repeat(E'\u00e9', 500000), '64', '75', 'N')$$),
  ('partial_state, 1 MB', $$SELECT (repeat(E'\u00e9', 500000) || '/fault_slip:AAAA')::partial_state$$)) t(v, q);

-- ---- a LATIN1 client receives the real error, not 22021 -----------------------------------
-- The statements are ASCII; chr() makes the characters on the server, all of
-- them in LATIN1 (no-break space, degree sign, e-acute), so every message
-- converts to the client's encoding unless it holds part of a character.
\set VERBOSITY sqlstate
SET client_encoding = 'LATIN1';
SELECT ('110/64' || chr(160) || 'SW')::plane;
SELECT ('110' || chr(176) || '/64' || chr(176) || chr(176))::plane;
SELECT ('120/30' || chr(160))::lineation;
SELECT (repeat('x', 199) || chr(233) || 'abc')::plane;
SELECT (repeat(chr(233), 300))::fault_slip;
SELECT ('line 120/30 within ' || repeat(chr(233), 300))::cone;
SELECT ('{"kind": "' || repeat(chr(176), 100) || '"}')::sphere_grid;
SELECT moment_tensor('110/64/30', repeat(chr(233), 300));
RESET client_encoding;
\set VERBOSITY terse

-- the backend is alive
SELECT 'alive' AS backend, (SELECT count(*) FROM mf_cases) + (SELECT count(*) FROM mf_mb) + 15 + 8 AS cases,
       (SELECT count(*) FROM pg_stat_activity WHERE pid = pg_backend_pid()) AS this_session;
DROP TABLE mf_cases, mf_mb, mf_f, mf_l;
