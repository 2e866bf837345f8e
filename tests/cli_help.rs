//! The command line documents itself: every subcommand's `--help` states its exit
//! statuses, and the README's command table names every option the help lists.

use std::process::Command;

const BIN: &str = env!("CARGO_BIN_EXE_dutyline");
const COMMANDS: [&str; 10] = [
    "check",
    "results",
    "build",
    "fmt",
    "diff",
    "new",
    "lsp",
    "completions",
    "man",
    "watch",
];

fn help(command: &str) -> String {
    let out = Command::new(BIN)
        .args([command, "--help"])
        .output()
        .unwrap();
    assert!(out.status.success(), "{command} --help");
    String::from_utf8(out.stdout).unwrap()
}

/// The options a help text lists (the short form where there is one), without help.
fn long_options(text: &str) -> Vec<String> {
    text.lines()
        .map(str::trim_start)
        .filter(|l| l.starts_with('-'))
        .filter_map(|l| l.split_whitespace().next())
        .map(|w| w.trim_end_matches(',').to_string())
        .filter(|w| w != "-h")
        .collect()
}

#[test]
fn every_help_states_the_exit_statuses() {
    for command in COMMANDS {
        let text = help(command);
        assert!(text.contains("Exit status: 0"), "{command}: {text}");
        assert!(text.contains("2 usage or I/O errors"), "{command}: {text}");
        assert!(text.contains("141"), "{command}: {text}");
    }
    for command in ["results", "build"] {
        assert!(help(command).contains("3 "), "{command} documents exit 3");
    }
}

#[test]
fn every_command_reading_a_design_takes_allow_dir() {
    for command in ["check", "results", "build", "diff", "watch"] {
        let text = help(command);
        assert!(text.contains("--allow-dir <DIR>"), "{command}: {text}");
        assert!(text.contains("File access:"), "{command}: {text}");
    }
}

#[test]
fn the_readme_command_table_names_every_option() {
    let readme =
        std::fs::read_to_string(concat!(env!("CARGO_MANIFEST_DIR"), "/README.md")).unwrap();
    for command in COMMANDS {
        let row = readme
            .lines()
            .find(|l| {
                l.starts_with(&format!("| `dutyline {command} "))
                    || l.starts_with(&format!("| `dutyline {command}` "))
            })
            .unwrap_or_else(|| panic!("no README row for {command}"));
        let options = long_options(&help(command));
        if command == "build" {
            // -o, --style, --compare, --force, --allow-dir: the options `build --help` lists.
            assert_eq!(options.len(), 5, "{options:?}");
        }
        for option in options {
            assert!(
                row.contains(&option),
                "README row for {command} lacks {option}: {row}"
            );
        }
    }
}
