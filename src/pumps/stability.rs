//! Where a head curve rises with flow: the unstable (rising, "drooping") part of a
//! pump curve.
//!
//! A stable head curve falls continuously from shut-off to run-out. Where the head
//! rises with flow instead, a level (static-head) system curve whose head lies between
//! the lowest head before the rise and the peak of the rise crosses the pump curve
//! twice: the pump may settle on either intersection and, in parallel operation or
//! against a slowly changing level, hunt between them. ANSI/HI 9.6.3 and the Hydraulic
//! Institute's centrifugal-pump guidance describe such curves as unstable (rising
//! head-capacity curves) and advise against operating where the system can meet the
//! curve twice (from memory); that parallel pumps with rising curves can hunt is common
//! practice.
//!
//! Method: the curve is sampled at [`STABILITY_GRID_INTERVALS`] + 1 equally spaced
//! flows on its data domain. The rise is the largest H(q_b) − H(q_a) over q_a < q_b;
//! q_a is the lowest point before the peak q_b. Rises below [`RISE_TOLERANCE`] of the
//! peak head are ignored (fits of flat data). Validity: the data domain of the fit.

/// Sampling intervals over the data domain.
pub const STABILITY_GRID_INTERVALS: usize = 400;

/// Rises smaller than this fraction of the peak head (0.2 %) are not reported: within
/// the reading accuracy of a published curve (our choice).
pub const RISE_TOLERANCE: f64 = 0.002;

/// The rising part of a head curve: the head rises from `head_low` at `flow_low` to
/// `head_peak` at `flow_peak` (flows m³/s, heads m). A level system curve with a head
/// strictly between `head_low` and `head_peak` crosses the curve at least twice.
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct RisingRegion {
    /// Flow where the rise starts (the lowest head before the peak), m³/s.
    pub flow_low: f64,
    /// Head there, m.
    pub head_low: f64,
    /// Flow of the peak of the rise, m³/s.
    pub flow_peak: f64,
    /// Head at the peak, m.
    pub head_peak: f64,
}

impl RisingRegion {
    /// How much the head rises, m.
    pub fn rise(&self) -> f64 {
        self.head_peak - self.head_low
    }

    /// Whether a level system curve at `static_head` (m) lies in the band where it
    /// crosses the curve twice.
    pub fn two_crossings_at(&self, static_head: f64) -> bool {
        static_head > self.head_low && static_head < self.head_peak
    }

    /// The region of the same pump with flows × `flow_scale` and heads × `head_scale`
    /// (affinity laws, arrangements).
    pub fn scaled(&self, flow_scale: f64, head_scale: f64) -> RisingRegion {
        RisingRegion {
            flow_low: self.flow_low * flow_scale,
            head_low: self.head_low * head_scale,
            flow_peak: self.flow_peak * flow_scale,
            head_peak: self.head_peak * head_scale,
        }
    }
}

/// The largest rise of `head` (m, a function of flow in m³/s) on `domain` (m³/s), or
/// `None` when the curve does not rise by more than [`RISE_TOLERANCE`] of its peak
/// (or the domain or a value is not finite).
pub fn rising_region(head: &dyn Fn(f64) -> f64, domain: (f64, f64)) -> Option<RisingRegion> {
    let (a, b) = domain;
    if !(a.is_finite() && b.is_finite() && b > a) {
        return None;
    }
    let mut low = (a, head(a));
    let mut best: Option<RisingRegion> = None;
    let mut top: f64 = low.1;
    for i in 0..=STABILITY_GRID_INTERVALS {
        let q = a + (b - a) * i as f64 / STABILITY_GRID_INTERVALS as f64;
        let h = head(q);
        if !h.is_finite() {
            return None;
        }
        top = top.max(h);
        if h < low.1 {
            low = (q, h);
        }
        let rise = h - low.1;
        if rise > best.map_or(0.0, |r| r.rise()) {
            best = Some(RisingRegion {
                flow_low: low.0,
                head_low: low.1,
                flow_peak: q,
                head_peak: h,
            });
        }
    }
    best.filter(|r| r.rise() > RISE_TOLERANCE * top.abs())
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn a_falling_curve_has_no_rising_region() {
        let h = |q: f64| 50.0 - 2000.0 * q * q;
        assert!(rising_region(&h, (0.0, 0.1)).is_none());
    }

    #[test]
    fn a_drooping_parabola_rises_from_shutoff_to_its_vertex() {
        // H = 40 + 600 q − 50 000 q²: vertex 41.8 m at q = 0.006 m³/s.
        let h = |q: f64| 40.0 + 600.0 * q - 50_000.0 * q * q;
        let r = rising_region(&h, (0.0, 0.03)).expect("rises");
        assert_eq!(r.flow_low, 0.0);
        assert!((r.head_low - 40.0).abs() < 1e-12);
        assert!((r.flow_peak - 0.006).abs() < 0.03 / 400.0);
        assert!((r.head_peak - 41.8).abs() < 1e-3);
        assert!(r.two_crossings_at(41.0));
        assert!(!r.two_crossings_at(39.9) && !r.two_crossings_at(42.0));
        let s = r.scaled(2.0, 0.81);
        assert!((s.flow_peak - 2.0 * r.flow_peak).abs() < 1e-15);
        assert!((s.head_low - 32.4).abs() < 1e-9);
    }

    #[test]
    fn a_dip_in_the_middle_is_found() {
        // Falls from 50 to a dip of 44 m at 0.04, rises to 46 m at 0.06, then falls.
        let pts = [(0.0, 50.0), (0.04, 44.0), (0.06, 46.0), (0.1, 30.0)];
        let h = move |q: f64| {
            let i = pts.windows(2).position(|w| q <= w[1].0).unwrap_or(2);
            let (a, b) = (pts[i], pts[i + 1]);
            a.1 + (b.1 - a.1) * (q - a.0) / (b.0 - a.0)
        };
        let r = rising_region(&h, (0.0, 0.1)).expect("rises");
        assert!((r.flow_low - 0.04).abs() < 1e-9 && (r.flow_peak - 0.06).abs() < 1e-9);
        assert!((r.rise() - 2.0).abs() < 1e-9);
    }

    #[test]
    fn a_tiny_wobble_is_below_the_tolerance() {
        // Rises of at most 0.04 m on a 50 m curve (0.08 %).
        let h = |q: f64| 50.0 + 0.02 * (q * 3000.0).sin() - 10.0 * q;
        assert!(rising_region(&h, (0.0, 0.01)).is_none());
        assert!(rising_region(&|_| f64::NAN, (0.0, 1.0)).is_none());
        assert!(rising_region(&h, (1.0, 0.0)).is_none());
    }
}
