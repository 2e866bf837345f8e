//! The design's uncertainty (issue 15): ranges on inputs inside every case and how to
//! combine them, as `uncertainty { ... }` states them. The pump test grade is on the
//! pump ([`super::PumpCandidate::test_grade`]).

use crate::diagnostics::Span;

/// How the ranges are combined into a duty envelope.
#[derive(Clone, Copy, Debug, PartialEq, Eq)]
pub enum Combine {
    /// Every corner: each input at its low and high end, the pump at minus, nominal and
    /// plus tolerance (exact for effects monotone in each input).
    Corners,
    /// A stated number of quasi-random points (a Halton sequence: the same points every
    /// run, so the package stays byte-identical).
    Samples(u32),
}

/// A range on a pipe property, either as factors of each pipe's own value or as one
/// absolute range that replaces it.
#[derive(Clone, Copy, Debug, PartialEq)]
pub enum Spread {
    /// Low and high factors on the case's value (dimensionless; 0.5 = 50 %).
    Factor(f64, f64),
    /// Low and high values in SI (roughness m; Hazen-Williams C dimensionless).
    Absolute(f64, f64),
}

/// One input range.
#[derive(Clone, Debug, PartialEq)]
pub enum RangeKind {
    /// Absolute roughness of every Darcy-Weisbach pipe.
    Roughness(Spread),
    /// Hazen-Williams C of every Hazen-Williams pipe.
    HazenWilliamsC(Spread),
    /// A tank's level, ± m about each case's level.
    Level {
        /// The tank's name.
        tank: String,
        /// Half the range, m.
        plus_minus_m: f64,
    },
    /// The water temperature, ± K about each case's temperature.
    Temperature {
        /// Half the range, K.
        plus_minus_k: f64,
    },
    /// Every stated `loss` (its K and equivalent length), ± a fraction.
    Loss {
        /// Half the range as a fraction (0.2 = ±20 %).
        plus_minus: f64,
    },
}

/// One input range as written.
#[derive(Clone, Debug, PartialEq)]
pub struct InputRange {
    /// What varies and by how much.
    pub kind: RangeKind,
    /// Where it is written.
    pub span: Span,
}

impl InputRange {
    /// The value of a spread at `x` in [0, 1] (0 the low end), applied to `nominal`.
    pub fn spread_at(spread: Spread, nominal: f64, x: f64) -> f64 {
        let (lo, hi) = match spread {
            Spread::Factor(a, b) => (a * nominal, b * nominal),
            Spread::Absolute(a, b) => (a, b),
        };
        lo + (hi - lo) * x
    }
}

/// The `uncertainty { ... }` block.
#[derive(Clone, Debug, PartialEq)]
pub struct Uncertainty {
    /// How the ranges combine.
    pub combine: Combine,
    /// The ranges, in file order.
    pub inputs: Vec<InputRange>,
    /// Where the block is written (`None` when only test grades ask for an envelope).
    pub span: Option<Span>,
}

/// Most input ranges of one design (3 × 2⁸ corners per case and candidate).
pub const MAX_INPUTS: usize = 8;
/// Fewest and most quasi-random samples.
pub const SAMPLES: (u32, u32) = (8, 4096);
