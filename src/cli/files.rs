//! The disk: reading only regular files (never opening a FIFO, device or socket), the
//! folders a design may read from, and writing outputs whole or not at all.

use std::fs::{self, File, Metadata, OpenOptions};
use std::io::{ErrorKind, Read, Write};
use std::path::{Component, Path, PathBuf};

use dutyline::model::FileError;
use dutyline::syntax::MAX_SOURCE_BYTES;

use super::error::{CliError, WriteProblem};

/// `O_NONBLOCK`: opening a FIFO swapped in after the check returns at once instead of
/// waiting for a writer (values from the Linux and BSD/macOS `fcntl.h`).
#[cfg(target_os = "linux")]
const OPEN_NONBLOCKING: i32 = 0o4000;
#[cfg(all(unix, not(target_os = "linux")))]
const OPEN_NONBLOCKING: i32 = 0x0004;

/// What a file type is called in a message, `None` for a regular file.
fn special_kind(metadata: &Metadata) -> Option<&'static str> {
    let kind = metadata.file_type();
    if kind.is_file() {
        return None;
    }
    if kind.is_dir() {
        return Some("a folder");
    }
    if kind.is_symlink() {
        return Some("a symbolic link");
    }
    #[cfg(unix)]
    {
        use std::os::unix::fs::FileTypeExt;
        if kind.is_fifo() {
            return Some("a FIFO (named pipe)");
        }
        if kind.is_socket() {
            return Some("a socket");
        }
        if kind.is_char_device() || kind.is_block_device() {
            return Some("a device");
        }
    }
    Some("a special file")
}

fn io_error(error: std::io::Error) -> FileError {
    match error.kind() {
        ErrorKind::NotFound => FileError::NotFound,
        _ => FileError::Unreadable(error.to_string()),
    }
}

/// The bytes of a regular file (or of standard input for `-`), at most one byte more
/// than `MAX_SOURCE_BYTES`, so an enormous file is refused without being loaded whole.
/// The file type is checked before opening and again on the open file.
pub fn read_bytes(path: &Path) -> Result<Vec<u8>, FileError> {
    read_bytes_capped(path, MAX_SOURCE_BYTES)
}

/// [`read_bytes`] with another limit: at most `limit + 1` bytes are read.
pub fn read_bytes_capped(path: &Path, limit: usize) -> Result<Vec<u8>, FileError> {
    let cap = limit as u64 + 1;
    let mut bytes = Vec::new();
    if path == Path::new("-") {
        std::io::stdin()
            .take(cap)
            .read_to_end(&mut bytes)
            .map_err(io_error)?;
        return Ok(bytes);
    }
    let regular = |metadata: Metadata| match special_kind(&metadata) {
        Some(kind) => Err(FileError::NotRegularFile { kind }),
        None => Ok(()),
    };
    regular(fs::metadata(path).map_err(io_error)?)?;
    let mut options = OpenOptions::new();
    options.read(true);
    #[cfg(unix)]
    std::os::unix::fs::OpenOptionsExt::custom_flags(&mut options, OPEN_NONBLOCKING);
    let file = options.open(path).map_err(io_error)?;
    regular(file.metadata().map_err(io_error)?)?;
    file.take(cap).read_to_end(&mut bytes).map_err(io_error)?;
    Ok(bytes)
}

/// A file's text: regular, at most `MAX_SOURCE_BYTES`, UTF-8.
pub fn read_text(path: &Path) -> Result<String, FileError> {
    Ok(dutyline::syntax::decode_text(read_bytes(path)?)?)
}

/// A file named on the command line (design, style, revision) as text; size and
/// encoding problems become a located diagnostic against the file's own text.
pub fn read_named(path: &Path) -> Result<String, CliError> {
    let bytes = read_bytes(path).map_err(|error| CliError::Read {
        path: path.to_path_buf(),
        error,
        help: None,
    })?;
    decode_named(path, bytes)
}

/// The bytes of a file named on the command line (`path` is how it is named in
/// messages) as text, or a located diagnostic.
pub fn decode_named(path: &Path, bytes: Vec<u8>) -> Result<String, CliError> {
    dutyline::syntax::decode_text(bytes).map_err(|error| {
        let mut diagnostic = error.diagnostic();
        if diagnostic.span.is_none() {
            // The line is too long to show: the place goes in the message.
            diagnostic.message = format!(
                "{}:{}:{}: {}",
                path.display(),
                error.line,
                error.column,
                diagnostic.message
            );
        }
        CliError::Rejected {
            file: path.display().to_string(),
            source: error.render_text(),
            diagnostics: vec![diagnostic],
            summary: None,
        }
    })
}

/// The files a design may read: regular files in the design file's folder or below,
/// and in the folders given with `--allow-dir`, after resolving symbolic links.
pub struct DiskFiles {
    base: PathBuf,
    allowed: Vec<PathBuf>,
}

impl DiskFiles {
    /// Access for the design at `design` (`-`: the current folder) and the allowed folders.
    pub fn for_design(design: &Path, allowed: &[PathBuf]) -> Result<DiskFiles, CliError> {
        let folder = match design.parent() {
            Some(p) if design != Path::new("-") && !p.as_os_str().is_empty() => p,
            _ => Path::new("."),
        };
        DiskFiles::in_folder(folder, allowed)
    }

    /// Access as for a design in `folder` (`results --base-dir`).
    pub fn in_folder(folder: &Path, allowed: &[PathBuf]) -> Result<DiskFiles, CliError> {
        let base = fs::canonicalize(folder).map_err(|error| CliError::Read {
            path: folder.to_path_buf(),
            error: io_error(error),
            help: None,
        })?;
        let allowed_folder = |dir: &PathBuf| match fs::canonicalize(dir) {
            Ok(real) if real.is_dir() => Ok(real),
            Ok(_) => Err(CliError::Usage(format!(
                "`--allow-dir {}`: not a folder",
                dir.display()
            ))),
            Err(e) => Err(CliError::Usage(format!(
                "`--allow-dir {}`: {e}",
                dir.display()
            ))),
        };
        Ok(DiskFiles {
            base,
            allowed: allowed
                .iter()
                .map(allowed_folder)
                .collect::<Result<_, _>>()?,
        })
    }

    /// Where `path` as written in the design would be, before any check (for `watch`,
    /// which also watches a file that does not exist yet).
    pub fn path_of(&self, path: &str) -> PathBuf {
        self.base.join(path)
    }

    /// The real path of `path` as written in the design, if the design may read it.
    pub fn resolve(&self, path: &str) -> Result<PathBuf, FileError> {
        let given = Path::new(path);
        let joined = self.base.join(given);
        let permits = |real: &Path| {
            (!given.is_absolute() && real.starts_with(&self.base))
                || self.allowed.iter().any(|dir| real.starts_with(dir))
        };
        match fs::canonicalize(&joined) {
            Ok(real) if permits(&real) => Ok(real),
            Ok(_) => Err(FileError::OutsideAllowed),
            Err(error) if error.kind() == ErrorKind::NotFound => {
                if permits(&lexically_normal(&joined)) {
                    Err(FileError::NotFound)
                } else {
                    Err(FileError::OutsideAllowed)
                }
            }
            Err(error) => Err(FileError::Unreadable(error.to_string())),
        }
    }
}

impl dutyline::FileAccess for DiskFiles {
    fn read_text(&self, path: &str) -> Result<String, FileError> {
        read_text(&self.resolve(path)?)
    }
}

/// `a/./b/../c` as `a/c`, without touching the disk (for paths that do not exist).
fn lexically_normal(path: &Path) -> PathBuf {
    let mut out = PathBuf::new();
    for part in path.components() {
        match part {
            Component::CurDir => {}
            Component::ParentDir => {
                out.pop();
            }
            other => out.push(other),
        }
    }
    out
}

/// Whether an existing output may be replaced: absent, or a regular file; a design
/// file or a file that is not a PDF only with `force` (`pdf` false: any regular file).
pub fn check_target(path: &Path, pdf: bool, force: bool) -> Result<(), CliError> {
    let refuse = |problem| {
        Err(CliError::Write {
            path: path.to_path_buf(),
            problem,
        })
    };
    let metadata = match fs::symlink_metadata(path) {
        Ok(m) => m,
        Err(e) if e.kind() == ErrorKind::NotFound => return Ok(()),
        Err(e) => return refuse(WriteProblem::Io(e)),
    };
    if let Some(kind) = special_kind(&metadata) {
        return refuse(WriteProblem::NotARegularFile(kind));
    }
    if !pdf || force {
        return Ok(());
    }
    if path.extension().is_some_and(|e| e == "duty") {
        return refuse(WriteProblem::IsADesign);
    }
    let mut head = [0u8; 4];
    let starts_pdf = File::open(path)
        .and_then(|mut f| f.read_exact(&mut head))
        .is_ok()
        && &head == b"%PDF";
    if !starts_pdf {
        return refuse(WriteProblem::NotAPdf);
    }
    Ok(())
}

/// The one temporary name for `path`: `.NAME.dutyline-tmp` in the same folder, so a
/// write killed half-way leaves a file the next write of the same output removes.
pub fn temporary_for(path: &Path) -> PathBuf {
    let name = path
        .file_name()
        .map(|n| n.to_string_lossy().into_owned())
        .unwrap_or_else(|| "out".into());
    let folder = path
        .parent()
        .filter(|p| !p.as_os_str().is_empty())
        .unwrap_or(Path::new("."));
    folder.join(format!(".{name}.dutyline-tmp"))
}

/// Write bytes to `path` whole or not at all: the temporary file, then a rename. A
/// stale temporary is removed first; the replaced file's permissions are kept.
pub fn write_atomically(path: &Path, bytes: &[u8]) -> Result<(), CliError> {
    let tmp = temporary_for(path);
    let result = (|| {
        match fs::symlink_metadata(&tmp) {
            Ok(m) if m.is_dir() => {
                return Err(std::io::Error::other(format!(
                    "`{}` is in the way of the temporary file",
                    tmp.display()
                )))
            }
            Ok(_) => fs::remove_file(&tmp)?,
            Err(_) => {}
        }
        let mut file = OpenOptions::new().write(true).create_new(true).open(&tmp)?;
        file.write_all(bytes)?;
        if let Ok(existing) = fs::metadata(path) {
            file.set_permissions(existing.permissions())?;
        }
        file.sync_all()?;
        fs::rename(&tmp, path)
    })();
    if result.is_err() {
        let _ = fs::remove_file(&tmp);
    }
    result.map_err(|e| CliError::Write {
        path: path.to_path_buf(),
        problem: WriteProblem::Io(e),
    })
}

/// Write a new file whole, never replacing one: the temporary file, then a hard link
/// to `path` (which fails when `path` exists), then the temporary is removed.
pub fn write_new(path: &Path, bytes: &[u8]) -> Result<(), CliError> {
    let failed = |problem| CliError::Write {
        path: path.to_path_buf(),
        problem,
    };
    if let Ok(metadata) = fs::symlink_metadata(path) {
        return Err(failed(match special_kind(&metadata) {
            Some(kind) => WriteProblem::NotARegularFile(kind),
            None => WriteProblem::Exists,
        }));
    }
    let tmp = temporary_for(path);
    let _ = fs::remove_file(&tmp);
    let result = OpenOptions::new()
        .write(true)
        .create_new(true)
        .open(&tmp)
        .and_then(|mut file| file.write_all(bytes).and_then(|()| file.sync_all()))
        .and_then(|()| fs::hard_link(&tmp, path));
    let _ = fs::remove_file(&tmp);
    match result {
        Ok(()) => Ok(()),
        Err(e) if e.kind() == ErrorKind::AlreadyExists => Err(failed(WriteProblem::Exists)),
        Err(e) => Err(failed(WriteProblem::Io(e))),
    }
}
