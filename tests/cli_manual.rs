//! Shell completions and manual pages come from the clap definitions: the committed
//! pages in docs/man/ are what `dutyline man` prints now, groff reads them without a
//! warning, and the completion scripts name every subcommand (issue 16).

use std::path::Path;
use std::process::{Command, Output};

const BIN: &str = env!("CARGO_BIN_EXE_dutyline");
const SUBCOMMANDS: [&str; 12] = [
    "check",
    "results",
    "fmt",
    "diff",
    "build",
    "verify",
    "extract",
    "watch",
    "new",
    "lsp",
    "completions",
    "man",
];

fn run(args: &[&str]) -> Output {
    Command::new(BIN).args(args).output().unwrap()
}

fn page(name: Option<&str>) -> String {
    let out = match name {
        Some(n) => run(&["man", n]),
        None => run(&["man"]),
    };
    assert!(out.status.success(), "{name:?}");
    String::from_utf8(out.stdout).unwrap()
}

#[test]
fn the_committed_manual_pages_are_the_current_output() {
    let docs = Path::new(env!("CARGO_MANIFEST_DIR")).join("docs/man");
    let mut expected = vec![("dutyline.1".to_string(), page(None))];
    for s in SUBCOMMANDS {
        expected.push((format!("dutyline-{s}.1"), page(Some(s))));
    }
    for (file, text) in &expected {
        let committed = std::fs::read_to_string(docs.join(file))
            .unwrap_or_else(|_| panic!("docs/man/{file} is missing: regenerate (DEVELOPERS.md)"));
        assert_eq!(
            &committed, text,
            "docs/man/{file} is stale: regenerate (DEVELOPERS.md)"
        );
    }
    // No page in docs/man/ for a subcommand that is gone.
    let files = std::fs::read_dir(&docs).unwrap().count();
    assert_eq!(files, expected.len());
    // The tool's page lists every subcommand; a subcommand's page carries its exit statuses.
    for s in SUBCOMMANDS {
        assert!(expected[0].1.contains(&format!("dutyline\\-{s}(1)")), "{s}");
    }
    assert!(page(Some("check")).contains("Exit status: 0"));
    let unknown = run(&["man", "nonsense"]);
    assert_eq!(unknown.status.code(), Some(2));
    assert!(String::from_utf8_lossy(&unknown.stderr).contains("not a subcommand"));
}

#[test]
fn groff_reads_every_page_without_a_warning() {
    // groff is part of the machine's man tooling; without it there is nothing to run.
    let Ok(probe) = Command::new("groff").arg("--version").output() else {
        eprintln!("groff not installed: skipped");
        return;
    };
    assert!(probe.status.success());
    let docs = Path::new(env!("CARGO_MANIFEST_DIR")).join("docs/man");
    for entry in std::fs::read_dir(docs).unwrap() {
        let path = entry.unwrap().path();
        let out = Command::new("groff")
            .args(["-man", "-Tutf8", "-ww", "-z"])
            .arg(&path)
            .output()
            .unwrap();
        assert!(out.status.success(), "{}", path.display());
        assert!(
            out.stderr.is_empty(),
            "{}: {}",
            path.display(),
            String::from_utf8_lossy(&out.stderr)
        );
    }
}

#[test]
fn completion_scripts_name_every_subcommand_and_bash_parses_its_own() {
    for shell in ["bash", "zsh", "fish", "elvish", "powershell"] {
        let out = run(&["completions", shell]);
        assert!(out.status.success(), "{shell}");
        let script = String::from_utf8(out.stdout).unwrap();
        for s in SUBCOMMANDS {
            assert!(script.contains(s), "{shell} lacks {s}");
        }
        assert!(script.contains("deny-warnings"), "{shell}");
    }
    let script = run(&["completions", "bash"]).stdout;
    let dir = std::env::temp_dir().join(format!("dutyline-completions-{}", std::process::id()));
    std::fs::create_dir_all(&dir).unwrap();
    let file = dir.join("dutyline.bash");
    std::fs::write(&file, script).unwrap();
    let parsed = Command::new("bash").arg("-n").arg(&file).output().unwrap();
    assert!(
        parsed.status.success(),
        "{}",
        String::from_utf8_lossy(&parsed.stderr)
    );
    // Sourcing it registers the completion function for `dutyline`.
    let registered = Command::new("bash")
        .arg("-c")
        .arg(format!("source {} && complete -p dutyline", file.display()))
        .output()
        .unwrap();
    assert!(
        String::from_utf8_lossy(&registered.stdout).contains("dutyline"),
        "{}",
        String::from_utf8_lossy(&registered.stderr)
    );
    assert_eq!(run(&["completions", "tcsh"]).status.code(), Some(2));
}
