#!/usr/bin/python3
"""Inputs for the tests of `vigil extremum` (cmd/vigil/extremum_test.go).

Regenerate (offline, plain Python 3, no packages):
    cd cmd/vigil/testdata && /usr/bin/python3 extremum_make_eclipse.py

Writes, beside this script, the eclipse check of methods.md sec. 10 [C]:
    t_k = 2460000.3700 + 0.002 k (k = 0..60),
    m_k = 10 + 0.5 exp(-((t_k - 2460000.4321)/0.02)^2)   (minimum light at T0 = 2460000.4321)
  extremum_eclipse.csv            noise-free
  extremum_eclipse_perturbed.csv  plus e_k = 0.003((37k mod 17) - 8)/8
  extremum_one_sided.csv          the noise-free points up to k = 30 only (t <= 2460000.43),
                                  which stop before the minimum: one side only
Times are written with 7 decimals and magnitudes with 9, as Python's format gives them.
"""
import math

T0 = 2460000.4321


def point(k, perturbed):
    t = 2460000.3700 + 0.002 * k
    m = 10 + 0.5 * math.exp(-(((t - T0) / 0.02) ** 2))
    if perturbed:
        m += 0.003 * (((37 * k) % 17) - 8) / 8
    return t, m


def write(path, title, ks, perturbed):
    with open(path, "w") as f:
        f.write("# " + title + "\n")
        f.write("# written by extremum_make_eclipse.py from methods.md sec. 10; do not edit\n")
        f.write("time,mag\n")
        for k in ks:
            t, m = point(k, perturbed)
            f.write("%.7f,%.9f\n" % (t, m))


write("extremum_eclipse.csv", "eclipse of methods.md sec. 10, noise-free: minimum light at 2460000.4321",
      range(61), False)
write("extremum_eclipse_perturbed.csv",
      "eclipse of methods.md sec. 10 plus e_k = 0.003((37k mod 17) - 8)/8: minimum light at 2460000.4321",
      range(61), True)
write("extremum_one_sided.csv", "eclipse of methods.md sec. 10 cut at k = 30, before the minimum",
      range(31), False)
