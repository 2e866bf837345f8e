//! What the cases of one analysis share: values that are pure functions of a key
//! (a system table of equal losses, a candidate's curve at equal speed and liquid),
//! computed once and handed out as [`Arc`]s, so that a design of thousands of cases
//! that differ only in levels or hours computes them a few times, not per case.
//!
//! A value is a pure function of its key, so which case (or thread) builds it first
//! changes no bit of the results: sharing saves time and memory only.

use std::sync::{Arc, Mutex, MutexGuard, PoisonError};

/// The last [`Kept::KEPT`] values by key, shared between threads.
#[derive(Debug)]
pub struct Kept<K, V: ?Sized> {
    entries: Mutex<Vec<(K, Arc<V>)>>,
}

impl<K, V: ?Sized> Default for Kept<K, V> {
    fn default() -> Self {
        Kept {
            entries: Mutex::new(Vec::new()),
        }
    }
}

impl<K: PartialEq, V: ?Sized> Kept<K, V> {
    /// Values kept for reuse (the oldest is dropped first).
    pub const KEPT: usize = 16;

    /// The value of `key`: a kept one, else `build()` (run without the lock held), kept
    /// when it is `Some`.
    pub fn get_or(&self, key: K, build: impl FnOnce() -> Option<Arc<V>>) -> Option<Arc<V>> {
        self.try_get_or(key, || build().ok_or(())).ok()
    }

    /// As [`Kept::get_or`] for a `build` that can fail: its error is returned, not kept.
    pub fn try_get_or<E>(
        &self,
        key: K,
        build: impl FnOnce() -> Result<Arc<V>, E>,
    ) -> Result<Arc<V>, E> {
        if let Some((_, v)) = self.lock().iter().find(|(k, _)| *k == key) {
            return Ok(v.clone());
        }
        let value = build()?;
        let mut kept = self.lock();
        if kept.len() == Self::KEPT {
            kept.remove(0);
        }
        kept.push((key, value.clone()));
        Ok(value)
    }

    fn lock(&self) -> MutexGuard<'_, Vec<(K, Arc<V>)>> {
        // A push is the only write, so a lock poisoned by a panic elsewhere still holds
        // whole entries.
        self.entries.lock().unwrap_or_else(PoisonError::into_inner)
    }
}

/// What [`super::analyse`] shares between its cases.
#[derive(Debug, Default)]
pub struct Shared {
    /// System tables by losses and reach ([`super::system_table::SharedTables`]).
    pub tables: super::system_table::SharedTables,
    /// Candidates' operating curves ([`super::duty::SharedCurves`]).
    pub curves: super::duty::SharedCurves,
    /// Resolved segments by lines and pipe condition ([`super::system::SharedSegments`]).
    pub segments: super::system::SharedSegments,
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn keeps_the_last_values_and_builds_the_others() {
        let kept: Kept<u32, u32> = Kept::default();
        let mut builds = 0;
        for k in (0..40).chain(30..40).chain(0..2) {
            let v = kept.get_or(k, || {
                builds += 1;
                Some(Arc::new(k * 10))
            });
            assert_eq!(v.as_deref(), Some(&(k * 10)));
        }
        // 40 first builds; 30..40 are kept; 0 and 1 were dropped and are built again.
        assert_eq!(builds, 42);
        assert_eq!(kept.get_or(99, || None), None);
    }

    #[test]
    fn an_error_is_returned_and_not_kept() {
        let kept: Kept<u32, u32> = Kept::default();
        assert_eq!(kept.try_get_or(7, || Err("no")), Err("no"));
        assert_eq!(
            kept.try_get_or(7, || Ok::<_, &str>(Arc::new(70)))
                .as_deref(),
            Ok(&70)
        );
        assert_eq!(
            kept.try_get_or(7, || Err("built again")).as_deref(),
            Ok(&70)
        );
    }
}
