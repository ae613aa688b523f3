"""Reference values for the series analyses (tests/unit/series/*.test.ts), computed with scipy:
scipy.stats.linregress for the slope and its standard error, scipy.stats.t.ppf for the 95 %
two-sided quantile with n - 2 degrees of freedom. R = 8.314462618 J/(mol K) (CODATA 2018).
The data are invented (a temperature series and two pressure series at a fixed iR-free voltage).
Run: python3 tests/reference/series_reference.py
"""
import numpy as np
from scipy import stats

R = 8.314462618

def slope_ci(x, y):
    fit = stats.linregress(x, y)
    t = stats.t.ppf(0.975, len(x) - 2)
    return fit.slope, fit.stderr, fit.slope - t * fit.stderr, fit.slope + t * fit.stderr, t, fit.rvalue ** 2

# 1. temperature series: T in degC, j in A/cm2
T = np.array([160, 170, 180, 190, 200], float)
j = np.array([0.00412, 0.00601, 0.00853, 0.0121, 0.0166])
s, se, lo, hi, t, r2 = slope_ci(1 / (T + 273.15), np.log(j))
print("arrhenius: slope %.12g K, se %.12g, t %.12g, r2 %.12g" % (s, se, t, r2))
print("  Ea %.12g kJ/mol, low %.12g, high %.12g" % (-s * R / 1000, -hi * R / 1000, -lo * R / 1000))

# 2. pressure series (kPa absolute) with an order near 0.5
p = np.array([101, 150, 200, 250, 300], float)
jp = np.array([0.0100, 0.0123, 0.0140, 0.0159, 0.0171])
s, se, lo, hi, t, r2 = slope_ci(np.log(p), np.log(jp))
print("order: %.12g, se %.12g, low %.12g, high %.12g, t %.12g" % (s, se, lo, hi, t))

# 3. pressure series with no dependence within noise
jz = np.array([0.0100, 0.0103, 0.0098, 0.0101, 0.0102])
s, se, lo, hi, t, r2 = slope_ci(np.log(p), np.log(jz))
print("flat order: %.12g, se %.12g, low %.12g, high %.12g" % (s, se, lo, hi))
