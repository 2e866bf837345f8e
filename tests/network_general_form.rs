//! A single chain written in the general form (the discharge line ends at a junction
//! and a node-to-node line continues to the reservoir) gives the same duty as the
//! chain itself, within the network solver's tolerance; a second reservoir splits the
//! flow, and design errors in the network statements are located.

mod common;
use common::said;
use dutyline::analysis::{analyse, Analysis};
use dutyline::NoFiles;

fn orchard() -> String {
    let path = format!(
        "{}/examples-demo/orchard-lift-rev-a.duty",
        env!("CARGO_MANIFEST_DIR")
    );
    std::fs::read_to_string(path).expect("demo")
}

/// The orchard demo with its discharge split at a junction after the first pipe.
fn orchard_general_form() -> String {
    let src = orchard();
    // The expansion takes β from the next pipe of its line; split from it, it states
    // the chain's β (the ratio of the bores) itself.
    let chain = dutyline::check(&src, &NoFiles).design.expect("demo");
    let beta = chain.base.lines[1].segments[0]
        .fittings
        .iter()
        .find_map(|f| f.beta)
        .expect("the chain's expansion β");
    let src = src.replace(
        "fitting expansion_gradual { angle = 15 deg }",
        &format!("fitting expansion_gradual {{ beta = {beta:.17}, angle = 15 deg }}"),
    );
    let from = "    pipe pvc 8 in schedule 40 { length = 2650 ft + riser }";
    assert!(src.contains(from));
    let src = src.replace(
        "line discharge from pump to reservoir {",
        "junction station_outlet { elevation = 1204.0 ft }\n\nline discharge from pump to station_outlet {",
    );
    src.replace(
        from,
        &format!("}}\n\nline rising_main from station_outlet to reservoir {{\n{from}"),
    )
}

fn run(src: &str) -> Analysis {
    let c = dutyline::check(src, &NoFiles);
    assert!(!c.has_errors(), "{:?}", c.diagnostics);
    analyse(&c.design.expect("design"))
}

#[test]
fn a_chain_in_the_general_form_gives_the_same_duty() {
    let chain = run(&orchard());
    let general = run(&orchard_general_form());
    assert!(general.cases[0].system.as_ref().unwrap().network.is_some());
    let mut compared = 0;
    for (a, b) in chain.cases.iter().zip(&general.cases) {
        for (p, q) in a.pumps.iter().zip(&b.pumps) {
            let (Some(d1), Some(d2)) = (&p.duty, &q.duty) else {
                assert_eq!(p.duty.is_some(), q.duty.is_some());
                continue;
            };
            assert!(
                (d1.flow - d2.flow).abs() < 1e-6 * d1.flow,
                "{} {}: {} vs {}",
                a.name,
                p.name,
                d1.flow,
                d2.flow
            );
            assert!(
                (d1.head - d2.head).abs() < 1e-5,
                "{} {}: {} vs {}",
                a.name,
                p.name,
                d1.head,
                d2.head
            );
            assert!((d1.npsh_available - d2.npsh_available).abs() < 1e-6);
            compared += 1;
        }
    }
    assert!(compared >= 4, "{compared}");
}

#[test]
fn a_second_reservoir_takes_part_of_the_flow() {
    let src = orchard_general_form().replace(
        "tank reservoir {",
        "tank bench_pond { level = 1290 ft }\ntank reservoir {",
    ) + "\nline pond_feed from station_outlet to bench_pond {\n    pipe pvc 4 in schedule 40 { length = 900 ft }\n    fitting exit\n}\n";
    let a = run(&src);
    let p = &a.cases[0].pumps[0];
    let net = p.network.as_ref().expect("network at the duty");
    let duty = p.duty.as_ref().unwrap().flow;
    let inflow = |name: &str| {
        net.nodes
            .iter()
            .find(|n| n.name == name)
            .unwrap()
            .inflow
            .unwrap()
    };
    let (pond, reservoir) = (inflow("bench_pond"), inflow("reservoir"));
    assert!(pond > 0.0 && reservoir > 0.0);
    assert!(
        (pond + reservoir - duty).abs() < 1e-9,
        "{pond} + {reservoir} vs {duty}"
    );
}

#[test]
fn network_statement_errors_are_located() {
    let src = orchard_general_form()
        + "\nvalve v1 from station_outlet to resrvoir { kvs = 100 m^3/h }\nequipment e1 from station_outlet to reservoir { drop = 5 psi }\njunction lonely { elevation = 1200 ft }\n";
    let c = dutyline::check(&src, &NoFiles);
    let text: Vec<String> = c
        .diagnostics
        .iter()
        .map(|d| format!("{} {}", d.code, d.message))
        .collect();
    assert!(
        text.iter()
            .any(|t| t.contains("unknown-name there is no node or tank `resrvoir`")),
        "{text:?}"
    );
    assert!(text.iter().any(|t| t.contains("`rated_flow`")), "{text:?}");
    assert!(
        text.iter()
            .any(|t| t.contains("unused-node node `lonely` is joined to no link")),
        "{text:?}"
    );
    for d in &c.diagnostics {
        assert!(d.span.is_some(), "{}: {}", d.code, d.message);
    }
}

fn hillside() -> String {
    let path = format!(
        "{}/examples-demo/hillside-district.duty",
        env!("CARGO_MANIFEST_DIR")
    );
    std::fs::read_to_string(path).expect("demo")
}

fn statuses(a: &Analysis, id: &str) -> Vec<(String, &'static str)> {
    a.cases
        .iter()
        .flat_map(|c| &c.pumps)
        .flat_map(|p| &p.checks)
        .filter(|k| k.id.as_str() == id)
        .map(|k| (said(a, &k.message.get()), k.status.keyword()))
        .collect()
}

#[test]
fn node_requirements_and_minimum_flow_pass_in_the_demo() {
    let a = run(&hillside());
    let req = statuses(&a, "requirement");
    assert!(
        req.iter()
            .any(|(m, s)| m.contains("pressure at upper_vineyard") && *s == "pass"),
        "{req:?}"
    );
    assert!(
        req.iter()
            .any(|(m, s)| m.contains("flow into the tank at ridge_tank") && *s == "pass"),
        "{req:?}"
    );
    let min = statuses(&a, "minimum-flow");
    assert!(
        !min.is_empty() && min.iter().all(|(_, s)| *s == "pass"),
        "{min:?}"
    );
    let node = statuses(&a, "node-pressure");
    assert!(
        !node.is_empty() && node.iter().all(|(_, s)| *s == "pass"),
        "{node:?}"
    );
}

#[test]
fn node_requirements_and_minimum_flow_fail_when_not_met() {
    let src = hillside()
        .replace(
            "pressure at upper_vineyard >= 35 psi",
            "pressure at upper_vineyard >= 80 psi",
        )
        .replace("min_flow = 170 gpm", "min_flow = 900 gpm")
        .replace("    pressure = 35 psi\n", "    pressure = 70 psi\n");
    let a = run(&src);
    let req = statuses(&a, "requirement");
    assert!(
        req.iter()
            .any(|(m, s)| m.contains("pressure at upper_vineyard") && *s == "fail"),
        "{req:?}"
    );
    let min = statuses(&a, "minimum-flow");
    assert!(min.iter().any(|(_, s)| *s == "fail"), "{min:?}");
    let node = statuses(&a, "node-pressure");
    assert!(
        node.iter()
            .any(|(m, s)| m.contains("upper_vineyard") && *s == "fail"),
        "{node:?}"
    );
}

#[test]
fn flow_at_a_junction_is_refused() {
    let src = hillside().replace(
        "flow at ridge_tank >= 150 gpm for night_refill",
        "flow at hop_yard >= 150 gpm",
    );
    let c = dutyline::check(&src, &NoFiles);
    assert!(c
        .diagnostics
        .iter()
        .any(|d| d.code.as_str() == "bad-requirement" && d.span.is_some()));
}

#[test]
fn an_absolute_node_pressure_requirement_is_refused() {
    let src = hillside().replace(
        "pressure at upper_vineyard >= 35 psi",
        "pressure at upper_vineyard >= 50 psia",
    );
    let c = dutyline::check(&src, &NoFiles);
    assert!(c
        .diagnostics
        .iter()
        .any(|d| d.code.as_str() == "unit-mismatch" && d.message.contains("gauge")));
}

#[test]
fn a_control_valve_reports_its_authority_over_its_series_branch() {
    let src = hillside().replace(
        "    characteristic = equal_percentage\n    opening = 70 %",
        "    characteristic = equal_percentage\n    opening = 70 %\n    kind = control",
    );
    assert!(src.contains("kind = control"));
    let a = run(&src);
    let c = &a.cases[0]; // peak: the valve 70 % open
    let mut seen = 0;
    for p in &c.pumps {
        let (Some(net), Some(check)) = (
            &p.network,
            p.checks.iter().find(|k| k.id.as_str() == "valve-authority"),
        ) else {
            continue;
        };
        let link = |name: &str| net.links.iter().find(|l| l.name == name).unwrap();
        // Another route to N: the valve's own drop at 70 % scaled to fully open,
        // Δp₁₀₀ = Δp·(Kv/Kvs)² with Kv/Kvs = 50^(0.7−1) (equal percentage, R = 50), over
        // Δp₁₀₀ plus the drop of south_main, the one pipe in series with it (south_valve
        // joins only the two; lower_orchard draws a demand). Heads in m, ρg cancels.
        let r = 50f64.powf(0.7 - 1.0);
        let open = link("south_balancing").head_loss * r * r;
        let n = open / (open + link("south_main").head_loss);
        let value = check.value.unwrap();
        assert!((value - n).abs() < 1e-9 * n, "{value} vs {n}");
        assert_eq!(check.limit, Some(0.25));
        assert_eq!(check.subject.as_deref(), Some("south_balancing"));
        seen += 1;
    }
    assert!(seen >= 1, "no authority check");
    // A balancing valve (the default) has no authority check.
    assert!(statuses(&run(&hillside()), "valve-authority").is_empty());
}

#[test]
fn a_valve_kind_must_be_control_or_balancing() {
    let src = hillside().replace(
        "    opening = 70 %\n",
        "    opening = 70 %\n    kind = throttle\n",
    );
    let c = dutyline::check(&src, &NoFiles);
    assert!(c.has_errors());
    let d = c
        .diagnostics
        .iter()
        .find(|d| d.message.contains("throttle") || d.message.contains("valve kind"));
    assert!(
        d.is_some_and(|d| d.span.is_some()),
        "{:?}",
        c.diagnostics
            .iter()
            .map(|d| d.message.clone())
            .collect::<Vec<_>>()
    );
}
