-- Paleostress: stress_tensor I/O and accessors, per-datum quantities, the
-- aggregates stress_inversion, right_dihedra, focal_stress_inversion, error paths,
-- and serial vs parallel agreement.
\i sql/include/setup.sql

-- forward tensor: sigma1 030/20, sigma3 125/15 (orthogonalised), Phi 0.4 (invented axes)
CREATE TABLE stress_truth AS SELECT stress_tensor('030/20', '125/15', 0.4) AS t;
SELECT t::text::stress_tensor::text = t::text AS text_round_trip,
       round(angle(sigma1(t), '030/20')::numeric, 9) AS s1_off,
       round(shape_ratio(t)::numeric, 12) AS phi, data_count(t),
       mean_misfit(t) IS NULL AS no_misfit, sigma1_confidence(t) IS NULL AS no_cone,
       shape_ratio_interval(t) IS NULL AS no_interval
  FROM stress_truth;
-- trace 0 and unit norm (stress.hpp convention)
SELECT round((c[1] + c[2] + c[3])::numeric, 12) AS trace,
       round((c[1]^2 + c[2]^2 + c[3]^2 + 2 * (c[4]^2 + c[5]^2 + c[6]^2))::numeric, 12) AS norm2
  FROM (SELECT stress_components(t) c FROM stress_truth) s;
-- orthogonal principal axes (derived)
SELECT round(angle(sigma1(t), sigma2(t))::numeric, 6) AS a12, round(angle(sigma2(t), sigma3(t))::numeric, 6) AS a23
  FROM stress_truth;
-- Andersonian end members (derived from Zoback 1992 classes and Simpson 1997 A-phi):
-- vertical sigma1 = extension, A = Phi; vertical sigma3 = compression, A = 2 + Phi;
-- vertical sigma2 = strike-slip, A = 2 - Phi; SHmax along horizontal sigma1
SELECT stress_regime(t) AS regime, round(regime_index(t)::numeric, 9) AS a_phi,
       round(shmax_azimuth(t)::numeric, 9) AS shmax
  FROM (VALUES (stress_tensor('000/90', '090/00', 0.3)), (stress_tensor('040/00', '130/90', 0.3)),
               (stress_tensor('040/00', '130/00', 0.3))) v(t);
-- isotropic horizontal stress: vertical sigma1 with Phi = 0 has no SHmax (stress.hpp)
SELECT shmax_azimuth(stress_tensor('000/90', '090/00', 0)) IS NULL AS shmax_undefined;

-- per-datum: the predicted slip fits its own tensor (Wallace 1951, Bott 1959: misfit 0)
SELECT round(misfit(resolved_slip('070/55', t), t)::numeric, 6) AS self_misfit FROM stress_truth;
-- tendencies on general planes (sigma2 matters: Phi 0.4), against the definitions
-- evaluated here from the direction cosines l1..l3 of the pole on the principal axes:
-- Ts = |tau|/sn (Morris et al. 1996) with magnitudes 1, k + Phi (1 - k), k,
-- k = 1/(mu + sqrt(mu^2 + 1))^2, divided by its maximum mu (README, Paleostress);
-- Td = (s1 - sn)/(s1 - s3) with magnitudes 1, Phi, 0 (Ferrill et al. 1999)
WITH c AS (
  SELECT p, mu, t, (SELECT sum(a * b) FROM unnest(direction_cosines(pole(p)), direction_cosines(sigma1(t))) x(a, b)) l1,
         (SELECT sum(a * b) FROM unnest(direction_cosines(pole(p)), direction_cosines(sigma2(t))) x(a, b)) l2,
         (SELECT sum(a * b) FROM unnest(direction_cosines(pole(p)), direction_cosines(sigma3(t))) x(a, b)) l3,
         1 / (mu + sqrt(mu * mu + 1))^2 AS k
    FROM stress_truth, (VALUES ('070/55'::plane), ('200/10'), ('315/80'), ('010/45')) v(p), (VALUES (0.6), (0.85)) f(mu)),
m AS (SELECT *, l1^2 + (k + 0.4 * (1 - k)) * l2^2 + k * l3^2 AS sn,
             l1^2 + (k + 0.4 * (1 - k))^2 * l2^2 + k^2 * l3^2 AS tt FROM c)
SELECT p, mu, round(slip_tendency(p, t, mu)::numeric, 6) AS ts,
       round((slip_tendency(p, t, mu) - sqrt(tt - sn^2) / sn / mu)::numeric, 9) AS ts_minus_morris,
       round(dilation_tendency(p, t)::numeric, 6) AS td,
       round((dilation_tendency(p, t) - (1 - (l1^2 + 0.4 * l2^2)))::numeric, 9) AS td_minus_ferrill
  FROM m ORDER BY p, mu;
-- a plane normal to sigma3: Td = 1, Ts = 0 (Ferrill et al. 1999; Morris et al. 1996; derived)
SELECT round(dilation_tendency(plane_from_pole('000/00'), t)::numeric, 9) AS td,
       round(slip_tendency(plane_from_pole('000/00'), t)::numeric, 9) AS ts,
       resolved_slip(plane_from_pole('000/00'), t) IS NULL AS no_shear
  FROM (SELECT stress_tensor('090/00', '000/00', 0.5) t) s;

-- synthetic noise-free data: predicted slip on 400 planes spread by irrational steps
CREATE TABLE stress_slips AS
  SELECT g, g % 4 AS grp, resolved_slip(plane((g * 47.3) % 360, 5 + (g * 17.9) % 85), t) AS fs
    FROM stress_truth, generate_series(1, 400) g;
SELECT count(*) AS n, count(fs) AS defined FROM stress_slips;
-- Michael (1984) recovers the axes within a few degrees; the |tau| = 1 assumption
-- biases error-free data on random planes by up to ~3 degrees and Phi by up to
-- ~0.12 (stress.hpp, accuracy note from the unit tests)
SELECT data_count(s), angle(sigma1(s), '030/20') < 4 AS s1_near, angle(sigma3(s), sigma3(t)) < 4 AS s3_near,
       abs(shape_ratio(s) - 0.4) < 0.12 AS phi_near, mean_misfit(s) IS NULL AS streaming_has_no_misfit,
       stress_regime(s) = stress_regime(t) AS same_regime
  FROM (SELECT stress_inversion(fs) s FROM stress_slips) a, stress_truth;
-- bootstrap (Michael 1987): exact mean misfit small, cones and interval defined and contain the stress_truth
SELECT data_count(s), mean_misfit(s) < 5 AS misfit_small,
       sigma1_confidence(s) > 0 AND sigma1_confidence(s) < 10 AS cone1_ok,
       sigma3_confidence(s) > 0 AND sigma3_confidence(s) < 10 AS cone3_ok,
       (shape_ratio_interval(s))[1] <= shape_ratio(s) AND shape_ratio(s) <= (shape_ratio_interval(s))[2] AS phi_inside,
       s::text::stress_tensor::text = s::text AS text_round_trip
  FROM (SELECT stress_inversion(fs, 200, 42) s FROM stress_slips) a;
-- same seed, same answer; row order does not matter (data sorted before resampling)
SELECT (SELECT stress_inversion(fs, 50, 1)::text FROM stress_slips) =
       (SELECT stress_inversion(fs, 50, 1 ORDER BY g DESC)::text FROM stress_slips) AS order_free;
-- right dihedra (Angelier & Mechler 1977): maximum near sigma1, minimum near sigma3
SELECT grid_kind(g), grid_data_count(g), angle(grid_max(g), '030/20') < 5 AS max_near_s1,
       angle(grid_min(g), sigma3(t)) < 5 AS min_near_s3
  FROM (SELECT right_dihedra(fs, 5) g FROM stress_slips) a, stress_truth;
-- joint focal inversion (Vavrycuk 2014): given as auxiliary planes, the axes are still found
SELECT data_count(s), angle(sigma1(s), '030/20') < 10 AS s1_near, angle(sigma3(s), sigma3(t)) < 10 AS s3_near,
       mean_misfit(s) IS NOT NULL AS has_misfit, s::text LIKE '%focal_joint%' AS flagged
  FROM (SELECT focal_stress_inversion(auxiliary(fs), 0.6) s FROM stress_slips) a, stress_truth;
SELECT angle(sigma1(s), '030/20') < 10 AS s1_near, friction(s) BETWEEN 0.2 AND 1.0 AS searched_friction_in_range,
       s::text::stress_tensor::text = s::text AS text_round_trip
  FROM (SELECT focal_stress_inversion(fs) s FROM stress_slips) a;
-- focal inversion with bootstrap confidence: same best tensor as without, cones and
-- a Phi interval that resampling opened (not zero) and noise-free data keep small,
-- reproducible for a seed, friction searched when NULL (the kept set itself is
-- pinned in tests/unit/test_bootstrap.cpp, FocalBootstrap)
SELECT sigma1_confidence(b) > 0 AND sigma1_confidence(b) < 10 AS cone1_ok,
       sigma3_confidence(b) > 0 AND sigma3_confidence(b) < 10 AS cone3_ok,
       (shape_ratio_interval(b))[1] < (shape_ratio_interval(b))[2] AS interval_open,
       stress_components(b) = stress_components(p) AS same_best_tensor, friction(b) = friction(p) AS same_friction,
       b::text = r::text AS reproducible
  FROM (SELECT focal_stress_inversion(fs, NULL, 30, 5) b, focal_stress_inversion(fs, NULL, 30, 5) r,
               focal_stress_inversion(fs) p FROM stress_slips WHERE g <= 120) x;
SELECT friction(focal_stress_inversion(fs, 0.6, 20, 1)) AS fixed_friction FROM stress_slips WHERE g <= 120;
-- the friction a joint inversion used is reported; other tensors have none
SELECT friction(focal_stress_inversion(fs, 0.6)) AS given_friction, friction(stress_inversion(fs)) IS NULL AS linear_has_none
  FROM stress_slips;
SELECT friction('{"components": [0.7071067811865476, -0.7071067811865476, 0, 0, 0, 0], "n": 5, "friction": 0.4, "flags": ["focal_joint"]}'::stress_tensor);

-- NULL results: empty group, too few data (fewer than 4), parallel faults (degenerate)
SELECT stress_inversion(fs) IS NULL AS empty FROM stress_slips WHERE false;
SELECT stress_inversion(fs) IS NULL AS too_few, stress_inversion(fs, 10, 1) IS NULL AS too_few_boot,
       focal_stress_inversion(fs) IS NULL AS too_few_focal FROM stress_slips WHERE g <= 3;
SELECT stress_inversion(f) IS NULL AS parallel_faults
  FROM (VALUES ('030/60/10'::fault_slip), ('030/60/10'), ('030/60/10'), ('030/60/10'), ('030/60/10')) v(f);
SELECT right_dihedra(fs, 10) IS NULL AS empty FROM stress_slips WHERE false;
-- right_dihedra counts rows in blocks of 64 (kernels.hpp); a running (window)
-- aggregate calls the final function mid-stream, which counts the pending block,
-- and the state goes on: the grid at row k must be the grid of rows 1..k
-- (derived), across block boundaries (63, 64, 65, 128).
CREATE TEMP TABLE rd_run AS
  SELECT i, fault_slip((i * 37) % 360, 10 + (i * 13) % 80, (i * 53) % 360 - 180) AS f FROM generate_series(1, 150) i;
SELECT k, grid_data_count(r) AS n, r::text = (SELECT right_dihedra(f, 5) FROM rd_run WHERE i <= k)::text AS same
  FROM (SELECT i AS k, right_dihedra(f, 5) OVER (ORDER BY i) AS r FROM rd_run) w
 WHERE k IN (1, 63, 64, 65, 128, 150) ORDER BY k;
SELECT stress_inversion(f) IS NULL AS all_null FROM (VALUES (NULL::fault_slip), (NULL)) v(f);

-- error paths
SELECT q, pg_temp.err(q) FROM (VALUES
  ('SELECT ''nonsense''::stress_tensor'),
  ('SELECT ''{"components": [1, 0, 0, 0, 0, 0], "n": 1}''::stress_tensor'),
  ('SELECT ''{"components": [0.5, -0.5, 0, 0.5, 0], "n": 1}''::stress_tensor'),
  ('SELECT ''{"n": 1}''::stress_tensor'),
  ('SELECT ''{"components": [0.7071067811865476, -0.7071067811865476, 0, 0, 0, 0], "n": 1, "cones": [95, 1, 1]}''::stress_tensor'),
  ('SELECT ''{"components": [0.7071067811865476, -0.7071067811865476, 0, 0, 0, 0], "n": 1, "colour": 1}''::stress_tensor'),
  ('SELECT stress_tensor(''000/10'', ''090/00'', ''NaN'')'),
  ('SELECT stress_tensor(''000/10'', ''090/00'', 1.5)'),
  ('SELECT stress_tensor(''000/10'', ''000/10'', 0.5)'),
  ('SELECT slip_tendency(''0/45'', stress_tensor(''000/10'', ''090/00'', 0.5), 0)'),
  ('SELECT right_dihedra(fs, 7) FROM stress_slips'),
  ('SELECT right_dihedra(fs, NULL) FROM stress_slips'),
  ('SELECT right_dihedra(fs, CASE WHEN g < 5 THEN 5 ELSE 10 END) FROM stress_slips'),
  ('SELECT stress_inversion(fs, 0, 1) FROM stress_slips'),
  ('SELECT stress_inversion(fs, CASE WHEN g < 5 THEN 5 ELSE 10 END, 1) FROM stress_slips'),
  ('SELECT focal_stress_inversion(fs, 9) FROM stress_slips'),
  ('SELECT focal_stress_inversion(fs, 0.6, 0, 1) FROM stress_slips'),
  ('SELECT focal_stress_inversion(fs, 0.6, NULL, 1) FROM stress_slips'),
  ('SELECT ''{"components": [0.7071067811865476, -0.7071067811865476, 0, 0, 0, 0], "n": 5, "friction": 9}''::stress_tensor'),
  ('SELECT ''{"components": [0.7071067811865476, -0.7071067811865476, 0, 0, 0, 0], "n": 5, "friction": 0.5, "friction": 0.5}''::stress_tensor')) t(q);
-- a hand-typed tensor that passes validation
SELECT '{"components": [0.7071067811865476, -0.7071067811865476, 0, 0, 0, 0], "n": 3, "misfit": 2.5, "flags": ["focal_joint"]}'::stress_tensor;

-- serial vs parallel: force a parallel plan on a small table
CREATE TABLE stress_big AS SELECT g % 3 AS grp, resolved_slip(plane((g * 13.1) % 360, 3 + (g * 7.9) % 86), t) AS fs
  FROM stress_truth, generate_series(1, 6000) g;
ANALYZE stress_big;
SET parallel_setup_cost = 0; SET parallel_tuple_cost = 0; SET min_parallel_table_scan_size = 0;
SET max_parallel_workers_per_gather = 2; SET parallel_leader_participation = off;
EXPLAIN (COSTS OFF) SELECT stress_inversion(fs), right_dihedra(fs, 10), stress_inversion(fs, 20, 3) FROM stress_big;
CREATE TABLE stress_par AS SELECT grp, stress_inversion(fs) s, right_dihedra(fs, 10) d, stress_inversion(fs, 20, 3) b FROM stress_big GROUP BY grp;
SET max_parallel_workers_per_gather = 0;
CREATE TABLE stress_ser AS SELECT grp, stress_inversion(fs) s, right_dihedra(fs, 10) d, stress_inversion(fs, 20, 3) b FROM stress_big GROUP BY grp;
RESET parallel_leader_participation;
RESET max_parallel_workers_per_gather;
SELECT count(*) AS groups,
       max(angle(sigma1(s.s), sigma1(p.s))) < 1e-6 AS linear_agrees,
       bool_and(s.d::text = p.d::text) AS dihedra_identical,
       bool_and(s.b::text = p.b::text) AS bootstrap_identical
  FROM stress_ser s JOIN stress_par p USING (grp);
DROP TABLE stress_truth, stress_slips, stress_big, stress_par, stress_ser;
