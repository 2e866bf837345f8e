//! The fast duty path's system curve: a case's system head tabulated once on an even
//! grid of flows with its analytic slope, and read back by cubic Hermite interpolation.
//!
//! Cubic Hermite interpolation (e.g. Burden & Faires, *Numerical Analysis*, 9th ed.,
//! §3.4): on [q_k, q_k + h] with t = (q − q_k)/h,
//! H(q) ≈ h₀₀(t)·H_k + h₁₀(t)·h·H′_k + h₀₁(t)·H_{k+1} + h₁₁(t)·h·H′_{k+1}, with the Hermite
//! basis h₀₀ = 2t³ − 3t² + 1, h₁₀ = t³ − 2t² + t, h₀₁ = −2t³ + 3t², h₁₁ = t³ − t². Its error
//! is at most h⁴/384 · max|H⁗| on the interval. The dynamic part of a system head grows
//! like qᵖ with 1.75 ≤ p ≤ 2 (Colebrook, Hazen-Williams's 1.852, fittings' K: p = 2 and
//! K₁/Re: p = 1, both interpolated exactly), so on the k-th interval the relative error
//! of the dynamic head is about |p(p−1)(p−2)(p−3)|/(384 k⁴) ≤ 1e-3/k⁴.
//!
//! The table is read everywhere on [0, q_max] where its node values are finite (the
//! exact [`CaseSystem::head`] elsewhere), but is *trusted* only where the error is small:
//! - not in the first [`EXACT_INTERVALS`] intervals (k < 8: error ≤ 2.5e-7 of the dynamic
//!   head beyond), nor on an interval where some segment changes flow regime (laminar,
//!   critical zone, turbulent; the friction factor's slope jumps there) or is in the
//!   critical zone (the bridge of
//!   [`crate::hydraulics::friction::transitional_friction_factor`] bends sharply).
//!
//! [`solve_duty`] solves on the table and, when a crossing it found lies where the table
//! is not trusted, solves again on the exact curve, so every crossing either comes from
//! a trusted interval or is exact; the cheap table reads near zero flow keep Brent's
//! first steps (which often land there) cheap.
//!
//! A crossing of a pump curve with the tabulated curve then lies within about 1e-7
//! relative of the crossing with the exact curve (tests/duty_fast_path.rs checks 1e-6
//! on random systems and pump curves, drooping ones included). A network (general
//! form) is not tabulated: its head at a flow is a network solve whose link states can
//! switch between nodes.

use super::system::{friction_in, CaseSystem};
use crate::hydraulics::friction::FlowRegime;
use crate::pumps::{self, DutyOutcome, PumpScan};

/// Intervals of the table between zero and its last flow.
pub const TABLE_INTERVALS: usize = 64;
/// The first intervals, from zero flow, where the exact system head is used.
pub const EXACT_INTERVALS: usize = 8;

/// A case's system head tabulated on [0, q_max] (see the module documentation).
#[derive(Clone, Debug, PartialEq)]
pub struct SystemTable {
    /// Grid step, m³/s.
    step: f64,
    /// Last tabulated flow, m³/s.
    q_max: f64,
    /// Per node k (flow k·step): the losses (system head above the static head), m,
    /// and their slope dH/dq, s/m². The static head is not tabulated, so a copy of the
    /// system with another static head (a level band, another case's levels) reads the
    /// table unchanged ([`SharedTables`]).
    nodes: Vec<(f64, f64)>,
    /// Per interval: a node value is not finite (the exact head is read there).
    exact: Vec<bool>,
    /// Per interval: the interpolant is not trusted for a crossing (see the module docs).
    untrusted: Vec<bool>,
}

impl SystemTable {
    /// Tabulate `sys` on [0, q_max] (m³/s); `None` for a network or a bad range.
    pub fn new(sys: &CaseSystem, q_max: f64) -> Option<SystemTable> {
        if sys.network.is_some() || !(q_max.is_finite() && q_max > 0.0) {
            return None;
        }
        let step = q_max / TABLE_INTERVALS as f64;
        let mut nodes = Vec::with_capacity(TABLE_INTERVALS + 1);
        let mut regimes: Vec<Vec<FlowRegime>> = Vec::with_capacity(TABLE_INTERVALS + 1);
        for k in 0..=TABLE_INTERVALS {
            let q = q_max * k as f64 / TABLE_INTERVALS as f64;
            let (l, slope) = sys.losses_with_slope(q);
            nodes.push((l.friction + l.minor + l.network + l.drawdown, slope));
            regimes.push(
                sys.segments
                    .iter()
                    .map(|s| match s.hazen_williams_c {
                        Some(_) => FlowRegime::Turbulent,
                        None => friction_in(&sys.fluid, s, q).regime,
                    })
                    .collect(),
            );
        }
        let finite = |n: (f64, f64)| n.0.is_finite() && n.1.is_finite();
        let exact: Vec<bool> = (0..TABLE_INTERVALS)
            .map(|k| !finite(nodes[k]) || !finite(nodes[k + 1]))
            .collect();
        let critical = |r: &Vec<FlowRegime>| r.contains(&FlowRegime::Transitional);
        let untrusted = (0..TABLE_INTERVALS)
            .map(|k| {
                k < EXACT_INTERVALS
                    || exact[k]
                    || regimes[k] != regimes[k + 1]
                    || critical(&regimes[k])
                    || critical(&regimes[k + 1])
            })
            .collect();
        Some(SystemTable {
            step,
            q_max,
            nodes,
            exact,
            untrusted,
        })
    }

    /// Whether a crossing at flow q (m³/s) read from the table is trusted (see the
    /// module documentation); false outside the table.
    pub fn trusted(&self, q: f64) -> bool {
        match self.interval(q) {
            Some(k) => !self.untrusted[k],
            None => false,
        }
    }

    /// The interval holding q, when q is in the table (up to 1e-9 past its last flow,
    /// which rounding of a search's end can give).
    fn interval(&self, q: f64) -> Option<usize> {
        (q >= 0.0 && q <= self.q_max * (1.0 + 1e-9))
            .then(|| ((q / self.step) as usize).min(TABLE_INTERVALS - 1))
    }

    /// The last tabulated flow, m³/s.
    pub fn q_max(&self) -> f64 {
        self.q_max
    }

    /// System head at flow q (m³/s), m: `sys`'s static head plus the interpolated losses
    /// inside the table, the exact [`CaseSystem::head`] of `sys` (the system tabulated,
    /// or a copy with another static head) where the table is not read.
    pub fn head(&self, sys: &CaseSystem, q: f64) -> f64 {
        let Some(k) = self.interval(q).filter(|&k| !self.exact[k]) else {
            return sys.head(q);
        };
        let ((h0, d0), (h1, d1)) = (self.nodes[k], self.nodes[k + 1]);
        let t = (q - k as f64 * self.step) / self.step;
        let (t2, t3) = (t * t, t * t * t);
        sys.static_head
            + (2.0 * t3 - 3.0 * t2 + 1.0) * h0
            + (t3 - 2.0 * t2 + t) * self.step * d0
            + (-2.0 * t3 + 3.0 * t2) * h1
            + (t3 - t2) * self.step * d1
    }
}

/// What a chain's losses at a flow depend on, as the bits of the numbers: the fluid's
/// density and viscosity, every segment's side, geometry, roughness or C and K sums,
/// and the source well's drawdown law; not the levels or surface pressures. Two case
/// systems with equal keys have bit-identical [`CaseSystem::losses`] at every flow
/// (the same operations on the same numbers), so they can share a [`SystemTable`].
/// `None` for a network (not tabulated).
#[derive(Clone, Debug, PartialEq, Eq)]
pub struct LossKey(Vec<u64>);

impl LossKey {
    /// The key of `sys`.
    pub fn of(sys: &CaseSystem) -> Option<LossKey> {
        if sys.network.is_some() {
            return None;
        }
        let mut bits = vec![sys.fluid.density.to_bits(), sys.fluid.viscosity.to_bits()];
        if let Some(w) = sys.well {
            bits.extend([w.drawdown, w.test_flow, w.well_loss].map(f64::to_bits));
        }
        for s in sys.segments.iter() {
            bits.push(
                u64::from(s.per_pump) | (u64::from(s.side == crate::model::Side::Suction) << 1),
            );
            bits.extend(
                [
                    s.length,
                    s.inner_diameter,
                    s.area,
                    s.roughness,
                    s.hazen_williams_c.unwrap_or(f64::NAN),
                    s.k_constant,
                    s.k_laminar_sum,
                    s.k_fixed_sum,
                    s.equivalent_length,
                ]
                .map(f64::to_bits),
            );
        }
        Some(LossKey(bits))
    }
}

/// The system tables of an analysis's cases, shared between cases whose losses are
/// the same ([`LossKey`]) and whose tables reach the same flow: an hourly design of
/// thousands of cases that differ only in levels tabulates its pipes once
/// ([`super::shared`]).
#[derive(Debug, Default)]
pub struct SharedTables(super::shared::Kept<(LossKey, u64), SystemTable>);

impl SharedTables {
    /// The table of `sys` on [0, q_max] (m³/s), built or reused; `None` where
    /// [`SystemTable::new`] gives none.
    pub fn table(&self, sys: &CaseSystem, q_max: f64) -> Option<std::sync::Arc<SystemTable>> {
        let build = || SystemTable::new(sys, q_max).map(std::sync::Arc::new);
        match LossKey::of(sys) {
            Some(key) => self.0.get_or((key, q_max.to_bits()), build),
            None => build(),
        }
    }
}

/// The analysis's duty solve (the fast path): [`pumps::solve_duty_scanned`] on the
/// case's table when it has one, again on the exact system curve when a crossing lies
/// where the table is not trusted ([`SystemTable::trusted`]); the exact solve for a
/// network. `scan` is the pump's grid scan ([`PumpScan`]), taken here when not given.
pub fn solve_duty(
    pump_head: &dyn Fn(f64) -> f64,
    sys: &CaseSystem,
    q_end: f64,
    scan: Option<&PumpScan>,
) -> DutyOutcome {
    let owned;
    let scan = match scan {
        Some(s) => s,
        None => {
            owned = PumpScan::new(pump_head, q_end);
            &owned
        }
    };
    let exact = |q: f64| sys.head(q);
    let Some(table) = &sys.duty_table else {
        return pumps::solve_duty_scanned(pump_head, &exact, q_end, scan);
    };
    let fast = pumps::solve_duty_scanned(pump_head, &|q| table.head(sys, q), q_end, scan);
    let trusted = match &fast {
        DutyOutcome::Point { all_flows, .. } => all_flows.iter().all(|&q| table.trusted(q)),
        _ => true,
    };
    if trusted {
        fast
    } else {
        pumps::solve_duty_scanned(pump_head, &exact, q_end, scan)
    }
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::{check, NoFiles};

    fn demo_system() -> CaseSystem {
        let src = include_str!("../../examples-demo/orchard-lift-rev-a.duty");
        let design = check(src, &NoFiles).design.expect("the demo checks");
        CaseSystem::new(&design.cases[0].scenario).expect("system")
    }

    #[test]
    fn nodes_are_the_exact_head_and_between_them_within_the_bound() {
        let sys = demo_system();
        let table = SystemTable::new(&sys, 0.1).expect("a chain is tabulated");
        for i in 0..=1000 {
            let q = 0.1 * i as f64 / 1000.0;
            if !table.trusted(q) {
                continue;
            }
            let (exact, fast) = (sys.head(q), table.head(&sys, q));
            let dynamic = (exact - sys.static_head).max(1e-12);
            // The module's bound, 1e-3/k⁴ of the dynamic head on interval k (2.5e-7 at 8).
            assert!(
                (fast - exact).abs() <= 2.5e-7 * dynamic,
                "q {q}: {fast} vs {exact}"
            );
        }
        let q = 0.1 * 20.0 / 64.0;
        assert!((table.head(&sys, q) / sys.head(q) - 1.0).abs() < 1e-12);
    }

    #[test]
    fn bad_ranges_are_not_tabulated() {
        let sys = demo_system();
        assert!(SystemTable::new(&sys, 0.0).is_none());
        assert!(SystemTable::new(&sys, f64::NAN).is_none());
    }
}
