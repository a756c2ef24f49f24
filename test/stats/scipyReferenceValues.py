"""Regenerates the SciPy/NumPy reference values quoted in test/stats/*.test.ts.

Run with any Python that has SciPy (values in the tests came from SciPy 1.17.1, NumPy 2.4.6):
    python3 test/stats/scipyReferenceValues.py
Each line prints the test's name for the value, then the value with full precision.
"""
import numpy as np
from scipy import special, stats


def show(label, value):
    print(f"{label}: {float(value)!r}")


def kupiec_lr(n, x, p):
    phat = x / n
    l0 = special.xlogy(n - x, 1 - p) + special.xlogy(x, p)
    l1 = special.xlogy(n - x, 1 - phat) + special.xlogy(x, phat)
    return -2 * (l0 - l1)


def christoffersen(n00, n01, n10, n11, p):
    pi01 = n01 / (n00 + n01) if n00 + n01 else 0.0
    pi11 = n11 / (n10 + n11) if n10 + n11 else 0.0
    n = n00 + n01 + n10 + n11
    pi = (n01 + n11) / n
    markov = (special.xlogy(n00, 1 - pi01) + special.xlogy(n01, pi01)
              + special.xlogy(n10, 1 - pi11) + special.xlogy(n11, pi11))
    lr_ind = -2 * (special.xlogy(n00 + n10, 1 - pi) + special.xlogy(n01 + n11, pi) - markov)
    lr_uc = kupiec_lr(n, n01 + n11, p)
    return lr_ind, lr_uc, lr_uc + lr_ind


def diebold_mariano(d, h):
    d = np.asarray(d, float)
    n = len(d)
    e = d - d.mean()
    gamma = [np.sum(e[k:] * e[: n - k]) / n for k in range(h)]
    v = gamma[0] + 2 * sum(gamma[1:])
    dm = d.mean() / np.sqrt(v / n)
    hln = dm * np.sqrt((n + 1 - 2 * h + h * (h - 1) / n) / n)
    return float(dm), float(hln), float(stats.t.sf(hln, n - 1))


# special functions
show("gammaln(0.1)", special.gammaln(0.1))
show("gammaln(3.7)", special.gammaln(3.7))
show("gammaln(100.5)", special.gammaln(100.5))
show("gammainc(2.5, 1.7)", special.gammainc(2.5, 1.7))
show("gammainc(10, 12)", special.gammainc(10, 12))
show("gammaincc(0.5, 30)", special.gammaincc(0.5, 30))
show("betainc(2.5, 3.5, 0.4)", special.betainc(2.5, 3.5, 0.4))
show("betainc(0.5, 0.5, 0.1)", special.betainc(0.5, 0.5, 0.1))
show("betainc(30, 40, 0.45)", special.betainc(30, 40, 0.45))
# distributions
for x in (-1, 1.2345, -8):
    show(f"norm.cdf({x})", stats.norm.cdf(x))
for p in (0.975, 0.3, 1e-10, 0.999999, 5e-324):
    show(f"norm.ppf({p})", stats.norm.ppf(p))
for t, df in ((1.5, 5), (-2.3, 7.5), (0.3, 30), (-4, 3), (2, 1000)):
    show(f"t.cdf({t}, {df})", stats.t.cdf(t, df))
for x, df in ((3.84, 1), (5, 3), (20, 10.5)):
    show(f"chi2.cdf({x}, {df})", stats.chi2.cdf(x, df))
show("chi2.sf(50, 4)", stats.chi2.sf(50, 4))
# descriptive
data = np.array([3.1, 1.2, 5.5, 4.0, 2.2, 8.9, 0.4])
show("mean", np.mean(data))
show("var ddof=1", np.var(data, ddof=1))
for p in (0, 0.1, 0.25, 0.5, 0.9, 1):
    show(f"quantile linear {p}", np.quantile(data, p))
e = data - data.mean()
for k in range(4):
    show(f"autocovariance lag {k}", np.sum(e[k:] * e[: len(e) - k]) / len(e))
# tests
print("DM h=1 check series:", diebold_mariano([0.5, -0.2, 0.8, 0.1, 0.3, -0.4, 0.6, 0.2, 0, 0.4], 1))
print("DM h=1 [1, 2, 3, -2]:", diebold_mariano([1, 2, 3, -2], 1))
print("DM h=2 [1, 2, 3, 3, 2, 1]:", diebold_mariano([1, 2, 3, 3, 2, 1], 2))
for n, x, p in ((100, 15, 0.1), (250, 20, 0.05), (50, 0, 0.05), (20, 20, 0.9)):
    lr = float(kupiec_lr(n, x, p))
    print(f"Kupiec n={n} x={x} p={p}: LR {lr!r} p {float(stats.chi2.sf(lr, 1))!r}")
for counts, p in (((70, 10, 10, 10), 0.2), ((5, 2, 2, 0), 0.1)):
    lr_ind, lr_uc, lr_cc = (float(v) for v in christoffersen(*counts, p))
    print(f"Christoffersen {counts} p={p}: LR_ind {lr_ind!r} (p {float(stats.chi2.sf(lr_ind, 1))!r}), "
          f"LR_uc {lr_uc!r}, LR_cc {lr_cc!r} (p {float(stats.chi2.sf(lr_cc, 2))!r})")
