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

-- ---- separation of stress phases (rules: src/core/phases.hpp) -------------------------
CREATE FUNCTION stress_phases_accum(internal, fault_slip, integer, bigint) RETURNS internal
  AS 'MODULE_PATHNAME' LANGUAGE C IMMUTABLE PARALLEL SAFE;
CREATE FUNCTION stress_phases_starts_accum(internal, fault_slip, integer, bigint, integer) RETURNS internal
  AS 'MODULE_PATHNAME' LANGUAGE C IMMUTABLE PARALLEL SAFE;
CREATE FUNCTION stress_phases_combine(internal, internal) RETURNS internal
  AS 'MODULE_PATHNAME' LANGUAGE C IMMUTABLE PARALLEL SAFE;
CREATE FUNCTION stress_phases_serialize(internal) RETURNS bytea
  AS 'MODULE_PATHNAME' LANGUAGE C IMMUTABLE STRICT PARALLEL SAFE;
CREATE FUNCTION stress_phases_deserialize(bytea, internal) RETURNS internal
  AS 'MODULE_PATHNAME' LANGUAGE C IMMUTABLE STRICT PARALLEL SAFE;
CREATE FUNCTION stress_phases_final(internal) RETURNS stress_tensor[]
  AS 'MODULE_PATHNAME' LANGUAGE C IMMUTABLE PARALLEL SAFE;
COMMENT ON FUNCTION stress_phases_accum(internal, fault_slip, integer, bigint) IS 'stress_phases(fault_slip, integer, bigint) transition';
COMMENT ON FUNCTION stress_phases_starts_accum(internal, fault_slip, integer, bigint, integer) IS 'stress_phases(fault_slip, integer, bigint, integer) transition';
COMMENT ON FUNCTION stress_phases_combine(internal, internal) IS 'stress_phases combine (concatenates the kept data)';
COMMENT ON FUNCTION stress_phases_serialize(internal) IS 'stress_phases state serialization';
COMMENT ON FUNCTION stress_phases_deserialize(bytea, internal) IS 'stress_phases state deserialization (validated)';
COMMENT ON FUNCTION stress_phases_final(internal) IS 'stress_phases final function';

CREATE AGGREGATE stress_phases(fault_slip, phases integer, seed bigint) (
  SFUNC = stress_phases_accum, STYPE = internal, FINALFUNC = stress_phases_final,
  FINALFUNC_MODIFY = READ_WRITE,
  COMBINEFUNC = stress_phases_combine, SERIALFUNC = stress_phases_serialize,
  DESERIALFUNC = stress_phases_deserialize, PARALLEL = SAFE);
COMMENT ON AGGREGATE stress_phases(fault_slip, integer, bigint) IS
  'separates a mixed fault-slip population into phases (1..8) stress phases by hard division after Shan, Suen & Lin (2003, from memory): each datum goes to the tensor that fits it best, each tensor is the linear inversion (Michael 1984) of its data, repeated to a fixed point from 20 random starts (seeded; data sorted first, so deterministic); returns one stress_tensor per phase, largest first, with its data count and mean misfit; stress_phase(f, result) tells a datum''s phase; keeps the group''s data (at most 1,000,000); NULL for an empty group, fewer than 4 data per phase, or no division with every phase invertible. Results are interpretive; where fault reactivation or induced seismicity matters, defer to site investigation, local codes and licensed professionals';
CREATE AGGREGATE stress_phases(fault_slip, phases integer, seed bigint, starts integer) (
  SFUNC = stress_phases_starts_accum, STYPE = internal, FINALFUNC = stress_phases_final,
  FINALFUNC_MODIFY = READ_WRITE,
  COMBINEFUNC = stress_phases_combine, SERIALFUNC = stress_phases_serialize,
  DESERIALFUNC = stress_phases_deserialize, PARALLEL = SAFE);
COMMENT ON AGGREGATE stress_phases(fault_slip, integer, bigint, integer) IS
  'stress_phases with a given number of random starts (1..10000; the three-argument form uses 20); see stress_phases(fault_slip, integer, bigint). Results are interpretive; where fault reactivation or induced seismicity matters, defer to site investigation, local codes and licensed professionals';

CREATE FUNCTION stress_phase(fault_slip, phases stress_tensor[]) RETURNS integer
  AS 'MODULE_PATHNAME' LANGUAGE C IMMUTABLE STRICT PARALLEL SAFE;
COMMENT ON FUNCTION stress_phase(fault_slip, stress_tensor[]) IS
  'index (1-based) of the tensor in the array under which the datum has the smallest misfit angle (an undefined misfit counts as 90 degrees; ties to the lower index), the rule stress_phases divides by; NULL for an empty array';

-- ---- misfit summary ----------------------------------------------------------------------
CREATE TYPE misfit_stats AS (n bigint, undefined bigint, mean float8, median float8, above bigint, threshold float8);
COMMENT ON TYPE misfit_stats IS
  'misfit angles of a group of fault-slip data under given tensors: n defined misfits, undefined (plane normal to a principal axis), mean and median (degrees), above = count with misfit > threshold, the threshold';
CREATE FUNCTION misfit_summary_accum(internal, fault_slip, stress_tensor, float8) RETURNS internal
  AS 'MODULE_PATHNAME' LANGUAGE C IMMUTABLE PARALLEL SAFE;
CREATE FUNCTION misfit_summary_combine(internal, internal) RETURNS internal
  AS 'MODULE_PATHNAME' LANGUAGE C IMMUTABLE PARALLEL SAFE;
CREATE FUNCTION misfit_summary_serialize(internal) RETURNS bytea
  AS 'MODULE_PATHNAME' LANGUAGE C IMMUTABLE STRICT PARALLEL SAFE;
CREATE FUNCTION misfit_summary_deserialize(bytea, internal) RETURNS internal
  AS 'MODULE_PATHNAME' LANGUAGE C IMMUTABLE STRICT PARALLEL SAFE;
CREATE FUNCTION misfit_summary_final(internal) RETURNS misfit_stats
  AS 'MODULE_PATHNAME' LANGUAGE C IMMUTABLE PARALLEL SAFE;
COMMENT ON FUNCTION misfit_summary_accum(internal, fault_slip, stress_tensor, float8) IS 'misfit_summary transition';
COMMENT ON FUNCTION misfit_summary_combine(internal, internal) IS 'misfit_summary combine (concatenates the kept misfits)';
COMMENT ON FUNCTION misfit_summary_serialize(internal) IS 'misfit_summary state serialization';
COMMENT ON FUNCTION misfit_summary_deserialize(bytea, internal) IS 'misfit_summary state deserialization (validated)';
COMMENT ON FUNCTION misfit_summary_final(internal) IS 'misfit_summary final function';
CREATE AGGREGATE misfit_summary(fault_slip, stress_tensor, threshold float8) (
  SFUNC = misfit_summary_accum, STYPE = internal, FINALFUNC = misfit_summary_final,
  FINALFUNC_MODIFY = READ_WRITE,
  COMBINEFUNC = misfit_summary_combine, SERIALFUNC = misfit_summary_serialize,
  DESERIALFUNC = misfit_summary_deserialize, PARALLEL = SAFE);
COMMENT ON AGGREGATE misfit_summary(fault_slip, stress_tensor, float8) IS
  'misfit angles (Wallace 1951, Bott 1959) of a group''s data, each under the tensor given on its row: count, undefined, mean, median and count above the threshold (0..180 degrees, the same on every row); keeps 8 bytes per datum (at most 10,000,000); NULL for an empty group. Results are interpretive; where fault reactivation or induced seismicity matters, defer to site investigation, local codes and licensed professionals';

-- ---- summed moment tensors (rules: src/core/moment.hpp) ----------------------------------
CREATE TYPE moment_summary AS (
  n bigint, tensor float8[], p_axis lineation, b_axis lineation, t_axis lineation,
  best_double_couple fault_slip, epsilon float8, scalar_moment float8, moment_sum float8,
  consistency float8, summed float8[], weighted boolean);
COMMENT ON TYPE moment_summary IS
  'summed moment tensor of a group: n data; tensor = the sum normalised to unit scalar moment {nn, ee, dd, ne, nd, ed} (NED); its P, B, T axes; best double couple (same P and T); epsilon (Giardini 1984, 0 for a double couple, +-0.5 for a CLVD); scalar_moment = |sum|/sqrt2 and moment_sum = sum of the data''s moments (N m when weighted, else counts of unit moments); consistency = scalar_moment / moment_sum; summed = the sum itself; weighted = moments from magnitudes. Axis fields are NULL when the sum cancels';
CREATE FUNCTION moment_tensor_sum_accum(internal, fault_slip) RETURNS internal
  AS 'MODULE_PATHNAME' LANGUAGE C IMMUTABLE PARALLEL SAFE;
CREATE FUNCTION moment_tensor_sum_weighted_accum(internal, fault_slip, float8) RETURNS internal
  AS 'MODULE_PATHNAME' LANGUAGE C IMMUTABLE PARALLEL SAFE;
CREATE FUNCTION moment_tensor_sum_combine(internal, internal) RETURNS internal
  AS 'MODULE_PATHNAME' LANGUAGE C IMMUTABLE PARALLEL SAFE;
CREATE FUNCTION moment_tensor_sum_serialize(internal) RETURNS bytea
  AS 'MODULE_PATHNAME' LANGUAGE C IMMUTABLE STRICT PARALLEL SAFE;
CREATE FUNCTION moment_tensor_sum_deserialize(bytea, internal) RETURNS internal
  AS 'MODULE_PATHNAME' LANGUAGE C IMMUTABLE STRICT PARALLEL SAFE;
CREATE FUNCTION moment_tensor_sum_final(internal) RETURNS moment_summary
  AS 'MODULE_PATHNAME' LANGUAGE C IMMUTABLE PARALLEL SAFE;
COMMENT ON FUNCTION moment_tensor_sum_accum(internal, fault_slip) IS 'moment_tensor_sum(fault_slip) transition';
COMMENT ON FUNCTION moment_tensor_sum_weighted_accum(internal, fault_slip, float8) IS 'moment_tensor_sum(fault_slip, float8) transition';
COMMENT ON FUNCTION moment_tensor_sum_combine(internal, internal) IS 'moment_tensor_sum combine (adds compensated sums)';
COMMENT ON FUNCTION moment_tensor_sum_serialize(internal) IS 'moment_tensor_sum state serialization';
COMMENT ON FUNCTION moment_tensor_sum_deserialize(bytea, internal) IS 'moment_tensor_sum state deserialization (validated)';
COMMENT ON FUNCTION moment_tensor_sum_final(internal) IS 'moment_tensor_sum final function';
CREATE AGGREGATE moment_tensor_sum(fault_slip) (
  SFUNC = moment_tensor_sum_accum, STYPE = internal, SSPACE = 224, FINALFUNC = moment_tensor_sum_final,
  COMBINEFUNC = moment_tensor_sum_combine, SERIALFUNC = moment_tensor_sum_serialize,
  DESERIALFUNC = moment_tensor_sum_deserialize, PARALLEL = SAFE);
COMMENT ON AGGREGATE moment_tensor_sum(fault_slip) IS
  'sum of unit moment tensors n u^T + u n^T (Aki & Richards 1980) over a group, the kinematic P/T analysis of fault populations (Marrett & Allmendinger 1990); returns moment_summary; streaming, constant memory; NULL for an empty group';
CREATE AGGREGATE moment_tensor_sum(fault_slip, magnitude float8) (
  SFUNC = moment_tensor_sum_weighted_accum, STYPE = internal, SSPACE = 224, FINALFUNC = moment_tensor_sum_final,
  COMBINEFUNC = moment_tensor_sum_combine, SERIALFUNC = moment_tensor_sum_serialize,
  DESERIALFUNC = moment_tensor_sum_deserialize, PARALLEL = SAFE);
COMMENT ON AGGREGATE moment_tensor_sum(fault_slip, float8) IS
  'sum of moment tensors weighted by scalar moment M0 = 10^(1.5 Mw + 9.1) N m from moment magnitude Mw (Hanks & Kanamori 1979, IASPEI form; -10..12), Kostrov (1974) summation; rows with a NULL magnitude are skipped; returns moment_summary; streaming, constant memory; NULL for an empty group';

CREATE FUNCTION kostrov_strain_rate(moment_summary, volume float8, duration float8, shear_modulus float8 DEFAULT 3e10)
  RETURNS float8[]
  AS 'MODULE_PATHNAME' LANGUAGE C IMMUTABLE STRICT PARALLEL SAFE;
COMMENT ON FUNCTION kostrov_strain_rate(moment_summary, float8, float8, float8) IS
  'Kostrov (1974) average strain rate {nn, ee, dd, ne, nd, ed} (NED, per second, extension positive) = summed moment tensor / (2 shear_modulus volume duration), volume in m^3, duration in s, shear modulus in Pa (3e10 default, common practice); needs a sum weighted by magnitudes (22023 otherwise). Results are interpretive; where seismic hazard or induced seismicity matters, defer to site investigation, local codes and licensed professionals';
