//! Designs read from git revisions. Git runs in the design's folder of the working tree,
//! so `REV` and paths are what the user wrote there; a revision's design reads the curve
//! CSVs of the same revision, confined to its own folder as on disk.

use std::io::Read;
use std::path::{Component, Path, PathBuf};
use std::process::{Command, Stdio};

use dutyline::model::FileError;
use dutyline::syntax::MAX_SOURCE_BYTES;

use super::error::CliError;
use super::files;

/// The files of one revision, read from the design's folder of that revision.
pub struct GitFiles {
    revision: String,
    folder: PathBuf,
}

/// The two revisions `--git` names: `REV` (against the working tree, `None`) or `A..B`
/// (an empty side is `HEAD`, as in git).
pub fn revisions(spec: &str) -> (String, Option<String>) {
    let head = |s: &str| {
        if s.is_empty() {
            "HEAD".to_string()
        } else {
            s.to_string()
        }
    };
    match spec.split_once("..") {
        Some((old, new)) => (head(old), Some(head(new))),
        None => (spec.to_string(), None),
    }
}

/// The design `file` (a working-tree path) as it is in `revision`, with the files of that
/// revision; its name in messages is `REV:file`.
pub fn read_design(revision: &str, file: &Path) -> Result<(PathBuf, String, GitFiles), CliError> {
    let folder = match file.parent() {
        Some(p) if !p.as_os_str().is_empty() => p.to_path_buf(),
        _ => PathBuf::from("."),
    };
    let label = PathBuf::from(format!("{revision}:{}", file.display()));
    let name = file
        .file_name()
        .map(|n| n.to_string_lossy().into_owned())
        .ok_or_else(|| CliError::Usage(format!("`{}` names no file", file.display())))?;
    let verify = git(
        &folder,
        &["rev-parse", "--verify", "--quiet"],
        &format!("{revision}^{{commit}}"),
    )?;
    if !verify.status.success() {
        return Err(CliError::Usage(format!(
            "`{revision}` is not a revision of the git repository at `{}`",
            folder.display()
        )));
    }
    let files = GitFiles {
        revision: revision.to_string(),
        folder,
    };
    let bytes = files.blob(&name).map_err(|error| {
        let help = matches!(error, FileError::NotFound).then(|| {
            format!("`{name}` is not in revision `{revision}` of its folder; check the path and `git log -- {}`", file.display())
        });
        CliError::Read {
            path: label.clone(),
            error,
            help,
        }
    })?;
    let source = files::decode_named(&label, bytes)?;
    Ok((label, source, files))
}

impl GitFiles {
    /// The bytes of `relative` (inside the folder) in the revision: only a regular file
    /// (a blob of mode 100644 or 100755), at most one byte more than the size limit.
    fn blob(&self, relative: &str) -> Result<Vec<u8>, FileError> {
        let listed = git(
            &self.folder,
            &["ls-tree", &self.revision, "--"],
            &format!("./{relative}"),
        )
        .map_err(|_| FileError::Unreadable("git could not be run".into()))?;
        let text = String::from_utf8_lossy(&listed.stdout);
        let Some(entry) = text.lines().next() else {
            return Err(FileError::NotFound);
        };
        let fields: Vec<&str> = entry.split_whitespace().collect();
        let (mode, object) = match fields.as_slice() {
            [mode, _, object, ..] => (*mode, *object),
            _ => {
                return Err(FileError::Unreadable(
                    "unexpected git ls-tree output".into(),
                ))
            }
        };
        match mode {
            "100644" | "100755" => {}
            "120000" => {
                return Err(FileError::NotRegularFile {
                    kind: "a symbolic link",
                })
            }
            "040000" => return Err(FileError::NotRegularFile { kind: "a folder" }),
            _ => {
                return Err(FileError::NotRegularFile {
                    kind: "a special file",
                })
            }
        }
        let mut child = Command::new("git")
            .args(["cat-file", "blob", object])
            .current_dir(&self.folder)
            .stdout(Stdio::piped())
            .stderr(Stdio::null())
            .spawn()
            .map_err(|e| FileError::Unreadable(e.to_string()))?;
        let mut bytes = Vec::new();
        if let Some(out) = child.stdout.take() {
            out.take(MAX_SOURCE_BYTES as u64 + 1)
                .read_to_end(&mut bytes)
                .map_err(|e| FileError::Unreadable(e.to_string()))?;
        }
        let _ = child.kill();
        let _ = child.wait();
        Ok(bytes)
    }
}

impl dutyline::FileAccess for GitFiles {
    fn read_text(&self, path: &str) -> Result<String, FileError> {
        let relative = inside_folder(path).ok_or(FileError::OutsideAllowed)?;
        Ok(dutyline::syntax::decode_text(self.blob(&relative)?)?)
    }
}

/// `path` as written in a design, if it stays inside the design's folder (relative, and
/// no `..` leaving it): `a/./b/../c.csv` is `a/c.csv`.
fn inside_folder(path: &str) -> Option<String> {
    let mut parts: Vec<String> = Vec::new();
    for part in Path::new(path).components() {
        match part {
            Component::Normal(p) => parts.push(p.to_string_lossy().into_owned()),
            Component::CurDir => {}
            Component::ParentDir => {
                parts.pop()?;
            }
            Component::RootDir | Component::Prefix(_) => return None,
        }
    }
    (!parts.is_empty()).then(|| parts.join("/"))
}

/// Run git in `folder` with `args` and a last argument; a git that cannot be started
/// is a usage error.
fn git(folder: &Path, args: &[&str], last: &str) -> Result<std::process::Output, CliError> {
    Command::new("git")
        .args(args)
        .arg(last)
        .current_dir(folder)
        .stdin(Stdio::null())
        .output()
        .map_err(|e| {
            CliError::Usage(format!(
                "git could not be run in `{}`: {e}",
                folder.display()
            ))
        })
}
