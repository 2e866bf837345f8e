//! Control curves: the pump-set head a control strategy asks for at a demanded flow.
//!
//! In a single line between two free surfaces the flow follows from the pump head, so a
//! control curve above the system curve means the surplus head is taken downstream (by
//! the consumers' valves, or a pressure-sustaining valve): the pump set delivers the
//! demanded flow Q at the control head H_c(Q) ≥ H_sys(Q). Where the control curve lies
//! below the system curve the line still needs H_sys(Q), and the set supplies that
//! (the point is flagged). Equations (our own statement of common practice):
//! - constant discharge pressure: H_c(Q) = H_set;
//! - held at the far end (system curve): H_c(Q) = H_sys(Q) + H_residual;
//! - proportional: H_c(Q) = H_0 + (H_d − H_0)·Q/Q_d, with H_d = H_sys(Q_d) the system
//!   head at the design flow Q_d and H_0 the stated head at zero flow.

use crate::analysis::CaseSystem;
use crate::model::operation::Control;

/// The head the control asks of the pump set at total flow `q` (m³/s), m, before the
/// floor of the system head. `design_flow` is Q_d (m³/s). `None` for fixed-speed
/// strategies (throttle, on/off), whose head is the pump curve's.
pub fn control_head(control: Control, sys: &CaseSystem, design_flow: f64, q: f64) -> Option<f64> {
    control_head_with(control, sys, design_flow, q, || sys.head(q))
}

/// [`control_head`] with the system head at `q` given by `head_at_q` (taken only when the
/// control needs it).
fn control_head_with(
    control: Control,
    sys: &CaseSystem,
    design_flow: f64,
    q: f64,
    head_at_q: impl FnOnce() -> f64,
) -> Option<f64> {
    match control {
        Control::ConstantPressure { head } => Some(head),
        Control::SystemCurve { residual } => Some(head_at_q() + residual),
        Control::Proportional { zero_flow_head } => {
            let h_design = sys.head(design_flow);
            let x = if design_flow > 0.0 {
                q / design_flow
            } else {
                1.0
            };
            Some(zero_flow_head + (h_design - zero_flow_head) * x)
        }
        Control::Throttle | Control::OnOff => None,
    }
}

/// The head the set must give at `q`, m: the control head, never below the system
/// head, and whether the control curve lay below the system curve there.
pub fn required_head(
    control: Control,
    sys: &CaseSystem,
    design_flow: f64,
    q: f64,
) -> Option<(f64, bool)> {
    required_head_at(control, sys, design_flow, q, sys.head(q))
}

/// [`required_head`] with the system head at `q` (m) already taken.
pub fn required_head_at(
    control: Control,
    sys: &CaseSystem,
    design_flow: f64,
    q: f64,
    hs: f64,
) -> Option<(f64, bool)> {
    let hc = control_head_with(control, sys, design_flow, q, || hs)?;
    Some(if hc + 1e-9 < hs {
        (hs, true)
    } else {
        (hc, false)
    })
}

/// Points (flow m³/s, head m) of the control curve from zero to `q_max`, for plots.
pub fn control_curve(
    control: Control,
    sys: &CaseSystem,
    design_flow: f64,
    q_max: f64,
    n: usize,
) -> Vec<(f64, f64)> {
    let n = n.clamp(2, 200);
    (0..n)
        .filter_map(|i| {
            let q = q_max * i as f64 / (n - 1) as f64;
            control_head(control, sys, design_flow, q).map(|h| (q, h))
        })
        .collect()
}
