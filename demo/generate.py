"""Write the invented Harrow Ridge demo data (see demo/README.md). Standard library only."""
import csv
import math
import os
import random
import sys

# generate.py [OUT] [--sites A,B,...]: --sites writes only the named sites' rows (a
# reduced district for tests); every value is the same as in the full district.
args = [a for a in sys.argv[1:]]
only = None
if "--sites" in args:
    i = args.index("--sites")
    only = set(args[i + 1].split(","))
    del args[i:i + 2]
out = args[0] if args else "demo-out"
os.makedirs(out, exist_ok=True)
rnd = random.Random(2026)


def keep(site):
    """Whether a site's rows are written (all, unless --sites names some)."""
    return only is None or site in only

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
            row = [f"HR{k:04d}", site, round(rnd.uniform(2, 18), 1), f"{s}/{d}/{r}"]
            if keep(site):
                w.writerow(row)


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
            if keep(site):
                w.writerow([site, f"{site[:2]}-{j + 1:02d}", txt])
print(f"demo data written to {out}/")


# Bedding and lineations per site and map unit (invented): bedding folded about a
# site fold axis (poles scattered about the girdle normal to the axis), and a
# mineral lineation cluster per unit.
# The axes are the planted truth of the folds (fold_truth.csv); the sites added for
# the district map (PLOVER, CAIRN, SEDGE) come last, so the rows of the first three
# are the same as before they were added.
FOLDS = {"KESTREL": (200.0, 12.0), "MARLOW": (350.0, 5.0), "TARN": (60.0, 25.0),
         "PLOVER": (205.0, 8.0), "CAIRN": (40.0, 15.0), "SEDGE": (345.0, 10.0)}
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
                if keep(site):
                    wb.writerow([site, unit_name, f"{round((pt + 90) % 360, 1)}/{round(90 - pp, 1)}"])
            lt, lp = (at + 15) % 360, min(85.0, ap + 10)
            for _ in range(15):
                row = [site, unit_name, f"{round((lt + rnd.gauss(0, 6)) % 360, 1)}/{round(min(89.0, abs(lp + rnd.gauss(0, 5))), 1)}"]
                if keep(site):
                    wl.writerow(row)


# ---------------------------------------------------------------------------
# Paleostress part (issue 4): fault-slip data and focal mechanisms generated from
# KNOWN, invented stress states, so the demo can compare what the inversions
# recover with the truth. Conventions as in striae: North-East-Down vectors,
# right-hand-rule strike (dip direction = strike + 90), Aki & Richards rake (from
# the strike direction to the hanging-wall slip, positive = reverse), stress
# compression positive with sigma1 the most compressive. A separate seeded
# generator keeps the files above unchanged.
srnd = random.Random(4471)
# The district map (issue 9) needs more than the three first sites had: map units, age
# classes and coordinates of every datum, three more sites, and epicentres. All of it
# comes from a third seeded generator, so that every value the three first sites had
# before (stress_phases and the README numbers rest on them) is unchanged.
drnd = random.Random(9091)

# Invented stress states per site: (sigma1 trend, plunge), (sigma3 trend, plunge),
# shape ratio Phi = (s2 - s3)/(s1 - s3). sigma1 and sigma3 are exactly orthogonal.
TRUE_STRESS = {
    "KESTREL": ((105.0, 6.0), (285.0, 84.0), 0.40),   # compression, sigma1 WNW-ESE
    "MARLOW": ((260.0, 80.0), (80.0, 10.0), 0.55),    # extension, sigma3 ENE-WSW
    "TARN": ((290.0, 4.0), (20.0, 0.0), 0.45),        # strike-slip, sigma1 WNW-ESE
}
# An invented older stress phase per site: the source of some of the deliberately
# incompatible ("planted") field faults.
OLDER_STRESS = {
    "KESTREL": ((20.0, 5.0), (110.0, 0.0), 0.50),     # strike-slip
    "MARLOW": ((170.0, 5.0), (350.0, 85.0), 0.30),    # compression
    "TARN": ((200.0, 85.0), (20.0, 5.0), 0.50),       # extension
}
# The sites added for the district map, drawn with drnd. Their younger stress fills in
# the regimes between the first three (thrust, thrust-strike-slip, normal-strike-slip).
NEW_TRUE_STRESS = {
    "PLOVER": ((118.0, 8.0), (298.0, 82.0), 0.35),    # thrust, sigma1 ESE, 13 degrees off KESTREL's
    "CAIRN": ((100.0, 0.0), (10.0, 46.0), 0.50),      # thrust-strike-slip
    "SEDGE": ((350.0, 46.0), (80.0, 0.0), 0.50),      # normal-strike-slip, sigma3 ENE-WSW
}
NEW_OLDER_STRESS = {
    "PLOVER": ((30.0, 4.0), (120.0, 0.0), 0.50),      # strike-slip
    "CAIRN": ((210.0, 84.0), (30.0, 6.0), 0.40),      # extension
    "SEDGE": ((175.0, 6.0), (355.0, 84.0), 0.35),     # compression
}
ALL_TRUE = {**TRUE_STRESS, **NEW_TRUE_STRESS}
ALL_OLDER = {**OLDER_STRESS, **NEW_OLDER_STRESS}
N_FIELD, N_REVERSED, N_OLDER = 50, 2, 12     # per site: 36 compatible + 2 reversed + 12 of the older phase
N_FOCAL = 25                                 # focal mechanisms per site (the first three)
N_FOCAL_NEW = 15                             # focal mechanisms per added site
NOISE_SD = 3.0                               # degrees on strike, dip and rake
MIN_SHEAR = 0.2                              # |tau| / (s1 - s3); the maximum is 0.5

# ---- Geography (invented) --------------------------------------------------------
# WGS 84 longitude and latitude, degrees. The district is put in the open South
# Pacific on purpose, about 1,800 km from the nearest land, so that no real place
# is implied by any map or GIS layer made from it. The sites lie along a ridge
# trending NNE, thrust front in the west, rift shoulder in the east.
SITE_PLACE = {          # site centre (lon, lat) and setting
    "KESTREL": (-137.800, -41.220, "fold-and-thrust front"),
    "MARLOW": (-137.420, -41.120, "rift shoulder"),
    "TARN": (-137.620, -41.180, "transfer zone"),
    "PLOVER": (-137.780, -41.080, "fold-and-thrust front, northern segment"),
    "CAIRN": (-137.590, -41.300, "transfer zone, southern segment"),
    "SEDGE": (-137.400, -41.280, "rift shoulder, southern segment"),
}
KM_PER_DEG = 111.195    # mean Earth radius 6371 km: 2 pi R / 360; a local flat approximation
CONTACT_STRIKE = 20.0   # the Greywacke-Slate contact runs NNE through every site
UNIT_OFFSET_KM = 1.5    # Greywacke stations west of the contact, Slate stations east
OLDER_ZONE_KM = 2.0     # older faults are found in a basement exposure north of the Greywacke stations
STATION_SD_KM = 0.35
EPICENTRE_SHIFT_KM = (4.0, -2.5)   # a site's earthquakes cluster east-south-east of it, beneath the ridge flank
EPICENTRE_SD_KM = 2.2


def place(lon, lat, east_km, north_km):
    """A point east_km and north_km from (lon, lat) on a local flat approximation."""
    return (round(lon + east_km / (KM_PER_DEG * math.cos(math.radians(lat))), 5),
            round(lat + north_km / KM_PER_DEG, 5))


def station_place(site, unit_name, age_class):
    """Where a fault of this map unit and age class was measured at a site."""
    lon, lat, _ = SITE_PLACE[site]
    side = -1.0 if unit_name == "Greywacke" else 1.0      # west or east of the contact
    a = math.radians(CONTACT_STRIKE + 90.0)                # normal to the contact, toward ESE
    e = side * UNIT_OFFSET_KM * math.sin(a) + drnd.gauss(0, STATION_SD_KM)
    n = side * UNIT_OFFSET_KM * math.cos(a) + drnd.gauss(0, STATION_SD_KM)
    if age_class == "older":
        n += OLDER_ZONE_KM
    return place(lon, lat, e, n)


def epicentre(site):
    lon, lat, _ = SITE_PLACE[site]
    return place(lon, lat, EPICENTRE_SHIFT_KM[0] + drnd.gauss(0, EPICENTRE_SD_KM),
                 EPICENTRE_SHIFT_KM[1] + drnd.gauss(0, EPICENTRE_SD_KM))


def dot(a, b):
    return sum(x * y for x, y in zip(a, b))


def stress_matrix(s1, s3, phi):
    """Compression-positive tensor with eigenvalues 1, Phi, 0 on sigma1, sigma2, sigma3."""
    v1, v3 = vec(*s1), vec(*s3)
    assert abs(dot(v1, v3)) < 1e-12, "sigma1 and sigma3 must be orthogonal"
    v2 = cross(v3, v1)
    return [[v1[i] * v1[j] + phi * v2[i] * v2[j] for j in range(3)] for i in range(3)]


def plane_frame(s, d):
    """Strike vector, up-dip vector and upward normal (into the hanging wall) of a plane."""
    s, d = math.radians(s), math.radians(d)
    strike_v = (math.cos(s), math.sin(s), 0.0)
    updip = (math.cos(d) * math.sin(s), -math.cos(d) * math.cos(s), -math.sin(d))
    normal = (-math.sin(d) * math.sin(s), math.sin(d) * math.cos(s), -math.cos(d))
    return strike_v, updip, normal


def slip_vector(s, d, r):
    """Hanging-wall slip of strike/dip/rake (Aki & Richards)."""
    strike_v, updip, _ = plane_frame(s, d)
    r = math.radians(r)
    return tuple(math.cos(r) * a + math.sin(r) * b for a, b in zip(strike_v, updip))


def wallace_bott(S, s, d):
    """Rake of the resolved shear on plane s/d, and the shear magnitude.

    The traction on the plane with upward normal n is S n (compression positive);
    its shear part tau = S n - (n . S n) n is the shear the footwall exerts on the
    hanging wall with the sign of compression, so the hanging wall slips along -tau
    (Wallace 1951, Bott 1959: slip parallel to the resolved shear stress).
    """
    strike_v, updip, n = plane_frame(s, d)
    t = [dot(row, n) for row in S]
    tn = dot(t, n)
    u = [-(t[i] - tn * n[i]) for i in range(3)]
    mag = math.sqrt(dot(u, u))
    return math.degrees(math.atan2(dot(u, updip), dot(u, strike_v))), mag


def misfit_deg(S, s, d, r):
    """Angle (0..180) between the slip of s/d/r and the Wallace-Bott slip on its plane."""
    pr, _ = wallace_bott(S, s, d)
    return math.degrees(math.acos(max(-1.0, min(1.0, dot(slip_vector(s, d, r), slip_vector(s, d, pr))))))


def from_vectors(n, u):
    """strike/dip/rake of the plane with normal n and hanging-wall slip u (either sign of n)."""
    if n[2] > 0:                      # use the upward normal; (n, u) and (-n, -u) are the same couple
        n, u = tuple(-x for x in n), tuple(-x for x in u)
    d = math.degrees(math.acos(max(-1.0, min(1.0, -n[2]))))
    s = math.degrees(math.atan2(-n[0], n[1])) % 360
    strike_v, updip, _ = plane_frame(s, d)
    return s, d, math.degrees(math.atan2(dot(u, updip), dot(u, strike_v)))


def auxiliary_of(s, d, r):
    """The other nodal plane: its normal is the slip vector, its slip the normal."""
    _, _, n = plane_frame(s, d)
    return from_vectors(slip_vector(s, d, r), n)


def random_plane(rng):
    """Uniformly distributed normal, dip between 10 and 85 degrees."""
    c = rng.uniform(math.cos(math.radians(85)), math.cos(math.radians(10)))
    return rng.uniform(0, 360), math.degrees(math.acos(c))


def sheared_plane(S, rng):
    """A random plane carrying enough resolved shear for a defined slip direction."""
    while True:
        s, d = random_plane(rng)
        r, mag = wallace_bott(S, s, d)
        if mag >= MIN_SHEAR:
            return s, d, r


def noisy(s, d, r, rng):
    s = (s + rng.gauss(0, NOISE_SD)) % 360
    d = min(89.0, max(1.0, d + rng.gauss(0, NOISE_SD)))
    r = (r + rng.gauss(0, NOISE_SD) + 180) % 360 - 180
    return s, d, r


def wrap180(r):
    return (r + 180) % 360 - 180


with open(os.path.join(out, "stress_truth.csv"), "w", newline="") as f:
    w = csv.writer(f)
    w.writerow(["site", "sigma1", "sigma3", "shape_ratio", "older_sigma1", "older_sigma3", "older_shape_ratio"])
    for site, (s1, s3, phi) in ALL_TRUE.items():
        o1, o3, ophi = ALL_OLDER[site]
        stress_matrix(s1, s3, phi)    # checks orthogonality
        stress_matrix(o1, o3, ophi)
        if keep(site):
            w.writerow([site, f"{s1[0]:g}/{s1[1]:g}", f"{s3[0]:g}/{s3[1]:g}", phi,
                        f"{o1[0]:g}/{o1[1]:g}", f"{o3[0]:g}/{o3[1]:g}", ophi])

with open(os.path.join(out, "fold_truth.csv"), "w", newline="") as f:
    w = csv.writer(f)
    w.writerow(["site", "fold_axis"])
    for site, (at, ap) in FOLDS.items():
        if keep(site):
            w.writerow([site, f"{at:g}/{ap:g}"])

with open(os.path.join(out, "sites.csv"), "w", newline="") as f:
    w = csv.writer(f)
    w.writerow(["site", "lon", "lat", "setting"])
    for site, (lon, lat, setting) in SITE_PLACE.items():
        if keep(site):
            w.writerow([site, lon, lat, setting])


def field_rows(site, rng, n_field=N_FIELD):
    """A site's field faults: (station, fault, planted kind) drawn with rng."""
    S = stress_matrix(*ALL_TRUE[site])
    S_old = stress_matrix(*ALL_OLDER[site])
    kinds = [""] * (n_field - N_REVERSED - N_OLDER) + ["reversed"] * N_REVERSED + ["older phase"] * N_OLDER
    rng.shuffle(kinds)
    for j, kind in enumerate(kinds):
        while True:
            s, d, r = noisy(*sheared_plane(S_old if kind == "older phase" else S, rng), rng)
            if kind == "reversed":
                r = wrap180(r + 180)
            s, d, r = round(s) % 360, round(d), round(r)
            m = misfit_deg(S, s, d, r)
            # Planted faults must be clearly incompatible with the site's stress
            # (an older-phase slip can fit the younger stress by chance).
            if kind == "" or m > 45:
                break
        yield f"{site[0]}F-{j + 1:02d}", f"{s}/{d}/{r}", kind


# Field fault-slip data: whole degrees as read off a compass, plus an answer-key
# column `planted` (empty, "reversed" or "older phase") that the inversions never see.
# The map unit and the age class are what a field party records: the age class from
# cross-cutting relations and superposed striations, so the older-phase faults are
# "older", every other fault (the two reversed ones too: a geologist reading the wrong
# sense still dates the striation) "younger". Older faults are found only in the
# Greywacke (the Slate postdates the older phase); younger ones in both units.
with open(os.path.join(out, "fault_slip_data.csv"), "w", newline="") as f:
    w = csv.writer(f)
    w.writerow(["site", "station", "fault", "planted", "map_unit", "age_class", "lon", "lat"])
    for site in ALL_TRUE:
        rng = srnd if site in TRUE_STRESS else drnd
        for station, fault, kind in field_rows(site, rng):
            age = "older" if kind == "older phase" else "younger"
            unit_name = "Greywacke" if age == "older" or drnd.random() < 0.5 else "Slate"
            lon, lat = station_place(site, unit_name, age)
            if keep(site):
                w.writerow([site, station, fault, kind, unit_name, age, lon, lat])

# Focal mechanisms: drawn like the field faults (no planted outliers), one decimal,
# and the nodal plane listed is the fault plane or its auxiliary at random, as a
# catalogue would give it; `listed_plane` is the answer key. Epicentres scatter
# about their site.
with open(os.path.join(out, "stress_mechanisms.csv"), "w", newline="") as f:
    w = csv.writer(f)
    w.writerow(["event_id", "site", "depth_km", "mechanism", "listed_plane", "lon", "lat"])
    k = 0
    for site, truth in ALL_TRUE.items():
        rng = srnd if site in TRUE_STRESS else drnd
        S = stress_matrix(*truth)
        for _ in range(N_FOCAL if site in TRUE_STRESS else N_FOCAL_NEW):
            k += 1
            s, d, r = noisy(*sheared_plane(S, rng), rng)
            listed = "auxiliary" if rng.random() < 0.5 else "fault"
            if listed == "auxiliary":
                s, d, r = auxiliary_of(s, d, r)
            depth = round(rng.uniform(2, 18), 1)
            lon, lat = epicentre(site)
            if keep(site):
                w.writerow([f"HS{k:04d}", site, depth,
                            f"{round(s % 360, 1)}/{round(d, 1)}/{round(wrap180(r), 1)}", listed, lon, lat])
print(f"paleostress demo data written to {out}/")
