//! `dutyline new`: a starter design that checks, analyses without warnings, builds and is
//! canonical, in both unit systems; an existing file is never replaced.

mod cli_common;

use cli_common::{both, dutyline, scratch};

#[test]
fn the_starters_check_build_and_are_canonical() {
    let dir = scratch("new-starters");
    for (name, units, file) in [
        ("lift", "us", "lift.duty"),
        ("booster.duty", "si", "booster.duty"),
    ] {
        let out = dutyline(&dir, &["new", name, "--units", units]);
        assert!(out.status.success(), "{}", both(&out));
        let text = std::fs::read_to_string(dir.join(file)).unwrap();
        let stem = file.trim_end_matches(".duty");
        assert!(text.contains(&format!("title = \"{stem}\"")), "{text}");
        assert!(text.contains(&format!("units = {units}")), "{text}");
        assert!(
            text.lines()
                .filter(|l| l.trim_start().starts_with('#'))
                .count()
                >= 5
        );
        let out = dutyline(&dir, &["check", "--analyse", "--deny-warnings", file]);
        assert!(out.status.success(), "{file}: {}", both(&out));
        let out = dutyline(&dir, &["fmt", "--check", file]);
        assert!(out.status.success(), "{file}: {}", both(&out));
        let out = dutyline(&dir, &["build", file]);
        assert_eq!(out.status.code(), Some(0), "{file}: {}", both(&out));
        let pdf = std::fs::read(dir.join(format!("{stem}.pdf"))).unwrap();
        assert!(pdf.starts_with(b"%PDF"));
    }
}

#[test]
fn new_refuses_to_replace_a_file() {
    let dir = scratch("new-refuses");
    std::fs::write(dir.join("lift.duty"), "# mine\n").unwrap();
    let out = dutyline(&dir, &["new", "lift"]);
    assert_eq!(out.status.code(), Some(2), "{}", both(&out));
    assert!(String::from_utf8_lossy(&out.stderr).contains("never replaces"));
    assert_eq!(
        std::fs::read_to_string(dir.join("lift.duty")).unwrap(),
        "# mine\n"
    );
    // A missing folder is an I/O error, and no temporary is left behind.
    let out = dutyline(&dir, &["new", "no/such/folder/x"]);
    assert_eq!(out.status.code(), Some(2), "{}", both(&out));
    let names: Vec<_> = std::fs::read_dir(&dir)
        .unwrap()
        .map(|e| e.unwrap().file_name())
        .collect();
    assert_eq!(names.len(), 1, "{names:?}");
    // A quote in the name stays a valid title.
    let out = dutyline(&dir, &["new", "say \"hi\""]);
    assert!(out.status.success(), "{}", both(&out));
    let out = dutyline(&dir, &["check", "say \"hi\".duty"]);
    assert!(out.status.success(), "{}", both(&out));
}
