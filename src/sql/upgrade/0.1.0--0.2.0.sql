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

-- issue 13: fabric_summary fields that shadowed built-in names (point, random)
-- are renamed, with girdle, after the index they hold (Vollmer 1990).
ALTER TYPE fabric_summary RENAME ATTRIBUTE point TO vollmer_p;
ALTER TYPE fabric_summary RENAME ATTRIBUTE girdle TO vollmer_g;
ALTER TYPE fabric_summary RENAME ATTRIBUTE random TO vollmer_r;
COMMENT ON TYPE fabric_summary IS
  'orientation tensor: eigenvectors e1..e3, normalised eigenvalues s1 >= s2 >= s3 (sum 1), Woodcock (1977) K and C, Vollmer (1990) point, girdle and random indices P = s1 - s2, G = 2 (s2 - s3), R = 3 s3 (vollmer_p, vollmer_g, vollmer_r), count';

-- issue 13: one vocabulary (mechanism_class, stress_regime), sourced limits,
-- and the cautions where decisions are made.
COMMENT ON FUNCTION slip_sense(fault_slip) IS
  'sense of slip from the rake: normal, reverse, dextral, sinistral within 22.5 degrees of pure, else two senses, dominant first (e.g. normal-dextral); reverse, not thrust: the sense of one fault of any dip (mechanism_class and stress_regime name their class thrust, as their schemes do)';
COMMENT ON FUNCTION mechanism_class(fault_slip) IS
  'mechanism class from the plunges of the T, B and P axes after Frohlich (1992, PEPI 75:193; thresholds recalled from memory, not checked against the paper): thrust (T > 50), strike-slip (B > 60), normal (P > 60), else unclassified; the same words as stress_regime';
COMMENT ON FUNCTION stress_tensor(lineation, lineation, float8) IS
  'reduced stress tensor with sigma1 and sigma3 along the given axes (sigma3 orthogonalised against sigma1) and shape ratio Phi = (s2-s3)/(s1-s3) in 0..1 (Angelier 1979); data count 0. Results are interpretive; where fault reactivation, induced seismicity, or slope or excavation stability matters, defer to site investigation, local codes and licensed professionals';
COMMENT ON FUNCTION shmax_azimuth(stress_tensor) IS
  'azimuth of maximum horizontal compression, degrees 0..180 (Lund & Townend 2007, eqs 10-11); NULL when horizontal stress is isotropic. Results are interpretive; where fault reactivation, induced seismicity, or slope or excavation stability matters, defer to site investigation, local codes and licensed professionals';
COMMENT ON FUNCTION stress_regime(stress_tensor) IS
  'fault regime from the plunges of the principal axes, classes of Zoback (1992, JGR 97:11703, table 1; limits recalled from memory, not checked against the paper): normal (pl1 >= 52, pl3 <= 35), normal-strike-slip (40 <= pl1 < 52, pl3 <= 20), strike-slip (pl1 < 40, pl2 >= 45, pl3 <= 20, or pl1 <= 20, pl2 >= 45, pl3 < 40), thrust-strike-slip (pl1 <= 20, 40 <= pl3 < 52), thrust (pl1 <= 35, pl3 >= 52), else unclassified. Results are interpretive; where fault reactivation, induced seismicity, or slope or excavation stability matters, defer to site investigation, local codes and licensed professionals';
COMMENT ON FUNCTION regime_index(stress_tensor) IS
  'regime index A-phi of Simpson (1997), 0..3: 0..1 normal faulting, 1..2 strike-slip, 2..3 thrust faulting (the words of stress_regime)';
COMMENT ON FUNCTION misfit(fault_slip, stress_tensor) IS
  'angle between observed slip and the resolved shear traction (Wallace 1951, Bott 1959), degrees 0..180; NULL when the plane is normal to a principal axis. A convention error made on every datum (dip direction or left-hand-rule strike read as right-hand-rule strike, the slip of the footwall given for that of the hanging wall) fits a rotated stress state, or one with sigma1 and sigma3 swapped, exactly as well: a small misfit does not confirm the conventions. Results are interpretive; where fault reactivation, induced seismicity, or slope or excavation stability matters, defer to site investigation, local codes and licensed professionals';
COMMENT ON FUNCTION resolved_slip(plane, stress_tensor) IS
  'slip on the plane predicted by the Wallace-Bott hypothesis (direction of resolved shear traction); NULL when the plane is normal to a principal axis. Results are interpretive; where fault reactivation, induced seismicity, or slope or excavation stability matters, defer to site investigation, local codes and licensed professionals';
COMMENT ON FUNCTION slip_tendency(plane, stress_tensor, float8) IS
  'normalised slip tendency Ts/Ts_max, 0..1 (Morris et al. 1996), with magnitudes assumed so the optimal plane is at the frictional limit (friction 0.001..5): a relative measure, not a prediction of slip. Pore-fluid pressure, which this function does not model, controls reactivation and induced seismicity. Results are interpretive; where fault reactivation, induced seismicity, or slope or excavation stability matters, defer to site investigation, local codes and licensed professionals';
COMMENT ON FUNCTION dilation_tendency(plane, stress_tensor) IS
  'dilation tendency (s1 - sn)/(s1 - s3), 0..1 (Ferrill et al. 1999). Pore-fluid pressure, which this function does not model, controls reactivation and induced seismicity. Results are interpretive; where fault reactivation, induced seismicity, or slope or excavation stability matters, defer to site investigation, local codes and licensed professionals';
COMMENT ON AGGREGATE right_dihedra(fault_slip, float8) IS
  'right dihedra (Angelier & Mechler 1977): percent of data for which each node of a lower-hemisphere grid of the given spacing (degrees, dividing 90, 0.5..45) is in the compressional dihedron; sigma1 near the maximum, sigma3 near the minimum; NULL for an empty group. Results are interpretive; where fault reactivation, induced seismicity, or slope or excavation stability matters, defer to site investigation, local codes and licensed professionals';

-- issue 11: the binary form has 13 float8 fields, not 12 (the 0.1.0 comment miscounted)
COMMENT ON FUNCTION stress_tensor_send(stress_tensor) IS
  'binary output of stress_tensor (version byte; 13 float8: the 6 components, mean misfit, 3 confidence cones, the 2 ends of the Phi interval, friction; int8 data count; int4 flags); never -0';
