#!/usr/bin/env bash
# A fault-slip catalogue partitioned by region across two shard servers, read
# through postgres_fdw foreign partitions on a coordinator: a GROUP BY on the
# partition key must run striae's aggregates on the shards (partition-wise
# aggregation pushed down whole, asynchronously) and give exactly the result
# of the same rows on one server. Reference: PostgreSQL's own postgres_fdw and
# partitioning (the plan is read from EXPLAIN VERBOSE; "exactly" is compared on
# the text output at extra_float_digits = 3, i.e. bit for bit).
# For groupings that cut across the partitions, the two-phase forms (the
# *_partial aggregates on the shards, X(partial_state) on the coordinator).
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

# Two-phase aggregation for a grouping that cuts across the partitions: every
# site has rows in both regions. The shards run the *_partial aggregates
# (plain aggregates, so with the partition key in the inner GROUP BY they are
# pushed down whole and their partial_state values travel as text), and the
# coordinator merges them with X(partial_state). The answer must equal the
# one-phase aggregate over the same rows on one server: bit for bit where the
# state is integer counts or kept data (density_grid, right_dihedra, the
# bootstrap and joint inversions, stress_phases, misfit_summary), and within
# 1e-9 (relative; degrees for directions) where it is a floating-point sum
# added in another order (stress_inversion, fisher_mean, orientation_tensor,
# mean_plane, fold_axis, moment_tensor_sum; DESIGN.md's bound for serial
# against parallel runs).
T="stress_tensor('000/90'::lineation, '090/00'::lineation, 0.5)"
PARTIALS="stress_inversion_partial(f) AS inv, stress_inversion_partial(f, 40, 7) AS boot,
      focal_stress_inversion_partial(f) AS joint, focal_stress_inversion_partial(f, 0.6, 10, 3) AS joint_boot,
      right_dihedra_partial(f, 10) AS dihedra, fisher_mean_partial(pole(fault_plane(f))) AS fisher_l,
      fisher_mean_partial(fault_plane(f)) AS fisher_p, orientation_tensor_partial(fault_plane(f)) AS fabric,
      mean_plane_partial(fault_plane(f)) AS mean_p, fold_axis_partial(fault_plane(f)) AS fold,
      density_grid_partial(fault_plane(f), 10) AS density, density_grid_partial(p_axis(f), 15) AS density_l,
      stress_phases_partial(f, 2, 1) AS phases, misfit_summary_partial(f, $T, 30) AS misfit,
      moment_tensor_sum_partial(f) AS moment"
MERGES="stress_inversion(inv) AS inv, stress_inversion(boot) AS boot, focal_stress_inversion(joint) AS joint,
      focal_stress_inversion(joint_boot) AS joint_boot, right_dihedra(dihedra) AS dihedra,
      fisher_mean(fisher_l) AS fisher_l, fisher_mean(fisher_p) AS fisher_p, orientation_tensor(fabric) AS fabric,
      mean_plane(mean_p) AS mean_p, fold_axis(fold) AS fold, density_grid(density) AS density,
      density_grid(density_l) AS density_l, stress_phases(phases) AS phases, misfit_summary(misfit) AS misfit,
      moment_tensor_sum(moment) AS moment"
ONEPHASE="$AGGS, stress_phases(f, 2, 1) AS phases, misfit_summary(f, $T, 30) AS misfit, moment_tensor_sum(f) AS moment"
TWO="SELECT site, $MERGES FROM (SELECT region, site, $PARTIALS FROM catalogue GROUP BY region, site) s GROUP BY site"
plan=$(on 1 "${P[@]}" -d "$DB" -At -c "SET enable_partitionwise_aggregate = on" -c "EXPLAIN (VERBOSE, COSTS OFF) $TWO")
remote=$(grep -c "Remote SQL: SELECT .*public.stress_inversion_partial(f).*public.moment_tensor_sum_partial(f).*GROUP BY" <<<"$plan" || true)
async=$(grep -c "Async Foreign Scan" <<<"$plan" || true)
echo "two-phase, GROUP BY site across regions: $remote of 2 foreign scans carry the partial aggregates in their Remote SQL, $async async"
if [ "$remote" -ne 2 ] || [ "$async" -ne 2 ]; then echo "$plan"; fail=1; fi
cmp=$(on 1 "${P[@]}" -d "$DB" -At <<SQL
SET extra_float_digits = 3;
SET enable_partitionwise_aggregate = on;
CREATE TEMP TABLE two AS $TWO;
CREATE TEMP TABLE one AS SELECT site, $ONEPHASE FROM catalogue_all GROUP BY site;
CREATE FUNCTION pg_temp.close(a float8, b float8) RETURNS boolean LANGUAGE sql IMMUTABLE AS
  \$\$ SELECT (a IS NULL AND b IS NULL) OR abs(a - b) <= 1e-9 * greatest(1, abs(a), abs(b)) \$\$;
CREATE FUNCTION pg_temp.close(a float8[], b float8[]) RETURNS boolean LANGUAGE sql IMMUTABLE AS
  \$\$ SELECT cardinality(a) = cardinality(b) AND bool_and(pg_temp.close(x, y)) FROM unnest(a, b) u(x, y) \$\$;
CREATE FUNCTION pg_temp.close(a lineation, b lineation) RETURNS boolean LANGUAGE sql IMMUTABLE AS
  \$\$ SELECT (a IS NULL AND b IS NULL) OR a <-> b <= 1e-9 \$\$;
CREATE FUNCTION pg_temp.close(a plane, b plane) RETURNS boolean LANGUAGE sql IMMUTABLE AS
  \$\$ SELECT (a IS NULL AND b IS NULL) OR a <-> b <= 1e-9 \$\$;
SELECT count(*),
       count(*) FILTER (WHERE one.boot::text = two.boot::text AND one.joint::text = two.joint::text
                          AND one.joint_boot::text = two.joint_boot::text AND one.dihedra::text = two.dihedra::text
                          AND one.density::text = two.density::text AND one.density_l::text = two.density_l::text
                          AND one.phases::text = two.phases::text AND one.misfit::text = two.misfit::text),
       count(*) FILTER (WHERE pg_temp.close(stress_components(one.inv), stress_components(two.inv))
                          AND data_count(one.inv) = data_count(two.inv)
                          AND pg_temp.close((one.fisher_l).mean, (two.fisher_l).mean) AND (one.fisher_l).n = (two.fisher_l).n
                          AND pg_temp.close(ARRAY[(one.fisher_l).resultant, (one.fisher_l).kappa, (one.fisher_l).alpha95],
                                            ARRAY[(two.fisher_l).resultant, (two.fisher_l).kappa, (two.fisher_l).alpha95])
                          AND pg_temp.close((one.fisher_p).mean, (two.fisher_p).mean)
                          AND pg_temp.close(ARRAY[(one.fisher_p).resultant, (one.fisher_p).kappa, (one.fisher_p).alpha95],
                                            ARRAY[(two.fisher_p).resultant, (two.fisher_p).kappa, (two.fisher_p).alpha95])
                          AND pg_temp.close((one.fabric).e1, (two.fabric).e1) AND pg_temp.close((one.fabric).e3, (two.fabric).e3)
                          AND pg_temp.close(ARRAY[(one.fabric).s1, (one.fabric).s2, (one.fabric).s3],
                                            ARRAY[(two.fabric).s1, (two.fabric).s2, (two.fabric).s3])
                          AND pg_temp.close(one.mean_p, two.mean_p) AND pg_temp.close(one.fold, two.fold)
                          AND (one.moment).n = (two.moment).n AND pg_temp.close((one.moment).summed, (two.moment).summed)
                          AND pg_temp.close((one.moment).p_axis, (two.moment).p_axis)
                          AND pg_temp.close((one.moment).t_axis, (two.moment).t_axis)),
       count(*) FILTER (WHERE one.inv::text = two.inv::text AND one.fisher_l::text = two.fisher_l::text
                          AND one.fisher_p::text = two.fisher_p::text AND one.fabric::text = two.fabric::text
                          AND one.mean_p::text = two.mean_p::text AND one.fold::text = two.fold::text
                          AND one.moment::text = two.moment::text),
       count(*) FILTER (WHERE NOT (one IS NOT NULL) OR NOT (two IS NOT NULL))
  FROM one JOIN two USING (site);
SQL
)
IFS='|' read -r groups exact close bitwise nulls <<<"$cmp"
echo "  $groups groups: $exact bit-identical in the exact kinds, $close within 1e-9 in the floating-point sums ($bitwise of them bit-identical too), $nulls with a NULL result"
[ "$groups" -gt 1 ] && [ "$exact" = "$groups" ] && [ "$close" = "$groups" ] && [ "$nulls" = 0 ] || fail=1
# merging in stages: merge_partial per site over the shards' partials, then the
# final merge, equals the one-phase right dihedra of the site
staged=$(on 1 "${P[@]}" -d "$DB" -At -c "SET enable_partitionwise_aggregate = on" -c "
  SELECT count(*) FILTER (WHERE a = b), count(*) FROM (
    SELECT site, right_dihedra(m)::text AS a, (SELECT right_dihedra(f, 10)::text FROM catalogue_all c WHERE c.site = s.site) AS b
      FROM (SELECT site, merge_partial(p) AS m
              FROM (SELECT region, site, right_dihedra_partial(f, 10) AS p FROM catalogue GROUP BY region, site) x
             GROUP BY site) s GROUP BY site) t")
echo "  merging in stages (merge_partial, then right_dihedra): ${staged%%|*} of ${staged##*|} sites equal one server"
[ "${staged%%|*}" = "${staged##*|}" ] || fail=1
[ $fail -eq 0 ] && echo "check_sharding: ok"
[ $fail -eq 0 ]
