"""The results page of a per-domain stress analysis: one self-contained index.html.

Used by the demo (demo/page.py) and by scripts/analyse-csv.sh (analyse_csv.py). The
page holds a district map drawn here as inline SVG from longitudes and latitudes
(stations, SHmax bars coloured by regime, focal-sphere diagrams at the epicentres),
beside one section per group (site) with its result table and its figures. CSS only:
no JavaScript, no external resource, so it works offline from the file system. The
figures and the focal-sphere diagrams are striae's own SVG documents (net_svg); a
diagram is inlined in the map by keeping its disc (quadrants, nodal planes, primitive)
and dropping its text.

Python standard library only. Everything a page shows comes from the manifest (a dict,
see render()); nothing is computed here but the map's layout.
"""
import html
import math
import os
import re
import xml.etree.ElementTree as ET

SVG_NS = "http://www.w3.org/2000/svg"
ET.register_namespace("", SVG_NS)

# Regime colours, from the palette of Okabe & Ito (2008) that the figures use: warm for
# shortening, cool for extension, purple for the strike-slip regime between them
# (striae's own choice). Order: A-phi from 3 (thrust) down to 0 (normal).
REGIMES = [
    ("thrust", "#D55E00"),
    ("thrust-strike-slip", "#E69F00"),
    ("strike-slip", "#CC79A7"),
    ("normal-strike-slip", "#009E73"),
    ("normal", "#56B4E9"),
    ("unclassified", "#000000"),
]
REGIME_COLOUR = dict(REGIMES)
INK = "#222222"
MUTED = "#6b6b6b"

MAP_W, MAP_H = 600, 490       # map size in CSS pixels
MAP_PAD = 34                  # room for the frame's tick labels
BAR_PX = 46                   # length of an SHmax bar
GLYPH_PX = 16                 # diameter of a focal-sphere diagram on the map
STATION_SHAPES = ["circle", "square", "diamond", "triangle"]


def esc(x):
    return html.escape("" if x is None else str(x), quote=True)


def num(v):
    """A number from a CSV or JSON value; None for empty or missing."""
    if v is None or v == "":
        return None
    try:
        x = float(v)
    except (TypeError, ValueError):
        return None
    return x if math.isfinite(x) else None


# ---- formatting of result values -------------------------------------------------------

def fmt_axis(d, k):
    """sigma k as trend/plunge (three and two digits), with its cone when there is one."""
    t, p, c = num(d.get(f"sigma{k}_trend")), num(d.get(f"sigma{k}_plunge")), num(d.get(f"sigma{k}_cone95"))
    if t is None or p is None:
        return ""
    s = f"{round(t) % 360:03d}/{round(p):02d}"
    return s + (f" &plusmn;{c:.0f}&deg;" if c is not None else "")


def fmt_phi(d):
    phi, lo, hi = num(d.get("shape_ratio")), num(d.get("shape_ratio_low")), num(d.get("shape_ratio_high"))
    if phi is None:
        return ""
    return f"{phi:.2f}" + (f" [{lo:.2f}, {hi:.2f}]" if lo is not None and hi is not None else "")


def fmt_num(v, digits=0, unit=""):
    x = num(v)
    return "" if x is None else f"{x:.{digits}f}{unit}"


def fmt_regime(d):
    r = d.get("regime") or ""
    if not r:
        return ""
    return f'<span class="swatch" style="background:{REGIME_COLOUR.get(r, "#000")}"></span>{esc(r)}'


# The columns of every result table on the page. sigma2 is in the CSV and the GeoJSON;
# the page leaves it out so that a table fits beside the map.
STANDARD_COLUMNS = [
    ("domain", "#", lambda d: esc(d.get("domain"))),
    ("n", "n", lambda d: esc(d.get("n"))),
    ("sigma1", "&sigma;1 &plusmn;&nbsp;95&nbsp;% cone", lambda d: fmt_axis(d, 1)),
    ("sigma3", "&sigma;3", lambda d: fmt_axis(d, 3)),
    ("phi", "&Phi; [95&nbsp;%]", fmt_phi),
    ("shmax", "SHmax", lambda d: fmt_num(d.get("shmax_azimuth"), 0, "&deg;")),
    ("regime", "regime", fmt_regime),
    ("a_phi", "A&phi;", lambda d: fmt_num(d.get("regime_index"), 2)),
    ("misfit", "mean misfit", lambda d: fmt_num(d.get("mean_misfit"), 1, "&deg;")),
]


# ---- the map -----------------------------------------------------------------------------

class MapFrame:
    """Local equirectangular projection about the mean latitude of the points, fitted
    into the map: x = (lon - lon0) cos(lat0), y = lat, in degrees of latitude, so
    directions and distances are true at lat0 and close to it across a district.
    Longitudes are unwrapped about lon0, so a district across the antimeridian is whole."""

    def __init__(self, points):
        pts = [(lon, lat) for lon, lat in points if lon is not None and lat is not None]
        self.ok = bool(pts)
        if not self.ok:
            return
        # circular mean of the longitudes, then unwrap about it
        sx = sum(math.cos(math.radians(lo)) for lo, _ in pts)
        sy = sum(math.sin(math.radians(lo)) for lo, _ in pts)
        self.lon0 = math.degrees(math.atan2(sy, sx)) if (sx or sy) else pts[0][0]
        self.lat0 = sum(la for _, la in pts) / len(pts)
        self.k = math.cos(math.radians(self.lat0))
        xs = [self.unwrap(lo) * self.k for lo, _ in pts]
        ys = [la for _, la in pts]
        x0, x1, y0, y1 = min(xs), max(xs), min(ys), max(ys)
        # at least 2 km across, and a margin of 8 % so symbols stay inside
        min_span = 2.0 / 111.195
        cx, cy = (x0 + x1) / 2, (y0 + y1) / 2
        sx_, sy_ = max(x1 - x0, min_span) * 1.16, max(y1 - y0, min_span) * 1.16
        w, h = MAP_W - 2 * MAP_PAD, MAP_H - 2 * MAP_PAD
        self.scale = min(w / sx_, h / sy_)            # pixels per degree of latitude
        self.cx, self.cy = cx, cy

    def unwrap(self, lon):
        return (lon - self.lon0 + 540.0) % 360.0 - 180.0

    def xy(self, lon, lat):
        x = self.unwrap(lon) * self.k
        return (MAP_W / 2 + (x - self.cx) * self.scale, MAP_H / 2 - (lat - self.cy) * self.scale)

    def lonlat(self, px, py):
        x = (px - MAP_W / 2) / self.scale + self.cx
        lat = self.cy - (py - MAP_H / 2) / self.scale
        lon = (x / self.k + self.lon0 + 540.0) % 360.0 - 180.0
        return lon, lat

    def km_per_px(self):
        return 111.195 / self.scale


def nice_step(span, target):
    """A round step (1, 2, 2.5, 5 times a power of ten) giving about `target` steps."""
    raw = span / max(target, 1)
    p = 10 ** math.floor(math.log10(raw))
    for m in (1, 2, 2.5, 5, 10):
        if m * p >= raw:
            return m * p
    return 10 * p


def fmt_deg(v, pos, neg, step):
    digits = max(0, -math.floor(math.log10(step) + 1e-9)) if step < 1 else 0
    if step < 1 and abs(step * 10 ** digits - round(step * 10 ** digits)) > 1e-9:
        digits += 1
    return f"{abs(v):.{digits}f}°{pos if v >= 0 else neg}"


def f2(x):
    return f"{x:.2f}".rstrip("0").rstrip(".")


def glyph_svg(path, key, x, y, size, title):
    """A focal-sphere diagram written by net_svg, reduced to its disc and nested at (x, y).

    Keeps the mechanism layer and the primitive circle; drops title, desc, text, legend,
    frame ticks and the background, crops the view box to the disc, thickens the lines so
    they show at map size, and prefixes every id (and every reference to one) with key so
    that many diagrams can share one page."""
    root = ET.parse(path).getroot()
    prim = root.find(f".//{{{SVG_NS}}}circle[@id='primitive']")
    if prim is None:
        raise ValueError(f"{path}: no primitive circle (not a striae net)")
    cx, cy, r = (float(prim.get(a)) for a in ("cx", "cy", "r"))
    for parent in list(root.iter()):
        for child in list(parent):
            tag = child.tag.split("}")[-1]
            drop = tag in ("title", "desc", "text", "rect") or child.get("id") in ("legend", "north", "title")
            if parent.get("id") == "frame" and child is not prim:
                drop = True
            if drop:
                parent.remove(child)
    line = r * 2 / size        # one CSS pixel in the document's units
    for el in root.iter():
        if el.get("class") == "nodal_planes":
            el.set("stroke-width", f2(0.7 * line))
    frame = root.find(f".//{{{SVG_NS}}}g[@id='frame']")
    if frame is not None:
        frame.set("stroke-width", f2(0.9 * line))
    m = 0.6 * line
    root.set("viewBox", f"{f2(cx - r - m)} {f2(cy - r - m)} {f2(2 * (r + m))} {f2(2 * (r + m))}")
    root.set("x", f2(x - size / 2))
    root.set("y", f2(y - size / 2))
    root.set("width", f2(size))
    root.set("height", f2(size))
    root.attrib.pop("version", None)
    text = ET.tostring(root, encoding="unicode")
    text = re.sub(r'\bid="([^"]+)"', lambda mm: f'id="{key}-{mm.group(1)}"', text)
    text = re.sub(r"url\(#([^)]+)\)", lambda mm: f"url(#{key}-{mm.group(1)})", text)
    text = re.sub(r'href="#([^"]+)"', lambda mm: f'href="#{key}-{mm.group(1)}"', text)
    return f'<g class="event" data-event="{esc(key)}"><title>{esc(title)}</title>{text}</g>'


def station_mark(shape, x, y, r=2.6):
    if shape == "square":
        return f'<rect x="{f2(x - r * 0.85)}" y="{f2(y - r * 0.85)}" width="{f2(r * 1.7)}" height="{f2(r * 1.7)}"/>'
    if shape == "diamond":
        return f'<path d="M{f2(x)} {f2(y - r * 1.15)}L{f2(x + r * 1.15)} {f2(y)}L{f2(x)} {f2(y + r * 1.15)}L{f2(x - r * 1.15)} {f2(y)}Z"/>'
    if shape == "triangle":
        return f'<path d="M{f2(x)} {f2(y - r * 1.2)}L{f2(x + r * 1.1)} {f2(y + r * 0.8)}L{f2(x - r * 1.1)} {f2(y + r * 0.8)}Z"/>'
    return f'<circle cx="{f2(x)}" cy="{f2(y)}" r="{f2(r)}"/>'


BAR_STYLES = {
    # name: (description used when the caller gives none, SVG of a bar from (x1, y1) to (x2, y2) in colour c)
    "solid": lambda c, a, b: (f'<line {a} {b} stroke="#ffffff" stroke-width="7" stroke-linecap="round"/>'
                              f'<line {a} {b} stroke="{c}" stroke-width="4.5" stroke-linecap="round"/>'),
    "dashed": lambda c, a, b: (f'<line {a} {b} stroke="#ffffff" stroke-width="6" stroke-linecap="butt"/>'
                               f'<line {a} {b} stroke="{c}" stroke-width="3.5" stroke-dasharray="5 2.5" stroke-linecap="butt"/>'),
    "open": lambda c, a, b: (f'<line {a} {b} stroke="{INK}" stroke-width="7" stroke-linecap="round"/>'
                             f'<line {a} {b} stroke="{c}" stroke-width="5" stroke-linecap="round"/>'
                             f'<line {a} {b} stroke="#ffffff" stroke-width="1.6" stroke-linecap="round"/>'),
}


def bar(style, colour, x, y, azimuth, length=BAR_PX):
    """An SHmax bar centred on (x, y) along the azimuth (clockwise from north)."""
    a = math.radians(azimuth)
    dx, dy = math.sin(a) * length / 2, -math.cos(a) * length / 2
    p1 = f'x1="{f2(x - dx)}" y1="{f2(y - dy)}"'
    p2 = f'x2="{f2(x + dx)}" y2="{f2(y + dy)}"'
    return BAR_STYLES[style](colour, p1, p2)


def draw_map(m, out_dir):
    """The district map as an inline <svg>, or a note when nothing has coordinates."""
    domains, events, stations, places = m.get("domains", []), m.get("events", []), m.get("stations", []), m.get("places", [])
    pts = [(num(d.get("lon")), num(d.get("lat"))) for d in domains]
    pts += [(num(e.get("lon")), num(e.get("lat"))) for e in events]
    pts += [(num(s.get("lon")), num(s.get("lat"))) for s in stations]
    pts += [(num(p.get("lon")), num(p.get("lat"))) for p in places]
    fr = MapFrame(pts)
    if not fr.ok:
        return '<p class="note" id="no-map">No longitude and latitude in the data: no map.</p>'
    o = [f'<svg id="district-map" xmlns="{SVG_NS}" width="{MAP_W}" height="{MAP_H}" viewBox="0 0 {MAP_W} {MAP_H}" '
         f'role="img" aria-label="{esc(m.get("map_title", "map"))}" font-family="DejaVu Sans, Verdana, Arial, sans-serif" font-size="10">',
         f'<title>{esc(m.get("map_title", "map"))}</title>',
         f'<defs><clipPath id="map-clip"><rect x="{MAP_PAD}" y="{MAP_PAD}" width="{MAP_W - 2 * MAP_PAD}" height="{MAP_H - 2 * MAP_PAD}"/></clipPath></defs>',
         f'<rect x="0" y="0" width="{MAP_W}" height="{MAP_H}" fill="#ffffff"/>',
         f'<rect x="{MAP_PAD}" y="{MAP_PAD}" width="{MAP_W - 2 * MAP_PAD}" height="{MAP_H - 2 * MAP_PAD}" fill="#f7f5f0"/>']
    # graticule and its labels on the frame
    lon_a, lat_a = fr.lonlat(MAP_PAD, MAP_H - MAP_PAD)
    lon_b, lat_b = fr.lonlat(MAP_W - MAP_PAD, MAP_PAD)
    lon_span = (lon_b - lon_a) % 360.0
    lat_step = nice_step(lat_b - lat_a, 5)
    lon_step = nice_step(lon_span, 5)
    g = ['<g id="graticule" stroke="#d9d4c7" stroke-width="0.6" fill="none" clip-path="url(#map-clip)">']
    labels = [f'<g id="graticule-labels" fill="{MUTED}" font-size="9">']
    v = math.ceil(lat_a / lat_step) * lat_step
    while v <= lat_b + 1e-12:
        _, y = fr.xy(fr.lon0, v)
        g.append(f'<path d="M{MAP_PAD} {f2(y)}H{MAP_W - MAP_PAD}"/>')
        labels.append(f'<text x="{MAP_PAD - 3}" y="{f2(y + 3)}" text-anchor="end">{fmt_deg(v, "N", "S", lat_step)}</text>')
        v += lat_step
    v = math.ceil(lon_a / lon_step) * lon_step
    for _ in range(200):
        if (v - lon_a) % 360.0 > lon_span + 1e-12:
            break
        x, _ = fr.xy(v, fr.lat0)
        g.append(f'<path d="M{f2(x)} {MAP_PAD}V{MAP_H - MAP_PAD}"/>')
        w = (v + 540.0) % 360.0 - 180.0
        labels.append(f'<text x="{f2(x)}" y="{MAP_H - MAP_PAD + 12}" text-anchor="middle">{fmt_deg(w, "E", "W", lon_step)}</text>')
        v += lon_step
    g.append("</g>")
    labels.append("</g>")
    o += g
    # stations (small grey marks, one shape per class)
    classes = m.get("station_classes", [])
    o.append(f'<g id="stations" fill="#bdb6a6" stroke="#6f6856" stroke-width="0.5" clip-path="url(#map-clip)">')
    for s in stations:
        lon, lat = num(s.get("lon")), num(s.get("lat"))
        if lon is None or lat is None:
            continue
        x, y = fr.xy(lon, lat)
        o.append(station_mark(STATION_SHAPES[int(s.get("class", 0)) % len(STATION_SHAPES)], x, y))
    o.append("</g>")
    # focal-sphere diagrams at the epicentres
    o.append('<g id="events" clip-path="url(#map-clip)">')
    for e in events:
        lon, lat = num(e.get("lon")), num(e.get("lat"))
        if lon is None or lat is None or not e.get("glyph"):
            continue
        x, y = fr.xy(lon, lat)
        o.append(glyph_svg(os.path.join(out_dir, e["glyph"]), e["id"], x, y, GLYPH_PX, e.get("title", e["id"])))
    o.append("</g>")
    # SHmax bars by domain
    o.append('<g id="domains">')
    for d in domains:
        lon, lat = num(d.get("lon")), num(d.get("lat"))
        if lon is None or lat is None:
            continue
        x, y = fr.xy(lon, lat)
        az, regime = num(d.get("shmax_azimuth")), d.get("regime") or ""
        colour = REGIME_COLOUR.get(regime, "#000000")
        title = esc(d.get("_title", ""))
        o.append(f'<g class="domain" data-domain="{esc(d.get("domain"))}"><title>{title}</title>')
        if az is not None:
            o.append(bar(d.get("_style", "solid"), colour, x, y, az))
            o.append(f'<circle cx="{f2(x)}" cy="{f2(y)}" r="1.6" fill="{INK}"/>')
        elif regime:
            # SHmax undefined: the horizontal stress is isotropic
            o.append(f'<circle cx="{f2(x)}" cy="{f2(y)}" r="6" fill="#ffffff" stroke="{colour}" stroke-width="3"/>')
        else:
            # no result (too few data)
            o.append(f'<path d="M{f2(x - 4)} {f2(y - 4)}l8 8m0 -8l-8 8" stroke="{MUTED}" stroke-width="1.6"/>')
        o.append("</g>")
    o.append("</g>")
    # place labels, linked to their sections
    o.append(f'<g id="places" font-weight="bold" fill="{INK}" stroke="#ffffff" stroke-width="3" paint-order="stroke" clip-path="url(#map-clip)">')
    for p in places:
        lon, lat = num(p.get("lon")), num(p.get("lat"))
        if lon is None or lat is None:
            continue
        x, y = fr.xy(lon, lat)
        a = f'<a href="#{esc(p["anchor"])}">' if p.get("anchor") else "<a>"
        # below and to the left of the point (bars are centred on points, so a label
        # there covers the least of them), to the right where the frame is near
        left = x - 8 - 6.5 * len(p["name"]) > MAP_PAD
        tx, anchor = (x - 8, "end") if left else (x + 8, "start")
        ty = min(y + 24, MAP_H - MAP_PAD - 4)
        o.append(f'{a}<text x="{f2(tx)}" y="{f2(ty)}" text-anchor="{anchor}">{esc(p["name"])}</text></a>')
    o.append("</g>")
    o += labels
    # frame, north arrow, scale bar
    o.append(f'<rect x="{MAP_PAD}" y="{MAP_PAD}" width="{MAP_W - 2 * MAP_PAD}" height="{MAP_H - 2 * MAP_PAD}" fill="none" stroke="{INK}" stroke-width="1"/>')
    nx, ny = MAP_W - MAP_PAD - 18, MAP_PAD + 12
    o.append(f'<g id="north-arrow"><path d="M{nx} {ny}l-6 20l6 -5l6 5z" fill="{INK}"/>'
             f'<text x="{nx}" y="{ny + 32}" text-anchor="middle" font-weight="bold">N</text></g>')
    kmpp = fr.km_per_px()
    km = nice_step(kmpp * (MAP_W - 2 * MAP_PAD) / 4, 1)
    px = km / kmpp
    sx, sy = MAP_PAD + 12, MAP_H - MAP_PAD - 14
    km_txt = f"{km:g} km"
    o.append(f'<g id="scale-bar"><rect x="{f2(sx - 4)}" y="{f2(sy - 14)}" width="{f2(px + 8 + 7 * len(km_txt))}" height="20" fill="#ffffff" fill-opacity="0.8"/>'
             f'<path d="M{f2(sx)} {f2(sy - 4)}v4h{f2(px)}v-4" fill="none" stroke="{INK}" stroke-width="1.4"/>'
             f'<text x="{f2(sx + px + 4)}" y="{f2(sy)}">{km_txt}</text></g>')
    o.append("</svg>")
    return "\n".join(o)


def legend(m):
    """The map's key: regime colours, bar styles, stations, focal-sphere diagrams."""
    used = {d.get("regime") for d in m.get("domains", []) if d.get("regime")}
    rows = ['<ul class="key">']
    for name, colour in REGIMES:
        cls = "" if name in used else ' class="unused"'
        rows.append(f'<li{cls}><svg width="34" height="12" aria-hidden="true"><line x1="3" y1="6" x2="31" y2="6" stroke="{colour}" stroke-width="4.5" stroke-linecap="round"/></svg>{esc(name)}</li>')
    rows.append("</ul><ul class=\"key\">")
    for style, text in m.get("bar_styles", [("solid", "SHmax of a domain")]):
        rows.append(f'<li><svg width="34" height="12" aria-hidden="true">{bar(style, "#8a8a8a", 17, 6, 90, 28)}</svg>{esc(text)}</li>')
    for i, text in enumerate(m.get("station_classes", [])):
        shape = STATION_SHAPES[i % len(STATION_SHAPES)]
        rows.append(f'<li><svg width="34" height="12" aria-hidden="true"><g fill="#bdb6a6" stroke="#6f6856" stroke-width="0.5">{station_mark(shape, 17, 6, 3.2)}</g></svg>{esc(text)}</li>')
    if m.get("events"):
        rows.append(f'<li><svg width="34" height="14" aria-hidden="true"><circle cx="17" cy="7" r="6" fill="#ffffff" stroke="{INK}"/>'
                    f'<path d="M17 1a6 6 0 0 1 0 12z" fill="#0072B2"/></svg>focal mechanism at its epicentre '
                    '(lower hemisphere, quadrants of compressional first motion filled)</li>')
    rows.append("</ul>")
    return "\n".join(rows)


def domain_table(rows, label_cols, extra_cols, table_id=None):
    cols = STANDARD_COLUMNS[:1] + label_cols + STANDARD_COLUMNS[1:] + extra_cols
    ident = f' id="{esc(table_id)}"' if table_id else ""
    out = [f'<div class="table-wrap"><table class="domains"{ident}><thead><tr>']
    out += [f"<th>{h}</th>" for _, h, _ in cols]
    out.append("</tr></thead><tbody>")
    for d in rows:
        out.append(f'<tr data-domain="{esc(d.get("domain"))}">' + "".join(f"<td>{f(d)}</td>" for _, _, f in cols) + "</tr>")
    out.append("</tbody></table></div>")
    return "\n".join(out)


CSS = """
:root { --ink: #222222; --muted: #6b6b6b; --rule: #d9d4c7; --paper: #ffffff; --tint: #f7f5f0; --accent: #0072B2; }
* { box-sizing: border-box; }
body { margin: 0; color: var(--ink); background: var(--paper);
       font: 14px/1.45 "DejaVu Sans", Verdana, Arial, sans-serif; }
header { padding: 18px 28px 10px; border-bottom: 3px solid var(--accent); }
header h1 { margin: 0 0 4px; font-size: 22px; }
header p { margin: 4px 0; max-width: 100ch; }
.caution { margin: 10px 0 4px; padding: 8px 12px; background: #fff4e0; border-left: 4px solid #E69F00; max-width: 110ch; }
.files { font-size: 13px; color: var(--muted); }
.files a { color: var(--accent); }
main { display: grid; grid-template-columns: 616px minmax(0, 1fr); gap: 24px; padding: 16px 28px 40px; }
#map-column { position: sticky; top: 8px; align-self: start; }
#map-column h2, section h2 { font-size: 17px; margin: 6px 0 8px; }
ul.key { list-style: none; padding: 0; margin: 6px 0; display: flex; flex-wrap: wrap; gap: 2px 14px; font-size: 12px; }
ul.key li { display: flex; align-items: center; gap: 4px; }
ul.key li.unused { color: #aaaaaa; }
.note { color: var(--muted); font-size: 12.5px; max-width: 640px; }
section.group { border-top: 1px solid var(--rule); padding-top: 10px; margin-bottom: 26px; }
section.group h2 small { font-weight: normal; color: var(--muted); font-size: 13px; }
.table-wrap { overflow-x: auto; }
table.domains { border-collapse: collapse; font-size: 12px; margin: 4px 0 12px; }
table.domains th { text-align: left; vertical-align: bottom; font-weight: bold; border-bottom: 1.5px solid var(--ink); padding: 3px 7px 3px 0; }
table.domains td { border-bottom: 1px solid var(--rule); padding: 3px 7px 3px 0; white-space: nowrap; font-variant-numeric: tabular-nums; }
.swatch { display: inline-block; width: 10px; height: 10px; margin-right: 4px; vertical-align: -1px; border: 0.5px solid #444; }
.figures { display: grid; grid-template-columns: repeat(auto-fill, minmax(300px, 1fr)); gap: 10px 14px; }
.figures figure { margin: 0; }
.figures img { width: 100%; height: auto; border: 1px solid var(--rule); background: #fff; }
figcaption { font-size: 12px; color: var(--muted); }
.thumbs { display: flex; flex-wrap: wrap; gap: 4px; margin-top: 8px; }
.thumbs img { width: 92px; height: auto; border: 1px solid var(--rule); }
h3 { font-size: 14px; margin: 12px 0 4px; }
@media (max-width: 1400px) { main { grid-template-columns: minmax(0, 1fr); } #map-column { position: static; } }
"""


def render(m, out_dir):
    """The page as text. m, the manifest:

    title, intro (paragraphs, HTML allowed: the caller's own text), caution (text),
    files ([(relative path, description)]), summary (lines of text),
    domains (dicts: domain, lon, lat, the result columns of domain_result, and _title (a
      tooltip), _style (solid, dashed or open bar), _group (the section it belongs to)),
    label_columns ([(key, header)]: columns shown before the standard ones),
    extra_columns ([(key, header)]: shown after; values HTML-escaped, or with a third
      element True the caller's own HTML),
    bar_styles ([(style, text)] for the key), station_classes ([text]),
    stations ([{lon, lat, class}]), events ([{id, lon, lat, glyph (path of a net_svg
      focal-sphere document relative to out_dir), title}]),
    places ([{name, lon, lat, anchor}]),
    groups ([{name, anchor, subtitle, figures: [(src, caption)], thumbs: [(src, caption)],
      note}]): one section each, with the domains whose _group is its name.
    """
    def cols(spec):
        # (key, header) or (key, header, True) for a value that is the caller's own HTML
        return [(c[0], esc(c[1]), (lambda kk, raw: (lambda d: (d.get(kk) or "") if raw else esc(d.get(kk))))(c[0], len(c) > 2 and c[2]))
                for c in spec]

    label_cols, extra_cols = cols(m.get("label_columns", [])), cols(m.get("extra_columns", []))
    p = ["<!DOCTYPE html>", '<html lang="en">', "<head>", '<meta charset="utf-8">',
         '<meta name="viewport" content="width=device-width, initial-scale=1">',
         f"<title>{esc(m['title'])}</title>", f"<style>{CSS}</style>", "</head>", "<body>",
         "<header>", f"<h1>{esc(m['title'])}</h1>"]
    p += [f"<p>{t}</p>" for t in m.get("intro", [])]
    if m.get("summary"):
        p.append('<p class="summary">' + "<br>".join(esc(s) for s in m["summary"]) + "</p>")
    if m.get("files"):
        p.append('<p class="files">Files: ' + ", ".join(f'<a href="{esc(f)}">{esc(f)}</a> ({esc(t)})' for f, t in m["files"]) + "</p>")
    p.append(f'<p class="caution"><strong>Caution.</strong> {esc(m["caution"])}</p>')
    p += ["</header>", "<main>", '<div id="map-column">', f"<h2>{esc(m.get('map_title', 'Map'))}</h2>",
          draw_map(m, out_dir), legend(m)]
    p += [f'<p class="note">{t}</p>' for t in m.get("map_notes", [])]
    p.append("</div>")
    p.append('<div id="groups">')
    p.append('<section class="group" id="all-domains"><h2>All domains</h2>')
    p.append(domain_table(m["domains"], [("_group", esc(m.get("group_header", "group")), lambda d: esc(d.get("_group")))] + label_cols,
                          extra_cols, "domain-table"))
    p.append("</section>")
    for g in m.get("groups", []):
        sub = f" <small>{esc(g['subtitle'])}</small>" if g.get("subtitle") else ""
        p.append(f'<section class="group" id="{esc(g["anchor"])}"><h2>{esc(g["name"])}{sub}</h2>')
        if g.get("note"):
            p.append(f'<p class="note">{esc(g["note"])}</p>')
        rows = [d for d in m["domains"] if d.get("_group") == g["name"]]
        p.append(domain_table(rows, label_cols, extra_cols))
        if g.get("figures"):
            p.append('<div class="figures">')
            for src, caption in g["figures"]:
                p.append(f'<figure><a href="{esc(src)}"><img src="{esc(src)}" alt="{esc(caption)}"></a>'
                         f"<figcaption>{esc(caption)}</figcaption></figure>")
            p.append("</div>")
        if g.get("thumbs"):
            p.append(f"<h3>{esc(g.get('thumbs_title', 'Focal mechanisms'))}</h3>")
            p.append('<div class="thumbs">')
            for src, caption in g["thumbs"]:
                p.append(f'<a href="{esc(src)}"><img src="{esc(src)}" alt="{esc(caption)}" title="{esc(caption)}"></a>')
            p.append("</div>")
        p.append("</section>")
    p += ["</div>", "</main>", "</body>", "</html>", ""]
    return "\n".join(p)


def write(m, out_dir, name="index.html"):
    path = os.path.join(out_dir, name)
    with open(path, "w", encoding="utf-8") as f:
        f.write(render(m, out_dir))
    return path
