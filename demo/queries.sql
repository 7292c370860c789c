-- Harrow Ridge demo queries (invented scenario, demo/README.md).
\pset footer off
\echo '== Focal mechanisms per site: P/T/B axes and mechanism class'
SELECT site, count(*) AS events,
       string_agg(DISTINCT mechanism_class(mechanism), ', ') AS classes,
       round(avg(plunge(p_axis(mechanism)))::numeric, 1) AS mean_p_plunge,
       round(avg(plunge(t_axis(mechanism)))::numeric, 1) AS mean_t_plunge
  FROM mechanism GROUP BY site ORDER BY site;

\echo '== First events of each site with axes and the auxiliary nodal plane'
SELECT event_id, site, mechanism, auxiliary(mechanism) AS auxiliary,
       p_axis(mechanism) AS p, t_axis(mechanism) AS t, b_axis(mechanism) AS b,
       mechanism_class(mechanism) AS class
  FROM (SELECT *, row_number() OVER (PARTITION BY site ORDER BY event_id) rn FROM mechanism) m
 WHERE rn <= 3 ORDER BY site, event_id;

\echo '== Kagan angle of each event to its site''s reference event (largest first)'
WITH ref AS (SELECT DISTINCT ON (site) site, mechanism AS ref FROM mechanism ORDER BY site, event_id)
SELECT site, round(avg(kagan_angle(mechanism, ref))::numeric, 1) AS mean_kagan,
       round(max(kagan_angle(mechanism, ref))::numeric, 1) AS max_kagan
  FROM mechanism JOIN ref USING (site) GROUP BY site ORDER BY site;

\echo '== Field faults as written and in canonical form'
SELECT site, station, fault_as_written, fault_as_written::fault_slip AS canonical,
       slip_sense(fault_as_written::fault_slip) AS sense
  FROM field_fault ORDER BY site, station;

\copy (SELECT event_id, site, depth_km, mechanism, auxiliary(mechanism) AS auxiliary, p_axis(mechanism) AS p_axis, t_axis(mechanism) AS t_axis, b_axis(mechanism) AS b_axis, mechanism_class(mechanism) AS class FROM mechanism ORDER BY event_id) TO 'demo-out/mechanism_axes.csv' WITH (FORMAT csv, HEADER)
\copy (SELECT site, station, fault_as_written, fault_as_written::fault_slip AS canonical, slip_sense(fault_as_written::fault_slip) AS sense FROM field_fault ORDER BY site, station) TO 'demo-out/field_faults_canonical.csv' WITH (FORMAT csv, HEADER)

\echo '== Bedding per site and unit: cylindrical fold axis, mean bedding, fabric'
SELECT site, unit, count(*) AS n, fold_axis(bedding) AS fold_axis, mean_plane(bedding) AS mean_bedding,
       round((orientation_tensor(bedding)).vollmer_g::numeric, 2) AS girdle_index
  FROM bedding GROUP BY site, unit ORDER BY site, unit;

\echo '== Mean lineation per site and unit with Fisher alpha95 (degrees)'
SELECT site, unit, (f).n, (f).mean, round((f).alpha95::numeric, 1) AS alpha95, round((f).kappa::numeric, 1) AS kappa
  FROM (SELECT site, unit, fisher_mean(lineation) f FROM lineation_obs GROUP BY site, unit) s ORDER BY site, unit;

\echo '== Density maximum of bedding poles per site (5-degree grid, multiples of uniform density)'
SELECT site, grid_max(g) AS densest_pole, round((SELECT max(value) FROM grid_cells(g))::numeric, 2) AS max_mud
  FROM (SELECT site, density_grid(bedding, 5) g FROM bedding GROUP BY site) d ORDER BY site;

\copy (SELECT site, unit, count(*) AS n, fold_axis(bedding) AS fold_axis, mean_plane(bedding) AS mean_bedding FROM bedding GROUP BY site, unit ORDER BY site, unit) TO 'demo-out/fold_axes.csv' WITH (FORMAT csv, HEADER)
\copy (SELECT site, unit, (f).n, (f).mean, (f).alpha95, (f).kappa FROM (SELECT site, unit, fisher_mean(lineation) f FROM lineation_obs GROUP BY site, unit) s ORDER BY site, unit) TO 'demo-out/mean_lineations.csv' WITH (FORMAT csv, HEADER)
\copy (SELECT site, c.trend, c.plunge, c.value FROM (SELECT site, density_grid(bedding, 5) g FROM bedding GROUP BY site) d, grid_cells(g) c ORDER BY site, c.plunge, c.trend) TO 'demo-out/bedding_pole_density.csv' WITH (FORMAT csv, HEADER)

-- ---------------------------------------------------------------------------
-- Paleostress (issue 4): field fault-slip data and focal mechanisms generated
-- from the invented stress states in stress_truth (demo/README.md). Interpretive
-- results: see the caution in demo/README.md.
-- lineation as trend/plunge to 0.1 degree, for display only
CREATE FUNCTION pg_temp.tp(l lineation) RETURNS text LANGUAGE sql IMMUTABLE AS
  $$ SELECT to_char(trend(l), 'FM000.0') || '/' || to_char(plunge(l), 'FM00.0') $$;
CREATE FUNCTION pg_temp.r1(x float8) RETURNS numeric LANGUAGE sql IMMUTABLE AS $$ SELECT round(x::numeric, 1) $$;
CREATE FUNCTION pg_temp.r2(x float8) RETURNS numeric LANGUAGE sql IMMUTABLE AS $$ SELECT round(x::numeric, 2) $$;

\echo '== Invented true stress state per site (the generator''s input)'
SELECT site, pg_temp.tp(sigma1) AS sigma1, pg_temp.tp(sigma2(t)) AS sigma2, pg_temp.tp(sigma3) AS sigma3,
       shape_ratio AS phi, pg_temp.r1(shmax_azimuth(t)) AS shmax, stress_regime(t) AS regime,
       pg_temp.r2(regime_index(t)) AS a_phi
  FROM (SELECT *, stress_tensor(sigma1, sigma3, shape_ratio) t FROM stress_truth) s ORDER BY site;

\echo '== Generator check: misfit of the field faults under the TRUE stress (degrees)'
SELECT site, count(*) FILTER (WHERE planted IS NULL) AS compatible,
       pg_temp.r1(avg(m) FILTER (WHERE planted IS NULL)) AS mean_misfit,
       pg_temp.r1(max(m) FILTER (WHERE planted IS NULL)) AS max_misfit,
       count(*) FILTER (WHERE planted IS NOT NULL) AS planted,
       pg_temp.r1(min(m) FILTER (WHERE planted IS NOT NULL)) AS min_planted_misfit
  FROM (SELECT o.*, misfit(fault, stress_tensor(sigma1, sigma3, shape_ratio)) m
          FROM fault_slip_obs o JOIN stress_truth USING (site)) s
 GROUP BY site ORDER BY site;

\echo '== Generator check: focal mechanisms, listed nodal plane and misfit of the true fault plane under the TRUE stress'
SELECT site, count(*) AS events, count(*) FILTER (WHERE listed_plane = 'auxiliary') AS auxiliary_listed,
       pg_temp.r1(avg(misfit(CASE WHEN listed_plane = 'auxiliary' THEN auxiliary(mechanism) ELSE mechanism END,
                             stress_tensor(sigma1, sigma3, shape_ratio)))) AS mean_misfit_true_plane
  FROM focal_event JOIN stress_truth USING (site) GROUP BY site ORDER BY site;

\set QUIET on
-- Field faults: Michael inversion with 500 bootstrap resamples (fixed seed), over
-- all faults as a field party would first run it.
CREATE TEMP TABLE field_inv AS
  SELECT site, stress_inversion(fault, 500, 20261) AS t FROM fault_slip_obs GROUP BY site;
-- The population mixes two stress phases: separate it into two (hard division,
-- stress_phases), then give each datum its phase and its misfit under that phase.
CREATE TEMP TABLE field_phases AS
  SELECT site, stress_phases(fault, 2, 20261) AS ph FROM fault_slip_obs GROUP BY site;
CREATE TEMP TABLE fault_check AS
  SELECT o.site, o.station, o.fault, o.planted, stress_phase(o.fault, p.ph) AS phase,
         misfit(o.fault, p.ph[stress_phase(o.fault, p.ph)]) AS misfit
    FROM fault_slip_obs o JOIN field_phases p USING (site);
-- Each phase inverted again with bootstrap confidence on its own data.
CREATE TEMP TABLE phase_inv AS
  SELECT site, phase, stress_inversion(fault, 500, 20261) AS t FROM fault_check GROUP BY site, phase;
-- Focal mechanisms: joint inversion (either nodal plane listed, friction searched)
-- with bootstrap confidence (500 resamples, fixed seed).
CREATE TEMP TABLE focal_inv AS
  SELECT site, focal_stress_inversion(mechanism, NULL, 500, 20261) AS t FROM focal_event GROUP BY site;
CREATE TEMP TABLE rd AS
  SELECT site, 'right_dihedra_faults'::text AS method, count(*) AS n, right_dihedra(fault, 5) AS g FROM fault_slip_obs GROUP BY site
  UNION ALL
  SELECT site, 'right_dihedra_focal', count(*), right_dihedra(mechanism, 5) FROM focal_event GROUP BY site;

-- Each method's tensor against the truth it should recover: phase 2 (the smaller
-- phase) against the older stress, everything else against the site's stress.
CREATE TEMP VIEW stress_result AS
  SELECT r.*,
         r.sigma1 <-> CASE WHEN r.method = 'phase_2' THEN s.older_sigma1 ELSE s.sigma1 END AS sigma1_err,
         r.sigma3 <-> CASE WHEN r.method = 'phase_2' THEN s.older_sigma3 ELSE s.sigma3 END AS sigma3_err,
         CASE WHEN r.method = 'phase_2' THEN s.older_shape_ratio ELSE s.shape_ratio END AS true_phi
    FROM (SELECT m.site, m.method, data_count(t) AS n, sigma1(t) AS sigma1, sigma1_confidence(t) AS cone1,
                 sigma3(t) AS sigma3, sigma3_confidence(t) AS cone3, shape_ratio(t) AS phi,
                 (shape_ratio_interval(t))[1] AS phi_lo, (shape_ratio_interval(t))[2] AS phi_hi,
                 shmax_azimuth(t) AS shmax, stress_regime(t) AS regime, regime_index(t) AS a_phi, mean_misfit(t) AS misfit
            FROM (SELECT site, 'field_faults' AS method, t FROM field_inv
                  UNION ALL SELECT site, 'phase_' || phase, t FROM phase_inv
                  UNION ALL SELECT site, 'focal_joint', t FROM focal_inv) m
          UNION ALL
          SELECT site, method, n, grid_max(g), NULL, grid_min(g), NULL, NULL, NULL, NULL, NULL, NULL, NULL, NULL FROM rd) r
    JOIN stress_truth s USING (site);
\set QUIET off

\echo '== Recovered stress per site and method vs the invented truth (degrees; cones are 95 % half-angles)'
\echo '   field_faults: Michael inversion of all field faults, 500 bootstrap resamples; phase_1, phase_2:'
\echo '   stress_phases(fault, 2, seed) separates the two phases, each then inverted with 500 resamples'
\echo '   (phase_2 is compared with the older stress); focal_joint: Vavrycuk joint inversion, 500 resamples;'
\echo '   right_dihedra_*: grid_max / grid_min of a 5-degree right-dihedra grid'
SELECT site, method, n, pg_temp.tp(sigma1) AS sigma1, pg_temp.r1(cone1) AS cone1,
       pg_temp.tp(sigma3) AS sigma3, pg_temp.r1(cone3) AS cone3,
       pg_temp.r2(phi) AS phi, '[' || pg_temp.r2(phi_lo) || ', ' || pg_temp.r2(phi_hi) || ']' AS phi_95,
       pg_temp.r1(shmax) AS shmax, regime, pg_temp.r2(a_phi) AS a_phi, pg_temp.r1(misfit) AS misfit,
       pg_temp.r1(sigma1_err) AS s1_err, pg_temp.r1(sigma3_err) AS s3_err, true_phi
  FROM stress_result ORDER BY site, method;

\echo '== Phase assignment against the answer key per site (phase 1 = the larger phase)'
SELECT site, count(*) AS faults,
       count(*) FILTER (WHERE planted IS NULL AND phase = 1) AS compatible_in_phase_1,
       count(*) FILTER (WHERE planted IS NULL AND phase = 2) AS compatible_in_phase_2,
       count(*) FILTER (WHERE planted = 'older phase' AND phase = 2) AS older_in_phase_2,
       count(*) FILTER (WHERE planted = 'older phase' AND phase = 1) AS older_in_phase_1,
       count(*) FILTER (WHERE planted = 'reversed') AS reversed
  FROM fault_check GROUP BY site ORDER BY site;

\echo '== Misfit summary per site and phase (degrees; above = misfit > 30 under the own phase)'
SELECT site, phase, (s).n, pg_temp.r1((s).mean) AS mean, pg_temp.r1((s).median) AS median, (s).above
  FROM (SELECT site, phase, misfit_summary(o.fault, p.ph[phase], 30) s
          FROM fault_check o JOIN field_phases p USING (site) GROUP BY site, phase) q ORDER BY site, phase;

\echo '== Faults misfitting their own phase by more than 30 degrees, and the answer key'
SELECT site, station, fault, slip_sense(fault) AS sense, phase, pg_temp.r1(misfit) AS misfit,
       coalesce(planted, 'no') AS planted
  FROM fault_check WHERE misfit > 30 ORDER BY site, misfit DESC;

\copy (SELECT site, method, n, round(trend(sigma1)::numeric, 2) AS sigma1_trend, round(plunge(sigma1)::numeric, 2) AS sigma1_plunge, round(cone1::numeric, 2) AS sigma1_cone95, round(trend(sigma3)::numeric, 2) AS sigma3_trend, round(plunge(sigma3)::numeric, 2) AS sigma3_plunge, round(cone3::numeric, 2) AS sigma3_cone95, round(phi::numeric, 3) AS shape_ratio, round(phi_lo::numeric, 3) AS shape_ratio_low, round(phi_hi::numeric, 3) AS shape_ratio_high, round(shmax::numeric, 2) AS shmax_azimuth, regime, round(a_phi::numeric, 3) AS regime_index, round(misfit::numeric, 2) AS mean_misfit, round(sigma1_err::numeric, 2) AS sigma1_angle_to_true, round(sigma3_err::numeric, 2) AS sigma3_angle_to_true, true_phi AS true_shape_ratio FROM stress_result ORDER BY site, method) TO 'demo-out/stress_by_site.csv' WITH (FORMAT csv, HEADER)
\copy (SELECT site, station, fault, slip_sense(fault) AS sense, phase, round(misfit::numeric, 2) AS misfit, planted IS NOT NULL AS planted, planted AS planted_kind FROM fault_check ORDER BY site, station) TO 'demo-out/fault_phases.csv' WITH (FORMAT csv, HEADER)

\echo '== Summed moment tensor of the focal mechanisms per site (unit moments, Kostrov summation): P and T of the sum'
SELECT site, (m).n, pg_temp.tp((m).p_axis) AS p_axis, pg_temp.tp((m).t_axis) AS t_axis, (m).best_double_couple,
       pg_temp.r2((m).epsilon) AS epsilon, pg_temp.r2((m).consistency) AS consistency,
       pg_temp.r1((m).p_axis <-> sigma1) AS p_to_true_sigma1, pg_temp.r1((m).t_axis <-> sigma3) AS t_to_true_sigma3
  FROM (SELECT site, moment_tensor_sum(mechanism) m FROM focal_event GROUP BY site) q JOIN stress_truth USING (site)
 ORDER BY site;

\echo '== Friction coefficient chosen by the joint focal inversion (searched over 0.2..1.0) per site'
SELECT site, friction(t) AS friction, round(mean_misfit(t)::numeric, 1) AS mean_misfit
  FROM focal_inv f ORDER BY site;
