//! The pipe profile of a line as the screen uses it: elevation against chainage from
//! the design's profile, from segment end elevations, or a straight grade between the
//! line's end elevations; and the stations the grade line is evaluated at.

use uom::si::length::meter;

use crate::model::{Line, Side};

/// Elevation knots (chainage m, elevation m) of a line, strictly increasing chainage
/// from 0 to at least the line's length, and where they come from.
#[derive(Clone, Debug, PartialEq)]
pub struct LineProfile {
    /// The knots: (chainage m, elevation m), chainage strictly increasing.
    pub knots: Vec<(f64, f64)>,
    /// "given in the design", "from FILE", "segment end elevations" or "straight grade …".
    pub source: String,
    /// The line's length (sum of its segments), m.
    pub length: f64,
    /// A remark when the profile's length differs from the line's.
    pub warning: Option<String>,
}

impl LineProfile {
    /// Elevation at chainage `x` (m), by linear interpolation, held at the ends.
    pub fn elevation(&self, x: f64) -> f64 {
        let k = &self.knots;
        if x <= k[0].0 {
            return k[0].1;
        }
        for w in k.windows(2) {
            let ((x0, z0), (x1, z1)) = (w[0], w[1]);
            if x <= x1 {
                return if x1 > x0 {
                    z0 + (z1 - z0) * (x - x0) / (x1 - x0)
                } else {
                    z1
                };
            }
        }
        k[k.len() - 1].1
    }

    /// Knot chainages strictly between `a` and `b`.
    pub fn inner_knots(&self, a: f64, b: f64) -> impl Iterator<Item = f64> + '_ {
        self.knots
            .iter()
            .map(|(x, _)| *x)
            .filter(move |x| *x > a && *x < b)
    }
}

/// The profile of `line`: its `profile`, else its segments' end elevations, else a
/// straight grade from `ends.0` (upstream end) to `ends.1` (downstream end), m;
/// `discharge_end` names where a discharge line ends ("the destination level").
pub fn line_profile(line: &Line, ends: (f64, f64), discharge_end: &str) -> LineProfile {
    let length: f64 = line.segments.iter().map(|s| s.length.get::<meter>()).sum();
    if let Some(p) = &line.profile {
        let mut knots: Vec<(f64, f64)> = p
            .points
            .iter()
            .map(|(x, z)| (x.get::<meter>(), z.get::<meter>()))
            .collect();
        let last = knots[knots.len() - 1].0;
        let warning = ((last - length).abs() > (0.01 * length).max(1.0)).then(|| {
            format!(
                "line {}: the profile runs {:.1} m, the line's pipes {:.1} m; elevations beyond the profile are held at its last point",
                line.name, last, length
            )
        });
        if last < length {
            let z = knots[knots.len() - 1].1;
            knots.push((length, z));
        }
        return LineProfile {
            knots,
            source: p.source.clone(),
            length,
            warning,
        };
    }
    let mut knots: Vec<(f64, f64, bool)> = vec![(0.0, ends.0, false), (length, ends.1, false)];
    let mut x = 0.0;
    let mut given = false;
    for seg in &line.segments {
        let l = seg.length.get::<meter>();
        if let Some(z) = seg.wall.start_elevation {
            knots.push((x, z.get::<meter>(), true));
            given = true;
        }
        if let Some(z) = seg.wall.end_elevation {
            knots.push((x + l, z.get::<meter>(), true));
            given = true;
        }
        x += l;
    }
    // Sort by chainage; at one chainage a given elevation replaces the default end.
    knots.sort_by(|a, b| a.0.total_cmp(&b.0).then(a.2.cmp(&b.2)));
    let mut out: Vec<(f64, f64)> = Vec::new();
    for (x, z, _) in knots {
        match out.last_mut() {
            Some(last) if last.0 == x => last.1 = z,
            _ => out.push((x, z)),
        }
    }
    if out.len() == 1 {
        out.push((out[0].0 + 1e-9, out[0].1));
    }
    let source = if given {
        "segment end elevations (linear between them and the line's ends)".to_string()
    } else {
        match line.side {
            Side::Suction => {
                "straight grade from the source level to the pump centreline".to_string()
            }
            Side::Discharge => {
                format!("straight grade from the pump centreline to {discharge_end}")
            }
        }
    };
    LineProfile {
        knots: out,
        source,
        length,
        warning: None,
    }
}
