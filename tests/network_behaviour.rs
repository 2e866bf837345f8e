//! What the network solve does at its edges: check valves close against reverse flow
//! and open again, a stopped pump set or shut valve carries nothing, zero-flow links
//! stay finite, a part that reaches no tank is a named error, and the iterations are
//! bounded with the worst node named.

mod network_common;

use dutyline::analysis::network::{
    solve, Characteristic, Element, Network, NetworkError, Settings, Valve,
};
use network_common::*;

/// A sump, a pump set, and a junction feeding an upper tank; `upper` level given.
fn pumped(upper: f64, check: bool) -> Network {
    let nodes = vec![
        tank("sump", 10.0),
        junction("P", 5.0, 0.0),
        tank("upper", upper),
    ];
    let mut links = vec![
        link(&nodes, "pumps", "sump", "P", pumps(40.0, 20_000.0, 1)),
        link(&nodes, "main", "P", "upper", pipe(500.0, 0.15, 4.5e-5, 0.0)),
    ];
    links[0].check = check;
    Network {
        fluid: fluid(998.2, 1.0e-3),
        nodes,
        links,
    }
}

#[test]
fn a_pump_with_a_check_valve_stops_against_a_higher_tank() {
    // Shut-off 40 m from a 10 m sump: a tank at 60 m would drive flow backwards.
    let sol = solve(&pumped(60.0, true), &Settings::default()).unwrap();
    assert_eq!(sol.links[0].flow, 0.0);
    assert!(sol.links[0].closed);
    assert!(sol.links[1].flow.abs() < 1e-12);
    // Without the check valve the flow runs back through the pump.
    let back = solve(&pumped(60.0, false), &Settings::default()).unwrap();
    assert!(back.links[0].flow < 0.0);
}

#[test]
fn a_demand_behind_a_closed_check_valve_is_a_named_error() {
    // The pump set points from the junction into the tank, so the junction's demand
    // would need reverse flow through it: its check valve closes and the junction
    // reaches the tank through nothing that carries flow.
    let nodes = vec![tank("upper", 30.0), junction("J", 5.0, 0.01)];
    let mut links = vec![link(
        &nodes,
        "pumps",
        "J",
        "upper",
        pumps(40.0, 20_000.0, 1),
    )];
    links[0].check = true;
    let net = Network {
        fluid: fluid(998.2, 1.0e-3),
        nodes,
        links,
    };
    let err = solve(&net, &Settings::default()).unwrap_err();
    assert_eq!(err, NetworkError::Unsupplied { node: "J".into() });
    assert!(err.to_string().contains("node J draws a demand"), "{err}");
}

#[test]
fn a_check_valve_opens_when_the_pump_can_deliver() {
    let sol = solve(&pumped(30.0, true), &Settings::default()).unwrap();
    assert!(!sol.links[0].closed);
    let q = sol.links[0].flow;
    // Pump head = static + pipe loss at the solved flow.
    let pump_head = 40.0 - 20_000.0 * q * q;
    let pipe_loss = sol.nodes[1].head - 30.0;
    assert!(
        (pump_head - (sol.nodes[1].head - 10.0)).abs() < 1e-7,
        "{pump_head}"
    );
    assert!(pipe_loss > 0.0 && q > 0.0);
}

#[test]
fn a_shut_valve_and_a_dead_end_give_zero_flow_and_finite_heads() {
    let nodes = vec![
        tank("high", 50.0),
        junction("A", 0.0, 0.0),
        junction("dead_end", 0.0, 0.0),
        tank("low", 10.0),
    ];
    let shut = Element::Valve(Valve {
        kvs: 100.0,
        characteristic: Characteristic::EqualPercentage { rangeability: 50.0 },
        opening: 0.0,
        control: false,
    });
    let links = vec![
        link(&nodes, "in", "high", "A", pipe(100.0, 0.1, 4.5e-5, 0.0)),
        link(
            &nodes,
            "stub",
            "A",
            "dead_end",
            pipe(50.0, 0.1, 4.5e-5, 0.0),
        ),
        link(&nodes, "valve", "A", "low", shut),
    ];
    let net = Network {
        fluid: fluid(998.2, 1.0e-3),
        nodes,
        links,
    };
    let sol = solve(&net, &Settings::default()).unwrap();
    for l in &sol.links {
        assert!(l.flow.abs() < 1e-9, "{l:?}");
    }
    for n in &sol.nodes[..3] {
        assert!((n.head - 50.0).abs() < 1e-6, "{n:?}");
    }
}

#[test]
fn a_part_without_a_tank_is_named() {
    let nodes = vec![
        tank("high", 50.0),
        junction("A", 0.0, 0.01),
        junction("island_1", 0.0, 0.0),
        junction("island_2", 0.0, 0.0),
    ];
    let links = vec![
        link(&nodes, "in", "high", "A", pipe(100.0, 0.1, 4.5e-5, 0.0)),
        link(
            &nodes,
            "x",
            "island_1",
            "island_2",
            pipe(10.0, 0.1, 4.5e-5, 0.0),
        ),
    ];
    let net = Network {
        fluid: fluid(998.2, 1.0e-3),
        nodes,
        links,
    };
    let err = solve(&net, &Settings::default()).unwrap_err();
    assert_eq!(
        err,
        NetworkError::Disconnected {
            nodes: vec!["island_1".into(), "island_2".into()]
        }
    );
    assert!(err.to_string().contains("island_1, island_2 reach no tank"));
}

#[test]
fn too_few_iterations_name_the_worst_node() {
    let settings = Settings {
        max_iterations: 2,
        ..Settings::default()
    };
    match solve(&pumped(30.0, false), &settings) {
        Err(NetworkError::NotConverged {
            iterations,
            worst_node,
            head_change,
        }) => {
            // Two full steps, then two halved ones.
            assert_eq!(iterations, 4);
            assert_eq!(worst_node, "P");
            assert!(head_change.is_finite() && head_change > 0.0);
        }
        other => panic!("{other:?}"),
    }
}

#[test]
fn a_stopped_pump_set_passes_nothing() {
    let mut net = pumped(12.0, false);
    if let Element::Pump(p) = &mut net.links[0].element {
        p.parallel = 0;
    }
    let sol = solve(&net, &Settings::default()).unwrap();
    assert_eq!(sol.links[0].flow, 0.0);
    assert!(sol.links[0].closed);
}

#[test]
fn two_pumps_in_parallel_deliver_what_the_arrangement_law_says() {
    // Two equal pumps: the set's head at Q is one pump's head at Q/2.
    let one = pumped(30.0, true);
    let mut two = pumped(30.0, true);
    if let Element::Pump(p) = &mut two.links[0].element {
        p.parallel = 2;
    }
    let s1 = solve(&one, &Settings::default()).unwrap();
    let s2 = solve(&two, &Settings::default()).unwrap();
    let q2 = s2.links[0].flow;
    assert!(q2 > s1.links[0].flow);
    let head = 40.0 - 20_000.0 * (q2 / 2.0).powi(2);
    assert!((head - (s2.nodes[1].head - 10.0)).abs() < 1e-7);
}
