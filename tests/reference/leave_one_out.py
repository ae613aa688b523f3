"""Leave-one-out prediction error computed independently with numpy: each observation is
dropped, the model refitted by least squares (numpy.linalg.lstsq) on the rest, and the dropped
observation predicted. Prints PRESS and sqrt(PRESS/n) for the data sets the tests use:
  1. the hand-worked 2^2 factorial with three centre points (tests/api/doe.test.ts),
     interaction model y = b0 + b1 x1 + b2 x2 + b12 x1 x2;
  2. NIST StRD Pontius, quadratic y = b0 + b1 x + b2 x^2 (tests/api/doe.test.ts,
     tests/unit/doe/model-quality.test.ts).
Run: python3 tests/reference/leave_one_out.py
"""
import numpy as np


def loo(X, y):
    n = len(y)
    errors = []
    for i in range(n):
        keep = np.arange(n) != i
        beta, *_ = np.linalg.lstsq(X[keep], y[keep], rcond=None)
        errors.append(y[i] - X[i] @ beta)
    errors = np.array(errors)
    press = float(errors @ errors)
    return press, (press / n) ** 0.5


# 1. 2^2 factorial + 3 centre points, binder 10-40 wt %, cell temperature 160-200 degC
runs = [(10, 160, 10), (40, 160, 14), (10, 200, 12), (40, 200, 18), (25, 180, 13), (25, 180, 13.5), (25, 180, 12.5)]
x1 = np.array([(b - 25) / 15 for b, _, _ in runs])
x2 = np.array([(t - 180) / 20 for _, t, _ in runs])
y = np.array([s for _, _, s in runs], float)
X = np.column_stack([np.ones_like(x1), x1, x2, x1 * x2])
press, rmse = loo(X, y)
print(f"factorial-2x2-centre: PRESS = {press:.15g}, looRmse = {rmse:.15g}")

# 2. NIST Pontius (load scaled by 3e6 for conditioning; leave-one-out errors do not depend on it)
loads = [150000 * (i + 1) for i in range(20)] * 2
first = [0.11019, 0.21956, 0.32949, 0.43899, 0.54803, 0.65694, 0.76562, 0.87487, 0.98292, 1.09146, 1.20001, 1.30822, 1.41599, 1.52399, 1.63194, 1.73947, 1.84646, 1.95392, 2.06128, 2.16844]
second = [0.11052, 0.22018, 0.32939, 0.43886, 0.54798, 0.65739, 0.76596, 0.87474, 0.983, 1.0915, 1.20004, 1.30818, 1.41613, 1.52408, 1.63159, 1.73965, 1.84696, 1.95445, 2.06177, 2.16829]
x = np.array(loads, float) / 3e6
y = np.array(first + second)
X = np.column_stack([np.ones_like(x), x, x * x])
press, rmse = loo(X, y)
print(f"pontius-quadratic: PRESS = {press:.15g}, looRmse = {rmse:.15g}")
