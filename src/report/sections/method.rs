//! The method chapter: the equations and correlations the analysis uses, numbered and
//! set as equations, with their sources and the conventions a checker needs.

use crate::display::Units;
use crate::model::ReportUnits;
use crate::report::layout::document::Block;

/// The method chapter.
pub(super) fn chapter(blocks: &mut Vec<Block>, units: &Units) {
    blocks.push(Block::heading(1, "Method"));
    system_head(blocks, units);
    pump_curves(blocks);
    npsh(blocks);
    power_and_energy(blocks);
    blocks.push(Block::text(
        "Viscous liquids: for a liquid other than water the pump-performance viscosity parameter B of ANSI/HI 9.6.7 is computed from each candidate's water best-efficiency point at the case's speed, impeller and viscosity. Above B = 1 the water curve is corrected by the standard's factors: flow C_Q = 2.71^(-0.165 (log10 B)^3.15), head C_H = 1 - (1 - C_Q)(Q_W/Q_BEP-W)^0.75 (shut-off head unchanged), efficiency C_eta = B^-(0.0547 B^0.69), so shaft power is the water value times C_Q C_H / C_eta; these corrected curves give the duty, power, run-out power for motor sizing and energy. NPSH required is the water value at the corresponding water flow (not corrected). The equations are recalled, not checked against an open transcription; a curve from the manufacturer for the liquid governs.",
    ));
}

/// Standard gravity in the package's units (CGPM 1901, a defined value).
fn gravity(units: &Units) -> &'static str {
    match units.system {
        ReportUnits::Us => "g = 32.174 ft/s² (standard gravity, 3rd CGPM 1901, converted exactly)",
        ReportUnits::Si => "g = 9.806 65 m/s² (standard gravity, 3rd CGPM 1901)",
    }
}

/// Energy equation, Darcy-Weisbach, friction factor, Hazen-Williams, minor losses.
fn system_head(blocks: &mut Vec<Block>, units: &Units) {
    equation(
        blocks,
        "The head the pump must add is the energy equation between the two free surfaces, their velocities negligible:",
        "H(Q) = (z₂ − z₁) + (p₂ − p₁)/(ρ·g) + Σ hₗ + Σ hₘ",
    );
    equation(
        blocks,
        format!(
            "where z₁, z₂ are the source and destination surface levels, p₁, p₂ the absolute surface pressures, ρ the density of the case's fluid and {}. Σ hₗ is the wall friction of every segment and Σ hₘ the minor losses (fittings, entrance and exit). Wall friction by Darcy-Weisbach:",
            gravity(units)
        ),
        "hₗ = f · (L/D) · v²/(2·g)",
    );
    equation(
        blocks,
        "with the friction factor f = 64/Re for Re ≤ 2000 (laminar) and, for Re ≥ 4000, Colebrook-White (1939) solved to 10⁻¹³ relative:",
        "1/√f = −2 · log₁₀( ε/(3.7·D) + 2.51/(Re·√f) )",
    );
    equation(
        blocks,
        "In the transition 2000 < Re < 4000 the Churchill (1977) equation is scaled to meet both limits, and a warning marks operation there. Segments given a Hazen-Williams C use Williams and Hazen's equation, valid for water near ordinary temperatures:",
        match units.system {
            ReportUnits::Us => {
                "Δp/L = 4.52 · Q¹·⁸⁵ / (C¹·⁸⁵ · d⁴·⁸⁷)   (psi per foot; Q in US gpm, d in inches)"
            }
            ReportUnits::Si => "hₗ = 10.67 · L · Q¹·⁸⁵² / (C¹·⁸⁵² · D⁴·⁸⁷⁰⁴)   (hₗ, L, D in m; Q in m³/s)",
        },
    );
    blocks.push(Block::text(
        "Minor losses hₘ = K · v²/(2·g) on the velocity of the segment that carries the fitting. K comes from the Darby (1999) 3-K or Hooper (1981) 2-K methods where those papers give constants (K depends on Reynolds number and size), from Borda-Carnot and the Crane TP-410 formulas for expansions and contractions, or is given in the design with its reason. Equivalent lengths are converted with the segment's friction factor.",
    ));
}

/// Curve fits, BEP, affinity laws, arrangements and the duty point.
fn pump_curves(blocks: &mut Vec<Block>) {
    for text in [
        "Pump curves: published head, efficiency, NPSHr and power points are fitted by least squares (quadratic or cubic), or by the Fritsch-Carlson (1980) monotone cubic where a polynomial would not keep head falling with flow; residuals are reported per curve. The best efficiency point (BEP) is the maximum of the efficiency fit. The plots mark the BEP and the preferred operating region of ANSI/HI 9.6.3 (70–120 % of BEP flow); the allowable operating region is the manufacturer's and is not drawn.",
        "Affinity laws: at speed ratio r, Q ∝ r, H ∝ r², P ∝ r³, efficiency unchanged; NPSHr ∝ r² (common practice). Impeller trim uses the constant-width trim law (Q ∝ D, H ∝ D², P ∝ D³), an approximation to be confirmed by the manufacturer. Identical pumps in parallel share the flow, H(Q/n); in series they add head, n·H(Q). Unequal pumps in parallel cannot be described in a design, so whether a weaker pump would run against its shut-off head (deadhead) on a common header is not checked here.",
        "Duty point: the largest-flow crossing of pump (or arrangement) head and system head, found by a 200-interval scan and Brent's (1973) method to 10⁻¹⁰ relative. Variable-speed pumps are set to the speed that meets the case's flow requirement.",
    ] {
        blocks.push(Block::text(text));
    }
}

/// NPSH available, its datum, NPSH3 and the margin guidance.
fn npsh(blocks: &mut Vec<Block>) {
    equation(
        blocks,
        "NPSH available at the pump's datum, all heads in the case's fluid:",
        "NPSHa = pₐ/(ρ·g) + pₛ/(ρ·g) + (zₛ − zₚ) − hₗₛ − hₘₛ − pᵥ/(ρ·g)",
    );
    blocks.push(Block::text(
        "where pₐ is the barometric pressure, pₛ the gauge pressure on the source surface, zₛ the source surface level, zₚ the NPSH datum of the pump, hₗₛ and hₘₛ the friction and minor losses of the suction side, and pᵥ the vapour pressure at the case's temperature. The datum is the pump's own: the shaft centreline for a horizontal pump, the eye of the first-stage impeller for a vertical one. Published NPSHr is NPSH3, the NPSH at which the first-stage head has dropped by 3 %: at a ratio NPSHa/NPSHr of 1.0 the pump is already cavitating enough to lose head, and damage may begin well above it. The margins required follow ANSI/HI 9.6.1 (NPSH margin guideline) unless the design states its own.",
    ));
}

/// Hydraulic, shaft and input power, energy and the life-cycle cost convention.
fn power_and_energy(blocks: &mut Vec<Block>) {
    equation(
        blocks,
        "Power at each duty point: hydraulic power Pₕ, shaft power Pₛ at pump efficiency ηₚ, and electrical input power Pₑ at motor efficiency ηₘ and variable-speed drive efficiency ηᵥ (1 without a drive):",
        "Pₕ = ρ·g·Q·H,    Pₛ = Pₕ / ηₚ,    Pₑ = Pₛ / (ηₘ · ηᵥ)",
    );
    equation(
        blocks,
        "Energy per year is the sum over the cases of Pₑ × the case's hours. The life-cycle energy cost is the present worth of the yearly energy cost A (at today's prices), escalating at e per year and discounted at i per year over N years, the first payment at the end of year 1 (Hydraulic Institute and Europump, Pump Life Cycle Costs, 2001):",
        "LCCₑ = Σₙ₌₁ᴺ A·(1 + e)ⁿ/(1 + i)ⁿ = A · ((1 + i′)ᴺ − 1) / (i′ · (1 + i′)ᴺ)",
    );
    blocks.push(Block::text(
        "with i′ = (1 + i)/(1 + e) − 1. With i′ = 0 the factor is N; without a discount rate the life cost is N × A, undiscounted.",
    ));
}

/// A sentence that introduces an equation (naming its source), then the equation set
/// on its own line; the layout numbers equations "(N)" in order.
fn equation(blocks: &mut Vec<Block>, lead_in: impl Into<String>, formula: &str) {
    blocks.push(Block::text(lead_in));
    blocks.push(Block::Equation(formula.into()));
}
