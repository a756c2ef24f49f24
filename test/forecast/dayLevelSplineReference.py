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
