#!/usr/bin/env python3
"""Independent recomputation of the Kestrel demo's load profile (issue 13).

Reads tests/reference/demo_kestrel-booster.json (written by gen_demo_recompute.py) for
the INPUTS only: the case's fluid, levels and segments (system head by the reference
`System` of gen_demo_recompute.py: fluids Colebrook / Hazen-Williams, fluids fittings,
iapws water), the published curve points and fit method, the motor rating and
full-load efficiency; and the design file's profile and control (stated below, as
written in examples-demo/kestrel-booster.duty). Then, with numpy/scipy/fluids only:

- proportional control head H_c(Q) = H0 + (H_sys(Qd) - H0) Q/Qd, floored at H_sys(Q);
- speed ratio r in [min, max] from r^2 H(Q_p/r) = H_c by scipy.optimize.brentq;
- efficiency eta(Q_p/r) at corresponding points (affinity laws, efficiency held);
- shaft power rho g Q_p H / eta; motor part load by fluids.motor_efficiency_underloaded
  (WSEO 1993 curves) times the full-load efficiency; drive by fluids.VFD_efficiency
  (the DOE tip sheet #11 table) scaled to the stated 97 % full-load value;
- staging: every count 1..2, the least input power among counts within 50-130 % of
  the BEP flow at the running speed (BEP from the efficiency fit, scipy minimize_scalar);
- yearly energy = sum of input power x hours.

Writes tests/reference/profile_scipy.csv: per load point the count, speed ratio and
input power, and a last row with the yearly energy. tests/operation_profile.rs requires
the engine within 0.5 % of the yearly energy.
"""
import csv, json, os, sys
import numpy as np
import scipy, fluids
from scipy.optimize import brentq, minimize_scalar

HERE = os.path.dirname(os.path.abspath(__file__))
sys.path.insert(0, HERE)
from gen_demo_recompute import System, fitted  # noqa: E402
from results_v2 import expand_v2  # noqa: E402  (format 2 read in the shape of format 1)

G = 9.80665
# As written in examples-demo/kestrel-booster.duty (profile average, pump KR1, motor).
H0, QD = 54.0, 560.0 / 3600.0
PROFILE = [(0.30, 400), (0.45, 1100), (0.60, 2300), (0.75, 2200), (0.90, 1200), (1.00, 500)]
SPEED = (0.88, 1.0)
DRIVE_FULL_LOAD = 0.97


def main():
    doc = expand_v2(json.load(open(os.path.join(HERE, "demo_kestrel-booster.json"))))
    case = next(c for c in doc["cases"] if c["name"] == "average")
    sys_ = System(case)
    cand = next(c for c in doc["candidates"] if c["name"] == "KR1")
    cv = cand["curves"][cand["evaluated_curve"]]
    head = fitted(cv["flow_m3_s"], cv["head_m"], cv["head_fit"])
    eff = fitted(cv["flow_m3_s"], cv["efficiency"], cv["efficiency_fit"])
    qmax = max(cv["flow_m3_s"])
    bep = minimize_scalar(lambda q: -eff(q), bounds=(0.05 * qmax, qmax), method="bounded").x
    rating, eta_fl = cand["motor"]["rating_W"], cand["motor"]["efficiency"]
    rho = case["fluid"]["density_kg_m3"]
    drive_rating = rating / eta_fl
    def drive_eff(out_w):
        shape = fluids.VFD_efficiency(drive_rating, load=out_w / drive_rating) / fluids.VFD_efficiency(drive_rating, load=1.0)
        return DRIVE_FULL_LOAD * shape
    rows, total = [], 0.0
    h_design = sys_.head(QD)
    for share, hours in PROFILE:
        q = share * QD
        hc = max(H0 + (h_design - H0) * q / QD, sys_.head(q))
        options = []
        for k in (1, 2):
            qp = q / k
            f = lambda r: r * r * head(qp / r) - hc
            if f(SPEED[1]) < 0 or qp / SPEED[1] > qmax:
                continue
            r = SPEED[0] if f(SPEED[0]) >= 0 else brentq(f, SPEED[0], SPEED[1], xtol=1e-12)
            hp = r * r * head(qp / r)
            ps = rho * G * qp * hp / eff(qp / r)
            eta_m = eta_fl * fluids.motor_efficiency_underloaded(rating, load=ps / rating)
            pin_motor = ps / eta_m
            pin = k * pin_motor / drive_eff(pin_motor)
            ratio = qp / (bep * r)
            options.append((0.5 <= ratio <= 1.3, pin, k, r))
        good = [o for o in options if o[0]] or options
        _, pin, k, r = min(good, key=lambda o: o[1])
        total += pin * hours * 3600.0
        rows.append([f"{q:.9g}", hours, k, f"{r:.9g}", f"{pin:.9g}"])
    with open(os.path.join(HERE, "profile_scipy.csv"), "w", newline="") as fh:
        fh.write(f"# gen_profile.py: numpy {np.__version__}, scipy {scipy.__version__}, fluids {fluids.__version__}\n")
        w = csv.writer(fh)
        w.writerow(["flow_m3_s", "hours", "pumps_running", "speed_ratio", "input_power_W"])
        w.writerows(rows)
        w.writerow(["yearly_energy_J", "", "", "", f"{total:.9g}"])
    print(f"yearly energy {total / 3.6e9:.2f} MWh")


if __name__ == "__main__":
    main()
