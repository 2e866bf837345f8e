//! One candidate's curve moved within its test tolerance ([`Shift`]), as installed (the
//! nominal duty's speed and impeller, the arrangement's pumps), and its duty on a system.

use crate::analysis::duty::{arrangement_power, SEARCH_BEYOND_CURVE};
use crate::analysis::system::CaseSystem;
use crate::pumps::tolerance::Shift;
use crate::pumps::{self, PumpScan, ScaledPump};

/// The arrangement on a shifted curve.
pub struct Shifted<'a> {
    /// The pump at the nominal duty's speed and impeller.
    pub scaled: &'a ScaledPump<'a>,
    /// Where within its tolerance.
    pub shift: Shift,
    /// Pumps in parallel.
    pub parallel: f64,
    /// Pumps in series.
    pub series: f64,
}

/// The duty on one system: total flow m³/s and head m, per-pump flow m³/s.
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct ShiftedDuty {
    /// Total flow, m³/s.
    pub flow: f64,
    /// Head of the arrangement, m.
    pub head: f64,
    /// Flow per pump, m³/s.
    pub flow_per_pump: f64,
}

impl Shifted<'_> {
    /// The last flow per pump of the shifted published data, m³/s.
    pub fn end_per_pump(&self) -> f64 {
        self.scaled.domain().1 * self.shift.flow
    }

    /// Head of the arrangement at total flow q (m³/s), m: series·k_H·H(q/(parallel·k_Q)).
    pub fn head(&self, q: f64) -> f64 {
        self.series * self.shift.head * self.scaled.eval_head(q / self.parallel / self.shift.flow)
    }

    /// Shaft power of one pump at flow per pump qp (m³/s), W, in a liquid of `density`
    /// (kg/m³): (k_Q·k_H/k_η)·P(qp/k_Q) ([`Shift`]).
    pub fn power_per_pump(&self, density: f64, qp: f64) -> Option<f64> {
        arrangement_power(self.scaled, density, 1.0, 1.0, qp / self.shift.flow)
            .map(|p| p * self.shift.power())
    }

    /// NPSH3 of the shifted curve at flow per pump qp (m³/s), m, before its tolerance.
    pub fn npshr(&self, qp: f64) -> Option<f64> {
        self.scaled.eval_npshr(qp / self.shift.flow)
    }

    /// The flow range a duty search covers: the shifted data end × (1 +
    /// [`SEARCH_BEYOND_CURVE`]), m³/s.
    fn search_end(&self) -> f64 {
        self.end_per_pump() * self.parallel * (1.0 + SEARCH_BEYOND_CURVE)
    }

    /// The grid scan of this shifted curve ([`PumpScan`]): it depends on the pump alone,
    /// so one scan serves the duty on every system of the envelope. `None` when the
    /// search range is not a positive finite flow (the solve then says so).
    pub fn scan(&self) -> Option<PumpScan> {
        let q_end = self.search_end();
        (q_end.is_finite() && q_end > 0.0).then(|| PumpScan::new(&|q| self.head(q), q_end))
    }

    /// Where the shifted curve meets the system, within the shifted published data.
    pub fn duty(&self, sys: &CaseSystem) -> Result<ShiftedDuty, String> {
        self.duty_scanned(sys, self.scan().as_ref())
    }

    /// [`Shifted::duty`] with this curve's [`Shifted::scan`] already taken: the same
    /// solve as [`pumps::solve_duty`] ([`pumps::solve_duty_scanned`]), the same outcome.
    pub fn duty_scanned(
        &self,
        sys: &CaseSystem,
        scan: Option<&PumpScan>,
    ) -> Result<ShiftedDuty, String> {
        let end = self.end_per_pump() * self.parallel;
        let q_end = self.search_end();
        let outcome = match scan {
            Some(scan) => {
                pumps::solve_duty_scanned(&|q| self.head(q), &|q| sys.head(q), q_end, scan)
            }
            None => pumps::solve_duty(&|q| self.head(q), &|q| sys.head(q), q_end),
        };
        match outcome.point() {
            Some((q, _)) if q <= end * (1.0 + 1e-9) => Ok(ShiftedDuty {
                flow: q,
                head: self.head(q),
                flow_per_pump: q / self.parallel,
            }),
            Some(_) => Err("beyond the end of the published curve".into()),
            None => Err("no duty point".into()),
        }
    }

    /// The largest shaft power per pump (W) and its flow per pump (m³/s) along the
    /// shifted curve for flows per pump in [lo, hi] (m³/s), 41 points and both ends.
    pub fn max_power(&self, density: f64, lo: f64, hi: f64) -> Option<(f64, f64)> {
        let hi = hi.min(self.end_per_pump());
        let lo = lo.min(hi);
        (0..=40)
            .map(|i| lo + (hi - lo) * i as f64 / 40.0)
            .filter_map(|qp| self.power_per_pump(density, qp).map(|p| (p, qp)))
            .max_by(|a, b| a.0.total_cmp(&b.0))
    }

    /// The arrangement's head curve (total flow m³/s, head m), 41 points to its end.
    pub fn curve(&self) -> Vec<(f64, f64)> {
        let end = self.end_per_pump() * self.parallel;
        (0..=40)
            .map(|i| {
                let q = end * i as f64 / 40.0;
                (q, self.head(q))
            })
            .collect()
    }
}
