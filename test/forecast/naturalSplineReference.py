# Reference values of the natural cubic spline basis (test/forecast/naturalSpline.test.ts), computed with
# SciPy (an independent library; versions printed): scipy.interpolate.CubicSpline(knots, y,
# bc_type='natural') is the natural cubic spline interpolant through the points (knots, y): cubic between
# the knots, twice continuously differentiable, second derivative 0 at the outer knots. A natural cubic
# spline with those knots is linear beyond them (Hastie, Tibshirani and Friedman 2009, The Elements of
# Statistical Learning, 2nd ed., section 5.2.1), so beyond the outer knots the reference continues the
# SciPy spline by its tangent there: S(xi_1) + S'(xi_1) (x - xi_1) below, S(xi_K) + S'(xi_K) (x - xi_K)
# above (CubicSpline's own extrapolation would continue the end cubics instead).
# Invented inputs (shared with the test): three knot sets of K = 3, 4, 5 and values at the knots.
#   python3 test/forecast/naturalSplineReference.py
import numpy as np
import scipy
from scipy.interpolate import CubicSpline

print(f"numpy {np.__version__}, scipy {scipy.__version__}")

CASES = [
    ([-2.0, 0.5, 3.0], [1.0, -0.5, 4.0]),
    ([10.0, 11.5, 14.0, 14.75], [3.0, 2.0, 5.5, 4.0]),
    ([-1.3, 0.2, 0.9, 2.5, 4.0], [0.7, 2.1, 1.4, -0.8, 0.3]),
]

for knots, y in CASES:
    k = np.array(knots)
    spline = CubicSpline(k, np.array(y), bc_type='natural')
    slope = spline.derivative()
    lo, hi = k[0], k[-1]
    inside = [lo + (hi - lo) * t for t in (0.03, 0.17, 0.31, 0.5, 0.66, 0.8, 0.97)]
    below = [lo - 0.4, lo - 2.5]
    above = [hi + 0.3, hi + 3.0]
    print(f"knots {knots} y {y}")
    print("  inside", [(repr(float(x)), repr(float(spline(x)))) for x in inside])
    print("  below", [(repr(float(x)), repr(float(spline(lo) + slope(lo) * (x - lo)))) for x in below])
    print("  above", [(repr(float(x)), repr(float(spline(hi) + slope(hi) * (x - hi)))) for x in above])
