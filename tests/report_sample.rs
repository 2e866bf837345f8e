//! Writes target/sample.pdf (Letter) and target/sample-a4.pdf for visual checks.

mod report_common;

use dutyline::report::layout::{render_document, Style};
use std::time::Instant;

#[test]
fn writes_sample_pdfs() {
    let doc = report_common::sample_document();
    for (name, file) in [("letter", "sample.pdf"), ("a4", "sample-a4.pdf")] {
        let style = Style::builtin(name).expect("built-in style");
        let start = Instant::now();
        let rendered = render_document(&doc, &style).expect("render");
        let elapsed = start.elapsed();
        eprintln!(
            "{name}: {} pages, {} bytes, {:?}",
            rendered.page_count,
            rendered.bytes.len(),
            elapsed
        );
        assert!(rendered.page_count >= 12, "{} pages", rendered.page_count);
        // Generous bound for a debug build on a loaded machine (typically 0.1-0.2 s).
        assert!(elapsed.as_secs_f64() < 5.0, "render took {elapsed:?}");
        let dir = std::path::Path::new(env!("CARGO_MANIFEST_DIR")).join("target");
        std::fs::write(dir.join(file), &rendered.bytes).expect("write sample");
    }
}
