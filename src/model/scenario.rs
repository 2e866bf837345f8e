//! Lowering the physical setting: fluid, site, tanks, pump centreline and
//! lines; and applying a case's overrides to it. Each field has one setter,
//! used both by the base design and by case overrides.

use crate::diagnostics::Code;
use uom::si::f64::{
    DynamicViscosity, Frequency, Length, MassDensity, Pressure, ThermodynamicTemperature, Time,
};
use uom::si::{
    dynamic_viscosity::pascal_second, frequency::hertz, length::meter,
    mass_density::kilogram_per_cubic_meter, pressure::pascal, thermodynamic_temperature::kelvin,
    time::second,
};

use super::design::*;
use super::eval::{self, expect_dim, expect_number, expect_temperature, expect_word, Env};
use super::fields::{missing, read_fields, unknown_field};
use super::ranges;
use crate::diagnostics::{Diagnostic, Span};
use crate::hydraulics::catalogue::{self, Material};
use crate::hydraulics::fittings;
use crate::names::nearest;
use crate::syntax::ast::{Arg, ArgKind, Expr, Path, Statement, StatementKind};
use crate::units::{Dimension, QuantityKind};

/// A length from metres.
pub fn length(si: f64) -> Length {
    Length::new::<meter>(si)
}
/// A pressure from pascals.
pub fn pressure(si: f64) -> Pressure {
    Pressure::new::<pascal>(si)
}

/// A length field.
pub fn expect_length(e: &Expr, env: &Env, what: &str) -> Result<Length, Diagnostic> {
    Ok(length(expect_dim(e, env, Dimension::LENGTH, what)?.si))
}

/// A level (tank level, pump centreline) from the design's datum, checked against
/// [`ranges::LEVEL`].
pub fn expect_level(e: &Expr, env: &Env, what: &str) -> Result<Length, Diagnostic> {
    let v = expect_length(e, env, what)?.get::<meter>();
    Ok(length(env.in_range(&ranges::LEVEL, v, e.span)?))
}

/// A pressure field, keeping gauge/absolute; a plain pressure takes `plain_as`.
pub fn expect_pressure(
    e: &Expr,
    env: &Env,
    what: &str,
    plain_as_gauge: bool,
) -> Result<SurfacePressure, Diagnostic> {
    let q = expect_dim(e, env, Dimension::PRESSURE, what)?;
    Ok(match q.kind {
        QuantityKind::AbsolutePressure => SurfacePressure::Absolute(pressure(q.si)),
        QuantityKind::GaugePressure => SurfacePressure::Gauge(pressure(q.si)),
        _ if plain_as_gauge => SurfacePressure::Gauge(pressure(q.si)),
        _ => SurfacePressure::Absolute(pressure(q.si)),
    })
}

fn positive(v: f64, what: &str, span: Span) -> Result<f64, Diagnostic> {
    if v > 0.0 && v.is_finite() {
        Ok(v)
    } else {
        Err(Diagnostic::error(
            Code::OutOfRange,
            format!("{what} must be greater than zero"),
            Some(span),
        )
        .with_label("not positive"))
    }
}

fn non_negative(v: f64, what: &str, span: Span) -> Result<f64, Diagnostic> {
    if v >= 0.0 && v.is_finite() {
        Ok(v)
    } else {
        Err(Diagnostic::error(
            Code::OutOfRange,
            format!("{what} must not be negative"),
            Some(span),
        )
        .with_label("negative"))
    }
}

/// The fields of `fluid "name" { ... }`.
pub const FLUID_FIELDS: &[&str] = &[
    "temperature",
    "density",
    "viscosity",
    "kinematic_viscosity",
    "vapor_pressure",
    "bulk_modulus",
    "fraction",
    "basis",
];

/// The glycols `fluid WORD { ... }` names, with their engine kind.
pub const GLYCOLS: &[(&str, crate::fluid::glycol::Glycol)] = &[
    ("ethylene_glycol", crate::fluid::glycol::Glycol::Ethylene),
    ("propylene_glycol", crate::fluid::glycol::Glycol::Propylene),
];

/// One field of a glycol mixture (`temperature`, `fraction`, `basis`).
fn set_glycol(g: &mut GlycolMixture, field: &str, e: &Expr, env: &Env) -> Result<(), Diagnostic> {
    match field {
        "temperature" => {
            g.temperature = ThermodynamicTemperature::new::<kelvin>(expect_temperature(e, env, "fluid temperature")?)
        }
        "fraction" => {
            let x = expect_number(e, env, "glycol fraction")?;
            if !(x.is_finite() && x > 0.0 && x < 1.0) {
                return Err(Diagnostic::error(Code::OutOfRange, "a glycol fraction lies between 0 % and 100 %", Some(e.span))
                    .with_help("write it as a percentage, e.g. `fraction = 30 %`"));
            }
            g.fraction = x;
        }
        "basis" => {
            g.basis = match expect_word(e, env, "fraction basis", &["mass", "volume"])?.as_str() {
                "mass" => FractionBasis::Mass,
                _ => FractionBasis::Volume,
            }
        }
        other => {
            return Err(Diagnostic::error(
                Code::UnknownField,
                format!("{} has no field `{other}`: its properties follow from its fraction and temperature (Melinder 2010)", g.glycol.name()),
                Some(e.span),
            )
            .with_help("a glycol mixture takes `fraction`, `basis` and `temperature`"))
        }
    }
    Ok(())
}

/// The glycol mixture inside the range of Melinder's correlation (mass fraction 0–60 %,
/// from its freezing point to 100 °C); an `out-of-range` error at `span` otherwise.
pub fn check_glycol_range(fluid: &Fluid, span: Span) -> Result<(), Diagnostic> {
    let Fluid::Glycol(g) = fluid else {
        return Ok(());
    };
    let t = g.temperature.get::<kelvin>();
    crate::fluid::glycol::check_range(g.glycol, g.mass_fraction(), t).map_err(|err| {
        Diagnostic::error(Code::OutOfRange, err.message, Some(span))
            .with_help("the glycol properties (Melinder 2010) cover 0 to 60 % by mass, from the mixture's freezing point to 100 °C")
    })
}

/// Set one fluid field.
pub fn set_fluid(fluid: &mut Fluid, field: &str, e: &Expr, env: &Env) -> Result<(), Diagnostic> {
    match (fluid, field) {
        (Fluid::Water { temperature }, "temperature") => {
            *temperature = ThermodynamicTemperature::new::<kelvin>(expect_temperature(e, env, "fluid temperature")?);
        }
        (Fluid::Water { .. }, other) => {
            return Err(Diagnostic::error(
                Code::UnknownField,
                format!("water has no field `{other}`: its properties follow from its temperature (IAPWS-IF97)"),
                Some(e.span),
            )
            .with_help("for another liquid write `fluid \"name\" { density = ..., viscosity = ..., vapor_pressure = ... }`"))
        }
        (Fluid::Custom(c), "temperature") => {
            c.temperature = Some(ThermodynamicTemperature::new::<kelvin>(expect_temperature(e, env, "fluid temperature")?))
        }
        (Fluid::Custom(c), "density") => {
            let v = env.in_range(&ranges::DENSITY, expect_dim(e, env, Dimension::DENSITY, "density")?.si, e.span)?;
            c.density = MassDensity::new::<kilogram_per_cubic_meter>(v);
        }
        (Fluid::Custom(c), "viscosity") => {
            let v = env.in_range(&ranges::VISCOSITY, expect_dim(e, env, Dimension::DYNAMIC_VISCOSITY, "viscosity")?.si, e.span)?;
            c.viscosity = DynamicViscosity::new::<pascal_second>(v);
        }
        (Fluid::Custom(c), "kinematic_viscosity") => {
            let nu = positive(
                expect_dim(e, env, Dimension::KINEMATIC_VISCOSITY, "kinematic viscosity")?.si,
                "kinematic viscosity",
                e.span,
            )?;
            // Stored as dynamic viscosity; needs the density, which is read first (see lower_fluid).
            let rho = c.density.get::<kilogram_per_cubic_meter>();
            let mu = if rho > 0.0 { env.in_range(&ranges::VISCOSITY, nu * rho, e.span)? } else { nu * rho };
            c.viscosity = DynamicViscosity::new::<pascal_second>(mu);
        }
        (Fluid::Custom(c), "vapor_pressure") => {
            let q = expect_dim(e, env, Dimension::PRESSURE, "vapour pressure")?;
            if q.kind == QuantityKind::GaugePressure {
                return Err(Diagnostic::error(Code::UnitMismatch, "vapour pressure is an absolute pressure", Some(e.span))
                    .with_help("write it as kPa, kPa(a) or psia"));
            }
            c.vapor_pressure = pressure(env.in_range(&ranges::VAPOUR_PRESSURE, q.si, e.span)?);
        }
        (Fluid::Custom(c), "bulk_modulus") => {
            let q = expect_dim(e, env, Dimension::PRESSURE, "bulk modulus")?;
            c.bulk_modulus = Some(pressure(env.in_range(&ranges::BULK_MODULUS, q.si, e.span)?));
        }
        (Fluid::Glycol(g), field) => set_glycol(g, field, e, env)?,
        (_, other) => return Err(Diagnostic::error(Code::UnknownField, format!("the fluid has no field `{other}`"), Some(e.span))),
    }
    Ok(())
}

/// Lower `fluid water { ... }` or `fluid "name" { ... }`.
pub fn lower_fluid(
    args: &[Arg],
    body: &[Statement],
    span: Span,
    env: &Env,
    diags: &mut Vec<Diagnostic>,
) -> Option<Fluid> {
    let f = read_fields(body, "fluid", FLUID_FIELDS, diags);
    for st in &f.rest {
        diags.push(Diagnostic::error(
            Code::Unexpected,
            "a fluid holds only fields",
            Some(st.span),
        ));
    }
    let mut fluid = match args.first().map(|a| &a.kind) {
        Some(ArgKind::Word(w)) if w == "water" => Fluid::Water {
            temperature: ThermodynamicTemperature::new::<kelvin>(288.15),
        },
        Some(ArgKind::Word(w)) if GLYCOLS.iter().any(|(n, _)| n == w) => {
            Fluid::Glycol(GlycolMixture {
                glycol: GLYCOLS
                    .iter()
                    .find(|(n, _)| n == w)
                    .map(|(_, g)| *g)
                    .unwrap_or(crate::fluid::glycol::Glycol::Ethylene),
                fraction: 0.3,
                basis: FractionBasis::Mass,
                temperature: ThermodynamicTemperature::new::<kelvin>(288.15),
            })
        }
        Some(ArgKind::Text(name)) => Fluid::Custom(CustomFluid {
            name: name.clone(),
            temperature: None,
            density: MassDensity::new::<kilogram_per_cubic_meter>(0.0),
            viscosity: DynamicViscosity::new::<pascal_second>(0.0),
            vapor_pressure: pressure(0.0),
            bulk_modulus: None,
        }),
        _ => {
            let at = args.first().map(|a| a.span).unwrap_or(span);
            diags.push(
                Diagnostic::error(Code::BadFluid, "a fluid is `water`, `ethylene_glycol`, `propylene_glycol` or a quoted name", Some(at))
                    .with_help("write `fluid water { temperature = 15 degC }` or `fluid \"brine\" { density = ..., viscosity = ..., vapor_pressure = ... }`"),
            );
            return None;
        }
    };
    match &fluid {
        Fluid::Water { .. } => {
            if f.get("temperature").is_none() {
                diags.push(missing(
                    "temperature",
                    "fluid water",
                    span,
                    "temperature = 15 degC",
                ));
            }
        }
        Fluid::Glycol(_) => {
            for (req, ex) in [
                ("fraction", "fraction = 30 %"),
                ("basis", "basis = mass"),
                ("temperature", "temperature = 7 degC"),
            ] {
                if f.get(req).is_none() {
                    diags.push(missing(req, "a glycol mixture", span, ex));
                }
            }
        }
        Fluid::Custom(_) => {
            for (req, ex) in [
                ("density", "density = 1030 kg/m^3"),
                ("vapor_pressure", "vapor_pressure = 2.3 kPa"),
            ] {
                if f.get(req).is_none() {
                    diags.push(missing(req, "a custom fluid", span, ex));
                }
            }
            if f.get("viscosity").is_none() && f.get("kinematic_viscosity").is_none() {
                diags.push(missing(
                    "viscosity",
                    "a custom fluid",
                    span,
                    "viscosity = 1.2 cP",
                ));
            }
        }
    }
    // Density before kinematic viscosity, which needs it.
    let mut ordered: Vec<_> = f.fields.iter().collect();
    ordered.sort_by_key(|x| x.name == "kinematic_viscosity");
    for field in ordered {
        if let Err(d) = set_fluid(&mut fluid, field.name, field.value, env) {
            diags.push(d);
        }
    }
    if let Err(d) = check_glycol_range(&fluid, f.get("temperature").map_or(span, |x| x.value.span))
    {
        diags.push(d);
    }
    Some(fluid)
}

/// The fields of `site`.
pub const SITE_FIELDS: &[&str] = &["elevation", "pressure"];

/// Set one field of a site (base or case override), checking its dimension and range.
pub fn set_site(site: &mut Site, field: &str, e: &Expr, env: &Env) -> Result<(), Diagnostic> {
    match field {
        "elevation" => {
            let v = expect_length(e, env, "site elevation")?.get::<meter>();
            site.elevation = length(env.in_range(&ranges::SITE_ELEVATION, v, e.span)?);
        }
        "pressure" => match expect_pressure(e, env, "barometric pressure", false)? {
            SurfacePressure::Absolute(p) => {
                env.in_range(&ranges::BAROMETRIC_PRESSURE, p.get::<pascal>(), e.span)?;
                site.barometric_pressure = Some(p)
            }
            SurfacePressure::Gauge(_) => {
                return Err(Diagnostic::error(
                    Code::UnitMismatch,
                    "the barometric pressure is absolute, not gauge",
                    Some(e.span),
                )
                .with_help("write it as kPa, kPa(a), psia or in_Hg"))
            }
        },
        other => {
            return Err(Diagnostic::error(
                Code::UnknownField,
                format!("site has no field `{other}`"),
                Some(e.span),
            ))
        }
    }
    Ok(())
}

/// The fields of `tank`.
pub const TANK_FIELDS: &[&str] = &[
    "level",
    "pressure",
    "drawdown",
    "test_flow",
    "well_loss",
    "max_pressure",
    "high_point",
    "high_point_pressure",
    "connects",
];

/// One closed-loop field of a tank (`max_pressure`, `high_point`, `high_point_pressure`,
/// `connects`).
fn set_reference(
    r: &mut LoopReference,
    field: &str,
    e: &Expr,
    env: &Env,
) -> Result<(), Diagnostic> {
    let gauge = |what: &str| -> Result<Pressure, Diagnostic> {
        match expect_pressure(e, env, what, true)? {
            SurfacePressure::Gauge(g) => Ok(pressure(env.in_range(
                &ranges::GAUGE_PRESSURE,
                g.get::<pascal>(),
                e.span,
            )?)),
            SurfacePressure::Absolute(_) => Err(Diagnostic::error(
                Code::UnitMismatch,
                format!("{what} is a gauge pressure"),
                Some(e.span),
            )
            .with_help("write it as kPa, bar or psi (gauge)")),
        }
    };
    match field {
        "max_pressure" => r.max_pressure = Some(gauge("the maximum pressure")?),
        "high_point_pressure" => {
            r.high_point_pressure = Some(gauge("the high point's least pressure")?)
        }
        "high_point" => r.high_point = Some(expect_level(e, env, "loop high point")?),
        _ => {
            let w = expect_word(e, env, "connection", &["suction", "discharge"])?;
            r.on_discharge = (w == "discharge").then_some(e.span);
        }
    }
    Ok(())
}

/// Set one field of a tank (base or case override), checking its dimension and range.
pub fn set_tank(tank: &mut Tank, field: &str, e: &Expr, env: &Env) -> Result<(), Diagnostic> {
    match field {
        "level" => tank.level = expect_level(e, env, "tank level")?,
        "max_pressure" | "high_point" | "high_point_pressure" | "connects" => {
            set_reference(&mut tank.reference, field, e, env)?
        }
        "drawdown" | "well_loss" => {
            let v = expect_length(e, env, "drawdown")?.get::<meter>();
            let v = length(env.in_range(&ranges::DRAWDOWN, v, e.span)?);
            match field {
                "drawdown" => tank.drawdown = Some(v),
                _ => tank.well_loss = Some(v),
            }
        }
        "test_flow" => {
            let q = expect_dim(e, env, Dimension::VOLUME_RATE, "test flow")?.si;
            let q = env.in_range(&ranges::TEST_FLOW, q, e.span)?;
            tank.test_flow = Some(uom::si::f64::VolumeRate::new::<
                uom::si::volume_rate::cubic_meter_per_second,
            >(q));
        }
        "pressure" => {
            let p = expect_pressure(e, env, "surface pressure", true)?;
            match p {
                SurfacePressure::Gauge(g) => {
                    env.in_range(&ranges::GAUGE_PRESSURE, g.get::<pascal>(), e.span)?
                }
                SurfacePressure::Absolute(a) => {
                    env.in_range(&ranges::ABSOLUTE_PRESSURE, a.get::<pascal>(), e.span)?
                }
            };
            tank.surface_pressure = p;
        }
        other => {
            return Err(Diagnostic::error(
                Code::UnknownField,
                format!("a tank has no field `{other}`"),
                Some(e.span),
            ))
        }
    }
    Ok(())
}

/// The fields of a `pipe` (and of `LINE.N.` overrides).
pub const SEGMENT_FIELDS: &[&str] = &[
    "length",
    "roughness",
    "hazen_williams_c",
    "rating",
    "wall",
    "modulus",
    "corrosion_allowance",
    "joints",
    "start_elevation",
    "end_elevation",
    "flanges",
    "rating_basis",
    "yield_strength",
];

/// Set one field of a segment (base or case override), checking its dimension and range.
pub fn set_segment(seg: &mut Segment, field: &str, e: &Expr, env: &Env) -> Result<(), Diagnostic> {
    match field {
        "length" => {
            let l = expect_length(e, env, "pipe length")?;
            non_negative(l.get::<meter>(), "a pipe length", e.span)?;
            seg.length = length(env.in_range(&ranges::PIPE_LENGTH, l.get::<meter>(), e.span)?);
        }
        "roughness" => {
            let r = expect_length(e, env, "roughness")?;
            non_negative(r.get::<meter>(), "roughness", e.span)?;
            seg.roughness = Some(length(env.in_range(
                &ranges::ROUGHNESS,
                r.get::<meter>(),
                e.span,
            )?));
        }
        "hazen_williams_c" => {
            let c = expect_number(e, env, "Hazen-Williams C")?;
            positive(c, "Hazen-Williams C", e.span)?;
            seg.hazen_williams_c = Some(env.in_range(&ranges::HAZEN_WILLIAMS_C, c, e.span)?);
        }
        other => return super::lower::profile::set_wall_field(&mut seg.wall, other, e, env),
    }
    Ok(())
}

/// Lower `pipe MATERIAL SIZE { fields }`: the size is `N in schedule S`,
/// `N in type K`, `N in class 350`, `N in DR 11`, `DN150 schedule 40` or `bore 154 mm`.
pub fn lower_pipe(
    args: &[Arg],
    body: &[Statement],
    span: Span,
    env: &Env,
    diags: &mut Vec<Diagnostic>,
) -> Option<Segment> {
    let material = pipe_material(args, span, diags)?;
    let mut wall = WallData::default();
    let (size_label, inner, source) = match args.get(1).map(|a| &a.kind) {
        Some(ArgKind::Word(w)) if w == "bore" => pipe_bore(args, span, env, diags)?,
        Some(_) => pipe_nominal(material, args, &mut wall, diags)?,
        None => return bad_pipe(diags, span, "a pipe needs a size after its material"),
    };
    let mut seg = Segment {
        material,
        size_label,
        inner_diameter: length(inner),
        diameter_source: source,
        length: length(0.0),
        roughness: None,
        hazen_williams_c: None,
        fittings: Vec::new(),
        losses: Vec::new(),
        wall,
        span,
    };
    pipe_fields(&mut seg, body, env, diags);
    Some(seg)
}

/// A pipe's fields (length, roughness, Hazen-Williams C ...), with a warning for a
/// zero length.
fn pipe_fields(seg: &mut Segment, body: &[Statement], env: &Env, diags: &mut Vec<Diagnostic>) {
    let span = seg.span;
    let f = read_fields(body, "a pipe", SEGMENT_FIELDS, diags);
    for st in &f.rest {
        diags.push(
            Diagnostic::error(
                Code::Unexpected,
                "a pipe's braces hold only its fields",
                Some(st.span),
            )
            .with_help("fittings follow the pipe on their own lines, outside its braces"),
        );
    }
    if f.get("length").is_none() {
        diags.push(missing("length", "a pipe", span, "length = 120 ft"));
    }
    let mut length_failed = false;
    for field in &f.fields {
        if let Err(d) = set_segment(seg, field.name, field.value, env) {
            length_failed |= field.name == "length";
            diags.push(d);
        }
    }
    if let Some(l) = f
        .get("length")
        .filter(|_| seg.length.get::<meter>() == 0.0 && !length_failed)
    {
        diags.push(
            Diagnostic::warning(
                Code::ZeroLength,
                "a pipe of zero length: no wall friction is counted; its fittings and losses still use its bore",
                Some(l.value.span),
            )
            .with_help("give the pipe's length, or keep it at zero only to carry fittings"),
        );
    }
}

/// A pipe error: what is wrong, and the forms a pipe may take.
fn bad_pipe<T>(diags: &mut Vec<Diagnostic>, at: Span, msg: &str) -> Option<T> {
    diags.push(
        Diagnostic::error(Code::BadPipe, msg.to_string(), Some(at)).with_help(
            "write e.g. `pipe steel 6 in schedule 40 { length = 120 ft }`, `pipe copper 2 in type L`, `pipe hdpe 10 in DR 17` or `pipe pvc bore 146.3 mm`",
        ),
    );
    None
}

/// The pipe's material, its first word.
fn pipe_material(args: &[Arg], span: Span, diags: &mut Vec<Diagnostic>) -> Option<Material> {
    match args.first() {
        Some(Arg {
            kind: ArgKind::Word(w),
            span: s,
        }) => match Material::from_keyword(w) {
            Some(m) => Some(m),
            None => {
                let names: Vec<&str> = Material::all().iter().map(|m| m.keyword()).collect();
                let near = nearest(w, names.iter().copied());
                diags.push(
                    Diagnostic::error(
                        Code::UnknownMaterial,
                        format!("`{w}` is not a known pipe material"),
                        Some(*s),
                    )
                    .with_label("unknown material")
                    .with_help(format!(
                        "{}materials: {}",
                        if near.is_empty() {
                            String::new()
                        } else {
                            format!("did you mean {}? ", eval::quote_list(&near))
                        },
                        eval::quote_list(&names)
                    )),
                );
                None
            }
        },
        Some(a) => bad_pipe(diags, a.span, "a pipe starts with its material"),
        None => bad_pipe(diags, span, "a pipe needs a material and a size"),
    }
}

/// `bore <length>`: (size label, inner diameter m, its source).
fn pipe_bore(
    args: &[Arg],
    span: Span,
    env: &Env,
    diags: &mut Vec<Diagnostic>,
) -> Option<(String, f64, String)> {
    let Some(a) = args.get(2) else {
        return bad_pipe(diags, span, "`bore` needs an inner diameter");
    };
    let q = match &a.kind {
        ArgKind::Quantity { value, unit } => match eval::quantity_literal(value, unit) {
            Ok(q) => q,
            Err(d) => {
                diags.push(d);
                return None;
            }
        },
        _ => return bad_pipe(diags, a.span, "`bore` needs an inner diameter with a unit"),
    };
    if q.dim != Dimension::LENGTH {
        diags.push(
            Diagnostic::error(
                Code::UnitMismatch,
                format!("pipe bore: expected a length, found {}", q.dim.describe()),
                Some(a.span),
            )
            .with_label("expected a length"),
        );
        return None;
    }
    if q.si <= 0.0 {
        return bad_pipe(diags, a.span, "the bore must be greater than zero");
    }
    // Out of range: an error, but the segment is kept so its fittings do not
    // also report that they come before any pipe.
    if let Err(d) = env.in_range(&ranges::PIPE_BORE, q.si, a.span) {
        diags.push(d);
    }
    let ArgKind::Quantity { value, unit } = &a.kind else {
        return None;
    };
    Some((
        format!("bore {} {}", value.text, unit.text),
        q.si,
        "given in the design".to_string(),
    ))
}

/// A nominal size with its schedule, type, class or DR, from the pipe catalogue:
/// (size label, inner diameter m, the standard); the wall data go into `wall`.
fn pipe_nominal(
    material: Material,
    args: &[Arg],
    wall: &mut WallData,
    diags: &mut Vec<Diagnostic>,
) -> Option<(String, f64, String)> {
    let size_arg = args.get(1)?;
    let nominal = match &size_arg.kind {
        ArgKind::Quantity { value, unit } if unit.text == "in" => value.text.clone(),
        ArgKind::Word(w) if w.starts_with("DN") => w.clone(),
        _ => {
            return bad_pipe(
                diags,
                size_arg.span,
                "expected a nominal size such as `6 in`, `1-1/2 in` or `DN150`",
            )
        }
    };
    let (Some(kind_arg), Some(value_arg)) = (args.get(2), args.get(3)) else {
        return bad_pipe(
            diags,
            size_arg.span,
            "the nominal size needs a schedule, type, class or DR after it",
        );
    };
    let kind = match &kind_arg.kind {
        ArgKind::Word(w) if ["schedule", "type", "class", "DR"].contains(&w.as_str()) => w.clone(),
        _ => {
            return bad_pipe(
                diags,
                kind_arg.span,
                "expected `schedule`, `type`, `class` or `DR`",
            )
        }
    };
    let value = match &value_arg.kind {
        ArgKind::Number(n) => n.text.clone(),
        ArgKind::Word(w) => w.clone(),
        ArgKind::Quantity { value, unit } => format!("{}{}", value.text, unit.text),
        _ => {
            return bad_pipe(
                diags,
                value_arg.span,
                "expected a schedule, type, class or DR value",
            )
        }
    };
    let schedule = match kind.as_str() {
        "class" => format!("class {value}"),
        "DR" => format!("DR{value}"),
        _ => value.clone(),
    };
    let label = match kind.as_str() {
        "DR" => format!("{nominal} in DR {value}"),
        _ if nominal.starts_with("DN") => format!("{nominal} {kind} {value}"),
        _ => format!("{nominal} in {kind} {value}"),
    };
    match catalogue::pipe_size(material, &nominal, &schedule) {
        Ok(p) => {
            wall.outer_diameter = Some(length(p.outer_diameter_m));
            wall.thickness = Some(length(p.wall_m));
            wall.designation = Some(match kind.as_str() {
                "DR" => format!("DR {value}"),
                _ => format!("{kind} {value}"),
            });
            Some((label, p.inner_diameter_m, p.standard.to_string()))
        }
        Err(e) => {
            let at = size_arg.span.join(value_arg.span);
            let mut d = Diagnostic::error(Code::UnknownPipeSize, e.message, Some(at))
                .with_label("not in the pipe catalogue");
            if !e.nearest.is_empty() {
                d = d.with_help(format!("nearest valid sizes: {}", e.nearest.join(", ")));
            }
            diags.push(d);
            None
        }
    }
}

/// The fields in a fitting's braces.
pub const FITTING_FIELDS: &[&str] = &["beta", "angle", "rating"];
/// The fields of `loss { ... }`.
pub const LOSS_FIELDS: &[&str] = &["k", "equivalent_length", "why"];

/// Lower `fitting NAME [* N] [{ beta = 0.75, angle = 20 deg }]`.
pub fn lower_fitting(
    args: &[Arg],
    body: Option<&[Statement]>,
    span: Span,
    env: &Env,
    diags: &mut Vec<Diagnostic>,
) -> Option<FittingUse> {
    let (name, name_span) = match args.first() {
        Some(Arg {
            kind: ArgKind::Word(w),
            span,
        }) => (w.as_str(), *span),
        _ => {
            diags.push(
                Diagnostic::error(Code::BadFitting, "a fitting needs its name", Some(span))
                    .with_help("write e.g. `fitting elbow_90_long * 2`"),
            );
            return None;
        }
    };
    let Some(spec) = fittings::fitting(name) else {
        let near = fittings::suggest_fitting(name);
        let help = if near.is_empty() {
            "grammar/LANGUAGE.md lists the fittings; or write `loss { k = 0.5, why = \"...\" }`"
                .to_string()
        } else {
            format!("did you mean {}?", eval::quote_list(&near))
        };
        diags.push(
            Diagnostic::error(
                Code::UnknownFitting,
                format!("`{name}` is not a known fitting"),
                Some(name_span),
            )
            .with_label("unknown fitting")
            .with_help(help),
        );
        return None;
    };
    let mut count = 1u32;
    match &args[1..] {
        [] => {}
        [Arg {
            kind: ArgKind::Star,
            ..
        }, Arg {
            kind: ArgKind::Number(n),
            span: s,
        }] => {
            if n.value.fract() != 0.0 || n.value < 1.0 || n.value > 1000.0 {
                diags.push(
                    Diagnostic::error(
                        Code::BadCount,
                        "a fitting count is a whole number from 1 to 1000",
                        Some(*s),
                    )
                    .with_label("not a count"),
                );
                return None;
            }
            count = n.value as u32;
        }
        [first, ..] => {
            diags.push(
                Diagnostic::error(
                    Code::BadFitting,
                    "expected `* count` after the fitting name",
                    Some(first.span),
                )
                .with_help("write e.g. `fitting elbow_90_long * 2`"),
            );
            return None;
        }
    }
    let mut use_ = FittingUse {
        spec,
        count,
        beta: None,
        beta_from_bores: false,
        angle_rad: None,
        rating: None,
        span,
    };
    if let Some(body) = body {
        let f = read_fields(body, "a fitting", FITTING_FIELDS, diags);
        for field in &f.fields {
            match field.name {
                "beta" => match expect_number(field.value, env, "diameter ratio beta") {
                    Ok(b) if b > 0.0 && b < 1.0 => use_.beta = Some(b),
                    Ok(_) => diags.push(
                        Diagnostic::error(
                            Code::OutOfRange,
                            "beta is the small-to-large diameter ratio, between 0 and 1",
                            Some(field.value.span),
                        )
                        .with_label("not between 0 and 1"),
                    ),
                    Err(d) => diags.push(d),
                },
                "rating" => match super::lower::profile::expect_rating(field.value, env) {
                    Ok(r) => use_.rating = Some(r),
                    Err(d) => diags.push(d),
                },
                _ => match expect_number(field.value, env, "included angle") {
                    Ok(a) if a > 0.0 && a <= std::f64::consts::PI => use_.angle_rad = Some(a),
                    Ok(_) => diags.push(Diagnostic::error(
                        Code::OutOfRange,
                        "the included angle lies between 0 and 180 deg",
                        Some(field.value.span),
                    )),
                    Err(d) => diags.push(d),
                },
            }
        }
    }
    if spec.needs_angle && use_.angle_rad.is_none() {
        diags.push(missing(
            "angle",
            &format!("fitting {name}"),
            span,
            "angle = 20 deg",
        ));
    }
    Some(use_)
}

/// Lower `loss { k = 1.5, why = "..." }` or `loss { equivalent_length = 12 ft, why = "..." }`.
pub fn lower_loss(
    body: Option<&[Statement]>,
    span: Span,
    env: &Env,
    diags: &mut Vec<Diagnostic>,
) -> Option<ExtraLoss> {
    let body = body.unwrap_or(&[]);
    let f = read_fields(body, "a loss", LOSS_FIELDS, diags);
    let mut loss = ExtraLoss {
        k: None,
        equivalent_length: None,
        why: String::new(),
        span,
    };
    match f.get("why") {
        Some(w) => match eval::expect_text(w.value, env, "the reason") {
            Ok(t) => loss.why = t,
            Err(d) => diags.push(d),
        },
        None => diags.push(missing("why", "a loss", span, "why = \"flow meter\"")),
    }
    if let Some(k) = f.get("k") {
        match expect_number(k.value, env, "loss coefficient K") {
            Ok(v) if v >= 0.0 => match env.in_range(&ranges::LOSS_K, v, k.value.span) {
                Ok(v) => loss.k = Some(v),
                Err(d) => diags.push(d),
            },
            Ok(_) => diags.push(Diagnostic::error(
                Code::OutOfRange,
                "K must not be negative",
                Some(k.value.span),
            )),
            Err(d) => diags.push(d),
        }
    }
    if let Some(l) = f.get("equivalent_length") {
        match expect_length(l.value, env, "equivalent length") {
            Ok(v) if v.get::<meter>() >= 0.0 => {
                match env.in_range(&ranges::PIPE_LENGTH, v.get::<meter>(), l.value.span) {
                    Ok(v) => loss.equivalent_length = Some(length(v)),
                    Err(d) => diags.push(d),
                }
            }
            Ok(_) => diags.push(Diagnostic::error(
                Code::OutOfRange,
                "an equivalent length must not be negative",
                Some(l.value.span),
            )),
            Err(d) => diags.push(d),
        }
    }
    match (f.get("k").is_some(), f.get("equivalent_length").is_some()) {
        (false, false) => diags.push(missing("k", "a loss", span, "k = 0.5")),
        (true, true) => diags.push(Diagnostic::error(
            Code::ConflictingFields,
            "give a loss either `k` or `equivalent_length`, not both",
            Some(span),
        )),
        _ => {}
    }
    Some(loss)
}

/// Lower the statements inside `line NAME from A to B { ... }` into segments.
pub fn lower_segments(body: &[Statement], env: &Env, diags: &mut Vec<Diagnostic>) -> Vec<Segment> {
    let mut segments: Vec<Segment> = Vec::new();
    for st in body {
        let StatementKind::Block {
            keyword,
            args,
            body,
        } = &st.kind
        else {
            let d = match &st.kind {
                StatementKind::Assign { path, .. } => unknown_field(path, "a line", &[]),
                _ => Diagnostic::error(
                    Code::Unexpected,
                    "a line holds `pipe`, `fitting` and `loss` statements",
                    Some(st.span),
                ),
            };
            diags.push(d);
            continue;
        };
        match keyword.name.as_str() {
            "pipe" => {
                if let Some(s) =
                    lower_pipe(args, body.as_deref().unwrap_or(&[]), st.span, env, diags)
                {
                    segments.push(s);
                }
            }
            "fitting" | "loss" => {
                let item_fitting = if keyword.name == "fitting" {
                    lower_fitting(args, body.as_deref(), st.span, env, diags)
                } else {
                    None
                };
                let item_loss = if keyword.name == "loss" {
                    lower_loss(body.as_deref(), st.span, env, diags)
                } else {
                    None
                };
                match segments.last_mut() {
                    Some(seg) => {
                        seg.fittings.extend(item_fitting);
                        seg.losses.extend(item_loss);
                    }
                    None => diags.push(
                        Diagnostic::error(
                            Code::FittingBeforePipe,
                            format!("this {} comes before any pipe in the line", keyword.name),
                            Some(st.span),
                        )
                        .with_help(
                            "fittings and losses belong to the pipe above them; put a `pipe` first",
                        ),
                    ),
                }
            }
            other => {
                let near = nearest(other, crate::model::keywords::LINE_ITEMS.iter().copied());
                let mut d = Diagnostic::error(
                    Code::UnknownStatement,
                    format!("a line has no `{other}`"),
                    Some(keyword.span),
                )
                .with_label("not a line statement");
                d = d.with_help(if near.is_empty() {
                    "a line holds `pipe`, `fitting` and `loss` statements".to_string()
                } else {
                    format!("did you mean {}?", eval::quote_list(&near))
                });
                diags.push(d);
            }
        }
    }
    super::size_change::fill_ratios(&mut segments, diags);
    segments
}

/// Apply one case override `path = value` to a scenario.
pub fn apply_override(
    s: &mut Scenario,
    path: &Path,
    e: &Expr,
    env: &Env,
) -> Result<(), Diagnostic> {
    let parts: Vec<&str> = path.parts.iter().map(|p| p.name.as_str()).collect();
    match parts.as_slice() {
        ["roughness"] => {
            s.pipe_condition =
                match eval::expect_word(e, env, "roughness", &["new", "aged"])?.as_str() {
                    "aged" => PipeCondition::Aged,
                    _ => PipeCondition::New,
                }
        }
        ["hours"] => s.hours_per_year = expect_hours(e, env)?,
        ["fluid", field] => {
            set_fluid(&mut s.fluid, field, e, env)?;
            check_glycol_range(&s.fluid, e.span)?;
        }
        ["site", field] if SITE_FIELDS.contains(field) => set_site(&mut s.site, field, e, env)?,
        ["station", "centreline"] => s.centreline = expect_level(e, env, "pump centreline")?,
        [tank, field] if *tank == s.source.name && TANK_FIELDS.contains(field) => {
            set_tank(&mut s.source, field, e, env)?;
            // A closed loop returns to the tank it draws from: one tank, both ends.
            if s.destination.name == s.source.name {
                s.destination = s.source.clone();
            }
        }
        [tank, field] if *tank == s.destination.name && TANK_FIELDS.contains(field) => {
            set_tank(&mut s.destination, field, e, env)?
        }
        [name, field] if s.network.as_ref().is_some_and(|n| n.has(name)) => {
            if let Some(result) = s
                .network
                .as_mut()
                .and_then(|n| n.apply_override(name, field, e, env))
            {
                result?
            }
        }
        [pump, "speed"] if s.pump_speeds.iter().any(|(n, _)| n == pump) => {
            let v = expect_dim(e, env, Dimension::FREQUENCY, "pump speed")?.si;
            let v = positive(v, "a pump speed", e.span)?;
            let v = env.in_range(&ranges::PUMP_SPEED, v, e.span)?;
            if let Some(entry) = s.pump_speeds.iter_mut().find(|(n, _)| n == pump) {
                entry.1 = Frequency::new::<hertz>(v);
            }
        }
        [pump, "running"] if s.pump_running.iter().any(|(n, ..)| n == pump) => {
            let n = expect_number(e, env, "pumps running")?;
            if let Some(entry) = s.pump_running.iter_mut().find(|(p, ..)| p == pump) {
                let (count, parallel) = (entry.1, entry.2);
                if !parallel {
                    return Err(Diagnostic::error(
                        Code::OutOfRange,
                        format!("pump {pump} is not a parallel set: all its pumps run"),
                        Some(e.span),
                    )
                    .with_help("`running` sets how many pumps of a parallel set (`arrangement = parallel`) run in the case"));
                }
                if !(n.fract() == 0.0 && n >= 1.0 && n <= count as f64) {
                    return Err(Diagnostic::error(
                        Code::OutOfRange,
                        format!("pump {pump} is a set of {count} in parallel: 1 to {count} of them can run"),
                        Some(e.span),
                    )
                    .with_label(format!("a whole number from 1 to {count}")));
                }
                entry.3 = n as u32;
            }
        }
        [line, index, field] if SEGMENT_FIELDS.contains(field) => {
            let n: usize = index.parse().map_err(|_| no_such_path(path, s))?;
            if !s.lines.iter().any(|l| l.name == *line) {
                return Err(no_such_path(path, s));
            }
            let Some(l) = std::sync::Arc::make_mut(&mut s.lines)
                .iter_mut()
                .find(|l| l.name == *line)
            else {
                return Err(no_such_path(path, s));
            };
            let count = l.segments.len();
            let seg = l.segments.get_mut(n.wrapping_sub(1)).ok_or_else(|| {
                Diagnostic::error(
                    Code::UnknownPath,
                    format!(
                        "line `{line}` has {count} pipe segment(s); there is no segment {index}"
                    ),
                    Some(path.span),
                )
                .with_help("segments are numbered from 1 in the order their `pipe` lines appear")
            })?;
            set_segment(seg, field, e, env)?;
        }
        _ => return Err(no_such_path(path, s)),
    }
    Ok(())
}

/// Operating hours per year, written as a time (`1400 h`).
pub fn expect_hours(e: &Expr, env: &Env) -> Result<Time, Diagnostic> {
    let t = expect_dim(e, env, Dimension::TIME, "operating hours per year")?.si;
    if !(0.0..=8784.0 * 3600.0).contains(&t) {
        return Err(Diagnostic::error(
            Code::OutOfRange,
            "operating hours per year lie between 0 and 8784 h",
            Some(e.span),
        )
        .with_label("not a yearly number of hours"));
    }
    Ok(Time::new::<second>(t))
}

fn no_such_path(path: &Path, s: &Scenario) -> Diagnostic {
    let mut valid = vec![
        "roughness".to_string(),
        "hours".into(),
        "fluid.temperature".into(),
        "site.elevation".into(),
        "site.pressure".into(),
        "station.centreline".into(),
    ];
    for t in [&s.source, &s.destination] {
        valid.push(format!("{}.level", t.name));
        valid.push(format!("{}.pressure", t.name));
    }
    for l in s.lines.iter() {
        for i in 1..=l.segments.len() {
            valid.push(format!("{}.{i}.length", l.name));
        }
    }
    for (p, _) in &s.pump_speeds {
        valid.push(format!("{p}.speed"));
    }
    for (p, _, parallel, _) in &s.pump_running {
        if *parallel {
            valid.push(format!("{p}.running"));
        }
    }
    let written = path.dotted();
    let near = nearest(&written, valid.iter().map(|v| v.as_str()));
    let help = if near.is_empty() {
        format!(
            "a case may override {}",
            valid
                .iter()
                .take(12)
                .map(|v| format!("`{v}`"))
                .collect::<Vec<_>>()
                .join(", ")
        )
    } else {
        format!("did you mean {}?", eval::quote_list(&near))
    };
    Diagnostic::error(
        Code::UnknownPath,
        format!("`{written}` does not name anything a case can override"),
        Some(path.span),
    )
    .with_label("nothing by this name")
    .with_help(help)
}

/// Check-time errors for a case whose water cannot be analysed (issue 10.5): at or
/// below its freezing point (273.15 K; IAPWS-IF97 region 1 starts there), or at or
/// above its boiling point at the source surface (vapour pressure by IAPWS-IF97 Eq. 30
/// at or above the surface's absolute pressure: it flashes before reaching the pump).
/// `render` words the typed messages (in the design's report units: the caller's
/// outputs own them).
pub fn water_state_errors(
    design: &Design,
    render: &dyn Fn(&crate::message::Message) -> String,
) -> Vec<Diagnostic> {
    use crate::message::{value, Kind};
    let mut out = Vec::new();
    for case in &design.cases {
        let Fluid::Water { temperature } = &case.scenario.fluid else {
            continue;
        };
        let span = if case.span == Span::new(0, 0) {
            design.base.source.span
        } else {
            case.span
        };
        let t = temperature.get::<kelvin>();
        let shown = value(Kind::Temperature, t);
        if t <= crate::fluid::water::FREEZING_POINT_K {
            out.push(
                Diagnostic::error(
                    Code::OutOfRange,
                    render(&crate::message![
                        format!("case {}: water at ", case.name),
                        shown,
                        " is at or below its freezing point (",
                        value(Kind::Temperature, crate::fluid::water::FREEZING_POINT_K),
                        "): the case cannot be analysed"
                    ]),
                    Some(span),
                )
                .with_help("give the water a temperature above freezing, or describe the liquid with `fluid NAME { ... }`"),
            );
            continue;
        }
        let Ok(barometric) = case.scenario.site.barometric() else {
            continue;
        };
        let surface = case
            .scenario
            .source
            .surface_pressure
            .absolute(barometric)
            .pa();
        let boils = match crate::fluid::saturation_pressure_pa(t) {
            Ok(pv) => (pv >= surface).then_some(pv),
            Err(_) => Some(f64::INFINITY),
        };
        if let Some(pv) = boils {
            let vapour = if pv.is_finite() {
                crate::message!["its vapour pressure ", value(Kind::AbsolutePressure, pv)]
            } else {
                crate::message!["it is above its critical point"]
            };
            out.push(
                Diagnostic::error(
                    Code::OutOfRange,
                    render(&{
                        let mut m =
                            crate::message![format!("case {}: water at ", case.name), shown];
                        m.push(format!(
                            " boils at the surface of tank {}: ",
                            case.scenario.source.name
                        ));
                        m.append(&vapour);
                        m.push(" is at or above the surface's absolute pressure ");
                        m.push(value(Kind::AbsolutePressure, surface));
                        m.push("; the case cannot be analysed");
                        m
                    }),
                    Some(span),
                )
                .with_help("lower the temperature or raise the pressure on the source tank"),
            );
        }
    }
    out
}
