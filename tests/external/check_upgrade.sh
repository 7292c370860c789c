#!/usr/bin/env bash
# ALTER EXTENSION striae UPDATE from the released 0.1.0, as an operator does it:
# a database created with 0.1.0's library and SQL holds data of every type,
# indexes and stored results; the new package replaces the library; the update
# runs. Checks (reference: PostgreSQL's extension update mechanism, the
# catalogue itself):
#   1. the updated database's extension is object for object the same as a
#      fresh install of the current version (upgrade_catalog.sql);
#   2. stored values, indexes and the results of every 0.1.0 function and
#      aggregate are unchanged (upgrade_results.sql), except the lines that
#      upgrade_expected_changes.txt names with the reason;
#   3. the released install script is byte-identical to the one 0.1.0 built
#      (a released script is never edited).
# The old library is built from the git history (the 0.1.0 release commit).
# Needs STRIAE_DESTDIR (with-cluster.sh --install) for the new version.
set -euo pipefail
cd "$(dirname "$0")"
HERE="$PWD"
ROOT="$(cd ../.. && pwd)"
RELEASE_0_1_0=ec46ec2d5f753eeef59205c65b1b0ca38a79fd0d
: "${STRIAE_DESTDIR:?run under scripts/with-cluster.sh --install}"
W="$STRIAE_SCRATCH/upgrade"
rm -rf "$W"; mkdir -p "$W"
FRESH=striae_up_fresh
OLD=striae_up_old
cleanup() { dropdb --if-exists "$FRESH" 2>/dev/null; dropdb --if-exists "$OLD" 2>/dev/null; }
trap cleanup EXIT
cleanup

if ! git -C "$ROOT" cat-file -e "$RELEASE_0_1_0^{commit}" 2>/dev/null; then
  echo "check_upgrade: the 0.1.0 release commit is not in this clone's history (shallow clone?)" >&2
  exit 1
fi
echo "building the 0.1.0 library from $RELEASE_0_1_0"
mkdir -p "$W/src"
git -C "$ROOT" archive "$RELEASE_0_1_0" | tar -x -C "$W/src"
make -s -C "$W/src" -j2 >"$W/build.log" 2>&1 || { tail -30 "$W/build.log"; exit 1; }
make -s -C "$W/src" install DESTDIR="$W/inst" >>"$W/build.log" 2>&1 || { tail -30 "$W/build.log"; exit 1; }
chmod -R a+rX "$W"
share="$(pg_config --sharedir)/extension"
cmp "$W/inst$share/striae--0.1.0.sql" "$STRIAE_DESTDIR$share/striae--0.1.0.sql" ||
  { echo "the released install script striae--0.1.0.sql was edited"; exit 1; }
echo "released script striae--0.1.0.sql: identical to the release"

PSQL=(psql -X -q -v ON_ERROR_STOP=1)
# 0.1.0: old library (extension_destdir of this session only) and its own SQL
createdb "$OLD"
PGOPTIONS="-c extension_destdir=$W/inst" "${PSQL[@]}" -d "$OLD" <<'SQL'
CREATE EXTENSION striae VERSION '0.1.0';
CREATE TABLE u_data (i int PRIMARY KEY, p plane, l lineation, f fault_slip);
INSERT INTO u_data SELECT g, plane((g * 0.7071067811865476) % 360, (g * 0.3183098861837907) % 90),
                     lineation((g * 1.4142135623730951) % 360, (g * 0.5772156649015329) % 90),
                     fault_slip((g * 2.718281828459045) % 360, 5 + (g * 0.6180339887498949) % 85,
                                (g * 3.141592653589793) % 360 - 180)
  FROM generate_series(1, 600) g;
INSERT INTO u_data VALUES (0, NULL, NULL, NULL);
CREATE INDEX u_data_p ON u_data (p);
CREATE INDEX u_data_f ON u_data USING hash (f);
CREATE TABLE u_results AS
  SELECT i % 6 AS k, stress_inversion(f) AS s, stress_inversion(f, 20, i % 6) AS sb,
         focal_stress_inversion(f) AS fj, right_dihedra(f, 10) AS g, density_grid(l, 15) AS dg,
         fisher_mean(l) AS fm, orientation_tensor(p) AS ot
    FROM u_data WHERE i > 0 GROUP BY i % 6;
SQL
PGOPTIONS="-c extension_destdir=$W/inst" "${PSQL[@]}" -d "$OLD" -f "$HERE/upgrade_results.sql" >"$W/before.txt"
v=$(psql -X -At -d "$OLD" -c "SELECT extversion FROM pg_extension WHERE extname = 'striae'")
[ "$v" = 0.1.0 ] || { echo "expected 0.1.0 installed, found $v"; exit 1; }

# the new package: default extension_destdir is the current install
"${PSQL[@]}" -d "$OLD" -c "ALTER EXTENSION striae UPDATE"
v=$(psql -X -At -d "$OLD" -c "SELECT extversion FROM pg_extension WHERE extname = 'striae'")
cur=$(sed -n "s/^default_version = '\(.*\)'/\1/p" "$ROOT/striae.control")
[ "$v" = "$cur" ] || { echo "ALTER EXTENSION UPDATE left version $v, expected $cur"; exit 1; }
echo "ALTER EXTENSION striae UPDATE: 0.1.0 -> $v"
"${PSQL[@]}" -d "$OLD" -f "$HERE/upgrade_results.sql" >"$W/after.txt"

createdb "$FRESH"
"${PSQL[@]}" -d "$FRESH" -c "CREATE EXTENSION striae"
"${PSQL[@]}" -d "$FRESH" -f "$HERE/upgrade_catalog.sql" >"$W/fresh.cat"
"${PSQL[@]}" -d "$OLD" -f "$HERE/upgrade_catalog.sql" >"$W/updated.cat"
n=$(wc -l <"$W/fresh.cat")
if ! diff -u "$W/fresh.cat" "$W/updated.cat" >"$W/cat.diff"; then
  echo "catalogue of the updated database differs from a fresh install of $cur (- fresh, + updated):"
  head -60 "$W/cat.diff"
  exit 1
fi
echo "catalogue: updated database equals a fresh install ($n member objects and definitions)"

# results: every line equal unless listed as an intended change
fail=0
changed=0
while IFS=$'\t' read -r name before; do
  after=$(awk -F'\t' -v n="$name" '$1 == n { sub(/^[^\t]*\t/, ""); print; exit }' "$W/after.txt")
  if [ "$before" != "$after" ]; then
    if grep -q -F -x -e "$name" <(sed -n 's/^\([^#][^:]*\):.*/\1/p' "$HERE/upgrade_expected_changes.txt"); then
      changed=$((changed + 1))
      echo "  changed as intended: $name"
    else
      fail=$((fail + 1))
      echo "  CHANGED: $name"
      echo "    0.1.0: $before"
      echo "    now:   $after"
    fi
  fi
done <"$W/before.txt"
total=$(wc -l <"$W/before.txt")
echo "values and results: $total lines compared, $changed changed as intended, $fail unexpected changes"
[ "$total" -gt 20 ] && [ "$fail" -eq 0 ]
echo "check_upgrade: ok"
