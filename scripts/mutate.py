#!/usr/bin/env python3
"""Mutation score of the tests: plant small bugs in src/core one at a time and
see which tests catch them.

    python3 scripts/mutate.py [--only PATTERN] [--unit-only] [--list] ...
    make mutation [MUTATE_ARGS='--only stress']

The mutants are listed in tests/mutation/mutants.txt (format described there).
For each mutant the script

  1. works in a copy of the tree (build/mutation/tree), never in the checkout:
     the copy is synchronised from the checkout at the start of every run (a
     file whose content differs is copied, which also undoes a mutant left
     behind by an interrupted run), and every mutated file is restored in a
     `finally` block (Ctrl-C included);
  2. replaces the mutant's snippet, which must occur exactly once in its file
     (otherwise the mutant is reported "stale": the code moved on and the
     mutant list must follow);
  3. stage 1: recompiles only the translation units of the unit tests that
     include the mutated file (objects are cached by the content of the unit and
     of every header it includes, so the unmutated build is made once and kept
     between runs), links, and runs the GoogleTest unit tests with
     --gtest_fail_fast (the wall-clock Speed tests are left out: a mutant that
     only makes code slower does not change behaviour);
  4. stage 2, for the survivors of stage 1 only: inside ONE throwaway cluster
     (scripts/with-cluster.sh --install, a private install through Debian's
     extension_destdir), rebuilds striae.so with the mutant, installs it into
     the cluster's directory (each new backend loads the new library) and runs
     the pg_regress files one at a time, then the external checks one at a
     time, stopping at the first failure.

A mutant is killed when a test fails (or times out, or the server crashes),
survives when every test passes, and is not counted when it is marked
equivalent (it cannot change behaviour; skipped unless --run-equivalent), does
not compile ("invalid": fix the mutant) or is stale. Score = killed / (killed +
survived). Exit status 0 only if nothing is stale or invalid and the score
reaches --target (default 95).
"""
import argparse
import concurrent.futures
import fnmatch
import hashlib
import os
import re
import shlex
import shutil
import subprocess
import sys
import time

ROOT = os.path.dirname(os.path.dirname(os.path.abspath(__file__)))
WORK = os.path.join(ROOT, "build", "mutation")
TREE = os.path.join(WORK, "tree")
OBJ = os.path.join(WORK, "obj")
DEPS = os.path.join(WORK, "deps")
MUTANTS = os.path.join(ROOT, "tests", "mutation", "mutants.txt")

# What the copy of the tree holds (build products are never copied over).
SYNC_ENTRIES = ["Makefile", "striae.control", "striae_gis.control", "src", "sql", "expected", "tests", "scripts", "python"]
SKIP_SUFFIXES = (".o", ".so", ".bc", ".pyc")
SKIP_DIRS = {"__pycache__", "build", "results"}

# External checks not run in stage 2: they need three clusters, build the
# released version from git, measure time and memory rather than values, or
# build the demo's page (its values come from the functions checked elsewhere).
DEFAULT_SKIP_EXTERNAL = ["check_upgrade.sh", "check_sharding.sh", "check_concurrency.sh",
                         "check_memory_scale.sh", "check_demo_page.py"]


def log(msg=""):
    print(msg, flush=True)


# ---------------------------------------------------------------------------
# Mutant list
# ---------------------------------------------------------------------------

class Mutant:
    def __init__(self, fields, line):
        self.line = line
        self.fields = fields
        self.id = fields.get("id", "")
        self.file = fields.get("file", "")
        self.find = fields.get("find", "")
        self.replace = fields.get("replace", "")
        self.note = fields.get("note", "")
        self.equivalent = fields.get("equivalent")  # reason, or None
        self.tests = fields.get("tests")  # optional gtest filter tried first
        self.fate = None
        self.detail = ""
        self.seconds = 0.0


def read_mutants(path):
    """Blocks of 'key: value' lines separated by blank lines; '#' starts a comment line."""
    mutants, fields, start = [], {}, 0
    keys = {"id", "file", "find", "replace", "note", "equivalent", "tests"}
    with open(path, encoding="utf-8") as f:
        lines = f.read().split("\n")
    for no, raw in enumerate(lines + [""], 1):
        if raw.startswith("#"):
            continue
        if raw.strip() == "":
            if fields:
                mutants.append(Mutant(fields, start))
                fields = {}
            continue
        m = re.match(r"([a-z]+)(\+?): ?(.*)$", raw)
        if not m or m.group(1) not in keys:
            sys.exit(f"{path}:{no}: expected 'key: value' with key one of {sorted(keys)}")
        key, more, value = m.groups()
        if not fields:
            start = no
        if more:  # 'find+:' / 'replace+:' continue the value on a new line
            if key not in ("find", "replace") or key not in fields:
                sys.exit(f"{path}:{no}: '{key}+:' must follow '{key}:'")
            fields[key] += "\n" + value
            continue
        if key in fields:
            sys.exit(f"{path}:{no}: key {key} repeated")
        fields[key] = value
    seen = set()
    for mu in mutants:
        where = f"{path}:{mu.line}"
        for k in ("id", "file", "find", "note"):
            if not getattr(mu, k):
                sys.exit(f"{where}: mutant without '{k}'")
        if "replace" not in mu.fields:
            sys.exit(f"{where}: mutant without 'replace' (an empty replacement deletes the snippet)")
        if mu.id in seen:
            sys.exit(f"{where}: duplicate id {mu.id}")
        seen.add(mu.id)
        if not mu.file.startswith("src/core/"):
            sys.exit(f"{where}: mutants go into src/core only")
        if mu.find == mu.replace:
            sys.exit(f"{where}: replacement equals the snippet")
        if "#include" in mu.find or "#include" in mu.replace:
            sys.exit(f"{where}: a mutant must not change includes (dependencies are cached)")
    return mutants


# ---------------------------------------------------------------------------
# The copy of the tree
# ---------------------------------------------------------------------------

def sync_tree():
    """Make TREE's sources equal to the checkout's. Copies get a fresh mtime, so
    make rebuilds from them; build products in TREE are kept."""
    copied = removed = 0
    os.makedirs(TREE, exist_ok=True)

    def same(a, b):
        if not os.path.exists(b) or os.path.getsize(a) != os.path.getsize(b):
            return False
        with open(a, "rb") as fa, open(b, "rb") as fb:
            return fa.read() == fb.read()

    wanted = set()
    for entry in SYNC_ENTRIES:
        src = os.path.join(ROOT, entry)
        if os.path.isfile(src):
            items = [(src, entry)]
        elif os.path.isdir(src):
            items = []
            for d, dirs, files in os.walk(src):
                dirs[:] = [x for x in dirs if x not in SKIP_DIRS]
                for name in files:
                    if name.endswith(SKIP_SUFFIXES):
                        continue
                    p = os.path.join(d, name)
                    items.append((p, os.path.relpath(p, ROOT)))
        else:
            continue
        for p, rel in items:
            wanted.add(rel)
            dst = os.path.join(TREE, rel)
            if not same(p, dst):
                os.makedirs(os.path.dirname(dst), exist_ok=True)
                shutil.copyfile(p, dst)
                shutil.copymode(p, dst)
                copied += 1
    for entry in SYNC_ENTRIES:
        top = os.path.join(TREE, entry)
        if not os.path.isdir(top):
            continue
        for d, dirs, files in os.walk(top):
            dirs[:] = [x for x in dirs if x not in SKIP_DIRS]
            for name in files:
                if name.endswith(SKIP_SUFFIXES):
                    continue
                rel = os.path.relpath(os.path.join(d, name), TREE)
                if rel not in wanted:
                    os.remove(os.path.join(TREE, rel))
                    removed += 1
    return copied, removed


# ---------------------------------------------------------------------------
# Stage 1: unit tests, content-addressed objects
# ---------------------------------------------------------------------------

class UnitBuild:
    def __init__(self, cxxflags, jobs):
        flags = [f for f in shlex.split(cxxflags) if f != "-g"]
        self.flags = flags
        self.jobs = jobs
        self.units = sorted(
            [os.path.join("src/core", f) for f in os.listdir(os.path.join(TREE, "src/core")) if f.endswith(".cpp")]
            + [os.path.join("tests/unit", f) for f in os.listdir(os.path.join(TREE, "tests/unit")) if f.endswith(".cpp")])
        self.used = set()
        os.makedirs(OBJ, exist_ok=True)
        os.makedirs(DEPS, exist_ok=True)

    def _depfile(self, unit):
        return os.path.join(DEPS, unit.replace("/", "__") + ".d")

    def deps(self, unit):
        """Project files the unit includes (from the last compile's -MMD), or None."""
        p = self._depfile(unit)
        if not os.path.exists(p):
            return None
        with open(p) as f:
            text = f.read().replace("\\\n", " ")
        parts = text.split(":", 1)[1].split() if ":" in text else []
        return sorted({os.path.normpath(x) for x in parts})

    def key(self, unit, overrides):
        """Hash of the flags and of the unit's and its headers' contents;
        overrides maps a relative path to mutated content."""
        h = hashlib.sha1(" ".join(self.flags).encode())
        deps = self.deps(unit)
        if deps is None:
            return None
        for rel in [unit] + [d for d in deps if d != unit]:
            h.update(rel.encode() + b"\0")
            if rel in overrides:
                h.update(overrides[rel].encode())
            else:
                try:
                    with open(os.path.join(TREE, rel), "rb") as f:
                        h.update(f.read())
                except FileNotFoundError:
                    return None  # a header went away: recompile
        return h.hexdigest()[:20]

    def _compile(self, unit, key):
        out = os.path.join(OBJ, f"{unit.replace('/', '__')}-{key}.o")
        tmp = out + ".tmp"
        dep = self._depfile(unit)
        cmd = ["g++"] + self.flags + ["-MMD", "-MF", dep + ".tmp", "-c", unit, "-o", tmp]
        r = subprocess.run(cmd, cwd=TREE, capture_output=True, text=True)
        if r.returncode != 0:
            return False, r.stderr[-3000:]
        os.replace(tmp, out)
        # Paths in the dep file are relative to TREE.
        os.replace(dep + ".tmp", dep)
        return True, ""

    def objects(self, overrides):
        """Object paths for every unit (compiling what is missing), or (None, error)."""
        todo, objs = [], {}
        for unit in self.units:
            k = self.key(unit, overrides)
            path = os.path.join(OBJ, f"{unit.replace('/', '__')}-{k}.o") if k else None
            if path and os.path.exists(path):
                objs[unit] = path
            else:
                todo.append(unit)
        if todo:
            with concurrent.futures.ThreadPoolExecutor(max_workers=self.jobs) as ex:
                futs = {}
                for unit in todo:
                    # Without deps yet (first build), compile under a provisional key
                    # and rename once the dep file exists.
                    k = self.key(unit, overrides) or "new"
                    futs[ex.submit(self._compile, unit, k)] = (unit, k)
                for fut in concurrent.futures.as_completed(futs):
                    unit, k = futs[fut]
                    ok, err = fut.result()
                    if not ok:
                        return None, f"{unit}: {err}"
                    if k == "new":
                        real = self.key(unit, overrides)
                        src = os.path.join(OBJ, f"{unit.replace('/', '__')}-new.o")
                        dst = os.path.join(OBJ, f"{unit.replace('/', '__')}-{real}.o")
                        os.replace(src, dst)
                        k = real
                    objs[unit] = os.path.join(OBJ, f"{unit.replace('/', '__')}-{k}.o")
        self.used.update(objs.values())
        return [objs[u] for u in self.units], None

    def link(self, objs, out):
        cmd = ["g++"] + self.flags + objs + ["-lgtest", "-lgtest_main", "-pthread", "-o", out]
        r = subprocess.run(cmd, cwd=TREE, capture_output=True, text=True)
        return r.returncode == 0, r.stderr[-3000:]

    def prune(self):
        for name in os.listdir(OBJ):
            p = os.path.join(OBJ, name)
            if p not in self.used:
                os.remove(p)


def run_unit(binary, filt, timeout):
    """(passed, detail). Fail fast; the Speed tests are left out."""
    gfilter = f"{filt}-*Speed*" if filt else "-*Speed*"
    cmd = [binary, "--gtest_brief=1", "--gtest_fail_fast", f"--gtest_filter={gfilter}"]
    try:
        r = subprocess.run(cmd, cwd=TREE, capture_output=True, text=True, timeout=timeout,
                           start_new_session=True)
    except subprocess.TimeoutExpired:
        return False, "unit tests timed out"
    if r.returncode == 0:
        return True, ""
    failed = re.findall(r"^\[  FAILED  \] ([\w/.]+)", r.stdout, re.M)
    if failed:
        return False, f"unit {failed[0]}"
    if r.returncode < 0:
        return False, f"unit tests died of signal {-r.returncode}"
    return False, f"unit tests exit {r.returncode}"


# ---------------------------------------------------------------------------
# Applying a mutant
# ---------------------------------------------------------------------------

def mutated_text(mu):
    """(original, mutated) text of the mutant's file in TREE, or (None, reason)."""
    path = os.path.join(TREE, mu.file)
    if not os.path.exists(path):
        return None, f"{mu.file} does not exist"
    with open(path, encoding="utf-8") as f:
        text = f.read()
    n = text.count(mu.find)
    if n != 1:
        return None, f"snippet found {n} times in {mu.file}"
    return text, text.replace(mu.find, mu.replace)


# ---------------------------------------------------------------------------
# Stage 2: one cluster for all survivors
# ---------------------------------------------------------------------------

def cluster_stage(args):
    """Runs inside scripts/with-cluster.sh --install (started from TREE)."""
    import json
    global WORK, TREE
    with open(args.cluster_stage) as f:
        plan = json.load(f)
    WORK, TREE = plan["work"], plan["tree"]  # this copy of the script runs from inside TREE
    dest = os.environ["STRIAE_DESTDIR"]
    regress = plan["regress"]
    externals = plan["externals"]
    results = {}
    jobs = str(plan["jobs"])
    for item in plan["mutants"]:
        t0 = time.time()
        path = os.path.join(TREE, item["file"])
        with open(path, encoding="utf-8") as f:
            original = f.read()
        st = os.stat(path)
        # Objects make would rebuild; kept to put back with their mtimes afterwards.
        backup = os.path.join(WORK, "pg-backup")
        shutil.rmtree(backup, ignore_errors=True)
        os.makedirs(backup)
        saved = []
        for d in ("src/core", "src/pg", "."):
            for name in os.listdir(os.path.join(TREE, d)):
                if name.endswith((".o", ".so")):
                    rel = os.path.normpath(os.path.join(d, name))
                    shutil.copy2(os.path.join(TREE, rel), os.path.join(backup, rel.replace("/", "__")))
                    saved.append(rel)
        fate, detail = "survived", ""
        try:
            if original.count(item["find"]) != 1:
                fate, detail = "stale", "snippet not unique"
                raise StopIteration
            with open(path, "w", encoding="utf-8") as f:
                f.write(original.replace(item["find"], item["replace"]))
            r = subprocess.run(["make", "-s", f"-j{jobs}", "all"], cwd=TREE, capture_output=True, text=True)
            if r.returncode != 0:
                fate, detail = "invalid", "server build failed: " + r.stderr[-500:]
                raise StopIteration
            r = subprocess.run(["make", "-s", "install", f"DESTDIR={dest}"], cwd=TREE, capture_output=True, text=True)
            if r.returncode != 0:
                fate, detail = "invalid", "install failed: " + r.stderr[-500:]
                raise StopIteration
            subprocess.run(["chmod", "-R", "a+rX", dest], check=True)
            for name in regress:
                t1 = time.time()
                r = subprocess.run(["make", "-s", "installcheck", f"REGRESS={name}"], cwd=TREE,
                                   capture_output=True, text=True, timeout=plan["timeout"])
                if plan.get("verbose"):
                    log(f"    regress {name}: exit {r.returncode} ({time.time() - t1:.1f} s)")
                if r.returncode != 0:
                    fate, detail = "killed", f"regress {name}"
                    raise StopIteration
            for name in externals:
                t1 = time.time()
                cmd = (["/usr/bin/python3", name] if name.endswith(".py") else ["bash", name])
                try:
                    r = subprocess.run(cmd, cwd=os.path.join(TREE, "tests/external"), capture_output=True,
                                       text=True, timeout=plan["timeout"])
                except subprocess.TimeoutExpired:
                    fate, detail = "killed", f"external {name} timed out"
                    raise StopIteration
                if plan.get("verbose"):
                    log(f"    external {name}: exit {r.returncode} ({time.time() - t1:.1f} s)")
                if r.returncode != 0:
                    fate, detail = "killed", f"external {name}"
                    raise StopIteration
            detail = f"{len(regress)} regression files and {len(externals)} external checks pass"
        except StopIteration:
            pass
        except subprocess.TimeoutExpired as e:
            fate, detail = "killed", f"timeout: {' '.join(e.cmd) if isinstance(e.cmd, list) else e.cmd}"
        finally:
            with open(path, "w", encoding="utf-8") as f:
                f.write(original)
            os.utime(path, ns=(st.st_atime_ns, st.st_mtime_ns))
            for rel in saved:
                shutil.copy2(os.path.join(backup, rel.replace("/", "__")), os.path.join(TREE, rel))
            for d in ("src/core", "src/pg"):
                for name in os.listdir(os.path.join(TREE, d)):
                    rel = os.path.normpath(os.path.join(d, name))
                    if name.endswith(".o") and rel not in saved:
                        os.remove(os.path.join(TREE, rel))
            shutil.rmtree(os.path.join(TREE, "results"), ignore_errors=True)
        results[item["id"]] = {"fate": fate, "detail": detail, "seconds": time.time() - t0}
        log(f"  [cluster] {item['id']}: {fate} {detail}".rstrip())
        with open(plan["out"], "w") as f:
            json.dump(results, f)
    # Leave the unmutated library installed (the cluster is thrown away anyway).
    return 0


# ---------------------------------------------------------------------------
# Main
# ---------------------------------------------------------------------------

def main():
    ap = argparse.ArgumentParser(description=__doc__, formatter_class=argparse.RawDescriptionHelpFormatter)
    ap.add_argument("--only", action="append", default=[],
                    help="run mutants whose id or file contains PATTERN (shell wildcards allowed); repeatable")
    ap.add_argument("--list", action="store_true", help="list the mutants and check their snippets, run nothing")
    ap.add_argument("--unit-only", action="store_true", help="stage 1 only (survivors are reported as such)")
    ap.add_argument("--run-equivalent", action="store_true",
                    help="also run mutants marked equivalent (they should survive)")
    ap.add_argument("--jobs", type=int, default=2, help="parallel compiles (default 2)")
    ap.add_argument("--verbose", action="store_true", help="stage 2: print every test run with its time")
    ap.add_argument("--no-cache", action="store_true",
                    help="rerun the unit tests of mutants whose objects and tests did not change")
    ap.add_argument("--target", type=float, default=95.0, help="score needed for exit status 0 (percent)")
    ap.add_argument("--skip-external", action="append", default=None,
                    help=f"external check to leave out of stage 2 (default: {', '.join(DEFAULT_SKIP_EXTERNAL)})")
    ap.add_argument("--cxxflags", default="-std=c++17 -isystem /usr/include/eigen3 -Wall -Wextra -Werror -O2 -Isrc/core",
                    help="unit-test compile flags (make mutation passes the Makefile's UNIT_CXXFLAGS)")
    ap.add_argument("--mutants", default=MUTANTS, help="mutant list (default tests/mutation/mutants.txt)")
    ap.add_argument("--cluster-stage", help=argparse.SUPPRESS)
    args = ap.parse_args()
    if args.cluster_stage:
        return cluster_stage(args)

    t_start = time.time()
    mutants = read_mutants(args.mutants)

    def selected(mu):
        if not args.only:
            return True
        return any(fnmatch.fnmatch(mu.id, f"*{p}*") or fnmatch.fnmatch(mu.file, f"*{p}*") for p in args.only)

    chosen = [m for m in mutants if selected(m)]
    copied, removed = sync_tree()
    log(f"mutation: {len(mutants)} mutants listed, {len(chosen)} selected; tree copy {os.path.relpath(TREE, ROOT)} "
        f"({copied} files updated, {removed} removed)")

    for mu in chosen:
        original, mutated = mutated_text(mu)
        if original is None:
            mu.fate, mu.detail = "stale", mutated
        elif mu.equivalent is not None and not args.run_equivalent:
            mu.fate, mu.detail = "equivalent", mu.equivalent
    if args.list:
        for mu in chosen:
            log(f"{mu.id:40s} {mu.file:28s} {mu.fate or 'ok':10s} {mu.note}")
        return 0 if not any(m.fate == "stale" for m in chosen) else 1

    # Stage 1 ---------------------------------------------------------------
    build = UnitBuild(args.cxxflags, args.jobs)
    t0 = time.time()
    objs, err = build.objects({})
    if objs is None:
        log("mutation: the unmutated tree does not build:\n" + err)
        return 2
    base_bin = os.path.join(WORK, "unit_tests")
    ok, err = build.link(objs, base_bin)
    if not ok:
        log("mutation: link of the unmutated unit tests failed:\n" + err)
        return 2
    t1 = time.time()
    passed, detail = run_unit(base_bin, None, None)
    base_secs = time.time() - t1
    if not passed:
        log(f"mutation: the unmutated unit tests fail ({detail}); fix them first")
        return 2
    timeout = max(60.0, 5 * base_secs + 30)
    log(f"mutation: unmutated unit build ready in {t1 - t0:.0f} s, tests pass in {base_secs:.1f} s "
        f"(timeout per mutant {timeout:.0f} s)")

    interrupted = False
    mut_bin = os.path.join(WORK, "unit_tests_mutant")
    cache_path = os.path.join(WORK, "unit-results.json")
    import json
    cache = {}
    if os.path.exists(cache_path):
        with open(cache_path) as f:
            cache = json.load(f)

    def save_cache():
        with open(cache_path + ".tmp", "w") as f:
            json.dump(cache, f)
        os.replace(cache_path + ".tmp", cache_path)
    try:
        for mu in chosen:
            if mu.fate:
                continue
            t = time.time()
            original, mutated = mutated_text(mu)
            path = os.path.join(TREE, mu.file)
            st = os.stat(path)
            try:
                with open(path, "w", encoding="utf-8") as f:
                    f.write(mutated)
                objs, err = build.objects({mu.file: mutated})
                if objs is None:
                    mu.fate, mu.detail = "invalid", "does not compile: " + err.strip().split("\n")[0][:200]
                else:
                    # Same objects, same test binary: the stage-1 fate of an earlier run holds.
                    rkey = hashlib.sha1(("\n".join(objs) + "\n" + (mu.tests or "")).encode()).hexdigest()
                    if rkey in cache and not args.no_cache:
                        mu.fate, mu.detail = cache[rkey]
                        mu.detail += " (cached)"
                    else:
                        ok, err = build.link(objs, mut_bin)
                        if not ok:
                            mu.fate, mu.detail = "invalid", "does not link"
                        else:
                            passed, detail = True, ""
                            if mu.tests:
                                passed, detail = run_unit(mut_bin, mu.tests, timeout)
                            if passed:
                                passed, detail = run_unit(mut_bin, None, timeout)
                            mu.fate, mu.detail = ("survived", "unit tests pass") if passed else ("killed", detail)
                            if "timed out" not in detail and "signal" not in detail:
                                cache[rkey] = [mu.fate, mu.detail]
                                save_cache()
            finally:
                with open(path, "w", encoding="utf-8") as f:
                    f.write(original)
                os.utime(path, ns=(st.st_atime_ns, st.st_mtime_ns))
            mu.seconds = time.time() - t
            log(f"  {mu.id:42s} {mu.fate:9s} {mu.detail}  ({mu.seconds:.0f} s)")
    except KeyboardInterrupt:
        interrupted = True
        log("mutation: interrupted; the tree copy is restored")

    # Stage 2 ---------------------------------------------------------------
    survivors = [m for m in chosen if m.fate == "survived"]
    if survivors and not args.unit_only and not interrupted:
        import json
        regress = sorted(f[:-4] for f in os.listdir(os.path.join(TREE, "sql")) if f.endswith(".sql"))
        skip = DEFAULT_SKIP_EXTERNAL if args.skip_external is None else args.skip_external
        externals = sorted(f for f in os.listdir(os.path.join(TREE, "tests/external"))
                           if f.startswith("check_") and f not in skip)
        plan_path = os.path.join(WORK, "cluster-plan.json")
        out_path = os.path.join(WORK, "cluster-results.json")
        if os.path.exists(out_path):
            os.remove(out_path)
        with open(plan_path, "w") as f:
            json.dump({"mutants": [{"id": m.id, "file": m.file, "find": m.find, "replace": m.replace}
                                   for m in survivors],
                       "regress": regress, "externals": externals, "jobs": args.jobs,
                       "timeout": 600, "out": out_path, "work": WORK, "tree": TREE,
                       "verbose": args.verbose}, f)
        log(f"mutation: {len(survivors)} survivors of the unit tests; building the server library and "
            f"starting one cluster for regression ({len(regress)} files) and external checks ({len(externals)})")
        r = subprocess.run(["make", "-s", f"-j{args.jobs}", "all"], cwd=TREE, capture_output=True, text=True)
        if r.returncode != 0:
            log("mutation: the unmutated server library does not build:\n" + r.stderr[-2000:])
            return 2
        try:
            subprocess.run(["bash", "scripts/with-cluster.sh", "--install", "/usr/bin/python3",
                            "scripts/mutate.py", "--cluster-stage", plan_path], cwd=TREE)
        except KeyboardInterrupt:
            interrupted = True
            log("mutation: interrupted; the tree copy is restored")
        results = {}
        if os.path.exists(out_path):
            with open(out_path) as f:
                results = json.load(f)
        for m in survivors:
            if m.id in results:
                res = results[m.id]
                m.fate, m.detail = res["fate"], res["detail"]
                m.seconds += res["seconds"]
            else:
                m.fate, m.detail = "not-run", "cluster stage did not reach it"

    if not args.only and not interrupted:
        build.prune()

    # Report ----------------------------------------------------------------
    counts = {}
    for m in chosen:
        counts[m.fate or "not-run"] = counts.get(m.fate or "not-run", 0) + 1
    log("")
    log("mutation: fate of each mutant")
    for m in chosen:
        log(f"  {m.fate or 'not-run':10s} {m.id:42s} {m.file:26s} {m.detail}")
    killed, survived = counts.get("killed", 0), counts.get("survived", 0)
    score = 100.0 * killed / (killed + survived) if killed + survived else 100.0
    elapsed = time.time() - t_start
    log("")
    log("mutation: " + ", ".join(f"{k} {v}" for k, v in sorted(counts.items())))
    label = "" if not args.only else " (subset)"
    log(f"mutation score{label}: {killed}/{killed + survived} behaviour-changing mutants killed = {score:.1f} % "
        f"(target {args.target:g} %), run time {elapsed / 60:.1f} min")
    bad = counts.get("stale", 0) + counts.get("invalid", 0)
    if bad:
        log(f"mutation: {bad} mutants are stale or invalid: update tests/mutation/mutants.txt")
    return 0 if (not bad and score >= args.target and not interrupted) else 1


if __name__ == "__main__":
    sys.exit(main())
