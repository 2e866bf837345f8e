//! Dimension tables for PVC (ASTM D1785), copper tube (ASTM B88), ductile iron
//! (ANSI/AWWA C151/A21.51) and the DR series of IPS-sized polyethylene pipe.
//!
//! Rows are (nominal size in eighths of an inch, wall in inches); outside diameters
//! are in inches.

// Wall thicknesses such as 0.318 in are table data, not approximations of 1/pi.
#![allow(clippy::approx_constant)]

/// ASTM D1785 PVC schedule 40, minimum wall. Equal to B36.10M schedule 40 through
/// NPS 12; the larger sizes are rounded down (0.437, 0.593, 0.687 in). Verified
/// against `fluids.piping` ("40D1785").
#[rustfmt::skip]
pub(super) const D1785_SCH40: &[(u16, f64)] = &[
    (1, 0.068), (2, 0.088), (3, 0.091), (4, 0.109), (6, 0.113), (8, 0.133),
    (10, 0.140), (12, 0.145), (16, 0.154), (20, 0.203), (24, 0.216), (28, 0.226),
    (32, 0.237), (40, 0.258), (48, 0.280), (64, 0.322), (80, 0.365), (96, 0.406),
    (112, 0.437), (128, 0.500), (144, 0.562), (160, 0.593), (192, 0.687),
];

/// ASTM D1785 PVC schedule 80, minimum wall (NPS 10 and up rounded down from the
/// steel values: 0.593, 0.687, 0.843, 0.937, 1.218 in). Verified against
/// `fluids.piping` ("80D1785").
#[rustfmt::skip]
pub(super) const D1785_SCH80: &[(u16, f64)] = &[
    (1, 0.095), (2, 0.119), (3, 0.126), (4, 0.147), (6, 0.154), (8, 0.179),
    (10, 0.191), (12, 0.200), (16, 0.218), (20, 0.276), (24, 0.300), (28, 0.318),
    (32, 0.337), (40, 0.375), (48, 0.432), (64, 0.500), (80, 0.593), (96, 0.687),
    (112, 0.750), (128, 0.843), (144, 0.937), (160, 1.031), (192, 1.218),
];

/// ASTM B88 type K nominal wall. 1/4-6 in checked against a published transcription of
/// B88 (engineeringtoolbox "ASTM B88 Seamless Copper Water Tubes"); 8-12 in from
/// memory, consistent with the B88M metric type A walls (6.8, 8.5, 10.3 mm).
#[rustfmt::skip]
pub(super) const B88_TYPE_K: &[(u16, f64)] = &[
    (2, 0.035), (3, 0.049), (4, 0.049), (5, 0.049), (6, 0.065), (8, 0.065),
    (10, 0.065), (12, 0.072), (16, 0.083), (20, 0.095), (24, 0.109), (28, 0.120),
    (32, 0.134), (40, 0.160), (48, 0.192), (64, 0.271), (80, 0.338), (96, 0.405),
];

/// ASTM B88 type L nominal wall. 4 in is 0.110 in (ID 3.905 in, Copper Tube Handbook,
/// from memory; one web transcription prints 0.114). 8-12 in from memory.
#[rustfmt::skip]
pub(super) const B88_TYPE_L: &[(u16, f64)] = &[
    (2, 0.030), (3, 0.035), (4, 0.040), (5, 0.042), (6, 0.045), (8, 0.050),
    (10, 0.055), (12, 0.060), (16, 0.070), (20, 0.080), (24, 0.090), (28, 0.100),
    (32, 0.110), (40, 0.125), (48, 0.140), (64, 0.200), (80, 0.250), (96, 0.280),
];

/// ASTM B88 type M nominal wall (no 1/4 or 5/8 in). From memory; matches a public
/// code transcription of B88 and the B88M metric type C walls at 54, 105, 206 mm.
#[rustfmt::skip]
pub(super) const B88_TYPE_M: &[(u16, f64)] = &[
    (3, 0.025), (4, 0.028), (6, 0.032), (8, 0.035), (10, 0.042), (12, 0.049),
    (16, 0.058), (20, 0.065), (24, 0.072), (28, 0.083), (32, 0.095), (40, 0.109),
    (48, 0.122), (64, 0.170), (80, 0.212), (96, 0.254),
];

/// Ductile-iron pipe outside diameters (in), ANSI/AWWA C151/A21.51, as reproduced in
/// the pressure-class tables of manufacturers' catalogues.
#[rustfmt::skip]
pub(super) const C151_OUTSIDE_DIAMETER_IN: &[(u16, f64)] = &[
    (24, 3.96), (32, 4.80), (48, 6.90), (64, 9.05), (80, 11.10), (96, 13.20),
    (112, 15.30), (128, 17.40), (144, 19.50), (160, 21.60), (192, 25.80), (240, 32.00),
    (288, 38.30), (336, 44.50), (384, 50.80), (432, 57.56), (480, 61.61), (512, 65.67),
];

/// C151 pressure class 350 nominal thickness. Read from a manufacturer's reproduction
/// of the C150/C151 pressure-class table (4-64 in) and a utility specification
/// table (3-64 in); both agree (10 in is 0.26 in; one older table shows 0.28).
#[rustfmt::skip]
pub(super) const C151_CLASS_350: &[(u16, f64)] = &[
    (24, 0.25), (32, 0.25), (48, 0.25), (64, 0.25), (80, 0.26), (96, 0.28),
    (112, 0.31), (128, 0.34), (144, 0.36), (160, 0.38), (192, 0.43), (240, 0.49),
    (288, 0.56), (336, 0.63), (384, 0.70), (432, 0.79), (480, 0.83), (512, 0.87),
];

/// C151 pressure class 300 nominal thickness (14 in and up), same sources.
#[rustfmt::skip]
pub(super) const C151_CLASS_300: &[(u16, f64)] = &[
    (112, 0.30), (128, 0.32), (144, 0.34), (160, 0.36), (192, 0.40), (240, 0.45),
    (288, 0.51), (336, 0.57), (384, 0.64), (432, 0.72), (480, 0.76), (512, 0.80),
];

/// C151 pressure class 250 nominal thickness (14 in and up).
#[rustfmt::skip]
pub(super) const C151_CLASS_250: &[(u16, f64)] = &[
    (112, 0.28), (128, 0.30), (144, 0.31), (160, 0.33), (192, 0.37), (240, 0.42),
    (288, 0.47), (336, 0.52), (384, 0.58), (432, 0.65), (480, 0.68), (512, 0.72),
];

/// C151 pressure class 200 nominal thickness (24 in and up).
#[rustfmt::skip]
pub(super) const C151_CLASS_200: &[(u16, f64)] = &[
    (192, 0.33), (240, 0.38), (288, 0.42), (336, 0.47), (384, 0.52), (432, 0.58),
    (480, 0.61), (512, 0.64),
];

/// C151 pressure class 150 nominal thickness (30 in and up).
#[rustfmt::skip]
pub(super) const C151_CLASS_150: &[(u16, f64)] = &[
    (240, 0.34), (288, 0.38), (336, 0.41), (384, 0.46), (432, 0.51), (480, 0.54),
    (512, 0.56),
];

/// Standard shop cement-mortar lining thickness (in) of ANSI/AWWA C104/A21.4 for a
/// ductile-iron nominal size in eighths: 1/16 in for 3-12 in, 3/32 in for 14-24 in,
/// 1/8 in for 30-64 in (from memory; the standard also allows double thickness).
pub(super) fn c104_standard_lining_in(eighths: u16) -> f64 {
    if eighths <= 96 {
        1.0 / 16.0
    } else if eighths <= 192 {
        3.0 / 32.0
    } else {
        1.0 / 8.0
    }
}

/// The DR series of IPS-sized polyethylene pipe (ASTM D3035 / F714): dimension
/// ratio, catalogue key, and the nominal sizes (eighths) offered, taken from the
/// ASTM F2619 IPS tables as transcribed in `fluids.piping` and capped at NPS 24.
#[rustfmt::skip]
pub(super) const PE_DR_SERIES: &[(f64, &str, &[u16])] = &[
    (7.0, "DR7", &[4, 6, 8, 10, 12, 16, 20, 24, 32, 40, 48, 64, 80, 96, 112, 128, 144, 160, 176, 192]),
    (9.0, "DR9", &[4, 6, 8, 10, 12, 16, 20, 24, 32, 40, 48, 64, 80, 96, 112, 128, 144, 160, 176, 192]),
    (11.0, "DR11", &[4, 6, 8, 10, 12, 16, 20, 24, 32, 40, 48, 64, 80, 96, 112, 128, 144, 160, 176, 192]),
    (13.5, "DR13.5", &[4, 6, 8, 10, 12, 16, 20, 24, 32, 40, 48, 64, 80, 96, 112, 128, 144, 160, 176, 192]),
    (17.0, "DR17", &[16, 20, 24, 32, 40, 48, 64, 80, 96, 112, 128, 144, 160, 176, 192]),
    (21.0, "DR21", &[20, 24, 32, 40, 48, 64, 80, 96, 112, 128, 144, 160, 176, 192]),
    (26.0, "DR26", &[32, 40, 48, 64, 80, 96, 112, 128, 144, 160, 176, 192]),
    (32.5, "DR32.5", &[32, 40, 48, 64, 80, 96, 112, 128, 144, 160, 176, 192]),
];

/// Cast-iron outside diameters (CIOD, in) of municipal PVC pressure pipe, ANSI/AWWA
/// C900-16 (which took in the 14–24 in sizes of C905): (nominal in eighths, OD in).
/// From memory; equal to the ductile-iron ODs of AWWA C151 through 12 in, and to the
/// C900 and C905 tables transcribed in `fluids.piping` (tests/reference/gen_pipes.py).
#[rustfmt::skip]
pub(super) const C900_CIOD_IN: &[(u16, f64)] = &[
    (32, 4.80), (48, 6.90), (64, 9.05), (80, 11.10), (96, 13.20), (112, 15.30),
    (128, 17.40), (144, 19.50), (160, 21.60), (192, 25.80),
];

/// The DR series of AWWA C900-16 PVC (DR 14, 18, 21, 25) with their catalogue keys and
/// sizes (eighths) up to 24 in, as the C900-07 (4–12 in) and C905 (14 in and up) tables
/// transcribed in `fluids.piping` list them; the pressure classes are in
/// [`crate::hydraulics::ratings`].
#[rustfmt::skip]
pub(super) const C900_DR_SERIES: &[(f64, &str, &[u16])] = &[
    (14.0, "DR14", &[32, 48, 64, 80, 96, 112, 128, 144]),
    (18.0, "DR18", &[32, 48, 64, 80, 96, 112, 128, 144, 160, 192]),
    (21.0, "DR21", &[112, 128, 144, 160, 192]),
    (25.0, "DR25", &[32, 48, 64, 80, 96, 112, 128, 144, 160, 192]),
];

/// Minimum wall of a DR-rated pipe, t = OD / DR, rounded to 0.001 in as the
/// ASTM F714 / F2619 inch tables print it.
pub(super) fn pe_minimum_wall_in(outside_in: f64, dr: f64) -> f64 {
    (outside_in / dr * 1000.0).round() / 1000.0
}

/// Mean wall of ASTM D1785 PVC pipe: minimum wall plus half of its plus tolerance,
/// where the tolerance is 12 % of the minimum wall but not less than 0.020 in (from
/// memory of D1785's wall tolerance column). With it, OD - 2 x mean wall reproduces
/// the "average ID" column of published schedule 40 tables (e.g. 2 in: 2.047 in,
/// 4 in: 3.998 in).
pub(super) fn pvc_mean_wall_in(minimum_wall_in: f64) -> f64 {
    minimum_wall_in + 0.5 * (0.12 * minimum_wall_in).max(0.020)
}

/// Mean wall of DR-rated PE pipe, 1.06 x minimum wall (plus tolerance of 12 %), the
/// basis of the PPI Handbook of Polyethylene Pipe (2nd ed., ch. 6) average inside
/// diameter D = OD - 2.12 t (from memory).
pub(super) fn pe_mean_wall_in(minimum_wall_in: f64) -> f64 {
    1.06 * minimum_wall_in
}
