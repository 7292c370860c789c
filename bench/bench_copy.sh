#!/usr/bin/env bash
# COPY of N fault_slip values in text form vs COPY of the same numbers into
# three float8 columns. Target (issue 2): ratio <= 1.5.
set -euo pipefail
N="${STRIAE_BENCH_ROWS:-1000000}"
DIR="${STRIAE_SCRATCH:?run inside scripts/with-cluster.sh}/bench"
mkdir -p "$DIR"
/usr/bin/python3 - "$N" "$DIR" <<'PY'
import random, sys
n, d = int(sys.argv[1]), sys.argv[2]
rnd = random.Random(1)
with open(f"{d}/fs.txt", "w") as a, open(f"{d}/f3.txt", "w") as b:
    for _ in range(n):
        s, dp, r = round(rnd.uniform(0, 360), 2), round(rnd.uniform(0, 90), 2), round(rnd.uniform(-180, 180), 2)
        a.write(f"{s}/{dp}/{r}\n")
        b.write(f"{s}\t{dp}\t{r}\n")
PY
chmod -R a+rX "$DIR"
psql -X -q -v ON_ERROR_STOP=1 <<SQL
CREATE EXTENSION IF NOT EXISTS striae;
DROP TABLE IF EXISTS b_fs, b_f3;
CREATE UNLOGGED TABLE b_fs (f fault_slip);
CREATE UNLOGGED TABLE b_f3 (a float8, b float8, c float8);
CREATE OR REPLACE FUNCTION pg_temp.copy_ms(tbl text, path text) RETURNS float8 LANGUAGE plpgsql AS \$\$
DECLARE t0 timestamptz;
BEGIN
  EXECUTE format('TRUNCATE %I', tbl);
  t0 := clock_timestamp();
  EXECUTE format('COPY %I FROM %L', tbl, path);
  RETURN extract(epoch FROM clock_timestamp() - t0) * 1000;
END \$\$;
CREATE TEMP TABLE runs (kind text, ms float8);
-- alternate the two loads, 3 rounds each, keep the fastest of each
DO \$\$ BEGIN
  FOR i IN 1..3 LOOP
    INSERT INTO runs SELECT 'float8', pg_temp.copy_ms('b_f3', '$DIR/f3.txt');
    INSERT INTO runs SELECT 'fault_slip', pg_temp.copy_ms('b_fs', '$DIR/fs.txt');
  END LOOP;
END \$\$;
SELECT (SELECT count(*) FROM b_fs) AS rows_loaded,
       round(min(ms) FILTER (WHERE kind = 'float8')::numeric, 1) AS float8_x3_ms,
       round(min(ms) FILTER (WHERE kind = 'fault_slip')::numeric, 1) AS fault_slip_ms,
       round((min(ms) FILTER (WHERE kind = 'fault_slip') / min(ms) FILTER (WHERE kind = 'float8'))::numeric, 3)
         AS ratio_copy_fault_slip_vs_3_float8
  FROM runs;
SQL
