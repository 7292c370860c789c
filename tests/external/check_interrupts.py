"""Long aggregates stop when asked: statement_timeout, pg_cancel_backend and
pg_terminate_backend are honoured within 1 s while a final function computes.

Reference: PostgreSQL's own interrupt handling (the server raises 57014
query_canceled for a statement timeout or a cancel request, and ends the
session with 57P01 admin_shutdown for a terminate request). striae's core polls
a hook that reads the server's pending-interrupt flags (DESIGN.md, "Interrupts").

Each case is an aggregate whose transition phase takes well under the 1 s limit
(at most a few hundred thousand rows) and whose final function would take far
longer: the work is calibrated first with a small fraction of it (fewer
resamples, starts or mechanisms; the cost grows linearly or faster with them)
and the full run must extrapolate to at least 3 s, so that a final function
that ignored the request would stop at least 2 s late, twice the latency allowed. What is measured is the
latency after the stop request (the timeout's expiry, or the cancel sent from
a second connection), not the run time, so a loaded machine slows the
calibration but not the verdict. Before the core polled in every such loop, a
bootstrap ran 12.9 s past a 1 s timeout (and 13.7 s past a cancel request).
"""
import sys
import threading
import time

import psycopg
from psycopg import errors

sys.path.insert(0, __file__.rsplit("/", 1)[0])
from pgconn import fresh_db  # noqa: E402

DB = "striae_interrupts"
LIMIT = 1.0       # statement_timeout, seconds
MAX_LATENCY = 1.0  # allowed time from the stop request to the error
MIN_FULL = 3.0    # the un-cancelled work must extrapolate to at least this (3 x the limit)

fresh_db(DB)
failures = []


def fail(msg):
    failures.append(msg)
    print("FAIL:", msg)


def connect():
    return psycopg.connect(dbname=DB, autocommit=True)


with connect() as c:
    c.execute("SELECT setseed(0.25)")
    # Invented data (uniformly random mechanisms): only the run time matters here.
    c.execute("""CREATE TABLE m AS
        SELECT i, fault_slip(360 * random(), 90 * random(), 360 * random() - 180) AS f
          FROM generate_series(1, 400000) i""")
    c.execute("ANALYZE m")

# (name, full query, calibration query, factor: full work / calibration work)
CASES = [
    ("stress_inversion bootstrap, 10^4 data x 10^5 resamples",
     "SELECT stress_inversion(f, 100000, 1) FROM m WHERE i <= 10000",
     "SELECT stress_inversion(f, 1000, 1) FROM m WHERE i <= 10000", 100),
    ("focal_stress_inversion bootstrap, 2000 mechanisms x 10^5 resamples",
     "SELECT focal_stress_inversion(f, NULL, 100000, 1) FROM m WHERE i <= 2000",
     "SELECT focal_stress_inversion(f, NULL, 100, 1) FROM m WHERE i <= 2000", 1000),
    ("stress_phases, 2000 data, 3 phases x 10^4 starts",
     "SELECT stress_phases(f, 3, 1, 10000) FROM m WHERE i <= 2000",
     "SELECT stress_phases(f, 3, 1, 10) FROM m WHERE i <= 2000", 1000),
    # The friction search and plane picking over many mechanisms (the rows are
    # read in about 0.3 s; the work grows with their number).
    ("focal_stress_inversion friction search, 4 x 10^5 mechanisms",
     "SELECT focal_stress_inversion(f) FROM m",
     "SELECT focal_stress_inversion(f) FROM m WHERE i <= 40000", 10),
]


def timed(conn, sql):
    t0 = time.monotonic()
    conn.execute(sql)
    return time.monotonic() - t0


for name, full, small, factor in CASES:
    print("==", name)
    with connect() as a, connect() as b:
        t_small = timed(a, small)
        est = t_small * factor
        print(f"   calibration {t_small:.3f} s -> full run about {est:.0f} s")
        if est < MIN_FULL:
            fail(f"{name}: the full run would take only about {est:.1f} s; make the case larger")

        # 1. statement_timeout
        a.execute(f"SET statement_timeout = '{int(LIMIT * 1000)}ms'")
        t0 = time.monotonic()
        state = None
        try:
            a.execute(full)
        except errors.QueryCanceled as e:
            state = e.sqlstate
        elapsed = time.monotonic() - t0
        lat = elapsed - LIMIT
        print(f"   statement_timeout: stopped {lat:.3f} s after the timeout ({state})")
        if state != "57014":
            fail(f"{name}: statement_timeout gave {state}, not 57014")
        elif lat > MAX_LATENCY:
            fail(f"{name}: stopped {lat:.2f} s after the timeout")
        a.execute("SET statement_timeout = 0")

        # 2. pg_cancel_backend from the second connection, after 1 s of work
        pid = a.execute("SELECT pg_backend_pid()").fetchone()[0]
        out = {}

        def run():
            try:
                a.execute(full)
                out["state"] = "finished"
            except psycopg.Error as e:
                out["state"] = e.sqlstate
            out["t"] = time.monotonic()

        th = threading.Thread(target=run)
        th.start()
        time.sleep(LIMIT)
        t_cancel = time.monotonic()
        b.execute("SELECT pg_cancel_backend(%s)", (pid,))
        th.join(60)
        lat = out.get("t", float("inf")) - t_cancel
        print(f"   pg_cancel_backend: stopped {lat:.3f} s after the request ({out.get('state')})")
        if out.get("state") != "57014":
            fail(f"{name}: cancel gave {out.get('state')}, not 57014")
        elif lat > MAX_LATENCY:
            fail(f"{name}: stopped {lat:.2f} s after the cancel request")
        # the session goes on
        if a.execute("SELECT 1").fetchone()[0] != 1:
            fail(f"{name}: session unusable after the cancel")

# 3. pg_terminate_backend, once: the session ends, the server does not restart.
print("== pg_terminate_backend")
with connect() as b:
    start_b = b.execute("SELECT pg_postmaster_start_time()").fetchone()[0]
    a = connect()
    pid = a.execute("SELECT pg_backend_pid()").fetchone()[0]
    out = {}

    def run_t():
        try:
            a.execute(CASES[0][1])
            out["state"] = "finished"
        except psycopg.Error as e:
            out["state"] = e.sqlstate or type(e).__name__
        out["t"] = time.monotonic()

    th = threading.Thread(target=run_t)
    th.start()
    time.sleep(LIMIT)
    t_term = time.monotonic()
    b.execute("SELECT pg_terminate_backend(%s)", (pid,))
    th.join(60)
    lat = out.get("t", float("inf")) - t_term
    print(f"   stopped {lat:.3f} s after the request ({out.get('state')})")
    if out.get("state") not in ("57P01", "OperationalError"):
        fail(f"terminate gave {out.get('state')}")
    if lat > MAX_LATENCY:
        fail(f"terminate took {lat:.2f} s")
    a.close()
    # the other session is alive and the server was not restarted (a crashed
    # backend would have made the postmaster reinitialise and drop it)
    if b.execute("SELECT pg_postmaster_start_time()").fetchone()[0] != start_b:
        fail("the server restarted")
    gone = b.execute("SELECT count(*) FROM pg_stat_activity WHERE pid = %s", (pid,)).fetchone()[0]
    if gone:
        fail("the terminated backend is still there")

if failures:
    print(f"check_interrupts: {len(failures)} failures")
    sys.exit(1)
print("check_interrupts: every long aggregate stopped within 1 s of a timeout, cancel or terminate request")
