#!/usr/bin/env bash
# Two right_dihedra aggregates of different spacings in one query against the
# same two run apart. The node table of a grid depends only on its spacing and
# is cached per backend; a cache of one spacing was rebuilt on every row when
# two spacings took turns (measured 30 to 110 times slower). Ratio printed:
# together / (first apart + second apart); target about 1 (the same work).
# Each of the three timings is the best of STRIAE_BENCH_ROUNDS runs (default
# 11), interleaved, timed with clock_timestamp() in one session, after a
# warm-up. Data: generate_series and random() after setseed (fine for a
# benchmark): uniformly random strike, dip and rake.
set -euo pipefail
N="${STRIAE_BENCH_GRID_ROWS:-20000}"
ROUNDS="${STRIAE_BENCH_ROUNDS:-11}"
A="${STRIAE_BENCH_SPACING_A:-1}"
B="${STRIAE_BENCH_SPACING_B:-2}"
: "${PGHOST:?run inside scripts/with-cluster.sh}"
PSQL=(psql -X -q -v ON_ERROR_STOP=1)

"${PSQL[@]}" <<SQL
CREATE EXTENSION IF NOT EXISTS striae;
DROP TABLE IF EXISTS b_cache;
SELECT setseed(0.31) \\g /dev/null
CREATE UNLOGGED TABLE b_cache AS
  SELECT fault_slip(360 * random(), 90 * random(), 360 * random() - 180) AS f FROM generate_series(1, $N);
VACUUM ANALYZE b_cache;
CREATE OR REPLACE FUNCTION pg_temp.run_ms(q text) RETURNS float8 LANGUAGE plpgsql AS \$\$
DECLARE t0 timestamptz; r record;
BEGIN
  t0 := clock_timestamp();
  EXECUTE q INTO r;
  RETURN extract(epoch FROM clock_timestamp() - t0) * 1000;
END \$\$;
CREATE TEMP TABLE runs (kind text, ms float8);
SET max_parallel_workers_per_gather = 0;
SELECT pg_temp.run_ms('SELECT right_dihedra(f, $A), right_dihedra(f, $B) FROM b_cache') \\g /dev/null
DO \$\$ BEGIN
  FOR i IN 1..$ROUNDS LOOP
    INSERT INTO runs SELECT 'together', pg_temp.run_ms('SELECT right_dihedra(f, $A), right_dihedra(f, $B) FROM b_cache');
    INSERT INTO runs SELECT 'a', pg_temp.run_ms('SELECT right_dihedra(f, $A) FROM b_cache');
    INSERT INTO runs SELECT 'b', pg_temp.run_ms('SELECT right_dihedra(f, $B) FROM b_cache');
  END LOOP;
END \$\$;
\echo right_dihedra, $N rows, spacings $A and $B: best of $ROUNDS runs (ms)
SELECT round(min(ms) FILTER (WHERE kind = 'together')::numeric, 1) AS together_ms,
       round(min(ms) FILTER (WHERE kind = 'a')::numeric, 1) AS apart_a_ms,
       round(min(ms) FILTER (WHERE kind = 'b')::numeric, 1) AS apart_b_ms,
       round((min(ms) FILTER (WHERE kind = 'together') /
              (min(ms) FILTER (WHERE kind = 'a') + min(ms) FILTER (WHERE kind = 'b')))::numeric, 2)
         AS "ratio together / apart"
  FROM runs;
DROP TABLE b_cache;
SQL
