//! Small text-matching helpers shared by the catalogue and the fittings table
//! ("did you mean ...?" suggestions).

/// Longest input (in characters) that the edit distance looks at; longer input is
/// truncated so a pathological string cannot make suggestions expensive.
const MAX_COMPARED_CHARS: usize = 64;

/// Levenshtein edit distance (insertions, deletions, substitutions, each cost 1)
/// between `a` and `b`, case-insensitive, on at most the first 64 characters of each.
///
/// Levenshtein, V. I. (1966), "Binary codes capable of correcting deletions,
/// insertions and reversals", Soviet Physics Doklady 10(8), 707-710.
pub(crate) fn edit_distance(a: &str, b: &str) -> usize {
    let a: Vec<char> = a
        .chars()
        .take(MAX_COMPARED_CHARS)
        .flat_map(char::to_lowercase)
        .collect();
    let b: Vec<char> = b
        .chars()
        .take(MAX_COMPARED_CHARS)
        .flat_map(char::to_lowercase)
        .collect();
    let mut previous: Vec<usize> = (0..=b.len()).collect();
    let mut current = vec![0; b.len() + 1];
    for (i, ca) in a.iter().enumerate() {
        current[0] = i + 1;
        for (j, cb) in b.iter().enumerate() {
            let substitution = previous[j] + usize::from(ca != cb);
            current[j + 1] = substitution.min(previous[j + 1] + 1).min(current[j] + 1);
        }
        std::mem::swap(&mut previous, &mut current);
    }
    previous[b.len()]
}

/// The candidates nearest to `input` by edit distance, best first (ties keep the
/// candidates' order), at most `limit` of them, and none farther than
/// `max_distance`.
pub(crate) fn nearest_by_edit_distance<'a>(
    input: &str,
    candidates: impl IntoIterator<Item = &'a str>,
    limit: usize,
    max_distance: usize,
) -> Vec<&'a str> {
    let mut scored: Vec<(usize, usize, &'a str)> = candidates
        .into_iter()
        .enumerate()
        .map(|(index, name)| (edit_distance(input, name), index, name))
        .filter(|(distance, _, _)| *distance <= max_distance)
        .collect();
    scored.sort();
    scored.into_iter().take(limit).map(|(_, _, n)| n).collect()
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn distance_of_classic_pair() {
        assert_eq!(edit_distance("kitten", "sitting"), 3); // Levenshtein textbook example
        assert_eq!(edit_distance("", "abc"), 3);
        assert_eq!(edit_distance("Gate", "gate"), 0);
    }

    #[test]
    fn nearest_orders_and_limits() {
        let names = ["elbow_90_long", "elbow_45_long", "gate_valve"];
        let found = nearest_by_edit_distance("elbow_90_lng", names, 2, 5);
        assert_eq!(found, vec!["elbow_90_long", "elbow_45_long"]);
        assert!(nearest_by_edit_distance("zzzzzzzzzzzzzzzzz", names, 3, 3).is_empty());
    }
}
