#!/usr/bin/python3
"""Reference tables for vigil's timing, O-C and light-time code (package reduce).

Regenerate (offline, Debian python3-numpy; no scipy):
    cd testdata/timing && /usr/bin/python3 make_timing_refs.py

Writes, beside this script:
  eclipse_noisy.csv      synthetic eclipse (methods.md sec. 10 shape) + seeded noise
  cepheid_max.csv        synthetic asymmetric (Cepheid-like) maximum + seeded noise
  oc_noisy.csv           synthetic quadratic-ephemeris timings with sigmas + noise
  oc_unweighted.csv      the same times without sigmas
  lighttime_circ.csv     O-C timings with a circular light-time orbit + noise
  lighttime_ecc.csv      O-C timings with an eccentric light-time orbit + noise
  irwin_tau.csv          Irwin (1952) light-time term at given times (numpy Kepler solve)
  refs.csv               quantity,value: every reference number the Go tests read

All numbers come from numpy (np.polyfit with weights and covariance,
np.linalg.lstsq, np.roots) on the data written here; nothing is hand-edited.
Times are plain Julian dates on whatever scale the test states (synthetic).
"""
import math
import numpy as np

OUT = {}


def put(name, value):
    OUT[name] = float(value)


def write_csv(path, header_lines, cols, rows):
    with open(path, "w") as f:
        for h in header_lines:
            f.write("# " + h + "\n")
        f.write(",".join(cols) + "\n")
        for r in rows:
            f.write(",".join(repr(float(v)) for v in r) + "\n")


# ---------------------------------------------------------------------------
# 1. Extremum timing: numpy polyfit in a fixed window, root of dm/dt = 0,
#    sigma from the covariance propagated to the root (delta method).
def poly_extremum(t, m, err, lo, hi, deg, kind):
    sel = (t >= lo) & (t <= hi)
    tt, mm = t[sel], m[sel]
    t_ref = 0.5 * (tt.min() + tt.max())
    x = tt - t_ref
    if err is not None:
        c, cov = np.polyfit(x, mm, deg, w=1.0 / err[sel], cov="unscaled")
    else:
        c, cov = np.polyfit(x, mm, deg, cov=True)
    # cross-check with lstsq on the same weighted Vandermonde matrix
    A = np.vander(x, deg + 1)
    wv = 1.0 / err[sel] if err is not None else np.ones_like(x)
    c2 = np.linalg.lstsq(A * wv[:, None], mm * wv, rcond=None)[0]
    assert np.allclose(c, c2, rtol=1e-8, atol=1e-10)
    p = np.poly1d(c)
    d1, d2 = p.deriv(), p.deriv(2)
    roots = [r.real for r in np.roots(d1.coeffs) if abs(r.imag) < 1e-12]
    xlo, xhi = x.min(), x.max()
    good = []
    for r in roots:
        if xlo <= r <= xhi:
            curv = d2(r)
            if (kind == "max" and curv > 0) or (kind == "min" and curv < 0):
                good.append(r)
    assert good, "no turning point"
    r = min(good, key=p) if kind == "max" else max(good, key=p)
    # d x_root / d c_j (np.polyfit order: highest power first)
    g = np.zeros(deg + 1)
    for j in range(deg + 1):
        k = deg - j  # power of coefficient j
        if k >= 1:
            g[j] = -k * r ** (k - 1) / d2(r)
    sigma = math.sqrt(g @ cov @ g)
    return t_ref + r, sigma, int(sel.sum())


rng = np.random.default_rng(20260501)

# 1a. Eclipse of methods.md sec. 10 (T0 = 2460000.4321, width 0.02 d, depth
#     0.5 mag, 61 points 0.002 d apart) with Gaussian noise 0.005 mag.
T0_ECL = 2460000.4321
k = np.arange(61)
t_ecl = 2460000.3700 + 0.002 * k
m_ecl = 10 + 0.5 * np.exp(-(((t_ecl - T0_ECL) / 0.02) ** 2)) + rng.normal(0, 0.005, t_ecl.size)
e_ecl = np.full(t_ecl.size, 0.005)
write_csv("eclipse_noisy.csv",
          ["synthetic eclipse: m = 10 + 0.5 exp(-((t - 2460000.4321)/0.02)^2) + N(0, 0.005) (numpy default_rng(20260501))",
           "shape and sampling from methods.md sec. 10; min = largest magnitude at T0"],
          ["time", "mag", "err"], zip(t_ecl, m_ecl, e_ecl))
put("eclipse_true_time", T0_ECL)
for deg, lo, hi in [(2, 2460000.4220, 2460000.4420), (4, 2460000.4120, 2460000.4520)]:
    tx, sx, n = poly_extremum(t_ecl, m_ecl, e_ecl, lo, hi, deg, "min")
    put(f"eclipse_poly{deg}_from", lo)
    put(f"eclipse_poly{deg}_to", hi)
    put(f"eclipse_poly{deg}_time", tx)
    put(f"eclipse_poly{deg}_sigma", sx)
    put(f"eclipse_poly{deg}_n", n)
    tx, sx, n = poly_extremum(t_ecl, m_ecl, None, lo, hi, deg, "min")
    put(f"eclipse_poly{deg}_unweighted_time", tx)
    put(f"eclipse_poly{deg}_unweighted_sigma", sx)

# 1b. Cepheid-like maximum: fast rise, slow decline. m = 4 - 0.6 sum_k
#     (0.75^k / k) sin(k theta), theta = 2 pi (t - 2460100.0)/5.366 (a sawtooth
#     smoothed by the 0.75^k factors), sampled every ~0.012 d over 0.9 d around
#     the maximum, noise 0.006 mag.
P_CEP, EP_CEP = 5.366, 2460100.0
KS = np.arange(1, 6)


def cep_mag(t):
    th = 2 * np.pi * (np.asarray(t) - EP_CEP) / P_CEP
    return 4.0 - 0.6 * np.sum((0.75 ** KS / KS)[:, None] * np.sin(KS[:, None] * th[None, :]), axis=0)


def cep_dmag(t):
    th = 2 * np.pi * (t - EP_CEP) / P_CEP
    return -0.6 * np.sum(0.75 ** KS * np.cos(KS * th)) * 2 * np.pi / P_CEP


# true maximum light (smallest magnitude): dense grid, then bisection on dm/dt
grid = np.linspace(EP_CEP - 0.5, EP_CEP + 1.0, 150001)
i = int(np.argmin(cep_mag(grid)))
a, b = grid[i - 1], grid[i + 1]
for _ in range(200):
    mid = 0.5 * (a + b)
    if cep_dmag(a) * cep_dmag(mid) <= 0:
        b = mid
    else:
        a = mid
T_CEP = 0.5 * (a + b)
put("cepheid_true_time", T_CEP)
put("cepheid_true_mag", cep_mag([T_CEP])[0])
t_cep = np.sort(T_CEP - 0.45 + np.arange(76) * 0.012 + rng.uniform(-0.003, 0.003, 76))
m_cep = cep_mag(t_cep) + rng.normal(0, 0.006, t_cep.size)
write_csv("cepheid_max.csv",
          ["synthetic Cepheid-like maximum: m = 4 - 0.6 sum_{k=1..5} (0.75^k/k) sin(k*2pi(t - 2460100)/5.366) + N(0, 0.006)",
           "true time of maximum light in refs.csv (cepheid_true_time); no err column"],
          ["time", "mag"], zip(t_cep, m_cep))
lo, hi = T_CEP - 0.25, T_CEP + 0.25
tx, sx, n = poly_extremum(t_cep, m_cep, None, lo, hi, 3, "max")
put("cepheid_poly3_from", lo)
put("cepheid_poly3_to", hi)
put("cepheid_poly3_time", tx)
put("cepheid_poly3_sigma", sx)
put("cepheid_poly3_n", n)

# ---------------------------------------------------------------------------
# 2. O-C fits. Timings T = T0 + P E + Q E^2 + noise against the linear
#    ephemeris (T0 = 2450000.0, P = 0.4): methods.md sec. 11 synthetic case.
T0, P, Q = 2450000.0, 0.4, 2.0e-10
E = np.unique(np.round(np.sort(rng.uniform(0, 20000, 80)))).astype(float)
sig = rng.uniform(0.0003, 0.0012, E.size)
T = T0 + P * E + Q * E ** 2 + rng.normal(0, 1, E.size) * sig
write_csv("oc_noisy.csv",
          ["synthetic timings T = 2450000.0 + 0.4 E + 2e-10 E^2 + N(0, sigma) (numpy default_rng(20260501))",
           "O-C against the linear ephemeris T0 = 2450000.0, P = 0.4 d; cycle = round((time - T0)/P)"],
          ["time", "sigma", "cycle"], zip(T, sig, E))
write_csv("oc_unweighted.csv",
          ["the times of oc_noisy.csv without sigmas"], ["time", "cycle"], zip(T, E))
Ecyc = np.round((T - T0) / P)
assert np.array_equal(Ecyc, E)
OC = T - (T0 + P * E)


def oc_fit(prefix, w):
    # weighted: np.polyfit weights are 1/sigma; cov "unscaled" = formal (A^T W A)^-1
    for deg, name in [(1, "linear"), (2, "quadratic")]:
        if w is not None:
            c, cov = np.polyfit(E, OC, deg, w=w, cov="unscaled")
        else:
            c, cov = np.polyfit(E, OC, deg, cov=True)
        ww = w if w is not None else np.ones_like(E)
        A = np.vander(E, deg + 1)
        c2 = np.linalg.lstsq(A * ww[:, None], OC * ww, rcond=None)[0]
        assert np.allclose(c, c2, rtol=1e-7, atol=1e-12), (c, c2)
        res = (OC - np.polyval(c, E)) * ww
        chi2 = float(res @ res)
        c = c[::-1]               # constant first
        cov = cov[::-1, ::-1]
        put(f"{prefix}_{name}_epoch", T0 + c[0])
        put(f"{prefix}_{name}_period", P + c[1])
        put(f"{prefix}_{name}_epoch_err", math.sqrt(cov[0, 0]))
        put(f"{prefix}_{name}_period_err", math.sqrt(cov[1, 1]))
        put(f"{prefix}_{name}_chi2", chi2)
        put(f"{prefix}_{name}_dof", E.size - deg - 1)
        if deg == 2:
            q, per = c[2], P + c[1]
            put(f"{prefix}_quadratic_q", q)
            put(f"{prefix}_quadratic_q_err", math.sqrt(cov[2, 2]))
            gP, gQ = -2 * q / per ** 2, 2 / per
            put(f"{prefix}_quadratic_dpdt", 2 * q / per)
            put(f"{prefix}_quadratic_dpdt_err", math.sqrt(gP * gP * cov[1, 1] + gQ * gQ * cov[2, 2] + 2 * gP * gQ * cov[1, 2]))
        else:
            put(f"{prefix}_linear_cov_epoch_period", cov[0, 1])
    lin, quad = OUT[f"{prefix}_linear_chi2"], OUT[f"{prefix}_quadratic_chi2"]
    put(f"{prefix}_ftest_f", (lin - quad) / (quad / (E.size - 3)))


oc_fit("oc_weighted", 1.0 / sig)
oc_fit("oc_unweighted", None)

# ---------------------------------------------------------------------------
# 3. Light-time term, circular orbit: O-C = a0 + a1 E + A cos(2 pi (t - tmax)/P3)
#    + noise. Reference: grid in P3 + lstsq at each, golden-section refinement
#    (variable projection), covariance from a central-difference Jacobian of
#    all parameters at the optimum.
T0L, PL = 2451000.0, 0.8
EL = np.unique(np.round(np.sort(rng.uniform(0, 12000, 120)))).astype(float)
tL = T0L + PL * EL
P3, A3, TMAX = 2900.0, 0.012, 2453100.0
sigL = np.full(EL.size, 0.002)
ocL = 0.0015 - 2e-7 * EL + A3 * np.cos(2 * np.pi * (tL - TMAX) / P3) + rng.normal(0, 0.002, EL.size)
timesL = tL + ocL
write_csv("lighttime_circ.csv",
          ["synthetic O-C with a circular light-time orbit: P3 = 2900 d, A = 0.012 d, greatest delay at JD 2453100.0,",
           "ephemeris offset 0.0015 d - 2e-7 d * E, noise N(0, 0.002 d); ephemeris T0 = 2451000.0, P = 0.8 d"],
          ["time", "sigma", "cycle"], zip(timesL, sigL, EL))
ocLc = timesL - (T0L + PL * EL)
wL = 1 / sigL
tc = 0.5 * (timesL.min() + timesL.max())
span = timesL.max() - timesL.min()


def lin_at(p3, want_coef=False):
    X = np.column_stack([np.ones_like(EL), EL, np.sin(2 * np.pi * (timesL - tc) / p3), np.cos(2 * np.pi * (timesL - tc) / p3)])
    c = np.linalg.lstsq(X * wL[:, None], ocLc * wL, rcond=None)[0]
    r = (ocLc - X @ c) * wL
    return (float(r @ r), c) if want_coef else float(r @ r)


freqs = np.arange(1 / (span / 1.5), 1 / (span / 50), 1 / (10 * span))
chis = np.array([lin_at(1 / f) for f in freqs])
fb = freqs[int(np.argmin(chis))]
a, b = 1 / (fb + 1 / (10 * span)), 1 / (fb - 1 / (10 * span))
gr = (math.sqrt(5) - 1) / 2
for _ in range(200):
    c1, c2 = b - gr * (b - a), a + gr * (b - a)
    if lin_at(c1) < lin_at(c2):
        b = c2
    else:
        a = c1
p3b = 0.5 * (a + b)
chi2b, cb = lin_at(p3b, True)
ampb = math.hypot(cb[2], cb[3])
tmaxb = tc + math.atan2(cb[2], cb[3]) / (2 * math.pi) * p3b


def circ_model(par):
    a0, a1, amp, p3, tm = par
    return a0 + a1 * EL + amp * np.cos(2 * np.pi * (timesL - tm) / p3)


par = np.array([cb[0], cb[1], ampb, p3b, tmaxb])
steps = np.array([1e-7, 1e-11, 1e-7, 1e-4 * p3b / 1000, 1e-3])
J = np.zeros((EL.size, 5))
for j in range(5):
    up, dn = par.copy(), par.copy()
    up[j] += steps[j]
    dn[j] -= steps[j]
    J[:, j] = (circ_model(up) - circ_model(dn)) / (2 * steps[j])
covL = np.linalg.inv((J * wL[:, None] ** 2).T @ J)
put("ltc_period", p3b)
put("ltc_period_err", math.sqrt(covL[3, 3]))
put("ltc_amplitude", ampb)
put("ltc_amplitude_err", math.sqrt(covL[2, 2]))
put("ltc_tmax", tmaxb)
put("ltc_tmax_err", math.sqrt(covL[4, 4]))
put("ltc_chi2", chi2b)
put("ltc_true_period", P3)
put("ltc_true_amplitude", A3)

# ---------------------------------------------------------------------------
# 4. Irwin (1952) light-time term for an eccentric orbit, and timings with it.
def irwin_tau(t, amp, p3, tp, e, om):
    M = 2 * np.pi * (np.asarray(t) - tp) / p3
    Ea = M + e * np.sin(M)
    for _ in range(100):
        Ea = Ea - (Ea - e * np.sin(Ea) - M) / (1 - e * np.cos(Ea))
    nu = 2 * np.arctan2(np.sqrt(1 + e) * np.sin(Ea / 2), np.sqrt(1 - e) * np.cos(Ea / 2))
    return amp * ((1 - e * e) / (1 + e * np.cos(nu)) * np.sin(nu + om) + e * np.sin(om))


AE, PE, TPE, EE, OME = 0.015, 3300.0, 2454000.0, 0.45, math.radians(60.0)
tt = 2451000.0 + np.linspace(0, 9000, 37)
write_csv("irwin_tau.csv",
          ["Irwin (1952) tau = A[(1-e^2)/(1+e cos nu) sin(nu+omega) + e sin omega], Kepler by numpy Newton iteration",
           "A = 0.015 d, P3 = 3300 d, T_peri = 2454000.0, e = 0.45, omega = 60 deg"],
          ["time", "tau"], zip(tt, irwin_tau(tt, AE, PE, TPE, EE, OME)))
EX = np.unique(np.round(np.sort(rng.uniform(0, 14000, 150)))).astype(float)
tX = T0L + PL * EX
sigX = np.full(EX.size, 0.0015)
timesX = tX - 0.001 + 1e-7 * EX + irwin_tau(tX, AE, PE, TPE, EE, OME) + rng.normal(0, 0.0015, EX.size)
write_csv("lighttime_ecc.csv",
          ["synthetic O-C with an eccentric light-time orbit (the irwin_tau.csv elements) + ephemeris offset",
           "-0.001 d + 1e-7 d * E and noise N(0, 0.0015 d); ephemeris T0 = 2451000.0, P = 0.8 d"],
          ["time", "sigma", "cycle"], zip(timesX, sigX, EX))
# expected errors: Fisher matrix at the true elements (central differences)
ocX = timesX - (T0L + PL * EX)
tcX = 0.5 * (timesX.min() + timesX.max())


def ecc_model(par):
    a0, a1, amp, p3, tp, e, om = par
    return a0 + a1 * EX + irwin_tau(timesX, amp, p3, tp, e, om)


truth = np.array([-0.001, 1e-7, AE, PE, TPE, EE, OME])
steps = np.array([1e-7, 1e-11, 1e-7, 1e-3, 1e-3, 1e-6, 1e-6])
J = np.zeros((EX.size, 7))
for j in range(7):
    up, dn = truth.copy(), truth.copy()
    up[j] += steps[j]
    dn[j] -= steps[j]
    J[:, j] = (ecc_model(up) - ecc_model(dn)) / (2 * steps[j])
covX = np.linalg.inv((J / sigX[:, None] ** 2).T @ J)
for name, j in [("amplitude", 2), ("period", 3), ("tperi", 4), ("e", 5), ("omega_deg", 6)]:
    val = truth[j] if j != 6 else math.degrees(truth[j])
    err = math.sqrt(covX[j, j]) if j != 6 else math.degrees(math.sqrt(covX[j, j]))
    put(f"lte_true_{name}", val)
    put(f"lte_expected_{name}_err", err)

# ---------------------------------------------------------------------------
# 5. Intensity mean of a phased curve: flux = 10^(-0.4*4.0) (1 + 0.5 sin 2 pi phi)
#    sampled evenly at 40 phases: the trapezoid rule is exact for a sinusoid on
#    an even closed grid, so <V> = 4.0. numpy mean of the fluxes for the check.
ph = np.arange(40) / 40
flux = 10 ** (-0.4 * 4.0) * (1 + 0.5 * np.sin(2 * np.pi * ph))
vmag = -2.5 * np.log10(flux)
write_csv("intensity_phased.csv",
          ["V = -2.5 log10(10^(-1.6) (1 + 0.5 sin 2 pi phase)), 40 even phases"],
          ["phase", "mag"], zip(ph, vmag))
put("intensity_phased_mean", -2.5 * np.log10(np.mean(10 ** (-0.4 * vmag))))
put("intensity_phased_magmean", np.mean(vmag))

with open("refs.csv", "w") as f:
    f.write("# reference values written by make_timing_refs.py (numpy %s); do not edit\n" % np.__version__)
    f.write("quantity,value\n")
    for k2, v in OUT.items():
        f.write("%s,%r\n" % (k2, v))
print("wrote", len(OUT), "reference values")
