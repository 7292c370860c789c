"""Errors do not leak: over one connection, 5,000 errors of each kind are
raised and caught, and the backend's private memory stays flat.

Each kind runs 500 times as a warm-up (caches, plans), then 5,000 times; the
backend's anonymous resident memory (RssAnon in /proc/<pid>/status of
pg_backend_pid(), which leaves out the shared buffers the backend touches)
must not grow by more than 2 MB over the 5,000. Every iteration must really
raise (the loop counts the caught errors and the SQLSTATE they carry). The
kinds cover the paths an error takes: a C++ exception turned into an ERROR
by the guard (syntax, range, parameter, state errors, with and without
detail, short and 16 kB inputs, figure and SVG code with heap strings), errors
raised by the glue itself, aggregates failing in their transition and in their
final function, and an error raised inside the SPI query of input_errors.
Before the glue kept its arguments out of C++ strings, a figure label with a
control character leaked 1 kB per error (5 MB over 5,000), a stress_phase
array with a NULL 1.8 MB, net_figure text input 0.5 MB.
Reference: PostgreSQL's memory contexts free everything palloc'd for a failed
statement; what could leak is C++ heap memory whose destructor an ERROR skips.
"""
import sys
import time

import psycopg
from psycopg import sql

sys.path.insert(0, __file__.rsplit("/", 1)[0])
from pgconn import fresh_db  # noqa: E402

DB = "striae_error_memory"
N = int(__import__("os").environ.get("STRIAE_ERRORS", 5000))
WARMUP = 500
LIMIT_KB = 2048

fresh_db(DB)

# (kind, SQLSTATE expected, statement run with the text variable v set to arg)
KINDS = [
    ("plane syntax", "22P02", "PERFORM v::plane", "110/64X"),
    ("plane number out of range", "22003", "PERFORM v::plane", "1e309/45"),
    ("fault_slip sense, detail and hint", "22P02", "PERFORM v::fault_slip", "110/64/75 nomral"),
    ("stress_tensor text", "22P02", "PERFORM v::stress_tensor", '{"components": [1, 2], "n": 3}'),
    ("sphere_grid text", "22003", "PERFORM v::sphere_grid",
     '{"kind": "density", "spacing": 45, "n": 0, "values": [0,0,0,0,0,0,0,0,0,0,0]}'),
    ("cone text", "22P02", "PERFORM v::cone", "circle 120/30 within 10"),
    ("net_figure text", "22000", "PERFORM v::net_figure",
     '{"layers": [{"kind": "poles", "label": "x", "params": [], "data": [110, 95]}]}'),
    ("16 kB literal", "22P02", "PERFORM (v || repeat('x', 16384))::fault_slip", "110/64/"),
    ("constructor range", "22003", "PERFORM plane(10, 91 + length(v))", ""),
    ("glue parameter error", "22023", "PERFORM moment_tensor('110/64/30', v)", "xyz"),
    ("SVG projection", "22023", "PERFORM net_svg(net_poles('110/64'::plane), v)", "bogus"),
    ("figure label, 1 kB with a control character", "22023",
     "PERFORM net_label(net_poles('110/64'::plane), v || repeat('x', 1000))", "tab\t"),
    ("stress_phase array with a NULL (glue)", "22004",
     "PERFORM stress_phase('110/64/30', ARRAY[stress_tensor('10/5', '100/20', 0.4), NULL, v::stress_tensor])",
     '{"components": [0.7071067811865476, -0.7071067811865476, 0, 0, 0, 0], "n": 3}'),
    ("contour levels (glue)", "22004", "PERFORM net_contours(g, ARRAY[1, NULL]::float8[]) FROM grids", ""),
    ("aggregate parameter with rows", "22023", "PERFORM density_grid(l, 7 + length(v)) FROM lines", ""),
    ("aggregate parameter, empty group", "22023",
     "PERFORM focal_stress_inversion(f, 0, 10, 1) FROM faults WHERE length(v) > 0", "x"),
    ("bootstrap final", "22023", "PERFORM stress_inversion(f, 0, 1) FROM faults", ""),
    ("error inside the SPI query of input_errors", "22P02",
     "PERFORM * FROM input_errors('staging', 'lit', 'plane', v)", "line"),
]

fails = []


def rss_anon(conn, pid):
    with open(f"/proc/{pid}/status") as f:
        for line in f:
            if line.startswith("RssAnon:"):
                return int(line.split()[1])
    raise RuntimeError("no RssAnon")


with psycopg.connect(dbname=DB, autocommit=True) as conn:
    conn.execute("CREATE TABLE lines AS SELECT lineation(20 * i, 5 * i) AS l FROM generate_series(1, 12) i")
    conn.execute("CREATE TABLE faults AS SELECT fault_slip(10 * i, 30 + i, -90 + 7 * i) AS f FROM generate_series(1, 12) i")
    conn.execute("CREATE TABLE grids AS SELECT right_dihedra(f, 10) AS g FROM faults")
    conn.execute("CREATE TABLE staging (line text, lit text)")
    conn.execute("INSERT INTO staging VALUES ('1', '110/64'), ('two', 'x')")
    pid = conn.execute("SELECT pg_backend_pid()").fetchone()[0]

    def run(stmt, arg, state, n):
        # Each iteration raises inside its own block (a subtransaction, as an
        # application catching errors does) and is counted with its SQLSTATE.
        conn.execute(f"""
DO $do$
DECLARE v text := %s; caught int := 0; other text;
BEGIN
  FOR i IN 1..{n} LOOP
    BEGIN
      {stmt};
    EXCEPTION WHEN OTHERS THEN
      IF SQLSTATE = '{state}' THEN caught := caught + 1; ELSE other := SQLSTATE || ' ' || SQLERRM; END IF;
    END;
  END LOOP;
  IF caught <> {n} THEN RAISE EXCEPTION 'only % of {n} raised {state} (other: %)', caught, other; END IF;
END $do$""".replace("%s", sql.quote(arg)))

    first = rss_anon(conn, pid)
    for kind, state, stmt, arg in KINDS:
        t0 = time.monotonic()
        try:
            run(stmt, arg, state, WARMUP)
            before = rss_anon(conn, pid)
            run(stmt, arg, state, N)
            after = rss_anon(conn, pid)
        except psycopg.Error as e:
            fails.append(f"{kind}: {e}")
            print(f"FAIL: {kind}: {e}")
            continue
        grew = after - before
        print(f"{kind:45s} RssAnon {before} -> {after} kB ({grew:+d} kB over {N} errors, "
              f"{time.monotonic() - t0:.2f} s)")
        if grew > LIMIT_KB:
            fails.append(f"{kind}: RssAnon grew by {grew} kB over {N} errors")
    last = rss_anon(conn, pid)
    print(f"all kinds: RssAnon {first} -> {last} kB over {len(KINDS) * (N + WARMUP)} errors")

if fails:
    for f in fails:
        print("FAIL:", f)
    sys.exit(1)
print(f"check_error_memory: {len(KINDS)} kinds x {N} caught errors, backend memory flat within {LIMIT_KB} kB each")
