# Reference shifts of the day-level error regression (test/forecast/errorLevel.test.ts), computed with NumPy
# (an independent library; version printed) from the definitions in src/forecast/quantiles/errorLevel.ts:
#   m_s  = np.median of slot s's errors over the calibration days
#   y(d) = np.median over the slots of (e(d, s) - m_s)
#   x_k(t) = mean of y over the calibration days in [t - k, t - 1], k = 1, 7, 28 (Corsi 2009's daily,
#            weekly and monthly components)
#   b    = np.linalg.lstsq, no intercept, over the calibration days d with d - 28 >= the first day
#          (and every lookback non-empty): y(d) = sum_k b_k x_k(d) + v(d)
#   shift(t) = sum_k b_k x_k(t), for the delivery day and for every calibration day with all lookbacks
#   (an intercept correction, Clements and Hendry 1996, whose weights are estimated), used only when the
#   F test of b = 0 rejects at 5%: p = scipy.stats.f.sf(F, 3, rows - 3), F = (ESS / 3) / (RSS / (rows - 3))
# (the rows are also limited to the days within 364 days of the fit's day: all of this script's days) and, for
# the refit cadence, the same weights and slot medians applied to days after the fit ("refit cadence").
#   python3 test/forecast/errorLevelReference.py
import numpy as np
import scipy
from scipy import stats

print(f"numpy {np.__version__}, scipy {scipy.__version__}")

S = 5
LOOKBACKS = [1, 7, 28]
# Invented inputs (formulas shared with the test, evaluated the same way in both): 70 calibration days with
# day numbers 100.. and two gaps (days 131 and 150 missing), a slow wave in the day level plus slot terms.
DAY_NUMBERS = [100 + i for i in range(72) if 100 + i not in (131, 150)]
TARGET = 172
def error(t, s):
    return 0.6 * np.sin(t / 9.0) + 0.25 * (((t * 7 + s * 3) % 11) - 5) / 5 + 0.1 * s

days = np.array(DAY_NUMBERS)

def run(error, label):
  global y
  E = np.array([[error(t, s) for s in range(S)] for t in DAY_NUMBERS])
  m = np.median(E, axis=0)
  y = np.median(E - m, axis=1)
  rows, targets = [], []
  for i, t in enumerate(DAY_NUMBERS):
    if t - max(LOOKBACKS) < DAY_NUMBERS[0]:
      continue
    x = features(t)
    if x is None:
      continue
    rows.append(x)
    targets.append(y[i])
  X, Y = np.array(rows), np.array(targets)
  b, *_ = np.linalg.lstsq(X, Y, rcond=None)
  ess = float(b @ X.T @ Y)
  rss = float(Y @ Y) - ess
  F = (ess / 3) / (rss / (len(rows) - 3))
  p = stats.f.sf(F, 3, len(rows) - 3)
  print(label, "rows", len(rows), "weights", [repr(float(v)) for v in b], "F", repr(F), "p", repr(float(p)))
  used = p < 0.05
  print("  delivery day shift", repr(float(np.dot(features(TARGET), b)) if used else 0.0))
  for t in (110, 128, 132, 151, 171):
    x = features(t)
    print(f"  day {t} shift", repr(0.0 if x is None or not used else float(np.dot(x, b))))
  return b, m

def features(t):
    out = []
    for k in LOOKBACKS:
        inside = (days >= t - k) & (days <= t - 1)
        if not inside.any():
            return None
        out.append(y[inside].mean())
    return out

b_refit, m_refit = run(error, "a slow wave in the day level")
# The refit cadence (the Forecaster's driverCentre 'recent', driverRefitDays > 1): the weights and slot
# medians fitted for refit day 172 above are kept; days 172, 173 and 175 (174 missing) are measured
# against those slot medians, y(t) = median over s of (e(t, s) - m_s), and the shifts of days 173 and
# 176 use the same weights with lookbacks over every day before them (the refit day's calibration days
# and the days since).
NEW_DAYS = [172, 173, 175]
y_new = [float(np.median(np.array([error(t, s) for s in range(S)]) - m_refit)) for t in NEW_DAYS]
days = np.array(DAY_NUMBERS + NEW_DAYS)
y = np.concatenate([y, y_new])
print("refit cadence: levels of days 172, 173, 175", [repr(v) for v in y_new])
for t in (173, 176):
    print(f"  day {t} shift with the refit day's weights", repr(float(np.dot(features(t), b_refit))))
days = np.array(DAY_NUMBERS)
# Errors whose day level the lookbacks do not predict (F test not rejecting; the test's second case).
def scrambled(t, s):
    return (((t * 19) % 97) + s) / 97
run(scrambled, "scrambled")
# The F test's p-value alone (the test's fTestPValue cases): F = 1 with 3 and 37 degrees of freedom, F = 2.5 with 3 and 40.
print("f.sf(1, 3, 37)", repr(float(stats.f.sf(1, 3, 37))), "f.sf(2.5, 3, 40)", repr(float(stats.f.sf(2.5, 3, 40))))

# The quadratic term (driverCentre 'recent-quadratic'; fitErrorLevel with day means zbar(d)): a fourth column
#   q(t) = (zbar(t - 1) - c)^2 - Q, c = mean of zbar(t - 1) over the rows, Q = mean of (zbar(t - 1) - c)^2 over them,
# and the F test of all four weights at 1%: p = scipy.stats.f.sf(F, 4, rows - 4). Invented day means and errors
# whose day level carries the square of the day before's mean (formulas shared with the test):
def zbar(t):
    return 0.8 * np.sin(t / 4.0) + 0.3 * np.cos(t / 11.0)
def curved(t, s):
    return error(t, s) - 0.7 * zbar(t - 1) ** 2
E = np.array([[curved(t, s) for s in range(S)] for t in DAY_NUMBERS])
m = np.median(E, axis=0)
y = np.median(E - m, axis=1)
days = np.array(DAY_NUMBERS)
rows, targets, before = [], [], []
for i, t in enumerate(DAY_NUMBERS):
    x = features(t)
    if t - max(LOOKBACKS) < DAY_NUMBERS[0] or x is None:
        continue
    rows.append(x)
    targets.append(y[i])
    before.append(zbar(t - 1))
before = np.array(before)
c = before.mean()
Q = np.mean((before - c) ** 2)
X = np.column_stack([np.array(rows), (before - c) ** 2 - Q])
Y = np.array(targets)
b, *_ = np.linalg.lstsq(X, Y, rcond=None)
ess = float(b @ X.T @ Y)
rss = float(Y @ Y) - ess
F = (ess / 4) / (rss / (len(Y) - 4))
p = stats.f.sf(F, 4, len(Y) - 4)
print("quadratic term: rows", len(Y), "centre", repr(float(c)), "mean square", repr(float(Q)), "weights", [repr(float(v)) for v in b], "F", repr(F), "p", repr(float(p)))
def quadratic_shift(t):
    x = features(t)
    if x is None:
        return 0.0
    return float(np.dot(x, b[:3]) + b[3] * ((zbar(t - 1) - c) ** 2 - Q))
print("  delivery day shift", repr(quadratic_shift(TARGET)))
# The day before the delivery day with a mean of 5 (beyond every row's zbar(t - 1)): it takes the rows' greatest,
# before.max(), so the weights (fitted on rows whose day before is day 170 at the latest) and the shift are those
# of that value.
x = features(TARGET)
print("  delivery day shift with zbar(171) = 5, clamped to", repr(float(before.max())), repr(float(np.dot(x, b[:3]) + b[3] * ((before.max() - c) ** 2 - Q))))
for t in (110, 128, 171):
    print(f"  day {t} shift", repr(quadratic_shift(t)))
# Without the quadratic term the same errors' F test (3 weights, the 'recent' regression):
Xh = np.array(rows)
bh, *_ = np.linalg.lstsq(Xh, Y, rcond=None)
essh = float(bh @ Xh.T @ Y)
Fh = (essh / 3) / ((float(Y @ Y) - essh) / (len(Y) - 3))
print("  the same errors without the quadratic term: F", repr(Fh), "p", repr(float(stats.f.sf(Fh, 3, len(Y) - 3))), "delivery day shift", repr(float(np.dot(features(TARGET), bh))))
