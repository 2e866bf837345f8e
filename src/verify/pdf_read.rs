//! A bounded reader for the PDF files dutyline writes: a header, indirect objects one
//! after another, a classic cross-reference table, the trailer, `startxref` and
//! `%%EOF` (ISO 32000-1, 7.5). It reads the objects in file order, so the end of the
//! first revision is known exactly and an incremental update appended later (a
//! signature) is left for the caller to report.
//!
//! The input is untrusted: every read is bounds-checked, nesting is capped at
//! [`MAX_DEPTH`], decoded streams at [`MAX_DECODED_BYTES`], objects at
//! [`MAX_OBJECTS`]; every loop advances through the input, so none can hang, and no
//! input makes it panic. Anything dutyline does not write (cross-reference streams,
//! object streams, stream lengths by reference, filters other than `FlateDecode`) is
//! refused as [`ReadError::Unsupported`].

use std::collections::BTreeMap;
use std::io::Read;
use std::ops::Range;

/// Deepest nesting of arrays and dictionaries read.
pub const MAX_DEPTH: usize = 32;
/// Most indirect objects read from one file.
pub const MAX_OBJECTS: usize = 200_000;
/// Largest decoded stream, in bytes (64 MiB).
pub const MAX_DECODED_BYTES: usize = 64 << 20;

/// A PDF object (ISO 32000-1, 7.3).
#[derive(Debug, Clone, PartialEq)]
pub enum Obj {
    /// `null`.
    Null,
    /// A boolean.
    Bool(bool),
    /// An integer.
    Int(i64),
    /// A real number.
    Real(f64),
    /// A name without its `/`, `#xx` escapes decoded.
    Name(Vec<u8>),
    /// A string's bytes, escapes decoded.
    Str(Vec<u8>),
    /// An array.
    Array(Vec<Obj>),
    /// A dictionary.
    Dict(Dict),
    /// An indirect reference: object number, generation.
    Ref(u32, u16),
    /// A stream: its dictionary and the byte range of its (encoded) data in the file.
    Stream(Dict, Range<usize>),
}

/// A dictionary in file order.
pub type Dict = Vec<(Vec<u8>, Obj)>;

/// Why a file could not be read as a dutyline PDF.
#[derive(Debug, Clone, PartialEq, Eq)]
pub enum ReadError {
    /// The file does not start with `%PDF-`.
    NotPdf,
    /// The file ends before the first revision is complete (at byte `at`).
    Truncated {
        /// Byte offset in the file where it ends.
        at: usize,
    },
    /// Something unexpected at byte `at`.
    Malformed {
        /// Byte offset in the file.
        at: usize,
        /// What was found or expected.
        what: String,
    },
    /// A PDF feature dutyline never writes.
    Unsupported(String),
}

impl std::fmt::Display for ReadError {
    fn fmt(&self, f: &mut std::fmt::Formatter<'_>) -> std::fmt::Result {
        match self {
            ReadError::NotPdf => {
                write!(f, "the file is not a PDF (it does not start with `%PDF-`)")
            }
            ReadError::Truncated { at } => write!(
                f,
                "the file ends at byte {at}, before its first revision is complete (truncated?)"
            ),
            ReadError::Malformed { at, what } => write!(f, "damaged at byte {at}: {what}"),
            ReadError::Unsupported(what) => {
                write!(f, "it uses {what}, which dutyline never writes")
            }
        }
    }
}

type Result<T> = std::result::Result<T, ReadError>;

/// The first revision of a PDF, read object by object.
#[derive(Debug)]
pub struct Pdf<'a> {
    /// The whole file.
    pub bytes: &'a [u8],
    /// Each object by number, with the byte range of `N G obj … endobj`.
    pub objects: BTreeMap<u32, (Obj, Range<usize>)>,
    /// The trailer dictionary.
    pub trailer: Dict,
    /// Where the first revision ends: right after its `%%EOF` (an end-of-line marker
    /// after it counts as appended, as dutyline writes none).
    pub end: usize,
}

/// Reads the first revision of `bytes`.
pub fn read(bytes: &[u8]) -> Result<Pdf<'_>> {
    if !bytes.starts_with(b"%PDF-") {
        return Err(ReadError::NotPdf);
    }
    let mut lx = Lexer { b: bytes, pos: 0 };
    lx.skip_line();
    let mut objects = BTreeMap::new();
    loop {
        lx.skip_ws();
        if lx.pos >= bytes.len() {
            return Err(ReadError::Truncated { at: lx.pos });
        }
        if lx.keyword(b"xref") {
            break;
        }
        if objects.len() >= MAX_OBJECTS {
            return Err(lx.malformed("more objects than dutyline ever writes"));
        }
        let start = lx.pos;
        let (number, object) = lx.indirect_object()?;
        if objects.insert(number, (object, start..lx.pos)).is_some() {
            return Err(ReadError::Unsupported(format!(
                "object {number} defined twice in one revision"
            )));
        }
    }
    let offsets = lx.xref_table()?;
    check_offsets(&offsets, &objects)?;
    lx.skip_ws();
    if !lx.keyword(b"trailer") {
        return Err(lx.expected("`trailer`"));
    }
    let trailer = match lx.object(0)? {
        Obj::Dict(d) => d,
        _ => return Err(lx.malformed("the trailer is not a dictionary")),
    };
    lx.skip_ws();
    if !lx.keyword(b"startxref") {
        return Err(lx.expected("`startxref`"));
    }
    lx.skip_ws();
    lx.unsigned()?;
    lx.skip_ws_only();
    if !lx.literal(b"%%EOF") {
        return Err(lx.expected("`%%EOF`"));
    }
    Ok(Pdf {
        bytes,
        objects,
        trailer,
        end: lx.pos,
    })
}

/// Every in-use entry of the cross-reference table must point at its object.
fn check_offsets(
    offsets: &[(u32, usize)],
    objects: &BTreeMap<u32, (Obj, Range<usize>)>,
) -> Result<()> {
    for &(number, offset) in offsets {
        match objects.get(&number) {
            Some((_, span)) if span.start == offset => {}
            _ => {
                return Err(ReadError::Malformed {
                    at: offset,
                    what: format!("the cross-reference table puts object {number} where it is not"),
                })
            }
        }
    }
    Ok(())
}

impl<'a> Pdf<'a> {
    /// The object `o` refers to (followed through at most 8 references), or `o`.
    pub fn resolve<'b>(&'b self, mut o: &'b Obj) -> &'b Obj {
        for _ in 0..8 {
            match o {
                Obj::Ref(n, _) => match self.objects.get(n) {
                    Some((target, _)) => o = target,
                    None => return &Obj::Null,
                },
                _ => return o,
            }
        }
        &Obj::Null
    }

    /// The value of `key` in `dict`, references resolved.
    pub fn get<'b>(&'b self, dict: &'b Dict, key: &[u8]) -> &'b Obj {
        dict.iter()
            .find(|(k, _)| k == key)
            .map_or(&Obj::Null, |(_, v)| self.resolve(v))
    }

    /// A stream's data, decoded (no filter or `FlateDecode`), at most
    /// [`MAX_DECODED_BYTES`].
    pub fn decode(&self, dict: &Dict, range: &Range<usize>) -> Result<Vec<u8>> {
        let raw = self.bytes.get(range.clone()).ok_or(ReadError::Truncated {
            at: self.bytes.len(),
        })?;
        if !matches!(self.get(dict, b"DecodeParms"), Obj::Null) {
            return Err(ReadError::Unsupported("stream decode parameters".into()));
        }
        let flate = match self.get(dict, b"Filter") {
            Obj::Null => false,
            Obj::Name(n) if n == b"FlateDecode" => true,
            Obj::Array(a) if a.len() == 1 && a[0] == Obj::Name(b"FlateDecode".to_vec()) => true,
            Obj::Array(a) if a.is_empty() => false,
            _ => {
                return Err(ReadError::Unsupported(
                    "a stream filter other than FlateDecode".into(),
                ))
            }
        };
        if !flate {
            return Ok(raw.to_vec());
        }
        let mut out = Vec::new();
        flate2::read::ZlibDecoder::new(raw)
            .take(MAX_DECODED_BYTES as u64 + 1)
            .read_to_end(&mut out)
            .map_err(|e| ReadError::Malformed {
                at: range.start,
                what: format!("a compressed stream does not decompress ({e})"),
            })?;
        if out.len() > MAX_DECODED_BYTES {
            return Err(ReadError::Malformed {
                at: range.start,
                what: format!("a stream decompresses to more than {MAX_DECODED_BYTES} bytes"),
            });
        }
        Ok(out)
    }

    /// The object whose `N G obj … endobj` holds byte `offset`.
    pub fn object_at(&self, offset: usize) -> Option<u32> {
        self.objects
            .iter()
            .find(|(_, (_, span))| span.contains(&offset))
            .map(|(n, _)| *n)
    }
}

/// A PDF text string as Rust text: UTF-16BE after a byte-order mark, else each byte
/// as the character of that code (PDFDocEncoding agrees with Latin-1 on ASCII).
pub fn text(bytes: &[u8]) -> String {
    match bytes.strip_prefix(&[0xfe, 0xff]) {
        Some(rest) => {
            let units: Vec<u16> = rest
                .chunks(2)
                .map(|c| u16::from_be_bytes([c[0], *c.get(1).unwrap_or(&0)]))
                .collect();
            String::from_utf16_lossy(&units)
        }
        None => bytes.iter().map(|&b| char::from(b)).collect(),
    }
}

/// Parses one object from `bytes` (e.g. a `/ByteRange [...]` array), if it is one.
pub fn parse_object(bytes: &[u8]) -> Option<Obj> {
    let mut lx = Lexer { b: bytes, pos: 0 };
    lx.object(0).ok()
}

struct Lexer<'a> {
    b: &'a [u8],
    pos: usize,
}

fn is_ws(c: u8) -> bool {
    matches!(c, b'\0' | b'\t' | b'\n' | b'\x0c' | b'\r' | b' ')
}

fn is_delimiter(c: u8) -> bool {
    matches!(
        c,
        b'(' | b')' | b'<' | b'>' | b'[' | b']' | b'{' | b'}' | b'/' | b'%'
    )
}

fn is_regular(c: u8) -> bool {
    !is_ws(c) && !is_delimiter(c)
}

fn hex_value(c: u8) -> Option<u8> {
    (c as char).to_digit(16).map(|d| d as u8)
}

impl Lexer<'_> {
    fn peek(&self) -> Option<u8> {
        self.b.get(self.pos).copied()
    }

    fn malformed(&self, what: &str) -> ReadError {
        if self.pos >= self.b.len() {
            return ReadError::Truncated { at: self.b.len() };
        }
        ReadError::Malformed {
            at: self.pos,
            what: what.to_string(),
        }
    }

    fn expected(&self, what: &str) -> ReadError {
        self.malformed(&format!("expected {what}"))
    }

    fn skip_line(&mut self) {
        while let Some(c) = self.peek() {
            self.pos += 1;
            if c == b'\n' || c == b'\r' {
                break;
            }
        }
    }

    /// Skips white space and comments.
    fn skip_ws(&mut self) {
        while let Some(c) = self.peek() {
            if is_ws(c) {
                self.pos += 1;
            } else if c == b'%' && !self.b[self.pos..].starts_with(b"%%EOF") {
                self.skip_line();
            } else {
                break;
            }
        }
    }

    fn skip_ws_only(&mut self) {
        while self.peek().is_some_and(is_ws) {
            self.pos += 1;
        }
    }

    /// An end-of-line marker, if there is one.
    fn eol(&mut self) {
        if self.peek() == Some(b'\r') {
            self.pos += 1;
        }
        if self.peek() == Some(b'\n') {
            self.pos += 1;
        }
    }

    /// Consumes `word` when it is next, whatever follows.
    fn literal(&mut self, word: &[u8]) -> bool {
        if self.b[self.pos.min(self.b.len())..].starts_with(word) {
            self.pos += word.len();
            true
        } else {
            false
        }
    }

    /// Consumes the keyword `word` when it is next and ends there.
    fn keyword(&mut self, word: &[u8]) -> bool {
        let rest = &self.b[self.pos.min(self.b.len())..];
        let ends = rest.get(word.len()).is_none_or(|&c| !is_regular(c));
        if rest.starts_with(word) && ends {
            self.pos += word.len();
            true
        } else {
            false
        }
    }

    fn unsigned(&mut self) -> Result<u64> {
        let start = self.pos;
        let mut value: u64 = 0;
        while let Some(c) = self.peek().filter(u8::is_ascii_digit) {
            value = value
                .checked_mul(10)
                .and_then(|v| v.checked_add(u64::from(c - b'0')))
                .ok_or_else(|| self.malformed("a number too large"))?;
            self.pos += 1;
        }
        if self.pos == start {
            return Err(self.expected("a number"));
        }
        Ok(value)
    }

    /// `N G obj <object> [stream … endstream] endobj`.
    fn indirect_object(&mut self) -> Result<(u32, Obj)> {
        let number = u32::try_from(self.unsigned()?)
            .map_err(|_| self.malformed("an object number too large"))?;
        self.skip_ws();
        self.unsigned()?;
        self.skip_ws();
        if !self.keyword(b"obj") {
            return Err(self.expected("`obj`"));
        }
        let mut object = self.object(0)?;
        self.skip_ws();
        if self.keyword(b"stream") {
            let Obj::Dict(dict) = object else {
                return Err(self.malformed("a stream without a dictionary"));
            };
            object = self.stream_data(dict)?;
            self.skip_ws();
        }
        if !self.keyword(b"endobj") {
            return Err(self.expected("`endobj`"));
        }
        Ok((number, object))
    }

    /// The data after `stream`: exactly `/Length` bytes, then `endstream`.
    fn stream_data(&mut self, dict: Dict) -> Result<Obj> {
        self.eol();
        let length = match dict.iter().find(|(k, _)| k == b"Length") {
            Some((_, Obj::Int(n))) if *n >= 0 => *n as usize,
            Some((_, Obj::Ref(..))) => {
                return Err(ReadError::Unsupported(
                    "a stream length given by reference".into(),
                ))
            }
            _ => return Err(self.malformed("a stream without a valid /Length")),
        };
        let start = self.pos;
        let end = start
            .checked_add(length)
            .filter(|&e| e <= self.b.len())
            .ok_or(ReadError::Truncated { at: self.b.len() })?;
        self.pos = end;
        self.skip_ws_only();
        if !self.keyword(b"endstream") {
            return Err(self.expected("`endstream` after /Length bytes of stream data"));
        }
        Ok(Obj::Stream(dict, start..end))
    }

    /// The cross-reference table after `xref`: the in-use entries as (number, offset).
    fn xref_table(&mut self) -> Result<Vec<(u32, usize)>> {
        let mut entries = Vec::new();
        loop {
            self.skip_ws();
            if !self.peek().is_some_and(|c| c.is_ascii_digit()) {
                break;
            }
            let first = self.unsigned()?;
            self.skip_ws();
            let count = self.unsigned()?;
            if first.saturating_add(count) > MAX_OBJECTS as u64 + 1 {
                return Err(self.malformed("a cross-reference section larger than dutyline writes"));
            }
            for number in first..first + count {
                self.skip_ws();
                let offset = self.unsigned()?;
                self.skip_ws();
                self.unsigned()?;
                self.skip_ws();
                if self.keyword(b"n") {
                    entries.push((number as u32, offset as usize));
                } else if !self.keyword(b"f") {
                    return Err(self.expected("`n` or `f` in the cross-reference table"));
                }
            }
        }
        Ok(entries)
    }

    /// One direct object (or reference), nested at most [`MAX_DEPTH`] deep.
    fn object(&mut self, depth: usize) -> Result<Obj> {
        if depth > MAX_DEPTH {
            return Err(self.malformed("objects nested deeper than dutyline writes"));
        }
        self.skip_ws();
        let Some(c) = self.peek() else {
            return Err(ReadError::Truncated { at: self.pos });
        };
        match c {
            b'/' => {
                self.pos += 1;
                Ok(Obj::Name(self.name()))
            }
            b'(' => self.literal_string().map(Obj::Str),
            b'<' if self.b.get(self.pos + 1) == Some(&b'<') => {
                self.pos += 2;
                self.dict(depth).map(Obj::Dict)
            }
            b'<' => self.hex_string().map(Obj::Str),
            b'[' => {
                self.pos += 1;
                self.array(depth).map(Obj::Array)
            }
            b'+' | b'-' | b'.' | b'0'..=b'9' => self.number_or_ref(),
            _ if self.keyword(b"true") => Ok(Obj::Bool(true)),
            _ if self.keyword(b"false") => Ok(Obj::Bool(false)),
            _ if self.keyword(b"null") => Ok(Obj::Null),
            _ => Err(self.malformed("an unexpected byte where an object should start")),
        }
    }

    fn name(&mut self) -> Vec<u8> {
        let mut out = Vec::new();
        while let Some(c) = self.peek().filter(|&c| is_regular(c)) {
            self.pos += 1;
            let escaped = (c == b'#')
                .then(|| {
                    let hi = hex_value(*self.b.get(self.pos)?)?;
                    let lo = hex_value(*self.b.get(self.pos + 1)?)?;
                    Some(hi * 16 + lo)
                })
                .flatten();
            match escaped {
                Some(byte) => {
                    out.push(byte);
                    self.pos += 2;
                }
                None => out.push(c),
            }
        }
        out
    }

    fn literal_string(&mut self) -> Result<Vec<u8>> {
        self.pos += 1;
        let mut out = Vec::new();
        let mut open = 1usize;
        loop {
            let Some(c) = self.peek() else {
                return Err(ReadError::Truncated { at: self.pos });
            };
            self.pos += 1;
            match c {
                b'(' => {
                    open += 1;
                    out.push(c);
                }
                b')' => {
                    open -= 1;
                    if open == 0 {
                        return Ok(out);
                    }
                    out.push(c);
                }
                b'\\' => self.escape(&mut out)?,
                _ => out.push(c),
            }
        }
    }

    /// The character after a backslash in a literal string (ISO 32000-1, Table 3).
    fn escape(&mut self, out: &mut Vec<u8>) -> Result<()> {
        let Some(c) = self.peek() else {
            return Err(ReadError::Truncated { at: self.pos });
        };
        self.pos += 1;
        match c {
            b'n' => out.push(b'\n'),
            b'r' => out.push(b'\r'),
            b't' => out.push(b'\t'),
            b'b' => out.push(0x08),
            b'f' => out.push(0x0c),
            b'\r' => {
                if self.peek() == Some(b'\n') {
                    self.pos += 1;
                }
            }
            b'\n' => {}
            b'0'..=b'7' => {
                let mut value = u32::from(c - b'0');
                for _ in 0..2 {
                    match self.peek().filter(|d| (b'0'..=b'7').contains(d)) {
                        Some(d) => {
                            value = value * 8 + u32::from(d - b'0');
                            self.pos += 1;
                        }
                        None => break,
                    }
                }
                out.push((value & 0xff) as u8);
            }
            other => out.push(other),
        }
        Ok(())
    }

    fn hex_string(&mut self) -> Result<Vec<u8>> {
        self.pos += 1;
        let mut digits = Vec::new();
        loop {
            let Some(c) = self.peek() else {
                return Err(ReadError::Truncated { at: self.pos });
            };
            self.pos += 1;
            match c {
                b'>' => break,
                _ if is_ws(c) => {}
                _ => digits.push(hex_value(c).ok_or_else(|| self.malformed("a bad hex string"))?),
            }
        }
        if digits.len() % 2 == 1 {
            digits.push(0);
        }
        Ok(digits.chunks(2).map(|p| p[0] * 16 + p[1]).collect())
    }

    fn array(&mut self, depth: usize) -> Result<Vec<Obj>> {
        let mut items = Vec::new();
        loop {
            self.skip_ws();
            if self.peek() == Some(b']') {
                self.pos += 1;
                return Ok(items);
            }
            items.push(self.object(depth + 1)?);
        }
    }

    fn dict(&mut self, depth: usize) -> Result<Dict> {
        let mut entries = Vec::new();
        loop {
            self.skip_ws();
            if self.literal(b">>") {
                return Ok(entries);
            }
            if self.peek() != Some(b'/') {
                return Err(self.expected("a name (a dictionary key) or `>>`"));
            }
            self.pos += 1;
            let key = self.name();
            let value = self.object(depth + 1)?;
            entries.push((key, value));
        }
    }

    /// A number, or `N G R` when two unsigned integers are followed by `R`.
    fn number_or_ref(&mut self) -> Result<Obj> {
        let start = self.pos;
        while self
            .peek()
            .is_some_and(|c| c.is_ascii_digit() || matches!(c, b'+' | b'-' | b'.'))
        {
            self.pos += 1;
        }
        let text = std::str::from_utf8(&self.b[start..self.pos]).unwrap_or("");
        if let Ok(int) = text.parse::<i64>() {
            let after = self.pos;
            if let Some(reference) = self.reference_tail(int) {
                return Ok(reference);
            }
            self.pos = after;
            return Ok(Obj::Int(int));
        }
        match text.parse::<f64>() {
            Ok(v) if v.is_finite() => Ok(Obj::Real(v)),
            _ => {
                self.pos = start;
                Err(self.malformed("a malformed number"))
            }
        }
    }

    /// ` G R` after an object number, if that is what follows.
    fn reference_tail(&mut self, number: i64) -> Option<Obj> {
        let number = u32::try_from(number).ok()?;
        self.skip_ws_only();
        let generation = u16::try_from(self.unsigned().ok()?).ok()?;
        self.skip_ws_only();
        self.keyword(b"R").then_some(Obj::Ref(number, generation))
    }
}
