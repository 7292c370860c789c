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
