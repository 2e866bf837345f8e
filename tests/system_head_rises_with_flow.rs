//! The system curve built from the friction factor must rise with flow: for a real pipe
//! and real water, Darcy–Weisbach head h = f (L/D) V^2 / (2 g) increases with Q through
//! laminar, transitional and turbulent flow.

use dutyline::fluid::water;
use dutyline::hydraulics::friction::darcy_friction_factor;

const G: f64 = 9.806_65; // standard gravity, m/s^2 (CGPM 1901; NIST SP 811)

fn head_loss_m(q: f64, d: f64, l: f64, eps: f64, density: f64, viscosity: f64) -> f64 {
    let area = std::f64::consts::PI * d * d / 4.0;
    let v = q / area;
    let re = density * v * d / viscosity;
    let f = darcy_friction_factor(re, eps / d).f;
    f * l / d * v * v / (2.0 * G)
}

#[test]
fn head_loss_rises_monotonically_with_flow() {
    // 100 m of 50 mm and 300 mm pipe, smooth and commercial steel (eps 0.045 mm, common
    // practice), water at 20 degC and 80 degC, Q from 1e-8 to 0.5 m^3/s.
    for t in [293.15, 353.15] {
        let w = water(t, 300_000.0).expect("liquid");
        for d in [0.05, 0.3] {
            for eps in [0.0, 0.045e-3, 1.0e-3] {
                let mut previous = 0.0;
                let mut saw_transition = false;
                for i in 0..=5000 {
                    let q = 10f64.powf(-8.0 + 7.7 * f64::from(i) / 5000.0);
                    let h =
                        head_loss_m(q, d, 100.0, eps, w.density_kg_m3, w.dynamic_viscosity_pa_s);
                    assert!(h.is_finite() && h > previous, "T {t} D {d} eps {eps} Q {q}");
                    previous = h;
                    let re = w.density_kg_m3 * q / (std::f64::consts::PI * d * d / 4.0) * d
                        / w.dynamic_viscosity_pa_s;
                    saw_transition |= re > 2000.0 && re < 4000.0;
                }
                assert!(saw_transition, "grid must cross the transitional zone");
            }
        }
    }
}
