"""Expected metrics of the protocol fixtures (tests/fixtures/curves/protocols.ts), computed with
numpy/scipy from the semi-empirical model itself, independently of shared/curves.

Run: python3 tests/reference/protocol_metrics.py
Each printed value is asserted in tests/unit/curves/protocol-metrics.test.ts, which names this
script beside the assertion. Definitions used (README "Metric definitions"): values are read on
step means of the loaded steps (never from the open-circuit reading); between two steps whose
lower one is below 0.1 A/cm² the curve is linear in log10 j, elsewhere linear in j; the Tafel
slope is the least-squares slope of iR-free V against log10 j over 5–50 mA/cm².
"""
import math
import numpy as np
from scipy.optimize import brentq

R_GAS, F = 8.314462618, 96485.33212  # CODATA 2018
FIXTURE = dict(e0=0.95, b=math.log(10) * R_GAS * 433.15 / F, j0=1.5e-4, r=0.25, c=0.05, jl=1.6)
PGMFREE = dict(e0=0.97, b=0.075, j0=2e-6, r=0.35, c=0.08, jl=0.9)
KINETIC = 0.1


def model(p, j):
    act = p['b'] * math.log10(j / p['j0']) if j > p['j0'] else 0.0
    return p['e0'] - act - p['r'] * j + p['c'] * math.log(1 - j / p['jl']) * 1.0


def interp(x, y, at):
    x, y = np.asarray(x), np.asarray(y)
    if at < x[0] or at > x[-1]:
        return None
    i = max(0, min(np.searchsorted(x, at, side='right') - 1, len(x) - 2))
    lo, hi = x[i], x[i + 1]
    f = math.log(at / lo) / math.log(hi / lo) if 0 < lo < KINETIC else (at - lo) / (hi - lo)
    return y[i] + f * (y[i + 1] - y[i])


def crossing(x, y, v):
    if y[0] < v:
        return None
    for i in range(len(x) - 1):
        if y[i] > v > y[i + 1]:
            f = (v - y[i]) / (y[i + 1] - y[i])
            lo, hi = x[i], x[i + 1]
            return lo * (hi / lo) ** f if 0 < lo < KINETIC else lo + f * (hi - lo)
    return None


def tafel(x, y, lo=0.005, hi=0.05):
    x, y = np.asarray(x), np.asarray(y)
    m = (x >= lo * (1 - 1e-9)) & (x <= hi * (1 + 1e-9))
    return -np.polyfit(np.log10(x[m]), y[m], 1)[0] * 1000, int(m.sum())


def show(name, value):
    print(f'{name} = {value!r}')


P = FIXTURE
print('# item 1: open circuit, jump to 1.0 A/cm², steps down')
J1 = [1.0, 0.8, 0.6, 0.5, 0.4, 0.3, 0.2, 0.15, 0.1, 0.05, 0.03, 0.02, 0.01, 0.005]
xs = sorted(J1)
v = [model(P, j) for j in xs]
irf = [model(P, j) + P['r'] * j for j in xs]
show('item1.vAtRef', interp(xs, v, 0.2))
show('item1.vAtRefIrFree', interp(xs, irf, 0.2))
show('item1.jAtRef@0.6V', crossing(xs, v, 0.6))
show('item1.jAtRefIrFree@0.6V', crossing(xs, irf, 0.6))
show('item1.tafel', tafel(xs, irf))
show('item1.peakPower', max(j * model(P, j) for j in xs))
show('item1.modelRoot@0.6V', brentq(lambda j: model(P, j) - 0.6, 0.1, 1.0))

print('# item 2: V_ref between OCV and the first loaded step; kinetic bracket 20–50 mA/cm²')
J2 = [0.005, 0.01, 0.02, 0.05, 0.1, 0.2, 0.4, 0.6]
v2 = [model(P, j) for j in J2]
irf2 = [model(P, j) + P['r'] * j for j in J2]
show('item2.firstStepV', v2[0])
show('item2.jAtRef@0.75V(log)', crossing(J2, v2, 0.75))
show('item2.jAtRefIrFree@0.75V(log)', crossing(J2, irf2, 0.75))
f = (0.75 - irf2[2]) / (irf2[3] - irf2[2])
show('item2.jAtRefIrFree@0.75V(linear j, for comparison)', 0.02 + f * 0.03)
show('item2.modelRootIrFree@0.75V', brentq(lambda j: model(P, j) + P['r'] * j - 0.75, 0.02, 0.05))
show('item2.modelRoot@0.75V', brentq(lambda j: model(P, j) - 0.75, 0.02, 0.05))
show('item7.peakPower(0.6 A/cm² is the last step)', 0.6 * model(P, 0.6))

print('# item 3: no step in 5–50 mA/cm² (the old fallback fitted 0.1–1.0 A/cm²)')
x3 = [k / 10 for k in range(1, 11)]
show('item3.slopeOver0.1-1.0(old, wrong)', tafel(x3, [model(P, j) + P['r'] * j for j in x3], 0.1, 1.0))

print('# item 5: set points 0, 1, 2, 3, 5 … 400 mA/cm², current ±0.2 %')
S5 = [0, 0.001, 0.002, 0.003, 0.005, 0.0075, 0.01, 0.015, 0.02, 0.03, 0.05, 0.1, 0.2, 0.4]
E5 = [0.002, -0.001, 0.001, -0.002]
jm, im, vm = [], [], []
for s in S5[1:]:
    js = [s * (1 + e) for e in E5]
    jm.append(np.mean(js))
    vm.append(np.mean([model(P, j) for j in js]))
    im.append(np.mean([model(P, j) + P['r'] * j for j in js]))
show('item5.tafel', tafel(jm, im))
show('item5.vAtRef', interp(jm, vm, 0.2))
show('item5.jAtRefIrFree@0.8V', crossing(jm, im, 0.8))
show('item5.firstLoadedStepJ', jm[0])

print('# item 6a: potentiostatic PGM-free, decaying current, last half of each dwell')
Q = PGMFREE
VS = [round(0.95 - 0.05 * i, 2) for i in range(14)]
steps = []
for vset in VS:
    jss = brentq(lambda j: model(Q, j) - vset, 1e-12, Q['jl'] * (1 - 1e-12), xtol=1e-15)
    ks = np.arange(10)
    js = jss * (1 + 0.3 * np.exp(-ks / 2))
    vv = vset + np.where(ks % 2 == 0, 0.00005, -0.00005)
    keep = ks >= 5
    steps.append((js[keep].mean(), vv[keep].mean(), (vv[keep] + js[keep] * Q['r']).mean(), jss))
steps.sort()
xj = [s[0] for s in steps]
show('item6a.vAtRef@0.2', interp(xj, [s[1] for s in steps], 0.2))
show('item6a.vAtRefIrFree@0.2', interp(xj, [s[2] for s in steps], 0.2))
show('item6a.jAtRefIrFree@0.8V', crossing(xj, [s[2] for s in steps], 0.8))
show('item6a.jAtRef@0.6V', crossing(xj, [s[1] for s in steps], 0.6))
show('item6a.modelV@0.2 (truth)', model(Q, 0.2))
show('item6a.modelRoot@0.6V (truth)', brentq(lambda j: model(Q, j) - 0.6, 1e-9, 0.89))
show('item6a.tafel', tafel(xj, [s[2] for s in steps]))
show('item6a.peakPower', max(s[0] * s[1] for s in steps))

print('# item 6b: galvanostatic, 15 mV undershoot recovering as e^(-k/1.5)')
k = np.arange(10)
show('item6b.vAtRef', model(P, 0.2) - 0.015 * np.exp(-k[5:] / 1.5).mean())
show('item6b.vAtRef(all readings, old)', model(P, 0.2) - 0.015 * np.exp(-k / 1.5).mean())

print('# H2 crossover 2 mA/cm²: iR-free V = E0 − b·log10((j + jx)/j0)')
JX = 0.002
JC = [0.003, 0.005, 0.008, 0.01, 0.015, 0.02, 0.03, 0.04, 0.05, 0.1, 0.2]
irc = [P['e0'] - P['b'] * math.log10((j + JX) / P['j0']) for j in JC]
show('crossover.tafel(with jx)', tafel([j + JX for j in JC], irc))
show('crossover.tafel(without jx)', tafel(JC, irc))
show('crossover.b (model)', P['b'] * 1000)
show('crossover.jAtRefIrFree@0.75V(with jx)', crossing([j + JX for j in JC], irc, 0.75))
