//! The pump candidates, each lowered by `model::pumps`, with their names and count checked.

use super::{duplicate_name, Blocks, MAX_PUMPS};
use crate::diagnostics::Code;
use crate::diagnostics::Diagnostic;
use crate::model::design::PumpCandidate;
use crate::model::eval::Env;
use crate::model::{pumps, FileAccess};

/// Every `pump NAME { ... }` that lowered, in file order.
pub fn lower_candidates(
    blocks: &Blocks,
    env: &Env,
    files: &dyn FileAccess,
    diags: &mut Vec<Diagnostic>,
) -> Vec<PumpCandidate> {
    let mut pump_list: Vec<PumpCandidate> = Vec::new();
    for block in blocks.all("pump") {
        let Some(pump) = pumps::lower_pump(
            block.args,
            block.statements(),
            block.span,
            env,
            files,
            diags,
        ) else {
            continue;
        };
        if let Some(first) = pump_list.iter().find(|q| q.name == pump.name) {
            diags.push(duplicate_name(
                &format!("pump `{}`", pump.name),
                block.span,
                first.span,
            ));
            continue;
        }
        pump_list.push(pump);
    }
    if let Some(first_over) = pump_list.get(MAX_PUMPS) {
        diags.push(
            Diagnostic::error(
                Code::TooMany,
                format!(
                    "the design has {} pumps; at most {MAX_PUMPS} are accepted",
                    pump_list.len()
                ),
                Some(first_over.span),
            )
            .with_label(format!("pump {} of {}", MAX_PUMPS + 1, pump_list.len()))
            .with_help(
                "compare the candidates in groups: copies of the design with at most 20 pumps each",
            ),
        );
    }
    if pump_list.is_empty() && blocks.one("pump").is_none() {
        diags.push(Diagnostic::warning(
            Code::NoPumps,
            "the design has no pump candidates: only system curves are computed",
            None,
        ));
    }
    pump_list
}
