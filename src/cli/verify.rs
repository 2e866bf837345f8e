//! `verify` and `extract`, and the attached sources of `build`: the disk side of
//! `dutyline::verify`.

use std::io::Write;
use std::path::{Component, Path, PathBuf};
use std::process::ExitCode;

use dutyline::diagnostics::{Code, Diagnostic};
use dutyline::verify::read::{Embedded, MAX_PACKAGE_BYTES};
use dutyline::verify::sources::MANIFEST_NAME;
use dutyline::verify::{DesignFiles, Verdict};

use super::commands::Loaded;
use super::error::{CliError, WriteProblem, EXIT_DESIGN, EXIT_NO_SELECTION};
use super::files;
use super::output::{self, Out};

/// Longest attachment name written by `extract`, in bytes.
const MAX_NAME_BYTES: usize = 1024;

/// The last component of `path`, or `fallback` (standard input).
pub fn file_name(path: &Path, fallback: &str) -> String {
    match path.file_name() {
        Some(name) if path != Path::new("-") => name.to_string_lossy().into_owned(),
        _ => fallback.to_string(),
    }
}

/// A loaded design with the files its check read, as the package attaches them.
pub fn design_files(path: &Path, loaded: &Loaded) -> DesignFiles {
    DesignFiles {
        name: file_name(path, "design.duty"),
        source: loaded.source.clone(),
        imports: loaded.imports.clone(),
    }
}

/// A package's bytes, at most [`MAX_PACKAGE_BYTES`].
fn read_package(path: &Path) -> Result<Vec<u8>, CliError> {
    let bytes =
        files::read_bytes_capped(path, MAX_PACKAGE_BYTES).map_err(|error| CliError::Read {
            path: path.to_path_buf(),
            error,
            help: None,
        })?;
    Ok(bytes)
}

/// A file that is not a readable dutyline package, as an error of exit status 1.
fn not_a_package(path: &Path, message: String) -> CliError {
    CliError::Rejected {
        file: path.display().to_string(),
        source: String::new(),
        diagnostics: vec![Diagnostic::error(
            Code::NotAPackage,
            format!("{}: {message}", path.display()),
            None,
        )
        .with_help("only a PDF package written by `dutyline build` can be verified or extracted")],
        summary: None,
    }
}

/// `dutyline verify PACKAGE.pdf`: 0 identical, 1 differs (or no readable package),
/// 3 built by another version (the results compared instead).
pub fn verify(out: &mut Out, path: &Path) -> Result<ExitCode, CliError> {
    let bytes = read_package(path)?;
    let report =
        dutyline::verify::verify(&bytes).map_err(|e| not_a_package(path, e.to_string()))?;
    output::text(out, &report.render(&path.display().to_string()))?;
    Ok(match report.verdict {
        Verdict::Identical => ExitCode::SUCCESS,
        Verdict::Differs(_) => ExitCode::from(EXIT_DESIGN),
        Verdict::OtherVersion { .. } => ExitCode::from(EXIT_NO_SELECTION),
    })
}

/// `dutyline extract PACKAGE.pdf [-o DIR] [--force]`: every attached file but the
/// build record, under DIR; nothing is written unless every name is safe and (without
/// `force`) no file exists yet.
pub fn extract(out: &mut Out, path: &Path, dir: &Path, force: bool) -> Result<ExitCode, CliError> {
    let bytes = read_package(path)?;
    let file =
        dutyline::verify::read::read(&bytes).map_err(|e| not_a_package(path, e.to_string()))?;
    if !file.embedded.iter().any(|e| e.name == MANIFEST_NAME) {
        return Err(not_a_package(
            path,
            format!("it carries no build record `{MANIFEST_NAME}`"),
        ));
    }
    let wanted: Vec<&Embedded> = file
        .embedded
        .iter()
        .filter(|e| e.name != MANIFEST_NAME)
        .collect();
    let mut targets = Vec::new();
    for e in &wanted {
        let relative = safe_relative(&e.name)
            .map_err(|why| not_a_package(path, format!("{why}; nothing was written")))?;
        targets.push((dir.join(relative), *e));
    }
    refuse_existing(&targets, force)?;
    for e in &wanted {
        let sha = dutyline::verify::compile::sha256_hex(&e.bytes);
        if e.recorded_sha256.as_deref().is_some_and(|s| s != sha) {
            output::error_text(&format!(
                "warning: `{}` does not match the SHA-256 its package records: the package was altered\n",
                e.name
            ));
        }
    }
    match std::fs::symlink_metadata(dir) {
        Ok(m) if m.is_dir() => {}
        Ok(_) => {
            return Err(CliError::Write {
                path: dir.to_path_buf(),
                problem: WriteProblem::NotARegularFile("not a folder"),
            })
        }
        Err(_) => std::fs::create_dir_all(dir).map_err(|e| CliError::Write {
            path: dir.to_path_buf(),
            problem: WriteProblem::Io(e),
        })?,
    }
    for (target, e) in &targets {
        write_one(dir, target, &e.bytes, force)?;
        writeln!(out, "wrote {}", target.display()).map_err(CliError::stdout)?;
    }
    Ok(ExitCode::SUCCESS)
}

/// An attachment name as a path inside the output folder: relative, `/`-separated,
/// without `.`, `..`, empty components, backslashes or control characters.
pub fn safe_relative(name: &str) -> Result<PathBuf, String> {
    let refuse = |why: &str| {
        Err(format!(
            "the attachment name `{}` {why}",
            name.escape_debug()
        ))
    };
    if name.is_empty() || name.len() > MAX_NAME_BYTES {
        return refuse("is empty or too long");
    }
    if name.chars().any(|c| c.is_control() || c == '\\') {
        return refuse("holds a control character or a backslash");
    }
    if name.starts_with('/') || name.contains(':') {
        return refuse("is an absolute path");
    }
    let mut path = PathBuf::new();
    for part in name.split('/') {
        if part.is_empty() || part == "." || part == ".." {
            return refuse("leaves the output folder or has an empty, `.` or `..` part");
        }
        path.push(part);
    }
    if path
        .components()
        .any(|c| !matches!(c, Component::Normal(_)))
    {
        return refuse("is not a plain relative path");
    }
    Ok(path)
}

/// Without `force`, any existing target refuses the whole extraction.
fn refuse_existing(targets: &[(PathBuf, &Embedded)], force: bool) -> Result<(), CliError> {
    if force {
        return Ok(());
    }
    for (target, _) in targets {
        if std::fs::symlink_metadata(target).is_ok() {
            return Err(CliError::Write {
                path: target.clone(),
                problem: WriteProblem::KeptWithoutForce,
            });
        }
    }
    Ok(())
}

/// Writes one file under `dir`, creating its folders; every existing folder on the way
/// must be a real folder (no symbolic link), so nothing lands outside `dir`.
fn write_one(dir: &Path, target: &Path, bytes: &[u8], force: bool) -> Result<(), CliError> {
    let failed = |path: &Path, problem| CliError::Write {
        path: path.to_path_buf(),
        problem,
    };
    let relative = target.strip_prefix(dir).unwrap_or(target);
    let mut folder = dir.to_path_buf();
    let parents: Vec<Component> = relative.components().collect();
    for part in &parents[..parents.len().saturating_sub(1)] {
        folder.push(part);
        match std::fs::symlink_metadata(&folder) {
            Ok(m) if m.is_dir() => {}
            Ok(_) => {
                let in_the_way = std::io::Error::other(
                    "a file or symbolic link is where a folder is needed; nothing is written through it",
                );
                return Err(failed(&folder, WriteProblem::Io(in_the_way)));
            }
            Err(_) => std::fs::create_dir_all(&folder)
                .map_err(|e| failed(&folder, WriteProblem::Io(e)))?,
        }
    }
    if force && std::fs::symlink_metadata(target).is_ok() {
        files::check_target(target, false, true)?;
        return files::write_atomically(target, bytes);
    }
    files::write_new(target, bytes)
}
