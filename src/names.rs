//! Nearest-name suggestions for diagnostics ("did you mean `elbow_90_long`?").

/// Edit distance (Levenshtein) between two strings, case-insensitive.
pub fn edit_distance(a: &str, b: &str) -> usize {
    let a: Vec<char> = a.to_lowercase().chars().collect();
    let b: Vec<char> = b.to_lowercase().chars().collect();
    let mut prev: Vec<usize> = (0..=b.len()).collect();
    let mut cur = vec![0; b.len() + 1];
    for (i, ca) in a.iter().enumerate() {
        cur[0] = i + 1;
        for (j, cb) in b.iter().enumerate() {
            let cost = usize::from(ca != cb);
            cur[j + 1] = (prev[j] + cost).min(prev[j + 1] + 1).min(cur[j] + 1);
        }
        std::mem::swap(&mut prev, &mut cur);
    }
    prev[b.len()]
}

/// Up to three candidates close to `name`, best first. A candidate counts as
/// close when its distance is at most a third of the longer name (at least 2),
/// or when one name contains the other.
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
    fn suggests_close_names() {
        assert_eq!(edit_distance("kitten", "sitting"), 3);
        let c = ["elbow_90_long", "elbow_90_standard", "gate_valve"];
        assert_eq!(nearest("elbow_90_lng", c)[0], "elbow_90_long");
        assert!(nearest("zzzzzz", c).is_empty());
    }
}
