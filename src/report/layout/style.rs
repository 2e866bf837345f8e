//! Report style: page geometry, type sizes, colours and plot styling, read from TOML
//! (`styles/letter.toml`, `styles/a4.toml` are the built-in styles and the reference for
//! every key).

use serde::{Deserialize, Deserializer};
use std::fmt;

/// An sRGB colour, written `"#rrggbb"` in style files.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub struct Colour {
    /// Red, 0–255.
    pub r: u8,
    /// Green, 0–255.
    pub g: u8,
    /// Blue, 0–255.
    pub b: u8,
}

impl Colour {
    /// A colour from its three 8-bit channels.
    pub const fn rgb(r: u8, g: u8, b: u8) -> Self {
        Colour { r, g, b }
    }

    /// White, used for backgrounds behind markers.
    pub const WHITE: Colour = Colour::rgb(255, 255, 255);

    /// Parses `"#rrggbb"`; `None` for anything else.
    pub fn parse_hex(text: &str) -> Option<Colour> {
        let hex = text.strip_prefix('#')?;
        if hex.len() != 6 || !hex.chars().all(|c| c.is_ascii_hexdigit()) {
            return None;
        }
        let channel = |i: usize| u8::from_str_radix(&hex[i..i + 2], 16).ok();
        Some(Colour::rgb(channel(0)?, channel(2)?, channel(4)?))
    }
}

impl<'de> Deserialize<'de> for Colour {
    fn deserialize<D: Deserializer<'de>>(deserializer: D) -> Result<Self, D::Error> {
        let text = String::deserialize(deserializer)?;
        Colour::parse_hex(&text).ok_or_else(|| {
            serde::de::Error::custom(format!("invalid colour {text:?}: expected \"#rrggbb\""))
        })
    }
}

/// How a plot line is stroked.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Deserialize)]
#[serde(rename_all = "kebab-case")]
pub enum LineStyle {
    /// Continuous line.
    Solid,
    /// Long dashes.
    Dashed,
    /// Round dots.
    Dotted,
    /// Dash, dot, dash.
    DashDot,
}

/// Page geometry in millimetres.
#[derive(Debug, Clone, PartialEq, Deserialize)]
#[serde(deny_unknown_fields)]
pub struct PageStyle {
    /// Page width (Letter 215.9, A4 210).
    pub width_mm: f64,
    /// Page height (Letter 279.4, A4 297).
    pub height_mm: f64,
    /// Top margin: distance from the paper edge to the top of the text body.
    pub margin_top_mm: f64,
    /// Bottom margin: distance from the paper edge to the bottom of the text body.
    pub margin_bottom_mm: f64,
    /// Left margin.
    pub margin_left_mm: f64,
    /// Right margin.
    pub margin_right_mm: f64,
    /// Header baseline distance above the top of the text body.
    pub header_offset_mm: f64,
    /// Footer baseline distance below the bottom of the text body.
    pub footer_offset_mm: f64,
}

/// Type sizes (points) and text colours.
#[derive(Debug, Clone, PartialEq, Deserialize)]
#[serde(deny_unknown_fields)]
pub struct TextStyle {
    /// Body text size.
    pub base_size_pt: f64,
    /// Line pitch as a multiple of the font size.
    pub line_spacing: f64,
    /// Heading sizes for levels 1, 2 and 3.
    pub heading_sizes_pt: [f64; 3],
    /// Table cell text size.
    pub table_size_pt: f64,
    /// Preformatted (monospaced) text size.
    pub mono_size_pt: f64,
    /// Header, footer, captions and notes.
    pub small_size_pt: f64,
    /// Vertical gap between blocks.
    pub paragraph_gap_pt: f64,
    /// Body text colour (a dark grey reads quieter than black).
    pub colour: Colour,
    /// Secondary text: header, footer, captions, line numbers.
    pub muted_colour: Colour,
    /// Rules and box outlines.
    pub rule_colour: Colour,
    /// Background of table header rows.
    pub table_header_fill: Colour,
}

/// Plot styling.
#[derive(Debug, Clone, PartialEq, Deserialize)]
#[serde(deny_unknown_fields)]
pub struct ChartStyle {
    /// Series colours, picked by `style_index % palette.len()`.
    pub palette: Vec<Colour>,
    /// Series line styles, picked by `style_index % line_styles.len()`.
    pub line_styles: Vec<LineStyle>,
    /// Series line width.
    pub line_width_pt: f64,
    /// Grid line colour.
    pub grid_colour: Colour,
    /// Axis, tick and reference-line colour.
    pub axis_colour: Colour,
    /// Tick label, legend and annotation size.
    pub label_size_pt: f64,
    /// Duty-point marker colour.
    pub marker_colour: Colour,
}

/// A complete report style.
#[derive(Debug, Clone, PartialEq, Deserialize)]
#[serde(deny_unknown_fields)]
pub struct Style {
    /// Style name, e.g. `"letter"`.
    pub name: String,
    /// Page geometry.
    pub page: PageStyle,
    /// Type and colours.
    pub text: TextStyle,
    /// Plot styling.
    pub chart: ChartStyle,
}

/// A style file that could not be read, located by 1-based line and column.
#[derive(Debug, Clone, PartialEq, Eq)]
pub struct StyleError {
    /// What is wrong.
    pub message: String,
    /// 1-based line of the offending text (0 when unknown).
    pub line: usize,
    /// 1-based column (in characters) of the offending text (0 when unknown).
    pub column: usize,
    /// How to fix it.
    pub help: String,
}

impl fmt::Display for StyleError {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        write!(
            f,
            "style error at {}:{}: {} (help: {})",
            self.line, self.column, self.message, self.help
        )
    }
}

impl std::error::Error for StyleError {}

const LETTER: &str = include_str!("../../../styles/letter.toml");
const A4: &str = include_str!("../../../styles/a4.toml");

impl Style {
    /// Reads and checks a style from TOML text. Unknown keys, missing keys, wrong types,
    /// bad colours and impossible geometry are errors with a line and column.
    pub fn from_toml(text: &str) -> Result<Style, StyleError> {
        let style: Style = toml::from_str(text).map_err(|e| {
            let (line, column) = e
                .span()
                .map(|span| line_column(text, span.start))
                .unwrap_or((0, 0));
            let message = e.message().trim().to_string();
            let help = help_for(&message);
            StyleError {
                message,
                line,
                column,
                help,
            }
        })?;
        style.check(text)?;
        Ok(style)
    }

    /// A built-in style by name: `"letter"` or `"a4"` (case-insensitive).
    pub fn builtin(name: &str) -> Option<Style> {
        let text = match name.to_ascii_lowercase().as_str() {
            "letter" => LETTER,
            "a4" => A4,
            _ => return None,
        };
        Style::from_toml(text).ok()
    }

    /// Names accepted by [`Style::builtin`].
    pub fn builtin_names() -> &'static [&'static str] {
        &["letter", "a4"]
    }

    /// Width of the text body in millimetres.
    pub fn body_width_mm(&self) -> f64 {
        self.page.width_mm - self.page.margin_left_mm - self.page.margin_right_mm
    }

    /// Height of the text body in millimetres.
    pub fn body_height_mm(&self) -> f64 {
        self.page.height_mm - self.page.margin_top_mm - self.page.margin_bottom_mm
    }

    fn check(&self, text: &str) -> Result<(), StyleError> {
        let p = &self.page;
        let t = &self.text;
        let c = &self.chart;
        let lengths = [
            ("width_mm", p.width_mm, 50.0, 2000.0),
            ("height_mm", p.height_mm, 50.0, 2000.0),
            ("margin_top_mm", p.margin_top_mm, 0.0, 500.0),
            ("margin_bottom_mm", p.margin_bottom_mm, 0.0, 500.0),
            ("margin_left_mm", p.margin_left_mm, 0.0, 500.0),
            ("margin_right_mm", p.margin_right_mm, 0.0, 500.0),
            ("header_offset_mm", p.header_offset_mm, 0.0, 100.0),
            ("footer_offset_mm", p.footer_offset_mm, 0.0, 100.0),
            ("base_size_pt", t.base_size_pt, 4.0, 30.0),
            ("line_spacing", t.line_spacing, 1.0, 3.0),
            ("table_size_pt", t.table_size_pt, 4.0, 30.0),
            ("mono_size_pt", t.mono_size_pt, 4.0, 30.0),
            ("small_size_pt", t.small_size_pt, 4.0, 30.0),
            ("paragraph_gap_pt", t.paragraph_gap_pt, 0.0, 72.0),
            ("line_width_pt", c.line_width_pt, 0.1, 10.0),
            ("label_size_pt", c.label_size_pt, 4.0, 30.0),
        ];
        for (key, value, min, max) in lengths {
            if !(value.is_finite() && value >= min && value <= max) {
                return Err(key_error(
                    text,
                    key,
                    format!("{key} = {value} is outside {min} ..= {max}"),
                    "use a value in the stated range; see styles/letter.toml",
                ));
            }
        }
        for size in t.heading_sizes_pt {
            if !(size.is_finite() && (4.0..=40.0).contains(&size)) {
                return Err(key_error(
                    text,
                    "heading_sizes_pt",
                    format!("heading size {size} pt is outside 4 ..= 40"),
                    "give three heading sizes in points, largest first",
                ));
            }
        }
        if self.body_width_mm() < 60.0 || self.body_height_mm() < 80.0 {
            return Err(key_error(
                text,
                "margin_left_mm",
                format!(
                    "margins leave a text body of {:.1} mm x {:.1} mm; at least 60 mm x 80 mm is needed",
                    self.body_width_mm(),
                    self.body_height_mm()
                ),
                "reduce the margins or enlarge the page",
            ));
        }
        if p.header_offset_mm > p.margin_top_mm || p.footer_offset_mm > p.margin_bottom_mm {
            return Err(key_error(
                text,
                "header_offset_mm",
                "the header or footer would sit outside the paper".to_string(),
                "keep header_offset_mm <= margin_top_mm and footer_offset_mm <= margin_bottom_mm",
            ));
        }
        if c.palette.is_empty() || c.line_styles.is_empty() {
            return Err(key_error(
                text,
                "palette",
                "the chart palette and line_styles need at least one entry each".to_string(),
                "list colours as [\"#0072b2\", ...] and styles as [\"solid\", \"dashed\", ...]",
            ));
        }
        Ok(())
    }
}

/// 1-based line and character column of a byte offset.
fn line_column(text: &str, offset: usize) -> (usize, usize) {
    let offset = offset.min(text.len());
    let before = text.get(..offset).unwrap_or(text);
    let line = before.matches('\n').count() + 1;
    let line_start = before.rfind('\n').map(|i| i + 1).unwrap_or(0);
    let column = before.get(line_start..).map_or(0, |s| s.chars().count()) + 1;
    (line, column)
}

/// An error located at the first line that assigns `key` (or 0:0 when absent).
fn key_error(text: &str, key: &str, message: String, help: &str) -> StyleError {
    let mut offset = 0;
    let mut found = None;
    for line in text.split_inclusive('\n') {
        let trimmed = line.trim_start();
        if let Some(rest) = trimmed.strip_prefix(key) {
            if rest.trim_start().starts_with('=') {
                found = Some(offset + (line.len() - trimmed.len()));
                break;
            }
        }
        offset += line.len();
    }
    let (line, column) = found.map_or((0, 0), |o| line_column(text, o));
    StyleError {
        message,
        line,
        column,
        help: help.to_string(),
    }
}

fn help_for(message: &str) -> String {
    let help = if message.contains("unknown field") {
        "remove the key or correct its spelling; the message lists the keys this table accepts"
    } else if message.contains("missing field") {
        "add the missing key; styles/letter.toml lists every key with a sensible value"
    } else if message.contains("colour") {
        "write colours as \"#rrggbb\", e.g. \"#262626\""
    } else if message.contains("variant") {
        "line styles are \"solid\", \"dashed\", \"dotted\" or \"dash-dot\""
    } else if message.contains("invalid type") {
        "check the value's type: lengths are numbers (12.0), names and colours are quoted"
    } else {
        "check the TOML syntax near this position; styles/letter.toml is a complete example"
    };
    help.to_string()
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn builtins_parse() {
        let letter = Style::builtin("letter").expect("letter");
        assert!((letter.page.width_mm - 215.9).abs() < 1e-9); // US Letter 8.5 in = 215.9 mm
        let a4 = Style::builtin("A4").expect("a4");
        assert!((a4.page.height_mm - 297.0).abs() < 1e-9); // ISO 216 A4 = 210 x 297 mm
        assert!(Style::builtin("tabloid").is_none());
    }

    #[test]
    fn line_column_counts_from_one() {
        assert_eq!(line_column("ab\ncd", 0), (1, 1));
        assert_eq!(line_column("ab\ncd", 4), (2, 2));
    }

    #[test]
    fn bad_colour_is_located() {
        let text = LETTER.replace("grid_colour = \"#dcdcdc\"", "grid_colour = \"grey\"");
        let err = Style::from_toml(&text).expect_err("bad colour");
        let expected_line = text
            .lines()
            .position(|l| l.starts_with("grid_colour"))
            .map(|i| i + 1);
        assert_eq!(Some(err.line), expected_line);
        assert!(err.message.contains("colour"), "{}", err.message);
        assert!(err.help.contains("#rrggbb"));
    }

    #[test]
    fn geometry_is_checked() {
        let text = LETTER.replace("margin_left_mm = 20.0", "margin_left_mm = 150.0");
        let err = Style::from_toml(&text).expect_err("margins too wide");
        assert!(err.message.contains("text body"), "{}", err.message);
        assert!(err.line > 0);
    }
}
