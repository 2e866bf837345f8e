//! The house rule of DEVELOPERS.md, checked on the source: imports point down the
//! pipeline only. The stages below the outputs (syntax, units, model, the engine, the
//! analysis, typed messages) never name an output module, so report units are chosen
//! only by `display.rs` and the outputs; the engine (fluid, hydraulics, pumps) never
//! names the syntax, the model or the analysis. Comment lines are not code and are
//! skipped (doc links to `crate::display` are allowed).

use std::path::{Path, PathBuf};

const OUTPUTS: &[&str] = &[
    "crate::display",
    "crate::results",
    "crate::report",
    "crate::diff",
    "crate::cli",
    "crate::lsp",
    "crate::verify",
];

const ABOVE_ENGINE: &[&str] = &["crate::syntax", "crate::model", "crate::analysis"];

fn rust_files(path: &Path, out: &mut Vec<PathBuf>) {
    if path.is_file() {
        out.push(path.to_path_buf());
        return;
    }
    let mut entries: Vec<PathBuf> = std::fs::read_dir(path)
        .unwrap_or_else(|e| panic!("{}: {e}", path.display()))
        .map(|e| e.expect("entry").path())
        .collect();
    entries.sort();
    for p in entries {
        if p.is_dir() || p.extension().is_some_and(|x| x == "rs") {
            rust_files(&p, out);
        }
    }
}

/// Every code line of the files under `roots` that names one of `forbidden`.
fn offences(roots: &[&str], forbidden: &[&str]) -> Vec<String> {
    let mut files = Vec::new();
    for r in roots {
        rust_files(&Path::new(env!("CARGO_MANIFEST_DIR")).join(r), &mut files);
    }
    assert!(!files.is_empty(), "no sources under {roots:?}");
    let mut out = Vec::new();
    for f in files {
        let text = std::fs::read_to_string(&f).expect("source");
        for (n, line) in text.lines().enumerate() {
            let code = line.trim_start();
            if code.starts_with("//") {
                continue;
            }
            for word in forbidden.iter().filter(|w| code.contains(*w)) {
                out.push(format!("{}:{}: names {word}", f.display(), n + 1));
            }
        }
    }
    out
}

#[test]
fn no_stage_below_the_outputs_names_an_output() {
    let found = offences(
        &[
            "src/syntax",
            "src/units",
            "src/model",
            "src/fluid",
            "src/hydraulics",
            "src/pumps",
            "src/analysis",
            "src/message.rs",
            "src/numbers.rs",
        ],
        OUTPUTS,
    );
    assert!(found.is_empty(), "{found:#?}");
}

#[test]
fn the_engine_names_no_earlier_stage() {
    let found = offences(&["src/fluid", "src/hydraulics", "src/pumps"], ABOVE_ENGINE);
    assert!(found.is_empty(), "{found:#?}");
}

/// The scan itself can fail: the output module's own file names itself.
#[test]
fn the_scan_finds_a_named_output() {
    let found = offences(&["src/results/text.rs"], &["crate::display"]);
    assert!(!found.is_empty());
}
