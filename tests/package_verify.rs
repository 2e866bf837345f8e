//! Self-verifying packages (issue 18): every demo package verifies; a changed digit on
//! a page, a replaced attachment, another tool version, a PDF from another program, a
//! truncated or damaged file are each reported precisely and never panic; extract gives
//! back the inputs byte for byte and refuses names that leave its folder.

mod cli_common;

use std::path::Path;

use cli_common::{both, copy_demos, dutyline, scratch};
use dutyline::verify::{self, Verdict};
use lopdf::{Document, Object, StringFormat};
use sha2::{Digest, Sha256};

fn sha(bytes: &[u8]) -> String {
    Sha256::digest(bytes)
        .iter()
        .map(|b| format!("{b:02x}"))
        .collect()
}

/// `dir/NAME.pdf` built from `examples-demo/NAME.duty` (plus `extra` arguments).
fn build(dir: &Path, name: &str, extra: &[&str]) -> Vec<u8> {
    let design = format!("examples-demo/{name}.duty");
    let pdf = format!("{name}.pdf");
    let mut args = vec!["build", design.as_str(), "-o", pdf.as_str()];
    args.extend_from_slice(extra);
    let out = dutyline(dir, &args);
    assert!(out.status.success(), "{}", both(&out));
    std::fs::read(dir.join(pdf)).unwrap()
}

fn stdout(out: &std::process::Output) -> String {
    String::from_utf8_lossy(&out.stdout).into_owned()
}

/// The object id of the file specification of attachment `name`.
fn spec_of(doc: &Document, name: &str) -> lopdf::ObjectId {
    let root = doc.trailer.get(b"Root").unwrap().as_reference().unwrap();
    let catalog = doc.get_dictionary(root).unwrap();
    let names = catalog.get(b"Names").unwrap().as_dict().unwrap();
    let tree = names.get(b"EmbeddedFiles").unwrap().as_dict().unwrap();
    let list = tree.get(b"Names").unwrap().as_array().unwrap();
    for pair in list.chunks(2) {
        if pair[0].as_str().unwrap() == name.as_bytes() {
            return pair[1].as_reference().unwrap();
        }
    }
    panic!("no attachment {name}");
}

/// Replaces attachment `name`'s content; with `consistent` its description (and the
/// build record's SHA-256, unless `name` is the record) follow, as a careful forger's
/// would.
fn replace_attachment(doc: &mut Document, name: &str, bytes: &[u8], consistent: bool) {
    let spec = spec_of(doc, name);
    let dict = doc.get_dictionary(spec).unwrap();
    let ef = dict.get(b"EF").unwrap().as_dict().unwrap();
    let stream_id = ef.get(b"F").unwrap().as_reference().unwrap();
    let stream = doc
        .get_object_mut(stream_id)
        .unwrap()
        .as_stream_mut()
        .unwrap();
    stream.set_plain_content(bytes.to_vec());
    if consistent {
        let desc = format!("replaced; SHA-256 {}", sha(bytes));
        doc.get_dictionary_mut(spec).unwrap().set(
            "Desc",
            Object::String(desc.into_bytes(), StringFormat::Literal),
        );
    }
}

fn attachment(doc: &Document, name: &str) -> Vec<u8> {
    let spec = spec_of(doc, name);
    let ef = doc
        .get_dictionary(spec)
        .unwrap()
        .get(b"EF")
        .unwrap()
        .as_dict()
        .unwrap();
    let id = ef.get(b"F").unwrap().as_reference().unwrap();
    let stream = doc.get_object(id).unwrap().as_stream().unwrap();
    stream
        .decompressed_content()
        .unwrap_or_else(|_| stream.content.clone())
}

fn save(doc: &mut Document) -> Vec<u8> {
    let mut bytes = Vec::new();
    doc.save_to(&mut bytes).unwrap();
    bytes
}

#[test]
fn every_demo_package_verifies_and_says_so_in_one_line() {
    let dir = scratch("verify-demos");
    copy_demos(&dir);
    std::fs::write(
        dir.join("examples-demo/house.toml"),
        std::fs::read_to_string(Path::new(cli_common::ROOT).join("styles/a4.toml")).unwrap(),
    )
    .unwrap();
    let cases: [(&str, &[&str]); 4] = [
        ("orchard-lift-rev-a", &[]),
        ("kestrel-booster", &[]),
        (
            "orchard-lift-rev-b",
            &["--compare", "examples-demo/orchard-lift-rev-a.duty"],
        ),
        ("kestrel-booster", &["--style", "examples-demo/house.toml"]),
    ];
    for (name, extra) in cases {
        build(&dir, name, extra);
        let out = dutyline(&dir, &["verify", &format!("{name}.pdf")]);
        assert!(out.status.success(), "{name} {extra:?}: {}", both(&out));
        let text = stdout(&out);
        assert_eq!(text.lines().count(), 1, "{text}");
        assert!(text.contains(": verified: identical"), "{text}");
    }
}

#[test]
fn build_is_byte_identical_and_extract_gives_back_the_inputs() {
    let dir = scratch("verify-extract");
    copy_demos(&dir);
    let first = build(&dir, "kestrel-booster", &[]);
    let second = build(&dir, "kestrel-booster", &[]);
    assert_eq!(first, second, "two builds of the same inputs differ");
    let out = dutyline(&dir, &["extract", "kestrel-booster.pdf", "-o", "review"]);
    assert!(out.status.success(), "{}", both(&out));
    for file in ["kestrel-booster.duty", "kestrel-kr1-430.csv"] {
        assert_eq!(
            std::fs::read(dir.join("review").join(file)).unwrap(),
            std::fs::read(dir.join("examples-demo").join(file)).unwrap(),
            "{file} extracted differs from the input"
        );
    }
    assert!(
        !dir.join("review/dutyline-build.json").exists(),
        "the build record is not written out"
    );
    // Rebuilt from the extracted files: the same bytes.
    let out = dutyline(
        &dir,
        &["build", "review/kestrel-booster.duty", "-o", "rebuilt.pdf"],
    );
    assert!(out.status.success(), "{}", both(&out));
    assert_eq!(std::fs::read(dir.join("rebuilt.pdf")).unwrap(), first);
    // A second extract refuses to overwrite; --force replaces.
    let again = dutyline(&dir, &["extract", "kestrel-booster.pdf", "-o", "review"]);
    assert_eq!(again.status.code(), Some(2), "{}", both(&again));
    assert!(String::from_utf8_lossy(&again.stderr).contains("--force"));
    let forced = dutyline(
        &dir,
        &["extract", "kestrel-booster.pdf", "-o", "review", "--force"],
    );
    assert!(forced.status.success(), "{}", both(&forced));
}

#[test]
fn one_changed_digit_on_a_page_names_that_page() {
    let dir = scratch("verify-page");
    copy_demos(&dir);
    let bytes = build(&dir, "orchard-lift-rev-a", &[]);
    let mut doc = Document::load_mem(&bytes).unwrap();
    let pages = doc.get_pages();
    let page_count = pages.len();
    let page_id = pages[&3];
    let content_id = doc.get_page_contents(page_id)[0];
    let stream = doc
        .get_object_mut(content_id)
        .unwrap()
        .as_stream_mut()
        .unwrap();
    let mut content = stream.decompressed_content().unwrap();
    let digit = content.iter().position(u8::is_ascii_digit).unwrap();
    content[digit] = if content[digit] == b'7' { b'8' } else { b'7' };
    stream.set_plain_content(content);
    doc.compress();
    std::fs::write(dir.join("tampered.pdf"), save(&mut doc)).unwrap();
    let out = dutyline(&dir, &["verify", "tampered.pdf"]);
    assert_eq!(out.status.code(), Some(1), "{}", both(&out));
    let text = stdout(&out);
    assert!(text.contains("NOT verified"), "{text}");
    assert!(
        text.contains(&format!("page 3 of {page_count} differs")),
        "{text}"
    );
    assert!(
        !text.contains("attachment"),
        "only the page changed: {text}"
    );
}

#[test]
fn a_replaced_attachment_is_named() {
    let dir = scratch("verify-attachment");
    copy_demos(&dir);
    let bytes = build(&dir, "kestrel-booster", &[]);
    let csv = std::fs::read(dir.join("examples-demo/kestrel-kr1-430.csv")).unwrap();
    let edited = String::from_utf8(csv).unwrap().replacen("0.", "1.", 1);

    // Replaced without touching its recorded SHA-256.
    let mut doc = Document::load_mem(&bytes).unwrap();
    replace_attachment(&mut doc, "kestrel-kr1-430.csv", edited.as_bytes(), false);
    std::fs::write(dir.join("swapped.pdf"), save(&mut doc)).unwrap();
    let out = dutyline(&dir, &["verify", "swapped.pdf"]);
    assert_eq!(out.status.code(), Some(1), "{}", both(&out));
    let text = stdout(&out);
    assert!(
        text.contains("attachment `kestrel-kr1-430.csv` was altered"),
        "{text}"
    );

    // Replaced with its description updated too: the build record and the rebuild
    // still catch it, and the pages that show the curve differ.
    let mut doc = Document::load_mem(&bytes).unwrap();
    replace_attachment(&mut doc, "kestrel-kr1-430.csv", edited.as_bytes(), true);
    std::fs::write(dir.join("forged.pdf"), save(&mut doc)).unwrap();
    let out = dutyline(&dir, &["verify", "forged.pdf"]);
    assert_eq!(out.status.code(), Some(1), "{}", both(&out));
    let text = stdout(&out);
    assert!(
        text.contains("attachment `kestrel-kr1-430.csv` does not match the build record"),
        "{text}"
    );
    assert!(
        text.contains("attachment `kestrel-booster.results.json` differs"),
        "{text}"
    );
    assert!(
        text.contains("differ from the rebuild (page content)"),
        "{text}"
    );
}

#[test]
fn another_tool_version_compares_the_results_json() {
    let dir = scratch("verify-version");
    copy_demos(&dir);
    let bytes = build(&dir, "kestrel-booster", &[]);
    let mut doc = Document::load_mem(&bytes).unwrap();
    // As if an older dutyline had computed one duty flow differently.
    let results_name = "kestrel-booster.results.json";
    let mut results: serde_json::Value =
        serde_json::from_slice(&attachment(&doc, results_name)).unwrap();
    let duty_flow = &mut results["cases"][0]["pumps"][0]["duty"]["flow_m3_s"];
    let old_flow = duty_flow.as_f64().expect("a duty flow in the results");
    *duty_flow = serde_json::json!(old_flow * 1.05);
    let results_text = serde_json::to_string_pretty(&results).unwrap();
    let mut record: serde_json::Value =
        serde_json::from_slice(&attachment(&doc, "dutyline-build.json")).unwrap();
    record["version"] = "0.0.9".into();
    for file in record["files"].as_array_mut().unwrap() {
        if file["name"] == results_name {
            file["sha256"] = sha(results_text.as_bytes()).into();
            file["bytes"] = results_text.len().into();
        }
    }
    let record_text = serde_json::to_string_pretty(&record).unwrap();
    replace_attachment(&mut doc, results_name, results_text.as_bytes(), true);
    replace_attachment(
        &mut doc,
        "dutyline-build.json",
        record_text.as_bytes(),
        true,
    );
    std::fs::write(dir.join("older.pdf"), save(&mut doc)).unwrap();
    let out = dutyline(&dir, &["verify", "older.pdf"]);
    assert_eq!(out.status.code(), Some(3), "{}", both(&out));
    let text = stdout(&out);
    assert!(
        text.contains(&format!(
            "built with dutyline 0.0.9, this is dutyline {}",
            dutyline::VERSION
        )),
        "{text}"
    );
    assert!(text.contains("1 quantity moved:"), "{text}");
    assert!(
        text.contains("cases › average › pumps › KR1 › duty › flow_m3_s: "),
        "{text}"
    );
}

#[test]
fn a_pdf_from_another_program_is_refused_clearly() {
    let dir = scratch("verify-other");
    let mut doc = Document::with_version("1.7");
    let pages_id = doc.new_object_id();
    let content = doc.add_object(lopdf::Stream::new(
        lopdf::Dictionary::new(),
        b"BT ET".to_vec(),
    ));
    let dict =
        |entries: Vec<(&str, Object)>| Object::Dictionary(lopdf::Dictionary::from_iter(entries));
    let page = doc.add_object(dict(vec![
        ("Type", "Page".into()),
        ("Parent", Object::Reference(pages_id)),
        ("Contents", Object::Reference(content)),
        (
            "MediaBox",
            Object::Array(vec![0.into(), 0.into(), 595.into(), 842.into()]),
        ),
    ]));
    doc.objects.insert(
        pages_id,
        dict(vec![
            ("Type", "Pages".into()),
            ("Kids", Object::Array(vec![Object::Reference(page)])),
            ("Count", 1.into()),
        ]),
    );
    let catalog = doc.add_object(dict(vec![
        ("Type", "Catalog".into()),
        ("Pages", Object::Reference(pages_id)),
    ]));
    let info = doc.add_object(dict(vec![(
        "Producer",
        Object::string_literal("Some Other Writer 2.1"),
    )]));
    doc.trailer.set("Root", catalog);
    doc.trailer.set("Info", info);
    std::fs::write(dir.join("other.pdf"), save(&mut doc)).unwrap();
    let out = dutyline(&dir, &["verify", "other.pdf"]);
    assert_eq!(out.status.code(), Some(1), "{}", both(&out));
    let err = String::from_utf8_lossy(&out.stderr);
    assert!(err.contains("not a dutyline package"), "{err}");
    assert!(err.contains("Some Other Writer 2.1"), "{err}");
    // Not a PDF at all, and a file that does not exist.
    std::fs::write(dir.join("notes.pdf"), "just some text").unwrap();
    let out = dutyline(&dir, &["verify", "notes.pdf"]);
    assert_eq!(out.status.code(), Some(1), "{}", both(&out));
    assert!(String::from_utf8_lossy(&out.stderr).contains("not a PDF"));
    let out = dutyline(&dir, &["verify", "missing.pdf"]);
    assert_eq!(out.status.code(), Some(2), "{}", both(&out));
}

#[test]
fn truncated_and_flipped_packages_are_errors_never_panics_nor_verified() {
    let dir = scratch("verify-fuzz");
    copy_demos(&dir);
    let bytes = build(&dir, "orchard-lift-rev-a", &[]);
    assert_eq!(verify::verify(&bytes).unwrap().verdict, Verdict::Identical);
    // Truncations: at 97 points spread over the file, and in its last 64 bytes.
    let n = bytes.len();
    let cuts: Vec<usize> = (0..97)
        .map(|i| i * n / 97)
        .chain(n.saturating_sub(64)..n)
        .collect();
    for cut in cuts {
        match verify::verify(&bytes[..cut]) {
            Err(e) => assert!(!e.to_string().is_empty()),
            Ok(report) => assert!(!report.identical(), "cut at {cut} verified"),
        }
    }
    let out = {
        std::fs::write(dir.join("short.pdf"), &bytes[..n / 2]).unwrap();
        dutyline(&dir, &["verify", "short.pdf"])
    };
    assert_eq!(out.status.code(), Some(1), "{}", both(&out));
    assert!(
        String::from_utf8_lossy(&out.stderr).contains("truncated"),
        "{}",
        both(&out)
    );
    // Byte flips: the header, the cross-reference table, the trailer, and 12 points
    // spread over the body. None verifies.
    let xref = bytes.windows(6).rposition(|w| w == b"\nxref\n").unwrap() + 1;
    let mut points: Vec<usize> = vec![0, 5, 9, xref, xref + 30, n - 40, n - 3];
    points.extend((1..13).map(|i| i * n / 13));
    for at in points {
        let mut flipped = bytes.clone();
        flipped[at] ^= 0x20;
        if let Ok(report) = verify::verify(&flipped) {
            assert!(!report.identical(), "flip at {at} verified");
        }
    }
    // Garbage that looks like the start of a PDF.
    for junk in [
        &b""[..],
        b"%PDF-",
        b"%PDF-1.3\n1 0 obj <<",
        b"%PDF-1.3\n1 0 obj <</Length 99999999999999999999>> stream\n",
        b"%PDF-1.3\n1 0 obj [[[[[[[[[[[[[[[[[[[[[[[[[[[[[[[[[[[[[[[[[[[[[[ endobj",
        b"%PDF-1.3\n1 0 obj (unclosed \\",
        b"%PDF-1.3\nxref\n0 99999999999\ntrailer",
    ] {
        assert!(verify::verify(junk).is_err(), "{junk:?}");
    }
}

#[test]
fn a_signature_appended_later_still_verifies_and_is_reported() {
    let dir = scratch("verify-signed");
    copy_demos(&dir);
    let mut bytes = build(&dir, "orchard-lift-rev-a", &[]);
    let original = bytes.len();
    // An incremental update as a signing tool appends one: a signature dictionary
    // whose byte range covers the original revision.
    let update = format!(
        "\n900 0 obj\n<</Type/Sig/Filter/Adobe.PPKLite/ByteRange[0 {original} {} 16]/Contents<00>>>\nendobj\nxref\n900 1\n{:010} 00000 n \ntrailer\n<</Prev 0/Size 901>>\nstartxref\n{}\n%%EOF\n",
        original + 40,
        original + 1,
        original + 120
    );
    bytes.extend_from_slice(update.as_bytes());
    std::fs::write(dir.join("signed.pdf"), &bytes).unwrap();
    let out = dutyline(&dir, &["verify", "signed.pdf"]);
    assert!(out.status.success(), "{}", both(&out));
    let text = stdout(&out);
    assert!(text.contains("verified: identical"), "{text}");
    assert!(text.contains("1 later revision(s)"), "{text}");
    assert!(
        text.contains("a digital signature over bytes 0–")
            && text.contains("which covers the compared revision"),
        "{text}"
    );
}

#[test]
fn extract_refuses_names_that_leave_its_folder() {
    let dir = scratch("verify-names");
    copy_demos(&dir);
    let bytes = build(&dir, "kestrel-booster", &[]);
    for evil in [
        "../escaped.csv",
        "/tmp/dutyline-absolute.csv",
        "a/../../b.csv",
    ] {
        let mut doc = Document::load_mem(&bytes).unwrap();
        let spec = spec_of(&doc, "kestrel-kr1-430.csv");
        let dict = doc.get_dictionary_mut(spec).unwrap();
        for key in ["F", "UF"] {
            dict.set(key, Object::string_literal(evil));
        }
        std::fs::write(dir.join("evil.pdf"), save(&mut doc)).unwrap();
        let out = dutyline(&dir, &["extract", "evil.pdf", "-o", "out/inner"]);
        assert_eq!(out.status.code(), Some(1), "{evil}: {}", both(&out));
        let err = String::from_utf8_lossy(&out.stderr);
        assert!(err.contains("nothing was written"), "{err}");
        assert!(!dir.join("out").exists(), "{evil}: something was written");
        assert!(!dir.join("escaped.csv").exists() && !dir.join("out/escaped.csv").exists());
        assert!(!Path::new("/tmp/dutyline-absolute.csv").exists());
    }
}
