//! The parser of unit expressions: `m^3/h`, `kg/(m*s)`, `kPa(g)`, `1/s`, ...

use super::dimension::Dimension;
use super::registry::{self, UnitDef};
use super::unit::{Unit, UnitError};

/// Largest exponent magnitude accepted after `^`.
const MAX_EXPONENT: u32 = 9;
/// Deepest parenthesis nesting accepted.
const MAX_DEPTH: usize = 16;

#[derive(Clone, Copy, Debug, PartialEq)]
enum Tok {
    Name,
    Number,
    Mul,
    Div,
    Pow,
    Open,
    Close,
    Minus,
    /// A run of superscript characters such as `²` or `⁻¹`, with its value.
    Super(i32),
}

#[derive(Clone, Copy, Debug)]
struct Token {
    tok: Tok,
    start: usize,
    end: usize,
}

fn superscript_digit(c: char) -> Option<i32> {
    "⁰¹²³⁴⁵⁶⁷⁸⁹".chars().position(|s| s == c).map(|p| p as i32)
}

fn lex(text: &str) -> Result<Vec<Token>, UnitError> {
    let mut tokens = Vec::new();
    let mut chars = text.char_indices().peekable();
    while let Some((start, c)) = chars.next() {
        let single = |tok| Token {
            tok,
            start,
            end: start + c.len_utf8(),
        };
        let token = match c {
            '*' | '·' | '⋅' => single(Tok::Mul),
            '/' => single(Tok::Div),
            '^' => single(Tok::Pow),
            '(' => single(Tok::Open),
            ')' => single(Tok::Close),
            '-' | '−' => single(Tok::Minus),
            '%' => single(Tok::Name),
            '0'..='9' => {
                let mut end = start + 1;
                while let Some(&(i, '0'..='9')) = chars.peek() {
                    end = i + 1;
                    chars.next();
                }
                Token {
                    tok: Tok::Number,
                    start,
                    end,
                }
            }
            c if c == '⁻' || superscript_digit(c).is_some() => {
                let (mut end, mut sign, mut value, mut digits) = (start + c.len_utf8(), 1, 0, 0);
                match superscript_digit(c) {
                    Some(d) => (value, digits) = (d, 1),
                    None => sign = -1,
                }
                while let Some(d) = chars.peek().and_then(|&(_, n)| superscript_digit(n)) {
                    if let Some((i, n)) = chars.next() {
                        end = i + n.len_utf8();
                    }
                    value = (value * 10 + d).min(1000);
                    digits += 1;
                }
                if digits == 0 {
                    return Err(UnitError::new(
                        "'⁻' must be followed by a digit",
                        start,
                        end - start,
                    ));
                }
                Token {
                    tok: Tok::Super(sign * value),
                    start,
                    end,
                }
            }
            c if c.is_ascii_alphabetic() || c == '_' || c == '°' => {
                let mut end = start + c.len_utf8();
                while let Some(&(i, n)) = chars.peek() {
                    if !(n.is_ascii_alphanumeric() || n == '_') {
                        break;
                    }
                    end = i + 1;
                    chars.next();
                }
                let rest = &text[end..];
                if rest.starts_with("(g)") || rest.starts_with("(a)") {
                    end += 3;
                    chars.nth(2);
                }
                Token {
                    tok: Tok::Name,
                    start,
                    end,
                }
            }
            c if c.is_whitespace() => {
                let msg = "spaces are not allowed inside a unit; write it without them, e.g. m^3/h";
                return Err(UnitError::new(msg, start, c.len_utf8()));
            }
            '.' | ',' => {
                let msg = "decimal numbers are not allowed inside a unit";
                return Err(UnitError::new(msg, start, 1));
            }
            c => {
                let msg = format!("unexpected character '{c}' in a unit");
                return Err(UnitError::new(msg, start, c.len_utf8()));
            }
        };
        tokens.push(token);
    }
    Ok(tokens)
}

/// A partial result: SI factor and dimension.
#[derive(Clone, Copy)]
struct Acc {
    factor: f64,
    dim: Dimension,
}

struct Parser<'a> {
    text: &'a str,
    tokens: Vec<Token>,
    pos: usize,
    /// Every unit name used, with its byte range.
    atoms: Vec<(&'static UnitDef, usize, usize)>,
    /// Whether any operator, power or `1` was used.
    compound: bool,
}

impl<'a> Parser<'a> {
    fn peek(&self) -> Option<Token> {
        self.tokens.get(self.pos).copied()
    }

    fn slice(&self, t: Token) -> &'a str {
        &self.text[t.start..t.end]
    }

    fn error_at(&self, t: Option<Token>, message: impl Into<String>) -> UnitError {
        match t {
            Some(t) => UnitError::new(message, t.start, t.end - t.start),
            None => UnitError::new(message, self.text.len(), 0),
        }
    }

    fn expr(&mut self, depth: usize) -> Result<Acc, UnitError> {
        let mut acc = self.power(depth)?;
        let mut after_slash = false;
        while let Some(op) = self.peek() {
            let dim = match op.tok {
                Tok::Mul if after_slash => {
                    let msg = "'*' after '/' is ambiguous: put the whole denominator in \
                               parentheses, e.g. kg/(m*s)";
                    return Err(self.error_at(Some(op), msg));
                }
                Tok::Mul | Tok::Div => {
                    self.pos += 1;
                    self.compound = true;
                    let rhs = self.power(depth)?;
                    if op.tok == Tok::Mul {
                        acc.factor *= rhs.factor;
                        acc.dim.checked_mul(rhs.dim)
                    } else {
                        after_slash = true;
                        acc.factor /= rhs.factor;
                        acc.dim.checked_div(rhs.dim)
                    }
                }
                _ => break,
            };
            acc.dim = dim.ok_or_else(|| {
                self.error_at(
                    Some(op),
                    "the dimension exponents of this unit are too large",
                )
            })?;
        }
        Ok(acc)
    }

    fn power(&mut self, depth: usize) -> Result<Acc, UnitError> {
        let base = self.primary(depth)?;
        let Some(t) = self.peek() else {
            return Ok(base);
        };
        let n = match t.tok {
            Tok::Pow => {
                self.pos += 1;
                self.exponent(t)?
            }
            Tok::Super(n) => {
                self.pos += 1;
                check_exponent(n, t)?
            }
            _ => return Ok(base),
        };
        self.compound = true;
        let dim = i8::try_from(n).ok().and_then(|n| base.dim.powi(n));
        let dim = dim.ok_or_else(|| {
            self.error_at(
                Some(t),
                "the dimension exponents of this unit are too large",
            )
        })?;
        Ok(Acc {
            factor: base.factor.powi(n),
            dim,
        })
    }

    /// The integer after `^`: `2`, `-1`, `−1`, `(-1)`.
    fn exponent(&mut self, caret: Token) -> Result<i32, UnitError> {
        let missing = "expected an integer exponent after '^', e.g. m^3 or s^-1";
        let open = self.peek().filter(|t| t.tok == Tok::Open);
        if open.is_some() {
            self.pos += 1;
        }
        let negative = self.peek().filter(|t| t.tok == Tok::Minus).is_some();
        if negative {
            self.pos += 1;
        }
        let number = match self.peek() {
            Some(t) if t.tok == Tok::Number => t,
            Some(t) => return Err(self.error_at(Some(t), missing)),
            None => return Err(self.error_at(Some(caret), missing)),
        };
        self.pos += 1;
        if let Some(open) = open {
            match self.peek() {
                Some(t) if t.tok == Tok::Close => self.pos += 1,
                _ => return Err(self.error_at(Some(open), "unclosed '(' in the exponent")),
            }
        }
        let digits = self.slice(number);
        let value: i32 = digits.parse().unwrap_or(i32::MAX);
        check_exponent(if negative { -value } else { value }, number)
    }

    fn primary(&mut self, depth: usize) -> Result<Acc, UnitError> {
        let Some(t) = self.peek() else {
            let msg = if self.text.is_empty() {
                "empty unit"
            } else {
                "expected a unit name at the end"
            };
            let at = self.tokens.last().copied();
            return Err(self.error_at(at, msg));
        };
        match t.tok {
            Tok::Name => {
                self.pos += 1;
                let name = self.slice(t);
                let def = registry::lookup(name).ok_or_else(|| unknown_name(name, t))?;
                self.atoms.push((def, t.start, t.end));
                Ok(Acc {
                    factor: def.factor,
                    dim: def.dim,
                })
            }
            Tok::Number => {
                let starts_expr = self.pos == 0 || self.tokens[self.pos - 1].tok == Tok::Open;
                let before_slash = self.tokens.get(self.pos + 1).map(|n| n.tok) == Some(Tok::Div);
                if self.slice(t) != "1" || !starts_expr || !before_slash {
                    let msg = "a number may appear in a unit only as the 1 of 1/s";
                    return Err(self.error_at(Some(t), msg));
                }
                self.pos += 1;
                self.compound = true;
                Ok(Acc {
                    factor: 1.0,
                    dim: Dimension::NONE,
                })
            }
            Tok::Open => {
                if depth >= MAX_DEPTH {
                    return Err(self.error_at(Some(t), "parentheses are nested too deeply"));
                }
                self.pos += 1;
                let inner = self.expr(depth + 1)?;
                match self.peek() {
                    Some(c) if c.tok == Tok::Close => {
                        self.pos += 1;
                        Ok(inner)
                    }
                    _ => Err(self.error_at(Some(t), "this '(' is never closed")),
                }
            }
            _ => {
                let msg = format!("expected a unit name before '{}'", self.slice(t));
                Err(self.error_at(Some(t), msg))
            }
        }
    }
}

fn check_exponent(n: i32, at: Token) -> Result<i32, UnitError> {
    let len = at.end - at.start;
    if n == 0 {
        return Err(UnitError::new(
            "an exponent of 0 is not allowed",
            at.start,
            len,
        ));
    }
    if n.unsigned_abs() > MAX_EXPONENT {
        let msg = format!("exponent {n} is out of range: at most {MAX_EXPONENT} in size");
        return Err(UnitError::new(msg, at.start, len));
    }
    Ok(n)
}

fn unknown_name(name: &str, t: Token) -> UnitError {
    let len = t.end - t.start;
    let stem = name.trim_end_matches(|c: char| c.is_ascii_digit());
    let mut err = if stem.len() < name.len() && registry::lookup(stem).is_some() {
        let power = &name[stem.len()..];
        let msg = format!("unknown unit '{name}': write powers with '^', e.g. {stem}^{power}");
        UnitError::new(msg, t.start, len)
    } else if let Some(base) = name.strip_suffix("(g)").or(name.strip_suffix("(a)")) {
        let msg = format!(
            "unknown unit '{name}': the gauge/absolute marks (g) and (a) go only on Pa, kPa, \
             MPa and bar, not on {base} (psi has psig and psia)"
        );
        UnitError::new(msg, t.start, len)
    } else {
        UnitError::new(format!("unknown unit '{name}'"), t.start, len)
    };
    err.suggestions = registry::suggest(name);
    if name.ends_with("(g)") || name.ends_with("(a)") {
        err.suggestions = registry::suggest(&name.replace(['(', ')'], ""));
    }
    err
}

/// Parse a unit expression such as "m", "m^3/h", "lbf/in^2", "kg/(m*s)", "kg/(m·s)", "psig",
/// "kPa(g)", "bar(a)", "degF", "°C", "USD/kWh", "%", "1/s", "ft^3/s".
///
/// A temperature scale (degC, degF, K, degR) standing alone gives an affine unit (a
/// temperature point); inside a compound unit it is a degree size with no offset. A gauge or
/// absolute pressure unit must stand alone. One unit may name at most one currency.
pub fn parse_unit(text: &str) -> Result<Unit, UnitError> {
    let mut parser = Parser {
        text,
        tokens: lex(text)?,
        pos: 0,
        atoms: Vec::new(),
        compound: false,
    };
    let acc = parser.expr(0)?;
    if let Some(t) = parser.peek() {
        let msg = match t.tok {
            Tok::Close => "this ')' has no matching '('".to_string(),
            Tok::Open => "expected '*' or '/' before '('".to_string(),
            _ => format!("expected '*' or '/' before '{}'", parser.slice(t)),
        };
        return Err(parser.error_at(Some(t), msg));
    }
    let bare = !parser.compound && parser.atoms.len() == 1;
    let mut currency: Option<&str> = None;
    for &(def, start, end) in &parser.atoms {
        if !bare && registry::pressure_reference(def).is_some() {
            let msg = format!(
                "'{}' states a pressure reference and must stand alone; use a plain pressure \
                 unit (psi, kPa, bar) inside a compound unit",
                def.name
            );
            return Err(UnitError::new(msg, start, end - start));
        }
        if registry::is_currency(def) {
            match currency {
                Some(first) if first != def.name => {
                    let msg = format!(
                        "this unit mixes {first} and {}; dutyline does not convert currencies",
                        def.name
                    );
                    return Err(UnitError::new(msg, start, end - start));
                }
                _ => currency = Some(def.name),
            }
        }
    }
    if !(acc.factor.is_finite() && acc.factor > 0.0) {
        return Err(UnitError::new(
            "the size of this unit is out of range",
            0,
            text.len(),
        ));
    }
    let single = parser.atoms.first().map(|a| a.0).filter(|_| bare);
    let affine = single.is_some_and(registry::is_temperature_scale);
    Ok(Unit {
        text: text.to_string(),
        factor: acc.factor,
        offset: single.filter(|_| affine).map_or(0.0, |d| d.offset),
        dim: acc.dim,
        affine,
        pressure_ref: single.and_then(registry::pressure_reference),
    })
}

#[cfg(test)]
mod tests {
    use super::super::PressureReference;
    use super::*;

    fn unit(text: &str) -> Unit {
        parse_unit(text).unwrap_or_else(|e| panic!("{text}: {e}"))
    }

    fn err(text: &str) -> UnitError {
        parse_unit(text).expect_err(text)
    }

    fn close(a: f64, b: f64) -> bool {
        (a - b).abs() <= 1e-12 * b.abs()
    }

    #[test]
    fn products_quotients_powers_and_parentheses() {
        assert!(close(unit("m^3/h").factor, 1.0 / 3600.0));
        assert_eq!(unit("m^3/h").dim, Dimension::VOLUME_RATE);
        assert!(close(unit("kg/(m*s)").factor, 1.0));
        assert_eq!(unit("kg/(m·s)").dim, Dimension::DYNAMIC_VISCOSITY);
        assert_eq!(
            unit("kg/m/s"),
            Unit {
                text: "kg/m/s".into(),
                ..unit("kg/(m*s)")
            }
        );
        assert_eq!(unit("1/s").dim, Dimension::FREQUENCY);
        assert_eq!(
            unit("1/(m*s)").dim,
            Dimension::LENGTH.mul(Dimension::TIME).powi(-1).unwrap()
        );
        assert_eq!(unit("s^-1").dim, Dimension::FREQUENCY);
        assert_eq!(unit("s^(−1)").dim, Dimension::FREQUENCY);
        assert_eq!(unit("s⁻¹").dim, Dimension::FREQUENCY);
        assert_eq!(unit("m²").dim, Dimension::AREA);
        assert_eq!(unit("(m)").dim, Dimension::LENGTH);
        assert_eq!(unit("N*m").dim, Dimension::ENERGY);
        assert_eq!(unit("USD/kWh").dim, Dimension::MONEY_PER_ENERGY);
        assert_eq!(unit("lbf/ft^3").dim, Dimension::SPECIFIC_WEIGHT);
    }

    #[test]
    fn temperature_scales_are_points_alone_and_degree_sizes_in_compounds() {
        let c = unit("degC");
        assert!(c.affine && c.offset == 273.15 && c.factor == 1.0);
        assert!(unit("K").affine && unit("K").offset == 0.0);
        assert!(unit("(degF)").affine);
        let k = unit("W/(m*degC)");
        assert!(!k.affine && k.offset == 0.0 && k.factor == 1.0);
        let f = unit("Btu/degF");
        assert!(!f.affine && close(f.factor, 1055.05585262 * 1.8));
        let d = unit("delta_degF");
        assert!(!d.affine && d.offset == 0.0 && close(d.factor, 5.0 / 9.0));
    }

    #[test]
    fn pressure_references_stand_alone_only() {
        assert_eq!(unit("psig").pressure_ref, Some(PressureReference::Gauge));
        assert_eq!(
            unit("kPa(a)").pressure_ref,
            Some(PressureReference::Absolute)
        );
        assert_eq!(unit("bar(g)").pressure_ref, Some(PressureReference::Gauge));
        assert_eq!(unit("psi").pressure_ref, None);
        let e = err("psig/ft");
        assert_eq!((e.offset, e.len), (0, 4));
        let e = err("m(g)");
        assert_eq!((e.offset, e.len), (0, 4));
    }

    #[test]
    fn errors_point_at_the_offending_part() {
        let e = err("gmp/ft");
        assert_eq!((e.offset, e.len), (0, 3));
        assert_eq!(e.suggestions.first().map(String::as_str), Some("gpm"));
        let at = |t: &str| {
            let e = err(t);
            (e.offset, e.len)
        };
        assert_eq!(at(""), (0, 0));
        assert_eq!(at("^"), (0, 1));
        assert_eq!(at("m^"), (1, 1));
        assert_eq!(at("m^999"), (2, 3));
        assert_eq!(at("m^0"), (2, 1));
        assert_eq!(at("((m"), (1, 1));
        assert_eq!(at("m/"), (1, 1));
        assert_eq!(at("m)"), (1, 1));
        assert_eq!(at("m^3 /h"), (3, 1));
        assert_eq!(at("kg/m*s"), (4, 1));
        assert_eq!(at("2/s"), (0, 1));
        assert_eq!(at("m*1/s"), (2, 1));
        assert_eq!(at("ft3"), (0, 3));
        assert_eq!(at("m^2.5"), (3, 1));
        assert_eq!(at("°X/s"), (0, 3));
        assert_eq!(at("m(s)"), (1, 1));
        assert_eq!(at("USD/EUR"), (4, 3));
        assert!(err("ft3").message.contains("ft^3"));
        assert!(err("kg/m*s").message.contains("kg/(m*s)"));
    }

    #[test]
    fn deep_nesting_and_huge_exponent_sums_are_errors() {
        let deep = format!("{}m{}", "(".repeat(40), ")".repeat(40));
        assert!(err(&deep).message.contains("nested"));
        let many = vec!["m^9"; 20].join("*");
        assert!(err(&many).message.contains("too large"));
        let tiny = vec!["mm^9"; 12].join("*");
        assert!(err(&tiny).message.contains("out of range"));
        assert!(parse_unit(&vec!["mm^9"; 11].join("*")).is_ok());
    }
}
