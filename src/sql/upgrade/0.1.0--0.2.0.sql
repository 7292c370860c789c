-- Upgrade from 0.1.0 to 0.2.0: changes to objects that 0.1.0 already had.
-- The fragments wholly new in 0.2.0 follow this file in the built script
-- (Makefile: NEW_IN_0_2_0). tests/external/check_upgrade.sh compares the
-- catalogue of an updated database with a fresh install object by object.
\echo Use "ALTER EXTENSION striae UPDATE TO '0.2.0'" to load this file. \quit

-- issue 12: numeric constructors wrap any finite azimuth (and rake); text input keeps its ranges
COMMENT ON FUNCTION plane(float8, float8) IS
  'plane from right-hand-rule strike (any finite value, wrapped to 0..360) and dip (0..90), degrees';
COMMENT ON FUNCTION plane_from_dip_direction(float8, float8) IS
  'plane from dip direction (any finite value, wrapped to 0..360) and dip (0..90), degrees; strike = dip direction - 90';
COMMENT ON FUNCTION lineation(float8, float8) IS
  'line from trend (any finite value, wrapped to 0..360) and plunge (-90..90; negative = upward, flipped to the lower hemisphere), degrees';
COMMENT ON FUNCTION fault_slip(float8, float8, float8) IS
  'fault slip from right-hand-rule strike (any finite value, wrapped to 0..360), dip (0..90) and Aki & Richards rake (any finite value, wrapped to -180..180, positive = reverse), degrees';
COMMENT ON FUNCTION fault_slip(plane, float8) IS
  'fault slip from a plane and an Aki & Richards rake (degrees, measured from the right-hand-rule strike; any finite value, wrapped to -180..180)';
