"""Write the invented Harrow Ridge demo data (see demo/README.md). Standard library only."""
import csv
import math
import os
import random
import sys

out = sys.argv[1] if len(sys.argv) > 1 else "demo-out"
os.makedirs(out, exist_ok=True)
rnd = random.Random(2026)

# Base mechanisms per site (strike, dip, rake), invented.
SITES = {
    "KESTREL": (20.0, 35.0, 95.0),
    "MARLOW": (175.0, 55.0, -85.0),
    "TARN": (60.0, 82.0, 178.0),
}


def perturb(s, d, r, sd):
    """Jitter a mechanism's angles by a few degrees (demo noise, not a model)."""
    s = (s + rnd.gauss(0, sd)) % 360
    d = min(89.0, max(1.0, d + rnd.gauss(0, sd)))
    r = r + rnd.gauss(0, sd)
    r = (r + 180) % 360 - 180
    return round(s, 1), round(d, 1), round(r, 1)


with open(os.path.join(out, "mechanisms.csv"), "w", newline="") as f:
    w = csv.writer(f)
    w.writerow(["event_id", "site", "depth_km", "mechanism"])
    k = 0
    for site, base in SITES.items():
        for _ in range(12):
            k += 1
            s, d, r = perturb(*base, 6)
            w.writerow([f"HR{k:04d}", site, round(rnd.uniform(2, 18), 1), f"{s}/{d}/{r}"])


def bearing(az):
    """Quadrant bearing text of an azimuth (N70W style)."""
    az %= 360
    if az <= 90:
        return f"N{az:g}E"
    if az < 180:
        return f"S{180 - az:g}E"
    if az <= 270:
        return f"S{az - 180:g}W"
    return f"N{360 - az:g}W"


def quadrant(az):
    return ["N", "NE", "E", "SE", "S", "SW", "W", "NW"][int(((az % 360) + 22.5) // 45) % 8]


with open(os.path.join(out, "field_faults.csv"), "w", newline="") as f:
    w = csv.writer(f)
    w.writerow(["site", "station", "fault_as_written"])
    for site, base in SITES.items():
        for j in range(8):
            s, d, r = perturb(*base, 8)
            s, d = round(s), round(d)
            pitch = round(abs(math.degrees(math.asin(math.sin(math.radians(r))))))
            # The pitch is measured from the strike end toward which the
            # striation plunges: for normal slip that is the end the slip
            # vector's horizontal part points to, for reverse slip the other.
            toward_strike = (abs(r) < 90) == (r < 0)
            end_az = s if toward_strike else (s + 180) % 360
            dip_sense = "R" if r > 0 else "N"
            strike_sense = "S" if abs(r) < 90 else "D"
            pitch_sense = " ".join(([dip_sense] if pitch >= 1 else []) + ([strike_sense] if pitch <= 89 else []))
            q = abs(round(r))
            rake_sense = " ".join(([dip_sense] if 0 < q < 180 else []) + ([strike_sense] if q != 90 else []))
            ddir = (s + 90) % 360
            style = j % 4
            if style == 0:
                txt = f"{s}/{d}/{q} {rake_sense}"
            elif style == 1:
                txt = f"{(s + 180) % 360}/{d}{quadrant(ddir)}/{pitch}{quadrant(end_az)} {pitch_sense}"
            elif style == 2:
                txt = f"{bearing(s)} {d}{quadrant(ddir)}/{pitch}{quadrant(end_az)} {pitch_sense}"
            else:
                txt = f"{s}/{d}/{round(r)}"
            w.writerow([site, f"{site[:2]}-{j + 1:02d}", txt])
print(f"demo data written to {out}/")


# Bedding and lineations per site and map unit (invented): bedding folded about a
# site fold axis (poles scattered about the girdle normal to the axis), and a
# mineral lineation cluster per unit.
FOLDS = {"KESTREL": (200.0, 12.0), "MARLOW": (350.0, 5.0), "TARN": (60.0, 25.0)}
UNITS = ["Greywacke", "Slate"]


def vec(t, p):
    t, p = math.radians(t), math.radians(p)
    return (math.cos(p) * math.cos(t), math.cos(p) * math.sin(t), math.sin(p))


def cross(a, b):
    return (a[1] * b[2] - a[2] * b[1], a[2] * b[0] - a[0] * b[2], a[0] * b[1] - a[1] * b[0])


def unit(a):
    n = math.sqrt(sum(x * x for x in a))
    return tuple(x / n for x in a)


with open(os.path.join(out, "bedding.csv"), "w", newline="") as f, \
        open(os.path.join(out, "lineations.csv"), "w", newline="") as g:
    wb, wl = csv.writer(f), csv.writer(g)
    wb.writerow(["site", "unit", "bedding"])
    wl.writerow(["site", "unit", "lineation"])
    for site, (at, ap) in FOLDS.items():
        axis = vec(at, ap)
        e1 = unit(cross(axis, (0.0, 0.0, 1.0)))
        e2 = unit(cross(axis, e1))
        for unit_name in UNITS:
            for _ in range(25):
                # pole on the girdle normal to the axis, a little off it
                a = math.radians(rnd.uniform(-70, 70))
                off = math.radians(rnd.gauss(0, 3))
                pole = unit(tuple(math.cos(off) * (math.cos(a) * e2[i] + math.sin(a) * e1[i]) + math.sin(off) * axis[i]
                                  for i in range(3)))
                if pole[2] < 0:
                    pole = tuple(-x for x in pole)
                pt = math.degrees(math.atan2(pole[1], pole[0])) % 360
                pp = math.degrees(math.asin(max(-1.0, min(1.0, pole[2]))))
                wb.writerow([site, unit_name, f"{round((pt + 90) % 360, 1)}/{round(90 - pp, 1)}"])
            lt, lp = (at + 15) % 360, min(85.0, ap + 10)
            for _ in range(15):
                wl.writerow([site, unit_name, f"{round((lt + rnd.gauss(0, 6)) % 360, 1)}/{round(min(89.0, abs(lp + rnd.gauss(0, 5))), 1)}"])
