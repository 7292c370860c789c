"""The demo's district page in a real browser, on a reduced district.

Runs demo/run.sh for two of the six sites (DEMO_SITES, DEMO_QUICK: the tour of queries
is skipped) into a scratch directory, then checks what `make demo` promises:

- domains.csv has one row per domain (site x map unit x age class of the field faults,
  plus the focal mechanisms of each site), counted here from the generated data files;
- domains.geojson is GeoJSON (RFC 7946): a FeatureCollection of one Point Feature per
  row, coordinates [lon, lat] equal to the row's, every column of the row a property
  with the same value;
- index.html, loaded by Debian's chromium (headless, from the file system), raises no
  error: a capturing script injected into a copy of the page (the page itself has no
  JavaScript) records script errors, console.error calls and failed loads, then, on
  the load event, checks every <img> loaded (complete, natural width > 0), that the
  map is drawn (an <svg id="district-map"> at its size, one SHmax bar group per domain
  with coordinates and one focal-sphere diagram per mechanism, each inside the map's
  box), and writes its findings into the DOM, which --dump-dom prints; chromium's own
  console log (--enable-logging=stderr) is read too;
- every <img> and link target of the page exists on disk, every figure is an SVG
  document (parsed as XML), and the inline map is well-formed XML.
"""
import csv
import json
import os
import re
import shutil
import subprocess
import sys
import tempfile
import xml.etree.ElementTree as ET

ROOT = os.path.abspath(os.path.join(os.path.dirname(__file__), "..", ".."))
SITES = ["KESTREL", "SEDGE"]
failures = []


def check(ok, what):
    print(("ok   " if ok else "FAIL ") + what)
    if not ok:
        failures.append(what)


def rows(path):
    with open(path, newline="", encoding="utf-8") as f:
        return list(csv.DictReader(f))


work = tempfile.mkdtemp(prefix="striae-demo-page-")
out = os.path.join(work, "out")
env = dict(os.environ, DEMO_OUT=out, DEMO_SITES=",".join(SITES), DEMO_DB="striae_demo_check", DEMO_QUICK="1")
run = subprocess.run(["bash", os.path.join(ROOT, "demo", "run.sh")], env=env, capture_output=True, text=True, timeout=300)
check(run.returncode == 0, "reduced demo ran (exit %d)%s" % (run.returncode, "" if run.returncode == 0 else ": " + run.stderr[-2000:]))
if run.returncode != 0:
    sys.exit(1)
check("district page: " in run.stdout and "== Demo district summary" in run.stdout, "the demo prints its summary and where the page is")
subprocess.run(["dropdb", "--if-exists", "striae_demo_check"], check=False, capture_output=True)

# ---- domains.csv against the generated data ---------------------------------------------
faults = rows(os.path.join(out, "fault_slip_data.csv"))
events = rows(os.path.join(out, "stress_mechanisms.csv"))
domains = rows(os.path.join(out, "domains.csv"))
expected = {(f["site"], f["map_unit"], f["age_class"], "field faults") for f in faults}
expected |= {(e["site"], "", "", "focal mechanisms") for e in events}
got = {(d["site"], d["map_unit"], d["age_class"], d["data"]) for d in domains}
check(got == expected and len(domains) == len(expected),
      "domains.csv: one row per site/map unit/age class and per site's mechanisms (%d rows)" % len(domains))
counts = {}
for f in faults:
    k = (f["site"], f["map_unit"], f["age_class"], "field faults")
    counts[k] = counts.get(k, 0) + 1
for e in events:
    k = (e["site"], "", "", "focal mechanisms")
    counts[k] = counts.get(k, 0) + 1
check(all(int(d["n"]) == counts[(d["site"], d["map_unit"], d["age_class"], d["data"])] for d in domains),
      "domains.csv: n of every domain is its number of data")
check(all(d["shmax_azimuth"] and d["regime"] and d["lon"] and d["lat"] for d in domains),
      "domains.csv: every domain has a result and a position")

# ---- GeoJSON -------------------------------------------------------------------------------
with open(os.path.join(out, "domains.geojson"), encoding="utf-8") as f:
    gj = json.load(f)
feats = gj.get("features", [])
check(gj.get("type") == "FeatureCollection" and len(feats) == len(domains),
      "domains.geojson: a FeatureCollection of %d features" % len(feats))


def same(csv_value, json_value):
    if json_value is None:
        return csv_value == ""
    if isinstance(json_value, (int, float)):
        return csv_value != "" and float(csv_value) == float(json_value)
    return csv_value == json_value


ok_geom = ok_props = True
for d, ft in zip(domains, feats):
    g, p = ft.get("geometry") or {}, ft.get("properties") or {}
    ok_geom &= (ft.get("type") == "Feature" and g.get("type") == "Point"
                and g.get("coordinates") == [float(d["lon"]), float(d["lat"])])
    ok_props &= set(p) == set(d) and all(same(d[k], p[k]) for k in d)
check(ok_geom, "domains.geojson: Point geometry at each row's [lon, lat], in the table's order")
check(ok_props, "domains.geojson: every column of every row is a property with the same value")

# ---- the GIS layers (demo/gis.sql, read by ogr2ogr from the PostGIS views) ------------------
with open(os.path.join(out, "shmax_bars.geojson"), encoding="utf-8") as f:
    bars = json.load(f).get("features", [])
check(len(bars) == len(domains), "shmax_bars.geojson: one bar per domain (%d)" % len(bars))
by_domain = {str(b["properties"]["domain"]): b for b in bars}
ok_bar = True
for d in domains:
    b = by_domain.get(d["domain"])
    g = (b or {}).get("geometry") or {}
    c = g.get("coordinates") or []
    # the bar runs end - centre - end; its centre is the domain's point; its attribute is
    # the domain's SHmax (the CSV holds the value rounded to 0.1 degree)
    ok_bar &= (g.get("type") == "LineString" and len(c) == 3
               and abs(c[1][0] - float(d["lon"])) < 1e-9 and abs(c[1][1] - float(d["lat"])) < 1e-9
               and abs(float(b["properties"]["shmax_azimuth"]) - float(d["shmax_azimuth"])) <= 0.05 + 1e-9)
check(ok_bar, "shmax_bars.geojson: a 3-vertex LineString centred on each domain's point, with its SHmax")
with open(os.path.join(out, "mechanism_quadrants.geojson"), encoding="utf-8") as f:
    quads = json.load(f).get("features", [])
check(len(quads) == len(events) and all(q["geometry"]["type"] == "MultiPolygon" for q in quads),
      "mechanism_quadrants.geojson: a MultiPolygon for each of the %d mechanisms" % len(quads))

# ---- the page on disk ----------------------------------------------------------------------
with open(os.path.join(out, "index.html"), encoding="utf-8") as f:
    page = f.read()
srcs = re.findall(r'<img src="([^"]+)"', page)
hrefs = [h for h in re.findall(r'href="([^"#][^"]*)"', page)]
check(len(srcs) == len(SITES) * 6 + len(events), "index.html: %d figures and mechanism diagrams referenced" % len(srcs))
missing = [s for s in set(srcs + hrefs) if not os.path.isfile(os.path.join(out, s))]
check(not missing, "index.html: every <img> and link target exists%s" % (": missing " + ", ".join(missing[:5]) if missing else ""))
bad_svg = []
for s in set(srcs):
    try:
        if ET.parse(os.path.join(out, s)).getroot().tag != "{http://www.w3.org/2000/svg}svg":
            bad_svg.append(s)
    except (ET.ParseError, OSError):
        bad_svg.append(s)
check(not bad_svg, "every figure is an SVG document%s" % (": " + ", ".join(bad_svg[:5]) if bad_svg else ""))
m = re.search(r'<svg id="district-map".*?</svg>\n', page, re.S)
try:
    mapdoc = ET.fromstring(m.group(0)) if m else None
except ET.ParseError as e:
    mapdoc = None
    print("map parse error:", e)
check(mapdoc is not None, "the inline district map is well-formed XML")
check("<script" not in page.lower() and "http://" not in page.replace('xmlns="http://www.w3.org/2000/svg"', "")
      and "https://" not in page, "the page has no script and refers to nothing on the network")

# ---- the page in chromium ---------------------------------------------------------------
PROBE = """<script>
var striaeErrors = [];
window.addEventListener('error', function (e) {
  var t = e.target;
  striaeErrors.push(t && (t.src || t.href) ? 'failed to load ' + (t.src || t.href) : 'script error: ' + e.message);
}, true);
var striaeConsoleError = console.error;
console.error = function () { striaeErrors.push('console.error: ' + Array.prototype.join.call(arguments, ' ')); striaeConsoleError.apply(console, arguments); };
window.addEventListener('load', function () {
  var r = {errors: striaeErrors, images: document.images.length, bad_images: [], outside: []};
  for (var i = 0; i < document.images.length; i++) {
    var im = document.images[i];
    if (!im.complete || im.naturalWidth === 0) r.bad_images.push(im.getAttribute('src'));
  }
  var map = document.getElementById('district-map');
  if (map) {
    var b = map.getBoundingClientRect();
    r.map = [b.width, b.height];
    var inside = function (el) {
      var c = el.getBoundingClientRect();
      return c.width > 0 && c.height > 0 && c.left >= b.left - 1 && c.right <= b.right + 1 && c.top >= b.top - 1 && c.bottom <= b.bottom + 1;
    };
    var doms = map.querySelectorAll('g.domain'), evs = map.querySelectorAll('g.event');
    r.domains = doms.length; r.events = evs.length;
    for (var j = 0; j < doms.length; j++) if (!inside(doms[j])) r.outside.push('domain ' + doms[j].getAttribute('data-domain'));
    for (var k = 0; k < evs.length; k++) if (!inside(evs[k])) r.outside.push('event ' + evs[k].getAttribute('data-event'));
  }
  var p = document.createElement('pre');
  p.id = 'striae-probe';
  p.textContent = JSON.stringify(r);
  document.body.appendChild(p);
});
</script>"""
probe_page = os.path.join(out, "index.probe.html")
with open(probe_page, "w", encoding="utf-8") as f:
    f.write(page.replace("<head>", "<head>\n" + PROBE, 1))
profile = tempfile.mkdtemp(prefix="striae-chromium-")
try:
    br = subprocess.run(["chromium", "--headless", "--no-sandbox", "--disable-gpu", "--disable-background-networking",
                         "--disable-component-update", "--disable-sync", "--no-first-run", "--user-data-dir=" + profile,
                         "--enable-logging=stderr", "--v=0", "--window-size=1600,1200", "--virtual-time-budget=10000",
                         "--dump-dom", "file://" + probe_page], capture_output=True, text=True, timeout=180)
finally:
    shutil.rmtree(profile, ignore_errors=True)
pm = re.search(r'<pre id="striae-probe">(.*?)</pre>', br.stdout, re.S)
check(pm is not None, "chromium loaded the page and the probe ran")
if pm:
    r = json.loads(pm.group(1).replace("&quot;", '"').replace("&amp;", "&").replace("&lt;", "<").replace("&gt;", ">"))
    check(r["errors"] == [], "no script error, console error or failed load: %s" % r["errors"][:5])
    check(r["images"] == len(srcs) and r["bad_images"] == [],
          "all %d images loaded%s" % (r["images"], (": not " + ", ".join(r["bad_images"][:5])) if r["bad_images"] else ""))
    check(r.get("map", [0, 0])[0] >= 500 and r.get("map", [0, 0])[1] >= 400, "the map is drawn at its size %s" % r.get("map"))
    check(r.get("domains") == len(domains), "the map has one SHmax symbol per domain (%s)" % r.get("domains"))
    check(r.get("events") == len(events), "the map has one focal-sphere diagram per mechanism (%s)" % r.get("events"))
    check(r["outside"] == [], "every map symbol lies inside the map: %s" % r["outside"][:5])
console = [ln for ln in br.stderr.splitlines() if ":CONSOLE" in ln]
check(console == [], "chromium's console log is empty%s" % (": " + console[0] if console else ""))

shutil.rmtree(work, ignore_errors=True)
print("check_demo_page: %d failure(s)" % len(failures))
sys.exit(1 if failures else 0)
