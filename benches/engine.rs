//! Engine benchmarks: parse + check, one system-curve point, one duty solve (the demo's,
//! and a 20-segment line's fast and exact), the full demo build to PDF bytes, and a
//! large generated design to results.
//!
//! Run: `cargo bench --bench engine -- --warm-up-time 1 --measurement-time 3`.
//! Targets: full demo build < 30 ms, one duty solve < 1 µs (20 segments, issue 17),
//! large design < 200 ms.

use std::fmt::Write;
use std::hint::black_box;

use criterion::{criterion_group, criterion_main, Criterion};
use dutyline::analysis::duty::CandidateCurves;
use dutyline::analysis::CaseSystem;
use dutyline::{check, Design, NoFiles};

const DEMO: &str = include_str!("../examples-demo/orchard-lift-rev-a.duty");

fn demo_design() -> Design {
    check(DEMO, &NoFiles).design.expect("the demo checks")
}

fn parse_and_check(c: &mut Criterion) {
    c.bench_function("parse_check_demo", |b| {
        b.iter(|| check(black_box(DEMO), &NoFiles))
    });
}

fn system_head(c: &mut Criterion) {
    let design = demo_design();
    let sys = CaseSystem::new(&design.cases[0].scenario).expect("system");
    let q = 0.045; // about 700 gpm, the demo's duty
    c.bench_function("system_head_one_flow", |b| {
        b.iter(|| sys.head(black_box(q)))
    });
}

fn duty_solve(c: &mut Criterion) {
    let design = demo_design();
    let sys = CaseSystem::new(&design.cases[0].scenario).expect("system");
    let curves = CandidateCurves::fit(&design.pumps[0]);
    let (pump, _) = curves.evaluated.expect("a fitted curve");
    let (_, q_data_end) = pump.head.domain();
    c.bench_function("duty_solve", |b| {
        b.iter(|| {
            dutyline::pumps::solve_duty(
                &|q| pump.head.eval(q),
                &|q| sys.head(q),
                black_box(q_data_end * 1.1),
            )
        })
    });
}

/// One duty solve on a 20-segment line (the large design's first case and first
/// candidate): the fast path (tabulated system curve, the candidate's grid scan) as the
/// analysis runs it, and the exact solve it replaced (system curve evaluated exactly,
/// the pump sampled on the grid) for comparison. Target: the fast one under 1 µs.
fn duty_solve_20_segments(c: &mut Criterion) {
    let src = large_design();
    let design = check(&src, &NoFiles).design.expect("design");
    let cases = &design.cases[..1];
    let candidates: Vec<CandidateCurves> = design.pumps.iter().map(CandidateCurves::fit).collect();
    let mut sys = CaseSystem::new(&cases[0].scenario).expect("system");
    assert_eq!(sys.segments.len(), 20);
    sys.tabulate(dutyline::analysis::duty::search_reach(
        &cases[0],
        &design,
        &candidates,
    ));
    let cc = &candidates[0];
    let (pump, _) = cc.evaluated.as_ref().expect("a fitted curve");
    let scan = cc.duty_scan.as_ref().expect("a scan");
    let q_end = pump.head.domain().1 * 1.1;
    let head = |q: f64| pump.head.eval(q);
    c.bench_function("duty_solve_20_segments", |b| {
        b.iter(|| {
            dutyline::analysis::system_table::solve_duty(&head, &sys, black_box(q_end), Some(scan))
        })
    });
    c.bench_function("duty_solve_20_segments_exact", |b| {
        b.iter(|| dutyline::pumps::solve_duty(&head, &|q| sys.head(q), black_box(q_end)))
    });
}

fn demo_to_pdf(c: &mut Criterion) {
    let style = dutyline::report::layout::style::Style::builtin("letter").expect("style");
    c.bench_function("demo_build_pdf", |b| {
        b.iter(|| {
            let design = demo_design();
            let analysis = dutyline::analysis::analyse(&design);
            dutyline::report::render_pdf(&design, &analysis, DEMO, &style, None).expect("pdf")
        })
    });
}

/// 100 cases × 10 candidates × 20 pipe segments, to the results JSON.
fn large_design() -> String {
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
    for i in 0..100 {
        writeln!(
            s,
            "case c{i} {{ low.level = {:.2} m, hours = 80 h{} }}",
            99.0 + 0.03 * i as f64,
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

fn large_to_results(c: &mut Criterion) {
    let src = large_design();
    let checked = check(&src, &NoFiles);
    assert!(!checked.has_errors(), "the generated design checks");
    let design = checked.design.expect("design");
    assert_eq!((design.cases.len(), design.pumps.len()), (100, 10));
    let mut group = c.benchmark_group("large");
    group.sample_size(10);
    group.bench_function("large_design_results", |b| {
        b.iter(|| {
            let checked = check(black_box(&src), &NoFiles);
            let design = checked.design.expect("design");
            let analysis = dutyline::analysis::analyse(&design);
            dutyline::results::to_json(&design, &analysis, "large.duty", &src, &checked.diagnostics)
        })
    });
    group.finish();
}

criterion_group!(
    benches,
    parse_and_check,
    system_head,
    duty_solve,
    duty_solve_20_segments,
    demo_to_pdf,
    large_to_results
);
criterion_main!(benches);
