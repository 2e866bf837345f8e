//! A design as a tree of named values, and the difference of two such trees.
//!
//! Children are matched by key, so their order never matters; order-sensitive
//! collections (segments of a line, points of a curve) put their position in the
//! key ("segment 2"). Two children with the same key (the same fitting listed
//! twice) are told apart by their content: they are sorted by it and numbered
//! (`fitting gate_valve #2`), so listing them in another order changes nothing.

use super::InputChange;

/// One named value of a design.
#[derive(Clone, Debug, PartialEq)]
pub struct Node {
    /// What matches this node with its counterpart in the other design.
    pub key: String,
    /// How the node appears in a change's path.
    pub label: String,
    /// Its value or its parts.
    pub value: Value,
}

/// What a node holds.
#[derive(Clone, Debug, PartialEq)]
pub enum Value {
    /// A value as printed in report units.
    Leaf(String),
    /// A named part with its own values; `summary` describes it when it is added or
    /// removed, unless it is `itemised`: then each of its values is reported on its own.
    Group {
        /// How the part reads when added or removed.
        summary: String,
        /// Its values and sub-parts.
        children: Vec<Node>,
        /// Report each child on its own when added or removed.
        itemised: bool,
    },
}

impl Node {
    /// A value, keyed by its label.
    pub fn leaf(label: impl Into<String>, value: impl Into<String>) -> Node {
        let label = label.into();
        Node {
            key: label.clone(),
            label,
            value: Value::Leaf(value.into()),
        }
    }

    /// A part, keyed by its label.
    pub fn group(
        label: impl Into<String>,
        summary: impl Into<String>,
        children: Vec<Node>,
    ) -> Node {
        let label = label.into();
        Node {
            key: label.clone(),
            label,
            value: Value::Group {
                summary: summary.into(),
                children,
                itemised: false,
            },
        }
    }

    /// The same node matched by another key (the label stays as shown).
    pub fn keyed(mut self, key: impl Into<String>) -> Node {
        self.key = key.into();
        self
    }

    /// The text shown when the node is added or removed.
    pub fn describe(&self) -> String {
        match &self.value {
            Value::Leaf(v) => v.clone(),
            Value::Group { summary, .. } => summary.clone(),
        }
    }

    /// Everything the node holds, as one text (to order duplicates).
    fn content(&self) -> String {
        match &self.value {
            Value::Leaf(v) => v.clone(),
            Value::Group {
                summary, children, ..
            } => {
                let inner: Vec<String> = children
                    .iter()
                    .map(|c| format!("{}={}", c.key, c.content()))
                    .collect();
                format!("{summary}{{{}}}", inner.join(";"))
            }
        }
    }
}

/// Nodes with unique keys: duplicates sorted by content and numbered `#2`, `#3`, ...
pub fn unique(nodes: &[Node]) -> Vec<Node> {
    let mut order: Vec<&str> = Vec::new();
    for n in nodes {
        if !order.contains(&n.key.as_str()) {
            order.push(&n.key);
        }
    }
    let mut out = Vec::new();
    for key in order {
        let mut same: Vec<&Node> = nodes.iter().filter(|n| n.key == key).collect();
        if same.len() > 1 {
            same.sort_by_cached_key(|n| n.content());
        }
        for (i, n) in same.into_iter().enumerate() {
            let mut n = n.clone();
            if i > 0 {
                n.key = format!("{} #{}", n.key, i + 1);
                n.label = format!("{} #{}", n.label, i + 1);
            }
            out.push(n);
        }
    }
    out
}

/// Both lists with unique keys, numbered so that duplicates correspond: of the
/// nodes sharing a key, those with equal content on both sides are matched first,
/// the rest in order of content; what is left over is added or removed.
pub fn pair_up(old: &[Node], new: &[Node]) -> (Vec<Node>, Vec<Node>) {
    let (mut old, mut new) = (old.to_vec(), new.to_vec());
    let mut keys: Vec<String> = Vec::new();
    for n in old.iter().chain(new.iter()) {
        if !keys.contains(&n.key) {
            keys.push(n.key.clone());
        }
    }
    for key in keys {
        let sorted = |list: &[Node]| {
            let mut idx: Vec<usize> = (0..list.len()).filter(|&i| list[i].key == key).collect();
            idx.sort_by_cached_key(|&i| list[i].content());
            idx
        };
        let (a, b) = (sorted(&old), sorted(&new));
        if a.len() <= 1 && b.len() <= 1 {
            continue;
        }
        // Equal content first, then the rest in order.
        let mut b_left: Vec<usize> = b.clone();
        let mut pairs: Vec<(Option<usize>, Option<usize>)> = Vec::new();
        let mut a_left = Vec::new();
        for &i in &a {
            match b_left
                .iter()
                .position(|&j| new[j].content() == old[i].content())
            {
                Some(k) => pairs.push((Some(i), Some(b_left.remove(k)))),
                None => a_left.push(i),
            }
        }
        for k in 0..a_left.len().max(b_left.len()) {
            pairs.push((a_left.get(k).copied(), b_left.get(k).copied()));
        }
        for (n, (i, j)) in pairs.into_iter().enumerate() {
            let number = |node: &mut Node| {
                if n > 0 {
                    node.key = format!("{} #{}", node.key, n + 1);
                    node.label = format!("{} #{}", node.label, n + 1);
                }
            };
            if let Some(i) = i {
                number(&mut old[i]);
            }
            if let Some(j) = j {
                number(&mut new[j]);
            }
        }
    }
    (old, new)
}

/// The changes from `old` to `new` under `path`, in file order: the new design's
/// order, with each removed node where it stood in the old design.
pub fn diff_nodes(old: &[Node], new: &[Node], path: &[String], out: &mut Vec<InputChange>) {
    let (old, new) = pair_up(old, new);
    let at = |label: &str| {
        let mut p = path.to_vec();
        p.push(label.to_string());
        p
    };
    let removed = |o: &Node| whole(o, path, true);
    // Old nodes not yet reported, in old order.
    let mut pending = 0;
    let matched: Vec<bool> = old
        .iter()
        .map(|o| new.iter().any(|n| n.key == o.key))
        .collect();
    let old_index = |n: &Node| old.iter().position(|o| o.key == n.key);
    for (i, n) in new.iter().enumerate() {
        let Some(j) = old_index(n) else {
            // Removals in the same gap come first: a replacement reads "removed, added".
            let gap_end = new[i + 1..].iter().find_map(old_index).unwrap_or(old.len());
            while pending < gap_end {
                if !matched[pending] {
                    out.extend(removed(&old[pending]));
                }
                pending += 1;
            }
            out.extend(whole(n, path, false));
            continue;
        };
        while pending < j {
            if !matched[pending] {
                out.extend(removed(&old[pending]));
            }
            pending += 1;
        }
        pending = pending.max(j + 1);
        let o = &old[j];
        match (&o.value, &n.value) {
            (Value::Leaf(a), Value::Leaf(b)) => {
                if a != b {
                    out.push(InputChange {
                        path: at(&n.label),
                        before: Some(a.clone()),
                        after: Some(b.clone()),
                    });
                }
            }
            (Value::Group { children: a, .. }, Value::Group { children: b, .. }) => {
                diff_nodes(a, b, &at(&n.label), out);
            }
            _ => out.push(InputChange {
                path: at(&n.label),
                before: Some(o.describe()),
                after: Some(n.describe()),
            }),
        }
    }
    for (o, m) in old.iter().zip(&matched).skip(pending) {
        if !m {
            out.extend(removed(o));
        }
    }
}

/// A node added (or `removed`) as a whole: one change, or one per value when itemised.
fn whole(n: &Node, path: &[String], removed: bool) -> Vec<InputChange> {
    let mut p = path.to_vec();
    p.push(n.label.clone());
    match &n.value {
        Value::Group {
            children,
            itemised: true,
            ..
        } => children
            .iter()
            .flat_map(|c| whole(c, &p, removed))
            .collect(),
        _ => {
            let text = Some(n.describe());
            let (before, after) = if removed { (text, None) } else { (None, text) };
            vec![InputChange {
                path: p,
                before,
                after,
            }]
        }
    }
}

/// Every leaf under `nodes` with its path of keys and of labels.
pub fn leaves(nodes: &[Node]) -> Vec<(Vec<String>, Vec<String>, String)> {
    let mut out = Vec::new();
    walk(&unique(nodes), &mut Vec::new(), &mut Vec::new(), &mut out);
    out
}

fn walk(
    nodes: &[Node],
    keys: &mut Vec<String>,
    labels: &mut Vec<String>,
    out: &mut Vec<(Vec<String>, Vec<String>, String)>,
) {
    for n in nodes {
        keys.push(n.key.clone());
        labels.push(n.label.clone());
        match &n.value {
            Value::Leaf(v) => out.push((keys.clone(), labels.clone(), v.clone())),
            Value::Group { children, .. } => walk(&unique(children), keys, labels, out),
        }
        keys.pop();
        labels.pop();
    }
}

/// Rebuild a tree from leaves (paths of keys and labels). Each group's summary
/// lists its leaves as `label = value`.
pub fn from_leaves(leaves: &[(Vec<String>, Vec<String>, String)]) -> Vec<Node> {
    let mut out: Vec<Node> = Vec::new();
    for (keys, labels, value) in leaves {
        insert(&mut out, keys, labels, value);
    }
    for n in &mut out {
        summarise(n);
    }
    out
}

fn insert(nodes: &mut Vec<Node>, keys: &[String], labels: &[String], value: &str) {
    let (Some(key), Some(label)) = (keys.first(), labels.first()) else {
        return;
    };
    if keys.len() == 1 {
        nodes.push(Node::leaf(label.clone(), value).keyed(key.clone()));
        return;
    }
    let idx = match nodes.iter().position(|n| &n.key == key) {
        Some(i) => i,
        None => {
            let mut group = Node::group(label.clone(), "", Vec::new()).keyed(key.clone());
            if let Value::Group { itemised, .. } = &mut group.value {
                *itemised = true;
            }
            nodes.push(group);
            nodes.len() - 1
        }
    };
    if let Value::Group { children, .. } = &mut nodes[idx].value {
        insert(children, &keys[1..], &labels[1..], value);
    }
}

fn summarise(n: &mut Node) {
    if let Value::Group {
        summary, children, ..
    } = &mut n.value
    {
        for c in children.iter_mut() {
            summarise(c);
        }
        let parts: Vec<String> = children
            .iter()
            .map(|c| match &c.value {
                Value::Leaf(v) => format!("{} = {v}", c.label),
                Value::Group { summary, .. } => format!("{} {summary}", c.label),
            })
            .collect();
        *summary = parts.join(", ");
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    fn change(path: &[&str], before: Option<&str>, after: Option<&str>) -> InputChange {
        InputChange {
            path: path.iter().map(|s| s.to_string()).collect(),
            before: before.map(str::to_string),
            after: after.map(str::to_string),
        }
    }

    #[test]
    fn matches_by_key_in_any_order() {
        let a = vec![Node::leaf("x", "1"), Node::leaf("y", "2")];
        let b = vec![Node::leaf("y", "2"), Node::leaf("x", "1")];
        let mut out = Vec::new();
        diff_nodes(&a, &b, &[], &mut out);
        assert!(out.is_empty());
    }

    #[test]
    fn reports_changes_removals_and_additions() {
        let a = vec![
            Node::group("g", "G", vec![Node::leaf("x", "1")]),
            Node::leaf("gone", "old"),
        ];
        let b = vec![
            Node::group("g", "G", vec![Node::leaf("x", "2")]),
            Node::leaf("new", "fresh"),
        ];
        let mut out = Vec::new();
        diff_nodes(&a, &b, &[], &mut out);
        assert_eq!(
            out,
            vec![
                change(&["g", "x"], Some("1"), Some("2")),
                change(&["gone"], Some("old"), None),
                change(&["new"], None, Some("fresh")),
            ]
        );
    }

    #[test]
    fn removed_nodes_keep_their_place() {
        let a = vec![
            Node::leaf("a", "1"),
            Node::leaf("b", "2"),
            Node::leaf("c", "3"),
        ];
        let b = vec![Node::leaf("a", "1"), Node::leaf("c", "4")];
        let mut out = Vec::new();
        diff_nodes(&a, &b, &[], &mut out);
        assert_eq!(
            out,
            vec![
                change(&["b"], Some("2"), None),
                change(&["c"], Some("3"), Some("4")),
            ]
        );
    }

    #[test]
    fn duplicates_are_matched_by_content() {
        let a = vec![Node::leaf("f", "2"), Node::leaf("f", "1")];
        let b = vec![Node::leaf("f", "1"), Node::leaf("f", "3")];
        let mut out = Vec::new();
        diff_nodes(&a, &b, &[], &mut out);
        assert_eq!(out, vec![change(&["f #2"], Some("2"), Some("3"))]);
        // Removing one of three duplicates is one change, wherever it stood.
        let a = vec![
            Node::leaf("f", "6"),
            Node::leaf("f", "4"),
            Node::leaf("f", "1"),
        ];
        let b = vec![Node::leaf("f", "6"), Node::leaf("f", "4")];
        let mut out = Vec::new();
        diff_nodes(&a, &b, &[], &mut out);
        assert_eq!(out.len(), 1);
        assert_eq!(out[0].before.as_deref(), Some("1"));
        assert_eq!(out[0].after, None);
    }

    #[test]
    fn leaves_round_trip() {
        let tree = vec![Node::group(
            "tank a",
            "",
            vec![
                Node::leaf("level", "1 m"),
                Node::leaf("pressure", "0 kPa(g)"),
            ],
        )];
        let rebuilt = from_leaves(&leaves(&tree));
        assert_eq!(rebuilt[0].describe(), "level = 1 m, pressure = 0 kPa(g)");
        assert_eq!(leaves(&rebuilt), leaves(&tree));
    }
}
