"""Figures rendered by a real browser: Debian's chromium, headless, turns
striae's SVG documents into PNG, and the pixels are sampled where the geometry
says what must be drawn. Every document is also parsed as XML (Python's
xml.etree) and its structure checked: root size, one <path> per drawn datum,
legend text.

Expected positions come from the projection formulas of Snyder (1987, USGS
Professional Paper 1395; polar Lambert azimuthal equal-area r = sqrt(2)
sin(chi/2), polar stereographic r = tan(chi/2), chi the angle from the nadir),
written here independently of striae, and from the conventions of Aki &
Richards (1980): a pure thrust (0/45/90) has T vertical, so the centre of its
focal-sphere diagram lies in a quadrant of compressional first motion (filled);
a pure normal fault (0/45/-90) has P vertical (centre empty); a vertical
strike-slip fault (0/90/0) has T at 225/00 and P at 315/00, so the four
quadrants alternate filled (NE, SW) and empty (SE, NW) around the centre
(derived from Aki & Richards conventions, METHODS.md section 2).
"""
import math
import os
import shutil
import subprocess
import sys
import tempfile
import xml.etree.ElementTree as ET

from PIL import Image

from pgconn import fresh_db

NS = {"s": "http://www.w3.org/2000/svg"}
BLUE = (0x00, 0x72, 0xB2)  # first data colour (Okabe & Ito 2008)
WHITE = (255, 255, 255)
failures = []
work = tempfile.mkdtemp(prefix="striae-fig-")


def check(ok, what):
    print(("ok   " if ok else "FAIL ") + what)
    if not ok:
        failures.append(what)


def render(name, sql):
    """Run sql (one text value, an SVG document), parse it, screenshot it."""
    svg = subprocess.run(["psql", "-X", "-q", "-At", "-v", "ON_ERROR_STOP=1", "-d", "striae_external", "-c", sql],
                         check=True, capture_output=True, text=True).stdout
    svg = svg[:-1] if svg.endswith("\n") else svg
    path = os.path.join(work, name + ".svg")
    with open(path, "w") as f:
        f.write(svg)
    root = ET.fromstring(svg.encode())
    w, h = float(root.get("width")), float(root.get("height"))
    check(root.tag == "{http://www.w3.org/2000/svg}svg" and root.get("version") == "1.1"
          and root.get("viewBox") == "0 0 %s %s" % (root.get("width"), root.get("height")),
          "%s: SVG 1.1 root with its size as the viewBox" % name)
    check(root.find("s:title", NS) is not None and root.find("s:desc", NS) is not None, "%s: title and desc" % name)
    prim = root.find(".//s:circle[@id='primitive']", NS)
    cx, cy, r = (float(prim.get(k)) for k in ("cx", "cy", "r"))
    png = os.path.join(work, name + ".png")
    profile = tempfile.mkdtemp(prefix="striae-chromium-")
    try:
        subprocess.run(["chromium", "--headless", "--no-sandbox", "--disable-gpu", "--disable-background-networking",
                        "--disable-component-update", "--disable-sync", "--no-first-run", "--hide-scrollbars",
                        "--user-data-dir=" + profile, "--screenshot=" + png,
                        "--window-size=%d,%d" % (math.ceil(w), math.ceil(h)), "file://" + path],
                       check=True, capture_output=True, timeout=180)
    finally:
        shutil.rmtree(profile, ignore_errors=True)
    img = Image.open(png).convert("RGB")
    check(img.size == (math.ceil(w), math.ceil(h)), "%s: rendered at the document's size %s" % (name, img.size))
    return root, img, (cx, cy, r)


def near(c, ref, tol=40):
    return all(abs(a - b) <= tol for a, b in zip(c, ref))


def pixel(img, x, y):
    return img.getpixel((int(round(x)), int(round(y))))


def unit(trend, plunge):
    t, p = math.radians(trend), math.radians(plunge)
    return (math.cos(p) * math.cos(t), math.cos(p) * math.sin(t), math.sin(p))


def snyder(v, proj):
    """Disc position (x east, y north) of a lower-hemisphere unit vector (N, E, D)."""
    n, e, d = v
    if d < 0:
        n, e, d = -n, -e, -d
    chi = math.acos(max(-1.0, min(1.0, d)))
    r = math.sqrt(2) * math.sin(chi / 2) if proj == "equal-area" else math.tan(chi / 2)
    h = math.hypot(n, e)
    return (0.0, 0.0) if h == 0 else (r * e / h, r * n / h)


def at(frame, xy):
    cx, cy, r = frame
    return cx + r * xy[0], cy - r * xy[1]


fresh_db()

# Focal-sphere diagrams: what must be filled where.
for name, mech, expect_centre in (("thrust", "0/45/90", True), ("normal", "0/45/-90", False)):
    root, img, fr = render(name, "SELECT net_svg(net_mechanism('%s'), legend => false)" % mech)
    cx, cy, r = fr
    c = pixel(img, cx + 0.12 * r, cy + 0.12 * r)  # beside the letter at the centre
    check(near(c, BLUE if expect_centre else WHITE), "%s %s: centre %s (pixel %s)" % (name, mech, "filled" if expect_centre else "empty", c))
    check(len(root.findall(".//s:g[@class='mechanism']/s:path[@class='compressional']", NS)) == 1, "%s: one path of quadrants" % name)

root, img, fr = render("strike_slip", "SELECT net_svg(net_mechanism('0/90/0'), size => 300, legend => false)")
cx, cy, r = fr
d = 0.5 * r / math.sqrt(2)
quad = {"NE": pixel(img, cx + d, cy - d), "SE": pixel(img, cx + d, cy + d), "SW": pixel(img, cx - d, cy + d), "NW": pixel(img, cx - d, cy - d)}
check(near(quad["NE"], BLUE) and near(quad["SW"], BLUE) and near(quad["SE"], WHITE) and near(quad["NW"], WHITE),
      "strike-slip 0/90/0 alternates around its centre: %s" % quad)

# A pole lands at its projected pixel, in both projections; nothing at the mirrored place.
for proj in ("equal-area", "equal-angle"):
    root, img, fr = render("pole_" + proj, "SELECT net_svg(net_poles(p), projection => '%s', legend => false) FROM (VALUES ('120/50'::plane)) t(p)" % proj)
    xy = snyder(unit(30, 40), proj)  # pole of 120/50 is 030/40
    x, y = at(fr, xy)
    check(near(pixel(img, x, y), BLUE), "pole 030/40 (%s) at pixel (%.1f, %.1f): %s" % (proj, x, y, pixel(img, x, y)))
    mx, my = at(fr, (-xy[0], -xy[1]))
    check(near(pixel(img, mx, my), WHITE, 5), "nothing at the mirrored pixel (%.1f, %.1f)" % (mx, my))
    check(len(root.findall(".//s:g[@class='poles']/s:path", NS)) == 1, "one path for one pole")

# Planes dipping east are drawn in the east half; their poles opposite, in the west.
# The great circle of 030/50 passes through the line 45 degrees from its strike
# in the plane: cos 45 s + sin 45 d with s the strike and d the down-dip unit
# vectors (Aki & Richards conventions, METHODS.md section 1; trend 062.7,
# plunge 32.8).


def inked(img, x, y, rad=2):
    return any(min(img.getpixel((int(round(x)) + i, int(round(y)) + j))) < 200
               for i in range(-rad, rad + 1) for j in range(-rad, rad + 1))


for proj in ("equal-area", "equal-angle"):
    root, img, fr = render("east_dip_" + proj, "SELECT net_svg(net_great_circles(p) || net_poles(p), projection => '%s', size => 600, legend => false) FROM (VALUES ('0/60'::plane), ('30/50')) t(p)" % proj)
    x, y = at(fr, snyder(unit(90, 60), proj))
    check(inked(img, x, y), "%s: great circle of 0/60 passes through 090/60 in the east half" % proj)
    x, y = at(fr, snyder(unit(270, 60), proj))
    check(not inked(img, x, y), "%s: and not through 270/60 in the west half" % proj)
    x, y = at(fr, snyder(unit(270, 30), proj))
    check(near(pixel(img, x, y), (0xD5, 0x5E, 0x00)), "%s: pole of 0/60 at 270/30, opposite the dip direction (second colour)" % proj)
    sv, dv = unit(30, 0), unit(120, 50)
    v = tuple(math.sqrt(0.5) * (sv[i] + dv[i]) for i in range(3))
    x, y = at(fr, snyder(v, proj))
    check(inked(img, x, y, 1), "%s: great circle of 030/50 passes through the line 45 degrees along it" % proj)

# A cone is centred at its axis: inside at 12 degrees from the axis all round, outside at 18.
root, img, fr = render("cone", "SELECT net_svg(net_cone('120/50', 15), legend => false)")
a = unit(120, 50)
ref = (0.0, 0.0, 1.0)
e1 = (a[1] * ref[2] - a[2] * ref[1], a[2] * ref[0] - a[0] * ref[2], a[0] * ref[1] - a[1] * ref[0])
l1 = math.sqrt(sum(c * c for c in e1))
e1 = tuple(c / l1 for c in e1)
e2 = (a[1] * e1[2] - a[2] * e1[1], a[2] * e1[0] - a[0] * e1[2], a[0] * e1[1] - a[1] * e1[0])
inside_ok = outside_ok = True
for k in range(12):
    phi = 2 * math.pi * k / 12
    for ang, want_in in ((12, True), (18, False)):
        c, s = math.cos(math.radians(ang)), math.sin(math.radians(ang))
        v = tuple(c * a[i] + s * (math.cos(phi) * e1[i] + math.sin(phi) * e2[i]) for i in range(3))
        px = pixel(img, *at(fr, snyder(v, "equal-area")))
        tinted = px[0] < 235 and px[2] > px[0]
        if want_in and not tinted:
            inside_ok = False
        if not want_in and not near(px, WHITE, 6):
            outside_ok = False
check(inside_ok, "cone 120/50 of 15 degrees: filled 12 degrees from its axis all round")
check(outside_ok, "cone 120/50 of 15 degrees: empty 18 degrees from its axis all round")

# A full figure: one path per datum in each layer, legend lines present.
root, img, fr = render("site", """
  SELECT net_svg(net_label(net_faults(f), 'faults') || net_poles(fault_plane(f)) || net_pt_axes(f)
                 || net_stress(stress_tensor('105/06', '285/84', 0.4)), title => 'site', graticule => true)
    FROM (SELECT fault_slip((i * 37) % 360, 10 + (i * 13) % 80, ((i * 53) % 360) - 180) f FROM generate_series(1, 25) i) s""")
counts = {cls: len(root.findall(".//s:g[@class='%s']/s:path" % cls, NS)) for cls in ("slip_planes", "poles", "p_axes", "t_axes")}
check(all(v == 25 for v in counts.values()), "one path per datum in every layer: %s" % counts)
legend = [t.text for t in root.findall(".//s:g[@id='legend']/s:text", NS)]
check(any(t.startswith("faults: n = 25") for t in legend) and any("\u03c31 105/06" in t for t in legend)
      and any(t.startswith("T axes") for t in legend), "legend lines: %s" % legend)
check(root.find(".//s:path[@id='graticule']", NS) is not None, "graticule drawn on request")

shutil.rmtree(work, ignore_errors=True)
if failures:
    print("%d browser check(s) failed" % len(failures))
    sys.exit(1)
