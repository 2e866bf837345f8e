//! What a reviewer recomputes at each duty (issue 10, "everything printed"): NPSH
//! available term by term, every segment at the duty flow, hydraulic, shaft and input
//! power, specific energy and wire-to-water efficiency. Consistency of the printed
//! terms with the totals, and hand-computed surface-pressure heads for a pressurised
//! and a vacuum tank.

mod common;
use common::DemoFiles;
use dutyline::analysis::Analysis;

/// Standard gravity, 9.806 65 m/s² (CGPM 1901); 1 psi = 6894.757 293 168 Pa (NIST SP
/// 811, 2008, Appendix B).
const G0: f64 = 9.806_65;
const PSI: f64 = 6_894.757_293_168;

fn analyse(src: &str) -> Analysis {
    common::analyse_valid(src, &DemoFiles).1
}

fn demo(name: &str) -> String {
    let path = format!("{}/examples-demo/{name}.duty", env!("CARGO_MANIFEST_DIR"));
    std::fs::read_to_string(path).expect("demo")
}

#[test]
fn printed_terms_add_up_to_the_totals_in_every_demo() {
    for name in [
        "orchard-lift-rev-a",
        "orchard-lift-rev-b",
        "kestrel-booster",
    ] {
        let a = analyse(&demo(name));
        for c in &a.cases {
            let s = c.system.as_ref().expect("system");
            for p in &c.pumps {
                let Some(d) = &p.duty else { continue };
                let at = format!("{name} {} {}", c.name, p.name);
                assert!((d.npsh_terms.sum() - d.npsh_available).abs() < 1e-9, "{at}");
                let losses = s.losses(d.flow);
                let segments = d.segments(s);
                let friction: f64 = segments.iter().map(|g| g.friction_head).sum();
                let minor: f64 = segments.iter().map(|g| g.minor_head).sum();
                assert!((friction - losses.friction).abs() < 1e-9, "{at}");
                assert!((minor - losses.minor).abs() < 1e-9, "{at}");
                assert!(
                    (s.static_head + friction + minor - d.head).abs() < 1e-6 * d.head,
                    "{at}"
                );
                // Velocity next to the pump = Q / (π D² / 4) of that segment.
                let last_suction = s
                    .segments
                    .iter()
                    .rfind(|g| g.side == dutyline::model::Side::Suction)
                    .expect("suction");
                let area = std::f64::consts::PI * last_suction.inner_diameter.powi(2) / 4.0;
                let v = d.suction_velocity.expect("velocity");
                assert!((v - d.flow / area).abs() < 1e-12 * v.max(1.0), "{at}");
                // Reynolds ρvD/μ and velocity per segment.
                for (g, seg) in segments.iter().zip(s.segments.iter()) {
                    let v = d.flow / (std::f64::consts::PI * seg.inner_diameter.powi(2) / 4.0);
                    assert!((g.velocity - v).abs() < 1e-12 * v, "{at}");
                    let re = s.fluid.density * v * seg.inner_diameter / s.fluid.viscosity;
                    assert!((g.reynolds - re).abs() < 1e-9 * re, "{at}");
                    assert_eq!(g.fittings_k.len(), seg.fittings.len());
                    if let Some(f) = g.friction_factor {
                        // Darcy-Weisbach: f L/D v²/2g.
                        let h = f * seg.length / seg.inner_diameter * v * v / (2.0 * G0);
                        assert!((g.friction_head - h).abs() < 1e-9 * h.max(1e-9), "{at}");
                    }
                }
                // Hydraulic power ρgQH; input = shaft / (η_motor η_drive).
                let hydraulic = s.fluid.density * G0 * d.flow * d.head;
                assert!(
                    (d.hydraulic_power - hydraulic).abs() < 1e-9 * hydraulic,
                    "{at}"
                );
                let shaft = d.shaft_power.expect("shaft");
                let input = d.input_power.expect("input");
                let expected = shaft / (d.motor_efficiency * d.drive_efficiency);
                assert!((input - expected).abs() < 1e-9 * input, "{at}");
                let w2w = d.wire_to_water_efficiency.expect("w2w");
                assert!((w2w - hydraulic / input).abs() < 1e-9, "{at}");
                let se = d.specific_energy.expect("specific energy");
                assert!((se - input / d.flow).abs() < 1e-9 * se, "{at}");
                // Energy = input power × running hours.
                if let Some(e) = p.energy {
                    assert!(
                        (e.energy_j - input * e.hours * 3600.0).abs() < 1e-6 * e.energy_j.max(1.0),
                        "{at}"
                    );
                }
            }
        }
    }
}

#[test]
fn pressurised_and_vacuum_tanks_enter_npsh_and_static_head_with_their_sign() {
    let base = demo("orchard-lift-rev-a");
    let open = analyse(&base);
    // Source under 10 psig, destination under 5 psig.
    let pressurised = analyse(
        &base
            .replace(
                "tank wet_well { level = 1208.5 ft }",
                "tank wet_well {\n    level = 1208.5 ft\n    pressure = 10 psig\n}",
            )
            .replace(
                "tank reservoir { level = ridge_overflow - 2.5 ft }",
                "tank reservoir {\n    level = ridge_overflow - 2.5 ft\n    pressure = 5 psig\n}",
            ),
    );
    // Source under a vacuum of 5 psi (−5 psig).
    let vacuum = analyse(&base.replace(
        "tank wet_well { level = 1208.5 ft }",
        "tank wet_well {\n    level = 1208.5 ft\n    pressure = -5 psig\n}",
    ));
    let sys = |a: &Analysis| a.cases[0].system.clone().expect("system");
    let (o, p, v) = (sys(&open), sys(&pressurised), sys(&vacuum));
    // Density is evaluated at the source surface's absolute pressure (IAPWS-IF97), so
    // each system has its own ρg.
    let (rho_g, rho_g_p, rho_g_v) = (
        o.fluid.density * G0,
        p.fluid.density * G0,
        v.fluid.density * G0,
    );
    let duty = |a: &Analysis| a.cases[0].pumps[0].duty.clone().expect("duty");
    let (dp, dv) = (duty(&pressurised), duty(&vacuum));
    // Surface pressure head: 10 psi × 6894.757 Pa/psi / (ρ g) = 68 947.57 / (998.9 × 9.80665)
    // = 7.04 m (ρ from IAPWS-IF97 at 64 °F, the engine's; checked in water_reference.rs).
    assert!((dp.npsh_terms.surface_pressure_head - 10.0 * PSI / rho_g_p).abs() < 1e-9);
    assert!((dv.npsh_terms.surface_pressure_head + 5.0 * PSI / rho_g_v).abs() < 1e-9);
    // The barometric term is the same pressure in all three.
    assert!((dp.npsh_terms.barometric_head - o.barometric.pa() / rho_g_p).abs() < 1e-9);
    // Static head: Δz + (p_dest − p_source)/(ρg): 5 − 10 psi lowers it by 5 psi of head;
    // the vacuum on the source raises it by 5 psi of head.
    let dz = o.static_head; // open tanks: the static head is the level difference
    assert!((p.static_head - (dz - 5.0 * PSI / rho_g_p)).abs() < 1e-9);
    assert!((v.static_head - (dz + 5.0 * PSI / rho_g_v)).abs() < 1e-9);
    // Reservoir 1342.0 − 2.5 = 1339.5 ft, wet well 1208.5 ft: 131.0 ft = 39.9288 m.
    assert!((dz - 131.0 * 0.3048).abs() < 1e-9, "{dz}");
    assert!(rho_g > 0.0);
    // The printed terms add up to NPSHa (solved by a separate path) with the surface
    // term's sign: + for the pressurised source, − for the vacuum.
    for d in [&dp, &dv] {
        assert!((d.npsh_terms.sum() - d.npsh_available).abs() < 1e-9);
    }
    // Without station piping, the set's terms are the suction header's.
    assert_eq!(p.npsh_terms(dp.flow), dp.npsh_terms);
    assert!(dp.npsh_available > duty(&open).npsh_available);
    assert!(dv.npsh_available < duty(&open).npsh_available);
}
