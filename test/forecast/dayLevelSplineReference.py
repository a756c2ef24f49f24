"""Reference values of test/forecast/dayLevelSpline.test.ts (NumPy 2.4; run: python3 test/forecast/dayLevelSplineReference.py).

Knots of the day-level spline: np.quantile's default method ('linear', Hyndman and Fan 1996
definition 7) of the sample below at the hinge levels j/(K+1) and at Harrell's (2015, table 2.3)
levels of a 3-knot restricted cubic spline; the 'surprise' knots are those of m less its least-squares
line on x (np.polyfit, degree 1).
"""
import numpy as np

m = np.array([0.31, -0.42, 1.27, 0.05, -1.18, 0.66, 0.12, 2.03, -0.35, 0.48, -0.91, 0.87, 0.19, 0.73])
x = np.array([510.0, 480.0, 590.0, 500.0, 450.0, 540.0, 505.0, 620.0, 470.0, 530.0, 460.0, 560.0, 515.0, 545.0])

np.set_printoptions(precision=17)
print('hinge K=2', repr(np.quantile(m, [1 / 3, 2 / 3]).tolist()))
print('hinge K=3', repr(np.quantile(m, [0.25, 0.5, 0.75]).tolist()))
print('natural-cubic K=3', repr(np.quantile(m, [0.1, 0.5, 0.9]).tolist()))
beta, alpha = np.polyfit(x, m, 1)
print('surprise alpha, beta', repr([alpha, beta]))
print('surprise K=2', repr(np.quantile(m - (alpha + beta * x), [1 / 3, 2 / 3]).tolist()))

# The 'shared' basis's curve weights: least squares (np.linalg.lstsq) of the day's mean price on
# [1, m, x (the day before's mean residual load), the day's own mean residual load, the two hinges at the
# 1/3 and 2/3 quantiles of m, Monday..Saturday dummies], over 60 rows given by formulas (inputs, any values).
r = np.arange(60)
m2 = np.sin(0.7 * r) + 0.3 * np.cos(1.9 * r)
x_before = 500 + 30 * np.cos(0.45 * r)
x_own = 500 + 25 * np.sin(1.1 * r + 0.3)
weekday = r % 7 + 1
y = 0.2 + 0.6 * m2 + 0.001 * x_before - 0.002 * x_own + 0.05 * np.sin(3.7 * r) - 0.4 * m2 ** 2
k = np.quantile(m2, [1 / 3, 2 / 3])
X = np.column_stack([np.ones(60), m2, x_before, x_own, np.maximum(0, m2 - k[0]), np.maximum(0, m2 - k[1])] + [(weekday == w).astype(float) for w in range(1, 7)])
coef = np.linalg.lstsq(X, y, rcond=None)[0]
print('shared knots', repr(k.tolist()))
print('shared weights', repr(coef[4:6].tolist()))
