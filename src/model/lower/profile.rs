//! The safety-screen inputs of a line: its pipe profile (`profile { chainage ...
//! elevation ... }` or `profile from "file.csv"`), the line fields `closure_time` and
//! `restraint`, and the wall fields of a pipe (`rating`, `wall`, `modulus`,
//! `corrosion_allowance`, `joints`, `start_elevation`, `end_elevation`).

use uom::si::f64::{Length, Pressure, Time};
use uom::si::{length::meter, pressure::pascal, time::second};

use crate::diagnostics::{Code, Diagnostic, Span};
use crate::hydraulics::flanges::{FlangeClass, FLANGE_KEYWORDS};
use crate::model::design::{Profile, Restraint, Segment, WallData};
use crate::model::eval::{self, expect_dim, expect_word, Env};
use crate::model::fields::{read_fields, unknown_field};
use crate::model::pumps::read_csv_table;
use crate::model::{ranges, FileAccess};
use crate::syntax::ast::{Arg, ArgKind, Expr, Statement, StatementKind, Table};
use crate::units::{Dimension, QuantityKind};

/// Most points of one pipe profile (grammar/LANGUAGE.md, "Limits").
pub const MAX_PROFILE_POINTS: usize = 2000;

/// The fields a line block accepts besides its pipes, fittings and losses.
pub const LINE_FIELDS: &[&str] = &["closure_time", "restraint", "serves"];

/// What a line says for the safety screen, besides its pipes.
#[derive(Default)]
pub struct LineExtras {
    pub profile: Option<Profile>,
    pub closure_time: Option<Time>,
    pub restraint: Restraint,
    pub per_pump: bool,
}

/// Split a line body: the profile and line fields are read here; the statements
/// returned are the pipes, fittings and losses (and anything unknown, which
/// [`crate::model::scenario::lower_segments`] reports).
pub fn lower_line_extras(
    body: &[Statement],
    env: &Env,
    files: &dyn FileAccess,
    diags: &mut Vec<Diagnostic>,
) -> (LineExtras, Vec<Statement>) {
    let mut extras = LineExtras::default();
    let mut rest = Vec::new();
    let mut assigns = Vec::new();
    let mut profile_span: Option<Span> = None;
    for st in body {
        match &st.kind {
            StatementKind::Curve {
                keyword,
                args,
                table,
            } if keyword.name == "profile" => {
                if let Some(first) = profile_span {
                    diags.push(
                        Diagnostic::error(
                            Code::DuplicateField,
                            "a line has one `profile`",
                            Some(keyword.span),
                        )
                        .with_secondary(first, "first given here"),
                    );
                    continue;
                }
                profile_span = Some(keyword.span);
                extras.profile = lower_profile(args, table.as_ref(), st.span, env, files, diags);
            }
            StatementKind::Assign { path, .. }
                if path.parts.len() == 1 && LINE_FIELDS.contains(&path.parts[0].name.as_str()) =>
            {
                assigns.push(st.clone())
            }
            StatementKind::Assign { path, .. } if path.parts.len() == 1 => {
                diags.push(unknown_field(path, "a line", LINE_FIELDS))
            }
            _ => rest.push(st.clone()),
        }
    }
    let f = read_fields(&assigns, "a line", LINE_FIELDS, diags);
    for field in &f.fields {
        match field.name {
            "closure_time" => match expect_dim(field.value, env, Dimension::TIME, "closure time")
                .and_then(|q| env.in_range(&ranges::CLOSURE_TIME, q.si, field.value.span))
            {
                Ok(t) => extras.closure_time = Some(Time::new::<second>(t)),
                Err(d) => diags.push(d),
            },
            "serves" => match expect_word(field.value, env, "serves", &["set", "each_pump"]) {
                Ok(w) => extras.per_pump = w == "each_pump",
                Err(d) => diags.push(d),
            },
            _ => match expect_word(
                field.value,
                env,
                "restraint",
                &["anchored", "upstream_anchored", "expansion_joints"],
            ) {
                Ok(w) => {
                    extras.restraint = match w.as_str() {
                        "upstream_anchored" => Restraint::UpstreamOnly,
                        "expansion_joints" => Restraint::ExpansionJoints,
                        _ => Restraint::Anchored,
                    }
                }
                Err(d) => diags.push(d),
            },
        }
    }
    (extras, rest)
}

/// A profile and segment end elevations both describe the line: an error at the first
/// segment that gives elevations.
pub fn check_elevation_sources(
    profile: Option<&Profile>,
    segments: &[Segment],
    diags: &mut Vec<Diagnostic>,
) {
    let Some(p) = profile else { return };
    if let Some(seg) = segments
        .iter()
        .find(|s| s.wall.start_elevation.is_some() || s.wall.end_elevation.is_some())
    {
        diags.push(
            Diagnostic::error(
                Code::ConflictingFields,
                "this line has a `profile` and a pipe with `start_elevation`/`end_elevation`",
                Some(seg.span),
            )
            .with_secondary(p.span, "the profile")
            .with_help("give the elevations one way: the profile, or per pipe"),
        );
    }
}

/// `profile { chainage UNIT  elevation UNIT ... }` or `profile from "file.csv"`.
fn lower_profile(
    args: &[Arg],
    table: Option<&Table>,
    span: Span,
    env: &Env,
    files: &dyn FileAccess,
    diags: &mut Vec<Diagnostic>,
) -> Option<Profile> {
    let bad = |at: Span, msg: &str| {
        Diagnostic::error(Code::BadProfile, msg.to_string(), Some(at)).with_help(
            "write `profile { ... }` with a table `chainage ft  elevation ft`, or `profile from \"profile.csv\"`",
        )
    };
    let file = match args {
        [] => None,
        [Arg {
            kind: ArgKind::Word(w),
            ..
        }, Arg {
            kind: ArgKind::Text(t),
            span: ts,
        }] if w == "from" => Some((t.clone(), *ts)),
        [first, ..] => {
            diags.push(bad(first.span, "a profile takes only `from \"file.csv\"`"));
            return None;
        }
    };
    let owned;
    let (table, source) = match (table, file) {
        (Some(_), Some((_, s))) => {
            diags.push(Diagnostic::error(
                Code::ConflictingFields,
                "a profile takes its table inline or from a file, not both",
                Some(s),
            ));
            return None;
        }
        (Some(t), None) => (t, "given in the design".to_string()),
        (None, Some((path, s))) => {
            match read_csv_table(files, &path, s, "chainage ft, elevation ft") {
                Ok(t) => {
                    owned = t;
                    (&owned, format!("from {path}"))
                }
                Err(d) => {
                    diags.push(d);
                    return None;
                }
            }
        }
        (None, None) => {
            diags.push(bad(span, "the profile has no table"));
            return None;
        }
    };
    let points = profile_points(table, env, diags)?;
    Some(Profile {
        points,
        source,
        span,
    })
}

/// The (chainage, elevation) points of a profile table, checked: two columns of
/// lengths, 2 to [`MAX_PROFILE_POINTS`] rows, chainage from zero strictly increasing.
fn profile_points(
    t: &Table,
    env: &Env,
    diags: &mut Vec<Diagnostic>,
) -> Option<Vec<(Length, Length)>> {
    let before = diags.len();
    let mut factor = [None, None];
    for c in &t.columns {
        let slot = match c.name.name.as_str() {
            "chainage" => 0,
            "elevation" => 1,
            other => {
                diags.push(
                    Diagnostic::error(
                        Code::UnknownColumn,
                        format!("a profile table has no column `{other}`"),
                        Some(c.name.span),
                    )
                    .with_help("columns are `chainage` and `elevation`, each with a length unit"),
                );
                continue;
            }
        };
        match eval::unit(&c.unit) {
            Ok(u) if u.dim == Dimension::LENGTH => factor[slot] = Some(u),
            Ok(u) => diags.push(
                Diagnostic::error(
                    Code::UnitMismatch,
                    format!(
                        "column `{}`: expected a length, found {} ({})",
                        c.name.name,
                        u.dim.describe(),
                        c.unit.text
                    ),
                    Some(c.unit.span),
                )
                .with_help(eval::example_units(Dimension::LENGTH)),
            ),
            Err(d) => diags.push(d),
        }
    }
    let (Some(cu), Some(eu)) = (&factor[0], &factor[1]) else {
        if diags.len() == before {
            diags.push(Diagnostic::error(
                Code::MissingColumn,
                "a profile table needs a `chainage` and an `elevation` column",
                Some(t.span),
            ));
        }
        return None;
    };
    if diags.len() > before {
        return None;
    }
    if t.rows.len() < 2 || t.rows.len() > MAX_PROFILE_POINTS {
        diags.push(Diagnostic::error(
            if t.rows.len() < 2 {
                Code::TooFewPoints
            } else {
                Code::TooMany
            },
            format!(
                "a profile has 2 to {MAX_PROFILE_POINTS} points; this one has {}",
                t.rows.len()
            ),
            Some(t.span),
        ));
        return None;
    }
    let chainage_col = t.columns.iter().position(|c| c.name.name == "chainage")?;
    let mut points: Vec<(Length, Length)> = Vec::with_capacity(t.rows.len());
    for row in &t.rows {
        if row.cells.len() != 2 || row.cells.iter().any(|c| c.value.is_none()) {
            diags.push(Diagnostic::error(
                Code::BadRow,
                "a profile row is a chainage and an elevation",
                Some(row.span),
            ));
            return None;
        }
        let value = |i: usize, u| {
            let n = row.cells[i].value.as_ref().map(|n| n.value).unwrap_or(0.0);
            crate::units::Quantity::from_value(n, u).si
        };
        let (ci, ei) = (chainage_col, 1 - chainage_col);
        let (x, z) = (value(ci, cu), value(ei, eu));
        let z = match env.in_range(&ranges::LEVEL, z, row.cells[ei].span) {
            Ok(z) => z,
            Err(d) => {
                diags.push(d);
                return None;
            }
        };
        let ok = match points.last() {
            None => x == 0.0,
            Some((prev, _)) => x > prev.get::<meter>() && x <= ranges::PIPE_LENGTH.possible.1,
        };
        if !ok {
            diags.push(
                Diagnostic::error(
                    Code::BadProfile,
                    if points.is_empty() {
                        "a profile starts at chainage 0 (the line's upstream end)"
                    } else {
                        "the chainage must increase from row to row"
                    },
                    Some(row.cells[ci].span),
                )
                .with_label("this chainage"),
            );
            return None;
        }
        points.push((Length::new::<meter>(x), Length::new::<meter>(z)));
    }
    Some(points)
}

/// A pressure rating (gauge): a plain or gauge pressure above zero.
pub fn expect_rating(e: &Expr, env: &Env) -> Result<Pressure, Diagnostic> {
    let q = expect_dim(e, env, Dimension::PRESSURE, "pressure rating")?;
    if q.kind == QuantityKind::AbsolutePressure {
        return Err(Diagnostic::error(
            Code::UnitMismatch,
            "a pressure rating is a gauge pressure; an absolute pressure was given",
            Some(e.span),
        )
        .with_help("write e.g. `rating = 150 psi` or `rating = 1600 kPa(g)`"));
    }
    let v = env.in_range(&ranges::PRESSURE_RATING, q.si, e.span)?;
    Ok(Pressure::new::<pascal>(v))
}

/// The wall fields of a pipe (the safety screen's inputs), one at a time.
pub fn set_wall_field(
    wall: &mut WallData,
    field: &str,
    e: &Expr,
    env: &Env,
) -> Result<(), Diagnostic> {
    let length_in = |range: &ranges::Range, what: &str| -> Result<Length, Diagnostic> {
        let q = expect_dim(e, env, Dimension::LENGTH, what)?;
        Ok(Length::new::<meter>(env.in_range(range, q.si, e.span)?))
    };
    match field {
        "rating" => wall.rating = Some(expect_rating(e, env)?),
        "wall" => wall.thickness = Some(length_in(&ranges::WALL_THICKNESS, "wall thickness")?),
        "corrosion_allowance" => {
            wall.corrosion_allowance = Some(length_in(
                &ranges::CORROSION_ALLOWANCE,
                "corrosion allowance",
            )?)
        }
        "start_elevation" => wall.start_elevation = Some(length_in(&ranges::LEVEL, "elevation")?),
        "end_elevation" => wall.end_elevation = Some(length_in(&ranges::LEVEL, "elevation")?),
        "modulus" => {
            let q = expect_dim(e, env, Dimension::PRESSURE, "modulus of elasticity")?;
            let v = env.in_range(&ranges::ELASTIC_MODULUS, q.si, e.span)?;
            wall.modulus = Some(Pressure::new::<pascal>(v));
        }
        "joints" => {
            let w = expect_word(e, env, "joints", &["threaded", "plain"])?;
            wall.threaded = w == "threaded";
        }
        "flanges" => {
            let w = expect_word(e, env, "flanges", FLANGE_KEYWORDS)?;
            wall.flanges = FlangeClass::from_keyword(&w);
        }
        "rating_basis" => {
            let w = expect_word(e, env, "rating basis", &["asme_b31_3", "awwa_m11"])?;
            wall.m11 = w == "awwa_m11";
        }
        "yield_strength" => {
            let q = expect_dim(e, env, Dimension::PRESSURE, "minimum yield strength")?;
            let v = env.in_range(&ranges::YIELD_STRENGTH, q.si, e.span)?;
            wall.yield_strength = Some(Pressure::new::<pascal>(v));
        }
        other => {
            return Err(Diagnostic::error(
                Code::UnknownField,
                format!("a pipe has no field `{other}`"),
                Some(e.span),
            ))
        }
    }
    Ok(())
}
