"""Analyse a CSV of field faults or focal mechanisms, grouped by a column: the worker of
scripts/analyse-csv.sh (README, "Your own data in one command").

    analyse_csv.py FILE [--db CONNINFO] [--out DIR] [--group COLUMN[,COLUMN...]]
                        [--kind faults|mechanisms] [--resamples N] [--seed S]
                        [--check-only] [--create-extension]

Reads the file here (structure: text, header, field counts), then lets striae's own
parsers judge every value in the database (input_errors, field_fault_slip_input_error,
the fault_slip constructor), so a value passes exactly when striae would read it. Each
bad row is listed with its line, column, value and reason; every good row is analysed;
the counts add up. Everything lives in temporary tables of one session: nothing is left
in the database. Writes DIR/domains.csv, DIR/domains.geojson (when the file has
longitudes and latitudes), DIR/bad_rows.csv, DIR/data.csv (the good rows, canonical),
DIR/figures/<group>/*.svg and DIR/index.html.

Exit status: 0 analysed (bad rows, if any, are listed), 1 no good row or a database
error, 2 usage, not a CSV, or needed columns missing. Python's standard library and
psycopg 3 (Debian python3-psycopg).
"""
import argparse
import csv
import json
import math
import os
import re
import sys

HERE = os.path.dirname(os.path.abspath(__file__))
sys.path.insert(0, HERE)
import page  # noqa: E402

PROG = "analyse-csv"
MAX_DIAGRAMS = 400          # focal-sphere diagrams drawn (files and map); the rest are counted
MAX_STATIONS = 5000         # station marks on the map (an even sample beyond); the rest are counted
SEED_DEFAULT = 20261
RESAMPLES_DEFAULT = 500

# The data columns a file may have, in the order they are looked for. Each is a set of
# header names (lower case) and how one row's values become a fault_slip.
DATA_FORMS = [
    ("fault", ["fault"], "faults"),
    ("mechanism", ["mechanism"], "mechanisms"),
    ("plane_striation", ["plane", "striation", "sense"], "faults"),
    ("field_book", ["strike", "dip", "rake|pitch", "sense"], "faults"),
    ("strike_dip_rake", ["strike", "dip", "rake"], "mechanisms"),
]
FORMS_TEXT = ("fault | mechanism | plane, striation, sense | strike, dip, rake (or pitch), sense | "
              "strike, dip, rake")
LON_NAMES, LAT_NAMES = ("lon", "longitude"), ("lat", "latitude")
ID_NAMES = ("id", "event_id", "station")
RESULT_COLUMNS = {"domain", "data", "n", "lon", "lat", "sigma1_trend", "sigma1_plunge", "sigma1_cone95",
                  "sigma2_trend", "sigma2_plunge", "sigma2_cone95", "sigma3_trend", "sigma3_plunge",
                  "sigma3_cone95", "shape_ratio", "shape_ratio_low", "shape_ratio_high", "shmax_azimuth",
                  "regime", "regime_index", "mean_misfit"}


class Fail(Exception):
    """A message for the user and the exit status."""

    def __init__(self, message, code):
        super().__init__(message)
        self.code = code


# ---- the file ----------------------------------------------------------------------------

def read_table(path):
    """Header and records of a CSV file: (header, [(line, fields)], blank lines).

    A file that is not text (NUL bytes, not UTF-8) or has no header is not a CSV here."""
    try:
        with open(path, "rb") as f:
            raw = f.read()
    except OSError as e:
        raise Fail(f"{path}: cannot read: {e.strerror}", 2)
    if not raw.strip():
        raise Fail(f"{path}: the file is empty", 2)
    if b"\x00" in raw:
        raise Fail(f"{path}: not a CSV file (it holds binary data: NUL bytes); save the table as CSV, "
                   "comma-separated, UTF-8", 2)
    try:
        text = raw.decode("utf-8-sig")
    except UnicodeDecodeError as e:
        raise Fail(f"{path}: not a CSV file in UTF-8 (byte {e.start + 1} is not UTF-8); save the table "
                   "as CSV, comma-separated, UTF-8", 2)
    first = next((ln for ln in text.splitlines() if ln.strip()), "")
    delim = ","
    if "," not in first:
        counts = {d: first.count(d) for d in (";", "\t")}
        best = max(counts, key=counts.get)
        if counts[best]:
            delim = best
    reader = csv.reader(text.splitlines(keepends=True), delimiter=delim, strict=True)
    records, blank, header, start = [], 0, None, 1
    try:
        for fields in reader:
            line = start
            start = reader.line_num + 1
            if not fields or all(not x.strip() for x in fields):
                blank += 1
                continue
            if header is None:
                header = (line, [h.strip() for h in fields])
            else:
                records.append((line, fields))
    except csv.Error as e:
        raise Fail(f"{path}: not a CSV file: line {reader.line_num}: {e}", 2)
    if header is None:
        raise Fail(f"{path}: no header line", 2)
    return header[1], records, blank, delim


def find(header_lc, names):
    for n in names:
        if n in header_lc:
            return header_lc.index(n)
    return None


def choose_columns(path, header, args):
    """Which columns hold the group, the data, coordinates and ids; a Fail if unclear."""
    lc = [h.lower() for h in header]
    dup = sorted({h for h in lc if lc.count(h) > 1 and h})
    if dup:
        raise Fail(f"{path}: the header names a column more than once: {', '.join(dup)}", 2)
    shown = ", ".join(header)
    present = []
    for name, cols, kind in DATA_FORMS:
        idx = []
        for c in cols:
            i = find(lc, c.split("|"))
            if i is None:
                break
            idx.append(i)
        else:
            present.append((name, cols, kind, idx))
    # the field-book form includes strike, dip, rake: it wins over the bare form
    if any(p[0] == "field_book" for p in present):
        present = [p for p in present if p[0] != "strike_dip_rake"]
    if not present:
        raise Fail(f"{path}: no data columns; the header has: {shown}. It needs one of: {FORMS_TEXT} "
                   "(README, \"Your own data in one command\")", 2)
    if len(present) > 1:
        raise Fail(f"{path}: more than one set of data columns ({'; '.join(', '.join(p[1]) for p in present)}): "
                   "keep one", 2)
    form, cols, kind, idx = present[0]
    groups = [g.strip().lower() for g in args.group.split(",") if g.strip()]
    gidx = []
    for g in groups:
        if g not in lc:
            raise Fail(f"{path}: no grouping column \"{g}\"; the header has: {shown} "
                       "(choose one with --group COLUMN)", 2)
        gidx.append(lc.index(g))
    lon, lat = find(lc, LON_NAMES), find(lc, LAT_NAMES)
    if (lon is None) != (lat is None):
        raise Fail(f"{path}: a longitude column needs a latitude column and the other way round "
                   f"(the header has: {shown})", 2)
    return {"form": form, "kind": args.kind or kind, "data": idx, "data_names": [header[i] for i in idx],
            "groups": gidx, "group_names": [header[i] for i in gidx], "lon": lon, "lat": lat,
            "id": find(lc, ID_NAMES), "width": len(header), "header": header}


# A number with a decimal comma ("41,25"), as spreadsheets in many locales save numbers in
# files with a semicolon or a tab between fields. Read as a decimal point in such files
# only, and only in numeric columns (coordinates; strike, dip and rake or pitch of the
# numeric forms): in a comma-separated file, and in a literal (fault, mechanism, plane,
# striation), a comma is a separator.
DECIMAL_COMMA = re.compile(r"[+-]?[0-9]+,[0-9]+")
NUMERIC_FORMS = {"field_book": 3, "strike_dip_rake": 3}   # how many leading data columns are numbers


def number_text(text, decimal_comma):
    """The cell, stripped, with a decimal comma made a point where the file allows it."""
    t = text.strip()
    if decimal_comma and DECIMAL_COMMA.fullmatch(t):
        return t.replace(",", ".")
    return t


def coordinate(text, name, lo, hi, decimal_comma=False):
    """(value, None) or (None, reason) for a longitude or latitude cell; empty is (None, None)."""
    t = number_text(text, decimal_comma)
    if not t:
        return None, None
    try:
        v = float(t)
    except ValueError:
        return None, f"{name} is not a number"
    if not math.isfinite(v) or not lo <= v <= hi:
        return None, f"{name} {t} is out of range ({lo:g} to {hi:g} degrees)"
    return v, None


# ---- the database ------------------------------------------------------------------------

def connect(args):
    try:
        import psycopg
    except ImportError:
        raise Fail("python3-psycopg is missing: run scripts/install-deps.sh as root", 1)
    try:
        conn = psycopg.connect(args.db or "", autocommit=True)
    except psycopg.Error as e:
        raise Fail(f"cannot connect to the database{' ' + repr(args.db) if args.db else ''}: {str(e).strip()}", 1)
    with conn.cursor() as cur:
        cur.execute("SELECT extversion FROM pg_extension WHERE extname = 'striae'")
        if cur.fetchone() is None:
            if not args.create_extension:
                raise Fail("the database has no striae extension: run CREATE EXTENSION striae; in it "
                           "(or leave out --db to analyse on a throwaway cluster)", 1)
            cur.execute("CREATE EXTENSION striae")
        cur.execute("SET client_min_messages = warning")
    return conn


SETUP = """
CREATE TEMP TABLE raw (line int PRIMARY KEY, grp text[], label text, a text, b text, c text, d text,
                       lon float8, lat float8);
-- The fault_slip constructor of a plane, a striation and a sense: NULL when it accepts
-- them, else its message (and detail), as input_error gives for a literal.
CREATE FUNCTION pg_temp.striation_error(p text, s text, sense text) RETURNS text LANGUAGE plpgsql AS $f$
DECLARE msg text; det text;
BEGIN
  PERFORM fault_slip(p::plane, s::lineation, sense);
  RETURN NULL;
EXCEPTION WHEN data_exception THEN
  GET STACKED DIAGNOSTICS msg = MESSAGE_TEXT, det = PG_EXCEPTION_DETAIL;
  RETURN msg || CASE WHEN coalesce(det, '') <> '' THEN ' (' || det || ')' ELSE '' END;
END $f$;
"""

# Per form: the SQL listing (line, column, value, reason) of the bad values of raw, and
# the expression of the datum for the good rows.
SCREEN = {
    "fault": ("SELECT line, 1, value, reason FROM input_errors('pg_temp.raw', 'a', 'fault_slip', 'line')",
              "a::fault_slip"),
    "mechanism": ("SELECT line, 1, value, reason FROM input_errors('pg_temp.raw', 'a', 'fault_slip', 'line')",
                  "a::fault_slip"),
    "plane_striation": (
        """SELECT line, 1, value, reason FROM input_errors('pg_temp.raw', 'a', 'plane', 'line')
           UNION ALL SELECT line, 2, value, reason FROM input_errors('pg_temp.raw', 'b', 'lineation', 'line')
           UNION ALL SELECT line, 3, value, reason FROM input_errors('pg_temp.raw', 'c', 'slip_sense', 'line')
           UNION ALL SELECT line, 0, concat_ws(', ', a, b, c), pg_temp.striation_error(a, b, c) FROM pg_temp.raw
                      WHERE plane_input_error(a) IS NULL AND lineation_input_error(b) IS NULL
                        AND slip_sense_input_error(c) IS NULL AND pg_temp.striation_error(a, b, c) IS NOT NULL""",
        "fault_slip(a::plane, b::lineation, c)"),
    "field_book": (
        """SELECT line, 0, concat_ws(', ', a, b, c, d), field_fault_slip_input_error(a, b, c, d) FROM pg_temp.raw
            WHERE field_fault_slip_input_error(a, b, c, d) IS NOT NULL""",
        "field_fault_slip(a, b, c, d)"),
    "strike_dip_rake": (
        """SELECT line, 0, concat_ws(', ', a, b, c),
                  CASE WHEN a ~ '[/,]' OR b ~ '[/,]' OR c ~ '[/,]' THEN 'a column holds more than one field'
                       ELSE input_error(concat_ws('/', a, b, c), 'fault_slip') END
             FROM pg_temp.raw
            WHERE input_error(concat_ws('/', a, b, c), 'fault_slip') IS NOT NULL
               OR a ~ '[/,]' OR b ~ '[/,]' OR c ~ '[/,]'""",
        "concat_ws('/', a, b, c)::fault_slip"),
}


def slug(name, taken):
    s = re.sub(r"[^A-Za-z0-9._-]+", "_", name).strip("._")[:60] or "group"
    base, k = s, 2
    while s.lower() in taken:
        s, k = f"{base}_{k}", k + 1
    taken.add(s.lower())
    return s


def figure_sql(kind):
    """(file name, caption, SQL of one SVG document for a group) of each figure."""
    stress = ("coalesce(net_label(net_stress((SELECT t FROM pg_temp.dom WHERE grp = %(g)s)), %(slabel)s), "
              "'{\"layers\": []}'::net_figure)")
    if kind == "faults":
        return [
            ("fault_net", "faults (great circles, hanging-wall slip arrows) and the inverted stress",
             f"SELECT net_svg(net_label(net_faults(f), 'faults') || {stress}, title => %(title)s || ': faults and stress', "
             "graticule => true) FROM pg_temp.obs WHERE grp = %(g)s"),
            ("dihedra", "right dihedra: each fault's P dihedron, contours of the grid",
             "SELECT net_svg(net_dihedra(f) || net_contours(right_dihedra(f, 2.5), NULL, false), "
             "title => %(title)s || ': right dihedra') FROM pg_temp.obs WHERE grp = %(g)s"),
            ("hoeppener", "faults after Hoeppener (1955), with the stress axes",
             f"SELECT net_svg(net_label(net_hoeppener(f), 'faults') || {stress}, "
             "title => %(title)s || ': faults after Hoeppener (1955)') FROM pg_temp.obs WHERE grp = %(g)s"),
        ]
    return [
        ("focal_axes", "P and T axes of the mechanisms, joint focal inversion",
         f"SELECT net_svg(net_label(net_pt_axes(f), 'mechanisms') || {stress}, "
         "title => %(title)s || ': focal mechanisms and stress', graticule => true) FROM pg_temp.obs WHERE grp = %(g)s"),
        ("dihedra", "right dihedra of the mechanisms",
         "SELECT net_svg(net_dihedra(f) || net_contours(right_dihedra(f, 2.5), NULL, false), "
         "title => %(title)s || ': right dihedra') FROM pg_temp.obs WHERE grp = %(g)s"),
    ]


def analyse(args, path, spec, records, blank):
    from psycopg import sql
    conn = connect(args)
    cur = conn.cursor()
    cur.execute(SETUP)
    with open(os.path.join(HERE, "domain_columns.sql"), encoding="utf-8") as f:
        cur.execute(f.read())

    # Rows of the wrong width, and coordinates, are judged here; the rest is loaded.
    bad = []          # (line, column name, value, reason)
    loaded = 0
    with cur.copy("COPY pg_temp.raw (line, grp, label, a, b, c, d, lon, lat) FROM STDIN") as cp:
        for line, fields in records:
            if len(fields) != spec["width"]:
                bad.append((line, "", ",".join(fields), f"{len(fields)} fields, the header has {spec['width']}"))
                continue
            problems = []
            grp = [fields[i].strip() for i in spec["groups"]]
            for name, v in zip(spec["group_names"], grp):
                if not v:
                    problems.append((line, name, "", f"no value in the grouping column {name}"))
            lon = lat = None
            if spec["lon"] is not None:
                lon, r1 = coordinate(fields[spec["lon"]], "longitude", -180, 180, spec["decimal_comma"])
                lat, r2 = coordinate(fields[spec["lat"]], "latitude", -90, 90, spec["decimal_comma"])
                for r, i in ((r1, spec["lon"]), (r2, spec["lat"])):
                    if r:
                        problems.append((line, spec["header"][i], fields[i], r))
                if (lon is None) != (lat is None) and not (r1 or r2):
                    problems.append((line, f"({spec['header'][spec['lon']]}, {spec['header'][spec['lat']]})",
                                     f"{fields[spec['lon']]}, {fields[spec['lat']]}",
                                     "a longitude needs a latitude and the other way round"))
            if problems:
                bad.extend(problems)
                continue
            numeric = NUMERIC_FORMS.get(spec["form"], 0)
            vals = [number_text(fields[i], spec["decimal_comma"] and k < numeric) for k, i in enumerate(spec["data"])]
            vals += [None] * (4 - len(spec["data"]))
            label = fields[spec["id"]].strip() if spec["id"] is not None else ""
            cp.write_row([line, grp, label or f"line {line}", *vals, lon, lat])
            loaded += 1

    screen_sql, datum = SCREEN[spec["form"]]
    cur.execute(f"SELECT line, col, value, reason FROM ({screen_sql}) s(line, col, value, reason) ORDER BY line, col")
    names = ["(" + ", ".join(spec["data_names"]) + ")"] + spec["data_names"]
    db_bad = cur.fetchall()
    for line, col, value, reason in db_bad:
        bad.append((line, names[col] if len(spec["data_names"]) > 1 else spec["data_names"][0], value, reason))
    bad_lines = sorted({b[0] for b in bad})
    cur.execute("DELETE FROM pg_temp.raw WHERE line = ANY(%s)", (bad_lines,))
    cur.execute(f"CREATE TEMP TABLE obs AS SELECT line, grp, label, {datum} AS f, lon, lat FROM pg_temp.raw")
    cur.execute("SELECT count(*) FROM pg_temp.obs")
    good = cur.fetchone()[0]
    bad.sort(key=lambda b: b[0])

    # The listing and the counts: every data row is good or bad, never dropped.
    n_rows = len(records)
    print(f"{PROG}: {path}: {n_rows} data rows" + (f" ({blank} blank line{'s' if blank > 1 else ''} skipped)" if blank else "")
          + f": {good} analysed, {len(bad_lines)} bad")
    for line, col, value, reason in bad:
        where = f"{col} " if col else ""
        print(f"  line {line}: {where}\"{value}\": {reason}")
    assert good + len(bad_lines) == n_rows, "every row is good or bad"
    if good == 0:
        raise Fail("no good row to analyse", 1)

    os.makedirs(args.out, exist_ok=True)
    out = os.path.abspath(args.out)
    with open(os.path.join(out, "bad_rows.csv"), "w", newline="", encoding="utf-8") as f:
        w = csv.writer(f)
        w.writerow(["line", "column", "value", "reason"])
        w.writerows(bad)

    # The per-domain result, one row per group.
    kind = spec["kind"]
    agg = ("stress_inversion(f, %(r)s::integer, %(s)s::bigint)" if kind == "faults"
           else "focal_stress_inversion(f, NULL::float8, %(r)s::integer, %(s)s::bigint)")
    cur.execute(f"""CREATE TEMP TABLE dom AS
        SELECT grp, count(*) AS n, {agg} AS t,
               avg(cosd(lat) * cosd(lon)) AS x, avg(cosd(lat) * sind(lon)) AS y, avg(sind(lat)) AS z
          FROM pg_temp.obs GROUP BY grp""", {"r": args.resamples, "s": args.seed})
    gcols = [n if n.lower() not in RESULT_COLUMNS else f"group_{n}" for n in spec["group_names"]]
    has_xy = spec["lon"] is not None
    sel = [sql.SQL("row_number() OVER (ORDER BY d.grp)::int AS domain")]
    sel += [sql.SQL("d.grp[{}] AS {}").format(sql.Literal(i + 1), sql.Identifier(c)) for i, c in enumerate(gcols)]
    sel += [sql.SQL("{} AS data").format(sql.Literal("field faults" if kind == "faults" else "focal mechanisms")),
            sql.SQL("d.n"), sql.SQL("c.*")]
    if has_xy:
        sel += [sql.SQL("p.lon"), sql.SQL("p.lat")]
    cur.execute(sql.SQL("""CREATE TEMP TABLE domain_result AS SELECT {} FROM pg_temp.dom d
        CROSS JOIN LATERAL pg_temp.domain_columns(d.t) c
        LEFT JOIN LATERAL pg_temp.mean_position(d.x, d.y, d.z) p ON true""").format(sql.SQL(", ").join(sel)))
    cur.execute("SELECT * FROM pg_temp.domain_result ORDER BY domain")
    cols = [c.name for c in cur.description]
    domains = [dict(zip(cols, r)) for r in cur.fetchall()]
    with open(os.path.join(out, "domains.csv"), "w", newline="", encoding="utf-8") as f:
        w = csv.writer(f)
        w.writerow(cols)
        for d in domains:
            w.writerow(["" if d[c] is None else d[c] for c in cols])
    files = [("domains.csv", "per-group result")]
    if has_xy:
        with open(os.path.join(HERE, "domain_geojson.sql"), encoding="utf-8") as f:
            cur.execute(f.read())
        doc = cur.fetchone()[0]
        with open(os.path.join(out, "domains.geojson"), "w", encoding="utf-8") as f:
            f.write(doc if isinstance(doc, str) else json.dumps(doc))
            f.write("\n")
        files.append(("domains.geojson", "the same as a GIS layer"))
    cur.execute("SELECT line, grp, label, f::text, lon, lat FROM pg_temp.obs ORDER BY line")
    obs = cur.fetchall()
    with open(os.path.join(out, "data.csv"), "w", newline="", encoding="utf-8") as f:
        w = csv.writer(f)
        w.writerow(["line"] + spec["group_names"] + ["id", "fault_slip"] + (["lon", "lat"] if has_xy else []))
        for line, grp, label, fs, lon, lat in obs:
            w.writerow([line, *grp, label, fs] + (["" if lon is None else lon, "" if lat is None else lat] if has_xy else []))
    files += [("data.csv", "the rows analysed, canonical"), ("bad_rows.csv", "the rows not analysed, with reasons")]

    # Figures per group, and focal-sphere diagrams of mechanisms (the first MAX_DIAGRAMS).
    taken, groups, events = set(), [], []
    diagrams = 0
    cur.execute("SELECT grp, t IS NOT NULL FROM pg_temp.dom ORDER BY grp")
    for grp, has_t in cur.fetchall():
        name = " / ".join(grp)
        s = slug(name, taken)
        gdir = os.path.join(out, "figures", s)
        os.makedirs(gdir, exist_ok=True)
        figs = []
        title = name if len(name.encode()) <= 120 else name.encode()[:117].decode(errors="ignore") + "..."
        for fname, caption, q in figure_sql(kind):
            cur.execute(q, {"g": grp, "title": title, "slabel": "stress"})
            svg = cur.fetchone()[0]
            with open(os.path.join(gdir, fname + ".svg"), "w", encoding="utf-8") as f:
                f.write(svg)
            figs.append((f"figures/{s}/{fname}.svg", caption))
        thumbs = []
        if kind == "mechanisms":
            os.makedirs(os.path.join(gdir, "mechanisms"), exist_ok=True)
            cur.execute("""SELECT line, label, f::text, lon, lat,
                                  net_svg(net_label(net_mechanism(f), left(label, 60)), size => 240, title => left(label, 60))
                             FROM pg_temp.obs WHERE grp = %s ORDER BY line LIMIT %s""",
                        (grp, max(0, MAX_DIAGRAMS - diagrams)))
            for line, label, fs, lon, lat, svg in cur.fetchall():
                diagrams += 1
                fn = f"figures/{s}/mechanisms/line{line}.svg"
                with open(os.path.join(out, fn), "w", encoding="utf-8") as f:
                    f.write(svg)
                thumbs.append((fn, f"{label}: {fs}"))
                events.append({"id": f"line{line}", "lon": lon, "lat": lat, "glyph": fn,
                               "title": f"{label} ({name}): {fs}"})
        note = "" if has_t else "No stress result: fewer than 4 data, or a degenerate set (all faults of one zone)."
        groups.append({"name": name, "anchor": f"group-{s}", "figures": figs, "thumbs": thumbs, "note": note,
                       "thumbs_title": "Focal mechanisms"})
    n_mech = sum(1 for _ in obs) if kind == "mechanisms" else 0
    if kind == "mechanisms" and diagrams < n_mech:
        print(f"  focal-sphere diagrams drawn for the first {diagrams} of {n_mech} mechanisms (the map and the page)")
        map_notes_mech = [f"Focal-sphere diagrams are drawn for the first {diagrams} of the {n_mech} mechanisms."]
    else:
        map_notes_mech = []

    for d in domains:
        label = " / ".join(str(d[c]) for c in gcols)
        d["_group"] = label
        d["_style"] = "solid" if kind == "faults" else "open"
        sh = f"SHmax {float(d['shmax_azimuth']):.0f} degrees, " if d.get("shmax_azimuth") is not None else ""
        d["_title"] = f"{label}: n {d['n']}: {sh}{d.get('regime') or 'no result'}"
    stations = ([{"lon": lon, "lat": lat, "class": 0} for _, _, _, _, lon, lat in obs if lon is not None]
                if kind == "faults" else [])
    map_notes = map_notes_mech
    if len(stations) > MAX_STATIONS:
        step = len(stations) / MAX_STATIONS
        map_notes.append(f"The map shows {MAX_STATIONS} of the {len(stations)} stations, an even sample.")
        print(f"  the map shows {MAX_STATIONS} of {len(stations)} stations (an even sample)")
        stations = [stations[int(i * step)] for i in range(MAX_STATIONS)]
    # groups are labelled on the map by their number (#) in the tables: names may be long
    places = [{"name": str(d["domain"]), "lon": d.get("lon"), "lat": d.get("lat"),
               "anchor": g["anchor"]} for d, g in zip(domains, groups)]
    what = "field faults" if kind == "faults" else "focal mechanisms"
    manifest = {
        "title": f"{os.path.basename(path)}: stress by {', '.join(spec['group_names'])}",
        "intro": [page.esc(f"{good} {what} of {path} in {len(domains)} groups by {', '.join(spec['group_names'])}; "
                           f"{'stress_inversion' if kind == 'faults' else 'focal_stress_inversion (friction searched)'} "
                           f"with {args.resamples} bootstrap resamples (seed {args.seed}) per group. Cones and intervals "
                           "are 95 % bootstrap half-angles.")],
        "summary": [f"{n_rows} data rows: {good} analysed, {len(bad_lines)} not (bad_rows.csv lists them with reasons)."],
        "caution": "These results are interpretive. Where fault reactivation, induced seismicity, or slope or "
                   "excavation stability matters, they do not replace site investigation, the applicable codes "
                   "and the judgement of licensed professionals.",
        "files": files,
        "map_title": "Map: SHmax by group" + (", focal mechanisms" if kind == "mechanisms" else ""),
        "map_notes": ["SHmax bars are centred on the mean position of a group's rows and numbered as in the "
                      "tables (#); their colour is the stress regime after Zoback (1992), their length fixed. "
                      "Local equirectangular projection."] + map_notes,
        "group_header": ", ".join(spec["group_names"]),
        "label_columns": [],
        "bar_styles": [("solid" if kind == "faults" else "open", f"SHmax of a group's {what}")],
        "station_classes": ["measurement station"] if stations else [],
        "stations": stations,
        "events": events,
        "places": places,
        "domains": domains,
        "groups": groups,
    }
    index = page.write(manifest, out)
    print(f"  groups: {len(domains)} (" + ", ".join(f"{d['_group']}: {d['n']}" for d in domains) + ")")
    no_xy = sum(1 for o in obs if o[4] is None) if has_xy else 0
    if no_xy:
        print(f"  rows analysed without coordinates (not on the map, not in a group's position): {no_xy}")
    no_result = [d["_group"] for d in domains if d.get("regime") is None]
    if no_result:
        print(f"  no stress result (fewer than 4 data or a degenerate set): {', '.join(no_result)}")
    print(f"  written: {out}/ " + ", ".join(f for f, _ in files) + ", figures/, index.html")
    print(f"  page: {index}")
    conn.close()


def parse_args(argv):
    ap = argparse.ArgumentParser(prog=PROG, description="Analyse a CSV of field faults or focal mechanisms by group.")
    ap.add_argument("file")
    ap.add_argument("--db", help="libpq connection string of a database with the striae extension")
    ap.add_argument("--out", help="output directory (default: <file name>-striae in the current directory)")
    ap.add_argument("--group", default="site", help="grouping column(s), comma-separated (default: site)")
    ap.add_argument("--kind", choices=["faults", "mechanisms"], help="override the kind the columns imply")
    ap.add_argument("--resamples", type=int, default=RESAMPLES_DEFAULT, help="bootstrap resamples (default 500)")
    ap.add_argument("--seed", type=int, default=SEED_DEFAULT, help="bootstrap seed (default 20261)")
    ap.add_argument("--check-only", action="store_true", help="check the file's structure and stop")
    ap.add_argument("--create-extension", action="store_true", help=argparse.SUPPRESS)
    args = ap.parse_args(argv)
    if not 1 <= args.resamples <= 100000:
        ap.error("--resamples takes 1 to 100000")
    if args.out is None:
        args.out = os.path.splitext(os.path.basename(args.file))[0] + "-striae"
    return args


def main(argv):
    args = parse_args(argv)
    try:
        header, records, blank, delim = read_table(args.file)
        spec = choose_columns(args.file, header, args)
        spec["decimal_comma"] = delim != ","
        if not records:
            raise Fail(f"{args.file}: no data rows under the header", 1)
        if args.check_only:
            return 0
        analyse(args, args.file, spec, records, blank)
    except Fail as e:
        print(f"{PROG}: {e}", file=sys.stderr)
        return e.code
    return 0


if __name__ == "__main__":
    sys.exit(main(sys.argv[1:]))
