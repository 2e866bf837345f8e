//! The lowered design: typed, unit-checked, with names resolved.
//!
//! Physical values are `uom` quantities (SI inside). Money is not a `uom`
//! dimension, so prices are plain `f64` in currency units per joule.

use uom::si::f64::{
    DynamicViscosity, Frequency, Length, MassDensity, Pressure, Ratio, ThermodynamicTemperature,
    Time, VolumeRate,
};

use crate::diagnostics::Span;
use crate::hydraulics::catalogue::Material;
use crate::hydraulics::fittings::FittingSpec;

/// A whole design: what the engine analyses.
#[derive(Clone, Debug)]
pub struct Design {
    pub project: Project,
    pub revisions: Vec<Revision>,
    pub purpose: Option<String>,
    pub assumptions: Vec<String>,
    pub notes: Vec<String>,
    /// The base scenario, before any case overrides.
    pub base: Scenario,
    /// Cases in file order, each with its scenario resolved.
    pub cases: Vec<Case>,
    pub requirements: Vec<Requirement>,
    pub pumps: Vec<PumpCandidate>,
    pub motor: MotorSettings,
    pub energy: EnergySettings,
    /// Load profiles, control, staging and life-cycle cost elements.
    pub operation: super::operation::OperationSettings,
}

#[derive(Clone, Debug, Default)]
pub struct Project {
    pub title: String,
    pub number: String,
    pub client: String,
    pub prepared: String,
    pub checked: String,
    pub approved: String,
    pub units: ReportUnits,
    /// A built-in style name or a path to a style file.
    pub style: Option<String>,
    pub style_span: Option<Span>,
}

/// Units used in the report and text results.
#[derive(Clone, Copy, Debug, Default, PartialEq, Eq)]
pub enum ReportUnits {
    #[default]
    Si,
    Us,
}

impl ReportUnits {
    pub fn keyword(self) -> &'static str {
        match self {
            ReportUnits::Si => "si",
            ReportUnits::Us => "us",
        }
    }
}

#[derive(Clone, Debug, PartialEq)]
pub struct Revision {
    pub id: String,
    pub date: String,
    pub description: String,
}

/// Everything a case may override.
#[derive(Clone, Debug)]
pub struct Scenario {
    pub fluid: Fluid,
    pub site: Site,
    pub source: Tank,
    pub destination: Tank,
    pub centreline: Length,
    pub lines: Vec<Line>,
    pub pipe_condition: PipeCondition,
    /// Operating hours per year in this case (energy); zero for a check-only case.
    pub hours_per_year: Time,
    /// Speed overrides for pumps in this case, by pump name.
    pub pump_speeds: Vec<(String, Frequency)>,
}

#[derive(Clone, Debug)]
pub enum Fluid {
    Water {
        temperature: ThermodynamicTemperature,
    },
    Custom(CustomFluid),
}

#[derive(Clone, Debug)]
pub struct CustomFluid {
    pub name: String,
    pub temperature: Option<ThermodynamicTemperature>,
    pub density: MassDensity,
    pub viscosity: DynamicViscosity,
    pub vapor_pressure: Pressure,
}

impl Fluid {
    pub fn name(&self) -> &str {
        match self {
            Fluid::Water { .. } => "water",
            Fluid::Custom(c) => &c.name,
        }
    }
}

#[derive(Clone, Debug)]
pub struct Site {
    pub elevation: Length,
    /// Absolute barometric pressure given directly; otherwise from the elevation.
    pub barometric_pressure: Option<Pressure>,
}

/// A free surface: a tank, sump, well or reservoir.
#[derive(Clone, Debug)]
pub struct Tank {
    pub name: String,
    pub level: Length,
    pub surface_pressure: SurfacePressure,
    pub span: Span,
}

/// The pressure on a free surface.
#[derive(Clone, Copy, Debug, PartialEq)]
pub enum SurfacePressure {
    Gauge(Pressure),
    Absolute(Pressure),
}

#[derive(Clone, Copy, Debug, PartialEq, Eq)]
pub enum PipeCondition {
    New,
    Aged,
}

impl PipeCondition {
    pub fn keyword(self) -> &'static str {
        match self {
            PipeCondition::New => "new",
            PipeCondition::Aged => "aged",
        }
    }
}

/// Which side of the pump a line is on.
#[derive(Clone, Copy, Debug, PartialEq, Eq)]
pub enum Side {
    Suction,
    Discharge,
}

impl Side {
    pub fn keyword(self) -> &'static str {
        match self {
            Side::Suction => "suction",
            Side::Discharge => "discharge",
        }
    }
}

#[derive(Clone, Debug)]
pub struct Line {
    pub name: String,
    pub side: Side,
    pub from: String,
    pub to: String,
    pub segments: Vec<Segment>,
    pub span: Span,
}

/// One run of pipe of one size and material, with the fittings on it.
#[derive(Clone, Debug)]
pub struct Segment {
    pub material: Material,
    /// The size as a reader sees it: "8 in schedule 40", "bore 154.1 mm".
    pub size_label: String,
    pub inner_diameter: Length,
    /// Where the inner diameter comes from (a standard's table, or "given").
    pub diameter_source: String,
    pub length: Length,
    /// Explicit roughness; otherwise the material's for the case's pipe condition.
    pub roughness: Option<Length>,
    /// Hazen-Williams C; when set the segment uses Hazen-Williams for friction.
    pub hazen_williams_c: Option<f64>,
    pub fittings: Vec<FittingUse>,
    pub losses: Vec<ExtraLoss>,
    pub span: Span,
}

#[derive(Clone, Debug)]
pub struct FittingUse {
    pub spec: &'static FittingSpec,
    pub count: u32,
    pub beta: Option<f64>,
    pub angle_rad: Option<f64>,
    pub span: Span,
}

/// A loss the design states directly: a K value or an equivalent length, with its reason.
#[derive(Clone, Debug)]
pub struct ExtraLoss {
    pub k: Option<f64>,
    pub equivalent_length: Option<Length>,
    pub why: String,
    pub span: Span,
}

#[derive(Clone, Debug)]
pub struct Case {
    pub name: String,
    pub scenario: Scenario,
    /// The overrides as written, for the report ("wet_well.level = 1202.0 ft").
    pub overrides: Vec<String>,
    pub span: Span,
}

/// What a requirement constrains.
#[derive(Clone, Copy, Debug, PartialEq, Eq)]
pub enum Metric {
    Flow,
    Head,
    NpshMargin,
    NpshExcess,
    Efficiency,
    SuctionVelocity,
    DischargeVelocity,
    ShaftPower,
}

impl Metric {
    pub const ALL: [(&'static str, Metric); 8] = [
        ("flow", Metric::Flow),
        ("head", Metric::Head),
        ("npsh_margin", Metric::NpshMargin),
        ("npsh_excess", Metric::NpshExcess),
        ("efficiency", Metric::Efficiency),
        ("suction_velocity", Metric::SuctionVelocity),
        ("discharge_velocity", Metric::DischargeVelocity),
        ("shaft_power", Metric::ShaftPower),
    ];
    pub fn keyword(self) -> &'static str {
        Metric::ALL
            .iter()
            .find(|(_, m)| *m == self)
            .map(|(k, _)| *k)
            .unwrap_or("?")
    }
}

#[derive(Clone, Debug)]
pub struct Requirement {
    pub metric: Metric,
    pub at_least: bool,
    /// SI value (m^3/s, m, ratio, m/s, W).
    pub limit_si: f64,
    /// The requirement as written, for messages and the report.
    pub text: String,
    /// Cases it applies to; empty means every case.
    pub cases: Vec<String>,
    pub span: Span,
}

#[derive(Clone, Copy, Debug, PartialEq, Eq)]
pub enum ArrangementKind {
    Single,
    Parallel,
    Series,
}

#[derive(Clone, Debug)]
pub struct PumpCandidate {
    pub name: String,
    pub description: String,
    pub rated_speed: Frequency,
    pub arrangement: ArrangementKind,
    /// Pumps running together (parallel or series).
    pub count: u32,
    /// Installed standby pumps (not running).
    pub standby: u32,
    /// Published curves: several impeller diameters at the rated speed, or several speeds.
    pub curves: Vec<CurveData>,
    /// The impeller diameter evaluated; `None` means the largest published.
    pub impeller: Option<Length>,
    /// Adjust the pump to meet the flow requirement.
    pub adjust: Adjust,
    /// The motor's nameplate rating per pump when the design states it (`motor_rating`);
    /// `None` selects the smallest standard rating that carries every duty.
    pub motor_rating: Option<uom::si::f64::Power>,
    pub span: Span,
}

#[derive(Clone, Copy, Debug, PartialEq)]
pub enum Adjust {
    None,
    /// Variable-speed drive, within these fractions of the rated speed.
    Speed {
        min_ratio: f64,
        max_ratio: f64,
    },
    /// Impeller trim down to this fraction of the published diameter.
    Trim {
        min_ratio: f64,
    },
}

/// One published curve table, in SI.
#[derive(Clone, Debug)]
pub struct CurveData {
    pub impeller: Option<Length>,
    pub speed: Frequency,
    pub flow: Vec<VolumeRate>,
    pub head: Vec<Length>,
    pub efficiency: Vec<Option<Ratio>>,
    pub npshr: Vec<Option<Length>>,
    pub shaft_power: Vec<Option<uom::si::f64::Power>>,
    pub span: Span,
}

#[derive(Clone, Copy, Debug, PartialEq)]
pub enum MotorStandardChoice {
    Nema,
    Iec,
}

#[derive(Clone, Debug)]
pub struct MotorSettings {
    pub standard: MotorStandardChoice,
    pub service_factor: f64,
    /// Motor efficiency; `None` uses the stated default.
    pub efficiency: Option<f64>,
    /// Variable-frequency drive efficiency, when a drive is used.
    pub drive_efficiency: Option<f64>,
}

#[derive(Clone, Debug)]
pub struct EnergySettings {
    /// Price of energy in currency units per joule; `None` when not given.
    pub price_per_joule: Option<f64>,
    /// The currency as written ("USD").
    pub currency: String,
    pub years: f64,
    pub discount_rate: f64,
    pub escalation: f64,
    /// Whether `discount_rate` and `escalation` are real or nominal rates.
    pub rates: super::operation::RateBasis,
    /// General inflation per year (fraction), for nominal rates.
    pub inflation: f64,
}
