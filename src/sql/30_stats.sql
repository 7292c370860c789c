-- Orientation statistics: result types, sphere_grid, and the parallel-safe
-- aggregates fisher_mean, orientation_tensor, mean_plane, fold_axis, density_grid.

CREATE TYPE fisher_summary AS (
  mean lineation, n bigint, resultant float8, kappa float8, alpha95 float8, angular_sd float8);
COMMENT ON TYPE fisher_summary IS
  'Fisher (1953) statistics of axial data: mean axis, count, resultant length R, precision kappa = (N-1)/(N-R), exact alpha95 (degrees), angular standard deviation 81/sqrt(kappa) (degrees); NULL fields are undefined for the group';

CREATE TYPE fabric_summary AS (
  e1 lineation, e2 lineation, e3 lineation, s1 float8, s2 float8, s3 float8,
  woodcock_k float8, woodcock_c float8, vollmer_p float8, vollmer_g float8, vollmer_r float8, n bigint);
COMMENT ON TYPE fabric_summary IS
  'orientation tensor: eigenvectors e1..e3, normalised eigenvalues s1 >= s2 >= s3 (sum 1), Woodcock (1977) K and C, Vollmer (1990) point, girdle and random indices P = s1 - s2, G = 2 (s2 - s3), R = 3 s3 (vollmer_p, vollmer_g, vollmer_r), count';

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
