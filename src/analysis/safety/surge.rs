//! Surge screening of one line: Korteweg wave speed per segment (and the lowest
//! credible one, with entrained air), the pipe period 2L/a, the Joukowsky head of a
//! pump trip, and the head rise of a valve closure (Joukowsky when faster than 2L/a
//! at the lowest credible wave speed, else Michaud's formula with the effective
//! closure time). Screening estimates, not a transient analysis.

use uom::si::{length::meter, pressure::pascal, time::second};

use crate::analysis::limits;
use crate::analysis::system::{CaseSystem, G};
use crate::hydraulics::wave_speed::{self, WavePipe};
use crate::model::{Line, Segment};

/// Wave speed of one segment.
#[derive(Clone, Debug, PartialEq)]
pub struct SegmentWave {
    /// Korteweg wave speed, m/s.
    pub wave_speed: f64,
    /// With the entrained-air fraction of [`limits::ENTRAINED_AIR_FRACTION`], m/s.
    pub lowest_wave_speed: f64,
    /// Wall modulus used, Pa, and Poisson's ratio.
    pub modulus: f64,
    /// Poisson's ratio of the wall (dimensionless).
    pub poisson: f64,
    /// Restraint factor ψ and D/e.
    pub restraint_factor: f64,
    /// Ratio of inner diameter to wall thickness D/e (dimensionless).
    pub diameter_to_wall: f64,
    /// Where the modulus comes from.
    pub modulus_source: String,
}

/// A valve closure screen.
#[derive(Clone, Debug, PartialEq)]
pub struct ValveClosure {
    /// The stroke the design gives, s, and the effective closure time used, s.
    pub stroke: f64,
    /// Effective closure time used, s.
    pub effective: f64,
    /// Whether the effective closure is within 2L/a at the lowest credible wave speed.
    pub rapid: bool,
    /// Head rise, m.
    pub head: f64,
    /// "Joukowsky" or "Michaud".
    pub method: &'static str,
}

/// The surge screen of one line at one duty.
#[derive(Clone, Debug, PartialEq)]
pub struct LineSurge {
    /// Per segment of the line (in order); `None` where the wall is unknown.
    pub segments: Vec<Option<SegmentWave>>,
    /// Equivalent wave speed L/Σ(Lᵢ/aᵢ), m/s, and at the lowest credible speeds.
    pub wave_speed: f64,
    /// Equivalent wave speed at the lowest credible segment wave speeds, m/s.
    pub lowest_wave_speed: f64,
    /// Pipe period 2L/a, s, and 2L/a at the lowest credible wave speed.
    pub period: f64,
    /// Pipe period 2L/a at the lowest credible wave speed, s.
    pub period_lowest: f64,
    /// Area of the equivalent pipe L/Σ(Lᵢ/Aᵢ), m², and its duty velocity Q/A, m/s.
    pub equivalent_area: f64,
    /// Duty velocity Q/A in the equivalent pipe, m/s.
    pub equivalent_velocity: f64,
    /// Joukowsky head a·ΔV/g of the equivalent pipe for the duty flow stopped, m.
    pub joukowsky_head: f64,
    /// The valve closure screen, when the line gives `closure_time`.
    pub valve: Option<ValveClosure>,
}

/// Bulk modulus of the case's liquid, Pa: water by IAPWS-IF97 (K = ρ·w², w the speed of
/// sound); a named liquid's stated `bulk_modulus`, or `None` when it states none.
pub fn bulk_modulus(sys: &CaseSystem, fluid: &crate::model::Fluid) -> Option<f64> {
    if let crate::model::Fluid::Custom(c) = fluid {
        return c.bulk_modulus.map(|k| k.get::<pascal>());
    }
    let t = sys.fluid.temperature_k?;
    if sys.fluid.name != "water" {
        return None;
    }
    crate::fluid::water_bulk_modulus_pa(t, sys.source_surface.pa()).ok()
}

/// The wave speeds of one segment for liquid bulk modulus `k` and density `rho`, at a
/// mean absolute pressure `p_abs` for the entrained-air figure.
pub fn segment_wave(
    seg: &Segment,
    line: &Line,
    k: f64,
    rho: f64,
    p_abs: f64,
) -> Option<SegmentWave> {
    let table = wave_speed::elastic(seg.material);
    let (modulus, source) = match (seg.wall.modulus, table) {
        (Some(m), _) => (m.get::<pascal>(), "given in the design".to_string()),
        (None, Some(e)) => (e.modulus_pa, e.source.to_string()),
        (None, None) => return None,
    };
    let poisson = table.map(|e| e.poisson).unwrap_or(0.3);
    let d = seg.inner_diameter.get::<meter>();
    let e = seg.wall.thickness?.get::<meter>();
    let pipe = WavePipe {
        bulk_modulus: k,
        density: rho,
        inner_diameter: d,
        wall: e,
        modulus,
        poisson,
        restraint: line.restraint,
    };
    let a = wave_speed::korteweg(&pipe)?;
    let k_air = wave_speed::bulk_modulus_with_gas(k, limits::ENTRAINED_AIR_FRACTION.value, p_abs);
    let low = wave_speed::korteweg(&WavePipe {
        bulk_modulus: k_air,
        ..pipe
    })?;
    Some(SegmentWave {
        wave_speed: a,
        lowest_wave_speed: low,
        modulus,
        poisson,
        restraint_factor: wave_speed::restraint_factor(line.restraint, poisson, d, e),
        diameter_to_wall: d / e,
        modulus_source: source,
    })
}

/// The surge screen of a line at duty flow `q` (m³/s) with the segments' areas
/// `areas` (m²): a compound line is replaced by the equivalent pipe of the same length,
/// travel time and inertia, a = L/Σ(Lᵢ/aᵢ) and A = L/Σ(Lᵢ/Aᵢ) (Wylie and Streeter,
/// *Fluid Transients in Systems*, 1993, §5.2, from memory). `None` when a segment's
/// wave speed is unknown or the line has no length.
pub fn line_surge(
    line: &Line,
    waves: Vec<Option<SegmentWave>>,
    areas: &[f64],
    q: f64,
) -> Option<LineSurge> {
    let lengths: Vec<f64> = line
        .segments
        .iter()
        .map(|s| s.length.get::<meter>())
        .collect();
    let total: f64 = lengths.iter().sum();
    if total <= 0.0 || waves.iter().any(|w| w.is_none()) {
        return None;
    }
    let ws: Vec<&SegmentWave> = waves.iter().flatten().collect();
    let travel: f64 = lengths.iter().zip(&ws).map(|(l, w)| l / w.wave_speed).sum();
    let travel_low: f64 = lengths
        .iter()
        .zip(&ws)
        .map(|(l, w)| l / w.lowest_wave_speed)
        .sum();
    let inertia: f64 = lengths.iter().zip(areas).map(|(l, a)| l / a).sum();
    let area = total / inertia;
    let v = q / area;
    let a_eq = total / travel;
    let joukowsky = wave_speed::joukowsky_head(a_eq, v, G);
    let valve = line.closure_time.map(|t| {
        let stroke = t.get::<second>();
        let effective = stroke * limits::EFFECTIVE_CLOSURE_FRACTION.value;
        let rapid = effective <= 2.0 * travel_low;
        let head = if rapid {
            joukowsky
        } else {
            wave_speed::michaud_head(total, v, effective, a_eq, G)
        };
        ValveClosure {
            stroke,
            effective,
            rapid,
            head,
            method: if rapid { "Joukowsky" } else { "Michaud" },
        }
    });
    Some(LineSurge {
        segments: waves,
        wave_speed: a_eq,
        lowest_wave_speed: total / travel_low,
        period: 2.0 * travel,
        period_lowest: 2.0 * travel_low,
        equivalent_area: area,
        equivalent_velocity: v,
        joukowsky_head: joukowsky,
        valve,
    })
}
