"""Constant memory per group, and parallel speed-up, of striae's aggregates.

A GROUP BY with 1,000 groups over a fault-slip table of N rows, for
stress_inversion, fisher_mean and orientation_tensor, run serially in one
backend; the backend's peak private memory (RssAnon of /proc/<pid>/status,
sampled every 2 ms while the query runs, minus the value just before it) is
printed for a small and a large N. Streaming aggregates keep a fixed state per
group, so the two peaks must agree within --check MB whatever the row count,
beyond what the server itself adds for the larger table: the same query with
the built-in count(f) is measured in the same run as the baseline (its peak
grows by about 10 MB from 10^6 to 10^7 rows on PostgreSQL 15, with no
aggregate state to speak of), and each aggregate's growth minus the baseline's
growth is what is checked.

With --parallel, each aggregate's speed-up with 2 parallel workers (best of
--rounds) is printed beside the speed-up of the built-in sum over the same
table in the same run.

Runs inside scripts/with-cluster.sh (PGHOST/PGPORT set); reads /proc of the
server's backend, so it must run on the server's machine as root or as the
server's user.
"""
import argparse
import os
import subprocess
import sys
import threading
import time

PSQL = ["psql", "-X", "-q", "-At", "-v", "ON_ERROR_STOP=1", "-d", os.environ.get("STRIAE_SCALE_DB", "postgres")]

AGGS = {
    "stress_inversion": "stress_inversion(f)",
    "fisher_mean": "fisher_mean(p_axis(f))",
    "orientation_tensor": "orientation_tensor(fault_plane(f))",
}


class Session:
    """One psql process kept open, so every query runs in the same backend."""

    def __init__(self):
        self.p = subprocess.Popen(PSQL, stdin=subprocess.PIPE, stdout=subprocess.PIPE, text=True, bufsize=1)
        self.pid = int(self.run("SELECT pg_backend_pid();")[0])

    def run(self, sql):
        self.p.stdin.write(sql + "\n\\echo __done__\n")
        self.p.stdin.flush()
        out = []
        for line in self.p.stdout:
            line = line.rstrip("\n")
            if line == "__done__":
                return out
            out.append(line)
        raise RuntimeError("psql ended early")

    def close(self):
        self.p.stdin.close()
        self.p.wait()


def rss_anon_kb(pid):
    with open(f"/proc/{pid}/status") as f:
        for line in f:
            if line.startswith("RssAnon:"):
                return int(line.split()[1])
    raise RuntimeError("no RssAnon")


def peak_during(session, sql):
    """Run sql in session; return (peak RssAnon growth in MB, elapsed s)."""
    base = rss_anon_kb(session.pid)
    peak = [base]
    stop = threading.Event()

    def sample():
        while not stop.is_set():
            try:
                peak[0] = max(peak[0], rss_anon_kb(session.pid))
            except (OSError, RuntimeError):
                return
            time.sleep(0.002)

    t = threading.Thread(target=sample)
    t.start()
    t0 = time.perf_counter()
    session.run(sql)
    dt = time.perf_counter() - t0
    stop.set()
    t.join()
    return (peak[0] - base) / 1024.0, dt


def build(session, name, n):
    session.run(f"""
DROP TABLE IF EXISTS {name};
SELECT setseed(0.25);
CREATE UNLOGGED TABLE {name} AS
  SELECT (g % 1000)::int AS grp, random() AS a,
         fault_slip(360 * random(), 90 * random(), 360 * random() - 180) AS f
    FROM generate_series(1, {n}) g;
VACUUM ANALYZE {name};""")


def best_ms(session, sql, rounds):
    best = float("inf")
    for _ in range(rounds):
        out = session.run(f"SELECT pg_temp.run_ms($q${sql}$q$);")
        best = min(best, float(out[0]))
    return best


def main():
    ap = argparse.ArgumentParser(description=__doc__.splitlines()[0])
    ap.add_argument("--small", type=int, default=1_000_000)
    ap.add_argument("--large", type=int, default=10_000_000)
    ap.add_argument("--check", type=float, default=None, help="fail unless peaks agree within this many MB")
    ap.add_argument("--parallel", action="store_true")
    ap.add_argument("--rounds", type=int, default=int(os.environ.get("STRIAE_BENCH_ROUNDS", "5")))
    args = ap.parse_args()

    s = Session()
    s.run("CREATE EXTENSION IF NOT EXISTS striae;")
    s.run("""CREATE OR REPLACE FUNCTION pg_temp.run_ms(q text) RETURNS float8 LANGUAGE plpgsql AS $$
DECLARE t0 timestamptz; r record;
BEGIN t0 := clock_timestamp(); EXECUTE q INTO r; RETURN extract(epoch FROM clock_timestamp() - t0) * 1000; END $$;""")
    sizes = [("scale_small", args.small), ("scale_large", args.large)]
    for name, n in sizes:
        t0 = time.perf_counter()
        build(s, name, n)
        print(f"built {name}: {n:,} rows, 1,000 groups, in {time.perf_counter() - t0:.1f} s", flush=True)

    print("peak backend memory (RssAnon growth, MB) of SELECT grp, agg(...) ... GROUP BY grp, serial:")
    print(f"  {'aggregate':20s} {args.small:>12,} rows {args.large:>12,} rows   difference   beyond count's")
    worst = 0.0
    base_diff = None
    for agg, expr in [("count (built-in)", "count(f)")] + list(AGGS.items()):
        peaks = []
        for name, _ in sizes:
            # a new backend for each measurement; a query over 10 rows first loads
            # the library and the catalogue caches, so the peak is the query's own
            m = Session()
            m.run("SET max_parallel_workers_per_gather = 0; SET work_mem = '64MB';")
            m.run(f"SELECT count(x) FROM (SELECT grp, {expr} AS x FROM (SELECT * FROM {name} LIMIT 10) s GROUP BY grp) t;")
            mb, dt = peak_during(m, f"SELECT count(x) FROM (SELECT grp, {expr} AS x FROM {name} GROUP BY grp) t;")
            m.close()
            peaks.append((mb, dt))
        diff = peaks[1][0] - peaks[0][0]
        if base_diff is None:  # the baseline row
            base_diff = diff
            excess = ""
        else:
            worst = max(worst, abs(diff - base_diff))
            excess = f" {diff - base_diff:+10.1f} MB"
        print(f"  {agg:20s} {peaks[0][0]:10.1f} MB ({peaks[0][1]:5.1f} s) {peaks[1][0]:10.1f} MB ({peaks[1][1]:5.1f} s) {diff:+8.1f} MB"
              + excess, flush=True)

    if args.parallel:
        print(f"speed-up with 2 parallel workers over {args.large:,} rows, GROUP BY grp (1,000 groups), best of {args.rounds}:")
        par = ("SET max_parallel_workers_per_gather = 2; SET parallel_setup_cost = 0; SET parallel_tuple_cost = 0; "
               "SET min_parallel_table_scan_size = 0;")
        queries = {"sum (built-in)": "sum(a)"}
        queries.update(AGGS)
        base = None
        for label, expr in queries.items():
            q = f"SELECT count(x) FROM (SELECT grp, {expr} AS x FROM scale_large GROUP BY grp) t"
            s.run("SET max_parallel_workers_per_gather = 0;")
            ser = best_ms(s, q, args.rounds)
            s.run(par)
            plan = "\n".join(s.run(f"EXPLAIN (COSTS OFF) {q};"))
            if "Partial" not in plan or "Gather" not in plan:
                print(f"  {label}: no parallel plan\n{plan}")
                sys.exit(1)
            p = best_ms(s, q, args.rounds)
            sp = ser / p
            if base is None:
                base = sp
            print(f"  {label:20s} serial {ser:9.1f} ms  2 workers {p:9.1f} ms  speed-up {sp:4.2f}"
                  + ("" if label.startswith("sum") else f"  (sum: {base:4.2f})"), flush=True)
    s.close()
    if args.check is not None:
        ok = worst <= args.check
        print(f"largest difference beyond the baseline's {worst:.1f} MB: {'ok' if ok else 'FAIL'} (allowed {args.check} MB)")
        sys.exit(0 if ok else 1)


if __name__ == "__main__":
    main()
