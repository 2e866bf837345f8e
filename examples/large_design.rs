//! Writes the generated large design of the speed benches to standard output, for
//! whole-process measurements: `cargo run --release --example large_design -- 10000 > large.duty`.

#[path = "../benches/support/large_design.rs"]
mod large_design;

fn main() {
    let cases = std::env::args()
        .nth(1)
        .and_then(|a| a.parse().ok())
        .unwrap_or(100);
    print!("{}", large_design::large_design(cases));
}
