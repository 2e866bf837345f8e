//! Graph checks before a solve: valid link ends, size caps, and that every node reaches
//! a fixed-head node (otherwise its head is undetermined and the matrix singular).

use super::{Network, NetworkError, MAX_ELEMENTS};

/// Most node names a disconnected-part error lists.
const MAX_NAMED: usize = 5;

/// Check a network's graph; `Ok` when every node reaches a fixed-head node.
pub fn check(net: &Network) -> Result<(), NetworkError> {
    if net.nodes.len() > MAX_ELEMENTS || net.links.len() > MAX_ELEMENTS {
        return Err(NetworkError::TooLarge(format!(
            "the network has {} nodes and {} links; at most {MAX_ELEMENTS} of each are solved",
            net.nodes.len(),
            net.links.len()
        )));
    }
    let n = net.nodes.len();
    let mut adjacency = vec![Vec::new(); n];
    for l in &net.links {
        if l.from >= n || l.to >= n {
            return Err(NetworkError::BadLink(format!(
                "link `{}` names a node that does not exist",
                l.name
            )));
        }
        if l.from == l.to {
            return Err(NetworkError::BadLink(format!(
                "link `{}` starts and ends at the same node `{}`",
                l.name, net.nodes[l.from].name
            )));
        }
        adjacency[l.from].push(l.to);
        adjacency[l.to].push(l.from);
    }
    let mut reached = vec![false; n];
    let mut stack: Vec<usize> = (0..n).filter(|&i| net.fixed_head(i).is_some()).collect();
    for &i in &stack {
        reached[i] = true;
    }
    while let Some(i) = stack.pop() {
        for &j in &adjacency[i] {
            if !reached[j] {
                reached[j] = true;
                stack.push(j);
            }
        }
    }
    let lost: Vec<String> = (0..n)
        .filter(|&i| !reached[i])
        .take(MAX_NAMED)
        .map(|i| net.nodes[i].name.clone())
        .collect();
    if lost.is_empty() {
        Ok(())
    } else {
        Err(NetworkError::Disconnected { nodes: lost })
    }
}

/// Independent loops of the network as lists of (link, +1/−1 direction), one per link
/// outside a spanning forest (fundamental cycles), for conservation checks.
pub fn fundamental_loops(net: &Network) -> Vec<Vec<(usize, f64)>> {
    let n = net.nodes.len();
    let mut parent: Vec<Option<(usize, usize)>> = vec![None; n]; // (parent node, link)
    let mut seen = vec![false; n];
    let mut adjacency = vec![Vec::new(); n];
    for (k, l) in net.links.iter().enumerate() {
        adjacency[l.from].push((l.to, k));
        adjacency[l.to].push((l.from, k));
    }
    let mut tree = vec![false; net.links.len()];
    let mut depth = vec![0usize; n];
    for root in 0..n {
        if seen[root] {
            continue;
        }
        seen[root] = true;
        let mut queue = std::collections::VecDeque::from([root]);
        while let Some(i) = queue.pop_front() {
            for &(j, k) in &adjacency[i] {
                if !seen[j] {
                    seen[j] = true;
                    parent[j] = Some((i, k));
                    depth[j] = depth[i] + 1;
                    tree[k] = true;
                    queue.push_back(j);
                }
            }
        }
    }
    let mut loops = Vec::new();
    for (k, l) in net.links.iter().enumerate() {
        if tree[k] {
            continue;
        }
        // The loop: link k from → to, then the tree path to → … → from.
        let mut lp = vec![(k, 1.0)];
        let (mut a, mut b) = (l.to, l.from);
        let mut tail = Vec::new();
        while a != b {
            if depth[a] >= depth[b] {
                let (p, e) = parent[a].expect("a non-root node has a parent");
                lp.push((e, if net.links[e].from == a { 1.0 } else { -1.0 }));
                a = p;
            } else {
                let (p, e) = parent[b].expect("a non-root node has a parent");
                tail.push((e, if net.links[e].to == b { 1.0 } else { -1.0 }));
                b = p;
            }
        }
        lp.extend(tail.into_iter().rev());
        loops.push(lp);
    }
    loops
}
