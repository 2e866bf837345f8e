//! Regression tests for the command line's files, outputs and exit statuses. Each test
//! names the issue and the failure it fixed, and drives the built binary in a temporary
//! folder of its own.

use dutyline::diagnostics::Code;
use std::io::Read;
use std::path::{Path, PathBuf};
use std::process::{Command, Stdio};
use std::time::{Duration, Instant};

const BIN: &str = env!("CARGO_BIN_EXE_dutyline");
/// Longest a command may take before the test kills it and fails (a hang is a failure).
const TIMEOUT: Duration = Duration::from_secs(30);

/// A fresh folder under the system's temporary folder, named after the test, removed
/// when the test ends.
struct Folder(PathBuf);

impl std::ops::Deref for Folder {
    type Target = Path;
    fn deref(&self) -> &Path {
        &self.0
    }
}

impl Drop for Folder {
    fn drop(&mut self) {
        let _ = std::fs::remove_dir_all(&self.0);
    }
}

fn folder(test: &str) -> Folder {
    let dir = std::env::temp_dir().join(format!(
        "dutyline-regression-io-{}-{test}",
        std::process::id()
    ));
    let _ = std::fs::remove_dir_all(&dir);
    std::fs::create_dir_all(&dir).unwrap();
    Folder(dir)
}

/// The kestrel demo (with its CSV curve) copied into `dir`; the design's path.
fn kestrel_in(dir: &Path) -> PathBuf {
    let demo = Path::new(env!("CARGO_MANIFEST_DIR")).join("examples-demo");
    std::fs::copy(
        demo.join("kestrel-kr1-430.csv"),
        dir.join("kestrel-kr1-430.csv"),
    )
    .unwrap();
    let design = dir.join("kestrel.duty");
    std::fs::copy(demo.join("kestrel-booster.duty"), &design).unwrap();
    design
}

/// The kestrel demo in `dir` with its curve read from `csv` instead of its own CSV.
fn kestrel_reading(dir: &Path, csv: &str) -> PathBuf {
    let design = kestrel_in(dir);
    let text = std::fs::read_to_string(&design).unwrap();
    let changed = text.replace("from \"kestrel-kr1-430.csv\"", &format!("from \"{csv}\""));
    assert_ne!(text, changed, "the demo reads its CSV");
    std::fs::write(&design, changed).unwrap();
    design
}

fn mkfifo(path: &Path) {
    let status = Command::new("mkfifo").arg(path).status().unwrap();
    assert!(status.success(), "mkfifo {}", path.display());
}

struct Run {
    code: Option<i32>,
    stdout: Vec<u8>,
    stderr: String,
}

impl Run {
    fn out(&self) -> String {
        String::from_utf8_lossy(&self.stdout).into_owned()
    }
}

/// Run the binary in `dir`; kill it and fail the test if it takes longer than [`TIMEOUT`].
fn run(dir: &Path, args: &[&str]) -> Run {
    let mut child = Command::new(BIN)
        .args(args)
        .current_dir(dir)
        .stdin(Stdio::null())
        .stdout(Stdio::piped())
        .stderr(Stdio::piped())
        .spawn()
        .unwrap();
    let mut stdout = child.stdout.take().unwrap();
    let mut stderr = child.stderr.take().unwrap();
    let out = std::thread::spawn(move || {
        let mut bytes = Vec::new();
        let _ = stdout.read_to_end(&mut bytes);
        bytes
    });
    let err = std::thread::spawn(move || {
        let mut bytes = Vec::new();
        let _ = stderr.read_to_end(&mut bytes);
        bytes
    });
    let status = wait_or_kill(&mut child, args);
    Run {
        code: status.code(),
        stdout: out.join().unwrap(),
        stderr: String::from_utf8_lossy(&err.join().unwrap()).into_owned(),
    }
}

fn wait_or_kill(child: &mut std::process::Child, args: &[&str]) -> std::process::ExitStatus {
    let start = Instant::now();
    loop {
        if let Some(status) = child.try_wait().unwrap() {
            return status;
        }
        if start.elapsed() > TIMEOUT {
            let _ = child.kill();
            let _ = child.wait();
            panic!(
                "`dutyline {}` hung; killed after {TIMEOUT:?}",
                args.join(" ")
            );
        }
        std::thread::sleep(Duration::from_millis(20));
    }
}

/// The renderer's header for a place: `file:line:col`.
fn located(run: &Run, file: &str, line: usize, column: usize) -> bool {
    run.stderr.contains(&format!("{file}:{line}:{column}"))
}

// ---- Exit status and standard output -------------------------------------------------

#[test]
fn a_closed_standard_output_ends_quietly_with_141() {
    // Issue 19: `results x.duty | head -c 10` panicked with "failed printing to stdout:
    // Broken pipe" (exit 101). The reader here closes the pipe before anything is written.
    let dir = folder("closed-pipe");
    let design = kestrel_in(&dir);
    for args in [
        vec!["results", design.to_str().unwrap()],
        vec!["results", design.to_str().unwrap(), "--format", "json"],
        vec!["build", design.to_str().unwrap(), "-o", "-"],
    ] {
        let mut child = Command::new(BIN)
            .args(&args)
            .stdin(Stdio::null())
            .stdout(Stdio::piped())
            .stderr(Stdio::piped())
            .spawn()
            .unwrap();
        drop(child.stdout.take());
        let mut stderr = child.stderr.take().unwrap();
        let status = wait_or_kill(&mut child, &args);
        let mut text = String::new();
        stderr.read_to_string(&mut text).unwrap();
        // 141 = 128 + SIGPIPE (13), the shell's status for a closed pipe (POSIX signal numbers).
        assert_eq!(status.code(), Some(141), "{args:?}: {text}");
        assert!(!text.contains("panicked"), "{args:?}: {text}");
        assert!(!text.contains("Broken pipe"), "{args:?}: {text}");
    }
}

#[test]
fn results_and_build_exit_3_without_a_recommended_candidate() {
    // Issue 19 (results-json "Exit status"): `results` and `build` exited 0 when no
    // candidate qualified. A reservoir 900 ft above the demo's lies far beyond every
    // candidate's shut-off head (the demo's pumps deliver about 150 ft), so none qualifies.
    let dir = folder("exit-3");
    let demo = Path::new(env!("CARGO_MANIFEST_DIR")).join("examples-demo/orchard-lift-rev-a.duty");
    let text = std::fs::read_to_string(&demo).unwrap();
    let high = text.replace(
        "tank reservoir { level = ridge_overflow - 2.5 ft }",
        "tank reservoir { level = ridge_overflow + 900 ft }",
    );
    assert_ne!(text, high);
    std::fs::write(dir.join("high.duty"), high).unwrap();
    let results = run(&dir, &["results", "high.duty", "--format", "json"]);
    assert_eq!(results.code, Some(3), "{}", results.stderr);
    let json: serde_json::Value = serde_json::from_slice(&results.stdout).unwrap();
    assert!(
        json["selection"]["recommended"].is_null(),
        "the results are still printed"
    );
    let build = run(&dir, &["build", "high.duty", "-o", "high.pdf"]);
    assert_eq!(build.code, Some(3), "{}", build.stderr);
    assert!(std::fs::read(dir.join("high.pdf"))
        .unwrap()
        .starts_with(b"%PDF"));
    // The demos themselves analyse every case and recommend a candidate: exit 0.
    let ok = run(&dir, &["results", demo.to_str().unwrap()]);
    assert_eq!(ok.code, Some(0), "{}", ok.stderr);
}

#[test]
fn a_missing_design_is_one_rendered_diagnostic_with_exit_2() {
    // Issue 19: I/O errors were printed by hand (`error: cannot read ...`), not as the
    // one diagnostic shape with its code and help.
    let dir = folder("missing");
    let r = run(&dir, &["check", "nowhere.duty"]);
    assert_eq!(r.code, Some(2));
    assert!(
        r.stderr
            .contains("error[file-not-read]: cannot read `nowhere.duty`: no such file"),
        "{}",
        r.stderr
    );
    assert!(r.stderr.contains("= help:"), "{}", r.stderr);
    assert_eq!(
        r.stderr.matches("error").count(),
        1,
        "printed once: {}",
        r.stderr
    );
}

#[test]
fn a_style_file_error_shows_its_source_line() {
    // Issue 19: style-file errors were printed by a hand-made formatter without the line
    // they point at.
    let dir = folder("style-line");
    let design = kestrel_in(&dir);
    let letter =
        std::fs::read_to_string(Path::new(env!("CARGO_MANIFEST_DIR")).join("styles/letter.toml"))
            .unwrap();
    let broken = letter.replacen("name = \"letter\"\n", "name = \"letter\"\nbogus = 3\n", 1);
    assert_ne!(letter, broken);
    std::fs::write(dir.join("house.toml"), &broken).unwrap();
    let line = broken.lines().position(|l| l == "bogus = 3").unwrap() + 1;
    let r = run(
        &dir,
        &[
            "build",
            design.to_str().unwrap(),
            "--style",
            "house.toml",
            "-o",
            "k.pdf",
        ],
    );
    assert_eq!(r.code, Some(1), "{}", r.stderr);
    assert!(r.stderr.contains("error[style]"), "{}", r.stderr);
    assert!(located(&r, "house.toml", line, 1), "{}", r.stderr);
    assert!(
        r.stderr.contains(&format!("{line} │ bogus = 3")),
        "{}",
        r.stderr
    );
    assert!(!dir.join("k.pdf").exists());
}

#[test]
fn file_access_errors_are_typed_and_their_help_follows_the_kind() {
    // Issue 19: `FileAccess` returned a `String`, so the diagnostic's help could not tell
    // a missing file from a refused one.
    use dutyline::model::FileError;
    struct Refusing(FileError);
    impl dutyline::FileAccess for Refusing {
        fn read_text(&self, _path: &str) -> Result<String, FileError> {
            Err(self.0.clone())
        }
    }
    let source = std::fs::read_to_string(
        Path::new(env!("CARGO_MANIFEST_DIR")).join("examples-demo/kestrel-booster.duty"),
    )
    .unwrap();
    let kinds = [
        (
            FileError::NotFound,
            Code::FileNotRead,
            "relative to the folder",
        ),
        (FileError::TooLarge { line: 9 }, Code::FileTooLarge, "1 MiB"),
        (
            FileError::NotUtf8 { line: 2, column: 5 },
            Code::InvalidUtf8,
            "UTF-8",
        ),
        (
            FileError::NotRegularFile {
                kind: "a FIFO (named pipe)",
            },
            Code::NotARegularFile,
            "ordinary file",
        ),
        (
            FileError::OutsideAllowed,
            Code::FileNotAllowed,
            "--allow-dir",
        ),
    ];
    for (error, code, help) in kinds {
        let checked = dutyline::check(&source, &Refusing(error.clone()));
        let d = checked
            .diagnostics
            .iter()
            .find(|d| d.code == code)
            .unwrap_or_else(|| panic!("{error:?}: {:?}", checked.diagnostics));
        assert!(d.message.contains(&error.to_string()), "{}", d.message);
        assert!(
            d.help.as_deref().unwrap_or_default().contains(help),
            "{error:?}: {:?}",
            d.help
        );
        assert!(d.span.is_some(), "at the `from` of the curve");
    }
}

// ---- Every rejection located ----------------------------------------------------------

#[test]
fn invalid_utf8_gives_the_line_and_column_of_the_first_bad_byte() {
    // Issue 11: `invalid-utf8` gave a byte offset only.
    let dir = folder("utf8");
    // Latin-1 é (0xE9) after `  title = "caf` (14 characters): line 2, column 15.
    std::fs::write(
        dir.join("bad.duty"),
        b"project {\n  title = \"caf\xe9 lift\"\n}\n",
    )
    .unwrap();
    let r = run(&dir, &["check", "bad.duty"]);
    assert_eq!(r.code, Some(1));
    assert!(r.stderr.contains("error[invalid-utf8]"), "{}", r.stderr);
    assert!(located(&r, "bad.duty", 2, 15), "{}", r.stderr);
    assert!(r.stderr.contains("UTF-8"), "says what to do: {}", r.stderr);
}

#[test]
fn file_too_large_points_at_the_line_where_the_limit_is_crossed() {
    // Issue 11: `file-too-large` had no line:column.
    let dir = folder("too-large");
    // 15-byte lines; the limit of 1 048 576 bytes lies after 69 905 whole lines
    // (69 905 × 15 = 1 048 575 bytes), so byte 1 048 577 is column 2 of line 69 906.
    let line = "# comment line\n";
    assert_eq!(line.len(), 15);
    std::fs::write(dir.join("big.duty"), line.repeat(80_000)).unwrap();
    let r = run(&dir, &["check", "big.duty"]);
    assert_eq!(r.code, Some(1));
    assert!(r.stderr.contains("error[file-too-large]"), "{}", r.stderr);
    assert!(located(&r, "big.duty", 69_906, 2), "{}", r.stderr);
    assert!(r.stderr.contains("CSV"), "says what to do: {}", r.stderr);
    assert!(
        r.stderr.len() < 2_000,
        "no long excerpt: {} bytes",
        r.stderr.len()
    );
    // One line of 1 MiB and more: the place is in the message, the line is not printed.
    let mut long = b"# ".to_vec();
    long.extend(std::iter::repeat_n(b'x', 1 << 20));
    std::fs::write(dir.join("long.duty"), long).unwrap();
    let r = run(&dir, &["check", "long.duty"]);
    assert_eq!(r.code, Some(1));
    // The limit byte 1 048 577 is on line 1, column 1 048 577 (all ASCII).
    assert!(located(&r, "long.duty", 1, 1_048_577), "{}", r.stderr);
    assert!(
        r.stderr.len() < 2_000,
        "no long excerpt: {} bytes",
        r.stderr.len()
    );
}

// ---- File access ------------------------------------------------------------------

/// Longer than the 24 characters a diagnostic may quote of a CSV.
const SECRET: &str = "SECRET-LINE-which-must-never-be-printed";

/// A folder beside the test's with a file that must never be read or echoed.
fn outside_secret(dir: &Path) -> PathBuf {
    let outside = dir.join("outside");
    std::fs::create_dir_all(&outside).unwrap();
    let file = outside.join("secret.csv");
    std::fs::write(&file, format!("{SECRET}\n1, 2\n3, 4\n5, 6\n")).unwrap();
    file
}

#[test]
fn an_absolute_curve_path_is_refused_without_echoing_the_file() {
    // Issue 11: `from "/etc/passwd"` read the file and printed its first line.
    let dir = folder("absolute");
    let secret = outside_secret(&dir);
    let project = dir.join("project");
    std::fs::create_dir_all(&project).unwrap();
    let design = kestrel_reading(&project, secret.to_str().unwrap());
    let r = run(&dir, &["check", design.to_str().unwrap()]);
    assert_eq!(r.code, Some(1));
    assert!(r.stderr.contains("error[file-not-allowed]"), "{}", r.stderr);
    assert!(r.stderr.contains("--allow-dir"), "{}", r.stderr);
    assert!(!r.stderr.contains(SECRET), "{}", r.stderr);
}

#[test]
fn a_curve_path_leaving_the_folder_is_refused() {
    // Issue 11: `from "../../x"` read files above the design's folder.
    let dir = folder("parent");
    outside_secret(&dir);
    let project = dir.join("project");
    std::fs::create_dir_all(&project).unwrap();
    let design = kestrel_reading(&project, "../outside/secret.csv");
    let r = run(&dir, &["check", design.to_str().unwrap()]);
    assert_eq!(r.code, Some(1));
    assert!(r.stderr.contains("error[file-not-allowed]"), "{}", r.stderr);
    assert!(!r.stderr.contains(SECRET), "{}", r.stderr);
    // A missing file outside is refused the same way, so nothing is learnt about it.
    let design = kestrel_reading(&project, "../outside/none.csv");
    let r = run(&dir, &["check", design.to_str().unwrap()]);
    assert!(r.stderr.contains("error[file-not-allowed]"), "{}", r.stderr);
}

#[test]
fn a_symlink_leaving_the_folder_is_resolved_before_the_check() {
    // Issue 11: a link inside the folder pointing outside it was followed.
    let dir = folder("symlink");
    let secret = outside_secret(&dir);
    let project = dir.join("project");
    std::fs::create_dir_all(&project).unwrap();
    std::os::unix::fs::symlink(&secret, project.join("curve.csv")).unwrap();
    let design = kestrel_reading(&project, "curve.csv");
    let r = run(&dir, &["check", design.to_str().unwrap()]);
    assert_eq!(r.code, Some(1));
    assert!(r.stderr.contains("error[file-not-allowed]"), "{}", r.stderr);
    assert!(!r.stderr.contains(SECRET), "{}", r.stderr);
}

#[test]
fn allow_dir_lets_a_design_read_another_folder() {
    // Issue 11: the rule needs an explicit way out for shared curve libraries.
    let dir = folder("allow-dir");
    let library = dir.join("library");
    std::fs::create_dir_all(&library).unwrap();
    std::fs::copy(
        Path::new(env!("CARGO_MANIFEST_DIR")).join("examples-demo/kestrel-kr1-430.csv"),
        library.join("kr1.csv"),
    )
    .unwrap();
    let project = dir.join("project");
    std::fs::create_dir_all(&project).unwrap();
    let absolute = library.join("kr1.csv");
    let design = kestrel_reading(&project, absolute.to_str().unwrap());
    let refused = run(&dir, &["check", design.to_str().unwrap()]);
    assert_eq!(refused.code, Some(1), "{}", refused.stderr);
    for command in ["check", "results"] {
        let r = run(
            &dir,
            &[
                command,
                design.to_str().unwrap(),
                "--allow-dir",
                library.to_str().unwrap(),
            ],
        );
        assert_eq!(r.code, Some(0), "{command}: {}", r.stderr);
    }
    let r = run(
        &dir,
        &[
            "build",
            design.to_str().unwrap(),
            "--allow-dir",
            "library",
            "-o",
            "k.pdf",
        ],
    );
    assert_eq!(r.code, Some(0), "{}", r.stderr);
    let design_b = project.join("b.duty");
    std::fs::copy(&design, &design_b).unwrap();
    let r = run(
        &dir,
        &[
            "diff",
            design.to_str().unwrap(),
            design_b.to_str().unwrap(),
            "--allow-dir",
            "library",
        ],
    );
    assert_eq!(r.code, Some(0), "{}", r.stderr);
}

#[test]
fn a_style_file_named_in_the_design_obeys_the_folder_rule() {
    // Issue 11: style paths, like curve paths, accepted absolute paths and `../..`.
    let dir = folder("design-style");
    let outside = dir.join("outside");
    std::fs::create_dir_all(&outside).unwrap();
    std::fs::copy(
        Path::new(env!("CARGO_MANIFEST_DIR")).join("styles/a4.toml"),
        outside.join("house.toml"),
    )
    .unwrap();
    let project = dir.join("project");
    std::fs::create_dir_all(&project).unwrap();
    let design = kestrel_in(&project);
    let text = std::fs::read_to_string(&design).unwrap();
    let changed = text.replace("style = a4", "style = \"../outside/house.toml\"");
    assert_ne!(text, changed);
    std::fs::write(&design, changed).unwrap();
    let d = design.to_str().unwrap();
    let r = run(&dir, &["build", d, "-o", "k.pdf"]);
    assert_eq!(r.code, Some(2), "{}", r.stderr);
    assert!(r.stderr.contains("error[file-not-allowed]"), "{}", r.stderr);
    assert!(!dir.join("k.pdf").exists());
    let r = run(&dir, &["build", d, "-o", "k.pdf", "--allow-dir", "outside"]);
    assert_eq!(r.code, Some(0), "{}", r.stderr);
}

#[test]
fn a_curve_row_is_quoted_cut_short_and_a_bad_header_not_at_all() {
    // Issue 11: diagnostics echoed whatever the file held (its first line, any cell).
    let dir = folder("quoting");
    let long_cell = format!("x{SECRET}{SECRET}");
    std::fs::write(
        dir.join("rows.csv"),
        format!("flow m^3/h, head m\n0, 76\n{long_cell}, 70\n300, 60\n"),
    )
    .unwrap();
    let design = kestrel_reading(&dir, "rows.csv");
    let r = run(&dir, &["check", design.to_str().unwrap()]);
    assert_eq!(r.code, Some(1));
    assert!(r.stderr.contains("error[bad-csv]"), "{}", r.stderr);
    // The row is a curve row: its cell is quoted, at most 24 characters and an ellipsis.
    let shown: String = long_cell.chars().take(24).collect();
    assert!(r.stderr.contains(&format!("`{shown}…`")), "{}", r.stderr);
    assert!(!r.stderr.contains(SECRET), "{}", r.stderr);
    // A first line that is not a header is not quoted, nor a long name or unit in one.
    for header in [
        SECRET.to_string(),
        format!("flow {SECRET}"),
        format!("{SECRET} m"),
    ] {
        std::fs::write(dir.join("rows.csv"), format!("{header}\n0, 76\n")).unwrap();
        let r = run(&dir, &["check", design.to_str().unwrap()]);
        assert!(
            r.stderr.contains("error[bad-csv]"),
            "{header}: {}",
            r.stderr
        );
        assert!(!r.stderr.contains(SECRET), "{header}: {}", r.stderr);
    }
}

#[test]
fn fifos_are_refused_at_once_wherever_a_file_is_read() {
    // Issue 11: reading a FIFO (design, curve CSV, --style, --compare, diff) hung forever.
    let dir = folder("fifo");
    let design = kestrel_in(&dir);
    let d = design.to_str().unwrap();
    mkfifo(&dir.join("pipe.duty"));
    mkfifo(&dir.join("pipe.toml"));
    let curve = dir.join("curve");
    std::fs::create_dir_all(&curve).unwrap();
    mkfifo(&curve.join("pipe.csv"));
    let fifo_curve = kestrel_reading(&curve, "pipe.csv");
    let cases: Vec<(Vec<&str>, i32)> = vec![
        (vec!["check", "pipe.duty"], 2),
        (vec!["results", "pipe.duty"], 2),
        (vec!["fmt", "pipe.duty"], 2),
        (vec!["check", fifo_curve.to_str().unwrap()], 1),
        (vec!["build", d, "--style", "pipe.toml", "-o", "k.pdf"], 2),
        (vec!["build", d, "--compare", "pipe.duty", "-o", "k.pdf"], 2),
        (vec!["diff", "pipe.duty", d], 2),
        (vec!["diff", d, "pipe.duty"], 2),
    ];
    for (args, code) in cases {
        let r = run(&dir, &args);
        assert_eq!(r.code, Some(code), "{args:?}: {}", r.stderr);
        assert!(
            r.stderr.contains("error[not-a-regular-file]"),
            "{args:?}: {}",
            r.stderr
        );
        assert!(r.stderr.contains("FIFO"), "{args:?}: {}", r.stderr);
    }
    assert!(!dir.join("k.pdf").exists());
}

#[test]
fn a_folder_as_the_design_is_refused() {
    // Issue 11: only regular files are opened; a folder gave a raw system message.
    let dir = folder("folder-design");
    std::fs::create_dir_all(dir.join("plans.duty")).unwrap();
    let r = run(&dir, &["check", "plans.duty"]);
    assert_eq!(r.code, Some(2));
    assert!(
        r.stderr.contains("it is a folder, not a regular file"),
        "{}",
        r.stderr
    );
}

// ---- Output paths -------------------------------------------------------------------

#[test]
fn special_outputs_are_refused_and_left_as_they_are() {
    // Issue 11: a FIFO, a symlink or a folder at `-o` was replaced by a regular file (and
    // `-o /dev/null` as root replaced the device).
    let dir = folder("special-outputs");
    let design = kestrel_in(&dir);
    let d = design.to_str().unwrap();
    mkfifo(&dir.join("fifo.pdf"));
    std::fs::write(dir.join("real.pdf"), b"%PDF-1.3 earlier").unwrap();
    std::os::unix::fs::symlink("real.pdf", dir.join("link.pdf")).unwrap();
    std::fs::create_dir_all(dir.join("folder.pdf")).unwrap();
    for (name, kind) in [
        ("fifo.pdf", "FIFO"),
        ("link.pdf", "symbolic link"),
        ("folder.pdf", "folder"),
    ] {
        for force in [None, Some("--force")] {
            let mut args = vec!["build", d, "-o", name];
            args.extend(force);
            let r = run(&dir, &args);
            assert_eq!(r.code, Some(2), "{args:?}: {}", r.stderr);
            assert!(
                r.stderr.contains("error[output-refused]"),
                "{args:?}: {}",
                r.stderr
            );
            assert!(r.stderr.contains(kind), "{args:?}: {}", r.stderr);
        }
    }
    use std::os::unix::fs::FileTypeExt;
    assert!(std::fs::symlink_metadata(dir.join("fifo.pdf"))
        .unwrap()
        .file_type()
        .is_fifo());
    assert!(std::fs::symlink_metadata(dir.join("link.pdf"))
        .unwrap()
        .file_type()
        .is_symlink());
    assert!(dir.join("folder.pdf").is_dir());
    assert_eq!(
        std::fs::read(dir.join("real.pdf")).unwrap(),
        b"%PDF-1.3 earlier"
    );
}

#[test]
fn dash_output_writes_the_pdf_to_standard_output() {
    // Issue 11: `-o -` wrote a file named `-`.
    let dir = folder("dash-output");
    let design = kestrel_in(&dir);
    let r = run(&dir, &["build", design.to_str().unwrap(), "-o", "-"]);
    assert_eq!(r.code, Some(0), "{}", r.stderr);
    assert!(
        r.stdout.starts_with(b"%PDF"),
        "{}",
        r.out().chars().take(40).collect::<String>()
    );
    assert!(r.stdout.ends_with(b"%%EOF\n") || r.stdout.ends_with(b"%%EOF"));
    assert!(!dir.join("-").exists());
}

#[test]
fn the_next_build_removes_a_stale_temporary() {
    // Issue 11: a build killed half-way left `.NAME.pdf.tmpPID` files no build removed.
    let dir = folder("stale-temporary");
    let design = kestrel_in(&dir);
    let stale = dir.join(".k.pdf.dutyline-tmp");
    std::fs::write(&stale, b"half a package").unwrap();
    let r = run(&dir, &["build", design.to_str().unwrap(), "-o", "k.pdf"]);
    assert_eq!(r.code, Some(0), "{}", r.stderr);
    assert!(std::fs::read(dir.join("k.pdf"))
        .unwrap()
        .starts_with(b"%PDF"));
    let leftovers: Vec<String> = std::fs::read_dir(&*dir)
        .unwrap()
        .map(|e| e.unwrap().file_name().to_string_lossy().into_owned())
        .filter(|n| n.contains("tmp"))
        .collect();
    assert!(leftovers.is_empty(), "{leftovers:?}");
}

#[test]
fn a_design_or_a_non_pdf_is_not_overwritten_without_force() {
    // Issue 11: `-o other.duty` silently overwrote another design.
    let dir = folder("overwrite");
    let design = kestrel_in(&dir);
    let d = design.to_str().unwrap();
    std::fs::write(dir.join("other.duty"), "project { title = \"other\" }\n").unwrap();
    std::fs::write(dir.join("notes.pdf"), "minutes of the site meeting\n").unwrap();
    for name in ["other.duty", "notes.pdf"] {
        let before = std::fs::read(dir.join(name)).unwrap();
        let r = run(&dir, &["build", d, "-o", name]);
        assert_eq!(r.code, Some(2), "{name}: {}", r.stderr);
        assert!(r.stderr.contains("--force"), "{name}: {}", r.stderr);
        assert_eq!(
            std::fs::read(dir.join(name)).unwrap(),
            before,
            "{name} changed"
        );
        let r = run(&dir, &["build", d, "-o", name, "--force"]);
        assert_eq!(r.code, Some(0), "{name}: {}", r.stderr);
        assert!(std::fs::read(dir.join(name)).unwrap().starts_with(b"%PDF"));
    }
    // An earlier package is replaced without --force; the design itself never.
    let r = run(&dir, &["build", d, "-o", "notes.pdf"]);
    assert_eq!(r.code, Some(0), "{}", r.stderr);
    let r = run(&dir, &["build", d, "-o", d, "--force"]);
    assert_eq!(r.code, Some(2), "{}", r.stderr);
    assert!(
        r.stderr.contains("is the design file itself"),
        "{}",
        r.stderr
    );
}
