//! The tanks: named levels with a surface pressure.

use crate::diagnostics::Code;
use uom::si::f64::Length;
use uom::si::length::meter;

use super::{duplicate_name, Block, Blocks};
use crate::diagnostics::Diagnostic;
use crate::model::design::*;
use crate::model::eval::Env;
use crate::model::fields::{block_name, missing, read_fields};
use crate::model::scenario;

/// Every well-formed `tank NAME { ... }` with a name of its own, in file order.
pub fn lower_tanks(blocks: &Blocks, env: &Env, diags: &mut Vec<Diagnostic>) -> Vec<Tank> {
    let mut tanks: Vec<Tank> = Vec::new();
    for block in blocks.all("tank") {
        if let Some(tank) = lower_tank(block, &tanks, env, diags) {
            tanks.push(tank);
        }
    }
    tanks
}

/// One tank, or `None` when its name is missing, reserved or already taken.
fn lower_tank(
    block: &Block,
    earlier: &[Tank],
    env: &Env,
    diags: &mut Vec<Diagnostic>,
) -> Option<Tank> {
    let (name, name_span) = block_name(
        block.args,
        block.span,
        Code::BadTank,
        "a tank",
        "tank sump { level = 101.2 m }",
        diags,
    )?;
    if name == "pump" {
        diags.push(Diagnostic::error(
            Code::ReservedName,
            "`pump` names the pump end of a line; choose another tank name",
            Some(name_span),
        ));
        return None;
    }
    if let Some(first) = earlier.iter().find(|t| &t.name == name) {
        diags.push(duplicate_name(
            &format!("tank `{name}`"),
            name_span,
            first.span,
        ));
        return None;
    }
    let mut tank = Tank {
        name: name.clone(),
        level: Length::new::<meter>(0.0),
        surface_pressure: SurfacePressure::Gauge(scenario::pressure(0.0)),
        drawdown: None,
        test_flow: None,
        well_loss: None,
        reference: LoopReference::default(),
        span: name_span,
    };
    let what = format!("tank {name}");
    let fields = read_fields(block.statements(), &what, scenario::TANK_FIELDS, diags);
    if fields.get("level").is_none() {
        diags.push(missing("level", &what, block.span, "level = 101.2 m"));
    }
    for field in &fields.fields {
        if let Err(e) = scenario::set_tank(&mut tank, field.name, field.value, env) {
            diags.push(e);
        }
    }
    let has = |f: &str| fields.get(f).is_some();
    if (has("well_loss") || has("test_flow")) && !has("drawdown") {
        diags.push(missing("drawdown", &what, block.span, "drawdown = 12 ft"));
    }
    if has("drawdown") && !has("test_flow") {
        diags.push(missing(
            "test_flow",
            &what,
            block.span,
            "test_flow = 500 gpm",
        ));
    }
    if let (Some(s), Some(w)) = (tank.drawdown, tank.well_loss) {
        if w > s {
            diags.push(
                Diagnostic::error(
                    Code::ConflictingFields,
                    format!("the well loss of tank {name} exceeds its whole drawdown"),
                    fields.get("well_loss").map(|f| f.value.span),
                )
                .with_help(
                    "`well_loss` is the part of `drawdown` (at the test flow) that grows as Q²",
                ),
            );
        }
    }
    Some(tank)
}
