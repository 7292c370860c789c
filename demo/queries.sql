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
