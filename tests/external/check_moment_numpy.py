"""Independent numpy re-computation of moment_tensor_sum on random catalogues, and
of kostrov_strain_rate, per group in one GROUP BY query.

Reference: numpy (Debian python3-numpy), implementing METHODS.md sections 2 and 10
separately from src/core:
  - M = M0 (n u^T + u n^T), NED [pub: Aki & Richards 1980, Box 4.4], n, u from
    strike/dip/rake [pub: Aki & Richards 1980];
  - M0 = 10^(1.5 Mw + 9.1) N m [mem: Hanks & Kanamori 1979, IASPEI 2013 form];
  - scalar moment of the sum |M|_F / sqrt 2 [mem: Silver & Jordan 1982];
    normalised tensor = sum / that; consistency = that / sum of M0 [mem:
    Frohlich & Apperson 1992];
  - P, B, T = eigenvectors of the smallest, middle, largest eigenvalue
    (numpy.linalg.eigh); epsilon = -lambda_absmin / |lambda_absmax| [mem:
    Giardini 1984];
  - best double couple n = (T + P)/sqrt2, u = (T - P)/sqrt2 (common practice, no
    source): compared as a double couple, i.e. its P and T axes;
  - Kostrov strain rate sum M / (2 mu V T) [mem: Kostrov 1974].
Data: seeded numpy Generator; groups of random mechanisms (N = 1 .. 3000) with
magnitudes 1..8 (weighted) and without (unit moments), a group of identical
mechanisms, and an opposite-slip pair (cancels: axis fields NULL).
Tolerances: normalised components 1e-9 absolute; moments and strain rates 1e-9
relative; the raw sum 1e-12 of the sum of M0 (it may cancel); axes 1e-7 degree where eigenvalues are separated by more than 1e-6;
epsilon 1e-9.
"""
import math
import os
import subprocess
import sys

import numpy as np

from pgconn import fresh_db, nums, query

DB = "striae_external"
rng = np.random.default_rng(7)


def fault(s, d, r):
    f, d, r = np.radians(s), np.radians(d), np.radians(r)
    n = np.array([-np.sin(d) * np.sin(f), np.sin(d) * np.cos(f), -np.cos(d)])
    u = np.array([np.cos(r) * np.cos(f) + np.sin(r) * np.cos(d) * np.sin(f),
                  np.cos(r) * np.sin(f) - np.sin(r) * np.cos(d) * np.cos(f), -np.sin(r) * np.sin(d)])
    return n, u


def line_vec(t, p):
    t, p = math.radians(t), math.radians(p)
    return np.array([math.cos(p) * math.cos(t), math.cos(p) * math.sin(t), math.sin(p)])


def axial_deg(a, b):
    return math.degrees(math.atan2(np.linalg.norm(np.cross(a, b)), abs(float(np.dot(a, b)))))


groups = []
for k in (1, 2, 5, 30, 300, 3000):
    groups.append([(rng.uniform(0, 360), rng.uniform(0, 90), rng.uniform(-180, 180), rng.uniform(1, 8)) for _ in range(k)])
groups.append([(30.0, 60.0, 40.0, 5.0)] * 10)
groups.append([(123.0, 47.0, 35.0, 4.0), (123.0, 47.0, -145.0, 4.0)])
# a cluster of similar thrusts (well-defined axes)
groups.append([(20 + rng.normal(0, 5), 35 + rng.normal(0, 5), 95 + rng.normal(0, 5), rng.uniform(2, 6)) for _ in range(200)])

fresh_db(DB)
lines = "\n".join(f"{g}\t{s!r}\t{d!r}\t{r!r}\t{m!r}" for g, rows in enumerate(groups) for s, d, r, m in rows)
subprocess.run(["psql", "-X", "-q", "-v", "ON_ERROR_STOP=1", "-d", DB],
               input="CREATE TABLE cat (g int, s float8, d float8, r float8, mw float8);\nCOPY cat FROM STDIN;\n"
               + lines + "\n\\.\n", check=True, capture_output=True, text=True, env=dict(os.environ))
stored = {}
for g, s, d, r, m in query("SET extra_float_digits = 3; SELECT g, strike(f), dip(f), rake(f), mw FROM "
                           "(SELECT g, fault_slip(s, d, r) f, mw FROM cat) q", DB):
    stored.setdefault(int(g), []).append((float(s), float(d), float(r), float(m)))
SQL = ("SET extra_float_digits = 3; SELECT g, {w}, (m).n, (m).tensor, (m).p_axis, (m).b_axis, (m).t_axis, "
       "p_axis((m).best_double_couple), t_axis((m).best_double_couple), (m).epsilon, (m).scalar_moment, "
       "(m).moment_sum, (m).consistency, (m).summed, {k} FROM (SELECT g, moment_tensor_sum({args}) m "
       "FROM (SELECT g, fault_slip(s, d, r) f, mw FROM cat) c GROUP BY g) q ORDER BY g")
rows = (query(SQL.format(w="true", args="f, mw", k="kostrov_strain_rate(m, 1e15, 3.15e9, 3.3e10)"), DB)
        + query(SQL.format(w="false", args="f", k="NULL"), DB))
worst, fails = {}, []


def note(key, dev, tol, g):
    worst[key] = max(worst.get(key, 0.0), dev)
    if dev > tol:
        fails.append(f"group {g}: {key} off by {dev:.3e}")


for row in rows:
    g, weighted = int(row[0]), row[1] == "t"
    data = stored[g]
    M = np.zeros((3, 3))
    m0s = 0.0
    for s, d, r, mw in data:
        n, u = fault(s, d, r)
        m0 = 10.0 ** (1.5 * mw + 9.1) if weighted else 1.0
        M += m0 * (np.outer(n, u) + np.outer(u, n))
        m0s += m0
    scalar = np.linalg.norm(M) / math.sqrt(2.0)
    cnt, tensor, pa, ba, ta, dcp, dct, eps, sc, msum, cons, summed, rate = row[2:]
    if int(cnt) != len(data):
        fails.append(f"group {g}: n {cnt}")
    note("moment_sum (rel)", abs(float(msum) / m0s - 1), 1e-9, g)
    note("summed (rel to sum of M0)", float(np.max(np.abs(np.array(nums(summed)) - M[[0, 1, 2, 0, 0, 1], [0, 1, 2, 1, 2, 2]]))) / m0s, 1e-12, g)
    note("consistency", abs(float(cons) - scalar / m0s), 1e-9, g)
    if scalar <= 1e-12 * m0s:
        if tensor != "" or pa != "":
            fails.append(f"group {g}: cancelled sum should have NULL axes")
        else:
            print(f"  group {g}: sum cancels (consistency {float(cons):.1e}), axis fields NULL as documented")
        continue
    T = M / scalar
    note("tensor components", float(np.max(np.abs(np.array(nums(tensor)) - T[[0, 1, 2, 0, 0, 1], [0, 1, 2, 1, 2, 2]]))), 1e-9, g)
    w, v = np.linalg.eigh(T)
    gaps = [w[1] - w[0], min(w[1] - w[0], w[2] - w[1]), w[2] - w[1]]
    for k, txt in enumerate((pa, ba, ta)):
        if gaps[k] > 1e-6:
            note("axes (deg)", axial_deg(line_vec(*nums(txt)), v[:, k]), 1e-7, g)
    if gaps[0] > 1e-6 and gaps[2] > 1e-6:
        note("best DC axes (deg)", max(axial_deg(line_vec(*nums(dcp)), v[:, 0]), axial_deg(line_vec(*nums(dct)), v[:, 2])), 1e-7, g)
    imin, imax = int(np.argmin(np.abs(w))), int(np.argmax(np.abs(w)))
    note("epsilon", abs(float(eps) - (-w[imin] / abs(w[imax]))), 1e-9, g)
    if weighted:
        ref = M[[0, 1, 2, 0, 0, 1], [0, 1, 2, 1, 2, 2]] / (2 * 3.3e10 * 1e15 * 3.15e9)
        note("kostrov rate (rel)", float(np.max(np.abs(np.array(nums(rate)) - ref))) / float(np.max(np.abs(ref))), 1e-9, g)
print(f"{len(groups)} groups x weighted/unweighted, {sum(len(x) for x in groups)} mechanisms")
print("worst deviations: " + ", ".join(f"{k} {v:.2e}" for k, v in sorted(worst.items())))
for f in fails[:20]:
    print("  FAIL", f)
ok = not fails and len(rows) == 2 * len(groups)
print(f"check_moment_numpy: {'ok' if ok else 'FAILED'} ({len(fails)} failures)")
sys.exit(0 if ok else 1)
