"""Independent numpy re-computation of fisher_mean and orientation_tensor
(lineations and poles of planes), per group in one GROUP BY query each.

Reference: numpy (Debian python3-numpy), implementing METHODS.md sections 3-4
separately from src/core:
  - T = (1/N) sum x x^T, eigenvalues s1 >= s2 >= s3 and eigenvectors e1..e3
    by numpy.linalg.eigh [pub: formulas of METHODS.md section 4];
  - axial data aligned with e1 (each x multiplied by sign(x . e1)) before
    summing, the reference method of METHODS.md section 3; R = |sum|,
    mean = sum / R, kappa = (N-1)/(N-R), exact alpha95 from
    cos a = 1 - ((N-R)/R) ((1/0.05)^(1/(N-1)) - 1) [pub: Fisher 1953,
    Proc. R. Soc. A 217:295]; angular_sd = 81/sqrt(kappa) [from memory];
  - Woodcock (1977) K = ln(s1/s2)/ln(s2/s3), C = ln(s1/s3) [from memory];
    Vollmer (1990) P = s1-s2, G = 2(s2-s3), R = 3 s3 [from memory].
Pole of a plane: -n with n the upward normal of METHODS.md section 1 (Aki &
Richards 1980), computed from strike and dip here, not with the trend/plunge
shortcut the extension may use.

Data: seeded numpy Generator; groups drawn from a Fisher distribution with the
inverse CDF of cos(theta), derived from Fisher (1953): a moderate cluster, a
cluster straddling the horizontal (mean 000/00, so data come out as e.g. 002/05
and 178/03), a steep cluster (straddling the vertical), a tight cluster, a
broad one, small N (1, 2, 3) and a girdle (tensor only, see below). Part of the
input is written in the upward form (trend + 180, -plunge; for planes the
opposite strike with plane_from_dip_direction) to exercise canonicalisation.

Girdles and very broad clusters: stats.hpp documents that the streaming
resultant equals the e1-aligned one only when every datum lies within 62.43
degrees of e1 (it aligns with the nearest of 13 fixed axes). A girdle and a
kappa = 4 cluster break that bound, so they are compared for the tensor only and
their Fisher deviation is printed for information. Every compared group is
checked to lie within the bound, so the comparison is exact by the documented
contract.

No published worked example is included: none is recalled with enough
confidence to quote its numbers.
"""
import math
import os
import subprocess
import sys

import numpy as np

from pgconn import fresh_db, nums, query

DB = "striae_external"
rng = np.random.default_rng(20261215)


def psql_stdin(script):
    """Run a SQL script through psql's stdin (for COPY data too large for -c)."""
    subprocess.run(["psql", "-X", "-q", "-v", "ON_ERROR_STOP=1", "-d", DB],
                   input=script, check=True, capture_output=True, text=True, env=dict(os.environ))


def vec(trend, plunge):
    t, p = math.radians(trend), math.radians(plunge)
    return np.array([math.cos(p) * math.cos(t), math.cos(p) * math.sin(t), math.sin(p)])


def pole_vec(strike, dip):
    """-n, n = (-sin d sin f, sin d cos f, -cos d): METHODS.md section 1."""
    f, d = math.radians(strike), math.radians(dip)
    return np.array([math.sin(d) * math.sin(f), -math.sin(d) * math.cos(f), math.cos(d)])


def to_trend_plunge(x):
    """Trend/plunge of the direction x (plunge negative when x points up)."""
    x = x / np.linalg.norm(x)
    return math.degrees(math.atan2(x[1], x[0])) % 360.0, math.degrees(math.asin(max(-1.0, min(1.0, x[2]))))


def fisher_sample(mean, kappa, n):
    """Unit vectors from a Fisher distribution about `mean`: inverse CDF of
    cos(theta), cos = 1 + ln(1 - U (1 - exp(-2 kappa))) / kappa, derived from
    Fisher (1953); azimuth uniform; rotated from the pole to `mean`."""
    u = rng.random(n)
    c = 1.0 + np.log1p(-u * (-np.expm1(-2.0 * kappa))) / kappa
    c = np.clip(c, -1.0, 1.0)
    s = np.sqrt(1.0 - c * c)
    phi = rng.uniform(0.0, 2.0 * math.pi, n)
    m = mean / np.linalg.norm(mean)
    a = np.cross(m, [0.0, 0.0, 1.0] if abs(m[2]) < 0.9 else [1.0, 0.0, 0.0])
    a /= np.linalg.norm(a)
    b = np.cross(m, a)
    return (np.outer(s * np.cos(phi), a) + np.outer(s * np.sin(phi), b) + np.outer(c, m))


def girdle_sample(normal, spread_deg, n):
    """Unit vectors scattered about the great circle normal to `normal`."""
    m = normal / np.linalg.norm(normal)
    a = np.cross(m, [0.0, 0.0, 1.0] if abs(m[2]) < 0.9 else [1.0, 0.0, 0.0])
    a /= np.linalg.norm(a)
    b = np.cross(m, a)
    phi = rng.uniform(0.0, math.pi, n)
    off = np.radians(rng.normal(0.0, spread_deg, n))
    v = (np.outer(np.cos(off) * np.cos(phi), a) + np.outer(np.cos(off) * np.sin(phi), b)
         + np.outer(np.sin(off), m))
    return v


# group: (name, kind 'l' or 'p', vectors, compare_fisher)
groups = []


def add(name, kind, x, fisher=True):
    groups.append((name, kind, np.asarray(x, dtype=float), fisher))


for kind in ("l", "p"):
    add("moderate 040/35 k30 N40", kind, fisher_sample(vec(40, 35), 30.0, 40))
    add("horizontal 000/00 k40 N60", kind, fisher_sample(vec(0, 0), 40.0, 60))
    add("horizontal 123/02 k15 N25", kind, fisher_sample(vec(123, 2), 15.0, 25))
    add("steep 090/85 k25 N50", kind, fisher_sample(vec(90, 85), 25.0, 50))
    add("vertical 000/90 k60 N30", kind, fisher_sample(vec(0, 90), 60.0, 30))
    add("tight 250/60 k2000 N200", kind, fisher_sample(vec(250, 60), 2000.0, 200))
    add("broad 310/20 k15 N60", kind, fisher_sample(vec(310, 20), 15.0, 60))
    add("N=1", kind, fisher_sample(vec(200, 10), 50.0, 1))
    add("N=2 tight", kind, fisher_sample(vec(10, 3), 200.0, 2))
    add("N=2 across horizontal", kind, [vec(0, 5), vec(180, 5)])
    add("N=2 wide (alpha95 undefined)", kind, [vec(0, 10), vec(80, 40)])
    add("N=3", kind, fisher_sample(vec(160, 45), 30.0, 3))
    add("N=3 across horizontal", kind, [vec(0, 5), vec(180, 5), vec(20, 3)])
    add("girdle pole 030/20 N120", kind, girdle_sample(vec(30, 20), 6.0, 120), fisher="girdle")
    add("very broad 200/30 k4 N60", kind, fisher_sample(vec(200, 30), 4.0, 60), fisher="beyond the 62.43 deg bound")

# Rows: (group, i, a, b, form). Lineations: a, b = trend, plunge as given to
# lineation(); planes: strike/dip for plane() or dip direction/dip for
# plane_from_dip_direction(). Every third datum is written in the upward form.
rows = []
for g, (name, kind, x, _) in enumerate(groups):
    for i, v in enumerate(x):
        t, p = to_trend_plunge(v)
        if kind == "l":
            if p >= 0 and i % 3 == 2:
                t, p = (t + 180.0) % 360.0, -p  # same axis, upward form
            rows.append((g, i, t, p, 0))
        else:
            if p < 0:
                t, p = (t + 180.0) % 360.0, -p  # lower-hemisphere pole
            dip = 90.0 - p
            if i % 3 == 2:
                rows.append((g, i, (t + 180.0) % 360.0, dip, 1))  # dip direction = pole trend + 180
            else:
                rows.append((g, i, (t + 90.0) % 360.0, dip, 0))  # strike = pole trend + 90 (RHR)

fresh_db(DB)
data = "\n".join(f"{g}\t{i}\t{a!r}\t{b!r}\t{f}" for g, i, a, b, f in rows)
psql_stdin("CREATE TABLE raw (g int, i int, a float8, b float8, form int);\n"
           "COPY raw FROM STDIN;\n" + data + "\n\\.\n"
           "CREATE TABLE dl AS SELECT r.g, r.i, lineation(r.a, r.b) AS l FROM raw r JOIN (VALUES "
           + ",".join(f"({g})" for g, gr in enumerate(groups) if gr[1] == "l") + ") k(g) USING (g);\n"
           "CREATE TABLE dp AS SELECT r.g, r.i, CASE r.form WHEN 0 THEN plane(r.a, r.b) "
           "ELSE plane_from_dip_direction(r.a, r.b) END AS p FROM raw r JOIN (VALUES "
           + ",".join(f"({g})" for g, gr in enumerate(groups) if gr[1] == "p") + ") k(g) USING (g);\n")

# The reference uses the values as striae stored them (read back exactly).
stored = {}
for g, i, a, b in query("SET extra_float_digits = 3; SELECT g, i, trend(l), plunge(l) FROM dl "
                        "UNION ALL SELECT g, i, strike(p), dip(p) FROM dp", DB):
    g = int(g)
    v = vec(float(a), float(b)) if groups[g][1] == "l" else pole_vec(float(a), float(b))
    stored.setdefault(g, []).append(v)

FISHER_SQL = ("SET extra_float_digits = 3; SELECT g, (s).mean, (s).n, (s).resultant, (s).kappa, (s).alpha95, "
              "(s).angular_sd FROM (SELECT g, fisher_mean({c}) s FROM {t} GROUP BY g) q ORDER BY g")
TENSOR_SQL = ("SET extra_float_digits = 3; SELECT g, (f).e1, (f).e2, (f).e3, (f).s1, (f).s2, (f).s3, "
              "(f).woodcock_k, (f).woodcock_c, (f).vollmer_p, (f).vollmer_g, (f).vollmer_r, (f).n "
              "FROM (SELECT g, orientation_tensor({c}) f FROM {t} GROUP BY g) q ORDER BY g")
fisher = {int(r[0]): r[1:] for t, c in (("dl", "l"), ("dp", "p")) for r in query(FISHER_SQL.format(t=t, c=c), DB)}
tensor = {int(r[0]): r[1:] for t, c in (("dl", "l"), ("dp", "p")) for r in query(TENSOR_SQL.format(t=t, c=c), DB)}


def axial_deg(a, b):
    """Axial angle by atan2(|a x b|, |a.b|), precise for nearly parallel axes."""
    return math.degrees(math.atan2(np.linalg.norm(np.cross(a, b)), abs(float(np.dot(a, b)))))


def line_of(s):
    return vec(*nums(s))


def fnum(s):
    return None if s == "" else float(s)


failures = []
worst = {}


def note(key, dev):
    worst[key] = max(worst.get(key, 0.0), dev)


def rel_check(gname, key, got, ref, rel=1e-9, floor=1e-13):
    """|got - ref| <= rel |ref| + floor; None means the field must be NULL."""
    if ref is None or got is None:
        if (ref is None) != (got is None):
            failures.append(f"{gname}: {key} got {got}, expected {'NULL' if ref is None else ref}")
        return
    dev = abs(got - ref)
    note(key + " (rel)", dev / max(abs(ref), floor / rel))
    if dev > rel * abs(ref) + floor:
        failures.append(f"{gname}: {key} got {got!r}, expected {ref!r}")


def angle_check(gname, key, got_text, ref_vec, tol=1e-7):
    if ref_vec is None or got_text == "":
        if (ref_vec is None) != (got_text == ""):
            failures.append(f"{gname}: {key} got {got_text!r}, expected {'NULL' if ref_vec is None else 'a value'}")
        return
    dev = axial_deg(line_of(got_text), ref_vec)
    note(key + " (deg)", dev)
    if dev > tol:
        failures.append(f"{gname}: {key} {got_text} is {dev:.3e} deg from the reference")


BOUND = 90.0 - 27.569276130480937  # exactness bound documented in stats.hpp
TIE = 1e-12  # eigenvalue tie / zero threshold documented in stats.hpp
info = []
for g, (name, kind, _, cmp_fisher) in enumerate(groups):
    gname = f"[{g}] {kind} {name}"
    x = np.array(stored[g])
    n = len(x)
    T = sum(np.outer(v, v) for v in x) / n
    w, V = np.linalg.eigh(T)
    s = w[::-1].copy()
    E = V[:, ::-1]
    s = np.where(np.abs(s) < 1e-15, 0.0, s)
    e1 = E[:, 0]

    # --- orientation tensor ---
    e1g, e2g, e3g, s1g, s2g, s3g, kg, cg, pg, gg, rg, ng = tensor[g]
    if int(ng) != n:
        failures.append(f"{gname}: tensor n {ng} != {n}")
    for k, (got, ref) in enumerate(zip((s1g, s2g, s3g), s)):
        rel_check(gname, f"s{k + 1}", float(got), float(ref))
    # Eigenvectors only where their eigenvalue is separated from the others.
    gaps = [s[0] - s[1], min(s[0] - s[1], s[1] - s[2]), s[1] - s[2]]
    for k, got in enumerate((e1g, e2g, e3g)):
        if gaps[k] > 1e-6:
            angle_check(gname, f"e{k + 1}", got, E[:, k])
    kref = math.log(s[0] / s[1]) / math.log(s[1] / s[2]) if s[2] >= TIE and s[1] - s[2] >= TIE else None
    cref = math.log(s[0] / s[2]) if s[2] >= TIE else None
    rel_check(gname, "woodcock_k", fnum(kg), kref, floor=1e-12)
    rel_check(gname, "woodcock_c", fnum(cg), cref, floor=1e-12)
    rel_check(gname, "vollmer_P", float(pg), s[0] - s[1], floor=1e-13)
    rel_check(gname, "vollmer_G", float(gg), 2 * (s[1] - s[2]), floor=1e-13)
    rel_check(gname, "vollmer_R", float(rg), 3 * s[2], floor=1e-13)

    # --- Fisher mean, axial: align with e1 (METHODS.md section 3) ---
    meang, nfg, Rg, kapg, a95g, asdg = fisher[g]
    sg = np.where(x @ e1 < 0, -1.0, 1.0)
    Rv = np.array([math.fsum(sg * x[:, c]) for c in range(3)])
    R = float(np.linalg.norm(Rv))
    mean = Rv / R
    far = int(np.sum(np.degrees(np.arccos(np.clip(np.abs(x @ e1), 0.0, 1.0))) > BOUND))
    if cmp_fisher is not True:
        info.append(f"{gname}: {far} data beyond {BOUND} deg of e1; Fisher R {float(Rg):.6f} vs e1-aligned {R:.6f}, "
                    f"kappa {fnum(kapg)!r} vs {(n - 1) / (n - R)!r}, mean {axial_deg(line_of(meang), mean):.3g} deg apart "
                    f"(not compared: {cmp_fisher})")
        continue
    if far:
        failures.append(f"{gname}: test data error, {far} data beyond {BOUND} deg of e1")
    if int(nfg) != n:
        failures.append(f"{gname}: fisher n {nfg} != {n}")
    rel_check(gname, "R", float(Rg), R)
    if s[0] - s[1] > 1e-6:
        angle_check(gname, "mean", meang, mean)
    if n >= 2 and n - R > 1e-12 * n:
        kappa = (n - 1) / (n - R)
        cosa = 1.0 - ((n - R) / R) * ((1.0 / 0.05) ** (1.0 / (n - 1)) - 1.0)
        a95 = math.degrees(math.acos(cosa)) if cosa >= -1.0 else None
        asd = 81.0 / math.sqrt(kappa)
    else:
        kappa = a95 = asd = None
    rel_check(gname, "kappa", fnum(kapg), kappa)
    if a95 is None or fnum(a95g) is None:
        rel_check(gname, "alpha95", fnum(a95g), a95)
    else:
        note("alpha95 (deg)", abs(float(a95g) - a95))
        if abs(float(a95g) - a95) > 1e-7:
            failures.append(f"{gname}: alpha95 got {a95g}, expected {a95!r}")
    rel_check(gname, "angular_sd", fnum(asdg), asd)

print(f"{len(groups)} groups, {len(rows)} data")
for line in info:
    print("  info:", line)
print("worst deviations: " + ", ".join(f"{k} {v:.2e}" for k, v in sorted(worst.items())))
for f in failures[:40]:
    print("  FAIL", f)
ok = not failures and len(fisher) == len(groups) and len(tensor) == len(groups)
print(f"check_stats_numpy: {'ok' if ok else 'FAILED'} ({len(failures)} failures)")
sys.exit(0 if ok else 1)
