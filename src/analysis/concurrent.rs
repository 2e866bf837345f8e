//! Independent pieces of an analysis (cases, candidates) on every core: rayon's
//! data-parallel map on its global thread pool (`RAYON_NUM_THREADS` sets its size).
//!
//! Each piece is a pure function of the design and its own inputs, and the results are
//! collected in the input order, so the output is the same whatever the number of
//! threads (tests/thread_count.rs compares the results JSON at 1 and 2 threads). Used
//! for the cases of an analysis, their safety screens, and the candidates of the yearly
//! operation.

use rayon::prelude::*;

/// `f` applied to every item, the results in the items' order; in parallel when there
/// are at least two items, else on the calling thread (no pool is started for one).
pub fn map<T: Sync, R: Send>(items: &[T], f: impl Fn(&T) -> R + Sync + Send) -> Vec<R> {
    if items.len() < 2 {
        return items.iter().map(f).collect();
    }
    items.par_iter().map(f).collect()
}

#[cfg(test)]
mod tests {
    #[test]
    fn keeps_the_order_of_the_items() {
        let items: Vec<u64> = (0..1000).collect();
        let out = super::map(&items, |&i| i * i);
        assert_eq!(out, items.iter().map(|&i| i * i).collect::<Vec<_>>());
        assert_eq!(super::map(&[3u8], |&i| i + 1), vec![4]);
    }
}
