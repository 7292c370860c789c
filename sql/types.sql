-- Types plane, lineation, fault_slip: text notations, canonical forms,
-- float8 output conventions, binary I/O, comparison and every error path.
\set VERBOSITY terse
\i sql/include/setup.sql

-- plane: the accepted notations all give the canonical right-hand-rule form
SELECT v, v::plane AS canonical FROM (VALUES
  ('110/64'), (' 110 / 64 '), ('110,64'), ('110 64'), ('110°/64°'),
  ('290/64S'), ('110/64 SW'), ('110/64N'), ('N70W 64SW'), ('S70E, 64 SW'),
  ('N30E 40SE'), ('200/64 dd'), ('64->200'), ('64 → 200'),
  ('270/90'), ('33/0'), ('360/10'), ('0.5/89.25')) t(v);

-- plane errors: syntax (22P02) and range (22003)
SELECT v, pg_temp.err(format('SELECT %L::plane', v)) FROM (VALUES
  (''),
  ('110'),
  ('110/64/3'),
  ('110//64'),
  ('NaN/64'),
  ('Infinity/64'),
  ('110/-64'),
  ('400/64'),
  ('110/95'),
  ('0/30S'),
  ('30/40NE'),
  ('N70W 64'),
  ('N95W 64SW'),
  ('110/64X'),
  ('110/64;'),
  ('1e999/64')) t(v);

-- lineation
SELECT v, v::lineation AS canonical FROM (VALUES
  ('120/30'), ('300/-30'), ('30->120'), ('30->S60E'), ('S60E/30'),
  ('N60W/30'), ('200/0'), ('45/90'), ('180/05'), ('0/-5')) t(v);
SELECT v, pg_temp.err(format('SELECT %L::lineation', v)) FROM (VALUES
  ('120'),
  ('120/30SE'),
  ('-30->120'),
  ('120/91'),
  ('361/30'),
  ('nan/30')) t(v);

-- fault_slip: signed Aki & Richards rake, unsigned rake + sense, pitch + end + sense
SELECT v, v::fault_slip AS canonical FROM (VALUES
  ('110/64/-75'), ('110/64/-180'), ('110/64/75'), ('110/64/75 N'), ('110/64/75 R'),
  ('110/64/75 T'), ('110/64/75/normal'), ('110/64/75 SN'), ('110/64/0 S'),
  ('110/64/180 D'), ('110/64/75W N'), ('110/64/75E N'), ('110/64SW/75W/N'),
  ('N70W 64SW/75W R'), ('290/64S/90E R'), ('110/64/0W D'), ('110/64/30E S N'),
  ('270/90/30'), ('40/0/10')) t(v);
SELECT v, pg_temp.err(format('SELECT %L::fault_slip', v)) FROM (VALUES
  ('110/64'),
  ('110/64/75 X'),
  ('110/64/-75 N'),
  ('110/64/75 D'),
  ('110/64/75 N D'),
  ('110/64/0 N'),
  ('110/64/75SN'),
  ('110/64/0W N'),
  ('110/64/95W N'),
  ('290/64S/-75'),
  ('0/64/75E N'),
  ('110/64/190'),
  ('110/64/75 N R'),
  ('64->200')) t(v);

-- output follows float8: shortest round-trip by default, rounding when
-- extra_float_digits <= 0 (the stored value is unchanged)
SELECT plane(110.123456789012345, 64.1);
SET extra_float_digits = -3;
SELECT plane(110.123456789012345, 64.1), lineation(1/3.0, 2/3.0);
SET extra_float_digits = 1;
SELECT plane(110.123456789012345, 64.1)::text::plane = plane(110.123456789012345, 64.1) AS text_round_trip;
RESET extra_float_digits;
SELECT lineation(1/3.0, 2/3.0)::text::lineation = lineation(1/3.0, 2/3.0) AS text_round_trip;

-- binary I/O round trip through send/recv, and recv validation
SELECT plane_send('110/64') AS wire;
SELECT encode(fault_slip_send('110/64/-75'), 'hex') AS wire;

-- exact comparison, btree and hash opclasses
SELECT '110/64'::plane = '290/64S'::plane AS same, '110/64'::plane <> '110/65'::plane AS differ,
       '110/64'::plane < '110/65'::plane AS lt, '111/0'::plane = '0/0'::plane AS horizontal_same;
CREATE TABLE t_planes (p plane);
INSERT INTO t_planes VALUES ('110/64'), ('290/64S'), ('10/20'), ('N70W 64SW'), ('10/20'), ('270/90'), ('90/90');
SELECT p, count(*) FROM t_planes GROUP BY p ORDER BY p;
SET enable_hashagg = off;
SELECT p, count(*) FROM t_planes GROUP BY p ORDER BY p;
RESET enable_hashagg;
CREATE INDEX ON t_planes (p);
CREATE INDEX ON t_planes USING hash (p);
SET enable_seqscan = off;
SELECT count(*) FROM t_planes WHERE p = '110/64';
RESET enable_seqscan;
CREATE TABLE t_lines AS SELECT lineation(g * 7 % 360, g % 90) AS l FROM generate_series(1, 500) g;
SELECT count(DISTINCT l) AS distinct_lines, count(*) FROM t_lines;
CREATE TABLE t_faults AS SELECT fault_slip(g * 7 % 360, g % 91, g % 361 - 180) AS f FROM generate_series(1, 500) g;
SELECT count(DISTINCT f) AS distinct_faults FROM t_faults;
SELECT f FROM t_faults ORDER BY f LIMIT 3;
