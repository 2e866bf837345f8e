//! The references chapter: the publications the calculation relies on, each once,
//! saying which values were recalled rather than read from the document, and which
//! recalled tables the test suite cross-checks against an open transcription.

use std::collections::BTreeSet;

use crate::analysis::network::Element;
use crate::analysis::Analysis;
use crate::model::{Adjust, Design, Fluid, MotorStandardChoice};
use crate::report::layout::document::{Align, Block, Column};

/// When the calculation relies on a reference, so that the chapter lists only what this
/// design used (a reviewer checks every listed source; an unused one is noise).
#[derive(Clone, Copy)]
enum When {
    /// Every design.
    Always,
    /// A pipe by Darcy-Weisbach (roughness).
    Darcy,
    /// A pipe by Hazen-Williams.
    HazenWilliams,
    /// A pipe of one of these materials (keywords).
    Material(&'static [&'static str]),
    /// A liquid other than water (the viscosity screen and correction).
    Viscous,
    /// A duty envelope (`uncertainty`).
    Envelope,
    /// Motors sized to NEMA.
    Nema,
    /// Motors sized to IEC.
    Iec,
    /// A variable-speed candidate (drive losses).
    Drive,
    /// A network beyond the chain.
    Network,
    /// A valve by flow coefficient.
    Valves,
    /// A well's drawdown.
    Wells,
    /// Station piping per pump.
    StationPiping,
    /// The safety screen (ratings, wave speed, surge).
    Safety,
    /// The safety screen's pressure rating of a pipe of one of these materials.
    Rating(&'static [&'static str]),
}

/// What a design and its analysis use, for [`When`].
struct Uses {
    materials: BTreeSet<&'static str>,
    darcy: bool,
    hazen_williams: bool,
    viscous: bool,
    envelope: bool,
    nema: bool,
    drive: bool,
    network: bool,
    valves: bool,
    wells: bool,
    station_piping: bool,
    safety: bool,
}

impl Uses {
    fn of(design: &Design, analysis: &Analysis) -> Uses {
        let systems = || analysis.cases.iter().filter_map(|c| c.system.as_ref());
        let links = || {
            systems()
                .filter_map(|s| s.network.as_ref())
                .flat_map(|(n, _)| n.network.links.iter())
        };
        let network_segments = links().flat_map(|l| match &l.element {
            Element::Pipe(run) => run.segments.as_slice(),
            _ => &[],
        });
        let segments: Vec<_> = systems()
            .flat_map(|s| s.segments.iter())
            .chain(network_segments)
            .collect();
        Uses {
            materials: segments.iter().map(|s| s.material).collect(),
            darcy: segments.iter().any(|s| s.hazen_williams_c.is_none()),
            hazen_williams: segments.iter().any(|s| s.hazen_williams_c.is_some()),
            viscous: systems().any(|s| !s.fluid.is_water()),
            envelope: design.uncertainty.is_some(),
            nema: matches!(design.motor.standard, MotorStandardChoice::Nema),
            drive: design
                .pumps
                .iter()
                .any(|p| matches!(p.adjust, Adjust::Speed { .. })),
            network: systems().any(|s| s.network.is_some()),
            valves: links().any(|l| matches!(l.element, Element::Valve(_))),
            wells: systems().any(|s| s.well.is_some())
                || links().any(|l| matches!(l.element, Element::Drawdown(_))),
            station_piping: segments.iter().any(|s| s.per_pump),
            safety: analysis.safety.cases.iter().any(|c| c.screened()),
        }
    }

    fn relies_on(&self, when: When) -> bool {
        match when {
            When::Always => true,
            When::Darcy => self.darcy,
            When::HazenWilliams => self.hazen_williams,
            When::Material(keys) => keys.iter().any(|k| self.materials.contains(k)),
            When::Viscous => self.viscous,
            When::Envelope => self.envelope,
            When::Nema => self.nema,
            When::Iec => !self.nema,
            When::Drive => self.drive,
            When::Network => self.network,
            When::Valves => self.valves,
            When::Wells => self.wells,
            When::StationPiping => self.station_piping,
            When::Safety => self.safety,
            When::Rating(keys) => self.safety && self.relies_on(When::Material(keys)),
        }
    }
}

/// How a reference's values came into the tool.
#[derive(Clone, Copy, PartialEq, Eq)]
enum Provenance {
    /// An equation or method, implemented from the publication.
    Method,
    /// Tabulated values or limits recalled, not read from the document in hand.
    Recalled,
    /// Recalled, and cross-checked against an open transcription of the same table.
    RecalledCrossChecked,
}

impl Provenance {
    fn text(self) -> &'static str {
        match self {
            Provenance::Method => "equation implemented from the publication",
            Provenance::Recalled => "values recalled; confirm against the edition in force",
            Provenance::RecalledCrossChecked => {
                "values recalled; confirm against the edition in force; cross-checked against an open transcription (below)"
            }
        }
    }
}

/// A reference: publication (title, edition, table or clause), what it supplies, when
/// the calculation relies on it, and how its values came in.
type Reference = (&'static str, &'static str, When, Provenance);

/// The references (listed where the design uses them: [`When`]).
const REFERENCES: [Reference; 42] = [
    ("IAPWS R7-97(2012), Revised Release on the IAPWS Industrial Formulation 1997 for the Thermodynamic Properties of Water and Steam (IAPWS-IF97).", "density, vapour pressure", When::Always, Provenance::Method),
    ("IAPWS R12-08(2008), Release on the IAPWS Formulation 2008 for the Viscosity of Ordinary Water Substance.", "viscosity", When::Always, Provenance::Method),
    ("U.S. Standard Atmosphere, 1976. NOAA, NASA, USAF, Washington D.C.; ISO 2533:1975 Standard Atmosphere.", "barometric pressure at the site elevation", When::Always, Provenance::Method),
    ("BIPM, 3rd CGPM (1901), declaration on the unit of mass and the definition of weight; standard acceleration of gravity; NIST SP 330 (2019).", "g = standard gravity", When::Always, Provenance::Method),
    ("Colebrook, C.F. (1939), Turbulent flow in pipes, with particular reference to the transition region between the smooth and rough pipe laws. J. Inst. Civil Eng. 11, 133–156.", "turbulent friction factor, equation (3)", When::Darcy, Provenance::Method),
    ("Churchill, S.W. (1977), Friction-factor equation spans all fluid-flow regimes. Chemical Engineering 84(24), 91–92.", "friction factor in the transition", When::Darcy, Provenance::Method),
    ("Moody, L.F. (1944), Friction factors for pipe flow. Trans. ASME 66, 671–684, Fig. 2.", "absolute roughness of new pipe materials", When::Darcy, Provenance::Recalled),
    ("Williams, G.S. and Hazen, A. (1920), Hydraulic Tables, 3rd ed. Wiley, New York.", "Hazen-Williams equation and C values, equation (4)", When::HazenWilliams, Provenance::Recalled),
    ("AWWA Manual M41, Ductile-Iron Pipe and Fittings.", "C of cement-mortar-lined ductile iron", When::Material(&["ductile_iron", "cement_lined_ductile_iron"]), Provenance::Recalled),
    ("Uni-Bell PVC Pipe Association, Handbook of PVC Pipe: Design and Construction.", "C of PVC pipe", When::Material(&["pvc"]), Provenance::Recalled),
    ("Plastics Pipe Institute, Handbook of Polyethylene Pipe, 2nd ed. (2008), ch. 6.", "roughness and C of PE pipe", When::Material(&["hdpe"]), Provenance::Recalled),
    ("Hooper, W.B. (1981), The two-K method predicts head losses in pipe fittings. Chemical Engineering, 24 August 1981, 96–100.", "K of fittings and entrances (2-K)", When::Always, Provenance::RecalledCrossChecked),
    ("Darby, R. (1999), Correlate pressure drops through fittings. Chemical Engineering 106(7), July 1999, 101–104; Darby, R. (2001), Chemical Engineering Fluid Mechanics, 2nd ed., Marcel Dekker, ch. 7.", "K of fittings and valves (3-K)", When::Always, Provenance::RecalledCrossChecked),
    ("Crane Co. (2009), Flow of Fluids through Valves, Fittings and Pipe, Technical Paper No. 410, Appendix A (resistance coefficients K).", "K of foot valves, size changes, entrance and exit", When::Always, Provenance::RecalledCrossChecked),
    ("ASME B36.10M, Welded and Seamless Wrought Steel Pipe; ASME B36.19M, Stainless Steel Pipe: dimension tables.", "outside diameters and walls of steel pipe", When::Material(&["steel", "stainless", "galvanized"]), Provenance::RecalledCrossChecked),
    ("ASTM D1785, PVC Plastic Pipe, Schedules 40, 80 and 120; ASTM F714 and D3035, PE pipe (DR-PR) based on outside diameter.", "outside diameters and walls of plastic pipe", When::Material(&["pvc", "hdpe"]), Provenance::RecalledCrossChecked),
    ("ASTM B88, Seamless Copper Water Tube; AWWA C151/A21.51, Ductile-Iron Pipe, Centrifugally Cast.", "dimensions of copper tube and ductile iron pipe", When::Material(&["copper", "ductile_iron", "cement_lined_ductile_iron"]), Provenance::Recalled),
    ("Fritsch, F.N. and Carlson, R.E. (1980), Monotone piecewise cubic interpolation. SIAM J. Numer. Anal. 17(2), 238–246.", "monotone curve fit", When::Always, Provenance::Method),
    ("Brent, R.P. (1973), Algorithms for Minimization without Derivatives. Prentice-Hall, ch. 4.", "duty-point root finding", When::Always, Provenance::Method),
    ("ANSI/HI 9.6.1-2017, Rotodynamic Pumps — Guideline for NPSH Margin. Hydraulic Institute (edition from memory).", "NPSH margin ratios (1.1–2.0 for general water services); NPSH3 definition", When::Always, Provenance::Recalled),
    ("ANSI/HI 9.6.3-2017, Rotodynamic Pumps — Guideline for Operating Regions. Hydraulic Institute (edition from memory).", "preferred operating region 70–120 % of BEP flow; rising head curves", When::Always, Provenance::Recalled),
    ("ANSI/HI 9.6.7-2015, Rotodynamic Pumps — Guideline for Effects of Liquid Viscosity on Performance. Hydraulic Institute (edition from memory).", "viscosity parameter B; correction factors C_Q, C_H, C_eta (equations recalled)", When::Viscous, Provenance::Recalled),
    ("ISO 9906:2012, Rotodynamic pumps — Hydraulic performance acceptance tests — Grades 1, 2 and 3.", "acceptance grades, Table 8 tolerance factors: duty envelopes", When::Envelope, Provenance::Recalled),
    ("NEMA MG 1, Motors and Generators, Parts 12, 30 and 31 (ratings, service factor, inverter-fed motors).", "standard ratings and service factor", When::Nema, Provenance::Recalled),
    ("IEC 60034-1, Rotating electrical machines — Part 1: Rating and performance (duty type S1).", "continuous rating", When::Iec, Provenance::Recalled),
    ("IEC 60072-1, Dimensions and output series for rotating electrical machines — Part 1.", "standard output ratings", When::Iec, Provenance::Recalled),
    ("Hydraulic Institute and Europump (2001), Pump Life Cycle Costs: A Guide to LCC Analysis for Pumping Systems.", "life-cycle cost, equation (7)", When::Always, Provenance::Method),
    ("Washington State Energy Office (1993), Energy-Efficient Electric Motor Selection Handbook; reproduced in U.S. DOE (1997), Determining Electric Motor Load and Efficiency, DOE/GO-10097-517, Figure 2.", "typical motor part-load efficiency as a share of full-load efficiency", When::Always, Provenance::RecalledCrossChecked),
    ("U.S. DOE (2012), Adjustable Speed Drive Part-Load Efficiency, Motor Systems Tip Sheet #11, Table 1.", "drive efficiency against load and rating (losses at part load)", When::Drive, Provenance::RecalledCrossChecked),
    ("IEC 61800-9-2:2017, Adjustable speed electrical power drive systems — Part 9-2: Ecodesign — Energy efficiency indicators, eight reference operating points.", "reference points of relative frequency and torque at which drive losses are declared", When::Drive, Provenance::Recalled),
    ("Todini, E. and Pilati, S. (1988), A gradient algorithm for the analysis of pipe networks. In Coulbeck, B. and Orr, C.-H. (eds), Computer Applications in Water Supply, Vol. 1, Research Studies Press, 1–20.", "network solve (global gradient algorithm)", When::Network, Provenance::Method),
    ("IEC 60534-2-1:2011, Industrial-process control valves — Part 2-1: Flow capacity — Sizing equations for fluid flow under installed conditions.", "valve flow coefficients Kv and Cv", When::Valves, Provenance::Recalled),
    ("Jacob, C.E. (1947), Drawdown test to determine effective radius of artesian well. Trans. ASCE 112, 1047–1070.", "well drawdown s = BQ + CQ²", When::Wells, Provenance::Method),
    ("Sanks, R.L. (ed.) (1998), Pumping Station Design, 2nd ed. Butterworth-Heinemann.", "modified pump curve (each pump's own station piping)", When::StationPiping, Provenance::Recalled),
    ("Korteweg, D.J. (1878), Über die Fortpflanzungsgeschwindigkeit des Schalles in elastischen Röhren. Annalen der Physik 241(12), 525–542; Wylie, E.B. and Streeter, V.L. (1993), Fluid Transients in Systems. Prentice Hall, ch. 2.", "pressure-wave speed and pipe restraint factors", When::Safety, Provenance::Recalled),
    ("Joukowsky, N. (1900), Über den hydraulischen Stoss in Wasserleitungsröhren. Mém. Acad. Imp. Sci. St.-Pétersbourg 9(5); Michaud, J. (1878), Coups de bélier dans les conduites. Bull. Soc. Vaudoise Ing. Arch. 4.", "surge head of a sudden and of a slow flow change", When::Safety, Provenance::Method),
    ("AWWA C150/A21.50, Thickness Design of Ductile-Iron Pipe; AWWA C104/A21.4, Cement-Mortar Lining for Ductile-Iron Pipe and Fittings.", "ductile iron pressure classes; lining thickness", When::Rating(&["ductile_iron", "cement_lined_ductile_iron"]), Provenance::Recalled),
    ("AWWA C900-16, Polyvinyl Chloride (PVC) Pressure Pipe and Fabricated Fittings, 4 In. Through 60 In.; AWWA Manual M23, PVC Pipe — Design and Installation.", "PVC pressure class, short-term rating, recurring-surge fatigue", When::Rating(&["pvc"]), Provenance::Recalled),
    ("AWWA Manual M11, Steel Pipe — A Guide for Design and Installation; ASME B31.3, Process Piping, 304.1.2 and Table A-1.", "steel pipe pressure design", When::Rating(&["steel", "stainless", "galvanized"]), Provenance::Recalled),
    ("ASME B16.5, Pipe Flanges and Flanged Fittings (group 1.1); ASME B16.1, Gray Iron Pipe Flanges and Flanged Fittings; AWWA C207, Steel Pipe Flanges for Waterworks Service.", "flange pressure–temperature ratings", When::Safety, Provenance::Recalled),
    ("IEC 60034-30-1:2014, Rotating electrical machines — Part 30-1: Efficiency classes of line operated AC motors (IE code).", "motor full-load efficiency by class, 50 and 60 Hz", When::Always, Provenance::Recalled),
    ("NIST Special Publication 811 (2008), Guide for the Use of the International System of Units, Appendix B.", "unit conversion factors", When::Always, Provenance::Method),
];

/// The open transcriptions the recalled tables were compared with, and what was not.
const CROSS_CHECKS: &str = "Cross-checks: the tool's test suite compares the recalled fitting constants (Hooper 2-K, Darby 3-K, Crane foot valves, size changes and entrances) and the pipe dimension tables (ASME B36.10M and B36.19M, ASTM D1785, PE by DR), the typical motor part-load curve (WSEO 1993) and the drive part-load table (DOE Tip Sheet #11) with the open transcriptions of the same tables in the Python fluids package (Caleb Bell et al.), and checks that each material's new and aged roughness gives the friction factor implied by its Hazen-Williams C. A transcription is a second reading of the same publication, not a source: where they differ, the publication governs. The Hazen-Williams C values, the NPSH margin and operating-region limits and the motor tables are recalled without such a cross-check.";

/// The glycol reference, listed (last) only when the design pumps a glycol mixture.
const MELINDER: Reference = (
    "Melinder, Å. (2010), Properties of Secondary Working Fluids for Indirect Systems, 2nd ed., International Institute of Refrigeration, Paris: the fits for aqueous ethylene and propylene glycol.",
    "glycol density, viscosity and freezing point",
    When::Always,
    Provenance::Method,
);

/// The references chapter: the publications this design relies on, numbered in the
/// fixed order of [`REFERENCES`].
pub(super) fn chapter(blocks: &mut Vec<Block>, design: &Design, analysis: &Analysis) {
    let uses = Uses::of(design, analysis);
    let glycol = matches!(design.base.fluid, Fluid::Glycol(_)).then_some(&MELINDER);
    blocks.push(Block::heading(1, "References"));
    blocks.push(Block::Table {
        columns: vec![
            Column::new("No.", 0.05, Align::Right),
            Column::new("Publication", 0.55, Align::Left),
            Column::new("Supplies", 0.20, Align::Left),
            Column::new("Values", 0.20, Align::Left),
        ],
        rows: REFERENCES
            .iter()
            .filter(|r| uses.relies_on(r.2))
            .chain(glycol)
            .enumerate()
            .map(|(k, (publication, supplies, _, provenance))| {
                vec![
                    format!("[{}]", k + 1),
                    publication.to_string(),
                    supplies.to_string(),
                    provenance.text().to_string(),
                ]
            })
            .collect(),
        caption: Some("Publications the calculation relies on".into()),
    });
    blocks.push(Block::text(CROSS_CHECKS));
    if glycol.is_some() {
        blocks.push(Block::text("The glycol coefficients were taken from CoolProp's open transcription of Melinder's tables (mass fraction, kelvin) and the test suite evaluates them against that transcription; where the two differ, the publication governs."));
    }
}
