//! A well field (issue 12, engine part: `analysis::network::field`): the candidate pump
//! at every well, unequal wells and piping, one collector.
//!
//! - Against tests/reference/gen_network.py (`well_fields`): the same field solved by
//!   scipy.optimize.root (MINPACK hybrd) with fluids' Colebrook. Acceptance: flows within
//!   0.1 %, heads and NPSH available within 0.01 m (the tolerance), and 1e-6 to
//!   catch drift early.
//! - Conservation: the total field flow reaches the reservoir; flow balances at every
//!   node to 1e-9 m³/s.
//! - A hand solution: two identical wells split the flow equally.

mod network_common;

use std::sync::Arc;

use dutyline::analysis::network::field::{solve_field, FieldSolution, FieldWell};
use dutyline::analysis::network::{Element, Network, PipeRun};
use dutyline::analysis::system::WellDrawdown;
use network_common::{fluid, from_reference, segment, well_field, Quadratic};

fn run_of(p: &serde_json::Value) -> PipeRun {
    let n = |k: &str| p[k].as_f64().unwrap();
    PipeRun {
        segments: vec![segment(
            n("length_m"),
            n("diameter_m"),
            n("roughness_m"),
            n("k"),
        )],
    }
}

/// The collector network and the wells of a reference field.
fn build(f: &serde_json::Value) -> (Network, Vec<FieldWell>) {
    let mut c = f["collector"].clone();
    c["fluid"] = f["fluid"].clone();
    let mut collector = from_reference(&c);
    collector.fluid = fluid(
        f["fluid"]["density"].as_f64().unwrap(),
        f["fluid"]["viscosity"].as_f64().unwrap(),
    );
    collector.fluid.vapor_pressure = dutyline::hydraulics::heads::AbsolutePressure::new(
        f["fluid"]["vapor_pressure_pa"].as_f64().unwrap(),
    );
    let wells = f["wells"]
        .as_array()
        .unwrap()
        .iter()
        .map(|w| {
            let n = |k: &str| w[k].as_f64().unwrap();
            let node = w["collector_node"].as_str().unwrap();
            FieldWell {
                name: w["name"].as_str().unwrap().into(),
                static_level: n("static_level_m"),
                surface_pressure: 0.0,
                drawdown: WellDrawdown {
                    drawdown: n("drawdown_m"),
                    test_flow: n("test_flow_m3_s"),
                    well_loss: n("well_loss_m"),
                },
                pump_elevation: n("pump_elevation_m"),
                suction: run_of(&w["suction"]),
                discharge: run_of(&w["discharge"]),
                collector_node: collector.nodes.iter().position(|x| x.name == node).unwrap(),
            }
        })
        .collect();
    (collector, wells)
}

fn solve_reference(f: &serde_json::Value) -> (FieldSolution, Network) {
    let (collector, wells) = build(f);
    let curve = Arc::new(Quadratic {
        h0: f["pump"]["shutoff_m"].as_f64().unwrap(),
        a: f["pump"]["curve_m_s2_m6"].as_f64().unwrap(),
        max_flow: 1.0,
    });
    let net = dutyline::analysis::network::field::field_network(&collector, &wells, curve.clone())
        .unwrap();
    let sol = solve_field(
        &collector,
        &wells,
        curve,
        f["barometric_pa"].as_f64().unwrap(),
    )
    .unwrap();
    (sol, net)
}

fn close(a: f64, b: f64, rel: f64) -> bool {
    (a - b).abs() <= rel * b.abs()
}

#[test]
fn three_unequal_wells_match_scipy() {
    let f = well_field("three_wells");
    let (sol, net) = solve_reference(&f);
    let want = &f["solution"];
    for (p, w) in sol.pumps.iter().zip(want["pumps"].as_array().unwrap()) {
        let num = |k: &str| w[k].as_f64().unwrap();
        assert_eq!(p.well, w["well"].as_str().unwrap());
        assert!(close(p.flow, num("flow_m3_s"), 1e-3), "{p:?} vs {w}");
        assert!(close(p.flow, num("flow_m3_s"), 1e-6), "{p:?} vs {w}");
        for (got, key) in [
            (p.head, "head_m"),
            (p.npsh_available, "npsh_available_m"),
            (p.pumping_level, "pumping_level_m"),
        ] {
            assert!((got - num(key)).abs() < 0.01, "{key}: {p:?} vs {w}");
            assert!((got - num(key)).abs() < 1e-6, "{key}: {p:?} vs {w}");
        }
    }
    // Unequal wells give unequal flows (the point of solving them as a network).
    assert!((sol.pumps[0].flow - sol.pumps[1].flow).abs() > 1e-3);
    for (k, l) in net.links.iter().enumerate() {
        let r = want["flows_m3_s"][&l.name].as_f64().unwrap();
        assert!(close(sol.network.links[k].flow, r, 1e-6), "{}", l.name);
    }
    for (i, n) in net.nodes.iter().enumerate() {
        let r = want["heads_m"][&n.name].as_f64().unwrap();
        assert!((sol.network.nodes[i].head - r).abs() < 1e-6, "{}", n.name);
    }
    assert!(close(
        sol.total_flow,
        want["total_flow_m3_s"].as_f64().unwrap(),
        1e-6
    ));
}

#[test]
fn the_field_conserves_flow() {
    for name in ["three_wells", "twin_wells"] {
        let (sol, net) = solve_reference(&well_field(name));
        for (i, node) in net.nodes.iter().enumerate() {
            if matches!(
                node.kind,
                dutyline::analysis::network::NodeKind::FixedHead { .. }
            ) {
                continue;
            }
            let bal: f64 = net
                .links
                .iter()
                .enumerate()
                .map(|(k, l)| {
                    let q = sol.network.links[k].flow;
                    (if l.to == i { q } else { 0.0 }) - (if l.from == i { q } else { 0.0 })
                })
                .sum();
            assert!(bal.abs() < 1e-9, "{name} {}: {bal}", node.name);
        }
        let main = net.links.iter().position(|l| l.name == "main").unwrap();
        assert!(close(sol.network.links[main].flow, sol.total_flow, 1e-9));
        // Each drawdown link carries its pump's flow, with s = B Q + C Q² at it.
        for p in &sol.pumps {
            let k = net
                .links
                .iter()
                .position(|l| l.name == format!("{} drawdown", p.well))
                .unwrap();
            assert!(matches!(net.links[k].element, Element::Drawdown(_)));
            assert!(close(sol.network.links[k].flow, p.flow, 1e-9));
            assert!((sol.network.links[k].head_loss - p.drawdown).abs() < 1e-9);
        }
    }
}

#[test]
fn two_identical_wells_split_equally() {
    let f = well_field("twin_wells");
    let (sol, _) = solve_reference(&f);
    let (a, b) = (&sol.pumps[0], &sol.pumps[1]);
    // Hand solution: by symmetry each well gives half the total.
    assert!(close(a.flow, b.flow, 1e-9), "{a:?} {b:?}");
    assert!(close(a.flow, sol.total_flow / 2.0, 1e-9));
    assert!((a.npsh_available - b.npsh_available).abs() < 1e-9);
    let want = f["solution"]["pumps"][0]["flow_m3_s"].as_f64().unwrap();
    assert!(close(a.flow, want, 1e-6));
}
