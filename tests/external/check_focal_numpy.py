"""Independent numpy re-computation of auxiliary planes, P/T/B axes and moment
tensors of a few hundred random mechanisms, against striae in SQL.

Reference: numpy (Debian python3-numpy), implementing the Aki & Richards
(1980) formulas of METHODS.md section 2 separately from src/core: here the
auxiliary plane comes from the moment tensor's eigenvectors rather than from
swapping n and u, so the two computations share no code path.
"""
import sys

import numpy as np

from pgconn import fresh_db, nums, query

rng = np.random.default_rng(20261201)
N = 400
strike = rng.uniform(0, 360, N)
dip = rng.uniform(1, 89, N)
rake = rng.uniform(-180, 180, N)

fresh_db()
values = ",".join(f"({i},fault_slip({s!r},{d!r},{r!r}))" for i, (s, d, r) in enumerate(zip(strike, dip, rake)))
query(f"CREATE TABLE m(i int, f fault_slip); INSERT INTO m VALUES {values}")
rows = query("SET extra_float_digits = 3; SELECT i, f, auxiliary(f), p_axis(f), t_axis(f), b_axis(f), "
             "moment_tensor(f) FROM m ORDER BY i")


def vectors(s, d, r):
    s, d, r = np.radians([s, d, r])
    n = np.array([-np.sin(d) * np.sin(s), np.sin(d) * np.cos(s), -np.cos(d)])
    st = np.array([np.cos(s), np.sin(s), 0.0])
    dd = np.array([-np.cos(d) * np.sin(s), np.cos(d) * np.cos(s), np.sin(d)])
    u = np.cos(r) * st - np.sin(r) * dd
    return n, u


def line_vec(t, p):
    t, p = np.radians([t, p])
    return np.array([np.cos(p) * np.cos(t), np.cos(p) * np.sin(t), np.sin(p)])


def axial_deg(a, b):
    """Axial angle by atan2(|a x b|, |a.b|), precise for nearly parallel axes."""
    return np.degrees(np.arctan2(np.linalg.norm(np.cross(a, b)), abs(float(np.dot(a, b)))))


worst = {"aux": 0.0, "P": 0.0, "T": 0.0, "B": 0.0, "M": 0.0}
for i, f, aux, p, t, b, m in rows:
    s, d, r = nums(f)
    n, u = vectors(s, d, r)
    M = np.outer(n, u) + np.outer(u, n)
    w, V = np.linalg.eigh(M)  # ascending: P (-1), B (0), T (+1)
    P_ref, B_ref, T_ref = V[:, 0], V[:, 1], V[:, 2]
    # Auxiliary plane normal from the eigenvectors: the nodal-plane normals are
    # (T +- P)/sqrt2; the one not parallel to n is the auxiliary normal.
    c1, c2 = (T_ref + P_ref) / np.sqrt(2), (T_ref - P_ref) / np.sqrt(2)
    aux_n_ref = c2 if abs(np.dot(c1, n)) > abs(np.dot(c2, n)) else c1
    a_s, a_d, a_r = nums(aux)
    a_n, a_u = vectors(a_s, a_d, a_r)
    worst["aux"] = max(worst["aux"], axial_deg(a_n, aux_n_ref))
    for name, got, ref in (("P", p, P_ref), ("T", t, T_ref), ("B", b, B_ref)):
        worst[name] = max(worst[name], axial_deg(line_vec(*nums(got)), ref))
    mm = nums(m)
    ref6 = [M[0, 0], M[1, 1], M[2, 2], M[0, 1], M[0, 2], M[1, 2]]
    worst["M"] = max(worst["M"], max(abs(x - y) for x, y in zip(mm, ref6)))
    # The auxiliary representation must give the same moment tensor.
    M2 = np.outer(a_n, a_u) + np.outer(a_u, a_n)
    worst["M"] = max(worst["M"], float(np.max(np.abs(M2 - M))))

print(f"{len(rows)} mechanisms; worst deviations: " + ", ".join(f"{k} {v:.2e}" for k, v in worst.items()))
ok = len(rows) == N and all(worst[k] < 1e-8 for k in ("aux", "P", "T", "B")) and worst["M"] < 1e-9
print("check_focal_numpy:", "ok" if ok else "FAILED")
sys.exit(0 if ok else 1)
