//! The named fittings. Darby and Hooper constants are those of the published
//! tables, checked one by one against the `fluids` package dictionaries
//! `fluids.fittings.Darby` and `fluids.fittings.Hooper` by
//! `tests/reference/gen_fittings.py` (the entry each name maps to is quoted in its
//! `source`).

use super::{FittingSpec, KMethod};

/// Other spellings accepted by [`super::fitting`], mapped to canonical names.
pub const ALIASES: &[(&str, &str)] = &[
    ("inlet_flush", "entrance_flush"),
    ("entrance_sharp", "entrance_flush"),
    ("inlet_projecting", "entrance_projecting"),
    ("entrance_reentrant", "entrance_projecting"),
    ("inlet_rounded", "entrance_rounded"),
    ("bellmouth", "entrance_rounded"),
    ("outlet", "exit"),
    ("elbow_90", "elbow_90_standard"),
    ("elbow_45", "elbow_45_standard"),
    ("y_strainer", "strainer_y"),
    ("basket_strainer", "strainer_basket"),
];

const fn darby(
    name: &'static str,
    description: &'static str,
    source: &'static str,
    k1: f64,
    ki: f64,
    kd: f64,
) -> FittingSpec {
    FittingSpec {
        name,
        description,
        method: KMethod::Darby { k1, ki, kd },
        source,
        needs_beta: false,
        needs_angle: false,
    }
}

const fn hooper(
    name: &'static str,
    description: &'static str,
    source: &'static str,
    k1: f64,
    kinf: f64,
) -> FittingSpec {
    FittingSpec {
        name,
        description,
        method: KMethod::Hooper { k1, kinf },
        source,
        needs_beta: false,
        needs_angle: false,
    }
}

const fn inlet(
    name: &'static str,
    description: &'static str,
    source: &'static str,
    k1: f64,
    kinf: f64,
) -> FittingSpec {
    FittingSpec {
        name,
        description,
        method: KMethod::HooperInletOutlet { k1, kinf },
        source,
        needs_beta: false,
        needs_angle: false,
    }
}

const fn fixed(
    name: &'static str,
    description: &'static str,
    source: &'static str,
    method: KMethod,
    needs_beta: bool,
    needs_angle: bool,
) -> FittingSpec {
    FittingSpec {
        name,
        description,
        method,
        source,
        needs_beta,
        needs_angle,
    }
}

/// Every named fitting.
#[rustfmt::skip]
pub const FITTINGS: &[FittingSpec] = &[
    // Elbows and bends (Darby 3-K).
    darby("elbow_90_standard", "90 deg standard elbow, flanged or welded, r/D = 1",
        "Darby (1999) 3-K, entry \"Elbow, 90°, flanged, welded, bends, (r/D = 1)\"", 800.0, 0.091, 4.0),
    darby("elbow_90_long", "90 deg long-radius elbow, r/D = 1.5 (Darby's only r/D = 1.5 entry, listed as threaded)",
        "Darby (1999) 3-K, entry \"Elbow, 90°, threaded, long radius, (r/D = 1.5)\"", 800.0, 0.071, 4.2),
    darby("elbow_90_threaded", "90 deg standard elbow, threaded, r/D = 1",
        "Darby (1999) 3-K, entry \"Elbow, 90°, threaded, standard, (r/D = 1)\"", 800.0, 0.14, 4.0),
    darby("bend_90_r2d", "90 deg bend, r/D = 2",
        "Darby (1999) 3-K, entry \"Elbow, 90°, (r/D = 2)\"", 800.0, 0.056, 3.9),
    darby("bend_90_r4d", "90 deg bend, r/D = 4",
        "Darby (1999) 3-K, entry \"Elbow, 90°, (r/D = 4)\"", 800.0, 0.066, 3.9),
    darby("bend_90_r6d", "90 deg bend, r/D = 6",
        "Darby (1999) 3-K, entry \"Elbow, 90°, (r/D = 6)\"", 800.0, 0.075, 4.2),
    darby("elbow_90_mitre_1_weld", "90 deg mitre elbow, one weld (one 90 deg cut)",
        "Darby (1999) 3-K, entry \"Elbow, 90°, mitered, 1 weld, (90°)\"", 1000.0, 0.27, 4.0),
    darby("elbow_90_mitre_2_welds", "90 deg mitre elbow, two welds (45 deg cuts)",
        "Darby (1999) 3-K, entry \"Elbow, 90°, 2 welds, (45°)\"", 800.0, 0.068, 4.1),
    darby("elbow_90_mitre_3_welds", "90 deg mitre elbow, three welds (30 deg cuts)",
        "Darby (1999) 3-K, entry \"Elbow, 90°, 3 welds, (30°)\"", 800.0, 0.035, 4.2),
    darby("elbow_45_standard", "45 deg standard elbow, r/D = 1 (Darby lists it as threaded)",
        "Darby (1999) 3-K, entry \"Elbow, 45°, threaded standard, (r/D = 1)\"", 500.0, 0.071, 4.2),
    darby("elbow_45_long", "45 deg long-radius elbow, r/D = 1.5",
        "Darby (1999) 3-K, entry \"Elbow, 45°, long radius, (r/D = 1.5)\"", 500.0, 0.052, 4.0),
    darby("elbow_45_mitre_1_weld", "45 deg mitre elbow, one weld",
        "Darby (1999) 3-K, entry \"Elbow, 45°, mitered, 1 weld, (45°)\"", 500.0, 0.086, 4.0),
    darby("elbow_45_mitre_2_welds", "45 deg mitre elbow, two welds (22.5 deg cuts)",
        "Darby (1999) 3-K, entry \"Elbow, 45°, mitered, 2 welds, (22.5°)\"", 500.0, 0.052, 4.0),
    darby("return_bend", "180 deg return bend, flanged, r/D = 1",
        "Darby (1999) 3-K, entry \"Elbow, 180°, flanged, (r/D = 1)\"", 1000.0, 0.12, 4.0),
    darby("return_bend_threaded", "180 deg close-return bend, threaded, r/D = 1",
        "Darby (1999) 3-K, entry \"Elbow, 180°, threaded, close-return bend, (r/D = 1)\"", 1000.0, 0.23, 4.0),
    darby("return_bend_long", "180 deg return bend, r/D = 1.5",
        "Darby (1999) 3-K, entry \"Elbow, 180°, all, (r/D = 1.5)\"", 1000.0, 0.1, 4.0),
    // Tees (Darby 3-K).
    darby("tee_run", "tee, flow straight through the run, flanged",
        "Darby (1999) 3-K, entry \"Tee, Run-through, flanged, (r/D = 1)\"", 150.0, 0.05, 4.0),
    darby("tee_run_threaded", "tee, flow straight through the run, threaded",
        "Darby (1999) 3-K, entry \"Tee, Run-through, threaded, (r/D = 1)\"", 200.0, 0.091, 4.0),
    darby("tee_branch", "tee, flow turning through the branch, flanged",
        "Darby (1999) 3-K, entry \"Tee, Through-branch, (as elbow), flanged, (r/D = 1)\"", 800.0, 0.28, 4.0),
    darby("tee_branch_threaded", "tee, flow turning through the branch, threaded",
        "Darby (1999) 3-K, entry \"Tee, Through-branch, (as elbow), threaded, (r/D = 1)\"", 500.0, 0.274, 4.0),
    darby("tee_branch_long", "tee, flow turning through the branch, r/D = 1.5",
        "Darby (1999) 3-K, entry \"Tee, Through-branch,(as elbow), (r/D = 1.5)\"", 800.0, 0.14, 4.0),
    darby("tee_branch_stub_in", "stub-in branch connection, flow through the branch",
        "Darby (1999) 3-K, entry \"Tee, Through-branch, (as elbow), stub-in branch\"", 1000.0, 0.34, 4.0),
    // Valves (Darby 3-K).
    darby("gate_valve", "gate valve, fully open, full bore",
        "Darby (1999) 3-K, entry \"Valve, Gate valve, standard, β = 1\"", 300.0, 0.037, 3.9),
    darby("globe_valve", "globe valve, fully open, standard pattern",
        "Darby (1999) 3-K, entry \"Valve, Globe valve, standard, β = 1\"", 1500.0, 1.7, 3.6),
    darby("ball_valve", "ball valve, fully open, full bore",
        "Darby (1999) 3-K, entry \"Valve, Ball valve, standard, β = 1\"", 300.0, 0.017, 3.5),
    darby("plug_valve", "plug valve, fully open, straight through",
        "Darby (1999) 3-K, entry \"Valve, Plug valve, straight through\"", 300.0, 0.084, 3.9),
    darby("plug_valve_branch", "plug valve, branch flow",
        "Darby (1999) 3-K, entry \"Valve, Plug valve, branch flow\"", 500.0, 0.41, 4.0),
    darby("plug_valve_three_way", "three-way plug valve, flow through",
        "Darby (1999) 3-K, entry \"Valve, Plug valve, three-way (flow through)\"", 300.0, 0.14, 4.0),
    darby("diaphragm_valve", "diaphragm valve, dam (weir) type, fully open",
        "Darby (1999) 3-K, entry \"Valve, Diaphragm, dam type\"", 1000.0, 0.69, 4.9),
    darby("angle_valve_45", "angle valve, 45 deg, full line size",
        "Darby (1999) 3-K, entry \"Valve, Angle valve, 45°, full line size, β = 1\"", 950.0, 0.25, 4.0),
    darby("angle_valve_90", "angle valve, 90 deg, full line size",
        "Darby (1999) 3-K, entry \"Valve, Angle valve, 90°, full line size, β = 1\"", 1000.0, 0.69, 4.0),
    darby("check_valve_swing", "swing check valve, fully open",
        "Darby (1999) 3-K, entry \"Valve, Swing check\"", 1500.0, 0.46, 4.0),
    darby("check_valve_lift", "lift check valve, fully open",
        "Darby (1999) 3-K, entry \"Valve, Lift check\"", 2000.0, 2.85, 3.8),
    // Valves that Darby does not list (Hooper 2-K).
    hooper("butterfly_valve", "butterfly valve, fully open",
        "Hooper (1981) 2-K, entry \"Valve, Butterfly,\"", 800.0, 0.25),
    hooper("check_valve_tilting_disc", "tilting-disc check valve, fully open",
        "Hooper (1981) 2-K, entry \"Valve, Check, Tilting-disc\"", 1000.0, 0.5),
    hooper("ball_valve_reduced_bore", "ball valve, reduced trim, beta = 0.9",
        "Hooper (1981) 2-K, entry \"Valve, Ball, Reduced trim, Beta = 0.9\"", 500.0, 0.15),
    hooper("plug_valve_reduced_bore", "plug valve, reduced trim, beta = 0.8",
        "Hooper (1981) 2-K, entry \"Valve, Plug, Reduced trim, Beta = 0.8\"", 1000.0, 0.25),
    // Foot valves (Crane K = n fT; both include the strainer).
    fixed("foot_valve", "foot valve with strainer, hinged disc",
        "Crane TP-410 (2009), p. A-29, K = 75 fT (from memory; as fluids.fittings.K_foot_valve_Crane style 1)",
        KMethod::CraneFt { n: 75.0 }, false, false),
    fixed("foot_valve_poppet", "foot valve with strainer, poppet disc",
        "Crane TP-410 (2009), p. A-29, K = 420 fT (from memory; as fluids.fittings.K_foot_valve_Crane style 0)",
        KMethod::CraneFt { n: 420.0 }, false, false),
    // Strainers (clean; vendor Cv data should replace these when known).
    fixed("strainer_basket", "basket strainer, clean perforated basket",
        "common practice, K = 2.0: from a published Cv = 22.5 for a 1 in simplex basket strainer with perforated basket (Eaton pipeline strainer data) via K = 891 d^4 / Cv^2 (Crane TP-410), d = 1.049 in, giving 2.1",
        KMethod::Constant(2.0), false, false),
    fixed("strainer_y", "Y strainer, clean screen",
        "common practice, K = 3.0 (from memory; Y strainers typically lose more than basket strainers of the same size); replace with the vendor's Cv when known",
        KMethod::Constant(3.0), false, false),
    // Entrances and exit (Hooper 1981 inlet/outlet table).
    inlet("entrance_flush", "pipe entrance flush with the tank wall, sharp edged",
        "Hooper (1981) 2-K inlet table, \"normal entrance, r/D = 0\", K1 = 160, Kinf = 0.5 (from memory; Kinf equals Crane TP-410's 0.5, fluids.fittings.entrance_sharp)", 160.0, 0.5),
    inlet("entrance_projecting", "inward-projecting (re-entrant, Borda) pipe entrance",
        "Hooper (1981) 2-K inlet table, \"Borda entrance\", K1 = 160, Kinf = 1.0 (from memory; thin-walled limit, Idelchik 0.985 in fluids.fittings.entrance_distance; Crane TP-410 gives 0.78 for thick walls)", 160.0, 1.0),
    inlet("entrance_rounded", "rounded (bellmouth) entrance, r/D >= 0.15",
        "Hooper (1981) 2-K inlet table, \"rounded entrance, r/D >= 0.15\", K1 = 160, Kinf = 0.04 (from memory; Kinf equals Crane TP-410's 0.04, fluids.fittings.entrance_rounded)", 160.0, 0.04),
    fixed("exit", "pipe exit into a large tank or reservoir (all geometries)",
        "K = 1.0: Borda-Carnot with beta -> 0; Hooper (1981) exit K1 = 0, Kinf = 1.0; fluids.fittings.exit_normal",
        KMethod::Constant(1.0), false, false),
    // Size changes (on the small pipe's velocity; the segment is the small pipe).
    fixed("expansion_sudden", "sudden expansion from this (small) pipe to a larger one",
        "Borda-Carnot: K = (1 - beta^2)^2 on the small-pipe velocity (Crane TP-410 p. A-26, theta = 180 deg)",
        KMethod::SuddenExpansion, true, false),
    fixed("expansion_gradual", "conical expansion from this (small) pipe, total angle theta",
        "Crane TP-410 p. A-26: K = 2.6 sin(theta/2) (1 - beta^2)^2 for theta <= 45 deg, else (1 - beta^2)^2",
        KMethod::GradualExpansion, true, true),
    fixed("contraction_sudden", "sudden contraction from a larger pipe into this (small) pipe",
        "Crane TP-410 p. A-26: K = 0.5 (1 - beta^2) on the small-pipe velocity (theta = 180 deg)",
        KMethod::SuddenContraction, true, false),
    fixed("contraction_gradual", "conical contraction into this (small) pipe, total angle theta",
        "Crane TP-410 p. A-26: K = 0.8 sin(theta/2) (1 - beta^2) for theta <= 45 deg, else 0.5 (1 - beta^2) sqrt(sin(theta/2))",
        KMethod::GradualContraction, true, true),
];

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn names_are_unique_snake_case_and_aliases_resolve() {
        for (i, f) in FITTINGS.iter().enumerate() {
            assert!(f
                .name
                .chars()
                .all(|c| c.is_ascii_lowercase() || c.is_ascii_digit() || c == '_'));
            assert!(
                FITTINGS[i + 1..].iter().all(|g| g.name != f.name),
                "{}",
                f.name
            );
            assert!(!f.source.is_empty() && !f.description.is_empty());
        }
        for (alias, target) in ALIASES {
            assert!(FITTINGS.iter().any(|f| f.name == *target), "{alias}");
            assert!(FITTINGS.iter().all(|f| f.name != *alias), "{alias}");
        }
    }
}
