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
       round((orientation_tensor(bedding)).girdle::numeric, 2) AS girdle_index
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
-- Misfit of each fault under its site's inverted tensor; > 30 degrees is flagged.
CREATE TEMP TABLE fault_check AS
  SELECT o.site, o.station, o.fault, o.planted, misfit(o.fault, i.t) AS misfit,
         coalesce(misfit(o.fault, i.t) > 30, false) AS flagged
    FROM fault_slip_obs o JOIN field_inv i USING (site);
-- The same inversion without the flagged faults.
CREATE TEMP TABLE clean_inv AS
  SELECT site, stress_inversion(fault, 500, 20261) AS t FROM fault_check WHERE NOT flagged GROUP BY site;
-- Focal mechanisms: joint inversion (either nodal plane listed, friction searched)
-- with bootstrap confidence (500 resamples, fixed seed).
CREATE TEMP TABLE focal_inv AS
  SELECT site, focal_stress_inversion(mechanism, NULL, 500, 20261) AS t FROM focal_event GROUP BY site;
CREATE TEMP TABLE rd AS
  SELECT site, 'right_dihedra_faults'::text AS method, count(*) AS n, right_dihedra(fault, 5) AS g FROM fault_slip_obs GROUP BY site
  UNION ALL
  SELECT site, 'right_dihedra_focal', count(*), right_dihedra(mechanism, 5) FROM focal_event GROUP BY site;

CREATE TEMP VIEW stress_result AS
  SELECT r.*, r.sigma1 <-> s.sigma1 AS sigma1_err, r.sigma3 <-> s.sigma3 AS sigma3_err, s.shape_ratio AS true_phi
    FROM (SELECT m.site, m.method, data_count(t) AS n, sigma1(t) AS sigma1, sigma1_confidence(t) AS cone1,
                 sigma3(t) AS sigma3, sigma3_confidence(t) AS cone3, shape_ratio(t) AS phi,
                 (shape_ratio_interval(t))[1] AS phi_lo, (shape_ratio_interval(t))[2] AS phi_hi,
                 shmax_azimuth(t) AS shmax, stress_regime(t) AS regime, regime_index(t) AS a_phi, mean_misfit(t) AS misfit
            FROM (SELECT site, 1 AS o, 'field_faults' AS method, t FROM field_inv
                  UNION ALL SELECT site, 2, 'field_faults_unflagged', t FROM clean_inv
                  UNION ALL SELECT site, 3, 'focal_joint', t FROM focal_inv) m
          UNION ALL
          SELECT site, method, n, grid_max(g), NULL, grid_min(g), NULL, NULL, NULL, NULL, NULL, NULL, NULL, NULL FROM rd) r
    JOIN stress_truth s USING (site);
\set QUIET off

\echo '== Recovered stress per site and method vs the invented truth (degrees; cones are 95 % half-angles)'
\echo '   field_faults: Michael inversion, 500 bootstrap resamples; field_faults_unflagged: the same without'
\echo '   faults misfitting > 30 deg; focal_joint: Vavrycuk joint inversion, 500 bootstrap resamples;'
\echo '   right_dihedra_*: grid_max / grid_min of a 5-degree right-dihedra grid'
SELECT site, method, n, pg_temp.tp(sigma1) AS sigma1, pg_temp.r1(cone1) AS cone1,
       pg_temp.tp(sigma3) AS sigma3, pg_temp.r1(cone3) AS cone3,
       pg_temp.r2(phi) AS phi, '[' || pg_temp.r2(phi_lo) || ', ' || pg_temp.r2(phi_hi) || ']' AS phi_95,
       pg_temp.r1(shmax) AS shmax, regime, pg_temp.r2(a_phi) AS a_phi, pg_temp.r1(misfit) AS misfit,
       pg_temp.r1(sigma1_err) AS s1_err, pg_temp.r1(sigma3_err) AS s3_err, true_phi
  FROM stress_result ORDER BY site, method;

\echo '== Faults flagged incompatible (misfit > 30 deg under the site''s field inversion) and the answer key'
SELECT site, station, fault, slip_sense(fault) AS sense, pg_temp.r1(misfit) AS misfit,
       coalesce(planted, 'no') AS planted
  FROM fault_check WHERE flagged ORDER BY site, misfit DESC;

\echo '== Flagging against the answer key per site'
SELECT site, count(*) AS faults, count(*) FILTER (WHERE planted IS NOT NULL) AS planted,
       count(*) FILTER (WHERE flagged) AS flagged,
       count(*) FILTER (WHERE flagged AND planted IS NOT NULL) AS planted_flagged,
       count(*) FILTER (WHERE NOT flagged AND planted IS NOT NULL) AS planted_missed,
       count(*) FILTER (WHERE flagged AND planted IS NULL) AS false_alarms
  FROM fault_check GROUP BY site ORDER BY site;

\copy (SELECT site, method, n, round(trend(sigma1)::numeric, 2) AS sigma1_trend, round(plunge(sigma1)::numeric, 2) AS sigma1_plunge, round(cone1::numeric, 2) AS sigma1_cone95, round(trend(sigma3)::numeric, 2) AS sigma3_trend, round(plunge(sigma3)::numeric, 2) AS sigma3_plunge, round(cone3::numeric, 2) AS sigma3_cone95, round(phi::numeric, 3) AS shape_ratio, round(phi_lo::numeric, 3) AS shape_ratio_low, round(phi_hi::numeric, 3) AS shape_ratio_high, round(shmax::numeric, 2) AS shmax_azimuth, regime, round(a_phi::numeric, 3) AS regime_index, round(misfit::numeric, 2) AS mean_misfit, round(sigma1_err::numeric, 2) AS sigma1_angle_to_true, round(sigma3_err::numeric, 2) AS sigma3_angle_to_true, true_phi AS true_shape_ratio FROM stress_result ORDER BY site, method) TO 'demo-out/stress_by_site.csv' WITH (FORMAT csv, HEADER)
\copy (SELECT site, station, fault, slip_sense(fault) AS sense, round(misfit::numeric, 2) AS misfit, planted IS NOT NULL AS planted, planted AS planted_kind FROM fault_check WHERE flagged ORDER BY site, station) TO 'demo-out/flagged_faults.csv' WITH (FORMAT csv, HEADER)

\echo '== Friction coefficient chosen by the joint focal inversion (searched over 0.2..1.0) per site'
SELECT site, friction(t) AS friction, round(mean_misfit(t)::numeric, 1) AS mean_misfit
  FROM focal_inv f ORDER BY site;
