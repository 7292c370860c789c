"""Independent reimplementation of striae's bootstrap (Michael 1987) for the
external checks: the generator from the published algorithms and the resample
rules documented in src/core/bootstrap.hpp and README (Paleostress), with the
inversion of Michael (1984) by numpy's least squares. Not run by itself
(tests/external/run.sh runs check_* files only).

Generator, written from the published definitions, not from striae's code:
  - splitmix64 (Steele, Lea & Flood 2014, "Fast splittable pseudorandom number
    generators", OOPSLA): x += 0x9e3779b97f4a7c15; z = x;
    z = (z ^ (z >> 30)) * 0xbf58476d1ce4e5b9; z = (z ^ (z >> 27)) *
    0x94d049bb133111eb; return z ^ (z >> 31)  (all mod 2^64);
  - xoshiro256** (Blackman & Vigna 2021, "Scrambled linear pseudorandom number
    generators", ACM TOMS 47(4):36): result = rotl(s1 * 5, 7) * 9;
    t = s1 << 17; s2 ^= s0; s3 ^= s1; s1 ^= s2; s0 ^= s3; s2 ^= t;
    s3 = rotl(s3, 45); its four state words filled by four splitmix64 outputs
    from the seed (the seeding the xoshiro authors recommend);
  - bounded integers by Lemire's multiply-and-reject method (Lemire 2019, "Fast
    random integer generation in an interval", ACM TOMACS 29(1):3) on the top
    32 bits of a draw (bootstrap.hpp): x = next >> 32; m = x * s; l = m mod 2^32;
    if l < s: t = (2^32 - s) mod s; while l < t: redraw; return m >> 32.
Seed mapping (README): the SQL bigint seed is taken as its 64-bit two's
complement pattern (seed -1 is 2^64 - 1).

Bootstrap rules (bootstrap.hpp, README): data sorted lexicographically by
(n, u) (stress.hpp sort_slip_data); resample r = 0..M-1 draws N indices with
replacement, in order, from one generator seeded once; each resample is
inverted (undefined: infinitely far); distance to the best tensor = angle
between the unit-norm tensors (acos of the Frobenius inner product); kept:
the ceil(level M) closest (ties by resample number); if any kept one is
undefined the confidence is undefined; cone k = largest axial angle between
axis k of a kept resample and axis k of the best; Phi interval = smallest and
largest Phi of the kept resamples.
"""
import math

import numpy as np

MASK = (1 << 64) - 1
RANK_LIMIT = 1e-10  # stress.hpp kStressRankLimit
NULL_LIMIT = 1e-12  # stress.hpp kStressNullLimit


def splitmix64_stream(seed):
    x = seed & MASK
    while True:
        x = (x + 0x9E3779B97F4A7C15) & MASK
        z = x
        z = ((z ^ (z >> 30)) * 0xBF58476D1CE4E5B9) & MASK
        z = ((z ^ (z >> 27)) * 0x94D049BB133111EB) & MASK
        yield z ^ (z >> 31)


def rotl(x, k):
    return ((x << k) | (x >> (64 - k))) & MASK


class Xoshiro256ss:
    def __init__(self, seed):
        sm = splitmix64_stream(seed)
        self.s = [next(sm) for _ in range(4)]

    def next(self):
        s = self.s
        result = (rotl((s[1] * 5) & MASK, 7) * 9) & MASK
        t = (s[1] << 17) & MASK
        s[2] ^= s[0]
        s[3] ^= s[1]
        s[1] ^= s[2]
        s[0] ^= s[3]
        s[2] ^= t
        s[3] = rotl(s[3], 45)
        return result

    def below(self, bound):
        m = (self.next() >> 32) * bound
        low = m & 0xFFFFFFFF
        if low < bound:
            threshold = ((1 << 32) - bound) % bound
            while low < threshold:
                m = (self.next() >> 32) * bound
                low = m & 0xFFFFFFFF
        return m >> 32


# ---------------------------------------------------------------------------
# Michael (1984) inversion, weighted by multiplicities
# ---------------------------------------------------------------------------

def fault_vectors(strike, dip, rake):
    """(n, u) arrays from strike/dip/rake arrays: n = (-sin d sin f, sin d cos f,
    -cos d), u = (cos r cos f + sin r cos d sin f, cos r sin f - sin r cos d cos f,
    -sin r sin d) [pub: Aki & Richards 1980; METHODS.md section 1]."""
    f, d, r = np.radians(strike), np.radians(dip), np.radians(rake)
    sf, cf, sd, cd, sr, cr = np.sin(f), np.cos(f), np.sin(d), np.cos(d), np.sin(r), np.cos(r)
    n = np.stack([-sd * sf, sd * cf, -cd], axis=-1)
    u = np.stack([cr * cf + sr * cd * sf, cr * sf - sr * cd * cf, -sr * sd], axis=-1)
    return n, u


def design(n):
    """Stacked 3N x 5 matrix: column k of datum i's rows is the shear traction
    on n_i of the basis tensor E_k (E1 = diag(1,0,-1), E2 = sym(1,2),
    E3 = sym(1,3), E4 = diag(0,1,-1), E5 = sym(2,3))."""
    basis = np.zeros((5, 3, 3))
    basis[0] = np.diag([1.0, 0.0, -1.0])
    basis[1][0, 1] = basis[1][1, 0] = 1.0
    basis[2][0, 2] = basis[2][2, 0] = 1.0
    basis[3] = np.diag([0.0, 1.0, -1.0])
    basis[4][1, 2] = basis[4][2, 1] = 1.0
    w = np.einsum("kab,ib->ika", basis, n)
    q = np.einsum("ika,ia->ik", w, n)
    a = w - q[:, :, None] * n[:, None, :]
    return a.transpose(0, 2, 1)  # (N, 3, 5)


def michael_weighted(a3, u, weight):
    """Compression-positive unit-norm components (nn, ee, dd, ne, nd, ed) of the
    least-squares solution with rows of datum i weighted by weight[i] (its
    multiplicity), or None where stress.hpp calls the system degenerate."""
    sw = np.sqrt(weight)[:, None, None]
    a = (a3 * sw).reshape(-1, 5)
    b = (u * np.sqrt(weight)[:, None]).reshape(-1)
    sv = np.linalg.svd(a, compute_uv=False)
    if not (sv[0] > 0) or (sv[-1] / sv[0]) ** 2 < RANK_LIMIT:
        return None
    if np.linalg.norm(a.T @ b) < NULL_LIMIT * math.sqrt(float(np.sum(sv ** 2)) * float(np.sum(b * b))):
        return None
    x, *_ = np.linalg.lstsq(a, b, rcond=None)
    c = np.array([-x[0], -x[3], x[0] + x[3], -x[1], -x[2], -x[4]])
    return c / math.sqrt(c[0] ** 2 + c[1] ** 2 + c[2] ** 2 + 2.0 * (c[3] ** 2 + c[4] ** 2 + c[5] ** 2))


def matrix(c):
    nn, ee, dd, ne, nd, ed = c
    return np.array([[nn, ne, nd], [ne, ee, ed], [nd, ed, dd]])


def principal(c):
    """(axes as columns sigma1..3, Phi) of compression-positive components."""
    w, v = np.linalg.eigh(matrix(c))
    return v[:, ::-1], (w[1] - w[0]) / (w[2] - w[0])


def axial_deg(a, b):
    return math.degrees(math.atan2(np.linalg.norm(np.cross(a, b)), abs(float(np.dot(a, b)))))


def tensor_distance(a, b):
    dot = (a[0] * b[0] + a[1] * b[1] + a[2] * b[2] + 2.0 * (a[3] * b[3] + a[4] * b[4] + a[5] * b[5]))
    return math.degrees(math.acos(max(-1.0, min(1.0, dot))))


def sort_data(n, u):
    """Data in striae's kept order: lexicographic by (n, u). Also the smallest
    gap between neighbours in the first component that differs (an order
    decided by less than about 1e-12 could differ from striae's, whose vectors
    may differ from numpy's in the last bits)."""
    keys = [tuple(n[i]) + tuple(u[i]) for i in range(len(n))]
    order = sorted(range(len(n)), key=lambda i: keys[i])
    gap = math.inf
    for a, b in zip(order, order[1:]):
        for x, y in zip(keys[a], keys[b]):
            if x != y:
                gap = min(gap, abs(x - y))
                break
        else:
            gap = 0.0
    return n[order], u[order], gap


def draws(seed, count, resamples):
    """Multiplicities of each resample: list of arrays (documented draw order)."""
    g = Xoshiro256ss(seed)
    out = []
    for _ in range(resamples):
        m = np.zeros(count)
        for _ in range(count):
            m[g.below(count)] += 1
        out.append(m)
    return out


def bootstrap(n, u, resamples, seed, level=0.95, keep_override=None):
    """The documented bootstrap of (n, u) already in kept order.
    Returns dict(best, cones or None, phi or None, keep, kept (resample
    numbers), distances)."""
    a3 = design(n)
    best = michael_weighted(a3, u, np.ones(len(n)))
    if best is None:
        return None
    axes_b, _ = principal(best)
    rs = []
    for m in draws(seed, len(n), resamples):
        c = michael_weighted(a3, u, m)
        if c is None:
            rs.append((math.inf, None, None))
            continue
        ax, phi = principal(c)
        rs.append((tensor_distance(c, best), ax, phi))
    keep = keep_override if keep_override is not None else max(1, min(resamples, math.ceil(level * resamples - 1e-9)))
    order = sorted(range(resamples), key=lambda r: (rs[r][0], r))
    kept = order[:keep]
    result = {"best": best, "keep": keep, "kept": kept, "distances": [r[0] for r in rs],
              "cones": None, "phi": None}
    if not math.isfinite(rs[kept[-1]][0]):
        return result
    cones = [max(axial_deg(rs[r][1][:, k], axes_b[:, k]) for r in kept) for k in range(3)]
    phis = [rs[r][2] for r in kept]
    result["cones"] = cones
    result["phi"] = (min(phis), max(phis))
    return result
