//! Staging of a parallel set: how many pumps run at a load point.
//!
//! Rule (`staging = least_power`): among the counts k = 1..n that deliver the point,
//! those whose per-pump flow lies within the allowable operating region (and above the
//! minimum continuous flow) are preferred; of these the one with the least input power
//! runs. When no count keeps the pumps in the region, the least-power count that
//! delivers runs and the profile checks say so. `staging = all_running` runs every duty
//! pump. Every count is evaluated (n ≤ 20), so the choice is exact, not a heuristic.

use super::point::SetState;
use crate::message::Message;
use crate::model::operation::Staging;

/// What one count gives at a point: its state and the power the choice compares
/// (mean input power over the hours: the running power × the share of time running).
pub type Outcome = Result<(SetState, f64), Message>;

/// The count chosen, with every count's outcome (for the audit trail).
#[derive(Clone, Debug)]
pub struct Choice {
    /// The chosen state and its mean input power (W), or why no count delivers.
    pub chosen: Result<(SetState, f64), Message>,
    /// Per count k = 1..n: mean input power (W) or why that count does not deliver.
    pub by_count: Vec<(u32, Result<f64, Message>)>,
}

/// Choose the running count among 1..=`n` by `staging`; `eval(k)` gives count k's
/// outcome and `in_region` says whether a state keeps the pumps in the allowable region.
pub fn choose(
    n: u32,
    staging: Staging,
    eval: impl Fn(u32) -> Outcome,
    in_region: impl Fn(&SetState) -> bool,
) -> Choice {
    let n = n.clamp(1, 20);
    let counts: Vec<u32> = match staging {
        Staging::LeastPower => (1..=n).collect(),
        Staging::AllRunning => vec![n],
    };
    let outcomes: Vec<(u32, Outcome)> = counts.iter().map(|&k| (k, eval(k))).collect();
    let least = |region: bool| {
        outcomes
            .iter()
            .filter_map(|(_, o)| o.as_ref().ok())
            .filter(|(s, _)| !region || in_region(s))
            .min_by(|a, b| a.1.total_cmp(&b.1))
            .cloned()
    };
    let chosen = match least(true).or_else(|| least(false)) {
        Some(c) => Ok(c),
        None => Err(outcomes
            .last()
            .and_then(|(_, o)| o.as_ref().err().cloned())
            .unwrap_or_else(|| Message::text("no count of pumps delivers this flow"))),
    };
    Choice {
        chosen,
        by_count: outcomes
            .into_iter()
            .map(|(k, o)| (k, o.map(|(_, w)| w)))
            .collect(),
    }
}

/// A flow where the chosen count changes.
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct Switch {
    /// Flow where the count changes, m³/s (midpoint of the last bracket).
    pub flow: f64,
    /// Count below and above this flow.
    pub from: u32,
    /// Count above this flow.
    pub to: u32,
    /// Half the last bracket: the switching flow is known to ± this, m³/s.
    pub resolution: f64,
}

/// Switching points between the load points' flows (m³/s, any order): where two
/// neighbouring flows run different counts, the change is bracketed by `bisections`
/// halvings (at most 30); `running(q)` is the count chosen at q (`None` where nothing
/// delivers). Cost: one evaluation per flow plus `bisections` per change.
pub fn switching_points(
    flows: &[f64],
    bisections: usize,
    running: impl Fn(f64) -> Option<u32>,
) -> Vec<Switch> {
    let known: Vec<(f64, Option<u32>)> = flows.iter().map(|&q| (q, None)).collect();
    switching_points_from(&known, bisections, running)
}

/// [`switching_points`] where the count at some flows is already known: each pair is a
/// flow (m³/s) and its count when known (`None`: `running` is asked, as for a flow that
/// nothing delivers, which asks again and gets `None` once more). The brackets, and so
/// the switching points, are those of [`switching_points`] over the same flows.
pub fn switching_points_from(
    flows: &[(f64, Option<u32>)],
    bisections: usize,
    running: impl Fn(f64) -> Option<u32>,
) -> Vec<Switch> {
    let mut qs: Vec<(f64, Option<u32>)> = flows
        .iter()
        .copied()
        .filter(|(q, _)| q.is_finite() && *q >= 0.0)
        .collect();
    qs.sort_by(|a, b| a.0.total_cmp(&b.0));
    qs.dedup_by(|b, a| a.0 == b.0);
    let known: Vec<(f64, u32)> = qs
        .iter()
        .filter_map(|&(q, k)| k.or_else(|| running(q)).map(|k| (q, k)))
        .collect();
    let mut out = Vec::new();
    for w in known.windows(2) {
        let ((mut lo, k0), (mut hi, k1)) = (w[0], w[1]);
        if k0 == k1 || out.len() >= 40 {
            continue;
        }
        for _ in 0..bisections.min(30) {
            let mid = 0.5 * (lo + hi);
            match running(mid) {
                Some(k) if k == k0 => lo = mid,
                Some(k) if k == k1 => hi = mid,
                _ => break,
            }
        }
        out.push(Switch {
            flow: 0.5 * (lo + hi),
            from: k0,
            to: k1,
            resolution: 0.5 * (hi - lo),
        });
    }
    out
}
