#!/usr/bin/python3
"""Reference tables for vigil's reduce package.

Regenerate from the repository root (offline; Debian python3-astropy 5.2.1,
python3-numpy):

    /usr/bin/python3 testdata/reduce/make_reduce.py

The tables are written beside this script:

    times.csv              HJD_UTC and BJD_TDB from astropy for stars, sites
                           (and the Earth's centre) and instants
    ensemble_input.csv     synthetic instrumental photometry, 5 comparison
                           stars C1..C5 and check star K, with missing cells
    ensemble_expected.csv  that table reduced by numpy with the formulas of
                           the command-line contract (spec/cli.md, vigil
                           reduce), written independently of the Go code,
                           plus astropy's HJD_UTC and BJD_TDB of each row
    ensemble_summary.csv   check_mean, check_std, n, skipped of that reduction
    badcomp_input.csv      the same stars, comparison C3 with a catalogue
                           magnitude 0.30 mag too faint (see the Go test)
    badcomp_expected.csv   that table reduced by numpy with C3 left out

Settings: UT1 = UTC (delta_ut1_utc = 0, as vigil assumes), the 'builtin'
solar-system ephemeris (ERFA epv00), no IERS download. HJD is counted on the
UTC scale (JD_UTC + heliocentric light time), BJD on TDB (JD_TDB +
barycentric light time), both by Time.light_travel_time. The Earth's centre
is EarthLocation.from_geocentric(0, 0, 0). Longitudes are east-positive.

Everything is deterministic: fixed seeds, fixed lists. Only the date in the
header changes between runs.
"""

import csv
import datetime as dt
import os
import sys
import warnings

import numpy as np

from astropy.utils import iers

iers.conf.auto_download = False
iers.conf.auto_max_age = None

import astropy  # noqa: E402
import astropy.units as u  # noqa: E402
from astropy.coordinates import EarthLocation, SkyCoord  # noqa: E402
from astropy.time import Time  # noqa: E402

warnings.simplefilter("ignore")  # IERS-table age warnings: read once, UT1 = UTC is set below

HERE = os.path.dirname(os.path.abspath(__file__))
HEADER = [
    "# made by testdata/reduce/make_reduce.py on %s with astropy %s, numpy %s"
    % (dt.date.today().isoformat(), astropy.__version__, np.__version__),
    "# UT1 = UTC; builtin ephemeris; longitude east-positive; HJD on UTC, BJD on TDB",
]


def write(name, head, rows, comments=()):
    with open(os.path.join(HERE, name), "w", newline="") as f:
        for c in list(HEADER) + list(comments):
            f.write(c + "\n")
        w = csv.writer(f, lineterminator="\n")
        w.writerow(head)
        for r in rows:
            w.writerow(r)


def light_times(jd_utc, ra_h, dec_deg, loc):
    """HJD_UTC and BJD_TDB of the instants (JD UTC) for the star seen at loc."""
    t = Time(jd_utc, format="jd", scale="utc", location=loc)
    t.delta_ut1_utc = 0.0
    star = SkyCoord(ra=ra_h * 15 * u.deg, dec=dec_deg * u.deg, frame="icrs")
    helio = t.light_travel_time(star, "heliocentric", ephemeris="builtin")
    bary = t.light_travel_time(star, "barycentric", ephemeris="builtin")
    hjd = t.utc.jd1 + (t.utc.jd2 + helio.to_value(u.day))
    tdb = t.tdb
    bjd = tdb.jd1 + (tdb.jd2 + bary.to_value(u.day))
    return hjd, bjd


GEOCENTRE = EarthLocation.from_geocentric(0 * u.m, 0 * u.m, 0 * u.m)


def times_table():
    stars = [  # name, RA (h), Dec (deg)
        ("delta_cep", 22.486184728, 58.415198306),  # ICRS of methods.md §7
        ("meeus_21a", 10.139527778, 11.967222222),  # Meeus Ex. 21.a star, methods.md §7
        ("south_pole_near", 6.4, -84.5),
        ("ecliptic_spring", 0.5, 2.0),
        ("ecliptic_autumn", 12.2, -3.5),
        ("north_ecl_pole", 18.0, 66.56),
    ]
    sites = [  # name, lat, lon (E), elevation m; None: the Earth's centre
        ("geocentre", None),
        ("europe", (50.0, 10.0, 0.0)),
        ("andes", (-30.2, -70.7, 2500.0)),
        ("pacific", (21.3, -157.9, 10.0)),
        ("dateline", (-45.0, 179.9, 300.0)),
    ]
    rng = np.random.default_rng(20241221)
    instants = [2460666.3333333333, 2460360.5, 2460542.5]  # methods.md §7 checks
    instants += list(2444239.5 + rng.random(20) * (2466154.5 - 2444239.5))  # 1980..2040
    instants += list(2460666.0 + np.arange(0, 1.0, 0.0625))  # one day, every 1.5 h
    rows = []
    for sname, loc in sites:
        el = GEOCENTRE if loc is None else EarthLocation.from_geodetic(loc[1] * u.deg, loc[0] * u.deg, loc[2] * u.m)
        for name, ra, dec in stars:
            jd = np.array(instants)
            hjd, bjd = light_times(jd, ra, dec, el)
            for k in range(len(jd)):
                lat, lon, elev = ("", "", "") if loc is None else loc
                rows.append([sname, name, "%.9f" % ra, "%.9f" % dec, lat, lon, elev,
                             "%.10f" % jd[k], "%.10f" % hjd[k], "%.10f" % bjd[k]])
    write("times.csv", ["site", "star", "ra_h", "dec_deg", "lat_deg", "lon_deg", "elev_m",
                        "jd_utc", "hjd_utc", "bjd_tdb"], rows)


# The synthetic photometry: target RA/Dec and site used for its times.
TARGET = (22.486184728, 58.415198306)  # RA h, Dec deg
SITE = (50.0, 10.0, 0.0)
CATALOG = {"C1": 11.200, "C2": 12.050, "C3": 10.700, "C4": 11.640, "C5": 12.310}
CHECK = ("K", 11.650)


def photometry_input(seed, cat_error):
    """Rows of instrumental photometry (strings, as written) over three nights."""
    rng = np.random.default_rng(seed)
    rows = []
    jd0 = 2460666.30
    for night in range(3):
        for k in range(40):
            jd = jd0 + night + 0.004 * k
            z = 19.32 + 0.05 * night + 0.02 * np.sin(k / 7.0)  # zero point drifts
            v_true = 11.80 + 0.25 * np.sin(2 * np.pi * (jd - jd0) / 0.71)
            row = {"jd_utc": "%.6f" % jd}
            row["target"] = "%.4f" % (v_true - z + rng.normal(0, 0.006))
            row["target_err"] = "%.4f" % (0.004 + 0.003 * rng.random())
            for i, (cid, cmag) in enumerate(CATALOG.items()):
                sig = 0.003 + 0.002 * i
                true_c = cmag + cat_error.get(cid, 0.0)
                row[cid] = "%.4f" % (true_c - z + rng.normal(0, sig))
                row[cid + "_err"] = "%.4f" % (sig * (0.9 + 0.2 * rng.random()))
            row["K"] = "%.4f" % (CHECK[1] + 0.004 - z + rng.normal(0, 0.008))
            row["K_err"] = "%.4f" % 0.008
            rows.append(row)
    # Missing cells: errors, single comparison stars, the target, everything.
    for k in range(0, len(rows), 9):
        rows[k]["C2_err"] = ""  # an unknown error: equal weights in that row
    for k in range(4, len(rows), 11):
        rows[k]["C4"] = ""  # star not measured: left out of that row
        rows[k]["C4_err"] = ""
    for k in (17, 63):
        rows[k]["target"] = ""  # no target: skipped
        rows[k]["target_err"] = ""
    for k in (30, 95):
        for cid in CATALOG:  # no comparison star: skipped
            rows[k][cid] = ""
            rows[k][cid + "_err"] = ""
    for k in (50,):  # a single comparison star with an error
        for cid in ("C1", "C2", "C4", "C5"):
            rows[k][cid] = ""
            rows[k][cid + "_err"] = ""
    for k in (51,):  # a single comparison star without an error
        for cid in ("C1", "C3", "C4", "C5"):
            rows[k][cid] = ""
            rows[k][cid + "_err"] = ""
        rows[k]["C2_err"] = ""
    for k in (70, 71):
        rows[k]["K"] = ""  # check star not measured
        rows[k]["target_err"] = ""  # target error unknown: counts 0
    return rows


def num(s):
    return float(s) if s != "" else np.nan


def reduce_numpy(rows, comps):
    """The contract's formulas, row by row, with the comparison stars comps."""
    out = []
    skipped = 0
    checks = []
    for r in rows:
        v = num(r["target"])
        cs = [(CATALOG[c] - num(r[c]), num(r[c + "_err"])) for c in comps if r[c] != ""]
        if np.isnan(v) or not cs:
            skipped += 1
            continue
        z = np.array([c[0] for c in cs])
        e = np.array([c[1] for c in cs])
        if len(z) == 1:
            zp, szp = z[0], (0.0 if np.isnan(e[0]) else e[0])
        elif np.all(e > 0):
            w = 1 / e**2
            zp, szp = np.sum(w * z) / np.sum(w), 1 / np.sqrt(np.sum(w))
        else:
            zp, szp = np.mean(z), np.std(z, ddof=1) / np.sqrt(len(z))
        te = num(r["target_err"])
        te = 0.0 if np.isnan(te) else te
        mag, err = v + zp, np.sqrt(te**2 + szp**2)
        k = num(r["K"])
        chk = k + zp if not np.isnan(k) else np.nan
        if not np.isnan(chk):
            checks.append(chk)
        out.append((r["jd_utc"], mag, err, chk))
    checks = np.array(checks)
    summary = (np.mean(checks), np.std(checks, ddof=1), len(out), skipped)
    return out, summary


def write_input(name, rows):
    head = ["jd_utc", "target", "target_err"]
    for c in CATALOG:
        head += [c, c + "_err"]
    head += ["K", "K_err"]
    write(name, head, [[r[h] for h in head] for r in rows],
          ["# synthetic instrumental magnitudes; comparison stars C1..C5 = %s; check K = %.3f"
           % (", ".join("%.3f" % m for m in CATALOG.values()), CHECK[1])])


def write_expected(name, out, with_times):
    rows = []
    jd = np.array([float(o[0]) for o in out])
    if with_times:
        loc = EarthLocation.from_geodetic(SITE[1] * u.deg, SITE[0] * u.deg, SITE[2] * u.m)
        hjd, bjd = light_times(jd, TARGET[0], TARGET[1], loc)
    for k, (j, mag, err, chk) in enumerate(out):
        r = [j, "%.10f" % mag, "%.10f" % err, "" if np.isnan(chk) else "%.10f" % chk]
        if with_times:
            r += ["%.10f" % hjd[k], "%.10f" % bjd[k]]
        rows.append(r)
    head = ["jd_utc", "mag", "err", "check_mag"] + (["hjd_utc", "bjd_tdb"] if with_times else [])
    write(name, head, rows, ["# target RA %.9f h, Dec %.9f deg; site lat %.1f, lon %.1f E, %.0f m"
                             % (TARGET + SITE)])


def main():
    times_table()
    rows = photometry_input(7, {})
    write_input("ensemble_input.csv", rows)
    out, summ = reduce_numpy(rows, list(CATALOG))
    write_expected("ensemble_expected.csv", out, True)
    write("ensemble_summary.csv", ["check_mean", "check_std", "n", "skipped"],
          [["%.10f" % summ[0], "%.10f" % summ[1], summ[2], summ[3]]])
    bad = photometry_input(11, {"C3": 0.30})
    write_input("badcomp_input.csv", bad)
    out, _ = reduce_numpy(bad, ["C1", "C2", "C4", "C5"])
    write_expected("badcomp_expected.csv", out, False)
    return 0


if __name__ == "__main__":
    sys.exit(main())
