//! A sample calculation package using every block kind, shared by the layout tests.
#![allow(dead_code)]

pub mod pdftext;

use dutyline::report::layout::{
    Align, Block, Chart, Column, Document, HLine, Marker, PageMeta, Series, Signatory, Span, YAxis,
};

/// Static head 18 m plus a quadratic friction term k·Q² (illustrative numbers only).
fn system_curve(k: f64, static_head: f64) -> Vec<(f64, f64)> {
    (0..=30)
        .map(|i| {
            let q = f64::from(i) * 3.0;
            (q, static_head + k * q * q)
        })
        .collect()
}

/// A quadratic pump curve H = H0 - a·Q² (illustrative numbers only).
fn pump_curve(h0: f64, a: f64) -> Vec<(f64, f64)> {
    (0..=22)
        .map(|i| {
            let q = f64::from(i) * 4.0;
            (q, h0 - a * q * q)
        })
        .collect()
}

fn head_chart() -> Chart {
    Chart {
        x_label: "Flow Q [m³/h]".into(),
        y_label: "Head H [m]".into(),
        y2_label: Some("Efficiency η [%]".into()),
        series: vec![
            Series {
                name: "Pump A, Ø 210 mm impeller".into(),
                points: pump_curve(52.0, 0.0042),
                style_index: 0,
                ..Series::default()
            },
            Series {
                name: "System, case 1 (normal level)".into(),
                points: system_curve(0.0031, 18.0),
                style_index: 1,
                ..Series::default()
            },
            Series {
                name: "System, case 2 (low level)".into(),
                points: system_curve(0.0031, 23.5),
                style_index: 2,
                ..Series::default()
            },
            Series {
                name: "Efficiency η".into(),
                points: (0..=22)
                    .map(|i| {
                        let q = f64::from(i) * 4.0;
                        (q, 78.0 * (1.0 - ((q - 58.0) / 58.0).powi(2)))
                    })
                    .collect(),
                axis: YAxis::Right,
                style_index: 3,
                markers: true,
                ..Series::default()
            },
        ],
        points: vec![
            Marker {
                x: 59.6,
                y: 37.1,
                label: "Q = 59.6 m³/h\nH = 37.1 m".into(),
                axis: YAxis::Left,
            },
            Marker {
                x: 52.4,
                y: 40.5,
                label: "Q = 52.4 m³/h, H = 40.5 m".into(),
                axis: YAxis::Left,
            },
        ],
        hlines: Vec::new(),
        ..Chart::default()
    }
}

fn power_chart() -> Chart {
    Chart {
        x_label: "Flow Q [m³/h]".into(),
        y_label: "Shaft power P [kW]".into(),
        series: vec![Series {
            name: "Shaft power, pump A".into(),
            points: (0..=22)
                .map(|i| {
                    let q = f64::from(i) * 4.0;
                    (q, 3.1 + 0.095 * q - 0.00035 * q * q)
                })
                .collect(),
            style_index: 0,
            ..Series::default()
        }],
        points: vec![Marker {
            x: 59.6,
            y: 7.5,
            label: "P = 7.5 kW at duty".into(),
            axis: YAxis::Left,
        }],
        hlines: vec![HLine {
            y: 11.0,
            label: "Motor rating 11 kW".into(),
            axis: YAxis::Left,
        }],
        ..Chart::default()
    }
}

const SOURCE: &str = r#"# Pump station P-101: raw water transfer
project "Riverside intake" {
    calc_number = "CALC-2024-017"
    revision    = "B"
}

fluid water { temperature = 15 °C }   # IAPWS-IF97

line suction {
	segment { material = "ductile iron"; dn = 250; length = 12 m; roughness = 0.25 mm }
	fitting "bellmouth entry" { k = 0.05 }
}

line discharge {
    segment { material = "HDPE PE100 SDR17"; dn = 200; length = 1840 m; roughness = 0.007 mm }
    fitting "90° long-radius bend" { count = 6; k = 0.2 }
    fitting "swing check valve" { k = 2.0 }
    fitting "gate valve, fully open" { k = 0.15 }
}

case normal { suction_level = 102.4 m; delivery_level = 118.9 m; flow = 60 m³/h }
case low    { suction_level = 99.0 m;  delivery_level = 118.9 m; flow = 52 m³/h }
"#;

/// The sample package: every block kind, two figures (one with a second axis), a long
/// table and a long listing, about 15 pages.
pub fn sample_document() -> Document {
    let mut blocks = vec![
        Block::TitleBlock {
            lines: vec![
                ("Project".into(), "Riverside intake, raw water transfer".into()),
                ("Calculation number".into(), "CALC-2024-017".into()),
                ("Client".into(), "Riverside Water Board".into()),
                ("Revision / date".into(), "B · 2024-05-14".into()),
                ("Subject".into(), "Duty pump selection for P-101 A/B, Δp ≤ 4.5 bar, 15 °C".into()),
                ("Tool".into(), "dutyline 0.1.0".into()),
                ("Source SHA-256".into(), "3f786850e387550fdab836ed7e6dc881de23001b3f786850e387550fdab836ed".into()),
            ],
            seal_box: true,
            signatures: vec![
                Signatory::new("Prepared", "A. Engineer", "2024-05-14"),
                Signatory::new("Checked", "B. Checker", ""),
                Signatory::new("Approved", "", ""),
            ],
        },
        Block::PageBreak,
        Block::heading(1, "Revision history"),
        Block::Table {
            columns: vec![
                Column::new("Rev", 0.08, Align::Center),
                Column::new("Date", 0.16, Align::Left),
                Column::new("Description", 0.56, Align::Left),
                Column::new("By", 0.2, Align::Left),
            ],
            rows: vec![
                vec!["A".into(), "2024-04-02".into(), "Issued for review".into(), "A. Engineer".into()],
                vec!["B".into(), "2024-05-14".into(), "Discharge line re-routed; case 2 added".into(), "A. Engineer".into()],
            ],
            caption: Some("Revisions".into()),
        },
        Block::Contents,
        Block::PageBreak,
        Block::heading(1, "Purpose and scope"),
        Block::Paragraph(vec![
            Span::plain("This calculation selects the duty pumps for the raw water transfer station "),
            Span::bold("P-101 A/B"),
            Span::plain(" and checks them against the installed system for every operating case. Flows are in m³/h, heads in metres of water column at 15 °C (ρ = 999.1 kg/m³, from IAPWS-IF97). The design file is "),
            Span::mono("riverside/p101.duty"),
            Span::plain("."),
        ]),
        Block::caution("The results depend on the manufacturer's certified pump curves and on the installed conditions. Surge, pipe pressure rating, structural and electrical design are outside this calculation. The work shall be reviewed by a licensed engineer and checked against the codes of the authority having jurisdiction."),
        Block::heading(1, "Design basis"),
        Block::heading(2, "Fluid"),
        Block::KeyValue(vec![
            ("Fluid".into(), "Water, 15 °C".into()),
            ("Density ρ".into(), "999.1 kg/m³ (IAPWS-IF97)".into()),
            ("Kinematic viscosity ν".into(), "1.138 × 10⁻⁶ m²/s".into()),
            ("Vapour pressure".into(), "1.705 kPa".into()),
            ("Barometric pressure".into(), "100.2 kPa at 102 m above sea level".into()),
        ]),
        Block::heading(2, "Pipelines"),
    ];
    let mut rows = Vec::new();
    for i in 0..90 {
        rows.push(vec![
            format!("S{:02}", i + 1),
            if i % 3 == 0 {
                "HDPE PE100 SDR17".into()
            } else {
                "ductile iron K9, cement-mortar lined".into()
            },
            format!("{}", 150 + 50 * (i % 4)),
            format!("{:.1}", 12.5 + 3.7 * f64::from(i)),
            format!("{:.3}", 0.007 + 0.01 * f64::from(i % 5)),
            if i == 17 {
                "Nonbreakingidentifier_SEGMENT_WITH_A_VERY_LONG_NAME_THAT_MUST_WRAP_INSIDE_ITS_CELL"
                    .into()
            } else {
                format!("ΔH ≤ {:.2} m", 0.2 + 0.01 * f64::from(i))
            },
        ]);
    }
    blocks.push(Block::Table {
        columns: vec![
            Column::new("Segment", 0.1, Align::Left),
            Column::new("Material", 0.3, Align::Left),
            Column::new("DN", 0.08, Align::Right),
            Column::new("Length [m]", 0.14, Align::Right),
            Column::new("Roughness ε [mm]", 0.16, Align::Right),
            Column::new("Remark", 0.22, Align::Left),
        ],
        rows,
        caption: Some("Pipe segments of the discharge line".into()),
    });
    blocks.extend([
        Block::heading(2, "Fittings"),
        Block::Paragraph(vec![Span::plain("Loss coefficients follow the Darby 3-K method where a fitting is listed there, otherwise the Hooper 2-K method. Each K value is quoted with its source; values marked “common practice” are trade values.")]),
        Block::heading(1, "Method"),
        Block::Paragraph(vec![Span::plain("The head the pump must deliver is the energy equation between the two free surfaces: H = Δz + Δp/(ρ·g) + Σ(f·L/D + ΣK)·v²/(2g). The Darcy friction factor f comes from the Colebrook equation, valid for 4000 ≤ Re ≤ 10⁸ and 0 ≤ ε/D ≤ 0.05.")]),
        Block::heading(1, "System curves"),
        Block::Figure {
            chart: head_chart(),
            height_mm: 95.0,
            caption: "Pump A head and efficiency against the system curves, duty points marked".into(),
        },
        Block::heading(2, "Shaft power"),
        Block::Figure {
            chart: power_chart(),
            height_mm: 70.0,
            caption: "Shaft power along the curve with the motor rating".into(),
        },
        Block::note("Efficiency is read on the right axis; its ticks line up with the head grid."),
        Block::heading(1, "Checks"),
        Block::heading(2, "NPSH"),
        Block::heading(3, "Available against required"),
        Block::Paragraph(vec![Span::plain("NPSH available exceeds NPSH required by the margin ratio 1.3 in both cases (common practice for water transfer duty).\nA forced line break follows the first sentence.")]),
        Block::Spacer(5.0),
        Block::heading(1, "Appendix: design file"),
    ]);
    let mut lines: Vec<String> = Vec::new();
    for copy in 0..18 {
        lines.extend(SOURCE.lines().map(|l| l.to_string()));
        lines.push(format!("# copy {copy} of the sample source to make a long listing; this comment line is long enough that it has to wrap onto a continuation line at this width"));
    }
    blocks.push(Block::Preformatted {
        lines,
        line_numbers: true,
    });
    Document {
        title: "Duty pump selection, raw water transfer P-101".into(),
        meta: PageMeta {
            header_left: "Riverside intake".into(),
            header_right: "CALC-2024-017 · Rev B".into(),
            footer_left: "source SHA-256 3f786850…".into(),
            ..Default::default()
        },
        info: Default::default(),
        id_seed: "3f786850e387550fdab836ed7e6dc881de23001b3f786850e387550fdab836ed".into(),
        blocks,
        attachments: Vec::new(),
    }
}
