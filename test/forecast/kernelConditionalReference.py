# Reference quantiles of the 'level' pool of the driver spread model (test/forecast/kernelConditional.test.ts),
# computed with NumPy (an independent library; version printed) from the definitions in
# src/forecast/quantiles/driverSpread.ts and kernelConditionalQuantiles.ts:
#   log |e(d, s)| = g0 + g' f(d, s) + v      least squares (Harvey 1976), as driverSpreadReference.py
#   u = e / sigma;  q_tau(s) = centre(s) + sigma(s) Q_tau(u | centre(s))
#   Q_tau(u | x): every u in ascending order (np.argsort, stable: ties by row), its own point forecast x_i
#     in population standard deviations of the x_i (np.std), Epanechnikov weights
#     w_i = max(0, 1 - ((x_i - x) / h)^2) with h = 0.5, doubled while Kish's effective sample size
#     (sum w)^2 / sum w^2 is below min(500, n); the value v_j of positive weight sits at the level
#     (C_j - w_j) / (C_last - w_last) (C the cumulative weights), and the quantile is interpolated
#     linearly in the level by np.interp (Hall, Wolff and Yao 1999; Hyndman and Fan 1996 definition 7
#     when the weights are equal); computed at the states g h / 4 (g integer) and interpolated linearly
#     between the two around the target.
#   python3 test/forecast/kernelConditionalReference.py
import math
import numpy as np

print(f"numpy {np.__version__}")

S, DAYS = 24, 30
LEVELS = [0.05, 0.25, 0.5, 0.75, 0.95]
# Invented inputs (formulas shared with the test, evaluated the same way in both): errors whose skew
# changes with the point forecast's level (a longer left tail where the forecast is low).
def centre(d, s): return math.sin(0.7 * s + 0.3 * d) * 2 + 0.05 * d
def exog(d, s): return 20 + ((d * 5 + s * 2) % 9) * 1.5
def error(d, s):
    base = ((d * 7 + s * 3) % 11 - 5) / 5
    return base * (1.5 if (base < 0 and centre(d, s) < 0) else 1) + 0.01 * s

def features(ex, ce):
    rows = []
    for s in range(S):
        a = 2 * math.pi * s / S
        rows.append([math.cos(a), math.sin(a), math.cos(2 * a), math.sin(2 * a), ex[s], ce[s], 0.0])
    return np.array(rows)

X = np.vstack([features([exog(d, s) for s in range(S)], [centre(d, s) for s in range(S)]) for d in range(DAYS)])
e = np.array([error(d, s) for d in range(DAYS) for s in range(S)])
absolute = np.abs(e)
floor = 1e-3 * np.quantile(absolute, 0.5)
y = np.log(np.maximum(absolute, floor))
# The constant log cosh column (errors on prices) is left out, as standardisedGram leaves out a constant column.
design = np.hstack([np.ones((X.shape[0], 1)), X[:, :-1]])
g, *_ = np.linalg.lstsq(design, y, rcond=None)
fitted = design @ g
u = e / np.exp(fitted)
target_centre = np.array([math.sin(0.7 * s) * 2.2 for s in range(S)])
target = np.hstack([np.ones((S, 1)), features([26 + s for s in range(S)], list(target_centre))[:, :-1]])
spread = np.exp(np.clip(target @ g, fitted.min(), fitted.max()))

x = X[:, 5]
sd = np.std(x)
order = np.argsort(u, kind="stable")
values, states = u[order], x[order] / sd
n = len(values)

def conditional(t):
    h = 0.5
    while True:
        w = np.maximum(0.0, 1 - ((states - t) / h) ** 2)
        if w.sum() > 0 and w.sum() ** 2 / (w ** 2).sum() >= min(500, n):
            break
        h *= 2
    keep = w > 0
    v, wk = values[keep], w[keep]
    c = np.cumsum(wk)
    levels = (c - wk) / (c[-1] - wk[-1])
    return [float(np.interp(tau, levels, v)) for tau in LEVELS]

# On the grid of states g * step (step = h / 4), linear in between.
step = 0.5 * 0.25
print("level pool")
for s in range(S):
    t = target_centre[s] / sd / step
    g = math.floor(t)
    lam = t - g
    below, above = conditional(g * step), conditional((g + 1) * step)
    q = [target_centre[s] + spread[s] * ((1 - lam) * b + lam * a) for b, a in zip(below, above)]
    print("  [" + ", ".join(repr(float(v)) for v in q) + "],")
