#[test]
fn demo_analyses() {
    let src = std::fs::read_to_string("examples-demo/orchard-lift-rev-a.duty").unwrap();
    let c = dutyline::check(&src, &dutyline::NoFiles);
    let d = c.design.expect("valid");
    let a = dutyline::analysis::analyse(&d);
    for case in &a.cases {
        let s = case.system.as_ref().unwrap();
        println!(
            "case {} static {:.2} rho {:.1} npsha0 {:.2}",
            case.name,
            s.static_head,
            s.fluid.density,
            s.npsh_available(0.0)
        );
        for p in &case.pumps {
            println!(
                "  {} duty {:?} fail {:?}",
                p.name,
                p.duty.as_ref().map(|d| (
                    d.flow * 15850.3,
                    d.head / 0.3048,
                    d.efficiency,
                    d.npsh_available,
                    d.npsh_required
                )),
                p.failure
            );
            for ch in &p.checks {
                println!("    {} {:?} {}", ch.id, ch.status, ch.message);
            }
            for w in &p.warnings {
                println!("    w: {w}");
            }
        }
    }
    println!("{:?}", a.selection);
}
