-- The demo district's per-domain result (demo/README.md, "The district map"): one row
-- per domain, a domain being the field faults of one site, map unit and age class, or
-- the focal mechanisms of one site. Written by demo/run.sh as demo-out/domains.csv,
-- demo-out/domains.geojson (scripts/report/domain_geojson.sql) and the district page.
-- Interpretive results of an invented data set: see the caution in demo/README.md.
\set QUIET on
\i scripts/report/domain_columns.sql
DROP TABLE IF EXISTS domain_tensor, domain_result, domain_recovery, fold_recovery;
-- Field faults: Michael inversion with 500 bootstrap resamples (fixed seed) per site,
-- map unit and age class; focal mechanisms: the joint inversion (friction searched)
-- with 500 resamples per site. The position of a domain is the centre of its
-- stations or epicentres.
CREATE TABLE domain_tensor AS
  WITH d AS (
    SELECT 'field faults'::text AS data, site, map_unit, age_class, count(*) AS n,
           stress_inversion(fault, 500, 20261) AS t,
           avg(cosd(lat) * cosd(lon)) AS x, avg(cosd(lat) * sind(lon)) AS y, avg(sind(lat)) AS z
      FROM fault_slip_obs GROUP BY site, map_unit, age_class
    UNION ALL
    SELECT 'focal mechanisms', site, NULL, NULL, count(*),
           focal_stress_inversion(mechanism, NULL, 500, 20261),
           avg(cosd(lat) * cosd(lon)), avg(cosd(lat) * sind(lon)), avg(sind(lat))
      FROM focal_event GROUP BY site)
  SELECT row_number() OVER (ORDER BY d.site, d.data, d.map_unit, d.age_class DESC) AS domain,
         d.site, d.map_unit, d.age_class, d.data, d.n, d.t, p.lon, p.lat
    FROM d LEFT JOIN LATERAL pg_temp.mean_position(d.x, d.y, d.z) p ON true;
-- The table of the district's result: the tensor's columns (domain_columns.sql).
-- domain_tensor keeps the tensors for the map layers (demo/gis.sql).
CREATE TABLE domain_result AS
  SELECT d.domain, d.site, d.map_unit, d.age_class, d.data, d.n, c.*, d.lon, d.lat
    FROM domain_tensor d CROSS JOIN LATERAL pg_temp.domain_columns(d.t) c
   ORDER BY d.domain;

-- The planted truth of each domain: the site's younger stress for its younger faults
-- and its focal mechanisms, the older stress for its older faults (stress_truth).
CREATE TABLE domain_recovery AS
  SELECT r.domain, r.site, r.map_unit, r.age_class, r.data, r.n,
         to_text(sigma1(tt)) AS true_sigma1, to_text(lineation(r.sigma1_trend, r.sigma1_plunge)) AS sigma1,
         round((sigma1(tt) <-> lineation(r.sigma1_trend, r.sigma1_plunge))::numeric, 1) AS sigma1_to_true,
         to_text(sigma3(tt)) AS true_sigma3, to_text(lineation(r.sigma3_trend, r.sigma3_plunge)) AS sigma3,
         round((sigma3(tt) <-> lineation(r.sigma3_trend, r.sigma3_plunge))::numeric, 1) AS sigma3_to_true,
         round(shape_ratio(tt)::numeric, 2) AS true_phi, r.shape_ratio AS phi,
         r.shape_ratio_low AS phi_low, r.shape_ratio_high AS phi_high,
         round(shmax_azimuth(tt)::numeric, 1) AS true_shmax, r.shmax_azimuth AS shmax,
         -- SHmax is an axis: the difference is folded into 0..90
         round((90 - abs(90 - mod(abs(r.shmax_azimuth - shmax_azimuth(tt)::numeric), 180)))::numeric, 1) AS shmax_to_true,
         stress_regime(tt) AS true_regime, r.regime
    FROM domain_result r JOIN stress_truth s USING (site)
         CROSS JOIN LATERAL (SELECT CASE WHEN r.age_class = 'older'
                                         THEN stress_tensor(s.older_sigma1, s.older_sigma3, s.older_shape_ratio)
                                         ELSE stress_tensor(s.sigma1, s.sigma3, s.shape_ratio) END AS tt) x;

-- Folds: the cylindrical fold axis of each site's bedding (both units) against the
-- planted axis (fold_truth).
CREATE TABLE fold_recovery AS
  SELECT site, count(*) AS n, to_text(fold_axis) AS true_fold_axis, to_text(fold_axis(bedding)) AS fold_axis,
         round((fold_axis(bedding) <-> fold_axis)::numeric, 1) AS angle_to_true
    FROM bedding JOIN fold_truth USING (site) GROUP BY site, fold_truth.fold_axis;
\set QUIET off
\pset footer off

\echo '== District domains: stress recovered per site, map unit and age class against the planted truth'
\echo '   (angles in degrees; field faults: stress_inversion(fault, 500, 20261); focal mechanisms:'
\echo '   focal_stress_inversion(mechanism, NULL, 500, 20261); the truth is the site''s younger stress for'
\echo '   younger faults and focal mechanisms, its older stress for older faults)'
SELECT domain AS "#", site, coalesce(map_unit, '-') AS unit, coalesce(age_class, '-') AS age, data, n,
       true_sigma1, sigma1, sigma1_to_true AS s1_err, true_sigma3, sigma3, sigma3_to_true AS s3_err,
       true_phi, phi || ' [' || phi_low || ', ' || phi_high || ']' AS phi_95,
       true_shmax, shmax, shmax_to_true AS shmax_err, true_regime, regime
  FROM domain_recovery ORDER BY domain;

\echo '== Folds: fold axis of the bedding (both units) against the planted axis'
SELECT site, n, true_fold_axis, fold_axis, angle_to_true FROM fold_recovery ORDER BY site;
