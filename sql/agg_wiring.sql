-- Aggregate support functions wired to another aggregate's state. Every
-- aggregate state is SQL type internal, so a superuser may build an aggregate
-- from the transition function of one striae aggregate and the final, combine,
-- serialize or deserialize function of another (or of a PostgreSQL aggregate).
-- Each support function checks the kind tag of the state it is handed and
-- raises a class-22 error (22000) naming both kinds; none reads the foreign
-- state. One section per kind of support function; every state kind is handed
-- to a foreign function, and every support function is handed a foreign state.
\i sql/include/setup.sql

CREATE SCHEMA wiring;
CREATE TABLE wiring.d (i int, l lineation, p plane, f fault_slip);
-- invented values, spread over the sphere
INSERT INTO wiring.d
  SELECT i, lineation((i * 37) % 360, (i * 13) % 90), plane((i * 53) % 360, 10 + (i * 7) % 80),
         fault_slip((i * 29) % 360, 20 + (i * 11) % 60, (i * 47) % 360 - 180)
    FROM generate_series(1, 2000) i;  -- enough rows for a parallel plan
-- a partial_state per row, for the merge aggregates over partial_state
ALTER TABLE wiring.d ADD COLUMN pt partial_state;
UPDATE wiring.d d SET pt = s.pt FROM (SELECT i, stress_inversion_partial(f) AS pt FROM wiring.d GROUP BY i) s
 WHERE s.i = d.i;
ANALYZE wiring.d;

-- The state kinds: the aggregate's argument types, the arguments of a call,
-- and the support functions of one aggregate of that kind.
CREATE TEMP TABLE kinds (kind text PRIMARY KEY, args text, call text, sfunc text, combinefunc text,
                         serialfunc text, deserialfunc text, finalfunc text);
INSERT INTO kinds VALUES
  ('fisher', 'lineation', 'l', 'fisher_lineation_accum', 'fisher_combine', 'fisher_serialize', 'fisher_deserialize', 'fisher_final'),
  ('tensor', 'plane', 'p', 'tensor_plane_accum', 'tensor_combine', 'tensor_serialize', 'tensor_deserialize', 'fold_axis_final'),
  ('density', 'lineation, float8', 'l, 10', 'density_lineation_accum', 'density_combine', 'density_serialize', 'density_deserialize', 'density_final'),
  ('stress', 'fault_slip', 'f', 'stress_inversion_accum', 'stress_inversion_combine', 'stress_inversion_serialize', 'stress_inversion_deserialize', 'stress_inversion_final'),
  ('dihedra', 'fault_slip, float8', 'f, 10', 'right_dihedra_accum', 'right_dihedra_combine', 'right_dihedra_serialize', 'right_dihedra_deserialize', 'right_dihedra_final'),
  ('bootstrap', 'fault_slip, integer, bigint', 'f, 5, 1', 'stress_bootstrap_accum', 'stress_keep_combine', 'stress_keep_serialize', 'stress_keep_deserialize', 'stress_bootstrap_final'),
  ('focal', 'fault_slip, float8', 'f, 0.6', 'focal_stress_inversion_friction_accum', 'stress_keep_combine', 'stress_keep_serialize', 'stress_keep_deserialize', 'focal_stress_inversion_final'),
  ('focal_bootstrap', 'fault_slip, float8, integer, bigint', 'f, 0.6, 5, 1', 'focal_bootstrap_accum', 'stress_keep_combine', 'stress_keep_serialize', 'stress_keep_deserialize', 'focal_stress_inversion_final'),
  ('phases', 'fault_slip, integer, bigint', 'f, 2, 1', 'stress_phases_accum', 'stress_phases_combine', 'stress_phases_serialize', 'stress_phases_deserialize', 'stress_phases_final'),
  ('misfit', 'fault_slip, stress_tensor, float8', 'f, stress_tensor(''000/00''::lineation, ''090/00''::lineation, 0.5), 20', 'misfit_summary_accum', 'misfit_summary_combine', 'misfit_summary_serialize', 'misfit_summary_deserialize', 'misfit_summary_final'),
  ('moment', 'fault_slip', 'f', 'moment_tensor_sum_accum', 'moment_tensor_sum_combine', 'moment_tensor_sum_serialize', 'moment_tensor_sum_deserialize', 'moment_tensor_sum_final'),
  ('merge', 'partial_state', 'pt', 'partial_merge_accum', 'partial_merge_combine', 'partial_merge_serialize', 'partial_merge_deserialize', 'stress_inversion_merge_final');

-- Create aggregate wiring.<name> of a kind with one support function replaced
-- (role: finalfunc, combinefunc, serialfunc or deserialfunc), run it over the
-- table (forcing a parallel plan when the role needs one), and show the error.
CREATE FUNCTION pg_temp.wired(name text, k text, role text, fn text) RETURNS text LANGUAGE plpgsql AS $$
DECLARE r kinds;
BEGIN
  SELECT * INTO r FROM kinds WHERE kind = k;
  EXECUTE format('CREATE AGGREGATE wiring.%I(%s) (SFUNC = %s, STYPE = internal, '
                 'COMBINEFUNC = %s, SERIALFUNC = %s, DESERIALFUNC = %s, FINALFUNC = %s, PARALLEL = SAFE)',
                 name, r.args, r.sfunc,
                 CASE role WHEN 'combinefunc' THEN fn ELSE r.combinefunc END,
                 CASE role WHEN 'serialfunc' THEN fn ELSE r.serialfunc END,
                 CASE role WHEN 'deserialfunc' THEN fn ELSE r.deserialfunc END,
                 CASE role WHEN 'finalfunc' THEN fn ELSE r.finalfunc END);
  RETURN pg_temp.err(format('SELECT wiring.%I(%s)::text FROM wiring.d', name, r.call));
END $$;

-- ---- final functions --------------------------------------------------------------
SELECT k AS state, fn AS final_function, pg_temp.wired('final_' || k || '_' || fn, k, 'finalfunc', fn) AS result
  FROM (VALUES ('fisher', 'tensor_final'), ('tensor', 'fisher_final'), ('density', 'mean_plane_final'),
               ('stress', 'density_final'), ('dihedra', 'stress_inversion_final'),
               ('bootstrap', 'focal_stress_inversion_final'), ('focal', 'stress_bootstrap_final'),
               ('focal_bootstrap', 'right_dihedra_final'), ('phases', 'misfit_summary_final'),
               ('misfit', 'moment_tensor_sum_final'), ('moment', 'stress_phases_final'),
               ('merge', 'stress_inversion_final'), ('fisher', 'fisher_mean_merge_final'),
               ('stress', 'merge_partial_final'), ('density', 'partial_final_fault_slip'),
               ('stress', 'partial_final_plane'), ('merge', 'partial_final_fault_slip')) t(k, fn);
-- A state that striae did not make: PostgreSQL's own array_agg state.
CREATE AGGREGATE wiring.foreign_final(plane) (SFUNC = array_agg_transfn, STYPE = internal, FINALFUNC = fold_axis_final);
SELECT pg_temp.err('SELECT wiring.foreign_final(p)::text FROM wiring.d');

-- ---- combine, serialize and deserialize functions (parallel plans) -------------------
SET parallel_setup_cost = 0;
SET parallel_tuple_cost = 0;
SET min_parallel_table_scan_size = 0;
SET max_parallel_workers_per_gather = 2;
SET parallel_leader_participation = off;
-- the plan these aggregates get: the partial states are serialized, then
-- deserialized and combined
CREATE AGGREGATE wiring.plan_check(lineation) (SFUNC = fisher_lineation_accum, STYPE = internal,
  COMBINEFUNC = fisher_combine, SERIALFUNC = fisher_serialize, DESERIALFUNC = fisher_deserialize,
  FINALFUNC = fisher_final, PARALLEL = SAFE);
EXPLAIN (COSTS OFF) SELECT wiring.plan_check(l) FROM wiring.d;
SELECT (wiring.plan_check(l)).n FROM wiring.d;

SELECT k AS state, fn AS combine_function, pg_temp.wired('combine_' || k || '_' || fn, k, 'combinefunc', fn) AS result
  FROM (VALUES ('fisher', 'tensor_combine'), ('tensor', 'density_combine'), ('density', 'stress_inversion_combine'),
               ('stress', 'right_dihedra_combine'), ('dihedra', 'stress_keep_combine'),
               ('bootstrap', 'fisher_combine'), ('focal', 'tensor_combine'),
               ('focal_bootstrap', 'stress_inversion_combine'), ('phases', 'misfit_summary_combine'),
               ('misfit', 'moment_tensor_sum_combine'), ('moment', 'stress_phases_combine'),
               ('merge', 'stress_inversion_combine'), ('stress', 'partial_merge_combine')) t(k, fn);
SELECT k AS state, fn AS serialize_function, pg_temp.wired('serial_' || k || '_' || fn, k, 'serialfunc', fn) AS result
  FROM (VALUES ('fisher', 'tensor_serialize'), ('tensor', 'stress_keep_serialize'), ('density', 'fisher_serialize'),
               ('stress', 'density_serialize'), ('dihedra', 'stress_inversion_serialize'),
               ('bootstrap', 'right_dihedra_serialize'), ('focal', 'tensor_serialize'),
               ('focal_bootstrap', 'fisher_serialize'), ('phases', 'moment_tensor_sum_serialize'),
               ('misfit', 'stress_phases_serialize'), ('moment', 'misfit_summary_serialize'),
               ('merge', 'stress_inversion_serialize'), ('dihedra', 'partial_merge_serialize')) t(k, fn);
-- a deserialize function handed another aggregate's serialized state
SELECT k AS state, fn AS deserialize_function, pg_temp.wired('deserial_' || k || '_' || fn, k, 'deserialfunc', fn) AS result
  FROM (VALUES ('fisher', 'tensor_deserialize'), ('tensor', 'density_deserialize'),
               ('density', 'stress_inversion_deserialize'), ('stress', 'right_dihedra_deserialize'),
               ('dihedra', 'stress_keep_deserialize'), ('focal', 'fisher_deserialize'),
               ('phases', 'misfit_summary_deserialize'), ('misfit', 'moment_tensor_sum_deserialize'),
               ('moment', 'stress_phases_deserialize'), ('merge', 'stress_inversion_deserialize'),
               ('stress', 'partial_merge_deserialize')) t(k, fn);
RESET parallel_setup_cost;
RESET parallel_tuple_cost;
RESET min_parallel_table_scan_size;
RESET max_parallel_workers_per_gather;
RESET parallel_leader_participation;

-- ---- transition functions handed an existing state ------------------------------------
-- A moving-aggregate window keeps one state and calls the forward function
-- (MSFUNC) for rows entering the frame and the inverse (MINVFUNC) for rows
-- leaving it; a transition function of another kind as the inverse is handed
-- the forward function's state when the third row moves the frame.
CREATE FUNCTION pg_temp.moving(name text, args text, call text, fwd text, inv text, final text)
RETURNS text LANGUAGE plpgsql AS $$
BEGIN
  EXECUTE format('CREATE AGGREGATE wiring.%I(%s) (SFUNC = %s, STYPE = internal, FINALFUNC = %s, '
                 'MSFUNC = %s, MINVFUNC = %s, MSTYPE = internal, MFINALFUNC = %s)',
                 name, args, fwd, final, fwd, inv, final);
  RETURN pg_temp.err(format('SELECT (wiring.%I(%s) OVER (ORDER BY i ROWS BETWEEN 1 PRECEDING AND CURRENT ROW))::text '
                            'FROM wiring.d', name, call));
END $$;
-- Transition functions that share an argument list are wired directly; for the
-- others the forward function is another kind's transition function declared
-- (as a superuser can) with the argument list of the one under test: the
-- extra arguments are not read.
DO $$
DECLARE lib text := (SELECT probin FROM pg_proc WHERE oid = 'fisher_final'::regproc);
BEGIN
  EXECUTE format('CREATE FUNCTION wiring.fisher_as_density(internal, lineation, float8) RETURNS internal '
                 'AS %L, %L LANGUAGE C', lib, 'fisher_lineation_accum');
  EXECUTE format('CREATE FUNCTION wiring.tensor_as_density(internal, plane, float8) RETURNS internal '
                 'AS %L, %L LANGUAGE C', lib, 'tensor_plane_accum');
  EXECUTE format('CREATE FUNCTION wiring.stress_as_bootstrap(internal, fault_slip, integer, bigint) RETURNS internal '
                 'AS %L, %L LANGUAGE C', lib, 'stress_inversion_accum');
  EXECUTE format('CREATE FUNCTION wiring.focal_as_focal_bootstrap(internal, fault_slip, float8, integer, bigint) '
                 'RETURNS internal AS %L, %L LANGUAGE C', lib, 'focal_stress_inversion_friction_accum');
  EXECUTE format('CREATE FUNCTION wiring.moment_as_misfit(internal, fault_slip, stress_tensor, float8) '
                 'RETURNS internal AS %L, %L LANGUAGE C', lib, 'moment_tensor_sum_accum');
  EXECUTE format('CREATE FUNCTION wiring.moment_as_merge(internal, partial_state) '
                 'RETURNS internal AS %L, %L LANGUAGE C', lib, 'moment_tensor_sum_accum');
END $$;
SELECT inv AS transition_function, fwd AS state_from, pg_temp.moving('moving_' || n, args, call, fwd, inv, final) AS result
  FROM (VALUES
    (1, 'lineation', 'l', 'tensor_lineation_accum', 'fisher_lineation_accum', 'tensor_final'),
    (2, 'lineation', 'l', 'fisher_lineation_accum', 'tensor_lineation_accum', 'fisher_final'),
    (3, 'plane', 'p', 'tensor_plane_accum', 'fisher_plane_accum', 'mean_plane_final'),
    (4, 'plane', 'p', 'fisher_plane_accum', 'tensor_plane_accum', 'fisher_final'),
    (5, 'fault_slip', 'f', 'focal_stress_inversion_accum', 'stress_inversion_accum', 'focal_stress_inversion_final'),
    (6, 'fault_slip', 'f', 'stress_inversion_accum', 'focal_stress_inversion_accum', 'stress_inversion_final'),
    (7, 'fault_slip, float8', 'f, 0.6', 'focal_stress_inversion_friction_accum', 'right_dihedra_accum', 'focal_stress_inversion_final'),
    (8, 'fault_slip, float8', 'f, 10', 'right_dihedra_accum', 'focal_stress_inversion_friction_accum', 'right_dihedra_final'),
    (9, 'lineation, float8', 'l, 10', 'wiring.fisher_as_density', 'density_lineation_accum', 'fisher_final'),
    (10, 'plane, float8', 'p, 10', 'wiring.tensor_as_density', 'density_plane_accum', 'tensor_final'),
    (11, 'fault_slip, integer, bigint', 'f, 5, 1', 'wiring.stress_as_bootstrap', 'stress_bootstrap_accum', 'stress_inversion_final'),
    (12, 'fault_slip, float8, integer, bigint', 'f, 0.6, 5, 1', 'wiring.focal_as_focal_bootstrap', 'focal_bootstrap_accum',
     'focal_stress_inversion_final'),
    (13, 'fault_slip', 'f', 'stress_inversion_accum', 'moment_tensor_sum_accum', 'stress_inversion_final'),
    (14, 'fault_slip, float8', 'f, 10', 'right_dihedra_accum', 'moment_tensor_sum_weighted_accum', 'right_dihedra_final'),
    (15, 'fault_slip, integer, bigint', 'f, 5, 1', 'stress_bootstrap_accum', 'stress_phases_accum', 'stress_bootstrap_final'),
    (16, 'fault_slip, stress_tensor, float8', 'f, stress_tensor(''000/00''::lineation, ''090/00''::lineation, 0.5), 20',
     'wiring.moment_as_misfit', 'misfit_summary_accum', 'moment_tensor_sum_final'),
    -- the moment state is made from NULL rows, so the partial_state argument is never read as a fault_slip
    (17, 'partial_state', 'NULL::partial_state', 'wiring.moment_as_merge', 'partial_merge_accum', 'moment_tensor_sum_final'),
    (18, 'partial_state', 'pt', 'partial_merge_accum', 'wiring.moment_as_merge', 'stress_inversion_merge_final')) t(n, args, call, fwd, inv, final);

-- The backend is still alive and the real aggregates still work.
SELECT (fisher_mean(l)).n, fold_axis(p) IS NOT NULL AS fold, stress_inversion(f) IS NOT NULL AS stress,
       grid_data_count(right_dihedra(f, 10)) AS dihedra_n
  FROM wiring.d;
SET client_min_messages = warning;
DROP SCHEMA wiring CASCADE;
RESET client_min_messages;
