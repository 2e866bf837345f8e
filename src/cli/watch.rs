//! `dutyline watch FILE`: build the package, then rebuild whenever the design or a file
//! it reads (curve CSVs, a style file) changes. Polling (no watcher crate): every
//! [`POLL`] the modification time and size of each watched file are compared; after a
//! change the files must stay still for one more [`POLL`] (debounce) before the rebuild,
//! so an editor's save in several writes gives one build. Each build is `build`'s own,
//! which writes through a temporary file and renames it, so an interrupted or failed
//! build never leaves a half-written PDF.

use std::cell::RefCell;
use std::path::{Path, PathBuf};
use std::process::ExitCode;
use std::time::{Duration, SystemTime};

use dutyline::model::{FileAccess, FileError};

use super::commands::{self, BuildOptions};
use super::error::CliError;
use super::files::{self, DiskFiles};
use super::output::{self, Out};

/// How often the files are looked at.
pub const POLL: Duration = Duration::from_millis(250);
/// Most files watched (the design and what it reads).
pub const MAX_WATCHED: usize = 256;

/// The options of `watch`: those of `build`, and when to stop.
pub struct WatchOptions {
    pub output: Option<PathBuf>,
    pub style: Option<String>,
    pub force: bool,
    /// Stop after this many builds (successful or not); `None`: until interrupted.
    pub max_builds: Option<u32>,
}

/// A [`FileAccess`] that notes every path the design asks for.
struct Recording<'a> {
    inner: &'a DiskFiles,
    asked: RefCell<Vec<PathBuf>>,
}

impl FileAccess for Recording<'_> {
    fn read_text(&self, path: &str) -> Result<String, FileError> {
        let mut asked = self.asked.borrow_mut();
        if asked.len() < MAX_WATCHED {
            asked.push(
                self.inner
                    .resolve(path)
                    .unwrap_or_else(|_| self.inner.path_of(path)),
            );
        }
        drop(asked);
        self.inner.read_text(path)
    }
}

/// The design and every file it reads now (also those missing, so that creating one
/// rebuilds), its style file included.
fn watched_files(design: &Path, allowed: &[PathBuf]) -> Vec<PathBuf> {
    let mut out = vec![design.to_path_buf()];
    let (Ok(disk), Ok(source)) = (
        DiskFiles::for_design(design, allowed),
        files::read_named(design),
    ) else {
        return out;
    };
    let recording = Recording {
        inner: &disk,
        asked: RefCell::new(Vec::new()),
    };
    let checked = dutyline::check(&source, &recording);
    out.extend(recording.asked.into_inner());
    let style = checked
        .design
        .as_ref()
        .and_then(|d| d.project.style.clone());
    if let Some(style) =
        style.filter(|s| dutyline::report::layout::style::Style::builtin(s).is_none())
    {
        out.push(
            disk.resolve(&style)
                .unwrap_or_else(|_| disk.path_of(&style)),
        );
    }
    out.sort();
    out.dedup();
    out.truncate(MAX_WATCHED);
    out
}

/// Modification time and size of each file (`None` when it cannot be read).
fn stamps(paths: &[PathBuf]) -> Vec<Option<(SystemTime, u64)>> {
    paths
        .iter()
        .map(|p| {
            let m = std::fs::metadata(p).ok()?;
            Some((m.modified().ok()?, m.len()))
        })
        .collect()
}

/// Wait until a watched file changes and then stays still for one poll.
fn wait_for_change(paths: &[PathBuf], before: &[Option<(SystemTime, u64)>]) {
    let mut now = stamps(paths);
    while now == before {
        std::thread::sleep(POLL);
        now = stamps(paths);
    }
    loop {
        std::thread::sleep(POLL);
        let later = stamps(paths);
        if later == now {
            return;
        }
        now = later;
    }
}

/// One build as `build` does it; a failure is printed and becomes the status.
fn build_once(
    out: &mut Out,
    design: &Path,
    allowed: &[PathBuf],
    options: &WatchOptions,
) -> ExitCode {
    let build = BuildOptions {
        output: options.output.clone(),
        style: options.style.clone(),
        compare: None,
        force: options.force,
    };
    match commands::build(out, design, allowed, build) {
        Ok(code) => code,
        Err(error) => {
            output::error_text(&error.render());
            error.exit_code()
        }
    }
}

pub fn watch(
    out: &mut Out,
    design: &Path,
    allowed: &[PathBuf],
    options: WatchOptions,
) -> Result<ExitCode, CliError> {
    if design == Path::new("-") {
        return Err(CliError::Usage(
            "watch needs a design file, not standard input".into(),
        ));
    }
    let mut builds = 0u32;
    loop {
        let paths = watched_files(design, allowed);
        let before = stamps(&paths);
        let status = build_once(out, design, allowed, &options);
        builds = builds.saturating_add(1);
        if options.max_builds.is_some_and(|max| builds >= max) {
            return Ok(status);
        }
        output::text(
            out,
            &format!(
                "watching {} file(s) for changes; Ctrl-C stops\n",
                paths.len()
            ),
        )?;
        std::io::Write::flush(out).map_err(CliError::stdout)?;
        wait_for_change(&paths, &before);
    }
}
