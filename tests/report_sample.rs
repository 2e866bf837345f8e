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
        // Speed is measured by the benchmarks (benches/package.rs), not asserted here.
        let dir = std::env::var_os("CARGO_TARGET_DIR")
            .map(std::path::PathBuf::from)
            .unwrap_or_else(|| std::path::Path::new(env!("CARGO_MANIFEST_DIR")).join("target"));
        std::fs::create_dir_all(&dir).expect("target folder");
        std::fs::write(dir.join(file), &rendered.bytes).expect("write sample");
    }
}
