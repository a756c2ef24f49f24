# Reference values of the economics checks, computed with numpy (a general-purpose numerics library;
# printed with its version) in the conventions of numpy-financial, which is not installed here:
#   npv(rate, values) = sum_t values[t] / (1 + rate)^t, t = 0, 1, ... (the first flow undiscounted);
#   irr(values): the real roots x > 0 of sum_t values[t] x^-t = 0 via numpy.roots on the polynomial
#   with coefficients values[0], ..., values[n] in x = 1 + r (numpy-financial's own method), r = x - 1;
#   annuity factor a(r, n) = sum_{t=1..n} (1 + r)^-t.
#   python3 test/economics/numpyReferenceValues.py
import numpy as np

print(f"numpy {np.__version__}")
flows = np.array([-100.0, 39.0, 59.0, 55.0, 20.0])
npv = lambda rate, values: float(np.sum(np.asarray(values) / (1.0 + rate) ** np.arange(len(values))))
roots = np.roots(flows)
real = [float(r.real) - 1.0 for r in roots if abs(r.imag) < 1e-12 and r.real > 0]
print(f"irr([-100, 39, 59, 55, 20]) = {real[0]!r}")
print(f"npv(0.281, [-100, 39, 59, 55, 20]) = {npv(0.281, flows)!r}")
print(f"annuity factor (0.05, 10) = {float(np.sum(1.05 ** -np.arange(1, 11)))!r}")
