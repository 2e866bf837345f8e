//! The PDF as a reader sees it: page count, text through ToUnicode, embedded subset
//! fonts, byte-identical output within and across processes.

mod report_common;

use dutyline::report::layout::{render, render_document, Style};
use lopdf::{Document as PdfDoc, Object};
use report_common::pdftext::page_texts;
use report_common::sample_document;

fn letter() -> Style {
    Style::builtin("letter").expect("letter style")
}

#[test]
fn page_count_matches_the_pdf() {
    let rendered = render_document(&sample_document(), &letter()).expect("render");
    let pdf = PdfDoc::load_mem(&rendered.bytes).expect("lopdf reads the output");
    assert_eq!(pdf.get_pages().len(), rendered.page_count);
    assert!(rendered.page_count >= 8, "{} pages", rendered.page_count);
}

#[test]
fn headings_and_special_characters_are_in_the_content_streams() {
    let rendered = render_document(&sample_document(), &letter()).expect("render");
    let texts = page_texts(&rendered.bytes).expect("decode text");
    let all = texts.join("\n");
    for heading in &rendered.headings {
        let page = &texts[heading.page - 1];
        assert!(
            page.contains(&heading.text),
            "heading {:?} not on page {}",
            heading.text,
            heading.page
        );
    }
    for needle in [
        "m³/h",
        "15 °C",
        "η",
        "Δp ≤ 4.5 bar",
        "1.138 × 10⁻⁶ m²/s",
        "·",
        "Reviewer's seal / stamp",
    ] {
        assert!(all.contains(needle), "{needle:?} missing from the PDF text");
    }
    let last = texts.last().expect("pages");
    assert!(last.contains(&format!("page {} of {}", texts.len(), texts.len())));
}

#[test]
fn contents_lists_the_pages_headings_land_on() {
    let rendered = render_document(&sample_document(), &letter()).expect("render");
    let texts = page_texts(&rendered.bytes).expect("decode text");
    let contents = texts
        .iter()
        .find(|t| t.contains("Contents\n"))
        .expect("a contents page");
    let lines: Vec<&str> = contents.lines().collect();
    for h in &rendered.headings {
        // A contents entry is shown as: text, number, page number, dot leader.
        let at = (0..lines.len().saturating_sub(2))
            .find(|&i| lines[i] == h.text && lines[i + 1] == h.number)
            .unwrap_or_else(|| panic!("{:?} not in contents", h.text));
        assert_eq!(lines[at + 2], h.page.to_string(), "page of {:?}", h.text);
    }
}

#[test]
fn fonts_are_embedded_as_small_subsets() {
    let bytes = render(&sample_document(), &letter()).expect("render");
    let pdf = PdfDoc::load_mem(&bytes).expect("load");
    let mut programs = 0;
    for object in pdf.objects.values() {
        let Ok(dict) = object.as_dict() else { continue };
        if dict.get(b"Type").and_then(Object::as_name).ok() != Some(b"FontDescriptor".as_slice()) {
            continue;
        }
        let name = dict
            .get(b"FontName")
            .and_then(Object::as_name)
            .expect("FontName");
        assert_eq!(
            name.get(6),
            Some(&b'+'),
            "subset tag on {}",
            String::from_utf8_lossy(name)
        );
        let file = dict
            .get(b"FontFile2")
            .and_then(Object::as_reference)
            .expect("FontFile2 present");
        let stream = pdf
            .get_object(file)
            .and_then(Object::as_stream)
            .expect("font stream");
        let length1 = stream
            .dict
            .get(b"Length1")
            .and_then(Object::as_i64)
            .expect("Length1");
        assert!(
            length1 < 80_000,
            "font program of {length1} bytes is not a subset"
        );
        programs += 1;
    }
    assert_eq!(programs, 3, "regular, bold and mono embedded");
    assert!(bytes.len() < 200_000, "{} bytes", bytes.len());
}

#[test]
fn two_renders_are_byte_identical() {
    let doc = sample_document();
    let a = render(&doc, &letter()).expect("first");
    let b = render(&doc, &letter()).expect("second");
    assert!(a == b, "renders differ");
    let mut other = doc.clone();
    other.id_seed.push('x');
    let c = render(&other, &letter()).expect("third");
    assert_eq!(a.len(), c.len());
    assert!(a != c, "the id seed must change the file identifier");
}

#[test]
fn trailer_id_comes_from_the_seed_and_content() {
    let bytes = render(&sample_document(), &letter()).expect("render");
    let pdf = PdfDoc::load_mem(&bytes).expect("load");
    let id = pdf
        .trailer
        .get(b"ID")
        .and_then(Object::as_array)
        .expect("trailer /ID");
    assert_eq!(id.len(), 2);
    for part in id {
        let s = part.as_str().expect("string");
        assert_eq!(s.len(), 32);
        assert!(
            s.iter().all(u8::is_ascii_hexdigit),
            "{}",
            String::from_utf8_lossy(s)
        );
    }
}

/// Child half of the cross-process check: renders into the file named by
/// `DUTYLINE_RENDER_TO` (run only by `renders_are_identical_across_processes`).
#[test]
#[ignore = "spawned by renders_are_identical_across_processes"]
fn child_render_to_file() {
    if let Ok(path) = std::env::var("DUTYLINE_RENDER_TO") {
        let bytes = render(&sample_document(), &letter()).expect("render");
        std::fs::write(path, bytes).expect("write");
    }
}

#[test]
fn renders_are_identical_across_processes() {
    let dir = std::env::temp_dir().join(format!("dutyline-determinism-{}", std::process::id()));
    std::fs::create_dir_all(&dir).expect("temp dir");
    let mut outputs = Vec::new();
    for run in 0..2 {
        let path = dir.join(format!("run{run}.pdf"));
        let status = std::process::Command::new(std::env::current_exe().expect("test binary"))
            .args([
                "--ignored",
                "--exact",
                "child_render_to_file",
                "--test-threads=1",
            ])
            .env("DUTYLINE_RENDER_TO", &path)
            .stdout(std::process::Stdio::null())
            .status()
            .expect("spawn child");
        assert!(status.success());
        outputs.push(std::fs::read(&path).expect("child output"));
    }
    let here = render(&sample_document(), &letter()).expect("render here");
    std::fs::remove_dir_all(&dir).ok();
    assert!(
        outputs[0] == outputs[1],
        "two processes wrote different bytes"
    );
    assert!(outputs[0] == here, "a child process and this one differ");
}
