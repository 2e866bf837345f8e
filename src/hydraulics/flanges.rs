//! Pressure ratings of flanged joints by standard, class and material group, SI
//! (Pa gauge). A flange rating is a pressure–temperature rating: the standards give no
//! separate surge allowance, so the same value limits the steady and the transient
//! pressure here (conservative; ASME B31.3 §302.2.4 may allow short variations above it
//! for process piping).
//!
//! - ASME B16.5 (2017), Table 2-1.1, material group 1.1 (carbon steel, A105 forgings,
//!   A216 WCB castings): class 150 and class 300 at −20 to 500 °F, linear between the
//!   tabulated temperatures (the standard's own rule).
//! - ASME B16.1 (2015), cast-iron flanges (ASTM A126 class B): class 125 and class 250,
//!   NPS 1–12 and NPS 14–24 (larger sizes rate lower), at −20 to 150 °F, and at 200 °F.
//! - AWWA C207 (2018), steel ring flanges for waterworks service: classes B, D, E and F
//!   at atmospheric temperatures (class D rates lower above NPS 12).
//!
//! Every value is **from memory**, not read from the edition in force; the package says
//! so and defers to the certified ratings of the flanges supplied.

use super::ratings::PSI;

/// A flange standard and class as the design names it (`flanges = asme_150`).
#[derive(Clone, Copy, Debug, PartialEq, Eq)]
pub enum FlangeClass {
    /// ASME B16.5 class 150, group 1.1.
    Asme150,
    /// ASME B16.5 class 300, group 1.1.
    Asme300,
    /// ASME B16.1 class 125 cast iron.
    Iron125,
    /// ASME B16.1 class 250 cast iron.
    Iron250,
    /// AWWA C207 class B.
    AwwaB,
    /// AWWA C207 class D.
    AwwaD,
    /// AWWA C207 class E.
    AwwaE,
    /// AWWA C207 class F.
    AwwaF,
}

/// The keywords, in the order of the language reference.
pub const FLANGE_KEYWORDS: &[&str] = &[
    "asme_150", "asme_300", "iron_125", "iron_250", "awwa_b", "awwa_d", "awwa_e", "awwa_f",
];

/// ASME B16.5 Table 2-1.1 (group 1.1): (°F, class 150 psig, class 300 psig), from memory.
const B16_5_GROUP_1_1: &[(f64, f64, f64)] = &[
    (100.0, 285.0, 740.0),
    (200.0, 260.0, 680.0),
    (300.0, 230.0, 655.0),
    (400.0, 200.0, 635.0),
    (500.0, 170.0, 605.0),
];

/// Outside diameter above which a pipe is NPS 14 or larger, m (NPS 12 is 12.75 in,
/// NPS 14 is 14.0 in; C151 ductile iron 12 in is 13.20 in).
const ABOVE_NPS_12: f64 = 13.6 * 0.0254;

impl FlangeClass {
    /// The class of a keyword of [`FLANGE_KEYWORDS`].
    pub fn from_keyword(word: &str) -> Option<FlangeClass> {
        use FlangeClass::*;
        let all = [
            Asme150, Asme300, Iron125, Iron250, AwwaB, AwwaD, AwwaE, AwwaF,
        ];
        FLANGE_KEYWORDS
            .iter()
            .position(|k| *k == word)
            .map(|i| all[i])
    }

    /// The keyword of the language.
    pub fn keyword(self) -> &'static str {
        use FlangeClass::*;
        let i = [
            Asme150, Asme300, Iron125, Iron250, AwwaB, AwwaD, AwwaE, AwwaF,
        ]
        .iter()
        .position(|c| *c == self)
        .unwrap_or(0);
        FLANGE_KEYWORDS[i]
    }

    /// How the package names the flanges.
    pub fn description(self) -> &'static str {
        match self {
            FlangeClass::Asme150 => "ASME B16.5 class 150 flanges (material group 1.1)",
            FlangeClass::Asme300 => "ASME B16.5 class 300 flanges (material group 1.1)",
            FlangeClass::Iron125 => "ASME B16.1 class 125 cast-iron flanges",
            FlangeClass::Iron250 => "ASME B16.1 class 250 cast-iron flanges",
            FlangeClass::AwwaB => "AWWA C207 class B ring flanges",
            FlangeClass::AwwaD => "AWWA C207 class D ring flanges",
            FlangeClass::AwwaE => "AWWA C207 class E ring flanges",
            FlangeClass::AwwaF => "AWWA C207 class F ring flanges",
        }
    }

    /// The publication (with "from memory").
    pub fn source(self) -> &'static str {
        match self {
            FlangeClass::Asme150 | FlangeClass::Asme300 => {
                "ASME B16.5-2017, Table 2-1.1 (group 1.1 pressure-temperature ratings) (from memory)"
            }
            FlangeClass::Iron125 | FlangeClass::Iron250 => {
                "ASME B16.1-2015, pressure-temperature ratings of class 125 and 250 cast-iron flanges (from memory)"
            }
            _ => "ANSI/AWWA C207-18, ring flange classes for water service (from memory)",
        }
    }
}

/// The rating (Pa gauge) of flanges of `class` on a pipe of outside diameter
/// `outer_diameter` (m) at `temperature_k` (K); `Err` above the tabulated temperature.
pub fn flange_rating(
    class: FlangeClass,
    outer_diameter: f64,
    temperature_k: f64,
) -> Result<f64, String> {
    let f = (temperature_k - 273.15) * 1.8 + 32.0;
    let large = outer_diameter > ABOVE_NPS_12;
    let psi = match class {
        FlangeClass::Asme150 | FlangeClass::Asme300 => {
            let col = |r: &(f64, f64, f64)| {
                if class == FlangeClass::Asme150 {
                    r.1
                } else {
                    r.2
                }
            };
            b16_5(f, col)?
        }
        FlangeClass::Iron125 | FlangeClass::Iron250 => {
            // (rating to 150 °F, at 200 °F) for NPS 1–12 and NPS 14–24, psig.
            let (cold, hot) = match (class, large) {
                (FlangeClass::Iron125, false) => (200.0, 190.0),
                (FlangeClass::Iron125, true) => (150.0, 135.0),
                (_, false) => (500.0, 460.0),
                (_, true) => (300.0, 280.0),
            };
            if f <= 150.0 {
                cold
            } else if f <= 200.0 {
                cold + (hot - cold) * (f - 150.0) / 50.0
            } else {
                return Err(format!(
                    "cast-iron flanges are rated here to 200 degF; the liquid is at {f:.0} degF"
                ));
            }
        }
        _ => {
            if f > 100.0 {
                return Err(format!(
                    "AWWA C207 ring flanges are rated for water at atmospheric temperatures; the liquid is at {f:.0} degF"
                ));
            }
            match (class, large) {
                (FlangeClass::AwwaB, _) => 86.0,
                (FlangeClass::AwwaD, false) => 175.0,
                (FlangeClass::AwwaD, true) => 150.0,
                (FlangeClass::AwwaE, _) => 275.0,
                _ => 300.0,
            }
        }
    };
    Ok(psi * PSI)
}

/// B16.5 group 1.1 at `f` °F (the 100 °F value from −20 °F), linear between rows.
fn b16_5(f: f64, col: impl Fn(&(f64, f64, f64)) -> f64) -> Result<f64, String> {
    let rows = B16_5_GROUP_1_1;
    if f <= rows[0].0 {
        return Ok(col(&rows[0]));
    }
    for w in rows.windows(2) {
        if f <= w[1].0 {
            let t = (f - w[0].0) / (w[1].0 - w[0].0);
            return Ok(col(&w[0]) + t * (col(&w[1]) - col(&w[0])));
        }
    }
    Err(format!(
        "the B16.5 ratings are tabulated here to 500 degF; the liquid is at {f:.0} degF"
    ))
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn group_1_1_ratings() {
        // ASME B16.5 Table 2-1.1, group 1.1 (from memory): class 150 is 285 psig and
        // class 300 is 740 psig at −20 to 100 °F; at 150 °F class 150 is midway between
        // 285 and 260: 272.5 psig.
        let at = |c, f: f64| flange_rating(c, 0.2191, (f - 32.0) / 1.8 + 273.15).unwrap() / PSI;
        assert!((at(FlangeClass::Asme150, 60.0) - 285.0).abs() < 1e-9);
        assert!((at(FlangeClass::Asme300, 60.0) - 740.0).abs() < 1e-9);
        assert!((at(FlangeClass::Asme150, 150.0) - 272.5).abs() < 1e-9);
        assert!(flange_rating(FlangeClass::Asme150, 0.2191, 600.0).is_err());
        // B16.1 class 125: 200 psig to NPS 12, 150 psig from NPS 14 (from memory).
        assert!((at(FlangeClass::Iron125, 60.0) - 200.0).abs() < 1e-9);
        let big = flange_rating(FlangeClass::Iron125, 0.4064, 290.0).unwrap() / PSI;
        assert!((big - 150.0).abs() < 1e-9);
        // AWWA C207 class D: 175 psi to 12 in, 150 psi above (from memory).
        assert!((at(FlangeClass::AwwaD, 60.0) - 175.0).abs() < 1e-9);
        for k in FLANGE_KEYWORDS {
            assert_eq!(FlangeClass::from_keyword(k).unwrap().keyword(), *k);
        }
    }
}
