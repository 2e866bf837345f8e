//! The network solve against an independent recomputation: the same networks solved
//! by scipy.optimize.root (MINPACK hybrd) with fluids' Colebrook, and the two-loop grid
//! also by the Hardy Cross (1936) method (tests/reference/gen_network.py, which wrote
//! tests/reference/network_scipy.json). Acceptance: flows within 0.1 %, heads within
//! 0.01 m (the tolerance); the solves agree far closer, so the test also holds
//! them to 1e-6 relative and 1e-6 m to catch a drift early.

mod network_common;

use network_common::reference;

use dutyline::analysis::network::{solve, Settings};

fn check_network(name: &str) {
    let doc = reference();
    let entry = doc["networks"]
        .as_array()
        .unwrap()
        .iter()
        .find(|n| n["name"] == name)
        .unwrap();
    let net = network_common::from_reference(entry);
    let sol = solve(&net, &Settings::default()).unwrap();
    let want = &entry["solution"];
    for (k, l) in net.links.iter().enumerate() {
        let q_ref = want["flows_m3_s"][&l.name].as_f64().unwrap();
        let q = sol.links[k].flow;
        let rel = (q - q_ref).abs() / q_ref.abs();
        assert!(rel < 1e-3, "{name} link {}: {q} vs scipy {q_ref}", l.name);
        assert!(
            rel < 1e-6,
            "{name} link {}: {q} vs scipy {q_ref} ({rel:.1e})",
            l.name
        );
    }
    for (i, n) in net.nodes.iter().enumerate() {
        let h_ref = want["heads_m"][&n.name].as_f64().unwrap();
        let h = sol.nodes[i].head;
        assert!(
            (h - h_ref).abs() < 0.01,
            "{name} node {}: {h} vs {h_ref}",
            n.name
        );
        assert!(
            (h - h_ref).abs() < 1e-6,
            "{name} node {}: {h} vs {h_ref}",
            n.name
        );
    }
}

#[test]
fn three_reservoir_junction_matches_scipy() {
    check_network("three_reservoir");
}

#[test]
fn two_loop_grid_matches_scipy_and_hardy_cross() {
    check_network("two_loop");
    let doc = reference();
    let entry = doc["networks"]
        .as_array()
        .unwrap()
        .iter()
        .find(|n| n["name"] == "two_loop")
        .unwrap();
    let net = network_common::from_reference(entry);
    let sol = solve(&net, &Settings::default()).unwrap();
    for (k, l) in net.links.iter().enumerate() {
        let q_hc = entry["hardy_cross_flows_m3_s"][&l.name].as_f64().unwrap();
        assert!(
            (sol.links[k].flow - q_hc).abs() < 1e-3 * q_hc.abs(),
            "{}",
            l.name
        );
    }
}

#[test]
fn pumped_split_with_valve_and_equipment_matches_scipy() {
    check_network("pumped_split");
}
