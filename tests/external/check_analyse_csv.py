"""scripts/analyse-csv.sh on small files, against the test cluster (--db, no new cluster).

Field faults: two groups drawn here with numpy from planted stress states, slip by the
Wallace-Bott rule (Wallace 1951, Bott 1959: the hanging wall slips along the resolved
shear stress; conventions of Aki & Richards 1980: right-hand-rule strike, rake from the
strike to the hanging-wall slip, positive reverse; North-East-Down, compression
positive), without noise, on planes carrying at least 0.35 (s1 - s3) of resolved shear
(the maximum is 0.5), where Michael's (1984) assumption of equal shear magnitudes nearly
holds, so his inversion must find sigma1 within a few degrees (README: the |tau| = 1
assumption biases error-free data on random planes by up to about 3 degrees on the axes;
5 degrees allowed here. On planes down to 0.25 a set of 12 drawn here came out 6.5
degrees off: the bias grows with the spread of shear magnitudes). Six malformed rows and a blank
line are mixed in; the listing must be exactly the expected lines, the counts must add
up, and the outputs must hold every good row and only those: n per group, data.csv, the
group positions (mean of unit vectors, numpy), and domains.csv equal to the server's
stress_inversion of the good rows. Focal mechanisms: a group of 8 and a group of 3 (too
few: listed as without result). Files that are not CSV or lack needed columns: exit 2
and a clear message, before any database work.
"""
import csv
import json
import math
import os
import shutil
import subprocess
import sys
import tempfile
import xml.etree.ElementTree as ET

import numpy as np

from pgconn import fresh_db, query

ROOT = os.path.abspath(os.path.join(os.path.dirname(__file__), "..", ".."))
CMD = os.path.join(ROOT, "scripts", "analyse-csv.sh")
DB = "dbname=striae_external"
failures = []


def check(ok, what):
    print(("ok   " if ok else "FAIL ") + what)
    if not ok:
        failures.append(what)


def vec(trend, plunge):
    t, p = math.radians(trend), math.radians(plunge)
    return np.array([math.cos(p) * math.cos(t), math.cos(p) * math.sin(t), math.sin(p)])


def stress(s1, s3, phi):
    v1, v3 = vec(*s1), vec(*s3)
    assert abs(v1 @ v3) < 1e-12
    v2 = np.cross(v3, v1)
    return np.outer(v1, v1) + phi * np.outer(v2, v2)


def wallace_bott_rake(S, s, d):
    """Rake of the hanging-wall slip on plane s/d under S, and the shear magnitude."""
    s, d = math.radians(s), math.radians(d)
    strike = np.array([math.cos(s), math.sin(s), 0.0])
    updip = np.array([math.cos(d) * math.sin(s), -math.cos(d) * math.cos(s), -math.sin(d)])
    n = np.array([-math.sin(d) * math.sin(s), math.sin(d) * math.cos(s), -math.cos(d)])  # upward, into the hanging wall
    t = S @ n
    u = -(t - (n @ t) * n)
    return math.degrees(math.atan2(u @ updip, u @ strike)), float(np.linalg.norm(u))


def draw(S, k, rng):
    out = []
    while len(out) < k:
        s, d = rng.uniform(0, 360), rng.uniform(20, 80)
        r, mag = wallace_bott_rake(S, s, d)
        if mag >= 0.35:
            out.append("%.1f/%.1f/%.1f" % (s, d, r))
    return out


def run(args):
    p = subprocess.run(["bash", CMD] + args, capture_output=True, text=True, timeout=300)
    return p.returncode, p.stdout, p.stderr


def rows(path):
    with open(path, newline="", encoding="utf-8") as f:
        return list(csv.DictReader(f))


fresh_db()
work = tempfile.mkdtemp(prefix="striae-csv-")
rng = np.random.default_rng(9)

# ---- field faults with malformed rows ---------------------------------------------------
TRUTH = {"NORTH": ((100.0, 5.0), (280.0, 85.0), 0.5),    # thrust
         "SOUTH": ((200.0, 80.0), (20.0, 10.0), 0.4)}    # normal
CENTRE = {"NORTH": (-137.5, -41.1), "SOUTH": (-137.5, -41.3)}
lines = ["id,site,fault,lon,lat"]
good = []                                   # (id, site, fault, lon, lat)
for site, truth in TRUTH.items():
    for j, f in enumerate(draw(stress(*truth), 12, rng)):
        lon, lat = CENTRE[site][0] + rng.normal(0, 0.02), CENTRE[site][1] + rng.normal(0, 0.02)
        good.append(("%s-%02d" % (site[0], j + 1), site, f, round(lon, 5), round(lat, 5)))
bad_rows = [
    "X01,NORTH,110/94/-75,-137.5,-41.1",
    "X02,NORTH,110/64/75 X,-137.5,-41.1",
    "X03,,10/20/30,-137.5,-41.2",
    "X04,SOUTH,20/30/40,-137.5,95",
    "X05,SOUTH,20/30/40,-137.5",
    "X06,SOUTH,,-137.5,-41.3",
]
body = ["%s,%s,%s,%s,%s" % g for g in good]
# bad rows at fixed places, and one blank line
for k, b in enumerate(bad_rows):
    body.insert(3 + 4 * k, b)
body.insert(10, "")
lines += body
faults_csv = os.path.join(work, "faults.csv")
with open(faults_csv, "w") as f:
    f.write("\n".join(lines) + "\n")
line_of = {ln.split(",")[0]: i + 1 for i, ln in enumerate(lines) if ln}
expected_listing = [
    'line %d: fault "110/94/-75": dip 94 is out of range (Accepted: dip from 0 to 90 degrees.)' % line_of["X01"],
    'line %d: fault "110/64/75 X": unknown slip sense "x"' % line_of["X02"],
    'line %d: site "": no value in the grouping column site' % line_of["X03"],
    'line %d: lat "95": latitude 95 is out of range (-90 to 90 degrees)' % line_of["X04"],
    'line %d: "X05,SOUTH,20/30/40,-137.5": 4 fields, the header has 5' % line_of["X05"],
    'line %d: fault "": the value is empty' % line_of["X06"],
]
expected_listing.sort(key=lambda s: int(s.split(":")[0].split()[1]))
out = os.path.join(work, "faults-out")
rc, so, se = run([faults_csv, "--db", DB, "--out", out])
check(rc == 0, "faults: exit 0 (%d)%s" % (rc, "" if rc == 0 else ": " + se[-1500:]))
so_lines = so.splitlines()
head = "analyse-csv: %s: %d data rows (1 blank line skipped): %d analysed, %d bad" % (faults_csv, len(good) + 6, len(good), 6)
check(so_lines[:1] == [head], "faults: the counts line is exact: %r" % so_lines[:1])
listing = [ln.strip() for ln in so_lines[1:] if ln.startswith("  line ")]
check(listing == expected_listing, "faults: the bad rows are listed exactly, in line order")
if listing != expected_listing:
    for a, b in zip(listing + [""] * 6, expected_listing + [""] * 6):
        print("   got      %s\n   expected %s" % (a, b))

domains = rows(os.path.join(out, "domains.csv"))
check([d["site"] for d in domains] == ["NORTH", "SOUTH"] and [int(d["n"]) for d in domains] == [12, 12],
      "faults: domains.csv has both groups with all 12 good rows each")
data = rows(os.path.join(out, "data.csv"))
check(sorted(r["id"] for r in data) == sorted(g[0] for g in good), "faults: data.csv holds exactly the good rows")
check(len(rows(os.path.join(out, "bad_rows.csv"))) == 6, "faults: bad_rows.csv has the 6 problems")
for d in domains:
    s1 = vec(float(d["sigma1_trend"]), float(d["sigma1_plunge"]))
    ang = math.degrees(math.acos(min(1.0, abs(s1 @ vec(*TRUTH[d["site"]][0])))))
    check(ang < 5.0, "faults: %s sigma1 %s/%s within 5 degrees of the planted %s/%s (%.1f)"
          % (d["site"], d["sigma1_trend"], d["sigma1_plunge"], *TRUTH[d["site"]][0], ang))
    pts = [(g[3], g[4]) for g in good if g[1] == d["site"]]
    m = np.mean([[math.cos(math.radians(la)) * math.cos(math.radians(lo)),
                  math.cos(math.radians(la)) * math.sin(math.radians(lo)), math.sin(math.radians(la))] for lo, la in pts], axis=0)
    lon, lat = math.degrees(math.atan2(m[1], m[0])), math.degrees(math.atan2(m[2], math.hypot(m[0], m[1])))
    check(abs(float(d["lon"]) - lon) < 1e-5 and abs(float(d["lat"]) - lat) < 1e-5,
          "faults: %s position is the mean of its rows (%s, %s vs %.5f, %.5f)" % (d["site"], d["lon"], d["lat"], lon, lat))
    lits = ",".join("'%s'" % g[2] for g in good if g[1] == d["site"])
    ref = query("SELECT round(trend(sigma1(t))::numeric, 1), round(plunge(sigma1(t))::numeric, 1), "
                "round(shape_ratio(t)::numeric, 3), round(mean_misfit(t)::numeric, 1) FROM (SELECT "
                "stress_inversion(f::fault_slip, 500, 20261) t FROM unnest(ARRAY[%s]) f) s" % lits)[0]
    check(ref == [d["sigma1_trend"], d["sigma1_plunge"], d["shape_ratio"], d["mean_misfit"]],
          "faults: %s result equals stress_inversion of its good rows in the server" % d["site"])
with open(os.path.join(out, "domains.geojson")) as f:
    gj = json.load(f)
check([ft["properties"]["site"] for ft in gj["features"]] == ["NORTH", "SOUTH"]
      and all(ft["geometry"]["type"] == "Point" for ft in gj["features"]), "faults: domains.geojson has both groups as Points")
figs = [os.path.join(out, "figures", s, k + ".svg") for s in ("NORTH", "SOUTH") for k in ("fault_net", "dihedra", "hoeppener")]
ok = True
for p in figs:
    try:
        ok &= ET.parse(p).getroot().tag == "{http://www.w3.org/2000/svg}svg"
    except (OSError, ET.ParseError):
        ok = False
check(ok, "faults: three SVG figures per group")
with open(os.path.join(out, "index.html")) as f:
    html = f.read()
check('id="district-map"' in html and html.count('class="domain"') == 2
      and all('src="figures/%s/%s.svg"' % (s, k) in html for s in ("NORTH", "SOUTH") for k in ("fault_net", "dihedra", "hoeppener")),
      "faults: index.html has the map with both groups and every figure")

# ---- focal mechanisms: one group too small -----------------------------------------------
S = stress(((120.0, 0.0)), ((30.0, 0.0)), 0.5)           # strike-slip
mech = draw(S, 11, rng)
mlines = ["event_id,region,mechanism,longitude,latitude"]
for j, m in enumerate(mech):
    mlines.append("E%02d,%s,%s,%.4f,%.4f" % (j + 1, "R1" if j < 8 else "R2", m, 10.0 + 0.01 * j, 45.0 - 0.01 * j))
mech_csv = os.path.join(work, "mechanisms.csv")
with open(mech_csv, "w") as f:
    f.write("\n".join(mlines) + "\n")
mout = os.path.join(work, "mech-out")
rc, so, se = run([mech_csv, "--db", DB, "--out", mout, "--group", "region"])
check(rc == 0 and so.splitlines()[0].endswith(": 11 data rows: 11 analysed, 0 bad"), "mechanisms: exit 0, 11 analysed")
check("  no stress result (fewer than 4 data or a degenerate set): R2" in so.splitlines(),
      "mechanisms: the group of 3 is named as without result")
md = rows(os.path.join(mout, "domains.csv"))
check([(d["region"], d["n"], d["data"]) for d in md] == [("R1", "8", "focal mechanisms"), ("R2", "3", "focal mechanisms")]
      and md[0]["regime"] != "" and md[1]["regime"] == "", "mechanisms: domains.csv has R1 with a result and R2 without")
n_diag = sum(len(os.listdir(os.path.join(mout, "figures", g, "mechanisms"))) for g in ("R1", "R2"))
with open(os.path.join(mout, "index.html")) as f:
    mh = f.read()
check(n_diag == 11 and mh.count('class="event"') == 11, "mechanisms: a focal-sphere diagram per event, on the map too")

# ---- a spreadsheet saved with semicolons and decimal commas ------------------------------
# Spreadsheets in many locales write ";" between fields and "," as the decimal mark (and
# often a byte-order mark and CRLF line ends). In such a file a number with a decimal comma
# is read as a decimal point in the numeric columns; in a comma-separated file the same
# quoted cell stays a bad value.
eu_rows = []
for j, m in enumerate(draw(S, 6, rng)):
    st, dp, rk = (float(x) for x in m.split("/"))
    eu_rows.append(("E%02d" % (j + 1), "%.2f" % st, "%.2f" % dp, "%.2f" % rk, "%.3f" % (10.0 + 0.011 * j), "%.3f" % (45.0 - 0.013 * j)))
eu_csv = os.path.join(work, "semicolons.csv")
with open(eu_csv, "wb") as f:
    text = "event_id;region;strike;dip;rake;lon;lat\r\n" + "".join(
        "%s;R1;%s;%s;%s;%s;%s\r\n" % tuple(v.replace(".", ",") if k else v for k, v in enumerate(r)) for r in eu_rows)
    f.write(b"\xef\xbb\xbf" + text.encode())
eout = os.path.join(work, "eu-out")
rc, so, se = run([eu_csv, "--db", DB, "--out", eout, "--group", "region"])
ok = rc == 0 and so.splitlines()[0].endswith(": 6 data rows: 6 analysed, 0 bad")
check(ok, "decimal commas: a semicolon file with a BOM and CRLF, every row analysed"
      + ("" if ok else " (exit %d: %r)" % (rc, (so + se)[:300])))
if rc == 0:
    ed = rows(os.path.join(eout, "data.csv"))
    canon = query("SELECT f::fault_slip::text FROM unnest(ARRAY[%s]) WITH ORDINALITY u(f, k) ORDER BY k"
                  % ",".join("'%s/%s/%s'" % r[1:4] for r in eu_rows))
    check([r["fault_slip"] for r in ed] == [c[0] for c in canon],
          "decimal commas: strike, dip and rake read as the same numbers with points (%s)" % ed[0]["fault_slip"])
    check([(float(r["lon"]), float(r["lat"])) for r in ed] == [(float(r[4]), float(r[5])) for r in eu_rows],
          "decimal commas: longitudes and latitudes read as the same numbers with points")
comma_csv = os.path.join(work, "comma-decimal.csv")
with open(comma_csv, "w") as f:
    f.write("id,site,fault,lon,lat\n" + "".join('C%d,A,%s,10.0,"45,5"\n' % (j, g[2]) for j, g in enumerate(good[:5])))
rc, so, se = run([comma_csv, "--db", DB, "--out", os.path.join(work, "comma-out")])
check(rc == 1 and 'lat "45,5": latitude is not a number' in so,
      "decimal commas: not read in a comma-separated file (the cell is a bad value there)")

# ---- files the command refuses -----------------------------------------------------------
binary = os.path.join(work, "photo.jpg")
with open(binary, "wb") as f:
    f.write(b"\xff\xd8\xff\xe0\x00\x10JFIF\x00\x01\x01\x00\x00\x01\x00\x01\x00\x00")
rc, so, se = run([binary, "--db", DB, "--out", os.path.join(work, "x")])
check(rc == 2 and se.strip() == "analyse-csv: %s: not a CSV file (it holds binary data: NUL bytes); save the table as "
      "CSV, comma-separated, UTF-8" % binary and so == "", "a binary file: exit 2 and the message (%d, %r)" % (rc, se.strip()))
latin = os.path.join(work, "latin1.csv")
with open(latin, "wb") as f:
    f.write("site,fault\nLe Crêt,10/20/30\n".encode("latin-1"))
rc, so, se = run([latin, "--db", DB])
byte = "site,fault\nLe Crêt".encode("latin-1").index(0xEA) + 1
check(rc == 2 and "not a CSV file in UTF-8 (byte %d is not UTF-8)" % byte in se,
      "a file not in UTF-8: exit 2 and the byte named (%d, %r)" % (rc, se.strip()))
nocols = os.path.join(work, "nocols.csv")
with open(nocols, "w") as f:
    f.write("site,strike,dip\nA,10,20\n")
rc, so, se = run([nocols, "--db", DB])
check(rc == 2 and se.strip() == ("analyse-csv: %s: no data columns; the header has: site, strike, dip. It needs one of: "
                                 "fault | mechanism | plane, striation, sense | strike, dip, rake (or pitch), sense | "
                                 "strike, dip, rake (README, \"Your own data in one command\")" % nocols),
      "a file without data columns: exit 2 and the message (%d)" % rc)
rc, so, se = run([faults_csv, "--db", DB, "--group", "unit"])
check(rc == 2 and "no grouping column \"unit\"; the header has: id, site, fault, lon, lat" in se,
      "a missing grouping column: exit 2 and the message (%d)" % rc)
check(not os.path.exists(os.path.join(work, "x")), "nothing is written for a refused file")

shutil.rmtree(work, ignore_errors=True)
print("check_analyse_csv: %d failure(s)" % len(failures))
sys.exit(1 if failures else 0)
