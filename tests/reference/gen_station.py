#!/usr/bin/env python3
"""Independent recomputation of station piping per pump for dutyline (issue 12).

The design of tests/station_piping.rs: two identical pumps in parallel, each with its
own suction branch (K = 20) and discharge branch (K = 30), a 24 in common suction and a
6 in common discharge (K = 100), every pipe 1 ft of new commercial steel. Solved here
with wall friction included: the Darcy friction factor by fluids.friction.Colebrook
(Colebrook 1939), roughness 0.00015 ft (Moody 1944, Trans. ASME 66, Fig. 2), inner
diameters of schedule 40 steel pipe from ASME B36.10M (6 in: 6.065 in; 24 in:
22.624 in), water at 60 degF by IAPWS-IF97 (density, vapour pressure) and IAPWS 2008
(viscosity) through the iapws package, barometric pressure 101 325 Pa (U.S. Standard
Atmosphere 1976 at sea level).

Each pump gives H = 100 ft - 0.1 ft/gpm x q (q per pump). The duty per pump solves
H(qp) - own branches(qp) = 40 ft + common piping(2 qp) (scipy.optimize.brentq); NPSH
available per pump is the pressure heads and static suction head less the common
suction at 2 qp and the pump's own suction branch at qp (ANSI/HI 9.6.1).

Writes station_scipy.csv next to this script. Run: python3 gen_station.py
(pip install fluids iapws scipy)
"""
import csv
import os

from scipy.optimize import brentq

from reference_common import FT, G, GPM, INCH, P_BARO, pipe_loss, water

T_K = (60.0 - 32.0) / 1.8 + 273.15
RHO, MU, PV = water(T_K)


def loss(q, d_in, length_ft, k):
    """Head loss, m: Darcy-Weisbach with Colebrook, plus K v^2/2g."""
    return pipe_loss(q, d_in * INCH, length_ft * FT, k, RHO, MU)


def common_suction(q):
    return loss(q, 22.624, 1.0, 0.0)


def own_suction(qp):
    return loss(qp, 6.065, 1.0, 20.0)


def own_discharge(qp):
    return loss(qp, 6.065, 1.0, 30.0)


def common_discharge(q):
    return loss(q, 6.065, 1.0, 100.0)


def pump(qp):
    return (100.0 - 0.1 * qp / GPM) * FT


def solve(static_ft, suction_ft):
    def residual(qp):
        q = 2.0 * qp
        header = static_ft * FT + common_suction(q) + common_discharge(q)
        return pump(qp) - own_suction(qp) - own_discharge(qp) - header

    qp = brentq(residual, 1.0 * GPM, 900.0 * GPM, xtol=1e-14, rtol=1e-14)
    q = 2.0 * qp
    header = static_ft * FT + common_suction(q) + common_discharge(q)
    npsha = (P_BARO - PV) / (RHO * G) + suction_ft * FT - common_suction(q) - own_suction(qp)
    return qp, header, pump(qp), npsha


def main():
    here = os.path.dirname(os.path.abspath(__file__))
    rows = []
    # case normal: levels 100 ft and 140 ft, centreline 95 ft; high_suction: 105 ft.
    for case, static_ft, suction_ft in [("normal", 40.0, 5.0), ("high_suction", 35.0, 10.0)]:
        qp, header, head, npsha = solve(static_ft, suction_ft)
        rows.append(dict(case=case, flow_per_pump_m3_s=f"{qp:.12e}", head_at_headers_m=f"{header:.12e}",
                         pump_head_m=f"{head:.12e}", npsh_available_m=f"{npsha:.12e}"))
    with open(os.path.join(here, "station_scipy.csv"), "w", newline="") as fh:
        fh.write("# written by gen_station.py; do not edit\n")
        w = csv.DictWriter(fh, fieldnames=list(rows[0]))
        w.writeheader()
        w.writerows(rows)


if __name__ == "__main__":
    main()
