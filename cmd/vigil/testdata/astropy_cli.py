#!/usr/bin/python3
"""Reference values for the vigil command line, computed with astropy.

Writes, beside this script:
  astropy_sky.csv    what `vigil sky` reports, for a few sites, stars, instants
  astropy_night.csv  what `vigil night` reports (events and moon_illum)

Regenerate (offline; Debian's python3-astropy 5.2.1 and numpy):
  /usr/bin/python3 cmd/vigil/testdata/astropy_cli.py

Settings, as in methods.md section 1: IERS auto-download off (auto_max_age
None), UT1 = UTC (delta_ut1_utc = 0), astropy's built-in ephemeris, airless
altitudes (AltAz pressure = 0) except alt_refracted_deg (10 degC, 1010 hPa,
dry air, 0.55 micron). Longitude EAST positive, azimuth from north through
east. hjd is on the UTC scale, bjd_tdb on the TDB scale.

Definitions reproduced from spec/cli.md (vigil night): the night of DATE runs
from local mean noon (12h UTC - longitude/15 h) for one day; dusk = first
downward crossing, dawn = last upward crossing of the Sun's centre (apparent,
topocentric, airless) through -0.8333, -6, -12, -18 deg; moonrise and moonset
= first crossings of +0.125 deg by the Moon's geocentric direction, searched
between sunset and sunrise only (or the whole span when the Sun stays down);
moon_illum = (1 + cos i)/2 (Meeus 1998, eq. 48.1) at the midpoint of sunset and
sunrise (or of the span). Crossings are found on a 60 s grid and refined on a
1 s grid by linear interpolation. Empty cells: the event does not happen.

The numbers below the header are written by this script: never edit them.
"""
import csv
import datetime
import os
import warnings

import astropy
import numpy as np
from astropy.utils import iers

iers.conf.auto_download = False
iers.conf.auto_max_age = None

import astropy.units as u  # noqa: E402
from astropy.coordinates import (AltAz, EarthLocation, GCRS, SkyCoord, TETE,  # noqa: E402
                                 get_body)
from astropy.time import Time  # noqa: E402
from astropy.utils.exceptions import AstropyWarning  # noqa: E402

# Read once: polar motion beyond the bundled IERS table falls back to its
# 50-year mean, an arcsecond-level effect well inside the test tolerances.
warnings.simplefilter("ignore", AstropyWarning)

HERE = os.path.dirname(os.path.abspath(__file__))


def utc(iso):
    t = Time(iso, scale="utc")
    t.delta_ut1_utc = 0.0
    return t


def location(lat, lon, elev):
    return EarthLocation.from_geodetic(lon * u.deg, lat * u.deg, elev * u.m)


def altaz(t, loc, refracted=False):
    if refracted:
        return AltAz(obstime=t, location=loc, pressure=1010 * u.hPa,
                     temperature=10 * u.deg_C, relative_humidity=0,
                     obswl=0.55 * u.micron)
    return AltAz(obstime=t, location=loc, pressure=0 * u.hPa)


def moon_illum(t):
    sun = get_body("sun", t)
    moon = get_body("moon", t)
    psi = sun.separation(moon).rad
    r = sun.distance.to(u.km).value
    d = moon.distance.to(u.km).value
    i = np.arctan2(r * np.sin(psi), d - r * np.cos(psi))  # Meeus 1998, eq. 48.3
    return (1 + np.cos(i)) / 2


# name, lat, lon (east +), elev m, RA text, Dec text, instant. "moon+" and
# "sun+" put the star near the Moon or the Sun at that instant (offsets in
# degrees), so that the separations and the Sun caution are exercised.
SKY_CASES = [
    ("delta Cep, methods.md 3/7", 50, 10, 0, "22:29:10.26502", "+58:24:54.7139", "2024-12-21T20:00:00Z"),
    ("demo site coordinates, west of Greenwich", 52.1172, -1.4538, 140, "19:52:28.37", "+01:00:20.4", "2025-08-15T22:30:00Z"),
    ("southern site, high elevation", -31.2754, 149.0672, 1150, "05:35:17.3", "-05:23:28", "2025-01-10T12:00:00Z"),
    ("far west, star below the horizon", 19.82, -155.47, 4200, "12:00:00", "-60:00:00", "2026-03-03T08:00:00Z"),
    ("near the pole star, Arctic winter", 69.65, 18.96, 10, "03:00:00", "+89:00:00", "2025-12-21T00:00:00Z"),
    ("star 3 deg from the Moon", 45.0, -75.0, 100, "moon+3", "moon+0", "2025-03-12T01:00:00Z"),
    ("star 8 deg from the Sun, daytime", 40.0, 15.0, 300, "sun+8", "sun+0", "2025-05-20T11:00:00Z"),
]


def near(body, t, loc, dra_deg, ddec_deg):
    """RA/Dec text of a direction offset from where the body is seen from the
    site, its topocentric apparent place turned back into an ICRS direction."""
    frame = altaz(t, loc)
    seen = get_body(body, t, loc).transform_to(frame)
    b = SkyCoord(alt=seen.alt, az=seen.az, frame=frame).transform_to("icrs")
    ra = (b.ra.deg + dra_deg / np.cos(b.dec.rad)) % 360 / 15
    dec = b.dec.deg + ddec_deg
    return f"{ra:.4f}", f"{dec:+.3f}"


def sky_rows():
    rows = []
    for name, lat, lon, elev, ra, dec, iso in SKY_CASES:
        t = utc(iso)
        loc = location(lat, lon, elev)
        for body in ("moon", "sun"):
            if ra.startswith(body):
                ra, dec = near(body, t, loc, float(ra[len(body):]), float(dec[len(body):]))
        star = SkyCoord(ra, dec, unit=(u.hourangle, u.deg), frame="icrs")
        aa = star.transform_to(altaz(t, loc))
        aar = star.transform_to(altaz(t, loc, refracted=True))
        tete = star.transform_to(TETE(obstime=t, location=loc))
        last = t.sidereal_time("apparent", longitude=lon * u.deg).hour
        ha = (last - tete.ra.hour + 12) % 24 - 12
        hjd = (t.utc + t.light_travel_time(star, "heliocentric", location=loc)).utc.jd
        bjd = (t.tdb + t.light_travel_time(star, "barycentric", location=loc)).tdb.jd
        sun = get_body("sun", t, loc).transform_to(altaz(t, loc))
        moon = get_body("moon", t, loc).transform_to(altaz(t, loc))
        rows.append({
            "name": name, "lat": lat, "lon": lon, "elev": elev, "ra": ra, "dec": dec, "at": iso,
            "alt_deg": f"{aa.alt.deg:.6f}", "alt_refracted_deg": f"{aar.alt.deg:.6f}",
            "az_deg": f"{aa.az.deg:.6f}", "hour_angle_h": f"{ha:.7f}",
            "hjd": f"{hjd:.8f}", "bjd_tdb": f"{bjd:.8f}",
            "sun_alt_deg": f"{sun.alt.deg:.6f}", "moon_alt_deg": f"{moon.alt.deg:.6f}",
            "moon_sep_deg": f"{aa.separation(moon).deg:.6f}",
            "sun_sep_deg": f"{aa.separation(sun).deg:.6f}",
            "moon_illum": f"{moon_illum(t):.6f}",
        })
    return rows


# name, lat, lon (east +), elev m, date
NIGHT_CASES = [
    ("methods.md 5, 50N 10E", 50, 10, 0, "2024-12-21"),
    ("Greenwich, methods.md 5", 51.4779, -0.0015, 0, "2024-03-20"),
    ("demo site", 52.1172, -1.4538, 140, "2026-12-01"),
    ("southern site", -31.2754, 149.0672, 1150, "2025-01-10"),
    ("far west", 19.82, -155.47, 4200, "2026-03-03"),
]

STEP = 60  # seconds, coarse grid


def sun_alt(times, loc):
    return get_body("sun", times, loc).transform_to(altaz(times, loc)).alt.deg


def moon_geo_alt(times, loc):
    m = get_body("moon", times)  # geocentric
    d = SkyCoord(m.ra, m.dec, frame=GCRS(obstime=times))  # direction only: no parallax
    return d.transform_to(altaz(times, loc)).alt.deg


def crossings(f, t0, t1, loc, h0):
    """[(Time, rising)] of f(t) - h0 through zero in [t0, t1)."""
    n = int(round((t1 - t0).to(u.s).value / STEP))
    grid = t0 + np.arange(n + 1) * STEP * u.s
    y = f(grid, loc) - h0
    out = []
    for i in np.nonzero(np.sign(y[:-1]) != np.sign(y[1:]))[0]:
        fine = grid[i] + np.arange(STEP + 1) * u.s
        z = f(fine, loc) - h0
        j = np.nonzero(np.sign(z[:-1]) != np.sign(z[1:]))[0][0]
        frac = z[j] / (z[j] - z[j + 1])
        out.append((fine[j] + frac * u.s, bool(z[j + 1] > z[j])))
    return out


def iso(t):
    return "" if t is None else t.utc.isot + "Z"


def night_rows():
    rows = []
    for name, lat, lon, elev, date in NIGHT_CASES:
        loc = location(lat, lon, elev)
        d = datetime.datetime.strptime(date, "%Y-%m-%d")
        noon = d + datetime.timedelta(hours=12 - lon / 15)
        start = utc(noon.strftime("%Y-%m-%dT%H:%M:%S.%f"))
        end = start + 1 * u.day
        row = {"name": name, "lat": lat, "lon": lon, "elev": elev, "date": date}
        for h0, dusk, dawn in ((-0.8333, "sunset", "sunrise"), (-6, "civil_dusk", "civil_dawn"),
                               (-12, "nautical_dusk", "nautical_dawn"), (-18, "astro_dusk", "astro_dawn")):
            cs = crossings(sun_alt, start, end, loc, h0)
            down = [t for t, r in cs if not r]
            up = [t for t, r in cs if r]
            row[dusk] = iso(down[0] if down else None)
            row[dawn] = iso(up[-1] if up else None)
        ends = sun_alt(Time([start, end]), loc) < -0.8333
        dark_from = Time(row["sunset"]) if row["sunset"] else (start if ends[0] else None)
        dark_to = Time(row["sunrise"]) if row["sunrise"] else (end if ends[1] else None)
        row["moonrise"] = row["moonset"] = ""
        if dark_from is not None and dark_to is not None and dark_from < dark_to:
            cs = crossings(moon_geo_alt, dark_from, dark_to, loc, 0.125)
            rises = [t for t, r in cs if r]
            sets = [t for t, r in cs if not r]
            row["moonrise"] = iso(rises[0] if rises else None)
            row["moonset"] = iso(sets[0] if sets else None)
        mid = start + 0.5 * u.day
        if row["sunset"] and row["sunrise"]:
            a, b = Time(row["sunset"]), Time(row["sunrise"])
            mid = a + (b - a) / 2
        row["moon_illum"] = f"{moon_illum(mid):.6f}"
        rows.append(row)
    return rows


def write(path, rows):
    with open(path, "w", newline="") as fh:
        fh.write(f"# written by astropy_cli.py with astropy {astropy.__version__}, numpy {np.__version__} "
                 f"(settings in its docstring); "
                 f"regenerate: /usr/bin/python3 cmd/vigil/testdata/astropy_cli.py\n")
        w = csv.DictWriter(fh, fieldnames=list(rows[0].keys()), lineterminator="\n")
        w.writeheader()
        w.writerows(rows)


if __name__ == "__main__":
    print("astropy", astropy.__version__)
    write(os.path.join(HERE, "astropy_sky.csv"), sky_rows())
    write(os.path.join(HERE, "astropy_night.csv"), night_rows())
