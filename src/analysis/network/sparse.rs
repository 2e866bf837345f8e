//! Sparse symmetric positive-definite solve: a minimum-degree ordering, a symbolic
//! factorisation done once per network, and a left-looking Cholesky factorisation
//! A = L·Lᵀ done at every iteration of the gradient solve.
//!
//! Method: the minimum-degree ordering of Tinney and Walker (1967) on the
//! elimination graph (George and Liu, *Computer Solution of Large Sparse Positive
//! Definite Systems*, Prentice-Hall, 1981, ch. 5), which also yields the pattern of L;
//! the left-looking column Cholesky of George and Liu (1981, ch. 2) on that pattern.
//! Ties in the degree are broken by the lower node index, so the ordering (and the
//! rounding of every result) is deterministic.
//!
//! Cost: the ordering is O(Σ fill · log n) with the indexed heap below; a factorisation is
//! O(Σ_j |L_{:,j}|²). Pipe networks are nearly planar, so the fill stays small.

/// Largest number of unknowns a pattern accepts (a size cap for untrusted designs).
pub const MAX_UNKNOWNS: usize = 200_000;
/// Largest number of nonzeros of L accepted before the ordering gives up.
pub const MAX_FILL: usize = 20_000_000;

/// Why a sparse solve failed.
#[derive(Clone, Debug, PartialEq)]
pub enum SparseError {
    /// Too many unknowns or too much fill for the caps above.
    TooLarge,
    /// A pivot was not positive: the matrix is not positive definite; the unknown's
    /// index (in the caller's numbering) is given.
    NotPositiveDefinite(usize),
}

/// The symbolic factor: ordering and the pattern of L (columns in elimination order).
#[derive(Clone, Debug)]
pub struct Pattern {
    n: usize,
    /// `order[k]` is the caller's unknown eliminated k-th.
    order: Vec<usize>,
    /// `position[i]` is the elimination step of the caller's unknown i.
    position: Vec<usize>,
    /// Column pointers of L (strictly below the diagonal), length n + 1.
    col_start: Vec<usize>,
    /// Row indices (elimination numbering) of L below the diagonal, sorted per column.
    rows: Vec<usize>,
    /// For each row j, the columns k < j with L[j,k] ≠ 0 (ascending), and the index of
    /// that entry in `rows`, so a left-looking update needs no search: row j's are
    /// `row_cols[row_start[j]..row_start[j + 1]]`.
    row_cols: Vec<(usize, usize)>,
    /// Start of each row's entries in `row_cols`, length n + 1.
    row_start: Vec<usize>,
}

impl Pattern {
    /// Order and analyse the pattern of a symmetric matrix of size n whose off-diagonal
    /// nonzeros are the given pairs (i, j), i ≠ j (each pair once or more, either way).
    pub fn new(n: usize, pairs: &[(usize, usize)]) -> Result<Pattern, SparseError> {
        if n > MAX_UNKNOWNS {
            return Err(SparseError::TooLarge);
        }
        // Adjacency of the elimination graph: eliminating v joins its neighbours into a
        // clique. The lists are kept as sets (no order): each neighbour's list is marked
        // with a stamp, then the clique's members it lacks are appended, so one union
        // costs one pass over both lists. The degrees, and so the ordering, are those of
        // the sets alone.
        let mut adj: Vec<Vec<usize>> = vec![Vec::new(); n];
        for &(i, j) in pairs {
            if i != j && i < n && j < n {
                adj[i].push(j);
                adj[j].push(i);
            }
        }
        for a in &mut adj {
            a.sort_unstable();
            a.dedup();
        }
        let mut heap = DegreeHeap::new(adj.iter().map(Vec::len).collect());
        let mut order = Vec::with_capacity(n);
        let mut columns: Vec<Vec<usize>> = Vec::with_capacity(n);
        let mut fill = 0usize;
        // mark[x] == stamp: x is in the list being extended.
        let mut mark = vec![0usize; n];
        let mut stamp = 0usize;
        while let Some(v) = heap.pop() {
            let neighbours = std::mem::take(&mut adj[v]);
            fill += neighbours.len();
            if fill > MAX_FILL {
                return Err(SparseError::TooLarge);
            }
            for &a in &neighbours {
                stamp += 1;
                join_clique(&mut adj[a], &neighbours, v, a, &mut mark, stamp);
                heap.set(a, adj[a].len());
            }
            order.push(v);
            columns.push(neighbours);
        }
        Ok(Self::from_columns(n, order, columns))
    }

    fn from_columns(n: usize, order: Vec<usize>, columns: Vec<Vec<usize>>) -> Pattern {
        let mut position = vec![0; n];
        for (k, &v) in order.iter().enumerate() {
            position[v] = k;
        }
        let mut col_start = Vec::with_capacity(n + 1);
        let mut rows = Vec::with_capacity(columns.iter().map(Vec::len).sum());
        col_start.push(0);
        for col in &columns {
            let first = rows.len();
            rows.extend(col.iter().map(|&v| position[v]));
            rows[first..].sort_unstable();
            col_start.push(rows.len());
        }
        // Rows of L by a counting pass: columns are visited in ascending order, so each
        // row's columns come out ascending (the order of the left-looking updates).
        let mut row_start = vec![0usize; n + 1];
        for &j in &rows {
            row_start[j + 1] += 1;
        }
        for j in 0..n {
            row_start[j + 1] += row_start[j];
        }
        let mut next = row_start.clone();
        let mut row_cols = vec![(0usize, 0usize); rows.len()];
        for k in 0..n {
            for (at, &j) in rows
                .iter()
                .enumerate()
                .take(col_start[k + 1])
                .skip(col_start[k])
            {
                row_cols[next[j]] = (k, at);
                next[j] += 1;
            }
        }
        Pattern {
            n,
            order,
            position,
            col_start,
            rows,
            row_cols,
            row_start,
        }
    }

    /// Number of unknowns.
    pub fn len(&self) -> usize {
        self.n
    }

    /// True for a pattern of no unknowns.
    pub fn is_empty(&self) -> bool {
        self.n == 0
    }

    /// Nonzeros of L below the diagonal (the fill of the ordering included).
    pub fn fill(&self) -> usize {
        self.rows.len()
    }

    /// Where `A[i,j] = A[j,i]`, i ≠ j (caller's numbering), is kept, for
    /// [`Matrix::add_at`]; `None` when the pair was not given to [`Pattern::new`].
    pub fn slot(&self, i: usize, j: usize) -> Option<usize> {
        let (pi, pj) = (*self.position.get(i)?, *self.position.get(j)?);
        let (row, col) = if pi > pj { (pi, pj) } else { (pj, pi) };
        if row == col {
            return None;
        }
        let range = self.col_start[col]..self.col_start[col + 1];
        self.rows[range.clone()]
            .binary_search(&row)
            .ok()
            .map(|at| range.start + at)
    }
}

/// The nodes not yet eliminated by (degree, index), least first: a binary heap that
/// knows where each node sits, so a node's degree is changed in place (no stale
/// entries). The least (degree, index) is the node a minimum-degree step eliminates.
struct DegreeHeap {
    /// Current degree of each node.
    degree: Vec<usize>,
    /// The heap of nodes.
    heap: Vec<usize>,
    /// Where each node sits in `heap` (`usize::MAX` once popped).
    at: Vec<usize>,
}

impl DegreeHeap {
    fn new(degree: Vec<usize>) -> DegreeHeap {
        let n = degree.len();
        let mut h = DegreeHeap {
            degree,
            heap: (0..n).collect(),
            at: (0..n).collect(),
        };
        for i in (0..n / 2).rev() {
            h.down(i);
        }
        h
    }

    fn less(&self, a: usize, b: usize) -> bool {
        (self.degree[a], a) < (self.degree[b], b)
    }

    fn swap(&mut self, i: usize, j: usize) {
        self.heap.swap(i, j);
        self.at[self.heap[i]] = i;
        self.at[self.heap[j]] = j;
    }

    fn up(&mut self, mut i: usize) {
        while i > 0 {
            let parent = (i - 1) / 2;
            if !self.less(self.heap[i], self.heap[parent]) {
                break;
            }
            self.swap(i, parent);
            i = parent;
        }
    }

    fn down(&mut self, mut i: usize) {
        loop {
            let (l, r) = (2 * i + 1, 2 * i + 2);
            let mut least = i;
            if l < self.heap.len() && self.less(self.heap[l], self.heap[least]) {
                least = l;
            }
            if r < self.heap.len() && self.less(self.heap[r], self.heap[least]) {
                least = r;
            }
            if least == i {
                break;
            }
            self.swap(i, least);
            i = least;
        }
    }

    /// Remove and return the node of least (degree, index).
    fn pop(&mut self) -> Option<usize> {
        let top = *self.heap.first()?;
        let last = self.heap.len() - 1;
        self.swap(0, last);
        self.heap.pop();
        self.at[top] = usize::MAX;
        if !self.heap.is_empty() {
            self.down(0);
        }
        Some(top)
    }

    /// Set the degree of a node still in the heap.
    fn set(&mut self, v: usize, degree: usize) {
        let i = self.at[v];
        if i == usize::MAX {
            return;
        }
        let old = self.degree[v];
        self.degree[v] = degree;
        if degree < old {
            self.up(i);
        } else if degree > old {
            self.down(i);
        }
    }
}

/// `list` (the neighbours of `a`, a set) becomes `list` ∪ `clique` without `v` and `a`:
/// `v` is dropped in place, the rest is marked with `stamp`, and each member of `clique`
/// not marked is appended.
fn join_clique(
    list: &mut Vec<usize>,
    clique: &[usize],
    v: usize,
    a: usize,
    mark: &mut [usize],
    stamp: usize,
) {
    list.retain(|&x| {
        mark[x] = stamp;
        x != v
    });
    mark[a] = stamp;
    for &x in clique {
        if mark[x] != stamp {
            mark[x] = stamp;
            list.push(x);
        }
    }
}

/// A symmetric matrix on a [`Pattern`], assembled entry by entry, then factorised.
#[derive(Clone, Debug)]
pub struct Matrix<'p> {
    pattern: &'p Pattern,
    /// Diagonal, elimination numbering.
    diag: Vec<f64>,
    /// Values of L's positions: first the entries of A, then the factor in place.
    values: Vec<f64>,
}

impl<'p> Matrix<'p> {
    /// A zero matrix on the pattern.
    pub fn zeros(pattern: &'p Pattern) -> Matrix<'p> {
        Matrix {
            pattern,
            diag: vec![0.0; pattern.n],
            values: vec![0.0; pattern.rows.len()],
        }
    }

    /// Add `v` to `A[i,i]` (caller's numbering).
    pub fn add_diagonal(&mut self, i: usize, v: f64) {
        self.diag[self.pattern.position[i]] += v;
    }

    /// Add `v` to `A[i,j]` and `A[j,i]`, i ≠ j (caller's numbering); the pair must have been
    /// given to [`Pattern::new`].
    pub fn add_off_diagonal(&mut self, i: usize, j: usize, v: f64) {
        if let Some(at) = self.pattern.slot(i, j) {
            self.values[at] += v;
        }
    }

    /// Add `v` to the off-diagonal pair kept at `slot` ([`Pattern::slot`]).
    pub fn add_at(&mut self, slot: usize, v: f64) {
        self.values[slot] += v;
    }

    /// Factorise in place (left-looking Cholesky) and solve A·x = b; `b` is in the
    /// caller's numbering and so is the answer.
    pub fn solve(mut self, b: &[f64]) -> Result<Vec<f64>, SparseError> {
        self.factorise()?;
        Ok(self.substitute(b))
    }

    fn factorise(&mut self) -> Result<(), SparseError> {
        let p = self.pattern;
        let mut work = vec![0.0; p.n];
        for j in 0..p.n {
            let (start, end) = (p.col_start[j], p.col_start[j + 1]);
            for (&r, &v) in p.rows[start..end].iter().zip(&self.values[start..end]) {
                work[r] = v;
            }
            let mut d = self.diag[j];
            for &(k, at) in &p.row_cols[p.row_start[j]..p.row_start[j + 1]] {
                let ljk = self.values[at];
                d -= ljk * ljk;
                let stop = p.col_start[k + 1];
                let below = p.rows[at + 1..stop].iter().zip(&self.values[at + 1..stop]);
                for (&r, &v) in below {
                    work[r] -= v * ljk;
                }
            }
            // A pivot that is not positive, or lost to rounding against the original
            // diagonal, means the matrix is not (numerically) positive definite.
            if d.is_nan() || d <= 1e-14 * self.diag[j].abs() || !d.is_finite() {
                return Err(SparseError::NotPositiveDefinite(p.order[j]));
            }
            let ljj = d.sqrt();
            self.diag[j] = ljj;
            for idx in start..end {
                self.values[idx] = work[p.rows[idx]] / ljj;
                work[p.rows[idx]] = 0.0;
            }
        }
        Ok(())
    }

    fn substitute(&self, b: &[f64]) -> Vec<f64> {
        let p = self.pattern;
        let mut y: Vec<f64> = (0..p.n).map(|k| b[p.order[k]]).collect();
        for j in 0..p.n {
            y[j] /= self.diag[j];
            let yj = y[j];
            for idx in p.col_start[j]..p.col_start[j + 1] {
                y[p.rows[idx]] -= self.values[idx] * yj;
            }
        }
        for j in (0..p.n).rev() {
            let mut s = y[j];
            for idx in p.col_start[j]..p.col_start[j + 1] {
                s -= self.values[idx] * y[p.rows[idx]];
            }
            y[j] = s / self.diag[j];
        }
        let mut x = vec![0.0; p.n];
        for k in 0..p.n {
            x[p.order[k]] = y[k];
        }
        x
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    /// A weighted path-graph Laplacian plus a diagonal shift is SPD; check A·x = b.
    #[test]
    fn solves_a_grid_laplacian_to_rounding() {
        let (w, h) = (7, 5);
        let n = w * h;
        let mut pairs = Vec::new();
        let mut weights = Vec::new();
        for r in 0..h {
            for c in 0..w {
                let i = r * w + c;
                if c + 1 < w {
                    pairs.push((i, i + 1));
                    weights.push(1.0 + (i % 3) as f64);
                }
                if r + 1 < h {
                    pairs.push((i, i + w));
                    weights.push(0.5 + (i % 5) as f64);
                }
            }
        }
        let pattern = Pattern::new(n, &pairs).unwrap();
        let mut dense = vec![vec![0.0; n]; n];
        let mut m = Matrix::zeros(&pattern);
        for (&(i, j), &wt) in pairs.iter().zip(&weights) {
            m.add_diagonal(i, wt);
            m.add_diagonal(j, wt);
            m.add_off_diagonal(i, j, -wt);
            dense[i][i] += wt;
            dense[j][j] += wt;
            dense[i][j] -= wt;
            dense[j][i] -= wt;
        }
        m.add_diagonal(0, 2.0); // a fixed-head neighbour makes it definite
        dense[0][0] += 2.0;
        let b: Vec<f64> = (0..n).map(|i| (i as f64 * 0.37).sin()).collect();
        let x = m.solve(&b).unwrap();
        for i in 0..n {
            let ax: f64 = (0..n).map(|j| dense[i][j] * x[j]).sum();
            assert!((ax - b[i]).abs() < 1e-10, "row {i}: {ax} vs {}", b[i]);
        }
    }

    #[test]
    fn a_singular_laplacian_is_refused() {
        let pattern = Pattern::new(3, &[(0, 1), (1, 2)]).unwrap();
        let mut m = Matrix::zeros(&pattern);
        for (i, j) in [(0, 1), (1, 2)] {
            m.add_diagonal(i, 1.0);
            m.add_diagonal(j, 1.0);
            m.add_off_diagonal(i, j, -1.0);
        }
        assert!(matches!(
            m.solve(&[1.0, 0.0, -1.0]),
            Err(SparseError::NotPositiveDefinite(_))
        ));
    }

    #[test]
    fn a_tree_orders_without_fill() {
        // A star: minimum degree eliminates the leaves first, so L has no fill.
        let pairs: Vec<(usize, usize)> = (1..50).map(|i| (0, i)).collect();
        let p = Pattern::new(50, &pairs).unwrap();
        assert_eq!(p.fill(), 49);
    }
}
