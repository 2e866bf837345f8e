//! The `let` constants, evaluated first and in file order.

use super::duplicate_name;
use crate::diagnostics::Diagnostic;
use crate::model::eval::{self, Env};
use crate::syntax::ast::{File, StatementKind};

/// Evaluate every `let name = value` into the environment the other phases read.
pub fn lower_constants(file: &File, diags: &mut Vec<Diagnostic>) -> Env {
    let mut env = Env::default();
    for statement in &file.statements {
        let StatementKind::Let { name, value } = &statement.kind else {
            continue;
        };
        if let Some((_, first)) = env.constants.get(&name.name) {
            diags.push(
                duplicate_name(&format!("`{}`", name.name), name.span, *first)
                    .with_help("give each constant its own name"),
            );
            continue;
        }
        match eval::eval(value, &env) {
            Ok(v) => {
                env.constants.insert(name.name.clone(), (v, name.span));
            }
            Err(e) => diags.push(e),
        }
    }
    env
}
