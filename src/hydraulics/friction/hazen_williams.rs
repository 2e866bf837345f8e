//! Hazen–Williams head loss for water, in its SI and US customary forms.
//!
//! Source: Williams, G. S. and Hazen, A. (1905; 3rd ed. 1920), *Hydraulic Tables*,
//! John Wiley & Sons, New York: V = k C R^0.63 S^0.54, with k = 1.318 (ft, s) or 0.849
//! (m, s), R the hydraulic radius (D/4 for a full pipe) and S the head-loss gradient.
//! Solved for the loss these give the customary forms used below:
//! - SI: h_f = 10.67 L Q^1.852 / (C^1.852 D^4.8704) (Q m^3/s, D m, L m, h_f m); exact
//!   rearrangement gives 10.674 (common practice to quote 10.67).
//! - US: p = 4.52 Q^1.85 / (C^1.85 d^4.87) psi per foot (Q US gpm, d inches), the form of
//!   NFPA 13 (*Standard for the Installation of Sprinkler Systems*), hydraulic-calculation
//!   chapter (clause number varies by edition); exact rearrangement with water at
//!   62.4 lbf/ft^3 gives 4.531.
//!
//! The method is empirical: water at ordinary temperatures, turbulent flow, pipes of
//! about 2 in (50 mm) and larger; see [`hazen_williams_validity`].

/// Kelvin value of 0 degC.
const ZERO_CELSIUS_K: f64 = 273.15;

/// SI Hazen–Williams constant (m, m^3/s).
pub const HAZEN_WILLIAMS_SI_CONSTANT: f64 = 10.67;
/// US customary Hazen–Williams constant (psi/ft, gpm, in).
pub const HAZEN_WILLIAMS_US_CONSTANT: f64 = 4.52;

/// Hazen–Williams head loss (m of water) in SI form
/// h_f = 10.67 L Q^1.852 / (C^1.852 D^4.8704), for flow `flow_m3_s` (m^3/s), inside
/// diameter `diameter_m` (m), length `length_m` (m) and roughness coefficient `c`.
///
/// Source and validity: see the module documentation and [`hazen_williams_validity`].
/// The loss carries the sign of the flow (reverse flow gives a negative loss).
/// Returns `f64::NAN` for non-finite inputs, diameter or C <= 0, or a negative length.
/// Worked number: Q = 0.1 m^3/s, D = 0.3 m, L = 1000 m, C = 130 gives 6.4235 m.
pub fn hazen_williams_head_loss_m(flow_m3_s: f64, diameter_m: f64, length_m: f64, c: f64) -> f64 {
    let all_finite = [flow_m3_s, diameter_m, length_m, c]
        .iter()
        .all(|v| v.is_finite());
    if !all_finite || diameter_m <= 0.0 || c <= 0.0 || length_m < 0.0 {
        return f64::NAN;
    }
    let magnitude = HAZEN_WILLIAMS_SI_CONSTANT * length_m * flow_m3_s.abs().powf(1.852)
        / si_denominator(c, diameter_m);
    magnitude.copysign(flow_m3_s)
}

/// C^1.852 · D^4.8704 of the SI form, or the value it gave last for the same C and D:
/// the last few are kept per thread, keyed by the bits of both, so a kept value is the
/// computed one bit for bit. A segment's C and bore stay while its flow changes (a
/// system curve, a duty solve), and the two powers cost more than the rest of the loss.
fn si_denominator(c: f64, diameter_m: f64) -> f64 {
    use std::cell::Cell;
    const SLOTS: usize = 8;
    thread_local! {
        static KEPT: [Cell<(u64, u64, f64)>; SLOTS] =
            const { [const { Cell::new((u64::MAX, u64::MAX, 0.0)) }; SLOTS] };
    }
    let (kc, kd) = (c.to_bits(), diameter_m.to_bits());
    let hash = (kc ^ kd.rotate_left(31)).wrapping_mul(0x9E37_79B9_7F4A_7C15);
    let slot = (hash >> 61) as usize % SLOTS;
    if let Some(v) = KEPT.with(|k| {
        let (a, b, v) = k[slot].get();
        (a == kc && b == kd).then_some(v)
    }) {
        return v;
    }
    let v = c.powf(1.852) * diameter_m.powf(4.8704);
    KEPT.with(|k| k[slot].set((kc, kd, v)));
    v
}

/// Hazen–Williams pressure loss (psi per foot of pipe) in US customary form
/// p = 4.52 Q^1.85 / (C^1.85 d^4.87), for flow `flow_gpm` (US gal/min), inside diameter
/// `diameter_in` (in) and roughness coefficient `c`.
///
/// Source and validity: see the module documentation and [`hazen_williams_validity`].
/// Signed like the flow; `f64::NAN` for non-finite inputs or diameter or C <= 0.
/// Worked number: 500 gpm in 6.065 in pipe with C = 120 gives 0.009758 psi/ft.
pub fn hazen_williams_psi_per_ft(flow_gpm: f64, diameter_in: f64, c: f64) -> f64 {
    let all_finite = [flow_gpm, diameter_in, c].iter().all(|v| v.is_finite());
    if !all_finite || diameter_in <= 0.0 || c <= 0.0 {
        return f64::NAN;
    }
    let magnitude = HAZEN_WILLIAMS_US_CONSTANT * flow_gpm.abs().powf(1.85)
        / (c.powf(1.85) * diameter_in.powf(4.87));
    magnitude.copysign(flow_gpm)
}

/// Where a Hazen-Williams calculation leaves the range in which the method is normally
/// trusted, with the value found (SI), so an output can state it in its own units.
/// All limits are common practice (the method is empirical, fitted to water near
/// 60 degF in ordinary pipes).
#[derive(Clone, Copy, Debug, PartialEq)]
pub enum HazenWilliamsRemark {
    /// An input is not a finite number: its name and value.
    NotFinite(&'static str, f64),
    /// Water temperature (K) outside about 5–25 degC ([`HW_TEMPERATURE_RANGE_K`]).
    Temperature(f64),
    /// Velocity (m/s) above about 3 m/s (10 ft/s, [`HW_MAX_VELOCITY`]).
    Velocity(f64),
    /// Inside diameter (m) below about 50 mm (2 in, [`HW_MIN_DIAMETER`]).
    Diameter(f64),
    /// C outside 60 (old, badly tuberculated pipe) to 150 (very smooth pipe).
    C(f64),
}

/// Water temperatures (K) Hazen-Williams is fitted to: about 5–25 degC (common practice).
pub const HW_TEMPERATURE_RANGE_K: (f64, f64) = (ZERO_CELSIUS_K + 5.0, ZERO_CELSIUS_K + 25.0);
/// Largest velocity (m/s) for Hazen-Williams: about 3 m/s, 10 ft/s (common practice).
pub const HW_MAX_VELOCITY: f64 = 3.0;
/// Smallest inside diameter (m) for Hazen-Williams: about 50 mm, 2 in (common practice).
pub const HW_MIN_DIAMETER: f64 = 0.05;

/// The remarks on one Hazen–Williams calculation (velocity m/s, inside diameter m,
/// C, water temperature K); empty when inside the range.
pub fn hazen_williams_remarks(
    velocity_m_s: f64,
    diameter_m: f64,
    c: f64,
    temperature_k: f64,
) -> Vec<HazenWilliamsRemark> {
    let named = [
        ("velocity", velocity_m_s),
        ("diameter", diameter_m),
        ("C", c),
        ("temperature", temperature_k),
    ];
    let not_finite: Vec<HazenWilliamsRemark> = named
        .iter()
        .filter(|(_, v)| !v.is_finite())
        .map(|&(name, v)| HazenWilliamsRemark::NotFinite(name, v))
        .collect();
    if !not_finite.is_empty() {
        return not_finite;
    }
    let mut remarks = Vec::new();
    let (t_lo, t_hi) = HW_TEMPERATURE_RANGE_K;
    if !(t_lo..=t_hi).contains(&temperature_k) {
        remarks.push(HazenWilliamsRemark::Temperature(temperature_k));
    }
    if velocity_m_s.abs() > HW_MAX_VELOCITY {
        remarks.push(HazenWilliamsRemark::Velocity(velocity_m_s.abs()));
    }
    if diameter_m < HW_MIN_DIAMETER {
        remarks.push(HazenWilliamsRemark::Diameter(diameter_m));
    }
    if !(60.0..=150.0).contains(&c) {
        remarks.push(HazenWilliamsRemark::C(c));
    }
    remarks
}

/// Warnings (human-readable, SI) when a Hazen–Williams calculation is outside the range
/// in which the method is normally trusted ([`hazen_williams_remarks`]); empty when
/// inside. Outputs in other units word the remarks themselves.
pub fn hazen_williams_validity(
    velocity_m_s: f64,
    diameter_m: f64,
    c: f64,
    temperature_k: f64,
) -> Vec<String> {
    hazen_williams_remarks(velocity_m_s, diameter_m, c, temperature_k)
        .into_iter()
        .map(|r| match r {
            HazenWilliamsRemark::NotFinite(name, value) => {
                format!("Hazen-Williams: {name} is not a finite number ({value})")
            }
            HazenWilliamsRemark::Temperature(t) => format!(
                "Hazen-Williams is fitted to water at ordinary temperatures (about 5-25 degC); \
                 {:.1} degC is outside, use Darcy-Weisbach with Colebrook",
                t - ZERO_CELSIUS_K
            ),
            HazenWilliamsRemark::Velocity(v) => format!(
                "Hazen-Williams: velocity {v:.2} m/s is above about 3 m/s, where its fixed \
                 exponents misjudge the loss; use Darcy-Weisbach"
            ),
            HazenWilliamsRemark::Diameter(d) => format!(
                "Hazen-Williams: inside diameter {:.1} mm is below about 50 mm (2 in), outside \
                 the pipes it was fitted to; use Darcy-Weisbach",
                d * 1000.0
            ),
            HazenWilliamsRemark::C(c) => format!(
                "Hazen-Williams: C = {c} is outside the usual 60-150 range of published C values"
            ),
        })
        .collect()
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn kept_denominators_are_the_computed_ones_to_the_bit() {
        // More (C, D) pairs than slots, asked in two orders: each loss is the one of the
        // formula written out.
        let pairs: Vec<(f64, f64)> = (0..40)
            .map(|i| (80.0 + 3.0 * i as f64, 0.05 + 0.01 * (i % 9) as f64))
            .collect();
        for round in 0..2 {
            for &(c, d) in pairs.iter().rev().skip(round) {
                let h = hazen_williams_head_loss_m(0.03, d, 250.0, c);
                let by_hand = HAZEN_WILLIAMS_SI_CONSTANT * 250.0 * 0.03f64.powf(1.852)
                    / (c.powf(1.852) * d.powf(4.8704));
                assert_eq!(h.to_bits(), by_hand.to_bits(), "C {c}, D {d}");
            }
        }
    }

    #[test]
    fn worked_si_number() {
        // By hand: 0.1^1.852 = 0.014060, 130^1.852 = 8222.9, 0.3^4.8704 = 0.0028403;
        // h = 10.67 * 1000 * 0.014060 / (8222.9 * 0.0028403) = 150.03 / 23.356 = 6.4235 m.
        let h = hazen_williams_head_loss_m(0.1, 0.3, 1000.0, 130.0);
        assert!((h - 6.4235).abs() < 1e-3, "{h}");
        assert!((hazen_williams_head_loss_m(-0.1, 0.3, 1000.0, 130.0) + h).abs() < 1e-12);
    }

    #[test]
    fn worked_us_number() {
        // By hand: 500^1.85 = 98 423, 120^1.85 = 7022.4, 6.065^4.87 = 6492.1;
        // p = 4.52 * 98 423 / (7022.4 * 6492.1) = 444 870 / 45 590 000 = 0.009758 psi/ft.
        let p = hazen_williams_psi_per_ft(500.0, 6.065, 120.0);
        assert!((p - 0.009758).abs() < 2e-6, "{p}");
    }

    #[test]
    fn validity_flags_each_limit() {
        assert!(hazen_williams_validity(1.5, 0.2, 130.0, 288.15).is_empty());
        assert_eq!(hazen_williams_validity(3.5, 0.2, 130.0, 288.15).len(), 1);
        assert_eq!(hazen_williams_validity(1.0, 0.025, 130.0, 288.15).len(), 1);
        assert_eq!(hazen_williams_validity(1.0, 0.2, 40.0, 288.15).len(), 1);
        assert_eq!(hazen_williams_validity(1.0, 0.2, 130.0, 353.15).len(), 1);
        assert_eq!(hazen_williams_validity(4.0, 0.02, 200.0, 353.15).len(), 4);
        assert_eq!(
            hazen_williams_validity(f64::NAN, 0.2, 130.0, 288.15).len(),
            1
        );
    }

    #[test]
    fn invalid_inputs_give_nan() {
        assert!(hazen_williams_head_loss_m(0.1, 0.0, 10.0, 130.0).is_nan());
        assert!(hazen_williams_head_loss_m(0.1, 0.3, -1.0, 130.0).is_nan());
        assert!(hazen_williams_head_loss_m(f64::NAN, 0.3, 1.0, 130.0).is_nan());
        assert!(hazen_williams_psi_per_ft(100.0, 4.0, 0.0).is_nan());
    }
}
