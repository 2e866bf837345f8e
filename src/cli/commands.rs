//! One function per subcommand: read, call the library, write; every failure is a
//! [`CliError`] returned to `run`.

use dutyline::diagnostics::Code;
use std::collections::BTreeMap;
use std::io::Write;
use std::path::{Path, PathBuf};
use std::process::ExitCode;

use dutyline::analysis::Analysis;
use dutyline::diagnostics::Diagnostic;
use dutyline::model::FileError;
use dutyline::report::layout::style::{Style, StyleError};
use dutyline::verify::{Recording, StyleSource};

use super::error::{CliError, EXIT_DESIGN, EXIT_NO_SELECTION};
use super::files::{self, DiskFiles};
use super::output::{self, Out};

/// The output format of `results` and `diff`.
#[derive(Clone, Copy, clap::ValueEnum)]
pub enum Format {
    Text,
    Json,
}

/// A design read and checked, with the files it may read and those its check read.
pub struct Loaded {
    pub source: String,
    pub checked: dutyline::Checked,
    pub files: DiskFiles,
    /// The files the check read: path as the design names it → text (what a package
    /// attaches beside the design).
    pub imports: BTreeMap<String, String>,
}

/// Read and check a design; diagnostics with any error make it a [`CliError::Rejected`].
pub fn load(path: &Path, allowed: &[PathBuf]) -> Result<Loaded, CliError> {
    load_in(path, None, allowed)
}

/// [`load`], the design's files resolved against `base` instead of the design's folder
/// when given.
pub fn load_in(path: &Path, base: Option<&Path>, allowed: &[PathBuf]) -> Result<Loaded, CliError> {
    let source = files::read_named(path)?;
    let files = match base {
        Some(folder) => DiskFiles::in_folder(folder, allowed)?,
        None => DiskFiles::for_design(path, allowed)?,
    };
    let recording = Recording::new(&files);
    let checked = checked(path, &source, &recording)?;
    let imports = recording.into_files();
    Ok(Loaded {
        source,
        checked,
        files,
        imports,
    })
}

/// Check a design's text read through `files`; any error rejects it.
fn checked(
    path: &Path,
    source: &str,
    files: &dyn dutyline::FileAccess,
) -> Result<dutyline::Checked, CliError> {
    let checked = dutyline::check(source, files);
    if checked.has_errors() {
        return Err(rejected(
            path,
            source.to_string(),
            checked.diagnostics,
            None,
        ));
    }
    Ok(checked)
}

fn rejected(
    path: &Path,
    source: String,
    diagnostics: Vec<Diagnostic>,
    summary: Option<String>,
) -> CliError {
    CliError::Rejected {
        file: path.display().to_string(),
        source,
        diagnostics,
        summary,
    }
}

/// The design of a checked file without errors (always present then).
fn design_of(loaded: &Loaded) -> Result<&dutyline::Design, CliError> {
    loaded.checked.design.as_ref().ok_or_else(|| {
        CliError::Usage(
            "the design has no errors but could not be built; please report this".into(),
        )
    })
}

/// 0 when every case was analysed and a candidate is recommended, else 3.
fn analysis_status(analysis: &Analysis) -> ExitCode {
    let failed_case = analysis.cases.iter().any(|c| c.error.is_some());
    if failed_case || analysis.selection.recommended.is_none() {
        ExitCode::from(EXIT_NO_SELECTION)
    } else {
        ExitCode::SUCCESS
    }
}

/// The options of `check`.
pub struct CheckOptions {
    pub deny_warnings: bool,
    /// Also run the analysis, so its warnings are printed and counted.
    pub analyse: bool,
}

pub fn check(
    out: &mut Out,
    path: &Path,
    allowed: &[PathBuf],
    options: CheckOptions,
) -> Result<ExitCode, CliError> {
    let source = files::read_named(path)?;
    let files = DiskFiles::for_design(path, allowed)?;
    let mut checked = dutyline::check(&source, &files);
    let errors = checked.diagnostics.iter().filter(|d| d.is_error()).count();
    if let (true, 0, Some(design)) = (options.analyse, errors, &checked.design) {
        let analysis = dutyline::analysis::analyse(design);
        checked
            .diagnostics
            .extend(analysis_warnings(design, &analysis));
    }
    let warnings = checked.diagnostics.len() - errors;
    if errors > 0 || (options.deny_warnings && warnings > 0) {
        let summary = format!(
            "{}: {errors} error(s), {warnings} warning(s)",
            path.display()
        );
        return Err(rejected(path, source, checked.diagnostics, Some(summary)));
    }
    output::diagnostics(&checked.diagnostics, path, &source);
    writeln!(out, "{}: valid ({warnings} warning(s))", path.display()).map_err(CliError::stdout)?;
    Ok(ExitCode::SUCCESS)
}

/// The analysis warnings as diagnostics: with the design's own warnings they are the
/// `warnings` list of `results --format json`, so both commands count the same.
/// Their quantities are in the design's report units.
pub fn analysis_warnings(design: &dutyline::Design, analysis: &Analysis) -> Vec<Diagnostic> {
    let units = dutyline::display::Units::new(design.project.units);
    analysis
        .warnings
        .iter()
        .map(|w| w.diagnostic(|m| units.render(m)))
        .collect()
}

/// The options of `results`.
pub struct ResultsOptions {
    pub format: Format,
    /// Resolve the design's files against this folder instead of the design's own.
    pub base_dir: Option<PathBuf>,
    /// Exit 0 instead of 3 when no candidate is recommended (git textconv).
    pub exit_zero: bool,
}

pub fn results(
    out: &mut Out,
    path: &Path,
    allowed: &[PathBuf],
    options: ResultsOptions,
) -> Result<ExitCode, CliError> {
    let loaded = load_in(path, options.base_dir.as_deref(), allowed)?;
    let design = design_of(&loaded)?;
    let analysis = dutyline::analysis::analyse(design);
    match options.format {
        // Written as it is built: a 10 000-case document is never held whole.
        Format::Json => dutyline::results::write_json(
            &mut *out,
            design,
            &analysis,
            &path.display().to_string(),
            &loaded.source,
            &loaded.checked.diagnostics,
        )
        .map_err(CliError::stdout)?,
        // Written in pieces as it is made: a many-case text is never held whole.
        Format::Text => {
            dutyline::results::write_text(&mut *out, design, &analysis).map_err(CliError::stdout)?
        }
    }
    let status = if options.exit_zero {
        ExitCode::SUCCESS
    } else {
        analysis_status(&analysis)
    };
    // The process ends next: freeing a 10 000-case analysis piece by piece took 5 % of
    // the run (issue 17); the system takes the memory back whole.
    std::mem::forget(analysis);
    Ok(status)
}

/// The options of `build`.
pub struct BuildOptions {
    pub output: Option<PathBuf>,
    pub style: Option<String>,
    pub compare: Option<PathBuf>,
    pub force: bool,
}

pub fn build(
    out: &mut Out,
    path: &Path,
    allowed: &[PathBuf],
    options: BuildOptions,
) -> Result<ExitCode, CliError> {
    let target = match options.output {
        Some(output) => output,
        None if path == Path::new("-") => {
            return Err(CliError::Usage(
                "a design read from standard input needs `-o OUT.pdf` (or `-o -`)".into(),
            ))
        }
        None => path.with_extension("pdf"),
    };
    let to_stdout = target == Path::new("-");
    if !to_stdout {
        check_output(path, &target, options.force)?;
    }
    let loaded = load(path, allowed)?;
    output::diagnostics(&loaded.checked.diagnostics, path, &loaded.source);
    let design = design_of(&loaded)?;
    let (_, style) = load_style(options.style.as_deref(), design, &loaded.files)?;
    let compare = match &options.compare {
        Some(old) => Some(super::verify::design_files(old, &load(old, allowed)?)),
        None => None,
    };
    let sources = dutyline::verify::Sources {
        design: super::verify::design_files(path, &loaded),
        style,
        compare,
    };
    let package = dutyline::verify::compile(&sources).map_err(|e| {
        let diagnostic = Diagnostic::error(Code::Layout, e.to_string(), None);
        rejected(path, String::new(), vec![diagnostic], None)
    })?;
    let (bytes, analysis) = (package.bytes, package.analysis);
    let wrote = format!(
        "{}: wrote {} ({} bytes)\n",
        path.display(),
        target.display(),
        bytes.len()
    );
    if to_stdout {
        output::bytes(out, &bytes)?;
        output::error_text(&wrote);
    } else {
        check_output(path, &target, options.force)?;
        files::write_atomically(&target, &bytes)?;
        output::text(out, &wrote)?;
    }
    let status = analysis_status(&analysis);
    // As in `results`: the process ends next, and the system takes the memory back whole.
    std::mem::forget(analysis);
    Ok(status)
}

/// The output may be written: not the design itself, and a kind of file `build` replaces.
fn check_output(design: &Path, target: &Path, force: bool) -> Result<(), CliError> {
    let same = target == design
        || matches!(
            (std::fs::canonicalize(design), std::fs::canonicalize(target)),
            (Ok(a), Ok(b)) if a == b
        );
    if same {
        return Err(CliError::Write {
            path: target.to_path_buf(),
            problem: super::error::WriteProblem::IsTheInput,
        });
    }
    files::check_target(target, true, force)
}

/// Resolve the style: the command line's, the design's, or the units' default. A style
/// file named on the command line may be anywhere; one named in the design obeys the
/// design's file-access rule. Returns the style and what to attach for it.
fn load_style(
    argument: Option<&str>,
    design: &dutyline::Design,
    files: &DiskFiles,
) -> Result<(Style, StyleSource), CliError> {
    let choice = argument
        .map(str::to_string)
        .or_else(|| design.project.style.clone())
        .unwrap_or_else(|| dutyline::report::builtin_style_for(design).to_string());
    if let Some(style) = Style::builtin(&choice) {
        return Ok((style, StyleSource::Builtin(choice)));
    }
    // A missing file may be a misspelt built-in name: say which names exist.
    let with_names = |error: CliError| match error {
        CliError::Read {
            path,
            error: FileError::NotFound,
            ..
        } => CliError::Read {
            path,
            error: FileError::NotFound,
            help: Some(format!(
                "`{choice}` is neither a built-in style ({}) nor a style file (TOML)",
                Style::builtin_names().join(", ")
            )),
        },
        other => other,
    };
    let path = match argument {
        Some(_) => PathBuf::from(&choice),
        None => files.resolve(&choice).map_err(|error| {
            with_names(CliError::Read {
                path: PathBuf::from(&choice),
                error,
                help: None,
            })
        })?,
    };
    let text = files::read_named(&path).map_err(with_names)?;
    let style = Style::from_toml(&text).map_err(|error| {
        let diagnostic = style_diagnostic(&error, &text);
        rejected(&path, text.clone(), vec![diagnostic], None)
    })?;
    // A style named on the command line is attached under its file name; one named
    // in the design under the path the design gives.
    let name = match argument {
        Some(_) => super::verify::file_name(&path, "style.toml"),
        None => choice,
    };
    Ok((style, StyleSource::File { name, text }))
}

/// A style-file error as a diagnostic pointing at its line and column.
fn style_diagnostic(error: &StyleError, text: &str) -> Diagnostic {
    let span = (error.line > 0).then(|| {
        let line_start: usize = text
            .split_inclusive('\n')
            .take(error.line - 1)
            .map(str::len)
            .sum();
        let line = text[line_start..].lines().next().unwrap_or_default();
        let offset = line
            .char_indices()
            .nth(error.column.saturating_sub(1))
            .map_or(line.len(), |(i, _)| i);
        let token = line[offset..]
            .find(|c: char| c.is_whitespace() || c == '=')
            .unwrap_or(line.len() - offset);
        let width = token.max(line[offset..].chars().next().map_or(0, char::len_utf8));
        dutyline::diagnostics::Span::new(line_start + offset, line_start + offset + width)
    });
    Diagnostic::error(Code::Style, error.message.clone(), span).with_help(error.help.clone())
}

pub fn fmt(out: &mut Out, paths: &[PathBuf], check: bool) -> Result<ExitCode, CliError> {
    let stdin = Path::new("-");
    if paths.iter().filter(|f| f.as_path() == stdin).count() > 1 {
        return Err(CliError::Usage(
            "`-` (standard input) may be given once".into(),
        ));
    }
    let mut worst = ExitCode::SUCCESS;
    for path in paths {
        let source = files::read_named(path)?;
        let formatted = match dutyline::syntax::format_source(&source) {
            Ok(f) => f,
            Err(diagnostics) => {
                output::diagnostics(&diagnostics, path, &source);
                worst = ExitCode::from(EXIT_DESIGN);
                continue;
            }
        };
        // Standard input is echoed even when canonical (unless checking).
        let echo = path == stdin && !check;
        if formatted == source && !echo {
            continue;
        }
        if check {
            print_changed_lines(out, path, &source, &formatted)?;
            worst = ExitCode::from(EXIT_DESIGN);
        } else if path == stdin {
            output::text(out, &formatted)?;
        } else {
            let real = std::fs::canonicalize(path).unwrap_or_else(|_| path.clone());
            files::check_target(&real, false, false)?;
            files::write_atomically(&real, formatted.as_bytes())?;
            writeln!(out, "formatted {}", path.display()).map_err(CliError::stdout)?;
        }
    }
    Ok(worst)
}

/// A short account of what formatting would change: the first differing lines.
fn print_changed_lines(out: &mut Out, path: &Path, old: &str, new: &str) -> Result<(), CliError> {
    let a: Vec<&str> = old.lines().collect();
    let b: Vec<&str> = new.lines().collect();
    let first = a
        .iter()
        .zip(&b)
        .position(|(x, y)| x != y)
        .unwrap_or(a.len().min(b.len()));
    let mut text = format!(
        "{} is not in canonical layout; from line {}:\n",
        path.display(),
        first + 1
    );
    for line in a.iter().skip(first).take(6) {
        text.push_str(&format!("- {line}\n"));
    }
    for line in b.iter().skip(first).take(6) {
        text.push_str(&format!("+ {line}\n"));
    }
    output::text(out, &text)
}

/// The options of `diff`.
pub struct DiffOptions {
    pub format: Format,
    pub exit_code: bool,
    /// OLD is a git revision (`REV`, or `A..B` for both sides) of the design NEW.
    pub git: bool,
}

/// One revision of a design: its name in messages, its text and the files it reads.
struct Side {
    label: PathBuf,
    source: String,
    files: Box<dyn dutyline::FileAccess>,
}

impl Side {
    fn disk(path: &Path, allowed: &[PathBuf]) -> Result<Side, CliError> {
        Ok(Side {
            label: path.to_path_buf(),
            source: files::read_named(path)?,
            files: Box::new(DiskFiles::for_design(path, allowed)?),
        })
    }

    fn git(revision: &str, path: &Path) -> Result<Side, CliError> {
        let (label, source, files) = super::git::read_design(revision, path)?;
        Ok(Side {
            label,
            source,
            files: Box::new(files),
        })
    }

    /// The side checked and analysed.
    fn analysed(&self) -> Result<(dutyline::Design, Analysis), CliError> {
        let checked = checked(&self.label, &self.source, self.files.as_ref())?;
        let design = checked.design.ok_or_else(|| {
            CliError::Usage(
                "the design has no errors but could not be built; please report this".into(),
            )
        })?;
        let analysis = dutyline::analysis::analyse(&design);
        Ok((design, analysis))
    }
}

/// The two sides `diff` compares: two files, or git revisions of one design.
fn diff_sides(
    old: &Path,
    new: &Path,
    allowed: &[PathBuf],
    git: bool,
) -> Result<(Side, Side), CliError> {
    if git {
        let (before, after) = super::git::revisions(&old.to_string_lossy());
        let before = Side::git(&before, new)?;
        let after = match after {
            Some(revision) => Side::git(&revision, new)?,
            None => Side::disk(new, allowed)?,
        };
        return Ok((before, after));
    }
    if old == Path::new("-") && new == Path::new("-") {
        return Err(CliError::Usage(
            "only one of OLD and NEW may be `-` (standard input)".into(),
        ));
    }
    Ok((Side::disk(old, allowed)?, Side::disk(new, allowed)?))
}

pub fn diff(
    out: &mut Out,
    old: &Path,
    new: &Path,
    allowed: &[PathBuf],
    options: DiffOptions,
) -> Result<ExitCode, CliError> {
    let (old_side, new_side) = diff_sides(old, new, allowed, options.git)?;
    let (old_design, old_analysis) = old_side.analysed()?;
    let (new_design, new_analysis) = new_side.analysed()?;
    let diff = dutyline::diff::diff(&old_design, &old_analysis, &new_design, &new_analysis);
    let text = match options.format {
        Format::Text => dutyline::diff::render_text(&diff),
        Format::Json => dutyline::diff::to_json(&diff),
    };
    output::text(out, &text)?;
    if options.exit_code && dutyline::diff::has_differences(&diff) {
        Ok(ExitCode::from(EXIT_DESIGN))
    } else {
        Ok(ExitCode::SUCCESS)
    }
}

pub fn new_design(out: &mut Out, name: &Path, si: bool) -> Result<ExitCode, CliError> {
    let path = if name.extension().is_some_and(|e| e == "duty") {
        name.to_path_buf()
    } else {
        let mut with = name.as_os_str().to_owned();
        with.push(".duty");
        PathBuf::from(with)
    };
    let title = path
        .file_stem()
        .map(|s| s.to_string_lossy().into_owned())
        .unwrap_or_else(|| "New design".into());
    files::write_new(&path, super::starter::starter(&title, si).as_bytes())?;
    writeln!(
        out,
        "wrote {}; check it with `dutyline check --analyse {}`",
        path.display(),
        path.display()
    )
    .map_err(CliError::stdout)?;
    Ok(ExitCode::SUCCESS)
}
