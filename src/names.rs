//! Nearest-name suggestions for diagnostics ("did you mean `elbow_90_long`?"): the one
//! edit distance of the crate, used for keywords, fields, units, fittings and pipe sizes.

/// Longest input (in characters) the edit distance looks at; longer input is truncated
/// so a pathological string cannot make suggestions expensive.
const MAX_COMPARED_CHARS: usize = 64;

/// Optimal string alignment distance between two names, case-insensitive: the
/// Levenshtein distance (Levenshtein, V. I. (1966), "Binary codes capable of correcting
/// deletions, insertions and reversals", Soviet Physics Doklady 10(8), 707-710) with
/// adjacent transpositions counted as one edit (Damerau, F. J. (1964), "A technique for
/// computer detection and correction of spelling errors", Comm. ACM 7(3), 171-176), on at
/// most the first 64 characters of each.
pub fn edit_distance(a: &str, b: &str) -> usize {
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
    let mut rows = vec![vec![0usize; b.len() + 1]; a.len() + 1];
    for (i, row) in rows.iter_mut().enumerate() {
        row[0] = i;
    }
    for (j, cell) in rows[0].iter_mut().enumerate() {
        *cell = j;
    }
    for i in 1..=a.len() {
        for j in 1..=b.len() {
            let cost = usize::from(a[i - 1] != b[j - 1]);
            let mut best = (rows[i - 1][j] + 1)
                .min(rows[i][j - 1] + 1)
                .min(rows[i - 1][j - 1] + cost);
            if i > 1 && j > 1 && a[i - 1] == b[j - 2] && a[i - 2] == b[j - 1] {
                best = best.min(rows[i - 2][j - 2] + 1);
            }
            rows[i][j] = best;
        }
    }
    rows[a.len()][b.len()]
}

/// The candidates nearest to `input`, best first (ties keep the candidates' order), at
/// most `limit` of them, none farther than `max_distance`.
pub fn nearest_within<'a>(
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

/// Up to three candidates close to `name`, best first. A candidate counts as close when
/// its distance is at most a third of the longer name (at least 2), or when one name
/// contains the other.
pub fn nearest<'a, I>(name: &str, candidates: I) -> Vec<String>
where
    I: IntoIterator<Item = &'a str>,
{
    let lower = name.to_lowercase();
    let mut scored: Vec<(usize, String)> = candidates
        .into_iter()
        .filter_map(|c| {
            let d = edit_distance(name, c);
            let limit = (name.chars().count().max(c.chars().count()) / 3).max(2);
            let cl = c.to_lowercase();
            let contains =
                !lower.is_empty() && (cl.contains(&lower) || lower.contains(&cl)) && cl.len() > 1;
            (d <= limit || contains).then(|| (d, c.to_string()))
        })
        .collect();
    scored.sort();
    scored.dedup_by(|a, b| a.1 == b.1);
    scored.into_iter().take(3).map(|(_, c)| c).collect()
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn distance_counts_edits_and_transpositions() {
        assert_eq!(edit_distance("kitten", "sitting"), 3); // Levenshtein textbook example
        assert_eq!(edit_distance("gmp", "gpm"), 1); // one transposition
        assert_eq!(edit_distance("", "abc"), 3);
        assert_eq!(edit_distance("Gate", "gate"), 0);
    }

    #[test]
    fn suggests_close_names() {
        let c = ["elbow_90_long", "elbow_90_standard", "gate_valve"];
        assert_eq!(nearest("elbow_90_lng", c)[0], "elbow_90_long");
        assert!(nearest("zzzzzz", c).is_empty());
        let names = ["elbow_90_long", "elbow_45_long", "gate_valve"];
        assert_eq!(
            nearest_within("elbow_90_lng", names, 2, 5),
            vec!["elbow_90_long", "elbow_45_long"]
        );
        assert!(nearest_within("zzzzzzzzzzzzzzzzz", names, 3, 3).is_empty());
    }
}
