"""The Python client module (python/striae_client) against the server, through
psycopg 3 (Debian python3-psycopg), in text and in binary format.

References: the server's own text output of each value (what psql prints),
grid_cells() for the node layout of sphere_grid, sigma1()/sigma3() for the
principal axes (numpy.linalg.eigh on the client side), and exact equality of
round trips (Python floats are sent with repr, the shortest round-trip text,
or as IEEE doubles in binary).
"""
import math
import os
import sys

import numpy as np
import psycopg

sys.path.insert(0, os.path.join(os.path.dirname(__file__), "..", "..", "python"))
import striae_client as sc  # noqa: E402
from pgconn import fresh_db  # noqa: E402

DB = "striae_python"
fresh_db(DB)
failures = []
checks = 0


def check(cond, what):
    global checks
    checks += 1
    if not cond:
        failures.append(what)
        print("FAIL:", what)


with psycopg.connect(dbname=DB, autocommit=True) as conn:
    sc.register(conn)
    conn.execute("""CREATE TABLE t (id int, p plane, l lineation, f fault_slip, c cone, s stress_tensor, g sphere_grid)""")
    conn.execute("""INSERT INTO t
      SELECT 1, '110/64', '300/-30', '110/64/75W N', cone('120/30'::lineation, 10),
             stress_tensor('030/20', '125/15', 0.4), density_grid(l, 5)
        FROM (VALUES ('120/30'::lineation), ('125/35'), ('10/5')) v(l)""")
    conn.execute("""WITH d AS (SELECT fault_slip((gs * 37) % 360, 20 + (gs * 11) % 70, (gs * 53) % 360 - 180) AS f
                                 FROM generate_series(1, 30) gs)
      INSERT INTO t
      SELECT 2, plane(0.1 + 1e-13, 89.999999), lineation(359.99, 0), fault_slip(12.3456789, 45, -179.9),
             cone('110/64'::plane, 7.5), (SELECT stress_inversion(f, 50, 7) FROM d), (SELECT right_dihedra(f, 10) FROM d)""")
    # text output of every value as the server prints it (extra_float_digits 1: shortest round trip)
    server_text = {r[0]: r[1:] for r in conn.execute(
        "SELECT id, p::text, l::text, f::text, c::text, s::text, g::text FROM t ORDER BY id")}
    for binary in (False, True):
        fmt = "binary" if binary else "text"
        with conn.cursor(binary=binary) as cur:
            rows = cur.execute("SELECT id, p, l, f, c, s, g FROM t ORDER BY id").fetchall()
        for row in rows:
            i, p, l, f, c, s, g = row
            check(isinstance(p, sc.Plane) and isinstance(l, sc.Lineation) and isinstance(f, sc.FaultSlip)
                  and isinstance(c, sc.Cone) and isinstance(s, sc.StressTensor) and isinstance(g, sc.SphereGrid),
                  f"{fmt}: row {i} loads as striae_client objects")
            # the Python object prints exactly what the server prints
            for name, obj, text in zip("plfcsg", (p, l, f, c, s, g), server_text[i]):
                check(str(obj) == text, f"{fmt}: row {i} {name}: client {str(obj)[:80]!r} vs server {text[:80]!r}")
            check(g.values.dtype == np.float64 and g.values.shape == (len(g.nodes()[0]),),
                  f"{fmt}: grid values are a float64 numpy array with one value per node")
        if binary:
            bin_rows = rows
        else:
            text_rows = rows
    check(text_rows == bin_rows, "text and binary loads give equal objects")
    _, p, l, f, c, s, g = text_rows[0]
    check(p == sc.Plane(110, 64) and l == sc.Lineation(120, 30) and f == sc.FaultSlip(110, 64, -105),
          "canonical values (README text-notation examples)")
    check(c == sc.Cone("line", 120, 30, 10), "cone")
    check(s.n == 0 and s.misfit is None and s.cones is None and s.flags == (), "forward tensor has no quality measures")
    _, p2, l2, f2, c2, s2, g2 = text_rows[1]
    check(s2.n == 30 and s2.misfit is not None and s2.cones is not None and s2.phi_interval is not None,
          "bootstrap tensor carries misfit, cones and the Phi interval")
    check(g2.kind == "right_dihedra" and g.kind == "density", "grid kinds")

    # node layout: grid_nodes equals grid_cells exactly
    for spacing in (0.5, 2.5, 5, 7.5, 10, 45):
        cells = conn.execute("SELECT array_agg(trend), array_agg(plunge) FROM grid_cells("
                             "(SELECT density_grid('10/10'::lineation, %s::float8)))", [spacing]).fetchone()
        tr, pl = sc.grid_nodes(spacing)
        check(np.array_equal(tr, np.array(cells[0])) and np.array_equal(pl, np.array(cells[1])),
              f"grid_nodes({spacing}) equals grid_cells node for node")
    cells = conn.execute("SELECT array_agg(value) FROM grid_cells((SELECT g FROM t WHERE id = 2))").fetchone()[0]
    check(np.array_equal(g2.values, np.array(cells)), "grid values equal grid_cells values")
    # the densest node of the density grid is grid_max (axial: compare as axes)
    gm = conn.execute("SELECT grid_max(g) FROM t WHERE id = 1").fetchone()[0]
    v = g.vectors()[np.argmax(g.values)]
    check(abs(abs(float(np.dot(v, gm.vector()))) - 1) < 1e-12, "argmax of the numpy grid is grid_max")

    # principal axes with numpy vs the server's sigma1, sigma3
    s1, s3 = conn.execute("SELECT sigma1(s), sigma3(s) FROM t WHERE id = 2").fetchone()
    w, axes = s2.principal_axes()
    check(w[0] >= w[1] >= w[2], "principal values descending")
    check(abs(abs(axes[:, 0] @ s1.vector()) - 1) < 1e-9 and abs(abs(axes[:, 2] @ s3.vector()) - 1) < 1e-9,
          "numpy eigenvectors of the tensor are the server's sigma1 and sigma3")
    check(abs(np.trace(s2.matrix())) < 1e-12 and abs(np.sum(s2.matrix() ** 2) - 1) < 1e-9,
          "tensor matrix is trace-free and of unit norm")

    # round trips: Python objects as parameters, text (%t) and binary (%b), exact
    values = [sc.Plane(110.123456789012, 64.5), sc.Lineation(0.1 + 0.2, 89.99999999), sc.FaultSlip(12.5, 45.25, -179.5),
              sc.Cone("plane", 110, 64, 7.5), s2, g2, sc.Lineation(7, 0)]
    for v in values:
        for ph in ("%t", "%b"):
            back = conn.execute(f"SELECT {ph}", [v]).fetchone()[0]
            check(back == v, f"round trip {ph} of {type(v).__name__}")
            back_text = conn.execute(f"SELECT ({ph})::text", [v]).fetchone()[0]
            check(back_text == str(v), f"server text of {type(v).__name__} sent with {ph}")
    # arrays
    arr = conn.execute("SELECT ARRAY['110/64'::plane, '200/64 dd', NULL]").fetchone()[0]
    check(arr == [sc.Plane(110, 64), sc.Plane(110, 64), None], "plane[] loads as a list of Plane")
    n = conn.execute("SELECT cardinality(%s::lineation[])", [[sc.Lineation(1, 2), sc.Lineation(3, 4)]]).fetchone()[0]
    check(n == 2, "a list of Lineation is sent as lineation[]")
    # a value the server rejects is the server's error
    try:
        conn.execute("SELECT %s", [sc.Plane(400, 10)])
        check(False, "Plane(400, 10) is rejected by the server")
    except psycopg.errors.NumericValueOutOfRange:
        pass
    # functions work on sent values: pole of a Plane is its Plane.pole()
    pole = conn.execute("SELECT pole(%s)", [sc.Plane(110, 64)]).fetchone()[0]
    check(pole == sc.Plane(110, 64).pole(), "pole() on the server equals Plane.pole()")
    # NULLs
    check(conn.execute("SELECT NULL::stress_tensor, NULL::sphere_grid").fetchone() == (None, None), "NULL is None")
    # the JSON forms carry the same numbers as the objects
    j = conn.execute("SELECT to_jsonb(s) FROM t WHERE id = 2").fetchone()[0]
    check(sc.StressTensor.from_json(j) == s2, "to_jsonb(stress_tensor) reads back to the same tensor")

print(f"check_python_client: {checks} checks, {len(failures)} failures")
sys.exit(1 if failures else 0)
