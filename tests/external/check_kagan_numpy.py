"""Kagan (1991, GJI 106:709) angle against an independent numpy computation by
quaternions: the rotation between the principal frames of two double couples,
minimised over the four symmetric frame choices. Also the identities of the
issue: a mechanism vs its own auxiliary representation is 0; thrust vs normal
on the same planes is 90 (derived from Aki & Richards conventions).
"""
import sys

import numpy as np

from pgconn import fresh_db, nums, query

rng = np.random.default_rng(7)
N = 300
a = np.column_stack([rng.uniform(0, 360, N), rng.uniform(1, 89, N), rng.uniform(-180, 180, N)])
b = np.column_stack([rng.uniform(0, 360, N), rng.uniform(1, 89, N), rng.uniform(-180, 180, N)])

fresh_db()
vals = ",".join(f"({i},fault_slip({x[0]!r},{x[1]!r},{x[2]!r}),fault_slip({y[0]!r},{y[1]!r},{y[2]!r}))"
                for i, (x, y) in enumerate(zip(a, b)))
query(f"CREATE TABLE k(i int, a fault_slip, b fault_slip); INSERT INTO k VALUES {vals}")
rows = query("SET extra_float_digits = 3; SELECT i, a, b, kagan_angle(a, b) FROM k ORDER BY i")


def frame(s, d, r):
    s, d, r = np.radians([s, d, r])
    n = np.array([-np.sin(d) * np.sin(s), np.sin(d) * np.cos(s), -np.cos(d)])
    st = np.array([np.cos(s), np.sin(s), 0.0])
    dd = np.array([-np.cos(d) * np.sin(s), np.cos(d) * np.cos(s), np.sin(d)])
    u = np.cos(r) * st - np.sin(r) * dd
    t, p = (n + u) / np.sqrt(2), (n - u) / np.sqrt(2)
    return np.column_stack([t, p, np.cross(t, p)])


def quat(R):
    """Unit quaternion (w, x, y, z) of a rotation matrix (Shepperd's method)."""
    tr = np.trace(R)
    q = np.array([1 + tr, 1 + R[0, 0] - R[1, 1] - R[2, 2], 1 - R[0, 0] + R[1, 1] - R[2, 2],
                  1 - R[0, 0] - R[1, 1] + R[2, 2]])
    k = int(np.argmax(q))
    if k == 0:
        v = np.array([q[0], R[2, 1] - R[1, 2], R[0, 2] - R[2, 0], R[1, 0] - R[0, 1]])
    elif k == 1:
        v = np.array([R[2, 1] - R[1, 2], q[1], R[0, 1] + R[1, 0], R[0, 2] + R[2, 0]])
    elif k == 2:
        v = np.array([R[0, 2] - R[2, 0], R[0, 1] + R[1, 0], q[2], R[1, 2] + R[2, 1]])
    else:
        v = np.array([R[1, 0] - R[0, 1], R[0, 2] + R[2, 0], R[1, 2] + R[2, 1], q[3]])
    return v / np.linalg.norm(v)


def kagan(x, y):
    A, B = frame(*x), frame(*y)
    best = 180.0
    for sgn in ([1, 1, 1], [1, -1, -1], [-1, 1, -1], [-1, -1, 1]):
        q = quat(B @ (A * np.array(sgn)).T)
        best = min(best, np.degrees(2 * np.arccos(min(1.0, abs(q[0])))))
    return best


worst = 0.0
for i, x, y, k in rows:
    worst = max(worst, abs(float(k) - kagan(nums(x), nums(y))))
ident = query("SELECT kagan_angle(f, auxiliary(f)) FROM k, LATERAL (SELECT a f) z "
              "ORDER BY 1 DESC LIMIT 1")[0][0]
tn = query("SELECT kagan_angle('0/45/90', '0/45/-90')")[0][0]
print(f"{len(rows)} pairs; worst |striae - numpy| = {worst:.2e} deg; max self-vs-auxiliary = {ident}; thrust vs normal = {tn}")
ok = len(rows) == N and worst < 1e-6 and float(ident) == 0.0 and float(tn) == 90.0
print("check_kagan_numpy:", "ok" if ok else "FAILED")
sys.exit(0 if ok else 1)
