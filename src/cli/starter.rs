//! `dutyline new`: a commented starter design in US customary or SI units that checks
//! and builds as written, for the engineer to replace every number with the project's.

/// The starter design titled `title`, in `si` or US customary units.
pub fn starter(title: &str, si: bool) -> String {
    let template = if si { SI } else { US };
    let quoted = title.replace('\\', "\\\\").replace('"', "\\\"");
    template.replace("@TITLE@", &quoted)
}

const US: &str = r#"# A starter design from `dutyline new`. Every number below is a placeholder:
# replace it with the project's levels, pipes and certified pump curves.
# Reference: grammar/LANGUAGE.md. Check with `dutyline check --analyse FILE`,
# build the package with `dutyline build FILE`.

project {
    title = "@TITLE@"
    number = "0000"
    prepared = "your name"
    units = us  # report units: us | si
}

revision A 2026-01-01 "Starter"

fluid water { temperature = 60 degF }
site { elevation = 500 ft }  # sets the barometric pressure for NPSH available

# Free surfaces: where the water comes from and where it goes.
tank sump { level = 502 ft }
tank reservoir { level = 620 ft }

station { centreline = 500 ft }  # pump centreline elevation

line suction from sump to pump {
    pipe steel 8 in schedule 40 { length = 20 ft }
    fitting entrance_rounded
    fitting elbow_90_long
}

line discharge from pump to reservoir {
    pipe steel 6 in schedule 40 { length = 1500 ft }
    fitting check_valve_swing
    fitting gate_valve
    fitting elbow_90_long * 4
    fitting exit
}

# Operating cases: the base design plus overrides.
case normal { hours = 2000 h }
case low_sump { sump.level = 499 ft }
case aged { roughness = aged }

require {
    flow >= 500 gpm for normal
    flow >= 450 gpm for aged
    npsh_margin >= 1.3
}

# A candidate with its published curve (placeholder numbers).
pump A "End suction candidate, 1780 rpm" {
    speed = 1780 rpm
    curve impeller 11 in {
        flow gpm   head ft   efficiency %   npshr ft
        0          175       0              -
        200        172       36             6.0
        400        165       61             7.0
        600        152       75             8.5
        800        132       78             11.0
        1000       105       69             14.5
    }
}

motor { standard = nema, service_factor = 1.15 }
energy { price = 0.12 USD/kWh, years = 20, discount_rate = 5 % }

assume "Levels, lengths and the pump curve are placeholders of the starter design."
"#;

const SI: &str = r#"# A starter design from `dutyline new`. Every number below is a placeholder:
# replace it with the project's levels, pipes and certified pump curves.
# Reference: grammar/LANGUAGE.md. Check with `dutyline check --analyse FILE`,
# build the package with `dutyline build FILE`.

project {
    title = "@TITLE@"
    number = "0000"
    prepared = "your name"
    units = si  # report units: us | si
}

revision 1 2026-01-01 "Starter"

fluid water { temperature = 15 degC }
site { elevation = 150 m }  # sets the barometric pressure for NPSH available

# Free surfaces: where the water comes from and where it goes.
tank sump { level = 151 m }
tank reservoir { level = 190 m }

station { centreline = 150 m }  # pump centreline elevation

line suction from sump to pump {
    pipe ductile_iron 8 in class 350 { length = 6 m }
    fitting entrance_rounded
    fitting elbow_90_long
}

line discharge from pump to reservoir {
    pipe ductile_iron 6 in class 350 { length = 450 m }
    fitting check_valve_swing
    fitting butterfly_valve
    fitting elbow_90_long * 4
    fitting exit
}

# Operating cases: the base design plus overrides.
case normal { hours = 2000 h }
case low_sump { sump.level = 150.2 m }
case aged { roughness = aged }

require {
    flow >= 110 m^3/h for normal
    flow >= 100 m^3/h for aged
    npsh_margin >= 1.3
}

# A candidate with its published curve (placeholder numbers).
pump A "End suction candidate, 2950 rpm" {
    speed = 2950 rpm
    curve impeller 250 mm {
        flow m^3/h   head m   efficiency %   npshr m
        0            56       0              -
        40           55       36             2.0
        80           52       61             2.4
        120          47       75             3.0
        160          40       78             3.9
        200          31       69             5.1
    }
}

motor { standard = iec }
energy { price = 0.20 EUR/kWh, years = 20, discount_rate = 5 % }

assume "Levels, lengths and the pump curve are placeholders of the starter design."
"#;
