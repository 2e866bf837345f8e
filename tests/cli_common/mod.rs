//! Helpers of the CLI tests: scratch folders, the demos copied into them, git.
#![allow(dead_code)] // each test binary uses a different subset of these helpers

use std::path::{Path, PathBuf};
use std::process::{Command, Output};

pub const BIN: &str = env!("CARGO_BIN_EXE_dutyline");
pub const ROOT: &str = env!("CARGO_MANIFEST_DIR");

/// A fresh, empty folder for one test.
pub fn scratch(name: &str) -> PathBuf {
    let dir = std::env::temp_dir().join(format!("dutyline-{name}-{}", std::process::id()));
    let _ = std::fs::remove_dir_all(&dir);
    std::fs::create_dir_all(&dir).unwrap();
    dir
}

/// Copy the demo folder into `dir/examples-demo`.
pub fn copy_demos(dir: &Path) {
    let target = dir.join("examples-demo");
    std::fs::create_dir_all(&target).unwrap();
    for entry in std::fs::read_dir(Path::new(ROOT).join("examples-demo")).unwrap() {
        let path = entry.unwrap().path();
        if matches!(
            path.extension().and_then(|e| e.to_str()),
            Some("duty" | "csv")
        ) {
            std::fs::copy(&path, target.join(path.file_name().unwrap())).unwrap();
        }
    }
}

/// The `dutyline` binary run in `dir`.
pub fn dutyline(dir: &Path, args: &[&str]) -> Output {
    Command::new(BIN)
        .args(args)
        .current_dir(dir)
        .output()
        .unwrap()
}

/// A shell command run in `dir` with the tested `dutyline` first on the PATH.
pub fn shell(dir: &Path, command: &str) -> Output {
    let bin_dir = Path::new(BIN).parent().unwrap();
    let path = format!(
        "{}:{}",
        bin_dir.display(),
        std::env::var("PATH").unwrap_or_default()
    );
    Command::new("sh")
        .args(["-c", command])
        .current_dir(dir)
        .env("PATH", path)
        .output()
        .unwrap()
}

/// Run git in `dir` (an identity is set so commits work on any machine); panics on failure.
pub fn git(dir: &Path, args: &[&str]) -> String {
    let out = Command::new("git")
        .args([
            "-c",
            "user.name=Test",
            "-c",
            "user.email=test@example.invalid",
        ])
        .args([
            "-c",
            "commit.gpgsign=false",
            "-c",
            "init.defaultBranch=main",
        ])
        .args(args)
        .current_dir(dir)
        .output()
        .unwrap();
    assert!(
        out.status.success(),
        "git {args:?}: {}",
        String::from_utf8_lossy(&out.stderr)
    );
    String::from_utf8(out.stdout).unwrap()
}

/// Standard output and error of a run, for failure messages.
pub fn both(out: &Output) -> String {
    format!(
        "status {:?}\n--- stdout ---\n{}\n--- stderr ---\n{}",
        out.status.code(),
        String::from_utf8_lossy(&out.stdout),
        String::from_utf8_lossy(&out.stderr)
    )
}
