-- Orientation statistics aggregates: values, NULL/empty/degenerate groups,
-- sphere_grid I/O, and serial vs parallel agreement.
\i sql/include/setup.sql

-- A cluster straddling the horizontal: 000/05 and 180/05 are nearly the same
-- axis, so the mean is near horizontal at trend 0 (derived: axial data).
SELECT mean, n, round(resultant::numeric, 9) AS r, round(kappa::numeric, 6) AS kappa,
       round(alpha95::numeric, 6) AS a95
  FROM (SELECT (fisher_mean(l)).* FROM (VALUES ('000/05'::lineation), ('180/05'), ('000/03'), ('180/02')) t(l)) s;
-- Poles of planes dipping 85 to the east and to the west straddle the horizontal E-W.
SELECT mean, n FROM (SELECT (fisher_mean(p)).* FROM (VALUES ('0/85'::plane), ('180/85'), ('0/88')) t(p)) s;

-- Fisher (1953): R = N for identical data, kappa undefined (infinite), alpha95 = 0;
-- N = 1: only the mean; N = 2 defined (derived from the formulas)
SELECT n, resultant, kappa, alpha95, angular_sd
  FROM (SELECT (fisher_mean(l)).* FROM (VALUES ('120/30'::lineation), ('120/30'), ('120/30')) t(l)) s;
SELECT mean, n, resultant, kappa, alpha95 FROM (SELECT (fisher_mean(l)).* FROM (VALUES ('120/30'::lineation)) t(l)) s;
SELECT n, round(resultant::numeric, 12) AS r, round(kappa::numeric, 6) AS kappa, round(alpha95::numeric, 6) AS a95
  FROM (SELECT (fisher_mean(l)).* FROM (VALUES ('0/0'::lineation), ('10/0')) t(l)) s;
-- empty group, all-NULL group, NULL rows skipped
SELECT fisher_mean(l) IS NULL AS empty FROM (SELECT '1/1'::lineation l WHERE false) t;
SELECT fisher_mean(l) IS NULL AS all_null FROM (VALUES (NULL::lineation), (NULL)) t(l);
SELECT (fisher_mean(l)).n FROM (VALUES ('10/10'::lineation), (NULL), ('12/10')) t(l);

-- orientation tensor: eigenvalues sum to 1; axes of a synthetic girdle (poles of
-- planes sharing the axis 030/20, derived). The eigenvalues against the tensor
-- T = (1/N) sum x x^T of the poles built here: s1 s2 + s1 s3 + s2 s3 is the sum
-- of T's principal 2x2 minors, and with s3 = 0 (a girdle) s1 is the larger root
-- of s^2 - s + minors (characteristic polynomial, textbook linear algebra)
CREATE TABLE fold AS
  SELECT plane_through('030/20'::lineation, l) AS p
    FROM (VALUES ('120/00'::lineation), ('300/50'), ('300/80'), ('120/40'), ('210/70'), ('300/20')) t(l);
WITH t AS (SELECT avg(v[1] * v[1]) xx, avg(v[2] * v[2]) yy, avg(v[3] * v[3]) zz, avg(v[1] * v[2]) xy,
                  avg(v[1] * v[3]) xz, avg(v[2] * v[3]) yz
             FROM (SELECT direction_cosines(pole(p)) v FROM fold) x),
     m AS (SELECT xx * yy - xy^2 + xx * zz - xz^2 + yy * zz - yz^2 AS minors FROM t)
SELECT fold_axis(p) AS axis, round((o.s1 + o.s2 + o.s3)::numeric, 12) AS sum_s,
       round((o.s1 * o.s2 + o.s1 * o.s3 + o.s2 * o.s3 - m.minors)::numeric, 12) AS minors_vs_tensor,
       round((o.s1 - (1 + sqrt(1 - 4 * m.minors)) / 2)::numeric, 9) AS s1_vs_root,
       round(o.s3::numeric, 12) AS s3, o.e3
  FROM fold, LATERAL (SELECT (orientation_tensor(p)).* FROM fold) o, m GROUP BY o.s1, o.s2, o.s3, o.e3, m.minors;
-- a point cluster: Woodcock K > 1 (cluster) and Vollmer point fabric dominant
SELECT round(woodcock_k::numeric, 4) > 1 AS cluster, vollmer_p > vollmer_g AS point_dominant, n
  FROM (SELECT (orientation_tensor(l)).* FROM (VALUES ('10/40'::lineation), ('12/42'), ('8/41'), ('11/37')) t(l)) s;
SELECT mean_plane(p) FROM (VALUES ('110/64'::plane), ('112/62'), ('108/66')) t(p);
-- degenerate cases give NULL by the documented rule
SELECT fold_axis(p) IS NULL AS one_plane FROM (VALUES ('110/64'::plane)) t(p);
SELECT fold_axis(p) IS NULL AS identical_planes FROM (VALUES ('110/64'::plane), ('110/64'), ('290/64S')) t(p);
SELECT mean_plane(p) IS NULL AS empty FROM (SELECT '1/1'::plane p WHERE false) t;
SELECT woodcock_k IS NULL AS k_undefined_for_identical, s1 FROM (SELECT (orientation_tensor(l)).* FROM (VALUES ('5/5'::lineation), ('5/5')) t(l)) s;

-- density grid (Vollmer 1995 exponential weights, multiples of uniform density)
-- a cluster peaked at 040/30 (triangular spread of +-4 degrees; invented test data)
CREATE TABLE lin AS SELECT g AS id, g % 5 AS grp,
  lineation(40 + 4 * ((g * 0.6180339887) % 1 + (g * 0.4142135624) % 1 - 1),
            30 + 4 * ((g * 0.7320508076) % 1 + (g * 0.2360679775) % 1 - 1)) AS l FROM generate_series(1, 2000) g;
SELECT grid_kind(g), grid_spacing(g), grid_data_count(g), grid_max(g) <-> '40/30'::lineation < 3 AS max_near_cluster,
       (SELECT count(*) FROM grid_cells(g)) AS nodes, (SELECT round(max(value)::numeric, 3) FROM grid_cells(g)) > 1 AS peak_above_uniform
  FROM (SELECT density_grid(l, 5) g FROM lin) t;
SELECT q, pg_temp.err(q) FROM (VALUES
  ('SELECT density_grid(l, 7) FROM lin'), ('SELECT density_grid(l, 0.1) FROM lin'),
  ('SELECT density_grid(l, ''NaN'') FROM lin'), ('SELECT density_grid(l, CASE WHEN id < 5 THEN 5 ELSE 10 END) FROM lin'),
  ('SELECT density_grid(l, NULL) FROM lin')) t(q);
SELECT density_grid(l, 10) IS NULL AS empty FROM lin WHERE false;
-- sphere_grid text round trip and input validation
SELECT g::text::sphere_grid::text = g::text AS text_round_trip FROM (SELECT density_grid(l, 15) g FROM lin) t;
-- spacing 45: rings at plunge 0 (4 nodes, axial half ring), 45 (6 nodes) and 90 (1 node)
SELECT grid_max('{"kind": "right_dihedra", "spacing": 45, "n": 3, "values": [0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 100]}'::sphere_grid),
       grid_min('{"kind": "right_dihedra", "spacing": 45, "n": 3, "values": [100, 100, 100, 100, 100, 100, 100, 100, 100, 100, 0]}'::sphere_grid);
SELECT q, pg_temp.err(q) FROM (VALUES
  ('SELECT ''{"kind": "density", "spacing": 45, "n": 3, "values": [1, 2]}''::sphere_grid'),
  ('SELECT ''{"kind": "density", "spacing": 45, "n": 3, "values": [1, 2, 3, 4, 5, 6, 7, 8, 9, 10, 11, 12]}''::sphere_grid'),
  ('SELECT ''{"kind": "right_dihedra", "spacing": 45, "n": 3, "values": [1, 2, 3, 4, 5, 6, 7, 8, 9, 10, 300]}''::sphere_grid'),
  ('SELECT ''{"kind": "density", "spacing": 45, "n": 0, "values": [1, 2, 3]}''::sphere_grid'),
  ('SELECT ''{"kind": "density", "spacing": 7, "n": 3, "values": [1]}''::sphere_grid'),
  ('SELECT ''{"kind": "heat", "spacing": 45, "n": 3, "values": [1, 2, 3]}''::sphere_grid'),
  ('SELECT ''{"kind": "density", "spacing": 45, "n": 3, "values": [1, NaN, 3]}''::sphere_grid'),
  ('SELECT ''nonsense''::sphere_grid')) t(q);

-- serial vs parallel: force a parallel plan on a small table
CREATE TABLE big AS SELECT g % 7 AS grp, lineation((g * 37.3) % 360, (g * 11.7) % 90) AS l,
  plane((g * 13.1) % 360, (g * 7.9) % 90) AS p FROM generate_series(1, 20000) g;
ANALYZE big;
SET parallel_setup_cost = 0; SET parallel_tuple_cost = 0; SET min_parallel_table_scan_size = 0;
SET max_parallel_workers_per_gather = 2; SET parallel_leader_participation = off;
EXPLAIN (COSTS OFF) SELECT fisher_mean(l), orientation_tensor(p), density_grid(l, 10) FROM big;
CREATE TABLE par AS SELECT grp, fisher_mean(l) f, orientation_tensor(p) o, fold_axis(p) fa, density_grid(l, 10) d FROM big GROUP BY grp;
CREATE TABLE par_all AS SELECT fisher_mean(l) f, orientation_tensor(p) o, density_grid(p, 10) d FROM big;
SET max_parallel_workers_per_gather = 0;
CREATE TABLE ser AS SELECT grp, fisher_mean(l) f, orientation_tensor(p) o, fold_axis(p) fa, density_grid(l, 10) d FROM big GROUP BY grp;
CREATE TABLE ser_all AS SELECT fisher_mean(l) f, orientation_tensor(p) o, density_grid(p, 10) d FROM big;
RESET parallel_leader_participation;
SELECT count(*) AS groups,
       max(abs((s.f).resultant - (p.f).resultant)) < 1e-9 AS resultant_agrees,
       max((s.f).mean <-> (p.f).mean) < 1e-9 AS mean_agrees,
       max(abs((s.o).s1 - (p.o).s1) + abs((s.o).s3 - (p.o).s3)) < 1e-9 AS eigen_agrees,
       max(s.fa <-> p.fa) < 1e-9 AS fold_agrees,
       bool_and((SELECT max(abs(a.value - b.value)) FROM grid_cells(s.d) WITH ORDINALITY a(t, pl, value, i)
                 JOIN grid_cells(p.d) WITH ORDINALITY b(t, pl, value, i) USING (i)) < 1e-9) AS density_agrees
  FROM ser s JOIN par p USING (grp);
SELECT abs((s.f).kappa - (p.f).kappa) < 1e-9 * (s.f).kappa AS kappa_agrees,
       (s.o).e1 <-> (p.o).e1 < 1e-9 AS e1_agrees, s.d::text = p.d::text AS density_identical
  FROM ser_all s, par_all p;
