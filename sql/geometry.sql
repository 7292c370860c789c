-- Constructors, accessors and per-datum geometry, with their error paths.
-- Expected values follow the conventions of DESIGN.md (right-hand rule, NED,
-- lower hemisphere; derived, common practice, no source) unless a source is named.
\i sql/include/setup.sql

-- constructors
SELECT plane(110, 64), plane_from_dip_direction(200, 64), lineation(300, -30),
       fault_slip(110, 64, -75), fault_slip('110/64'::plane, -75);
SELECT q, pg_temp.err(q) FROM (VALUES
  ('SELECT plane(361, 90.5)'), ('SELECT plane(10, -1)'), ('SELECT plane(''NaN'', 10)'),
  ('SELECT plane(10, ''Infinity'')'), ('SELECT plane_from_dip_direction(-5, -10)'),
  ('SELECT lineation(10, 91)'), ('SELECT lineation(''-Infinity'', 10)'),
  ('SELECT fault_slip(370, 10, 200), fault_slip(10, 95, 0)'), ('SELECT fault_slip(''110/64''::plane, ''NaN'')')) t(q);
SELECT plane(NULL, 10) IS NULL AS strict_null;

-- striation + sense constructor (default tolerance 10 degrees)
-- (string literals need a cast here: fault_slip(float8, float8, float8) also takes three)
SELECT fault_slip('110/64'::plane, '200/64'::lineation, 'normal') AS down_dip_normal,
       fault_slip('110/64'::plane, '200/64'::lineation, 'R') AS down_dip_reverse,
       fault_slip('110/64'::plane, '110/0'::lineation, 'dextral') AS along_strike_dextral,
       fault_slip('110/64'::plane, '200/59'::lineation, 'n') AS projected_5_degrees,
       fault_slip('110/64'::plane, '200/40'::lineation, 'n', 30) AS projected_24_degrees,
       fault_slip('110/64'::plane, '20/-64'::lineation, 'thrust') AS upward_striation_input;
SELECT q, pg_temp.err(q) FROM (VALUES
  ('SELECT fault_slip(''110/64''::plane, ''200/40''::lineation, ''normal'')'),
  ('SELECT fault_slip(''110/64''::plane, ''110/0''::lineation, ''normal'')'),
  ('SELECT fault_slip(''110/64''::plane, ''200/64''::lineation, ''sinistral'')'),
  ('SELECT fault_slip(''110/64''::plane, ''200/64''::lineation, ''sideways'')'),
  ('SELECT fault_slip(''110/64''::plane, ''200/64''::lineation, ''normal reverse'')'),
  ('SELECT fault_slip(''110/64''::plane, ''200/64''::lineation, '''')'),
  ('SELECT fault_slip(''110/64''::plane, ''200/64''::lineation, ''n'', -1)'),
  ('SELECT fault_slip(''110/64''::plane, ''200/64''::lineation, ''n'', 90)'),
  ('SELECT fault_slip(''110/64''::plane, ''200/64''::lineation, ''n'', ''NaN'')')) t(q);

-- accessors
SELECT strike(p), dip(p), dip_direction(p) FROM (VALUES ('110/64'::plane), ('270/90'), ('5/0')) t(p);
SELECT trend(l), plunge(l), direction_cosines(l) FROM (VALUES ('90/0'::lineation), ('0/90'), ('45/45')) t(l);
SELECT strike(f), dip(f), rake(f), fault_plane(f), slip_sense(f)
  FROM (VALUES ('110/64/-75'::fault_slip), ('110/64/-120'), ('10/80/170'), ('10/80/30'), ('10/80/90')) t(f);

-- poles are exact in degrees
SELECT pole('110/64'), pole('0/0'), pole('45/90'), plane_from_pole('20/26'), plane_from_pole('0/90');
SELECT count(*) AS pole_round_trip_failures FROM generate_series(0, 359, 7) s, generate_series(0, 90, 5) d
 WHERE plane_from_pole(pole(plane(s, d))) <> plane(s, d);

-- angles are axial, 0..90; <-> is the same
SELECT angle('0/5'::lineation, '180/5'::lineation), '0/0'::lineation <-> '90/0'::lineation,
       angle('0/30'::plane, '180/30'::plane), '10/30'::plane <-> '10/30'::plane;

-- intersection and plane through two lines
SELECT intersection('0/90', '90/90') AS vertical, intersection('0/30', '90/90') AS e_w,
       plane_through('0/0', '90/30') AS through;
SELECT q, pg_temp.err(q) FROM (VALUES
  ('SELECT intersection(''10/20'', ''10/20'')'),
  ('SELECT intersection(''10/20'', ''190/20E'')'),
  ('SELECT plane_through(''10/20'', ''190/-20'')')) t(q);
-- the intersection of two planes lies in both
SELECT count(*) AS off_plane FROM generate_series(1, 200) g,
  LATERAL (SELECT plane(g * 37 % 360, g * 13 % 89 + 1) a, plane(g * 53 % 360, g * 17 % 89 + 1) b) x
 WHERE a <> b AND a <-> b > 0.01
   AND (abs(90 - (pole(a) <-> intersection(a, b))) > 1e-9 OR abs(90 - (pole(b) <-> intersection(a, b))) > 1e-9);
