#[test]
fn demo_parses() {
    for f in ["examples-demo/orchard-lift-rev-a.duty"] {
        let src = std::fs::read_to_string(f).unwrap();
        match dutyline::syntax::parse(&src) {
            Ok(file) => {
                for s in &file.statements {
                    println!("{:?}\n", s.kind);
                }
            }
            Err(d) => panic!("{}", dutyline::diagnostics::render(&d, f, &src)),
        }
    }
}
