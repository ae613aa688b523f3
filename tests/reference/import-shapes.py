"""Expected values for the import-shape fixtures (tests/fixtures/curves/shape-*).

The fixtures are written from the semi-empirical polarization model
    V(j) = E0 - b*log10(j/j0) - R*j - eta_mt,   eta_mt = -m*ln(1 - j/jL) >= 0
with the invented parameters of tests/fixtures/curves/model-parameters.ts. This script
recomputes the model with numpy, independently of the TypeScript code under test, and prints
the values the tests assert. Run: python3 tests/reference/import-shapes.py
"""
import numpy as np

R_GAS = 8.314462618      # J/(mol K), CODATA 2018
FARADAY = 96485.33212    # C/mol, CODATA 2018
T = 433.15               # K (160 °C)
E0, J0, R_OHM, M, JL = 0.95, 1.5e-4, 0.25, 0.05, 1.6
B = np.log(10) * R_GAS * T / FARADAY  # Tafel slope for alpha*n = 1, V/dec


def model(j):
    j = np.asarray(j, dtype=float)
    act = np.where(j > J0, B * np.log10(np.maximum(j, J0) / J0), 0.0)
    eta_mt = -M * np.log(1 - j / JL)  # mass-transport loss, positive, subtracted
    return E0 - act - R_OHM * j - eta_mt


HFR = 0.25  # Ohm cm2, as the fixtures write it
print(f"tafel slope b = {B * 1000:.6f} mV/dec")
for j in (0.0, 0.1, 0.2, 0.6, 1.0, 1.4):
    v = float(model(j))
    print(f"V({j}) = {v:.6f} V; rounded to 4 decimals {round(v, 4):.4f}; iR-free V + j*HFR = {v + j * HFR:.6f} V")
# the written fixture values are rounded to 4 decimals (V) before the code reads them
v02 = round(float(model(0.2)), 4)
print(f"V(0.2) as written = {v02:.4f} V; iR-free as written = {round(float(model(0.2)) + 0.2 * HFR, 4):.4f} V")
# a curve written as iR-free voltage only: the measured V is V_iR-free - j*HFR
print(f"V(0.2) recovered from iR-free column = {round(float(model(0.2)) + 0.2 * HFR, 4) - 0.2 * HFR:.6f} V")

# A total-current file converted with 25 cm², then re-converted with the build's 20 cm²:
# every step's j grows by 25/20, so j_ref = 0.2 A/cm² falls between the steps written at
# 0.15 and 0.2 A/cm² (now 0.1875 and 0.25), linearly interpolated there.
v015, v020 = round(float(model(0.15)), 4), round(float(model(0.2)), 4)
j_lo, j_hi = 0.15 * 25 / 20, 0.2 * 25 / 20
v_ref = v015 + (0.2 - j_lo) / (j_hi - j_lo) * (v020 - v015)
print(f"re-measured on 20 cm2: V(0.2) = {v_ref:.6f} V (between {v015:.4f} V at {j_lo} and {v020:.4f} V at {j_hi} A/cm2)")
