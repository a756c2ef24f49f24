# Reference values of the energy and variogram scores (test/forecast/pathScores.test.ts), computed with
# SciPy's distance functions and NumPy (independent libraries; versions printed), from the definitions:
#   energy score  ES = mean_j ||x_j - y|| - (1 / (2 n^2)) sum_{j,k} ||x_j - x_k||
#                 (Gneiting and Raftery 2007, section 4.3; Gneiting et al. 2008, TEST 17(2), eq. 6)
#   variogram score of order p, weights 1, over all ordered pairs of periods (i, j):
#                 VS_p = sum_{i,j} (|y_i - y_j|^p - mean_m |x_mi - x_mj|^p)^2   (Scheuerer and Hamill 2015, eq. 2)
#   python3 test/forecast/pathScoresReference.py
import numpy as np
import scipy
from scipy.spatial.distance import cdist, pdist

print(f"numpy {np.__version__}, scipy {scipy.__version__}")

# Five paths over six periods and a realised day (invented numbers: inputs only).
paths = np.array([
    [41.0, 38.5, 55.2, 80.1, 62.0, 47.3],
    [35.2, 33.0, 49.8, 91.4, 70.5, 44.1],
    [44.9, 40.2, 60.7, 72.3, 58.8, 50.6],
    [39.1, 36.7, 52.0, 85.0, 66.1, 45.9],
    [47.5, 43.3, 58.1, 99.9, 75.2, 52.4],
])
y = np.array([[42.0, 37.0, 57.5, 88.0, 64.0, 48.0]])

n = paths.shape[0]
es = cdist(paths, y).mean() - pdist(paths).sum() * 2 / (2 * n * n)
print(f"energy score = {es!r}")

def variogram(p):
    d_obs = np.abs(y[0][:, None] - y[0][None, :]) ** p
    d_ens = np.mean(np.abs(paths[:, :, None] - paths[:, None, :]) ** p, axis=0)
    return float(np.sum((d_obs - d_ens) ** 2))

print(f"variogram score p = 0.5: {variogram(0.5)!r}")
print(f"variogram score p = 1: {variogram(1.0)!r}")
