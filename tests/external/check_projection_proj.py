"""Projection of striae's nets against PROJ (Debian proj-bin).

Reference: Snyder (1987), Map Projections - A Working Manual, USGS Professional
Paper 1395: the polar aspects of the Lambert azimuthal equal-area and the
stereographic projection, as implemented by PROJ (`laea` and `stere` with
lat_0 = -90). A direction of trend t and plunge p is the point of longitude t
and latitude -p on a sphere seen from below (the nadir is the south pole);
striae's unit net (radius 1 at the horizontal) is PROJ's projection on a sphere
of radius 1/sqrt(2) (equal-area) and 1/2 (stereographic, scale 1 at the pole).
Check: 1,296 directions (a grid plus random ones, including the nadir and the
horizontal) agree to 1e-9 of the net radius in both projections.
"""
import math
import random
import subprocess
import sys

from pgconn import fresh_db, query

fresh_db()
rng = random.Random(20260)
dirs = [(t, p) for t in range(0, 360, 15) for p in (0, 1, 10, 30, 45, 60, 80, 89, 90)]
dirs += [(t, 0.0) for t in (0.5, 90, 179.999, 180, 270)]
while len(dirs) < 1296:
    dirs.append((rng.uniform(0, 360), math.degrees(math.asin(rng.uniform(0, 1)))))

PROJ = {
    "equal-area": ["+proj=laea", "+lat_0=-90", "+lon_0=0", "+R=%.17g" % math.sqrt(0.5)],
    "equal-angle": ["+proj=stere", "+lat_0=-90", "+lat_ts=-90", "+lon_0=0", "+R=0.5"],
}
values = ",".join("(%d, lineation(%.17g, %.17g))" % (i, t, p) for i, (t, p) in enumerate(dirs))
worst_all = 0.0
for name, args in PROJ.items():
    rows = query("SELECT i, (net_xy(l, '%s'))[0], (net_xy(l, '%s'))[1], trend(l), plunge(l) FROM (VALUES %s) v(i, l) ORDER BY i"
                 % (name, name, values))
    # Feed PROJ the stored (canonical) line: lon = trend, lat = -plunge.
    text = "".join("%s %s\n" % (r[3], -float(r[4])) for r in rows)
    out = subprocess.run(["proj", "-f", "%.17g"] + args, input=text, capture_output=True, text=True, check=True).stdout
    ref = [tuple(map(float, line.split())) for line in out.splitlines()]
    assert len(ref) == len(rows), (len(ref), len(rows))
    worst = 0.0
    for r, (x, y) in zip(rows, ref):
        d = math.hypot(float(r[1]) - x, float(r[2]) - y)
        worst = max(worst, d)
    print("%s: %d directions, largest difference from PROJ %.2e of the net radius" % (name, len(rows), worst))
    worst_all = max(worst_all, worst)
if worst_all > 1e-9:
    print("FAIL: projection differs from PROJ by more than 1e-9")
    sys.exit(1)
