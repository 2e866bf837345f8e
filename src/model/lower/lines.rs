//! The lines: suction (tank to pump) and discharge (pump to tank), each a series of
//! pipe segments, and the source and destination tanks they connect.

use super::{duplicate_name, profile, Block, Blocks, MAX_SEGMENTS};
use crate::diagnostics::Code;
use crate::diagnostics::{Diagnostic, Span};
use crate::model::design::*;
use crate::model::eval::{self, Env};
use crate::model::fields::missing;
use crate::model::scenario::lower_segments;
use crate::model::FileAccess;
use crate::names::nearest;
use crate::syntax::ast::{Arg, ArgKind};

/// The lines and the tanks at their ends.
pub struct Network {
    pub lines: Vec<Line>,
    pub source: Option<Tank>,
    pub destination: Option<Tank>,
    /// The network node the discharge lines end at, when they end at one (general form).
    pub entry: Option<String>,
}

/// Every line, the segment limit, and the one source and one destination tank.
pub fn lower_lines(
    blocks: &Blocks,
    tanks: &[Tank],
    nodes: &[String],
    env: &Env,
    files: &dyn FileAccess,
    diags: &mut Vec<Diagnostic>,
) -> Network {
    let mut lines: Vec<Line> = Vec::new();
    let errors_before = diags.iter().filter(|x| x.is_error()).count();
    for block in blocks.all("line") {
        if !nodes.is_empty() && is_network_line(block) {
            continue; // a link between two nodes: lowered with the network
        }
        if let Some(line) = lower_line(block, &lines, tanks, nodes, env, files, diags) {
            lines.push(line);
        }
    }
    check_segment_count(&lines, diags);
    let line_failed = diags.iter().filter(|x| x.is_error()).count() > errors_before;
    let source = end_tank(&lines, Side::Suction, tanks, diags);
    let entry = lines
        .iter()
        .find(|l| l.side == Side::Discharge && nodes.contains(&l.to))
        .map(|l| l.to.clone());
    let destination = match &entry {
        Some(node) => {
            same_far_end(&lines, node, diags);
            None
        }
        None => end_tank(&lines, Side::Discharge, tanks, diags),
    };
    if !line_failed {
        missing_side(&lines, blocks, diags);
    }
    Network {
        lines,
        source,
        destination,
        entry,
    }
}

/// A `line NAME from A to B` with neither end `pump`.
pub(super) fn is_network_line(block: &Block) -> bool {
    line_ends(block.args).is_some_and(|(_, _, a, b)| a.0 != "pump" && b.0 != "pump")
}

/// Every discharge line of a network design ends at its entry node.
fn same_far_end(lines: &[Line], entry: &str, diags: &mut Vec<Diagnostic>) {
    if let Some(other) = lines
        .iter()
        .find(|l| l.side == Side::Discharge && l.to != entry)
    {
        diags.push(Diagnostic::error(Code::BadLine, "all discharge lines must end at the same node", Some(other.span))
            .with_label(format!("this discharge line ends at `{}`, the first at `{entry}`", other.to))
            .with_help("the discharge lines run in series from the pump to the node where the network begins; write the rest as `line NAME from NODE to NODE`"));
    }
}

/// One `line NAME from A to B { ... }`, or `None` (with a diagnostic) when its shape,
/// name or tank is wrong.
fn lower_line(
    block: &Block,
    earlier: &[Line],
    tanks: &[Tank],
    nodes: &[String],
    env: &Env,
    files: &dyn FileAccess,
    diags: &mut Vec<Diagnostic>,
) -> Option<Line> {
    let Some((name, name_span, from, to)) = line_ends(block.args) else {
        diags.push(bad_line(block.span));
        return None;
    };
    if let Some(first) = earlier.iter().find(|l| l.name == name) {
        diags.push(duplicate_name(
            &format!("line `{name}`"),
            name_span,
            first.span,
        ));
        return None;
    }
    let side = match (from.0 == "pump", to.0 == "pump") {
        (false, true) => Side::Suction,
        (true, false) => Side::Discharge,
        _ => {
            diags.push(
                Diagnostic::error(Code::BadLine, "a line runs from a tank to `pump` (suction) or from `pump` to a tank (discharge)", Some(block.span))
                    .with_help("e.g. `line suction from sump to pump { ... }`"),
            );
            return None;
        }
    };
    let tank_end = if side == Side::Suction { &from } else { &to };
    let at_node = side == Side::Discharge && nodes.contains(&tank_end.0);
    if !at_node && !tanks.iter().any(|t| t.name == tank_end.0) {
        diags.push(unknown_tank(&tank_end.0, tank_end.1, tanks));
        return None;
    }
    let (extras, body) = profile::lower_line_extras(block.statements(), env, files, diags);
    let segments = lower_segments(&body, env, diags);
    profile::check_elevation_sources(extras.profile.as_ref(), &segments, diags);
    if segments.is_empty() && block.body.is_some_and(|b| b.is_empty()) || block.body.is_none() {
        diags.push(
            Diagnostic::error(
                Code::EmptyLine,
                format!("line `{name}` has no pipe"),
                Some(name_span),
            )
            .with_help("add `pipe MATERIAL SIZE { length = ... }`"),
        );
    }
    Some(Line {
        name,
        side,
        from: from.0,
        to: to.0,
        segments,
        profile: extras.profile,
        closure_time: extras.closure_time,
        restraint: extras.restraint,
        per_pump: extras.per_pump,
        span: name_span,
    })
}

/// A named end of a line: the word and where it is written.
pub(super) type End = (String, Span);

/// Name, name span and the two ends of `NAME from A to B`, when the arguments have that shape.
pub(super) fn line_ends(args: &[Arg]) -> Option<(String, Span, End, End)> {
    match args {
        [Arg {
            kind: ArgKind::Word(n),
            span: ns,
        }, Arg {
            kind: ArgKind::Word(f),
            ..
        }, a, Arg {
            kind: ArgKind::Word(t),
            ..
        }, b]
            if f == "from" && t == "to" =>
        {
            match (&a.kind, &b.kind) {
                (ArgKind::Word(x), ArgKind::Word(y)) => {
                    Some((n.clone(), *ns, (x.clone(), a.span), (y.clone(), b.span)))
                }
                _ => None,
            }
        }
        _ => None,
    }
}

fn unknown_tank(name: &str, span: Span, tanks: &[Tank]) -> Diagnostic {
    let near = nearest(name, tanks.iter().map(|t| t.name.as_str()));
    Diagnostic::error(
        Code::UnknownName,
        format!("there is no tank `{name}`"),
        Some(span),
    )
    .with_label("unknown tank")
    .with_help(if near.is_empty() {
        "define it with `tank NAME { level = ... }`".to_string()
    } else {
        format!("did you mean {}?", eval::quote_list(&near))
    })
}

/// The tank at the far end of a line.
fn far_tank(line: &Line) -> &str {
    match line.side {
        Side::Suction => &line.from,
        Side::Discharge => &line.to,
    }
}

/// The one tank every line of a side connects to; an error at the first line that
/// connects elsewhere.
fn end_tank(
    lines: &[Line],
    side: Side,
    tanks: &[Tank],
    diags: &mut Vec<Diagnostic>,
) -> Option<Tank> {
    let mut on_side = lines.iter().filter(|l| l.side == side);
    let first = far_tank(on_side.next()?);
    if let Some(other) = on_side.find(|l| far_tank(l) != first) {
        let what = if side == Side::Suction {
            "suction"
        } else {
            "discharge"
        };
        diags.push(Diagnostic::error(Code::BadLine, format!("all {what} lines must connect to the same tank"), Some(other.span))
            .with_label(format!("this {what} line connects to `{}`, the first to `{first}`", far_tank(other)))
            .with_help("dutyline analyses one source and one destination; lines on one side run in series in file order"));
        return None;
    }
    tanks.iter().find(|t| t.name == first).cloned()
}

/// At most [`MAX_SEGMENTS`] pipes in all lines; the error points at the first one over.
fn check_segment_count(lines: &[Line], diags: &mut Vec<Diagnostic>) {
    let total: usize = lines.iter().map(|l| l.segments.len()).sum();
    if let Some(first_over) = lines.iter().flat_map(|l| &l.segments).nth(MAX_SEGMENTS) {
        diags.push(
            Diagnostic::error(
                Code::TooMany,
                format!("the design has {total} pipe segments; at most {MAX_SEGMENTS} are accepted"),
                Some(first_over.span),
            )
            .with_label(format!("segment {} of {total}", MAX_SEGMENTS + 1))
            .with_help("merge consecutive pipes of the same material and size into one with the summed length; their fittings follow it"),
        );
    }
}

/// A design needs one suction and one discharge line: when either side (or both) has
/// none, say so at the line that is there, or at the top of the design.
fn missing_side(lines: &[Line], blocks: &Blocks, diags: &mut Vec<Diagnostic>) {
    let Some(first) = lines.first() else {
        diags.push(missing(
            "line",
            "the design",
            blocks.first_line_span(),
            "line suction from sump to pump { ... }",
        ));
        return;
    };
    if !lines.iter().any(|l| l.side == Side::Suction) {
        diags.push(
            Diagnostic::error(
                Code::MissingLine,
                "the design has no suction line",
                Some(first.span),
            )
            .with_label("a discharge line, but no line brings water to the pump")
            .with_help("add `line suction from SOURCE to pump { ... }` above this line"),
        );
    }
    if !lines.iter().any(|l| l.side == Side::Discharge) {
        diags.push(
            Diagnostic::error(
                Code::MissingLine,
                "the design has no discharge line",
                Some(first.span),
            )
            .with_label("a suction line, but no line takes water from the pump")
            .with_help("add `line discharge from pump to DESTINATION { ... }` below this line"),
        );
    }
}

fn bad_line(span: Span) -> Diagnostic {
    Diagnostic::error(
        Code::BadLine,
        "a line is `line NAME from A to B { ... }`",
        Some(span),
    )
    .with_help("e.g. `line discharge from pump to reservoir { ... }`")
}
