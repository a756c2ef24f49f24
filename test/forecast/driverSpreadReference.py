# Reference quantiles of the driver spread model (test/forecast/driverSpread.test.ts), computed with NumPy
# (an independent library; version printed) from the definitions in src/forecast/quantiles/driverSpread.ts:
#   log |e(d, s)| = g0 + g' f(d, s) + v          least squares over every calibration day and slot
#                                                (Harvey 1976, Econometrica 44(3), 461-465)
#   sigma(d, s) = exp(fitted), the delivery day's log spread kept within the fitted range
#   u = e / sigma;  q_tau(s) = centre(s) + sigma(s) Q_tau({u})   (filtered historical simulation,
#                                                Barone-Adesi, Giannopoulos and Vosper 1999)
#   Q_tau: NumPy's default quantile, Hyndman and Fan's (1996) definition 7
#   f(d, s): cos and sin of 2 pi s / S and 4 pi s / S, the exogenous columns, the centre, and (errors on an
#            asinh scale) log cosh of the centre, from NumPy's cosh
#   python3 test/forecast/driverSpreadReference.py
import math
import numpy as np

print(f"numpy {np.__version__}")

S, DAYS = 6, 8
LEVELS = [0.1, 0.5, 0.9]
# Invented inputs (formulas shared with the test, evaluated the same way in both).
def error(d, s): return ((d * 7 + s * 3) % 11 - 5) * (1 + 0.3 * s) + 0.1 * d
def exog(d, s): return 20 + ((d * 5 + s * 2) % 9) * 1.5
def centre(d, s): return 40 + 3 * s - 0.5 * d

def features(ex, ce, asinh):
    rows = []
    for s in range(S):
        a = 2 * math.pi * s / S
        row = [math.cos(a), math.sin(a), math.cos(2 * a), math.sin(2 * a), ex[s], ce[s]]
        if asinh:
            row.append(float(np.log(np.cosh(ce[s]))))
        rows.append(row)
    return np.array(rows)

def quantiles(centre, target_centre, asinh):
    X = np.vstack([features([exog(d, s) for s in range(S)], [centre(d, s) for s in range(S)], asinh) for d in range(DAYS)])
    e = np.array([error(d, s) for d in range(DAYS) for s in range(S)])
    absolute = np.abs(e)
    floor = 1e-3 * np.quantile(absolute, 0.5)
    y = np.log(np.maximum(absolute, floor))
    design = np.hstack([np.ones((X.shape[0], 1)), X])
    g, *_ = np.linalg.lstsq(design, y, rcond=None)
    fitted = design @ g
    u = e / np.exp(fitted)
    target = np.hstack([np.ones((S, 1)), features([26 + s for s in range(S)], target_centre, asinh)])
    spread = np.exp(np.clip(target @ g, fitted.min(), fitted.max()))
    for pool in ("all", "slot"):
        print(pool)
        for s in range(S):
            sample = u if pool == "all" else u.reshape(DAYS, S)[:, s]
            q = [target_centre[s] + spread[s] * np.quantile(sample, tau) for tau in LEVELS]
            print("  [" + ", ".join(repr(float(v)) for v in q) + "],")

print("prices (no log cosh column)")
quantiles(centre, [50 + s for s in range(S)], False)
# Centres on an asinh scale, with the log cosh column.
def centre_z(d, s): return -2 + 0.7 * s - 0.15 * d
print("asinh scale (log cosh column)")
quantiles(centre_z, [-1.5 + 0.6 * s for s in range(S)], True)

# A refit day's regression: g fitted on the first REFIT_DAYS calibration days (those of an earlier day), then
# applied to all DAYS days of the delivery day's calibration (fitted log spreads, their range, u) and to its features.
REFIT_DAYS = 6
def quantiles_refit(centre, target_centre, asinh):
    X = np.vstack([features([exog(d, s) for s in range(S)], [centre(d, s) for s in range(S)], asinh) for d in range(DAYS)])
    e = np.array([error(d, s) for d in range(DAYS) for s in range(S)])
    n_refit = REFIT_DAYS * S
    absolute = np.abs(e[:n_refit])
    floor = 1e-3 * np.quantile(absolute, 0.5)
    y = np.log(np.maximum(absolute, floor))
    design = np.hstack([np.ones((X.shape[0], 1)), X])
    g, *_ = np.linalg.lstsq(design[:n_refit], y, rcond=None)
    fitted = design @ g
    u = e / np.exp(fitted)
    target = np.hstack([np.ones((S, 1)), features([26 + s for s in range(S)], target_centre, asinh)])
    spread = np.exp(np.clip(target @ g, fitted.min(), fitted.max()))
    print("all, refit")
    for s in range(S):
        q = [target_centre[s] + spread[s] * np.quantile(u, tau) for tau in LEVELS]
        print("  [" + ", ".join(repr(float(v)) for v in q) + "],")

print("a refit day's regression (first 6 days), prices")
quantiles_refit(centre, [50 + s for s in range(S)], False)
