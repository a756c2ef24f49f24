# Reference values of the pooled slot fit (test/forecast/pooledGrams.test.ts), computed with NumPy (an
# independent library; version printed): weighted least squares with one level (dummy) per slot and
# slopes shared by the slots, solved by numpy.linalg.lstsq on the rows scaled by sqrt(weight)
# (weighted least squares as ordinary least squares on sqrt(W) X, sqrt(W) y; e.g. Draper and Smith
# 1998, Applied Regression Analysis, 3rd ed., section 9.2).
#   python3 test/forecast/pooledGramsReference.py
import math
import numpy as np

print(f"numpy {np.__version__}")
# Invented design (inputs only): 3 slots, 12 rows each, 3 regressors, the same formulas as the test.
S, N, K = 3, 12, 3
weights = [0.5, 1.0, 0.25]
def x(s, i, j):
    return math.sin(1.3 * i + 0.7 * j + 0.4 * s) + 0.1 * j * i
def y(s, i):
    return 2.0 + s + 0.8 * x(s, i, 0) - 0.5 * x(s, i, 1) + 0.3 * x(s, i, 2) + 0.2 * math.cos(2.1 * i + s)
rows, ys, ws = [], [], []
for s in range(S):
    for i in range(N):
        rows.append([1.0 if t == s else 0.0 for t in range(S)] + [x(s, i, j) for j in range(K)])
        ys.append(y(s, i))
        ws.append(weights[s])
X, Y, w = np.array(rows), np.array(ys), np.sqrt(np.array(ws))
beta = np.linalg.lstsq(X * w[:, None], Y * w, rcond=None)[0]
print("levels =", [float(v) for v in beta[:S]])
print("slopes =", [float(v) for v in beta[S:]])
