//! No input panics; finite positive inputs over wide ranges give finite results;
//! meaningless inputs give errors (or the documented NaN), never a panic.

use dutyline::fluid::{barometric_pressure_pa, water, water_state};
use dutyline::hydraulics::friction::{
    checked_darcy_friction_factor, churchill_1977, colebrook, colebrook_warm,
    darcy_friction_factor, friction_warnings, haaland_1983, hazen_williams_head_loss_m,
    hazen_williams_psi_per_ft, hazen_williams_validity, laminar, swamee_jain_1976,
};

/// Deterministic pseudo-random numbers in [0, 1) (64-bit LCG, Knuth MMIX constants).
struct Lcg(u64);

impl Lcg {
    fn next(&mut self) -> f64 {
        self.0 = self
            .0
            .wrapping_mul(6_364_136_223_846_793_005)
            .wrapping_add(1_442_695_040_888_963_407);
        (self.0 >> 11) as f64 / (1u64 << 53) as f64
    }

    /// Log-uniform in [lo, hi].
    fn log_between(&mut self, lo: f64, hi: f64) -> f64 {
        (lo.ln() + (hi.ln() - lo.ln()) * self.next()).exp()
    }
}

fn finite_positive(x: f64) -> bool {
    x.is_finite() && x > 0.0
}

#[test]
fn friction_is_finite_over_wide_ranges() {
    let mut rng = Lcg(1);
    for _ in 0..20_000 {
        let re = rng.log_between(1e-6, 1e15);
        let rr = if rng.next() < 0.1 {
            0.0
        } else {
            rng.log_between(1e-12, 1.0)
        };
        let f = darcy_friction_factor(re, rr);
        assert!(finite_positive(f.f), "Re {re} rr {rr}: {f:?}");
        assert!(finite_positive(colebrook(re, rr)), "Re {re} rr {rr}");
        assert!(
            finite_positive(colebrook_warm(re, rr, f.f)),
            "Re {re} rr {rr}"
        );
        assert!(finite_positive(churchill_1977(re, rr)), "Re {re} rr {rr}");
        assert!(finite_positive(laminar(re)));
        if re >= 100.0 {
            assert!(
                finite_positive(swamee_jain_1976(re, rr)),
                "SJ Re {re} rr {rr}"
            );
            assert!(
                finite_positive(haaland_1983(re, rr)),
                "Haaland Re {re} rr {rr}"
            );
        }
        let _ = friction_warnings(re, rr);
    }
}

#[test]
fn friction_rejects_meaningless_inputs_without_panicking() {
    let odd = [
        f64::NAN,
        f64::INFINITY,
        f64::NEG_INFINITY,
        -1.0,
        0.0,
        -0.0,
        f64::MIN_POSITIVE,
        f64::MAX,
    ];
    for re in odd {
        for rr in odd.iter().copied().chain([1e-3, 3.7, 10.0]) {
            let checked = checked_darcy_friction_factor(re, rr);
            let plain = darcy_friction_factor(re, rr);
            match checked {
                Ok(friction) => assert!(finite_positive(friction.f), "Re {re} rr {rr}"),
                Err(e) => {
                    assert!(!e.message.is_empty());
                    assert!(plain.f.is_nan());
                }
            }
            let _ = (
                colebrook(re, rr),
                churchill_1977(re, rr),
                swamee_jain_1976(re, rr),
            );
            let _ = (haaland_1983(re, rr), friction_warnings(re, rr));
        }
    }
}

#[test]
fn hazen_williams_is_finite_over_wide_ranges() {
    let mut rng = Lcg(2);
    for _ in 0..20_000 {
        let q = rng.log_between(1e-9, 100.0);
        let d = rng.log_between(1e-3, 10.0);
        let l = rng.log_between(1e-3, 1e5);
        let c = rng.log_between(1.0, 200.0);
        assert!(
            finite_positive(hazen_williams_head_loss_m(q, d, l, c)),
            "{q} {d} {l} {c}"
        );
        let gpm = rng.log_between(1e-3, 1e6);
        let d_in = rng.log_between(0.1, 120.0);
        assert!(finite_positive(hazen_williams_psi_per_ft(gpm, d_in, c)));
        let _ = hazen_williams_validity(q, d, c, rng.log_between(1.0, 1e4));
    }
    let _ = hazen_williams_validity(f64::NAN, f64::INFINITY, -1.0, f64::NAN);
}

#[test]
fn water_is_finite_across_the_liquid_range() {
    let mut rng = Lcg(3);
    for _ in 0..5_000 {
        let t = 273.15 + (647.096 - 273.15) * rng.next();
        let p = rng.log_between(1.0, 100.0e6);
        if t <= 273.15 || t >= 647.096 {
            continue;
        }
        let state = water_state(t, p).unwrap_or_else(|e| panic!("T {t} p {p}: {e}"));
        let w = state.properties;
        assert!(finite_positive(w.density_kg_m3), "T {t} p {p}");
        assert!(finite_positive(w.dynamic_viscosity_pa_s), "T {t} p {p}");
        assert!(finite_positive(w.vapor_pressure_pa), "T {t} p {p}");
        assert!(
            w.density_kg_m3 > 300.0 && w.density_kg_m3 < 1050.0,
            "T {t} p {p}: {w:?}"
        );
    }
}

#[test]
fn water_errors_for_bad_temperature_or_pressure() {
    for t in [
        f64::NAN,
        f64::INFINITY,
        f64::NEG_INFINITY,
        -1.0,
        0.0,
        273.15,
        647.096,
        1e300,
    ] {
        let e = water(t, 101_325.0).expect_err("not liquid");
        assert!(e.message.contains("647.096 K"), "{e}");
    }
    for p in [f64::NAN, f64::INFINITY, -1.0, 0.0, 1e300] {
        assert!(water(300.0, p).is_err(), "{p}");
    }
}

#[test]
fn atmosphere_is_finite_in_range_and_errors_outside() {
    let mut rng = Lcg(4);
    for _ in 0..5_000 {
        let z = -5000.0 + 16_000.0 * rng.next();
        assert!(finite_positive(
            barometric_pressure_pa(z).expect("in range")
        ));
    }
    for z in [f64::NAN, f64::INFINITY, -1e6, 1e6, -5000.001, 11000.001] {
        assert!(barometric_pressure_pa(z).is_err());
    }
}
