"""Kaplan-Meier reference for tests/unit/durability/survival.test.ts, from scipy.stats.ecdf on
right-censored data (survival function and its 95 % log-log confidence interval, Greenwood).
Invented accelerated tests: onsets (failures) at 300, 500, 500, 900 h; logs ended without an
onset (censored) at 400, 500, 1200 h.
Run: python3 tests/reference/survival_reference.py
"""
from scipy import stats

data = stats.CensoredData(uncensored=[300, 500, 500, 900], right=[400, 500, 1200])
result = stats.ecdf(data)
ci = result.sf.confidence_interval(0.95, method="log-log")
for t, s, lo, hi in zip(result.sf.quantiles, result.sf.probabilities, ci.low.probabilities, ci.high.probabilities):
    print("t %g  S %.15g  low %.15g  high %.15g" % (t, s, lo, hi))
