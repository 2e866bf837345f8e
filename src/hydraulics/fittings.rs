//! Fittings: named loss coefficients (K, on the velocity head of the segment that
//! carries the fitting) and the methods that evaluate them.
//!
//! Methods and sources:
//! - Darby 3-K: K = K1/Re + Ki (1 + Kd / Dn^0.3), Dn the nominal diameter in
//!   inches. Darby, R. (1999), "Correlate pressure drops through fittings",
//!   Chemical Engineering 106(7), July 1999, 101-104 (co-credited to P. Silverberg
//!   by `fluids`; follow-up letter Silverberg, Chemical Engineering 108(4), April
//!   2001, 127-130); the constants are also in Darby, Chemical Engineering Fluid
//!   Mechanics, 2nd ed. (2001) (from memory). Stated for laminar and turbulent flow.
//!   Dn is found from the actual inner diameter by interpolating the ASME B36.10M
//!   schedule 40 NPS-versus-ID table (Dn = NPS exactly for schedule 40 pipe), as the
//!   `fluids` package does; outside NPS 1/8-24 it is extrapolated and a warning is
//!   raised by [`validity_warnings`].
//! - Hooper 2-K: K = K1/Re + Kinf (1 + 1/D), D the actual inner diameter in inches.
//!   Hooper, W. B. (1981), "The two-K method predicts head losses in pipe fittings",
//!   Chemical Engineering 88(17), 96-100, Aug. 24, 1981. Laminar and turbulent flow.
//! - Hooper inlets and outlets: K = K1/Re + Kinf, without the size term (same paper).
//! - Crane: K = n fT, fT = 0.25 / [log10(eps / (3.7 D))]^2 the fully turbulent
//!   friction factor of clean commercial steel, eps = 0.0018 in. Crane Co.,
//!   Technical Paper No. 410, Flow of Fluids Through Valves, Fittings, and Pipe
//!   (2009), pp. A-26 to A-29 (from memory). Turbulent flow.
//! - Size changes, all on the SMALL pipe's velocity head (Crane's K1), beta =
//!   d_small / d_large, theta the total included angle:
//!   sudden expansion K = (1 - beta^2)^2 (Borda-Carnot);
//!   gradual expansion K = 2.6 sin(theta/2) (1 - beta^2)^2 for theta <= 45 deg, else
//!   (1 - beta^2)^2;
//!   sudden contraction K = 0.5 (1 - beta^2);
//!   gradual contraction K = 0.8 sin(theta/2) (1 - beta^2) for theta <= 45 deg, else
//!   0.5 (1 - beta^2) sqrt(sin(theta/2)) (Crane TP-410, p. A-26). Turbulent flow.
//!
//! Re = 0 (no flow): [`k_value`] returns K without the K1/Re term. The head loss
//! K v^2 / 2g stays finite as Re -> 0 because K1/Re x v^2 = K1 nu v / D; a caller
//! that wants the laminar term at small flows adds
//! [`k_laminar_coefficient`] x nu / (2 g D) x v itself.

mod table;

use crate::hydraulics::catalogue::darby_nominal_diameter_in;
use crate::names::nearest_within as nearest_by_edit_distance;

use table::FITTINGS;

/// Reynolds number below which turbulent-flow K values are flagged (common practice).
const TURBULENT_RE: f64 = 4000.0;
/// Crane's clean commercial steel roughness, 0.0018 in, m (Crane TP-410).
const CRANE_ROUGHNESS_M: f64 = 0.0018 * 0.0254;
/// Metres per inch, exact (NIST SP 811).
const METRES_PER_INCH: f64 = 0.0254;

/// How a fitting's K is evaluated.
#[derive(Clone, Copy, Debug, PartialEq)]
pub enum KMethod {
    /// Fixed K from a named handbook.
    Constant(f64),
    /// Hooper (1981) 2-K: K1/Re + kinf (1 + 1 in / D).
    Hooper {
        /// Laminar coefficient K1.
        k1: f64,
        /// K at infinite Re for a 1 in fitting scale.
        kinf: f64,
    },
    /// Hooper (1981) 2-K for pipe inlets and outlets: K1/Re + kinf (no size term).
    HooperInletOutlet {
        /// Laminar coefficient K1.
        k1: f64,
        /// K at infinite Re.
        kinf: f64,
    },
    /// Darby (1999/2001) 3-K: K1/Re + ki (1 + kd / Dn^0.3), Dn in inches.
    Darby {
        /// Laminar coefficient K1.
        k1: f64,
        /// Turbulent coefficient Ki.
        ki: f64,
        /// Size coefficient Kd, inch^0.3.
        kd: f64,
    },
    /// Crane TP-410: K = n fT (fully turbulent clean-steel friction factor).
    CraneFt {
        /// The multiple of fT.
        n: f64,
    },
    /// Borda-Carnot sudden expansion, needs beta.
    SuddenExpansion,
    /// Crane gradual (conical) expansion, needs beta and angle.
    GradualExpansion,
    /// Crane sudden contraction, needs beta.
    SuddenContraction,
    /// Crane gradual (conical) contraction, needs beta and angle.
    GradualContraction,
}

/// One named fitting.
#[derive(Clone, Debug, PartialEq)]
pub struct FittingSpec {
    /// Keyword a user writes, lower_snake_case.
    pub name: &'static str,
    /// What the fitting is.
    pub description: &'static str,
    /// How K is evaluated.
    pub method: KMethod,
    /// Source of the method and constants.
    pub source: &'static str,
    /// Whether [`KContext::beta`] is required.
    pub needs_beta: bool,
    /// Whether [`KContext::angle_rad`] is required.
    pub needs_angle: bool,
}

/// Conditions of one evaluation.
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct KContext {
    /// Reynolds number in the segment carrying the fitting (>= 0; 0 drops K1/Re).
    pub reynolds: f64,
    /// Inner diameter of that segment, m (the SMALL pipe for size changes).
    pub inner_diameter_m: f64,
    /// d_small / d_large for expansions and contractions.
    pub beta: Option<f64>,
    /// Total included angle of a gradual expansion or contraction, radians.
    pub angle_rad: Option<f64>,
}

/// A K that cannot be evaluated.
#[derive(Clone, Debug, PartialEq)]
pub struct FittingError {
    /// What is wrong.
    pub message: String,
}

impl std::fmt::Display for FittingError {
    fn fmt(&self, f: &mut std::fmt::Formatter<'_>) -> std::fmt::Result {
        f.write_str(&self.message)
    }
}

impl std::error::Error for FittingError {}

fn error(message: String) -> FittingError {
    FittingError { message }
}

/// The fitting with this name or one of its aliases (`inlet_flush`, `outlet`,
/// `bellmouth`, `y_strainer`, ...; see [`fitting_aliases`]), case-insensitive.
pub fn fitting(name: &str) -> Option<&'static FittingSpec> {
    let key = name.trim().to_ascii_lowercase();
    let canonical = table::ALIASES
        .iter()
        .find(|(alias, _)| *alias == key)
        .map_or(key.as_str(), |(_, target)| *target);
    FITTINGS.iter().find(|f| f.name == canonical)
}

/// Accepted alternative spellings, as (alias, canonical name).
pub fn fitting_aliases() -> &'static [(&'static str, &'static str)] {
    table::ALIASES
}

/// Every named fitting.
pub fn all_fittings() -> &'static [FittingSpec] {
    FITTINGS
}

/// Up to three fitting names nearest to `name` by edit distance (for "did you
/// mean"), best first; empty when nothing is reasonably close.
pub fn suggest_fitting(name: &str) -> Vec<&'static str> {
    let typed = name.trim();
    let max_distance = (typed.chars().count() / 3).max(3);
    nearest_by_edit_distance(typed, FITTINGS.iter().map(|f| f.name), 3, max_distance)
}

/// Whether K is independent of the Reynolds number, so the system curve can
/// evaluate it once per segment (it may still depend on D, beta or angle).
pub fn is_constant(spec: &FittingSpec) -> bool {
    !matches!(
        spec.method,
        KMethod::Hooper { .. } | KMethod::HooperInletOutlet { .. } | KMethod::Darby { .. }
    )
}

/// K1, the coefficient of the laminar term K1/Re (0 for methods without one).
pub fn k_laminar_coefficient(spec: &FittingSpec) -> f64 {
    match spec.method {
        KMethod::Hooper { k1, .. }
        | KMethod::HooperInletOutlet { k1, .. }
        | KMethod::Darby { k1, .. } => k1,
        _ => 0.0,
    }
}

/// Evaluates K for one fitting (formulas and sources in the module docs).
///
/// # Errors
/// Re negative or NaN; inner diameter not finite and positive; beta missing or
/// outside (0, 1] when the method needs it; angle missing or outside (0, pi].
pub fn k_value(spec: &FittingSpec, ctx: KContext) -> Result<f64, FittingError> {
    if ctx.reynolds.is_nan() || ctx.reynolds < 0.0 {
        return Err(error(format!(
            "{}: Reynolds number must be >= 0, got {}",
            spec.name, ctx.reynolds
        )));
    }
    let d = ctx.inner_diameter_m;
    if !(d.is_finite() && d > 0.0) {
        return Err(error(format!(
            "{}: inner diameter must be a positive length, got {d} m",
            spec.name
        )));
    }
    // K1/Re, dropped at Re = 0 (see module docs) and vanishing at Re = infinity.
    let laminar = |k1: f64| {
        if ctx.reynolds > 0.0 {
            k1 / ctx.reynolds
        } else {
            0.0
        }
    };
    let k = match spec.method {
        KMethod::Constant(k) => k,
        KMethod::Hooper { k1, kinf } => laminar(k1) + kinf * (1.0 + METRES_PER_INCH / d),
        KMethod::HooperInletOutlet { k1, kinf } => laminar(k1) + kinf,
        KMethod::Darby { k1, ki, kd } => {
            let dn = darby_nominal_diameter_in(d / METRES_PER_INCH);
            laminar(k1) + ki * (1.0 + kd / dn.powf(0.3))
        }
        KMethod::CraneFt { n } => n * crane_ft(d),
        KMethod::SuddenExpansion => {
            let b2 = beta(spec, ctx)?.powi(2);
            (1.0 - b2).powi(2)
        }
        KMethod::GradualExpansion => {
            let b2 = beta(spec, ctx)?.powi(2);
            let theta = angle(spec, ctx)?;
            if theta <= std::f64::consts::FRAC_PI_4 {
                2.6 * (theta / 2.0).sin() * (1.0 - b2).powi(2)
            } else {
                (1.0 - b2).powi(2)
            }
        }
        KMethod::SuddenContraction => 0.5 * (1.0 - beta(spec, ctx)?.powi(2)),
        KMethod::GradualContraction => {
            let b2 = beta(spec, ctx)?.powi(2);
            let theta = angle(spec, ctx)?;
            if theta <= std::f64::consts::FRAC_PI_4 {
                0.8 * (theta / 2.0).sin() * (1.0 - b2)
            } else {
                0.5 * (1.0 - b2) * (theta / 2.0).sin().sqrt()
            }
        }
    };
    if k.is_finite() {
        Ok(k)
    } else {
        Err(error(format!("{}: K evaluated to {k}", spec.name)))
    }
}

/// Warnings for an evaluation outside the method's validity range (empty when
/// inside): turbulent-only methods below Re = 4000 (common practice threshold),
/// and Darby's Dn extrapolated outside the NPS 1/8-24 schedule 40 table.
pub fn validity_warnings(spec: &FittingSpec, ctx: KContext) -> Vec<String> {
    let mut out = Vec::new();
    let turbulent_only = !matches!(
        spec.method,
        KMethod::Hooper { .. } | KMethod::HooperInletOutlet { .. } | KMethod::Darby { .. }
    );
    if turbulent_only && ctx.reynolds > 0.0 && ctx.reynolds < TURBULENT_RE {
        out.push(format!(
            "{}: K is from turbulent-flow data; Re = {:.0} is below {TURBULENT_RE:.0}",
            spec.name, ctx.reynolds
        ));
    }
    if let KMethod::Darby { .. } = spec.method {
        let id_in = ctx.inner_diameter_m / METRES_PER_INCH;
        let dn = darby_nominal_diameter_in(id_in);
        if !(0.125..=24.0).contains(&dn) {
            out.push(format!(
                "{}: inner diameter {id_in:.3} in is outside NPS 1/8-24; Darby's nominal size \
                 Dn = {dn:.2} in is extrapolated",
                spec.name
            ));
        }
    }
    out
}

/// Crane's fully turbulent friction factor of clean commercial steel,
/// fT = 0.25 / [log10(eps / (3.7 D))]^2, eps = 0.0018 in (Crane TP-410, 2009).
/// Meaningful for D well above eps (every real pipe); a D below 10 eps is clamped to
/// 10 eps so the logarithm stays negative and fT finite.
pub fn crane_ft(inner_diameter_m: f64) -> f64 {
    let d = inner_diameter_m.max(10.0 * CRANE_ROUGHNESS_M);
    let log = (CRANE_ROUGHNESS_M / (3.7 * d)).log10();
    0.25 / (log * log)
}

fn beta(spec: &FittingSpec, ctx: KContext) -> Result<f64, FittingError> {
    match ctx.beta {
        Some(b) if b > 0.0 && b <= 1.0 => Ok(b),
        Some(b) => Err(error(format!(
            "{}: beta = d_small / d_large must be in (0, 1], got {b}",
            spec.name
        ))),
        None => Err(error(format!(
            "{}: needs beta = d_small / d_large",
            spec.name
        ))),
    }
}

fn angle(spec: &FittingSpec, ctx: KContext) -> Result<f64, FittingError> {
    match ctx.angle_rad {
        Some(a) if a > 0.0 && a <= std::f64::consts::PI => Ok(a),
        Some(a) => Err(error(format!(
            "{}: total included angle must be in (0, 180] degrees, got {:.3} degrees",
            spec.name,
            a.to_degrees()
        ))),
        None => Err(error(format!(
            "{}: needs the total included angle",
            spec.name
        ))),
    }
}
