#!/usr/bin/env bash
# Binary COPY and pg_dump/pg_restore round trips for every type: the data read
# back must equal the data written, bit for bit (compared with exact '=' and
# with the text at extra_float_digits = 3). Reference: PostgreSQL's own COPY
# BINARY and pg_dump (they call the types' send/recv and out/in functions).
set -euo pipefail
SRC=striae_rt_src
DST=striae_rt_dst
dropdb --if-exists "$SRC"; dropdb --if-exists "$DST"
createdb "$SRC"; createdb "$DST"
W="$(mktemp -d)"
trap 'rm -rf "$W"; dropdb --if-exists "$SRC"; dropdb --if-exists "$DST"' EXIT
psql -X -q -v ON_ERROR_STOP=1 -d "$SRC" <<'SQL'
CREATE EXTENSION striae;
CREATE TABLE d (i int PRIMARY KEY, p plane, l lineation, f fault_slip);
-- irrational values exercise the shortest round-trip output
INSERT INTO d SELECT g, plane((g * 0.7071067811865476) % 360, (g * 0.3183098861837907) % 90),
                     lineation((g * 1.4142135623730951) % 360, (g * 0.5772156649015329) % 90),
                     fault_slip((g * 2.718281828459045) % 360, (g * 0.6180339887498949) % 90,
                                (g * 3.141592653589793) % 360 - 180)
  FROM generate_series(1, 2000) g;
INSERT INTO d VALUES (0, NULL, NULL, NULL);
SQL
# binary COPY out and in
psql -X -q -v ON_ERROR_STOP=1 -d "$SRC" -c "\\copy d TO '$W/d.bin' WITH (FORMAT binary)"
psql -X -q -v ON_ERROR_STOP=1 -d "$SRC" -c "CREATE TABLE d2 (LIKE d)" -c "\\copy d2 FROM '$W/d.bin' WITH (FORMAT binary)"
bad=$(psql -X -At -d "$SRC" -c "SELECT count(*) FROM d FULL JOIN d2 USING (i)
  WHERE d.p IS DISTINCT FROM d2.p OR d.l IS DISTINCT FROM d2.l OR d.f IS DISTINCT FROM d2.f")
echo "binary COPY: $bad mismatching rows of 2001"
[ "$bad" = 0 ]
# stress_tensor and sphere_grid (no '=' operator: compared by their text, which
# round-trips exactly at extra_float_digits = 3), from real aggregate results
psql -X -q -v ON_ERROR_STOP=1 -d "$SRC" <<'SQL'
CREATE TABLE r AS
  SELECT i % 8 AS k, stress_inversion(f) AS s, stress_inversion(f, 20, i % 8) AS sb,
         right_dihedra(f, 10) AS g, density_grid(l, 15) AS dg,
         net_label(net_faults(f), 'site ' || (i % 8)) || net_stress(stress_inversion(f, 20, i % 8))
           || net_contours(right_dihedra(f, 10), '{10, 50}') || net_lines(l) AS fig
    FROM d WHERE i > 0 GROUP BY i % 8;
SQL
psql -X -q -v ON_ERROR_STOP=1 -d "$SRC" -c "\copy r TO '$W/r.bin' WITH (FORMAT binary)"
psql -X -q -v ON_ERROR_STOP=1 -d "$SRC" -c "CREATE TABLE r2 (LIKE r)" -c "\copy r2 FROM '$W/r.bin' WITH (FORMAT binary)"
bad=$(psql -X -q -At -d "$SRC" -c "SET extra_float_digits = 3" -c "SELECT count(*) FROM r FULL JOIN r2 USING (k)
  WHERE r.s::text IS DISTINCT FROM r2.s::text OR r.sb::text IS DISTINCT FROM r2.sb::text
     OR r.g::text IS DISTINCT FROM r2.g::text OR r.dg::text IS DISTINCT FROM r2.dg::text
     OR r.fig::text IS DISTINCT FROM r2.fig::text")
nulls=$(psql -X -q -At -d "$SRC" -c "SELECT count(*) FROM r WHERE s IS NULL OR sb IS NULL OR g IS NULL OR dg IS NULL OR fig IS NULL")
echo "binary COPY of stress_tensor, sphere_grid and net_figure: $bad mismatching rows of 8 ($nulls with NULLs)"
[ "$bad" = 0 ] && [ "$nulls" = 0 ]
# a corrupted binary value is rejected with a clean error (wrong version byte)
psql -X -q -d "$SRC" -c "CREATE TABLE d3 (LIKE d)" >/dev/null
/usr/bin/python3 - "$W/d.bin" "$W/bad.bin" <<'PY'
import sys
data = bytearray(open(sys.argv[1], "rb").read())
# header is 19 bytes; first tuple: int16 count, then int32 len + int4, then int32 len 17 + version byte
off = 19 + 2 + 4 + 4 + 4
assert data[off] == 1, data[off]
data[off] = 9
open(sys.argv[2], "wb").write(data)
PY
if out=$(psql -X -q -d "$SRC" -c "\\copy d3 FROM '$W/bad.bin' WITH (FORMAT binary)" 2>&1); then
  echo "corrupted binary input was accepted"; exit 1
fi
echo "$out" | grep -q "invalid binary format version 9 for type plane" || { echo "unexpected: $out"; exit 1; }
echo "binary COPY: corrupted version byte rejected"
# partial_state (two-phase aggregation): partials of every kind through binary
# COPY, and corrupted binary partials rejected with 22P03 (the binary input
# validates exactly as the text input does)
psql -X -q -v ON_ERROR_STOP=1 -d "$SRC" <<'SQL'
CREATE TABLE pt AS SELECT row_number() OVER () AS k, x AS p FROM (
  SELECT fisher_mean_partial(l) FROM d UNION ALL SELECT fisher_mean_partial(p) FROM d
  UNION ALL SELECT orientation_tensor_partial(l) FROM d UNION ALL SELECT density_grid_partial(p, 10) FROM d
  UNION ALL SELECT stress_inversion_partial(f) FROM d UNION ALL SELECT stress_inversion_partial(f, 10, 1) FROM d
  UNION ALL SELECT right_dihedra_partial(f, 15) FROM d UNION ALL SELECT focal_stress_inversion_partial(f, 0.6) FROM d
  UNION ALL SELECT focal_stress_inversion_partial(f, 0.6, 5, 2) FROM d UNION ALL SELECT stress_phases_partial(f, 2, 1) FROM d
  UNION ALL SELECT misfit_summary_partial(f, stress_tensor('000/90', '090/00', 0.5), 30) FROM d
  UNION ALL SELECT moment_tensor_sum_partial(f, 5) FROM d UNION ALL SELECT NULL::partial_state) s(x);
SQL
psql -X -q -v ON_ERROR_STOP=1 -d "$SRC" -c "\copy pt TO '$W/pt.bin' WITH (FORMAT binary)"
psql -X -q -v ON_ERROR_STOP=1 -d "$SRC" -c "CREATE TABLE pt2 (LIKE pt)" -c "\copy pt2 FROM '$W/pt.bin' WITH (FORMAT binary)"
bad=$(psql -X -q -At -d "$SRC" -c "SELECT count(*) FROM pt FULL JOIN pt2 USING (k) WHERE pt.p::text IS DISTINCT FROM pt2.p::text
  OR partial_state_send(pt.p) IS DISTINCT FROM partial_state_send(pt2.p)")
kinds=$(psql -X -q -At -d "$SRC" -c "SELECT count(DISTINCT partial_kind(p)) FROM pt")
echo "binary COPY of partial_state: $bad mismatching rows of 13 ($kinds kinds)"
[ "$bad" = 0 ] && [ "$kinds" = 12 ]
psql -X -q -v ON_ERROR_STOP=1 -d "$SRC" -c "\copy (SELECT p FROM pt WHERE partial_kind(p) = 'stress_inversion/fault_slip') TO '$W/p1.bin' WITH (FORMAT binary)"
psql -X -q -d "$SRC" -c "CREATE TABLE pt3 (p partial_state)" >/dev/null
for how in kind truncated count; do
  /usr/bin/python3 - "$W/p1.bin" "$W/pbad.bin" "$how" <<'PY'
import struct, sys
data = bytearray(open(sys.argv[1], "rb").read())
# 19-byte header, int16 field count, int32 length, then the value: 16-byte
# partial header (magic "Stag", kind, input, reserved), then the stress state
# (magic "SST1", int64 count, sums)
off = 19 + 2
(n,) = struct.unpack(">i", data[off:off + 4])
v = off + 4
assert data[v:v + 4] == b"Stag", data[v:v + 4]
if sys.argv[3] == "kind":
    data[v + 4] = 99                      # a kind no partial carries
elif sys.argv[3] == "truncated":
    data[off:off + 4] = struct.pack(">i", n - 8)
    del data[v + n - 8:v + n]             # the last sum cut off
else:
    data[v + 16 + 4 + 7] = 0x40           # count far beyond the data the sums hold
open(sys.argv[2], "wb").write(data)
PY
  if out=$(psql -X -q -v VERBOSITY=verbose -d "$SRC" -c "\copy pt3 FROM '$W/pbad.bin' WITH (FORMAT binary)" 2>&1); then
    echo "corrupted binary partial ($how) was accepted"; exit 1
  fi
  echo "$out" | grep -q "22P03: invalid binary data for type partial_state" || { echo "unexpected ($how): $out"; exit 1; }
  echo "binary COPY: corrupted partial_state ($how) rejected: $(echo "$out" | sed -n 's/^DETAIL: *//p' | head -1 | cut -c1-110)"
done
# dump and restore
pg_dump -Fc -d "$SRC" -t d -t r -t pt -f "$W/d.dump"
psql -X -q -d "$DST" -c "CREATE EXTENSION striae"
pg_restore -d "$DST" "$W/d.dump"
a=$(psql -X -q -At -d "$SRC" -c "SET extra_float_digits = 3" -c "SELECT md5(string_agg(p::text || l::text || f::text, ',' ORDER BY i)) FROM d")
b=$(psql -X -q -At -d "$DST" -c "SET extra_float_digits = 3" -c "SELECT md5(string_agg(p::text || l::text || f::text, ',' ORDER BY i)) FROM d")
echo "dump/restore: source $a, restored $b"
[ "$a" = "$b" ]
q="SELECT md5(string_agg(s::text || sb::text || g::text || dg::text, ',' ORDER BY k)) FROM r"
a=$(psql -X -q -At -d "$SRC" -c "SET extra_float_digits = 3" -c "$q")
b=$(psql -X -q -At -d "$DST" -c "SET extra_float_digits = 3" -c "$q")
echo "dump/restore of stress_tensor and sphere_grid: source $a, restored $b"
[ "$a" = "$b" ]
q="SELECT md5(string_agg(coalesce(p::text, 'NULL'), ',' ORDER BY k)) FROM pt"
a=$(psql -X -q -At -d "$SRC" -c "$q")
b=$(psql -X -q -At -d "$DST" -c "$q")
echo "dump/restore of partial_state: source $a, restored $b"
[ "$a" = "$b" ]
# the text output at default settings also reads back exactly
bad=$(psql -X -At -d "$DST" -c "SELECT count(*) FROM d WHERE p::text::plane <> p OR l::text::lineation <> l OR f::text::fault_slip <> f")
echo "text round trip: $bad mismatching rows"
[ "$bad" = 0 ]
# cone: binary COPY and text round trips; a table with GiST indexes dumped and
# restored (pg_restore rebuilds the indexes) answers nearest-neighbour and cone
# searches through the index exactly as the source does
psql -X -q -v ON_ERROR_STOP=1 -d "$SRC" <<'SQL'
CREATE TABLE c AS SELECT i, cone(l, (i * 0.6180339887498949) % 90) AS lc, cone(p, (i * 0.5772156649015329) % 90) AS pc
  FROM d WHERE i > 0;
CREATE TABLE e AS SELECT i, l, p FROM d;
CREATE INDEX e_l ON e USING gist (l);
CREATE INDEX e_p ON e USING gist (p);
SQL
psql -X -q -v ON_ERROR_STOP=1 -d "$SRC" -c "\copy c TO '$W/c.bin' WITH (FORMAT binary)"
psql -X -q -v ON_ERROR_STOP=1 -d "$SRC" -c "CREATE TABLE c2 (LIKE c)" -c "\copy c2 FROM '$W/c.bin' WITH (FORMAT binary)"
bad=$(psql -X -q -At -d "$SRC" -c "SET extra_float_digits = 3" -c "SELECT count(*) FROM c FULL JOIN c2 USING (i)
  WHERE c.lc::text IS DISTINCT FROM c2.lc::text OR c.pc::text IS DISTINCT FROM c2.pc::text
     OR c.lc::text::cone::text IS DISTINCT FROM c.lc::text OR c.pc::text::cone::text IS DISTINCT FROM c.pc::text")
echo "cone: binary COPY and text round trip, $bad mismatching rows of 2000"
[ "$bad" = 0 ]
pg_dump -Fc -d "$SRC" -t e -f "$W/e.dump"
pg_restore -d "$DST" "$W/e.dump"
q="SET enable_seqscan = off; SELECT md5(string_agg(x, ',' ORDER BY x)) FROM (
     SELECT (SELECT string_agg(i::text, ' ' ORDER BY l <-> c.lc_axis, i) FROM (SELECT i, l FROM e ORDER BY l <-> c.lc_axis LIMIT 7) k)
            || '|' || (SELECT count(*) FROM e WHERE p <@ cone(plane_from_pole(c.lc_axis), 10)) AS x
       FROM (SELECT lineation((g * 37) % 360, (g * 11) % 90) AS lc_axis FROM generate_series(1, 50) g) c) s"
a=$(psql -X -q -At -d "$SRC" -c "$q")
b=$(psql -X -q -At -d "$DST" -c "$q")
plan=$(psql -X -q -At -d "$DST" -c "SET enable_seqscan = off" -c "EXPLAIN (COSTS OFF) SELECT i FROM e ORDER BY l <-> '10/10' LIMIT 7")
echo "$plan" | grep -q "Index Scan using e_l" || { echo "restored GiST index not used: $plan"; exit 1; }
echo "dump/restore with GiST indexes: source $a, restored $b (restored index used)"
[ "$a" = "$b" ]
echo "check_roundtrip: ok"
