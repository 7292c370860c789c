"""Independent numpy check of the rotations: rotate (about a lineation and about a
directed trend/plunge axis), rotate_vertical, untilt and unfold, for plane,
lineation and fault_slip, on random data in one query per function.

Reference: numpy (Debian python3-numpy). Rotation matrices are built here from
unit quaternions (Euler-Rodrigues parameters: q = (cos w/2, a sin w/2), the
textbook quaternion-to-matrix formula), NOT from Rodrigues' vector formula the
extension uses, so the two come from different computations. Conventions of
METHODS.md sections 1 and 10 [pub: Aki & Richards 1980 for n, u; right-hand
rule]: NED; a lineation axis points down along its trend and plunge; a directed
axis (trend, plunge) is taken as given; untilt turns about the bedding strike by
-dip (180 - dip overturned); unfold (Ramsay 1967, from memory) turns about the
horizontal line at trend + 90 of the fold axis by its plunge, then untilts by the
limb as turned.

Compared: lineations and plane poles as axes, angle < 1e-9 degree; fault slips by
the angles between striae's (n, u) and the reference pair (or the pair with both
signs flipped: the same relative motion), each < 1e-9 degree.
"""
import math
import sys

import numpy as np

from pgconn import fresh_db, nums, query

DB = "striae_external"
rng = np.random.default_rng(20261202)
N = 400
TOL = 1e-9


def line_vec(t, p):
    t, p = math.radians(t), math.radians(p)
    return np.array([math.cos(p) * math.cos(t), math.cos(p) * math.sin(t), math.sin(p)])


def normal(strike, dip):
    f, d = math.radians(strike), math.radians(dip)
    return np.array([-math.sin(d) * math.sin(f), math.sin(d) * math.cos(f), -math.cos(d)])


def fault(strike, dip, rake):
    f, d, r = (math.radians(x) for x in (strike, dip, rake))
    n = normal(strike, dip)
    u = np.array([math.cos(r) * math.cos(f) + math.sin(r) * math.cos(d) * math.sin(f),
                  math.cos(r) * math.sin(f) - math.sin(r) * math.cos(d) * math.cos(f),
                  -math.sin(r) * math.sin(d)])
    return n, u


def quat_matrix(axis, w_deg):
    a = np.asarray(axis, float) / np.linalg.norm(axis)
    h = math.radians(w_deg) / 2.0
    q0, (q1, q2, q3) = math.cos(h), a * math.sin(h)
    return np.array([
        [q0 * q0 + q1 * q1 - q2 * q2 - q3 * q3, 2 * (q1 * q2 - q0 * q3), 2 * (q1 * q3 + q0 * q2)],
        [2 * (q1 * q2 + q0 * q3), q0 * q0 - q1 * q1 + q2 * q2 - q3 * q3, 2 * (q2 * q3 - q0 * q1)],
        [2 * (q1 * q3 - q0 * q2), 2 * (q2 * q3 + q0 * q1), q0 * q0 - q1 * q1 - q2 * q2 + q3 * q3]])


def axial_deg(a, b):
    return math.degrees(math.atan2(np.linalg.norm(np.cross(a, b)), abs(float(np.dot(a, b)))))


def vec_deg(a, b):
    return math.degrees(math.atan2(np.linalg.norm(np.cross(a, b)), float(np.dot(a, b))))


def strike_vec(s):
    return np.array([math.cos(math.radians(s)), math.sin(math.radians(s)), 0.0])


def untilt_matrix(bs, bd, over=False):
    return quat_matrix(strike_vec(bs), 180.0 - bd if over else -bd)


def plane_of(nv):
    """strike/dip of the plane with normal nv (either sign)."""
    if nv[2] > 0:
        nv = -nv
    d = math.degrees(math.acos(max(-1.0, min(1.0, -nv[2]))))
    s = math.degrees(math.atan2(-nv[0], nv[1])) % 360.0
    return s, d


fresh_db(DB)
rows = []
for i in range(N):
    rows.append((i, rng.uniform(0, 360), rng.uniform(0, 90), rng.uniform(0, 360), rng.uniform(-90, 90),
                 rng.uniform(0, 360), rng.uniform(0, 90), rng.uniform(-180, 180),
                 rng.uniform(0, 360), rng.uniform(0, 90), rng.uniform(-720, 720),
                 rng.uniform(0, 360), rng.uniform(-90, 90), rng.uniform(0, 360), rng.uniform(0, 90)))
values = ",".join("(" + ",".join(repr(float(x)) if k else str(x) for k, x in enumerate(r)) + ")" for r in rows)
query("CREATE TABLE rot (i int, ps float8, pd float8, lt float8, lp float8, fs float8, fd float8, fr float8, "
      "at float8, ap float8, w float8, dt float8, dp float8, bs float8, bd float8); INSERT INTO rot VALUES " + values, DB)
# Stored values as striae canonicalised them (17 digits), then every rotation.
SQL = ("SET extra_float_digits = 3; SELECT i, strike(p), dip(p), trend(l), plunge(l), strike(f), dip(f), rake(f), "
       "trend(a), plunge(a), w, dt, dp, strike(b), dip(b), "
       "rotate(p, a, w), rotate(l, a, w), rotate(f, a, w), "
       "rotate(p, dt, dp, w), rotate(l, dt, dp, w), rotate(f, dt, dp, w), "
       "rotate_vertical(p, w), rotate_vertical(l, w), rotate_vertical(f, w), "
       "untilt(p, b), untilt(l, b), untilt(f, b), untilt(f, b, true), "
       "trend(fa), plunge(fa), unfold(f, b, fa, 90 - 1e-9), unfold(l, b, fa, 90 - 1e-9) "
       "FROM (SELECT i, plane(ps, pd) p, lineation(lt, lp) l, fault_slip(fs, fd, fr) f, lineation(at, ap) a, w, dt, dp, "
       "plane(bs, bd) b, intersection(plane(bs, bd), plane(at, 45)) fa FROM rot) s ORDER BY i")
res = query(SQL, DB)
worst = {}
fails = []


def note(key, dev, i):
    worst[key] = max(worst.get(key, 0.0), dev)
    if dev > TOL:
        fails.append(f"row {i}: {key} off by {dev:.3e} deg")


def check_line(key, txt, ref, i):
    note(key, axial_deg(line_vec(*nums(txt)), ref), i)


def check_plane(key, txt, ref_n, i):
    note(key, axial_deg(normal(*nums(txt)), ref_n), i)


def check_fault(key, txt, rn, ru, i):
    n, u = fault(*nums(txt))
    dev = min(max(vec_deg(n, rn), vec_deg(u, ru)), max(vec_deg(n, -rn), vec_deg(u, -ru)))
    note(key, dev, i)


for r in res:
    i = int(r[0])
    ps, pd, lt, lp, fs, fd, fr, at, ap, w, dt, dp, bs, bd = (float(x) for x in r[1:15])
    out = r[15:]
    pn, lv = normal(ps, pd), line_vec(lt, lp)
    fn, fu = fault(fs, fd, fr)
    for k, R in enumerate((quat_matrix(line_vec(at, ap), w), quat_matrix(line_vec(dt, dp), w),
                           quat_matrix([0, 0, 1], w))):
        name = ("about lineation", "about directed axis", "about vertical")[k]
        check_plane(f"plane {name}", out[3 * k], R @ pn, i)
        check_line(f"lineation {name}", out[3 * k + 1], R @ lv, i)
        check_fault(f"fault_slip {name}", out[3 * k + 2], R @ fn, R @ fu, i)
    U = untilt_matrix(bs, bd)
    check_plane("untilt plane", out[9], U @ pn, i)
    check_line("untilt lineation", out[10], U @ lv, i)
    check_fault("untilt fault_slip", out[11], U @ fn, U @ fu, i)
    Uo = untilt_matrix(bs, bd, True)
    check_fault("untilt overturned fault_slip", out[12], Uo @ fn, Uo @ fu, i)
    # unfold: the fold axis is the intersection of the limb with another plane (so it lies on the limb)
    ft, fp = float(out[13]), float(out[14])
    R1 = quat_matrix(strike_vec(ft + 90.0), fp)
    s1, d1 = plane_of(R1 @ normal(bs, bd))
    R = untilt_matrix(s1, d1) @ R1
    check_fault("unfold fault_slip", out[15], R @ fn, R @ fu, i)
    check_line("unfold lineation", out[16], R @ lv, i)

print(f"{len(res)} rows x 15 rotations")
print("worst deviations (degrees): " + ", ".join(f"{k} {v:.2e}" for k, v in sorted(worst.items())))
for f in fails[:20]:
    print("  FAIL", f)
ok = len(res) == N and not fails
print(f"check_rotation_numpy: {'ok' if ok else 'FAILED'} ({len(fails)} failures)")
sys.exit(0 if ok else 1)
