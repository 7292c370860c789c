-- The GiST operator classes on lineation and plane: the planner uses them for
-- ORDER BY x <-> v LIMIT k and for x <@ cone(v, d), and they return exactly
-- what a sequential scan returns (the reference: the same query with index
-- scans disabled), on random axes with many near the horizontal (where u and
-- -u wrap around) and near the vertical.
\i sql/include/setup.sql

SELECT setseed(0.1313);
CREATE TABLE axes (id int PRIMARY KEY, l lineation, p plane);
-- a quarter within 0.01 degree of the horizontal, an eighth within 0.01 of the
-- vertical, the rest uniform on the sphere (z uniform: Archimedes)
INSERT INTO axes
SELECT g, l, plane_from_pole(l) FROM (
  SELECT g, CASE WHEN u < 0.25 THEN lineation(360 * random(), 0.02 * random() - 0.01)
                 WHEN u < 0.375 THEN lineation(360 * random(), 89.99 + 0.01 * random())
                 ELSE lineation(360 * random(), degrees(asin(random()))) END AS l
    FROM (SELECT g, random() AS u FROM generate_series(1, 20000) g) s) t;
-- exact duplicates and exact horizontal/vertical axes too
INSERT INTO axes SELECT 20000 + g, l, plane_from_pole(l)
  FROM generate_series(1, 40) g, LATERAL (VALUES (CASE g % 4 WHEN 0 THEN '000/00'::lineation WHEN 1 THEN '090/00'
                                                    WHEN 2 THEN '000/90' ELSE '135/45' END)) v(l);
CREATE INDEX axes_l ON axes USING gist (l);
CREATE INDEX axes_p ON axes USING gist (p);
ANALYZE axes;

-- query axes: horizontal on both sides of the wrap, vertical, near both, oblique
CREATE TABLE queries (qid int, l lineation, d float8);
INSERT INTO queries VALUES
  (1, '000/00', 0.5), (2, '179.999/0.0005', 1), (3, '090/00', 2), (4, '000/90', 0.5), (5, '217/89.995', 3),
  (6, '135/45', 0), (7, '359.99/0', 5), (8, '045/30', 10), (9, '300/60', 1), (10, '180/00', 0.02),
  (11, '012.5/00.001', 4), (12, '270/89.5', 20);
INSERT INTO queries SELECT 100 + g, lineation(360 * random(), degrees(asin(random()))), 30 * random()
  FROM generate_series(1, 28) g;

-- the plans
EXPLAIN (COSTS OFF) SELECT id FROM axes ORDER BY l <-> '120/30'::lineation LIMIT 5;
EXPLAIN (COSTS OFF) SELECT id FROM axes ORDER BY p <-> '110/64'::plane LIMIT 5;
EXPLAIN (COSTS OFF) SELECT count(*) FROM axes WHERE l <@ cone('120/30'::lineation, 5);
EXPLAIN (COSTS OFF) SELECT count(*) FROM axes WHERE p <@ cone('110/64'::plane, 5);
-- a join runs the nearest-neighbour search per outer row, with the index
SET enable_seqscan = off;
EXPLAIN (COSTS OFF)
  SELECT q.qid, (SELECT array_agg(id) FROM (SELECT id FROM axes ORDER BY l <-> q.l LIMIT 25) k) FROM queries q;
RESET enable_seqscan;

-- answers by index, then by sequential scan
CREATE FUNCTION pg_temp.answers() RETURNS TABLE (qid int, knn_l int[], knn_l_d float8[], knn_p int[],
                                                 knn_p_d float8[], in_l int[], in_p int[])
LANGUAGE sql AS $$
  SELECT q.qid,
         (SELECT array_agg(id ORDER BY dd, id) FROM (SELECT id, l <-> q.l AS dd FROM axes ORDER BY l <-> q.l LIMIT 25) k),
         (SELECT array_agg(dd ORDER BY dd) FROM (SELECT l <-> q.l AS dd FROM axes ORDER BY l <-> q.l LIMIT 25) k),
         (SELECT array_agg(id ORDER BY dd, id) FROM (SELECT id, p <-> plane_from_pole(q.l) AS dd FROM axes
                                                      ORDER BY p <-> plane_from_pole(q.l) LIMIT 25) k),
         (SELECT array_agg(dd ORDER BY dd) FROM (SELECT p <-> plane_from_pole(q.l) AS dd FROM axes
                                                  ORDER BY p <-> plane_from_pole(q.l) LIMIT 25) k),
         (SELECT array_agg(id ORDER BY id) FROM axes WHERE l <@ cone(q.l, q.d)),
         (SELECT array_agg(id ORDER BY id) FROM axes WHERE p <@ cone(plane_from_pole(q.l), q.d))
    FROM queries q $$;
SET enable_seqscan = off;
CREATE TEMP TABLE by_index AS SELECT * FROM pg_temp.answers();
RESET enable_seqscan;
SET enable_indexscan = off;
SET enable_bitmapscan = off;
CREATE TEMP TABLE by_scan AS SELECT * FROM pg_temp.answers();
RESET enable_indexscan;
RESET enable_bitmapscan;

-- The same ids in the same order and bit-identical distances; the cone
-- searches return the same sets (and they are not trivially empty).
SELECT count(*) AS queries,
       count(*) FILTER (WHERE i.knn_l = s.knn_l AND i.knn_l_d = s.knn_l_d) AS same_knn_lineation,
       count(*) FILTER (WHERE i.knn_p = s.knn_p AND i.knn_p_d = s.knn_p_d) AS same_knn_plane,
       count(*) FILTER (WHERE i.in_l IS NOT DISTINCT FROM s.in_l) AS same_cone_lineation,
       count(*) FILTER (WHERE i.in_p IS NOT DISTINCT FROM s.in_p) AS same_cone_plane,
       sum(cardinality(s.in_l)) AS rows_in_cones
  FROM by_index i JOIN by_scan s USING (qid);
-- near the wrap-around: the nearest axes to 000/00 include axes listed near 180/00
SELECT count(*) FILTER (WHERE trend(a.l) > 90) > 0 AS wraps
  FROM axes a WHERE a.id = ANY ((SELECT knn_l FROM by_index WHERE qid = 1)::int[]);
-- the distances are the operator's own: 000/05 and 180/05 are 10 degrees apart
SELECT '000/05'::lineation <-> '180/05' AS d, '000/00'::lineation <-> '179.999/0.0005' < 0.002 AS across;

-- After inserts (the index grows by penalty and page splits, not sorted build)
-- the answers are still those of a scan.
INSERT INTO axes SELECT 30000 + g, l, plane_from_pole(l)
  FROM (SELECT g, lineation(360 * random(), 90 * random() ^ 3) AS l FROM generate_series(1, 5000) g) t;
CREATE TABLE grown (id int, l lineation);
CREATE INDEX grown_l ON grown USING gist (l);
INSERT INTO grown SELECT id, l FROM axes;
SET enable_seqscan = off;
CREATE TEMP TABLE grown_index AS
  SELECT q.qid, (SELECT array_agg(id ORDER BY dd, id) FROM (SELECT id, l <-> q.l AS dd FROM grown ORDER BY l <-> q.l LIMIT 25) k) AS knn,
         (SELECT array_agg(id ORDER BY id) FROM grown WHERE l <@ cone(q.l, q.d)) AS inside FROM queries q;
CREATE TEMP TABLE axes_index AS
  SELECT q.qid, (SELECT array_agg(id ORDER BY dd, id) FROM (SELECT id, l <-> q.l AS dd FROM axes ORDER BY l <-> q.l LIMIT 25) k) AS knn
    FROM queries q;
RESET enable_seqscan;
SET enable_indexscan = off;
SET enable_bitmapscan = off;
CREATE TEMP TABLE grown_scan AS
  SELECT q.qid, (SELECT array_agg(id ORDER BY dd, id) FROM (SELECT id, l <-> q.l AS dd FROM grown ORDER BY l <-> q.l, id LIMIT 25) k) AS knn,
         (SELECT array_agg(id ORDER BY id) FROM grown WHERE l <@ cone(q.l, q.d)) AS inside FROM queries q;
RESET enable_indexscan;
RESET enable_bitmapscan;
SELECT count(*) AS queries, count(*) FILTER (WHERE g.knn = s.knn) AS same_knn_grown,
       count(*) FILTER (WHERE a.knn = s.knn) AS same_knn_after_insert,
       count(*) FILTER (WHERE g.inside IS NOT DISTINCT FROM s.inside) AS same_cone_grown
  FROM grown_index g JOIN grown_scan s USING (qid) JOIN axes_index a USING (qid);

-- cone: text form, constructors, errors
SELECT cone('120/30'::lineation, 10) AS c1, cone('110/64'::plane, 7.5) AS c2, 'line S60E/30 within 10'::cone AS c3,
       half_angle('plane 290/64S within 3'::cone) AS h;
SELECT '120/30'::lineation <@ cone('125/32'::lineation, 10) AS inside, '110/64'::plane <@ cone('290/64S'::plane, 0) AS same;
SELECT pg_temp.err($$SELECT cone('120/30'::lineation, 95)$$);
SELECT pg_temp.err($$SELECT 'line 120/30 within'::cone$$);
SELECT pg_temp.err($$SELECT '120/30'::lineation <@ cone('110/64'::plane, 5)$$);
SET enable_seqscan = off;
SELECT pg_temp.err($$SELECT count(*) FROM axes WHERE l <@ cone('110/64'::plane, 5)$$);
RESET enable_seqscan;
