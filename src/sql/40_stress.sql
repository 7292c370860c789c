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
COMMENT ON FUNCTION stress_tensor_send(stress_tensor) IS
  'binary output of stress_tensor (version byte; 13 float8: the 6 components, mean misfit, 3 confidence cones, the 2 ends of the Phi interval, friction; int8 data count; int4 flags); never -0';

CREATE FUNCTION stress_tensor(sigma1 lineation, sigma3 lineation, shape_ratio float8) RETURNS stress_tensor
  AS 'MODULE_PATHNAME', 'stress_tensor_from_axes' LANGUAGE C IMMUTABLE STRICT PARALLEL SAFE;
COMMENT ON FUNCTION stress_tensor(lineation, lineation, float8) IS
  'reduced stress tensor with sigma1 and sigma3 along the given axes (sigma3 orthogonalised against sigma1) and shape ratio Phi = (s2-s3)/(s1-s3) in 0..1 (Angelier 1979); data count 0. Results are interpretive; where fault reactivation, induced seismicity, or slope or excavation stability matters, defer to site investigation, local codes and licensed professionals';

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
  'azimuth of maximum horizontal compression, degrees 0..180 (Lund & Townend 2007, eqs 10-11); NULL when horizontal stress is isotropic. Results are interpretive; where fault reactivation, induced seismicity, or slope or excavation stability matters, defer to site investigation, local codes and licensed professionals';
CREATE FUNCTION stress_regime(stress_tensor) RETURNS text
  AS 'MODULE_PATHNAME', 'stress_tensor_regime' LANGUAGE C IMMUTABLE STRICT PARALLEL SAFE;
COMMENT ON FUNCTION stress_regime(stress_tensor) IS
  'fault regime from the plunges of the principal axes, classes of Zoback (1992, JGR 97:11703, table 1; limits recalled from memory, not checked against the paper): normal (pl1 >= 52, pl3 <= 35), normal-strike-slip (40 <= pl1 < 52, pl3 <= 20), strike-slip (pl1 < 40, pl2 >= 45, pl3 <= 20, or pl1 <= 20, pl2 >= 45, pl3 < 40), thrust-strike-slip (pl1 <= 20, 40 <= pl3 < 52), thrust (pl1 <= 35, pl3 >= 52), else unclassified. Results are interpretive; where fault reactivation, induced seismicity, or slope or excavation stability matters, defer to site investigation, local codes and licensed professionals';
CREATE FUNCTION regime_index(stress_tensor) RETURNS float8
  AS 'MODULE_PATHNAME', 'stress_regime_index' LANGUAGE C IMMUTABLE STRICT PARALLEL SAFE;
COMMENT ON FUNCTION regime_index(stress_tensor) IS
  'regime index A-phi of Simpson (1997), 0..3: 0..1 normal faulting, 1..2 strike-slip, 2..3 thrust faulting (the words of stress_regime)';
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
  'angle between observed slip and the resolved shear traction (Wallace 1951, Bott 1959), degrees 0..180; NULL when the plane is normal to a principal axis. A convention error made on every datum (dip direction or left-hand-rule strike read as right-hand-rule strike, the slip of the footwall given for that of the hanging wall) fits a rotated stress state, or one with sigma1 and sigma3 swapped, exactly as well: a small misfit does not confirm the conventions. Results are interpretive; where fault reactivation, induced seismicity, or slope or excavation stability matters, defer to site investigation, local codes and licensed professionals';
CREATE FUNCTION resolved_slip(plane, stress_tensor) RETURNS fault_slip
  AS 'MODULE_PATHNAME', 'stress_resolved_slip' LANGUAGE C IMMUTABLE STRICT PARALLEL SAFE;
COMMENT ON FUNCTION resolved_slip(plane, stress_tensor) IS
  'slip on the plane predicted by the Wallace-Bott hypothesis (direction of resolved shear traction); NULL when the plane is normal to a principal axis. Results are interpretive; where fault reactivation, induced seismicity, or slope or excavation stability matters, defer to site investigation, local codes and licensed professionals';
CREATE FUNCTION slip_tendency(plane, stress_tensor, friction float8 DEFAULT 0.6) RETURNS float8
  AS 'MODULE_PATHNAME', 'stress_slip_tendency' LANGUAGE C IMMUTABLE STRICT PARALLEL SAFE;
COMMENT ON FUNCTION slip_tendency(plane, stress_tensor, float8) IS
  'normalised slip tendency Ts/Ts_max, 0..1 (Morris et al. 1996), with magnitudes assumed so the optimal plane is at the frictional limit (friction 0.001..5): a relative measure, not a prediction of slip. Pore-fluid pressure, which this function does not model, controls reactivation and induced seismicity. Results are interpretive; where fault reactivation, induced seismicity, or slope or excavation stability matters, defer to site investigation, local codes and licensed professionals';
CREATE FUNCTION dilation_tendency(plane, stress_tensor) RETURNS float8
  AS 'MODULE_PATHNAME', 'stress_dilation_tendency' LANGUAGE C IMMUTABLE STRICT PARALLEL SAFE;
COMMENT ON FUNCTION dilation_tendency(plane, stress_tensor) IS
  'dilation tendency (s1 - sn)/(s1 - s3), 0..1 (Ferrill et al. 1999). Pore-fluid pressure, which this function does not model, controls reactivation and induced seismicity. Results are interpretive; where fault reactivation, induced seismicity, or slope or excavation stability matters, defer to site investigation, local codes and licensed professionals';

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
  'right dihedra (Angelier & Mechler 1977): percent of data for which each node of a lower-hemisphere grid of the given spacing (degrees, dividing 90, 0.5..45) is in the compressional dihedron; sigma1 near the maximum, sigma3 near the minimum; NULL for an empty group. Results are interpretive; where fault reactivation, induced seismicity, or slope or excavation stability matters, defer to site investigation, local codes and licensed professionals';

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
