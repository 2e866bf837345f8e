#!/usr/bin/env python3
"""Reference duty points, best efficiency points and affinity solves for the pumps module.

Independent of the Rust code: numpy.polyfit (least squares) fits the pump tables and
scipy.optimize.brentq solves the intersections. Run from this folder:

    pip install numpy scipy
    python3 gen_duty.py

Writes, next to this script:
  pump_tables.csv    the reference pump tables (SI: m3/s, m, efficiency fraction)
  duty_scipy.csv     duty flow and head per table, polynomial degree and system curve
  bep_scipy.csv      best efficiency point of the cubic efficiency fit per table
  affinity_scipy.csv speed ratio and trim ratio that meet a required duty (quadratic head)

The pump tables are invented but plausible (head falling with flow, efficiency peaking
mid-range); table C is the illustrative table of the design language notes converted
from gpm and ft with NIST SP 811 factors (1 US gal = 3.785411784 L, 1 ft = 0.3048 m).
"""

import csv
import os

import numpy as np
from scipy.optimize import brentq, minimize_scalar

HERE = os.path.dirname(os.path.abspath(__file__))
GPM = 3.785411784e-3 / 60.0  # m3/s per US gpm (NIST SP 811)
FT = 0.3048  # m per ft (NIST SP 811)

TABLES = {
    "A": dict(
        speed_rpm=2900.0,
        diameter_m=0.200,
        flow=[0.0, 0.005, 0.010, 0.015, 0.020, 0.025, 0.030],
        head=[52.0, 51.2, 49.3, 46.0, 41.4, 35.3, 27.8],
        efficiency=[0.0, 0.42, 0.62, 0.72, 0.76, 0.74, 0.66],
    ),
    "B": dict(
        speed_rpm=1480.0,
        diameter_m=0.350,
        flow=[0.0, 0.02, 0.04, 0.06, 0.08, 0.10],
        head=[38.5, 38.0, 36.4, 33.5, 29.2, 23.4],
        efficiency=[0.0, 0.55, 0.74, 0.82, 0.81, 0.72],
    ),
    "C": dict(
        speed_rpm=3550.0,
        diameter_m=8.75 * 0.0254,
        flow=[g * GPM for g in (0, 100, 200, 300, 400, 500)],
        head=[h * FT for h in (142, 139, 133, 123, 108, 88)],
        efficiency=[0.0, 0.48, 0.66, 0.76, 0.77, 0.70],
    ),
}

# (static head as a fraction of shut-off head, exponent of the friction term, flow as a
# fraction of the last data flow where the system curve meets the tabulated head)
SYSTEMS = [(0.3, 2.0, 0.5), (0.6, 2.0, 0.85), (0.3, 1.9, 0.85), (0.6, 1.9, 0.5), (0.0, 2.0, 0.95)]
DEGREES = [2, 3]


def polyval_ascending(coef_desc, q):
    return float(np.polyval(coef_desc, q))


def write_tables():
    with open(os.path.join(HERE, "pump_tables.csv"), "w", newline="") as f:
        w = csv.writer(f)
        w.writerow(["table", "speed_rpm", "diameter_m", "flow_m3s", "head_m", "efficiency"])
        for name, t in TABLES.items():
            for q, h, e in zip(t["flow"], t["head"], t["efficiency"]):
                w.writerow([name, repr(t["speed_rpm"]), repr(t["diameter_m"]), repr(q), repr(h), repr(e)])


def duty_rows():
    rows = []
    for name, t in TABLES.items():
        q = np.array(t["flow"])
        h = np.array(t["head"])
        q_end = float(q[-1])
        for degree in DEGREES:
            coef = np.polyfit(q, h, degree)
            for static_frac, n, meet_frac in SYSTEMS:
                hs = float(static_frac * h[0])
                # friction coefficient chosen so the system meets the tabulated data there
                q_t = meet_frac * q_end
                h_t = float(np.interp(q_t, q, h))
                k = float((h_t - hs) / q_t**n)
                g = lambda x: polyval_ascending(coef, x) - (hs + k * x**n)
                root = float(brentq(g, 0.0, q_end, xtol=1e-15, rtol=4 * np.finfo(float).eps, maxiter=200))
                asc = [float(c) for c in coef[::-1]] + [""] * (4 - len(coef))
                rows.append(
                    [name, degree, repr(hs), repr(k), repr(n), repr(q_end), repr(root),
                     repr(polyval_ascending(coef, root))] + [repr(c) if c != "" else "" for c in asc]
                )
    return rows


def bep_rows():
    rows = []
    for name, t in TABLES.items():
        q = np.array(t["flow"])
        e = np.array(t["efficiency"])
        coef = np.polyfit(q, e, 3)
        crit = np.roots(np.polyder(coef))
        cands = [float(r.real) for r in crit if abs(r.imag) < 1e-12 and q[0] <= r.real <= q[-1]]
        cands += [float(q[0]), float(q[-1])]
        best = max(cands, key=lambda x: np.polyval(coef, x))
        check = minimize_scalar(lambda x: -np.polyval(coef, x), bounds=(q[0], q[-1]),
                                method="bounded", options={"xatol": 1e-12})
        assert abs(check.x - best) < 1e-8 * q[-1], (name, check.x, best)
        rows.append([name, repr(best), repr(float(np.polyval(coef, best)))])
    return rows


def affinity_rows():
    rows = []
    for name, t in TABLES.items():
        q = np.array(t["flow"])
        h = np.array(t["head"])
        coef = np.polyfit(q, h, 2)
        H = lambda x: float(np.polyval(coef, x))
        # required duty: 60 % of q_max at 80 % of the head the published curve gives there
        q_req = 0.6 * float(q[-1])
        h_req = 0.8 * H(q_req)
        speed = brentq(lambda r: r * r * H(q_req / r) - h_req, 0.5, 1.1, xtol=1e-15, rtol=4 * np.finfo(float).eps)
        trim = brentq(lambda d: d * d * H(q_req / d) - h_req, 0.5, 1.0, xtol=1e-15, rtol=4 * np.finfo(float).eps)
        rows.append([name, "speed", repr(q_req), repr(h_req), repr(float(speed))])
        rows.append([name, "trim", repr(q_req), repr(h_req), repr(float(trim))])
    return rows


def main():
    write_tables()
    with open(os.path.join(HERE, "duty_scipy.csv"), "w", newline="") as f:
        w = csv.writer(f)
        w.writerow(["table", "degree", "static_head_m", "k", "exponent", "q_end_m3s",
                    "duty_flow_m3s", "duty_head_m", "c0", "c1", "c2", "c3"])
        w.writerows(duty_rows())
    with open(os.path.join(HERE, "bep_scipy.csv"), "w", newline="") as f:
        w = csv.writer(f)
        w.writerow(["table", "bep_flow_m3s", "bep_efficiency"])
        w.writerows(bep_rows())
    with open(os.path.join(HERE, "affinity_scipy.csv"), "w", newline="") as f:
        w = csv.writer(f)
        w.writerow(["table", "kind", "q_req_m3s", "h_req_m", "ratio"])
        w.writerows(affinity_rows())


if __name__ == "__main__":
    main()
