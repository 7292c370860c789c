"""Independent numpy re-computation of stress_inversion and right_dihedra, per
group in one GROUP BY query each.

Reference: numpy (Debian python3-numpy), implementing METHODS.md sections 1, 5
and 6 separately from src/core:
  - n (upward hanging-wall normal) and u (hanging-wall slip) from strike, dip
    and rake as striae stored them, by the formulas of METHODS.md section 1
    [pub: Aki & Richards 1980, Quantitative Seismology, ch. 4];
  - linear inversion of Michael (1984, JGR 89:11517) [pub]: unknowns
    (s11, s12, s13, s22, s23) of the tension-positive tensor, s33 = -(s11 + s22);
    |tau| = 1 on every fault gives three rows per datum whose column k is the
    shear traction of basis tensor E_k, a_k = E_k n - (n.E_k n) n, and A x = u.
    The stacked 3N x 5 system is solved with numpy.linalg.lstsq (SVD), NOT via
    the 5 x 5 normal equations the extension accumulates, so the two results
    come from different computations. Result negated to compression positive
    and scaled to unit Frobenius norm (README, Paleostress);
  - NULL rules of stress.hpp: fewer than 4 data; rank test on A^T A, i.e.
    (smallest / largest singular value of A)^2 < 1e-10; slips cancelling out,
    |A^T u| < 1e-12 sqrt(trace(A^T A) sum u.u);
  - principal axes by numpy.linalg.eigh of the compression-positive matrix,
    sigma1 = largest value; Phi = (s2 - s3)/(s1 - s3) [pub: Angelier 1979, as
    quoted in METHODS.md section 6];
  - mean misfit = mean angle between u and the resolved shear traction of the
    tension-positive tensor [pub: Wallace 1951, J. Geol. 59:118; Bott 1959,
    Geol. Mag. 96:109], planes with |tau| < 1e-9 left out (stress.hpp), checked
    on stress_inversion(f, resamples, seed), whose best tensor is the same
    linear inversion; its cones and Phi interval (Michael 1987, JGR 92:357, by
    the rules of bootstrap.hpp) against ref_bootstrap.py, the reimplementation
    of the documented bootstrap with its generator written from the published
    algorithms (groups up to 1000 data; check_bootstrap_numpy.py pins the
    level, the kept count and the seed mapping);
  - right dihedra [pub: Angelier & Mechler 1977, Bull. Soc. geol. France
    19:1309]: node x compressional for (n, u) when (x.n)(x.u) < -1e-12, on a
    nodal plane when |(x.n)(x.u)| <= 1e-12 (the on-plane margin of dihedra.hpp),
    which counts as half a datum (striae's rule since 0.2.0, issue 12: the
    boundary between the dihedra is shared equally); percent = 100 count / N on
    the node layout
    rebuilt here from the ring rule documented in grid.hpp and the README
    (rings at plunge 0, s, .., 90; max(1, round(360 cos p / s)) nodes from trend
    0; the horizontal ring keeps trends [0,180); one node at plunge 90).

Data: seeded numpy Generator. Wallace-Bott data (slip parallel to the resolved
shear traction) from known tensors, error-free and with angular noise on the
normal and the slip, on random planes and on near-optimally oriented planes;
purely random strike/dip/rake groups from N = 4 to 5000 (one rounded to 0.1
degree as field data are); NULL cases (N = 3, one plane with many rakes: rank
deficient, vertical faults of one zone: rank 4, opposite slip pairs: slips
cancel); and a group of grid-aligned vertical and dip-slip faults whose nodal
planes pass exactly through grid nodes (the on-plane rule of dihedra.hpp).

Tolerances: components and Phi 1e-9 absolute (unit-norm components); bootstrap
cones 1e-7 degree and Phi interval 1e-9; axes
1e-7 degree where the principal values are separated by more than 1e-6; mean
misfit 1e-7 degree; right-dihedra percentages 1e-9 (a one-count difference is
100/N, far above it); node positions 1e-9 degree.

No published worked example is included: none is recalled with enough
confidence to quote its numbers.
"""
import math
import os
import subprocess
import sys

import numpy as np

import ref_bootstrap as rb
from pgconn import fresh_db, nums, query

DB = "striae_external"
rng = np.random.default_rng(20260315)
SPACING = 10.0
ON_PLANE = 1e-12   # dihedra.hpp kDihedraOnPlane
RANK_LIMIT = 1e-10  # stress.hpp kStressRankLimit
NULL_LIMIT = 1e-12  # stress.hpp kStressNullLimit
MIN_DATA = 4        # stress.hpp kMinStressData
MIN_SHEAR = 1e-9    # stress.hpp kMinResolvedShear


def psql_stdin(script):
    """Run a SQL script through psql's stdin (for COPY data too large for -c)."""
    subprocess.run(["psql", "-X", "-q", "-v", "ON_ERROR_STOP=1", "-d", DB],
                   input=script, check=True, capture_output=True, text=True, env=dict(os.environ))


# ---------------------------------------------------------------------------
# Geometry, METHODS.md section 1 (NED, degrees)
# ---------------------------------------------------------------------------

def line_vec(trend, plunge):
    t, p = np.radians(trend), np.radians(plunge)
    return np.stack([np.cos(p) * np.cos(t), np.cos(p) * np.sin(t), np.sin(p)], axis=-1)


fault_vectors = rb.fault_vectors


def strike_dip_rake(n, u):
    """Inverse of fault_vectors for one datum (METHODS.md section 1, derived)."""
    n = np.asarray(n, float) / np.linalg.norm(n)
    u = np.asarray(u, float) / np.linalg.norm(u)
    if n[2] > 0:
        n, u = -n, -u
    d = math.degrees(math.acos(max(-1.0, min(1.0, -n[2]))))
    f = math.degrees(math.atan2(-n[0], n[1])) % 360.0
    s = np.array([math.cos(math.radians(f)), math.sin(math.radians(f)), 0.0])
    sd = math.sin(math.radians(d))
    sin_r = -u[2] / sd if sd > 1e-12 else float(np.dot(np.cross(s, u), [0.0, 0.0, -1.0]))
    r = math.degrees(math.atan2(sin_r, float(np.dot(u, s))))
    if r <= -180.0:
        r += 360.0
    return f, d, r


def unit(v):
    return v / np.linalg.norm(v, axis=-1, keepdims=True)


def random_upward_normals(k):
    v = unit(rng.normal(size=(k, 3)))
    v[v[:, 2] > 0] *= -1.0
    return v


def compression_tensor(s1, s3, phi):
    """Compression-positive reduced tensor with sigma1 along s1, sigma3 along s3
    (orthogonalised here) and shape ratio phi: values 1, phi, 0, trace removed,
    unit Frobenius norm."""
    a1 = unit(np.asarray(s1, float))
    a3 = np.asarray(s3, float) - np.dot(s3, a1) * a1
    a3 = unit(a3)
    a2 = np.cross(a3, a1)
    m = np.outer(a1, a1) + phi * np.outer(a2, a2)
    m -= np.trace(m) / 3.0 * np.eye(3)
    return m / np.linalg.norm(m)


def wallace_bott_slips(n, sig_t):
    """Unit resolved shear tractions of the tension-positive tensor on planes n."""
    t = n @ sig_t
    tau = t - np.sum(t * n, axis=1, keepdims=True) * n
    return unit(tau)


def perturb(n, u, deg_normal, deg_slip):
    """Angular noise: tilt the normal by ~deg_normal, project the slip into the
    new plane and rotate it about the normal by ~deg_slip (normal deviates)."""
    n2 = unit(n + np.radians(deg_normal) * rng.normal(size=n.shape) / math.sqrt(2.0))
    u2 = unit(u - np.sum(u * n2, axis=1, keepdims=True) * n2)
    a = np.radians(deg_slip) * rng.normal(size=len(n))[:, None]
    u3 = np.cos(a) * u2 + np.sin(a) * np.cross(n2, u2)
    return n2, unit(u3)


# ---------------------------------------------------------------------------
# Groups: list of (name, rows of (strike, dip, rake), note)
# ---------------------------------------------------------------------------
groups = []
truth = {}  # group -> generating compression-positive tensor (Wallace-Bott groups)


def add_vectors(name, n, u, note=""):
    groups.append((name, [strike_dip_rake(a, b) for a, b in zip(n, u)], note))


def add_wb(name, s1, s3, phi, k, noise=(0.0, 0.0), optimal=False):
    c = compression_tensor(line_vec(*s1), line_vec(*s3), phi)
    sig_t = -c
    if optimal:
        # normals ~60 degrees from sigma1 towards +-sigma3, scattered (planes near
        # the optimal Coulomb orientation; conjugate sets by the random sign)
        w, v = np.linalg.eigh(c)
        a1, a2, a3 = v[:, 2], v[:, 1], v[:, 0]
        th = np.radians(rng.normal(60.0, 8.0, k))
        ps = np.radians(rng.normal(0.0, 20.0, k)) + np.where(rng.random(k) < 0.5, 0.0, math.pi)
        n = (np.cos(th)[:, None] * a1 + (np.sin(th) * np.cos(ps))[:, None] * a3
             + (np.sin(th) * np.sin(ps))[:, None] * a2)
        n = unit(n)
        n[n[:, 2] > 0] *= -1.0
    else:
        n = random_upward_normals(k)
    u = wallace_bott_slips(n, sig_t)
    if noise != (0.0, 0.0):
        n, u = perturb(n, u, *noise)
    truth[len(groups)] = c
    add_vectors(name, n, u, "wb")


def add_random(name, k, decimals=None):
    f, d, r = rng.uniform(0, 360, k), rng.uniform(0, 90, k), rng.uniform(-180, 180, k)
    if decimals is not None:
        f, d, r = np.round(f, decimals), np.round(d, decimals), np.round(r, decimals)
    groups.append((name, list(zip(f, d, r)), "random"))


add_wb("WB 040/10 135/05 phi .3 N60 noise 5/10", (40, 10), (135, 5), 0.3, 60, (5.0, 10.0))
add_wb("WB 200/80 020/10 phi .6 N200 optimal noise 3/5", (200, 80), (20, 10), 0.6, 200, (3.0, 5.0), optimal=True)
add_wb("WB 090/05 000/85 phi .5 N1000 noise 10/15", (90, 5), (0, 85), 0.5, 1000, (10.0, 15.0))
add_wb("WB 310/30 200/25 phi .1 N40 error-free", (310, 30), (200, 25), 0.1, 40)
add_wb("WB 015/60 105/00 phi .9 N300 optimal error-free", (15, 60), (105, 0), 0.9, 300, optimal=True)
add_wb("WB 250/20 150/30 phi .4 N4 noise 5/5", (250, 20), (150, 30), 0.4, 4, (5.0, 5.0))
add_random("random N5", 5)
add_random("random N30", 30)
add_random("random N500", 500)
add_random("random N5000", 5000)
add_random("random N100 rounded 0.1 deg", 100, decimals=1)
add_random("random N3 (NULL: too few)", 3)
groups.append(("one plane, 10 rakes (NULL: rank)", [(123.0, 47.0, float(r)) for r in np.linspace(-170, 170, 10)], "null"))
groups.append(("vertical faults, one zone (NULL: rank 4)",
               [(float(s), 90.0, float(r)) for s, r in zip(rng.uniform(0, 360, 20), rng.uniform(-180, 180, 20))], "null"))
_pairs = []
for f, d, r in zip(rng.uniform(0, 360, 8), rng.uniform(10, 80, 8), rng.uniform(-180, 180, 8)):
    _pairs += [(f, d, r), (f, d, r - 180.0 if r > 0 else r + 180.0)]
groups.append(("8 opposite-slip pairs (NULL: slips cancel)", _pairs, "null"))
groups.append(("grid-aligned vertical and dip-slip faults",
               [(float(s), 90.0, float(r)) for s in range(0, 360, 30) for r in (0.0, 90.0, -90.0, 180.0)]
               + [(float(s), 45.0, float(r)) for s in range(0, 360, 40) for r in (90.0, -90.0)]
               + [(float(s), 0.0, 0.0) for s in (0.0, 90.0)], "on-plane"))

# ---------------------------------------------------------------------------
# Load, then read back what striae stored (strike, dip, rake to 17 digits)
# ---------------------------------------------------------------------------
fresh_db(DB)
lines = []
for g, (_, rows, _) in enumerate(groups):
    for i, (f, d, r) in enumerate(rows):
        lines.append(f"{g}\t{i}\t{float(f)!r}\t{float(d)!r}\t{float(r)!r}")
psql_stdin("CREATE TABLE raw (g int, i int, s float8, d float8, r float8);\n"
           "COPY raw FROM STDIN;\n" + "\n".join(lines) + "\n\\.\n"
           "CREATE TABLE fs AS SELECT g, i, CASE WHEN i % 4 = 1 THEN (s || '/' || d || '/' || r)::fault_slip "
           "ELSE fault_slip(s, d, r) END AS f FROM raw;\n")
stored = {}
for g, i, f, d, r in query("SET extra_float_digits = 3; SELECT g, i, strike(f), dip(f), rake(f) FROM fs "
                           "ORDER BY g, i", DB):
    stored.setdefault(int(g), []).append((float(f), float(d), float(r)))

INV_SQL = ("SET extra_float_digits = 3; SELECT g, n, stress_components(t), sigma1(t), sigma2(t), sigma3(t), "
           "shape_ratio(t), data_count(t) FROM (SELECT g, count(*) n, stress_inversion(f) t FROM fs "
           "GROUP BY g) q ORDER BY g")
BOOT_M, BOOT_SEED = 200, 7
BOOT_SQL = ("SET extra_float_digits = 3; SELECT g, stress_components(t), mean_misfit(t), sigma1_confidence(t), "
            "sigma2_confidence(t), sigma3_confidence(t), shape_ratio_interval(t), data_count(t) "
            f"FROM (SELECT g, stress_inversion(f, {BOOT_M}, {BOOT_SEED}) t FROM fs GROUP BY g) q ORDER BY g")
RD_SQL = ("SET extra_float_digits = 3; SELECT q.g, c.k, c.trend, c.plunge, c.value FROM "
          f"(SELECT g, right_dihedra(f, {SPACING!r}) r FROM fs GROUP BY g) q, "
          "LATERAL grid_cells(q.r) WITH ORDINALITY c(trend, plunge, value, k) ORDER BY q.g, c.k")
inv = {int(r[0]): r[1:] for r in query(INV_SQL, DB)}
boot = {int(r[0]): r[1:] for r in query(BOOT_SQL, DB)}
rd = {}
for g, k, t, p, v in query(RD_SQL, DB):
    rd.setdefault(int(g), []).append((float(t), float(p), float(v)))


# ---------------------------------------------------------------------------
# Reference computations
# ---------------------------------------------------------------------------

def design(n):
    """Stacked 3N x 5 matrix: rows (datum i, component), column k the shear
    traction on n_i of the basis tensor E_k (ref_bootstrap.design)."""
    return rb.design(n).reshape(-1, 5)


def michael(n, u):
    """(compression-positive unit-norm components [nn, ee, dd, ne, nd, ed], cond) or (None, why)."""
    if len(n) < MIN_DATA:
        return None, "too few data"
    a = design(n)
    b = u.reshape(-1)
    sv = np.linalg.svd(a, compute_uv=False)
    if not (sv[0] > 0) or (sv[-1] / sv[0]) ** 2 < RANK_LIMIT:
        return None, "rank deficient"
    if np.linalg.norm(a.T @ b) < NULL_LIMIT * math.sqrt(float(np.sum(sv ** 2)) * float(np.sum(u * u))):
        return None, "slips cancel"
    x, *_ = np.linalg.lstsq(a, b, rcond=None)
    c = np.array([-x[0], -x[3], x[0] + x[3], -x[1], -x[2], -x[4]])
    c /= math.sqrt(c[0] ** 2 + c[1] ** 2 + c[2] ** 2 + 2.0 * (c[3] ** 2 + c[4] ** 2 + c[5] ** 2))
    return c, float(sv[0] / sv[-1])


def matrix(c):
    nn, ee, dd, ne, nd, ed = c
    return np.array([[nn, ne, nd], [ne, ee, ed], [nd, ed, dd]])


def mean_misfit_ref(n, u, c):
    t = n @ (-matrix(c))
    tau = t - np.sum(t * n, axis=1, keepdims=True) * n
    mag = np.linalg.norm(tau, axis=1)
    ok = mag >= MIN_SHEAR
    ang = np.degrees(np.arctan2(np.linalg.norm(np.cross(u[ok], tau[ok]), axis=1), np.sum(u[ok] * tau[ok], axis=1)))
    return float(np.mean(ang)) if ok.any() else None


def grid_nodes(s):
    """Node (trend, plunge) list rebuilt from the documented ring rule."""
    rings = int(math.floor(90.0 / s + 0.5))
    out = []
    for i in range(rings + 1):
        if i == rings:
            out.append((0.0, 90.0))
            continue
        p = i * s
        m = max(1, int(math.floor(360.0 * math.cos(math.radians(p)) / s + 0.5)))
        step = 360.0 / m
        for j in range(m):
            t = j * step
            if i == 0 and t >= 180.0:
                continue
            out.append((t, p))
    return out


def axial_deg(a, b):
    return math.degrees(math.atan2(np.linalg.norm(np.cross(a, b)), abs(float(np.dot(a, b)))))


failures = []
worst = {}
info = []


def note(key, dev):
    worst[key] = max(worst.get(key, 0.0), dev)


def fail(msg):
    failures.append(msg)


nodes = grid_nodes(SPACING)
X = line_vec(np.array([t for t, _ in nodes]), np.array([p for _, p in nodes]))
nulls_seen = 0
for g, (name, _, _) in enumerate(groups):
    gname = f"[{g}] {name}"
    sdr = np.array(stored[g])
    n, u = fault_vectors(sdr[:, 0], sdr[:, 1], sdr[:, 2])
    ref, extra = michael(n, u)

    # --- stress_inversion(f) ---
    cnt, comp, s1t, s2t, s3t, phit, dct = inv[g]
    if int(cnt) != len(n):
        fail(f"{gname}: {cnt} rows in SQL, {len(n)} in the reference")
    if ref is None or comp == "":
        if (ref is None) != (comp == ""):
            fail(f"{gname}: tensor {'NULL' if comp == '' else comp} but reference {'NULL (' + extra + ')' if ref is None else 'defined'}")
        else:
            nulls_seen += 1
            info.append(f"{gname}: NULL as expected ({extra})")
    else:
        got = np.array(nums(comp))
        dev = float(np.max(np.abs(got - ref)))
        note("components (abs)", dev)
        if dev > 1e-9:
            fail(f"{gname}: components {got.tolist()} vs reference {ref.tolist()} (max dev {dev:.3e}, cond(A) {extra:.3g})")
        if int(dct) != len(n):
            fail(f"{gname}: data_count {dct} != {len(n)}")
        w, v = np.linalg.eigh(matrix(ref))
        vals, axes = w[::-1], v[:, ::-1]  # sigma1 = most compressive = largest
        gaps = [vals[0] - vals[1], min(vals[0] - vals[1], vals[1] - vals[2]), vals[1] - vals[2]]
        for k, txt in enumerate((s1t, s2t, s3t)):
            if gaps[k] > 1e-6:
                d = axial_deg(line_vec(*nums(txt)), axes[:, k])
                note(f"sigma{k + 1} (deg)", d)
                if d > 1e-7:
                    fail(f"{gname}: sigma{k + 1} {txt} is {d:.3e} deg from the reference")
        phi = (vals[1] - vals[2]) / (vals[0] - vals[2])
        note("shape_ratio (abs)", abs(float(phit) - phi))
        if abs(float(phit) - phi) > 1e-9:
            fail(f"{gname}: shape_ratio {phit} vs reference {phi!r}")
        msg = f"{gname}: cond(A) {extra:.3g}, Phi {phi:.4f}"
        if g in truth:  # information only: the |tau| = 1 estimate vs the generating tensor
            tw, tv = np.linalg.eigh(truth[g])
            msg += (f"; generating tensor: sigma1 {axial_deg(tv[:, 2], axes[:, 0]):.2f} deg, "
                    f"sigma3 {axial_deg(tv[:, 0], axes[:, 2]):.2f} deg away, "
                    f"Phi {(tw[1] - tw[0]) / (tw[2] - tw[0]):.4f}")
        info.append(msg)

    # --- stress_inversion(f, 200, 7): same best tensor, exact mean misfit, bootstrap ranges ---
    bcomp, bmis, c1, c2, c3, pint, bdc = boot[g]
    if ref is None or bcomp == "":
        if (ref is None) != (bcomp == ""):
            fail(f"{gname}: bootstrap tensor {'NULL' if bcomp == '' else 'defined'}, reference {'NULL' if ref is None else 'defined'}")
    else:
        dev = float(np.max(np.abs(np.array(nums(bcomp)) - ref)))
        note("bootstrap best components (abs)", dev)
        if dev > 1e-9:
            fail(f"{gname}: bootstrap best components off by {dev:.3e}")
        mref = mean_misfit_ref(n, u, ref)
        if mref is None or bmis == "":
            if (mref is None) != (bmis == ""):
                fail(f"{gname}: mean_misfit {bmis!r}, reference {mref!r}")
        else:
            note("mean_misfit (deg)", abs(float(bmis) - mref))
            if abs(float(bmis) - mref) > 1e-7:
                fail(f"{gname}: mean_misfit {bmis} vs reference {mref!r}")
        # The cones and the interval against the reimplementation of the
        # documented bootstrap (ref_bootstrap.py; check_bootstrap_numpy.py pins
        # it sharply), for groups up to 1000 data (the draws are pure Python)
        # whose (n, u) order and kept set are not decided by near ties.
        if len(n) <= 1000:
            ns, us, order_gap = rb.sort_data(n, u)
            bref = rb.bootstrap(ns, us, BOOT_M, BOOT_SEED) if order_gap >= 1e-9 else None
            dist = sorted(bref["distances"]) if bref else []
            keep = bref["keep"] if bref else 0
            if bref is None or (keep < BOOT_M and math.isfinite(dist[keep - 1]) and dist[keep] - dist[keep - 1] < 1e-7):
                info.append(f"{gname}: bootstrap not compared (order or kept set decided by a near tie)")
            elif bref["cones"] is None or c1 == "":
                if (bref["cones"] is None) != (c1 == ""):
                    fail(f"{gname}: bootstrap cones {'NULL' if c1 == '' else 'defined'}, reference "
                         f"{'NULL' if bref['cones'] is None else 'defined'}")
            else:
                have = [float(c1), float(c2), float(c3)] + nums(pint)
                want = list(bref["cones"]) + list(bref["phi"])
                dc = max(abs(a - b) for a, b in zip(have[:3], want[:3]))
                dp = max(abs(a - b) for a, b in zip(have[3:], want[3:]))
                note("bootstrap cones (deg)", dc)
                note("bootstrap Phi interval", dp)
                if dc > 1e-7 or dp > 1e-9:
                    fail(f"{gname}: bootstrap cones and Phi interval {have} vs reference {want}")

    # --- right_dihedra(f, 10) ---
    cells = rd.get(g, [])
    if len(cells) != len(nodes):
        fail(f"{gname}: right_dihedra has {len(cells)} cells, the documented layout {len(nodes)}")
        continue
    pos = max(max(abs(ct - t), abs(cp - p)) for (ct, cp, _), (t, p) in zip(cells, nodes))
    note("grid node position (deg)", pos)
    if pos > 1e-9:
        fail(f"{gname}: grid node positions differ from the documented layout by {pos:.3e} deg")
    # products evaluated element by element (no BLAS), one node row at a time
    a = X[:, 0:1] * n[:, 0] + X[:, 1:2] * n[:, 1] + X[:, 2:3] * n[:, 2]
    b = X[:, 0:1] * u[:, 0] + X[:, 1:2] * u[:, 1] + X[:, 2:3] * u[:, 2]
    prod = a * b
    counts = np.sum(prod < -ON_PLANE, axis=1) + 0.5 * np.sum(np.abs(prod) <= ON_PLANE, axis=1)
    pct = 100.0 * counts / len(n)
    got = np.array([v for _, _, v in cells])
    dev = float(np.max(np.abs(got - pct)))
    note("right_dihedra percent (abs)", dev)
    if dev > 1e-9:
        bad = int(np.sum(np.abs(got - pct) > 1e-9))
        fail(f"{gname}: right_dihedra differs at {bad} nodes, max {dev:.3e} percent")
    near = int(np.sum(np.abs(prod) <= ON_PLANE))
    if near:
        info.append(f"{gname}: {near} node-datum pairs on a nodal plane (|(x.n)(x.u)| <= 1e-12, counted half)")
    margin = np.abs(prod[np.abs(prod) > ON_PLANE])
    if margin.size and margin.min() < 1e-9:
        info.append(f"{gname}: closest off-plane product {margin.min():.2e} (rounding could matter below ~1e-15)")

print(f"{len(groups)} groups, {sum(len(r) for _, r, _ in groups)} data, right_dihedra at {SPACING:g} deg: {len(nodes)} nodes")
for line in info:
    print("  info:", line)
print("worst deviations: " + ", ".join(f"{k} {v:.2e}" for k, v in sorted(worst.items())))
for f in failures[:40]:
    print("  FAIL", f)
ok = not failures and len(inv) == len(groups) and len(boot) == len(groups) and len(rd) == len(groups)
print(f"check_stress_numpy: {'ok' if ok else 'FAILED'} ({len(failures)} failures)")
sys.exit(0 if ok else 1)
