-- Types plane, lineation, fault_slip: I/O, exact comparison, btree and hash opclasses.
\echo Use "CREATE EXTENSION striae" to load this file. \quit

CREATE TYPE plane;

CREATE FUNCTION plane_in(cstring) RETURNS plane
  AS 'MODULE_PATHNAME' LANGUAGE C IMMUTABLE STRICT PARALLEL SAFE;
CREATE FUNCTION plane_out(plane) RETURNS cstring
  AS 'MODULE_PATHNAME' LANGUAGE C IMMUTABLE STRICT PARALLEL SAFE;
CREATE FUNCTION plane_recv(internal) RETURNS plane
  AS 'MODULE_PATHNAME' LANGUAGE C IMMUTABLE STRICT PARALLEL SAFE;
CREATE FUNCTION plane_send(plane) RETURNS bytea
  AS 'MODULE_PATHNAME' LANGUAGE C IMMUTABLE STRICT PARALLEL SAFE;

CREATE TYPE plane (
  INPUT = plane_in, OUTPUT = plane_out,
  RECEIVE = plane_recv, SEND = plane_send,
  INTERNALLENGTH = 16, ALIGNMENT = double, STORAGE = plain
);
COMMENT ON TYPE plane IS 'a plane: right-hand-rule strike and dip in degrees, canonical text ''110/64''';
COMMENT ON FUNCTION plane_in(cstring) IS 'text input of plane';
COMMENT ON FUNCTION plane_out(plane) IS 'text output of plane (float8 conventions)';
COMMENT ON FUNCTION plane_recv(internal) IS 'binary input of plane (validated)';
COMMENT ON FUNCTION plane_send(plane) IS 'binary output of plane';
CREATE FUNCTION plane_eq(plane, plane) RETURNS boolean
  AS 'MODULE_PATHNAME' LANGUAGE C IMMUTABLE STRICT PARALLEL SAFE LEAKPROOF;
COMMENT ON FUNCTION plane_eq(plane, plane) IS 'exact = on canonical plane values (support for operator =)';
CREATE OPERATOR = (LEFTARG = plane, RIGHTARG = plane, PROCEDURE = plane_eq,
  COMMUTATOR = =, NEGATOR = <>, RESTRICT = eqsel, JOIN = eqjoinsel, HASHES, MERGES);
CREATE FUNCTION plane_ne(plane, plane) RETURNS boolean
  AS 'MODULE_PATHNAME' LANGUAGE C IMMUTABLE STRICT PARALLEL SAFE LEAKPROOF;
COMMENT ON FUNCTION plane_ne(plane, plane) IS 'exact <> on canonical plane values (support for operator <>)';
CREATE OPERATOR <> (LEFTARG = plane, RIGHTARG = plane, PROCEDURE = plane_ne,
  COMMUTATOR = <>, NEGATOR = =, RESTRICT = neqsel, JOIN = neqjoinsel);
CREATE FUNCTION plane_lt(plane, plane) RETURNS boolean
  AS 'MODULE_PATHNAME' LANGUAGE C IMMUTABLE STRICT PARALLEL SAFE LEAKPROOF;
COMMENT ON FUNCTION plane_lt(plane, plane) IS 'exact < on canonical plane values (support for operator <)';
CREATE OPERATOR < (LEFTARG = plane, RIGHTARG = plane, PROCEDURE = plane_lt,
  COMMUTATOR = >, NEGATOR = >=, RESTRICT = scalarltsel, JOIN = scalarltjoinsel);
CREATE FUNCTION plane_le(plane, plane) RETURNS boolean
  AS 'MODULE_PATHNAME' LANGUAGE C IMMUTABLE STRICT PARALLEL SAFE LEAKPROOF;
COMMENT ON FUNCTION plane_le(plane, plane) IS 'exact <= on canonical plane values (support for operator <=)';
CREATE OPERATOR <= (LEFTARG = plane, RIGHTARG = plane, PROCEDURE = plane_le,
  COMMUTATOR = >=, NEGATOR = >, RESTRICT = scalarlesel, JOIN = scalarlejoinsel);
CREATE FUNCTION plane_gt(plane, plane) RETURNS boolean
  AS 'MODULE_PATHNAME' LANGUAGE C IMMUTABLE STRICT PARALLEL SAFE LEAKPROOF;
COMMENT ON FUNCTION plane_gt(plane, plane) IS 'exact > on canonical plane values (support for operator >)';
CREATE OPERATOR > (LEFTARG = plane, RIGHTARG = plane, PROCEDURE = plane_gt,
  COMMUTATOR = <, NEGATOR = <=, RESTRICT = scalargtsel, JOIN = scalargtjoinsel);
CREATE FUNCTION plane_ge(plane, plane) RETURNS boolean
  AS 'MODULE_PATHNAME' LANGUAGE C IMMUTABLE STRICT PARALLEL SAFE LEAKPROOF;
COMMENT ON FUNCTION plane_ge(plane, plane) IS 'exact >= on canonical plane values (support for operator >=)';
CREATE OPERATOR >= (LEFTARG = plane, RIGHTARG = plane, PROCEDURE = plane_ge,
  COMMUTATOR = <=, NEGATOR = <, RESTRICT = scalargesel, JOIN = scalargejoinsel);
CREATE FUNCTION plane_cmp(plane, plane) RETURNS integer
  AS 'MODULE_PATHNAME' LANGUAGE C IMMUTABLE STRICT PARALLEL SAFE LEAKPROOF;
COMMENT ON FUNCTION plane_cmp(plane, plane) IS 'btree support: total order on canonical plane values (field by field)';
CREATE FUNCTION plane_hash(plane) RETURNS integer
  AS 'MODULE_PATHNAME' LANGUAGE C IMMUTABLE STRICT PARALLEL SAFE LEAKPROOF;
COMMENT ON FUNCTION plane_hash(plane) IS 'hash support for plane';
CREATE FUNCTION plane_hash_extended(plane, bigint) RETURNS bigint
  AS 'MODULE_PATHNAME' LANGUAGE C IMMUTABLE STRICT PARALLEL SAFE LEAKPROOF;
COMMENT ON FUNCTION plane_hash_extended(plane, bigint) IS 'seeded hash support for plane';

CREATE OPERATOR CLASS plane_ops DEFAULT FOR TYPE plane USING btree AS
  OPERATOR 1 <, OPERATOR 2 <=, OPERATOR 3 =, OPERATOR 4 >=, OPERATOR 5 >,
  FUNCTION 1 plane_cmp(plane, plane);
CREATE OPERATOR CLASS plane_hash_ops DEFAULT FOR TYPE plane USING hash AS
  OPERATOR 1 =,
  FUNCTION 1 plane_hash(plane),
  FUNCTION 2 plane_hash_extended(plane, bigint);

CREATE TYPE lineation;

CREATE FUNCTION lineation_in(cstring) RETURNS lineation
  AS 'MODULE_PATHNAME' LANGUAGE C IMMUTABLE STRICT PARALLEL SAFE;
CREATE FUNCTION lineation_out(lineation) RETURNS cstring
  AS 'MODULE_PATHNAME' LANGUAGE C IMMUTABLE STRICT PARALLEL SAFE;
CREATE FUNCTION lineation_recv(internal) RETURNS lineation
  AS 'MODULE_PATHNAME' LANGUAGE C IMMUTABLE STRICT PARALLEL SAFE;
CREATE FUNCTION lineation_send(lineation) RETURNS bytea
  AS 'MODULE_PATHNAME' LANGUAGE C IMMUTABLE STRICT PARALLEL SAFE;

CREATE TYPE lineation (
  INPUT = lineation_in, OUTPUT = lineation_out,
  RECEIVE = lineation_recv, SEND = lineation_send,
  INTERNALLENGTH = 16, ALIGNMENT = double, STORAGE = plain
);
COMMENT ON TYPE lineation IS 'a line (axis), lower hemisphere: trend and plunge in degrees, canonical text ''120/30''';
COMMENT ON FUNCTION lineation_in(cstring) IS 'text input of lineation';
COMMENT ON FUNCTION lineation_out(lineation) IS 'text output of lineation (float8 conventions)';
COMMENT ON FUNCTION lineation_recv(internal) IS 'binary input of lineation (validated)';
COMMENT ON FUNCTION lineation_send(lineation) IS 'binary output of lineation';
CREATE FUNCTION lineation_eq(lineation, lineation) RETURNS boolean
  AS 'MODULE_PATHNAME' LANGUAGE C IMMUTABLE STRICT PARALLEL SAFE LEAKPROOF;
COMMENT ON FUNCTION lineation_eq(lineation, lineation) IS 'exact = on canonical lineation values (support for operator =)';
CREATE OPERATOR = (LEFTARG = lineation, RIGHTARG = lineation, PROCEDURE = lineation_eq,
  COMMUTATOR = =, NEGATOR = <>, RESTRICT = eqsel, JOIN = eqjoinsel, HASHES, MERGES);
CREATE FUNCTION lineation_ne(lineation, lineation) RETURNS boolean
  AS 'MODULE_PATHNAME' LANGUAGE C IMMUTABLE STRICT PARALLEL SAFE LEAKPROOF;
COMMENT ON FUNCTION lineation_ne(lineation, lineation) IS 'exact <> on canonical lineation values (support for operator <>)';
CREATE OPERATOR <> (LEFTARG = lineation, RIGHTARG = lineation, PROCEDURE = lineation_ne,
  COMMUTATOR = <>, NEGATOR = =, RESTRICT = neqsel, JOIN = neqjoinsel);
CREATE FUNCTION lineation_lt(lineation, lineation) RETURNS boolean
  AS 'MODULE_PATHNAME' LANGUAGE C IMMUTABLE STRICT PARALLEL SAFE LEAKPROOF;
COMMENT ON FUNCTION lineation_lt(lineation, lineation) IS 'exact < on canonical lineation values (support for operator <)';
CREATE OPERATOR < (LEFTARG = lineation, RIGHTARG = lineation, PROCEDURE = lineation_lt,
  COMMUTATOR = >, NEGATOR = >=, RESTRICT = scalarltsel, JOIN = scalarltjoinsel);
CREATE FUNCTION lineation_le(lineation, lineation) RETURNS boolean
  AS 'MODULE_PATHNAME' LANGUAGE C IMMUTABLE STRICT PARALLEL SAFE LEAKPROOF;
COMMENT ON FUNCTION lineation_le(lineation, lineation) IS 'exact <= on canonical lineation values (support for operator <=)';
CREATE OPERATOR <= (LEFTARG = lineation, RIGHTARG = lineation, PROCEDURE = lineation_le,
  COMMUTATOR = >=, NEGATOR = >, RESTRICT = scalarlesel, JOIN = scalarlejoinsel);
CREATE FUNCTION lineation_gt(lineation, lineation) RETURNS boolean
  AS 'MODULE_PATHNAME' LANGUAGE C IMMUTABLE STRICT PARALLEL SAFE LEAKPROOF;
COMMENT ON FUNCTION lineation_gt(lineation, lineation) IS 'exact > on canonical lineation values (support for operator >)';
CREATE OPERATOR > (LEFTARG = lineation, RIGHTARG = lineation, PROCEDURE = lineation_gt,
  COMMUTATOR = <, NEGATOR = <=, RESTRICT = scalargtsel, JOIN = scalargtjoinsel);
CREATE FUNCTION lineation_ge(lineation, lineation) RETURNS boolean
  AS 'MODULE_PATHNAME' LANGUAGE C IMMUTABLE STRICT PARALLEL SAFE LEAKPROOF;
COMMENT ON FUNCTION lineation_ge(lineation, lineation) IS 'exact >= on canonical lineation values (support for operator >=)';
CREATE OPERATOR >= (LEFTARG = lineation, RIGHTARG = lineation, PROCEDURE = lineation_ge,
  COMMUTATOR = <=, NEGATOR = <, RESTRICT = scalargesel, JOIN = scalargejoinsel);
CREATE FUNCTION lineation_cmp(lineation, lineation) RETURNS integer
  AS 'MODULE_PATHNAME' LANGUAGE C IMMUTABLE STRICT PARALLEL SAFE LEAKPROOF;
COMMENT ON FUNCTION lineation_cmp(lineation, lineation) IS 'btree support: total order on canonical lineation values (field by field)';
CREATE FUNCTION lineation_hash(lineation) RETURNS integer
  AS 'MODULE_PATHNAME' LANGUAGE C IMMUTABLE STRICT PARALLEL SAFE LEAKPROOF;
COMMENT ON FUNCTION lineation_hash(lineation) IS 'hash support for lineation';
CREATE FUNCTION lineation_hash_extended(lineation, bigint) RETURNS bigint
  AS 'MODULE_PATHNAME' LANGUAGE C IMMUTABLE STRICT PARALLEL SAFE LEAKPROOF;
COMMENT ON FUNCTION lineation_hash_extended(lineation, bigint) IS 'seeded hash support for lineation';

CREATE OPERATOR CLASS lineation_ops DEFAULT FOR TYPE lineation USING btree AS
  OPERATOR 1 <, OPERATOR 2 <=, OPERATOR 3 =, OPERATOR 4 >=, OPERATOR 5 >,
  FUNCTION 1 lineation_cmp(lineation, lineation);
CREATE OPERATOR CLASS lineation_hash_ops DEFAULT FOR TYPE lineation USING hash AS
  OPERATOR 1 =,
  FUNCTION 1 lineation_hash(lineation),
  FUNCTION 2 lineation_hash_extended(lineation, bigint);

CREATE TYPE fault_slip;

CREATE FUNCTION fault_slip_in(cstring) RETURNS fault_slip
  AS 'MODULE_PATHNAME' LANGUAGE C IMMUTABLE STRICT PARALLEL SAFE;
CREATE FUNCTION fault_slip_out(fault_slip) RETURNS cstring
  AS 'MODULE_PATHNAME' LANGUAGE C IMMUTABLE STRICT PARALLEL SAFE;
CREATE FUNCTION fault_slip_recv(internal) RETURNS fault_slip
  AS 'MODULE_PATHNAME' LANGUAGE C IMMUTABLE STRICT PARALLEL SAFE;
CREATE FUNCTION fault_slip_send(fault_slip) RETURNS bytea
  AS 'MODULE_PATHNAME' LANGUAGE C IMMUTABLE STRICT PARALLEL SAFE;

CREATE TYPE fault_slip (
  INPUT = fault_slip_in, OUTPUT = fault_slip_out,
  RECEIVE = fault_slip_recv, SEND = fault_slip_send,
  INTERNALLENGTH = 24, ALIGNMENT = double, STORAGE = plain
);
COMMENT ON TYPE fault_slip IS 'fault-slip datum or nodal plane: strike, dip and Aki & Richards rake in degrees, canonical text ''110/64/-75''';
COMMENT ON FUNCTION fault_slip_in(cstring) IS 'text input of fault_slip';
COMMENT ON FUNCTION fault_slip_out(fault_slip) IS 'text output of fault_slip (float8 conventions)';
COMMENT ON FUNCTION fault_slip_recv(internal) IS 'binary input of fault_slip (validated)';
COMMENT ON FUNCTION fault_slip_send(fault_slip) IS 'binary output of fault_slip';
CREATE FUNCTION fault_slip_eq(fault_slip, fault_slip) RETURNS boolean
  AS 'MODULE_PATHNAME' LANGUAGE C IMMUTABLE STRICT PARALLEL SAFE LEAKPROOF;
COMMENT ON FUNCTION fault_slip_eq(fault_slip, fault_slip) IS 'exact = on canonical fault_slip values (support for operator =)';
CREATE OPERATOR = (LEFTARG = fault_slip, RIGHTARG = fault_slip, PROCEDURE = fault_slip_eq,
  COMMUTATOR = =, NEGATOR = <>, RESTRICT = eqsel, JOIN = eqjoinsel, HASHES, MERGES);
CREATE FUNCTION fault_slip_ne(fault_slip, fault_slip) RETURNS boolean
  AS 'MODULE_PATHNAME' LANGUAGE C IMMUTABLE STRICT PARALLEL SAFE LEAKPROOF;
COMMENT ON FUNCTION fault_slip_ne(fault_slip, fault_slip) IS 'exact <> on canonical fault_slip values (support for operator <>)';
CREATE OPERATOR <> (LEFTARG = fault_slip, RIGHTARG = fault_slip, PROCEDURE = fault_slip_ne,
  COMMUTATOR = <>, NEGATOR = =, RESTRICT = neqsel, JOIN = neqjoinsel);
CREATE FUNCTION fault_slip_lt(fault_slip, fault_slip) RETURNS boolean
  AS 'MODULE_PATHNAME' LANGUAGE C IMMUTABLE STRICT PARALLEL SAFE LEAKPROOF;
COMMENT ON FUNCTION fault_slip_lt(fault_slip, fault_slip) IS 'exact < on canonical fault_slip values (support for operator <)';
CREATE OPERATOR < (LEFTARG = fault_slip, RIGHTARG = fault_slip, PROCEDURE = fault_slip_lt,
  COMMUTATOR = >, NEGATOR = >=, RESTRICT = scalarltsel, JOIN = scalarltjoinsel);
CREATE FUNCTION fault_slip_le(fault_slip, fault_slip) RETURNS boolean
  AS 'MODULE_PATHNAME' LANGUAGE C IMMUTABLE STRICT PARALLEL SAFE LEAKPROOF;
COMMENT ON FUNCTION fault_slip_le(fault_slip, fault_slip) IS 'exact <= on canonical fault_slip values (support for operator <=)';
CREATE OPERATOR <= (LEFTARG = fault_slip, RIGHTARG = fault_slip, PROCEDURE = fault_slip_le,
  COMMUTATOR = >=, NEGATOR = >, RESTRICT = scalarlesel, JOIN = scalarlejoinsel);
CREATE FUNCTION fault_slip_gt(fault_slip, fault_slip) RETURNS boolean
  AS 'MODULE_PATHNAME' LANGUAGE C IMMUTABLE STRICT PARALLEL SAFE LEAKPROOF;
COMMENT ON FUNCTION fault_slip_gt(fault_slip, fault_slip) IS 'exact > on canonical fault_slip values (support for operator >)';
CREATE OPERATOR > (LEFTARG = fault_slip, RIGHTARG = fault_slip, PROCEDURE = fault_slip_gt,
  COMMUTATOR = <, NEGATOR = <=, RESTRICT = scalargtsel, JOIN = scalargtjoinsel);
CREATE FUNCTION fault_slip_ge(fault_slip, fault_slip) RETURNS boolean
  AS 'MODULE_PATHNAME' LANGUAGE C IMMUTABLE STRICT PARALLEL SAFE LEAKPROOF;
COMMENT ON FUNCTION fault_slip_ge(fault_slip, fault_slip) IS 'exact >= on canonical fault_slip values (support for operator >=)';
CREATE OPERATOR >= (LEFTARG = fault_slip, RIGHTARG = fault_slip, PROCEDURE = fault_slip_ge,
  COMMUTATOR = <=, NEGATOR = <, RESTRICT = scalargesel, JOIN = scalargejoinsel);
CREATE FUNCTION fault_slip_cmp(fault_slip, fault_slip) RETURNS integer
  AS 'MODULE_PATHNAME' LANGUAGE C IMMUTABLE STRICT PARALLEL SAFE LEAKPROOF;
COMMENT ON FUNCTION fault_slip_cmp(fault_slip, fault_slip) IS 'btree support: total order on canonical fault_slip values (field by field)';
CREATE FUNCTION fault_slip_hash(fault_slip) RETURNS integer
  AS 'MODULE_PATHNAME' LANGUAGE C IMMUTABLE STRICT PARALLEL SAFE LEAKPROOF;
COMMENT ON FUNCTION fault_slip_hash(fault_slip) IS 'hash support for fault_slip';
CREATE FUNCTION fault_slip_hash_extended(fault_slip, bigint) RETURNS bigint
  AS 'MODULE_PATHNAME' LANGUAGE C IMMUTABLE STRICT PARALLEL SAFE LEAKPROOF;
COMMENT ON FUNCTION fault_slip_hash_extended(fault_slip, bigint) IS 'seeded hash support for fault_slip';

CREATE OPERATOR CLASS fault_slip_ops DEFAULT FOR TYPE fault_slip USING btree AS
  OPERATOR 1 <, OPERATOR 2 <=, OPERATOR 3 =, OPERATOR 4 >=, OPERATOR 5 >,
  FUNCTION 1 fault_slip_cmp(fault_slip, fault_slip);
CREATE OPERATOR CLASS fault_slip_hash_ops DEFAULT FOR TYPE fault_slip USING hash AS
  OPERATOR 1 =,
  FUNCTION 1 fault_slip_hash(fault_slip),
  FUNCTION 2 fault_slip_hash_extended(fault_slip, bigint);
-- Constructors, accessors and per-datum geometry of plane, lineation, fault_slip.

CREATE FUNCTION plane(strike float8, dip float8) RETURNS plane
  AS 'MODULE_PATHNAME', 'plane_make' LANGUAGE C IMMUTABLE STRICT PARALLEL SAFE;
COMMENT ON FUNCTION plane(float8, float8) IS
  'plane from right-hand-rule strike (0..360) and dip (0..90), degrees';

CREATE FUNCTION plane_from_dip_direction(dip_direction float8, dip float8) RETURNS plane
  AS 'MODULE_PATHNAME' LANGUAGE C IMMUTABLE STRICT PARALLEL SAFE;
COMMENT ON FUNCTION plane_from_dip_direction(float8, float8) IS
  'plane from dip direction (0..360) and dip (0..90), degrees; strike = dip direction - 90';

CREATE FUNCTION lineation(trend float8, plunge float8) RETURNS lineation
  AS 'MODULE_PATHNAME', 'lineation_make' LANGUAGE C IMMUTABLE STRICT PARALLEL SAFE;
COMMENT ON FUNCTION lineation(float8, float8) IS
  'line from trend (0..360) and plunge (-90..90; negative = upward, flipped to the lower hemisphere), degrees';

CREATE FUNCTION fault_slip(strike float8, dip float8, rake float8) RETURNS fault_slip
  AS 'MODULE_PATHNAME', 'fault_slip_make' LANGUAGE C IMMUTABLE STRICT PARALLEL SAFE;
COMMENT ON FUNCTION fault_slip(float8, float8, float8) IS
  'fault slip from right-hand-rule strike, dip and Aki & Richards rake (-180..180, positive = reverse), degrees';

CREATE FUNCTION fault_slip(fault plane, rake float8) RETURNS fault_slip
  AS 'MODULE_PATHNAME', 'fault_slip_from_plane' LANGUAGE C IMMUTABLE STRICT PARALLEL SAFE;
COMMENT ON FUNCTION fault_slip(plane, float8) IS
  'fault slip from a plane and an Aki & Richards rake (degrees, measured from the right-hand-rule strike)';

CREATE FUNCTION fault_slip(fault plane, striation lineation, sense text, tolerance float8 DEFAULT 10)
  RETURNS fault_slip
  AS 'MODULE_PATHNAME', 'fault_slip_from_striation' LANGUAGE C IMMUTABLE STRICT PARALLEL SAFE;
COMMENT ON FUNCTION fault_slip(plane, lineation, text, float8) IS
  'fault slip from a plane, a striation and a sense (normal, reverse/thrust, dextral, sinistral, or n r t d s, or one of each kind); a striation up to tolerance degrees off the plane is projected onto it';

CREATE FUNCTION strike(plane) RETURNS float8
  AS 'MODULE_PATHNAME', 'plane_strike' LANGUAGE C IMMUTABLE STRICT PARALLEL SAFE;
COMMENT ON FUNCTION strike(plane) IS 'right-hand-rule strike of a plane, degrees [0,360)';
CREATE FUNCTION dip(plane) RETURNS float8
  AS 'MODULE_PATHNAME', 'plane_dip' LANGUAGE C IMMUTABLE STRICT PARALLEL SAFE;
COMMENT ON FUNCTION dip(plane) IS 'dip of a plane, degrees [0,90]';
CREATE FUNCTION dip_direction(plane) RETURNS float8
  AS 'MODULE_PATHNAME', 'plane_dip_direction' LANGUAGE C IMMUTABLE STRICT PARALLEL SAFE;
COMMENT ON FUNCTION dip_direction(plane) IS 'dip direction of a plane (strike + 90), degrees [0,360)';
CREATE FUNCTION trend(lineation) RETURNS float8
  AS 'MODULE_PATHNAME', 'lineation_trend' LANGUAGE C IMMUTABLE STRICT PARALLEL SAFE;
COMMENT ON FUNCTION trend(lineation) IS 'trend of a line, degrees [0,360)';
CREATE FUNCTION plunge(lineation) RETURNS float8
  AS 'MODULE_PATHNAME', 'lineation_plunge' LANGUAGE C IMMUTABLE STRICT PARALLEL SAFE;
COMMENT ON FUNCTION plunge(lineation) IS 'plunge of a line, degrees [0,90], lower hemisphere';
CREATE FUNCTION strike(fault_slip) RETURNS float8
  AS 'MODULE_PATHNAME', 'fault_slip_strike' LANGUAGE C IMMUTABLE STRICT PARALLEL SAFE;
COMMENT ON FUNCTION strike(fault_slip) IS 'right-hand-rule strike of the fault plane, degrees';
CREATE FUNCTION dip(fault_slip) RETURNS float8
  AS 'MODULE_PATHNAME', 'fault_slip_dip' LANGUAGE C IMMUTABLE STRICT PARALLEL SAFE;
COMMENT ON FUNCTION dip(fault_slip) IS 'dip of the fault plane, degrees';
CREATE FUNCTION rake(fault_slip) RETURNS float8
  AS 'MODULE_PATHNAME', 'fault_slip_rake' LANGUAGE C IMMUTABLE STRICT PARALLEL SAFE;
COMMENT ON FUNCTION rake(fault_slip) IS 'Aki & Richards rake of the hanging-wall slip, degrees (-180,180]';
CREATE FUNCTION fault_plane(fault_slip) RETURNS plane
  AS 'MODULE_PATHNAME', 'fault_slip_plane' LANGUAGE C IMMUTABLE STRICT PARALLEL SAFE;
COMMENT ON FUNCTION fault_plane(fault_slip) IS 'the fault plane of a fault-slip datum';
CREATE FUNCTION slip_sense(fault_slip) RETURNS text
  AS 'MODULE_PATHNAME', 'fault_slip_sense' LANGUAGE C IMMUTABLE STRICT PARALLEL SAFE;
COMMENT ON FUNCTION slip_sense(fault_slip) IS
  'sense of slip from the rake: normal, reverse, dextral, sinistral within 22.5 degrees of pure, else two senses, dominant first (e.g. normal-dextral)';
CREATE FUNCTION direction_cosines(lineation) RETURNS float8[]
  AS 'MODULE_PATHNAME', 'lineation_direction_cosines' LANGUAGE C IMMUTABLE STRICT PARALLEL SAFE;
COMMENT ON FUNCTION direction_cosines(lineation) IS 'unit vector of a line as {north, east, down}';

CREATE FUNCTION pole(plane) RETURNS lineation
  AS 'MODULE_PATHNAME', 'plane_pole' LANGUAGE C IMMUTABLE STRICT PARALLEL SAFE;
COMMENT ON FUNCTION pole(plane) IS 'lower-hemisphere pole of a plane: trend strike - 90, plunge 90 - dip';
CREATE FUNCTION plane_from_pole(lineation) RETURNS plane
  AS 'MODULE_PATHNAME' LANGUAGE C IMMUTABLE STRICT PARALLEL SAFE;
COMMENT ON FUNCTION plane_from_pole(lineation) IS 'the plane whose pole is the given line';

CREATE FUNCTION angle(lineation, lineation) RETURNS float8
  AS 'MODULE_PATHNAME', 'lineation_angle' LANGUAGE C IMMUTABLE STRICT PARALLEL SAFE;
COMMENT ON FUNCTION angle(lineation, lineation) IS 'axial angle between two lines, degrees 0..90';
CREATE FUNCTION angle(plane, plane) RETURNS float8
  AS 'MODULE_PATHNAME', 'plane_angle' LANGUAGE C IMMUTABLE STRICT PARALLEL SAFE;
COMMENT ON FUNCTION angle(plane, plane) IS 'angle between two planes (between their poles), degrees 0..90';
CREATE OPERATOR <-> (LEFTARG = lineation, RIGHTARG = lineation, PROCEDURE = angle, COMMUTATOR = <->);
COMMENT ON OPERATOR <->(lineation, lineation) IS 'axial angle between two lines, degrees';
CREATE OPERATOR <-> (LEFTARG = plane, RIGHTARG = plane, PROCEDURE = angle, COMMUTATOR = <->);
COMMENT ON OPERATOR <->(plane, plane) IS 'angle between two planes, degrees';

CREATE FUNCTION intersection(plane, plane) RETURNS lineation
  AS 'MODULE_PATHNAME', 'plane_intersection' LANGUAGE C IMMUTABLE STRICT PARALLEL SAFE;
COMMENT ON FUNCTION intersection(plane, plane) IS
  'line of intersection of two planes (error if they are less than 1e-6 degree apart)';
CREATE FUNCTION plane_through(lineation, lineation) RETURNS plane
  AS 'MODULE_PATHNAME', 'lineation_plane_through' LANGUAGE C IMMUTABLE STRICT PARALLEL SAFE;
COMMENT ON FUNCTION plane_through(lineation, lineation) IS
  'the plane containing two lines (error if they are less than 1e-6 degree apart)';
-- Focal-mechanism geometry of fault_slip values (one nodal plane with its rake).

CREATE FUNCTION auxiliary(fault_slip) RETURNS fault_slip
  AS 'MODULE_PATHNAME', 'fault_slip_auxiliary' LANGUAGE C IMMUTABLE STRICT PARALLEL SAFE;
COMMENT ON FUNCTION auxiliary(fault_slip) IS
  'the other nodal plane of the double couple with its rake (normal and slip vectors swapped)';
CREATE FUNCTION auxiliary_plane(fault_slip) RETURNS plane
  AS 'MODULE_PATHNAME', 'fault_slip_auxiliary_plane' LANGUAGE C IMMUTABLE STRICT PARALLEL SAFE;
COMMENT ON FUNCTION auxiliary_plane(fault_slip) IS 'the other nodal plane of the double couple';
CREATE FUNCTION p_axis(fault_slip) RETURNS lineation
  AS 'MODULE_PATHNAME', 'fault_slip_p_axis' LANGUAGE C IMMUTABLE STRICT PARALLEL SAFE;
COMMENT ON FUNCTION p_axis(fault_slip) IS 'pressure axis (n - u)/sqrt 2 of the double couple, lower hemisphere';
CREATE FUNCTION t_axis(fault_slip) RETURNS lineation
  AS 'MODULE_PATHNAME', 'fault_slip_t_axis' LANGUAGE C IMMUTABLE STRICT PARALLEL SAFE;
COMMENT ON FUNCTION t_axis(fault_slip) IS 'tension axis (n + u)/sqrt 2 of the double couple, lower hemisphere';
CREATE FUNCTION b_axis(fault_slip) RETURNS lineation
  AS 'MODULE_PATHNAME', 'fault_slip_b_axis' LANGUAGE C IMMUTABLE STRICT PARALLEL SAFE;
COMMENT ON FUNCTION b_axis(fault_slip) IS 'null axis T x P of the double couple, lower hemisphere';
CREATE FUNCTION moment_tensor(fault_slip, frame text DEFAULT 'ned') RETURNS float8[]
  AS 'MODULE_PATHNAME', 'fault_slip_moment_tensor' LANGUAGE C IMMUTABLE STRICT PARALLEL SAFE;
COMMENT ON FUNCTION moment_tensor(fault_slip, text) IS
  'double-couple moment tensor for unit scalar moment, M = n u^T + u n^T; frame ''ned'' gives {nn, ee, dd, ne, nd, ed}, ''use'' gives {rr, tt, pp, rt, rp, tp} (up, south, east)';
CREATE FUNCTION kagan_angle(fault_slip, fault_slip) RETURNS float8
  AS 'MODULE_PATHNAME', 'fault_slip_kagan_angle' LANGUAGE C IMMUTABLE STRICT PARALLEL SAFE;
COMMENT ON FUNCTION kagan_angle(fault_slip, fault_slip) IS
  'Kagan (1991) angle: smallest rotation between two double couples, degrees 0..120';
CREATE FUNCTION mechanism_class(fault_slip) RETURNS text
  AS 'MODULE_PATHNAME', 'fault_slip_mechanism_class' LANGUAGE C IMMUTABLE STRICT PARALLEL SAFE;
COMMENT ON FUNCTION mechanism_class(fault_slip) IS
  'Frohlich (1992) class from P, T, B plunges: thrust (T > 50), strike-slip (B > 60), normal (P > 60), else oblique';
-- Orientation statistics: result types, sphere_grid, and the parallel-safe
-- aggregates fisher_mean, orientation_tensor, mean_plane, fold_axis, density_grid.

CREATE TYPE fisher_summary AS (
  mean lineation, n bigint, resultant float8, kappa float8, alpha95 float8, angular_sd float8);
COMMENT ON TYPE fisher_summary IS
  'Fisher (1953) statistics of axial data: mean axis, count, resultant length R, precision kappa = (N-1)/(N-R), exact alpha95 (degrees), angular standard deviation 81/sqrt(kappa) (degrees); NULL fields are undefined for the group';

CREATE TYPE fabric_summary AS (
  e1 lineation, e2 lineation, e3 lineation, s1 float8, s2 float8, s3 float8,
  woodcock_k float8, woodcock_c float8, point float8, girdle float8, random float8, n bigint);
COMMENT ON TYPE fabric_summary IS
  'orientation tensor: eigenvectors e1..e3, normalised eigenvalues s1 >= s2 >= s3 (sum 1), Woodcock (1977) K and C, Vollmer (1990) point, girdle, random indices, count';

-- sphere_grid: values at the nodes of a lower-hemisphere grid
CREATE TYPE sphere_grid;
CREATE FUNCTION sphere_grid_in(cstring) RETURNS sphere_grid
  AS 'MODULE_PATHNAME' LANGUAGE C IMMUTABLE STRICT PARALLEL SAFE;
CREATE FUNCTION sphere_grid_out(sphere_grid) RETURNS cstring
  AS 'MODULE_PATHNAME' LANGUAGE C IMMUTABLE STRICT PARALLEL SAFE;
CREATE FUNCTION sphere_grid_recv(internal) RETURNS sphere_grid
  AS 'MODULE_PATHNAME' LANGUAGE C IMMUTABLE STRICT PARALLEL SAFE;
CREATE FUNCTION sphere_grid_send(sphere_grid) RETURNS bytea
  AS 'MODULE_PATHNAME' LANGUAGE C IMMUTABLE STRICT PARALLEL SAFE;
CREATE TYPE sphere_grid (
  INPUT = sphere_grid_in, OUTPUT = sphere_grid_out, RECEIVE = sphere_grid_recv, SEND = sphere_grid_send,
  INTERNALLENGTH = VARIABLE, ALIGNMENT = double, STORAGE = extended);
COMMENT ON TYPE sphere_grid IS
  'values at near-uniform nodes of the lower hemisphere (rings of constant plunge at the grid spacing); text form {"kind", "spacing", "n", "values"}';
COMMENT ON FUNCTION sphere_grid_in(cstring) IS 'text input of sphere_grid (validated)';
COMMENT ON FUNCTION sphere_grid_out(sphere_grid) IS 'text output of sphere_grid';
COMMENT ON FUNCTION sphere_grid_recv(internal) IS 'binary input of sphere_grid (validated)';
COMMENT ON FUNCTION sphere_grid_send(sphere_grid) IS 'binary output of sphere_grid';

CREATE FUNCTION grid_cells(sphere_grid) RETURNS TABLE (trend float8, plunge float8, value float8)
  AS 'MODULE_PATHNAME', 'sphere_grid_cells' LANGUAGE C IMMUTABLE STRICT PARALLEL SAFE ROWS 1000;
COMMENT ON FUNCTION grid_cells(sphere_grid) IS 'one row per grid node: node trend and plunge (degrees) and its value';
CREATE FUNCTION grid_max(sphere_grid) RETURNS lineation
  AS 'MODULE_PATHNAME', 'sphere_grid_max' LANGUAGE C IMMUTABLE STRICT PARALLEL SAFE;
COMMENT ON FUNCTION grid_max(sphere_grid) IS
  'axis of the grid maximum: the node with the largest value, or the axial mean (principal eigenvector) of all nodes tied at it';
CREATE FUNCTION grid_min(sphere_grid) RETURNS lineation
  AS 'MODULE_PATHNAME', 'sphere_grid_min' LANGUAGE C IMMUTABLE STRICT PARALLEL SAFE;
COMMENT ON FUNCTION grid_min(sphere_grid) IS
  'axis of the grid minimum: the node with the smallest value, or the axial mean of all nodes tied at it';
CREATE FUNCTION grid_spacing(sphere_grid) RETURNS float8
  AS 'MODULE_PATHNAME', 'sphere_grid_spacing' LANGUAGE C IMMUTABLE STRICT PARALLEL SAFE;
COMMENT ON FUNCTION grid_spacing(sphere_grid) IS 'node spacing of the grid, degrees';
CREATE FUNCTION grid_data_count(sphere_grid) RETURNS bigint
  AS 'MODULE_PATHNAME', 'sphere_grid_data_count' LANGUAGE C IMMUTABLE STRICT PARALLEL SAFE;
COMMENT ON FUNCTION grid_data_count(sphere_grid) IS 'number of data the grid summarises';
CREATE FUNCTION grid_kind(sphere_grid) RETURNS text
  AS 'MODULE_PATHNAME', 'sphere_grid_kind' LANGUAGE C IMMUTABLE STRICT PARALLEL SAFE;
COMMENT ON FUNCTION grid_kind(sphere_grid) IS 'what the values are: density (multiples of uniform density) or right_dihedra (percent)';

-- aggregate support functions (internal states; each validates what it is handed)
CREATE FUNCTION fisher_lineation_accum(internal, lineation) RETURNS internal
  AS 'MODULE_PATHNAME' LANGUAGE C IMMUTABLE PARALLEL SAFE;
CREATE FUNCTION fisher_plane_accum(internal, plane) RETURNS internal
  AS 'MODULE_PATHNAME' LANGUAGE C IMMUTABLE PARALLEL SAFE;
CREATE FUNCTION fisher_combine(internal, internal) RETURNS internal
  AS 'MODULE_PATHNAME' LANGUAGE C IMMUTABLE PARALLEL SAFE;
CREATE FUNCTION fisher_serialize(internal) RETURNS bytea
  AS 'MODULE_PATHNAME' LANGUAGE C IMMUTABLE STRICT PARALLEL SAFE;
CREATE FUNCTION fisher_deserialize(bytea, internal) RETURNS internal
  AS 'MODULE_PATHNAME' LANGUAGE C IMMUTABLE STRICT PARALLEL SAFE;
CREATE FUNCTION fisher_final(internal) RETURNS fisher_summary
  AS 'MODULE_PATHNAME' LANGUAGE C IMMUTABLE PARALLEL SAFE;
COMMENT ON FUNCTION fisher_lineation_accum(internal, lineation) IS 'fisher_mean(lineation) transition';
COMMENT ON FUNCTION fisher_plane_accum(internal, plane) IS 'fisher_mean(plane) transition (poles)';
COMMENT ON FUNCTION fisher_combine(internal, internal) IS 'fisher_mean combine';
COMMENT ON FUNCTION fisher_serialize(internal) IS 'fisher_mean state serialization';
COMMENT ON FUNCTION fisher_deserialize(bytea, internal) IS 'fisher_mean state deserialization (validated)';
COMMENT ON FUNCTION fisher_final(internal) IS 'fisher_mean final function';

CREATE FUNCTION tensor_lineation_accum(internal, lineation) RETURNS internal
  AS 'MODULE_PATHNAME' LANGUAGE C IMMUTABLE PARALLEL SAFE;
CREATE FUNCTION tensor_plane_accum(internal, plane) RETURNS internal
  AS 'MODULE_PATHNAME' LANGUAGE C IMMUTABLE PARALLEL SAFE;
CREATE FUNCTION tensor_combine(internal, internal) RETURNS internal
  AS 'MODULE_PATHNAME' LANGUAGE C IMMUTABLE PARALLEL SAFE;
CREATE FUNCTION tensor_serialize(internal) RETURNS bytea
  AS 'MODULE_PATHNAME' LANGUAGE C IMMUTABLE STRICT PARALLEL SAFE;
CREATE FUNCTION tensor_deserialize(bytea, internal) RETURNS internal
  AS 'MODULE_PATHNAME' LANGUAGE C IMMUTABLE STRICT PARALLEL SAFE;
CREATE FUNCTION tensor_final(internal) RETURNS fabric_summary
  AS 'MODULE_PATHNAME' LANGUAGE C IMMUTABLE PARALLEL SAFE;
CREATE FUNCTION mean_plane_final(internal) RETURNS plane
  AS 'MODULE_PATHNAME' LANGUAGE C IMMUTABLE PARALLEL SAFE;
CREATE FUNCTION fold_axis_final(internal) RETURNS lineation
  AS 'MODULE_PATHNAME' LANGUAGE C IMMUTABLE PARALLEL SAFE;
COMMENT ON FUNCTION tensor_lineation_accum(internal, lineation) IS 'orientation_tensor(lineation) transition';
COMMENT ON FUNCTION tensor_plane_accum(internal, plane) IS 'orientation-tensor transition for planes (poles)';
COMMENT ON FUNCTION tensor_combine(internal, internal) IS 'orientation-tensor combine';
COMMENT ON FUNCTION tensor_serialize(internal) IS 'orientation-tensor state serialization';
COMMENT ON FUNCTION tensor_deserialize(bytea, internal) IS 'orientation-tensor state deserialization (validated)';
COMMENT ON FUNCTION tensor_final(internal) IS 'orientation_tensor final function';
COMMENT ON FUNCTION mean_plane_final(internal) IS 'mean_plane final function';
COMMENT ON FUNCTION fold_axis_final(internal) IS 'fold_axis final function';

CREATE FUNCTION density_lineation_accum(internal, lineation, float8) RETURNS internal
  AS 'MODULE_PATHNAME' LANGUAGE C IMMUTABLE PARALLEL SAFE;
CREATE FUNCTION density_plane_accum(internal, plane, float8) RETURNS internal
  AS 'MODULE_PATHNAME' LANGUAGE C IMMUTABLE PARALLEL SAFE;
CREATE FUNCTION density_combine(internal, internal) RETURNS internal
  AS 'MODULE_PATHNAME' LANGUAGE C IMMUTABLE PARALLEL SAFE;
CREATE FUNCTION density_serialize(internal) RETURNS bytea
  AS 'MODULE_PATHNAME' LANGUAGE C IMMUTABLE STRICT PARALLEL SAFE;
CREATE FUNCTION density_deserialize(bytea, internal) RETURNS internal
  AS 'MODULE_PATHNAME' LANGUAGE C IMMUTABLE STRICT PARALLEL SAFE;
CREATE FUNCTION density_final(internal) RETURNS sphere_grid
  AS 'MODULE_PATHNAME' LANGUAGE C IMMUTABLE PARALLEL SAFE;
COMMENT ON FUNCTION density_lineation_accum(internal, lineation, float8) IS 'density_grid(lineation) transition';
COMMENT ON FUNCTION density_plane_accum(internal, plane, float8) IS 'density_grid(plane) transition (poles)';
COMMENT ON FUNCTION density_combine(internal, internal) IS 'density_grid combine';
COMMENT ON FUNCTION density_serialize(internal) IS 'density_grid state serialization';
COMMENT ON FUNCTION density_deserialize(bytea, internal) IS 'density_grid state deserialization (validated)';
COMMENT ON FUNCTION density_final(internal) IS 'density_grid final function';

CREATE AGGREGATE fisher_mean(lineation) (
  SFUNC = fisher_lineation_accum, STYPE = internal, SSPACE = 736, FINALFUNC = fisher_final,
  COMBINEFUNC = fisher_combine, SERIALFUNC = fisher_serialize, DESERIALFUNC = fisher_deserialize,
  PARALLEL = SAFE);
COMMENT ON AGGREGATE fisher_mean(lineation) IS
  'Fisher (1953) mean of lineations as axes (sign-free; right for clusters straddling the horizontal); exact when all data lie within 62.4 degrees of the mean axis (always so for a cluster; broad girdle-like groups are aligned with the nearest of 13 fixed axes instead); NULL for an empty group';
CREATE AGGREGATE fisher_mean(plane) (
  SFUNC = fisher_plane_accum, STYPE = internal, SSPACE = 736, FINALFUNC = fisher_final,
  COMBINEFUNC = fisher_combine, SERIALFUNC = fisher_serialize, DESERIALFUNC = fisher_deserialize,
  PARALLEL = SAFE);
COMMENT ON AGGREGATE fisher_mean(plane) IS 'Fisher (1953) mean of the poles of planes (axial; exact when all poles lie within 62.4 degrees of the mean axis); NULL for an empty group';

CREATE AGGREGATE orientation_tensor(lineation) (
  SFUNC = tensor_lineation_accum, STYPE = internal, SSPACE = 112, FINALFUNC = tensor_final,
  COMBINEFUNC = tensor_combine, SERIALFUNC = tensor_serialize, DESERIALFUNC = tensor_deserialize,
  PARALLEL = SAFE);
COMMENT ON AGGREGATE orientation_tensor(lineation) IS 'orientation tensor of lineations: eigen-axes, eigenvalues, fabric shape; NULL for an empty group';
CREATE AGGREGATE orientation_tensor(plane) (
  SFUNC = tensor_plane_accum, STYPE = internal, SSPACE = 112, FINALFUNC = tensor_final,
  COMBINEFUNC = tensor_combine, SERIALFUNC = tensor_serialize, DESERIALFUNC = tensor_deserialize,
  PARALLEL = SAFE);
COMMENT ON AGGREGATE orientation_tensor(plane) IS 'orientation tensor of the poles of planes; NULL for an empty group';

CREATE AGGREGATE mean_plane(plane) (
  SFUNC = tensor_plane_accum, STYPE = internal, SSPACE = 112, FINALFUNC = mean_plane_final,
  COMBINEFUNC = tensor_combine, SERIALFUNC = tensor_serialize, DESERIALFUNC = tensor_deserialize,
  PARALLEL = SAFE);
COMMENT ON AGGREGATE mean_plane(plane) IS
  'plane whose pole is e1 of the poles'' orientation tensor; NULL for an empty group or when e1 is not unique (s1 - s2 < 1e-12)';
CREATE AGGREGATE fold_axis(plane) (
  SFUNC = tensor_plane_accum, STYPE = internal, SSPACE = 112, FINALFUNC = fold_axis_final,
  COMBINEFUNC = tensor_combine, SERIALFUNC = tensor_serialize, DESERIALFUNC = tensor_deserialize,
  PARALLEL = SAFE);
COMMENT ON AGGREGATE fold_axis(plane) IS
  'cylindrical best-fit fold axis of folded planes: e3 of the poles; NULL for fewer than 2 planes or no unique girdle (s2 - s3 < 1e-12)';

CREATE AGGREGATE density_grid(lineation, spacing float8) (
  SFUNC = density_lineation_accum, STYPE = internal, FINALFUNC = density_final,
  COMBINEFUNC = density_combine, SERIALFUNC = density_serialize, DESERIALFUNC = density_deserialize,
  PARALLEL = SAFE);
COMMENT ON AGGREGATE density_grid(lineation, float8) IS
  'density of lineations on a lower-hemisphere grid of the given spacing (degrees, dividing 90, 0.5..45): Vollmer (1995) exponential weights, k = 3, in multiples of uniform density; data binned at 0.5 degree';
CREATE AGGREGATE density_grid(plane, spacing float8) (
  SFUNC = density_plane_accum, STYPE = internal, FINALFUNC = density_final,
  COMBINEFUNC = density_combine, SERIALFUNC = density_serialize, DESERIALFUNC = density_deserialize,
  PARALLEL = SAFE);
COMMENT ON AGGREGATE density_grid(plane, float8) IS
  'density of the poles of planes on a lower-hemisphere grid (see density_grid(lineation, float8))';
-- Paleostress: the stress_tensor type, its accessors, per-datum quantities under a
-- tensor, and the aggregates stress_inversion, right_dihedra, focal_stress_inversion.

CREATE TYPE stress_tensor;
CREATE FUNCTION stress_tensor_in(cstring) RETURNS stress_tensor
  AS 'MODULE_PATHNAME' LANGUAGE C IMMUTABLE STRICT PARALLEL SAFE;
CREATE FUNCTION stress_tensor_out(stress_tensor) RETURNS cstring
  AS 'MODULE_PATHNAME' LANGUAGE C IMMUTABLE STRICT PARALLEL SAFE;
CREATE FUNCTION stress_tensor_recv(internal) RETURNS stress_tensor
  AS 'MODULE_PATHNAME' LANGUAGE C IMMUTABLE STRICT PARALLEL SAFE;
CREATE FUNCTION stress_tensor_send(stress_tensor) RETURNS bytea
  AS 'MODULE_PATHNAME' LANGUAGE C IMMUTABLE STRICT PARALLEL SAFE;
CREATE TYPE stress_tensor (
  INPUT = stress_tensor_in, OUTPUT = stress_tensor_out,
  RECEIVE = stress_tensor_recv, SEND = stress_tensor_send,
  INTERNALLENGTH = 120, ALIGNMENT = double, STORAGE = plain
);
COMMENT ON TYPE stress_tensor IS
  'reduced stress tensor (compression positive, NED, trace 0, unit norm) with its data count and optional quality measures; text form {"components": [nn, ee, dd, ne, nd, ed], "n": count, "misfit": .., "cones": [..], "phi_interval": [..], "friction": .., "flags": [..]}';
COMMENT ON FUNCTION stress_tensor_in(cstring) IS 'text input of stress_tensor (validated: trace 0 and unit norm within 1e-9, ranges of the quality measures)';
COMMENT ON FUNCTION stress_tensor_out(stress_tensor) IS 'text output of stress_tensor (float8 conventions; undefined measures omitted)';
COMMENT ON FUNCTION stress_tensor_recv(internal) IS 'binary input of stress_tensor (version byte checked, value validated)';
COMMENT ON FUNCTION stress_tensor_send(stress_tensor) IS 'binary output of stress_tensor (version byte, 12 float8, int8 count, int4 flags)';

CREATE FUNCTION stress_tensor(sigma1 lineation, sigma3 lineation, shape_ratio float8) RETURNS stress_tensor
  AS 'MODULE_PATHNAME', 'stress_tensor_from_axes' LANGUAGE C IMMUTABLE STRICT PARALLEL SAFE;
COMMENT ON FUNCTION stress_tensor(lineation, lineation, float8) IS
  'reduced stress tensor with sigma1 and sigma3 along the given axes (sigma3 orthogonalised against sigma1) and shape ratio Phi = (s2-s3)/(s1-s3) in 0..1 (Angelier 1979); data count 0';

CREATE FUNCTION sigma1(stress_tensor) RETURNS lineation
  AS 'MODULE_PATHNAME' LANGUAGE C IMMUTABLE STRICT PARALLEL SAFE;
COMMENT ON FUNCTION sigma1(stress_tensor) IS 'axis of the maximum (most compressive) principal stress, lower hemisphere';
CREATE FUNCTION sigma2(stress_tensor) RETURNS lineation
  AS 'MODULE_PATHNAME' LANGUAGE C IMMUTABLE STRICT PARALLEL SAFE;
COMMENT ON FUNCTION sigma2(stress_tensor) IS 'axis of the intermediate principal stress, lower hemisphere';
CREATE FUNCTION sigma3(stress_tensor) RETURNS lineation
  AS 'MODULE_PATHNAME' LANGUAGE C IMMUTABLE STRICT PARALLEL SAFE;
COMMENT ON FUNCTION sigma3(stress_tensor) IS 'axis of the minimum (least compressive) principal stress, lower hemisphere';
CREATE FUNCTION shape_ratio(stress_tensor) RETURNS float8
  AS 'MODULE_PATHNAME', 'stress_shape_ratio' LANGUAGE C IMMUTABLE STRICT PARALLEL SAFE;
COMMENT ON FUNCTION shape_ratio(stress_tensor) IS 'shape ratio Phi = (s2-s3)/(s1-s3), 0..1 (Angelier 1979); R = 1 - Phi';
CREATE FUNCTION shmax_azimuth(stress_tensor) RETURNS float8
  AS 'MODULE_PATHNAME', 'stress_shmax_azimuth' LANGUAGE C IMMUTABLE STRICT PARALLEL SAFE;
COMMENT ON FUNCTION shmax_azimuth(stress_tensor) IS
  'azimuth of maximum horizontal compression, degrees 0..180 (Lund & Townend 2007, eqs 10-11); NULL when horizontal stress is isotropic';
CREATE FUNCTION stress_regime(stress_tensor) RETURNS text
  AS 'MODULE_PATHNAME', 'stress_tensor_regime' LANGUAGE C IMMUTABLE STRICT PARALLEL SAFE;
COMMENT ON FUNCTION stress_regime(stress_tensor) IS
  'stress regime from the plunges of the principal axes after the plunge classes of Zoback (1992; limits recalled from memory): extension, transtension, strike-slip, transpression, compression or undetermined';
CREATE FUNCTION regime_index(stress_tensor) RETURNS float8
  AS 'MODULE_PATHNAME', 'stress_regime_index' LANGUAGE C IMMUTABLE STRICT PARALLEL SAFE;
COMMENT ON FUNCTION regime_index(stress_tensor) IS
  'regime index A-phi of Simpson (1997), 0..3: 0..1 extensional, 1..2 strike-slip, 2..3 compressional';
CREATE FUNCTION data_count(stress_tensor) RETURNS bigint
  AS 'MODULE_PATHNAME', 'stress_data_count' LANGUAGE C IMMUTABLE STRICT PARALLEL SAFE;
COMMENT ON FUNCTION data_count(stress_tensor) IS 'number of data behind the tensor (0 for a tensor built from axes)';
CREATE FUNCTION friction(stress_tensor) RETURNS float8
  AS 'MODULE_PATHNAME', 'stress_friction' LANGUAGE C IMMUTABLE STRICT PARALLEL SAFE;
COMMENT ON FUNCTION friction(stress_tensor) IS
  'friction coefficient the joint focal inversion used (the given one, or the one its search chose); NULL for other tensors';

CREATE FUNCTION mean_misfit(stress_tensor) RETURNS float8
  AS 'MODULE_PATHNAME', 'stress_mean_misfit' LANGUAGE C IMMUTABLE STRICT PARALLEL SAFE;
COMMENT ON FUNCTION mean_misfit(stress_tensor) IS
  'exact mean misfit angle of the data, degrees; NULL unless the tensor came from an aggregate that keeps its data';
CREATE FUNCTION sigma1_confidence(stress_tensor) RETURNS float8
  AS 'MODULE_PATHNAME' LANGUAGE C IMMUTABLE STRICT PARALLEL SAFE;
COMMENT ON FUNCTION sigma1_confidence(stress_tensor) IS 'bootstrap confidence half-angle of sigma1, degrees (Michael 1987); NULL without bootstrap';
CREATE FUNCTION sigma2_confidence(stress_tensor) RETURNS float8
  AS 'MODULE_PATHNAME' LANGUAGE C IMMUTABLE STRICT PARALLEL SAFE;
COMMENT ON FUNCTION sigma2_confidence(stress_tensor) IS 'bootstrap confidence half-angle of sigma2, degrees (Michael 1987); NULL without bootstrap';
CREATE FUNCTION sigma3_confidence(stress_tensor) RETURNS float8
  AS 'MODULE_PATHNAME' LANGUAGE C IMMUTABLE STRICT PARALLEL SAFE;
COMMENT ON FUNCTION sigma3_confidence(stress_tensor) IS 'bootstrap confidence half-angle of sigma3, degrees (Michael 1987); NULL without bootstrap';
CREATE FUNCTION shape_ratio_interval(stress_tensor) RETURNS float8[]
  AS 'MODULE_PATHNAME' LANGUAGE C IMMUTABLE STRICT PARALLEL SAFE;
COMMENT ON FUNCTION shape_ratio_interval(stress_tensor) IS 'bootstrap interval {low, high} of the shape ratio Phi (Michael 1987); NULL without bootstrap';
CREATE FUNCTION stress_components(stress_tensor) RETURNS float8[]
  AS 'MODULE_PATHNAME' LANGUAGE C IMMUTABLE STRICT PARALLEL SAFE;
COMMENT ON FUNCTION stress_components(stress_tensor) IS 'tensor components {nn, ee, dd, ne, nd, ed}, compression positive, North-East-Down';

CREATE FUNCTION misfit(fault_slip, stress_tensor) RETURNS float8
  AS 'MODULE_PATHNAME', 'stress_misfit' LANGUAGE C IMMUTABLE STRICT PARALLEL SAFE;
COMMENT ON FUNCTION misfit(fault_slip, stress_tensor) IS
  'angle between observed slip and the resolved shear traction (Wallace 1951, Bott 1959), degrees 0..180; NULL when the plane is normal to a principal axis';
CREATE FUNCTION resolved_slip(plane, stress_tensor) RETURNS fault_slip
  AS 'MODULE_PATHNAME', 'stress_resolved_slip' LANGUAGE C IMMUTABLE STRICT PARALLEL SAFE;
COMMENT ON FUNCTION resolved_slip(plane, stress_tensor) IS
  'slip on the plane predicted by the Wallace-Bott hypothesis (direction of resolved shear traction); NULL when the plane is normal to a principal axis';
CREATE FUNCTION slip_tendency(plane, stress_tensor, friction float8 DEFAULT 0.6) RETURNS float8
  AS 'MODULE_PATHNAME', 'stress_slip_tendency' LANGUAGE C IMMUTABLE STRICT PARALLEL SAFE;
COMMENT ON FUNCTION slip_tendency(plane, stress_tensor, float8) IS
  'normalised slip tendency Ts/Ts_max, 0..1 (Morris et al. 1996), with magnitudes assumed so the optimal plane is at the frictional limit (friction 0.001..5): a relative measure, not a prediction of slip. Results are interpretive; where fault reactivation or induced seismicity matters, defer to site investigation, local codes and licensed professionals';
CREATE FUNCTION dilation_tendency(plane, stress_tensor) RETURNS float8
  AS 'MODULE_PATHNAME', 'stress_dilation_tendency' LANGUAGE C IMMUTABLE STRICT PARALLEL SAFE;
COMMENT ON FUNCTION dilation_tendency(plane, stress_tensor) IS
  'dilation tendency (s1 - sn)/(s1 - s3), 0..1 (Ferrill et al. 1999). Results are interpretive; where fault reactivation or induced seismicity matters, defer to site investigation, local codes and licensed professionals';

-- aggregate support functions (internal states; each validates what it is handed)
CREATE FUNCTION stress_inversion_accum(internal, fault_slip) RETURNS internal
  AS 'MODULE_PATHNAME' LANGUAGE C IMMUTABLE PARALLEL SAFE;
CREATE FUNCTION stress_inversion_combine(internal, internal) RETURNS internal
  AS 'MODULE_PATHNAME' LANGUAGE C IMMUTABLE PARALLEL SAFE;
CREATE FUNCTION stress_inversion_serialize(internal) RETURNS bytea
  AS 'MODULE_PATHNAME' LANGUAGE C IMMUTABLE STRICT PARALLEL SAFE;
CREATE FUNCTION stress_inversion_deserialize(bytea, internal) RETURNS internal
  AS 'MODULE_PATHNAME' LANGUAGE C IMMUTABLE STRICT PARALLEL SAFE;
CREATE FUNCTION stress_inversion_final(internal) RETURNS stress_tensor
  AS 'MODULE_PATHNAME' LANGUAGE C IMMUTABLE PARALLEL SAFE;
COMMENT ON FUNCTION stress_inversion_accum(internal, fault_slip) IS 'stress_inversion(fault_slip) transition';
COMMENT ON FUNCTION stress_inversion_combine(internal, internal) IS 'stress_inversion(fault_slip) combine';
COMMENT ON FUNCTION stress_inversion_serialize(internal) IS 'stress_inversion(fault_slip) state serialization';
COMMENT ON FUNCTION stress_inversion_deserialize(bytea, internal) IS 'stress_inversion(fault_slip) state deserialization (validated)';
COMMENT ON FUNCTION stress_inversion_final(internal) IS 'stress_inversion(fault_slip) final function';

CREATE AGGREGATE stress_inversion(fault_slip) (
  SFUNC = stress_inversion_accum, STYPE = internal, SSPACE = 176, FINALFUNC = stress_inversion_final,
  COMBINEFUNC = stress_inversion_combine, SERIALFUNC = stress_inversion_serialize,
  DESERIALFUNC = stress_inversion_deserialize, PARALLEL = SAFE);
COMMENT ON AGGREGATE stress_inversion(fault_slip) IS
  'reduced stress tensor from fault-slip data by the linear inversion of Michael (1984), streaming in constant memory; NULL for an empty group, fewer than 4 data, or a degenerate set (parallel faults, one zone, slips cancelling out); mean misfit not computed (use misfit() per row). Results are interpretive; where fault reactivation or induced seismicity matters, defer to site investigation, local codes and licensed professionals';

CREATE FUNCTION right_dihedra_accum(internal, fault_slip, float8) RETURNS internal
  AS 'MODULE_PATHNAME' LANGUAGE C IMMUTABLE PARALLEL SAFE;
CREATE FUNCTION right_dihedra_combine(internal, internal) RETURNS internal
  AS 'MODULE_PATHNAME' LANGUAGE C IMMUTABLE PARALLEL SAFE;
CREATE FUNCTION right_dihedra_serialize(internal) RETURNS bytea
  AS 'MODULE_PATHNAME' LANGUAGE C IMMUTABLE STRICT PARALLEL SAFE;
CREATE FUNCTION right_dihedra_deserialize(bytea, internal) RETURNS internal
  AS 'MODULE_PATHNAME' LANGUAGE C IMMUTABLE STRICT PARALLEL SAFE;
CREATE FUNCTION right_dihedra_final(internal) RETURNS sphere_grid
  AS 'MODULE_PATHNAME' LANGUAGE C IMMUTABLE PARALLEL SAFE;
COMMENT ON FUNCTION right_dihedra_accum(internal, fault_slip, float8) IS 'right_dihedra transition';
COMMENT ON FUNCTION right_dihedra_combine(internal, internal) IS 'right_dihedra combine';
COMMENT ON FUNCTION right_dihedra_serialize(internal) IS 'right_dihedra state serialization';
COMMENT ON FUNCTION right_dihedra_deserialize(bytea, internal) IS 'right_dihedra state deserialization (validated)';
COMMENT ON FUNCTION right_dihedra_final(internal) IS 'right_dihedra final function';

CREATE AGGREGATE right_dihedra(fault_slip, spacing float8) (
  SFUNC = right_dihedra_accum, STYPE = internal, FINALFUNC = right_dihedra_final,
  COMBINEFUNC = right_dihedra_combine, SERIALFUNC = right_dihedra_serialize,
  DESERIALFUNC = right_dihedra_deserialize, PARALLEL = SAFE);
COMMENT ON AGGREGATE right_dihedra(fault_slip, float8) IS
  'right dihedra (Angelier & Mechler 1977): percent of data for which each node of a lower-hemisphere grid of the given spacing (degrees, dividing 90, 0.5..45) is in the compressional dihedron; sigma1 near the maximum, sigma3 near the minimum; NULL for an empty group';

-- aggregates that keep the group's data (at most 1,000,000 data, 48 bytes each)
CREATE FUNCTION stress_bootstrap_accum(internal, fault_slip, integer, bigint) RETURNS internal
  AS 'MODULE_PATHNAME' LANGUAGE C IMMUTABLE PARALLEL SAFE;
CREATE FUNCTION focal_stress_inversion_accum(internal, fault_slip) RETURNS internal
  AS 'MODULE_PATHNAME' LANGUAGE C IMMUTABLE PARALLEL SAFE;
CREATE FUNCTION focal_stress_inversion_friction_accum(internal, fault_slip, float8) RETURNS internal
  AS 'MODULE_PATHNAME' LANGUAGE C IMMUTABLE PARALLEL SAFE;
CREATE FUNCTION focal_bootstrap_accum(internal, fault_slip, float8, integer, bigint) RETURNS internal
  AS 'MODULE_PATHNAME' LANGUAGE C IMMUTABLE PARALLEL SAFE;
COMMENT ON FUNCTION focal_bootstrap_accum(internal, fault_slip, float8, integer, bigint) IS 'focal_stress_inversion(fault_slip, float8, integer, bigint) transition';
CREATE FUNCTION stress_keep_combine(internal, internal) RETURNS internal
  AS 'MODULE_PATHNAME' LANGUAGE C IMMUTABLE PARALLEL SAFE;
CREATE FUNCTION stress_keep_serialize(internal) RETURNS bytea
  AS 'MODULE_PATHNAME' LANGUAGE C IMMUTABLE STRICT PARALLEL SAFE;
CREATE FUNCTION stress_keep_deserialize(bytea, internal) RETURNS internal
  AS 'MODULE_PATHNAME' LANGUAGE C IMMUTABLE STRICT PARALLEL SAFE;
CREATE FUNCTION stress_bootstrap_final(internal) RETURNS stress_tensor
  AS 'MODULE_PATHNAME' LANGUAGE C IMMUTABLE PARALLEL SAFE;
CREATE FUNCTION focal_stress_inversion_final(internal) RETURNS stress_tensor
  AS 'MODULE_PATHNAME' LANGUAGE C IMMUTABLE PARALLEL SAFE;
COMMENT ON FUNCTION stress_bootstrap_accum(internal, fault_slip, integer, bigint) IS 'stress_inversion(fault_slip, integer, bigint) transition';
COMMENT ON FUNCTION focal_stress_inversion_accum(internal, fault_slip) IS 'focal_stress_inversion(fault_slip) transition';
COMMENT ON FUNCTION focal_stress_inversion_friction_accum(internal, fault_slip, float8) IS 'focal_stress_inversion(fault_slip, float8) transition';
COMMENT ON FUNCTION stress_keep_combine(internal, internal) IS 'combine of the data-keeping stress inversions (concatenates)';
COMMENT ON FUNCTION stress_keep_serialize(internal) IS 'data-keeping stress inversion state serialization';
COMMENT ON FUNCTION stress_keep_deserialize(bytea, internal) IS 'data-keeping stress inversion state deserialization (validated)';
COMMENT ON FUNCTION stress_bootstrap_final(internal) IS 'stress_inversion(fault_slip, integer, bigint) final function';
COMMENT ON FUNCTION focal_stress_inversion_final(internal) IS 'focal_stress_inversion final function';

CREATE AGGREGATE stress_inversion(fault_slip, resamples integer, seed bigint) (
  SFUNC = stress_bootstrap_accum, STYPE = internal, FINALFUNC = stress_bootstrap_final,
  FINALFUNC_MODIFY = READ_WRITE,
  COMBINEFUNC = stress_keep_combine, SERIALFUNC = stress_keep_serialize,
  DESERIALFUNC = stress_keep_deserialize, PARALLEL = SAFE);
COMMENT ON AGGREGATE stress_inversion(fault_slip, integer, bigint) IS
  'linear stress inversion (Michael 1984) with exact mean misfit and bootstrap confidence (Michael 1987: resamples 1..100000, 95 % closest kept) on the axes and the shape ratio; deterministic for a given seed (data are sorted first); keeps the group''s data (at most 1,000,000); NULL for an empty group, fewer than 4 data or a degenerate set. Results are interpretive; where fault reactivation or induced seismicity matters, defer to site investigation, local codes and licensed professionals';

CREATE AGGREGATE focal_stress_inversion(fault_slip) (
  SFUNC = focal_stress_inversion_accum, STYPE = internal, FINALFUNC = focal_stress_inversion_final,
  FINALFUNC_MODIFY = READ_WRITE,
  COMBINEFUNC = stress_keep_combine, SERIALFUNC = stress_keep_serialize,
  DESERIALFUNC = stress_keep_deserialize, PARALLEL = SAFE);
COMMENT ON AGGREGATE focal_stress_inversion(fault_slip) IS
  'joint stress inversion of focal mechanisms (Vavrycuk 2014): picks the more unstable nodal plane of each mechanism iteratively, friction searched over 0.2..1.0 in steps of 0.1 (the chosen value is friction(result)); exact mean misfit of the picked planes; keeps the group''s data (at most 1,000,000); NULL for an empty group, fewer than 4 mechanisms or a degenerate set. Results are interpretive; where fault reactivation or induced seismicity matters, defer to site investigation, local codes and licensed professionals';
CREATE AGGREGATE focal_stress_inversion(fault_slip, friction float8) (
  SFUNC = focal_stress_inversion_friction_accum, STYPE = internal, FINALFUNC = focal_stress_inversion_final,
  FINALFUNC_MODIFY = READ_WRITE,
  COMBINEFUNC = stress_keep_combine, SERIALFUNC = stress_keep_serialize,
  DESERIALFUNC = stress_keep_deserialize, PARALLEL = SAFE);
COMMENT ON AGGREGATE focal_stress_inversion(fault_slip, float8) IS
  'joint stress inversion of focal mechanisms (Vavrycuk 2014) at a fixed friction (0.001..5); see focal_stress_inversion(fault_slip). Results are interpretive; where fault reactivation or induced seismicity matters, defer to site investigation, local codes and licensed professionals';
CREATE AGGREGATE focal_stress_inversion(fault_slip, friction float8, resamples integer, seed bigint) (
  SFUNC = focal_bootstrap_accum, STYPE = internal, FINALFUNC = focal_stress_inversion_final,
  FINALFUNC_MODIFY = READ_WRITE,
  COMBINEFUNC = stress_keep_combine, SERIALFUNC = stress_keep_serialize,
  DESERIALFUNC = stress_keep_deserialize, PARALLEL = SAFE);
COMMENT ON AGGREGATE focal_stress_inversion(fault_slip, float8, integer, bigint) IS
  'joint stress inversion of focal mechanisms (Vavrycuk 2014) with bootstrap confidence (Michael 1987): friction fixed, or searched over 0.2..1.0 when NULL; each resample reruns the plane picking at the chosen friction; 95 % cones on the axes and a shape-ratio interval; deterministic for a given seed; keeps the group''s data (at most 1,000,000). Results are interpretive; where fault reactivation or induced seismicity matters, defer to site investigation, local codes and licensed professionals';
