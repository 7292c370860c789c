-- Loading and showing data (new in 0.2.0): literal checks for screening staging
-- tables, the field-book constructor of fault_slip, fixed-precision display,
-- and JSON forms of stress_tensor and sphere_grid.

-- ---- literal checks: NULL for a valid literal, else the reason (never an error) ----
CREATE FUNCTION plane_input_error(literal text) RETURNS text
  AS 'MODULE_PATHNAME' LANGUAGE C IMMUTABLE STRICT PARALLEL SAFE;
COMMENT ON FUNCTION plane_input_error(text) IS
  'NULL when the text is a valid plane literal (the cast to plane would accept it), else the reason; never raises for bad text';
CREATE FUNCTION lineation_input_error(literal text) RETURNS text
  AS 'MODULE_PATHNAME' LANGUAGE C IMMUTABLE STRICT PARALLEL SAFE;
COMMENT ON FUNCTION lineation_input_error(text) IS
  'NULL when the text is a valid lineation literal, else the reason; never raises for bad text';
CREATE FUNCTION fault_slip_input_error(literal text) RETURNS text
  AS 'MODULE_PATHNAME' LANGUAGE C IMMUTABLE STRICT PARALLEL SAFE;
COMMENT ON FUNCTION fault_slip_input_error(text) IS
  'NULL when the text is a valid fault_slip literal, else the reason; never raises for bad text';
CREATE FUNCTION stress_tensor_input_error(literal text) RETURNS text
  AS 'MODULE_PATHNAME' LANGUAGE C IMMUTABLE STRICT PARALLEL SAFE;
COMMENT ON FUNCTION stress_tensor_input_error(text) IS
  'NULL when the text is a valid stress_tensor literal (syntax, trace 0 and unit norm, ranges), else the reason; never raises for bad text';
CREATE FUNCTION sphere_grid_input_error(literal text) RETURNS text
  AS 'MODULE_PATHNAME' LANGUAGE C IMMUTABLE STRICT PARALLEL SAFE;
COMMENT ON FUNCTION sphere_grid_input_error(text) IS
  'NULL when the text is a valid sphere_grid literal (syntax, spacing, node count, value ranges), else the reason; never raises for bad text';
CREATE FUNCTION slip_sense_input_error(sense text) RETURNS text
  AS 'MODULE_PATHNAME' LANGUAGE C IMMUTABLE STRICT PARALLEL SAFE;
COMMENT ON FUNCTION slip_sense_input_error(text) IS
  'NULL when the text is a slip sense that fault_slip(plane, lineation, sense) and field_fault_slip accept, else the reason';
CREATE FUNCTION input_error(literal text, notation text) RETURNS text
  AS 'MODULE_PATHNAME' LANGUAGE C IMMUTABLE STRICT PARALLEL SAFE;
COMMENT ON FUNCTION input_error(text, text) IS
  'NULL when the text is a valid literal of the notation (plane, lineation, fault_slip, stress_tensor, sphere_grid, slip_sense), else the reason; an unknown notation is an error (22023)';

CREATE FUNCTION input_errors(literals text[], notation text)
  RETURNS TABLE (line bigint, value text, reason text)
  AS 'MODULE_PATHNAME', 'input_errors_array' LANGUAGE C IMMUTABLE STRICT PARALLEL SAFE ROWS 10;
COMMENT ON FUNCTION input_errors(text[], text) IS
  'the elements of the array that are not valid literals of the notation: position (1-based), value and reason; NULL elements are skipped';
CREATE FUNCTION input_errors(staging regclass, column_name name, notation text, line_column name DEFAULT NULL)
  RETURNS TABLE (line bigint, value text, reason text)
  AS 'MODULE_PATHNAME', 'input_errors_table' LANGUAGE C STABLE PARALLEL RESTRICTED ROWS 10;
COMMENT ON FUNCTION input_errors(regclass, name, text, name) IS
  'the rows of a table whose column is not a valid literal of the notation: line (the line_column value, or without it the row''s place in physical order, which is file order right after COPY), value and reason; runs with the caller''s privileges; NULL values are skipped';

-- ---- the field book's four columns ----
CREATE FUNCTION field_fault_slip(strike text, dip text, rake_or_pitch text, sense text) RETURNS fault_slip
  AS 'MODULE_PATHNAME' LANGUAGE C IMMUTABLE STRICT PARALLEL SAFE;
COMMENT ON FUNCTION field_fault_slip(text, text, text, text) IS
  'fault slip from a field book''s columns: strike (azimuth or quadrant bearing), dip (optionally with its dip quadrant, ''64SW''), unsigned rake from the right-hand-rule strike (''75'') or pitch with its strike end (''75W''), and sense (''N'', ''R'', ''D'', ''S'', words, or two); read as the fault_slip text notation';
CREATE FUNCTION field_fault_slip_input_error(strike text, dip text, rake_or_pitch text, sense text) RETURNS text
  AS 'MODULE_PATHNAME' LANGUAGE C IMMUTABLE STRICT PARALLEL SAFE;
COMMENT ON FUNCTION field_fault_slip_input_error(text, text, text, text) IS
  'NULL when field_fault_slip accepts the four columns, else the reason; never raises for bad text';

-- ---- fixed-precision display ----
CREATE FUNCTION to_text(plane, decimals integer DEFAULT 0) RETURNS text
  AS 'MODULE_PATHNAME', 'plane_to_text' LANGUAGE C IMMUTABLE STRICT PARALLEL SAFE;
COMMENT ON FUNCTION to_text(plane, integer) IS
  'plane for display, rounded to decimals (0..10): strike with three integer digits, dip with two (''040/05''); not for storage (the type''s own output is exact)';
CREATE FUNCTION to_text(lineation, decimals integer DEFAULT 0) RETURNS text
  AS 'MODULE_PATHNAME', 'lineation_to_text' LANGUAGE C IMMUTABLE STRICT PARALLEL SAFE;
COMMENT ON FUNCTION to_text(lineation, integer) IS
  'lineation for display, rounded to decimals (0..10): trend with three integer digits, plunge with two (''020/26'')';
CREATE FUNCTION to_text(fault_slip, decimals integer DEFAULT 0) RETURNS text
  AS 'MODULE_PATHNAME', 'fault_slip_to_text' LANGUAGE C IMMUTABLE STRICT PARALLEL SAFE;
COMMENT ON FUNCTION to_text(fault_slip, integer) IS
  'fault_slip for display, rounded to decimals (0..10): ''110/64/-75''';
CREATE FUNCTION to_text(stress_tensor, decimals integer DEFAULT 0) RETURNS text
  AS 'MODULE_PATHNAME', 'stress_tensor_to_text' LANGUAGE C IMMUTABLE STRICT PARALLEL SAFE;
COMMENT ON FUNCTION to_text(stress_tensor, integer) IS
  'stress tensor summary for reports: principal axes rounded to decimals (0..10), Phi with two more decimals, data count and mean misfit when defined';
CREATE FUNCTION to_text(sphere_grid, decimals integer) RETURNS text
  AS 'MODULE_PATHNAME', 'sphere_grid_to_text' LANGUAGE C IMMUTABLE STRICT PARALLEL SAFE;
COMMENT ON FUNCTION to_text(sphere_grid, integer) IS
  'the grid''s text form with values rounded to decimals (0..10); still a valid sphere_grid literal and JSON';

-- ---- JSON: the text forms of stress_tensor and sphere_grid are JSON objects ----
-- to_json/to_jsonb of a row use a type's cast to json when there is one, so
-- these casts make stress_tensor and sphere_grid fields come out as objects.
CREATE FUNCTION stress_tensor_json(stress_tensor) RETURNS json
  LANGUAGE sql IMMUTABLE STRICT PARALLEL SAFE AS 'SELECT $1::pg_catalog.text::pg_catalog.json';
COMMENT ON FUNCTION stress_tensor_json(stress_tensor) IS 'stress_tensor as a JSON object (its text form; cast support)';
CREATE FUNCTION stress_tensor_jsonb(stress_tensor) RETURNS jsonb
  LANGUAGE sql IMMUTABLE STRICT PARALLEL SAFE AS 'SELECT $1::pg_catalog.text::pg_catalog.jsonb';
COMMENT ON FUNCTION stress_tensor_jsonb(stress_tensor) IS 'stress_tensor as a jsonb object (its text form; cast support)';
CREATE FUNCTION sphere_grid_json(sphere_grid) RETURNS json
  LANGUAGE sql IMMUTABLE STRICT PARALLEL SAFE AS 'SELECT $1::pg_catalog.text::pg_catalog.json';
COMMENT ON FUNCTION sphere_grid_json(sphere_grid) IS 'sphere_grid as a JSON object (its text form; cast support)';
CREATE FUNCTION sphere_grid_jsonb(sphere_grid) RETURNS jsonb
  LANGUAGE sql IMMUTABLE STRICT PARALLEL SAFE AS 'SELECT $1::pg_catalog.text::pg_catalog.jsonb';
COMMENT ON FUNCTION sphere_grid_jsonb(sphere_grid) IS 'sphere_grid as a jsonb object (its text form; cast support)';
CREATE CAST (stress_tensor AS json) WITH FUNCTION stress_tensor_json(stress_tensor);
CREATE CAST (stress_tensor AS jsonb) WITH FUNCTION stress_tensor_jsonb(stress_tensor);
CREATE CAST (sphere_grid AS json) WITH FUNCTION sphere_grid_json(sphere_grid);
CREATE CAST (sphere_grid AS jsonb) WITH FUNCTION sphere_grid_jsonb(sphere_grid);
COMMENT ON CAST (stress_tensor AS json) IS 'the text form, a JSON object; to_json and to_jsonb of rows use it';
COMMENT ON CAST (stress_tensor AS jsonb) IS 'the text form, a JSON object';
COMMENT ON CAST (sphere_grid AS json) IS 'the text form, a JSON object; to_json and to_jsonb of rows use it';
COMMENT ON CAST (sphere_grid AS jsonb) IS 'the text form, a JSON object';
