//! Yearly operation as the design states it: load profiles (flow against hours per
//! year on one case's system), the control strategy, staging, and the life-cycle cost
//! elements per candidate. SI `f64` values with the unit in each field's doc comment.

use crate::diagnostics::Span;

/// Most rows of one load profile (grammar/LANGUAGE.md, "Limits").
pub const MAX_PROFILE_POINTS: usize = 100;
/// Most `profile` blocks of a design.
pub const MAX_PROFILES: usize = 20;

/// One `load_profile CASE { ... }` block: load points on the named case's system curve.
#[derive(Clone, Debug)]
pub struct LoadProfile {
    /// The case whose system curve, fluid and levels the points run on.
    pub case: String,
    /// How variable-speed candidates follow the demand (fixed-speed ones throttle or
    /// cycle on and off, see [`Control::for_fixed_speed`]).
    pub control: Control,
    /// How many pumps of a parallel set run at each point.
    pub staging: Staging,
    /// The flow that `100 %` stands for, m³/s.
    pub design_flow: f64,
    /// The load points in file order.
    pub points: Vec<LoadPoint>,
    /// Margin of the shut-off head at minimum speed over the static head, m; `None`
    /// takes [`DEFAULT_DEADHEAD_MARGIN_FRACTION`] of the static head.
    pub deadhead_margin: Option<f64>,
    /// Minimum continuous flow per pump as a fraction of its best-efficiency flow at
    /// the running speed; `None` takes the allowable operating region's lower limit.
    pub min_flow_ratio: Option<f64>,
    /// On/off control: active storage volume between the start and stop levels, m³.
    pub storage_volume: Option<f64>,
    /// On/off control: level band of the destination over which the head is
    /// integrated (the stop level is the case's level plus this), m.
    pub level_band: f64,
    /// Starts per hour the motor allows (the maker's or NEMA MG 1 Part 12); `None`
    /// takes [`DEFAULT_MAX_STARTS_PER_HOUR`].
    pub max_starts_per_hour: Option<f64>,
    /// How the points were binned from a CSV of hourly flows (`curve hourly from
    /// "file.csv"`); `None` when the design gives the table itself.
    pub binning: Option<HourlyBinning>,
    /// Where the `load_profile` block is written.
    pub span: Span,
}

/// Most bins of an hourly profile (`bins = N`).
pub const MAX_HOURLY_BINS: usize = 50;
/// Bins of an hourly profile when the design states none.
pub const DEFAULT_HOURLY_BINS: usize = 10;
/// Rows of an hourly profile: one year of hours, or a leap year's.
pub const HOURS_IN_YEARS: [usize; 2] = [8760, 8784];

/// A load profile summarised from hourly flows: equal-width flow bins from zero to the
/// largest hourly flow; each bin's load point is its hours at the mean flow of its
/// hours, so the delivered volume of the year is kept exactly.
#[derive(Clone, Debug, PartialEq)]
pub struct HourlyBinning {
    /// The file, as written in the design.
    pub source: String,
    /// Hourly rows read (8 760 or 8 784).
    pub rows: usize,
    /// Bin edges, m³/s: `hours.len() + 1` ascending values from 0; the last bin
    /// includes its upper edge.
    pub edges: Vec<f64>,
    /// Hours in each bin, h.
    pub hours: Vec<f64>,
    /// Mean flow of each bin's hours, m³/s (0 for a bin without hours).
    pub mean_flow: Vec<f64>,
    /// Hours with zero flow (no pumping), h.
    pub zero_hours: f64,
}

/// Default deadhead margin: 10 % of the static head. dutyline's default, not a
/// standard's value; a design states its own with `deadhead_margin`.
pub const DEFAULT_DEADHEAD_MARGIN_FRACTION: f64 = 0.10;
/// Default start limit: 6 starts per hour, a common figure for small and medium
/// squirrel-cage motors (common practice); NEMA MG 1 Part 12 (12.54) tabulates the
/// allowed starts by rating and poles, and the maker's figure governs.
pub const DEFAULT_MAX_STARTS_PER_HOUR: f64 = 6.0;

/// One row of a load profile.
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct LoadPoint {
    /// Total flow demanded, m³/s.
    pub flow: f64,
    /// Hours per year at this flow, h.
    pub hours: f64,
    /// Where the row is written.
    pub span: Span,
}

/// The control strategy of a variable-speed pump set over a profile.
#[derive(Clone, Copy, Debug, PartialEq)]
pub enum Control {
    /// The pump discharge head is held at `head` (m) whatever the flow; the surplus
    /// over the line's need is taken by the consumers' valves.
    ConstantPressure {
        /// The held discharge head, m.
        head: f64,
    },
    /// The head at the line's far end is held `residual` (m) above what the line needs:
    /// the pump head follows the system curve (a sensor at the destination).
    SystemCurve {
        /// Head above the line's need at the far end, m.
        residual: f64,
    },
    /// Proportional curve: head falls linearly from the system head at the design flow
    /// to `zero_flow_head` (m) at zero flow.
    Proportional {
        /// Head at zero flow, m.
        zero_flow_head: f64,
    },
    /// Fixed (rated or case) speed, a valve throttles to the demanded flow.
    Throttle,
    /// Fixed speed cycling on and off into storage.
    OnOff,
}

impl Control {
    /// The keyword of the language.
    pub fn keyword(self) -> &'static str {
        match self {
            Control::ConstantPressure { .. } => "constant_pressure",
            Control::SystemCurve { .. } => "system_curve",
            Control::Proportional { .. } => "proportional",
            Control::Throttle => "throttle",
            Control::OnOff => "on_off",
        }
    }
    /// The keyword in words for print ("constant pressure" for `constant_pressure`).
    pub fn words(self) -> String {
        self.keyword().replace('_', " ")
    }

    /// What a fixed-speed candidate does under this profile: cycles on and off when
    /// the profile says so, else throttles.
    pub fn for_fixed_speed(self) -> Control {
        match self {
            Control::OnOff => Control::OnOff,
            _ => Control::Throttle,
        }
    }
}

/// How many pumps of a parallel set run at a load point.
#[derive(Clone, Copy, Debug, PartialEq, Eq)]
pub enum Staging {
    /// The count with the least input power among counts within the allowable
    /// operating region (else among those that deliver at all).
    LeastPower,
    /// Every duty pump of the set runs at every point.
    AllRunning,
}

impl Staging {
    /// The keyword of the language.
    pub fn keyword(self) -> &'static str {
        match self {
            Staging::LeastPower => "least_power",
            Staging::AllRunning => "all_running",
        }
    }
    /// The keyword in words for print ("constant pressure" for `constant_pressure`).
    pub fn words(self) -> String {
        self.keyword().replace('_', " ")
    }
}

/// Life-cycle cost elements of one candidate, after the Hydraulic Institute and
/// Europump guide *Pump Life Cycle Costs* (2001), in currency units as written.
/// The energy cost is computed from the profile, not stated.
#[derive(Clone, Debug, Default, PartialEq)]
pub struct CostElements {
    /// The candidate these costs belong to.
    pub pump: String,
    /// Initial cost (pumps, motors, drives, auxiliaries), currency.
    pub initial: f64,
    /// Installation and commissioning, currency.
    pub installation: f64,
    /// Operation (labour of normal supervision), currency per year.
    pub operation: f64,
    /// Maintenance and repair, currency per year.
    pub maintenance: f64,
    /// Downtime (loss of production), currency per year.
    pub downtime: f64,
    /// Environmental costs, currency per year.
    pub environmental: f64,
    /// Decommissioning and disposal, currency, at the end of the life.
    pub disposal: f64,
    /// Where the `cost` block is written.
    pub span: Span,
}

/// Whether the discount and escalation rates include general inflation.
#[derive(Clone, Copy, Debug, Default, PartialEq, Eq)]
pub enum RateBasis {
    /// Rates above general inflation; costs stay in today's money.
    #[default]
    Real,
    /// Rates including general inflation; recurring costs other than energy grow with
    /// the stated `inflation`.
    Nominal,
}

impl RateBasis {
    /// The keyword of the language.
    pub fn keyword(self) -> &'static str {
        match self {
            RateBasis::Real => "real",
            RateBasis::Nominal => "nominal",
        }
    }
}

/// Everything the design says about the operation over the year.
#[derive(Clone, Debug, Default)]
pub struct OperationSettings {
    /// The load profiles, in file order.
    pub profiles: Vec<LoadProfile>,
    /// The cost elements stated per candidate, in file order.
    pub costs: Vec<CostElements>,
    /// Real or nominal rates (the `energy` block's `rates`).
    pub rates: RateBasis,
    /// General inflation per year for recurring non-energy costs under nominal rates
    /// (fraction).
    pub inflation: f64,
}
