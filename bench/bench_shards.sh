#!/usr/bin/env bash
# A catalogue of 2 x N fault-slip rows (N = STRIAE_SHARD_ROWS, default
# 1,000,000) on two shard servers, read through postgres_fdw foreign
# partitions on a coordinator; GROUP BY the partition key with
# stress_inversion, fisher_mean and orientation_tensor, timed three ways in the
# same run (best of STRIAE_BENCH_ROUNDS, default 5):
#   pushed down: partition-wise aggregation, each shard aggregates its rows and
#                ships one row (async foreign scans, so the shards work at once);
#   rows shipped: partition-wise aggregation off, the rows travel to the
#                coordinator (fetch_size 10000) and it aggregates them;
#   one server:  the same 2 x N rows in one local table on the coordinator.
# Then the same aggregates grouped by 10 strike bins that cut across the shards,
# three ways: two-phase (the *_partial aggregates pushed down, grouped by shard
# and bin, merged on the coordinator), rows shipped, one server.
# Needs scripts/with-cluster.sh --install --clusters 3.
set -euo pipefail
N="${STRIAE_SHARD_ROWS:-1000000}"
ROUNDS="${STRIAE_BENCH_ROUNDS:-5}"
if [ "${STRIAE_CLUSTERS:-1}" -lt 3 ]; then
  echo "bench_shards: needs three clusters (scripts/with-cluster.sh --clusters 3); skipped"
  exit 0
fi
DB=striae_shard_bench
P=(psql -X -q -v ON_ERROR_STOP=1)
on() { local k=$1; shift; PGHOST="$(eval echo "\$STRIAE_HOST_$k")" PGPORT="$(eval echo "\$STRIAE_PORT_$k")" "$@"; }
for k in 1 2 3; do on "$k" dropdb --if-exists "$DB"; on "$k" createdb "$DB"; on "$k" "${P[@]}" -d "$DB" -c "CREATE EXTENSION striae"; done
GEN="SELECT %s::text AS region, fault_slip(360 * random(), 90 * random(), 360 * random() - 180) AS f FROM generate_series(1, $N)"
for r in north:2:0.1 south:3:0.2; do
  IFS=: read -r region k seed <<<"$r"
  on "$k" "${P[@]}" -d "$DB" -o /dev/null -c "SELECT setseed($seed)" \
    -c "CREATE TABLE catalogue_part AS $(printf "$GEN" "'$region'")" -c "VACUUM ANALYZE catalogue_part"
done
on 1 "${P[@]}" -d "$DB" <<SQL
CREATE EXTENSION postgres_fdw;
CREATE SERVER shard_north FOREIGN DATA WRAPPER postgres_fdw
  OPTIONS (host '$STRIAE_HOST_2', port '$STRIAE_PORT_2', dbname '$DB', extensions 'striae', async_capable 'true', fetch_size '10000');
CREATE SERVER shard_south FOREIGN DATA WRAPPER postgres_fdw
  OPTIONS (host '$STRIAE_HOST_3', port '$STRIAE_PORT_3', dbname '$DB', extensions 'striae', async_capable 'true', fetch_size '10000');
CREATE USER MAPPING FOR CURRENT_USER SERVER shard_north OPTIONS (user 'postgres');
CREATE USER MAPPING FOR CURRENT_USER SERVER shard_south OPTIONS (user 'postgres');
CREATE TABLE catalogue (region text NOT NULL, f fault_slip NOT NULL) PARTITION BY LIST (region);
CREATE FOREIGN TABLE catalogue_north PARTITION OF catalogue FOR VALUES IN ('north')
  SERVER shard_north OPTIONS (table_name 'catalogue_part');
CREATE FOREIGN TABLE catalogue_south PARTITION OF catalogue FOR VALUES IN ('south')
  SERVER shard_south OPTIONS (table_name 'catalogue_part');
ANALYZE catalogue;
SELECT setseed(0.1) \\g /dev/null
CREATE TABLE catalogue_local AS $(printf "$GEN" "'north'");
SELECT setseed(0.2) \\g /dev/null
INSERT INTO catalogue_local $(printf "$GEN" "'south'");
VACUUM ANALYZE catalogue_local;
SQL
Q="SELECT region, stress_inversion(f), fisher_mean(p_axis(f)), orientation_tensor(fault_plane(f)) FROM %s GROUP BY region"
BIN="width_bucket(strike(f), 0, 360, 10)"
QX="SELECT $BIN AS bin, stress_inversion(f), fisher_mean(p_axis(f)), orientation_tensor(fault_plane(f)) FROM %s GROUP BY 1"
TWO="SELECT bin, stress_inversion(a), fisher_mean(b), orientation_tensor(c) FROM (SELECT region, $BIN AS bin,
  stress_inversion_partial(f) AS a, fisher_mean_partial(p_axis(f)) AS b, orientation_tensor_partial(fault_plane(f)) AS c
  FROM catalogue GROUP BY 1, 2) s GROUP BY bin"
on 1 "${P[@]}" -d "$DB" <<SQL
SET max_parallel_workers_per_gather = 0;
CREATE FUNCTION pg_temp.run_ms(q text) RETURNS float8 LANGUAGE plpgsql AS \$\$
DECLARE t0 timestamptz; r record;
BEGIN t0 := clock_timestamp(); FOR r IN EXECUTE q LOOP END LOOP; RETURN extract(epoch FROM clock_timestamp() - t0) * 1000; END \$\$;
CREATE TEMP TABLE runs (kind text, ms float8);
DO \$\$ BEGIN
  FOR i IN 1..$ROUNDS LOOP
    SET enable_partitionwise_aggregate = on;
    INSERT INTO runs SELECT 'pushed down (async)', pg_temp.run_ms('$(printf "$Q" catalogue)');
    SET enable_partitionwise_aggregate = off;
    INSERT INTO runs SELECT 'rows shipped', pg_temp.run_ms('$(printf "$Q" catalogue)');
    INSERT INTO runs SELECT 'one server', pg_temp.run_ms('$(printf "$Q" catalogue_local)');
  END LOOP;
END \$\$;
\echo 2 x $N rows, GROUP BY the partition key (2 groups), best of $ROUNDS (ms); ratio = time / one server
WITH b AS (SELECT kind, min(ms) AS ms FROM runs GROUP BY kind)
SELECT kind, round(ms::numeric, 1) AS best_ms,
       round((ms / (SELECT ms FROM b WHERE kind = 'one server'))::numeric, 2) AS ratio_to_one_server
  FROM b ORDER BY ms;
TRUNCATE runs;
DO \$\$ BEGIN
  FOR i IN 1..$ROUNDS LOOP
    SET enable_partitionwise_aggregate = on;
    INSERT INTO runs SELECT 'two-phase (partials pushed down)', pg_temp.run_ms('$TWO');
    INSERT INTO runs SELECT 'rows shipped', pg_temp.run_ms('$(printf "$QX" catalogue)');
    INSERT INTO runs SELECT 'one server', pg_temp.run_ms('$(printf "$QX" catalogue_local)');
  END LOOP;
END \$\$;
\echo 2 x $N rows, GROUP BY 10 strike bins across both shards, best of $ROUNDS (ms); ratio = time / one server
WITH b AS (SELECT kind, min(ms) AS ms FROM runs GROUP BY kind)
SELECT kind, round(ms::numeric, 1) AS best_ms,
       round((ms / (SELECT ms FROM b WHERE kind = 'one server'))::numeric, 2) AS ratio_to_one_server
  FROM b ORDER BY ms;
SQL
plan=$(on 1 "${P[@]}" -d "$DB" -At -c "SET enable_partitionwise_aggregate = on" -c "EXPLAIN (VERBOSE, COSTS OFF) $(printf "$Q" catalogue)")
pushed=$(grep -c "Remote SQL: SELECT region, public.stress_inversion(f), public.fisher_mean(public.p_axis(f)).*GROUP BY" <<<"$plan" || true)
async=$(grep -c "Async Foreign Scan" <<<"$plan" || true)
plan=$(on 1 "${P[@]}" -d "$DB" -At -c "SET enable_partitionwise_aggregate = off" -c "EXPLAIN (VERBOSE, COSTS OFF) $(printf "$Q" catalogue)")
shipped=$(grep -c "Remote SQL: SELECT region, f FROM public.catalogue_part" <<<"$plan" || true)
echo "plans: pushed down $pushed of 2 foreign scans ($async async); rows shipped $shipped of 2 foreign scans"
plan=$(on 1 "${P[@]}" -d "$DB" -At -c "SET enable_partitionwise_aggregate = on" -c "EXPLAIN (VERBOSE, COSTS OFF) $TWO")
partial=$(grep -c "Remote SQL: SELECT region, width_bucket(public.strike(f).*public.stress_inversion_partial(f).*GROUP BY" <<<"$plan" || true)
echo "plans: two-phase, the partial aggregates in $partial of 2 foreign scans"
for k in 1 2 3; do on "$k" dropdb "$DB"; done
[ "$pushed" -eq 2 ] && [ "$async" -eq 2 ] && [ "$shipped" -eq 2 ] && [ "$partial" -eq 2 ]
