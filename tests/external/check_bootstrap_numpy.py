"""Pinned bootstrap: stress_inversion(fault_slip, resamples, seed) against an
independent reimplementation of its documented rules (ref_bootstrap.py).

Reference (ref_bootstrap.py, numpy from Debian python3-numpy): the generator
written from the published algorithms (splitmix64, Steele, Lea & Flood 2014;
xoshiro256**, Blackman & Vigna 2021; bounded draws, Lemire 2019), the seed
mapping of the README (the bigint's two's-complement bits), the resample rules
of bootstrap.hpp (Michael 1987 as striae states it: N draws with replacement
per resample from the data sorted by (n, u), each resample inverted by Michael
1984, kept: the ceil(0.95 M) closest to the best tensor by the angle between
unit-norm tensors), each resample inverted by numpy.linalg.lstsq of the
weighted 3N x 5 system (not the normal equations striae sums).

Checked per group: the best tensor's components, the three cones, the Phi
interval, and NULL cones exactly where a kept resample is undefined. Every
group is also shown to be sharp: the reference with one resample fewer kept,
one more kept, the 90 % level, or the next seed differs from the reference in
a cone or the interval by more than the tolerance, so a bootstrap with any of
those mistakes fails here. A group whose kept set is decided by a near tie
(distances at the cut closer than 1e-7 degree), or whose sort order is decided
by less than 1e-9, fails the check instead of passing by luck. (The seeds are
ones for which every group is sharp: for some seeds the resample at the cut
happens not to extend any cone or the interval.)

Data: seeded numpy Generator; Wallace-Bott slips of known tensors with
angular noise on random planes (N = 12, 25, 60) and a random group of N = 5
(about 10 % of its resamples draw at most two distinct faults and are
undefined, so its cones are NULL at the 95 % level).

Tolerances: components and Phi 1e-9; cones 1e-7 degree.
"""
import math
import sys

import numpy as np

import ref_bootstrap as rb
from pgconn import fresh_db, nums, query

DB = "striae_external"
rng = np.random.default_rng(20260402)
LEVEL = 0.95  # the SQL aggregate's level (README)


def unit(v):
    return v / np.linalg.norm(v, axis=-1, keepdims=True)


def strike_dip_rake(n, u):
    if n[2] > 0:
        n, u = -n, -u
    d = math.degrees(math.acos(max(-1.0, min(1.0, -n[2]))))
    f = math.degrees(math.atan2(-n[0], n[1])) % 360.0
    s = np.array([math.cos(math.radians(f)), math.sin(math.radians(f)), 0.0])
    r = math.degrees(math.atan2(-u[2] / math.sin(math.radians(d)), float(np.dot(u, s))))
    return f, d, r


def wb_group(k, noise):
    """Wallace-Bott data of a random compression-positive tensor, with noise."""
    a1 = unit(rng.normal(size=3))
    a3 = unit(np.cross(a1, rng.normal(size=3)))
    a2 = np.cross(a3, a1)
    phi = rng.uniform(0.2, 0.8)
    c = np.outer(a1, a1) + phi * np.outer(a2, a2)
    out = []
    while len(out) < k:
        n = unit(rng.normal(size=3))
        if n[2] > 0:
            n = -n
        t = -c @ n
        tau = t - np.dot(t, n) * n
        if np.linalg.norm(tau) < 1e-3 or abs(n[2]) > 0.99:
            continue
        u = unit(tau)
        n2 = unit(n + math.radians(noise) * rng.normal(size=3))
        u2 = unit(u + math.radians(noise) * rng.normal(size=3))
        u2 = unit(u2 - np.dot(u2, n2) * n2)
        out.append(strike_dip_rake(n2, u2))
    return out


groups = [  # (name, rows, resamples, seed)
    ("N12 noise 10, M 20 (keeps 19), seed 8", wb_group(12, 10.0), 20, 8),
    ("N12 noise 10, M 30 (keeps 29), seed -1", None, 30, -1),
    ("N25 noise 8, M 40 (keeps 38), seed 123456789014", wb_group(25, 8.0), 40, 123456789014),
    ("N60 noise 15, M 50 (keeps 48), seed 0", wb_group(60, 15.0), 50, 0),
    ("N5 random, M 200 (undefined resamples kept: NULL cones), seed 3",
     [(rng.uniform(0, 360), rng.uniform(10, 80), rng.uniform(-180, 180)) for _ in range(5)], 200, 3),
]
groups[1] = (groups[1][0], groups[0][1], groups[1][2], groups[1][3])

fresh_db(DB)
values = []
for g, (_, rows, _, _) in enumerate(groups):
    for i, (f, d, r) in enumerate(rows):
        values.append(f"({g}, {i}, fault_slip({float(f)!r}, {float(d)!r}, {float(r)!r}))")
query("CREATE TABLE fs (g int, i int, f fault_slip)", DB)
query("INSERT INTO fs VALUES " + ", ".join(values), DB)
stored = {}
for g, i, f, d, r in query("SET extra_float_digits = 3; SELECT g, i, strike(f), dip(f), rake(f) FROM fs ORDER BY g, i", DB):
    stored.setdefault(int(g), []).append((float(f), float(d), float(r)))
params = ", ".join(f"({g}, {m}, {s})" for g, (_, _, m, s) in enumerate(groups))
got = {int(r[0]): r[1:] for r in query(
    "SET extra_float_digits = 3; SELECT p.g, stress_components(t), sigma1_confidence(t), sigma2_confidence(t), "
    "sigma3_confidence(t), shape_ratio_interval(t) FROM (VALUES " + params + ") p(g, m, s), "
    "LATERAL (SELECT stress_inversion(f, p.m, p.s::bigint ORDER BY i DESC) t FROM fs WHERE fs.g = p.g) q ORDER BY p.g", DB)}


def summary(res):
    if res is None or res["cones"] is None:
        return None
    return list(res["cones"]) + list(res["phi"])


def differs(a, b):
    if (a is None) != (b is None):
        return True
    if a is None:
        return False
    return any(abs(x - y) > (1e-7 if k < 3 else 1e-9) for k, (x, y) in enumerate(zip(a, b)))


failures = []
worst = {"components": 0.0, "cones (deg)": 0.0, "phi interval": 0.0}
for g, (name, _, m, seed) in enumerate(groups):
    sdr = np.array(stored[g])
    n, u = rb.fault_vectors(sdr[:, 0], sdr[:, 1], sdr[:, 2])
    n, u, gap = rb.sort_data(n, u)
    if gap < 1e-9:
        failures.append(f"[{g}] {name}: the (n, u) order is decided by {gap:.1e}; choose other data")
        continue
    ref = rb.bootstrap(n, u, m, seed, LEVEL)
    keep = ref["keep"]
    d = sorted(ref["distances"])
    if keep < m and math.isfinite(d[keep - 1]) and d[keep] - d[keep - 1] < 1e-7:
        failures.append(f"[{g}] {name}: the kept set is decided by a near tie; choose another seed")
    # sharpness: the check would see each of these mistakes (groups with a
    # defined confidence; the NULL group checks the undefined-resample rule)
    alt = {} if summary(ref) is None else {"one fewer kept": rb.bootstrap(n, u, m, seed, keep_override=max(1, keep - 1)) if keep > 1 else None,
           "one more kept": rb.bootstrap(n, u, m, seed, keep_override=keep + 1) if keep < m else None,
           "level 0.9": rb.bootstrap(n, u, m, seed, 0.9),
           "next seed": rb.bootstrap(n, u, m, seed + 1, LEVEL)}
    for what, res in alt.items():
        if res is not None and not differs(summary(res), summary(ref)):
            if what == "level 0.9" and res["keep"] == keep:
                continue
            failures.append(f"[{g}] {name}: not sharp: '{what}' gives the same summary")
    comp, c1, c2, c3, pint = got[g]
    dev = float(np.max(np.abs(np.array(nums(comp)) - ref["best"])))
    worst["components"] = max(worst["components"], dev)
    if dev > 1e-9:
        failures.append(f"[{g}] {name}: best components off by {dev:.2e}")
    want = summary(ref)
    if want is None:
        if c1 != "" or pint != "":
            failures.append(f"[{g}] {name}: cones {c1, c2, c3} but the reference keeps an undefined resample (NULL)")
        undefined = sum(1 for x in ref["distances"] if not math.isfinite(x))
        print(f"  [{g}] {name}: {undefined} of {m} resamples undefined, kept {keep}: NULL confidence as expected")
        continue
    if c1 == "":
        failures.append(f"[{g}] {name}: NULL cones, reference {want}")
        continue
    have = [float(c1), float(c2), float(c3)] + nums(pint)
    for k in range(5):
        dv = abs(have[k] - want[k])
        key = "cones (deg)" if k < 3 else "phi interval"
        worst[key] = max(worst[key], dv)
        if dv > (1e-7 if k < 3 else 1e-9):
            failures.append(f"[{g}] {name}: {key} {have} vs reference {want}")
            break
    print(f"  [{g}] {name}: kept {keep}, cones {', '.join(f'{x:.3f}' for x in want[:3])}, "
          f"Phi {want[3]:.4f}..{want[4]:.4f}")

print("worst deviations: " + ", ".join(f"{k} {v:.2e}" for k, v in worst.items()))
for f in failures:
    print("  FAIL", f)
ok = not failures and len(got) == len(groups)
print(f"check_bootstrap_numpy: {'ok' if ok else 'FAILED'} ({len(failures)} failures)")
sys.exit(0 if ok else 1)
