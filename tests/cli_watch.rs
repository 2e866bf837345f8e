//! `dutyline watch` rebuilds on a change of the design or of a CSV it imports, prints the
//! diagnostics of a broken save and keeps the last good PDF (issue 16).

mod cli_common;

use std::io::{BufRead, BufReader};
use std::process::{Command, Stdio};
use std::sync::mpsc;
use std::time::Duration;

use cli_common::{copy_demos, scratch, BIN};

/// Wait for the next line of the watcher's output that contains `what`.
fn expect_line(lines: &mpsc::Receiver<String>, what: &str) -> String {
    loop {
        let line = lines
            .recv_timeout(Duration::from_secs(60))
            .unwrap_or_else(|_| panic!("no line with `{what}` within 60 s"));
        if line.contains(what) {
            return line;
        }
    }
}

/// Change a file so that its modification time surely moves on (coarse file systems).
fn rewrite(path: &std::path::Path, text: &str) {
    std::thread::sleep(Duration::from_millis(1100));
    std::fs::write(path, text).unwrap();
}

#[test]
fn watch_rebuilds_on_design_and_csv_changes_and_keeps_the_last_good_pdf() {
    let dir = scratch("watch");
    copy_demos(&dir);
    let demo = dir.join("examples-demo");
    let design = demo.join("kestrel-booster.duty");
    let csv = demo.join("kestrel-kr1-430.csv");
    let pdf = demo.join("kestrel-booster.pdf");
    let mut child = Command::new(BIN)
        .args(["watch", "kestrel-booster.duty", "--max-builds", "3"])
        .current_dir(&demo)
        .stdout(Stdio::piped())
        .stderr(Stdio::piped())
        .spawn()
        .unwrap();
    let (send, lines) = mpsc::channel();
    let stdout = child.stdout.take().unwrap();
    std::thread::spawn(move || {
        for line in BufReader::new(stdout).lines().map_while(Result::ok) {
            let _ = send.send(line);
        }
    });
    expect_line(&lines, "wrote kestrel-booster.pdf");
    let watching = expect_line(&lines, "watching");
    // The design and the curve CSV it imports.
    assert!(watching.contains("watching 2 file(s)"), "{watching}");
    let first = std::fs::read(&pdf).unwrap();

    // A change of the imported CSV alone rebuilds, and the package shows it.
    let table = std::fs::read_to_string(&csv).unwrap();
    assert!(table.contains("0, 76.0, 0, -"), "{table}");
    rewrite(&csv, &table.replace("0, 76.0, 0, -", "0, 77.0, 0, -"));
    expect_line(&lines, "wrote kestrel-booster.pdf");
    expect_line(&lines, "watching");
    let second = std::fs::read(&pdf).unwrap();
    assert_ne!(first, second, "the rebuilt package reflects the CSV change");

    // A broken save: diagnostics on standard error, the last good PDF stays whole.
    let text = std::fs::read_to_string(&design).unwrap();
    rewrite(&design, &text.replacen("fluid water", "fluid watr", 1));
    let out = child.wait_with_output().unwrap();
    assert_eq!(out.status.code(), Some(1), "the last build failed");
    let stderr = String::from_utf8_lossy(&out.stderr);
    assert!(stderr.contains("error["), "{stderr}");
    assert_eq!(std::fs::read(&pdf).unwrap(), second);
    let leftovers: Vec<_> = std::fs::read_dir(&demo)
        .unwrap()
        .map(|e| e.unwrap().file_name().to_string_lossy().into_owned())
        .filter(|n| n.contains("dutyline-tmp"))
        .collect();
    assert!(leftovers.is_empty(), "{leftovers:?}");
}

#[test]
fn watch_refuses_standard_input() {
    let out = Command::new(BIN).args(["watch", "-"]).output().unwrap();
    assert_eq!(out.status.code(), Some(2));
}
