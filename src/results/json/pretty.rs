//! The results document's layout: serde_json's pretty layout (two-space indent, one
//! member per line), except that an array of numbers, booleans and nulls is written on
//! one line (`[0.0, 0.1, null]`), so the column arrays of format 2 stay readable and
//! small.

use std::io::{self, Write};

/// A pretty formatter keeping arrays of plain values on one line.
pub(super) struct Formatter {
    indent: usize,
    /// Per open array: whether it holds an object, an array or a string (laid out
    /// one element per line), and whether the next element is its first.
    arrays: Vec<(bool, bool)>,
    /// An array element is pending: its separator waits until its kind is known.
    pending: bool,
    has_value: bool,
}

impl Formatter {
    pub(super) fn new() -> Self {
        Formatter {
            indent: 0,
            arrays: Vec::new(),
            pending: false,
            has_value: false,
        }
    }

    fn newline<W: ?Sized + Write>(&self, w: &mut W) -> io::Result<()> {
        w.write_all(b"\n")?;
        for _ in 0..self.indent {
            w.write_all(b"  ")?;
        }
        Ok(())
    }

    /// Writes the pending separator of an array element: `, ` before a plain value,
    /// a new line before a nested one.
    fn element<W: ?Sized + Write>(&mut self, w: &mut W, nested: bool) -> io::Result<()> {
        if !self.pending {
            return Ok(());
        }
        self.pending = false;
        let Some((was_nested, first)) = self.arrays.last_mut() else {
            return Ok(());
        };
        let lead = !*first;
        *first = false;
        *was_nested |= nested;
        if nested {
            if lead {
                w.write_all(b",")?;
            }
            self.newline(w)
        } else if lead {
            w.write_all(b", ")
        } else {
            Ok(())
        }
    }
}

macro_rules! plain {
    ($($name:ident: $t:ty),*) => {$(
        fn $name<W: ?Sized + Write>(&mut self, w: &mut W, v: $t) -> io::Result<()> {
            self.element(w, false)?;
            serde_json::ser::CompactFormatter.$name(w, v)
        }
    )*};
}

impl serde_json::ser::Formatter for Formatter {
    fn write_null<W: ?Sized + Write>(&mut self, w: &mut W) -> io::Result<()> {
        self.element(w, false)?;
        w.write_all(b"null")
    }

    plain!(write_bool: bool, write_i8: i8, write_i16: i16, write_i32: i32, write_i64: i64,
        write_u8: u8, write_u16: u16, write_u32: u32, write_u64: u64, write_f32: f32,
        write_f64: f64);

    fn begin_string<W: ?Sized + Write>(&mut self, w: &mut W) -> io::Result<()> {
        self.element(w, true)?;
        w.write_all(b"\"")
    }

    fn begin_array<W: ?Sized + Write>(&mut self, w: &mut W) -> io::Result<()> {
        self.element(w, true)?;
        self.indent += 1;
        self.arrays.push((false, true));
        self.has_value = false;
        w.write_all(b"[")
    }

    fn end_array<W: ?Sized + Write>(&mut self, w: &mut W) -> io::Result<()> {
        self.indent -= 1;
        let (nested, _) = self.arrays.pop().unwrap_or((false, true));
        if nested {
            self.newline(w)?;
        }
        w.write_all(b"]")
    }

    fn begin_array_value<W: ?Sized + Write>(&mut self, _w: &mut W, _first: bool) -> io::Result<()> {
        self.pending = true;
        Ok(())
    }

    fn end_array_value<W: ?Sized + Write>(&mut self, _w: &mut W) -> io::Result<()> {
        self.has_value = true;
        Ok(())
    }

    fn begin_object<W: ?Sized + Write>(&mut self, w: &mut W) -> io::Result<()> {
        self.element(w, true)?;
        self.indent += 1;
        self.has_value = false;
        // An object inside an array is laid out member by member: its array is not
        // plain, so a later array opened inside it starts afresh.
        self.arrays.push((true, true));
        w.write_all(b"{")
    }

    fn end_object<W: ?Sized + Write>(&mut self, w: &mut W) -> io::Result<()> {
        self.indent -= 1;
        self.arrays.pop();
        if self.has_value {
            self.newline(w)?;
        }
        self.has_value = true;
        w.write_all(b"}")
    }

    fn begin_object_key<W: ?Sized + Write>(&mut self, w: &mut W, first: bool) -> io::Result<()> {
        if !first {
            w.write_all(b",")?;
        }
        self.newline(w)
    }

    fn begin_object_value<W: ?Sized + Write>(&mut self, w: &mut W) -> io::Result<()> {
        w.write_all(b": ")
    }

    fn end_object_value<W: ?Sized + Write>(&mut self, _w: &mut W) -> io::Result<()> {
        self.has_value = true;
        Ok(())
    }
}

#[cfg(test)]
mod tests {
    use serde::Serialize;

    fn laid_out(v: &serde_json::Value) -> String {
        let mut out = Vec::new();
        let mut ser = serde_json::Serializer::with_formatter(&mut out, super::Formatter::new());
        v.serialize(&mut ser).expect("serialise");
        String::from_utf8(out).expect("utf-8")
    }

    #[test]
    fn plain_arrays_stay_on_one_line_and_the_value_is_unchanged() {
        let v = serde_json::json!({
            "a": [0.5, null, true, -3],
            "b": [{"x": [1, 2], "y": "s"}, {"x": [], "y": "t"}],
            "c": [["p", "q"], [1.5]],
            "d": {},
            "e": [],
            "f": [[], [{}]]
        });
        let text = laid_out(&v);
        assert_eq!(serde_json::from_str::<serde_json::Value>(&text).unwrap(), v);
        assert!(text.contains("\"a\": [0.5, null, true, -3]"), "{text}");
        assert!(text.contains("\"x\": [1, 2]"), "{text}");
        assert!(text.contains("\"x\": []"), "{text}");
        assert!(text.contains("\"d\": {}"), "{text}");
        // Strings and objects in arrays go one to a line, indented by depth.
        assert!(
            text.contains("[\n      \"p\",\n      \"q\"\n    ]"),
            "{text}"
        );
        assert!(text.contains("\"b\": [\n    {\n      \"x\""), "{text}");
    }
}
