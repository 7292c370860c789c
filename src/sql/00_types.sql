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
