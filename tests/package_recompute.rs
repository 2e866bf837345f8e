//! A checker with only the PDF: the demo packages are read back (text of every page,
//! through lopdf) and a duty head, a friction and a minor head, an NPSHa, the hydraulic,
//! shaft and input power, and the yearly and life-cycle energy cost are recomputed
//! from the printed numbers alone, by the equations the package itself prints
//! (Darcy-Weisbach, Colebrook 1939, equation 5 for NPSHa, ρ·g·Q·H, the present-worth
//! factor of Pump Life Cycle Costs, HI/Europump 2001). Each comparison allows only the
//! rounding of the printed inputs, worked out term by term.

mod report_common;

use report_common::pdftext::page_texts;

struct DemoFiles;
impl dutyline::FileAccess for DemoFiles {
    fn read_text(&self, path: &str) -> Result<String, dutyline::model::FileError> {
        std::fs::read_to_string(format!("examples-demo/{path}"))
            .map_err(|e| dutyline::model::FileError::Unreadable(e.to_string()))
    }
}

/// The text lines of the demo's package, every page, in stream order.
fn package_lines(demo: &str) -> Vec<String> {
    let src = std::fs::read_to_string(format!("examples-demo/{demo}.duty")).unwrap();
    let d = dutyline::check(&src, &DemoFiles)
        .design
        .expect("valid demo");
    let a = dutyline::analysis::analyse(&d);
    let style =
        dutyline::report::layout::style::Style::builtin(dutyline::report::builtin_style_for(&d))
            .unwrap();
    let pdf = dutyline::report::render_pdf(&d, &a, &src, &style, None).unwrap();
    page_texts(&pdf)
        .unwrap()
        .iter()
        .flat_map(|p| p.lines().map(str::to_string).collect::<Vec<_>>())
        .collect()
}

/// A printed number: minus sign U+2212, a unit or "%" after it, "2.870 × 10⁵".
fn num(cell: &str) -> f64 {
    let cell = cell.replace('\u{2212}', "-");
    if let Some((mantissa, power)) = cell.split_once(" × 10") {
        let exp: String = power
            .chars()
            .map(|c| match c {
                '⁰' => '0',
                '¹' => '1',
                '²' => '2',
                '³' => '3',
                '⁴' => '4',
                '⁵' => '5',
                '⁶' => '6',
                '⁷' => '7',
                '⁸' => '8',
                '⁹' => '9',
                '⁻' => '-',
                _ => ' ',
            })
            .filter(|c| *c != ' ')
            .collect();
        return mantissa.trim().parse::<f64>().unwrap() * 10f64.powi(exp.parse().unwrap());
    }
    let first = cell.split_whitespace().next().unwrap_or("");
    first
        .parse()
        .unwrap_or_else(|_| panic!("not a number: {cell:?}"))
}

/// Half a unit of the last printed digit of a cell: the rounding it carries.
fn half_ulp(cell: &str) -> f64 {
    let first = cell.split_whitespace().next().unwrap_or("");
    let mantissa = first.split(" × ").next().unwrap_or(first);
    match mantissa.split_once('.') {
        Some((_, decimals)) => 0.5 * 10f64.powi(-(decimals.len() as i32)),
        None => 0.5,
    }
}

/// The index of the first line starting with `caption` (a table caption after its
/// "Table n" label), panicking with the caption when the package lacks it.
fn caption_at(lines: &[String], caption: &str, from: usize) -> usize {
    lines[from..]
        .iter()
        .position(|l| l.starts_with(caption))
        .map(|i| i + from)
        .unwrap_or_else(|| panic!("no table captioned {caption:?}"))
}

/// The `n` cells after the first row of the table captioned `caption` whose leading
/// cells are `labels`.
fn row(lines: &[String], caption: &str, labels: &[&str], n: usize) -> Vec<String> {
    let start = caption_at(lines, caption, 0);
    let at = (start..lines.len())
        .find(|&i| {
            labels
                .iter()
                .enumerate()
                .all(|(k, l)| lines.get(i + k).map(String::as_str) == Some(*l))
        })
        .unwrap_or_else(|| panic!("no row {labels:?} after {caption:?}"));
    lines[at + labels.len()..at + labels.len() + n].to_vec()
}

/// Count and K each of a fitting row of the fittings table: the first whole number after
/// the segment label is the count (the description may wrap), the next cell is K.
fn fittings_of(lines: &[String], segment: &str) -> Vec<(f64, f64)> {
    let start = caption_at(lines, ": K values at the first duty flow", 0);
    let end = caption_at(lines, ": Operating cases", start);
    let mut out = Vec::new();
    for i in start..end {
        if lines[i] != segment {
            continue;
        }
        let count = (i + 1..end)
            .find(|&j| !lines[j].is_empty() && lines[j].chars().all(|c| c.is_ascii_digit()))
            .expect("a count");
        out.push((num(&lines[count]), num(&lines[count + 1])));
    }
    out
}

/// Colebrook (1939): 1/√f = −2 log₁₀(ε/(3.7 D) + 2.51/(Re √f)), by fixed-point iteration.
fn colebrook(re: f64, relative_roughness: f64) -> f64 {
    let mut x: f64 = 8.0;
    for _ in 0..100 {
        x = -2.0 * (relative_roughness / 3.7 + 2.51 * x / re).log10();
    }
    1.0 / (x * x)
}

/// Within `tol`, with the numbers in the message.
fn close(what: &str, recomputed: f64, printed: f64, tol: f64) {
    assert!(
        (recomputed - printed).abs() <= tol,
        "{what}: recomputed {recomputed} against printed {printed} (allowed ±{tol})"
    );
}

/// Standard gravity, ft/s² (9.806 65 m/s² / 0.3048 m/ft, 3rd CGPM 1901).
const G_FT: f64 = 9.80665 / 0.3048;
/// US gallon in ft³ (231 in³, NIST SP 811 Appendix B).
const GAL_FT3: f64 = 231.0 / 1728.0;
/// Horsepower in ft·lbf/s (NIST SP 811 Appendix B).
const HP_FT_LBF_S: f64 = 550.0;
/// Horsepower in kW (NIST SP 811 Appendix B: 745.699 87 W).
const HP_KW: f64 = 0.745_699_87;

#[test]
fn us_duty_head_is_the_static_head_plus_the_printed_segment_losses() {
    let lines = package_lines("orchard-lift-rev-a");
    // Table 3: source, destination, pump datum, surface pressures, static head.
    let levels = row(&lines, ": Surface levels, pump datum", &["normal"], 5);
    let static_head = num(&levels[1]) - num(&levels[0]);
    close("static head", static_head, num(&levels[4]), 0.11);
    // Segments at the duty of A in case normal: flow, velocity, Re, f, friction, minor.
    let caption = ": Each segment at the duty flow";
    let mut sum = 0.0;
    let mut rounding = 0.0;
    for seg in ["suction 1", "discharge 1", "discharge 2"] {
        let cells = row(&lines, caption, &["normal", seg], 7);
        sum += num(&cells[4]) + num(&cells[5]);
        rounding += half_ulp(&cells[4]) + half_ulp(&cells[5]);
    }
    let duty = row(
        &lines,
        ": Flow, head and power are for the whole",
        &["normal"],
        3,
    );
    let head = num(&duty[2]);
    close(
        "duty head of A, case normal",
        num(&levels[4]) + sum,
        head,
        half_ulp(&levels[4]) + rounding + half_ulp(&duty[2]),
    );
}

#[test]
fn us_friction_and_minor_heads_follow_from_the_printed_pipe_and_flow() {
    let lines = package_lines("orchard-lift-rev-a");
    let seg = row(&lines, ": Segments as in case", &["discharge 2"], 5);
    let (d_in, length_ft, roughness_in) = (num(&seg[1]), num(&seg[2]), num(&seg[3]));
    let d_ft = d_in / 12.0;
    let fluid = row(&lines, ": Fluid properties and barometric", &["normal"], 6);
    let (rho_lb_ft3, mu_cp) = (num(&fluid[2]), num(&fluid[3]));
    let duty = row(
        &lines,
        ": Flow, head and power are for the whole",
        &["normal"],
        3,
    );
    let q_ft3_s = num(&duty[1]) * GAL_FT3 / 60.0;
    let cells = row(
        &lines,
        ": Each segment at the duty flow",
        &["normal", "discharge 2"],
        7,
    );
    // Velocity Q/A, A = πD²/4; the flow carries ±0.5 gpm of 768.
    let v = q_ft3_s / (std::f64::consts::PI * d_ft * d_ft / 4.0);
    close("velocity", v, num(&cells[1]), 0.01);
    // Reynolds ρvD/μ; 1 cP = 6.719 69e-4 lb/(ft·s) (NIST SP 811 Appendix B).
    let re = rho_lb_ft3 * num(&cells[1]) * d_ft / (mu_cp * 6.719_69e-4);
    close("Reynolds number", re, num(&cells[2]), 2e-3 * re);
    // Colebrook at the printed Re and roughness.
    let f = colebrook(num(&cells[2]), roughness_in / d_in);
    close("friction factor", f, num(&cells[3]), 5e-3 * f);
    // Darcy-Weisbach (equation 2) at the printed f and v: the velocity's rounding
    // (±0.005 ft/s of 4.97) is ±0.2 % of the head, the length's ±0.02 %.
    let vv = num(&cells[1]);
    let hf = num(&cells[3]) * length_ft / d_ft * vv * vv / (2.0 * G_FT);
    close("friction head", hf, num(&cells[4]), 2.5e-3 * hf);
    // Minor head of discharge 1: ΣK·n · v²/(2g) with the counts and K of the fittings table.
    let d1 = row(
        &lines,
        ": Each segment at the duty flow",
        &["normal", "discharge 1"],
        7,
    );
    let sum_k: f64 = fittings_of(&lines, "discharge 1")
        .iter()
        .map(|(n, k)| n * k)
        .sum();
    let v1 = num(&d1[1]);
    let hm = sum_k * v1 * v1 / (2.0 * G_FT);
    close(
        "minor head, discharge 1",
        hm,
        num(&d1[5]),
        2.0e-3 * hm + 0.0015,
    );
}

#[test]
fn npsha_follows_from_the_printed_pressures_levels_and_suction_losses() {
    // US demo, case normal, pump A: heads in ft from psi (lbf/in²) and lb/ft³ at
    // standard gravity, where a pound of mass weighs a pound-force.
    let lines = package_lines("orchard-lift-rev-a");
    let fluid = row(&lines, ": Fluid properties and barometric", &["normal"], 6);
    let rho = num(&fluid[2]);
    let (p_v, p_a) = (num(&fluid[4]) * 144.0, num(&fluid[5]) * 144.0);
    let levels = row(&lines, ": Surface levels, pump datum", &["normal"], 5);
    let static_suction = num(&levels[0]) - num(&levels[2]);
    let suction = row(
        &lines,
        ": Each segment at the duty flow",
        &["normal", "suction 1"],
        7,
    );
    let npsha = p_a / rho + static_suction - p_v / rho - num(&suction[4]) - num(&suction[5]);
    let terms = row(&lines, ": Heads in ft of the case's fluid", &["normal"], 10);
    // Pressures ±0.005 psi are ±0.012 ft each; the result is printed to 0.1 ft.
    close(
        "NPSHa of A, case normal",
        npsha,
        num(&terms[6]),
        0.03 + 0.05,
    );
    let sum: f64 = terms[..6].iter().map(|c| num(c)).sum();
    close(
        "NPSHa as the sum of its printed terms",
        sum,
        num(&terms[6]),
        6.0 * 0.05 + 0.05,
    );
    close(
        "margin ratio",
        num(&terms[6]) / num(&terms[7]),
        num(&terms[8]),
        0.03,
    );

    // SI demo, case average, pump KR1: heads in m, g = 9.806 65 m/s².
    let lines = package_lines("kestrel-booster");
    let fluid = row(&lines, ": Fluid properties and barometric", &["average"], 6);
    let rho = num(&fluid[2]);
    let (p_v, p_a) = (num(&fluid[4]) * 1e3, num(&fluid[5]) * 1e3);
    let levels = row(&lines, ": Surface levels, pump datum", &["average"], 5);
    let static_suction = num(&levels[0]) - num(&levels[2]);
    let terms = row(&lines, ": Heads in m of the case's fluid", &["average"], 10);
    let g = 9.80665;
    close("barometric head", p_a / (rho * g), num(&terms[0]), 0.006);
    close(
        "vapour pressure head",
        -p_v / (rho * g),
        num(&terms[3]),
        0.006,
    );
    let npsha =
        p_a / (rho * g) + static_suction - p_v / (rho * g) + num(&terms[4]) + num(&terms[5]);
    close(
        "NPSHa of KR1, case average",
        npsha,
        num(&terms[6]),
        0.015 + 0.005,
    );
}

#[test]
fn power_follows_from_the_printed_flow_head_density_and_efficiencies() {
    // US: P = ρ·g·Q·H with ρg in lbf/ft³, Q in ft³/s, H in ft, over 550 ft·lbf/s per hp.
    let lines = package_lines("orchard-lift-rev-a");
    let fluid = row(&lines, ": Fluid properties and barometric", &["normal"], 6);
    let duty = row(
        &lines,
        ": Flow, head and power are for the whole",
        &["normal"],
        10,
    );
    let (q, h) = (num(&duty[1]) * GAL_FT3 / 60.0, num(&duty[2]));
    let hydraulic = num(&fluid[2]) * q * h / HP_FT_LBF_S;
    let power = row(&lines, ": Whole arrangement at each duty", &["normal"], 10);
    // Flow ±0.5 gpm of 768 is ±0.07 %; head and density less.
    close(
        "hydraulic power of A",
        hydraulic,
        num(&power[0]),
        1.2e-3 * hydraulic,
    );
    let shaft = num(&power[0]) / (num(&power[2]) / 100.0);
    close(
        "shaft power of A",
        shaft,
        num(&power[1]),
        1.0e-3 * shaft + 0.005,
    );
    assert_eq!(power[4], "none", "no drive on A");
    let input = num(&power[1]) / (num(&power[3]) / 100.0);
    close("input power of A", input, num(&power[5]), 1.0e-3 * input);
    close(
        "shaft power in the duty table",
        num(&duty[7]),
        num(&power[1]),
        0.0,
    );

    // SI: P = ρ·g·Q·H in kW, and a variable-speed drive in the input power.
    let lines = package_lines("kestrel-booster");
    let fluid = row(&lines, ": Fluid properties and barometric", &["average"], 6);
    let duty = row(
        &lines,
        ": Flow, head and power are for the whole",
        &["average"],
        10,
    );
    let (q, h) = (num(&duty[1]) / 3600.0, num(&duty[2]));
    let hydraulic = num(&fluid[2]) * 9.80665 * q * h / 1e3;
    let power = row(&lines, ": Whole arrangement at each duty", &["average"], 10);
    close(
        "hydraulic power of KR1",
        hydraulic,
        num(&power[0]),
        5e-4 * hydraulic,
    );
    let input = num(&power[1]) / (num(&power[3]) / 100.0 * num(&power[4]) / 100.0);
    close(
        "input power of KR1 with its drive",
        input,
        num(&power[5]),
        1.2e-3 * input,
    );
}

#[test]
fn energy_and_life_cycle_cost_follow_from_the_printed_powers_hours_and_price() {
    // Revision B: its energy comes from hours per case (revision A has a load profile,
    // whose yearly energy is recomputed in tests/operation_profile.rs).
    let lines = package_lines("orchard-lift-rev-b");
    // Energy per year of A: Σ input power × hours over the cases (Table 14).
    let mut energy_kwh = 0.0;
    let mut rounding = 0.0;
    for case in ["normal", "low_river", "aged", "low_aged", "drought"] {
        let p = row(&lines, ": Whole arrangement at each duty", &[case], 10);
        let (input_hp, hours) = (num(&p[5]), num(&p[8]));
        energy_kwh += input_hp * HP_KW * hours;
        rounding += (0.005 * hours + 0.5 * input_hp) * HP_KW;
    }
    // A ranks second: B is within 0.3 % of it (a close call, see the package).
    let ranking = row(&lines, ": Ranking of the candidates", &["2", "A"], 7);
    close(
        "energy per year of A",
        energy_kwh,
        num(&ranking[1]),
        rounding + 0.5,
    );
    // Cost per year = energy × the price the basis states; life cost = A × PWF.
    let basis: String = lines.join(" ");
    let price = basis
        .split(" at ")
        .find_map(|s| s.strip_suffix_any_price())
        .expect("the basis states the energy price");
    let cost = num(&ranking[1]) * price;
    close(
        "cost per year of A",
        cost,
        num(&ranking[3]),
        0.5 * price + 0.5,
    );
    let (years, i, e) = (20.0, 0.05, 0.0); // "over 20 years, discounted at 5.0 % with 0.0 %"
    assert!(basis.contains("over 20 years, discounted at 5.0 % with 0.0 % energy-price escalation"));
    let i_net: f64 = (1.0 + i) / (1.0 + e) - 1.0;
    let pwf = ((1.0 + i_net).powf(years) - 1.0) / (i_net * (1.0 + i_net).powf(years));
    close(
        "life energy cost of A",
        num(&ranking[3]) * pwf,
        num(&ranking[4]),
        0.5 * pwf + 0.5,
    );
    // Life cost per 1000 gal: life cost ÷ (years × volume per year in 1000 gal).
    let per_volume = num(&ranking[4]) / (years * num(&ranking[0]));
    close(
        "life cost per 1000 gal of A",
        per_volume,
        num(&ranking[5]),
        5e-6 + 1e-5 * per_volume,
    );
}

/// The price in "0.118 USD/kWh over 20 years ...".
trait PriceText {
    fn strip_suffix_any_price(&self) -> Option<f64>;
}
impl PriceText for str {
    fn strip_suffix_any_price(&self) -> Option<f64> {
        let mut words = self.split_whitespace();
        let value = words.next()?.parse().ok()?;
        words.next()?.ends_with("/kWh").then_some(value)
    }
}
