"""Reference values for the lot-to-lot comparison (tests/unit/lots/compare-lots.test.ts), computed
with scipy: means, sample SDs (ddof=1), the Welch–Satterthwaite degrees of freedom and the 95 %
two-sided interval of mean(scale-up) - mean(small batch) with scipy.stats.t.ppf.
The data are invented (V at j_ref in V of builds made from a small batch and a scale-up batch).
Run: python3 tests/reference/lot_welch.py
"""
import numpy as np
from scipy import stats

small = np.array([0.612, 0.605, 0.618, 0.609])          # recipe R1 from the small batch
scale = np.array([0.598, 0.603, 0.590])                 # recipe R1 from the scale-up batch
va, vb = small.var(ddof=1) / len(small), scale.var(ddof=1) / len(scale)
se = np.sqrt(va + vb)
df = (va + vb) ** 2 / (va ** 2 / (len(small) - 1) + vb ** 2 / (len(scale) - 1))
t = stats.t.ppf(0.975, df)
diff = scale.mean() - small.mean()
print(f"mean small {small.mean():.15g} sd {small.std(ddof=1):.15g}")
print(f"mean scale {scale.mean():.15g} sd {scale.std(ddof=1):.15g}")
print(f"diff {diff:.15g} se {se:.15g} df {df:.15g} low {diff - t * se:.15g} high {diff + t * se:.15g}")
r = stats.ttest_ind(scale, small, equal_var=False)
print(f"scipy ttest_ind welch statistic {r.statistic:.15g} (= diff/se {diff / se:.15g})")
