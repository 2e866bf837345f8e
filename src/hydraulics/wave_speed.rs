//! Pressure-wave speed in a liquid-filled elastic pipe (Korteweg), the elastic
//! properties of pipe materials, and the Joukowsky head rise. SI throughout.

use super::catalogue::Material;

/// Short-term modulus of elasticity and Poisson's ratio of a pipe wall material.
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct Elastic {
    /// Young's modulus, Pa (short-term for plastics: the wave loads the wall for
    /// milliseconds).
    pub modulus_pa: f64,
    /// Poisson's ratio.
    pub poisson: f64,
    /// Where the values come from.
    pub source: &'static str,
}

/// Elastic properties by material, `None` for `other` (the design gives `modulus`).
///
/// Values (all recalled, "from memory"): steel 207 GPa, ν 0.30 and ductile iron
/// 166 GPa (24 × 10⁶ psi), ν 0.28, grey cast iron 100 GPa, ν 0.25, copper 117 GPa,
/// ν 0.34, concrete 30 GPa, ν 0.15 (Wylie and Streeter, *Fluid Transients in Systems*,
/// 1993, Table 2.1, and Chaudhry, *Applied Hydraulic Transients*, 3rd ed., 2014,
/// Table 2.1); stainless 193 GPa (ASME B31.3-2020 Table C-6, 304/316 at 21 °C);
/// PVC 400 000 psi = 2.76 GPa, ν 0.45 (AWWA M23, 2nd ed., short-term, PVC 12454);
/// HDPE PE4710 short-term 1.0 GPa (≈ 145 000 psi), ν 0.45 (PPI *Handbook of
/// Polyethylene Pipe*, 2nd ed., ch. 6, short-term modulus at 73 °F).
pub fn elastic(material: Material) -> Option<Elastic> {
    let e = |modulus_pa, poisson, source| {
        Some(Elastic {
            modulus_pa,
            poisson,
            source,
        })
    };
    match material {
        Material::Steel | Material::Galvanized => e(
            207e9,
            0.30,
            "Wylie and Streeter, Fluid Transients in Systems (1993), Table 2.1 (from memory)",
        ),
        Material::Stainless => e(
            193e9,
            0.30,
            "ASME B31.3-2020, Table C-6, austenitic stainless at 21 degC (from memory)",
        ),
        Material::DuctileIron | Material::CementLinedDuctileIron => e(
            166e9,
            0.28,
            "Chaudhry, Applied Hydraulic Transients, 3rd ed. (2014), Table 2.1 (from memory)",
        ),
        Material::CastIron => e(
            100e9,
            0.25,
            "Wylie and Streeter, Fluid Transients in Systems (1993), Table 2.1 (from memory)",
        ),
        Material::Copper => e(
            117e9,
            0.34,
            "Wylie and Streeter, Fluid Transients in Systems (1993), Table 2.1 (from memory)",
        ),
        Material::Concrete => e(
            30e9,
            0.15,
            "Chaudhry, Applied Hydraulic Transients, 3rd ed. (2014), Table 2.1 (from memory)",
        ),
        Material::Pvc => e(
            2.76e9,
            0.45,
            "AWWA M23, PVC Pipe: Design and Installation, 2nd ed., short-term modulus (from memory)",
        ),
        Material::Hdpe => e(
            1.0e9,
            0.45,
            "PPI Handbook of Polyethylene Pipe, 2nd ed., ch. 6, PE4710 short-term modulus (from memory)",
        ),
        Material::Other => None,
    }
}

/// Axial restraint of the pipe (the restraint factor ψ of the Korteweg formula).
#[derive(Clone, Copy, Debug, PartialEq, Eq, Default)]
pub enum Restraint {
    /// Anchored against axial movement throughout (buried, or anchored).
    #[default]
    Anchored,
    /// Anchored at the upstream end only.
    UpstreamOnly,
    /// Expansion joints throughout.
    ExpansionJoints,
}

impl Restraint {
    /// The keyword a design writes (`restraint = anchored`).
    pub fn keyword(self) -> &'static str {
        match self {
            Restraint::Anchored => "anchored",
            Restraint::UpstreamOnly => "upstream_anchored",
            Restraint::ExpansionJoints => "expansion_joints",
        }
    }

    /// In words, for the package.
    pub fn describe(self) -> &'static str {
        match self {
            Restraint::Anchored => "anchored against axial movement throughout",
            Restraint::UpstreamOnly => "anchored at the upstream end only",
            Restraint::ExpansionJoints => "expansion joints throughout",
        }
    }
}

/// D/e below which the thick-wall restraint factor is used.
pub const THICK_WALL_RATIO: f64 = 25.0;

/// Restraint factor ψ for a wall of inner diameter `d` and thickness `e` (m).
///
/// Thin wall (D/e ≥ 25; Wylie and Streeter, *Fluid Transients in Systems*, 1993,
/// eq. 2.18): ψ = 1 − ν/2 (upstream anchor only), 1 − ν² (anchored throughout),
/// 1 (expansion joints). Thick wall (D/e < 25; Halliwell's forms as given by Chaudhry,
/// *Applied Hydraulic Transients*, 3rd ed., 2014, §2.6, from memory):
/// ψ = 2e/D·(1 + ν) + D·(1 − ν/2)/(D + e), … D·(1 − ν²)/(D + e), … D/(D + e).
pub fn restraint_factor(restraint: Restraint, poisson: f64, d: f64, e: f64) -> f64 {
    let nu = poisson;
    let base = match restraint {
        Restraint::UpstreamOnly => 1.0 - nu / 2.0,
        Restraint::Anchored => 1.0 - nu * nu,
        Restraint::ExpansionJoints => 1.0,
    };
    if d / e >= THICK_WALL_RATIO {
        base
    } else {
        2.0 * e / d * (1.0 + nu) + d * base / (d + e)
    }
}

/// The inputs of one wave-speed evaluation, SI.
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct WavePipe {
    /// Bulk modulus of the liquid K, Pa.
    pub bulk_modulus: f64,
    /// Density of the liquid ρ, kg/m³.
    pub density: f64,
    /// Inner diameter D, m.
    pub inner_diameter: f64,
    /// Wall thickness e, m.
    pub wall: f64,
    /// Young's modulus of the wall E, Pa.
    pub modulus: f64,
    /// Poisson's ratio ν of the wall.
    pub poisson: f64,
    /// How the pipe is restrained against axial movement (sets ψ).
    pub restraint: Restraint,
}

/// Korteweg wave speed a = √( (K/ρ) / (1 + ψ·K·D/(E·e)) ), m/s (Wylie and Streeter,
/// *Fluid Transients in Systems*, 1993, eq. 2.16–2.18; Chaudhry, 3rd ed., eq. 2.24).
/// `None` when an input is not positive and finite.
pub fn korteweg(p: &WavePipe) -> Option<f64> {
    let ok = |x: f64| x.is_finite() && x > 0.0;
    if ![
        p.bulk_modulus,
        p.density,
        p.inner_diameter,
        p.wall,
        p.modulus,
    ]
    .into_iter()
    .all(ok)
    {
        return None;
    }
    let psi = restraint_factor(p.restraint, p.poisson, p.inner_diameter, p.wall);
    let a2 = (p.bulk_modulus / p.density)
        / (1.0 + psi * p.bulk_modulus * p.inner_diameter / (p.modulus * p.wall));
    (a2.is_finite() && a2 > 0.0).then(|| a2.sqrt())
}

/// The effective bulk modulus of a liquid carrying free gas at volume fraction `alpha`
/// under absolute pressure `p_abs` (isothermal gas): 1/K_e = 1/K + α/p (Wylie and
/// Streeter, *Fluid Transients in Systems*, 1993, §9.2, eq. 9.5 for small α). Pa.
pub fn bulk_modulus_with_gas(bulk_modulus: f64, alpha: f64, p_abs: f64) -> f64 {
    1.0 / (1.0 / bulk_modulus + alpha / p_abs.max(1.0))
}

/// Joukowsky head change for an instantaneous velocity change: ΔH = a·ΔV/g, m
/// (Joukowsky 1898; Wylie and Streeter, 1993, eq. 1.7). Valid for a change completed
/// within the pipe period 2L/a.
pub fn joukowsky_head(wave_speed: f64, delta_v: f64, g: f64) -> f64 {
    wave_speed * delta_v / g
}

/// Michaud's approximate head rise for a valve closure slower than 2L/a:
/// ΔH ≈ 2·L·V/(g·t_c), m, with t_c the effective closure time (Michaud 1878; as
/// quoted by Chaudhry, *Applied Hydraulic Transients*, 3rd ed., 2014, §1.6, from
/// memory). Capped at the Joukowsky rise, which it equals at t_c = 2L/a.
pub fn michaud_head(length: f64, velocity: f64, closure: f64, wave_speed: f64, g: f64) -> f64 {
    let joukowsky = joukowsky_head(wave_speed, velocity, g);
    if closure <= 0.0 {
        return joukowsky;
    }
    (2.0 * length * velocity / (g * closure)).min(joukowsky)
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn rigid_pipe_gives_the_speed_of_sound() {
        let p = WavePipe {
            bulk_modulus: 2.19e9,
            density: 998.2,
            inner_diameter: 0.2,
            wall: 0.01,
            modulus: 1e20,
            poisson: 0.3,
            restraint: Restraint::Anchored,
        };
        let a = korteweg(&p).unwrap();
        assert!((a - (2.19e9f64 / 998.2).sqrt()).abs() < 1e-6);
    }

    #[test]
    fn thin_and_thick_forms_meet_near_the_threshold() {
        // At D/e = 25 the thick form is 7.6 % above the thin one (2/25·1.3 + 25/26·0.91
        // = 0.979 against 0.91), and it tends to the thin one as D/e grows.
        let thin = 1.0 - 0.3f64 * 0.3;
        let thick = |de: f64| 2.0 / de * 1.3 + de * thin / (de + 1.0);
        assert!(
            (restraint_factor(Restraint::Anchored, 0.3, 24.999, 1.0) - thick(24.999)).abs() < 1e-12
        );
        assert!((thick(25.0) / thin - 1.0 - 0.0757).abs() < 1e-3);
        assert!((thick(1e4) - thin).abs() / thin < 1e-3);
    }

    #[test]
    fn bad_inputs_give_none() {
        let mut p = WavePipe {
            bulk_modulus: 2.19e9,
            density: 998.2,
            inner_diameter: 0.2,
            wall: 0.0,
            modulus: 2e11,
            poisson: 0.3,
            restraint: Restraint::Anchored,
        };
        assert!(korteweg(&p).is_none());
        p.wall = f64::NAN;
        assert!(korteweg(&p).is_none());
    }
}
