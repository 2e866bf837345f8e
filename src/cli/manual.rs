//! `dutyline completions SHELL` and `dutyline man [COMMAND]`: shell completion scripts
//! and manual pages generated from the clap definitions at run time (no build script),
//! so they always match the binary. The committed pages in `docs/man/` are that output.

use std::process::ExitCode;

use clap_complete::Shell;

use super::error::CliError;
use super::output::{self, Out};

/// Print the completion script of `shell` for the command line `cmd`.
pub fn completions(
    out: &mut Out,
    mut cmd: clap::Command,
    shell: Shell,
) -> Result<ExitCode, CliError> {
    let mut script = Vec::new();
    clap_complete::generate(shell, &mut cmd, "dutyline", &mut script);
    output::bytes(out, &script)?;
    Ok(ExitCode::SUCCESS)
}

/// Print the manual page of the tool, or of one of its subcommands (`dutyline-check.1`).
pub fn man(
    out: &mut Out,
    mut cmd: clap::Command,
    name: Option<&str>,
) -> Result<ExitCode, CliError> {
    cmd = cmd.disable_help_subcommand(true);
    cmd.build();
    let page = match name {
        None => cmd,
        Some(name) => cmd
            .get_subcommands()
            .find(|s| s.get_name() == name)
            .cloned()
            .ok_or_else(|| {
                let names: Vec<&str> = cmd_names(&cmd);
                CliError::Usage(format!(
                    "`{name}` is not a subcommand; the pages are {}",
                    names.join(", ")
                ))
            })?,
    };
    let mut roff = Vec::new();
    clap_mangen::Man::new(page)
        .source(format!("dutyline {}", dutyline::VERSION))
        .manual("dutyline manual")
        .render(&mut roff)
        .map_err(CliError::stdout)?;
    output::bytes(out, &roff)?;
    Ok(ExitCode::SUCCESS)
}

fn cmd_names(cmd: &clap::Command) -> Vec<&str> {
    cmd.get_subcommands().map(|s| s.get_name()).collect()
}
