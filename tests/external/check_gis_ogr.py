"""A GIS client reads striae_gis layers: GDAL's ogr2ogr (Debian gdal-bin) -> GeoJSON.

A database with the companion extension (CREATE EXTENSION striae_gis CASCADE)
holds a small invented fixture: five domains (site, map unit, age class, a
point) with fault-slip data made from known stress states (resolved_slip, so
the Wallace-Bott hypothesis holds exactly), one of them with too few data for
an inversion, and six focal mechanisms with epicentres and magnitudes. Two views
follow the documented pattern (README, "GIS layers"): one row per domain with
stress_map_feature, one row per mechanism with its compressional quadrants and
the disc. ogr2ogr reads each geometry column of each view over the standard
PostgreSQL connection (PG: connection string) into GeoJSON; the GeoJSON is
parsed here and checked (references named beside each check):
  - feature counts and every attribute against the SQL value (GDAL writes
    doubles with 15 to 17 significant digits: equal within 1e-14 relative);
  - geometry types: Point, LineString (null where SHmax is undefined),
    MultiPolygon, Polygon;
  - each SHmax bar, from its two end points alone (pyproj.Geod inverse, then
    halfway along that geodesic, Karney 2013): midpoint at the domain's point
    (1 m), azimuth there equal to shmax_azimuth (0.01 degree, the issue's
    bound) and length the requested one (0.1 %);
  - each mechanism: centroid of the quadrants within one radius of the
    epicentre (pyproj distance); the compressional area (pyproj geodesic area)
    half the disc's (equal-area projection: areas are solid angles, and the
    compressional directions are half of all: derived), within twice the drawing
    tolerance (0.2 %); the T axis
    placed by pyproj at 0.999 of its disc position (METHODS.md section 7) inside
    the compressional polygons and the P axis outside (Aki & Richards 1980);
  - the same view pattern without PostGIS (stress_map_row with longitude and
    latitude columns, the bar as WKT) gives the same columns and bars, vertex for
    vertex, also when ogr2ogr reads it from a CSV file written by psql's \copy.
"""
import json
import math
import os
import subprocess
import sys
import tempfile

from pyproj import Geod

DB = "striae_gis_ogr"
G = Geod(ellps="WGS84")
fail = []


def check(ok, what):
    if not ok:
        fail.append(what)
        if len(fail) <= 15:
            print("FAIL:", what)


def psql(sql):
    out = subprocess.run(["psql", "-X", "-q", "-At", "-v", "ON_ERROR_STOP=1", "-d", DB], input=sql,
                         check=True, capture_output=True, text=True).stdout
    return [line for line in out.splitlines() if line]


subprocess.run(["dropdb", "--if-exists", DB], check=True, capture_output=True)
subprocess.run(["createdb", DB], check=True)
psql("""
SET client_min_messages = warning;
CREATE EXTENSION striae_gis CASCADE;

-- invented domains: fictional names, points in a fictional district
CREATE TABLE fx_domains (domain text PRIMARY KEY, map_unit text, age_class text,
                         geom geometry(Point, 4326), truth stress_tensor);
INSERT INTO fx_domains VALUES
  ('Wrenfold Quarry', 'Ashby Greywacke', 'older',   ST_SetSRID(ST_MakePoint(9.412, 46.118), 4326),
   stress_tensor('032/08', '123/04', 0.35)),
  ('Hobb''s Cut',     'Ashby Greywacke', 'younger', ST_SetSRID(ST_MakePoint(9.486, 46.152), 4326),
   stress_tensor('160/78', '065/02', 0.5)),
  ('Larch Scar',      'Tolley Marl',     'older',   ST_SetSRID(ST_MakePoint(9.533, 46.097), 4326),
   stress_tensor('118/05', '015/80', 0.25)),
  ('Skelmer Beck',    'Tolley Marl',     'younger', ST_SetSRID(ST_MakePoint(9.601, 46.171), 4326),
   stress_tensor('075/30', '330/25', 0.6)),
  ('Pike Nab',        'Ashby Greywacke', 'younger', ST_SetSRID(ST_MakePoint(9.447, 46.203), 4326),
   stress_tensor('010/00', '100/00', 0.4));
-- fault-slip data that the domain's stress state predicts exactly; Pike Nab has 3
CREATE TABLE fx_faults AS
  SELECT domain, resolved_slip(plane((g * 47.3 + k * 11) % 360, 20 + (g * 13.1) % 65), truth) AS f
    FROM (SELECT domain, truth, row_number() OVER (ORDER BY domain) AS k FROM fx_domains) d,
         generate_series(1, CASE WHEN domain = 'Pike Nab' THEN 3 ELSE 24 END) g;
DELETE FROM fx_faults WHERE f IS NULL;

-- the per-domain view of the README
CREATE VIEW fx_domain_stress AS
  SELECT d.domain, d.map_unit, d.age_class, g.faults, m.*
    FROM fx_domains d
    JOIN (SELECT domain, count(*) AS faults, stress_inversion(f, 200, 11) AS t
            FROM fx_faults GROUP BY domain) g USING (domain)
    CROSS JOIN LATERAL stress_map_feature(g.t, d.geom, 6000) m;
-- the same without PostGIS: longitude and latitude columns, the bar as text
CREATE VIEW fx_domain_stress_plain AS
  SELECT d.domain, m.*
    FROM (SELECT domain, ST_X(geom) AS lon, ST_Y(geom) AS lat FROM fx_domains) d
    JOIN (SELECT domain, stress_inversion(f, 200, 11) AS t FROM fx_faults GROUP BY domain) g USING (domain)
    CROSS JOIN LATERAL stress_map_row(g.t, d.lon, d.lat, 6000) m;

-- invented focal mechanisms; symbol radius 800 m per magnitude unit
CREATE TABLE fx_events (event text PRIMARY KEY, mechanism fault_slip, magnitude float8, epicentre geometry(Point, 4326));
INSERT INTO fx_events VALUES
  ('ev-01', '0/90/0',     3.1, ST_SetSRID(ST_MakePoint(9.455, 46.131), 4326)),
  ('ev-02', '30/60/40',   2.4, ST_SetSRID(ST_MakePoint(9.512, 46.164), 4326)),
  ('ev-03', '312/23/-71', 4.0, ST_SetSRID(ST_MakePoint(9.578, 46.109), 4326)),
  ('ev-04', '75/80/165',  2.9, ST_SetSRID(ST_MakePoint(9.437, 46.182), 4326)),
  ('ev-05', '0/45/90',    3.6, ST_SetSRID(ST_MakePoint(9.621, 46.143), 4326)),
  ('ev-06', '201/12/95',  2.2, ST_SetSRID(ST_MakePoint(9.498, 46.211), 4326));
CREATE VIEW fx_mechanism_symbols AS
  SELECT e.event, e.mechanism::text AS mechanism, e.magnitude, 800 * e.magnitude AS radius_m,
         ST_X(e.epicentre) AS longitude, ST_Y(e.epicentre) AS latitude,
         p_axis(e.mechanism)::text AS p_axis, t_axis(e.mechanism)::text AS t_axis,
         focal_quadrants(e.mechanism, e.epicentre, 800 * e.magnitude)::geometry(MultiPolygon, 4326) AS compressional,
         focal_disc(e.epicentre, 800 * e.magnitude)::geometry(Polygon, 4326) AS disc
    FROM fx_events e;
""")

GEOMS = {"fx_domain_stress": ("geom", "shmax_bar"), "fx_mechanism_symbols": ("compressional", "disc")}
KEY = {"fx_domain_stress": "domain", "fx_mechanism_symbols": "event"}
conn = "PG:host=%s port=%s dbname=%s user=%s" % (os.environ["PGHOST"], os.environ["PGPORT"], DB, os.environ["PGUSER"])


def sql_rows(view):
    """Non-geometry columns of the view, as SQL prints them (float8 shortest round-trip -> exact)."""
    drop = "".join(" - '%s'" % g for g in GEOMS[view])
    rows = [json.loads(line) for line in psql("SELECT to_jsonb(v)%s FROM %s v" % (drop, view))]
    return {r[KEY[view]]: r for r in rows}


def same(a, b):
    if a is None or b is None or isinstance(a, str) or isinstance(b, str):
        return a == b
    return a == b or abs(a - b) <= 1e-14 * max(abs(a), abs(b))


layers = {}
with tempfile.TemporaryDirectory() as tmp:
    for view, cols in GEOMS.items():
        for col in cols:
            out = os.path.join(tmp, "%s_%s.geojson" % (view, col))
            subprocess.run(["ogr2ogr", "-f", "GeoJSON", out, conn, "%s(%s)" % (view, col)], check=True)
            with open(out) as fh:
                layers[(view, col)] = json.load(fh)

# ---- counts, attributes, geometry types ----------------------------------------------------
expected_types = {"geom": {"Point"}, "shmax_bar": {"LineString", None}, "compressional": {"MultiPolygon"},
                  "disc": {"Polygon"}}
sql = {view: sql_rows(view) for view in GEOMS}
attributes = 0
for (view, col), gj in layers.items():
    feats = gj["features"]
    check(len(feats) == len(sql[view]), "%s(%s): %d features, %d rows" % (view, col, len(feats), len(sql[view])))
    for ft in feats:
        props = ft["properties"]
        row = sql[view].get(props.get(KEY[view]))
        check(row is not None, "%s(%s): feature %r has no row" % (view, col, props.get(KEY[view])))
        if row is None:
            continue
        check(set(props) == set(row), "%s(%s): attributes %s, columns %s" % (view, col, sorted(props), sorted(row)))
        for k, v in row.items():
            attributes += 1
            check(same(props.get(k), v), "%s(%s) %s.%s: GeoJSON %r, SQL %r" % (view, col, props[KEY[view]], k, props.get(k), v))
        gtype = ft["geometry"]["type"] if ft["geometry"] else None
        check(gtype in expected_types[col], "%s(%s): geometry %s" % (view, col, gtype))
print("ogr2ogr: %d layers, %d features, %d attributes equal to the SQL values"
      % (len(layers), sum(len(g["features"]) for g in layers.values()), attributes))

# ---- points and SHmax bars -----------------------------------------------------------------
doms = sql["fx_domain_stress"]
nulls = [d for d, r in doms.items() if r["n"] is None]
check(nulls == ["Pike Nab"], "domains without a tensor: %s (expected Pike Nab: 3 faults)" % nulls)
for ft in layers[("fx_domain_stress", "geom")]["features"]:
    r = doms[ft["properties"]["domain"]]
    check(ft["geometry"]["coordinates"] == [r["longitude"], r["latitude"]], "point of %s" % r["domain"])
w_mid = w_az = w_len = 0.0
bars = 0
for ft in layers[("fx_domain_stress", "shmax_bar")]["features"]:
    r = doms[ft["properties"]["domain"]]
    if ft["geometry"] is None:
        check(r["shmax_azimuth"] is None, "%s: no bar, SHmax %r" % (r["domain"], r["shmax_azimuth"]))
        continue
    bars += 1
    c = ft["geometry"]["coordinates"]
    (x0, y0), (x2, y2) = c[0], c[-1]
    az1, _, s12 = G.inv(x0, y0, x2, y2)
    xm, ym, back = G.fwd(x0, y0, az1, s12 / 2)
    w_mid = max(w_mid, G.inv(xm, ym, r["longitude"], r["latitude"])[2])
    w_az = max(w_az, abs(((back + 180) - r["shmax_azimuth"] + 90) % 180 - 90))
    w_len = max(w_len, abs(s12 - 6000) / 6000)
print("SHmax bars from their end points (pyproj): %d bars; midpoint %.1e m from the domain point, "
      "azimuth there within %.1e degree of shmax_azimuth, length within %.1e of 6000 m" % (bars, w_mid, w_az, w_len))
check(bars == 4, "%d bars, expected 4" % bars)
check(w_mid < 1.0 and w_az < 0.01 and w_len < 1e-3, "bars: %.3g m, %.3g deg, %.3g" % (w_mid, w_az, w_len))

# without PostGIS: the same bars as text
plain = {json.loads(l)["domain"]: json.loads(l) for l in psql("SELECT to_jsonb(v) FROM fx_domain_stress_plain v")}
for ft in layers[("fx_domain_stress", "shmax_bar")]["features"]:
    d = ft["properties"]["domain"]
    wkt = plain[d]["shmax_bar"]
    if ft["geometry"] is None:
        check(wkt is None, "%s: plain bar %r" % (d, wkt))
        continue
    pts = [[float(v) for v in p.split()] for p in wkt[len("LINESTRING("):-1].split(",")]
    check(len(pts) == 3 and all(same(a, b) for p, q in zip(pts, ft["geometry"]["coordinates"]) for a, b in zip(p, q)),
          "%s: WKT bar %s differs from the GeoJSON bar" % (d, wkt))
    check(all(same(plain[d][k], doms[d][k]) for k in plain[d] if k in doms[d]), "%s: plain columns differ" % d)

# ... and a GIS reads it from a CSV file (psql's \copy; GDAL's CSV driver takes the WKT column as geometry)
with tempfile.TemporaryDirectory() as tmp:
    csv, out = os.path.join(tmp, "domains.csv"), os.path.join(tmp, "domains.geojson")
    subprocess.run(["psql", "-X", "-q", "-v", "ON_ERROR_STOP=1", "-d", DB, "-c",
                    "\\copy (SELECT * FROM fx_domain_stress_plain ORDER BY domain) TO '%s' CSV HEADER" % csv], check=True)
    subprocess.run(["ogr2ogr", "-f", "GeoJSON", out, csv, "-oo", "GEOM_POSSIBLE_NAMES=shmax_bar",
                    "-oo", "KEEP_GEOM_COLUMNS=NO", "-a_srs", "EPSG:4326"], check=True)
    with open(out) as fh:
        from_csv = {f["properties"]["domain"]: f["geometry"] for f in json.load(fh)["features"]}
pg_bars = {f["properties"]["domain"]: f["geometry"] for f in layers[("fx_domain_stress", "shmax_bar")]["features"]}
check(set(from_csv) == set(pg_bars), "CSV domains %s" % sorted(from_csv))
for d, g in pg_bars.items():
    c = from_csv.get(d)
    check((g is None and c is None) or (g is not None and c is not None and g["type"] == c["type"] and all(
        same(a, b) for p, q in zip(g["coordinates"], c["coordinates"]) for a, b in zip(p, q))),
        "%s: bar read from the CSV differs from the PostGIS one" % d)
print("without PostGIS: stress_map_row's bars as WKT (and read by ogr2ogr from a CSV) equal the PostGIS layer's")


# ---- mechanisms ----------------------------------------------------------------------------
def ring_area_centroid(ring):
    """Planar area and centroid of a ring in degrees (shoelace); fine for km-sized symbols."""
    a = cx = cy = 0.0
    for (x1, y1), (x2, y2) in zip(ring, ring[1:]):
        w = x1 * y2 - x2 * y1
        a += w
        cx += (x1 + x2) * w
        cy += (y1 + y2) * w
    return a / 2, cx / (3 * a), cy / (3 * a)


def inside(rings, x, y):
    res = False
    for ring in rings:
        for (x1, y1), (x2, y2) in zip(ring, ring[1:]):
            if (y1 > y) != (y2 > y) and x < (x2 - x1) * (y - y1) / (y2 - y1) + x1:
                res = not res
    return res


def axis_point(trend_plunge, lon, lat, radius):
    """The lower-hemisphere equal-area position of an axis (METHODS.md section 7), placed by pyproj."""
    t, p = (math.radians(float(v)) for v in trend_plunge.split("/"))
    rho = math.sqrt(1 - math.sin(p))                  # (vE, vN) / sqrt(1 + vD) has length sqrt(1 - vD)
    x, y = rho * math.sin(t), rho * math.cos(t)       # east, north
    az = math.degrees(math.atan2(x, y))
    return G.fwd(lon, lat, az, 0.999 * radius * math.hypot(x, y))[:2]


mechs = sql["fx_mechanism_symbols"]
disc = {f["properties"]["event"]: f["geometry"]["coordinates"] for f in layers[("fx_mechanism_symbols", "disc")]["features"]}
worst_c = worst_frac = 0.0
axes_ok = 0
for ft in layers[("fx_mechanism_symbols", "compressional")]["features"]:
    r = mechs[ft["properties"]["event"]]
    polys = ft["geometry"]["coordinates"]
    rings = [poly[0] for poly in polys]
    check(all(len(poly) == 1 for poly in polys), "%s: holes in the quadrants" % r["event"])
    # centroid of the quadrants (area-weighted) within one radius of the epicentre
    parts = [ring_area_centroid(q) for q in rings]
    a = sum(p[0] for p in parts)
    cx = sum(p[0] * p[1] for p in parts) / a
    cy = sum(p[0] * p[2] for p in parts) / a
    dist = G.inv(r["longitude"], r["latitude"], cx, cy)[2]
    worst_c = max(worst_c, dist / r["radius_m"])
    check(dist <= r["radius_m"], "%s: centroid %.1f m from the epicentre, radius %.0f" % (r["event"], dist, r["radius_m"]))
    # areas on the ellipsoid (pyproj): compressional = half the disc
    comp = sum(abs(G.polygon_area_perimeter([p[0] for p in q], [p[1] for p in q])[0]) for q in rings)
    whole = abs(G.polygon_area_perimeter([p[0] for p in disc[r["event"]][0]], [p[1] for p in disc[r["event"]][0]])[0])
    worst_frac = max(worst_frac, abs(comp / whole - 0.5))
    # T inside, P outside
    tx, ty = axis_point(r["t_axis"], r["longitude"], r["latitude"], r["radius_m"])
    px, py = axis_point(r["p_axis"], r["longitude"], r["latitude"], r["radius_m"])
    ok = inside(rings, tx, ty) and not inside(rings, px, py)
    axes_ok += ok
    check(ok, "%s: T inside %s, P inside %s" % (r["event"], inside(rings, tx, ty), inside(rings, px, py)))
print("mechanisms: %d; quadrant centroids within %.2f radius of the epicentre; compressional area / disc area "
      "within %.1e of 1/2 (pyproj geodesic areas); T inside and P outside the compressional polygons: %d"
      % (len(mechs), worst_c, worst_frac, axes_ok))
# drawn within the tolerance (0.001 of the radius): the rim outside the circle,
# the nodal planes as chords inside their curves; each changes the fraction by
# less than the tolerance (derived: a chord's segment is 2/3 sagitta x length)
check(worst_frac < 2e-3, "compressional fraction off 1/2 by %.3g" % worst_frac)
valid = psql("SELECT count(*) FILTER (WHERE ST_IsValid(compressional) AND ST_IsValid(disc)), count(*) FROM fx_mechanism_symbols")
check(valid == ["6|6"], "ST_IsValid: %s" % valid)

subprocess.run(["dropdb", DB], check=True)
if fail:
    print("check_gis_ogr: %d failures" % len(fail))
    sys.exit(1)
print("check_gis_ogr: ok")
