-- Figures: the net_figure type (layers of drawing primitives in direction
-- space), layer builders, composition and SVG rendering of lower-hemisphere
-- nets (equal-area by default, equal-angle on request).

CREATE TYPE net_figure;
CREATE FUNCTION net_figure_in(cstring) RETURNS net_figure
  AS 'MODULE_PATHNAME' LANGUAGE C IMMUTABLE STRICT PARALLEL SAFE;
CREATE FUNCTION net_figure_out(net_figure) RETURNS cstring
  AS 'MODULE_PATHNAME' LANGUAGE C IMMUTABLE STRICT PARALLEL SAFE;
CREATE FUNCTION net_figure_recv(internal) RETURNS net_figure
  AS 'MODULE_PATHNAME' LANGUAGE C IMMUTABLE STRICT PARALLEL SAFE;
CREATE FUNCTION net_figure_send(net_figure) RETURNS bytea
  AS 'MODULE_PATHNAME' LANGUAGE C IMMUTABLE STRICT PARALLEL SAFE;
CREATE TYPE net_figure (
  INPUT = net_figure_in, OUTPUT = net_figure_out, RECEIVE = net_figure_recv, SEND = net_figure_send,
  INTERNALLENGTH = VARIABLE, ALIGNMENT = double, STORAGE = extended);
COMMENT ON TYPE net_figure IS
  'a figure for a lower-hemisphere net: layers of planes, lines, fault-slip data, mechanisms, grids or stress tensors, kept as orientations (not projected); at most 64 layers and 100000 drawn data; render with net_svg';
COMMENT ON FUNCTION net_figure_in(cstring) IS 'text input of net_figure (JSON-shaped, validated)';
COMMENT ON FUNCTION net_figure_out(net_figure) IS 'text output of net_figure';
COMMENT ON FUNCTION net_figure_recv(internal) IS 'binary input of net_figure (validated)';
COMMENT ON FUNCTION net_figure_send(net_figure) IS 'binary output of net_figure';

-- layers built by functions
CREATE FUNCTION net_mechanism(fault_slip) RETURNS net_figure
  AS 'MODULE_PATHNAME' LANGUAGE C IMMUTABLE STRICT PARALLEL SAFE;
COMMENT ON FUNCTION net_mechanism(fault_slip) IS
  'focal-sphere diagram of one mechanism: both nodal planes, quadrants of compressional first motion (containing T) filled, P and T marked';
CREATE FUNCTION net_cone(lineation, float8) RETURNS net_figure
  AS 'MODULE_PATHNAME' LANGUAGE C IMMUTABLE STRICT PARALLEL SAFE;
COMMENT ON FUNCTION net_cone(lineation, float8) IS
  'a cone of the given half-angle (degrees, over 0 and at most 90) about an axis, e.g. a mean with its alpha95 or a counting circle';
CREATE FUNCTION net_stress(stress_tensor) RETURNS net_figure
  AS 'MODULE_PATHNAME' LANGUAGE C IMMUTABLE STRICT PARALLEL SAFE;
COMMENT ON FUNCTION net_stress(stress_tensor) IS
  'the principal stress axes of a tensor, their 95 % confidence cones when it has them, SHmax marked at the primitive; results are interpretive (see README, Cautions)';
CREATE FUNCTION net_contours(grid sphere_grid, levels float8[] DEFAULT NULL, filled boolean DEFAULT true) RETURNS net_figure
  AS 'MODULE_PATHNAME' LANGUAGE C IMMUTABLE PARALLEL SAFE;
COMMENT ON FUNCTION net_contours(sphere_grid, float8[], boolean) IS
  'contours of a density or right-dihedra grid: filled bands (or lines) at the given increasing levels, or at automatic levels when NULL';
CREATE FUNCTION net_label(net_figure, text) RETURNS net_figure
  AS 'MODULE_PATHNAME' LANGUAGE C IMMUTABLE STRICT PARALLEL SAFE;
COMMENT ON FUNCTION net_label(net_figure, text) IS 'the figure with every layer labelled by the text (legend); at most 200 bytes, one line';
CREATE FUNCTION net_figure_concat(net_figure, net_figure) RETURNS net_figure
  AS 'MODULE_PATHNAME' LANGUAGE C IMMUTABLE STRICT PARALLEL SAFE;
COMMENT ON FUNCTION net_figure_concat(net_figure, net_figure) IS 'layers of the first figure, then those of the second';
CREATE OPERATOR || (LEFTARG = net_figure, RIGHTARG = net_figure, FUNCTION = net_figure_concat);
COMMENT ON OPERATOR ||(net_figure, net_figure) IS 'layers of the left figure, then those of the right';

CREATE FUNCTION net_xy(lineation, projection text DEFAULT 'equal-area') RETURNS point
  AS 'MODULE_PATHNAME' LANGUAGE C IMMUTABLE STRICT PARALLEL SAFE;
COMMENT ON FUNCTION net_xy(lineation, text) IS
  'position of a line in the lower-hemisphere net: x east, y north, 1 at the primitive (projection equal-area or equal-angle)';

CREATE FUNCTION net_svg(figure net_figure, projection text DEFAULT 'equal-area', size integer DEFAULT 480,
                        title text DEFAULT '', graticule boolean DEFAULT false, legend boolean DEFAULT true)
  RETURNS text AS 'MODULE_PATHNAME' LANGUAGE C IMMUTABLE STRICT PARALLEL SAFE;
COMMENT ON FUNCTION net_svg(net_figure, text, integer, text, boolean, boolean) IS
  'the figure as a standalone SVG 1.1 document: lower hemisphere, north up; projection equal-area or equal-angle, width 120..4000 px, optional title, 10-degree graticule and legend';

-- layers built by aggregates (each keeps its group''s data: at most 100000 per group)
CREATE FUNCTION net_great_circles_accum(internal, plane) RETURNS internal
  AS 'MODULE_PATHNAME' LANGUAGE C IMMUTABLE PARALLEL SAFE;
CREATE FUNCTION net_poles_accum(internal, plane) RETURNS internal
  AS 'MODULE_PATHNAME' LANGUAGE C IMMUTABLE PARALLEL SAFE;
CREATE FUNCTION net_lines_accum(internal, lineation) RETURNS internal
  AS 'MODULE_PATHNAME' LANGUAGE C IMMUTABLE PARALLEL SAFE;
CREATE FUNCTION net_faults_accum(internal, fault_slip) RETURNS internal
  AS 'MODULE_PATHNAME' LANGUAGE C IMMUTABLE PARALLEL SAFE;
CREATE FUNCTION net_hoeppener_accum(internal, fault_slip) RETURNS internal
  AS 'MODULE_PATHNAME' LANGUAGE C IMMUTABLE PARALLEL SAFE;
CREATE FUNCTION net_pt_axes_accum(internal, fault_slip) RETURNS internal
  AS 'MODULE_PATHNAME' LANGUAGE C IMMUTABLE PARALLEL SAFE;
CREATE FUNCTION net_dihedra_accum(internal, fault_slip) RETURNS internal
  AS 'MODULE_PATHNAME' LANGUAGE C IMMUTABLE PARALLEL SAFE;
CREATE FUNCTION net_layer_combine(internal, internal) RETURNS internal
  AS 'MODULE_PATHNAME' LANGUAGE C IMMUTABLE PARALLEL SAFE;
CREATE FUNCTION net_layer_serialize(internal) RETURNS bytea
  AS 'MODULE_PATHNAME' LANGUAGE C IMMUTABLE STRICT PARALLEL SAFE;
CREATE FUNCTION net_layer_deserialize(bytea, internal) RETURNS internal
  AS 'MODULE_PATHNAME' LANGUAGE C IMMUTABLE STRICT PARALLEL SAFE;
CREATE FUNCTION net_layer_final(internal) RETURNS net_figure
  AS 'MODULE_PATHNAME' LANGUAGE C IMMUTABLE PARALLEL SAFE;
COMMENT ON FUNCTION net_great_circles_accum(internal, plane) IS 'net_great_circles transition';
COMMENT ON FUNCTION net_poles_accum(internal, plane) IS 'net_poles transition';
COMMENT ON FUNCTION net_lines_accum(internal, lineation) IS 'net_lines transition';
COMMENT ON FUNCTION net_faults_accum(internal, fault_slip) IS 'net_faults transition';
COMMENT ON FUNCTION net_hoeppener_accum(internal, fault_slip) IS 'net_hoeppener transition';
COMMENT ON FUNCTION net_pt_axes_accum(internal, fault_slip) IS 'net_pt_axes transition';
COMMENT ON FUNCTION net_dihedra_accum(internal, fault_slip) IS 'net_dihedra transition';
COMMENT ON FUNCTION net_layer_combine(internal, internal) IS 'combine function of the figure layer aggregates';
COMMENT ON FUNCTION net_layer_serialize(internal) IS 'state serialization of the figure layer aggregates';
COMMENT ON FUNCTION net_layer_deserialize(bytea, internal) IS 'state deserialization of the figure layer aggregates (validated)';
COMMENT ON FUNCTION net_layer_final(internal) IS 'final function of the figure layer aggregates (items sorted: independent of row order)';

CREATE AGGREGATE net_great_circles(plane) (
  SFUNC = net_great_circles_accum, STYPE = internal, FINALFUNC = net_layer_final, COMBINEFUNC = net_layer_combine,
  SERIALFUNC = net_layer_serialize, DESERIALFUNC = net_layer_deserialize, PARALLEL = SAFE);
COMMENT ON AGGREGATE net_great_circles(plane) IS 'figure layer: the planes as great circles (legend: n, mean pole with alpha95, eigenvalues, girdle axis)';
CREATE AGGREGATE net_poles(plane) (
  SFUNC = net_poles_accum, STYPE = internal, FINALFUNC = net_layer_final, COMBINEFUNC = net_layer_combine,
  SERIALFUNC = net_layer_serialize, DESERIALFUNC = net_layer_deserialize, PARALLEL = SAFE);
COMMENT ON AGGREGATE net_poles(plane) IS 'figure layer: poles to the planes (legend: n, Fisher mean pole with alpha95, eigenvalues)';
CREATE AGGREGATE net_lines(lineation) (
  SFUNC = net_lines_accum, STYPE = internal, FINALFUNC = net_layer_final, COMBINEFUNC = net_layer_combine,
  SERIALFUNC = net_layer_serialize, DESERIALFUNC = net_layer_deserialize, PARALLEL = SAFE);
COMMENT ON AGGREGATE net_lines(lineation) IS 'figure layer: lineations as points (legend: n, Fisher mean with alpha95, eigenvalues)';
CREATE AGGREGATE net_faults(fault_slip) (
  SFUNC = net_faults_accum, STYPE = internal, FINALFUNC = net_layer_final, COMBINEFUNC = net_layer_combine,
  SERIALFUNC = net_layer_serialize, DESERIALFUNC = net_layer_deserialize, PARALLEL = SAFE);
COMMENT ON AGGREGATE net_faults(fault_slip) IS 'figure layer: each fault as its great circle with an arrow at the striation showing the horizontal direction of hanging-wall slip';
CREATE AGGREGATE net_hoeppener(fault_slip) (
  SFUNC = net_hoeppener_accum, STYPE = internal, FINALFUNC = net_layer_final, COMBINEFUNC = net_layer_combine,
  SERIALFUNC = net_layer_serialize, DESERIALFUNC = net_layer_deserialize, PARALLEL = SAFE);
COMMENT ON AGGREGATE net_hoeppener(fault_slip) IS 'figure layer: each fault as an arrow through its pole in the direction of hanging-wall slip (Hoeppener 1955)';
CREATE AGGREGATE net_pt_axes(fault_slip) (
  SFUNC = net_pt_axes_accum, STYPE = internal, FINALFUNC = net_layer_final, COMBINEFUNC = net_layer_combine,
  SERIALFUNC = net_layer_serialize, DESERIALFUNC = net_layer_deserialize, PARALLEL = SAFE);
COMMENT ON AGGREGATE net_pt_axes(fault_slip) IS 'figure layer: P axes (rings) and T axes (squares) of focal mechanisms';
CREATE AGGREGATE net_dihedra(fault_slip) (
  SFUNC = net_dihedra_accum, STYPE = internal, FINALFUNC = net_layer_final, COMBINEFUNC = net_layer_combine,
  SERIALFUNC = net_layer_serialize, DESERIALFUNC = net_layer_deserialize, PARALLEL = SAFE);
COMMENT ON AGGREGATE net_dihedra(fault_slip) IS
  'figure layer: each datum''s P (compressional) dihedron, translucent, so that the region common to all (where sigma1 can lie, Angelier & Mechler 1977) is darkest';

CREATE FUNCTION net_stack_accum(internal, net_figure) RETURNS internal
  AS 'MODULE_PATHNAME' LANGUAGE C IMMUTABLE PARALLEL SAFE;
CREATE FUNCTION net_stack_combine(internal, internal) RETURNS internal
  AS 'MODULE_PATHNAME' LANGUAGE C IMMUTABLE PARALLEL SAFE;
CREATE FUNCTION net_stack_serialize(internal) RETURNS bytea
  AS 'MODULE_PATHNAME' LANGUAGE C IMMUTABLE STRICT PARALLEL SAFE;
CREATE FUNCTION net_stack_deserialize(bytea, internal) RETURNS internal
  AS 'MODULE_PATHNAME' LANGUAGE C IMMUTABLE STRICT PARALLEL SAFE;
CREATE FUNCTION net_stack_final(internal) RETURNS net_figure
  AS 'MODULE_PATHNAME' LANGUAGE C IMMUTABLE PARALLEL SAFE;
COMMENT ON FUNCTION net_stack_accum(internal, net_figure) IS 'net_stack transition';
COMMENT ON FUNCTION net_stack_combine(internal, internal) IS 'net_stack combine';
COMMENT ON FUNCTION net_stack_serialize(internal) IS 'net_stack state serialization';
COMMENT ON FUNCTION net_stack_deserialize(bytea, internal) IS 'net_stack state deserialization (validated)';
COMMENT ON FUNCTION net_stack_final(internal) IS 'net_stack final function (layers ordered by kind, label, content)';
CREATE AGGREGATE net_stack(net_figure) (
  SFUNC = net_stack_accum, STYPE = internal, FINALFUNC = net_stack_final, COMBINEFUNC = net_stack_combine,
  SERIALFUNC = net_stack_serialize, DESERIALFUNC = net_stack_deserialize, PARALLEL = SAFE);
COMMENT ON AGGREGATE net_stack(net_figure) IS 'all layers of the group''s figures in one figure, ordered by kind, label and content (independent of row order)';
