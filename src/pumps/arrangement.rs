//! Identical pumps in parallel, in series, or as duty/standby sets.
//!
//! For n identical pumps (common practice, e.g. Karassik et al., *Pump Handbook*,
//! 4th ed., 2008, on multiple-pump operation — from memory):
//! - in parallel each carries Q/n at the common head: H_comb(Q) = H(Q/n), each pump's
//!   efficiency is η(Q/n), the total shaft power is n·P(Q/n);
//! - in series each carries Q and adds its head: H_comb(Q) = n·H(Q), efficiency η(Q),
//!   total power n·P(Q);
//! - duty/standby: the duty pumps run in parallel; standby pumps carry no flow.
//!
//! Validity: identical pumps on a common header with negligible individual piping
//! losses; unequal pumps need a separate per-pump solve.

use super::PumpError;

/// How the installed pumps are connected.
#[derive(Clone, Copy, Debug, PartialEq)]
pub enum Arrangement {
    /// One pump.
    Single,
    /// n identical pumps in parallel, all running.
    Parallel(u32),
    /// n identical pumps in series.
    Series(u32),
    /// `duty` pumps running in parallel and `standby` pumps installed but stopped.
    DutyStandby {
        /// Running pumps.
        duty: u32,
        /// Stopped spare pumps.
        standby: u32,
    },
}

impl Arrangement {
    /// Checks the counts: at least one running pump.
    pub fn validate(&self) -> Result<(), PumpError> {
        match *self {
            Arrangement::Parallel(0) | Arrangement::Series(0) => {
                Err(PumpError::new("an arrangement needs at least one pump"))
            }
            Arrangement::DutyStandby { duty: 0, .. } => Err(PumpError::new(
                "a duty/standby set needs at least one duty pump",
            )),
            _ => Ok(()),
        }
    }

    /// Pumps sharing the flow side by side (1 unless parallel or duty/standby).
    pub fn in_parallel(&self) -> u32 {
        match *self {
            Arrangement::Parallel(n) => n.max(1),
            Arrangement::DutyStandby { duty, .. } => duty.max(1),
            _ => 1,
        }
    }

    /// Pumps adding their heads one after another (1 unless series).
    pub fn in_series(&self) -> u32 {
        match *self {
            Arrangement::Series(n) => n.max(1),
            _ => 1,
        }
    }

    /// Pumps running.
    pub fn running(&self) -> u32 {
        self.in_parallel() * self.in_series()
    }

    /// Pumps installed (running plus standby).
    pub fn installed(&self) -> u32 {
        match *self {
            Arrangement::DutyStandby { duty, standby } => duty.saturating_add(standby),
            _ => self.running(),
        }
    }

    /// Short name for reports and JSON ("single", "parallel", "series", "duty_standby").
    pub fn kind_name(&self) -> &'static str {
        match self {
            Arrangement::Single => "single",
            Arrangement::Parallel(_) => "parallel",
            Arrangement::Series(_) => "series",
            Arrangement::DutyStandby { .. } => "duty_standby",
        }
    }
}

/// One validated arrangement applied to one pump's curves.
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct ArrangedPump {
    arrangement: Arrangement,
}

impl ArrangedPump {
    /// Validates the arrangement (see [`Arrangement::validate`]).
    pub fn new(arrangement: Arrangement) -> Result<Self, PumpError> {
        arrangement.validate()?;
        Ok(Self { arrangement })
    }

    /// The arrangement.
    pub fn arrangement(&self) -> Arrangement {
        self.arrangement
    }

    /// Flow through each running pump at total flow q.
    pub fn per_pump_flow(&self, q: f64) -> f64 {
        q / f64::from(self.arrangement.in_parallel())
    }

    /// Head of each running pump at total head h.
    pub fn per_pump_head(&self, h: f64) -> f64 {
        h / f64::from(self.arrangement.in_series())
    }

    /// Combined head at total flow q from one pump's head curve.
    pub fn head(&self, pump: &dyn Fn(f64) -> f64, q: f64) -> f64 {
        f64::from(self.arrangement.in_series()) * pump(self.per_pump_flow(q))
    }

    /// Efficiency of each running pump (and so of the set) at total flow q.
    pub fn efficiency(&self, pump_efficiency: &dyn Fn(f64) -> f64, q: f64) -> f64 {
        pump_efficiency(self.per_pump_flow(q))
    }

    /// Total shaft power of the running pumps at total flow q.
    pub fn shaft_power(&self, pump_power: &dyn Fn(f64) -> f64, q: f64) -> f64 {
        f64::from(self.arrangement.running()) * pump_power(self.per_pump_flow(q))
    }
}

/// Combined head at total flow q: parallel n → H(Q/n); series n → n·H(Q); duty/standby
/// → the duty pumps in parallel. Errors for an arrangement without a running pump.
pub fn combined_head(
    pump: &dyn Fn(f64) -> f64,
    arrangement: Arrangement,
    q: f64,
) -> Result<f64, PumpError> {
    Ok(ArrangedPump::new(arrangement)?.head(pump, q))
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn counts() {
        let a = Arrangement::DutyStandby {
            duty: 2,
            standby: 1,
        };
        assert_eq!(
            (a.in_parallel(), a.in_series(), a.running(), a.installed()),
            (2, 1, 2, 3)
        );
        assert!(Arrangement::Parallel(0).validate().is_err());
        assert!(Arrangement::DutyStandby {
            duty: 0,
            standby: 2
        }
        .validate()
        .is_err());
    }
}
