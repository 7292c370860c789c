-- Two-phase aggregation (new in 0.2.0; rules: src/core/partial.hpp). On a
-- shard, X_partial(...) returns the group's aggregate state as a partial_state
-- value; on the coordinator, X(partial_state) merges the partials of a group
-- with X's own combine function and finishes with X's own final function, and
-- merge_partial(partial_state) merges them into one partial (to merge in
-- stages). A plain aggregate on the shard, so postgres_fdw pushes it down with a
-- GROUP BY that includes the partition key, even where the final grouping cuts
-- across partitions.

-- ---- the type -------------------------------------------------------------------------
CREATE TYPE partial_state;
CREATE FUNCTION partial_state_in(cstring) RETURNS partial_state
  AS 'MODULE_PATHNAME' LANGUAGE C IMMUTABLE STRICT PARALLEL SAFE;
CREATE FUNCTION partial_state_out(partial_state) RETURNS cstring
  AS 'MODULE_PATHNAME' LANGUAGE C IMMUTABLE STRICT PARALLEL SAFE;
CREATE FUNCTION partial_state_recv(internal) RETURNS partial_state
  AS 'MODULE_PATHNAME' LANGUAGE C IMMUTABLE STRICT PARALLEL SAFE;
CREATE FUNCTION partial_state_send(partial_state) RETURNS bytea
  AS 'MODULE_PATHNAME' LANGUAGE C IMMUTABLE STRICT PARALLEL SAFE;
CREATE TYPE partial_state (
  INPUT = partial_state_in, OUTPUT = partial_state_out, RECEIVE = partial_state_recv, SEND = partial_state_send,
  INTERNALLENGTH = VARIABLE, ALIGNMENT = int4, STORAGE = extended);
COMMENT ON TYPE partial_state IS
  'an aggregate state of striae travelling between servers (two-phase aggregation): the kind, the input type and the serialized state, validated on input; text <kind>/<input>:<base64>; made by the *_partial aggregates, merged by X(partial_state) and merge_partial';
COMMENT ON FUNCTION partial_state_in(cstring) IS 'partial_state text input: <kind>/<input>:<base64 of the serialized state>, validated like the aggregate''s deserialize function';
COMMENT ON FUNCTION partial_state_out(partial_state) IS 'partial_state text output: <kind>/<input>:<base64 of the serialized state>';
COMMENT ON FUNCTION partial_state_recv(internal) IS 'partial_state binary input: the value''s bytes (little-endian header, serialized state), validated like the text form';
COMMENT ON FUNCTION partial_state_send(partial_state) IS 'partial_state binary output: the value''s bytes (little-endian header, serialized state)';

CREATE FUNCTION partial_kind(partial_state) RETURNS text
  AS 'MODULE_PATHNAME' LANGUAGE C IMMUTABLE STRICT PARALLEL SAFE;
COMMENT ON FUNCTION partial_kind(partial_state) IS
  'the aggregate that made a partial and its input type, e.g. ''stress_inversion/fault_slip'', ''fisher_mean/plane''';
CREATE FUNCTION partial_count(partial_state) RETURNS bigint
  AS 'MODULE_PATHNAME' LANGUAGE C IMMUTABLE STRICT PARALLEL SAFE;
COMMENT ON FUNCTION partial_count(partial_state) IS
  'the number of data (non-NULL rows) a partial summarises';

-- ---- partial aggregates: the one-phase aggregate's own transition, combine,
-- ---- serialize and deserialize functions, with a final function that returns
-- ---- the state as a partial_state (one per input type) ---------------------------------
CREATE FUNCTION partial_final_lineation(internal) RETURNS partial_state
  AS 'MODULE_PATHNAME' LANGUAGE C IMMUTABLE PARALLEL SAFE;
CREATE FUNCTION partial_final_plane(internal) RETURNS partial_state
  AS 'MODULE_PATHNAME' LANGUAGE C IMMUTABLE PARALLEL SAFE;
CREATE FUNCTION partial_final_fault_slip(internal) RETURNS partial_state
  AS 'MODULE_PATHNAME' LANGUAGE C IMMUTABLE PARALLEL SAFE;
COMMENT ON FUNCTION partial_final_lineation(internal) IS 'final function of the partial aggregates over lineations: the state as a partial_state';
COMMENT ON FUNCTION partial_final_plane(internal) IS 'final function of the partial aggregates over planes: the state as a partial_state';
COMMENT ON FUNCTION partial_final_fault_slip(internal) IS 'final function of the partial aggregates over fault_slip: the state as a partial_state';

CREATE AGGREGATE fisher_mean_partial(lineation) (
  SFUNC = fisher_lineation_accum, STYPE = internal, SSPACE = 736, FINALFUNC = partial_final_lineation,
  COMBINEFUNC = fisher_combine, SERIALFUNC = fisher_serialize, DESERIALFUNC = fisher_deserialize, PARALLEL = SAFE);
CREATE AGGREGATE fisher_mean_partial(plane) (
  SFUNC = fisher_plane_accum, STYPE = internal, SSPACE = 736, FINALFUNC = partial_final_plane,
  COMBINEFUNC = fisher_combine, SERIALFUNC = fisher_serialize, DESERIALFUNC = fisher_deserialize, PARALLEL = SAFE);
CREATE AGGREGATE orientation_tensor_partial(lineation) (
  SFUNC = tensor_lineation_accum, STYPE = internal, SSPACE = 112, FINALFUNC = partial_final_lineation,
  COMBINEFUNC = tensor_combine, SERIALFUNC = tensor_serialize, DESERIALFUNC = tensor_deserialize, PARALLEL = SAFE);
CREATE AGGREGATE orientation_tensor_partial(plane) (
  SFUNC = tensor_plane_accum, STYPE = internal, SSPACE = 112, FINALFUNC = partial_final_plane,
  COMBINEFUNC = tensor_combine, SERIALFUNC = tensor_serialize, DESERIALFUNC = tensor_deserialize, PARALLEL = SAFE);
CREATE AGGREGATE mean_plane_partial(plane) (
  SFUNC = tensor_plane_accum, STYPE = internal, SSPACE = 112, FINALFUNC = partial_final_plane,
  COMBINEFUNC = tensor_combine, SERIALFUNC = tensor_serialize, DESERIALFUNC = tensor_deserialize, PARALLEL = SAFE);
CREATE AGGREGATE fold_axis_partial(plane) (
  SFUNC = tensor_plane_accum, STYPE = internal, SSPACE = 112, FINALFUNC = partial_final_plane,
  COMBINEFUNC = tensor_combine, SERIALFUNC = tensor_serialize, DESERIALFUNC = tensor_deserialize, PARALLEL = SAFE);
CREATE AGGREGATE density_grid_partial(lineation, spacing float8) (
  SFUNC = density_lineation_accum, STYPE = internal, FINALFUNC = partial_final_lineation,
  COMBINEFUNC = density_combine, SERIALFUNC = density_serialize, DESERIALFUNC = density_deserialize, PARALLEL = SAFE);
CREATE AGGREGATE density_grid_partial(plane, spacing float8) (
  SFUNC = density_plane_accum, STYPE = internal, FINALFUNC = partial_final_plane,
  COMBINEFUNC = density_combine, SERIALFUNC = density_serialize, DESERIALFUNC = density_deserialize, PARALLEL = SAFE);
CREATE AGGREGATE stress_inversion_partial(fault_slip) (
  SFUNC = stress_inversion_accum, STYPE = internal, SSPACE = 176, FINALFUNC = partial_final_fault_slip,
  COMBINEFUNC = stress_inversion_combine, SERIALFUNC = stress_inversion_serialize,
  DESERIALFUNC = stress_inversion_deserialize, PARALLEL = SAFE);
CREATE AGGREGATE stress_inversion_partial(fault_slip, resamples integer, seed bigint) (
  SFUNC = stress_bootstrap_accum, STYPE = internal, FINALFUNC = partial_final_fault_slip,
  COMBINEFUNC = stress_keep_combine, SERIALFUNC = stress_keep_serialize,
  DESERIALFUNC = stress_keep_deserialize, PARALLEL = SAFE);
CREATE AGGREGATE right_dihedra_partial(fault_slip, spacing float8) (
  SFUNC = right_dihedra_accum, STYPE = internal, FINALFUNC = partial_final_fault_slip,
  COMBINEFUNC = right_dihedra_combine, SERIALFUNC = right_dihedra_serialize,
  DESERIALFUNC = right_dihedra_deserialize, PARALLEL = SAFE);
CREATE AGGREGATE focal_stress_inversion_partial(fault_slip) (
  SFUNC = focal_stress_inversion_accum, STYPE = internal, FINALFUNC = partial_final_fault_slip,
  COMBINEFUNC = stress_keep_combine, SERIALFUNC = stress_keep_serialize,
  DESERIALFUNC = stress_keep_deserialize, PARALLEL = SAFE);
CREATE AGGREGATE focal_stress_inversion_partial(fault_slip, friction float8) (
  SFUNC = focal_stress_inversion_friction_accum, STYPE = internal, FINALFUNC = partial_final_fault_slip,
  COMBINEFUNC = stress_keep_combine, SERIALFUNC = stress_keep_serialize,
  DESERIALFUNC = stress_keep_deserialize, PARALLEL = SAFE);
CREATE AGGREGATE focal_stress_inversion_partial(fault_slip, friction float8, resamples integer, seed bigint) (
  SFUNC = focal_bootstrap_accum, STYPE = internal, FINALFUNC = partial_final_fault_slip,
  COMBINEFUNC = stress_keep_combine, SERIALFUNC = stress_keep_serialize,
  DESERIALFUNC = stress_keep_deserialize, PARALLEL = SAFE);
CREATE AGGREGATE stress_phases_partial(fault_slip, phases integer, seed bigint) (
  SFUNC = stress_phases_accum, STYPE = internal, FINALFUNC = partial_final_fault_slip,
  COMBINEFUNC = stress_phases_combine, SERIALFUNC = stress_phases_serialize,
  DESERIALFUNC = stress_phases_deserialize, PARALLEL = SAFE);
CREATE AGGREGATE stress_phases_partial(fault_slip, phases integer, seed bigint, starts integer) (
  SFUNC = stress_phases_starts_accum, STYPE = internal, FINALFUNC = partial_final_fault_slip,
  COMBINEFUNC = stress_phases_combine, SERIALFUNC = stress_phases_serialize,
  DESERIALFUNC = stress_phases_deserialize, PARALLEL = SAFE);
CREATE AGGREGATE misfit_summary_partial(fault_slip, stress_tensor, threshold float8) (
  SFUNC = misfit_summary_accum, STYPE = internal, FINALFUNC = partial_final_fault_slip,
  COMBINEFUNC = misfit_summary_combine, SERIALFUNC = misfit_summary_serialize,
  DESERIALFUNC = misfit_summary_deserialize, PARALLEL = SAFE);
CREATE AGGREGATE moment_tensor_sum_partial(fault_slip) (
  SFUNC = moment_tensor_sum_accum, STYPE = internal, SSPACE = 224, FINALFUNC = partial_final_fault_slip,
  COMBINEFUNC = moment_tensor_sum_combine, SERIALFUNC = moment_tensor_sum_serialize,
  DESERIALFUNC = moment_tensor_sum_deserialize, PARALLEL = SAFE);
CREATE AGGREGATE moment_tensor_sum_partial(fault_slip, magnitude float8) (
  SFUNC = moment_tensor_sum_weighted_accum, STYPE = internal, SSPACE = 224, FINALFUNC = partial_final_fault_slip,
  COMBINEFUNC = moment_tensor_sum_combine, SERIALFUNC = moment_tensor_sum_serialize,
  DESERIALFUNC = moment_tensor_sum_deserialize, PARALLEL = SAFE);

COMMENT ON AGGREGATE fisher_mean_partial(lineation) IS 'first phase of fisher_mean(lineation): the group''s state as a partial_state, to be merged by fisher_mean(partial_state); NULL for an empty group';
COMMENT ON AGGREGATE fisher_mean_partial(plane) IS 'first phase of fisher_mean(plane): the group''s state as a partial_state, to be merged by fisher_mean(partial_state); NULL for an empty group';
COMMENT ON AGGREGATE orientation_tensor_partial(lineation) IS 'first phase of orientation_tensor(lineation): the group''s state as a partial_state, to be merged by orientation_tensor(partial_state); NULL for an empty group';
COMMENT ON AGGREGATE orientation_tensor_partial(plane) IS 'first phase of orientation_tensor(plane), mean_plane and fold_axis: the group''s state as a partial_state, to be merged by orientation_tensor, mean_plane or fold_axis(partial_state); NULL for an empty group';
COMMENT ON AGGREGATE mean_plane_partial(plane) IS 'first phase of mean_plane (the same state as orientation_tensor_partial(plane)), to be merged by mean_plane(partial_state); NULL for an empty group';
COMMENT ON AGGREGATE fold_axis_partial(plane) IS 'first phase of fold_axis (the same state as orientation_tensor_partial(plane)), to be merged by fold_axis(partial_state); NULL for an empty group';
COMMENT ON AGGREGATE density_grid_partial(lineation, float8) IS 'first phase of density_grid(lineation, spacing): the group''s bin counts as a partial_state (at most about 2 MB), to be merged by density_grid(partial_state); NULL for an empty group';
COMMENT ON AGGREGATE density_grid_partial(plane, float8) IS 'first phase of density_grid(plane, spacing): the group''s bin counts as a partial_state (at most about 2 MB), to be merged by density_grid(partial_state); NULL for an empty group';
COMMENT ON AGGREGATE stress_inversion_partial(fault_slip) IS 'first phase of stress_inversion(fault_slip): the group''s normal equations as a partial_state (about 180 bytes), to be merged by stress_inversion(partial_state); NULL for an empty group';
COMMENT ON AGGREGATE stress_inversion_partial(fault_slip, integer, bigint) IS 'first phase of the bootstrap stress_inversion(fault_slip, resamples, seed): the group''s data as a partial_state (48 bytes a datum, at most 1,000,000 data), to be merged by stress_inversion(partial_state); NULL for an empty group';
COMMENT ON AGGREGATE right_dihedra_partial(fault_slip, float8) IS 'first phase of right_dihedra(fault_slip, spacing): the group''s node counts as a partial_state, to be merged by right_dihedra(partial_state); NULL for an empty group';
COMMENT ON AGGREGATE focal_stress_inversion_partial(fault_slip) IS 'first phase of focal_stress_inversion(fault_slip): the group''s data as a partial_state (48 bytes a datum, at most 1,000,000 data), to be merged by focal_stress_inversion(partial_state); NULL for an empty group';
COMMENT ON AGGREGATE focal_stress_inversion_partial(fault_slip, float8) IS 'first phase of focal_stress_inversion(fault_slip, friction): the group''s data as a partial_state (48 bytes a datum, at most 1,000,000 data), to be merged by focal_stress_inversion(partial_state); NULL for an empty group';
COMMENT ON AGGREGATE focal_stress_inversion_partial(fault_slip, float8, integer, bigint) IS 'first phase of focal_stress_inversion(fault_slip, friction, resamples, seed): the group''s data as a partial_state (48 bytes a datum, at most 1,000,000 data), to be merged by focal_stress_inversion(partial_state); NULL for an empty group';
COMMENT ON AGGREGATE stress_phases_partial(fault_slip, integer, bigint) IS 'first phase of stress_phases(fault_slip, phases, seed): the group''s data as a partial_state (48 bytes a datum, at most 1,000,000 data), to be merged by stress_phases(partial_state); NULL for an empty group';
COMMENT ON AGGREGATE stress_phases_partial(fault_slip, integer, bigint, integer) IS 'first phase of stress_phases(fault_slip, phases, seed, starts): the group''s data as a partial_state (48 bytes a datum, at most 1,000,000 data), to be merged by stress_phases(partial_state); NULL for an empty group';
COMMENT ON AGGREGATE misfit_summary_partial(fault_slip, stress_tensor, float8) IS 'first phase of misfit_summary: the group''s misfits as a partial_state (8 bytes a datum, at most 10,000,000), to be merged by misfit_summary(partial_state); NULL for an empty group';
COMMENT ON AGGREGATE moment_tensor_sum_partial(fault_slip) IS 'first phase of moment_tensor_sum(fault_slip): the group''s sums as a partial_state, to be merged by moment_tensor_sum(partial_state); NULL for an empty group';
COMMENT ON AGGREGATE moment_tensor_sum_partial(fault_slip, float8) IS 'first phase of moment_tensor_sum(fault_slip, magnitude): the group''s sums as a partial_state, to be merged by moment_tensor_sum(partial_state); NULL for an empty group';

-- ---- merge aggregates: one transition for all (the first partial of a group
-- ---- fixes kind, input and parameters; the others must match), a final
-- ---- function per aggregate that runs the one-phase aggregate's own final ---------------
CREATE FUNCTION partial_merge_accum(internal, partial_state) RETURNS internal
  AS 'MODULE_PATHNAME' LANGUAGE C IMMUTABLE PARALLEL SAFE;
CREATE FUNCTION partial_merge_combine(internal, internal) RETURNS internal
  AS 'MODULE_PATHNAME' LANGUAGE C IMMUTABLE PARALLEL SAFE;
CREATE FUNCTION partial_merge_serialize(internal) RETURNS bytea
  AS 'MODULE_PATHNAME' LANGUAGE C IMMUTABLE STRICT PARALLEL SAFE;
CREATE FUNCTION partial_merge_deserialize(bytea, internal) RETURNS internal
  AS 'MODULE_PATHNAME' LANGUAGE C IMMUTABLE STRICT PARALLEL SAFE;
COMMENT ON FUNCTION partial_merge_accum(internal, partial_state) IS 'transition of the merges over partial_state (NULL partials are skipped; error 22023 for partials of another kind, input or parameters than the group''s first)';
COMMENT ON FUNCTION partial_merge_combine(internal, internal) IS 'combine of the merges over partial_state';
COMMENT ON FUNCTION partial_merge_serialize(internal) IS 'state serialization of the merges over partial_state (the partial_state bytes of the merged state)';
COMMENT ON FUNCTION partial_merge_deserialize(bytea, internal) IS 'state deserialization of the merges over partial_state (validated)';

CREATE FUNCTION merge_partial_final(internal) RETURNS partial_state
  AS 'MODULE_PATHNAME' LANGUAGE C IMMUTABLE PARALLEL SAFE;
CREATE FUNCTION fisher_mean_merge_final(internal) RETURNS fisher_summary
  AS 'MODULE_PATHNAME' LANGUAGE C IMMUTABLE PARALLEL SAFE;
CREATE FUNCTION orientation_tensor_merge_final(internal) RETURNS fabric_summary
  AS 'MODULE_PATHNAME' LANGUAGE C IMMUTABLE PARALLEL SAFE;
CREATE FUNCTION mean_plane_merge_final(internal) RETURNS plane
  AS 'MODULE_PATHNAME' LANGUAGE C IMMUTABLE PARALLEL SAFE;
CREATE FUNCTION fold_axis_merge_final(internal) RETURNS lineation
  AS 'MODULE_PATHNAME' LANGUAGE C IMMUTABLE PARALLEL SAFE;
CREATE FUNCTION density_grid_merge_final(internal) RETURNS sphere_grid
  AS 'MODULE_PATHNAME' LANGUAGE C IMMUTABLE PARALLEL SAFE;
CREATE FUNCTION stress_inversion_merge_final(internal) RETURNS stress_tensor
  AS 'MODULE_PATHNAME' LANGUAGE C IMMUTABLE PARALLEL SAFE;
CREATE FUNCTION right_dihedra_merge_final(internal) RETURNS sphere_grid
  AS 'MODULE_PATHNAME' LANGUAGE C IMMUTABLE PARALLEL SAFE;
CREATE FUNCTION focal_stress_inversion_merge_final(internal) RETURNS stress_tensor
  AS 'MODULE_PATHNAME' LANGUAGE C IMMUTABLE PARALLEL SAFE;
CREATE FUNCTION stress_phases_merge_final(internal) RETURNS stress_tensor[]
  AS 'MODULE_PATHNAME' LANGUAGE C IMMUTABLE PARALLEL SAFE;
CREATE FUNCTION misfit_summary_merge_final(internal) RETURNS misfit_stats
  AS 'MODULE_PATHNAME' LANGUAGE C IMMUTABLE PARALLEL SAFE;
CREATE FUNCTION moment_tensor_sum_merge_final(internal) RETURNS moment_summary
  AS 'MODULE_PATHNAME' LANGUAGE C IMMUTABLE PARALLEL SAFE;
COMMENT ON FUNCTION merge_partial_final(internal) IS 'merge_partial final function: the merged state as a partial_state';
COMMENT ON FUNCTION fisher_mean_merge_final(internal) IS 'fisher_mean(partial_state) final function (fisher_mean''s own)';
COMMENT ON FUNCTION orientation_tensor_merge_final(internal) IS 'orientation_tensor(partial_state) final function (orientation_tensor''s own)';
COMMENT ON FUNCTION mean_plane_merge_final(internal) IS 'mean_plane(partial_state) final function (mean_plane''s own)';
COMMENT ON FUNCTION fold_axis_merge_final(internal) IS 'fold_axis(partial_state) final function (fold_axis''s own)';
COMMENT ON FUNCTION density_grid_merge_final(internal) IS 'density_grid(partial_state) final function (density_grid''s own)';
COMMENT ON FUNCTION stress_inversion_merge_final(internal) IS 'stress_inversion(partial_state) final function (that of stress_inversion(fault_slip) or of the bootstrap form, by the partials'' kind)';
COMMENT ON FUNCTION right_dihedra_merge_final(internal) IS 'right_dihedra(partial_state) final function (right_dihedra''s own)';
COMMENT ON FUNCTION focal_stress_inversion_merge_final(internal) IS 'focal_stress_inversion(partial_state) final function (focal_stress_inversion''s own)';
COMMENT ON FUNCTION stress_phases_merge_final(internal) IS 'stress_phases(partial_state) final function (stress_phases''s own)';
COMMENT ON FUNCTION misfit_summary_merge_final(internal) IS 'misfit_summary(partial_state) final function (misfit_summary''s own)';
COMMENT ON FUNCTION moment_tensor_sum_merge_final(internal) IS 'moment_tensor_sum(partial_state) final function (moment_tensor_sum''s own)';

CREATE AGGREGATE merge_partial(partial_state) (
  SFUNC = partial_merge_accum, STYPE = internal, FINALFUNC = merge_partial_final,
  COMBINEFUNC = partial_merge_combine, SERIALFUNC = partial_merge_serialize,
  DESERIALFUNC = partial_merge_deserialize, PARALLEL = SAFE);
CREATE AGGREGATE fisher_mean(partial_state) (
  SFUNC = partial_merge_accum, STYPE = internal, FINALFUNC = fisher_mean_merge_final,
  COMBINEFUNC = partial_merge_combine, SERIALFUNC = partial_merge_serialize,
  DESERIALFUNC = partial_merge_deserialize, PARALLEL = SAFE);
CREATE AGGREGATE orientation_tensor(partial_state) (
  SFUNC = partial_merge_accum, STYPE = internal, FINALFUNC = orientation_tensor_merge_final,
  COMBINEFUNC = partial_merge_combine, SERIALFUNC = partial_merge_serialize,
  DESERIALFUNC = partial_merge_deserialize, PARALLEL = SAFE);
CREATE AGGREGATE mean_plane(partial_state) (
  SFUNC = partial_merge_accum, STYPE = internal, FINALFUNC = mean_plane_merge_final,
  COMBINEFUNC = partial_merge_combine, SERIALFUNC = partial_merge_serialize,
  DESERIALFUNC = partial_merge_deserialize, PARALLEL = SAFE);
CREATE AGGREGATE fold_axis(partial_state) (
  SFUNC = partial_merge_accum, STYPE = internal, FINALFUNC = fold_axis_merge_final,
  COMBINEFUNC = partial_merge_combine, SERIALFUNC = partial_merge_serialize,
  DESERIALFUNC = partial_merge_deserialize, PARALLEL = SAFE);
CREATE AGGREGATE density_grid(partial_state) (
  SFUNC = partial_merge_accum, STYPE = internal, FINALFUNC = density_grid_merge_final,
  COMBINEFUNC = partial_merge_combine, SERIALFUNC = partial_merge_serialize,
  DESERIALFUNC = partial_merge_deserialize, PARALLEL = SAFE);
CREATE AGGREGATE stress_inversion(partial_state) (
  SFUNC = partial_merge_accum, STYPE = internal, FINALFUNC = stress_inversion_merge_final,
  FINALFUNC_MODIFY = READ_WRITE,
  COMBINEFUNC = partial_merge_combine, SERIALFUNC = partial_merge_serialize,
  DESERIALFUNC = partial_merge_deserialize, PARALLEL = SAFE);
CREATE AGGREGATE right_dihedra(partial_state) (
  SFUNC = partial_merge_accum, STYPE = internal, FINALFUNC = right_dihedra_merge_final,
  COMBINEFUNC = partial_merge_combine, SERIALFUNC = partial_merge_serialize,
  DESERIALFUNC = partial_merge_deserialize, PARALLEL = SAFE);
CREATE AGGREGATE focal_stress_inversion(partial_state) (
  SFUNC = partial_merge_accum, STYPE = internal, FINALFUNC = focal_stress_inversion_merge_final,
  FINALFUNC_MODIFY = READ_WRITE,
  COMBINEFUNC = partial_merge_combine, SERIALFUNC = partial_merge_serialize,
  DESERIALFUNC = partial_merge_deserialize, PARALLEL = SAFE);
CREATE AGGREGATE stress_phases(partial_state) (
  SFUNC = partial_merge_accum, STYPE = internal, FINALFUNC = stress_phases_merge_final,
  FINALFUNC_MODIFY = READ_WRITE,
  COMBINEFUNC = partial_merge_combine, SERIALFUNC = partial_merge_serialize,
  DESERIALFUNC = partial_merge_deserialize, PARALLEL = SAFE);
CREATE AGGREGATE misfit_summary(partial_state) (
  SFUNC = partial_merge_accum, STYPE = internal, FINALFUNC = misfit_summary_merge_final,
  FINALFUNC_MODIFY = READ_WRITE,
  COMBINEFUNC = partial_merge_combine, SERIALFUNC = partial_merge_serialize,
  DESERIALFUNC = partial_merge_deserialize, PARALLEL = SAFE);
CREATE AGGREGATE moment_tensor_sum(partial_state) (
  SFUNC = partial_merge_accum, STYPE = internal, FINALFUNC = moment_tensor_sum_merge_final,
  COMBINEFUNC = partial_merge_combine, SERIALFUNC = partial_merge_serialize,
  DESERIALFUNC = partial_merge_deserialize, PARALLEL = SAFE);

COMMENT ON AGGREGATE merge_partial(partial_state) IS 'the partials of a group merged into one partial of the same kind (to merge in stages); all must come from one partial aggregate with the same parameters (error 22023 otherwise); NULL partials are skipped; NULL when all are NULL';
COMMENT ON AGGREGATE fisher_mean(partial_state) IS 'second phase of fisher_mean: merges the group''s fisher_mean_partial values (all of lineations or all of planes) and returns what fisher_mean returns for their rows; NULL when there is nothing to merge';
COMMENT ON AGGREGATE orientation_tensor(partial_state) IS 'second phase of orientation_tensor: merges orientation_tensor_partial (or mean_plane_partial, fold_axis_partial) values and returns what orientation_tensor returns for their rows';
COMMENT ON AGGREGATE mean_plane(partial_state) IS 'second phase of mean_plane: merges partials of planes (mean_plane_partial, orientation_tensor_partial(plane)) and returns what mean_plane returns for their rows';
COMMENT ON AGGREGATE fold_axis(partial_state) IS 'second phase of fold_axis: merges partials of planes (fold_axis_partial, orientation_tensor_partial(plane)) and returns what fold_axis returns for their rows';
COMMENT ON AGGREGATE density_grid(partial_state) IS 'second phase of density_grid: merges density_grid_partial values of one spacing (integer bin counts: exactly the one-phase result)';
COMMENT ON AGGREGATE stress_inversion(partial_state) IS 'second phase of stress_inversion: merges stress_inversion_partial values (all of the linear form, or all of the bootstrap form with one resamples and seed) and returns what stress_inversion returns for their rows. Results are interpretive; where fault reactivation or induced seismicity matters, defer to site investigation, local codes and licensed professionals';
COMMENT ON AGGREGATE right_dihedra(partial_state) IS 'second phase of right_dihedra: merges right_dihedra_partial values of one spacing (integer counts: exactly the one-phase result). Results are interpretive; where fault reactivation, induced seismicity, or slope or excavation stability matters, defer to site investigation, local codes and licensed professionals';
COMMENT ON AGGREGATE focal_stress_inversion(partial_state) IS 'second phase of focal_stress_inversion: merges focal_stress_inversion_partial values of one form and friction (kept data: exactly the one-phase result, at most 1,000,000 data). Results are interpretive; where fault reactivation or induced seismicity matters, defer to site investigation, local codes and licensed professionals';
COMMENT ON AGGREGATE stress_phases(partial_state) IS 'second phase of stress_phases: merges stress_phases_partial values of one phases, seed and starts (kept data: exactly the one-phase result, at most 1,000,000 data). Results are interpretive; where fault reactivation or induced seismicity matters, defer to site investigation, local codes and licensed professionals';
COMMENT ON AGGREGATE misfit_summary(partial_state) IS 'second phase of misfit_summary: merges misfit_summary_partial values of one threshold (kept misfits: at most 10,000,000). Results are interpretive; where fault reactivation or induced seismicity matters, defer to site investigation, local codes and licensed professionals';
COMMENT ON AGGREGATE moment_tensor_sum(partial_state) IS 'second phase of moment_tensor_sum: merges moment_tensor_sum_partial values, all weighted or all unweighted, and returns what moment_tensor_sum returns for their rows';
