//! The head-loss law of each kind of link: h(Q) = H(from) − H(to), m, for a flow Q
//! (m³/s, positive from → to), with its slope dh/dQ (s/m²) for the gradient solve.
//!
//! - **Pipe runs**: the segments' own hydraulics ([`crate::analysis::system`]):
//!   Darcy-Weisbach with the Colebrook friction factor (laminar 64/Re below Re 2000)
//!   or Hazen-Williams, fittings by their K methods at the segment's Reynolds number.
//! - **Pump sets**: a head gain, h = −n_s·H_pump(Q/n_p) for n_p pumps running in
//!   parallel and n_s in series (the arrangement laws; e.g. Karassik et al., *Pump
//!   Handbook*, 4th ed., 2008, §2.3), the curve already at its speed and trim.
//! - **Equipment**: a drop Δp_r stated at a rated flow Q_r, h = Δp_r/(ρg)·(|Q|/Q_r)ⁿ,
//!   n = 2 unless stated (turbulent flow through fixed passages, common practice).
//! - **Valves by flow coefficient**: Δp = (ρ/ρ₀)·(Q/Kv)² with Δp in bar and Q in m³/h,
//!   ρ₀ = 1000 kg/m³ (IEC 60534-2-1:2011, eq. 1 for non-choked incompressible flow with
//!   N₁ = 1, from memory); Cv (US gal/min at 1 psi) = 1.156·Kv (common practice; the
//!   exact factor from NIST SP 811 units is 1.1561); inherent characteristics of
//!   IEC 60534-1 (from memory): linear Kv = x·Kvs and equal percentage Kv = Kvs·R^(x−1).
//! - **Well drawdown**: from a well's static level to its pumping level,
//!   s = B·Q + C·Q² (Jacob 1947, "Drawdown test to determine effective radius of
//!   artesian well", Trans. ASCE 112), continued as an odd law for reverse flow
//!   (a recharging well, outside the method's scope, is only kept solvable).
//!
//! **Zero flow.** Laws that are flat at Q = 0 (quadratic drops) are continued linearly
//! below [`REGULAR_FLOW`] (the chord through the law's value there), so the slope never
//! vanishes and the gradient solve's matrix stays definite; a pipe keeps its laminar
//! slope. Pump curves are continued with their end slopes beyond the published range and
//! with a floor on the slope where they are flat.

use std::sync::Arc;

use crate::analysis::system::{segment_loss_slopes_in, FluidState, SegmentState, WellDrawdown, G};

/// Below this flow (m³/s, 1 mL/s) a quadratic law is continued by its chord (numerical
/// regularisation; the flows of interest are far larger).
pub const REGULAR_FLOW: f64 = 1e-6;
/// Smallest slope dh/dQ used by the solve, s/m² (a pump's flat shut-off, a closed link).
pub const MIN_SLOPE: f64 = 1e-3;
/// Density of the reference water of the Kv definition, kg/m³ (IEC 60534-2-1, from memory).
pub const KV_REFERENCE_DENSITY: f64 = 1000.0;
/// Cv per Kv: US gal/min at 1 psi per m³/h at 1 bar (common practice, 1.156).
pub const CV_PER_KV: f64 = 1.156;
/// Default rangeability of an equal-percentage trim (common practice, 50).
pub const DEFAULT_RANGEABILITY: f64 = 50.0;

/// A head-against-flow curve of one pump (m against m³/s), already at its speed and
/// impeller; the solve evaluates it only inside `0..=max_flow` and continues it beyond.
pub trait HeadCurve: std::fmt::Debug + Send + Sync {
    /// Head, m, at a flow per pump, m³/s.
    fn head(&self, q: f64) -> f64;
    /// dH/dQ, s/m² (negative on a falling curve).
    fn slope(&self, q: f64) -> f64;
    /// The last published flow, m³/s.
    fn max_flow(&self) -> f64;
}

/// A pipe run: segments in series, each with its fittings.
#[derive(Clone, Debug)]
pub struct PipeRun {
    /// The segments of the run, in flow order, each with its fittings.
    pub segments: Vec<SegmentState>,
}

/// A pump set as a link.
#[derive(Clone, Debug)]
pub struct PumpSet {
    /// The head curve of one pump of the set at its speed and impeller.
    pub curve: Arc<dyn HeadCurve>,
    /// Pumps running in parallel (0: the set is stopped and the link closed).
    pub parallel: u32,
    /// Pumps in series (1 for a single or parallel set).
    pub series: u32,
}

/// An equipment item given by its drop at a rated flow.
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct Equipment {
    /// Pressure drop at the rated flow, Pa.
    pub rated_drop: f64,
    /// Rated flow, m³/s.
    pub rated_flow: f64,
    /// Exponent n of Δp ∝ Qⁿ (2 unless stated).
    pub exponent: f64,
}

/// An inherent valve characteristic.
#[derive(Clone, Copy, Debug, PartialEq)]
pub enum Characteristic {
    /// Kv = x·Kvs.
    Linear,
    /// Kv = Kvs·R^(x−1), R the rangeability.
    EqualPercentage {
        /// Rangeability R (dimensionless): Kv tends to Kvs/R as the opening nears zero.
        rangeability: f64,
    },
}

/// A valve by flow coefficient.
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct Valve {
    /// Kv of the fully open valve, m³/h at 1 bar.
    pub kvs: f64,
    /// The valve's inherent characteristic.
    pub characteristic: Characteristic,
    /// Opening, 0..=1 (0 is shut).
    pub opening: f64,
    /// A control valve (its authority is checked), not a balancing valve.
    pub control: bool,
}

impl Valve {
    /// Kv at the valve's opening, m³/h at 1 bar (0 when shut).
    pub fn kv(&self) -> f64 {
        let x = self.opening.clamp(0.0, 1.0);
        if x <= 0.0 {
            return 0.0;
        }
        match self.characteristic {
            Characteristic::Linear => x * self.kvs,
            Characteristic::EqualPercentage { rangeability } => {
                self.kvs * rangeability.powf(x - 1.0)
            }
        }
    }
}

/// What a link is.
#[derive(Clone, Debug)]
pub enum Element {
    /// A pipe run.
    Pipe(PipeRun),
    /// A pump set.
    Pump(PumpSet),
    /// An equipment item with a rated drop.
    Equipment(Equipment),
    /// A valve by flow coefficient.
    Valve(Valve),
    /// A well's drawdown from its static level to its pumping level.
    Drawdown(WellDrawdown),
}

impl Element {
    /// The word for the kind of link, as the results name it.
    pub fn kind(&self) -> &'static str {
        match self {
            Element::Pipe(_) => "pipe",
            Element::Pump(_) => "pump",
            Element::Equipment(_) => "equipment",
            Element::Valve(_) => "valve",
            Element::Drawdown(_) => "drawdown",
        }
    }

    /// True when the element passes no flow at all in this case (a stopped set, a shut valve).
    pub fn is_shut(&self) -> bool {
        match self {
            Element::Pump(p) => p.parallel == 0 || p.series == 0,
            Element::Valve(v) => v.kv() <= 0.0,
            _ => false,
        }
    }

    /// h(Q) = H(from) − H(to), m, and its slope dh/dQ, s/m², for a fluid.
    pub fn law(&self, fluid: &FluidState, q: f64) -> (f64, f64) {
        match self {
            Element::Pipe(run) => pipe_law(fluid, run, q),
            Element::Pump(set) => pump_law(set, q),
            Element::Equipment(e) => {
                let r = e.rated_drop / (fluid.density * G) / e.rated_flow.powf(e.exponent);
                power_law(r, e.exponent, q)
            }
            Element::Valve(v) => {
                // h = 1e5 Pa/bar · (3600 Q / Kv)² / (ρ₀ g): the (ρ/ρ₀) of Δp cancels ρ of h.
                let kv_si = v.kv() / 3600.0; // m³/s at 1 bar
                let r = 1e5 / (KV_REFERENCE_DENSITY * G) / (kv_si * kv_si);
                power_law(r, 2.0, q)
            }
            Element::Drawdown(w) => {
                let a = q.abs();
                (w.at(a) * q.signum(), w.slope(a).max(MIN_SLOPE))
            }
        }
    }
}

/// h = r·|Q|ⁿ·sign(Q), continued by its chord below [`REGULAR_FLOW`].
fn power_law(r: f64, n: f64, q: f64) -> (f64, f64) {
    let a = q.abs();
    if a < REGULAR_FLOW {
        let slope = r * REGULAR_FLOW.powf(n - 1.0);
        return (slope * q, slope.max(MIN_SLOPE));
    }
    let h = r * a.powf(n);
    (h * q.signum(), (n * h / a).max(MIN_SLOPE))
}

/// Loss of a pipe run at a flow (either sign), and its analytic slope
/// ([`segment_loss_slopes_in`]: Colebrook's variation of f with Re is in it), taken at
/// |Q| floored to a thousandth of [`REGULAR_FLOW`] so that it stays positive at zero flow.
fn pipe_law(fluid: &FluidState, run: &PipeRun, q: f64) -> (f64, f64) {
    let at = |a: f64| -> (f64, f64) {
        run.segments.iter().fold((0.0, 0.0), |(h, s), seg| {
            let l = segment_loss_slopes_in(fluid, seg, a);
            (h + (l.wall + l.minor), s + (l.wall_slope + l.minor_slope))
        })
    };
    let floor = REGULAR_FLOW * 1e-3;
    let (h, slope) = if q.abs() >= floor {
        at(q.abs())
    } else {
        (at(q.abs()).0, at(floor).1)
    };
    (h * q.signum(), slope.max(MIN_SLOPE))
}

/// A pump set's loss (minus its head gain) at the set's flow.
fn pump_law(set: &PumpSet, q: f64) -> (f64, f64) {
    let np = set.parallel.max(1) as f64;
    let ns = set.series.max(1) as f64;
    let per = q / np;
    let top = set.curve.max_flow();
    let (head, slope) = if per < 0.0 {
        let s = set.curve.slope(0.0).min(-MIN_SLOPE);
        (set.curve.head(0.0) + s * per, s)
    } else if per > top {
        let s = set.curve.slope(top).min(-MIN_SLOPE);
        (set.curve.head(top) + s * (per - top), s)
    } else {
        (set.curve.head(per), set.curve.slope(per).min(-MIN_SLOPE))
    };
    // d(−ns·H(Q/np))/dQ = −ns/np·H'.
    (-ns * head, (-ns / np * slope).max(MIN_SLOPE))
}

#[cfg(test)]
mod tests {
    use super::*;

    fn water() -> FluidState {
        FluidState {
            name: "water".into(),
            temperature_k: Some(293.15),
            density: 998.2,
            viscosity: 1.0e-3,
            vapor_pressure: crate::hydraulics::heads::AbsolutePressure::new(2339.0),
            source: "test".into(),
        }
    }

    #[test]
    fn a_valve_passes_its_kv_at_one_bar() {
        // Definition of Kv: m³/h of water at 1 bar (IEC 60534-1, from memory).
        let v = Valve {
            kvs: 40.0,
            characteristic: Characteristic::Linear,
            opening: 1.0,
            control: false,
        };
        let (h, _) = Element::Valve(v).law(&water(), 40.0 / 3600.0);
        let dp_bar = h * KV_REFERENCE_DENSITY * G / 1e5;
        assert!((dp_bar - 1.0).abs() < 1e-12, "{dp_bar}");
    }

    #[test]
    fn equal_percentage_gives_kvs_over_r_at_zero_plus() {
        let v = Valve {
            kvs: 50.0,
            characteristic: Characteristic::EqualPercentage { rangeability: 50.0 },
            opening: 0.5,
            control: false,
        };
        // Kv(0.5) = Kvs·R^-0.5 = 50/√50 (IEC 60534-1 equal percentage, from memory).
        assert!((v.kv() - 50.0 / 50f64.sqrt()).abs() < 1e-12);
    }

    #[test]
    fn equipment_scales_with_its_exponent() {
        let e = Equipment {
            rated_drop: 35_000.0,
            rated_flow: 0.012,
            exponent: 2.0,
        };
        let f = water();
        let (h1, _) = Element::Equipment(e).law(&f, 0.012);
        let (h2, _) = Element::Equipment(e).law(&f, 0.006);
        assert!((h1 - 35_000.0 / (f.density * G)).abs() < 1e-12);
        assert!((h2 / h1 - 0.25).abs() < 1e-12);
    }

    #[test]
    fn laws_are_odd_and_increasing_through_zero() {
        let e = Element::Equipment(Equipment {
            rated_drop: 1e4,
            rated_flow: 0.01,
            exponent: 1.8,
        });
        let f = water();
        let mut last = f64::NEG_INFINITY;
        for i in -200..=200 {
            let q = i as f64 * 1e-8;
            let (h, s) = e.law(&f, q);
            assert!(h > last && s > 0.0 && h.is_finite());
            assert!((h + e.law(&f, -q).0).abs() < 1e-18);
            last = h;
        }
    }
}
