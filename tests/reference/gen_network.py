#!/usr/bin/env python3
"""Independent recomputation of pipe networks for dutyline's network solve.

Each network below is solved here as one nonlinear system (every junction head and
every link flow as unknowns; a link's head-loss law equals the head difference across
it, and the flows balance at every junction) by a general-purpose root finder,
scipy.optimize.root (MINPACK hybrd), with the Darcy friction factor of
fluids.friction.Colebrook (Colebrook 1939). The two-loop network is also solved by the
Hardy Cross (1936) loop-correction method, written out below, as a second check.

Networks:
- three_reservoir: three reservoirs joined at one junction by cast-iron pipes
  (roughness 0.26 mm), the classic three-reservoir junction problem of the hydraulics
  textbooks with invented levels and pipes; the middle reservoir's flow direction is a
  result.
- two_loop: an invented two-loop grid fed from one reservoir with four demands and a
  stated K on one pipe.
- pumped_split: two pumps in parallel (a quadratic curve), a valve by Kv, an equipment
  drop and a check valve, feeding two reservoirs at different levels (the split is a
  result).

Demand-only networks (issue 12; no tank downstream of the station): at each station
flow Q the demands are scaled by Q / D (D their sum) and the entry node's head is an
unknown; the extra equation is H_g = z_g + p_g/(rho g) at the governing node g, found
here by trying every node with a required pressure or a demand and keeping the one at
which every other such node keeps its requirement (the critical-node rule; a different
route from dutyline's, which holds the entry head and raises every head afterwards).
- branched_demand: an entry node, a tee and three delivery points at different
  elevations and required pressures (invented), at three station flows.
- symmetric_pair: two identical branches to two identical delivery points (a hand
  check: the flow splits equally, each branch carries Q/2).

Well fields (issue 12; `well_fields`): several wells, each with the same pump, into one
collector. Every well adds four nodes (static level, pumping level, pump suction, pump
discharge) and four links (drawdown s = B Q + C Q^2 from the one test point, Jacob 1947;
suction pipe; pump; discharge pipe); the whole network is solved by the same
solve_root. NPSH available per pump = p_b/(rho g) + (H_suction - z_pump) - p_v/(rho g).
- three_wells: three unequal wells (levels, drawdowns, column lengths) into a two-node
  collector and a main to a reservoir (invented).
- twin_wells: two identical wells into one node (a hand check: equal flows).

Writes network_scipy.json next to this script: per network its data and the solution
(heads of every node, m; flows of every link, m^3/s), and under `demand_only` the
demand-only networks with their solutions per station flow. The Rust tests
(tests/network_reference.rs, tests/network_demand_only.rs, tests/well_field.rs) build the same networks from
this file.
Run: python3 gen_network.py   (pip install fluids scipy numpy)
"""
import json
import math
import os

import fluids
import numpy
import scipy
from fluids.friction import Colebrook
from scipy.optimize import root

G = 9.80665  # standard gravity (CGPM 1901)
CHECK_TURBULENT = False  # set while checking a final solution
KV_RHO0 = 1000.0  # reference water density of the Kv definition (IEC 60534-2-1)


def pipe(name, a, b, length, diameter, roughness, k=0.0):
    return dict(name=name, kind="pipe", **{"from": a, "to": b}, length_m=length,
                diameter_m=diameter, roughness_m=roughness, k=k)


NETWORKS = [
    dict(
        name="three_reservoir",
        fluid=dict(density=998.0, viscosity=0.001),
        nodes=[
            dict(name="R1", fixed_head_m=20.0, elevation_m=20.0),
            dict(name="R2", fixed_head_m=100.0, elevation_m=100.0),
            dict(name="R3", fixed_head_m=40.0, elevation_m=40.0),
            dict(name="J", demand_m3_s=0.0, elevation_m=0.0),
        ],
        links=[
            pipe("p1", "J", "R1", 100.0, 0.08, 0.00026),
            pipe("p2", "R2", "J", 150.0, 0.06, 0.00026),
            pipe("p3", "R3", "J", 80.0, 0.04, 0.00026),
        ],
    ),
    dict(
        name="two_loop",
        fluid=dict(density=998.2, viscosity=1.0016e-3),
        nodes=[
            dict(name="R", fixed_head_m=60.0, elevation_m=60.0),
            dict(name="A", demand_m3_s=0.0, elevation_m=20.0),
            dict(name="B", demand_m3_s=0.010, elevation_m=18.0),
            dict(name="C", demand_m3_s=0.015, elevation_m=15.0),
            dict(name="D", demand_m3_s=0.020, elevation_m=16.0),
            dict(name="E", demand_m3_s=0.0, elevation_m=14.0),
            dict(name="F", demand_m3_s=0.025, elevation_m=12.0),
        ],
        links=[
            pipe("feed", "R", "A", 800.0, 0.25, 0.0001, k=2.0),
            pipe("AB", "A", "B", 400.0, 0.20, 0.0001),
            pipe("BC", "B", "C", 450.0, 0.15, 0.0001),
            pipe("AD", "A", "D", 350.0, 0.15, 0.0001),
            pipe("BE", "B", "E", 300.0, 0.10, 0.0001),
            pipe("CF", "C", "F", 400.0, 0.10, 0.0001),
            pipe("DE", "D", "E", 420.0, 0.15, 0.0001),
            pipe("EF", "E", "F", 380.0, 0.15, 0.0001),
        ],
    ),
    dict(
        name="pumped_split",
        fluid=dict(density=998.2, viscosity=1.0016e-3),
        nodes=[
            dict(name="sump", fixed_head_m=10.0, elevation_m=10.0),
            dict(name="S", demand_m3_s=0.0, elevation_m=8.0),
            dict(name="P", demand_m3_s=0.0, elevation_m=8.0),
            dict(name="V", demand_m3_s=0.0, elevation_m=8.0),
            dict(name="J", demand_m3_s=0.004, elevation_m=20.0),
            dict(name="K", demand_m3_s=0.0, elevation_m=20.0),
            dict(name="upper", fixed_head_m=45.0, elevation_m=45.0),
            dict(name="lower", fixed_head_m=38.0, elevation_m=38.0),
        ],
        links=[
            pipe("suction", "sump", "S", 12.0, 0.20, 0.000045, k=1.5),
            dict(name="pumps", kind="pump", **{"from": "S", "to": "P"}, shutoff_m=52.0,
                 curve_m_s2_m6=9000.0, parallel=2),
            dict(name="control", kind="valve", **{"from": "P", "to": "V"}, kv=160.0),
            pipe("main", "V", "J", 900.0, 0.20, 0.000045),
            dict(name="meter", kind="equipment", **{"from": "J", "to": "K"},
                 rated_drop_pa=20000.0, rated_flow_m3_s=0.03, exponent=1.9),
            pipe("to_upper", "K", "upper", 600.0, 0.15, 0.000045),
            pipe("to_lower", "J", "lower", 700.0, 0.10, 0.000045, k=3.0),
        ],
    ),
]


def link_loss(link, q, fluid):
    """h(Q) = H(from) - H(to), m."""
    kind = link["kind"]
    a = abs(q)
    s = math.copysign(1.0, q)
    if kind == "pipe":
        d = link["diameter_m"]
        area = math.pi * d * d / 4.0
        v = a / area
        re = fluid["density"] * v * d / fluid["viscosity"]
        if re < 1e-9:
            return 0.0
        if CHECK_TURBULENT:
            assert re > 4000.0, f"{link['name']}: Re {re} not turbulent; keep the reference turbulent"
        f = Colebrook(re, link["roughness_m"] / d)
        return s * (f * link["length_m"] / d + link["k"]) * v * v / (2 * G)
    if kind == "drawdown":
        b = (link["drawdown_m"] - link["well_loss_m"]) / link["test_flow_m3_s"]
        c = link["well_loss_m"] / link["test_flow_m3_s"] ** 2
        return s * (b * a + c * a * a)
    if kind == "pump":
        per = q / link["parallel"]
        return -(link["shutoff_m"] - link["curve_m_s2_m6"] * per * abs(per))
    if kind == "valve":
        kv = link["kv"] / 3600.0
        return s * 1e5 / (KV_RHO0 * G) * (a / kv) ** 2
    if kind == "equipment":
        r = link["rated_drop_pa"] / (fluid["density"] * G) / link["rated_flow_m3_s"] ** link["exponent"]
        return s * r * a ** link["exponent"]
    raise ValueError(kind)


def solve_root(net):
    fluid = net["fluid"]
    names = [n["name"] for n in net["nodes"]]
    junctions = [n for n in net["nodes"] if "demand_m3_s" in n]
    jidx = {n["name"]: i for i, n in enumerate(junctions)}
    fixed = {n["name"]: n["fixed_head_m"] for n in net["nodes"] if "fixed_head_m" in n}
    nl = len(net["links"])

    def heads_of(x):
        return {**fixed, **{n["name"]: x[nl + i] for i, n in enumerate(junctions)}}

    def residual(x):
        heads = heads_of(x)
        out = []
        for k, link in enumerate(net["links"]):
            out.append(link_loss(link, x[k], fluid) - (heads[link["from"]] - heads[link["to"]]))
        for n in junctions:
            bal = -n["demand_m3_s"]
            for k, link in enumerate(net["links"]):
                if link["to"] == n["name"]:
                    bal += x[k]
                if link["from"] == n["name"]:
                    bal -= x[k]
            out.append(bal)
        return out

    mean = sum(fixed.values()) / len(fixed)
    x0 = [0.01] * nl + [mean] * len(junctions)
    sol = root(residual, x0, method="hybr", tol=1e-14, options={"maxfev": 100000})
    global CHECK_TURBULENT
    CHECK_TURBULENT = True
    worst = max(abs(r) for r in residual(sol.x))
    CHECK_TURBULENT = False
    assert worst < 1e-10, f"{net['name']}: residual {worst}"
    heads = heads_of(sol.x)
    return dict(heads_m={n: heads[n] for n in names},
                flows_m3_s={l["name"]: sol.x[k] for k, l in enumerate(net["links"])},
                max_residual=worst)


def hardy_cross_two_loop(net, iterations=200):
    """Hardy Cross (1936) loop corrections on the two-loop grid: flows balanced by
    construction, each loop corrected by dQ = -sum(h)/sum(|dh/dQ|) until converged."""
    fluid = net["fluid"]
    links = {l["name"]: l for l in net["links"]}
    # A balanced start: everything along the tree feed-AB-BC-CF, AD, DE, with BE, EF fed.
    q = {"feed": 0.070, "AB": 0.035, "BC": 0.020, "AD": 0.035, "BE": 0.005, "CF": 0.005,
         "DE": 0.015, "EF": 0.020}
    loops = [[("AB", 1), ("BE", 1), ("DE", -1), ("AD", -1)],
             [("BC", 1), ("CF", 1), ("EF", -1), ("BE", -1)]]
    for _ in range(iterations):
        biggest = 0.0
        for lp in loops:
            num = sum(d * link_loss(links[n], q[n], fluid) for n, d in lp)
            den = 0.0
            for n, _d in lp:
                dq = max(abs(q[n]) * 1e-7, 1e-12)
                den += abs((link_loss(links[n], q[n] + dq, fluid) - link_loss(links[n], q[n], fluid)) / dq)
            corr = -num / den
            for n, d in lp:
                q[n] += d * corr
            biggest = max(biggest, abs(corr))
        if biggest < 1e-15:
            break
    return q


DEMAND_ONLY = [
    dict(
        name="branched_demand",
        fluid=dict(density=998.2, viscosity=1.0016e-3),
        entry="M",
        nodes=[
            dict(name="M", demand_m3_s=0.0, elevation_m=2.0),
            dict(name="T", demand_m3_s=0.0, elevation_m=9.0),
            dict(name="U", demand_m3_s=0.004, elevation_m=24.0, required_pressure_pa=150e3),
            dict(name="L", demand_m3_s=0.006, elevation_m=12.0, required_pressure_pa=200e3),
            dict(name="R", demand_m3_s=0.003, elevation_m=18.0, required_pressure_pa=100e3),
        ],
        links=[
            pipe("main", "M", "T", 180.0, 0.1023, 0.00005),
            pipe("upper", "T", "U", 140.0, 0.0525, 0.00005),
            pipe("lower", "T", "L", 90.0, 0.0779, 0.00005),
            pipe("row", "M", "R", 210.0, 0.0525, 0.00005),
        ],
        station_flows_m3_s=[0.0065, 0.013, 0.0182],
    ),
    dict(
        name="symmetric_pair",
        fluid=dict(density=998.2, viscosity=1.0016e-3),
        entry="M",
        nodes=[
            dict(name="M", demand_m3_s=0.0, elevation_m=0.0),
            dict(name="A", demand_m3_s=0.005, elevation_m=10.0, required_pressure_pa=100e3),
            dict(name="B", demand_m3_s=0.005, elevation_m=10.0, required_pressure_pa=100e3),
        ],
        links=[
            pipe("left", "M", "A", 300.0, 0.0779, 0.00005),
            pipe("right", "M", "B", 300.0, 0.0779, 0.00005),
        ],
        station_flows_m3_s=[0.012],
    ),
]


def well(name, level, drawdown, well_loss, pump_z, column_m, node):
    return dict(name=name, static_level_m=level, drawdown_m=drawdown, test_flow_m3_s=0.02,
                well_loss_m=well_loss, pump_elevation_m=pump_z,
                suction=dict(length_m=3.0, diameter_m=0.15, roughness_m=0.00005, k=1.0),
                discharge=dict(length_m=column_m, diameter_m=0.1023, roughness_m=0.00005,
                               k=2.0),
                collector_node=node)


WELL_FIELDS = [
    dict(
        name="three_wells",
        fluid=dict(density=998.2, viscosity=1.0016e-3, vapor_pressure_pa=2339.0),
        barometric_pa=101325.0,
        pump=dict(shutoff_m=90.0, curve_m_s2_m6=60000.0),
        collector=dict(
            nodes=[
                dict(name="C1", demand_m3_s=0.0, elevation_m=100.0),
                dict(name="C2", demand_m3_s=0.0, elevation_m=100.0),
                dict(name="reservoir", fixed_head_m=118.0, elevation_m=118.0),
            ],
            links=[
                pipe("header", "C1", "C2", 300.0, 0.1541, 0.00005),
                pipe("main", "C2", "reservoir", 1200.0, 0.2027, 0.00005, k=3.0),
            ],
        ),
        wells=[
            well("w1", 70.0, 6.0, 1.5, 55.0, 80.0, "C1"),
            well("w2", 68.0, 9.0, 3.0, 52.0, 260.0, "C1"),
            well("w3", 72.0, 4.0, 1.0, 60.0, 140.0, "C2"),
        ],
    ),
    dict(
        name="twin_wells",
        fluid=dict(density=998.2, viscosity=1.0016e-3, vapor_pressure_pa=2339.0),
        barometric_pa=101325.0,
        pump=dict(shutoff_m=90.0, curve_m_s2_m6=60000.0),
        collector=dict(
            nodes=[
                dict(name="C", demand_m3_s=0.0, elevation_m=100.0),
                dict(name="reservoir", fixed_head_m=115.0, elevation_m=115.0),
            ],
            links=[pipe("main", "C", "reservoir", 900.0, 0.2027, 0.00005, k=3.0)],
        ),
        wells=[
            well("a", 70.0, 6.0, 1.5, 55.0, 120.0, "C"),
            well("b", 70.0, 6.0, 1.5, 55.0, 120.0, "C"),
        ],
    ),
]


def field_network(field):
    """The collector with every well's four nodes and four links appended, named as
    dutyline's analysis/network/field.rs names them."""
    nodes = list(field["collector"]["nodes"])
    links = list(field["collector"]["links"])
    for w in field["wells"]:
        n = w["name"]
        lv = w["static_level_m"]
        nodes += [dict(name=f"{n} static level", fixed_head_m=lv, elevation_m=lv),
                  dict(name=f"{n} pumping level", demand_m3_s=0.0, elevation_m=lv),
                  dict(name=f"{n} pump suction", demand_m3_s=0.0, elevation_m=w["pump_elevation_m"]),
                  dict(name=f"{n} pump discharge", demand_m3_s=0.0, elevation_m=w["pump_elevation_m"])]
        sp, dp = w["suction"], w["discharge"]
        links += [dict(name=f"{n} drawdown", kind="drawdown",
                       **{"from": f"{n} static level", "to": f"{n} pumping level"},
                       drawdown_m=w["drawdown_m"], test_flow_m3_s=w["test_flow_m3_s"],
                       well_loss_m=w["well_loss_m"]),
                  pipe(f"{n} suction", f"{n} pumping level", f"{n} pump suction",
                       sp["length_m"], sp["diameter_m"], sp["roughness_m"], sp["k"]),
                  dict(name=f"{n} pump", kind="pump",
                       **{"from": f"{n} pump suction", "to": f"{n} pump discharge"},
                       shutoff_m=field["pump"]["shutoff_m"],
                       curve_m_s2_m6=field["pump"]["curve_m_s2_m6"], parallel=1),
                  pipe(f"{n} discharge", f"{n} pump discharge", w["collector_node"],
                       dp["length_m"], dp["diameter_m"], dp["roughness_m"], dp["k"])]
    return dict(name=field["name"], fluid=field["fluid"], nodes=nodes, links=links)


def solve_field(field):
    net = field_network(field)
    sol = solve_root(net)
    fl = field["fluid"]
    rho_g = fl["density"] * G
    pumps = []
    for w in field["wells"]:
        n = w["name"]
        q = sol["flows_m3_s"][f"{n} pump"]
        hs = sol["heads_m"][f"{n} pump suction"]
        hd = sol["heads_m"][f"{n} pump discharge"]
        pumps.append(dict(well=n, flow_m3_s=q, head_m=hd - hs,
                          pumping_level_m=sol["heads_m"][f"{n} pumping level"],
                          npsh_available_m=field["barometric_pa"] / rho_g
                          + (hs - w["pump_elevation_m"]) - fl["vapor_pressure_pa"] / rho_g))
    return dict(sol, pumps=pumps, total_flow_m3_s=sum(p["flow_m3_s"] for p in pumps))


def need_head(n, fluid):
    """z + p_req/(rho g), m: the head a governing node must keep."""
    return n["elevation_m"] + n.get("required_pressure_pa", 0.0) / (fluid["density"] * G)


def solve_demand_only(net, q_station):
    """Every head and flow unknown; demands scaled by Q/D; the station's Q enters at the
    entry; H_g = need_g at the governing node g (tried in turn)."""
    fluid = net["fluid"]
    nodes = net["nodes"]
    nl, nn = len(net["links"]), len(nodes)
    total = sum(n["demand_m3_s"] for n in nodes)
    scale = q_station / total
    governing = [n for n in nodes if n["demand_m3_s"] > 0.0 or "required_pressure_pa" in n]

    def residual(x, g):
        heads = {n["name"]: x[nl + i] for i, n in enumerate(nodes)}
        out = [link_loss(l, x[k], fluid) - (heads[l["from"]] - heads[l["to"]])
               for k, l in enumerate(net["links"])]
        for n in nodes:
            bal = -n["demand_m3_s"] * scale + (q_station if n["name"] == net["entry"] else 0.0)
            for k, l in enumerate(net["links"]):
                bal += x[k] if l["to"] == n["name"] else 0.0
                bal -= x[k] if l["from"] == n["name"] else 0.0
            out.append(bal)
        # nn balances are dependent (they sum to zero): replace the entry's by the
        # governing node's head condition.
        out[nl + [n["name"] for n in nodes].index(net["entry"])] = heads[g["name"]] - need_head(g, fluid)
        return out

    for g in governing:
        x0 = [q_station / nl] * nl + [need_head(g, fluid) + 10.0] * nn
        sol = root(lambda x: residual(x, g), x0, method="hybr", tol=1e-14,
                   options={"maxfev": 100000})
        heads = {n["name"]: sol.x[nl + i] for i, n in enumerate(nodes)}
        if all(heads[n["name"]] >= need_head(n, fluid) - 1e-9 for n in governing):
            worst = max(abs(r) for r in residual(sol.x, g))
            assert worst < 1e-10, f"{net['name']}: residual {worst}"
            for k, l in enumerate(net["links"]):
                d = l["diameter_m"]
                re = fluid["density"] * abs(sol.x[k]) / (math.pi * d * d / 4) * d / fluid["viscosity"]
                assert re > 4000.0, f"{l['name']}: Re {re}: keep the reference turbulent"
            return dict(station_flow_m3_s=q_station, scale=scale, governing=g["name"],
                        heads_m=heads,
                        flows_m3_s={l["name"]: sol.x[k] for k, l in enumerate(net["links"])},
                        max_residual=worst)
    raise RuntimeError(f"{net['name']}: no governing node at Q = {q_station}")


def main():
    out = dict(
        generated_by="tests/reference/gen_network.py",
        versions=dict(fluids=fluids.__version__, scipy=scipy.__version__, numpy=numpy.__version__),
        networks=[],
    )
    for net in NETWORKS:
        sol = solve_root(net)
        entry = dict(net, solution=sol)
        if net["name"] == "two_loop":
            hc = hardy_cross_two_loop(net)
            for n, v in hc.items():
                assert abs(v - sol["flows_m3_s"][n]) < 1e-9 * max(1.0, abs(v)), (n, v)
            entry["hardy_cross_flows_m3_s"] = hc
        out["networks"].append(entry)
    out["demand_only"] = []
    for net in DEMAND_ONLY:
        sols = [solve_demand_only(net, q) for q in net["station_flows_m3_s"]]
        if net["name"] == "symmetric_pair":
            for s in sols:  # the hand solution: equal split
                assert abs(s["flows_m3_s"]["left"] - s["flows_m3_s"]["right"]) < 1e-12
        out["demand_only"].append(dict(net, solutions=sols))
    out["well_fields"] = []
    for field in WELL_FIELDS:
        sol = solve_field(field)
        if field["name"] == "twin_wells":  # the hand solution: equal split
            a, b = sol["pumps"]
            assert abs(a["flow_m3_s"] - b["flow_m3_s"]) < 1e-12
        out["well_fields"].append(dict(field, solution=sol))
    path = os.path.join(os.path.dirname(os.path.abspath(__file__)), "network_scipy.json")
    with open(path, "w") as f:
        json.dump(out, f, indent=1, sort_keys=True)
        f.write("\n")
    for e in out["networks"]:
        print(e["name"], {k: round(v, 6) for k, v in e["solution"]["flows_m3_s"].items()})
        print("  heads", {k: round(v, 4) for k, v in e["solution"]["heads_m"].items()})
    for e in out["well_fields"]:
        print(e["name"], [(p["well"], round(p["flow_m3_s"], 6), round(p["head_m"], 3),
                           round(p["npsh_available_m"], 3)) for p in e["solution"]["pumps"]])
    for e in out["demand_only"]:
        for s in e["solutions"]:
            print(e["name"], s["station_flow_m3_s"], s["governing"],
                  {k: round(v, 4) for k, v in s["heads_m"].items()})


if __name__ == "__main__":
    main()
