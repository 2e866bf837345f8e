//! Network solve benchmark: a 2 000-link looped grid (Colebrook pipes with fittings K,
//! some valves) fed from three tanks, solved from scratch (ordering, factorisations,
//! iterations) per case.
//!
//! Run: `cargo bench --bench network -- --warm-up-time 1 --measurement-time 3`.
//! Target: under 5 ms per case on one core (issue 12).

use std::hint::black_box;

use criterion::{criterion_group, criterion_main, Criterion};
use dutyline::analysis::network::{solve, Settings};

#[path = "../tests/network_common/mod.rs"]
mod network_common;

fn grid_2000(c: &mut Criterion) {
    let net = network_common::grid(32, 32, 3);
    assert!(net.links.len() >= 2000, "{} links", net.links.len());
    let iterations = solve(&net, &Settings::default())
        .expect("grid solves")
        .iterations;
    println!(
        "grid: {} nodes, {} links, {iterations} iterations",
        net.nodes.len(),
        net.links.len()
    );
    c.bench_function("network_2000_links", |b| {
        b.iter(|| solve(black_box(&net), &Settings::default()))
    });
}

criterion_group!(benches, grid_2000);
criterion_main!(benches);
