#!/usr/bin/python3
"""Reference predictions for vigil's observe package, computed with astropy.

Regenerate from the repository root (offline; Debian python3-astropy 5.2.1,
python3-numpy):

    /usr/bin/python3 observe/testdata/predict/make_predict.py

It writes, beside this script:

    events.csv   for invented stars, ephemerides and sites: every extremum
                 (cycle E, or E + 0.5 for secondary minima) with its
                 ephemeris time T0 + P*E + Q*E^2 and the UTC instant at which
                 it is seen at the site, solved by iteration so that the
                 heliocentric (HJD, UTC scale) or barycentric (BJD, TDB
                 scale) Julian date of that instant, from
                 Time.light_travel_time, equals the ephemeris time; with the
                 star's airless altitude and azimuth and the Sun's airless
                 altitude then.
    windows.csv  for each case, a span [from, to) whose ends lie midway
                 between events, and the cycles whose UTC instant lies in it.

Settings: airless (AltAz pressure = 0), longitude east-positive, azimuth from
north through east, UT1 = UTC (delta_ut1_utc = 0), the 'builtin' solar-system
ephemeris, no IERS download. Star positions are ICRS (J2000); a star with
proper motion is moved to each instant with SkyCoord.apply_space_motion (at a
nominal distance of 1 kpc and no radial velocity: only the direction matters).

Star and site names are invented. Deterministic: only the date in the header
changes between runs.
"""

import csv
import datetime as dt
import os
import warnings

import numpy as np
from astropy.utils import iers

iers.conf.auto_download = False
iers.conf.auto_max_age = None

import astropy.units as u
from astropy.coordinates import AltAz, EarthLocation, SkyCoord, get_sun, solar_system_ephemeris
from astropy.time import Time
from astropy.utils.exceptions import AstropyWarning
from erfa import ErfaWarning

# Read once, then silenced: IERS table range notices, ERFA's "dubious year"
# for instants past its leap-second table (both sides assume no new leap
# second), and "distance overridden" for the nominal 1 kpc of apply_space_motion.
warnings.simplefilter("ignore", AstropyWarning)
warnings.simplefilter("ignore", ErfaWarning)
solar_system_ephemeris.set("builtin")

HERE = os.path.dirname(os.path.abspath(__file__))

# name, ra (h), dec (deg), pmra* (mas/yr), pmdec (mas/yr), site (lat, lon east,
# elev m), scale, T0, P (d), Q (d), kind, secondary, first cycle, number of
# cycles (whole; half cycles added when secondary)
CASES = [
    ("Alder Var", 5.5, 30.0, 0, 0, (50.0, 10.0, 300.0), "bjd", 2459000.1234, 0.3712345, 0.0, "max", False, 5120, 8),
    ("Birch Var", 21.25, -45.5, 0, 0, (-31.27, 149.06, 1150.0), "hjd", 2450123.4567, 5.366341, 0.0, "max", False, 3070, 6),
    ("Cedar Ecl", 13.05, 61.2, 0, 0, (40.0, -105.0, 1600.0), "hjd", 2448500.2500, 1.2345678, 0.0, "min", True, 10020, 6),
    ("Damson Ecl", 0.35, 2.0, 0, 0, (0.0, -60.0, 0.0), "bjd", 2455555.5000, 2.7182818, 0.0, "min", True, 1440, 5),
    ("Elm Quad", 18.6, -12.0, 0, 0, (-23.5, 25.0, 50.0), "bjd", 2457000.0000, 0.6180339, 2.0e-9, "max", False, 9100, 6),
    ("Fir Fast", 10.14, 11.97, 4000, -3000, (64.8, 25.5, 20.0), "hjd", 2451545.3000, 0.1400000, 0.0, "max", False, 72870, 6),
    ("Ginkgo Old", 7.2, 20.0, 0, 0, (35.0, 139.7, 40.0), "hjd", 2440000.5000, 3.1415926, 0.0, "max", False, 2000, 5),
    ("Hazel Far", 16.8, -60.0, 0, 0, (-45.0, 170.0, 100.0), "bjd", 2465000.0000, 12.345678, 0.0, "min", True, 30, 4),
]


def coord_at(ra, dec, pmra, pmdec, t):
    if pmra == 0 and pmdec == 0:
        return SkyCoord(ra=ra * 15 * u.deg, dec=dec * u.deg, frame="icrs")
    c = SkyCoord(ra=ra * 15 * u.deg, dec=dec * u.deg, pm_ra_cosdec=pmra * u.mas / u.yr,
                 pm_dec=pmdec * u.mas / u.yr, distance=1000 * u.pc, radial_velocity=0 * u.km / u.s,
                 obstime=Time("J2000"), frame="icrs")
    return c.apply_space_motion(new_obstime=t)


def seen_at(T, scale, ra, dec, pmra, pmdec, loc):
    """The UTC instant whose HJD (UTC) or BJD (TDB) equals T."""
    kind = "barycentric" if scale == "bjd" else "heliocentric"
    tscale = "tdb" if scale == "bjd" else "utc"
    target = Time(T, format="jd", scale=tscale)
    t = Time(T, format="jd", scale=tscale).utc
    for _ in range(6):
        t.delta_ut1_utc = 0.0
        c = coord_at(ra, dec, pmra, pmdec, t)
        ltt = t.light_travel_time(c, kind, location=loc)
        t = (target - ltt).utc
    t.delta_ut1_utc = 0.0
    return t


def main():
    events, windows = [], []
    for (name, ra, dec, pmra, pmdec, (lat, lon, elev), scale, t0, p, q, kind, sec, e0, n) in CASES:
        loc = EarthLocation.from_geodetic(lon * u.deg, lat * u.deg, elev * u.m)
        cyc = []
        for e in range(e0, e0 + n):
            cyc.append(float(e))
            if sec:
                cyc.append(e + 0.5)
        rows = []
        for E in cyc:
            T = t0 + p * E + q * E * E
            t = seen_at(T, scale, ra, dec, pmra, pmdec, loc)
            c = coord_at(ra, dec, pmra, pmdec, t)
            aa = AltAz(obstime=t, location=loc, pressure=0)
            star = c.transform_to(aa)
            sun = get_sun(t).transform_to(aa)
            rows.append((E, T, t))
            events.append({
                "name": name, "ra_h": ra, "dec_deg": dec, "pmra_masyr": pmra, "pmdec_masyr": pmdec,
                "lat_deg": lat, "lon_deg": lon, "elev_m": elev, "timescale": scale,
                "epoch": f"{t0:.7f}", "period": f"{p:.9f}", "q": f"{q:.3e}", "kind": kind,
                "secondary": "true" if sec else "false",
                "cycle": f"{E:.1f}", "ephemeris_time": f"{T:.8f}", "utc_jd": f"{t.jd:.9f}",
                "utc_iso": t.isot + "Z", "alt_deg": f"{star.alt.deg:.6f}", "az_deg": f"{star.az.deg:.6f}",
                "sun_alt_deg": f"{sun.alt.deg:.6f}",
            })
        # A span whose ends lie midway between events 1|2 and (n-2)|(n-1).
        jds = [r[2].jd for r in rows]
        lo = (jds[0] + jds[1]) / 2
        hi = (jds[-2] + jds[-1]) / 2
        inside = [f"{r[0]:.1f}" for r in rows if lo <= r[2].jd < hi]
        windows.append({
            "name": name,
            "from": Time(lo, format="jd", scale="utc").isot + "Z",
            "to": Time(hi, format="jd", scale="utc").isot + "Z",
            "cycles": ";".join(inside),
        })
    header = (f"# Made by observe/testdata/predict/make_predict.py on {dt.date.today().isoformat()} with astropy "
              f"{__import__('astropy').__version__} (offline, builtin ephemeris, UT1 = UTC, airless, east longitude).\n")
    for fname, rows in (("events.csv", events), ("windows.csv", windows)):
        with open(os.path.join(HERE, fname), "w", newline="") as f:
            f.write(header)
            w = csv.DictWriter(f, fieldnames=list(rows[0].keys()))
            w.writeheader()
            w.writerows(rows)
    print(f"wrote {len(events)} events and {len(windows)} windows")


if __name__ == "__main__":
    main()
