//! Pressure ratings of pipe, each by its own standard's convention. SI (Pa gauge).
//!
//! - Ductile iron: the AWWA C150/C151 pressure class is the rated working pressure in
//!   psi; the wall design already carries a 100 psi surge allowance, so the class
//!   limits the operating pressure and class + 100 psi the transient, and no second
//!   allowance is taken.
//! - PVC schedule pipe (ASTM D1785): P = 2·S·t/(D − t) with the hydrostatic design
//!   stress S = 2 000 psi of PVC 1120 (12454) at 73 °F (the formula of D1785's
//!   appendix, ISO 161/1 form), times the temperature factor, times 0.5 for threaded
//!   pipe. The rating is for water without shock: no surge allowance.
//! - HDPE: PR = 2·HDS·F_T/(DR − 1), HDS = 1 000 psi for PE4710 at 73 °F (PPI TR-4), so
//!   DR 17 is 125 psi; AWWA C906 allows an occasional surge up to 2·PR and a recurring
//!   surge up to 1.5·PR in total pressure.
//! - Steel and stainless: ASME B31.3 §304.1.2, P = 2·t·S·E·W/(D − 2·Y·t) with
//!   t = 0.875·T − c (12.5 % mill tolerance of seamless pipe, corrosion and thread
//!   allowance c), S = 20.0 ksi (A106 Grade B, A312 TP304, to 100 °F, Table A-1),
//!   E = 1.0 (seamless), W = 1.0, Y = 0.4; §302.2.4 allows occasional variations up to
//!   1.33 times the design pressure.
//!
//! - Municipal PVC, ANSI/AWWA C900-16: pressure class PC = HDB/(SF·(DR − 1)/2) with
//!   HDB = 4 000 psi (PVC 12454) and SF = 2.0, rounded down to 5 psi: DR 14 = PC 305,
//!   DR 18 = PC 235, DR 21 = PC 200, DR 25 = PC 165 psi (the 2016 edition; the 2007
//!   edition's classes 200/150/100 included a surge allowance, the 2016 ones do not).
//!   Occasional surge: total pressure up to the short-term rating STR = 2·S_ST/(2.5·(DR
//!   − 1)), S_ST = 6 400 psi. Recurring surge: fatigue by AWWA M23 (3rd ed., ch. 5),
//!   cycles to failure C = 5.05·10²¹ · S^−4.906 (S the peak hoop stress, psi,
//!   S = P·(DR − 1)/2), so the package states the cycles the pipe takes at its class.
//! - Waterworks steel by AWWA M11 (5th ed., ch. 4), when the design asks for it
//!   (`rating_basis = awwa_m11`): P = 2·t·s/D on the nominal wall, s = 50 % of the
//!   minimum yield for the working pressure and 75 % for working + surge.
//!
//! Every tabulated constant here is recalled, not read from the edition in force:
//! each source string says "from memory".

use super::catalogue::Material;

/// One psi in pascals (NIST SP 811, B.8: 6.894 757 kPa).
pub const PSI: f64 = 6_894.757_293_168;

/// The rating of one pipe segment.
#[derive(Clone, Debug, PartialEq)]
pub struct PipeRating {
    /// The highest operating (steady) pressure allowed, Pa gauge.
    pub working_pa: f64,
    /// The highest pressure allowed during a surge (working + the standard's surge
    /// allowance), Pa gauge.
    pub transient_pa: f64,
    /// How the number was found (the inputs of the formula, SI).
    pub basis: Basis,
    /// The publications, with "from memory" where recalled.
    pub source: &'static str,
}

/// The inputs of a rating, SI, for the package to print in its own units.
#[derive(Clone, Debug, PartialEq)]
pub enum Basis {
    /// AWWA C150/C151 pressure class (psi, as the standard names it).
    DuctileIron {
        /// The pressure class, psi.
        class: f64,
    },
    /// ASTM D1785: S (Pa), t and D (m), the rating at 73 °F (Pa), the temperature
    /// factor, threaded.
    Pvc {
        /// Hydrostatic design stress S, Pa.
        stress: f64,
        /// Wall thickness t, m.
        wall: f64,
        /// Outside diameter D, m.
        outer_diameter: f64,
        /// Pressure rating at 73 °F, Pa (gauge).
        at_73: f64,
        /// Temperature derating factor (dimensionless).
        factor: f64,
        /// Threaded joints (the rating is halved).
        threaded: bool,
    },
    /// PE4710: HDS (Pa), temperature factor, DR, PR (Pa).
    Hdpe {
        /// Hydrostatic design stress HDS, Pa.
        stress: f64,
        /// Temperature factor F (dimensionless).
        factor: f64,
        /// Dimension ratio DR (outside diameter over wall, dimensionless).
        dr: f64,
        /// Pressure rating PR, Pa (gauge).
        pr: f64,
    },
    /// AWWA C900-16 PVC: DR, pressure class and short-term rating (Pa), and the AWWA
    /// M23 cycles to failure at the class pressure.
    C900 {
        /// Dimension ratio DR (dimensionless).
        dr: f64,
        /// Pressure class PC, Pa (gauge).
        class: f64,
        /// Short-term rating STR (occasional surge limit), Pa (gauge).
        short_term: f64,
        /// Cycles to failure with the peak at PC (AWWA M23), dimensionless.
        cycles_at_class: f64,
    },
    /// AWWA M11: nominal wall t (m), minimum yield (Pa), D (m), working pressure (Pa).
    SteelM11 {
        /// Nominal wall thickness, m.
        wall: f64,
        /// Specified minimum yield strength, Pa.
        yield_strength: f64,
        /// Outside diameter D, m.
        outer_diameter: f64,
        /// Working pressure at 50 % of yield, Pa (gauge).
        p: f64,
    },
    /// ASME B31.3: nominal wall, corrosion and thread allowances, the wall left t (m),
    /// S (Pa), D (m), P (Pa).
    Steel {
        /// Nominal wall thickness, m.
        wall: f64,
        /// Corrosion allowance, m.
        corrosion: f64,
        /// Thread depth allowance, m (0 unthreaded).
        thread: f64,
        /// Wall thickness left after the mill tolerance and allowances t, m.
        t: f64,
        /// Allowable stress S, Pa.
        stress: f64,
        /// Outside diameter D, m.
        outer_diameter: f64,
        /// Internal design pressure P, Pa (gauge).
        p: f64,
    },
}

impl Basis {
    /// The computation in words, numbers formatted by `pressure` (Pa) and `length` (m)
    /// in the reader's units.
    pub fn describe(
        &self,
        pressure: &dyn Fn(f64) -> String,
        length: &dyn Fn(f64) -> String,
    ) -> String {
        match *self {
            Basis::DuctileIron { class } => format!(
                "pressure class {class:.0}: rated working pressure {}; the class includes a surge allowance of {} (transient limit {}), no second allowance",
                pressure(class * PSI),
                pressure(100.0 * PSI),
                pressure((class + 100.0) * PSI)
            ),
            Basis::Pvc { stress, wall, outer_diameter, at_73, factor, threaded } => format!(
                "P = 2·S·t/(D − t) = 2 × {} × {} / ({} − {}) = {} at the standard's reference temperature; × {factor:.2} (temperature){}; no surge allowance (rating for water without shock)",
                pressure(stress),
                length(wall),
                length(outer_diameter),
                length(wall),
                pressure(at_73),
                if threaded { "; × 0.5 threaded" } else { "" }
            ),
            Basis::Hdpe { stress, factor, dr, pr } => format!(
                "PR = 2·HDS·F/(DR − 1) = 2 × {} × {factor:.2} / ({dr} − 1) = {} (PE4710); occasional surge to 2·PR = {}, recurring surge to 1.5·PR = {}",
                pressure(stress),
                pressure(pr),
                pressure(2.0 * pr),
                pressure(1.5 * pr)
            ),
            Basis::C900 { dr, class, short_term, cycles_at_class } => format!(
                "AWWA C900-16 DR {dr}: pressure class PC = HDB/(SF·(DR − 1)/2) = {}/(2.0 × ({dr} − 1)/2), rounded down to the standard's tabulated step = {}; occasional surge to the short-term rating 2·S_ST/(2.5·(DR − 1)) = {} (S_ST = {}); recurring surges: AWWA M23 fatigue, C = 9.67·10⁶·(S/S₁)^−4.906 with S₁ = {}; at the peak PC, S = PC·(DR − 1)/2 = {}: C = {} cycles",
                pressure(C900_HDB_PSI * PSI),
                pressure(class),
                pressure(short_term),
                pressure(C900_SHORT_TERM_PSI * PSI),
                pressure(1000.0 * PSI),
                pressure(class * (dr - 1.0) / 2.0),
                significant_cycles(cycles_at_class)
            ),
            Basis::SteelM11 { wall, yield_strength, outer_diameter, p } => format!(
                "AWWA M11: P = 2·t·s/D, t = {} (nominal), s = 50 % of the minimum yield {}, D = {}: {}; working + surge to 75 % of yield: {}",
                length(wall),
                pressure(yield_strength),
                length(outer_diameter),
                pressure(p),
                pressure(1.5 * p)
            ),
            Basis::Steel { wall, corrosion, thread, t, stress, outer_diameter, p } => format!(
                "P = 2·t·S·E·W/(D − 2·Y·t), t = 0.875 × {} − {} corrosion{} = {}, S = {}, E = 1.0, W = 1.0, Y = 0.4, D = {}: {}; occasional variation to 1.33 × = {}",
                length(wall),
                length(corrosion),
                if thread > 0.0 { format!(" − {} thread", length(thread)) } else { String::new() },
                length(t),
                pressure(stress),
                length(outer_diameter),
                pressure(p),
                pressure(1.33 * p)
            ),
        }
    }
}

/// What a rating needs to know of a segment.
#[derive(Clone, Copy, Debug, Default)]
pub struct RatingInput<'a> {
    /// The pipe material, when known.
    pub material: Option<Material>,
    /// Outside diameter, m.
    pub outer_diameter: Option<f64>,
    /// Wall thickness as the catalogue gives it (nominal; minimum for PVC, HDPE), m.
    pub wall: Option<f64>,
    /// `schedule 40`, `class 350`, `DR 17`.
    pub designation: Option<&'a str>,
    /// Threaded joints.
    pub threaded: bool,
    /// Corrosion allowance, m (steel); `None` takes the default.
    pub corrosion_allowance: Option<f64>,
    /// Liquid temperature, K; `None` takes 73 °F (23 °C).
    pub temperature_k: Option<f64>,
    /// Steel rated by AWWA M11 (waterworks) instead of ASME B31.3.
    pub m11: bool,
    /// Specified minimum yield strength of steel, Pa; `None` takes
    /// [`STEEL_YIELD_PSI`] (AWWA M11 only).
    pub yield_strength: Option<f64>,
}

/// Specified minimum yield strength of A53/A106 Grade B pipe, 35 ksi (ASTM A53 Table
/// 2, from memory): the default of an AWWA M11 rating.
pub const STEEL_YIELD_PSI: f64 = 35_000.0;

/// A cycle count to three significant figures with a superscript power: `3.24 × 10⁵`.
fn significant_cycles(c: f64) -> String {
    if !(c.is_finite() && c > 0.0) {
        return "unlimited".into();
    }
    let text = format!("{c:.2e}");
    let (mantissa, exp) = text.split_once('e').unwrap_or((&text, "0"));
    let sup: String = exp
        .chars()
        .map(|ch| match ch {
            '-' => '⁻',
            d => "⁰¹²³⁴⁵⁶⁷⁸⁹"
                .chars()
                .nth(d.to_digit(10).unwrap_or(0) as usize)
                .unwrap_or('⁰'),
        })
        .collect();
    format!("{mantissa} × 10{sup}")
}

/// Cycles to failure of PVC pressure pipe under recurring surges, AWWA M23 (3rd ed.,
/// ch. 5, from memory): C = 5.05·10²¹ · S^−4.906, S = P_peak·(DR − 1)/2 in psi.
pub fn m23_cycles_to_failure(dr: f64, peak_pa: f64) -> f64 {
    let s = peak_pa / PSI * (dr - 1.0) / 2.0;
    if s <= 0.0 {
        return f64::INFINITY;
    }
    5.05e21 * s.powf(-4.906)
}

/// Default corrosion allowance of carbon and galvanized steel, 1/16 in = 1.5875 mm
/// (common practice for water service); stainless takes none.
pub const STEEL_CORROSION_ALLOWANCE: f64 = 0.0015875;

/// The rating of a segment by its material's standard, or why there is none.
pub fn pipe_rating(input: &RatingInput) -> Result<PipeRating, String> {
    let material = input.material.ok_or("no material")?;
    match material {
        Material::DuctileIron | Material::CementLinedDuctileIron => ductile_iron(input),
        Material::Pvc if input.designation.is_some_and(|d| d.starts_with("DR")) => c900(input),
        Material::Pvc => pvc(input),
        Material::Hdpe => hdpe(input),
        Material::Steel | Material::Galvanized | Material::Stainless if input.m11 => {
            steel_m11(input, material)
        }
        Material::Steel | Material::Galvanized | Material::Stainless => steel(input, material),
        _ => Err(format!(
            "dutyline has no rating rule for {} pipe: give `rating = ...` from the manufacturer",
            material.keyword()
        )),
    }
}

/// The number after a designation word: `class 350` → 350, `DR 17` → 17.
fn designation_number(input: &RatingInput, word: &str) -> Option<f64> {
    let d = input.designation?;
    let rest = d.strip_prefix(word)?.trim();
    rest.parse::<f64>().ok().filter(|x| x.is_finite())
}

fn ductile_iron(input: &RatingInput) -> Result<PipeRating, String> {
    let class = designation_number(input, "class")
        .ok_or("ductile iron without a pressure class: give `class` in the size or `rating`")?;
    Ok(PipeRating {
        working_pa: class * PSI,
        transient_pa: (class + 100.0) * PSI,
        basis: Basis::DuctileIron { class },
        source: "ANSI/AWWA C150/A21.50 (thickness design with its surge allowance) and C151/A21.51 (pressure classes) (from memory)",
    })
}

/// Temperature factor of a thermoplastic rating: linear between the points, 1.0 at
/// and below the first; `Err` above the last (not rated).
fn temperature_factor(table: &[(f64, f64)], temperature_k: f64, what: &str) -> Result<f64, String> {
    let f = (temperature_k - 273.15) * 1.8 + 32.0;
    let (first, last) = (table[0], table[table.len() - 1]);
    if f <= first.0 {
        return Ok(first.1);
    }
    if f > last.0 {
        return Err(format!(
            "{what} is not rated above {:.0} degF; the case's liquid is at {f:.0} degF",
            last.0
        ));
    }
    let i = table
        .iter()
        .position(|(t, _)| *t >= f)
        .unwrap_or(table.len() - 1);
    let ((t0, k0), (t1, k1)) = (table[i - 1], table[i]);
    Ok(k0 + (k1 - k0) * (f - t0) / (t1 - t0))
}

/// PVC temperature factors (°F, factor) of the 73 °F rating (PPFA *Users' Guide*,
/// common manufacturer tables, from memory).
pub const PVC_TEMPERATURE_FACTORS: &[(f64, f64)] = &[
    (73.0, 1.00),
    (80.0, 0.88),
    (90.0, 0.75),
    (100.0, 0.62),
    (110.0, 0.51),
    (120.0, 0.40),
    (130.0, 0.31),
    (140.0, 0.22),
];

/// HDPE temperature factors (°F, factor) of the 73 °F pressure rating (PPI *Handbook of
/// Polyethylene Pipe*, 2nd ed., ch. 6, and AWWA M55, from memory).
pub const HDPE_TEMPERATURE_FACTORS: &[(f64, f64)] = &[
    (80.0, 1.00),
    (90.0, 0.90),
    (100.0, 0.80),
    (110.0, 0.75),
    (120.0, 0.65),
    (130.0, 0.60),
    (140.0, 0.50),
];

/// Hydrostatic design stress of PVC 1120 (cell class 12454) at 73 °F, 2 000 psi.
pub const PVC_HDS_PSI: f64 = 2_000.0;
/// Hydrostatic design stress of PE4710 at 73 °F, 1 000 psi.
pub const PE4710_HDS_PSI: f64 = 1_000.0;

/// 73 °F in kelvin, (73 − 32)/1.8 + 273.15: the reference temperature of the
/// thermoplastic ratings.
pub const REFERENCE_73_F_K: f64 = (73.0 - 32.0) / 1.8 + 273.15;

fn temperature(input: &RatingInput) -> f64 {
    input.temperature_k.unwrap_or(REFERENCE_73_F_K)
}

fn pvc(input: &RatingInput) -> Result<PipeRating, String> {
    let (Some(d), Some(t)) = (input.outer_diameter, input.wall) else {
        return Err("PVC given by bore: no ASTM D1785 wall to rate; give `rating = ...`".into());
    };
    let at_73 = 2.0 * PVC_HDS_PSI * t / (d - t);
    let factor = temperature_factor(PVC_TEMPERATURE_FACTORS, temperature(input), "PVC")?;
    let thread = if input.threaded { 0.5 } else { 1.0 };
    let psi = at_73 * factor * thread;
    Ok(PipeRating {
        working_pa: psi * PSI,
        transient_pa: psi * PSI,
        basis: Basis::Pvc {
            stress: PVC_HDS_PSI * PSI,
            wall: t,
            outer_diameter: d,
            at_73: at_73 * PSI,
            factor,
            threaded: input.threaded,
        },
        source: "ASTM D1785, Appendix X1 (rating formula, hydrostatic design stress of PVC 1120); PPFA temperature factors; threaded pipe at 50 % (from memory)",
    })
}

/// HDB of PVC 12454 (4 000 psi) and the short-term strength (6 400 psi), AWWA C900-16
/// (from memory).
const C900_HDB_PSI: f64 = 4_000.0;
const C900_SHORT_TERM_PSI: f64 = 6_400.0;

fn c900(input: &RatingInput) -> Result<PipeRating, String> {
    let dr = designation_number(input, "DR").ok_or("C900 PVC without a DR")?;
    if dr <= 1.0 {
        return Err("a DR of 1 or less has no wall".into());
    }
    let factor = temperature_factor(PVC_TEMPERATURE_FACTORS, temperature(input), "PVC")?;
    // Rounded down to 5 psi, as the standard tabulates the classes.
    let class = (C900_HDB_PSI / (2.0 * (dr - 1.0) / 2.0) / 5.0 + 1e-9).floor() * 5.0 * factor;
    let short_term = 2.0 * C900_SHORT_TERM_PSI / (2.5 * (dr - 1.0)) * factor;
    Ok(PipeRating {
        working_pa: class * PSI,
        transient_pa: short_term * PSI,
        basis: Basis::C900 {
            dr,
            class: class * PSI,
            short_term: short_term * PSI,
            cycles_at_class: m23_cycles_to_failure(dr, class * PSI),
        },
        source: "ANSI/AWWA C900-16 (pressure classes, short-term rating); AWWA M23, 3rd ed. (recurring-surge fatigue); PPFA temperature factors (from memory)",
    })
}

fn steel_m11(input: &RatingInput, material: Material) -> Result<PipeRating, String> {
    let (Some(d), Some(wall)) = (input.outer_diameter, input.wall) else {
        return Err(format!(
            "{} pipe given by bore: no wall to rate; give `rating = ...`",
            material.keyword()
        ));
    };
    let fy = input.yield_strength.unwrap_or(STEEL_YIELD_PSI * PSI);
    let p = 2.0 * wall * 0.5 * fy / d;
    Ok(PipeRating {
        working_pa: p,
        transient_pa: 1.5 * p,
        basis: Basis::SteelM11 {
            wall,
            yield_strength: fy,
            outer_diameter: d,
            p,
        },
        source: "AWWA M11, 5th ed., ch. 4 (working stress 50 % and surge 75 % of the minimum yield); ASTM A53 Grade B minimum yield (from memory)",
    })
}

fn hdpe(input: &RatingInput) -> Result<PipeRating, String> {
    let dr = designation_number(input, "DR")
        .ok_or("HDPE without a DR: give `DR` in the size or `rating`")?;
    if dr <= 1.0 {
        return Err("a DR of 1 or less has no wall".into());
    }
    let factor = temperature_factor(HDPE_TEMPERATURE_FACTORS, temperature(input), "PE4710")?;
    let pr = 2.0 * PE4710_HDS_PSI * factor / (dr - 1.0);
    Ok(PipeRating {
        working_pa: pr * PSI,
        transient_pa: 2.0 * pr * PSI,
        basis: Basis::Hdpe {
            stress: PE4710_HDS_PSI * PSI,
            factor,
            dr,
            pr: pr * PSI,
        },
        source: "PPI TR-4 (hydrostatic design stress of PE4710); AWWA C906-15 and M55 (PR formula, surge allowances) (from memory)",
    })
}

/// Allowable stress of A106 Grade B and A312 TP304 at up to 100 °F, 20.0 ksi.
pub const STEEL_ALLOWABLE_PSI: f64 = 20_000.0;

/// Thread height h = 0.8·p of an NPT thread (ASME B1.20.1, from memory), with the
/// threads per inch by outside diameter (27 for NPS 1/8, 18 to 3/8, 14 to 3/4, 11.5 to
/// 2, 8 above), m.
pub fn npt_thread_depth(outer_diameter: f64) -> f64 {
    let od_in = outer_diameter / 0.0254;
    let tpi = match od_in {
        x if x <= 0.41 => 27.0,
        x if x <= 0.68 => 18.0,
        x if x <= 1.06 => 14.0,
        x if x <= 2.38 => 11.5,
        _ => 8.0,
    };
    0.8 / tpi * 0.0254
}

fn steel(input: &RatingInput, material: Material) -> Result<PipeRating, String> {
    let (Some(d), Some(wall)) = (input.outer_diameter, input.wall) else {
        return Err(format!(
            "{} pipe given by bore: no wall to rate; give `rating = ...` or `wall = ...` with a catalogue size",
            material.keyword()
        ));
    };
    let c_default = if material == Material::Stainless {
        0.0
    } else {
        STEEL_CORROSION_ALLOWANCE
    };
    let corrosion = input.corrosion_allowance.unwrap_or(c_default);
    let thread = if input.threaded {
        npt_thread_depth(d)
    } else {
        0.0
    };
    let t = 0.875 * wall - corrosion - thread;
    if t <= 0.0 {
        return Err(format!(
            "the wall after mill tolerance and allowances is {:.2} mm: none left to carry pressure",
            t * 1000.0
        ));
    }
    let (s, e, w, y) = (STEEL_ALLOWABLE_PSI, 1.0, 1.0, 0.4);
    let psi = 2.0 * t * s * e * w / (d - 2.0 * y * t);
    Ok(PipeRating {
        working_pa: psi * PSI,
        transient_pa: 1.33 * psi * PSI,
        basis: Basis::Steel {
            wall,
            corrosion,
            thread,
            t,
            stress: s * PSI,
            outer_diameter: d,
            p: psi * PSI,
        },
        source: "ASME B31.3, §304.1.2 eq. (3a), Table A-1 (A106 Grade B, A312 TP304, at ambient), §302.2.4 (occasional variations) (from memory)",
    })
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn hdpe_dr17_pe4710_is_125_psi() {
        // PR = 2·1000/(17 − 1) = 125 psi (AWWA C906 pressure class table, PE4710 DR 17).
        let r = pipe_rating(&RatingInput {
            material: Some(Material::Hdpe),
            designation: Some("DR 17"),
            ..Default::default()
        })
        .unwrap();
        assert!((r.working_pa / PSI - 125.0).abs() < 1e-9);
        assert!((r.transient_pa / PSI - 250.0).abs() < 1e-9);
    }

    #[test]
    fn ductile_iron_class_is_the_working_pressure_without_a_second_allowance() {
        let r = pipe_rating(&RatingInput {
            material: Some(Material::DuctileIron),
            designation: Some("class 350"),
            ..Default::default()
        })
        .unwrap();
        assert!((r.working_pa / PSI - 350.0).abs() < 1e-9);
        assert!((r.transient_pa / PSI - 450.0).abs() < 1e-9);
    }

    #[test]
    fn pvc_above_140_degf_is_not_rated() {
        let e = pipe_rating(&RatingInput {
            material: Some(Material::Pvc),
            outer_diameter: Some(0.2191),
            wall: Some(0.00818),
            temperature_k: Some(340.0),
            ..Default::default()
        });
        assert!(e.is_err());
    }

    #[test]
    fn c900_2016_pressure_classes() {
        // AWWA C900-16 (from memory; the brief's 305/235/165 psi): DR 14 = PC 305,
        // DR 18 = PC 235, DR 21 = PC 200, DR 25 = PC 165 psi. 4000/13 = 307.7 → 305;
        // 4000/17 = 235.3 → 235; 4000/20 = 200; 4000/24 = 166.7 → 165.
        for (dr, pc) in [(14.0, 305.0), (18.0, 235.0), (21.0, 200.0), (25.0, 165.0)] {
            let d = format!("DR {dr}");
            let r = pipe_rating(&RatingInput {
                material: Some(Material::Pvc),
                designation: Some(&d),
                ..Default::default()
            })
            .unwrap();
            assert!(
                (r.working_pa / PSI - pc).abs() < 1e-9,
                "DR {dr}: {}",
                r.working_pa / PSI
            );
            // STR = 2 × 6400/(2.5 × (DR − 1)): DR 18 → 12 800/42.5 = 301.2 psi.
            let str_psi = 12_800.0 / (2.5 * (dr - 1.0));
            assert!((r.transient_pa / PSI - str_psi).abs() < 1e-9);
        }
        // AWWA M23: DR 18 at its class, S = 235 × 17/2 = 1 997.5 psi,
        // C = 5.05e21 × 1997.5^−4.906 = 5.05e21 × 10^(−4.906 × 3.30049) = 5.05e21 ×
        // 10^−16.1922 = 5.05e21 × 6.425e−17 = 3.24e5 cycles.
        let c = m23_cycles_to_failure(18.0, 235.0 * PSI);
        assert!((c / 3.244e5 - 1.0).abs() < 0.002, "{c}");
    }

    #[test]
    fn m11_waterworks_steel() {
        // AWWA M11: 24 in OD, 0.25 in wall, 35 ksi yield: P = 2 × 0.25 × 17 500/24
        // = 364.6 psi working, 546.9 psi with surge (75 % of yield).
        let r = pipe_rating(&RatingInput {
            material: Some(Material::Steel),
            outer_diameter: Some(24.0 * 0.0254),
            wall: Some(0.25 * 0.0254),
            m11: true,
            ..Default::default()
        })
        .unwrap();
        assert!((r.working_pa / PSI - 364.583_333).abs() < 1e-3);
        assert!((r.transient_pa / PSI - 546.875).abs() < 1e-3);
    }

    #[test]
    fn copper_has_no_rule() {
        assert!(pipe_rating(&RatingInput {
            material: Some(Material::Copper),
            ..Default::default()
        })
        .is_err());
    }
}
