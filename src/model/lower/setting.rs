//! The physical setting: fluid, site and the pump station's centreline.

use crate::diagnostics::Code;
use uom::si::f64::Length;
use uom::si::length::meter;

use crate::diagnostics::Diagnostic;
use crate::model::design::*;
use crate::model::eval::Env;
use crate::model::fields::{missing, read_fields};
use crate::model::scenario::{self, expect_level, lower_fluid};

use super::Blocks;

/// The fields of `station { ... }`.
pub(crate) const STATION_FIELDS: &[&str] = &["centreline"];

/// What the base scenario takes from `fluid`, `site` and `station`.
pub struct Setting {
    pub fluid: Option<Fluid>,
    pub site: Site,
    pub centreline: Option<Length>,
}

/// Fluid, site and station, in that order.
/// `station` is read only when `station` is true (a well field has none: its well
/// pumps give their own settings).
pub fn lower_setting(
    blocks: &Blocks,
    env: &Env,
    station: bool,
    diags: &mut Vec<Diagnostic>,
) -> Setting {
    let fluid = match blocks.one("fluid") {
        Some(block) => lower_fluid(block.args, block.statements(), block.span, env, diags),
        None => {
            diags.push(missing(
                "fluid",
                "the design",
                blocks.first_line_span(),
                "fluid water { temperature = 15 degC }",
            ));
            None
        }
    };
    Setting {
        fluid,
        site: lower_site(blocks, env, diags),
        centreline: if station {
            lower_station(blocks, env, diags)
        } else {
            None
        },
    }
}

/// `site { elevation = ... }` or `site { pressure = ... }`; sea level when absent.
fn lower_site(blocks: &Blocks, env: &Env, diags: &mut Vec<Diagnostic>) -> Site {
    let mut site = Site {
        elevation: Length::new::<meter>(0.0),
        barometric_pressure: None,
    };
    match blocks.one("site") {
        Some(block) => {
            let fields = read_fields(block.statements(), "site", scenario::SITE_FIELDS, diags);
            for field in &fields.fields {
                if let Err(e) = scenario::set_site(&mut site, field.name, field.value, env) {
                    diags.push(e);
                }
            }
        }
        None => diags.push(
            Diagnostic::warning(
                Code::SiteAssumed,
                "no `site` given: sea level (101.325 kPa) is assumed for NPSH available",
                None,
            )
            .with_help("add `site { elevation = 350 m }` or `site { pressure = 97 kPa }`"),
        ),
    }
    site
}

/// `station { centreline = ... }`: the pump's reference elevation.
fn lower_station(blocks: &Blocks, env: &Env, diags: &mut Vec<Diagnostic>) -> Option<Length> {
    let Some(block) = blocks.one("station") else {
        diags.push(missing(
            "station",
            "the design",
            blocks.first_line_span(),
            "station { centreline = 101.5 m }",
        ));
        return None;
    };
    let fields = read_fields(block.statements(), "station", STATION_FIELDS, diags);
    match fields.get("centreline") {
        Some(c) => match expect_level(c.value, env, "pump centreline") {
            Ok(v) => Some(v),
            Err(e) => {
                diags.push(e);
                None
            }
        },
        None => {
            diags.push(missing(
                "centreline",
                "station",
                block.span,
                "centreline = 101.5 m",
            ));
            None
        }
    }
}
