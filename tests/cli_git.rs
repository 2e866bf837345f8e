//! Git-aware revisions: `diff --git` reads a design and the CSVs it imports from the same
//! revision, confined to the design's folder, and the README's textconv recipe works for
//! a design that imports a curve CSV (the SI demo).

mod cli_common;

use std::path::{Path, PathBuf};

use cli_common::{both, copy_demos, dutyline, git, scratch, BIN};

const DESIGN: &str = "examples-demo/kestrel-booster.duty";
const CSV: &str = "examples-demo/kestrel-kr1-430.csv";

/// A repository holding the demos in one commit.
fn repository(name: &str) -> PathBuf {
    let dir = scratch(name);
    copy_demos(&dir);
    git(&dir, &["init", "-q"]);
    commit(&dir, "demos");
    dir
}

fn commit(dir: &Path, message: &str) {
    git(dir, &["add", "-A"]);
    git(dir, &["commit", "-q", "-m", message]);
}

fn edit(dir: &Path, file: &str, from: &str, to: &str) {
    let path = dir.join(file);
    let text = std::fs::read_to_string(&path).unwrap();
    assert!(text.contains(from), "{file} lacks {from}");
    std::fs::write(&path, text.replacen(from, to, 1)).unwrap();
}

fn stdout(out: &std::process::Output) -> String {
    String::from_utf8_lossy(&out.stdout).into_owned()
}

#[test]
fn diff_git_reads_the_csv_of_the_revision() {
    let dir = repository("git-csv");
    // Only the imported CSV changes: one head point of the KR1 curve (invented demo data).
    edit(&dir, CSV, "300, 65.6,", "300, 66.6,");
    let out = dutyline(&dir, &["diff", "--git", "HEAD", DESIGN]);
    assert!(out.status.success(), "{}", both(&out));
    let text = stdout(&out);
    assert!(text.contains("point 5 › head: 65.6 m → 66.6 m"), "{text}");
    // Both sides from git: committed, the same change between the two commits.
    commit(&dir, "raise a head point");
    for range in ["HEAD~1..HEAD", "HEAD~1.."] {
        let out = dutyline(&dir, &["diff", "--git", range, DESIGN]);
        assert!(out.status.success(), "{}", both(&out));
        assert!(
            stdout(&out).contains("65.6 m → 66.6 m"),
            "{range}: {}",
            both(&out)
        );
    }
    // No change between a revision and itself.
    let out = dutyline(
        &dir,
        &["diff", "--git", "HEAD..HEAD", DESIGN, "--exit-code"],
    );
    assert_eq!(out.status.code(), Some(0), "{}", both(&out));
}

#[test]
fn diff_git_confines_a_revision_to_the_design_folder_and_names_bad_input() {
    let dir = repository("git-confined");
    std::fs::copy(dir.join(CSV), dir.join("outside.csv")).unwrap();
    edit(
        &dir,
        DESIGN,
        "from \"kestrel-kr1-430.csv\"",
        "from \"../outside.csv\"",
    );
    commit(&dir, "import from outside the folder");
    let out = dutyline(&dir, &["diff", "--git", "HEAD~1..HEAD", DESIGN]);
    assert_eq!(out.status.code(), Some(1), "{}", both(&out));
    let errors = String::from_utf8_lossy(&out.stderr);
    assert!(errors.contains("file-not-allowed"), "{errors}");
    assert!(
        errors.contains("HEAD:examples-demo/kestrel-booster.duty"),
        "{errors}"
    );

    let out = dutyline(&dir, &["diff", "--git", "no-such-rev", DESIGN]);
    assert_eq!(out.status.code(), Some(2), "{}", both(&out));
    assert!(String::from_utf8_lossy(&out.stderr).contains("is not a revision"));
    let out = dutyline(&dir, &["diff", "--git", "HEAD", "examples-demo/new.duty"]);
    assert_eq!(out.status.code(), Some(2), "{}", both(&out));
    assert!(String::from_utf8_lossy(&out.stderr).contains("is not in revision `HEAD`"));
}

/// `git diff` with the README's textconv recipe, with `options` added to it.
fn textconv_diff(dir: &Path, options: &str) -> std::process::Output {
    std::fs::write(dir.join(".gitattributes"), "*.duty diff=dutyline\n").unwrap();
    let recipe = format!("{BIN} results --format text{options}");
    git(dir, &["config", "diff.dutyline.textconv", &recipe]);
    std::process::Command::new("git")
        .args(["diff", "HEAD~1", "HEAD", "--", DESIGN])
        .current_dir(dir)
        .output()
        .unwrap()
}

#[test]
fn git_diff_with_textconv_shows_the_si_demo_results_moving() {
    let dir = repository("git-textconv");
    // The hilltop reservoir 1.5 m higher: the static head rises 52.40 m → 53.90 m.
    edit(&dir, DESIGN, "level = 268.9 m", "level = 270.4 m");
    commit(&dir, "higher reservoir");
    // The recipe of the README (git runs textconv at the top of the working tree).
    let out = textconv_diff(&dir, " --exit-zero --base-dir examples-demo");
    assert!(out.status.success(), "{}", both(&out));
    let text = stdout(&out);
    assert!(text.contains("-  static head: 52.40 m"), "{text}");
    assert!(text.contains("+  static head: 53.90 m"), "{text}");
    // Without --base-dir the temporary copy git hands over cannot find its CSV.
    let out = textconv_diff(&dir, "");
    assert!(!out.status.success() || !stdout(&out).contains("static head"));
}

#[test]
fn results_exit_zero_keeps_textconv_alive_without_a_recommendation() {
    let dir = scratch("exit-zero");
    copy_demos(&dir);
    // No candidate can deliver 9000 gpm, so none is recommended (exit 3).
    edit(
        &dir,
        "examples-demo/orchard-lift-rev-a.duty",
        "flow >= 700 gpm",
        "flow >= 9000 gpm",
    );
    let design = "examples-demo/orchard-lift-rev-a.duty";
    let out = dutyline(&dir, &["results", design]);
    assert_eq!(out.status.code(), Some(3), "{}", both(&out));
    let out = dutyline(&dir, &["results", design, "--exit-zero"]);
    assert_eq!(out.status.code(), Some(0), "{}", both(&out));
    assert!(stdout(&out).contains("recommended: none"), "{}", both(&out));
}
