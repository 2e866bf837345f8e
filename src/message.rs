//! Typed messages: what the model and the analysis say about a design, with every
//! quantity kept as an SI value and its kind, so that only the outputs turn it into
//! report units (through [`crate::display::Units::render`]). A stage below the
//! outputs never formats a quantity itself.

use std::borrow::Cow;

/// The kind of a quantity in a message: which report unit shows it (see the
/// methods of the same names on [`crate::display::Units`]).
#[derive(Clone, Copy, Debug, PartialEq, Eq)]
pub enum Kind {
    /// Volume flow, m³/s.
    Flow,
    /// Head of fluid, m.
    Head,
    /// Elevation or level, m.
    Elevation,
    /// Pipe length, m.
    Length,
    /// Diameter, m.
    Diameter,
    /// A pressure difference (a drop, a rise), Pa.
    Pressure,
    /// A gauge pressure (above the local atmosphere), Pa.
    GaugePressure,
    /// An absolute pressure, Pa.
    AbsolutePressure,
    /// A pressure rating or screened pressure, Pa.
    Rating,
    /// Power, W.
    Power,
    /// Velocity, m/s.
    Velocity,
    /// Pressure-wave speed, m/s.
    WaveSpeed,
    /// Temperature, K.
    Temperature,
    /// Rotational speed, rpm.
    Speed,
    /// Energy, J.
    Energy,
    /// Energy per volume delivered, J/m³.
    SpecificEnergy,
    /// Volume, m³.
    Volume,
}

/// One piece of a message.
#[derive(Clone, Debug)]
pub enum Part {
    /// Plain words of the program's own, printed as they are.
    Text(&'static str),
    /// Plain words made when the message is (names, numbers already worded), printed as
    /// they are; held at their length (an analysis may hold a million messages).
    Owned(Box<str>),
    /// A quantity (SI value of its kind), printed with its report unit.
    Value(Kind, f64),
    /// A quantity printed with as many more decimals as it takes not to read like
    /// `against` (the first of [`crate::display::Shown::fmt_against`]); SI values.
    Against(Kind, f64, f64),
    /// A quantity typeset for print: a minus sign (U+2212), never "−0.0"
    /// ([`crate::display::Shown::text`]); SI value.
    Typeset(Kind, f64),
    /// As [`Part::Typeset`] without the unit ([`crate::display::Shown::figure`]).
    Figure(Kind, f64),
    /// A fraction as a percentage with one decimal ("76.5 %").
    Percent(f64),
    /// A fraction as a percentage that does not read like the fraction `against`.
    PercentAgainst(f64, f64),
    /// A ratio with two decimals or more, not reading like the ratio `against`.
    RatioAgainst(f64, f64),
    /// A number to `digits` significant figures, trailing zeros dropped.
    Significant(f64, usize),
    /// The name of the volume a cost per volume is given in (`m³`, `1000 gal`).
    VolumeCostUnit,
    /// Parts shared by many messages, read in place (a candidate's motor findings,
    /// repeated in the motor check of every case): one copy for all of them.
    Shared(std::sync::Arc<[Part]>),
}

impl Part {
    /// The words of a `Text` or `Owned` part.
    fn words(&self) -> Option<&str> {
        match self {
            Part::Text(t) => Some(t),
            Part::Owned(t) => Some(t),
            _ => None,
        }
    }
}

/// Parts are equal when they read the same: words by their text, whether borrowed or
/// owned (as `Cow` compared them); the others by kind and value.
impl PartialEq for Part {
    fn eq(&self, other: &Part) -> bool {
        use Part::*;
        match (self, other) {
            (Value(k, a), Value(l, b))
            | (Typeset(k, a), Typeset(l, b))
            | (Figure(k, a), Figure(l, b)) => k == l && a == b,
            (Against(k, a, x), Against(l, b, y)) => k == l && a == b && x == y,
            (Percent(a), Percent(b)) => a == b,
            (PercentAgainst(a, x), PercentAgainst(b, y))
            | (RatioAgainst(a, x), RatioAgainst(b, y)) => a == b && x == y,
            (Significant(a, m), Significant(b, n)) => a == b && m == n,
            (VolumeCostUnit, VolumeCostUnit) => true,
            (Shared(a), Shared(b)) => a == b,
            _ => matches!((self.words(), other.words()), (Some(a), Some(b)) if a == b),
        }
    }
}

impl From<&'static str> for Part {
    fn from(text: &'static str) -> Part {
        Part::Text(text)
    }
}

impl From<String> for Part {
    fn from(text: String) -> Part {
        Part::Owned(text.into_boxed_str())
    }
}

impl From<&String> for Part {
    fn from(text: &String) -> Part {
        Part::Owned(text.as_str().into())
    }
}

impl From<Cow<'static, str>> for Part {
    fn from(text: Cow<'static, str>) -> Part {
        match text {
            Cow::Borrowed(words) => Part::Text(words),
            Cow::Owned(words) => Part::from(words),
        }
    }
}

/// A sentence of words and quantities, rendered in report units by the outputs.
#[derive(Clone, Debug, Default, PartialEq)]
pub struct Message {
    /// The pieces in reading order.
    pub parts: Vec<Part>,
}

impl Message {
    /// An empty message.
    pub fn new() -> Message {
        Message::default()
    }
    /// A message of plain words only.
    pub fn text(text: impl Into<Cow<'static, str>>) -> Message {
        Message {
            parts: vec![Part::from(text.into())],
        }
    }
    /// An empty message with room for `parts` parts.
    pub fn with_capacity(parts: usize) -> Message {
        Message {
            parts: Vec::with_capacity(parts),
        }
    }
    /// Appends one part.
    pub fn push(&mut self, part: impl Into<Part>) {
        self.parts.push(part.into());
    }
    /// Appends plain words.
    pub fn push_str(&mut self, text: impl Into<Cow<'static, str>>) {
        self.parts.push(Part::from(text.into()));
    }
    /// Appends every part of `other`.
    pub fn append(&mut self, other: &Message) {
        self.parts.extend(other.parts.iter().cloned());
    }
    /// `text` followed by this message.
    pub fn prefixed(mut self, text: impl Into<Cow<'static, str>>) -> Message {
        self.parts.insert(0, Part::from(text.into()));
        self
    }
    /// The message's text when it holds no quantity (plain words only), else `None`.
    pub fn plain(&self) -> Option<String> {
        let mut out = String::new();
        plain_into(&self.parts, &mut out).then_some(out)
    }
}

/// Appends the words of `parts` to `out`; false at the first quantity.
fn plain_into(parts: &[Part], out: &mut String) -> bool {
    parts.iter().all(|part| match part {
        Part::Text(t) => {
            out.push_str(t);
            true
        }
        Part::Owned(t) => {
            out.push_str(t);
            true
        }
        Part::Shared(shared) => plain_into(shared, out),
        _ => false,
    })
}

/// A message, or how to make it when it is read: a check of one of thousands of cases
/// holds the few numbers its words need instead of the words, which most outputs never
/// print (the text of a summarised design prints the governing cases' only). Made
/// again at every read, from the same numbers, so the same every time.
#[derive(Clone)]
pub enum Words {
    /// The message itself.
    Made(Message),
    /// The function that makes it (a closure over the numbers it needs).
    Later(std::sync::Arc<dyn Fn() -> Message + Send + Sync>),
}

impl Words {
    /// Words made when read from `make`.
    pub fn later(make: impl Fn() -> Message + Send + Sync + 'static) -> Words {
        Words::Later(std::sync::Arc::new(make))
    }

    /// The message (made now for [`Words::Later`]).
    pub fn get(&self) -> Cow<'_, Message> {
        match self {
            Words::Made(m) => Cow::Borrowed(m),
            Words::Later(make) => Cow::Owned(make()),
        }
    }
}

impl From<Message> for Words {
    fn from(message: Message) -> Words {
        Words::Made(message)
    }
}

impl std::fmt::Debug for Words {
    fn fmt(&self, f: &mut std::fmt::Formatter<'_>) -> std::fmt::Result {
        self.get().fmt(f)
    }
}

/// Words are equal when their messages are, however they are held.
impl PartialEq for Words {
    fn eq(&self, other: &Words) -> bool {
        self.get() == other.get()
    }
}

impl From<&'static str> for Message {
    fn from(text: &'static str) -> Message {
        Message::text(text)
    }
}

impl From<String> for Message {
    fn from(text: String) -> Message {
        Message::text(text)
    }
}

/// A quantity of `kind` (SI value) as a message part.
pub fn value(kind: Kind, si: f64) -> Part {
    Part::Value(kind, si)
}

/// A flow (m³/s) as a message part.
pub fn flow(si: f64) -> Part {
    Part::Value(Kind::Flow, si)
}

/// A head (m) as a message part.
pub fn head(si: f64) -> Part {
    Part::Value(Kind::Head, si)
}

/// A quantity that must not read like `against` (both SI) as a message part.
pub fn against(kind: Kind, si: f64, against: f64) -> Part {
    Part::Against(kind, si, against)
}

/// A message from its parts: `message!["flow ", flow(q), " is low"]`; each item is
/// anything that turns into a [`Part`] (`&str`, `String`, a part).
#[macro_export]
macro_rules! message {
    ($($part:expr),* $(,)?) => {{
        #[allow(unused_mut)]
        let mut m = $crate::message::Message::with_capacity(
            [$(stringify!($part)),*].len(),
        );
        $( m.push($part); )*
        m
    }};
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn words_compare_by_their_text_whether_borrowed_or_owned() {
        assert_eq!(Part::Text("pump A"), Part::from("pump A".to_string()));
        assert_ne!(Part::Text("pump A"), Part::from("pump B".to_string()));
        assert_ne!(Part::Text("1"), Part::Percent(1.0));
        assert_eq!(head(2.0), Part::Value(Kind::Head, 2.0));
        assert_ne!(head(2.0), flow(2.0));
        let shared = Part::Shared(std::sync::Arc::from([Part::Text("a"), head(1.0)]));
        assert_eq!(shared.clone(), shared);
    }

    #[test]
    fn plain_reads_through_shared_parts_and_stops_at_a_quantity() {
        let words = Message {
            parts: vec![
                Part::Text("a "),
                Part::Shared(std::sync::Arc::from([Part::from("b ".to_string())])),
                Part::Text("c"),
            ],
        };
        assert_eq!(words.plain().as_deref(), Some("a b c"));
        let with_value = crate::message!["a ", Part::Shared(std::sync::Arc::from([head(1.0)]))];
        assert_eq!(with_value.plain(), None);
    }
}
