"""Independent numpy computation of slip_tendency and dilation_tendency on
general planes, under stress states where sigma2 matters (0 < Phi < 1).

References, computed here with numpy (Debian python3-numpy), separately from
src/core:
  - slip tendency Ts = |tau| / sn (Morris, Ferrill & Henderson 1996, Geology
    24:275), with the effective principal stresses striae documents for a
    reduced tensor (README, Paleostress; stress.hpp): sigma1 = 1, sigma3 = k,
    sigma2 = k + Phi (1 - k), k = 1 / (mu + sqrt(mu^2 + 1))^2, and normalised,
    as striae does, by the maximum of Ts over all planes. That maximum is
    found here numerically (a Fibonacci lattice of 20,000 normals, then a
    pattern search down to 1e-10 rad), not from the formula; it must also equal
    mu, which the magnitude model claims (Coulomb friction, stress.hpp);
  - dilation tendency Td = (sigma1 - sn) / (sigma1 - sigma3) (Ferrill et al.
    1999, GSA Today 9(5)) with the tensor's own principal values, which Td does
    not depend on beyond Phi (any sigma1 > sigma3 and a shift give the same
    ratio).
Principal values and axes come from numpy.linalg.eigh of the components
striae stored (read back with 17 significant digits); plane normals from the
stored strike and dip (Aki & Richards 1980 convention, METHODS.md section 1).

Data: seeded numpy Generator. Eight tensors: five from stress_tensor(sigma1,
sigma3, Phi) with Phi in {0.1, 0.3, 0.5, 0.75, 0.9} and random axes, three
typed as random trace-free unit-norm components (a general Phi); 1,500 random
planes (uniform normals, strike and dip as float8), friction 0.3, 0.6, 0.85.
The check is shown to see sigma2: with Phi off by 0.25 the reference moves by
more than the tolerance on at least 90 % of the planes.

Tolerances: 1e-9 absolute on both tendencies (values in 0..1; the maximum is
located to about 1e-18 relative, the eigen-decompositions differ in the last
bits); the numerical maximum within 1e-9 of mu.
"""
import math
import sys

import numpy as np

from pgconn import fresh_db, nums, query

DB = "striae_external"
rng = np.random.default_rng(20260401)
FRICTIONS = (0.3, 0.6, 0.85)
N_PLANES = 1500


def line_of(v):
    v = v / np.linalg.norm(v)
    if v[2] < 0:
        v = -v
    return math.degrees(math.atan2(v[1], v[0])) % 360.0, math.degrees(math.asin(min(1.0, v[2])))


def plane_normal(strike, dip):
    f, d = np.radians(strike), np.radians(dip)
    return np.stack([-np.sin(d) * np.sin(f), np.sin(d) * np.cos(f), -np.cos(d)], axis=-1)


# ---------------------------------------------------------------------------
# Tensors and planes into the database
# ---------------------------------------------------------------------------
fresh_db(DB)
tensor_sql = []
for phi in (0.1, 0.3, 0.5, 0.75, 0.9):
    a1 = rng.normal(size=3)
    a3 = np.cross(a1, rng.normal(size=3))
    (t1, p1), (t3, p3) = line_of(a1), line_of(a3)
    tensor_sql.append(f"stress_tensor(lineation({t1!r}, {p1!r}), lineation({t3!r}, {p3!r}), {phi!r})")
for _ in range(3):
    m = rng.normal(size=(3, 3))
    m = m + m.T
    m -= np.trace(m) / 3 * np.eye(3)
    m /= np.linalg.norm(m)
    comp = [m[0, 0], m[1, 1], -(m[0, 0] + m[1, 1]), m[0, 1], m[0, 2], m[1, 2]]
    # trace exactly zero in binary: dd is written as -(nn + ee)
    tensor_sql.append("'{\"components\": [" + ", ".join(repr(float(c)) for c in comp) + "], \"n\": 0}'::stress_tensor")
query("CREATE TABLE tens (k int, t stress_tensor)", DB)
query("INSERT INTO tens VALUES " + ", ".join(f"({k}, {s})" for k, s in enumerate(tensor_sql)), DB)

normals = rng.normal(size=(N_PLANES, 3))
normals /= np.linalg.norm(normals, axis=1, keepdims=True)
rows = []
for i, v in enumerate(normals):
    if v[2] > 0:
        v = -v  # upward normal (-sin d sin f, sin d cos f, -cos d)
    dip = math.degrees(math.acos(max(-1.0, min(1.0, -v[2]))))
    strike = math.degrees(math.atan2(-v[0], v[1])) % 360.0
    rows.append(f"({i}, plane({strike!r}, {dip!r}))")
query("CREATE TABLE pl (i int, p plane)", DB)
query("INSERT INTO pl VALUES " + ", ".join(rows), DB)

comps = {int(k): np.array(nums(c)) for k, c in
         query("SET extra_float_digits = 3; SELECT k, stress_components(t) FROM tens", DB)}
planes = {int(i): (float(s), float(d)) for i, s, d in
          query("SET extra_float_digits = 3; SELECT i, strike(p), dip(p) FROM pl", DB)}
mu_list = ", ".join(repr(m) for m in FRICTIONS)
got = {}
for k, i, mu, ts, td in query(
        "SET extra_float_digits = 3; SELECT k, i, mu, slip_tendency(p, t, mu), dilation_tendency(p, t) "
        f"FROM tens, pl, unnest(ARRAY[{mu_list}]::float8[]) mu ORDER BY k, i, mu", DB):
    got[(int(k), int(i), float(mu))] = (float(ts), float(td))


# ---------------------------------------------------------------------------
# Reference
# ---------------------------------------------------------------------------

def fib_normals(n):
    """Fibonacci lattice on the upper half of the sphere (axial: n and -n alike)."""
    j = np.arange(n) + 0.5
    z = j / n
    r = np.sqrt(1 - z * z)
    a = math.pi * (3 - math.sqrt(5)) * j
    return np.stack([r * np.cos(a), r * np.sin(a), z], axis=1)


def ts_values(s, lam):
    """Ts for rows of direction cosines lam (principal frame) and magnitudes s."""
    sn = (lam ** 2) @ s
    ss = (lam ** 2) @ (s ** 2)
    return np.sqrt(np.maximum(0.0, ss - sn * sn)) / sn


def ts_max(s):
    """Maximum of Ts over all unit normals: lattice, then pattern search in
    spherical angles with halving steps."""
    grid = fib_normals(20000)
    vals = ts_values(s, grid)
    v = grid[int(np.argmax(vals))]
    th, ph = math.acos(max(-1.0, min(1.0, v[2]))), math.atan2(v[1], v[0])

    def f(th, ph):
        x = np.array([[math.sin(th) * math.cos(ph), math.sin(th) * math.sin(ph), math.cos(th)]])
        return float(ts_values(s, x)[0])

    best = f(th, ph)
    step = 0.02
    while step > 1e-10:
        moved = False
        for dth, dph in ((step, 0), (-step, 0), (0, step), (0, -step), (step, step), (-step, -step),
                         (step, -step), (-step, step)):
            val = f(th + dth, ph + dph)
            if val > best:
                best, th, ph, moved = val, th + dth, ph + dph, True
                break
        if not moved:
            step /= 2
    return best


failures, worst = [], {"slip_tendency": 0.0, "dilation_tendency": 0.0, "Ts_max - mu": 0.0}
sensitive = total = 0
for k, c in sorted(comps.items()):
    m = np.array([[c[0], c[3], c[4]], [c[3], c[1], c[5]], [c[4], c[5], c[2]]])
    w, v = np.linalg.eigh(m)  # ascending: sigma3, sigma2, sigma1 (compression positive)
    s1, s2, s3 = w[2], w[1], w[0]
    phi = (s2 - s3) / (s1 - s3)
    axes = v[:, ::-1]  # columns sigma1, sigma2, sigma3
    ids = sorted(planes)
    n = plane_normal(np.array([planes[i][0] for i in ids]), np.array([planes[i][1] for i in ids]))
    lam = n @ axes
    sn_red = np.einsum("ij,jk,ik->i", n, m, n)
    td_ref = (s1 - sn_red) / (s1 - s3)
    for mu in FRICTIONS:
        q = mu + math.sqrt(mu * mu + 1)
        kk = 1 / (q * q)
        s = np.array([1.0, kk + phi * (1 - kk), kk])
        top = ts_max(s)
        worst["Ts_max - mu"] = max(worst["Ts_max - mu"], abs(top - mu))
        if abs(top - mu) > 1e-9:
            failures.append(f"tensor {k} mu {mu}: numerical maximum of Ts {top!r} is not mu")
        ref = ts_values(s, lam) / top
        wrong_phi = phi - 0.25 if phi > 0.5 else phi + 0.25
        wrong = ts_values(np.array([1.0, kk + wrong_phi * (1 - kk), kk]), lam) / top
        sensitive += int(np.sum(np.abs(wrong - ref) > 1e-6))
        total += len(ids)
        for j, i in enumerate(ids):
            ts, td = got[(k, i, mu)]
            d1, d2 = abs(ts - ref[j]), abs(td - td_ref[j])
            worst["slip_tendency"] = max(worst["slip_tendency"], d1)
            worst["dilation_tendency"] = max(worst["dilation_tendency"], d2)
            if d1 > 1e-9:
                failures.append(f"tensor {k} (Phi {phi:.3f}) mu {mu} plane {planes[i]}: slip_tendency {ts!r}, reference {ref[j]!r}")
            if d2 > 1e-9:
                failures.append(f"tensor {k} (Phi {phi:.3f}) plane {planes[i]}: dilation_tendency {td!r}, reference {td_ref[j]!r}")
    print(f"  tensor {k}: Phi {phi:.4f}")

print(f"{len(comps)} tensors x {N_PLANES} planes x {len(FRICTIONS)} frictions; sigma2 moves the reference "
      f"beyond tolerance on {100.0 * sensitive / total:.1f} % of the planes")
if sensitive < 0.9 * total:
    failures.append("the check is not sensitive to sigma2 on 90 % of the planes")
print("worst deviations: " + ", ".join(f"{k} {v:.2e}" for k, v in worst.items()))
for f in failures[:30]:
    print("  FAIL", f)
ok = not failures and len(got) == len(comps) * N_PLANES * len(FRICTIONS)
print(f"check_tendency_numpy: {'ok' if ok else 'FAILED'} ({len(failures)} failures)")
sys.exit(0 if ok else 1)
