#!/usr/bin/env python3
"""Independent recomputation of a well with drawdown for dutyline (issue 12).

The design of tests/well_drawdown.rs: a well at a static level of 95 m with a drawdown
of 8 m at a test flow of 100 m^3/h, 2 m of it well loss, so s = B Q + C Q^2 with
B Qt = 6 m and C Qt^2 = 2 m (Jacob 1947, Trans. ASCE 112); the pump at 80 m with
H = 60 m - 0.2 m/(m^3/h) x q; 0.3 m of 6 in schedule 40 steel in the well and 1 m of it
with K = 10 to a tank at 130 m. Friction by fluids.friction.Colebrook (Colebrook 1939),
roughness 0.00015 ft (Moody 1944, Trans. ASME 66, Fig. 2), inner diameter 6.065 in
(ASME B36.10M), water at 15 degC by IAPWS-IF97 and IAPWS 2008 through iapws,
barometric pressure 101 325 Pa (U.S. Standard Atmosphere 1976, sea level).

Duty: H(q) = (130 - (95 - s(q))) + losses(q) by scipy.optimize.brentq; NPSH available
= (p_baro - p_v)/(rho g) + (95 - s(q) - 80) - suction losses (ANSI/HI 9.6.1).
Writes well_scipy.csv next to this script. Run: python3 gen_well.py
(pip install fluids iapws scipy)
"""
import os

from scipy.optimize import brentq

from reference_common import G, INCH, M3H, P_BARO, pipe_loss, water

D = 6.065 * INCH  # 6 in schedule 40 (ASME B36.10M)
T_K = 288.15
RHO, MU, PV = water(T_K)


def loss(q, length, k):
    return pipe_loss(q, D, length, k, RHO, MU)


def drawdown(q, s_test=8.0, q_test=100.0 * M3H, s_well=2.0):
    r = q / q_test
    return (s_test - s_well) * r + s_well * r * r


def main():
    def residual(q):
        system = 130.0 - (95.0 - drawdown(q)) + loss(q, 0.3, 0.0) + loss(q, 1.0, 10.0)
        return 60.0 - 0.2 * q / M3H - system

    q = brentq(residual, 1.0 * M3H, 200.0 * M3H, xtol=1e-14, rtol=1e-14)
    s = drawdown(q)
    npsha = (P_BARO - PV) / (RHO * G) + (95.0 - s - 80.0) - loss(q, 0.3, 0.0)
    here = os.path.dirname(os.path.abspath(__file__))
    with open(os.path.join(here, "well_scipy.csv"), "w") as fh:
        fh.write("# written by gen_well.py; do not edit\n")
        fh.write("flow_m3_s,drawdown_m,pumping_level_m,npsh_available_m\n")
        fh.write(f"{q:.12e},{s:.12e},{95.0 - s:.12e},{npsha:.12e}\n")


if __name__ == "__main__":
    main()
