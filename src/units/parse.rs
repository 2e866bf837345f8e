//! The parser of unit expressions: `m^3/h`, `kg/(m*s)`, `kPa(g)`, `1/s`, ...

use super::dimension::Dimension;
use super::registry::{self, UnitDef};
use super::unit::{Unit, UnitError};

/// Largest exponent magnitude accepted after `^`.
const MAX_EXPONENT: u32 = 9;
/// Deepest parenthesis nesting accepted.
const MAX_DEPTH: usize = 16;
const TOO_LARGE: &str = "the dimension exponents of this unit are too large";

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

/// A token and its byte range in the unit text.
#[derive(Clone, Copy, Debug)]
struct Token {
    tok: Tok,
    start: usize,
    end: usize,
}

/// An error pointing at `t`.
fn fail<T>(message: impl Into<String>, t: Token) -> Result<T, UnitError> {
    Err(UnitError::new(message, t.start, t.end - t.start))
}

fn superscript_digit(c: char) -> Option<i32> {
    "⁰¹²³⁴⁵⁶⁷⁸⁹".chars().position(|s| s == c).map(|p| p as i32)
}

/// The end of the run of characters matching `pred` from byte `from`.
fn scan(text: &str, from: usize, pred: impl Fn(char) -> bool) -> usize {
    text[from..]
        .find(|c| !pred(c))
        .map_or(text.len(), |i| from + i)
}

fn lex(text: &str) -> Result<Vec<Token>, UnitError> {
    let mut tokens = Vec::new();
    let mut start = 0;
    while let Some(c) = text[start..].chars().next() {
        let next = start + c.len_utf8();
        let here = Token {
            tok: Tok::Name,
            start,
            end: next,
        };
        let (tok, end) = match c {
            '*' | '·' | '⋅' => (Tok::Mul, next),
            '/' => (Tok::Div, next),
            '^' => (Tok::Pow, next),
            '(' => (Tok::Open, next),
            ')' => (Tok::Close, next),
            '-' | '−' => (Tok::Minus, next),
            '%' => (Tok::Name, next),
            '0'..='9' => (Tok::Number, scan(text, start, |c| c.is_ascii_digit())),
            c if c == '⁻' || superscript_digit(c).is_some() => {
                let end = scan(text, next, |c| superscript_digit(c).is_some());
                let digits = text[start..end].chars().filter_map(superscript_digit);
                let value = digits.fold(None, |v, d| Some((v.unwrap_or(0) * 10 + d).min(1000)));
                let Some(value) = value else {
                    return fail("'⁻' must be followed by a superscript digit", here);
                };
                (Tok::Super(if c == '⁻' { -value } else { value }), end)
            }
            c if c.is_ascii_alphabetic() || c == '_' || c == '°' => {
                let end = scan(text, next, |c| c.is_ascii_alphanumeric() || c == '_');
                let marked = ["(g)", "(a)"].iter().any(|m| text[end..].starts_with(m));
                (Tok::Name, if marked { end + 3 } else { end })
            }
            c if c.is_whitespace() => {
                return fail(
                    "spaces are not allowed inside a unit: write e.g. m^3/h",
                    here,
                )
            }
            '.' | ',' => return fail("decimal numbers are not allowed inside a unit", here),
            c => return fail(format!("unexpected character '{c}' in a unit"), here),
        };
        tokens.push(Token { tok, start, end });
        start = end;
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
    /// Every unit name used, with its token.
    atoms: Vec<(&'static UnitDef, Token)>,
    /// Whether any operator, power or `1` was used.
    compound: bool,
}

impl<'a> Parser<'a> {
    fn peek(&self) -> Option<Token> {
        self.tokens.get(self.pos).copied()
    }

    /// Consumes the next token if it is `tok`.
    fn eat(&mut self, tok: Tok) -> Option<Token> {
        let t = self.peek().filter(|t| t.tok == tok)?;
        self.pos += 1;
        Some(t)
    }

    fn slice(&self, t: Token) -> &'a str {
        &self.text[t.start..t.end]
    }

    /// The last token, or an empty range at the end of an empty text.
    fn last(&self) -> Token {
        let end = Token {
            tok: Tok::Name,
            start: self.text.len(),
            end: self.text.len(),
        };
        self.tokens.last().copied().unwrap_or(end)
    }

    fn expr(&mut self, depth: usize) -> Result<Acc, UnitError> {
        let mut acc = self.power(depth)?;
        let mut after_slash = false;
        while let Some(op) = self.peek().filter(|t| matches!(t.tok, Tok::Mul | Tok::Div)) {
            if op.tok == Tok::Mul && after_slash {
                let msg = "'*' after '/' is ambiguous: put the whole denominator in parentheses, \
                           e.g. kg/(m*s)";
                return fail(msg, op);
            }
            self.pos += 1;
            self.compound = true;
            let rhs = self.power(depth)?;
            let dim = if op.tok == Tok::Mul {
                acc.factor *= rhs.factor;
                acc.dim.checked_mul(rhs.dim)
            } else {
                after_slash = true;
                acc.factor /= rhs.factor;
                acc.dim.checked_div(rhs.dim)
            };
            acc.dim = dim.map_or_else(|| fail(TOO_LARGE, op), Ok)?;
        }
        Ok(acc)
    }

    fn power(&mut self, depth: usize) -> Result<Acc, UnitError> {
        let base = self.primary(depth)?;
        let (n, at) = match self.peek() {
            Some(t) if t.tok == Tok::Pow => {
                self.pos += 1;
                (self.exponent(t)?, t)
            }
            Some(
                t @ Token {
                    tok: Tok::Super(n), ..
                },
            ) => {
                self.pos += 1;
                (check_exponent(n, t)?, t)
            }
            _ => return Ok(base),
        };
        self.compound = true;
        let dim = i8::try_from(n).ok().and_then(|n| base.dim.powi(n));
        let dim = dim.map_or_else(|| fail(TOO_LARGE, at), Ok)?;
        Ok(Acc {
            factor: base.factor.powi(n),
            dim,
        })
    }

    /// The integer after `^`: `2`, `-1`, `−1`, `(-1)`.
    fn exponent(&mut self, caret: Token) -> Result<i32, UnitError> {
        let missing = "expected an integer exponent after '^', e.g. m^3 or s^-1";
        let open = self.eat(Tok::Open);
        let negative = self.eat(Tok::Minus).is_some();
        let Some(number) = self.eat(Tok::Number) else {
            return fail(missing, self.peek().unwrap_or(caret));
        };
        if let Some(open) = open {
            self.eat(Tok::Close)
                .map_or_else(|| fail("unclosed '(' in the exponent", open), Ok)?;
        }
        let value: i32 = self.slice(number).parse().unwrap_or(i32::MAX);
        check_exponent(if negative { -value } else { value }, number)
    }

    fn primary(&mut self, depth: usize) -> Result<Acc, UnitError> {
        let Some(t) = self.peek() else {
            let msg = if self.text.is_empty() {
                "empty unit"
            } else {
                "expected a unit name at the end"
            };
            return fail(msg, self.last());
        };
        self.pos += 1;
        match t.tok {
            Tok::Name => {
                let name = self.slice(t);
                let def = registry::lookup(name).ok_or_else(|| unknown_name(name, t))?;
                self.atoms.push((def, t));
                Ok(Acc {
                    factor: def.factor,
                    dim: def.dim,
                })
            }
            Tok::Number => {
                let starts_expr = self.pos == 1 || self.tokens[self.pos - 2].tok == Tok::Open;
                let before_slash = self.peek().map(|n| n.tok) == Some(Tok::Div);
                if self.slice(t) != "1" || !starts_expr || !before_slash {
                    return fail("a number may appear in a unit only as the 1 of 1/s", t);
                }
                self.compound = true;
                Ok(Acc {
                    factor: 1.0,
                    dim: Dimension::NONE,
                })
            }
            Tok::Open if depth >= MAX_DEPTH => fail("parentheses are nested too deeply", t),
            Tok::Open => {
                let inner = self.expr(depth + 1)?;
                self.eat(Tok::Close)
                    .map_or_else(|| fail("this '(' is never closed", t), Ok)?;
                Ok(inner)
            }
            _ => fail(
                format!("expected a unit name before '{}'", self.slice(t)),
                t,
            ),
        }
    }
}

fn check_exponent(n: i32, at: Token) -> Result<i32, UnitError> {
    if n == 0 {
        return fail("an exponent of 0 is not allowed", at);
    }
    if n.unsigned_abs() > MAX_EXPONENT {
        return fail(
            format!("exponent {n} is out of range: at most {MAX_EXPONENT} in size"),
            at,
        );
    }
    Ok(n)
}

fn unknown_name(name: &str, t: Token) -> UnitError {
    let stem = name.trim_end_matches(|c: char| c.is_ascii_digit());
    let marked = name.strip_suffix("(g)").or(name.strip_suffix("(a)"));
    let message = if stem.len() < name.len() && registry::lookup(stem).is_some() {
        let power = &name[stem.len()..];
        format!("unknown unit '{name}': write powers with '^', e.g. {stem}^{power}")
    } else if marked == Some("psi") {
        format!("unknown unit '{name}': write psig (gauge) or psia (absolute)")
    } else if let Some(scale) = registry::temperature_spelling(name) {
        let mut err = UnitError::new(
            format!(
                "unknown unit '{name}': a temperature is written {scale} (or °{})",
                &scale[3..]
            ),
            t.start,
            t.end - t.start,
        );
        err.suggestions = vec![scale.to_string()];
        return err;
    } else if marked.is_some() {
        format!("unknown unit '{name}': the marks (g) and (a) go only on Pa, kPa, MPa and bar")
    } else {
        format!("unknown unit '{name}'")
    };
    let mut err = UnitError::new(message, t.start, t.end - t.start);
    err.suggestions = registry::suggest(&name.replace(['(', ')'], ""));
    err
}

/// Parse a unit expression such as "m", "m^3/h", "lbf/in^2", "kg/(m*s)", "kg/(m·s)", "psig",
/// "kPa(g)", "bar(a)", "degF", "°C", "USD/kWh", "%", "1/s", "ft^3/s".
///
/// A temperature scale (degC, degF, K, degR) standing alone gives an affine unit (a
/// temperature point); inside a compound unit it is a degree size with no offset. A gauge or
/// absolute pressure unit must stand alone. One unit may name at most one currency.
pub fn parse_unit(text: &str) -> Result<Unit, UnitError> {
    let tokens = lex(text)?;
    let mut parser = Parser {
        text,
        tokens,
        pos: 0,
        atoms: Vec::new(),
        compound: false,
    };
    let acc = parser.expr(0)?;
    if let Some(t) = parser.peek() {
        return match t.tok {
            Tok::Close => fail("this ')' has no matching '('", t),
            _ => fail(
                format!("expected '*' or '/' before '{}'", parser.slice(t)),
                t,
            ),
        };
    }
    let bare = !parser.compound && parser.atoms.len() == 1;
    let mut currency: Option<&str> = None;
    for &(def, t) in &parser.atoms {
        if !bare && registry::pressure_reference(def).is_some() {
            let msg = format!(
                "'{}' states a pressure reference and must stand alone; use a plain pressure \
                 unit (psi, kPa, bar) inside a compound unit",
                def.name
            );
            return fail(msg, t);
        }
        if registry::is_currency(def) {
            match currency {
                Some(first) if first != def.name => {
                    let (second, why) = (def.name, "dutyline does not convert currencies");
                    return fail(format!("this unit mixes {first} and {second}; {why}"), t);
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

    fn at(text: &str) -> (usize, usize) {
        let e = parse_unit(text).expect_err(text);
        (e.offset, e.len)
    }

    #[test]
    fn the_written_forms_of_powers_and_groups_agree() {
        for text in ["1/s", "s^-1", "s^(-1)", "s^(−1)", "s⁻¹", "Hz", "(1/s)"] {
            assert_eq!(unit(text).dim, Dimension::FREQUENCY, "{text}");
        }
        let viscosity = unit("kg/(m*s)");
        for text in ["kg/m/s", "kg/(m·s)", "kg*m^-1*s^-1", "Pa*s", "(kg/m)/s"] {
            assert_eq!(
                (unit(text).dim, unit(text).factor),
                (viscosity.dim, 1.0),
                "{text}"
            );
        }
        assert_eq!(unit("m²").dim, Dimension::AREA);
        assert_eq!(unit("m³/h").factor, unit("m^3/h").factor);
    }

    #[test]
    fn temperature_scales_are_points_alone_and_degree_sizes_in_compounds() {
        let c = unit("degC");
        assert!(c.affine && c.offset == 273.15 && c.factor == 1.0);
        assert!(unit("K").affine && unit("K").offset == 0.0);
        assert!(unit("(degF)").affine);
        for text in ["1/degC", "degF^2", "delta_degC"] {
            assert!(!unit(text).affine && unit(text).offset == 0.0, "{text}");
        }
        assert_eq!(at("1/psig"), (2, 4));
        let k = unit("W/(m*degC)");
        assert!(!k.affine && k.offset == 0.0 && k.factor == 1.0);
        let f = unit("Btu/degF");
        assert!(!f.affine && (f.factor - 1055.05585262 * 1.8).abs() < 1e-9);
        let d = unit("delta_degF");
        assert!(!d.affine && d.offset == 0.0 && (d.factor - 5.0 / 9.0).abs() < 1e-15);
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
        assert_eq!(at("psig/ft"), (0, 4));
        assert_eq!(at("m(g)"), (0, 4));
        assert!(parse_unit("psi(g)")
            .expect_err("psi(g)")
            .message
            .contains("psig"));
    }

    #[test]
    fn errors_point_at_the_offending_part() {
        let e = parse_unit("gmp/ft").expect_err("unknown");
        assert_eq!((e.offset, e.len, e.suggestions[0].as_str()), (0, 3, "gpm"));
        let cases = [
            ("", (0, 0)),
            ("^", (0, 1)),
            ("m^", (1, 1)),
            ("m^999", (2, 3)),
            ("m^0", (2, 1)),
            ("((m", (1, 1)),
            ("m/", (1, 1)),
            ("m)", (1, 1)),
            ("m^3 /h", (3, 1)),
            ("kg/m*s", (4, 1)),
            ("2/s", (0, 1)),
            ("m*1/s", (2, 1)),
            ("ft3", (0, 3)),
            ("m^2.5", (3, 1)),
            ("°X/s", (0, 3)),
            ("m(s)", (1, 1)),
            ("USD/EUR", (4, 3)),
            ("m^(2", (2, 1)),
            ("s⁻", (1, 3)),
        ];
        for (text, span) in cases {
            assert_eq!(at(text), span, "{text:?}");
        }
        assert!(parse_unit("ft3").expect_err("ft3").message.contains("ft^3"));
        assert!(parse_unit("kg/m*s")
            .expect_err("amb")
            .message
            .contains("kg/(m*s)"));
    }

    #[test]
    fn deep_nesting_and_huge_exponent_sums_are_errors() {
        let deep = format!("{}m{}", "(".repeat(40), ")".repeat(40));
        assert!(parse_unit(&deep)
            .expect_err("deep")
            .message
            .contains("nested"));
        let many = ["m^9"; 20].join("*");
        assert!(parse_unit(&many)
            .expect_err("many")
            .message
            .contains("too large"));
        let tiny = ["mm^9"; 12].join("*");
        assert!(parse_unit(&tiny)
            .expect_err("tiny")
            .message
            .contains("out of range"));
        assert!(parse_unit(&["mm^9"; 11].join("*")).is_ok());
    }
}
