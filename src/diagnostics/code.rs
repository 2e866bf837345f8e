//! Every diagnostic code of the tool, as one enum.
//!
//! A code is the stable short name a user searches for and a script matches on: it is
//! printed in brackets by the renderer (`error[unit-mismatch]`), written to the results
//! JSON (`diagnostics[].code`, `warnings[].code`) and listed with the same one-line
//! description in grammar/LANGUAGE.md ("Diagnostic codes"; a test keeps both in step).
//! [`Code::as_str`] gives the string, which never changes once released.

use serde::Serialize;

/// Declares the enum, its strings, descriptions and the list of all codes at once, so
/// a code cannot exist without its text and its description.
macro_rules! codes {
    ($($variant:ident = $text:literal : $description:literal;)*) => {
        /// A diagnostic code: what kind of problem a [`super::Diagnostic`] reports.
        #[derive(Clone, Copy, Debug, PartialEq, Eq, Hash, PartialOrd, Ord)]
        pub enum Code {
            $(#[doc = $description] $variant,)*
        }

        impl Code {
            /// Every code, in the order of grammar/LANGUAGE.md.
            pub const ALL: &'static [Code] = &[$(Code::$variant,)*];

            /// The code as printed and written to JSON, e.g. `unit-mismatch`.
            pub const fn as_str(self) -> &'static str {
                match self {
                    $(Code::$variant => $text,)*
                }
            }

            /// One line saying what the code reports (as in grammar/LANGUAGE.md).
            pub const fn description(self) -> &'static str {
                match self {
                    $(Code::$variant => $description,)*
                }
            }
        }
    };
}

codes! {
    // Reading the file and the grammar.
    FileTooLarge = "file-too-large": "a design or a file it reads is larger than 1 MiB";
    InvalidUtf8 = "invalid-utf8": "a design or a file it reads is not UTF-8 text";
    Syntax = "syntax": "the text does not follow the grammar (what was expected, what was found)";
    TooDeep = "too-deep": "brackets nested deeper than the limit";
    TooLong = "too-long": "a name, text or expression longer than its limit";
    NumberOutOfRange = "number-out-of-range": "a number too large to represent as a finite value";
    BadFraction = "bad-fraction": "a fraction such as `1/0` or `3/4/2` that is not a valid number";
    BadExponent = "bad-exponent": "a unit exponent too large";
    FormatFailed = "format-failed": "`fmt` cannot reproduce the file's content, so it is left unchanged";
    // Units and expressions.
    UnknownUnit = "unknown-unit": "a unit name that is not in the unit table";
    UnitMismatch = "unit-mismatch": "a value of the wrong dimension (a length where a flow is expected)";
    BadArithmetic = "bad-arithmetic": "an expression whose units cannot be combined (adding a length to a flow)";
    ExpectedNumber = "expected-number": "a word or text where a number with its unit is expected";
    ExpectedText = "expected-text": "a number or word where a quoted text is expected";
    ExpectedWord = "expected-word": "a number or text where a word (a name or keyword) is expected";
    // Names, statements and fields.
    UnknownName = "unknown-name": "a name that refers to nothing defined (tank, case, constant)";
    DuplicateName = "duplicate-name": "two tanks, lines, pumps, cases or constants with one name";
    ReservedName = "reserved-name": "a name the language keeps for itself (`pump` as a tank name)";
    Reserved = "reserved": "a keyword reserved for a later version of the language (`include`)";
    UnknownStatement = "unknown-statement": "a statement keyword the language or the block does not have";
    DuplicateBlock = "duplicate-block": "a block that may appear once given twice (`project`, `fluid`, `site`)";
    UnknownField = "unknown-field": "a field the block does not have";
    DuplicateField = "duplicate-field": "a field given twice in one block or case";
    MissingField = "missing-field": "a field the block needs is missing";
    ConflictingFields = "conflicting-fields": "fields that exclude each other given together";
    StrayField = "stray-field": "a field outside any block";
    StrayRequirement = "stray-requirement": "a requirement outside `require { ... }`";
    StrayCurve = "stray-curve": "a curve table outside a pump";
    StrayProfile = "stray-profile": "a pipe profile table outside a line";
    Unexpected = "unexpected": "a statement the block cannot hold (a block inside a fluid)";
    UnknownPath = "unknown-path": "a case override that names nothing a case can change";
    // The design's blocks.
    NoTitle = "no-title": "the project has no title";
    BadRevision = "bad-revision": "a revision line not of the form `revision ID YYYY-MM-DD \"description\"`";
    BadDate = "bad-date": "a date that is not a valid YYYY-MM-DD calendar date";
    BadText = "bad-text": "a project text statement without its one quoted text";
    BadFluid = "bad-fluid": "a fluid that is neither `water` nor a quoted name";
    BadTank = "bad-tank": "a tank without its name";
    BadCase = "bad-case": "a case without its name";
    BadPump = "bad-pump": "a pump without its name, or more than a description after it";
    BadLine = "bad-line": "a line that is not `line NAME from A to B` between a tank and the pump";
    MissingLine = "missing-line": "the design has no suction or no discharge line";
    EmptyLine = "empty-line": "a line without a pipe";
    BadPipe = "bad-pipe": "a pipe without a material and a size or bore";
    UnknownMaterial = "unknown-material": "a pipe material not in the catalogue";
    UnknownPipeSize = "unknown-pipe-size": "a nominal size or schedule not in the pipe catalogue";
    UnknownCase = "unknown-case": "a `load_profile` for a case the design does not have";
    UnknownPump = "unknown-pump": "a `cost` block for a pump the design does not have (warning)";
    UnusedField = "unused-field": "a field that the block's other settings make meaningless, e.g. `control_head` with `throttle`";
    MissingTable = "missing-table": "a `load_profile` without its `curve { ... }` table of flow against hours";
    UnexpectedStatement = "unexpected-statement": "a statement other than fields and the table inside a `load_profile`";
    MixedRates = "mixed-rates": "`inflation` given with real discount rates (real and nominal rates mixed)";
    BadUncertainty = "bad-uncertainty": "an `uncertainty` statement or `test_grade` that is not understood (a range, a grade, the combination)";
    MissingName = "missing-name": "a `load_profile` or `cost` block without the name of its case or pump";
    ZeroLength = "zero-length": "a pipe of zero length (warning: no wall friction counted)";
    BadFitting = "bad-fitting": "a fitting without its name, or a malformed count";
    UnknownFitting = "unknown-fitting": "a fitting name not in the fitting table";
    BadCount = "bad-count": "a fitting count that is not a whole number from 1 to 1000";
    FittingBeforePipe = "fitting-before-pipe": "a fitting or loss before the first pipe of its line";
    BadCurve = "bad-curve": "a curve header without `impeller`, `speed` or `from` and its value, or without a table";
    BadCsv = "bad-csv": "a curve file that is not a CSV curve table";
    UnknownColumn = "unknown-column": "a curve table column that is not flow, head, efficiency, power or NPSH required";
    MissingColumn = "missing-column": "a curve table without its flow or head column";
    BadRow = "bad-row": "a curve row with the wrong number of values, or flows not increasing";
    BadLink = "bad-link": "a network link not of the form `KIND NAME from A to B`, or from a node to itself";
    UnusedNode = "unused-node": "a network node joined to no link, or nodes without a discharge line ending at one";
    NoDownstreamTank = "no-downstream-tank": "a network that reaches no tank downstream of the station and draws no demand";
    WellFieldWithStation = "well-field-with-station": "a design with well pumps (`wellpump`) that also gives a `station` or a line to or from `pump`";
    WellPumpInLoop = "well-pump-in-loop": "a well pump whose well a network link returns to, or that discharges into another well (a closed loop through a well)";
    WellFieldNotAnalysed = "well-field-not-analysed": "a well field with a `load_profile` or `uncertainty` block, which are not computed for a well field (warning)";
    ExpansionTankDischarge = "expansion-tank-discharge": "a closed loop's expansion tank connected on the pump discharge (warning; its cases are not analysed)";
    BadNode = "bad-node": "a network node (`junction`, `delivery`) without a name";
    BadProfile = "bad-profile": "a pipe profile whose chainage does not start at 0 or does not increase";
    TooFewPoints = "too-few-points": "a curve with fewer than 3 points";
    BadRequirement = "bad-requirement": "a requirement not of the form `QUANTITY >= VALUE [for CASE, ...]`";
    NoCases = "no-cases": "no case given (warning: the base design is analysed as case `design`)";
    NoPumps = "no-pumps": "no pump candidate given (warning: only system curves are computed)";
    SiteAssumed = "site-assumed": "no site given (warning: sea-level barometric pressure is assumed)";
    // Limits and ranges.
    OutOfRange = "out-of-range": "a value outside its physically possible range";
    UnusualValue = "unusual-value": "a value outside its usual band (warning: a unit slip is likely)";
    TooMany = "too-many": "more cases, segments, pumps, curves or curve points than the limit";
    // Files a design reads.
    FileNotRead = "file-not-read": "a file named by the design or the command line that cannot be read";
    FileNotAllowed = "file-not-allowed": "a file outside the design's folder and every allowed folder";
    NotARegularFile = "not-a-regular-file": "a folder, FIFO, device or socket where a file is expected";
    // Style and layout.
    Style = "style": "a style file that is not valid";
    Layout = "layout": "a design that passes `check` but cannot be laid out on the page";
    // Analysis remarks.
    PumpCurve = "pump-curve": "a remark on a pump curve (its fit, its data)";
    CaseFailed = "case-failed": "a case that cannot be analysed";
    NoEntranceLoss = "no-entrance-loss": "a suction line without an entrance fitting (warning)";
    NoExitLoss = "no-exit-loss": "a discharge line without an exit fitting (warning)";
    StaticHead = "static-head": "a case whose static head is zero or negative (warning)";
    NpshNegative = "npsh-negative": "a case whose NPSH available is negative even at zero flow (warning)";
    GoverningCase = "governing-case": "a case without a flow requirement that delivers less at its limit than another case requires (warning)";
    UnstableCurve = "unstable-curve": "a pump head curve that rises with flow somewhere (warning)";
    MotorAltitude = "motor-altitude": "a site above 1000 m, where a motor's rating is derated (warning)";
    SafetyScreen = "safety-screen": "a remark of the pressure and surge screen, e.g. a line it could not screen (warning)";
    NoTestGrade = "no-test-grade": "an envelope asked for and a candidate without `test_grade`: grade 3B of ISO 9906:2012 is assumed (warning)";
    // The command line.
    Usage = "usage": "command-line arguments that do not make sense together";
    OutputRefused = "output-refused": "an output path that would replace the design, a non-PDF file or a non-regular file";
    WriteFailed = "write-failed": "an output that could not be written";
    NotAPackage = "not-a-package": "a file given to `verify` or `extract` that is not a readable dutyline package";
}

impl Code {
    /// The code whose [`Code::as_str`] is `text`, if there is one.
    pub fn from_text(text: &str) -> Option<Code> {
        Code::ALL.iter().copied().find(|c| c.as_str() == text)
    }
}

impl std::fmt::Display for Code {
    fn fmt(&self, f: &mut std::fmt::Formatter<'_>) -> std::fmt::Result {
        f.write_str(self.as_str())
    }
}

impl Serialize for Code {
    fn serialize<S: serde::Serializer>(&self, serializer: S) -> Result<S::Ok, S::Error> {
        serializer.serialize_str(self.as_str())
    }
}

#[cfg(test)]
mod tests {
    use super::Code;

    #[test]
    fn strings_are_unique_and_kebab_case() {
        let mut seen = std::collections::BTreeSet::new();
        for code in Code::ALL {
            assert!(seen.insert(code.as_str()), "{code} twice");
            assert!(code
                .as_str()
                .chars()
                .all(|c| c.is_ascii_lowercase() || c == '-' || c.is_ascii_digit()));
            assert_eq!(Code::from_text(code.as_str()), Some(*code));
        }
        assert_eq!(Code::from_text("no-such-code"), None);
    }
}
