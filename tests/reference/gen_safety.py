#!/usr/bin/env python3
"""Independent recomputation of the safety screen of the demos (issue 14).

For each demo the script runs `cargo run -q -- results <demo> --format json` and reads
its INPUTS (tank levels and pressures, centreline, segment bores, lengths, roughness,
fittings, the profile chainages and elevations, the published pump curves), never the
grade, pressures or wave speeds the engine computed. It recomputes:

- the duty flow of the screened candidate, the segment losses and the fluid with the
  independent code of gen_demo_recompute.py (fluids Colebrook and fitting K, iapws
  IAPWS-IF97);
- the hydraulic grade line by its own march: energy grade from the source surface
  (suction) or back from the destination surface (discharge), each segment's minor
  losses at its upstream end and its wall friction linear along it, HGL = E - v^2/2g,
  p = rho g (HGL - z); static pressures from the surfaces; the shut-off pressure from
  the largest published curve's head at zero flow x (1 + 5 %) in 1000 kg/m3 water
  plus the highest static suction pressure;
- the wave speed of every segment by the Korteweg formula with K = rho w^2 (iapws
  IAPWS97 speed of sound w), walls from fluids.piping.nearest_pipe (ASME B36.10M /
  B36.19M schedules; PVC schedules share the steel walls, ASTM D1785) and, for
  ductile iron, the AWWA C151 class 350 16 in wall of 0.34 in with OD 17.40 in (from
  memory), moduli and Poisson ratios as stated in src/hydraulics/wave_speed.rs, the
  restraint factor anchored throughout (1 - nu^2, or Halliwell's thick-wall form below
  D/e = 25); the equivalent pipe a = L / sum(L/a), A = L / sum(L/A); the period 2L/a
  and the Joukowsky head a Q/(A g).

Writes tests/reference/safety_reference.csv. Needs: pip install fluids iapws scipy numpy
"""

import csv
import math
import os
import sys

import fluids
import iapws
from fluids.piping import nearest_pipe
from iapws import IAPWS97

HERE = os.path.dirname(os.path.abspath(__file__))
sys.path.insert(0, HERE)
import gen_demo_recompute as R  # noqa: E402  (the independent hydraulics)

G = 9.80665
IN = 0.0254
DEMOS = [
    ("orchard-lift-rev-a", "examples-demo/orchard-lift-rev-a.duty"),
    ("kestrel-booster", "examples-demo/kestrel-booster.duty"),
]
# (modulus Pa, Poisson) as stated in src/hydraulics/wave_speed.rs (from memory).
ELASTIC = {
    "steel": (207e9, 0.30), "galvanized": (207e9, 0.30), "stainless": (193e9, 0.30),
    "ductile_iron": (166e9, 0.28), "cement_lined_ductile_iron": (166e9, 0.28),
    "pvc": (2.76e9, 0.45), "hdpe": (1.0e9, 0.45),
}


def wall_of(seg):
    """Wall thickness (m) from the size label, by fluids' pipe tables."""
    words = seg["size"].split()
    if seg["material"].endswith("ductile_iron"):
        assert words[:4] == ["16", "in", "class", "350"], seg["size"]
        return 0.34 * IN
    nps = float(words[0])
    schedule = words[3]
    _, _, _, t = nearest_pipe(NPS=nps, schedule=schedule)
    return t


def korteweg(k, rho, d, e, modulus, nu):
    base = 1.0 - nu * nu
    psi = base if d / e >= 25.0 else 2.0 * e / d * (1.0 + nu) + d * base / (d + e)
    return math.sqrt((k / rho) / (1.0 + psi * k * d / (modulus * e)))


def screened(doc):
    name = doc["safety"]["candidate"]
    return next(c for c in doc["candidates"] if c["name"] == name)


def grade(sys_, case, q):
    """{segment global index: (E at upstream end, wall, minor)} at flow q."""
    segs = case["segments"]
    losses = [sys_.segment_losses(s, q) for s in segs]
    e_source = sys_.z1 + (sys_.p1 - sys_.barometric) / (sys_.rho * G)
    e_dest = sys_.z2 + (sys_.p2 - sys_.barometric) / (sys_.rho * G)
    out, e = {}, e_source
    for i, s in enumerate(segs):
        if s["side"] == "suction":
            out[i] = (e,) + tuple(losses[i])
            e -= sum(losses[i])
    e = e_dest + sum(sum(losses[i]) for i, s in enumerate(segs) if s["side"] == "discharge")
    for i, s in enumerate(segs):
        if s["side"] == "discharge":
            out[i] = (e,) + tuple(losses[i])
            e -= sum(losses[i])
    return out, e_source, e_dest


def main():
    rows, header = [], []
    for demo, path in DEMOS:
        doc = R.run_engine(demo, path)
        header.append(f"# {demo}: source sha256 {doc['source']['sha256']}")
        cand = screened(doc)
        k_index = [c["name"] for c in doc["candidates"]].index(cand["name"])
        # Shut-off: largest published impeller, its zero-flow head.
        curves = [c for c in cand["curves"]]
        big = max(curves, key=lambda c: c.get("impeller_diameter_m") or 0.0)
        # Zero-flow published head (both demos publish a shut-off point), at the curve's
        # speed: the demos' maximum speed is the rated speed (max_speed 100 %).
        h0 = big["head_m"][0] if big["flow_m3_s"][0] == 0 else None
        suction = []
        for case in doc["cases"]:
            s = R.System(case)
            suction.append((s.p1 - s.barometric) + s.rho * G * (s.z1 - s.zc))
        ps = max(suction)
        for case in doc["cases"]:
            sys_ = R.System(case)
            pump = case["pumps"][k_index]
            ref = R.duty(sys_, cand, pump)
            if ref is None:
                continue
            q = ref["duty_flow_m3_s"]
            rows.append([demo, case["name"], "", "", "duty_flow_m3_s", repr(q)])
            energy, e_source, e_dest = grade(sys_, case, q)
            w = IAPWS97(T=case["fluid"]["temperature_K"], P=sys_.p1 / 1e6)
            k = float(w.rho) * float(w.w) ** 2
            rows.append([demo, case["name"], "", "", "bulk_modulus_Pa", repr(k)])
            for line in case["lines"]:
                segs = [i for i, s in enumerate(case["segments"]) if s["line"] == line["name"]]
                starts, x = {}, 0.0
                for i in segs:
                    starts[i] = x
                    x += case["segments"][i]["length_m"]
                seen = set()
                for n, st in enumerate(line["profile"]):
                    i = st["segment"]
                    seg = case["segments"][i]
                    area = math.pi * seg["inner_diameter_m"] ** 2 / 4.0
                    hv = (q / area) ** 2 / (2.0 * G)
                    e0, wall, minor = energy[i]
                    if n == 0:
                        h = e0 - (0.0 if seg["side"] == "suction" else hv)
                    else:
                        seen.add(i)
                        frac = ((st["chainage_m"] - starts[i]) / seg["length_m"]
                                if seg["length_m"] > 0 else 1.0)
                        h = e0 - minor - wall * min(max(frac, 0.0), 1.0) - hv
                    z = st["elevation_m"]
                    p = sys_.rho * G * (h - z)
                    static = (e_source if seg["side"] == "suction" else e_dest)
                    ps_static = sys_.rho * G * (static - z)
                    tag = [demo, case["name"], line["name"], str(n)]
                    rows.append(tag + ["pressure_duty_Pa", repr(p)])
                    rows.append(tag + ["pressure_static_Pa", repr(ps_static)])
                    if seg["side"] == "discharge" and h0 is not None:
                        so = ps + 1000.0 * G * h0 * 1.05 + 1000.0 * G * (sys_.zc - z)
                        rows.append(tag + ["pressure_shutoff_Pa", repr(so)])
                # Wave speed per segment and the equivalent pipe.
                travel = inertia = total = 0.0
                for j, i in enumerate(segs):
                    seg = case["segments"][i]
                    e = wall_of(seg)
                    modulus, nu = ELASTIC[seg["material"]]
                    a = korteweg(k, sys_.rho, seg["inner_diameter_m"], e, modulus, nu)
                    rows.append([demo, case["name"], line["name"], str(j), "wave_speed_m_s", repr(a)])
                    length = seg["length_m"]
                    area = math.pi * seg["inner_diameter_m"] ** 2 / 4.0
                    travel += length / a
                    inertia += length / area
                    total += length
                a_eq = total / travel
                v_eq = q / (total / inertia)
                tag = [demo, case["name"], line["name"], ""]
                rows.append(tag + ["equivalent_wave_speed_m_s", repr(a_eq)])
                rows.append(tag + ["period_s", repr(2.0 * travel)])
                rows.append(tag + ["joukowsky_head_m", repr(a_eq * v_eq / G)])
    out = os.path.join(HERE, "safety_reference.csv")
    with open(out, "w", newline="") as fh:
        fh.write(f"# generated by tests/reference/gen_safety.py with python {sys.version.split()[0]}, "
                 f"fluids {fluids.__version__}, iapws {iapws.__version__}\n")
        for line in header:
            fh.write(line + "\n")
        writer = csv.writer(fh, lineterminator="\n")
        writer.writerow(["demo", "case", "line", "index", "quantity", "value"])
        writer.writerows(rows)
    print(f"wrote {len(rows)} rows to {out}")


if __name__ == "__main__":
    main()
