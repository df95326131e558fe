#!/usr/bin/python3
"""Reference times of extremum for observe/logbook's polyExtremum, by numpy.

Regenerate (offline, Debian's python3-numpy):
    /usr/bin/python3 observe/logbook/testdata/polyextremum.py
It writes observe/logbook/testdata/polyextremum.csv beside itself.

Each case makes its points from a formula (the Go test makes the same
points), fits m = sum a_k x^k with x = (t - mean t)/half-span by numpy's
least squares (np.linalg.lstsq, SVD), takes the real root of dm/dx inside
the span nearest x = 0 with the wanted curvature (m'' > 0 for maximum
light, < 0 for minimum light), and propagates the covariance
s^2 (X^T X)^-1, s^2 = RSS/(n - deg - 1), to the root:
dx*/da_k = -k x*^(k-1) / m''(x*).

Cases "methods-*": the check data of the methods sheet, section 10:
t_k = 2460000.3700 + 0.002 k (k = 0..60), m = 10 + 0.5 exp(-((t - 2460000.4321)/0.02)^2),
perturbed by e_k = 0.003((37k mod 17) - 8)/8; the parabola through the 11
points within 0.0101 d of the faintest sample.
"""
import math
import os
import numpy as np

T0 = 2460000.4321


def methods_points(perturbed):
    t = np.array([2460000.3700 + 0.002 * k for k in range(61)])
    m = 10 + 0.5 * np.exp(-((t - T0) / 0.02) ** 2)
    if perturbed:
        m = m + np.array([0.003 * (((37 * k) % 17) - 8) / 8 for k in range(61)])
    i = int(np.argmax(m))
    keep = np.abs(t - t[i]) <= 0.0101
    return t[keep], m[keep]


def pulsator_points(perturbed):
    # A smooth asymmetric maximum: m = 11 - 0.4 cos(2 pi u) - 0.08 sin(2 pi u)... at 61 points.
    t = np.array([2459500.1000 + 0.0015 * k for k in range(61)])
    u = (t - 2459500.1450) / 0.5
    m = 11 - 0.4 * np.cos(2 * math.pi * u) + 0.06 * np.sin(4 * math.pi * u)
    if perturbed:
        m = m + np.array([0.004 * (((29 * k) % 13) - 6) / 6 for k in range(61)])
    return t, m


def fit(t, m, deg, max_light):
    mean = t.mean()
    h = (t.max() - t.min()) / 2
    x = (t - mean) / h
    X = np.vander(x, deg + 1, increasing=True)
    a, res, rank, sv = np.linalg.lstsq(X, m, rcond=None)
    rss = float(np.sum((m - X @ a) ** 2))
    s2 = rss / (len(x) - deg - 1)
    cov = s2 * np.linalg.inv(X.T @ X)
    d1 = np.array([k * a[k] for k in range(1, deg + 1)])  # increasing powers
    d2 = np.array([k * (k - 1) * a[k] for k in range(2, deg + 1)])
    roots = np.roots(d1[::-1])
    best = None
    for r in roots:
        if abs(r.imag) > 1e-12:
            continue
        r = r.real
        if r < x.min() or r > x.max():
            continue
        curv = np.polyval(d2[::-1], r)
        if (max_light and curv > 0) or (not max_light and curv < 0):
            if best is None or abs(r) < abs(best):
                best = r
    curv = np.polyval(d2[::-1], best)
    g = np.array([0.0] + [-k * best ** (k - 1) / curv for k in range(1, deg + 1)])
    sigma = math.sqrt(max(float(g @ cov @ g), 0.0)) * h
    return mean + best * h, sigma


def main():
    here = os.path.dirname(os.path.abspath(__file__))
    rows = []
    for name, pts, deg, max_light in [
        ("methods-clean", methods_points(False), 2, False),
        ("methods-perturbed", methods_points(True), 2, False),
        ("pulsator-deg3", pulsator_points(True), 3, True),
        ("pulsator-deg4", pulsator_points(True), 4, True),
        ("pulsator-deg2-clean", pulsator_points(False), 2, True),
    ]:
        t, m = pts
        te, s = fit(t, m, deg, max_light)
        rows.append((name, deg, "max" if max_light else "min", len(t), te, s))
    with open(os.path.join(here, "polyextremum.csv"), "w") as f:
        f.write("# Reference extremum times for polyExtremum, made by polyextremum.py with numpy %s\n" % np.__version__)
        f.write("# (np.linalg.lstsq fit, np.roots of the derivative). Do not edit: regenerate with\n")
        f.write("#   /usr/bin/python3 observe/logbook/testdata/polyextremum.py\n")
        f.write("# t_ext is a Julian date (the scale of the input times); sigma_days the propagated formal error.\n")
        f.write("case,degree,kind,n,t_ext,sigma_days\n")
        for r in rows:
            f.write("%s,%d,%s,%d,%.10f,%.6e\n" % r)


if __name__ == "__main__":
    main()
