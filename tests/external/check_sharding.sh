#!/usr/bin/env bash
# A fault-slip catalogue partitioned by region across two shard servers, read
# through postgres_fdw foreign partitions on a coordinator: a GROUP BY on the
# partition key must run striae's aggregates on the shards (partition-wise
# aggregation pushed down whole, asynchronously) and give exactly the result
# of the same rows on one server. Reference: PostgreSQL's own postgres_fdw and
# partitioning (the plan is read from EXPLAIN VERBOSE; "exactly" is compared on
# the text output at extra_float_digits = 3, i.e. bit for bit).
# Needs scripts/with-cluster.sh --install --clusters 3 (cluster 1 coordinator).
set -euo pipefail
if [ "${STRIAE_CLUSTERS:-1}" -lt 3 ]; then
  echo "check_sharding: needs three clusters (scripts/with-cluster.sh --clusters 3)" >&2
  exit 1
fi
DB=striae_shard
P=(psql -X -q -v ON_ERROR_STOP=1)
on() { local k=$1; shift; PGHOST="$(eval echo "\$STRIAE_HOST_$k")" PGPORT="$(eval echo "\$STRIAE_PORT_$k")" "$@"; }
cleanup() { for k in 1 2 3; do on "$k" dropdb --if-exists "$DB" 2>/dev/null || true; done; }
trap cleanup EXIT
cleanup
for k in 1 2 3; do on "$k" createdb "$DB"; on "$k" "${P[@]}" -d "$DB" -c "CREATE EXTENSION striae"; done

# the whole catalogue on the coordinator, as the one-server reference
on 1 "${P[@]}" -d "$DB" <<'SQL'
CREATE TABLE catalogue_all (region text NOT NULL, site int NOT NULL, f fault_slip NOT NULL);
INSERT INTO catalogue_all
  SELECT CASE WHEN g % 3 = 0 THEN 'south' ELSE 'north' END, g % 7,
         fault_slip((g * 2.718281828459045) % 360, 5 + (g * 0.6180339887498949) % 85,
                    (g * 3.141592653589793) % 360 - 180)
    FROM generate_series(1, 3000) g;
SQL
# each shard holds its region, in the same row order
for r in north:2 south:3; do
  region=${r%%:*}; k=${r##*:}
  on "$k" "${P[@]}" -d "$DB" -c "CREATE TABLE catalogue_part (region text NOT NULL, site int NOT NULL, f fault_slip NOT NULL)"
  on 1 psql -X -q -d "$DB" -c "\\copy (SELECT * FROM catalogue_all WHERE region = '$region') TO STDOUT" |
    on "$k" psql -X -q -v ON_ERROR_STOP=1 -d "$DB" -c "\\copy catalogue_part FROM STDIN"
  on "$k" "${P[@]}" -d "$DB" -c "ANALYZE catalogue_part"
done

# the coordinator: a partitioned table whose partitions are foreign tables
on 1 "${P[@]}" -d "$DB" <<SQL
CREATE EXTENSION postgres_fdw;
CREATE SERVER shard_north FOREIGN DATA WRAPPER postgres_fdw
  OPTIONS (host '$STRIAE_HOST_2', port '$STRIAE_PORT_2', dbname '$DB', extensions 'striae', async_capable 'true');
CREATE SERVER shard_south FOREIGN DATA WRAPPER postgres_fdw
  OPTIONS (host '$STRIAE_HOST_3', port '$STRIAE_PORT_3', dbname '$DB', extensions 'striae', async_capable 'true');
CREATE USER MAPPING FOR CURRENT_USER SERVER shard_north OPTIONS (user 'postgres');
CREATE USER MAPPING FOR CURRENT_USER SERVER shard_south OPTIONS (user 'postgres');
CREATE TABLE catalogue (region text NOT NULL, site int NOT NULL, f fault_slip NOT NULL) PARTITION BY LIST (region);
CREATE FOREIGN TABLE catalogue_north PARTITION OF catalogue FOR VALUES IN ('north')
  SERVER shard_north OPTIONS (table_name 'catalogue_part');
CREATE FOREIGN TABLE catalogue_south PARTITION OF catalogue FOR VALUES IN ('south')
  SERVER shard_south OPTIONS (table_name 'catalogue_part');
ANALYZE catalogue;
SQL

# every aggregate of striae, grouped by the partition key (and by key + site)
AGGS="stress_inversion(f) AS inv, stress_inversion(f, 40, 7) AS boot, focal_stress_inversion(f) AS joint,
      focal_stress_inversion(f, 0.6, 10, 3) AS joint_boot, right_dihedra(f, 10) AS dihedra,
      fisher_mean(pole(fault_plane(f))) AS fisher_l, fisher_mean(fault_plane(f)) AS fisher_p,
      orientation_tensor(fault_plane(f)) AS fabric, mean_plane(fault_plane(f)) AS mean_p,
      fold_axis(fault_plane(f)) AS fold, density_grid(fault_plane(f), 10) AS density,
      density_grid(p_axis(f), 15) AS density_l"
fail=0
for keys in "region" "region, site"; do
  q="SELECT $keys, $AGGS FROM %s GROUP BY $keys ORDER BY $keys"
  plan=$(on 1 "${P[@]}" -d "$DB" -At -c "SET enable_partitionwise_aggregate = on" \
           -c "EXPLAIN (VERBOSE, COSTS OFF) $(printf "$q" catalogue)")
  remote=$(grep -c "Remote SQL: SELECT .*public.stress_inversion(f).*public.right_dihedra(f, 10.*GROUP BY" <<<"$plan" || true)
  async=$(grep -c "Async Foreign Scan" <<<"$plan" || true)
  local_agg=$(grep -c -E "^\s*(->\s*)?(Finalize |Partial )?(Hash|Group)?Aggregate" <<<"$plan" || true)
  echo "GROUP BY $keys: $remote of 2 foreign scans carry the aggregates in their Remote SQL, $async async, $local_agg local aggregate nodes"
  if [ "$remote" -ne 2 ] || [ "$async" -ne 2 ] || [ "$local_agg" -ne 0 ]; then
    echo "$plan"; fail=1
  fi
  a=$(on 1 "${P[@]}" -d "$DB" -At -c "SET extra_float_digits = 3" -c "SET enable_partitionwise_aggregate = on" \
        -c "SELECT md5(string_agg(t::text, E'\n')), count(*) FROM ($(printf "$q" catalogue)) t")
  b=$(on 1 "${P[@]}" -d "$DB" -At -c "SET extra_float_digits = 3" \
        -c "SELECT md5(string_agg(t::text, E'\n')), count(*) FROM ($(printf "$q" catalogue_all)) t")
  nulls=$(on 1 "${P[@]}" -d "$DB" -At -c "SELECT count(*) FROM ($(printf "$q" catalogue_all)) t WHERE NOT (t IS NOT NULL)")
  echo "  sharded ${a%%|*} (${a##*|} groups), one server ${b%%|*} (${b##*|} groups), $nulls groups with a NULL result"
  [ "$a" = "$b" ] && [ "${a##*|}" -gt 1 ] && [ "$nulls" -eq 0 ] || fail=1
done
[ -n "${SHOWPLAN:-}" ] && echo "$plan"
[ $fail -eq 0 ] && echo "check_sharding: ok"
[ $fail -eq 0 ]
