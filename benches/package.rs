//! Package speed (issue 17): each demo from source to PDF bytes the way `build`
//! makes them (check, analyse, results JSON attached, PDF), and the generated large
//! design to results JSON and to a summarised package.
//!
//! Run: `cargo bench --bench package -- --warm-up-time 1 --measurement-time 3`.
//! Targets: each demo under 15 ms; the large design's results under 1 s and its
//! summarised package under 2 s (case count: `DUTYLINE_BENCH_CASES`, default 1 000).

use std::hint::black_box;

use criterion::{criterion_group, criterion_main, Criterion};
use dutyline::verify::{DesignFiles, Sources, StyleSource};
use dutyline::{check, NoFiles};

#[path = "support/large_design.rs"]
mod large_design;

/// The demos with the CSV files they read.
const DEMOS: [(&str, &str); 4] = [
    (
        "orchard-lift-rev-a",
        include_str!("../examples-demo/orchard-lift-rev-a.duty"),
    ),
    (
        "orchard-lift-rev-b",
        include_str!("../examples-demo/orchard-lift-rev-b.duty"),
    ),
    (
        "kestrel-booster",
        include_str!("../examples-demo/kestrel-booster.duty"),
    ),
    (
        "hillside-district",
        include_str!("../examples-demo/hillside-district.duty"),
    ),
];
const KESTREL_CSV: (&str, &str) = (
    "kestrel-kr1-430.csv",
    include_str!("../examples-demo/kestrel-kr1-430.csv"),
);

/// The sources `build` compiles for a design file named `name`.duty.
fn sources(name: &str, text: &str) -> Sources {
    let mut imports = std::collections::BTreeMap::new();
    if text.contains(KESTREL_CSV.0) {
        imports.insert(KESTREL_CSV.0.to_string(), KESTREL_CSV.1.to_string());
    }
    let style = dutyline::report::builtin_style_for(
        check(text, &imports)
            .design
            .as_ref()
            .expect("the design checks"),
    );
    Sources {
        design: DesignFiles {
            name: format!("{name}.duty"),
            source: text.to_string(),
            imports,
        },
        style: StyleSource::Builtin(style.to_string()),
        compare: None,
    }
}

fn demo_packages(c: &mut Criterion) {
    for (name, text) in DEMOS {
        let s = sources(name, text);
        c.bench_function(&format!("package_{name}"), |b| {
            b.iter(|| dutyline::verify::compile(black_box(&s)).expect("package"))
        });
    }
}

fn bench_cases() -> usize {
    std::env::var("DUTYLINE_BENCH_CASES")
        .ok()
        .and_then(|v| v.parse().ok())
        .unwrap_or(1_000)
}

fn large(c: &mut Criterion) {
    let cases = bench_cases();
    let src = large_design::large_design(cases);
    let checked = check(&src, &NoFiles);
    assert!(!checked.has_errors(), "the generated design checks");
    let mut group = c.benchmark_group("large");
    group.sample_size(10);
    group.bench_function(format!("large_{cases}_results"), |b| {
        b.iter(|| {
            let checked = check(black_box(&src), &NoFiles);
            let design = checked.design.expect("design");
            let analysis = dutyline::analysis::analyse(&design);
            dutyline::results::to_json(&design, &analysis, "large.duty", &src, &checked.diagnostics)
        })
    });
    let s = sources("large", &src);
    group.bench_function(format!("large_{cases}_package"), |b| {
        b.iter(|| dutyline::verify::compile(black_box(&s)).expect("package"))
    });
    group.finish();
}

criterion_group!(benches, demo_packages, large);
criterion_main!(benches);
