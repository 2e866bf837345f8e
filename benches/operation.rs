//! Operation over the year: a profile of 50 load points × 10 parallel variable-speed
//! candidates with staging (issue 13 target: under 5 ms).
//!
//! Run: `cargo bench --bench operation -- --warm-up-time 1 --measurement-time 3`.

use std::hint::black_box;

use criterion::{criterion_group, criterion_main, Criterion};

const KESTREL: &str = include_str!("../examples-demo/kestrel-booster.duty");
const CSV: &str = include_str!("../examples-demo/kestrel-kr1-430.csv");

struct Files;
impl dutyline::FileAccess for Files {
    fn read_text(&self, _path: &str) -> Result<String, dutyline::model::FileError> {
        Ok(CSV.to_string())
    }
}

/// The Kestrel demo with ten copies of KR1 and a 50-row profile from 20 % to 100 %.
fn design() -> dutyline::Design {
    let start = KESTREL.find("pump KR1").expect("KR1");
    let end = KESTREL.find("pump KR2").expect("KR2");
    let kr1 = &KESTREL[start..end];
    let mut src = KESTREL[..start].to_string();
    for i in 0..10 {
        src.push_str(&kr1.replacen("pump KR1", &format!("pump C{i}"), 1));
    }
    let rest = &KESTREL[end..];
    let rest = &rest[rest.find("\nload_profile").expect("load_profile")..];
    let rows: String = (0..50)
        .map(|k| format!("        {:.1}       150\n", 20.0 + 80.0 * k as f64 / 49.0))
        .collect();
    let table_start = rest.find("        30       400").expect("rows");
    let table_end = rest.find("    }\n}").expect("end of table");
    let mut rest = format!("{}{}{}", &rest[..table_start], rows, &rest[table_end..]);
    for name in ["KR1", "KR2"] {
        rest = rest.replace(
            &format!("cost {name} {{"),
            &format!("cost C{} {{", if name == "KR1" { 0 } else { 1 }),
        );
    }
    src.push_str(&rest);
    let c = dutyline::check(&src, &Files);
    c.design.unwrap_or_else(|| panic!("{:?}", c.diagnostics))
}

fn profile_50_by_10(c: &mut Criterion) {
    let d = design();
    let a = dutyline::analysis::analyse(&d);
    assert_eq!(a.operation.len(), 10);
    assert_eq!(a.operation[0].points.len(), 50);
    c.bench_function("profile_50_bins_10_candidates", |b| {
        b.iter(|| {
            dutyline::analysis::operation::analyse(
                black_box(&d),
                &a.cases,
                &a.candidates,
                &a.motor_sizing,
            )
        })
    });
}

criterion_group!(benches, profile_50_by_10);
criterion_main!(benches);
