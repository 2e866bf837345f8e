//! The words of the design language in one place: statement keywords, the items of a
//! line, the fields of each block and the words a field takes. The lowering reads its
//! statement keywords from here; editors (the TextMate grammar in `editors/`, the
//! language server's completion) list the same words, and a test keeps them in step.

use super::lower;
use super::pumps::PUMP_FIELDS;
use super::scenario::{
    FITTING_FIELDS, FLUID_FIELDS, LOSS_FIELDS, SEGMENT_FIELDS, SITE_FIELDS, TANK_FIELDS,
};

/// The top-level statement keywords (`project`, `tank`, `line`, ...).
pub const STATEMENTS: &[&str] = &[
    "project",
    "revision",
    "purpose",
    "fluid",
    "site",
    "tank",
    "station",
    "line",
    "case",
    "require",
    "pump",
    "motor",
    "energy",
    "assume",
    "note",
    "junction",
    "delivery",
    "valve",
    "equipment",
    "wellpump",
    "load_profile",
    "cost",
    "uncertainty",
];

/// Words the grammar itself reserves: constants, case scopes of a requirement, curve
/// tables.
pub const RESERVED: &[&str] = &["let", "for", "curve"];

/// The items of a `line` block.
pub const LINE_ITEMS: &[&str] = &["pipe", "fitting", "loss"];

/// The ranges of an `uncertainty` block (`roughness 50 % to 200 %`).
pub const UNCERTAINTY_ITEMS: &[&str] = lower::UNCERTAINTY_ITEMS;

/// Connecting words in statement arguments: `line NAME from A to B`, `curve impeller D
/// from "file.csv"`, `pipe steel 8 in schedule 40`, `curve hourly from "flows.csv"`.
pub const ARGUMENT_WORDS: &[&str] = &[
    "from", "to", "impeller", "speed", "schedule", "type", "class", "DR", "hourly",
];

/// Words a field takes as its value (`units = us`, `roughness = aged`, ...).
pub const VALUE_WORDS: &[&str] = &[
    "us",
    "si",
    "single",
    "parallel",
    "series",
    "none",
    "speed",
    "trim",
    "nema",
    "iec",
    "new",
    "aged",
    "water",
    "pump",
    "corners",
    "samples",
    "ethylene_glycol",
    "propylene_glycol",
    "mass",
    "volume",
    "suction",
    "discharge",
    "fluid",
];

/// The overrides of a case besides `TANK.level` and the other dotted paths.
pub const CASE_FIELDS: &[&str] = &["hours", "roughness"];

/// Per block keyword, the fields its braces take.
pub fn fields(block: &str) -> &'static [&'static str] {
    match block {
        "project" => lower::PROJECT_FIELDS,
        "fluid" => FLUID_FIELDS,
        "site" => SITE_FIELDS,
        "tank" => TANK_FIELDS,
        "station" => lower::STATION_FIELDS,
        "pipe" => SEGMENT_FIELDS,
        "fitting" => FITTING_FIELDS,
        "loss" => LOSS_FIELDS,
        "pump" => PUMP_FIELDS,
        "motor" => lower::MOTOR_FIELDS,
        "energy" => lower::ENERGY_FIELDS,
        "case" => CASE_FIELDS,
        "uncertainty" => lower::UNCERTAINTY_FIELDS,
        _ => &[],
    }
}

/// The quantities of a `require` line (`flow`, `npsh_margin`, ...).
pub fn requirement_quantities() -> impl Iterator<Item = &'static str> {
    super::design::Metric::ALL.iter().map(|(k, _)| *k)
}
