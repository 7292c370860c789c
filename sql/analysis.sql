-- Analysis (issue 12): rotations and back-tilting, wrapping numeric constructors,
-- stress-phase separation, misfit summary, summed moment tensors, error paths and
-- serial vs parallel agreement.
\i sql/include/setup.sql

-- numeric constructors wrap any finite azimuth (and rake); text keeps its ranges
SELECT plane(strike(p) + 10, dip(p)) AS turned, lineation(-10, 30) AS l, plane(-725, 30) AS p2,
       fault_slip(400, 50, 190) AS f, fault_slip('110/64'::plane, -200) AS f2,
       plane_from_dip_direction(-90, 30) AS dd
  FROM (VALUES ('355/40'::plane)) v(p);
-- (text input: out-of-range numbers stay errors; their SQLSTATEs are the parser's)
SELECT q, pg_temp.err(q) <> 'no error' AS rejected FROM (VALUES ('SELECT ''370/30''::plane'), ('SELECT ''-10/30''::lineation'),
  ('SELECT ''10/30/190''::fault_slip')) t(q);
SELECT q, pg_temp.err(q) FROM (VALUES ('SELECT plane(10, 91)'), ('SELECT lineation(''NaN'', 10)'), ('SELECT fault_slip(10, 20, ''Infinity'')'),
  ('SELECT plane(''-Infinity'', 10)')) t(q);

-- rotations: about the downward vertical a positive angle turns north toward east
-- (right-hand rule, derived from Rodrigues' formula); rotate_vertical is exact in degrees
SELECT rotate('010/40'::plane, '000/90'::lineation, 30) AS by_axis, rotate_vertical('010/40'::plane, 30) AS vertical,
       rotate_vertical('350/20'::lineation, 20) AS l, rotate_vertical('110/64/-75'::fault_slip, -120) AS f,
       rotate('090/00'::lineation, 0, 90, 90) AS east_to_south;
-- a directed axis: about north (000/00) by +90, east goes down (derived: (1,0,0) x (0,1,0) = (0,0,1))
SELECT rotate('090/00'::lineation, '000/00'::lineation, 90) AS east_down,
       rotate('090/00'::lineation, 180, 0, 90) AS about_south_up,
       rotate('090/00'::lineation, 0, -90, 90) AS about_up;
-- back-tilting, worked by hand in tests/unit/test_analysis.cpp (Rotation.UntiltWorkedCases):
-- bed 270/30 carries the normal fault 090/60/-90 to the vertical 090/90/-90; bed 000/30
-- carries 180/60/-90 to 0/90/90 (same motion, the other block named hanging wall)
SELECT untilt('090/60/-90'::fault_slip, '270/30') AS restored_1, untilt('180/60/-90'::fault_slip, '000/30') AS restored_2,
       untilt('123/47'::plane, '123/47') AS bed_flat, untilt('123/47'::plane, '123/47', true) AS overturned_flat,
       slip_sense(untilt('090/60/-90'::fault_slip, '270/30')) AS sense;
-- plunging fold (Ramsay 1967, from memory): fold axis 030/20 on a limb containing it
SELECT round(dip(unfold(limb, limb, '030/20'))::numeric, 9) AS limb_dip,
       round(angle(unfold('030/20'::lineation, limb, '030/20'), '030/00')::numeric, 9) AS axis_off
  FROM (SELECT plane_through('030/20', '150/35') limb) s;
-- composition and inverse (random data: the numpy check tests/external/check_rotation_numpy.py)
SELECT round(kagan_angle(rotate(rotate(f, '123/45'::lineation, 70), '123/45'::lineation, -70), f)::numeric, 7) AS back,
       round(kagan_angle(rotate(rotate(f, '123/45'::lineation, 70), '123/45'::lineation, 50),
                         rotate(f, '123/45'::lineation, 120))::numeric, 7) AS composed
  FROM (VALUES ('030/60/40'::fault_slip)) v(f);
SELECT q, pg_temp.err(q) FROM (VALUES ('SELECT rotate(''10/20''::plane, ''0/90''::lineation, ''NaN'')'),
  ('SELECT rotate(''10/20''::plane, 0, 91, 10)'), ('SELECT unfold(''10/20''::plane, ''0/0''::plane, ''030/20'', 10)'),
  ('SELECT unfold(''10/20''::plane, ''0/0''::plane, ''030/20'', 90)')) t(q);

-- synthetic two-phase population (invented): predicted slips of two tensors on
-- pseudo-random planes, rakes perturbed by up to +-6 degrees
CREATE TABLE phase_truth AS
  SELECT 1 AS phase, stress_tensor('090/05', '000/85', 0.4) AS t
  UNION ALL SELECT 2, stress_tensor('020/80', '000/10', 0.5);
CREATE TABLE mixed AS
  SELECT g, CASE WHEN g % 10 < 7 THEN 1 ELSE 2 END AS truth,
         fault_slip(fault_plane(r), rake(r) + 6 * sin(g * 7.77)) AS f
    FROM (SELECT g, resolved_slip(plane((g * 137.508) % 360, 10 + (g * 53.3) % 80),
                                   (SELECT t FROM phase_truth WHERE phase = CASE WHEN g % 10 < 7 THEN 1 ELSE 2 END)) r
            FROM generate_series(1, 200) g) s
   WHERE r IS NOT NULL;
CREATE TABLE phases AS SELECT stress_phases(f, 2, 42) AS ph FROM mixed;
SELECT cardinality(ph) AS k, data_count(ph[1]) + data_count(ph[2]) AS total,
       data_count(ph[1]) >= data_count(ph[2]) AS largest_first,
       round(mean_misfit(ph[1])::numeric, 0) < 10 AS fits_1, round(mean_misfit(ph[2])::numeric, 0) < 10 AS fits_2
  FROM phases;
-- each true stress recovered (axes within 10 degrees) and the share of data assigned right
SELECT t.phase, round(angle(sigma1(t.t), sigma1(p.ph[t.phase]))::numeric, 0) < 10 AS sigma1_close,
       round(angle(sigma3(t.t), sigma3(p.ph[t.phase]))::numeric, 0) < 10 AS sigma3_close
  FROM phase_truth t, phases p ORDER BY t.phase;
SELECT count(*) AS n, count(*) FILTER (WHERE stress_phase(f, ph) = truth) * 100 / count(*) >= 85 AS assigned_85
  FROM mixed, phases;
-- deterministic for a seed, independent of row order; k = 1 is the plain inversion
SELECT (SELECT stress_phases(f, 2, 42) FROM (SELECT f FROM mixed ORDER BY g DESC) s)::text = ph::text AS same,
       round(angle(sigma1((SELECT (stress_phases(f, 1, 7))[1] FROM mixed)), sigma1((SELECT stress_inversion(f) FROM mixed)))::numeric, 9) AS k1_vs_plain
  FROM phases;
SELECT stress_phases(f, 2, 1) IS NULL AS too_few FROM (SELECT f FROM mixed LIMIT 7) s;
SELECT stress_phase('030/60/40', '{}'::stress_tensor[]) IS NULL AS empty_array;
SELECT q, pg_temp.err(q) FROM (VALUES ('SELECT stress_phases(f, 9, 1) FROM mixed'),
  ('SELECT stress_phases(f, 2, 1, 0) FROM mixed'), ('SELECT stress_phases(f, g::int % 2 + 1, 1) FROM mixed'),
  ('SELECT stress_phases(f, NULL, 1) FROM mixed'),
  ('SELECT stress_phase(''030/60/40'', ARRAY[NULL::stress_tensor])')) t(q);

-- misfit summary under each datum's phase tensor; the mean equals avg(misfit)
SELECT (s).n, (s).undefined, round((s).mean::numeric, 9) = round(a::numeric, 9) AS mean_is_avg,
       round((s).median::numeric, 9) = round(m::numeric, 9) AS median_is_percentile, (s).above = c AS above_ok
  FROM (SELECT misfit_summary(f, ph[stress_phase(f, ph)], 5) s, avg(misfit(f, ph[stress_phase(f, ph)])) a,
               percentile_cont(0.5) WITHIN GROUP (ORDER BY misfit(f, ph[stress_phase(f, ph)])) m,
               count(*) FILTER (WHERE misfit(f, ph[stress_phase(f, ph)]) > 5) c
          FROM mixed, phases) q;
-- a plane normal to a principal axis has no misfit: counted as undefined
SELECT (s).n, (s).undefined, (s).mean = m AS mean_is_misfit, (s).median = m AS median_is_misfit,
       (s).above = (m > 30)::int AS above_ok, (s).threshold
  FROM (SELECT misfit_summary(f, stress_tensor('000/90', '090/00', 0.5), 30) s,
               max(misfit(f, stress_tensor('000/90', '090/00', 0.5))) m FROM (VALUES ('000/00/0'::fault_slip), ('045/60/-90'::fault_slip)) v(f)) q;
SELECT q, pg_temp.err(q) FROM (VALUES ('SELECT misfit_summary(f, NULL, 200) FROM mixed'),
  ('SELECT misfit_summary(f, NULL, g) FROM mixed')) t(q);

-- summed moment tensors: identical mechanisms give the mechanism back with epsilon 0;
-- opposite slips on one plane cancel (axes NULL, consistency 0)
SELECT (s).n, (SELECT max(abs(a - b)) FROM unnest((s).tensor, moment_tensor('30/60/40')) x(a, b)) < 1e-14 AS tensor_is_mechanism, (s).best_double_couple,
       (s).epsilon, round((s).consistency::numeric, 12) AS consistency, (s).p_axis <-> p_axis('30/60/40') < 1e-8 AS p_ok
  FROM (SELECT moment_tensor_sum(f) s FROM (VALUES ('30/60/40'::fault_slip), ('30/60/40'), ('30/60/40')) v(f)) q;
SELECT (s).n, (s).tensor IS NULL AS no_tensor, (s).best_double_couple IS NULL AS no_dc,
       round((s).consistency::numeric, 12) AS consistency, (s).moment_sum
  FROM (SELECT moment_tensor_sum(f) s FROM (VALUES ('123/47/35'::fault_slip), ('123/47/-145')) v(f)) q;
-- weighted: Mw 6 is 10^18.1 N m (Hanks & Kanamori 1979, IASPEI form); Kostrov strain rate
-- of one such event in 1e12 m^3 over 1e8 s with 3e10 Pa: M / (2 mu V T) (Kostrov 1974)
SELECT round(log((s).moment_sum)::numeric, 9) AS log_m0, (s).weighted,
       round(((kostrov_strain_rate(s, 1e12, 1e8))[3] / (moment_tensor('0/45/90'))[3] * 2 * 3e10 * 1e12 * 1e8
             / 10 ^ 18.1)::numeric, 9) AS rate_ok
  FROM (SELECT moment_tensor_sum(f, 6.0) s FROM (VALUES ('0/45/90'::fault_slip)) v(f)) q;
-- two thrusts at right angles: a pure CLVD, epsilon 0.5 (Giardini 1984 as recalled)
SELECT (moment_tensor_sum(f)).epsilon FROM (VALUES ('0/45/90'::fault_slip), ('90/45/90')) v(f);
SELECT q, pg_temp.err(q) FROM (VALUES ('SELECT moment_tensor_sum(f, 13) FROM mixed'),
  ('SELECT kostrov_strain_rate(moment_tensor_sum(f), 1e12, 1e8) FROM mixed'),
  ('SELECT kostrov_strain_rate(moment_tensor_sum(f, 5), 0, 1e8) FROM mixed')) t(q);
SELECT moment_tensor_sum(f) IS NULL AS empty FROM mixed WHERE false;

-- right dihedra: a node on a nodal plane counts half (since 0.2.0). Pure thrust 0/45/90:
-- P horizontal E-W, T vertical, B along the strike N-S (derived from Aki & Richards
-- conventions): on the 45-degree grid node 000/00 lies on both nodal planes: 50 %
SELECT trend, plunge, value FROM grid_cells((SELECT right_dihedra(f, 45) FROM (VALUES ('0/45/90'::fault_slip)) v(f)))
 ORDER BY plunge, trend;

-- joint focal inversion: a friction chosen at an end of the searched range is flagged
CREATE TABLE ana_focal AS SELECT focal_stress_inversion(f) AS t, focal_stress_inversion(f, 0.6) AS t6 FROM mixed WHERE truth = 1;
SELECT friction(t) IN (0.2, 1.0) = (t::text LIKE '%friction_at_limit%') AS flag_iff_end,
       t6::text NOT LIKE '%friction_at_limit%' AS fixed_not_flagged, t::text::stress_tensor::text = t::text AS round_trip
  FROM ana_focal;
SELECT '{"components": [0.7071067811865476, -0.7071067811865476, 0, 0, 0, 0], "n": 5, "friction": 1, "flags": ["focal_joint", "friction_at_limit"]}'::stress_tensor;

-- serial vs parallel
CREATE TABLE ana_cat AS SELECT g % 5 AS grp, fault_slip((g * 37.3) % 360, (g * 11.7) % 90, (g * 71.1) % 360 - 180) AS f,
  2 + (g % 40) / 10.0 AS mw FROM generate_series(1, 20000) g;
INSERT INTO ana_cat SELECT 9, f, 4 FROM mixed;
ANALYZE ana_cat;
SET parallel_setup_cost = 0; SET parallel_tuple_cost = 0; SET min_parallel_table_scan_size = 0;
SET max_parallel_workers_per_gather = 2; SET parallel_leader_participation = off;
EXPLAIN (COSTS OFF) SELECT moment_tensor_sum(f, mw), stress_phases(f, 2, 3), misfit_summary(f, stress_tensor('090/05', '000/85', 0.4), 30) FROM ana_cat;
CREATE TABLE ana_par AS SELECT grp, moment_tensor_sum(f, mw) m, moment_tensor_sum(f) u,
  misfit_summary(f, stress_tensor('090/05', '000/85', 0.4), 30) s FROM ana_cat GROUP BY grp;
CREATE TABLE ana_par_ph AS SELECT stress_phases(f, 2, 3) ph FROM ana_cat WHERE grp = 9;
SET max_parallel_workers_per_gather = 0;
CREATE TABLE ana_ser AS SELECT grp, moment_tensor_sum(f, mw) m, moment_tensor_sum(f) u,
  misfit_summary(f, stress_tensor('090/05', '000/85', 0.4), 30) s FROM ana_cat GROUP BY grp;
CREATE TABLE ana_ser_ph AS SELECT stress_phases(f, 2, 3) ph FROM ana_cat WHERE grp = 9;
RESET parallel_leader_participation;
SELECT count(*) AS groups,
       bool_and((SELECT max(abs(a - b)) FROM unnest((s.m).tensor, (p.m).tensor) x(a, b)) < 1e-9) AS weighted_agrees,
       bool_and(abs((s.m).moment_sum / (p.m).moment_sum - 1) < 1e-12) AS moments_agree,
       bool_and((SELECT max(abs(a - b)) FROM unnest((s.u).tensor, (p.u).tensor) x(a, b)) < 1e-9) AS unit_agrees,
       bool_and((s.s).median = (p.s).median AND (s.s).above = (p.s).above AND abs((s.s).mean - (p.s).mean) < 1e-9) AS misfits_agree
  FROM ana_ser s JOIN ana_par p USING (grp);
SELECT s.ph::text = p.ph::text AS phases_identical FROM ana_ser_ph s, ana_par_ph p;

DROP TABLE ana_cat, ana_par, ana_ser, ana_par_ph, ana_ser_ph, ana_focal, mixed, phases, phase_truth;
