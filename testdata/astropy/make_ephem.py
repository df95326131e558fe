#!/usr/bin/python3
"""Reference tables for vigil's ephem package, computed with astropy.

Regenerate from the repository root (offline; Debian python3-astropy 5.2.1,
python3-numpy):

    /usr/bin/python3 testdata/astropy/make_ephem.py

or `make refdata`. The tables are written beside this script:

    stars.csv        star altitude/azimuth, hour angle, apparent RA/Dec of date, GAST
    timescales.csv   TT, TDB, heliocentric and barycentric light-time corrections
    sunmoon.csv      topocentric Sun and Moon, geocentric Moon, illumination, star-Moon separation
    nights.csv       sunset/sunrise, twilights, moonrise/moonset by vigil's definitions
    leapseconds.csv  the TAI-UTC table astropy/ERFA use
    deltat.csv       TT-UT1 from astropy's bundled IERS-B UT1-UTC (1962 on)

Settings, the same for every table: airless (AltAz pressure = 0), longitude
east-positive, UT1 = UTC (delta_ut1_utc = 0, as vigil assumes) except in
deltat.csv, the 'builtin' solar-system ephemeris (ERFA epv00 for the Earth
and Sun, ERFA moon98 for the Moon), no IERS download. Polar motion: astropy
takes it from its bundled IERS-B table (1962-01-01 to 2022-11-29) and uses
its 50-year mean (x = 0.035", y = 0.29") outside it; vigil ignores polar
motion, which moves altitudes and azimuths by under 0.5".

Before 1960 ERFA has no TAI-UTC (it takes 0, a "dubious year"), so astropy's
TT = UTC + 32.184 s; from 1960 to 1971 it uses the rubber-second UTC offsets.
vigil counts instants before 1972 as UT with TT = UT + DeltaT (Meeus table
10.A). The tables carry astropy's own TT; the Go test compares time scales
only from 1972 on and compares the light-time corrections on their own before.

Everything is deterministic: fixed seeds, fixed lists. Only the date in the
header changes between runs.
"""

import csv
import datetime as dt
import io
import os
import re
import sys
import warnings

import numpy as np

from astropy.utils import iers

iers.conf.auto_download = False
iers.conf.auto_max_age = None

import astropy  # noqa: E402
import astropy.units as u  # noqa: E402
import erfa  # noqa: E402
from astropy.coordinates import (  # noqa: E402
    GCRS,
    TETE,
    AltAz,
    EarthLocation,
    SkyCoord,
    get_body,
    get_sun,
)
from astropy.time import Time  # noqa: E402

OUT = os.path.dirname(os.path.abspath(__file__))
COMMAND = "/usr/bin/python3 testdata/astropy/make_ephem.py   (or: make refdata)"

# Warnings are collected and shown once each at the end (stderr).
_seen_warnings = {}


def _show_warning(message, category, filename, lineno, file=None, line=None):
    text = re.sub(r"yielded \d+ of", "yielded N of", str(message).split("\n")[0])
    key = (category.__name__, text[:160])
    _seen_warnings[key] = _seen_warnings.get(key, 0) + 1


warnings.showwarning = _show_warning
warnings.simplefilter("always")
# astropy's logger prints AstropyWarnings itself; route them through warnings only.
astropy.log.setLevel("ERROR")

# ---------------------------------------------------------------------------
# Inputs

# label, latitude (deg, north+), longitude (deg, EAST+), elevation (m)
SITES = [
    ("n52-e13", 52.52, 13.40, 35.0),
    ("n32-w112", 31.96, -111.60, 2096.0),
    ("s29-w71", -29.26, -70.73, 2400.0),
    ("s34-e18", -33.93, 18.47, 10.0),
    ("n20-w155", 19.82, -155.47, 4200.0),
    ("s46-e171", -45.87, 170.50, 100.0),
    ("n70-e19", 69.65, 18.96, 10.0),
    ("n78-e16", 78.22, 15.65, 10.0),
    ("s78-e167", -77.85, 166.67, 20.0),
    ("n00-w180", 0.30, -179.70, 0.0),
    ("n64-w22", 64.13, -21.90, 50.0),
    ("n40-w4", 40.42, -3.70, 650.0),
]

# Fixed stars: label, RA (h), Dec (deg), pmRA* (mas/yr, mu_alpha cos delta), pmDec (mas/yr).
# Catalogue-like places chosen for the geometry they test (pole, fast proper
# motion, ecliptic poles); the labels are invented.
FIXED_STARS = [
    ("pole-n", 2.530301, 89.264109, 44.48, -11.85),
    ("pole-s", 21.146485, -88.956499, 25.96, 5.02),
    ("fast-a", 17.963472, 4.693391, -802.80, 10362.54),
    ("fast-b", 21.116694, 38.749414, 4164.21, 3249.99),
    ("fast-c", 14.661361, -60.833939, -3679.25, 473.67),
    ("ecl-n", 18.0, 66.560708, 0.0, 0.0),
    ("ecl-s", 6.0, -66.560708, 0.0, 0.0),
    ("eq-0", 0.0, 0.0, 0.0, 0.0),
]

START_1950 = dt.datetime(1950, 1, 1)
END_2050 = dt.datetime(2050, 1, 1)

J2000 = Time("J2000.0", scale="tt")

# ---------------------------------------------------------------------------
# Helpers


def utc_days_with_steps():
    """UTC dates whose length is not 86400 s (leap seconds, 1960s steps)."""
    days = set()
    for y, m, _ in erfa.leap_seconds.get():
        d = dt.date(int(y), int(m), 1) - dt.timedelta(days=1)
        days.add(d)
    return days


def random_instants(rng, n):
    """n instants uniform over 1950-2050, whole milliseconds, as datetimes.

    Days that end in a leap second are avoided: on them astropy's UTC Julian
    date counts 86401 s to the day, vigil's 86400, and the two Julian dates of
    one ISO label differ (the labels themselves agree)."""
    bad = utc_days_with_steps()
    span_ms = int((END_2050 - START_1950).total_seconds() * 1000)
    out = []
    while len(out) < n:
        ms = int(rng.integers(0, span_ms))
        t = START_1950 + dt.timedelta(milliseconds=ms)
        if t.date() in bad:
            continue
        out.append(t)
    return out


def iso(t):
    """ISO 8601 UTC label with milliseconds and a Z."""
    return t.strftime("%Y-%m-%dT%H:%M:%S.") + f"{t.microsecond // 1000:03d}Z"


def atime(dts):
    """astropy UTC Time from datetimes, with UT1 = UTC."""
    t = Time([d.strftime("%Y-%m-%dT%H:%M:%S.%f") for d in dts], format="isot", scale="utc")
    t.delta_ut1_utc = 0.0
    return t


def location(lat, lon, elev):
    return EarthLocation.from_geodetic(lon=lon * u.deg, lat=lat * u.deg, height=elev * u.m)


def altaz(t, loc):
    return AltAz(obstime=t, location=loc, pressure=0 * u.hPa)


def stars_at(ra_h, dec, pmra, pmdec, t):
    """ICRS unit-sphere places of stars at the instants t, proper motion applied
    from epoch J2000.0 (TT) by astropy's space motion (erfa.pmsafe). The stars
    are put at 10 pc with zero radial velocity only so that astropy can move
    them (straight-line motion in space: the direction follows the unit vector
    plus proper motion times time, renormalised); the distance is dropped
    afterwards (no parallax)."""
    c = SkyCoord(
        ra=np.asarray(ra_h) * 15 * u.deg,
        dec=np.asarray(dec) * u.deg,
        pm_ra_cosdec=np.asarray(pmra) * u.mas / u.yr,
        pm_dec=np.asarray(pmdec) * u.mas / u.yr,
        distance=10 * u.pc,
        radial_velocity=0 * u.km / u.s,
        frame="icrs",
        obstime=J2000,
    )
    m = c.apply_space_motion(new_obstime=t)
    return SkyCoord(ra=m.ra, dec=m.dec, frame="icrs")


def diff_seconds(a, b):
    """(a - b) in seconds between the Julian dates of two Time objects that
    may be on different scales, keeping the two-part precision."""
    return ((a.jd1 - b.jd1) + (a.jd2 - b.jd2)) * 86400.0


def wrap_hours(h):
    return (h + 12.0) % 24.0 - 12.0


def header(title, settings_extra=()):
    lines = [
        f"# {title}",
        f"# source: astropy {astropy.__version__} (pyerfa {erfa.__version__}, numpy {np.__version__}),"
        " Debian python3-astropy, offline",
        f"# generated: {dt.date.today().isoformat()}",
        "# settings: airless (AltAz pressure=0); longitude EAST-positive; UT1 = UTC (delta_ut1_utc=0);"
        " builtin ephemeris (ERFA epv00, moon98); polar motion from bundled IERS-B"
        " (1962-01-01..2022-11-29), its 50-yr mean outside",
        "# scales: instants are UTC (ISO 8601 labels); before 1972 astropy's TT = UTC + (ERFA TAI-UTC,"
        " 0 before 1960) + 32.184 s",
    ]
    lines += [f"# {s}" for s in settings_extra]
    lines.append(f"# regenerate: {COMMAND}")
    return lines


def write_table(name, head, columns, rows):
    path = os.path.join(OUT, name)
    buf = io.StringIO()
    for line in head:
        buf.write(line + "\n")
    w = csv.writer(buf, lineterminator="\n")
    w.writerow(columns)
    for r in rows:
        w.writerow(r)
    with open(path, "w", encoding="utf-8") as f:
        f.write(buf.getvalue())
    print(f"wrote {name}: {len(rows)} rows", file=sys.stderr)


def f7(x):
    return f"{x:.7f}"


def f6(x):
    return f"{x:.6f}"


def f9(x):
    return f"{x:.9f}"


def random_stars(rng, n):
    ra = rng.uniform(0, 24, n)
    dec = np.degrees(np.arcsin(rng.uniform(-1, 1, n)))
    pmra = rng.normal(0, 150, n)
    pmdec = rng.normal(0, 150, n)
    return [(f"rnd-{i:02d}", ra[i], dec[i], pmra[i], pmdec[i]) for i in range(n)]


# ---------------------------------------------------------------------------
# a. Star positions


def table_stars(rng):
    pool = FIXED_STARS + random_stars(rng, 60)
    # Quotas per site by astropy's airless altitude: below the horizon, low,
    # middle, high, near the zenith.
    bins = [(-90, 0, 3), (0, 10, 4), (10, 45, 7), (45, 80, 7), (80, 90.01, 4)]
    rows = []
    for label, lat, lon, elev in SITES:
        loc = location(lat, lon, elev)
        # Candidates: each fixed star at 5 instants (first, so that the
        # quotas take them when they qualify), then stars drawn from the pool,
        # a third of which are moved near the zenith (Dec near the latitude,
        # RA near the local sidereal time).
        stars = [s for s in FIXED_STARS for _ in range(5)]
        nfixed = len(stars)
        n = nfixed + 240
        when = random_instants(rng, n)
        t = atime(when)
        stars += [pool[i] for i in rng.integers(0, len(pool), n - nfixed)]
        last = t.sidereal_time("apparent", longitude=lon * u.deg).hour
        for k in range(nfixed, n, 3):
            dec = float(np.clip(lat + rng.uniform(-4, 4), -89.9, 89.9))
            ra = float((last[k] + rng.uniform(-0.25, 0.25)) % 24)
            stars[k] = (f"zen-{label}-{k:03d}", ra, dec, rng.normal(0, 50), rng.normal(0, 50))
        ra = [s[1] for s in stars]
        dec = [s[2] for s in stars]
        pmra = [s[3] for s in stars]
        pmdec = [s[4] for s in stars]
        c = stars_at(ra, dec, pmra, pmdec, t)
        aa = c.transform_to(altaz(t, loc))
        te = c.transform_to(TETE(obstime=t, location=loc))
        last = t.sidereal_time("apparent", longitude=lon * u.deg).hour
        gast = t.sidereal_time("apparent", "greenwich").hour
        alt = aa.alt.deg
        taken = []
        for lo, hi, quota in bins:
            got = [k for k in range(n) if lo <= alt[k] < hi][:quota]
            taken += got
        for k in sorted(taken):
            s = stars[k]
            rows.append([
                label, f"{lat:.4f}", f"{lon:.4f}", f"{elev:.1f}",
                s[0], f"{s[1]:.8f}", f"{s[2]:.8f}", f"{s[3]:.3f}", f"{s[4]:.3f}",
                iso(when[k]),
                f7(alt[k]), f7(aa.az.deg[k]),
                f"{wrap_hours(last[k] - te.ra.hour[k]):.8f}",
                f"{te.ra.hour[k]:.8f}", f7(te.dec.deg[k]),
                f"{gast[k]:.9f}",
            ])
    cols = ["site", "lat_deg", "lon_deg", "elev_m", "star", "ra_h", "dec_deg", "pmra_mas_yr",
            "pmdec_mas_yr", "utc", "alt_deg", "az_deg", "ha_h", "ra_app_h", "dec_app_deg", "gast_h"]
    head = header(
        "a. star positions: airless topocentric altitude, azimuth (north through east), hour angle"
        " (LAST - apparent RA), apparent RA/Dec of date (TETE with the site: true equator and equinox,"
        " annual + diurnal aberration), Greenwich apparent sidereal time (IAU 2006/2000A)",
        ["stars: ICRS at epoch J2000.0 (TT), proper motion mas/yr (pmra = mu_alpha cos delta) applied by"
         " SkyCoord.apply_space_motion at 10 pc, rv = 0, then distance dropped (no parallax)"],
    )
    write_table("stars.csv", head, cols, rows)


# ---------------------------------------------------------------------------
# b. Time scales, HJD and BJD_TDB


def table_timescales(rng):
    pool = FIXED_STARS + random_stars(rng, 40)
    n = 200
    rows = []
    when = random_instants(rng, n)
    # Four instants chosen by hand: two days either side of 1972-01-01 (where
    # UTC starts whole-second steps) and either side of the leap second at the
    # end of 2016 (on the days next to it, not on the leap day itself).
    extra = [dt.datetime(1971, 12, 30, 12), dt.datetime(1972, 1, 2, 12),
             dt.datetime(2016, 12, 30, 23, 59, 59), dt.datetime(2017, 1, 1, 0, 0, 1)]
    when = when[: n - len(extra)] + extra
    sidx = rng.integers(0, len(SITES), n)
    stidx = rng.integers(0, len(pool), n)
    for k in range(n):
        label, lat, lon, elev = SITES[sidx[k]]
        s = pool[stidx[k]]
        loc = location(lat, lon, elev)
        t = atime([when[k]])
        c = stars_at([s[1]], [s[2]], [s[3]], [s[4]], t)
        helio = t.light_travel_time(c, "heliocentric", location=loc)
        bary = t.light_travel_time(c, "barycentric", location=loc)
        tt_s = diff_seconds(t.tt, t.utc)[0]
        tdb_s = diff_seconds(t.tdb, t.utc)[0]
        helio_s = helio.to_value(u.s)[0]
        bary_s = bary.to_value(u.s)[0]
        # Julian dates for reading; the test uses the seconds columns.
        jd_utc = 2440587.5 + (when[k] - dt.datetime(1970, 1, 1)).total_seconds() / 86400.0
        rows.append([
            label, f"{lat:.4f}", f"{lon:.4f}", f"{elev:.1f}",
            s[0], f"{s[1]:.8f}", f"{s[2]:.8f}", f"{s[3]:.3f}", f"{s[4]:.3f}",
            iso(when[k]),
            f6(tt_s), f6(tdb_s), f6(helio_s), f6(bary_s),
            f9(jd_utc + helio_s / 86400.0), f9(jd_utc + (tdb_s + bary_s) / 86400.0),
        ])
    cols = ["site", "lat_deg", "lon_deg", "elev_m", "star", "ra_h", "dec_deg", "pmra_mas_yr",
            "pmdec_mas_yr", "utc", "tt_minus_utc_s", "tdb_minus_utc_s", "helio_s", "bary_s",
            "hjd_utc", "bjd_tdb"]
    head = header(
        "b. time scales and light-time corrections: TT - UTC, TDB - UTC (astropy Time, geocentric TDB),"
        " heliocentric and barycentric corrections (Time.light_travel_time, Roemer delay to the Sun's"
        " centre / solar-system barycentre, star direction after proper motion)",
        ["hjd_utc = JD(UTC label) + helio_s/86400; bjd_tdb = JD(UTC label) + (tdb_minus_utc_s + bary_s)/86400",
         "JD(UTC label) counts 86400 s per day; no instant lies on a day that ends in a leap second"],
    )
    write_table("timescales.csv", head, cols, rows)


# ---------------------------------------------------------------------------
# c. Sun and Moon


def moon_geo_direction(t):
    """Geocentric apparent Moon direction as a unit-sphere GCRS coordinate
    (no parallax when transformed to a site's AltAz)."""
    m = get_body("moon", t)
    return SkyCoord(ra=m.ra, dec=m.dec, frame=GCRS(obstime=t))


def moon_illumination(t):
    """Illuminated fraction k = (1 + cos i)/2, i the phase angle at the Moon
    between the Sun and the Earth, from astropy's geocentric Sun and Moon."""
    s = get_sun(t).cartesian.xyz.to_value(u.km)
    m = get_body("moon", t).cartesian.xyz.to_value(u.km)
    a = s - m
    b = -m
    cross = np.linalg.norm(np.cross(a, b, axis=0), axis=0)
    dot = np.sum(a * b, axis=0)
    i = np.arctan2(cross, dot)
    return (1 + np.cos(i)) / 2


def table_sunmoon(rng):
    pool = FIXED_STARS + random_stars(rng, 40)
    rows = []
    for label, lat, lon, elev in SITES:
        loc = location(lat, lon, elev)
        n = 60
        when = random_instants(rng, n)
        t = atime(when)
        sun = get_sun(t).transform_to(altaz(t, loc))
        moon = get_body("moon", t, location=loc).transform_to(altaz(t, loc))
        mgeo = moon_geo_direction(t).transform_to(altaz(t, loc))
        illum = moon_illumination(t)
        # Stars: half near the Moon (0.3 to 10 degrees from its topocentric
        # place), half drawn from the pool.
        mt = get_body("moon", t, location=loc)
        stars = []
        for k in range(n):
            if k % 2 == 0:
                off = SkyCoord(ra=mt.ra[k], dec=mt.dec[k], frame="icrs")
                sep = rng.uniform(0.3, 10) * u.deg
                pa = rng.uniform(0, 360) * u.deg
                p = off.directional_offset_by(pa, sep)
                stars.append((f"near-moon-{label}-{k:02d}", p.ra.hour, p.dec.deg, 0.0, 0.0))
            else:
                stars.append(pool[int(rng.integers(0, len(pool)))])
        c = stars_at([s[1] for s in stars], [s[2] for s in stars], [s[3] for s in stars],
                     [s[4] for s in stars], t)
        caa = c.transform_to(altaz(t, loc))
        msep = caa.separation(moon).deg
        # Keep 13 rows a site: 8 with the Moon above 10 degrees, 5 others.
        up = [k for k in range(n) if moon.alt.deg[k] > 10][:8]
        other = [k for k in range(n) if moon.alt.deg[k] <= 10][:5]
        for k in sorted(up + other):
            s = stars[k]
            rows.append([
                label, f"{lat:.4f}", f"{lon:.4f}", f"{elev:.1f}", iso(when[k]),
                f7(sun.alt.deg[k]), f7(sun.az.deg[k]),
                f7(moon.alt.deg[k]), f7(moon.az.deg[k]),
                f7(mgeo.alt.deg[k]), f7(mgeo.az.deg[k]),
                f"{illum[k]:.6f}",
                s[0], f"{s[1]:.8f}", f"{s[2]:.8f}", f"{s[3]:.3f}", f"{s[4]:.3f}", f7(msep[k]),
            ])
    cols = ["site", "lat_deg", "lon_deg", "elev_m", "utc", "sun_alt_deg", "sun_az_deg",
            "moon_alt_deg", "moon_az_deg", "moon_geo_alt_deg", "moon_geo_az_deg", "moon_illum",
            "star", "ra_h", "dec_deg", "pmra_mas_yr", "pmdec_mas_yr", "star_moon_sep_deg"]
    head = header(
        "c. Sun and Moon: topocentric airless alt/az of the Sun (get_sun) and the Moon"
        " (get_body('moon', location)), altitude/azimuth of the geocentric Moon direction,"
        " illuminated fraction (1 + cos i)/2 from the geocentric Sun and Moon vectors,"
        " star-Moon separation seen from the site (both in AltAz)",
        ["the builtin Moon is ERFA moon98 (after Meeus 1998, ch. 47): the lunar theory is the same"
         " family as vigil's, so these rows test frames, parallax and time scales more than the theory"],
    )
    write_table("sunmoon.csv", head, cols, rows)


# ---------------------------------------------------------------------------
# d. Nights

NIGHTS = [
    ("n52-e13", "2024-06-20"), ("n52-e13", "2024-12-21"), ("n52-e13", "1965-03-15"),
    ("n52-e13", "2049-09-10"), ("n52-e13", "2017-03-01"),
    ("n32-w112", "1975-01-10"), ("n32-w112", "2023-07-04"), ("n32-w112", "2040-10-31"),
    ("n32-w112", "1957-09-09"),
    ("s29-w71", "1988-05-05"), ("s29-w71", "2024-12-21"), ("s29-w71", "2049-12-30"),
    ("s29-w71", "2003-03-03"),
    ("s34-e18", "1950-08-20"), ("s34-e18", "2001-01-01"), ("s34-e18", "2030-04-12"),
    ("n20-w155", "1999-12-31"), ("n20-w155", "2016-12-31"), ("n20-w155", "2012-06-30"),
    ("s46-e171", "1960-02-02"), ("s46-e171", "2026-06-21"), ("s46-e171", "2044-11-30"),
    ("n70-e19", "2024-06-21"), ("n70-e19", "2024-12-21"), ("n70-e19", "2020-03-20"),
    ("n70-e19", "2024-05-10"), ("n70-e19", "1955-01-25"),
    ("n78-e16", "2024-06-21"), ("n78-e16", "2023-12-21"), ("n78-e16", "2024-02-20"),
    ("s78-e167", "2024-06-21"), ("s78-e167", "2024-12-21"), ("s78-e167", "2030-08-20"),
    ("n00-w180", "2000-03-20"), ("n00-w180", "2033-09-15"),
    ("n64-w22", "2024-06-21"), ("n64-w22", "1970-11-10"), ("n64-w22", "2045-02-14"),
    ("n40-w4", "1980-07-15"), ("n40-w4", "2010-10-10"), ("n40-w4", "2035-01-01"),
]

SUNRISE_ALT = -0.8333
TWILIGHTS = [("sunset", "sunrise", SUNRISE_ALT), ("civil_dusk", "civil_dawn", -6.0),
             ("nautical_dusk", "nautical_dawn", -12.0), ("astro_dusk", "astro_dawn", -18.0)]
MOONRISE_ALT = 0.125
GRAZE_WARN_DEG = 0.05  # an extremum this close to a threshold makes an event fragile


def sun_alt(t, loc):
    return get_sun(t).transform_to(altaz(t, loc)).alt.deg


def moon_geo_alt(t, loc):
    return moon_geo_direction(t).transform_to(altaz(t, loc)).alt.deg


def crossings(t0, fn, level, minutes):
    """Crossings of fn(t) through level in [t0, t0 + minutes]: sampled each
    minute, then each second within the bracketing minute, then linear
    interpolation between the two bracketing seconds (the altitude curves are
    straight to < 1e-4 arcsec over a second). Returns [(Time, rising)] and the
    sampled values."""
    grid = t0 + np.arange(minutes + 1) * u.min
    grid.delta_ut1_utc = 0.0
    y = fn(grid) - level
    out = []
    for i in range(minutes):
        a, b = y[i], y[i + 1]
        if (a < 0) == (b < 0):
            continue
        sub = grid[i] + np.arange(61) * u.s
        sub.delta_ut1_utc = 0.0
        ys = fn(sub) - level
        j = next(j for j in range(60) if (ys[j] < 0) != (ys[j + 1] < 0))
        frac = ys[j] / (ys[j] - ys[j + 1])
        out.append((sub[j] + frac * u.s, b > a))
    return out, y


def near_extremum_margin(y):
    """Smallest |value| at a local extremum of the sampled curve (a grazing
    approach to the level)."""
    m = np.inf
    for i in range(1, len(y) - 1):
        if (y[i] >= y[i - 1] and y[i] >= y[i + 1]) or (y[i] <= y[i - 1] and y[i] <= y[i + 1]):
            m = min(m, abs(y[i]))
    return m


def label_of(t):
    return t.utc.isot + "Z"


def table_nights():
    sites = {s[0]: s for s in SITES}
    rows = []
    for label, date in NIGHTS:
        _, lat, lon, elev = sites[label]
        loc = location(lat, lon, elev)
        d = dt.datetime.strptime(date, "%Y-%m-%d")
        # Local mean noon of the date to local mean noon of the next date,
        # local mean time = UTC + lon/15 h.
        start_dt = d + dt.timedelta(hours=12) - dt.timedelta(microseconds=round(lon / 15 * 3600e6))
        start = atime([start_dt])[0]
        start.delta_ut1_utc = 0.0
        # The end is a label, 24 h of UTC labels later: on a day with a leap
        # second (or a 1960s rubber-second day) the night is not 86400 SI
        # seconds long. The minute grid covers [start, start + 1440 min];
        # any second left over at the end holds no event of these tables.
        end = atime([start_dt + dt.timedelta(days=1)])[0]
        end.delta_ut1_utc = 0.0
        minutes = 1440
        ev = {}
        sun_y = None
        for dusk, dawn, level in TWILIGHTS:
            cs, y = crossings(start, lambda tt: sun_alt(tt, loc), level, minutes)
            if near_extremum_margin(y) < GRAZE_WARN_DEG:
                print(f"warning: {label} {date}: Sun grazes {level} deg", file=sys.stderr)
            downs = [c for c, r in cs if not r]
            ups = [c for c, r in cs if r]
            ev[dusk] = downs[0] if downs else None
            ev[dawn] = ups[-1] if ups else None
            if level == SUNRISE_ALT:
                sun_y = y + level
        down_start = sun_y[0] < SUNRISE_ALT
        down_end = sun_y[-1] < SUNRISE_ALT
        always_up = ev["sunset"] is None and ev["sunrise"] is None and not down_start
        always_down = ev["sunset"] is None and ev["sunrise"] is None and down_start
        dark_from = ev["sunset"] if ev["sunset"] is not None else (start if down_start else None)
        dark_to = ev["sunrise"] if ev["sunrise"] is not None else (end if down_end else None)
        ev["moonrise"] = ev["moonset"] = None
        mcs, my = crossings(start, lambda tt: moon_geo_alt(tt, loc), MOONRISE_ALT, minutes)
        if near_extremum_margin(my) < GRAZE_WARN_DEG:
            print(f"warning: {label} {date}: Moon grazes {MOONRISE_ALT} deg", file=sys.stderr)
        if dark_from is not None and dark_to is not None and dark_from < dark_to:
            for c, rising in mcs:
                if abs((c - dark_from).to_value(u.s)) < 120 or abs((c - dark_to).to_value(u.s)) < 120:
                    print(f"warning: {label} {date}: Moon event {label_of(c)} within 2 min of the"
                          " dark span's edge", file=sys.stderr)
                if not (dark_from <= c <= dark_to):
                    continue
                if rising and ev["moonrise"] is None:
                    ev["moonrise"] = c
                if not rising and ev["moonset"] is None:
                    ev["moonset"] = c
        names = ["sunset", "sunrise", "civil_dusk", "civil_dawn", "nautical_dusk", "nautical_dawn",
                 "astro_dusk", "astro_dawn", "moonrise", "moonset"]
        rows.append([label, f"{lat:.4f}", f"{lon:.4f}", f"{elev:.1f}", date,
                     label_of(start), label_of(end)]
                    + [label_of(ev[k]) if ev[k] is not None else "" for k in names]
                    + [int(always_up), int(always_down)])
    cols = ["site", "lat_deg", "lon_deg", "elev_m", "date", "start_utc", "end_utc",
            "sunset", "sunrise", "civil_dusk", "civil_dawn", "nautical_dusk", "nautical_dawn",
            "astro_dusk", "astro_dawn", "moonrise", "moonset", "sun_always_up", "sun_always_down"]
    head = header(
        "d. nights by vigil's definitions: night = local mean noon of the date to the next local mean"
        " noon (local mean time = UTC + lon/15 h); Sun = topocentric airless centre altitude (get_sun"
        " -> AltAz) at -0.8333 (sunset/sunrise), -6, -12, -18 deg; dusk = first downward crossing,"
        " dawn = last upward crossing; Moon = altitude of the GEOCENTRIC Moon direction at +0.125 deg,"
        " first rise and first set within sunset..sunrise (the whole night if the Sun never rises)",
        ["method: astropy altitudes each minute, then each second inside the bracketing minute,"
         " then linear interpolation (error far below 0.01 s); empty cell = does not happen that night",
         "sun_always_up / sun_always_down: no sunset and no sunrise, Sun above / below -0.8333 deg"],
    )
    write_table("nights.csv", head, cols, rows)


# ---------------------------------------------------------------------------
# e. Leap seconds, and Delta T


def table_leapseconds():
    Time("2020-01-01", scale="utc").tt  # makes astropy load its leap-second table into ERFA
    tab = erfa.leap_seconds.get()
    expires = erfa.leap_seconds.expires.strftime("%Y-%m-%d")
    rows = []
    for y, m, v in tab:
        day = dt.date(int(y), int(m), 1)
        prev = day - dt.timedelta(days=1)
        # erfa.dat is the TAI - UTC function astropy's UTC conversions call.
        at = erfa.dat(day.year, day.month, day.day, 0.0)
        before = erfa.dat(prev.year, prev.month, prev.day, 0.5)
        rows.append([day.isoformat(), f"{v:.7f}", f"{at:.7f}", f"{before:.7f}", expires])
    cols = ["date", "erfa_tai_utc_s", "tai_minus_utc_s", "tai_minus_utc_day_before_s", "table_expires"]
    head = header(
        "e. leap seconds: the TAI - UTC table ERFA uses inside astropy (erfa.leap_seconds.get() after"
        " astropy loaded its bundled Leap_Second.dat), and TAI - UTC by erfa.dat at 0h UTC of each"
        " date and at 12h UTC of the day before",
        [f"table_expires: the date up to which astropy's table is known complete; rows before 1972 are the rubber-second"
         " offsets (their rate terms are in erfa.dat, not in the table) and have no whole-second equivalent"],
    )
    write_table("leapseconds.csv", head, cols, rows)


def table_deltat():
    rows = []
    for y in range(1962, 2023):
        for mo in (1, 7):
            day = dt.datetime(y, mo, 15)
            if day > dt.datetime(2022, 11, 15):
                continue
            t = Time(day.strftime("%Y-%m-%dT%H:%M:%S"), scale="utc")  # UT1 from IERS-B here
            tt_ut1 = diff_seconds(t.tt, t.ut1)
            ut1_utc = diff_seconds(t.ut1, t.utc)
            rows.append([day.strftime("%Y-%m-%d"), f"{tt_ut1:.4f}", f"{ut1_utc:.4f}"])
    cols = ["utc", "tt_minus_ut1_s", "ut1_minus_utc_s"]
    head = [
        "# e2. Delta T = TT - UT1 at 0h UTC, with UT1 - UTC from astropy's bundled IERS-B table"
        " (eopc04_IAU2000.62-now) and TT from astropy's UTC (rubber-second offsets before 1972)",
        f"# source: astropy {astropy.__version__} (pyerfa {erfa.__version__}), Debian python3-astropy, offline",
        f"# generated: {dt.date.today().isoformat()}",
        "# settings: this table alone does NOT set UT1 = UTC",
        f"# regenerate: {COMMAND}",
    ]
    write_table("deltat.csv", head, cols, rows)


def main():
    rng = np.random.default_rng(20240611)
    table_leapseconds()
    table_deltat()
    table_stars(rng)
    table_timescales(rng)
    table_sunmoon(rng)
    table_nights()
    for (cat, msg), n in sorted(_seen_warnings.items()):
        print(f"note: {n} x {cat}: {msg}", file=sys.stderr)


if __name__ == "__main__":
    main()
