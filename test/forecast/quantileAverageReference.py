"""Reference values for test/forecast/quantileAverage.test.ts, computed with SciPy.

The quantile average (Vincentization) of two forecasts, q_tau = (q_tau,1 + q_tau,2) / 2 (Lichtendahl,
Grushka-Cockayne and Winkler 2013), of members whose quantiles SciPy gives in closed form:
  1. two normals, N(10, 2^2) and N(40, 6^2): the average of a location-scale family's quantiles is the
     same family with the averaged location and scale, N(25, 4^2) (Lichtendahl et al. 2013, section 3);
  2. a normal N(10, 2^2) and a uniform U(0, 30), whose average is no named distribution.
Run: python3 test/forecast/quantileAverageReference.py (NumPy 2.4.6, SciPy 1.17.1 gave the test's values).
"""
import numpy as np
from scipy import stats

levels = np.array([0.05, 0.25, 0.5, 0.75, 0.95])
a = stats.norm.ppf(levels, loc=10, scale=2)
b = stats.norm.ppf(levels, loc=40, scale=6)
print("normal members", a.tolist(), b.tolist())
print("their average", ((a + b) / 2).tolist())
print("N(25, 4^2)", stats.norm.ppf(levels, loc=25, scale=4).tolist())
u = stats.uniform.ppf(levels, loc=0, scale=30)
print("uniform member", u.tolist())
print("normal and uniform average", ((a + u) / 2).tolist())
