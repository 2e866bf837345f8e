//! The `dutyline` command line: arguments in, library call, diagnostics out.

use std::path::{Path, PathBuf};
use std::process::ExitCode;

use clap::{Parser, Subcommand};

use dutyline::diagnostics::{self, Diagnostic};

#[derive(Parser)]
#[command(
    name = "dutyline",
    version,
    about = "Pump and system-curve calculation packages from a unit-checked design file"
)]
struct Cli {
    #[command(subcommand)]
    command: Command,
}

#[derive(Subcommand)]
enum Command {
    /// Check a design file: syntax, units, names, cases.
    #[command(
        after_help = "Example:\n  dutyline check examples-demo/orchard-lift-rev-a.duty\n\nExit status: 0 valid, 1 design errors (or warnings with --deny-warnings), 2 usage or I/O errors."
    )]
    Check {
        /// The design file (*.duty).
        file: PathBuf,
        /// Treat warnings as errors.
        #[arg(long)]
        deny_warnings: bool,
    },
    /// Compute and print the results: system curves, duty points, checks, selection.
    #[command(
        after_help = "Examples:\n  dutyline results examples-demo/orchard-lift-rev-a.duty\n  dutyline results examples-demo/orchard-lift-rev-a.duty --format json > results.json\n\nExit status: 0 computed, 1 design errors, 2 usage or I/O errors."
    )]
    Results {
        /// The design file (*.duty).
        file: PathBuf,
        /// Output format.
        #[arg(long, value_enum, default_value = "text")]
        format: Format,
    },
    /// Rewrite design files in the canonical layout (comments kept).
    #[command(
        after_help = "Examples:\n  dutyline fmt examples-demo/*.duty\n  dutyline fmt --check design.duty\n  cat design.duty | dutyline fmt -\n\nFiles are rewritten atomically and only when they change. `-` reads standard input and writes standard output.\nExit status: 0 formatted (or already canonical), 1 with --check when a file would change or on syntax errors, 2 usage or I/O errors."
    )]
    Fmt {
        /// Design files, or `-` for standard input.
        #[arg(required = true)]
        files: Vec<PathBuf>,
        /// Change nothing; exit 1 and show the lines that would change.
        #[arg(long)]
        check: bool,
    },
    /// Show what changed between two revisions: inputs and their effect on every duty point.
    #[command(
        after_help = "Examples:\n  dutyline diff examples-demo/orchard-lift-rev-a.duty examples-demo/orchard-lift-rev-b.duty\n  git show HEAD~1:design.duty | dutyline diff - design.duty --format json\n\nExit status: 0 whether or not there are differences (1 with --exit-code when there are), 1 design errors, 2 usage or I/O errors."
    )]
    Diff {
        /// The earlier revision, or `-` for standard input.
        old: PathBuf,
        /// The later revision, or `-` for standard input.
        new: PathBuf,
        /// Output format.
        #[arg(long, value_enum, default_value = "text")]
        format: Format,
        /// Exit 1 when there are differences, as `git diff --exit-code` does.
        #[arg(long)]
        exit_code: bool,
    },
    /// Build the PDF calculation package.
    #[command(
        after_help = "Examples:\n  dutyline build examples-demo/orchard-lift-rev-a.duty\n  dutyline build examples-demo/kestrel-booster.duty -o kestrel.pdf --style letter\n\nThe PDF goes next to the design file unless -o is given. It is written to a temporary file and renamed, so a failed build leaves an existing PDF untouched.\nExit status: 0 built, 1 design or style errors, 2 usage or I/O errors."
    )]
    Build {
        /// The design file (*.duty).
        file: PathBuf,
        /// Output PDF path (default: the design file with .pdf).
        #[arg(short = 'o', long = "output")]
        output: Option<PathBuf>,
        /// A built-in style (`letter`, `a4`) or the path of a style file (TOML).
        #[arg(long)]
        style: Option<String>,
        /// An earlier revision of the design: adds a "changes since" section.
        #[arg(long, value_name = "OLD")]
        compare: Option<PathBuf>,
    },
}

#[derive(Clone, Copy, clap::ValueEnum)]
enum Format {
    Text,
    Json,
}

/// Reads files relative to the design file's folder.
struct DiskFiles {
    base: PathBuf,
}

impl dutyline::FileAccess for DiskFiles {
    fn read_text(&self, path: &str) -> Result<String, String> {
        let p = self.base.join(path);
        let bytes = read_capped(&p).map_err(|e| e.to_string())?;
        if bytes.len() > dutyline::syntax::MAX_SOURCE_BYTES {
            return Err(format!(
                "the file is larger than {} bytes",
                dutyline::syntax::MAX_SOURCE_BYTES
            ));
        }
        String::from_utf8(bytes).map_err(|_| "the file is not UTF-8 text".to_string())
    }
}

fn main() -> ExitCode {
    let cli = match Cli::try_parse() {
        Ok(c) => c,
        Err(e) => {
            let _ = e.print();
            return if e.use_stderr() {
                ExitCode::from(2)
            } else {
                ExitCode::SUCCESS
            };
        }
    };
    match cli.command {
        Command::Check {
            file,
            deny_warnings,
        } => check(&file, deny_warnings),
        Command::Results { file, format } => results(&file, format),
        Command::Build {
            file,
            output,
            style,
            compare,
        } => build(&file, output, style, compare),
        Command::Fmt { files, check } => fmt(&files, check),
        Command::Diff {
            old,
            new,
            format,
            exit_code,
        } => diff(&old, &new, format, exit_code),
    }
}

/// Reads at most one byte more than `MAX_SOURCE_BYTES`, so that an enormous file (or an
/// endless one such as `/dev/zero`) is refused without being loaded whole. `-` is
/// standard input.
fn read_capped(path: &Path) -> std::io::Result<Vec<u8>> {
    use std::io::Read;
    let mut bytes = Vec::new();
    let cap = dutyline::syntax::MAX_SOURCE_BYTES as u64 + 1;
    if path == Path::new("-") {
        std::io::stdin().take(cap).read_to_end(&mut bytes)?;
    } else {
        std::fs::File::open(path)?
            .take(cap)
            .read_to_end(&mut bytes)?;
    }
    Ok(bytes)
}

/// Read a design file (or standard input for `-`), or print why not.
fn read_source(path: &Path) -> Result<String, ExitCode> {
    let name = path.display().to_string();
    let bytes = read_capped(path).map_err(|e| {
        eprintln!("error: cannot read `{name}`: {e}");
        ExitCode::from(2)
    })?;
    if bytes.len() > dutyline::syntax::MAX_SOURCE_BYTES {
        eprintln!(
            "error[file-too-large]: `{name}` is larger than {} bytes, the limit for design files",
            dutyline::syntax::MAX_SOURCE_BYTES
        );
        return Err(ExitCode::from(1));
    }
    dutyline::syntax::source_from_bytes(bytes).map_err(|d| {
        eprint!("{}", diagnostics::render(&[d], &name, ""));
        ExitCode::from(1)
    })
}

fn files_for(path: &Path) -> DiskFiles {
    DiskFiles {
        base: path.parent().map(Path::to_path_buf).unwrap_or_default(),
    }
}

fn report(diags: &[Diagnostic], path: &Path, source: &str) {
    if !diags.is_empty() {
        eprint!(
            "{}",
            diagnostics::render(diags, &path.display().to_string(), source)
        );
    }
}

fn check(path: &Path, deny_warnings: bool) -> ExitCode {
    let source = match read_source(path) {
        Ok(s) => s,
        Err(code) => return code,
    };
    let checked = dutyline::check(&source, &files_for(path));
    report(&checked.diagnostics, path, &source);
    let errors = checked.diagnostics.iter().filter(|d| d.is_error()).count();
    let warnings = checked.diagnostics.len() - errors;
    if errors > 0 || (deny_warnings && warnings > 0) {
        eprintln!(
            "{}: {errors} error(s), {warnings} warning(s)",
            path.display()
        );
        ExitCode::from(1)
    } else {
        println!("{}: valid ({warnings} warning(s))", path.display());
        ExitCode::SUCCESS
    }
}

/// Check a design and report; the design when it is valid.
fn load(path: &Path) -> Result<(String, dutyline::Checked), ExitCode> {
    let source = read_source(path)?;
    let checked = dutyline::check(&source, &files_for(path));
    let errors = checked.diagnostics.iter().any(|d| d.is_error());
    if errors {
        report(&checked.diagnostics, path, &source);
        return Err(ExitCode::from(1));
    }
    Ok((source, checked))
}

fn results(path: &Path, format: Format) -> ExitCode {
    let (source, checked) = match load(path) {
        Ok(x) => x,
        Err(code) => return code,
    };
    let Some(design) = &checked.design else {
        return ExitCode::from(1);
    };
    let analysis = dutyline::analysis::analyse(design);
    let out = match format {
        Format::Json => dutyline::results::to_json(
            design,
            &analysis,
            &path.display().to_string(),
            &source,
            &checked.diagnostics,
        ),
        Format::Text => dutyline::results::to_text(design, &analysis),
    };
    print!("{out}");
    ExitCode::SUCCESS
}

/// Resolve the style: the command line's, the design's, or the units' default.
fn load_style(
    arg: Option<&str>,
    design: &dutyline::Design,
    base: &Path,
) -> Result<dutyline::report::layout::style::Style, ExitCode> {
    use dutyline::report::layout::style::Style;
    let choice = arg
        .map(str::to_string)
        .or_else(|| design.project.style.clone())
        .unwrap_or_else(|| dutyline::report::builtin_style_for(design).to_string());
    if let Some(s) = Style::builtin(&choice) {
        return Ok(s);
    }
    let path = if arg.is_some() {
        PathBuf::from(&choice)
    } else {
        base.join(&choice)
    };
    let text = read_capped(&path)
        .and_then(|b| {
            if b.len() > dutyline::syntax::MAX_SOURCE_BYTES {
                return Err(std::io::Error::other("the file is too large for a style file"));
            }
            String::from_utf8(b).map_err(|_| std::io::Error::other("the file is not UTF-8 text"))
        })
        .map_err(|e| {
            eprintln!("error: `{choice}` is not a built-in style ({}) and cannot be read as a style file: {e}", Style::builtin_names().join(", "));
            ExitCode::from(2)
        })?;
    Style::from_toml(&text).map_err(|e| {
        eprintln!(
            "error[style]: {}\n  --> {}:{}:{}\n  = help: {}",
            e.message,
            path.display(),
            e.line,
            e.column,
            e.help
        );
        ExitCode::from(1)
    })
}

/// Write bytes to `path` whole or not at all: a temporary file in the same folder, then a rename.
fn write_atomically(path: &Path, bytes: &[u8]) -> std::io::Result<()> {
    use std::io::Write;
    let dir = path
        .parent()
        .filter(|p| !p.as_os_str().is_empty())
        .unwrap_or(Path::new("."));
    let name = path
        .file_name()
        .map(|n| n.to_string_lossy().into_owned())
        .unwrap_or_else(|| "out".into());
    let tmp = dir.join(format!(".{name}.tmp{}", std::process::id()));
    let result = (|| {
        let mut f = std::fs::File::create(&tmp)?;
        f.write_all(bytes)?;
        f.sync_all()?;
        std::fs::rename(&tmp, path)
    })();
    if result.is_err() {
        let _ = std::fs::remove_file(&tmp);
    }
    result
}

fn build(
    path: &Path,
    output: Option<PathBuf>,
    style: Option<String>,
    compare: Option<PathBuf>,
) -> ExitCode {
    let out = output.unwrap_or_else(|| path.with_extension("pdf"));
    if let (Ok(a), Ok(b)) = (std::fs::canonicalize(path), std::fs::canonicalize(&out)) {
        if a == b {
            eprintln!(
                "error: the output `{}` is the design file itself; choose another -o",
                out.display()
            );
            return ExitCode::from(2);
        }
    }
    if out == path {
        eprintln!(
            "error: the output `{}` is the design file itself; choose another -o",
            out.display()
        );
        return ExitCode::from(2);
    }
    let (source, checked) = match load(path) {
        Ok(x) => x,
        Err(code) => return code,
    };
    report(&checked.diagnostics, path, &source);
    let Some(design) = &checked.design else {
        return ExitCode::from(1);
    };
    let base = path.parent().map(Path::to_path_buf).unwrap_or_default();
    let style = match load_style(style.as_deref(), design, &base) {
        Ok(s) => s,
        Err(code) => return code,
    };
    let analysis = dutyline::analysis::analyse(design);
    let changes = match &compare {
        Some(old) => match load(old) {
            Ok((old_source, old_checked)) => old_checked.design.as_ref().map(|od| {
                let oa = dutyline::analysis::analyse(od);
                let d = dutyline::diff::diff(od, &oa, design, &analysis);
                dutyline::report::changes_from_diff(od, &d, &old_source)
            }),
            Err(code) => return code,
        },
        None => None,
    };
    let bytes =
        match dutyline::report::render_pdf(design, &analysis, &source, &style, changes.as_ref()) {
            Ok(b) => b,
            Err(e) => {
                eprintln!("error: the package could not be laid out: {e}");
                return ExitCode::from(1);
            }
        };
    match write_atomically(&out, &bytes) {
        Ok(()) => {
            println!(
                "{}: wrote {} ({} bytes)",
                path.display(),
                out.display(),
                bytes.len()
            );
            ExitCode::SUCCESS
        }
        Err(e) => {
            eprintln!("error: cannot write `{}`: {e}", out.display());
            ExitCode::from(2)
        }
    }
}

fn fmt(files: &[PathBuf], check: bool) -> ExitCode {
    let mut worst = ExitCode::SUCCESS;
    if files
        .iter()
        .filter(|f| f.as_path() == Path::new("-"))
        .count()
        > 1
    {
        eprintln!("error: `-` (standard input) may be given once");
        return ExitCode::from(2);
    }
    for path in files {
        let source = match read_source(path) {
            Ok(s) => s,
            Err(code) => return code,
        };
        let formatted = match dutyline::syntax::format_source(&source) {
            Ok(f) => f,
            Err(diags) => {
                report(&diags, path, &source);
                worst = ExitCode::from(1);
                continue;
            }
        };
        if path == Path::new("-") {
            if check {
                if formatted != source {
                    print_changed_lines(path, &source, &formatted);
                    worst = ExitCode::from(1);
                }
            } else {
                print!("{formatted}");
            }
            continue;
        }
        if formatted == source {
            continue;
        }
        if check {
            print_changed_lines(path, &source, &formatted);
            worst = ExitCode::from(1);
        } else if let Err(e) = write_atomically(path, formatted.as_bytes()) {
            eprintln!("error: cannot write `{}`: {e}", path.display());
            return ExitCode::from(2);
        } else {
            println!("formatted {}", path.display());
        }
    }
    worst
}

/// A short account of what formatting would change: the first differing lines.
fn print_changed_lines(path: &Path, old: &str, new: &str) {
    let a: Vec<&str> = old.lines().collect();
    let b: Vec<&str> = new.lines().collect();
    let first = a
        .iter()
        .zip(&b)
        .position(|(x, y)| x != y)
        .unwrap_or(a.len().min(b.len()));
    println!(
        "{} is not in canonical layout; from line {}:",
        path.display(),
        first + 1
    );
    for l in a.iter().skip(first).take(6) {
        println!("- {l}");
    }
    for l in b.iter().skip(first).take(6) {
        println!("+ {l}");
    }
}

fn diff(old: &Path, new: &Path, format: Format, exit_code: bool) -> ExitCode {
    if old == Path::new("-") && new == Path::new("-") {
        eprintln!("error: only one of OLD and NEW may be `-` (standard input)");
        return ExitCode::from(2);
    }
    let (_, old_checked) = match load(old) {
        Ok(x) => x,
        Err(code) => return code,
    };
    let (_, new_checked) = match load(new) {
        Ok(x) => x,
        Err(code) => return code,
    };
    let (Some(od), Some(nd)) = (&old_checked.design, &new_checked.design) else {
        return ExitCode::from(1);
    };
    let oa = dutyline::analysis::analyse(od);
    let na = dutyline::analysis::analyse(nd);
    let d = dutyline::diff::diff(od, &oa, nd, &na);
    match format {
        Format::Text => print!("{}", dutyline::diff::render_text(&d)),
        Format::Json => print!("{}", dutyline::diff::to_json(&d)),
    }
    if exit_code && dutyline::diff::has_differences(&d) {
        ExitCode::from(1)
    } else {
        ExitCode::SUCCESS
    }
}
