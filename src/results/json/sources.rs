//! The document's `sources` (format 2): every source text once, referred to by index.
//! A results document is written on one thread, so the texts seen while it is built
//! are kept per thread: [`reset`] at the start of a document, [`index`] for each
//! `source` field, and [`SourcesOut`] (the last field) writes them.

use std::cell::RefCell;
use std::collections::HashMap;

thread_local! {
    static SOURCES: RefCell<(Vec<String>, HashMap<String, usize>)> = RefCell::new(Default::default());
}

/// Starts a document: no source seen yet.
pub(super) fn reset() {
    SOURCES.with(|s| *s.borrow_mut() = Default::default());
}

/// The index of `text` in the document's `sources`, added when new.
pub(super) fn index(text: &str) -> usize {
    SOURCES.with(|s| {
        let (list, map) = &mut *s.borrow_mut();
        if let Some(&i) = map.get(text) {
            return i;
        }
        list.push(text.to_string());
        map.insert(text.to_string(), list.len() - 1);
        list.len() - 1
    })
}

/// Serialises the sources seen so far (the document's last field).
pub(super) struct SourcesOut;

impl serde::Serialize for SourcesOut {
    fn serialize<S: serde::Serializer>(&self, ser: S) -> Result<S::Ok, S::Error> {
        SOURCES.with(|s| ser.collect_seq(s.borrow().0.iter()))
    }
}
