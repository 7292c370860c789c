-- Two-phase aggregation (src/core/partial.hpp): the partial_state type (text
-- and binary forms, their errors) and the merges X(partial_state) and
-- merge_partial against the one-phase aggregates over the same rows. The
-- reference of every merged value is the one-phase aggregate on the same rows
-- (each checked elsewhere against its published examples and numpy): "exact"
-- compares text at extra_float_digits = 3, i.e. bit for bit (integer counts,
-- and kept data that the final functions sort); the kinds whose states are
-- floating-point sums (fisher_mean, orientation_tensor, mean_plane, fold_axis,
-- stress_inversion, moment_tensor_sum) agree to a relative 1e-9 and 1e-9
-- degree, the bound DESIGN.md sets for serial against parallel runs (the order
-- of the additions differs).
\i sql/include/setup.sql

CREATE SCHEMA part;
-- invented data: 5 cells, each cut across by two regions
CREATE TABLE part.d (i int, cell int, region text, l lineation, p plane, f fault_slip, mw float8);
INSERT INTO part.d
  SELECT i, i % 5, CASE WHEN i % 3 = 0 THEN 'south' ELSE 'north' END,
         lineation((i * 37) % 360, (i * 13) % 90), plane((i * 53) % 360, 10 + (i * 7) % 80),
         fault_slip((i * 29) % 360, 20 + (i * 11) % 60, (i * 47) % 360 - 180), 3 + (i % 20) * 0.1
    FROM generate_series(1, 600) i;
CREATE TEMP TABLE tensor AS SELECT stress_tensor('000/90', '090/00', 0.5) AS t;

-- the first phase, per cell and region (on shards this is what runs remotely)
CREATE TABLE part.p AS
SELECT cell, region,
       fisher_mean_partial(l) AS fisher_l, fisher_mean_partial(p) AS fisher_p,
       orientation_tensor_partial(l) AS tensor_l, orientation_tensor_partial(p) AS tensor_p,
       mean_plane_partial(p) AS mean_p, fold_axis_partial(p) AS fold,
       density_grid_partial(l, 10) AS density_l, density_grid_partial(p, 15) AS density_p,
       stress_inversion_partial(f) AS inv, stress_inversion_partial(f, 20, 7) AS boot,
       right_dihedra_partial(f, 10) AS dihedra,
       focal_stress_inversion_partial(f) AS focal, focal_stress_inversion_partial(f, 0.6) AS focal_mu,
       focal_stress_inversion_partial(f, 0.6, 10, 3) AS focal_boot,
       stress_phases_partial(f, 2, 1) AS phases, stress_phases_partial(f, 2, 1, 5) AS phases_s,
       misfit_summary_partial(f, (SELECT t FROM tensor), 30) AS misfit,
       moment_tensor_sum_partial(f) AS moment, moment_tensor_sum_partial(f, mw) AS moment_w
  FROM part.d GROUP BY cell, region;

-- what each partial says about itself (cell 0, north: 80 rows)
SELECT partial_kind(x), partial_count(x), length(x::text) AS text_length
  FROM part.p, LATERAL (VALUES (fisher_l), (fisher_p), (tensor_l), (tensor_p), (mean_p), (density_l), (density_p),
                               (inv), (boot), (dihedra), (focal), (focal_mu), (focal_boot), (phases), (misfit),
                               (moment), (moment_w)) v(x)
 WHERE cell = 0 AND region = 'north';

-- ---- the second phase equals the one-phase aggregate -----------------------------------
CREATE TEMP TABLE one AS
SELECT cell, fisher_mean(l) AS fisher_l, fisher_mean(p) AS fisher_p, orientation_tensor(l) AS tensor_l,
       orientation_tensor(p) AS tensor_p, mean_plane(p) AS mean_p, fold_axis(p) AS fold,
       density_grid(l, 10) AS density_l, density_grid(p, 15) AS density_p,
       stress_inversion(f) AS inv, stress_inversion(f, 20, 7) AS boot, right_dihedra(f, 10) AS dihedra,
       focal_stress_inversion(f) AS focal, focal_stress_inversion(f, 0.6) AS focal_mu,
       focal_stress_inversion(f, 0.6, 10, 3) AS focal_boot, stress_phases(f, 2, 1) AS phases,
       stress_phases(f, 2, 1, 5) AS phases_s, misfit_summary(f, (SELECT t FROM tensor), 30) AS misfit,
       moment_tensor_sum(f) AS moment, moment_tensor_sum(f, mw) AS moment_w
  FROM part.d GROUP BY cell;
CREATE TEMP TABLE two AS
SELECT cell, fisher_mean(fisher_l) AS fisher_l, fisher_mean(fisher_p) AS fisher_p,
       orientation_tensor(tensor_l) AS tensor_l, orientation_tensor(tensor_p) AS tensor_p,
       mean_plane(mean_p) AS mean_p, fold_axis(fold) AS fold, density_grid(density_l) AS density_l,
       density_grid(density_p) AS density_p, stress_inversion(inv) AS inv, stress_inversion(boot) AS boot,
       right_dihedra(dihedra) AS dihedra, focal_stress_inversion(focal) AS focal,
       focal_stress_inversion(focal_mu) AS focal_mu, focal_stress_inversion(focal_boot) AS focal_boot,
       stress_phases(phases) AS phases, stress_phases(phases_s) AS phases_s, misfit_summary(misfit) AS misfit,
       moment_tensor_sum(moment) AS moment, moment_tensor_sum(moment_w) AS moment_w
  FROM part.p GROUP BY cell;

-- within 1e-9 (relative for numbers, degrees for directions)
CREATE FUNCTION pg_temp.close(a float8, b float8) RETURNS boolean LANGUAGE sql IMMUTABLE AS
  $$ SELECT (a IS NULL AND b IS NULL) OR abs(a - b) <= 1e-9 * greatest(1, abs(a), abs(b)) $$;
CREATE FUNCTION pg_temp.close(a float8[], b float8[]) RETURNS boolean LANGUAGE sql IMMUTABLE AS
  $$ SELECT cardinality(a) = cardinality(b) AND bool_and(pg_temp.close(x, y)) FROM unnest(a, b) u(x, y) $$;
CREATE FUNCTION pg_temp.close(a lineation, b lineation) RETURNS boolean LANGUAGE sql IMMUTABLE AS
  $$ SELECT (a IS NULL AND b IS NULL) OR a <-> b <= 1e-9 $$;
CREATE FUNCTION pg_temp.close(a plane, b plane) RETURNS boolean LANGUAGE sql IMMUTABLE AS
  $$ SELECT (a IS NULL AND b IS NULL) OR a <-> b <= 1e-9 $$;
CREATE FUNCTION pg_temp.close(a stress_tensor, b stress_tensor) RETURNS boolean LANGUAGE sql IMMUTABLE AS
  $$ SELECT pg_temp.close(stress_components(a), stress_components(b)) AND data_count(a) = data_count(b) $$;
CREATE FUNCTION pg_temp.close(a fisher_summary, b fisher_summary) RETURNS boolean LANGUAGE sql IMMUTABLE AS
  $$ SELECT pg_temp.close(a.mean, b.mean) AND a.n = b.n AND pg_temp.close(a.resultant, b.resultant)
        AND pg_temp.close(a.kappa, b.kappa) AND pg_temp.close(a.alpha95, b.alpha95)
        AND pg_temp.close(a.angular_sd, b.angular_sd) $$;
CREATE FUNCTION pg_temp.close(a fabric_summary, b fabric_summary) RETURNS boolean LANGUAGE sql IMMUTABLE AS
  $$ SELECT pg_temp.close(a.e1, b.e1) AND pg_temp.close(a.e2, b.e2) AND pg_temp.close(a.e3, b.e3)
        AND pg_temp.close(ARRAY[a.s1, a.s2, a.s3, a.woodcock_k, a.woodcock_c, a.vollmer_p, a.vollmer_g, a.vollmer_r],
                          ARRAY[b.s1, b.s2, b.s3, b.woodcock_k, b.woodcock_c, b.vollmer_p, b.vollmer_g, b.vollmer_r])
        AND a.n = b.n $$;
CREATE FUNCTION pg_temp.close(a moment_summary, b moment_summary) RETURNS boolean LANGUAGE sql IMMUTABLE AS
  $$ SELECT a.n = b.n AND pg_temp.close(a.tensor, b.tensor) AND pg_temp.close(a.p_axis, b.p_axis)
        AND pg_temp.close(a.b_axis, b.b_axis) AND pg_temp.close(a.t_axis, b.t_axis)
        AND pg_temp.close(fault_plane(a.best_double_couple), fault_plane(b.best_double_couple))
        AND abs(a.epsilon - b.epsilon) <= 1e-9
        AND pg_temp.close(ARRAY[a.scalar_moment, a.moment_sum, a.consistency], ARRAY[b.scalar_moment, b.moment_sum, b.consistency])
        AND pg_temp.close(a.summed, b.summed) AND a.weighted = b.weighted $$;

SET extra_float_digits = 3;
SELECT one.cell,
       pg_temp.close(one.fisher_l, two.fisher_l) AND pg_temp.close(one.fisher_p, two.fisher_p) AS fisher,
       pg_temp.close(one.tensor_l, two.tensor_l) AND pg_temp.close(one.tensor_p, two.tensor_p) AS tensor,
       pg_temp.close(one.mean_p, two.mean_p) AND pg_temp.close(one.fold, two.fold) AS mean_fold,
       pg_temp.close(one.inv, two.inv) AS inversion,
       pg_temp.close(one.moment, two.moment) AND pg_temp.close(one.moment_w, two.moment_w) AS moment,
       one.density_l::text = two.density_l::text AND one.density_p::text = two.density_p::text AS density_exact,
       one.boot::text = two.boot::text AS bootstrap_exact, one.dihedra::text = two.dihedra::text AS dihedra_exact,
       one.focal::text = two.focal::text AND one.focal_mu::text = two.focal_mu::text
         AND one.focal_boot::text = two.focal_boot::text AS focal_exact,
       one.phases::text = two.phases::text AND one.phases_s::text = two.phases_s::text AS phases_exact,
       one.misfit::text = two.misfit::text AS misfit_exact
  FROM one JOIN two USING (cell) ORDER BY cell;
-- none of the compared results is NULL (a NULL on both sides would compare equal)
SELECT count(*) AS groups, count(*) FILTER (WHERE NOT (one IS NOT NULL)) AS with_null FROM one;
RESET extra_float_digits;

-- merging in stages: per region first (merge_partial), then per cell, gives the
-- same as merging all partials of a cell at once
SELECT cell, md5(density_grid(d)::text) = md5((SELECT density_grid(l, 10) FROM part.d x WHERE x.cell = s.cell)::text) AS density_exact,
       pg_temp.close(stress_inversion(inv), (SELECT stress_inversion(f) FROM part.d x WHERE x.cell = s.cell)) AS inversion,
       sum(partial_count(inv)) AS data
  FROM (SELECT cell, merge_partial(density_l) AS d, merge_partial(inv) AS inv
          FROM part.p GROUP BY cell, region) s
 GROUP BY cell ORDER BY cell;
SELECT partial_kind(merge_partial(focal_boot)), partial_count(merge_partial(focal_boot)) FROM part.p;

-- ---- text and binary forms ---------------------------------------------------------------
-- every partial reads back from its text to the same value (same text again)
SELECT count(*) FILTER (WHERE x::text::partial_state::text = x::text) AS round_trips, count(*) AS partials
  FROM part.p, LATERAL (VALUES (fisher_l), (fisher_p), (tensor_l), (tensor_p), (mean_p), (fold), (density_l),
                               (density_p), (inv), (boot), (dihedra), (focal), (focal_mu), (focal_boot), (phases),
                               (phases_s), (misfit), (moment), (moment_w)) v(x);
-- binary form: the 16-byte header (magic "Stag", kind 4 = stress_inversion, input 3 =
-- fault_slip, reserved 0; little-endian, src/core/partial.hpp), then the same
-- serialized state as the text's base64
SELECT encode(substr(partial_state_send(inv), 1, 16), 'hex') AS header,
       substr(partial_state_send(inv), 17) = decode(split_part(inv::text, ':', 2), 'base64') AS state_as_in_text,
       left(inv::text, 40) AS text_start
  FROM part.p WHERE cell = 0 AND region = 'north';

-- malformed text (22P02), each with its reason
CREATE TEMP TABLE good AS SELECT inv::text AS t, split_part(inv::text, ':', 2) AS b64,
                                 decode(split_part(inv::text, ':', 2), 'base64') AS bytes
                            FROM part.p WHERE cell = 0 AND region = 'north';
CREATE FUNCTION pg_temp.b64(b bytea) RETURNS text LANGUAGE sql IMMUTABLE AS
  $$ SELECT translate(encode(b, 'base64'), E'\n', '') $$;
SELECT what, pg_temp.err(format('SELECT %L::partial_state', literal)) AS result FROM good, LATERAL (VALUES
  ('no kind', 'U1NUMQ=='),
  ('no input type', 'stress_inversion:' || b64),
  ('unknown kind', 'stress/fault_slip:' || b64),
  ('unknown input type', 'stress_inversion/fault-slip:' || b64),
  ('no aggregate makes it', 'stress_inversion/plane:' || b64),
  ('empty state', 'stress_inversion/fault_slip:'),
  ('length not a multiple of 4', 'stress_inversion/fault_slip:' || left(b64, -1)),
  ('character outside base64', 'stress_inversion/fault_slip:' || replace(b64, 'A', '*')),
  ('a space', 'stress_inversion/fault_slip:' || overlay(b64 placing ' ' from 9 for 1)),
  ('unused bits not zero', 'stress_inversion/fault_slip:' || left(b64, -2) || 'B='),
  ('truncated state', 'stress_inversion/fault_slip:' || left(b64, -4)),
  ('another kind''s state', 'fisher_mean/lineation:' || b64),
  ('wrong marker', 'stress_inversion/fault_slip:' || pg_temp.b64(set_byte(bytes, 0, 0))),
  ('corrupted count', 'stress_inversion/fault_slip:' || pg_temp.b64(set_byte(bytes, 11, 64))),
  ('non-finite sum', 'stress_inversion/fault_slip:' || pg_temp.b64(overlay(bytes placing '\x000000000000f07f'::bytea from 13)))
) v(what, literal);
-- the same text with its good state is accepted
SELECT t::partial_state::text = t AS accepted FROM good;

-- ---- merge errors (22023) and NULLs ------------------------------------------------------
SELECT q, pg_temp.err(q) FROM (VALUES
  -- a partial of another aggregate
  ('SELECT fisher_mean(inv) FROM part.p'),
  ('SELECT density_grid(dihedra) FROM part.p'),
  ('SELECT mean_plane(tensor_l) FROM part.p'),
  -- partials of different kinds in one group
  ('SELECT stress_inversion(x) FROM (SELECT inv FROM part.p UNION ALL SELECT boot FROM part.p) s(x)'),
  ('SELECT fisher_mean(x) FROM (SELECT fisher_l FROM part.p UNION ALL SELECT fisher_p FROM part.p) s(x)'),
  ('SELECT merge_partial(x) FROM (SELECT density_l FROM part.p UNION ALL SELECT dihedra FROM part.p) s(x)'),
  -- different parameters in one group
  ('SELECT density_grid(x) FROM (SELECT density_l FROM part.p UNION ALL SELECT density_grid_partial(l, 5) FROM part.d) s(x)'),
  ('SELECT right_dihedra(x) FROM (SELECT dihedra FROM part.p UNION ALL SELECT right_dihedra_partial(f, 15) FROM part.d) s(x)'),
  ('SELECT focal_stress_inversion(x) FROM (SELECT focal FROM part.p UNION ALL SELECT focal_mu FROM part.p) s(x)'),
  ('SELECT stress_inversion(x) FROM (SELECT boot FROM part.p UNION ALL SELECT stress_inversion_partial(f, 20, 8) FROM part.d) s(x)'),
  ('SELECT stress_phases(x) FROM (SELECT phases FROM part.p UNION ALL SELECT phases_s FROM part.p) s(x)'),
  ('SELECT misfit_summary(x) FROM (SELECT misfit FROM part.p UNION ALL SELECT misfit_summary_partial(f, t, 45) FROM part.d, tensor) s(x)'),
  ('SELECT moment_tensor_sum(x) FROM (SELECT moment FROM part.p UNION ALL SELECT moment_w FROM part.p) s(x)')
) t(q);
-- NULL partials add nothing; no partial, or only NULL ones, give NULL
SELECT pg_temp.close(stress_inversion(x), (SELECT stress_inversion(f) FROM part.d)) AS nulls_skipped
  FROM (SELECT inv FROM part.p UNION ALL SELECT NULL::partial_state) s(x);
SELECT stress_inversion(x) IS NULL AS all_null, merge_partial(x) IS NULL AS merged_null
  FROM (VALUES (NULL::partial_state), (NULL)) v(x);
SELECT fisher_mean(fisher_l) IS NULL AS no_rows FROM part.p WHERE false;
-- an empty group has no partial; a group of only NULL rows has a partial of no data,
-- which merges as nothing (the one-phase aggregate returns NULL for such a group too)
SELECT stress_inversion_partial(f) IS NULL AS empty_group FROM part.d WHERE false;
WITH s(x) AS (SELECT stress_inversion_partial(NULL::fault_slip) FROM part.d)
SELECT partial_kind(x), partial_count(x), (SELECT stress_inversion(x) IS NULL FROM s) AS merged_null,
       (SELECT partial_count(merge_partial(x)) FROM s) AS merged_count FROM s;
WITH s(x) AS (SELECT density_grid_partial(NULL::plane, 10) FROM part.d)
SELECT partial_count(x), (SELECT density_grid(x) IS NULL FROM s) AS merged_null FROM s;
SELECT (moment_tensor_sum(x)).n FROM (SELECT moment_tensor_sum_partial(NULL::fault_slip) UNION ALL
                                      SELECT moment_w FROM part.p) s(x);

-- ---- parallel merges (Partial and Finalize Aggregate; serialized merge states) --------------
CREATE TABLE part.many AS
  SELECT i % 7 AS k, stress_inversion_partial(f) AS inv, density_grid_partial(l, 10) AS dens,
         stress_inversion_partial(f, 10, 2) AS boot
    FROM part.d GROUP BY i;
ANALYZE part.many;
CREATE TEMP TABLE serial AS
  SELECT k, stress_inversion(inv) AS inv, density_grid(dens)::text AS dens, stress_inversion(boot)::text AS boot,
         merge_partial(dens)::text AS merged
    FROM part.many GROUP BY k;
SET parallel_setup_cost = 0;
SET parallel_tuple_cost = 0;
SET min_parallel_table_scan_size = 0;
SET max_parallel_workers_per_gather = 2;
SET parallel_leader_participation = off;
SET enable_hashagg = off;
EXPLAIN (COSTS OFF) SELECT k, stress_inversion(inv), density_grid(dens) FROM part.many GROUP BY k;
SELECT count(*) AS groups,
       count(*) FILTER (WHERE pg_temp.close(p.inv, s.inv) AND p.dens = s.dens AND p.boot = s.boot
                              AND p.merged = s.merged) AS agree
  FROM (SELECT k, stress_inversion(inv) AS inv, density_grid(dens)::text AS dens,
               stress_inversion(boot)::text AS boot, merge_partial(dens)::text AS merged
          FROM part.many GROUP BY k) p JOIN serial s USING (k);
RESET enable_hashagg;
RESET parallel_setup_cost;
RESET parallel_tuple_cost;
RESET min_parallel_table_scan_size;
RESET max_parallel_workers_per_gather;
RESET parallel_leader_participation;

SET client_min_messages = warning;
DROP SCHEMA part CASCADE;
RESET client_min_messages;
