-- Values and results that an update of the extension must leave unchanged,
-- one "name<TAB>value" line each, over the tables that check_upgrade.sh
-- creates under 0.1.0. Run once under the old library and 0.1.0's SQL, once
-- after ALTER EXTENSION ... UPDATE under the new library; the two outputs must
-- agree line by line, but for the lines that upgrade_expected_changes.txt
-- names with the reason.
\pset format unaligned
\pset tuples_only on
\pset fieldsep '\t'
SET extra_float_digits = 3;
SELECT 'stored values', md5(string_agg(concat_ws('|', p, l, f), ',' ORDER BY i)) FROM u_data;
SELECT 'stored tensors and grids', md5(string_agg(concat_ws('|', s, sb, fj, g, dg), ',' ORDER BY k)) FROM u_results;
SELECT 'stored composites', md5(string_agg(concat_ws('|', fm, ot), ',' ORDER BY k)) FROM u_results;
-- an index built under 0.1.0 still answers (btree on plane, hash on fault_slip)
SET enable_seqscan = off;
SELECT 'btree index scan', count(*) FROM u_data WHERE p >= '100/30'::plane AND p < '200/60'::plane;
SELECT 'hash index scan', count(*) FROM u_data WHERE f = (SELECT f FROM u_data WHERE i = 17);
RESET enable_seqscan;
SELECT 'btree index scan (seq)', count(*) FROM u_data WHERE p >= '100/30'::plane AND p < '200/60'::plane;
-- per-row functions of 0.1.0
SELECT 'geometry', md5(string_agg(concat_ws('|', strike(p), dip(p), dip_direction(p), trend(l), plunge(l),
         strike(f), dip(f), rake(f), fault_plane(f), slip_sense(f), direction_cosines(l), pole(p),
         plane_from_pole(l), angle(l, pole(p)), angle(p, fault_plane(f)), p <-> fault_plane(f)),
         ',' ORDER BY i)) FROM u_data;
SELECT 'focal', md5(string_agg(concat_ws('|', auxiliary(f), auxiliary_plane(f), p_axis(f), t_axis(f), b_axis(f),
         moment_tensor(f), moment_tensor(f, 'use'), kagan_angle(f, auxiliary(f)), mechanism_class(f)),
         ',' ORDER BY i)) FROM u_data;
SELECT 'tensor functions ' || k, concat_ws('|', sigma1(s), sigma2(s), sigma3(s), shape_ratio(s), shmax_azimuth(s),
         stress_regime(s), regime_index(s), data_count(s), friction(fj), mean_misfit(sb),
         sigma1_confidence(sb), sigma2_confidence(sb), sigma3_confidence(sb), shape_ratio_interval(sb),
         stress_components(s))
  FROM u_results ORDER BY k;
SELECT 'tendencies', md5(string_agg(concat_ws('|', misfit(d.f, r.s), resolved_slip(d.p, r.s),
         slip_tendency(d.p, r.s), slip_tendency(d.p, r.s, 0.8), dilation_tendency(d.p, r.s)), ',' ORDER BY d.i))
  FROM u_data d JOIN u_results r ON r.k = d.i % 6;
SELECT 'grid functions ' || k, concat_ws('|', grid_max(g), grid_min(g), grid_spacing(g), grid_data_count(g), grid_kind(g),
         grid_max(dg), (SELECT md5(string_agg(concat_ws('|', trend, plunge, value), ',')) FROM grid_cells(dg)))
  FROM u_results ORDER BY k;
-- aggregates of 0.1.0, recomputed from the stored rows
SELECT 'aggregates ' || (i % 6), concat_ws('|', fisher_mean(l), fisher_mean(p), orientation_tensor(l), orientation_tensor(p),
         mean_plane(p), fold_axis(p), stress_inversion(f), stress_inversion(f, 30, 5), focal_stress_inversion(f),
         focal_stress_inversion(f, 0.6), md5(right_dihedra(f, 10)::text), md5(density_grid(l, 10)::text),
         md5(density_grid(p, 15)::text))
  FROM u_data GROUP BY i % 6 ORDER BY i % 6;
SELECT 'bootstrap focal ' || (i % 6), focal_stress_inversion(f, 0.6, 20, 3)
  FROM u_data WHERE i % 6 < 2 GROUP BY i % 6 ORDER BY i % 6;
-- right dihedra with grid nodes exactly on nodal planes (the B axis of a pure thrust,
-- the strike line of a vertical fault): counted 0 in 0.1.0, half since 0.2.0
SELECT 'right dihedra on nodal planes', right_dihedra(f, 45)::text
  FROM (VALUES ('0/45/90'::fault_slip), ('0/90/0'::fault_slip)) v(f);
