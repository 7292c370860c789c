-- Figures: net_xy, net_figure I/O, layer builders and aggregates, composition,
-- net_svg structure (parsed as XML by the server), degenerate inputs, errors,
-- serial vs parallel agreement. Pixels are checked in a browser by
-- tests/external/check_figures_browser.py, projection values against PROJ by
-- tests/external/check_projection_proj.py.
\i sql/include/setup.sql
CREATE FUNCTION pg_temp.paths(svg text, cls text) RETURNS int LANGUAGE sql AS $$
  SELECT (xpath('count(//s:g[@class="' || cls || '"]/s:path)', svg::xml,
                ARRAY[ARRAY['s', 'http://www.w3.org/2000/svg']]))[1]::text::int $$;
CREATE FUNCTION pg_temp.attr(svg text, q text) RETURNS text LANGUAGE sql AS $$
  SELECT array_to_string(xpath(q, svg::xml, ARRAY[ARRAY['s', 'http://www.w3.org/2000/svg']]), '|') $$;

-- net_xy (METHODS.md section 7, derived): plunge 45 east has radius
-- sqrt(1/2)/sqrt(1 + sqrt(1/2)) = 0.5412 (equal-area) and tan(22.5) = 0.4142
-- (equal-angle); north on the primitive is (0, 1); the vertical is the centre.
SELECT round((net_xy('090/45'))[0]::numeric, 12) AS ea_x, round((net_xy('090/45', 'equal-angle'))[0]::numeric, 12) AS stereo_x,
       round((net_xy('0/0'))[1]::numeric, 12) AS north_y, net_xy('0/90') AS centre;
SELECT pg_temp.err($$SELECT net_xy('0/0', 'polar')$$);

-- Text form round trip, and the layer kinds it names
SELECT net_mechanism('30/60/40');
SELECT net_label(net_cone('120/50', 15), 'mean ± α95');
SELECT '{"layers": []}'::net_figure;
SELECT ('{"layers": [{"kind": "poles", "label": "b", "params": [], "data": [200, 40, 20, 26]}]}'::net_figure)::text::net_figure;
SELECT q, pg_temp.err(q) FROM (VALUES
  ('SELECT ''{"layers": [{"kind": "poles", "label": "", "params": [], "data": [20, 91]}]}''::net_figure'),
  ('SELECT ''{"layers": [{"kind": "poles", "label": "", "params": [], "data": [20]}]}''::net_figure'),
  ('SELECT ''{"layers": [{"kind": "blobs", "label": "", "params": [], "data": []}]}''::net_figure'),
  ('SELECT ''{"layers": [{"kind": "mechanism", "label": "", "params": [], "data": [0, 45, 90, 0, 45, -90]}]}''::net_figure'),
  ('SELECT ''{"layers": [{"kind": "lines", "label": "", "params": [], "data": [300, -30]}]}''::net_figure'),
  ('SELECT ''{"layers": [{"kind": "cones", "label": "", "params": [], "data": [0, 0, 120]}]}''::net_figure'),
  ('SELECT ''{"layers": [{"kind": "lines", "label": "", "params": [], "data": [30, 20]}''::net_figure'),
  ('SELECT ''{"layers": [{"kind": "lines", "label": "a\u0001", "params": [], "data": [30, 20]}]}''::net_figure'),
  ('SELECT ''{"layers": [{"kind": "stress", "label": "", "params": [1, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0], "data": []}]}''::net_figure'),
  ('SELECT ''{"layers": [{"kind": "contours", "label": "", "params": [1, 45, 3, 1, 2, 1], "data": [1, 1, 1, 1, 1, 1, 1, 1, 1, 1, 1, 1, 1, 1]}]}''::net_figure'),
  ('SELECT ''nonsense''::net_figure')) t(q);

-- Aggregates: NULL rows skipped, empty group NULL, items sorted (independent of row order)
SELECT net_poles(p) FROM (VALUES ('200/40'::plane), (NULL), ('20/26')) t(p);
SELECT net_poles(p) FROM (VALUES ('20/26'::plane), ('200/40')) t(p);
SELECT net_great_circles(p) IS NULL AS empty FROM (SELECT '1/1'::plane p WHERE false) s;
SELECT net_faults(f) IS NULL AS all_null FROM (VALUES (NULL::fault_slip), (NULL)) t(f);
SELECT net_stack(x) IS NULL AS empty_stack FROM (SELECT net_mechanism('0/45/90') x WHERE false) s;
-- net_stack orders layers by kind, then label
SELECT net_stack(x) FROM (VALUES (net_label(net_cone('0/90', 10), 'b')), (net_mechanism('0/45/90')), (net_label(net_cone('0/90', 10), 'a'))) t(x);

-- A site's faults with the stress from them, in one call; structure of the document
CREATE TABLE fig_faults AS SELECT i, fault_slip((i * 37) % 360, 10 + (i * 13) % 80, ((i * 53) % 360) - 180) AS f
  FROM generate_series(1, 40) i;
CREATE TABLE fig_doc AS SELECT net_svg(net_label(net_faults(f), 'F') || net_stress(stress_inversion(f, 200, 7)) || net_poles(fault_plane(f)),
                               title => 'Site <A> & "B"', graticule => true) AS svg FROM fig_faults;
SELECT xml_is_well_formed_document(svg) AS well_formed, pg_temp.paths(svg, 'slip_planes') AS fault_paths,
       pg_temp.paths(svg, 'poles') AS pole_paths,
       pg_temp.attr(svg, '/s:svg/@width') AS width, pg_temp.attr(svg, '//s:circle[@id="primitive"]/@r') AS radius,
       pg_temp.attr(svg, '//s:text[@id="title"]/text()') AS title,
       svg ~ '^[\x09\x0a\x0d\x20-\x7e]*$' AS plain_ascii
  FROM fig_doc;
SELECT string_agg(t, ' / ') AS legend FROM fig_doc, unnest(xpath('//s:g[@id="legend"]/s:text/text()', svg::xml,
  ARRAY[ARRAY['s', 'http://www.w3.org/2000/svg']])::text[]) t;
-- the same figure renders to the same bytes
SELECT count(DISTINCT md5(net_svg(x))) AS distinct_documents FROM (SELECT net_faults(f) x FROM fig_faults) s, generate_series(1, 3);

-- Degenerate inputs give a correct document: one datum, vertical planes, data on
-- the primitive, a horizontal plane, a cone of 90 degrees, a grid of one value
SELECT k, xml_is_well_formed_document(svg) AS ok, pg_temp.paths(svg, k) AS paths FROM (VALUES
  ('great_circles', net_svg((SELECT net_great_circles(p) FROM (VALUES ('10/90'::plane), ('100/90'), ('0/0')) t(p)))),
  ('poles', net_svg((SELECT net_poles(p) FROM (VALUES ('10/90'::plane)) t(p)))),
  ('lines', net_svg((SELECT net_lines(l) FROM (VALUES ('045/00'::lineation), ('0/90')) t(l)))),
  ('slip_poles', net_svg((SELECT net_hoeppener(f) FROM (VALUES ('0/90/0'::fault_slip), ('0/0/0'), ('0/45/-90')) t(f)))),
  ('slip_planes', net_svg((SELECT net_faults(f) FROM (VALUES ('0/90/90'::fault_slip), ('0/0/0')) t(f)))),
  ('p_dihedra', net_svg((SELECT net_dihedra(f) FROM (VALUES ('0/90/0'::fault_slip), ('0/0/90'), ('0/45/90')) t(f)))),
  ('cones', net_svg(net_cone('0/0', 90) || net_cone('090/00', 30))),
  ('mechanism', net_svg(net_mechanism('0/0/90'), legend => false))) t(k, svg);
SELECT pg_temp.paths(net_svg(x), 'p_axes') AS p, pg_temp.paths(net_svg(x), 't_axes') AS t
  FROM (SELECT net_pt_axes(f) x FROM fig_faults) s;
SELECT xml_is_well_formed_document(svg) AS ok, pg_temp.paths(svg, 'contours') AS bands,
       pg_temp.attr(svg, '//s:g[@class="contours"]/s:path/@d') <> '' AS band_drawn
  FROM (SELECT net_svg(net_contours('{"kind": "density", "spacing": 45, "n": 5, "values": [1, 1, 1, 1, 1, 1, 1, 1, 1, 1, 1]}')) svg) s;
SELECT pg_temp.paths(net_svg(net_contours(right_dihedra(f, 5), '{25, 50, 75}') || net_dihedra(f)), 'p_dihedra') AS dihedra,
       pg_temp.paths(net_svg(net_contours(right_dihedra(f, 5), '{25, 50, 75}', false)), 'contours') AS lines
  FROM fig_faults;
SELECT pg_temp.paths(net_svg(net_stress(stress_tensor('040/00', '130/00', 0.3)), projection => 'equal-angle'), 'stress') AS stress_paths;

-- Errors: class 22 with a message that says what is accepted
SELECT q, pg_temp.err(q) FROM (VALUES
  ('SELECT net_cone(''0/0'', 95)'),
  ('SELECT net_cone(''0/0'', 0)'),
  ('SELECT net_svg(net_mechanism(''0/45/90''), size => 100)'),
  ('SELECT net_svg(net_mechanism(''0/45/90''), projection => ''mercator'')'),
  ('SELECT net_svg(net_mechanism(''0/45/90''), title => repeat(''x'', 201))'),
  ('SELECT net_label(net_mechanism(''0/45/90''), E''two\nlines'')'),
  ('SELECT net_contours(''{"kind": "density", "spacing": 45, "n": 5, "values": [1, 1, 1, 1, 1, 1, 1, 1, 1, 1, 1]}'', ''{2, 1}'')'),
  ('SELECT net_contours(''{"kind": "density", "spacing": 45, "n": 5, "values": [1, 1, 1, 1, 1, 1, 1, 1, 1, 1, 1]}'', ''{}'')'),
  ('SELECT net_stack(net_cone(''0/90'', 10)) FROM generate_series(1, 65)'),
  ('SELECT net_poles(plane(g % 360, 45)) FROM generate_series(1, 100001) g')) t(q);

-- serial vs parallel: the same figures
CREATE TABLE fig_big AS SELECT g % 3 AS grp, plane((g * 13.1) % 360, (g * 7.9) % 90) AS p,
  fault_slip((g * 17.3) % 360, (g * 5.1) % 90, ((g * 29.7) % 360) - 180) AS f FROM generate_series(1, 6000) g;
ANALYZE fig_big;
SET parallel_setup_cost = 0; SET parallel_tuple_cost = 0; SET min_parallel_table_scan_size = 0;
SET max_parallel_workers_per_gather = 2; SET parallel_leader_participation = off;
CREATE TABLE fig_layers AS SELECT g % 60 AS grp, net_cone(lineation(g % 360, g % 90), 1 + g % 80) AS x FROM generate_series(1, 3000) g;
ANALYZE fig_layers;
EXPLAIN (COSTS OFF) SELECT net_poles(p), net_faults(f) FROM fig_big;
EXPLAIN (COSTS OFF) SELECT grp, net_stack(x) FROM fig_layers GROUP BY grp;
CREATE TABLE fig_par AS SELECT grp, net_poles(p)::text a, net_faults(f)::text b, net_dihedra(f)::text c FROM fig_big GROUP BY grp;
CREATE TABLE fig_par_stack AS SELECT grp, net_stack(x)::text s FROM fig_layers GROUP BY grp;
SET max_parallel_workers_per_gather = 0;
CREATE TABLE fig_ser AS SELECT grp, net_poles(p)::text a, net_faults(f)::text b, net_dihedra(f)::text c FROM fig_big GROUP BY grp;
CREATE TABLE fig_ser_stack AS SELECT grp, net_stack(x)::text s FROM fig_layers GROUP BY grp;
RESET parallel_leader_participation;
SELECT count(*) AS groups, bool_and(s.a = p.a AND s.b = p.b AND s.c = p.c) AS identical FROM fig_ser s JOIN fig_par p USING (grp);
SELECT count(*) AS groups, bool_and(s.s = p.s) AS identical FROM fig_ser_stack s JOIN fig_par_stack p USING (grp);
DROP TABLE fig_faults, fig_doc, fig_big, fig_layers, fig_par, fig_par_stack, fig_ser, fig_ser_stack;
