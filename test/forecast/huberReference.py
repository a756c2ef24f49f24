# Reference value of Huber's clipping point (test/forecast/huber.test.ts), computed with SciPy (an
# independent library; version printed): c sigma with c = 1.345 (Holland and Welsch 1977) and sigma the
# normal-consistent MAD, MAD / Phi^-1(3/4) (scipy.stats.median_abs_deviation, scale='normal').
#   python3 test/forecast/huberReference.py
import numpy as np
import scipy
from scipy.stats import median_abs_deviation

print(f"numpy {np.__version__}, scipy {scipy.__version__}")
# Invented residuals (inputs only), odd count so that the median is one order statistic.
r = np.array([0.3, -1.2, 0.8, 5.0, -0.1, 0.4, -0.6, 2.2, -7.5, 0.05, 1.1])
print(f"clip limit = {1.345 * median_abs_deviation(r, scale='normal')!r}")
