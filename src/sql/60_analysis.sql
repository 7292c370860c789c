-- Analysis (0.2.0, issue 12): rotations and back-tilting, separation of stress
-- phases, summed moment tensors, misfit summaries.

-- ---- rotations (rules: src/core/rotation.hpp) ------------------------------------

CREATE FUNCTION rotate(plane, axis lineation, angle float8) RETURNS plane
  AS 'MODULE_PATHNAME', 'plane_rotate' LANGUAGE C IMMUTABLE STRICT PARALLEL SAFE;
COMMENT ON FUNCTION rotate(plane, lineation, float8) IS
  'plane rotated by angle degrees about the axis, right-hand rule: the axis points down along its trend and plunge (a horizontal axis toward its stored trend, 0..180), and a positive angle turns clockwise as seen looking along it (from above for a downward axis); Rodrigues'' formula';
CREATE FUNCTION rotate(plane, axis_trend float8, axis_plunge float8, angle float8) RETURNS plane
  AS 'MODULE_PATHNAME', 'plane_rotate_direction' LANGUAGE C IMMUTABLE STRICT PARALLEL SAFE;
COMMENT ON FUNCTION rotate(plane, float8, float8, float8) IS
  'plane rotated by angle degrees about the directed axis (trend, plunge), plunge -90..90 with negative pointing up, taken as given (no lower-hemisphere flip); right-hand rule: positive is clockwise seen looking along the axis';
CREATE FUNCTION rotate_vertical(plane, angle float8) RETURNS plane
  AS 'MODULE_PATHNAME', 'plane_rotate_vertical' LANGUAGE C IMMUTABLE STRICT PARALLEL SAFE;
COMMENT ON FUNCTION rotate_vertical(plane, float8) IS
  'plane turned about the vertical by angle degrees, clockwise seen from above (adds angle to the azimuth; a declination correction adds the east declination); exact in degrees';
CREATE FUNCTION untilt(plane, bedding plane, overturned boolean DEFAULT false) RETURNS plane
  AS 'MODULE_PATHNAME', 'plane_untilt' LANGUAGE C IMMUTABLE STRICT PARALLEL SAFE;
COMMENT ON FUNCTION untilt(plane, plane, boolean) IS
  'plane back-tilted with the bedding: rotated about the bedding strike by minus its dip so the bed is horizontal (by 180 - dip for an overturned bed)';
CREATE FUNCTION unfold(plane, limb plane, fold_axis lineation, tolerance float8 DEFAULT 10) RETURNS plane
  AS 'MODULE_PATHNAME', 'plane_unfold' LANGUAGE C IMMUTABLE STRICT PARALLEL SAFE;
COMMENT ON FUNCTION unfold(plane, plane, lineation, float8) IS
  'plane restored with a limb of a plunging fold in two steps after Ramsay (1967, from memory): the fold axis is rotated to horizontal about the horizontal line normal to its trend, then the limb is untilted; error 22000 if the fold axis lies more than tolerance degrees (0..90) off the limb';

CREATE FUNCTION rotate(lineation, axis lineation, angle float8) RETURNS lineation
  AS 'MODULE_PATHNAME', 'lineation_rotate' LANGUAGE C IMMUTABLE STRICT PARALLEL SAFE;
COMMENT ON FUNCTION rotate(lineation, lineation, float8) IS
  'lineation rotated by angle degrees about the axis, right-hand rule: the axis points down along its trend and plunge (a horizontal axis toward its stored trend, 0..180), and a positive angle turns clockwise as seen looking along it (from above for a downward axis); Rodrigues'' formula';
CREATE FUNCTION rotate(lineation, axis_trend float8, axis_plunge float8, angle float8) RETURNS lineation
  AS 'MODULE_PATHNAME', 'lineation_rotate_direction' LANGUAGE C IMMUTABLE STRICT PARALLEL SAFE;
COMMENT ON FUNCTION rotate(lineation, float8, float8, float8) IS
  'lineation rotated by angle degrees about the directed axis (trend, plunge), plunge -90..90 with negative pointing up, taken as given (no lower-hemisphere flip); right-hand rule: positive is clockwise seen looking along the axis';
CREATE FUNCTION rotate_vertical(lineation, angle float8) RETURNS lineation
  AS 'MODULE_PATHNAME', 'lineation_rotate_vertical' LANGUAGE C IMMUTABLE STRICT PARALLEL SAFE;
COMMENT ON FUNCTION rotate_vertical(lineation, float8) IS
  'lineation turned about the vertical by angle degrees, clockwise seen from above (adds angle to the azimuth; a declination correction adds the east declination); exact in degrees';
CREATE FUNCTION untilt(lineation, bedding plane, overturned boolean DEFAULT false) RETURNS lineation
  AS 'MODULE_PATHNAME', 'lineation_untilt' LANGUAGE C IMMUTABLE STRICT PARALLEL SAFE;
COMMENT ON FUNCTION untilt(lineation, plane, boolean) IS
  'lineation back-tilted with the bedding: rotated about the bedding strike by minus its dip so the bed is horizontal (by 180 - dip for an overturned bed)';
CREATE FUNCTION unfold(lineation, limb plane, fold_axis lineation, tolerance float8 DEFAULT 10) RETURNS lineation
  AS 'MODULE_PATHNAME', 'lineation_unfold' LANGUAGE C IMMUTABLE STRICT PARALLEL SAFE;
COMMENT ON FUNCTION unfold(lineation, plane, lineation, float8) IS
  'lineation restored with a limb of a plunging fold in two steps after Ramsay (1967, from memory): the fold axis is rotated to horizontal about the horizontal line normal to its trend, then the limb is untilted; error 22000 if the fold axis lies more than tolerance degrees (0..90) off the limb';

CREATE FUNCTION rotate(fault_slip, axis lineation, angle float8) RETURNS fault_slip
  AS 'MODULE_PATHNAME', 'fault_slip_rotate' LANGUAGE C IMMUTABLE STRICT PARALLEL SAFE;
COMMENT ON FUNCTION rotate(fault_slip, lineation, float8) IS
  'fault_slip rotated by angle degrees about the axis, right-hand rule: the axis points down along its trend and plunge (a horizontal axis toward its stored trend, 0..180), and a positive angle turns clockwise as seen looking along it (from above for a downward axis); Rodrigues'' formula';
CREATE FUNCTION rotate(fault_slip, axis_trend float8, axis_plunge float8, angle float8) RETURNS fault_slip
  AS 'MODULE_PATHNAME', 'fault_slip_rotate_direction' LANGUAGE C IMMUTABLE STRICT PARALLEL SAFE;
COMMENT ON FUNCTION rotate(fault_slip, float8, float8, float8) IS
  'fault_slip rotated by angle degrees about the directed axis (trend, plunge), plunge -90..90 with negative pointing up, taken as given (no lower-hemisphere flip); right-hand rule: positive is clockwise seen looking along the axis';
CREATE FUNCTION rotate_vertical(fault_slip, angle float8) RETURNS fault_slip
  AS 'MODULE_PATHNAME', 'fault_slip_rotate_vertical' LANGUAGE C IMMUTABLE STRICT PARALLEL SAFE;
COMMENT ON FUNCTION rotate_vertical(fault_slip, float8) IS
  'fault_slip turned about the vertical by angle degrees, clockwise seen from above (adds angle to the azimuth; a declination correction adds the east declination); exact in degrees';
CREATE FUNCTION untilt(fault_slip, bedding plane, overturned boolean DEFAULT false) RETURNS fault_slip
  AS 'MODULE_PATHNAME', 'fault_slip_untilt' LANGUAGE C IMMUTABLE STRICT PARALLEL SAFE;
COMMENT ON FUNCTION untilt(fault_slip, plane, boolean) IS
  'fault_slip back-tilted with the bedding: rotated about the bedding strike by minus its dip so the bed is horizontal (by 180 - dip for an overturned bed)';
CREATE FUNCTION unfold(fault_slip, limb plane, fold_axis lineation, tolerance float8 DEFAULT 10) RETURNS fault_slip
  AS 'MODULE_PATHNAME', 'fault_slip_unfold' LANGUAGE C IMMUTABLE STRICT PARALLEL SAFE;
COMMENT ON FUNCTION unfold(fault_slip, plane, lineation, float8) IS
  'fault_slip restored with a limb of a plunging fold in two steps after Ramsay (1967, from memory): the fold axis is rotated to horizontal about the horizontal line normal to its trend, then the limb is untilted; error 22000 if the fold axis lies more than tolerance degrees (0..90) off the limb';
