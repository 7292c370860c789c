"""The demo district's page, OUT/index.html, and the demo's closing summary.

Reads what demo/run.sh wrote into OUT (the per-domain result domains.csv, the planted
truth and its recovery domain_recovery.csv, the stations and epicentres, the figures
under figures/<SITE>/) and hands it to scripts/report/page.py. Standard library only.
Usage: page.py OUT [SECONDS]
"""
import csv
import os
import sys

sys.path.insert(0, os.path.join(os.path.dirname(os.path.abspath(__file__)), "..", "scripts", "report"))
import page  # noqa: E402

out = os.path.abspath(sys.argv[1] if len(sys.argv) > 1 else "demo-out")


def rows(name):
    with open(os.path.join(out, name), newline="", encoding="utf-8") as f:
        return list(csv.DictReader(f))


sites = rows("sites.csv")
domains = rows("domains.csv")
recovery = {r["domain"]: r for r in rows("domain_recovery.csv")}
faults = rows("fault_slip_data.csv")
events = rows("stress_mechanisms.csv")
setting = {s["site"]: s["setting"] for s in sites}

UNITS = ["Greywacke", "Slate"]
FIGURES = [
    ("fault_net", "field faults (great circles, hanging-wall slip arrows) and the stress of the main phase"),
    ("dihedra", "right dihedra: each fault's P dihedron, contours of the grid"),
    ("dihedra_filled", "right-dihedra grid, filled, with the main phase's stress axes"),
    ("hoeppener", "faults after Hoeppener (1955), main phase's stress axes"),
    ("focal_axes", "P and T axes of the focal mechanisms, joint focal inversion"),
    ("bedding", "bedding poles over their density, lineations and their mean"),
]

for d in domains:
    r = recovery.get(d["domain"], {})
    for k in ("sigma1_to_true", "sigma3_to_true", "shmax_to_true", "true_regime"):
        d[k] = r.get(k, "")
    d["_label"] = "focal mechanisms" if d["data"] == "focal mechanisms" else f"{d['map_unit']}, {d['age_class']}"
    d["_to_true"] = " / ".join(f"{float(d[k]):.1f}" if d[k] else "-" for k in ("sigma1_to_true", "sigma3_to_true", "shmax_to_true"))
    if d["regime"] != d["true_regime"]:
        d["_to_true"] += f"<br><small>planted: {d['true_regime']}</small>"
    d["_group"] = d["site"]
    d["_style"] = "open" if d["data"] == "focal mechanisms" else ("dashed" if d["age_class"] == "older" else "solid")
    what = d["data"] if d["data"] == "focal mechanisms" else f"{d['map_unit']}, {d['age_class']} faults"
    shmax = f"SHmax {float(d['shmax_azimuth']):.0f} degrees, " if d["shmax_azimuth"] else ""
    d["_title"] = f"{d['site']}: {what}, n {d['n']}: {shmax}{d['regime'] or 'no result'}"

groups = []
for s in sorted(sites, key=lambda s: s["site"]):
    name = s["site"]
    fig_dir = os.path.join(out, "figures", name)
    figs = [(f"figures/{name}/{k}.svg", c) for k, c in FIGURES if os.path.exists(os.path.join(fig_dir, f"{k}.svg"))]
    evs = sorted(e["event_id"] for e in events if e["site"] == name)
    thumbs = [(f"figures/{name}/mechanisms/{ev}.svg", ev) for ev in evs]
    groups.append({"name": name, "anchor": f"site-{name}", "subtitle": s["setting"], "figures": figs,
                   "note": "The figures show all of the site's field faults (both units and age classes); the "
                           "stress drawn on them is that of the larger of the two stress phases that "
                           "stress_phases separates blind, without the age classes.",
                   "thumbs": thumbs, "thumbs_title": f"Focal mechanisms near {name} ({len(evs)})"})

manifest = {
    "title": "Harrow Ridge district (invented): stress by domain",
    "intro": [
        "An invented district for striae's demo: field faults measured at six sites across two map "
        "units (Greywacke, Slate) and two age classes (older, younger: from cross-cutting relations), "
        "folded bedding, and a catalogue of focal mechanisms with epicentres. All data were generated "
        "from planted stress states and fold axes (demo/README.md), so each result below can be "
        "compared with the truth: the column &ldquo;to truth&rdquo; gives the angles between the "
        "recovered and the planted sigma1, sigma3 and SHmax, in that order.",
        "A domain is the field faults of one site, map unit and age class (stress_inversion, 500 "
        "bootstrap resamples), or the focal mechanisms of one site (focal_stress_inversion, friction "
        "searched, 500 resamples). Cones and intervals are 95&nbsp;% bootstrap half-angles.",
    ],
    "caution": "These results are interpretive: they show what the methods recover from an invented data "
               "set, not the stress at any real place. The district lies in open ocean on purpose. Where "
               "fault reactivation, induced seismicity, or slope or excavation stability matters, defer to "
               "site investigation, the applicable codes and licensed professionals.",
    "files": [("domains.csv", "per-domain result"), ("domains.geojson", "the same as a GIS layer"),
              ("shmax_bars.geojson", "SHmax bars, GIS view"), ("mechanism_quadrants.geojson", "focal quadrants, GIS view"),
              ("domain_recovery.csv", "against the planted truth"), ("stress_truth.csv", "planted stress"),
              ("fault_slip_data.csv", "field faults"), ("stress_mechanisms.csv", "focal mechanisms")],
    "map_title": "District map: SHmax by domain, focal mechanisms",
    "map_notes": [
        "SHmax bars are centred on the mean position of a domain's stations (field faults) or "
        "epicentres (focal mechanisms); their colour is the stress regime after Zoback (1992), "
        "their length fixed. Point at a bar or a diagram for its values; a site's name leads to "
        "its section. Local equirectangular projection about the district's mean latitude.",
    ],
    "group_header": "site",
    "label_columns": [("_label", "domain")],
    "extra_columns": [("_to_true", "to truth (°)", True)],
    "bar_styles": [("solid", "younger faults (Greywacke or Slate)"), ("dashed", "older faults (Greywacke)"),
                   ("open", "focal mechanisms of a site")],
    "station_classes": ["station in the Greywacke", "station in the Slate"],
    "stations": [{"lon": f["lon"], "lat": f["lat"], "class": UNITS.index(f["map_unit"])} for f in faults],
    "events": [{"id": e["event_id"], "lon": e["lon"], "lat": e["lat"],
                "glyph": f"figures/{e['site']}/mechanisms/{e['event_id']}.svg",
                "title": f"{e['event_id']} ({e['site']}): {e['mechanism']}, depth {e['depth_km']} km"} for e in events],
    "places": [{"name": s["site"], "lon": s["lon"], "lat": s["lat"], "anchor": f"site-{s['site']}"} for s in sites],
    "domains": domains,
    "groups": groups,
}


def angle(v):
    return float(v) if v not in ("", None) else None


s1 = [angle(d["sigma1_to_true"]) for d in domains if angle(d["sigma1_to_true"]) is not None]
s3 = [angle(d["sigma3_to_true"]) for d in domains if angle(d["sigma3_to_true"]) is not None]
regime_ok = sum(1 for d in domains if d["regime"] and d["regime"] == d["true_regime"])
field = [d for d in domains if d["data"] == "field faults"]
summary = [
    f"{len(sites)} sites, {len(faults)} field faults, {len(events)} focal mechanisms; "
    f"{len(domains)} domains ({len(field)} of field faults, {len(domains) - len(field)} of focal mechanisms).",
    f"sigma1 within {max(s1):.1f} degrees of the planted axis in every domain (median {sorted(s1)[len(s1) // 2]:.1f}), "
    f"sigma3 within {max(s3):.1f} (median {sorted(s3)[len(s3) // 2]:.1f}); "
    f"regime as planted in {regime_ok} of {len(domains)} domains." if s1 and s3 else "no domain has a result.",
]
manifest["summary"] = summary
path = page.write(manifest, out)

print()
print("== Demo district summary")
for line in summary:
    print("   " + line)
print(f"   per-domain result: {out}/domains.csv, GIS layer: {out}/domains.geojson")
print(f"   recovery of the planted truth: {out}/domain_recovery.csv")
print(f"   figures: {out}/figures/<SITE>/")
print(f"   district page: {path} (open it in a browser; no network needed)")
if len(sys.argv) > 2:
    print(f"   loading to page: {sys.argv[2]} s")
