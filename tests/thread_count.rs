//! Cases are analysed on every core (issue 17, `analysis::concurrent`); the results must
//! not depend on how many threads there are. The demos (two to five cases each, chains
//! and a network, a load profile) give byte-identical results JSON with one thread and
//! with two.

use std::process::Command;

const BIN: &str = env!("CARGO_BIN_EXE_dutyline");

fn results_json(design: &str, threads: &str) -> Vec<u8> {
    let out = Command::new(BIN)
        .args(["results", design, "--format", "json", "--exit-zero"])
        .env("RAYON_NUM_THREADS", threads)
        .current_dir(env!("CARGO_MANIFEST_DIR"))
        .output()
        .expect("run dutyline");
    assert!(
        out.status.success(),
        "{}",
        String::from_utf8_lossy(&out.stderr)
    );
    out.stdout
}

#[test]
fn one_thread_and_two_give_the_same_results() {
    for demo in [
        "examples-demo/orchard-lift-rev-a.duty",
        "examples-demo/orchard-lift-rev-b.duty",
        "examples-demo/kestrel-booster.duty",
        "examples-demo/hillside-district.duty",
        "examples-demo/wrenfield-chilled-water.duty",
    ] {
        let one = results_json(demo, "1");
        assert!(one.len() > 1000, "{demo}: results printed");
        assert!(
            one == results_json(demo, "2"),
            "{demo}: 1 and 2 threads differ"
        );
        assert!(
            one == results_json(demo, "2"),
            "{demo}: two runs at 2 threads differ"
        );
    }
}
