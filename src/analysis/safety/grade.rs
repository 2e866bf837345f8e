//! The hydraulic grade line along a line at a flow, and the pressures it gives.
//!
//! Energy equation along the pipe (White, *Fluid Mechanics*, 7th ed., §3.7 and §6.9):
//! the energy grade E falls by the wall friction of each segment linearly along it and
//! by the segment's minor losses, which are lumped at its upstream end (where they
//! lower the grade downstream: conservative for the lowest pressure); the hydraulic
//! grade is E − v²/2g and the gauge pressure ρ·g·(HGL − z). The suction side starts
//! from the source surface's head and falls toward the pump; the discharge side ends at
//! the destination surface's head, so both sides meet the system curve at the duty.

use super::geometry::LineProfile;
use crate::analysis::system::{CaseSystem, G};
use crate::hydraulics::heads::Head;
use crate::model::Side;

/// One point of a line where the grade is evaluated.
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct Station {
    /// Chainage from the line's upstream end, m.
    pub chainage: f64,
    /// Pipe elevation, m.
    pub elevation: f64,
    /// Index into the case's segments ([`CaseSystem::segments`]).
    pub segment: usize,
    /// Whether the station lies before its segment's lumped minor losses (line start).
    pub before_losses: bool,
}

/// Evenly spaced stations per line besides the profile knots and pipe ends, so that a
/// straight grade is screened along its length, not at its ends only.
pub const STATIONS_PER_LINE: usize = 20;

/// The stations of a line: its start (before the first losses), then for each segment
/// its start, the profile knots and the even stations (every 1/20 of the line) inside
/// it, and its end.
pub fn stations(sys: &CaseSystem, line: &str, profile: &LineProfile) -> Vec<Station> {
    let mut out = Vec::new();
    let mut x = 0.0;
    for (j, seg) in sys
        .segments
        .iter()
        .enumerate()
        .filter(|(_, s)| *s.line == *line)
    {
        let at = |c: f64, before| Station {
            chainage: c,
            elevation: profile.elevation(c),
            segment: j,
            before_losses: before,
        };
        if out.is_empty() {
            out.push(at(x, true));
        }
        out.push(at(x, false));
        let end = x + seg.length;
        let step = profile.length / STATIONS_PER_LINE as f64;
        let mut inner: Vec<f64> = profile.inner_knots(x, end).collect();
        if step > 0.0 {
            let first = (x / step).floor() as usize + 1;
            inner.extend(
                (first..first + STATIONS_PER_LINE)
                    .map(|k| k as f64 * step)
                    .take_while(|c| *c < end - 1e-9 * profile.length),
            );
        }
        inner.sort_by(f64::total_cmp);
        inner.dedup_by(|a, b| (*a - *b).abs() <= 1e-9 * profile.length.max(1.0));
        out.extend(inner.into_iter().map(|c| at(c, false)));
        out.push(at(end, false));
        x = end;
    }
    out
}

/// Energy head at the upstream end of every case segment when the set carries `q` and
/// each pump `qp` (m³/s; station piping carries `qp`), m (gauge datum: barometric
/// pressure is zero), with each segment's (wall, minor) loss.
fn segment_energy(sys: &CaseSystem, q: f64, qp: f64) -> Result<Vec<(f64, f64, f64)>, String> {
    // A well's surface is its pumping level at the flow.
    let source = sys
        .source_level
        .lowered(Head::new(sys.drawdown(q)))
        .raised(sys.source_gauge().head(sys.fluid.specific_weight()))
        .m();
    let destination = discharge_end_head(sys, q)?;
    let losses: Vec<(f64, f64)> = sys
        .segments
        .iter()
        .map(|s| sys.segment_losses(s, sys.segment_flow(s, q, qp)))
        .collect();
    let mut out = Vec::with_capacity(losses.len());
    let mut e = source;
    for (s, (w, m)) in sys.segments.iter().zip(&losses) {
        if s.side == Side::Suction {
            out.push((e, *w, *m));
            e -= w + m;
        }
    }
    let discharge_total: f64 = sys
        .segments
        .iter()
        .zip(&losses)
        .filter(|(s, _)| s.side == Side::Discharge)
        .map(|(_, (w, m))| w + m)
        .sum();
    let mut e = destination + discharge_total;
    for (s, (w, m)) in sys.segments.iter().zip(&losses) {
        if s.side == Side::Discharge {
            out.push((e, *w, *m));
            e -= w + m;
        }
    }
    Ok(out)
}

/// Energy head at the far end of the discharge lines at station flow `q`, m (gauge
/// datum): the destination surface's head for a chain; for a network (open or a closed
/// loop), the network's entry node head at that flow. The network's losses and
/// delivery pressures lie between that node and the tanks beyond it, so a tank's head
/// would understate every discharge pressure by them (unconservative for ratings), so a
/// network that cannot be solved at `q` is an error (why, in words), not the tank's head.
fn discharge_end_head(sys: &CaseSystem, q: f64) -> Result<f64, String> {
    match &sys.network {
        Some((net, _)) => net.entry_head(q).map_err(|e| e.to_string()),
        None => Ok(sys.destination_grade().m()),
    }
}

/// Hydraulic grade (m) at each station when the set carries `q` and each pump `qp`
/// (m³/s); `Err` with why when the network beyond the station cannot be solved at `q`.
pub fn grade_at(
    sys: &CaseSystem,
    stations: &[Station],
    q: f64,
    qp: f64,
) -> Result<Vec<f64>, String> {
    let energy = segment_energy(sys, q, qp)?;
    let mut starts = vec![0.0; sys.segments.len()];
    // Chainage where each segment starts (the first non-"before" station of it).
    let mut seen = vec![false; sys.segments.len()];
    for st in stations.iter().filter(|s| !s.before_losses) {
        if !seen[st.segment] {
            seen[st.segment] = true;
            starts[st.segment] = st.chainage;
        }
    }
    let grade = stations
        .iter()
        .map(|st| {
            let seg = &sys.segments[st.segment];
            let (e0, wall, minor) = energy[st.segment];
            let v = sys.segment_flow(seg, q, qp) / seg.area;
            let hv = v * v / (2.0 * G);
            if st.before_losses {
                let hv0 = if seg.side == Side::Suction { 0.0 } else { hv };
                return e0 - hv0;
            }
            let frac = if seg.length > 0.0 {
                ((st.chainage - starts[st.segment]) / seg.length).clamp(0.0, 1.0)
            } else {
                1.0
            };
            e0 - minor - wall * frac - hv
        })
        .collect();
    Ok(grade)
}

/// The static grade with the pumps stopped, m: the source surface's head on the
/// suction side, the destination's on the discharge side (held by the check valve).
pub fn static_grade(sys: &CaseSystem, stations: &[Station]) -> Vec<f64> {
    let (source, destination) = (sys.source_grade().m(), sys.destination_grade().m());
    stations
        .iter()
        .map(|st| match sys.segments[st.segment].side {
            Side::Suction => source,
            Side::Discharge => destination,
        })
        .collect()
}

/// Gauge pressure ρ·g·(HGL − z) at each station, Pa.
pub fn pressures(stations: &[Station], grade: &[f64], density: f64) -> Vec<f64> {
    stations
        .iter()
        .zip(grade)
        .map(|(st, h)| density * G * (h - st.elevation))
        .collect()
}
