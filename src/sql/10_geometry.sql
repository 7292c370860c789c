-- Constructors, accessors and per-datum geometry of plane, lineation, fault_slip.

CREATE FUNCTION plane(strike float8, dip float8) RETURNS plane
  AS 'MODULE_PATHNAME', 'plane_make' LANGUAGE C IMMUTABLE STRICT PARALLEL SAFE;
COMMENT ON FUNCTION plane(float8, float8) IS
  'plane from right-hand-rule strike (any finite value, wrapped to 0..360) and dip (0..90), degrees';

CREATE FUNCTION plane_from_dip_direction(dip_direction float8, dip float8) RETURNS plane
  AS 'MODULE_PATHNAME' LANGUAGE C IMMUTABLE STRICT PARALLEL SAFE;
COMMENT ON FUNCTION plane_from_dip_direction(float8, float8) IS
  'plane from dip direction (any finite value, wrapped to 0..360) and dip (0..90), degrees; strike = dip direction - 90';

CREATE FUNCTION lineation(trend float8, plunge float8) RETURNS lineation
  AS 'MODULE_PATHNAME', 'lineation_make' LANGUAGE C IMMUTABLE STRICT PARALLEL SAFE;
COMMENT ON FUNCTION lineation(float8, float8) IS
  'line from trend (any finite value, wrapped to 0..360) and plunge (-90..90; negative = upward, flipped to the lower hemisphere), degrees';

CREATE FUNCTION fault_slip(strike float8, dip float8, rake float8) RETURNS fault_slip
  AS 'MODULE_PATHNAME', 'fault_slip_make' LANGUAGE C IMMUTABLE STRICT PARALLEL SAFE;
COMMENT ON FUNCTION fault_slip(float8, float8, float8) IS
  'fault slip from right-hand-rule strike (any finite value, wrapped to 0..360), dip (0..90) and Aki & Richards rake (any finite value, wrapped to -180..180, positive = reverse), degrees';

CREATE FUNCTION fault_slip(fault plane, rake float8) RETURNS fault_slip
  AS 'MODULE_PATHNAME', 'fault_slip_from_plane' LANGUAGE C IMMUTABLE STRICT PARALLEL SAFE;
COMMENT ON FUNCTION fault_slip(plane, float8) IS
  'fault slip from a plane and an Aki & Richards rake (degrees, measured from the right-hand-rule strike; any finite value, wrapped to -180..180)';

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
  'sense of slip from the rake: normal, reverse, dextral, sinistral within 22.5 degrees of pure, else two senses, dominant first (e.g. normal-dextral); reverse, not thrust: the sense of one fault of any dip (mechanism_class and stress_regime name their class thrust, as their schemes do)';
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
