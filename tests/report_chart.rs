//! Charts as laid out: axis orientation, tick labels, second axis, dashes, legend.

use dutyline::report::layout::{
    layout, Block, Chart, Document, HLine, Item, LineStyle, Marker, Page, Series, Style, YAxis,
};

fn figure_page(chart: Chart) -> Page {
    let doc = Document {
        title: "Chart test".into(),
        id_seed: "chart".into(),
        blocks: vec![Block::Figure {
            chart,
            height_mm: 90.0,
            caption: "test".into(),
        }],
        ..Document::default()
    };
    let style = Style::builtin("a4").expect("a4");
    let mut laid = layout(&doc, &style).expect("layout");
    assert_eq!(laid.pages.len(), 1);
    laid.pages.remove(0)
}

fn head_chart() -> Chart {
    Chart {
        x_label: "Flow Q [m³/h]".into(),
        y_label: "Head H [m]".into(),
        y2_label: Some("Efficiency η [%]".into()),
        series: vec![
            Series {
                name: "head".into(),
                points: vec![(0.0, 0.31), (10.0, 0.29), (20.0, 0.22)],
                ..Series::default()
            },
            Series {
                name: "efficiency".into(),
                points: vec![(0.0, 0.0), (10.0, 61.0), (20.0, 70.0)],
                axis: YAxis::Right,
                style_index: 1,
                dashed: true,
                ..Series::default()
            },
        ],
        points: vec![
            Marker {
                x: 5.0,
                y: 0.30,
                label: "high".into(),
                axis: YAxis::Left,
            },
            Marker {
                x: 15.0,
                y: 0.05,
                label: "low".into(),
                axis: YAxis::Left,
            },
        ],
        hlines: vec![HLine {
            y: 0.1,
            label: "limit".into(),
            axis: YAxis::Left,
        }],
        ..Chart::default()
    }
}

#[test]
fn y_axis_points_up_and_labels_are_rounded() {
    let page = figure_page(head_chart());
    let base = |text: &str| {
        page.texts()
            .find(|t| t.text == text)
            .map(|t| t.baseline)
            .unwrap_or_else(|| panic!("{text:?} not drawn"))
    };
    assert!(
        base("high") < base("low"),
        "larger y must be higher on the page"
    );
    // Left ticks from 0 with a step of 0.05: labels carry exactly two decimals.
    let numeric: Vec<&str> = page
        .texts()
        .map(|t| t.text.as_str())
        .filter(|t| t.parse::<f64>().is_ok())
        .collect();
    assert!(
        numeric.contains(&"0.00") && numeric.contains(&"0.30"),
        "{numeric:?}"
    );
    assert!(numeric.iter().all(|t| t.len() <= 5), "{numeric:?}");
    assert!(base("0.30") < base("0.00"));
}

#[test]
fn second_axis_title_reads_upwards_and_ticks_exist() {
    let page = figure_page(head_chart());
    let titles: Vec<_> = page
        .texts()
        .filter(|t| t.text.starts_with("Head") || t.text.starts_with("Efficiency"))
        .collect();
    assert_eq!(titles.len(), 2, "both y titles drawn");
    assert!(titles.iter().all(|t| t.angle_deg == 90.0));
    let left = titles
        .iter()
        .find(|t| t.text.starts_with("Head"))
        .map(|t| t.x);
    let right = titles
        .iter()
        .find(|t| t.text.starts_with("Efficiency"))
        .map(|t| t.x);
    assert!(left < right);
    // The right axis reaches at least 70 %.
    let right_ticks: Vec<f64> = page
        .texts()
        .filter(|t| right.is_some_and(|r| t.x > r - 60.0 && t.x < r))
        .filter_map(|t| t.text.parse().ok())
        .collect();
    assert!(right_ticks.iter().any(|v| *v >= 70.0), "{right_ticks:?}");
}

#[test]
fn dashed_series_and_reference_lines_use_dash_patterns() {
    let page = figure_page(head_chart());
    let dashes: Vec<LineStyle> = page
        .items
        .iter()
        .filter_map(|i| match i {
            Item::Path {
                stroke: Some(s),
                points,
                ..
            } if points.len() >= 2 => Some(s.dash),
            _ => None,
        })
        .collect();
    let dashed = dashes.iter().filter(|d| **d == LineStyle::Dashed).count();
    // The forced-dashed series (plot and legend sample) and the reference line.
    assert!(dashed >= 3, "{dashed} dashed paths");
}

#[test]
fn legend_lists_named_series_below_the_plot() {
    let page = figure_page(head_chart());
    let axis_title = page
        .texts()
        .find(|t| t.text.starts_with("Flow"))
        .map(|t| t.baseline);
    let entry = page
        .texts()
        .find(|t| t.text == "efficiency")
        .map(|t| t.baseline);
    assert!(entry > axis_title, "legend entry below the x axis title");
}
