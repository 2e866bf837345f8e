//! `dutyline new`: a commented starter design in US customary or SI units that checks
//! and builds as written, for the engineer to replace every number with the project's.
//!
//! One template holds the design's shape and comments; [`US`] and [`SI`] fill in the
//! values of each system (placeholders `@NAME@`).

/// The starter design titled `title`, in `si` or US customary units.
pub fn starter(title: &str, si: bool) -> String {
    let values = if si { SI } else { US };
    let quoted = title.replace('\\', "\\\\").replace('"', "\\\"");
    let mut text = TEMPLATE.replace("@TITLE@", &quoted);
    for (name, value) in values {
        text = text.replace(&format!("@{name}@"), value);
    }
    text
}

/// The design with a placeholder for every value that differs between the systems.
const TEMPLATE: &str = r#"# A starter design from `dutyline new`. Every number below is a placeholder:
# replace it with the project's levels, pipes and certified pump curves.
# Reference: grammar/LANGUAGE.md. Check with `dutyline check --analyse FILE`,
# build the package with `dutyline build FILE`.

project {
    title = "@TITLE@"
    number = "0000"
    prepared = "your name"
    units = @UNITS@  # report units: us | si
}

revision @REVISION@ 2026-01-01 "Starter"

fluid water { temperature = @TEMPERATURE@ }
site { elevation = @SITE@ }  # sets the barometric pressure for NPSH available

# Free surfaces: where the water comes from and where it goes.
tank sump { level = @SUMP@ }
tank reservoir { level = @RESERVOIR@ }

station { centreline = @CENTRELINE@ }  # pump centreline elevation

line suction from sump to pump {
    pipe @SUCTION_PIPE@ }
    fitting entrance_rounded
    fitting elbow_90_long
}

line discharge from pump to reservoir {
    pipe @DISCHARGE_PIPE@ }
    fitting check_valve_swing
    fitting @VALVE@_valve
    fitting elbow_90_long * 4
    fitting exit
}

# Operating cases: the base design plus overrides.
case normal { hours = 2000 h }
case low_sump { sump.level = @LOW_SUMP@ }
case aged { roughness = aged }

require {
    flow >= @FLOW_NORMAL@ for normal
    flow >= @FLOW_AGED@ for aged
    npsh_margin >= 1.3
}

# A candidate with its published curve (placeholder numbers).
pump A "End suction candidate, @SPEED@ rpm" {
    speed = @SPEED@ rpm
    curve impeller @IMPELLER@ {
@CURVE@    }
}

motor { standard = @MOTOR@ }
energy { price = 0.@PRICE@/kWh, years = 20, discount_rate = 5 % }

assume "Levels, lengths and the pump curve are placeholders of the starter design."
"#;

/// The US customary values.
const US: &[(&str, &str)] = &[
    ("UNITS", "us"),
    ("REVISION", "A"),
    ("TEMPERATURE", "60 degF"),
    ("SITE", "500 ft"),
    ("SUMP", "502 ft"),
    ("RESERVOIR", "620 ft"),
    ("CENTRELINE", "500 ft"),
    ("SUCTION_PIPE", "steel 8 in schedule 40 { length = 20 ft"),
    (
        "DISCHARGE_PIPE",
        "steel 6 in schedule 40 { length = 1500 ft",
    ),
    ("VALVE", "gate"),
    ("LOW_SUMP", "499 ft"),
    ("FLOW_NORMAL", "500 gpm"),
    ("FLOW_AGED", "450 gpm"),
    ("SPEED", "1780"),
    ("IMPELLER", "11 in"),
    (
        "CURVE",
        "        flow gpm   head ft   efficiency %   npshr ft
        0          175       0              -
        200        172       36             6.0
        400        165       61             7.0
        600        152       75             8.5
        800        132       78             11.0
        1000       105       69             14.5
",
    ),
    ("MOTOR", "nema, service_factor = 1.15"),
    ("PRICE", "12 USD"),
];

/// The SI values.
const SI: &[(&str, &str)] = &[
    ("UNITS", "si"),
    ("REVISION", "1"),
    ("TEMPERATURE", "15 degC"),
    ("SITE", "150 m"),
    ("SUMP", "151 m"),
    ("RESERVOIR", "190 m"),
    ("CENTRELINE", "150 m"),
    (
        "SUCTION_PIPE",
        "cement_lined_ductile_iron 8 in class 350 { length = 6 m",
    ),
    (
        "DISCHARGE_PIPE",
        "cement_lined_ductile_iron 6 in class 350 { length = 450 m",
    ),
    ("VALVE", "butterfly"),
    ("LOW_SUMP", "150.2 m"),
    ("FLOW_NORMAL", "110 m^3/h"),
    ("FLOW_AGED", "100 m^3/h"),
    ("SPEED", "2950"),
    ("IMPELLER", "250 mm"),
    (
        "CURVE",
        "        flow m^3/h   head m   efficiency %   npshr m
        0            56       0              -
        40           55       36             2.0
        80           52       61             2.4
        120          47       75             3.0
        160          40       78             3.9
        200          31       69             5.1
",
    ),
    ("MOTOR", "iec"),
    ("PRICE", "20 EUR"),
];

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn every_placeholder_is_filled_in_both_systems() {
        for si in [false, true] {
            let text = starter("T", si);
            assert!(!text.contains('@'), "{text}");
        }
    }
}
