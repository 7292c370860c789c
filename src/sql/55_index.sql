-- Orientation searches (new in 0.2.0): the cone type ("within d degrees of an
-- axis"), its containment operators, and GiST operator classes on lineation
-- and plane serving x <@ cone(v, d) and ORDER BY x <-> v (nearest first),
-- exact under the axial metric.

CREATE TYPE cone;
CREATE FUNCTION cone_in(cstring) RETURNS cone
  AS 'MODULE_PATHNAME' LANGUAGE C IMMUTABLE STRICT PARALLEL SAFE;
CREATE FUNCTION cone_out(cone) RETURNS cstring
  AS 'MODULE_PATHNAME' LANGUAGE C IMMUTABLE STRICT PARALLEL SAFE;
CREATE FUNCTION cone_recv(internal) RETURNS cone
  AS 'MODULE_PATHNAME' LANGUAGE C IMMUTABLE STRICT PARALLEL SAFE;
CREATE FUNCTION cone_send(cone) RETURNS bytea
  AS 'MODULE_PATHNAME' LANGUAGE C IMMUTABLE STRICT PARALLEL SAFE;
CREATE TYPE cone (
  INPUT = cone_in, OUTPUT = cone_out, RECEIVE = cone_recv, SEND = cone_send,
  INTERNALLENGTH = 56, ALIGNMENT = double, STORAGE = plain
);
COMMENT ON TYPE cone IS
  'the axes within a half-angle of an axis: ''line 120/30 within 10'' (lineations) or ''plane 110/64 within 10'' (planes whose poles are within 10 degrees of its pole); also the key of the GiST operator classes';
COMMENT ON FUNCTION cone_in(cstring) IS 'text input of cone';
COMMENT ON FUNCTION cone_out(cone) IS 'text output of cone (float8 conventions)';
COMMENT ON FUNCTION cone_recv(internal) IS 'binary input of cone (validated)';
COMMENT ON FUNCTION cone_send(cone) IS 'binary output of cone';

CREATE FUNCTION cone(axis lineation, half_angle float8) RETURNS cone
  AS 'MODULE_PATHNAME', 'cone_from_lineation' LANGUAGE C IMMUTABLE STRICT PARALLEL SAFE;
COMMENT ON FUNCTION cone(lineation, float8) IS
  'the lineations within half_angle degrees (0..90, axial angle) of the axis; l <@ cone(v, d) is l <-> v <= d';
CREATE FUNCTION cone(axis plane, half_angle float8) RETURNS cone
  AS 'MODULE_PATHNAME', 'cone_from_plane' LANGUAGE C IMMUTABLE STRICT PARALLEL SAFE;
COMMENT ON FUNCTION cone(plane, float8) IS
  'the planes within half_angle degrees (0..90) of the plane (angle between poles); p <@ cone(q, d) is p <-> q <= d';
CREATE FUNCTION half_angle(cone) RETURNS float8
  AS 'MODULE_PATHNAME', 'cone_half_angle' LANGUAGE C IMMUTABLE STRICT PARALLEL SAFE;
COMMENT ON FUNCTION half_angle(cone) IS 'half-angle of a cone, degrees';

CREATE FUNCTION lineation_in_cone(lineation, cone) RETURNS boolean
  AS 'MODULE_PATHNAME' LANGUAGE C IMMUTABLE STRICT PARALLEL SAFE;
COMMENT ON FUNCTION lineation_in_cone(lineation, cone) IS
  'is the lineation within the cone (l <-> axis <= half-angle)? support for operator <@';
CREATE OPERATOR <@ (LEFTARG = lineation, RIGHTARG = cone, PROCEDURE = lineation_in_cone,
  RESTRICT = contsel, JOIN = contjoinsel);
COMMENT ON OPERATOR <@(lineation, cone) IS 'lineation within the cone (indexable by GiST)';
CREATE FUNCTION plane_in_cone(plane, cone) RETURNS boolean
  AS 'MODULE_PATHNAME' LANGUAGE C IMMUTABLE STRICT PARALLEL SAFE;
COMMENT ON FUNCTION plane_in_cone(plane, cone) IS
  'is the plane within the cone (p <-> plane of the cone <= half-angle)? support for operator <@';
CREATE OPERATOR <@ (LEFTARG = plane, RIGHTARG = cone, PROCEDURE = plane_in_cone,
  RESTRICT = contsel, JOIN = contjoinsel);
COMMENT ON OPERATOR <@(plane, cone) IS 'plane within the cone (indexable by GiST)';

-- GiST support: lineation_gist_* and plane_gist_* know the indexed type,
-- cone_gist_* work on keys (cones enclosing the axes below them).
CREATE FUNCTION lineation_gist_compress(internal) RETURNS internal
  AS 'MODULE_PATHNAME' LANGUAGE C IMMUTABLE STRICT PARALLEL SAFE;
CREATE FUNCTION lineation_gist_consistent(internal, cone, smallint, oid, internal) RETURNS boolean
  AS 'MODULE_PATHNAME' LANGUAGE C IMMUTABLE STRICT PARALLEL SAFE;
CREATE FUNCTION lineation_gist_distance(internal, lineation, smallint, oid, internal) RETURNS float8
  AS 'MODULE_PATHNAME' LANGUAGE C IMMUTABLE STRICT PARALLEL SAFE;
CREATE FUNCTION plane_gist_compress(internal) RETURNS internal
  AS 'MODULE_PATHNAME' LANGUAGE C IMMUTABLE STRICT PARALLEL SAFE;
CREATE FUNCTION plane_gist_consistent(internal, cone, smallint, oid, internal) RETURNS boolean
  AS 'MODULE_PATHNAME' LANGUAGE C IMMUTABLE STRICT PARALLEL SAFE;
CREATE FUNCTION plane_gist_distance(internal, plane, smallint, oid, internal) RETURNS float8
  AS 'MODULE_PATHNAME' LANGUAGE C IMMUTABLE STRICT PARALLEL SAFE;
CREATE FUNCTION cone_gist_union(internal, internal) RETURNS cone
  AS 'MODULE_PATHNAME' LANGUAGE C IMMUTABLE STRICT PARALLEL SAFE;
CREATE FUNCTION cone_gist_penalty(internal, internal, internal) RETURNS internal
  AS 'MODULE_PATHNAME' LANGUAGE C IMMUTABLE STRICT PARALLEL SAFE;
CREATE FUNCTION cone_gist_picksplit(internal, internal) RETURNS internal
  AS 'MODULE_PATHNAME' LANGUAGE C IMMUTABLE STRICT PARALLEL SAFE;
CREATE FUNCTION cone_gist_same(cone, cone, internal) RETURNS internal
  AS 'MODULE_PATHNAME' LANGUAGE C IMMUTABLE STRICT PARALLEL SAFE;
CREATE FUNCTION cone_gist_sortsupport(internal) RETURNS void
  AS 'MODULE_PATHNAME' LANGUAGE C IMMUTABLE STRICT PARALLEL SAFE;
COMMENT ON FUNCTION lineation_gist_compress(internal) IS 'GiST support: leaf key of a lineation';
COMMENT ON FUNCTION lineation_gist_consistent(internal, cone, smallint, oid, internal) IS 'GiST support: <@ cone, exact at leaves';
COMMENT ON FUNCTION lineation_gist_distance(internal, lineation, smallint, oid, internal) IS 'GiST support: <-> lower bound, exact at leaves';
COMMENT ON FUNCTION plane_gist_compress(internal) IS 'GiST support: leaf key of a plane (its pole)';
COMMENT ON FUNCTION plane_gist_consistent(internal, cone, smallint, oid, internal) IS 'GiST support: <@ cone, exact at leaves';
COMMENT ON FUNCTION plane_gist_distance(internal, plane, smallint, oid, internal) IS 'GiST support: <-> lower bound, exact at leaves';
COMMENT ON FUNCTION cone_gist_union(internal, internal) IS 'GiST support: cone enclosing the keys';
COMMENT ON FUNCTION cone_gist_penalty(internal, internal, internal) IS 'GiST support: growth of the half-angle';
COMMENT ON FUNCTION cone_gist_picksplit(internal, internal) IS 'GiST support: page split by two-means on the axes';
COMMENT ON FUNCTION cone_gist_same(cone, cone, internal) IS 'GiST support: identical keys';
COMMENT ON FUNCTION cone_gist_sortsupport(internal) IS 'GiST support: sorted build along a Hilbert curve of the axes';

CREATE OPERATOR CLASS lineation_gist_ops DEFAULT FOR TYPE lineation USING gist AS
  OPERATOR 8 <@ (lineation, cone),
  OPERATOR 15 <-> (lineation, lineation) FOR ORDER BY float_ops,
  FUNCTION 1 lineation_gist_consistent(internal, cone, smallint, oid, internal),
  FUNCTION 2 cone_gist_union(internal, internal),
  FUNCTION 3 lineation_gist_compress(internal),
  FUNCTION 5 cone_gist_penalty(internal, internal, internal),
  FUNCTION 6 cone_gist_picksplit(internal, internal),
  FUNCTION 7 cone_gist_same(cone, cone, internal),
  FUNCTION 8 lineation_gist_distance(internal, lineation, smallint, oid, internal),
  FUNCTION 11 cone_gist_sortsupport(internal),
  STORAGE cone;
CREATE OPERATOR CLASS plane_gist_ops DEFAULT FOR TYPE plane USING gist AS
  OPERATOR 8 <@ (plane, cone),
  OPERATOR 15 <-> (plane, plane) FOR ORDER BY float_ops,
  FUNCTION 1 plane_gist_consistent(internal, cone, smallint, oid, internal),
  FUNCTION 2 cone_gist_union(internal, internal),
  FUNCTION 3 plane_gist_compress(internal),
  FUNCTION 5 cone_gist_penalty(internal, internal, internal),
  FUNCTION 6 cone_gist_picksplit(internal, internal),
  FUNCTION 7 cone_gist_same(cone, cone, internal),
  FUNCTION 8 plane_gist_distance(internal, plane, smallint, oid, internal),
  FUNCTION 11 cone_gist_sortsupport(internal),
  STORAGE cone;
