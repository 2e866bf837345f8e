//! The cost of the duty envelopes (issue 15) on the Kestrel demo: 4 cases × 2
//! candidates × 24 corners (two-sided grade, three input ranges).
//!
//! Run: `cargo bench --bench envelope -- --warm-up-time 1 --measurement-time 3`.
//! Target: under 2 ms added to `results`; measured 7.5–9.7 ms on the shared 2-core
//! machine (2026-12-02), 2.29 ms against 4.85 ms before on 2026-12-03, 2.04–2.11 ms idle at
//! 11:30 UTC (DEVELOPERS.md,
//! "Benchmarks"), not yet met.

use std::hint::black_box;

use criterion::{criterion_group, criterion_main, Criterion};
use dutyline::analysis::{analyse, envelope};

const DEMO: &str = include_str!("../examples-demo/kestrel-booster.duty");

struct Csv;

impl dutyline::FileAccess for Csv {
    fn read_text(&self, path: &str) -> Result<String, dutyline::model::FileError> {
        match path {
            "kestrel-kr1-430.csv" => {
                Ok(include_str!("../examples-demo/kestrel-kr1-430.csv").into())
            }
            _ => Err(dutyline::model::FileError::NotFound),
        }
    }
}

fn corner_envelope(c: &mut Criterion) {
    let design = dutyline::check(DEMO, &Csv).design.expect("the demo checks");
    let a = analyse(&design);
    c.bench_function("envelope_kestrel_corners", |b| {
        b.iter(|| {
            let mut w = Vec::new();
            envelope::analyse(
                black_box(&design),
                &a.cases,
                &a.candidates,
                &a.motor_sizing,
                &mut w,
            )
        })
    });
}

criterion_group!(benches, corner_envelope);
criterion_main!(benches);
