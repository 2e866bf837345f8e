#!/usr/bin/env python3
"""Independent recomputation of every demo in examples-demo/ by reference libraries.

For each demo (and each design of tests/designs/recompute-*.duty, which put the demos'
tanks under pressure and vacuum, gauge and absolute) the script runs, from the crate root,

    cargo run -q -- results <path>.duty --format json

saves the document as tests/reference/demo_<name>.json (so the CSV records its
inputs), and recomputes from the document's INPUTS only (fluid temperature, site
elevation or stated barometric pressure, tank levels and gauge pressures, pump
centreline, segment inner diameters, lengths, roughness, Hazen-Williams C, fitting
names, counts, beta and angle, `loss` entries, published pump curve points with the
fit method named for each column, arrangement and case speed), never from the heads,
losses, properties or duty values the engine computed:

- barometric pressure: fluids.atmosphere.ATMOSPHERE_1976 (U.S. Standard Atmosphere
  1976) at the site elevation, when the design does not state it;
- water density and vapour pressure: iapws.IAPWS97 (IAPWS-IF97) at the case
  temperature and the source surface absolute pressure, iapws.iapws97._PSat_T;
  viscosity: IAPWS97(...).mu, which is iapws._iapws._Viscosity (IAPWS R12-08, 2008);
- wall friction: Darcy-Weisbach with fluids.friction.Colebrook (Colebrook 1939), or
  the Hazen-Williams SI form h = 10.67 L Q^1.852 / (C^1.852 D^4.8704) (Williams and
  Hazen, Hydraulic Tables, 1905/1920) on segments that give C; equivalent lengths of
  `loss` entries use the segment's friction law, as pipe of the segment's bore;
- minor losses on each segment's velocity head: the fluids entry named in the
  fitting's `source` (src/hydraulics/fittings/table.rs):
  "Darby (1999) 3-K, entry X" -> fluids.fittings.Darby3K(Di, Re, name=X);
  "Hooper (1981) 2-K, entry X" -> fluids.fittings.Hooper2K(Di in inches, Re, name=X);
  entrances: Hooper (1981) inlet K1/Re + Kinf, with K1 = 160 recovered from
  fluids.fittings.contraction_sharp(method='Hooper') and Kinf from
  fluids.fittings.entrance_rounded / entrance_sharp / entrance_distance;
  exit: fluids.fittings.exit_normal; size changes on the small pipe: diffuser_sharp,
  diffuser_conical, contraction_sharp, contraction_conical (method='Crane');
  foot valves: fluids.fittings.K_foot_valve_Crane; `loss { k }` as given;
- total head = static + friction + minor, static = z2 - z1 + (p2_abs - p1_abs)/(rho g),
  g = 9.80665 m/s2, at every flow of each case's tabulated system curve;
- duty points: each published curve column fitted as the document says
  (numpy.polyfit of the named degree, or scipy.interpolate.PchipInterpolator for the
  "Fritsch-Carlson monotone" spline; PCHIP is the Fritsch-Butland variant of the
  monotone cubic, so small differences between data points are expected), scaled by
  the affinity laws Q ~ N D, H ~ (N D)^2, efficiency equal, NPSHr ~ N^2 at Q ~ N, run
  as the arrangement (parallel: H(Q/n); series: n H(Q)), intersected with the
  recomputed system curve by scipy.optimize.brentq (the largest crossing flow, the
  stable one for a rising system curve), searched up to 110 % of the published flow;
- NPSH available at each duty flow term by term (ANSI/HI 9.6.1 definition):
  p_source_abs/(rho g) + (z_source - z_centreline) - suction losses - p_v/(rho g);
- NPSH available split further into barometric head p_baro/(rho g) and surface gauge
  pressure head (p_source_abs - p_baro)/(rho g);
- shaft power = rho g Q H / efficiency per pump, times the running pumps; hydraulic
  power rho g Q H; input power = shaft / (motor efficiency x drive efficiency), the two
  efficiencies read from the document (the design's, or the class value it names);
- velocity next to the pump = Q / (pi D^2 / 4) of the last suction segment and of the
  first discharge segment;
- energy per year = input power x running hours: the case's hours, or, where the case
  has a flow requirement (read from the document's `capacity[].required_flow_m3_s`),
  hours x required flow / reference duty flow.

Writes tests/reference/demo_recompute.csv:
    demo, case, pump, quantity, flow_m3_s, value
(`pump` empty for case quantities, `flow_m3_s` empty where no flow applies).
tests/reference_recompute.rs compares every row with the engine.

Run from anywhere (needs cargo for the JSON unless --from-json):
    pip install fluids iapws scipy numpy
    python3 tests/reference/gen_demo_recompute.py            # regenerate JSON and CSV
    python3 tests/reference/gen_demo_recompute.py --from-json # reuse the saved JSON
"""
import csv
import json
import math
import os
import re
import subprocess
import sys

import fluids
import fluids.fittings as ff
import iapws
import numpy as np
import scipy
from fluids.atmosphere import ATMOSPHERE_1976
from fluids.friction import Churchill_1977, Colebrook
from iapws import IAPWS97
from iapws.iapws97 import _PSat_T
from scipy.interpolate import PchipInterpolator
from scipy.optimize import brentq

from results_v2 import expand_v2  # format 2 read in the shape of format 1

HERE = os.path.dirname(os.path.abspath(__file__))
ROOT = os.path.dirname(os.path.dirname(HERE))
DEMOS = [
    ("orchard-lift-rev-a", "examples-demo/orchard-lift-rev-a.duty"),
    ("kestrel-booster", "examples-demo/kestrel-booster.duty"),
    ("recompute-pressure-us", "tests/designs/recompute-pressure-us.duty"),
    ("recompute-pressure-si", "tests/designs/recompute-pressure-si.duty"),
]
G = 9.80665  # standard gravity, m/s2 (CGPM 1901)
INCH = 0.0254  # m, exact (NIST SP 811)
HW_SI = 10.67  # Hazen-Williams SI constant (Williams and Hazen)
EXTRAPOLATION = 1.10  # search duty up to 110 % of the last published flow
GRID = 400  # sign-change search intervals before brentq


def hooper_inlet_k1():
    """Hooper's laminar inlet coefficient (160), recovered from fluids' Hooper (1988)
    sharp contraction into a pipe from a very large one: K = (1.2 + K1/Re)(1 - beta^4)."""
    re, d = 100.0, 1.0
    big = 1.0e3 * d
    k = ff.contraction_sharp(Di1=big, Di2=d, Re=re, method="Hooper")
    return (k / (1.0 - (d / big) ** 4) - 1.2) * re


K1_INLET = hooper_inlet_k1()
DARBY_ENTRY = re.compile(r'Darby \(1999\) 3-K, entry "(.*)"')
HOOPER_ENTRY = re.compile(r'Hooper \(1981\) 2-K, entry "(.*)"')


def fitting_k(fit, d, reynolds):
    """K of one piece of a fitting on a segment of bore d at Reynolds number reynolds."""
    name, source = fit["name"], fit["source"]
    beta, angle = fit.get("beta"), fit.get("angle_deg")
    m = DARBY_ENTRY.match(source)
    if m:
        return ff.Darby3K(Di=d, Re=reynolds, name=m.group(1))
    m = HOOPER_ENTRY.match(source)
    if m:
        return ff.Hooper2K(Di=d / INCH, Re=reynolds, name=m.group(1))
    if name == "entrance_rounded":
        return K1_INLET / reynolds + ff.entrance_rounded(Di=d, rc=0.15 * d, method="Crane")
    if name == "entrance_flush":
        return K1_INLET / reynolds + ff.entrance_sharp(method="Crane")
    if name == "entrance_projecting":
        return K1_INLET / reynolds + ff.entrance_distance(Di=d, t=1e-4 * d, method="Idelchik")
    if name == "exit":
        return ff.exit_normal()
    if name == "expansion_sudden":
        return ff.diffuser_sharp(Di1=d, Di2=d / beta, method="Rennels")
    if name == "expansion_gradual":
        return ff.diffuser_conical(Di1=d, Di2=d / beta, angle=angle, method="Crane")
    if name == "contraction_sudden":
        return ff.contraction_sharp(Di1=d / beta, Di2=d, method="Crane")
    if name == "contraction_gradual":
        return ff.contraction_conical(Di1=d / beta, Di2=d, angle=angle, method="Crane")
    if name == "foot_valve":
        return ff.K_foot_valve_Crane(D=d, style=1)
    if name == "foot_valve_poppet":
        return ff.K_foot_valve_Crane(D=d, style=0)
    raise SystemExit(f"no fluids counterpart for fitting {name!r} ({source})")


def hazen_williams(q, d, length, c):
    return HW_SI * length * q**1.852 / (c**1.852 * d**4.8704)


class System:
    """One case's hydraulics, rebuilt from the JSON inputs."""

    def __init__(self, case):
        given = case["barometric_pressure_given"]
        self.barometric = (case["barometric_pressure_Pa"] if given
                           else ATMOSPHERE_1976(case["site_elevation_m"]).P)
        lv = case["levels"]
        self.p1 = self.barometric + lv["source_gauge_pressure_Pa"]
        self.p2 = self.barometric + lv["destination_gauge_pressure_Pa"]
        self.z1, self.z2, self.zc = lv["source_m"], lv["destination_m"], lv["pump_centreline_m"]
        t = case["fluid"]["temperature_K"]
        if case["fluid"]["name"] != "water":
            raise SystemExit("only water cases are recomputed")
        w = IAPWS97(T=t, P=self.p1 / 1e6)
        self.rho, self.mu = float(w.rho), float(w.mu)
        self.pv = float(_PSat_T(t)) * 1e6
        self.static = self.z2 - self.z1 + (self.p2 - self.p1) / (self.rho * G)
        self.segments = case["segments"]
        self.laminar_or_transitional = False

    def check(self, q):
        """Stop unless every segment is turbulent at q (the CSV holds Colebrook values only)."""
        self.laminar_or_transitional = False
        self.losses(q)
        if self.laminar_or_transitional:
            raise SystemExit(f"a segment is not turbulent (Re < 4000) at {q} m3/s")

    def segment_losses(self, seg, q):
        q = float(q)
        if q <= 0.0:
            return 0.0, 0.0
        d = seg["inner_diameter_m"]
        v = q / (math.pi * d * d / 4.0)
        vh = v * v / (2.0 * G)
        reynolds = self.rho * v * d / self.mu
        c = seg["hazen_williams_c"]
        if reynolds >= 4000.0:
            fd = Colebrook(reynolds, seg["roughness_m"] / d)
        else:
            # Only met by the duty search's sign scan near zero flow, which needs the
            # sign of pump - system head alone; never written to the CSV (see `check`).
            self.laminar_or_transitional = True
            fd = Churchill_1977(reynolds, seg["roughness_m"] / d)
        if c is not None:
            wall = hazen_williams(q, d, seg["length_m"], c)
        else:
            wall = fd * seg["length_m"] / d * vh
        k = sum(f["count"] * fitting_k(f, d, reynolds) for f in seg["fittings"])
        minor = 0.0
        for loss in seg["losses"]:
            k += loss["k"] or 0.0
            le = loss["equivalent_length_m"] or 0.0
            if le > 0.0:
                minor += hazen_williams(q, d, le, c) if c is not None else fd * le / d * vh
        return wall, minor + k * vh

    def losses(self, q):
        friction = minor = suction = 0.0
        for seg in self.segments:
            wall, m = self.segment_losses(seg, q)
            friction += wall
            minor += m
            if seg["side"] == "suction":
                suction += wall + m
        return friction, minor, suction

    def head(self, q):
        f, m, _ = self.losses(q)
        return self.static + f + m

    def npsh_terms(self, q):
        rho_g = self.rho * G
        return {
            "npsh_barometric_head_m": self.barometric / rho_g,
            "npsh_surface_pressure_head_m": (self.p1 - self.barometric) / rho_g,
            "npsh_static_head_m": self.z1 - self.zc,
            "npsh_suction_loss_m": self.losses(q)[2],
            "npsh_vapour_head_m": self.pv / rho_g,
        }


def fitted(flow, values, method):
    """The column fitted by the method the JSON names; None when absent."""
    if method is None:
        return None
    pts = [(q, v) for q, v in zip(flow, values) if v is not None]
    x = np.array([p[0] for p in pts])
    y = np.array([p[1] for p in pts])
    m = re.fullmatch(r"least-squares polynomial, degree (\d)", method)
    if m:
        coef = np.polyfit(x, y, int(m.group(1)))
        return lambda q: float(np.polyval(coef, q))
    if method.startswith("Fritsch-Carlson monotone"):
        spline = PchipInterpolator(x, y, extrapolate=True)
        return lambda q: float(spline(q))
    raise SystemExit(f"unknown fit method {method!r}")


def duty(system, candidate, pump):
    """Reference duty of one candidate in one case, or None."""
    idx = candidate["evaluated_curve"]
    if idx is None:
        return None  # interpolated impeller: not reproduced here
    curve = candidate["curves"][idx]
    fl = curve["flow_m3_s"]
    head0 = fitted(fl, curve["head_m"], curve["head_fit"])
    eff0 = fitted(fl, curve["efficiency"], curve["efficiency_fit"])
    npshr0 = fitted(fl, curve["npsh_required_m"], curve["npsh_required_fit"])
    power0 = fitted(fl, curve["shaft_power_W"], curve["shaft_power_fit"])
    n = pump["speed_rpm"] / curve["speed_rpm"]
    d_case, d_curve = pump["impeller_diameter_m"], curve["impeller_diameter_m"]
    trim = d_case / d_curve if d_case and d_curve else candidate["trim_ratio"]
    s = n * trim
    kind, count = pump["arrangement"]["kind"], pump["arrangement"]["count"]
    par = count if kind == "parallel" else 1
    ser = count if kind == "series" else 1

    def head_arr(q):
        return ser * s * s * head0(q / par / s)

    q_end = fl[-1] * s * par * EXTRAPOLATION
    g = lambda q: head_arr(q) - system.head(q)
    grid = [q_end * i / GRID for i in range(GRID + 1)]
    vals = [g(q) for q in grid]
    roots = [brentq(g, a, b, xtol=1e-14, rtol=1e-13)
             for a, b, ga, gb in zip(grid, grid[1:], vals, vals[1:]) if ga * gb < 0.0]
    if not roots or vals[-1] > 0.0:
        return None
    q = roots[-1]
    h = head_arr(q)
    qp, hp = q / par, h / ser
    out = {"duty_flow_m3_s": q, "duty_head_m": h}
    if eff0 is not None:
        eta = eff0(qp / s)
        out["efficiency"] = eta
        out["shaft_power_W"] = system.rho * G * qp * hp / eta * par * ser
    elif power0 is not None:
        out["shaft_power_W"] = s**3 * power0(qp / s) * par * ser
    if npshr0 is not None:
        out["npsh_required_m"] = n * n * npshr0(qp / n)
    return out


def area(seg):
    return math.pi * seg["inner_diameter_m"] ** 2 / 4.0


def powers(system, case, candidate, pump, ref):
    """Velocities next to the pump, hydraulic and input power, energy per year."""
    q, h = ref["duty_flow_m3_s"], ref["duty_head_m"]
    suction = [s for s in system.segments if s["side"] == "suction"]
    discharge = [s for s in system.segments if s["side"] == "discharge"]
    out = {
        "suction_velocity_m_s": q / area(suction[-1]),
        "discharge_velocity_m_s": q / area(discharge[0]),
        "hydraulic_power_W": system.rho * G * q * h,
    }
    shaft = ref.get("shaft_power_W")
    if shaft is None:
        return out
    engine = pump["duty"]
    inp = shaft / (engine["motor_efficiency"] * engine["drive_efficiency"])
    out["input_power_W"] = inp
    hours = case["hours_per_year"]
    if hours > 0.0:
        required = next(c["required_flow_m3_s"] for c in candidate["capacity"]
                        if c["case"] == case["name"])
        running = hours * required / q if required else hours
        out["annual_energy_J"] = inp * running * 3600.0
    return out


def run_engine(demo, design_path):
    path = os.path.join(HERE, f"demo_{demo}.json")
    if "--from-json" not in sys.argv:
        run = subprocess.run(
            ["cargo", "run", "-q", "--", "results", design_path, "--format", "json"],
            cwd=ROOT, capture_output=True, text=True)
        # Exit 3: analysed, but no candidate qualifies; the document is complete.
        if run.returncode not in (0, 3):
            raise subprocess.CalledProcessError(run.returncode, run.args, run.stdout, run.stderr)
        text = run.stdout
        with open(path, "w") as fh:
            fh.write(text)
    with open(path) as fh:
        return expand_v2(json.load(fh))


def main():
    rows, header = [], []
    for demo, design_path in DEMOS:
        doc = run_engine(demo, design_path)
        header.append(f"# {demo}: demo_{demo}.json from dutyline {doc['tool_version']}, "
                      f"source sha256 {doc['source']['sha256']}")
        candidates = {c["name"]: c for c in doc["candidates"]}

        def add(case, pump, quantity, flow, value):
            rows.append([demo, case, pump, quantity, "" if flow is None else repr(float(flow)),
                         repr(float(value))])

        for case in doc["cases"]:
            if case["error"] is not None:
                continue
            name = case["name"]
            sys_ = System(case)
            if not case["barometric_pressure_given"]:
                add(name, "", "barometric_pressure_Pa", None, sys_.barometric)
            add(name, "", "density_kg_m3", None, sys_.rho)
            add(name, "", "dynamic_viscosity_Pa_s", None, sys_.mu)
            add(name, "", "vapor_pressure_Pa", None, sys_.pv)
            add(name, "", "static_head_m", None, sys_.static)
            for point in case["system_curve"]:
                q = point["flow_m3_s"]
                sys_.check(q)
                f, m, _ = sys_.losses(q)
                add(name, "", "friction_head_m", q, f)
                add(name, "", "minor_head_m", q, m)
                add(name, "", "system_head_m", q, sys_.static + f + m)
            for pump in case["pumps"]:
                ref = duty(sys_, candidates[pump["name"]], pump)
                if ref is None:
                    continue
                q = ref["duty_flow_m3_s"]
                sys_.check(q)
                for quantity, value in ref.items():
                    add(name, pump["name"], quantity, q, value)
                terms = sys_.npsh_terms(q)
                for quantity, value in terms.items():
                    add(name, pump["name"], quantity, q, value)
                npsha = (terms["npsh_barometric_head_m"] + terms["npsh_surface_pressure_head_m"]
                         + terms["npsh_static_head_m"] - terms["npsh_suction_loss_m"]
                         - terms["npsh_vapour_head_m"])
                add(name, pump["name"], "npsh_available_m", q, npsha)
                for quantity, value in powers(sys_, case, candidates[pump["name"]], pump,
                                              ref).items():
                    add(name, pump["name"], quantity, q, value)
    out = os.path.join(HERE, "demo_recompute.csv")
    with open(out, "w", newline="") as fh:
        fh.write(f"# generated by tests/reference/gen_demo_recompute.py with python "
                 f"{sys.version.split()[0]}, fluids {fluids.__version__}, iapws "
                 f"{iapws.__version__}, scipy {scipy.__version__}, numpy {np.__version__}\n")
        for line in header:
            fh.write(line + "\n")
        writer = csv.writer(fh, lineterminator="\n")
        writer.writerow(["demo", "case", "pump", "quantity", "flow_m3_s", "value"])
        writer.writerows(rows)
    print(f"wrote {len(rows)} rows to {out}")


if __name__ == "__main__":
    main()
