#!/usr/bin/env bash
# Concurrency: a bounded pgbench run (PostgreSQL's own load driver) on the
# throwaway cluster's Unix socket. Several clients insert fault-slip data and
# lineations into 8 sites while others run the grouped inversions and
# statistics, serial and with forced parallel plans, for STRIAE_PGBENCH_SECONDS
# (default 20) at a bounded rate. Checks:
#  - pgbench reports no failed transaction and no aborted client;
#  - every grouped result a client recorded under load (with the snapshot its
#    statement saw, pg_current_snapshot()) equals, as text, the same query
#    recomputed afterwards, serially, over exactly the rows visible in that
#    snapshot (pg_visible_in_snapshot of each row's inserting transaction);
#  - on the final table, forced parallel plans agree with the serial run.
set -euo pipefail
DB=striae_concurrency
SECS="${STRIAE_PGBENCH_SECONDS:-20}"
PGBENCH="$(pg_config --bindir)/pgbench"
W="$(mktemp -d)"
trap 'rm -rf "$W"; dropdb --if-exists "$DB" >/dev/null 2>&1 || true' EXIT
dropdb --if-exists "$DB" 2>/dev/null
createdb "$DB"
q() { psql -X -q -At -v ON_ERROR_STOP=1 -d "$DB" "$@"; }

q <<'SQL'
CREATE EXTENSION striae;
-- tx: the inserting transaction, so that any snapshot's rows can be selected again
CREATE TABLE obs (id bigserial PRIMARY KEY, site int NOT NULL, f fault_slip NOT NULL, l lineation NOT NULL,
                  tx xid8 NOT NULL DEFAULT pg_current_xact_id());
CREATE TABLE recorded (id bigserial PRIMARY KEY, snap pg_snapshot, site int, n bigint, linear text,
                       focal text, boot text, dihedra text, fisher text, fabric text);
-- the grouped results under test, over the rows a snapshot sees (NULL: the
-- statement's own snapshot)
CREATE FUNCTION grouped(s pg_snapshot) RETURNS TABLE (site int, n bigint, linear text, focal text, boot text,
                                                      dihedra text, fisher text, fabric text)
LANGUAGE sql STABLE AS $$
  SELECT site, count(*), stress_inversion(f)::text, focal_stress_inversion(f, 0.6)::text,
         stress_inversion(f, 10, 7)::text, right_dihedra(f, 15)::text, fisher_mean(l)::text,
         orientation_tensor(l)::text
    FROM obs WHERE s IS NULL OR pg_visible_in_snapshot(tx, s) GROUP BY site $$;
-- invented starting data: 30 rows per site
INSERT INTO obs (site, f, l)
  SELECT 1 + g % 8, fault_slip((g * 29.3) % 360, 5 + (g * 11.1) % 80, (g * 47.7) % 360 - 180),
         lineation((g * 37.1) % 360, (g * 13.3) % 90)
    FROM generate_series(1, 240) g;
SQL

cat >"$W/insert.sql" <<'SQL'
\set site random(1, 8)
INSERT INTO obs (site, f, l)
  SELECT :site, fault_slip(random() * 360, 5 + random() * 80, random() * 360 - 180),
         lineation(random() * 360, random() * 90)
    FROM generate_series(1, 4);
SQL
# grouped inversions and statistics, recorded with the statement's snapshot
cat >"$W/record.sql" <<'SQL'
INSERT INTO recorded (snap, site, n, linear, focal, boot, dihedra, fisher, fabric)
  SELECT pg_current_snapshot(), * FROM grouped(NULL);
SQL
# the same aggregates with a forced parallel plan (partial states serialized,
# combined across workers) while the table grows
cat >"$W/parallel.sql" <<'SQL'
SET parallel_setup_cost = 0;
SET parallel_tuple_cost = 0;
SET min_parallel_table_scan_size = 0;
SELECT site, count(*), stress_inversion(f), right_dihedra(f, 15), fisher_mean(l), density_grid(l, 10),
       focal_stress_inversion(f, 0.6)
  FROM obs GROUP BY site;
SQL

SECONDS=0
"$PGBENCH" -n -c 6 -j 2 -T "$SECS" -R 60 --random-seed=11 \
  -f "$W/insert.sql@6" -f "$W/record.sql@2" -f "$W/parallel.sql@1" "$DB" >"$W/pgbench.out" 2>&1 || {
  cat "$W/pgbench.out"
  echo "pgbench failed"
  exit 1
}
elapsed=$SECONDS
grep -E "number of (transactions actually processed|failed transactions)|latency average|^tps" "$W/pgbench.out" |
  sed 's/^/  pgbench: /'
failed=$(sed -n 's/^number of failed transactions: \([0-9]*\).*/\1/p' "$W/pgbench.out")
processed=$(sed -n 's/^number of transactions actually processed: \([0-9]*\).*/\1/p' "$W/pgbench.out")
if [ "${failed:-x}" != 0 ] || grep -qi "aborted" "$W/pgbench.out"; then
  cat "$W/pgbench.out"
  echo "pgbench: failed transactions or aborted clients"
  exit 1
fi
[ "${processed:-0}" -gt 0 ] || { echo "pgbench processed no transaction"; exit 1; }

rows=$(q -c "SELECT count(*) FROM obs")
snaps=$(q -c "SELECT count(DISTINCT snap::text) FROM recorded")
echo "  load: $rows rows in 8 sites after ${elapsed} s, $snaps recorded snapshots"
[ "$snaps" -gt 0 ] || { echo "no result was recorded under load"; exit 1; }

# Recompute serially for up to 40 recorded snapshots (evenly spaced, the last
# always included) and compare every recorded row as text. pg_snapshot has no
# equality operator: snapshots are matched by their text.
read -r checked mismatched < <(q -F ' ' <<'SQL'
SET max_parallel_workers_per_gather = 0;
WITH s AS (
  SELECT snap::text AS key, min(snap::text)::pg_snapshot AS snap, min(id) AS first FROM recorded GROUP BY 1
), numbered AS (
  SELECT key, snap, row_number() OVER (ORDER BY first) AS k, count(*) OVER () AS total FROM s
), chosen AS (
  SELECT key, snap FROM numbered WHERE k = total OR (k - 1) % greatest(1, total / 40) = 0
), rec AS (
  SELECT c.key, r.* FROM recorded r JOIN chosen c ON r.snap::text = c.key
), recomputed AS (
  SELECT c.key, g.* FROM chosen c, LATERAL grouped(c.snap) g
), cmp AS (
  SELECT coalesce(rec.key, recomputed.key) AS key,
         (rec.n, rec.linear, rec.focal, rec.boot, rec.dihedra, rec.fisher, rec.fabric) IS NOT DISTINCT FROM
         (recomputed.n, recomputed.linear, recomputed.focal, recomputed.boot, recomputed.dihedra,
          recomputed.fisher, recomputed.fabric) AS same
    FROM rec FULL JOIN recomputed ON rec.key = recomputed.key AND rec.site = recomputed.site
)
SELECT count(DISTINCT key), count(*) FILTER (WHERE NOT same) FROM cmp;
SQL
)
echo "  recorded under load vs serial recomputation: $checked snapshots compared, $mismatched rows differ"
[ "$mismatched" = 0 ] && [ "$checked" -gt 0 ] || exit 1

# Final table: forced parallel plans against the serial run.
bad=$(q <<'SQL'
SET max_parallel_workers_per_gather = 0;
CREATE TEMP TABLE ser AS
  SELECT site, count(*) n, stress_inversion(f) s, right_dihedra(f, 15) d, fisher_mean(l) fm,
         focal_stress_inversion(f, 0.6) fo FROM obs GROUP BY site;
SET max_parallel_workers_per_gather = 2;
SET parallel_setup_cost = 0;
SET parallel_tuple_cost = 0;
SET min_parallel_table_scan_size = 0;
CREATE TEMP TABLE par AS
  SELECT site, count(*) n, stress_inversion(f) s, right_dihedra(f, 15) d, fisher_mean(l) fm,
         focal_stress_inversion(f, 0.6) fo FROM obs GROUP BY site;
-- linear sums may differ in the last bits with the order of partial sums (1e-9 is
-- DESIGN.md's agreement bound); counts and kept-data results are exact
SELECT count(*) FROM ser FULL JOIN par USING (site)
 WHERE ser.n IS DISTINCT FROM par.n OR ser.d::text IS DISTINCT FROM par.d::text
    OR ser.fo::text IS DISTINCT FROM par.fo::text
    OR (SELECT max(abs(a - b)) FROM unnest(stress_components(ser.s), stress_components(par.s)) x(a, b)) > 1e-9
    OR abs((ser.fm).resultant - (par.fm).resultant) > 1e-9 OR (ser.fm).mean <-> (par.fm).mean > 1e-9;
SQL
)
echo "  final table, parallel vs serial: $bad of 8 sites differ"
[ "$bad" = 0 ]
echo "check_concurrency: ok"
