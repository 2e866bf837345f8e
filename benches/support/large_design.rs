//! The generated large design of the speed benches (issue 17), shared by
//! `benches/engine.rs`, `benches/package.rs` and `examples/large_design.rs`.

use std::fmt::Write;

/// `cases` cases × 10 candidates × 20 pipe segments (2 suction, 18 discharge), each
/// case a wet-well level from 99 to 102 m (repeating every 100 cases) and every third
/// case aged pipe; invented values.
pub fn large_design(cases: usize) -> String {
    let mut s = String::from(
        "project { title = \"Large generated design\", units = si }\n\
         fluid water { temperature = 15 degC }\nsite { elevation = 120 m }\n\
         tank low { level = 100 m }\ntank high { level = 140 m }\n\
         station { centreline = 98 m }\n\
         line suction from low to pump {\n",
    );
    for _ in 0..2 {
        s.push_str("    pipe steel 8 in schedule 40 { length = 6 m }\n    fitting elbow_90_long\n");
    }
    s.push_str("    fitting entrance_rounded\n}\nline discharge from pump to high {\n");
    for i in 0..18 {
        let size = if i % 2 == 0 {
            "6 in schedule 40"
        } else {
            "8 in schedule 40"
        };
        writeln!(s, "    pipe steel {size} {{ length = {} m }}", 40 + 7 * i).unwrap();
        s.push_str("    fitting elbow_90_standard * 2\n    fitting gate_valve\n");
    }
    s.push_str("    fitting check_valve_swing\n    fitting exit\n}\n");
    for i in 0..cases {
        writeln!(
            s,
            "case c{i} {{ low.level = {:.2} m, hours = 80 h{} }}",
            99.0 + 0.03 * (i % 100) as f64,
            if i % 3 == 0 { ", roughness = aged" } else { "" }
        )
        .unwrap();
    }
    s.push_str("require {\n    npsh_margin >= 1.2\n}\n");
    for p in 0..10 {
        let shut = 70.0 + 2.0 * p as f64;
        writeln!(s, "pump P{p} \"generated {p}\" {{\n    speed = 1780 rpm").unwrap();
        s.push_str("    curve impeller 300 mm {\n        flow m^3/h head m efficiency % npshr m\n");
        for k in 0..7 {
            let q = 60.0 * k as f64;
            let h = shut - 0.00012 * (1.0 + 0.05 * p as f64) * q * q;
            let e = if k == 0 {
                0.0
            } else {
                84.0 - 0.0009 * (q - 230.0) * (q - 230.0)
            };
            let n = if k == 0 {
                "-".to_string()
            } else {
                format!("{:.2}", 2.0 + 0.00004 * q * q)
            };
            writeln!(s, "        {q:.1} {h:.2} {e:.1} {n}").unwrap();
        }
        s.push_str("    }\n}\n");
    }
    s
}
