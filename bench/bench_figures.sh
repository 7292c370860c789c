#!/usr/bin/env bash
# Figure benchmark; the ratio is against a baseline measured in this run.
#  A net of 10,000 great circles and their 10,000 poles, rendered to an SVG
#  document by striae (SELECT net_svg(net_great_circles(p) || net_poles(p)),
#  aggregation included, timed with clock_timestamp() around EXECUTE in one
#  session, after a warm-up) against the same figure drawn by what a user would
#  script instead: numpy projecting the same great circles (each sampled every
#  2 degrees, 91 points: about 0.1 px from the true curve at this size) and
#  poles with the equal-area formula, matplotlib (general-purpose plotting,
#  Debian python3-matplotlib, Agg backend) drawing them as one LineCollection
#  and one scatter and saving SVG; timed with time.perf_counter() from the
#  loaded arrays to the written file. Best of the rounds (STRIAE_BENCH_ROUNDS,
#  default 11, at most 5 for matplotlib, which takes seconds a round).
#  Target (issue 8): striae / matplotlib <= 0.1. Also printed: the size of the
#  striae document of the 10,000 great circles alone in both projections
#  (target under 2 MB).
set -euo pipefail
ROUNDS="${STRIAE_BENCH_ROUNDS:-11}"
N=10000
: "${PGHOST:?run inside scripts/with-cluster.sh}"
DIR="${STRIAE_SCRATCH:?run inside scripts/with-cluster.sh}/bench_figures"
mkdir -p "$DIR"
PSQL=(psql -X -q -v ON_ERROR_STOP=1)

"${PSQL[@]}" <<SQL
CREATE EXTENSION IF NOT EXISTS striae;
DROP TABLE IF EXISTS b_fig;
SELECT setseed(0.28) \\g /dev/null
CREATE UNLOGGED TABLE b_fig AS SELECT i, plane(360 * random(), 90 * random()) AS p FROM generate_series(1, $N) i;
VACUUM ANALYZE b_fig;
SQL
"${PSQL[@]}" -At -c "SET extra_float_digits = 3" -c "COPY (SELECT strike(p), dip(p) FROM b_fig ORDER BY i) TO STDOUT" >"$DIR/planes.tsv"
"${PSQL[@]}" -At -c "SELECT net_svg(net_great_circles(p)) FROM b_fig" >"$DIR/circles.svg"
"${PSQL[@]}" -At -c "SELECT net_svg(net_great_circles(p), projection => 'equal-angle') FROM b_fig" >"$DIR/circles_stereo.svg"
"${PSQL[@]}" -At -c "SELECT net_svg(net_great_circles(p) || net_poles(p)) FROM b_fig" >"$DIR/net.svg"

sql_ms=$("${PSQL[@]}" -At <<SQL
CREATE TEMP TABLE t_fig (ms float8);
DO \$\$
DECLARE t0 timestamptz; n int;
BEGIN
  EXECUTE 'SELECT length(net_svg(net_great_circles(p) || net_poles(p))) FROM b_fig' INTO n;  -- warm-up
  FOR r IN 1..$ROUNDS LOOP
    t0 := clock_timestamp();
    EXECUTE 'SELECT length(net_svg(net_great_circles(p) || net_poles(p))) FROM b_fig' INTO n;
    INSERT INTO t_fig VALUES (1000 * extract(epoch FROM clock_timestamp() - t0));
  END LOOP;
END \$\$;
SELECT round(min(ms)::numeric, 1) FROM t_fig;
SQL
)

MPL_ROUNDS=$(( ROUNDS < 5 ? ROUNDS : 5 ))
mpl_ms=$(env -u OPENBLAS_CORETYPE -u OPENBLAS_L2_SIZE MPLBACKEND=Agg /usr/bin/python3 - "$DIR" "$MPL_ROUNDS" <<'PY'
import os, sys, time
import numpy as np
import matplotlib
matplotlib.use("Agg")
import matplotlib.pyplot as plt
from matplotlib.collections import LineCollection

d, rounds = sys.argv[1], int(sys.argv[2])
sd = np.loadtxt(os.path.join(d, "planes.tsv"))
best = float("inf")
for _ in range(rounds):
    t0 = time.perf_counter()
    f, dp = np.radians(sd[:, 0])[:, None], np.radians(sd[:, 1])[:, None]
    a = np.radians(np.linspace(0.0, 180.0, 91))[None, :]
    # points of each great circle: cos a * strike + sin a * down-dip (NED)
    n = np.cos(a) * np.cos(f) - np.sin(a) * np.cos(dp) * np.sin(f)
    e = np.cos(a) * np.sin(f) + np.sin(a) * np.cos(dp) * np.cos(f)
    dn = np.sin(a) * np.sin(dp) * np.ones_like(f)
    k = 1.0 / np.sqrt(1.0 + dn)
    lines = np.stack([e * k, n * k], axis=-1)
    # poles: trend f - 90, plunge 90 - dip
    pt, pp = f[:, 0] - np.pi / 2, np.pi / 2 - dp[:, 0]
    pn, pe, pd = np.cos(pp) * np.cos(pt), np.cos(pp) * np.sin(pt), np.sin(pp)
    pk = 1.0 / np.sqrt(1.0 + pd)
    fig, ax = plt.subplots(figsize=(5, 5))
    ax.add_collection(LineCollection(lines, linewidths=0.5, colors="#0072B2"))
    ax.scatter(pe * pk, pn * pk, s=4, c="#D55E00")
    ax.add_patch(plt.Circle((0, 0), 1, fill=False))
    ax.set_xlim(-1.05, 1.05)
    ax.set_ylim(-1.05, 1.05)
    ax.set_aspect("equal")
    ax.axis("off")
    fig.savefig(os.path.join(d, "mpl.svg"), format="svg")
    plt.close(fig)
    best = min(best, time.perf_counter() - t0)
print("%.1f" % (1000 * best))
PY
)
circles=$(stat -c %s "$DIR/circles.svg")
stereo=$(stat -c %s "$DIR/circles_stereo.svg")
net=$(stat -c %s "$DIR/net.svg")
mpl=$(stat -c %s "$DIR/mpl.svg")
echo "figures: net of $N great circles + $N poles to SVG: striae ${sql_ms} ms, numpy + matplotlib ${mpl_ms} ms (best of $ROUNDS / $MPL_ROUNDS rounds)"
/usr/bin/python3 -c "import sys; r = $sql_ms / $mpl_ms; print('figures: ratio striae / matplotlib = %.3f (target <= 0.1)%s' % (r, '' if r <= 0.1 else '  ABOVE TARGET'))"
/usr/bin/python3 -c "print('figures: SVG of $N great circles %.2f MB equal-area, %.2f MB equal-angle (target < 2 MB); with the poles %.2f MB; matplotlib document %.2f MB' % ($circles / 1e6, $stereo / 1e6, $net / 1e6, $mpl / 1e6))"
