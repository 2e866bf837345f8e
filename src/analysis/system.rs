//! One case's hydraulics: fluid state, static head, and the system curve as a
//! function of flow, with the suction-side losses that NPSH available needs.
//!
//! Energy equation between the two free surfaces (Bernoulli with losses, e.g.
//! White, *Fluid Mechanics*, 7th ed., §3.7 and §6.9): the pump adds
//! H(Q) = (z₂ − z₁) + (p₂ − p₁)/(ρg) + Σ f·L/D·v²/2g + Σ K·v²/2g,
//! the free-surface velocities being negligible. Wall friction is Darcy-Weisbach
//! with the friction factor of [`crate::hydraulics::friction`], or
//! Hazen-Williams for segments with a C value; minor losses use each fitting's
//! K method on the velocity of the segment that carries it.

use uom::si::{
    dynamic_viscosity::pascal_second, length::meter, mass_density::kilogram_per_cubic_meter,
    pressure::pascal, thermodynamic_temperature::kelvin,
};

use crate::analysis::network::station::StationNetwork;
use crate::analysis::system_table::SystemTable;
use crate::fluid;
use crate::hydraulics::fittings::{self, FittingSpec, KContext};
use crate::hydraulics::friction::{self, FlowRegime};
use crate::hydraulics::roughness;
use crate::message::{Kind, Message, Part};
use crate::model::{Fluid, PipeCondition, Scenario, Side};

pub use crate::hydraulics::heads::G;
use crate::hydraulics::heads::{AbsolutePressure, Elevation, GaugePressure, Head, SpecificWeight};
/// Standard sea-level atmosphere, 101 325 Pa (U.S. Standard Atmosphere 1976).
pub const STANDARD_ATMOSPHERE_PA: f64 = 101_325.0;

/// The fluid as it is in one case.
#[derive(Clone, Debug, PartialEq)]
pub struct FluidState {
    /// `water` or the design's name of the liquid.
    pub name: String,
    /// Temperature, K (when known).
    pub temperature_k: Option<f64>,
    /// Density, kg/m³.
    pub density: f64,
    /// Dynamic viscosity, Pa·s.
    pub viscosity: f64,
    /// Vapour pressure (absolute).
    pub vapor_pressure: AbsolutePressure,
    /// Where the properties come from.
    pub source: String,
}

impl FluidState {
    /// True for water (a design's `fluid water`; no other liquid can take that name),
    /// the liquid pump curves are tested on.
    pub fn is_water(&self) -> bool {
        self.name == "water"
    }

    /// Kinematic viscosity ν = μ/ρ, m²/s.
    pub fn kinematic_viscosity(&self) -> f64 {
        self.viscosity / self.density
    }

    /// Its specific weight ρg under standard gravity.
    pub fn specific_weight(&self) -> SpecificWeight {
        SpecificWeight::of_density(self.density)
    }
}

/// The source well's drawdown law, when the source tank states one.
fn well_drawdown(s: &Scenario) -> Result<Option<WellDrawdown>, SystemError> {
    for t in [&s.source, &s.destination] {
        let stated = t.drawdown.is_some() || t.test_flow.is_some() || t.well_loss.is_some();
        if stated && t.name == s.destination.name {
            return Err(SystemError {
                message: format!(
                    "tank {} is a destination: a drawdown belongs to a well the pumps draw from",
                    t.name
                ),
            });
        }
    }
    let t = &s.source;
    match (t.drawdown, t.test_flow) {
        (None, None) if t.well_loss.is_none() => Ok(None),
        (Some(d), Some(q)) => {
            let well = WellDrawdown {
                drawdown: d.get::<meter>(),
                test_flow: q.get::<uom::si::volume_rate::cubic_meter_per_second>(),
                well_loss: t.well_loss.map_or(0.0, |w| w.get::<meter>()),
            };
            if well.well_loss > well.drawdown || well.test_flow <= 0.0 {
                return Err(SystemError {
                    message: format!("well {}: its well loss exceeds its drawdown", t.name),
                });
            }
            Ok(Some(well))
        }
        _ => Err(SystemError {
            message: format!(
                "well {}: a drawdown needs its test flow (`drawdown` and `test_flow`)",
                t.name
            ),
        }),
    }
}

/// One pipe segment, resolved for a case.
#[derive(Clone, Debug)]
pub struct SegmentState {
    /// Name of the line the segment belongs to.
    pub line: std::sync::Arc<str>,
    /// Suction or discharge.
    pub side: Side,
    /// Position within its line (0-based).
    pub index: usize,
    /// Material name as in the catalogue.
    pub material: &'static str,
    /// Size as a reader sees it ("8 in schedule 40").
    pub size_label: String,
    /// Where the inner diameter comes from (a standard's table, or "given").
    pub diameter_source: String,
    /// Length, m.
    pub length: f64,
    /// Inner diameter, m.
    pub inner_diameter: f64,
    /// Flow area πD²/4, m².
    pub area: f64,
    /// Absolute roughness used by Darcy-Weisbach (also for equivalent lengths).
    pub roughness: f64,
    /// Where the roughness (or C) comes from, a publication.
    pub roughness_source: String,
    /// Hazen-Williams C (dimensionless); when set, friction is by Hazen-Williams.
    pub hazen_williams_c: Option<f64>,
    /// The fittings of the segment.
    pub fittings: Vec<FittingState>,
    /// Sum of constant K values on this segment (fittings × count, and `loss { k }`).
    pub k_constant: f64,
    /// The Reynolds-dependent fittings (2-K, 3-K) have K = K1/Re + K_fixed: the sums over
    /// them of count × K1 and of count × K_fixed, so that a flow costs one division.
    pub k_laminar_sum: f64,
    /// Σ count × K_fixed of the Reynolds-dependent fittings (dimensionless).
    pub k_fixed_sum: f64,
    /// Equivalent lengths of `loss { equivalent_length }`, m.
    pub equivalent_length: f64,
    /// Station piping (`serves = each_pump`): each pump has its own copy of the segment,
    /// carrying one pump's flow; left out of [`CaseSystem::losses`] (the header's curve).
    pub per_pump: bool,
}

/// A fitting on a segment, as used for its K.
#[derive(Clone, Debug)]
pub struct FittingState {
    /// The fitting table entry.
    pub spec: &'static FittingSpec,
    /// How many.
    pub count: u32,
    /// Diameter ratio small/large of a size change (dimensionless).
    pub beta: Option<f64>,
    /// β comes from the inner diameters of the pipes, not from the design.
    pub beta_from_bores: bool,
    /// Included angle of a taper, rad.
    pub angle_rad: Option<f64>,
    /// K without its laminar term K1/Re, in the segment's bore: K at Re = 0 for the
    /// Reynolds-dependent methods (2-K, 3-K), the whole K for the others.
    pub k_fixed: f64,
}

impl FittingState {
    /// K of one piece at Reynolds number `re` in the segment's bore: K1/Re + K_fixed.
    /// The same bits as [`k_of`] at that bore, which evaluates K_fixed anew at every call
    /// (`fittings::k_value` adds the laminar term last, and drops it at Re = 0); NaN
    /// where [`k_of`] gives NaN (Re negative or NaN, K not finite).
    pub fn k_at(&self, re: f64) -> f64 {
        if re.is_nan() || re < 0.0 {
            return f64::NAN;
        }
        let k = if fittings::is_constant(self.spec) || re == 0.0 {
            self.k_fixed
        } else {
            fittings::k_laminar_coefficient(self.spec) / re + self.k_fixed
        };
        if k.is_finite() {
            k
        } else {
            f64::NAN
        }
    }
}

/// Head losses at one flow, m of fluid.
#[derive(Clone, Copy, Debug, Default, PartialEq)]
pub struct Losses {
    /// Wall friction of every segment, m.
    pub friction: f64,
    /// Fittings and stated losses, m.
    pub minor: f64,
    /// The part of friction + minor on the suction side, m.
    pub suction: f64,
    /// The network's part: entry head at the flow minus at zero flow, m (0 for a chain).
    pub network: f64,
    /// A source well's drawdown below its static level at the flow, m (0 for a tank).
    pub drawdown: f64,
}

/// A source well's drawdown law, s = B·Q + C·Q² (Jacob 1947, "Drawdown test to determine
/// effective radius of artesian well", Trans. ASCE 112; the step-drawdown form of
/// Driscoll, *Groundwater and Wells*, 2nd ed., 1986, ch. 16, from memory), from the
/// design's test point: B·Q_t = drawdown − well loss (aquifer loss), C·Q_t² = well loss.
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct WellDrawdown {
    /// Drawdown below the static level at the test flow, m.
    pub drawdown: f64,
    /// The test flow, m³/s.
    pub test_flow: f64,
    /// The part of the drawdown at the test flow that is well loss (∝ Q²), m.
    pub well_loss: f64,
}

impl WellDrawdown {
    /// (Aquifer loss B·Q, well loss C·Q²) at flow q (m³/s), m; none at q ≤ 0.
    pub fn parts(&self, q: f64) -> (f64, f64) {
        let r = q.max(0.0) / self.test_flow;
        ((self.drawdown - self.well_loss) * r, self.well_loss * r * r)
    }

    /// Drawdown at flow q (m³/s), m.
    pub fn at(&self, q: f64) -> f64 {
        let (a, w) = self.parts(q);
        a + w
    }

    /// The drawdown's slope with flow at q (m³/s), s/m²: B + 2·C·q, 0 at q ≤ 0.
    pub fn slope(&self, q: f64) -> f64 {
        if q <= 0.0 {
            return 0.0;
        }
        let b = (self.drawdown - self.well_loss) / self.test_flow;
        let c = self.well_loss / (self.test_flow * self.test_flow);
        b + 2.0 * c * q
    }
}

/// A case's hydraulic model.
#[derive(Clone, Debug)]
pub struct CaseSystem {
    /// The fluid in this case.
    pub fluid: FluidState,
    /// Barometric pressure (absolute).
    pub barometric: AbsolutePressure,
    /// Where the barometric pressure comes from.
    pub barometric_source: String,
    /// Source free-surface level on the design's datum.
    pub source_level: Elevation,
    /// Destination free-surface level on the design's datum.
    pub destination_level: Elevation,
    /// Pump centreline elevation on the design's datum.
    pub centreline: Elevation,
    /// Absolute pressure on the source surface.
    pub source_surface: AbsolutePressure,
    /// Absolute pressure on the destination surface.
    pub destination_surface: AbsolutePressure,
    /// Static head: level difference plus surface pressure difference / ρg, m.
    pub static_head: f64,
    /// Every segment of every line, suction first; shared by the cases whose lines and
    /// pipe condition are the same ([`SharedSegments`]).
    pub segments: std::sync::Arc<Vec<SegmentState>>,
    /// New or aged pipe in this case.
    pub pipe_condition: PipeCondition,
    /// The network the discharge lines feed (general form), with its entry head at
    /// zero station flow, m; `None` for a single chain.
    pub network: Option<(StationNetwork, f64)>,
    /// Set when a network solve at some flow failed (the case is then reported failed).
    pub network_failed: Flag,
    /// The source is a well with a drawdown (its `source_level` the static level).
    pub well: Option<WellDrawdown>,
    /// A closed loop: the discharge (or the network) returns to the source tank.
    pub closed_loop: bool,
    /// The system curve tabulated for the fast duty path ([`CaseSystem::tabulate`]);
    /// `None` until tabulated, and for a network.
    pub duty_table: Option<std::sync::Arc<SystemTable>>,
}

/// A flag that can be raised through a shared reference: an atomic, so that a
/// [`CaseSystem`] can be read by several threads at once (the yearly operation runs its
/// candidates in parallel). Cloning copies its state.
#[derive(Debug, Default)]
pub struct Flag(std::sync::atomic::AtomicBool);

impl Flag {
    /// Whether the flag is raised.
    pub fn get(&self) -> bool {
        self.0.load(std::sync::atomic::Ordering::Relaxed)
    }
    /// Raise or lower the flag.
    pub fn set(&self, value: bool) {
        self.0.store(value, std::sync::atomic::Ordering::Relaxed);
    }
}

impl Clone for Flag {
    fn clone(&self) -> Flag {
        Flag(std::sync::atomic::AtomicBool::new(self.get()))
    }
}

/// Why a case could not be set up.
#[derive(Clone, Debug, PartialEq)]
pub struct SystemError {
    /// What is wrong, in words.
    pub message: String,
}

/// The mixture as the outputs name it: "ethylene glycol, 30 % by mass", or "..., 35 %
/// by volume (37.4 % by mass)".
fn glycol_name(g: &crate::model::GlycolMixture) -> String {
    let pc = |x: f64| crate::numbers::significant_trimmed(100.0 * x, 3);
    match g.basis {
        crate::model::FractionBasis::Mass => {
            format!("{}, {} % by mass", g.glycol.name(), pc(g.fraction))
        }
        crate::model::FractionBasis::Volume => format!(
            "{}, {} % by volume ({} % by mass)",
            g.glycol.name(),
            pc(g.fraction),
            pc(g.mass_fraction())
        ),
    }
}

/// A glycol mixture's state: density and viscosity by Melinder (2010) at its mass
/// fraction and temperature; the source gives no vapour pressure, so water's at the
/// temperature is used (IAPWS-IF97; glycol lowers the mixture's, so this is on the safe
/// side for NPSH), and below 0 °C water's at its triple point (611.7 Pa), which is
/// higher still.
fn glycol_state(g: &crate::model::GlycolMixture) -> Result<FluidState, SystemError> {
    let t = g.temperature.get::<kelvin>();
    let x = g.mass_fraction();
    let (density, viscosity) = fluid::glycol::glycol_properties(g.glycol, x, t)
        .map_err(|e| SystemError { message: e.message })?;
    let vapor_pressure = fluid::saturation_pressure_pa(t.max(fluid::water::TRIPLE_POINT_K))
        .map_err(|e| SystemError { message: e.message })?;
    Ok(FluidState {
        name: glycol_name(g),
        temperature_k: Some(t),
        density,
        viscosity,
        vapor_pressure: AbsolutePressure::new(vapor_pressure),
        source: format!(
            "Melinder, Properties of Secondary Working Fluids for Indirect Systems, 2nd ed., IIR 2010 (density, viscosity, freezing point); vapour pressure of water, IAPWS-IF97{}",
            if t < fluid::water::TRIPLE_POINT_K {
                " at its triple point (0.01 °C, 611.7 Pa: below 0 °C the formulation gives no liquid value, and this is higher than the mixture's, so on the safe side)"
            } else {
                " at the temperature (the mixture's is lower, so on the safe side)"
            }
        ),
    })
}

impl CaseSystem {
    /// Resolve a scenario: fluid properties, barometric pressure, pipes.
    pub fn new(s: &Scenario) -> Result<CaseSystem, SystemError> {
        CaseSystem::with_segments(s, || chain_segments(s).map(std::sync::Arc::new))
    }

    /// [`CaseSystem::new`] with the segments shared with other cases of the same lines
    /// and pipe condition where there are some ([`SharedSegments`]).
    pub fn new_shared(s: &Scenario, shared: &SharedSegments) -> Result<CaseSystem, SystemError> {
        CaseSystem::with_segments(s, || shared.segments(s))
    }

    /// [`CaseSystem::new`] with its segments from `segments` (asked for where `new`
    /// resolves them, so a design's first error stays the same).
    fn with_segments(
        s: &Scenario,
        segments: impl FnOnce() -> Result<std::sync::Arc<Vec<SegmentState>>, SystemError>,
    ) -> Result<CaseSystem, SystemError> {
        let barometric = s
            .site
            .barometric()
            .map_err(|message| SystemError { message })?;
        let barometric_source = match s.site.barometric_pressure {
            Some(_) => "given in the design".to_string(),
            None => format!(
                "U.S. Standard Atmosphere 1976 at {:.2} m elevation",
                s.site.elevation.get::<meter>()
            ),
        };
        let source_surface = s.source.surface_pressure.absolute(barometric);
        let destination_surface = s.destination.surface_pressure.absolute(barometric);
        if !source_surface.is_above_vacuum() || !destination_surface.is_above_vacuum() {
            return Err(SystemError { message: "a tank's absolute surface pressure is zero or negative (a vacuum below absolute zero)".into() });
        }
        let fluid = match &s.fluid {
            Fluid::Water { temperature } => {
                let t = temperature.get::<kelvin>();
                let p = fluid::water(t, source_surface.pa())
                    .map_err(|e| SystemError { message: e.message })?;
                FluidState {
                    name: "water".into(),
                    temperature_k: Some(t),
                    density: p.density_kg_m3,
                    viscosity: p.dynamic_viscosity_pa_s,
                    vapor_pressure: AbsolutePressure::new(p.vapor_pressure_pa),
                    source: "IAPWS-IF97 (density, vapour pressure) and IAPWS 2008 (viscosity)"
                        .into(),
                }
            }
            Fluid::Glycol(g) => glycol_state(g)?,
            Fluid::Custom(c) => FluidState {
                name: c.name.clone(),
                temperature_k: c.temperature.map(|t| t.get::<kelvin>()),
                density: c.density.get::<kilogram_per_cubic_meter>(),
                viscosity: c.viscosity.get::<pascal_second>(),
                vapor_pressure: AbsolutePressure::new(c.vapor_pressure.get::<pascal>()),
                source: "given in the design".into(),
            },
        };
        let segments = segments()?;
        let w = fluid.specific_weight();
        let source_level = Elevation::new(s.source.level.get::<meter>());
        let destination_level = Elevation::new(s.destination.level.get::<meter>());
        // (z₂ − z₁) + (p₂ − p₁)/(ρg), both surface pressures absolute.
        let static_head =
            destination_level.above(source_level) + (destination_surface - source_surface).head(w);
        let (network, static_head) = match &s.network {
            None => (None, static_head.m()),
            Some(layout) => {
                let net = StationNetwork::build(s, layout, &fluid, barometric.pa())?;
                let h0 = net.entry_head(0.0).map_err(|e| SystemError {
                    message: format!("the network: {e}"),
                })?;
                // The entry grade (gauge-based) stands in for the destination surface:
                // raised by the barometric head it is on the absolute basis. A closed
                // loop returns to its source: no static head, exactly.
                let stat = if s.destination.name == s.source.name {
                    0.0
                } else {
                    (Elevation::new(h0)
                        .raised(barometric.head(w))
                        .above(source_level)
                        - source_surface.head(w))
                    .m()
                };
                (Some((net, h0)), stat)
            }
        };
        let well = well_drawdown(s)?;
        let (destination_level, destination_surface) = match network
            .as_ref()
            .and_then(|(n, _)| Some((n, n.governing_at_zero()?)))
        {
            // A demand-only network: its governing node at zero flow stands in for
            // the destination surface (elevation, required pressure).
            Some((n, i)) => {
                let node = &n.network.nodes[i];
                let p = node.required_pressure.unwrap_or(0.0);
                (
                    Elevation::new(node.elevation),
                    GaugePressure::new(p).absolute(barometric),
                )
            }
            None => (destination_level, destination_surface),
        };
        Ok(CaseSystem {
            well,
            closed_loop: s.destination.name == s.source.name,
            network,
            network_failed: Flag::default(),
            duty_table: None,
            fluid,
            barometric,
            barometric_source,
            source_level,
            destination_level,
            centreline: Elevation::new(s.centreline.get::<meter>()),
            source_surface,
            destination_surface,
            static_head,
            segments,
            pipe_condition: s.pipe_condition,
        })
    }

    /// The gauge pressure on the source surface.
    pub fn source_gauge(&self) -> GaugePressure {
        self.source_surface.gauge(self.barometric)
    }

    /// The gauge pressure on the destination surface.
    pub fn destination_gauge(&self) -> GaugePressure {
        self.destination_surface.gauge(self.barometric)
    }

    /// The hydraulic grade of the source surface on the gauge basis (barometric
    /// pressure is zero): its level raised by p_g/(ρg).
    pub fn source_grade(&self) -> Elevation {
        self.source_level
            .raised(self.source_gauge().head(self.fluid.specific_weight()))
    }

    /// The hydraulic grade of the destination surface on the gauge basis.
    pub fn destination_grade(&self) -> Elevation {
        self.destination_level
            .raised(self.destination_gauge().head(self.fluid.specific_weight()))
    }

    /// Reynolds number in a segment at flow q (m³/s).
    pub fn reynolds(&self, seg: &SegmentState, q: f64) -> f64 {
        reynolds_in(&self.fluid, seg, q)
    }

    /// Darcy friction factor and regime in a segment at flow q.
    pub fn friction(&self, seg: &SegmentState, q: f64) -> friction::Friction {
        friction_in(&self.fluid, seg, q)
    }

    /// Wall-friction and minor losses of one segment at flow q, m.
    pub fn segment_losses(&self, seg: &SegmentState, q: f64) -> (f64, f64) {
        segment_losses_in(&self.fluid, seg, q)
    }

    /// All losses at flow q of the piping the whole set's flow passes (station piping,
    /// `serves = each_pump`, is left out: see [`CaseSystem::station_losses`]).
    pub fn losses(&self, q: f64) -> Losses {
        self.sum_losses::<false>(q).0
    }

    /// All losses at flow q, and the slope with flow of the chain's friction + minor
    /// losses, s/m² (the network's part has no slope here).
    pub fn losses_with_slope(&self, q: f64) -> (Losses, f64) {
        self.sum_losses::<true>(q)
    }

    /// Every segment's losses summed at q, with the slope only when `SLOPE` (else 0).
    fn sum_losses<const SLOPE: bool>(&self, q: f64) -> (Losses, f64) {
        let mut out = Losses::default();
        let mut slope = 0.0;
        for seg in self.segments.iter().filter(|s| !s.per_pump) {
            let l = segment_losses_with::<SLOPE>(&self.fluid, seg, q);
            out.friction += l.wall;
            out.minor += l.minor;
            slope += l.wall_slope + l.minor_slope;
            if seg.side == Side::Suction {
                out.suction += l.wall + l.minor;
            }
        }
        out.network = self.network_head(q);
        out.drawdown = self.drawdown(q);
        slope += self.well.map_or(0.0, |w| w.slope(q));
        (out, slope)
    }

    /// System head at flow q, m, and its slope dH/dq, s/m², for a chain (the network's
    /// part of the head has no slope here; see [`CaseSystem::losses_with_slope`]).
    pub fn head_and_slope(&self, q: f64) -> (f64, f64) {
        let (l, slope) = self.losses_with_slope(q);
        (
            self.static_head + l.friction + l.minor + l.network + l.drawdown,
            slope,
        )
    }

    /// Tabulate the system curve on [0, q_max] (m³/s) for the duty solves
    /// ([`SystemTable`]); a network is not tabulated.
    pub fn tabulate(&mut self, q_max: f64) {
        self.duty_table = SystemTable::new(self, q_max).map(std::sync::Arc::new);
    }

    /// [`CaseSystem::tabulate`] with a table shared with other cases of equal losses
    /// where there is one ([`super::system_table::SharedTables`]).
    pub fn tabulate_shared(&mut self, q_max: f64, tables: &super::system_table::SharedTables) {
        self.duty_table = tables.table(self, q_max);
    }

    /// The pump scan of a candidate for the fast duty path, when it holds for this
    /// system: not with station piping (each pump's own branches change the set's curve).
    pub fn scan<'a>(
        &self,
        cc: &'a super::duty::CandidateCurves,
    ) -> Option<&'a crate::pumps::PumpScan> {
        if self.segments.iter().any(|s| s.per_pump) {
            None
        } else {
            cc.duty_scan.as_ref()
        }
    }

    /// The source well's drawdown at flow q (m³/s), m; 0 for a tank.
    pub fn drawdown(&self, q: f64) -> f64 {
        self.well.map_or(0.0, |w| w.at(q))
    }

    /// System head at flow q, m.
    pub fn head(&self, q: f64) -> f64 {
        let l = self.losses(q);
        self.static_head + l.friction + l.minor + l.network + l.drawdown
    }

    /// The network's part of the system head at flow q, m: H_entry(q) − H_entry(0).
    /// A failed solve marks the case ([`CaseSystem::network_failed`]) and counts 0.
    pub fn network_head(&self, q: f64) -> f64 {
        match &self.network {
            None => 0.0,
            Some((net, h0)) => match net.entry_head(q.max(0.0)) {
                Ok(h) => h - h0,
                Err(_) => {
                    self.network_failed.set(true);
                    0.0
                }
            },
        }
    }

    /// NPSH available at the pump suction at flow q, m: the absolute pressure head on
    /// the source surface, plus the source level above the pump centreline, minus the
    /// suction losses, minus the vapour-pressure head (ANSI/HI 9.6.1; Karassik et al.,
    /// *Pump Handbook*, 4th ed., ch. 2).
    pub fn npsh_available(&self, q: f64) -> f64 {
        let l = self.losses(q);
        self.npsh_available_after(l.suction + l.drawdown)
    }

    /// NPSH available, m, for a suction-line loss already computed (see
    /// [`CaseSystem::npsh_available`]); a well's drawdown counts as part of it.
    pub fn npsh_available_after(&self, suction_loss: f64) -> f64 {
        let w = self.fluid.specific_weight();
        (self.source_surface.head(w) + self.source_level.above(self.centreline)
            - Head::new(suction_loss)
            - self.fluid.vapor_pressure.head(w))
        .m()
    }

    /// Whether the design gives station piping (`serves = each_pump` lines).
    pub fn has_station_piping(&self) -> bool {
        self.segments.iter().any(|s| s.per_pump)
    }

    /// Losses of one pump's own station piping at its flow `qp` (m³/s), m: (suction
    /// branch, discharge branch), each wall friction + minor losses. Both 0 without
    /// station piping.
    pub fn station_losses(&self, qp: f64) -> (f64, f64) {
        let (mut suction, mut discharge) = (0.0, 0.0);
        for seg in self.segments.iter().filter(|s| s.per_pump) {
            let (wall, minor) = self.segment_losses(seg, qp);
            match seg.side {
                Side::Suction => suction += wall + minor,
                Side::Discharge => discharge += wall + minor,
            }
        }
        (suction, discharge)
    }

    /// Head one pump's station piping takes at its flow `qp` (m³/s), suction and
    /// discharge branches together, m: the "modified pump curve" of a station, the pump's
    /// head less its own piping's loss, is what the set offers its headers (Sanks,
    /// *Pumping Station Design*, 3rd ed., ch. on system and pump curves, from memory).
    pub fn station_loss(&self, qp: f64) -> f64 {
        let (s, d) = self.station_losses(qp);
        s + d
    }

    /// NPSH available of one pump of a set, m: the common suction piping at the set's
    /// flow `q` and the pump's own suction branch at its flow `qp` (m³/s); see
    /// [`CaseSystem::npsh_available`]. Equal to it without station piping.
    pub fn npsh_available_per_pump(&self, q: f64, qp: f64) -> f64 {
        let l = self.losses(q);
        self.npsh_available_after(l.suction + l.drawdown + self.station_losses(qp).0)
    }

    /// The flow a segment carries when the set carries `q` and each pump `qp`, m³/s.
    pub fn segment_flow(&self, seg: &SegmentState, q: f64, qp: f64) -> f64 {
        if seg.per_pump {
            qp
        } else {
            q
        }
    }

    /// Velocity in the segment next to the pump on a side, m/s.
    pub fn pump_velocity(&self, side: Side, q: f64) -> Option<f64> {
        self.pump_velocity_set(side, q, q)
    }

    /// Velocity next to the pump on a side when the set carries `q` and each pump `qp`
    /// (m³/s), m/s: station piping there carries `qp`.
    pub fn pump_velocity_set(&self, side: Side, q: f64, qp: f64) -> Option<f64> {
        let seg = match side {
            Side::Suction => self.segments.iter().rev().find(|s| s.side == Side::Suction),
            Side::Discharge => self.segments.iter().find(|s| s.side == Side::Discharge),
        }?;
        Some(self.segment_flow(seg, q, qp) / seg.area)
    }

    /// Validity warnings at flow q, one per segment and remark: the laminar-turbulent
    /// transition, Darcy-Weisbach beyond Moody's (1944) chart, and Hazen-Williams outside
    /// its range (water only: `custom_fluid` names a liquid that is not water).
    pub fn flow_warnings(&self, q: f64, custom_fluid: Option<&str>) -> Vec<Message> {
        self.flow_warnings_set(q, q, custom_fluid)
    }

    /// [`CaseSystem::flow_warnings`] when the set carries `q_set` and each pump `qp`
    /// (m³/s): station piping is judged at `qp`.
    pub fn flow_warnings_set(
        &self,
        q_set: f64,
        qp: f64,
        custom_fluid: Option<&str>,
    ) -> Vec<Message> {
        let mut out = Vec::new();
        for (i, regime, re) in self.regimes_set(q_set, qp) {
            let seg = &self.segments[i];
            let q = self.segment_flow(seg, q_set, qp);
            if regime == FlowRegime::Transitional {
                out.push(Message::text(format!("line {} segment {}: Re = {re:.0} lies in the laminar-turbulent transition (2000–4000): friction is uncertain", seg.line, seg.index + 1)));
            }
            if let Some(c) = seg.hazen_williams_c {
                let mut ws: Vec<Message> = friction::hazen_williams_remarks(
                    q / seg.area,
                    seg.inner_diameter,
                    c,
                    self.fluid.temperature_k.unwrap_or(288.15),
                )
                .into_iter()
                .map(hazen_williams_remark)
                .collect();
                if let Some(name) = custom_fluid {
                    ws.push(Message::text(format!("Hazen-Williams is fitted to water, not to {name}; use Darcy-Weisbach with Colebrook")));
                }
                for w in ws {
                    out.push(w.prefixed(format!("line {} segment {}: ", seg.line, seg.index + 1)));
                }
            } else if regime != FlowRegime::Laminar {
                // Beyond Moody's chart (Re > 1e8, eps/D > 0.05). The first warning of
                // `friction_warnings` in the transition is the one given just above.
                let rr = seg.roughness / seg.inner_diameter;
                let skip = usize::from(regime == FlowRegime::Transitional);
                for w in friction::friction_warnings(re, rr).into_iter().skip(skip) {
                    out.push(Message::text(format!(
                        "line {} segment {}: {w}",
                        seg.line,
                        seg.index + 1
                    )));
                }
            }
        }
        out
    }

    /// The regimes met at flow q, with the segment each occurs in.
    pub fn regimes(&self, q: f64) -> Vec<(usize, FlowRegime, f64)> {
        self.regimes_set(q, q)
    }

    /// The regimes met when the set carries `q_set` and each pump `qp` (m³/s).
    fn regimes_set(&self, q_set: f64, qp: f64) -> Vec<(usize, FlowRegime, f64)> {
        self.segments
            .iter()
            .enumerate()
            .map(|(i, s)| {
                let q = self.segment_flow(s, q_set, qp);
                (i, self.friction(s, q).regime, self.reynolds(s, q))
            })
            .collect()
    }
}

/// NPSH available term by term, m of the case's fluid, signed so that they sum to
/// NPSH available (ANSI/HI 9.6.1; Karassik et al., *Pump Handbook*, 4th ed., ch. 2).
#[derive(Clone, Copy, Debug, Default, PartialEq)]
pub struct NpshTerms {
    /// Barometric pressure head p_baro/(ρg), m.
    pub barometric_head: f64,
    /// Gauge pressure on the source surface as head (p_abs − p_baro)/(ρg), m.
    pub surface_pressure_head: f64,
    /// Source level minus the pump datum (centreline), m; for a well, its pumping level
    /// (static level less the drawdown at the flow).
    pub static_suction_head: f64,
    /// Minus the vapour-pressure head, −p_v/(ρg), m.
    pub vapour_pressure_head: f64,
    /// Minus the wall-friction loss of the suction segments, m.
    pub suction_friction_head: f64,
    /// Minus the minor (fitting and stated) losses of the suction segments, m.
    pub suction_minor_head: f64,
}

impl NpshTerms {
    /// The sum of the terms: NPSH available, m.
    pub fn sum(&self) -> f64 {
        self.barometric_head
            + self.surface_pressure_head
            + self.static_suction_head
            + self.vapour_pressure_head
            + self.suction_friction_head
            + self.suction_minor_head
    }
}

/// One segment at one flow: what a reviewer needs to recompute its losses.
#[derive(Clone, Debug, PartialEq)]
pub struct SegmentAtFlow {
    /// Name of the line.
    pub line: std::sync::Arc<str>,
    /// Suction or discharge.
    pub side: Side,
    /// Position within its line (0-based).
    pub index: usize,
    /// Flow, m³/s.
    pub flow: f64,
    /// Mean velocity Q/A, m/s.
    pub velocity: f64,
    /// Velocity head v²/2g, m.
    pub velocity_head: f64,
    /// Reynolds number ρvD/μ.
    pub reynolds: f64,
    /// Darcy friction factor; `None` on a Hazen-Williams segment.
    pub friction_factor: Option<f64>,
    /// Wall-friction loss, m.
    pub friction_head: f64,
    /// Minor loss (fittings, stated K and equivalent lengths), m.
    pub minor_head: f64,
    /// K of one piece of every fitting on the segment at this Reynolds number, in order.
    pub fittings_k: Vec<f64>,
}

impl CaseSystem {
    /// NPSH available at flow q (m³/s), term by term (see [`NpshTerms`]); station
    /// piping is left out (the suction header's value).
    pub fn npsh_terms(&self, q: f64) -> NpshTerms {
        self.npsh_terms_of(q, None)
    }

    /// NPSH available of one pump of a set, term by term: the common suction piping at
    /// the set's flow `q`, the pump's own suction branch at its flow `qp` (m³/s).
    pub fn npsh_terms_per_pump(&self, q: f64, qp: f64) -> NpshTerms {
        self.npsh_terms_of(q, Some(qp))
    }

    /// The NPSH terms with station piping at `qp` when given, else left out.
    fn npsh_terms_of(&self, q: f64, qp: Option<f64>) -> NpshTerms {
        let w = self.fluid.specific_weight();
        let (mut friction, mut minor) = (0.0, 0.0);
        for seg in self.segments.iter().filter(|s| s.side == Side::Suction) {
            let flow = match (seg.per_pump, qp) {
                (false, _) => q,
                (true, Some(qp)) => qp,
                (true, None) => continue,
            };
            let (wall, m) = self.segment_losses(seg, flow);
            friction += wall;
            minor += m;
        }
        NpshTerms {
            barometric_head: self.barometric.head(w).m(),
            surface_pressure_head: self.source_gauge().head(w).m(),
            static_suction_head: self
                .source_level
                .lowered(Head::new(self.drawdown(q)))
                .above(self.centreline)
                .m(),
            vapour_pressure_head: (-self.fluid.vapor_pressure.head(w)).m(),
            suction_friction_head: -friction,
            suction_minor_head: -minor,
        }
    }

    /// Every segment at flow q (m³/s), in the order of [`CaseSystem::segments`].
    pub fn segments_at(&self, q: f64) -> Vec<SegmentAtFlow> {
        self.segments_at_set(q, q)
    }

    /// Every segment when the set carries `q` and each pump `qp` (m³/s): station piping
    /// at `qp`, the rest at `q`.
    pub fn segments_at_set(&self, q_set: f64, qp: f64) -> Vec<SegmentAtFlow> {
        self.segments
            .iter()
            .map(|seg| {
                let q = self.segment_flow(seg, q_set, qp);
                let velocity = q / seg.area;
                let reynolds = self.reynolds(seg, q);
                let (friction_head, minor_head) = self.segment_losses(seg, q);
                SegmentAtFlow {
                    line: seg.line.clone(),
                    side: seg.side,
                    index: seg.index,
                    flow: q,
                    velocity,
                    velocity_head: velocity * velocity / (2.0 * G),
                    reynolds,
                    friction_factor: match seg.hazen_williams_c {
                        Some(_) => None,
                        None if q > 0.0 => Some(self.friction(seg, q).f),
                        None => None,
                    },
                    friction_head,
                    minor_head,
                    fittings_k: seg.fittings.iter().map(|f| f.k_at(reynolds)).collect(),
                }
            })
            .collect()
    }
}

/// K of one fitting (one piece) at a Reynolds number in a pipe of diameter d.
/// Its parameters were validated when the case was set up ([`CaseSystem::new`]).
pub fn k_of(f: &FittingState, re: f64, d: f64) -> f64 {
    fittings::k_value(
        f.spec,
        KContext {
            reynolds: re,
            inner_diameter_m: d,
            beta: f.beta,
            angle_rad: f.angle_rad,
        },
    )
    .unwrap_or(f64::NAN)
}

/// A Hazen-Williams remark in words with its value and limit
/// (limits common practice, see [`friction::HazenWilliamsRemark`]).
fn hazen_williams_remark(remark: friction::HazenWilliamsRemark) -> Message {
    use friction::HazenWilliamsRemark as R;
    match remark {
        R::NotFinite(name, value) => Message::text(format!(
            "Hazen-Williams: {name} is not a finite number ({value})"
        )),
        R::Temperature(t) => {
            let (lo, hi) = friction::HW_TEMPERATURE_RANGE_K;
            crate::message![
                "Hazen-Williams is fitted to water at ordinary temperatures (about ",
                Part::Figure(Kind::Temperature, lo),
                "–",
                Part::Typeset(Kind::Temperature, hi),
                "); ",
                Part::Typeset(Kind::Temperature, t),
                " is outside, use Darcy-Weisbach with Colebrook"
            ]
        }
        R::Velocity(v) => crate::message![
            "Hazen-Williams: velocity ",
            Part::Against(Kind::Velocity, v, friction::HW_MAX_VELOCITY),
            " is above about ",
            Part::Against(Kind::Velocity, friction::HW_MAX_VELOCITY, v),
            ", where its fixed exponents misjudge the loss; use Darcy-Weisbach"
        ],
        R::Diameter(d) => crate::message![
            "Hazen-Williams: inside diameter ",
            Part::Against(Kind::Diameter, d, friction::HW_MIN_DIAMETER),
            " is below about ",
            Part::Against(Kind::Diameter, friction::HW_MIN_DIAMETER, d),
            ", outside the pipes it was fitted to; use Darcy-Weisbach"
        ],
        R::C(c) => crate::message![
            "Hazen-Williams: C = ",
            Part::Significant(c, 4),
            " is outside the usual 60–150 range of published C values"
        ],
    }
}

/// Reynolds number ρ|v|D/μ in a segment at flow q (m³/s) of a fluid.
pub fn reynolds_in(fluid: &FluidState, seg: &SegmentState, q: f64) -> f64 {
    let v = q.abs() / seg.area;
    fluid.density * v * seg.inner_diameter / fluid.viscosity
}

/// Darcy friction factor and regime in a segment at flow q (m³/s) of a fluid.
pub fn friction_in(fluid: &FluidState, seg: &SegmentState, q: f64) -> friction::Friction {
    friction::darcy_friction_factor(
        reynolds_in(fluid, seg, q).max(1e-9),
        seg.roughness / seg.inner_diameter,
    )
}

/// Wall-friction and minor losses of one segment at flow q (m³/s) of a fluid, m
/// (zero at q <= 0); see the module documentation for the laws.
pub fn segment_losses_in(fluid: &FluidState, seg: &SegmentState, q: f64) -> (f64, f64) {
    let l = segment_losses_with::<false>(fluid, seg, q);
    (l.wall, l.minor)
}

/// One segment's losses at a flow and their slopes with flow.
#[derive(Clone, Copy, Debug, Default, PartialEq)]
pub struct SegmentLoss {
    /// Wall-friction loss, m.
    pub wall: f64,
    /// Minor loss (fittings, stated K and equivalent lengths), m.
    pub minor: f64,
    /// d(wall)/dq, s/m².
    pub wall_slope: f64,
    /// d(minor)/dq, s/m².
    pub minor_slope: f64,
}

/// Losses of one segment at flow q (m³/s) of a fluid and their analytic slopes (all zero
/// at q <= 0; see the module documentation for the laws). With h = f·(L/D)·v²/2g and
/// v = q/A, Re = ρvD/μ ∝ q: dh/dq = (h/q)·(2 + (Re/f)·df/dRe), df/dRe of
/// [`friction::darcy_friction_slope`]; Hazen-Williams h ∝ q^1.852 gives 1.852·h/q; a
/// constant K gives 2·h/q and the K₁/Re part of a 2-K/3-K fitting (∝ q) gives h/q.
pub fn segment_loss_slopes_in(fluid: &FluidState, seg: &SegmentState, q: f64) -> SegmentLoss {
    segment_losses_with::<true>(fluid, seg, q)
}

/// The losses of [`segment_loss_slopes_in`], their slopes only when `SLOPE` (else zero):
/// the value-only callers do not pay for the friction factor's derivative.
fn segment_losses_with<const SLOPE: bool>(
    fluid: &FluidState,
    seg: &SegmentState,
    q: f64,
) -> SegmentLoss {
    if q <= 0.0 {
        return SegmentLoss::default();
    }
    let v = q / seg.area;
    let velocity_head = v * v / (2.0 * G);
    let re = reynolds_in(fluid, seg, q);
    // Wall friction and equivalent lengths by the segment's one method; the Darcy
    // friction factor is only solved for when Darcy-Weisbach is used.
    let (wall, equivalent, exponent) = match seg.hazen_williams_c {
        Some(c) => {
            let d = seg.inner_diameter;
            let wall = friction::hazen_williams_head_loss_m(q, d, seg.length, c);
            let equivalent = if seg.equivalent_length > 0.0 {
                friction::hazen_williams_head_loss_m(q, d, seg.equivalent_length, c)
            } else {
                0.0
            };
            (wall, equivalent, 1.852)
        }
        None => {
            let fr = friction_in(fluid, seg, q);
            let (f, re) = (fr.f, re.max(1e-9));
            let rr = seg.roughness / seg.inner_diameter;
            let exponent = if SLOPE {
                2.0 + re / f * friction::darcy_friction_slope(re, rr, &fr)
            } else {
                0.0
            };
            (
                f * seg.length / seg.inner_diameter * velocity_head,
                f * seg.equivalent_length / seg.inner_diameter * velocity_head,
                exponent,
            )
        }
    };
    // Σ count·(K1/Re + K_fixed) of the 2-K and 3-K fittings; like `k_value`, the
    // K1/Re term is dropped at Re = 0.
    let laminar = if re > 0.0 {
        seg.k_laminar_sum / re
    } else {
        0.0
    };
    let k_quadratic = seg.k_constant + seg.k_fixed_sum;
    let k = k_quadratic + laminar;
    if !SLOPE {
        return SegmentLoss {
            wall,
            minor: k * velocity_head + equivalent,
            ..SegmentLoss::default()
        };
    }
    SegmentLoss {
        wall,
        minor: k * velocity_head + equivalent,
        wall_slope: exponent * wall / q,
        minor_slope: ((2.0 * k_quadratic + laminar) * velocity_head + exponent * equivalent) / q,
    }
}

/// Every segment of the scenario's lines, suction first, resolved for its pipe condition
/// ([`resolve_segment`]).
fn chain_segments(s: &Scenario) -> Result<Vec<SegmentState>, SystemError> {
    let mut segments = Vec::new();
    let mut ordered: Vec<&crate::model::Line> =
        s.lines.iter().filter(|l| l.side == Side::Suction).collect();
    ordered.extend(s.lines.iter().filter(|l| l.side == Side::Discharge));
    for line in ordered {
        for (i, seg) in line.segments.iter().enumerate() {
            let mut state = resolve_segment(s, &line.name, line.side, i, seg)?;
            state.per_pump = line.per_pump;
            segments.push(state);
        }
    }
    Ok(segments)
}

/// The resolved segments of an analysis's cases, shared between cases of the same lines
/// and pipe condition ([`LinesKey`]): the segments are a function of those alone, and
/// cases share their lines with the base scenario unless an override changes a segment
/// (`Scenario::lines`), so a design of thousands of cases of new and aged pipe resolves
/// its segments twice ([`super::shared`]).
#[derive(Debug, Default)]
pub struct SharedSegments(super::shared::Kept<LinesKey, Vec<SegmentState>>);

impl SharedSegments {
    /// The segments of `s`, resolved or reused; an error is not kept.
    pub fn segments(&self, s: &Scenario) -> Result<std::sync::Arc<Vec<SegmentState>>, SystemError> {
        let key = LinesKey(std::sync::Arc::clone(&s.lines), s.pipe_condition);
        self.0
            .try_get_or(key, || chain_segments(s).map(std::sync::Arc::new))
    }
}

/// Lines by identity (`Arc::ptr_eq`: the very lines a case shares, which the key holds,
/// so the address is not reused) and a pipe condition.
#[derive(Debug)]
pub struct LinesKey(std::sync::Arc<Vec<crate::model::Line>>, PipeCondition);

impl PartialEq for LinesKey {
    fn eq(&self, other: &LinesKey) -> bool {
        std::sync::Arc::ptr_eq(&self.0, &other.0) && self.1 == other.1
    }
}

/// Resolve one pipe segment of a line for a scenario: roughness for the pipe condition,
/// fittings validated, their K sums split into constant and Reynolds-dependent parts.
pub fn resolve_segment(
    s: &Scenario,
    line_name: &str,
    side: Side,
    i: usize,
    seg: &crate::model::Segment,
) -> Result<SegmentState, SystemError> {
    let d = seg.inner_diameter.get::<meter>();
    let (roughness, roughness_source) = match (seg.roughness, roughness::roughness(seg.material)) {
                    (Some(r), _) => (r.get::<meter>(), "given in the design".to_string()),
                    (None, Some(entry)) => match s.pipe_condition {
                        PipeCondition::New => (entry.new_m, format!("{} (new)", entry.source)),
                        PipeCondition::Aged => (entry.aged_m, format!("{} (aged: {})", entry.source, entry.aged_note)),
                    },
                    (None, None) if seg.hazen_williams_c.is_some() => (0.0, "not used (Hazen-Williams)".to_string()),
                    (None, None) => {
                        return Err(SystemError { message: format!("line {} segment {}: material `{}` has no tabulated roughness; give `roughness = ...`", line_name, i + 1, seg.material.keyword()) })
                    }
                };
    let mut k_constant = 0.0;
    let mut fits = Vec::new();
    for f in &seg.fittings {
        let ctx = KContext {
            reynolds: 1e5,
            inner_diameter_m: d,
            beta: f.beta,
            angle_rad: f.angle_rad,
        };
        fittings::k_value(f.spec, ctx).map_err(|e| SystemError {
            message: format!(
                "fitting `{}` on line `{}`: {}",
                f.spec.name, line_name, e.message
            ),
        })?;
        let mut state = FittingState {
            spec: f.spec,
            count: f.count,
            beta: f.beta,
            beta_from_bores: f.beta_from_bores,
            angle_rad: f.angle_rad,
            k_fixed: 0.0,
        };
        // At Re = 0 the K1/Re term is dropped, leaving K_fixed; a constant K is the same
        // at any Re.
        let re = if fittings::is_constant(f.spec) {
            1e6
        } else {
            0.0
        };
        state.k_fixed = k_of(&state, re, d);
        fits.push(state);
    }
    let mut equivalent_length = 0.0;
    for l in &seg.losses {
        k_constant += l.k.unwrap_or(0.0);
        equivalent_length += l.equivalent_length.map(|x| x.get::<meter>()).unwrap_or(0.0);
    }
    let (mut k_laminar_sum, mut k_fixed_sum) = (0.0, 0.0);
    for f in &fits {
        let n = f.count as f64;
        if fittings::is_constant(f.spec) {
            k_constant += n * f.k_fixed;
        } else {
            k_laminar_sum += n * fittings::k_laminar_coefficient(f.spec);
            k_fixed_sum += n * f.k_fixed;
        }
    }
    Ok(SegmentState {
        line: line_name.into(),
        side,
        index: i,
        material: seg.material.keyword(),
        size_label: seg.size_label.clone(),
        diameter_source: seg.diameter_source.clone(),
        length: seg.length.get::<meter>(),
        inner_diameter: d,
        area: std::f64::consts::PI * d * d / 4.0,
        roughness,
        roughness_source,
        hazen_williams_c: seg.hazen_williams_c,
        fittings: fits,
        k_constant,
        k_laminar_sum,
        k_fixed_sum,
        equivalent_length,
        per_pump: false,
    })
}

#[cfg(test)]
mod tests {
    use super::*;

    /// [`FittingState::k_at`] (K_fixed kept from the set-up) gives the bits of [`k_of`]
    /// (K evaluated whole) for every fitting of the table, over bores and Reynolds
    /// numbers from zero flow to far beyond turbulent.
    #[test]
    fn k_at_is_k_of_to_the_bit_for_every_fitting() {
        for spec in fittings::all_fittings() {
            for d in [0.0127, 0.0525, 0.2027, 0.61, 1.5] {
                let mut f = FittingState {
                    spec,
                    count: 1,
                    beta: spec.needs_beta.then_some(0.6),
                    beta_from_bores: false,
                    angle_rad: spec.needs_angle.then_some(0.5),
                    k_fixed: 0.0,
                };
                let re = if fittings::is_constant(spec) {
                    1e6
                } else {
                    0.0
                };
                f.k_fixed = k_of(&f, re, d);
                for re in [0.0, 1e-3, 1.0, 850.0, 2000.0, 4000.0, 1.3e5, 2e7, 1e300] {
                    assert_eq!(
                        f.k_at(re).to_bits(),
                        k_of(&f, re, d).to_bits(),
                        "{} at D = {d} m, Re = {re}",
                        spec.name
                    );
                }
                assert!(f.k_at(-1.0).is_nan() && f.k_at(f64::NAN).is_nan());
            }
        }
    }
}
