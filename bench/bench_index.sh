#!/usr/bin/env bash
# Nearest-neighbour search with the GiST operator class on lineation against a
# sequential scan, same table, same queries, same session. Target (issue 13):
# 10^6 rows, 1,000 queries ORDER BY l <-> q LIMIT 10, index >= 50 times faster
# than the scan, results identical (ids and distances, every query).
# Also the "within d degrees" search (l <@ cone(q, 2)) on a tenth of the queries.
# Data: a quarter of the axes within 0.01 degree of the horizontal (the
# wrap-around of axes), an eighth within 0.01 of the vertical, the rest uniform
# on the sphere; queries uniform on the sphere. The index runs are the best of
# 3 rounds; the scan runs once (it is the slow side, and it supplies the
# reference answers). A query is timed inside one statement that runs all of
# them (a correlated subquery per query row), so client round trips are not
# counted on either side.
set -euo pipefail
N="${STRIAE_BENCH_ROWS:-1000000}"
Q="${STRIAE_BENCH_QUERIES:-1000}"
: "${PGHOST:?run inside scripts/with-cluster.sh}"
PSQL=(psql -X -q -v ON_ERROR_STOP=1)

# jit off on both sides: disabling scans in the index runs inflates the plan
# cost past jit_above_cost, and compiling would be timed as search.
export PGOPTIONS="${PGOPTIONS:-} -c client_min_messages=warning -c jit=off"
"${PSQL[@]}" <<SQL
CREATE EXTENSION IF NOT EXISTS striae;
DROP TABLE IF EXISTS b_axes, b_queries;
SELECT setseed(0.2026) \\g /dev/null
CREATE UNLOGGED TABLE b_axes AS
  SELECT g AS id, CASE WHEN u < 0.25 THEN lineation(360 * random(), 0.02 * random() - 0.01)
                       WHEN u < 0.375 THEN lineation(360 * random(), 89.99 + 0.01 * random())
                       ELSE lineation(360 * random(), degrees(asin(random()))) END AS l
    FROM (SELECT g, random() AS u FROM generate_series(1, $N) g) s;
CREATE UNLOGGED TABLE b_queries AS
  SELECT g AS qid, lineation(360 * random(), degrees(asin(random()))) AS q FROM generate_series(1, $Q) g;
VACUUM ANALYZE b_axes;
SQL

"${PSQL[@]}" <<SQL
CREATE OR REPLACE FUNCTION pg_temp.run_ms(q text) RETURNS float8 LANGUAGE plpgsql AS \$\$
DECLARE t0 timestamptz;
BEGIN
  t0 := clock_timestamp();
  EXECUTE q;
  RETURN extract(epoch FROM clock_timestamp() - t0) * 1000;
END \$\$;
CREATE TEMP TABLE timings (kind text, ms float8);
INSERT INTO timings SELECT 'build', pg_temp.run_ms('CREATE INDEX b_axes_l ON b_axes USING gist (l)');
ANALYZE b_axes;

-- the plans: an index scan ordered by <-> per query, and a scan with a top-N sort
SET enable_seqscan = off;
EXPLAIN (COSTS OFF) SELECT (SELECT array_agg(id) FROM (SELECT id FROM b_axes ORDER BY l <-> q LIMIT 10) k) FROM b_queries;
RESET enable_seqscan;
SET enable_indexscan = off; SET enable_bitmapscan = off;
EXPLAIN (COSTS OFF) SELECT (SELECT array_agg(id) FROM (SELECT id FROM b_axes ORDER BY l <-> q LIMIT 10) k) FROM b_queries;
RESET enable_indexscan; RESET enable_bitmapscan;

\set knn 'SELECT qid, k.ids, k.ds FROM b_queries, LATERAL (SELECT array_agg(id ORDER BY d, id) AS ids, array_agg(d ORDER BY d) AS ds FROM (SELECT id, l <-> q AS d FROM b_axes ORDER BY l <-> q LIMIT 10) s) k'
\set cone 'SELECT qid, (SELECT array_agg(id ORDER BY id) FROM b_axes WHERE l <@ cone(q, 2)) AS ids FROM b_queries WHERE qid % 10 = 0'
SELECT set_config('bench.knn', :'knn', false), set_config('bench.cone', :'cone', false) \\g /dev/null
SET enable_seqscan = off;
DO \$\$ BEGIN
  FOR i IN 1..3 LOOP
    DROP TABLE IF EXISTS r_index, r_cone_index;
    INSERT INTO timings SELECT 'knn index', pg_temp.run_ms('CREATE TEMP TABLE r_index AS ' || current_setting('bench.knn'));
    INSERT INTO timings SELECT 'cone index', pg_temp.run_ms('CREATE TEMP TABLE r_cone_index AS ' || current_setting('bench.cone'));
  END LOOP;
END \$\$;
RESET enable_seqscan;
SET enable_indexscan = off; SET enable_bitmapscan = off;
INSERT INTO timings SELECT 'knn scan', pg_temp.run_ms('CREATE TEMP TABLE r_scan AS ' || :'knn');
INSERT INTO timings SELECT 'cone scan', pg_temp.run_ms('CREATE TEMP TABLE r_cone_scan AS ' || :'cone');
RESET enable_indexscan; RESET enable_bitmapscan;

SELECT (SELECT count(*) FROM b_axes) AS rows, (SELECT count(*) FROM b_queries) AS knn_queries,
       round((min(ms) FILTER (WHERE kind = 'build') / 1000)::numeric, 1) AS index_build_s,
       pg_size_pretty(pg_relation_size('b_axes_l')) AS index_size FROM timings;
SELECT round(min(ms) FILTER (WHERE kind = 'knn index')::numeric, 1) AS knn_index_ms,
       round(min(ms) FILTER (WHERE kind = 'knn scan')::numeric, 1) AS knn_scan_ms,
       round((min(ms) FILTER (WHERE kind = 'knn scan') / min(ms) FILTER (WHERE kind = 'knn index'))::numeric, 1)
         AS ratio_knn_scan_vs_index,
       round((min(ms) FILTER (WHERE kind = 'knn index') / $Q)::numeric, 3) AS ms_per_knn_query
  FROM timings;
SELECT count(*) AS knn_queries_compared,
       count(*) FILTER (WHERE i.ids = s.ids AND i.ds = s.ds) AS identical_ids_and_distances
  FROM r_index i JOIN r_scan s USING (qid);
SELECT round(min(ms) FILTER (WHERE kind = 'cone index')::numeric, 1) AS cone_index_ms,
       round(min(ms) FILTER (WHERE kind = 'cone scan')::numeric, 1) AS cone_scan_ms,
       round((min(ms) FILTER (WHERE kind = 'cone scan') / min(ms) FILTER (WHERE kind = 'cone index'))::numeric, 1)
         AS ratio_cone_scan_vs_index
  FROM timings;
SELECT count(*) AS cone_queries_compared, count(*) FILTER (WHERE i.ids IS NOT DISTINCT FROM s.ids) AS identical_sets,
       sum(cardinality(s.ids)) AS rows_found
  FROM r_cone_index i JOIN r_cone_scan s USING (qid);
SQL
