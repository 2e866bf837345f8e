//! The `dutyline` command line: arguments in, library call, diagnostics out.

use std::io::Write;
use std::path::PathBuf;
use std::process::ExitCode;

use clap::{CommandFactory, Parser, Subcommand};

mod cli {
    pub mod commands;
    pub mod error;
    pub mod files;
    pub mod git;
    pub mod lsp;
    pub mod manual;
    pub mod output;
    pub mod starter;
    pub mod verify;
    pub mod watch;
}

use cli::commands::{self, Format};
use cli::error::CliError;

/// The process's allocator: jemalloc. With glibc's malloc the worker threads' arenas grow
/// a page at a time (58 000 `mprotect` calls in a 10 000-case analysis, by `strace -c`),
/// and each block carries a header; jemalloc's size classes and extents took that run from
/// 1.4-1.8 s to 1.0-1.3 s of CPU and 326 to 308 MB (DEVELOPERS.md, Decisions,
/// "Allocator"). Output is the same byte for byte: no result depends on addresses.
#[cfg(all(feature = "jemalloc", not(target_env = "msvc")))]
#[global_allocator]
static ALLOCATOR: tikv_jemallocator::Jemalloc = tikv_jemallocator::Jemalloc;

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

/// Said after the help of each subcommand that reads a design.
macro_rules! file_access {
    () => {
        "File access: a design reads only regular files (curve CSVs, a style file) in its own folder or below, after resolving symbolic links; absolute paths and paths leaving the folder need --allow-dir DIR. FIFOs, devices, sockets and folders are refused without being opened."
    };
}

#[derive(Subcommand)]
enum Command {
    /// Check a design file: syntax, units, names, cases.
    #[command(after_help = concat!(
        "Examples:\n  dutyline check examples-demo/orchard-lift-rev-a.duty\n  dutyline check --analyse examples-demo/kestrel-booster.duty\n\nWithout --analyse only the design is checked; with it the analysis runs too and its warnings (curve fits, cases that cannot be set up) count, the same list `results --format json` gives under `warnings`; `--analyse --deny-warnings` gates CI on them.\n\n",
        file_access!(),
        "\n\nExit status: 0 valid, 1 design errors (or warnings with --deny-warnings), 2 usage or I/O errors, 141 standard output closed early."
    ))]
    Check {
        /// The design file (*.duty), or `-` for standard input.
        file: PathBuf,
        #[command(flatten)]
        access: Access,
        /// Treat warnings as errors.
        #[arg(long)]
        deny_warnings: bool,
        /// Also run the analysis (curve fits, every case and candidate), so its warnings
        /// are printed and counted, as `results` lists them.
        #[arg(long, visible_alias = "analyze")]
        analyse: bool,
    },
    /// Compute and print the results: system curves, duty points, checks, selection.
    #[command(after_help = concat!(
        "Examples:\n  dutyline results examples-demo/orchard-lift-rev-a.duty\n  dutyline results examples-demo/orchard-lift-rev-a.duty --format json > results.json\n  git show HEAD:examples-demo/kestrel-booster.duty | dutyline results - --exit-zero --base-dir examples-demo\n\nThe last form is what git textconv does, which hands over a temporary copy: the design's CSVs are then read from --base-dir (of the working tree, not of the revision; `dutyline diff --git` reads both from the revision), and --exit-zero keeps git from taking exit 3 for a failure.\n\n",
        file_access!(),
        "\n\nExit status: 0 every case analysed and a candidate recommended, 1 design errors, 2 usage or I/O errors, 3 analysed but no candidate recommended or a case could not be analysed (the results are still printed), 141 standard output closed early (e.g. `| head`)."
    ))]
    Results {
        /// The design file (*.duty), or `-` for standard input.
        file: PathBuf,
        #[command(flatten)]
        access: Access,
        /// Output format.
        #[arg(long, value_enum, default_value = "text")]
        format: Format,
        /// Resolve the files the design reads (curve CSVs) against DIR instead of the
        /// design's folder, under the same file-access rule (for git textconv, which
        /// hands over a temporary copy).
        #[arg(long, value_name = "DIR")]
        base_dir: Option<PathBuf>,
        /// Exit 0 whenever the results are printed, also when no candidate is
        /// recommended (git textconv takes any other status as a failure).
        #[arg(long)]
        exit_zero: bool,
    },
    /// Rewrite design files in the canonical layout (comments kept).
    #[command(
        after_help = "Examples:\n  dutyline fmt examples-demo/*.duty\n  dutyline fmt --check design.duty\n  cat design.duty | dutyline fmt -\n\nFiles are rewritten atomically (through `.NAME.dutyline-tmp` in the same folder) and only when they change. `-` reads standard input and writes standard output. fmt reads no file a design names, so it has no --allow-dir.\nExit status: 0 formatted (or already canonical), 1 with --check when a file would change or on syntax errors, 2 usage or I/O errors, 141 standard output closed early."
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
    #[command(after_help = concat!(
        "Examples:\n  dutyline diff examples-demo/orchard-lift-rev-a.duty examples-demo/orchard-lift-rev-b.duty\n  dutyline diff --git HEAD~1 design.duty\n  dutyline diff --git v1..HEAD pumps/lift.duty --format json\n  git show HEAD~1:design.duty | dutyline diff - design.duty\n\nWith --git, git runs in the design's folder; a revision's design reads the curve CSVs of the same revision (`REV:path`), only in its own folder or below (--allow-dir applies to the working tree only).\n\n",
        file_access!(),
        " A revision read from standard input reads from the current folder.\n\nExit status: 0 whether or not there are differences (1 with --exit-code when there are), 1 design errors, 2 usage or I/O errors, 141 standard output closed early."
    ))]
    Diff {
        /// The earlier revision, or `-` for standard input; with --git a git revision
        /// (`REV`), or two (`REV1..REV2`).
        old: PathBuf,
        /// The later revision, or `-` for standard input; with --git the design's path in
        /// the working tree.
        new: PathBuf,
        /// Read OLD (and with `REV1..REV2` also NEW) from git: the design and the files
        /// it imports as they are in that revision.
        #[arg(long)]
        git: bool,
        #[command(flatten)]
        access: Access,
        /// Output format.
        #[arg(long, value_enum, default_value = "text")]
        format: Format,
        /// Exit 1 when there are differences, as `git diff --exit-code` does.
        #[arg(long)]
        exit_code: bool,
    },
    /// Build the PDF calculation package.
    #[command(after_help = concat!(
        "Examples:\n  dutyline build examples-demo/orchard-lift-rev-a.duty\n  dutyline build examples-demo/kestrel-booster.duty -o kestrel.pdf --style letter\n  dutyline build design.duty -o - > package.pdf\n\nThe PDF goes next to the design file unless -o is given; `-o -` writes it to standard output. It is written to the temporary file `.NAME.pdf.dutyline-tmp` in the output's folder and renamed, so a failed build leaves an existing PDF untouched; a temporary left by a killed build is removed by the next build of the same output. An existing output is replaced only when it is a regular file that starts like a PDF (`%PDF`) and is not a design (`*.duty`); --force replaces any regular file. Folders, FIFOs, devices, sockets and symbolic links at the output path are refused.\n\n",
        file_access!(),
        "\n\nExit status: 0 built, every case analysed and a candidate recommended; 1 design or style errors; 2 usage or I/O errors (including a refused output); 3 built, but no candidate recommended or a case could not be analysed; 141 standard output closed early."
    ))]
    Build {
        /// The design file (*.duty), or `-` for standard input (then -o is needed).
        file: PathBuf,
        #[command(flatten)]
        access: Access,
        /// Output PDF path (default: the design file with .pdf); `-` for standard output.
        #[arg(short = 'o', long = "output")]
        output: Option<PathBuf>,
        /// A built-in style (`letter`, `a4`) or the path of a style file (TOML).
        #[arg(long)]
        style: Option<String>,
        /// An earlier revision of the design: adds a "changes since" section.
        #[arg(long, value_name = "OLD")]
        compare: Option<PathBuf>,
        /// Replace an existing output even when it is a design file or not a PDF.
        #[arg(long)]
        force: bool,
    },
    /// Prove a package: recompile its attached sources and compare byte for byte.
    #[command(
        after_help = "Examples:\n  dutyline build examples-demo/kestrel-booster.duty -o kestrel.pdf && dutyline verify kestrel.pdf\n\nThe package's first revision (what dutyline wrote, up to its first %%EOF) is compared; a signature or other incremental update appended later is reported, not checked.\nExit status: 0 identical, 1 differs or not a readable dutyline package (the report or error says where), 2 usage or I/O errors, 3 built by another dutyline version (the results JSON is recomputed and the quantities that moved are listed), 141 standard output closed early."
    )]
    Verify {
        /// The PDF package.
        package: PathBuf,
    },
    /// Write a package's attached design and files back out.
    #[command(
        after_help = "Examples:\n  dutyline build examples-demo/kestrel-booster.duty -o kestrel.pdf && dutyline extract kestrel.pdf -o review\n  dutyline diff review/kestrel-booster.duty examples-demo/kestrel-booster.duty\n\nWrites every attached file but the build record under DIR, under its relative name; names that are absolute or contain `..` are refused and nothing is written. Existing files are never replaced unless --force.\nExit status: 0 written, 1 not a readable dutyline package or an unsafe attachment name, 2 usage or I/O errors (including an existing file without --force), 141 standard output closed early."
    )]
    Extract {
        /// The PDF package.
        package: PathBuf,
        /// The folder to write into (created if missing).
        #[arg(short = 'o', long = "output", value_name = "DIR", default_value = ".")]
        dir: PathBuf,
        /// Replace existing regular files.
        #[arg(long)]
        force: bool,
    },
    /// Write a commented starter design that checks and builds as written.
    #[command(
        after_help = "Examples:\n  dutyline new pumps/intake\n  dutyline new booster.duty --units si\n\nNAME gets `.duty` unless it ends so; the title is the file's name. An existing file is never replaced, and the folder must exist.\nExit status: 0 written, 2 usage or I/O errors (including an existing NAME), 141 standard output closed early."
    )]
    New {
        /// The design to write (`NAME.duty`).
        name: PathBuf,
        /// Report units of the starter.
        #[arg(long, value_enum, default_value = "us")]
        units: Units,
    },
    /// Build the package, then rebuild it whenever the design or a file it reads changes.
    #[command(after_help = concat!(
        "Examples:\n  dutyline watch examples-demo/kestrel-booster.duty\n  dutyline watch design.duty -o design-draft.pdf --max-builds 1\n\nThe design, its curve CSVs and its style file are looked at every 250 ms (modification time and size); after a change they must stay still for another 250 ms, then the package is rebuilt and the diagnostics are printed again. A file the design names but that is missing is watched too. Each build is `build`'s: written to a temporary file and renamed, so a failed build keeps the last good PDF. Ctrl-C stops.\n\n",
        file_access!(),
        "\n\nExit status: 0 built (with --max-builds, that of the last build), 1 design or style errors, 2 usage or I/O errors, 3 built without a recommendation, 141 standard output closed early."
    ))]
    Watch {
        /// The design file (*.duty).
        file: PathBuf,
        #[command(flatten)]
        access: Access,
        /// Output PDF path (default: the design file with .pdf).
        #[arg(short = 'o', long = "output")]
        output: Option<PathBuf>,
        /// A built-in style (`letter`, `a4`) or the path of a style file (TOML).
        #[arg(long)]
        style: Option<String>,
        /// Replace an existing output even when it is a design file or not a PDF.
        #[arg(long)]
        force: bool,
        /// Stop after N builds (for scripts); without it, watch until interrupted.
        #[arg(long, value_name = "N")]
        max_builds: Option<u32>,
    },
    /// Run the language server (Language Server Protocol over standard input and output).
    #[command(
        after_help = "Examples:\n  dutyline lsp\n\nAn editor starts it for *.duty files (editors/README.md shows VS Code, Neovim and Helix). It publishes the diagnostics of `check --analyse` on open and on every change, formats through `fmt`, and answers hover (a quantity in SI and report units, a constant, a fitting), completion, document symbols and go to definition. A document reads its curve CSVs from its own folder, as `check` does. Messages above 6 MiB are refused.\nExit status: 0 after `shutdown` and `exit` or when the input closes, 1 on `exit` without `shutdown`, 2 usage or I/O errors, 141 standard output closed early."
    )]
    Lsp,
    /// Print a shell completion script.
    #[command(
        after_help = "Examples:\n  dutyline completions bash > dutyline.bash\n  dutyline completions zsh > _dutyline\n  dutyline completions fish > dutyline.fish\n\nInstall: bash `~/.local/share/bash-completion/completions/dutyline`; zsh a file `_dutyline` in a folder on $fpath; fish `~/.config/fish/completions/dutyline.fish`.\nExit status: 0 printed, 2 usage or I/O errors, 141 standard output closed early."
    )]
    Completions {
        /// The shell.
        #[arg(value_enum)]
        shell: clap_complete::Shell,
    },
    /// Print a manual page (roff) of the tool or of one subcommand.
    #[command(
        after_help = "Examples:\n  dutyline man > dutyline.1\n  dutyline man check > dutyline-check.1\n\nThe pages in docs/man/ are this output (`man -l docs/man/dutyline.1` reads one).\nExit status: 0 printed, 2 usage or I/O errors (including an unknown COMMAND), 141 standard output closed early."
    )]
    Man {
        /// A subcommand whose page to print (the tool's own page without it).
        command: Option<String>,
    },
}

/// The report units of a starter design.
#[derive(Clone, Copy, clap::ValueEnum)]
enum Units {
    Us,
    Si,
}

/// The folders a design may read from besides its own (`--allow-dir`).
#[derive(clap::Args)]
struct Access {
    /// Let the design also read files in DIR and below (repeatable). Without it a design
    /// reads only regular files in its own folder or below.
    #[arg(long = "allow-dir", value_name = "DIR")]
    allow_dir: Vec<PathBuf>,
}

fn main() -> ExitCode {
    let cli = match Cli::try_parse() {
        Ok(c) => c,
        Err(e) => {
            let _ = e.print();
            return if e.use_stderr() {
                ExitCode::from(cli::error::EXIT_USAGE_OR_IO)
            } else {
                ExitCode::SUCCESS
            };
        }
    };
    match run(cli) {
        Ok(code) => code,
        Err(error) => {
            cli::output::error_text(&error.render());
            error.exit_code()
        }
    }
}

/// The chosen subcommand, its outcome as an exit status or the one error to print.
fn run(cli: Cli) -> Result<ExitCode, CliError> {
    let mut out = std::io::stdout().lock();
    let code = match cli.command {
        Command::Check {
            file,
            access,
            deny_warnings,
            analyse,
        } => commands::check(
            &mut out,
            &file,
            &access.allow_dir,
            commands::CheckOptions {
                deny_warnings,
                analyse,
            },
        ),
        Command::Results {
            file,
            access,
            format,
            base_dir,
            exit_zero,
        } => commands::results(
            &mut out,
            &file,
            &access.allow_dir,
            commands::ResultsOptions {
                format,
                base_dir,
                exit_zero,
            },
        ),
        Command::Build {
            file,
            access,
            output,
            style,
            compare,
            force,
        } => commands::build(
            &mut out,
            &file,
            &access.allow_dir,
            commands::BuildOptions {
                output,
                style,
                compare,
                force,
            },
        ),
        Command::Fmt { files, check } => commands::fmt(&mut out, &files, check),
        Command::Diff {
            old,
            new,
            git,
            access,
            format,
            exit_code,
        } => commands::diff(
            &mut out,
            &old,
            &new,
            &access.allow_dir,
            commands::DiffOptions {
                format,
                exit_code,
                git,
            },
        ),
        Command::Verify { package } => cli::verify::verify(&mut out, &package),
        Command::Extract {
            package,
            dir,
            force,
        } => cli::verify::extract(&mut out, &package, &dir, force),
        Command::Lsp => cli::lsp::run(&mut out),
        Command::Watch {
            file,
            access,
            output,
            style,
            force,
            max_builds,
        } => cli::watch::watch(
            &mut out,
            &file,
            &access.allow_dir,
            cli::watch::WatchOptions {
                output,
                style,
                force,
                max_builds,
            },
        ),
        Command::Completions { shell } => cli::manual::completions(&mut out, Cli::command(), shell),
        Command::Man { command } => cli::manual::man(&mut out, Cli::command(), command.as_deref()),
        Command::New { name, units } => {
            commands::new_design(&mut out, &name, matches!(units, Units::Si))
        }
    }?;
    out.flush().map_err(CliError::stdout)?;
    Ok(code)
}
