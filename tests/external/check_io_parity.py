"""Binary and text input accept exactly the same values, and every accepted
value's text output reads back to the identical value (dump/restore).

For each type (plane, lineation, fault_slip, cone, stress_tensor, sphere_grid,
net_figure, partial_state) a list of values at the edges of what the type
accepts is given as fields (for partial_state: the partials the aggregates make,
truncated, with bits flipped, and relabelled as another kind); each value is sent twice: as a text literal written from the same
numbers (Python's repr, the shortest text that reads back to the same double,
and integers as integers), through the type's input function, and as the
wire format of the type's receive function, through PostgreSQL's COPY BINARY.
Reference: PostgreSQL's own I/O paths (COPY BINARY calls recv, a cast from
text calls in, <type>_send gives the stored value's bytes). Required:
  - one is accepted exactly when the other is;
  - both store the same value (equal send bytes);
  - the text output, at extra_float_digits 1 (the default) and 3 (pg_dump's),
    reads back to the same bytes;
  - a pg_dump/pg_restore of a table holding every accepted value restores
    them all, with the same bytes.
The composite result types (fisher_summary, fabric_summary, misfit_stats,
moment_summary) have PostgreSQL's record I/O and no input of their own.
"""
import math
import re
import os
import struct
import subprocess
import sys
import tempfile

import psycopg

sys.path.insert(0, os.path.dirname(__file__))
from pgconn import fresh_db  # noqa: E402

DB = "striae_io_parity"
DB2 = "striae_io_parity_restored"
fresh_db(DB)
fresh_db(DB2)

NAN, INF = float("nan"), float("inf")
TINY = 5e-324        # smallest subnormal
SUB = 1e-310         # a subnormal
ULP90 = math.nextafter(90.0, 100.0)
ULP360 = math.nextafter(360.0, 400.0)
BELOW0 = -5e-324


def num(v):
    """Text of a number as a user (or pg_dump) would write it."""
    if isinstance(v, int):
        return str(v)
    if math.isnan(v):
        return "NaN"
    if math.isinf(v):
        return "Infinity" if v > 0 else "-Infinity"
    return repr(v)


def f8(*vs):
    return b"".join(struct.pack("!d", v) for v in vs)


# ---- values: (text literal, binary payload) ----------------------------------------

def angle_edges(hi, lo=0.0):
    return [lo, -0.0, hi, math.nextafter(hi, hi + 1), math.nextafter(lo, lo - 1), TINY, SUB, BELOW0,
            hi / 2, 1e-300, 1e300, -1e300, NAN, INF, -INF, 0.1, 1 / 3, 359.9999999999999, 180.0, 270.0, 90.0]


def plane_values():
    out = []
    for s in angle_edges(360.0):
        for d in [0.0, -0.0, 45.0, 90.0, ULP90, 64.0, SUB, -1.0, NAN, 1e-9]:
            out.append((f"{num(s)}/{num(d)}", b"\x01" + f8(s, d)))
    return out


def line_values():
    out = []
    for t in angle_edges(360.0):
        for p in [0.0, -0.0, 30.0, 90.0, -90.0, ULP90, -ULP90, -30.0, SUB, -SUB, INF]:
            out.append((f"{num(t)}/{num(p)}", b"\x01" + f8(t, p)))
    return out


def fault_values():
    out = []
    strikes = [0.0, -0.0, 90.0, 180.0, 270.0, 360.0, ULP360, -1.0, 40.0, SUB, NAN]
    rakes = [0.0, -0.0, 30.0, -30.0, 180.0, -180.0, math.nextafter(180.0, 200.0),
             math.nextafter(-180.0, -200.0), 90.0, -90.0, SUB, INF]
    # vertical and horizontal planes are where canonical forms move the rake
    combos = [(s, d, r) for d in (0.0, 90.0, 64.0) for s in strikes for r in rakes]
    combos += [(270.0, d, 30.0) for d in (ULP90, -0.0, SUB, -1.0, NAN)]
    for s, d, r in combos:
        out.append((f"{num(s)}/{num(d)}/{num(r)}", b"\x01" + f8(s, d, r)))
    return out


def cone_values():
    kinds = {0: "region", 1: "line", 2: "plane"}
    axes = [(120.0, 30.0), (300.0, -30.0), (0.0, 90.0), (110.0, 95.0), (361.0, 10.0), (-0.0, 0.0),
            (270.0, 90.0), (NAN, 10.0)]
    radii = [0.0, -0.0, 10.0, 90.0, ULP90, -1.0, SUB, INF, NAN]
    combos = [(k, a, r) for k in (0, 1, 2) for a in axes for r in (10.0, -0.0)]
    combos += [(k, axes[0], r) for k in (0, 1, 2, 3, -1) for r in radii]
    out = []
    for k, (a, b), r in combos:
        word = kinds.get(k, "circle")
        out.append((f"{word} {num(a)}/{num(b)} within {num(r)}",
                    b"\x01" + struct.pack("!i", k) + f8(a, b, r)))
    return out


S2 = 0.7071067811865476


def stress_values():
    comps = [(S2, -S2, 0.0, 0.0, 0.0, 0.0), (-0.0, 0.0, -0.0, S2, -S2, 0.0), (1.0, 0.0, 0.0, 0.0, 0.0, 0.0),
             (S2, -S2, 0.0, 0.0, 0.0, 1e-10), (S2, -S2, 0.0, 0.0, 0.0, 1e-8), (NAN, 0, 0, 0, 0, 0),
             (0.408248290463863, 0.408248290463863, -0.816496580927726, 0.0, 0.0, 0.0)]
    counts = [0, 1, 3, 2**53, 2**53 + 1, 2**63 - 1, -1]
    # (flags, misfit, cones, phi interval, friction)
    extras = [(0, 0.0, (0.0, 0.0, 0.0), (0.0, 0.0), 0.0),
              (1, 12.5, (0.0, 0.0, 0.0), (0.0, 0.0), 0.0),
              (1, 180.0, (0.0, 0.0, 0.0), (0.0, 0.0), 0.0),
              (1, 180.00000000000003, (0.0, 0.0, 0.0), (0.0, 0.0), 0.0),
              (1, -0.0, (0.0, 0.0, 0.0), (0.0, 0.0), 0.0),
              (2 | 4, 0.0, (10.0, 20.0, 90.0), (0.2, 0.7), 0.0),
              (2 | 4, 0.0, (10.0, -0.0, 90.0), (0.0, 1.0), 0.0),
              (2 | 4, 0.0, (10.0, 20.0, 91.0), (0.7, 0.2), 0.0),
              (8 | 32 | 64, 0.0, (0.0, 0.0, 0.0), (0.0, 0.0), 0.6),
              (8 | 16 | 32, 0.0, (0.0, 0.0, 0.0), (0.0, 0.0), 0.001),
              (32, 0.0, (0.0, 0.0, 0.0), (0.0, 0.0), 0.0009),
              (32, 0.0, (0.0, 0.0, 0.0), (0.0, 0.0), 5.000000000000001)]
    names = [(8, "focal_joint"), (16, "not_converged"), (64, "friction_at_limit")]
    out = []
    combos = [(c, 3, extras[0]) for c in comps] + [(comps[0], n, e) for n in counts for e in extras]
    combos += [(comps[1], n, e) for n in (0, 2**63 - 1) for e in extras]
    for c, n, (flags, mis, cones, phi, mu) in combos:
            if True:
                parts = ['"components": [' + ", ".join(num(v) for v in c) + "]", f'"n": {n}']
                if flags & 1:
                    parts.append(f'"misfit": {num(mis)}')
                if flags & 2:
                    parts.append('"cones": [' + ", ".join(num(v) for v in cones) + "]")
                if flags & 4:
                    parts.append(f'"phi_interval": [{num(phi[0])}, {num(phi[1])}]')
                if flags & 32:
                    parts.append(f'"friction": {num(mu)}')
                fl = [name for bit, name in names if flags & bit]
                if fl:
                    parts.append('"flags": [' + ", ".join(f'"{x}"' for x in fl) + "]")
                text = "{" + ", ".join(parts) + "}"
                if not -2**63 <= n < 2**63:
                    continue
                binary = b"\x01" + f8(*c, mis, *cones, phi[0], phi[1], mu) + struct.pack("!qI", n, flags)
                out.append((text, binary))
    return out


def grid_values():
    kinds = {1: "density", 2: "right_dihedra", 3: "heat"}
    spacings = [45.0, 45.00000000001, 44.99999999999, 7.0, 0.4, 46.0, NAN, -45.0]
    counts = [1, 0, -1, 3, 2**53, 2**53 + 1, 2**63 - 1]
    values = [[1.0] * 11, [0.0, -0.0] + [2.5] * 9, [100.0] * 11, [100.00000000000001] * 11,
              [-1.0] + [0.0] * 10, [SUB] * 11, [INF] + [0.0] * 10, [1.0] * 10, [1.0] * 12]
    combos = [(k, sp, 3, values[0]) for k in (1, 2, 3) for sp in spacings]
    combos += [(k, 45.0, n, values[0]) for k in (1, 2) for n in counts]
    combos += [(k, 45.0, 3, v) for k in (1, 2) for v in values]
    out = []
    for kind, spacing, n, vals in combos:
        text = ('{"kind": "%s", "spacing": %s, "n": %d, "values": [%s]}'
                % (kinds[kind], num(spacing), n, ", ".join(num(v) for v in vals)))
        binary = (b"\x01" + struct.pack("!i", kind) + f8(spacing) + struct.pack("!qi", n, len(vals))
                  + f8(*vals))
        out.append((text, binary))
    return out


LAYER = {"great_circles": 1, "poles": 2, "lines": 3, "slip_planes": 4, "cones": 11}


def figure_values():
    def enc(layers):
        b = b"SNF\x01" + struct.pack("!I", len(layers))
        for kind, label, params, data in layers:
            lb = label.encode()
            b += bytes([LAYER[kind]]) + struct.pack("!I", len(lb)) + lb
            b += struct.pack("!II", len(params), len(data)) + f8(*params) + f8(*data)
        return b

    def txt(layers):
        import json
        return json.dumps({"layers": [{"kind": k, "label": l, "params": [], "data": []} for k, l, p, d in layers]},
                          ensure_ascii=False).replace('"params": []', "PARAMS").replace('"data": []', "DATA")

    cases = [
        [],
        [("poles", "", [], [110.0, 64.0])],
        [("poles", "site A", [], [110.0, 64.0, 0.0, 0.0])],
        [("poles", "", [], [110.0, 95.0])],
        [("poles", "", [], [-0.0, 10.0])],
        [("poles", "", [], [270.0, 90.0])],
        [("lines", "é°", [], [120.0, 30.0])],
        [("lines", "", [], [120.0, SUB])],
        [("cones", "", [], [120.0, 30.0, 10.0])],
        [("cones", "", [], [120.0, 30.0, 0.0])],
        [("slip_planes", "", [], [90.0, 90.0, -30.0])],
        [("slip_planes", "", [], [270.0, 90.0, 30.0])],
        [("great_circles", "a\u0001", [], [110.0, 64.0])],
        [("great_circles", "", [1.0], [110.0, 64.0])],
    ]
    out = []
    for layers in cases:
        t = txt(layers)
        for k, l, p, d in layers:
            t = t.replace("PARAMS", '"params": [' + ", ".join(num(v) for v in p) + "]", 1)
            t = t.replace("DATA", '"data": [' + ", ".join(num(v) for v in d) + "]", 1)
        out.append((t, enc(layers)))
    return out


TYPES = [("plane", plane_values()), ("lineation", line_values()), ("fault_slip", fault_values()),
         ("cone", cone_values()), ("stress_tensor", stress_values()), ("sphere_grid", grid_values()),
         ("net_figure", figure_values())]

class Raw:
    """A value's bytes in the type's binary wire format."""
    def __init__(self, data):
        self.data = data


def raw_dumper(type_oid):
    class RawDumper(psycopg.adapt.Dumper):
        format = psycopg.pq.Format.BINARY
        oid = type_oid

        def dump(self, obj):
            return obj.data
    return RawDumper


failures = []
compared = 0
accepted_total = 0
PARTIALS = [
    "fisher_mean_partial(l)", "fisher_mean_partial(p)", "orientation_tensor_partial(l)",
    "mean_plane_partial(p)", "fold_axis_partial(p)", "density_grid_partial(l, 10)",
    "stress_inversion_partial(f)", "stress_inversion_partial(f, 10, 1)", "right_dihedra_partial(f, 30)",
    "focal_stress_inversion_partial(f)", "focal_stress_inversion_partial(f, 0.6)",
    "focal_stress_inversion_partial(f, NULL, 5, 1)", "stress_phases_partial(f, 2, 1)",
    "misfit_summary_partial(f, stress_tensor('10/5', '100/20', 0.4), 30)", "moment_tensor_sum_partial(f)",
    "moment_tensor_sum_partial(f, 5.0)"]


def partial_values(conn):
    """Partials made by the aggregates, and variants of their bytes: the text
    form is '<kind>/<input>:' and the base64 of the serialized state, the binary
    form a 16-byte header (kind tag, input, reserved) and the same state."""
    import base64
    conn.execute("""CREATE TABLE pdata AS SELECT lineation(37 * g % 360, 7 * g % 90) AS l,
                      plane(53 * g % 360, 11 * g % 90) AS p, fault_slip(29 * g % 360, 5 + 13 * g % 80, 17 * g % 360 - 180) AS f
                      FROM generate_series(1, 12) g""")
    made = []
    for agg in PARTIALS:
        t, b = conn.execute(f"SELECT x::text, partial_state_send(x) FROM (SELECT {agg} AS x FROM pdata) s").fetchone()
        made.append((t.split(":", 1)[0], bytes(b)))
    out = []
    for k, (label, b) in enumerate(made):
        head, state = b[:16], b[16:]

        def pair(lab, hd, st):
            return (lab + ":" + base64.b64encode(st).decode(), hd + st)
        out.append(pair(label, head, state))
        for cut in (1, 4, 8, len(state) - 4):
            out.append(pair(label, head, state[:-cut]))
        for pos in list(range(0, min(len(state), 40), 3)) + [len(state) - 1]:
            for bit in (0x01, 0x80):
                st = bytearray(state)
                st[pos] ^= bit
                out.append(pair(label, head, bytes(st)))
        other_label, other = made[(k + 7) % len(made)]
        out.append(pair(other_label, other[:16], state))  # another kind's label and tag
    return out


with psycopg.connect(dbname=DB, autocommit=True) as conn:
    TYPES.append(("partial_state", partial_values(conn)))
    for tname, values in TYPES:
        oid = conn.execute("SELECT %s::regtype::oid", (tname,)).fetchone()[0]
        cur = conn.cursor()
        cur.adapters.register_dumper(Raw, raw_dumper(oid))
        conn.execute(f"CREATE TABLE t_{tname} (id int, v {tname})")
        mism = 0
        acc = 0
        for i, (text, binary) in enumerate(values):
            compared += 1
            t_state = b_state = None
            t_bytes = b_bytes = None
            try:
                # text input (the cast from unknown calls the input function)
                t_bytes = conn.execute(f"INSERT INTO t_{tname} VALUES (%s, %s::{tname}) RETURNING {tname}_send(v)",
                                       (i, text)).fetchone()[0]
            except psycopg.Error as e:
                t_state = e.sqlstate
            try:
                # binary input: a parameter of the type in binary format calls its receive function
                b_bytes = cur.execute(f"SELECT {tname}_send(%b)", (Raw(binary),)).fetchone()[0]
            except psycopg.Error as e:
                b_state = e.sqlstate
            if (t_state is None) != (b_state is None):
                mism += 1
                failures.append(f"{tname}: {text!r}: text {'accepts' if t_state is None else 'rejects (' + t_state + ')'}"
                                f", binary {'accepts' if b_state is None else 'rejects (' + b_state + ')'}")
                continue
            if t_state is not None:
                continue
            acc += 1
            if bytes(t_bytes) != bytes(b_bytes):
                mism += 1
                failures.append(f"{tname}: {text!r}: text and binary input store different values")
        # every stored value's text reads back to the same bytes, at both settings
        for efd in (1, 3):
            conn.execute(f"SET extra_float_digits = {efd}")
            for i, out in conn.execute(f"SELECT id, v::text FROM t_{tname} "
                                       f"WHERE {tname}_send(v::text::{tname}) <> {tname}_send(v) ORDER BY id"):
                mism += 1
                failures.append(f"{tname}: value {i}: its output {out!r} (extra_float_digits {efd}) "
                                "reads back to another value")
            if tname == "stress_tensor":
                for i, out in conn.execute("SELECT id, v::text FROM t_stress_tensor ORDER BY id"):
                    if re.search(r"(?<![0-9eE.])-0(?![0-9.])", out):
                        mism += 1
                        failures.append(f"stress_tensor: value {i} prints -0: {out}")
        conn.execute("RESET extra_float_digits")
        accepted_total += acc
        print(f"{tname}: {len(values)} values, {acc} accepted by both inputs, {mism} mismatches")

# dump and restore the accepted values
with tempfile.TemporaryDirectory() as d:
    dump = os.path.join(d, "parity.dump")
    subprocess.run(["pg_dump", "-Fc", "-d", DB, "-t", "t_*", "-f", dump], check=True)
    subprocess.run(["pg_restore", "-d", DB2, dump], check=True)
lost = 0
with psycopg.connect(dbname=DB, autocommit=True) as a, psycopg.connect(dbname=DB2, autocommit=True) as b:
    for tname, _ in TYPES:
        q = f"SELECT id, {tname}_send(v) FROM t_{tname} ORDER BY id"
        ra, rb = a.execute(q).fetchall(), b.execute(q).fetchall()
        if [(i, bytes(x)) for i, x in ra] != [(i, bytes(x)) for i, x in rb]:
            lost += 1
            failures.append(f"{tname}: pg_dump/pg_restore changed or lost values ({len(ra)} -> {len(rb)} rows)")
print(f"pg_dump/pg_restore: {accepted_total} values restored, {lost} tables differing")

for f in failures[:60]:
    print("FAIL:", f)
if failures:
    print(f"check_io_parity: {len(failures)} mismatches in {compared} values")
    sys.exit(1)
print(f"check_io_parity: {compared} values, text and binary input agree on all, {accepted_total} round-trip exactly")
