//! Engine benchmarks: parse + check, one system-curve point, one duty solve (the demo's,
//! and a 20-segment line's fast and exact), the full demo build to PDF bytes, and a
//! large generated design to results.
//!
//! Run: `cargo bench --bench engine -- --warm-up-time 1 --measurement-time 3`.
//! Targets: full demo build < 30 ms, one duty solve < 1 µs (20 segments, issue 17),
//! large design < 200 ms.

use std::hint::black_box;

use criterion::{criterion_group, criterion_main, Criterion};
use dutyline::analysis::duty::CandidateCurves;
use dutyline::analysis::CaseSystem;
use dutyline::{check, Design, NoFiles};

#[path = "support/large_design.rs"]
mod large_design;

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
    let src = large_design::large_design(100);
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

fn large_to_results(c: &mut Criterion) {
    let src = large_design::large_design(100);
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
