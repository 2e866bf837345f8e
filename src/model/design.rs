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
use crate::hydraulics::heads::{AbsolutePressure, GaugePressure};
use uom::si::{length::meter, pressure::pascal};

/// A whole design: what the engine analyses.
#[derive(Clone, Debug)]
pub struct Design {
    /// Title block, report units and style.
    pub project: Project,
    /// Revision history in file order; the last entry is the current revision.
    pub revisions: Vec<Revision>,
    /// Purpose and scope, verbatim (`purpose "..."`).
    pub purpose: Option<String>,
    /// Assumptions, verbatim and in order (`assume "..."`).
    pub assumptions: Vec<String>,
    /// Notes, verbatim and in order (`note "..."`).
    pub notes: Vec<String>,
    /// The base scenario, before any case overrides.
    pub base: Scenario,
    /// Cases in file order, each with its scenario resolved.
    pub cases: Vec<Case>,
    /// Requirements checked for every case and candidate they apply to.
    pub requirements: Vec<Requirement>,
    /// Requirements at network nodes (`pressure at NODE >= ...`).
    pub node_requirements: Vec<super::network::NodeRequirement>,
    /// Pump candidates in file order.
    pub pumps: Vec<PumpCandidate>,
    /// Motor sizing settings (`motor { ... }`).
    pub motor: MotorSettings,
    /// Energy cost settings (`energy { ... }`).
    pub energy: EnergySettings,
    /// Load profiles, control, staging and life-cycle cost elements.
    pub operation: super::operation::OperationSettings,
    /// Input ranges and how they combine into duty envelopes (issue 15); `None` when the
    /// design states no range and no pump test grade.
    pub uncertainty: Option<super::uncertainty::Uncertainty>,
}

/// The `project` block: the title block of the package.
#[derive(Clone, Debug, Default)]
pub struct Project {
    /// Project title (empty when not given, with a warning).
    pub title: String,
    /// Project or calculation number.
    pub number: String,
    /// Client name.
    pub client: String,
    /// Who prepared the calculation.
    pub prepared: String,
    /// Who checked it.
    pub checked: String,
    /// Who approved it.
    pub approved: String,
    /// Units of the package and the text results.
    pub units: ReportUnits,
    /// A built-in style name or a path to a style file.
    pub style: Option<String>,
    /// Where the style is written, for diagnostics about it.
    pub style_span: Option<Span>,
}

/// Units used in the report and text results.
#[derive(Clone, Copy, Debug, Default, PartialEq, Eq)]
pub enum ReportUnits {
    /// SI units (m, m³/h, kPa, kW).
    #[default]
    Si,
    /// US customary units (ft, gpm, psi, hp).
    Us,
}

impl ReportUnits {
    /// The keyword as written in a design (`si`, `us`).
    pub fn keyword(self) -> &'static str {
        match self {
            ReportUnits::Si => "si",
            ReportUnits::Us => "us",
        }
    }
}

/// One `revision ID DATE "text"` entry.
#[derive(Clone, Debug, PartialEq)]
pub struct Revision {
    /// Revision id as written (`A`, `2`).
    pub id: String,
    /// Date as written, `YYYY-MM-DD` (a checked calendar date).
    pub date: String,
    /// What the revision changed.
    pub description: String,
}

/// Everything a case may override.
#[derive(Clone, Debug)]
pub struct Scenario {
    /// The pumped liquid.
    pub fluid: Fluid,
    /// Site elevation and barometric pressure.
    pub site: Site,
    /// The free surface the suction line draws from.
    pub source: Tank,
    /// The free surface the discharge line delivers to.
    pub destination: Tank,
    /// Pump centreline elevation (the datum of NPSH), on the design's datum.
    pub centreline: Length,
    /// Suction and discharge lines in file order, shared by the cases that do not change
    /// them (a case override copies them first: `Arc::make_mut`).
    pub lines: std::sync::Arc<Vec<Line>>,
    /// The network the discharge lines feed (general form); `None` for a single chain.
    pub network: Option<super::network::NetworkLayout>,
    /// New or aged pipe: which material roughness every segment uses.
    pub pipe_condition: PipeCondition,
    /// Operating hours per year in this case (energy); zero for a check-only case.
    pub hours_per_year: Time,
    /// Speed overrides for pumps in this case, by pump name.
    pub pump_speeds: Vec<(String, Frequency)>,
    /// Per pump candidate: (name, pumps of its set, whether the set is parallel, pumps
    /// running in this case: the set's count unless a case says `PUMP.running = N`).
    pub pump_running: Vec<(String, u32, bool, u32)>,
}

impl Scenario {
    /// Pumps of candidate `name`'s parallel set running in this case, when it is one.
    pub fn running(&self, name: &str) -> Option<u32> {
        self.pump_running
            .iter()
            .find(|(n, _, parallel, _)| n == name && *parallel)
            .map(|(_, _, _, r)| *r)
    }

    /// Speed of candidate `name` stated for this case, rpm, when the case states one.
    pub fn pump_speed_rpm(&self, name: &str) -> Option<f64> {
        self.pump_speeds
            .iter()
            .find(|(n, _)| n == name)
            .map(|(_, s)| s.get::<uom::si::frequency::cycle_per_minute>())
    }
}

/// The pumped liquid.
#[derive(Clone, Debug)]
pub enum Fluid {
    /// Liquid water, its properties from IAPWS-IF97 at the temperature.
    Water {
        /// Water temperature (absolute).
        temperature: ThermodynamicTemperature,
    },
    /// A liquid whose properties the design states.
    Custom(CustomFluid),
    /// An aqueous glycol mixture, its properties from Melinder (2010).
    Glycol(GlycolMixture),
}

/// How a glycol fraction is stated (`basis = mass | volume`).
#[derive(Clone, Copy, Debug, PartialEq, Eq)]
pub enum FractionBasis {
    /// Mass of glycol over mass of mixture.
    Mass,
    /// Volume of glycol over the volumes of glycol and water before mixing, at 20 °C.
    Volume,
}

/// `fluid ethylene_glycol { fraction = 30 %, basis = mass, temperature = 7 degC }`.
#[derive(Clone, Debug)]
pub struct GlycolMixture {
    /// Which glycol.
    pub glycol: crate::fluid::glycol::Glycol,
    /// The fraction as stated, 0–1 (dimensionless), on `basis`.
    pub fraction: f64,
    /// Mass or volume basis of `fraction`.
    pub basis: FractionBasis,
    /// Mixture temperature (absolute).
    pub temperature: ThermodynamicTemperature,
}

impl GlycolMixture {
    /// The glycol's mass fraction (dimensionless): the stated one, or converted from
    /// the volume fraction (`fluid::glycol::mass_fraction_from_volume`).
    pub fn mass_fraction(&self) -> f64 {
        match self.basis {
            FractionBasis::Mass => self.fraction,
            FractionBasis::Volume => {
                crate::fluid::glycol::mass_fraction_from_volume(self.glycol, self.fraction)
            }
        }
    }

    /// The mixture's freezing point, K (Melinder 2010).
    pub fn freezing_point_k(&self) -> f64 {
        crate::fluid::glycol::freezing_point_k(self.glycol, self.mass_fraction())
    }
}

/// A liquid described by its properties (`fluid "name" { ... }`).
#[derive(Clone, Debug)]
pub struct CustomFluid {
    /// Name as written in the design.
    pub name: String,
    /// Temperature, for the report only (absolute).
    pub temperature: Option<ThermodynamicTemperature>,
    /// Density.
    pub density: MassDensity,
    /// Dynamic viscosity.
    pub viscosity: DynamicViscosity,
    /// Vapour pressure (absolute).
    pub vapor_pressure: Pressure,
    /// Bulk modulus of elasticity (`bulk_modulus`), for the surge screen's wave speed;
    /// `None` leaves that liquid's surge screen undone.
    pub bulk_modulus: Option<Pressure>,
}

impl Fluid {
    /// The fluid's name for messages and the report (`water` or the design's).
    pub fn name(&self) -> &str {
        match self {
            Fluid::Water { .. } => "water",
            Fluid::Custom(c) => &c.name,
            Fluid::Glycol(g) => g.glycol.name(),
        }
    }

    /// The temperature of water or a glycol mixture (the fluids whose properties follow
    /// from it); `None` for a named liquid.
    pub fn temperature_mut(&mut self) -> Option<&mut ThermodynamicTemperature> {
        match self {
            Fluid::Water { temperature } => Some(temperature),
            Fluid::Glycol(g) => Some(&mut g.temperature),
            Fluid::Custom(_) => None,
        }
    }
}

/// The `site` block.
#[derive(Clone, Debug)]
pub struct Site {
    /// Site elevation above sea level (for the standard atmosphere and motor derating).
    pub elevation: Length,
    /// Absolute barometric pressure given directly; otherwise from the elevation.
    pub barometric_pressure: Option<Pressure>,
}

/// A free surface: a tank, sump, well or reservoir.
#[derive(Clone, Debug)]
pub struct Tank {
    /// Tank name as written.
    pub name: String,
    /// Free-surface level on the design's datum (may be below zero).
    pub level: Length,
    /// Pressure on the surface, gauge or absolute.
    pub surface_pressure: SurfacePressure,
    /// A well: its drawdown below the static `level` at `test_flow` (`drawdown = 12 ft`).
    pub drawdown: Option<Length>,
    /// A well: the flow of the drawdown test (`test_flow = 500 gpm`).
    pub test_flow: Option<VolumeRate>,
    /// A well: the part of `drawdown` that is well loss, growing as Q² (`well_loss`).
    pub well_loss: Option<Length>,
    /// The closed-loop fields of a pressure reference (expansion tank, fill point).
    pub reference: LoopReference,
    /// Where the tank's name is written.
    pub span: Span,
}

/// What a closed loop's pressure reference states besides its level and its minimum
/// (cold fill, precharge) `pressure` (grammar/LANGUAGE.md, "Closed loops").
#[derive(Clone, Debug, Default)]
pub struct LoopReference {
    /// `max_pressure`: the highest gauge pressure at the reference (relief setting or the
    /// hot system), for the ratings.
    pub max_pressure: Option<Pressure>,
    /// `high_point`: the loop's highest point (air vents, top coil) on the datum, when
    /// higher than every node the design names.
    pub high_point: Option<Length>,
    /// `high_point_pressure`: the least gauge pressure the high point must keep.
    pub high_point_pressure: Option<Pressure>,
    /// `connects = discharge`: where that word is written (the tank connects on the pump
    /// discharge); `None` for the suction (the default).
    pub on_discharge: Option<Span>,
}

/// The pressure on a free surface.
#[derive(Clone, Copy, Debug, PartialEq)]
pub enum SurfacePressure {
    /// Relative to the site's barometric pressure (may be negative: a vacuum).
    Gauge(Pressure),
    /// Absolute (above zero).
    Absolute(Pressure),
}

impl SurfacePressure {
    /// The surface's absolute pressure under the site's `barometric` pressure.
    pub fn absolute(self, barometric: AbsolutePressure) -> AbsolutePressure {
        match self {
            SurfacePressure::Gauge(g) => GaugePressure::new(g.get::<pascal>()).absolute(barometric),
            SurfacePressure::Absolute(a) => AbsolutePressure::new(a.get::<pascal>()),
        }
    }
    /// The surface's gauge pressure under the site's `barometric` pressure.
    pub fn gauge(self, barometric: AbsolutePressure) -> GaugePressure {
        match self {
            SurfacePressure::Gauge(g) => GaugePressure::new(g.get::<pascal>()),
            SurfacePressure::Absolute(a) => {
                AbsolutePressure::new(a.get::<pascal>()).gauge(barometric)
            }
        }
    }
    /// The gauge pressure as the design states it, `None` when it is stated absolute.
    pub fn stated_gauge(self) -> Option<GaugePressure> {
        match self {
            SurfacePressure::Gauge(g) => Some(GaugePressure::new(g.get::<pascal>())),
            SurfacePressure::Absolute(_) => None,
        }
    }
}

impl Site {
    /// The site's barometric pressure: as given, or the U.S. Standard Atmosphere 1976
    /// at the site elevation (NOAA/NASA/USAF, 1976, Eq. 33a); `Err` with the reason
    /// where the elevation is outside the standard atmosphere.
    pub fn barometric(&self) -> Result<AbsolutePressure, String> {
        match self.barometric_pressure {
            Some(p) => Ok(AbsolutePressure::new(p.get::<pascal>())),
            None => crate::fluid::barometric_pressure_pa(self.elevation.get::<meter>())
                .map(AbsolutePressure::new)
                .map_err(|e| e.message),
        }
    }
}

/// Which roughness of its material a pipe uses.
#[derive(Clone, Copy, Debug, PartialEq, Eq)]
pub enum PipeCondition {
    /// Clean new pipe (the material's new roughness or C).
    New,
    /// Pipe after years of service (the material's aged roughness or C).
    Aged,
}

impl PipeCondition {
    /// The keyword as written in a design (`new`, `aged`).
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
    /// From the source tank to the pump.
    Suction,
    /// From the pump to the destination tank.
    Discharge,
}

impl Side {
    /// The keyword as written in a design (`suction`, `discharge`).
    pub fn keyword(self) -> &'static str {
        match self {
            Side::Suction => "suction",
            Side::Discharge => "discharge",
        }
    }
}

/// A `line NAME from A to B { ... }`: pipe segments in flow order.
#[derive(Clone, Debug)]
pub struct Line {
    /// Line name as written.
    pub name: String,
    /// Suction or discharge.
    pub side: Side,
    /// Where the line starts: a tank name or `pump`.
    pub from: String,
    /// Where the line ends: a tank name or `pump`.
    pub to: String,
    /// Pipe segments in flow order, each with its fittings.
    pub segments: Vec<Segment>,
    /// The pipe profile along the line, when the design gives one (`profile { ... }`).
    pub profile: Option<Profile>,
    /// Stroke time of the line's fastest-closing valve, for the valve-closure surge
    /// screen (`closure_time = 30 s`); `None` skips that screen.
    pub closure_time: Option<Time>,
    /// How the line is restrained against axial movement (wave speed).
    pub restraint: Restraint,
    /// `serves = each_pump`: station piping, one copy of the line per pump of the set,
    /// each carrying one pump's flow (the set's flow / pumps in parallel).
    pub per_pump: bool,
    /// Where the `line` block is written.
    pub span: Span,
}

/// Elevation of the pipe along a line: (chainage from the line's upstream end, pipe
/// elevation in the design's datum) in flow direction, chainage strictly increasing
/// from zero.
#[derive(Clone, Debug)]
pub struct Profile {
    /// The points: (chainage, pipe elevation), chainage strictly increasing from zero.
    pub points: Vec<(Length, Length)>,
    /// Where it comes from: "given in the design" or the CSV file's name.
    pub source: String,
    /// Where the profile is written.
    pub span: Span,
}

pub use crate::hydraulics::wave_speed::Restraint;

/// One run of pipe of one size and material, with the fittings on it.
#[derive(Clone, Debug)]
pub struct Segment {
    /// Pipe material (catalogue entry with its roughness and C).
    pub material: Material,
    /// The size as a reader sees it: "8 in schedule 40", "bore 154.1 mm".
    pub size_label: String,
    /// Inner diameter (bore).
    pub inner_diameter: Length,
    /// Where the inner diameter comes from (a standard's table, or "given").
    pub diameter_source: String,
    /// Pipe length along its axis (may be zero, with a warning).
    pub length: Length,
    /// Explicit roughness; otherwise the material's for the case's pipe condition.
    pub roughness: Option<Length>,
    /// Hazen-Williams C; when set the segment uses Hazen-Williams for friction.
    pub hazen_williams_c: Option<f64>,
    /// Fittings on this segment, in file order.
    pub fittings: Vec<FittingUse>,
    /// Losses the design states directly.
    pub losses: Vec<ExtraLoss>,
    /// Wall data for ratings and wave speed (catalogue or given).
    pub wall: WallData,
    /// Where the `pipe` statement is written.
    pub span: Span,
}

/// What the safety screen needs of a pipe wall, from the catalogue or the design.
#[derive(Clone, Debug, Default)]
pub struct WallData {
    /// Outside diameter from the catalogue, when known.
    pub outer_diameter: Option<Length>,
    /// Wall thickness (catalogue nominal, or minimum for PVC/HDPE, or `wall = ...`).
    pub thickness: Option<Length>,
    /// The catalogue designation after the size: `schedule 40`, `class 350`, `DR 17`.
    pub designation: Option<String>,
    /// A pressure rating stated in the design (`rating = 150 psi`), gauge.
    pub rating: Option<Pressure>,
    /// Modulus of elasticity override (`modulus = 3.3 GPa`... as a pressure).
    pub modulus: Option<Pressure>,
    /// Corrosion allowance override (steel wall per ASME B31.3 §304.1).
    pub corrosion_allowance: Option<Length>,
    /// Threaded joints (`joints = threaded`): PVC derated 50 %, steel thread depth.
    pub threaded: bool,
    /// Pipe elevations at the segment's ends (`start_elevation`, `end_elevation`).
    pub start_elevation: Option<Length>,
    /// Pipe elevation at the segment's end (`end_elevation`).
    pub end_elevation: Option<Length>,
    /// The flanges of the segment's joints (`flanges = asme_150`), rated by their
    /// standard; the weaker of pipe and flanges governs.
    pub flanges: Option<crate::hydraulics::flanges::FlangeClass>,
    /// Steel rated by AWWA M11 (`rating_basis = awwa_m11`) instead of ASME B31.3.
    pub m11: bool,
    /// Specified minimum yield strength of steel (`yield_strength`), for AWWA M11.
    pub yield_strength: Option<Pressure>,
}

/// A fitting on a segment, with its count and geometry.
#[derive(Clone, Debug)]
pub struct FittingUse {
    /// The fitting table entry (name, K method, source).
    pub spec: &'static FittingSpec,
    /// How many of this fitting (1–1000).
    pub count: u32,
    /// Diameter ratio small/large for size changes (dimensionless, 0–1).
    pub beta: Option<f64>,
    /// β was taken from the inner diameters of this pipe and its neighbour in the line
    /// (not stated in the design).
    pub beta_from_bores: bool,
    /// Included angle of a taper, rad.
    pub angle_rad: Option<f64>,
    /// A pressure rating stated in the design (`rating = 250 psi`), gauge.
    pub rating: Option<Pressure>,
    /// Where the fitting is written.
    pub span: Span,
}

/// A loss the design states directly: a K value or an equivalent length, with its reason.
#[derive(Clone, Debug)]
pub struct ExtraLoss {
    /// Loss coefficient K (dimensionless, on the segment's velocity head).
    pub k: Option<f64>,
    /// Equivalent length of straight pipe of the segment's size.
    pub equivalent_length: Option<Length>,
    /// The reason the design gives for the loss.
    pub why: String,
    /// Where the loss is written.
    pub span: Span,
}

/// An operating case: the base scenario with its overrides applied.
#[derive(Clone, Debug)]
pub struct Case {
    /// Case name as written (`design` for the implicit case).
    pub name: String,
    /// The resolved scenario of the case.
    pub scenario: Scenario,
    /// The overrides as written, for the report ("wet_well.level = 1202.0 ft").
    pub overrides: Vec<String>,
    /// Where the case's name is written; empty for the implicit case.
    pub span: Span,
}

/// What a requirement constrains.
#[derive(Clone, Copy, Debug, PartialEq, Eq)]
pub enum Metric {
    /// Volume flow delivered, m³/s.
    Flow,
    /// Total head of the arrangement, m.
    Head,
    /// NPSH available / NPSH required (dimensionless).
    NpshMargin,
    /// NPSH available − NPSH required, m.
    NpshExcess,
    /// Pump efficiency at duty (fraction).
    Efficiency,
    /// Velocity in the suction segment next to the pump, m/s.
    SuctionVelocity,
    /// Velocity in the discharge segment next to the pump, m/s.
    DischargeVelocity,
    /// Shaft power of the running pumps, W.
    ShaftPower,
}

impl Metric {
    /// Every metric with its keyword in a design.
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
    /// The keyword as written in a design (`flow`, `npsh_margin`).
    pub fn keyword(self) -> &'static str {
        Metric::ALL
            .iter()
            .find(|(_, m)| *m == self)
            .map(|(k, _)| *k)
            .unwrap_or("?")
    }
}

/// One line of `require { ... }`: `QUANTITY >= VALUE [for CASE, ...]`.
#[derive(Clone, Debug)]
pub struct Requirement {
    /// What is constrained.
    pub metric: Metric,
    /// `true` for `>=`, `false` for `<=`.
    pub at_least: bool,
    /// SI value (m^3/s, m, ratio, m/s, W).
    pub limit_si: f64,
    /// The requirement as written, for messages and the report.
    pub text: String,
    /// Cases it applies to; empty means every case.
    pub cases: Vec<String>,
    /// Where the requirement is written.
    pub span: Span,
}

/// How the running pumps of a candidate are connected.
#[derive(Clone, Copy, Debug, PartialEq, Eq)]
pub enum ArrangementKind {
    /// One pump.
    Single,
    /// Pumps in parallel: flows add at a common head.
    Parallel,
    /// Pumps in series: heads add at a common flow.
    Series,
}

/// A `pump NAME "description" { ... }` candidate.
#[derive(Clone, Debug)]
pub struct PumpCandidate {
    /// Candidate name as written.
    pub name: String,
    /// Description as written (model, size).
    pub description: String,
    /// Rated speed, the speed of its published curves unless a curve states its own.
    pub rated_speed: Frequency,
    /// Single, parallel or series.
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
    /// The manufacturer's minimum continuous flow per pump (`min_flow`), when stated.
    pub min_flow: Option<VolumeRate>,
    /// The pump test acceptance grade of ISO 9906:2012 the purchase states (`test_grade`).
    pub test_grade: Option<crate::pumps::tolerance::Grade>,
    /// Where the pump's name is written.
    pub span: Span,
}

/// How a candidate is adjusted to meet each case's `flow >=` requirement.
#[derive(Clone, Copy, Debug, PartialEq)]
pub enum Adjust {
    /// Run as published (rated speed, the evaluated impeller).
    None,
    /// Variable-speed drive, within these fractions of the rated speed.
    Speed {
        /// Lowest speed as a fraction of the rated speed.
        min_ratio: f64,
        /// Highest speed as a fraction of the rated speed.
        max_ratio: f64,
    },
    /// Impeller trim down to this fraction of the published diameter.
    Trim {
        /// Smallest trimmed diameter as a fraction of the published diameter.
        min_ratio: f64,
    },
}

/// One published curve table, in SI.
#[derive(Clone, Debug)]
pub struct CurveData {
    /// Impeller diameter of the table, when it states one.
    pub impeller: Option<Length>,
    /// Speed of the table (the pump's rated speed unless stated).
    pub speed: Frequency,
    /// Flow of each point, strictly increasing.
    pub flow: Vec<VolumeRate>,
    /// Head of each point.
    pub head: Vec<Length>,
    /// Pump efficiency of each point, where published.
    pub efficiency: Vec<Option<Ratio>>,
    /// NPSH required of each point, where published.
    pub npshr: Vec<Option<Length>>,
    /// Shaft power of each point, where published.
    pub shaft_power: Vec<Option<uom::si::f64::Power>>,
    /// Where the curve is written.
    pub span: Span,
}

/// Which standard's motor ratings the sizing uses.
#[derive(Clone, Copy, Debug, PartialEq)]
pub enum MotorStandardChoice {
    /// NEMA MG 1 horsepower ratings.
    Nema,
    /// IEC 60072-1 kilowatt ratings.
    Iec,
}

/// The `motor` block.
#[derive(Clone, Debug)]
pub struct MotorSettings {
    /// Standard of the ratings.
    pub standard: MotorStandardChoice,
    /// Service factor (dimensionless, 1.0–1.5), reported as margin only.
    pub service_factor: f64,
    /// Motor efficiency; `None` uses the stated default.
    pub efficiency: Option<f64>,
    /// Variable-frequency drive efficiency, when a drive is used.
    pub drive_efficiency: Option<f64>,
    /// Supply frequency stated with `supply = 60 Hz`, Hz (50 or 60); `None` takes the
    /// rating series' (60 Hz NEMA, 50 Hz IEC).
    pub supply_hz: Option<f64>,
    /// The motor maker's efficiency at stated load fractions: (load fraction,
    /// efficiency fraction), loads ascending; used instead of the typical part-load
    /// curve over the profile.
    pub motor_table: Option<Vec<(f64, f64)>>,
    /// The drive maker's losses at the eight IEC 61800-9-2 points, fraction of the
    /// drive rating, in [`crate::pumps::part_load::IEC_61800_9_2_POINTS`] order.
    pub drive_losses: Option<[f64; 8]>,
}

/// The `energy` block.
#[derive(Clone, Debug)]
pub struct EnergySettings {
    /// Price of energy in currency units per joule; `None` when not given.
    pub price_per_joule: Option<f64>,
    /// The currency as written ("USD").
    pub currency: String,
    /// Life for the life-cycle energy cost, years (0 for none).
    pub years: f64,
    /// Yearly discount rate (fraction, e.g. 0.05).
    pub discount_rate: f64,
    /// Yearly escalation of the energy price (fraction).
    pub escalation: f64,
    /// Whether `discount_rate` and `escalation` are real or nominal rates.
    pub rates: super::operation::RateBasis,
    /// General inflation per year (fraction), for nominal rates.
    pub inflation: f64,
}
