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

# The quadratic term (driverCentre 'recent-quadratic'; fitErrorLevel with day means zbar(d)):
#   q(t) = (zbar(t - 1) - c)^2 - Q, c = mean of zbar(t - 1) over the rows, Q = mean of (zbar(t - 1) - c)^2 over them;
# the lookbacks' weights b as above (np.linalg.lstsq on the three columns, used when scipy.stats.f.sf(F, 3, n - 3)
# < 0.01, else 0), then the quadratic term's weight on what they leave, u = y - X b: b_q = q'u / q'q, used when
# scipy.stats.f.sf(F, 1, n - 1) < 0.01 with F = b_q q'u / ((u'u - b_q q'u) / (n - 1)); a delivery day's zbar(t - 1)
# beyond the rows' is clamped into [min, max] of them. Invented day means and errors whose day level carries the
# square of the day before's mean (formulas shared with the test):
def zbar(t):
    return ((t * 37) % 23) / 11.5 - 1
def curved(t, s):
    return 0.25 * (((t * 7 + s * 3) % 11) - 5) / 5 + 0.1 * s - 0.7 * zbar(t - 1) ** 2
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
X = np.array(rows)
Y = np.array(targets)
n = len(Y)
bh, *_ = np.linalg.lstsq(X, Y, rcond=None)
essh = float(bh @ X.T @ Y)
ph = stats.f.sf((essh / 3) / ((float(Y @ Y) - essh) / (n - 3)), 3, n - 3)
if not ph < 0.01:
    bh = np.zeros(3)
q = (before - c) ** 2 - Q
u = Y - X @ bh
bq = float(q @ u) / float(q @ q)
essq = bq * float(q @ u)
Fq = essq / ((float(u @ u) - essq) / (n - 1))
pq = stats.f.sf(Fq, 1, n - 1)
if not pq < 0.01:
    bq = 0.0
print("quadratic term: rows", n, "centre", repr(float(c)), "mean square", repr(float(Q)), "lookbacks' p", repr(float(ph)), "weights", [repr(float(v)) for v in bh], "quadratic F", repr(Fq), "p", repr(float(pq)), "weight", repr(bq))
def quadratic_shift(t, previous=None):
    x = features(t)
    if x is None:
        return 0.0
    z = zbar(t - 1) if previous is None else previous
    z = min(max(z, before.min()), before.max())
    return float(np.dot(x, bh) + bq * ((z - c) ** 2 - Q))
print("  delivery day shift", repr(quadratic_shift(TARGET)))
print("  delivery day shift with zbar(171) = 5, clamped to", repr(float(before.max())), repr(quadratic_shift(TARGET, 5.0)))
for t in (110, 128, 171):
    print(f"  day {t} shift", repr(quadratic_shift(t)))
print("  the same errors without the quadratic term: delivery day shift", repr(float(np.dot(features(TARGET), bh))))
# The slow wave's errors of the first case with the same day means: the quadratic term's F test on what the
# lookbacks leave does not reject, so its weight is 0 and the shift is the 'recent' one ("a slow wave" above).
E = np.array([[error(t, s) for s in range(S)] for t in DAY_NUMBERS])
m = np.median(E, axis=0)
y = np.median(E - m, axis=1)
kept = [i for i, t in enumerate(DAY_NUMBERS) if t - max(LOOKBACKS) >= DAY_NUMBERS[0] and features(t) is not None]
X = np.array([features(DAY_NUMBERS[i]) for i in kept])
Y = np.array([y[i] for i in kept])
bh, *_ = np.linalg.lstsq(X, Y, rcond=None)
u = Y - X @ bh
bq = float(q @ u) / float(q @ q)
essq = bq * float(q @ u)
Fq = essq / ((float(u @ u) - essq) / (n - 1))
print("the slow wave with the day means: quadratic F", repr(Fq), "p", repr(float(stats.f.sf(Fq, 1, n - 1))), "delivery day shift", repr(float(np.dot(features(TARGET), bh))))
