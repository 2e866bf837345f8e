//! The spanned syntax tree of a design file.
//!
//! The tree is generic: statements are `let`s, field assignments, conditions
//! (`flow >= 260 gpm for normal`), curve tables, and keyword blocks with
//! arguments and an optional body. The model stage gives keywords meaning.

use crate::diagnostics::Span;

/// A whole design file.
#[derive(Clone, Debug, PartialEq)]
pub struct File {
    /// Top-level statements in file order.
    pub statements: Vec<Statement>,
}

/// A name with its place.
#[derive(Clone, Debug, PartialEq)]
pub struct Ident {
    /// The name as written.
    pub name: String,
    /// Where the name is written.
    pub span: Span,
}

/// A dotted path such as `sump.level` or `discharge.1.length`.
#[derive(Clone, Debug, PartialEq)]
pub struct Path {
    /// The parts between the dots.
    pub parts: Vec<Ident>,
    /// Where the whole path is written.
    pub span: Span,
}

impl Path {
    /// The path as written, parts joined by dots.
    pub fn dotted(&self) -> String {
        self.parts
            .iter()
            .map(|p| p.name.as_str())
            .collect::<Vec<_>>()
            .join(".")
    }
}

/// One statement: a line, or a block with its body.
#[derive(Clone, Debug, PartialEq)]
pub struct Statement {
    /// What kind of statement.
    pub kind: StatementKind,
    /// The whole statement, body included.
    pub span: Span,
}

/// The shapes a statement can take.
#[derive(Clone, Debug, PartialEq)]
pub enum StatementKind {
    /// `let name = expr`
    Let {
        /// The constant's name.
        name: Ident,
        /// Its value.
        value: Expr,
    },
    /// `path = expr`
    Assign {
        /// The field (`level`, `sump.level` in a case).
        path: Path,
        /// Its value.
        value: Expr,
    },
    /// `path [at node] >= expr [for case, case]`
    Condition {
        /// The constrained quantity (`flow`).
        path: Path,
        /// The network node of `pressure at NODE >= ...`, when given.
        at: Option<Ident>,
        /// `>=` or `<=`.
        op: CompareOp,
        /// The limit.
        value: Expr,
        /// The cases after `for`; empty for every case.
        cases: Vec<Ident>,
    },
    /// `keyword arg arg { body }`
    Block {
        /// The block's keyword (`tank`, `pump`).
        keyword: Ident,
        /// The arguments between the keyword and the body.
        args: Vec<Arg>,
        /// The statements in braces, when there are braces.
        body: Option<Vec<Statement>>,
    },
    /// `curve arg arg { table }`
    Curve {
        /// The `curve` keyword.
        keyword: Ident,
        /// The arguments (`impeller 12.5 in`, `from "file.csv"`).
        args: Vec<Arg>,
        /// The inline table, when given.
        table: Option<Table>,
    },
}

/// The comparison of a condition.
#[derive(Clone, Copy, Debug, PartialEq, Eq)]
pub enum CompareOp {
    /// `>=`
    AtLeast,
    /// `<=`
    AtMost,
}

impl CompareOp {
    /// The operator as written.
    pub fn symbol(self) -> &'static str {
        match self {
            CompareOp::AtLeast => ">=",
            CompareOp::AtMost => "<=",
        }
    }
}

/// One argument of a block statement.
#[derive(Clone, Debug, PartialEq)]
pub struct Arg {
    /// What the argument is.
    pub kind: ArgKind,
    /// Where it is written.
    pub span: Span,
}

/// The kinds of block argument.
#[derive(Clone, Debug, PartialEq)]
pub enum ArgKind {
    /// A bare word (`steel`, `pump`).
    Word(String),
    /// A number without a unit.
    Number(Number),
    /// A number (or nominal fraction such as `1-1/2`) with a unit.
    Quantity {
        /// The number.
        value: Number,
        /// The unit as written.
        unit: UnitText,
    },
    /// A quoted text, unescaped.
    Text(String),
    /// A date, `YYYY-MM-DD` as written.
    Date(String),
    /// `*` (before a fitting count).
    Star,
}

/// A numeric literal: its text as written and its value.
#[derive(Clone, Debug, PartialEq)]
pub struct Number {
    /// The literal as written (`1.2e-3`, `1-1/2`).
    pub text: String,
    /// Its value (finite; dimensionless until a unit is attached).
    pub value: f64,
}

/// A unit as written, with its place.
#[derive(Clone, Debug, PartialEq)]
pub struct UnitText {
    /// The unit text (`m^3/h`).
    pub text: String,
    /// Where it is written.
    pub span: Span,
}

/// An expression on quantities.
#[derive(Clone, Debug, PartialEq)]
pub struct Expr {
    /// What the expression is.
    pub kind: ExprKind,
    /// Where it is written.
    pub span: Span,
}

/// The kinds of expression.
#[derive(Clone, Debug, PartialEq)]
pub enum ExprKind {
    /// A number without a unit.
    Number(Number),
    /// A number with a unit.
    Quantity {
        /// The number.
        value: Number,
        /// The unit as written.
        unit: UnitText,
    },
    /// A quoted text, unescaped.
    Text(String),
    /// A date, `YYYY-MM-DD` as written.
    Date(String),
    /// A name: a `let` constant or a keyword value such as `aged` or `nema`.
    Name(Path),
    /// Unary minus.
    Neg(Box<Expr>),
    /// `left op right`.
    Binary {
        /// The operator.
        op: BinaryOp,
        /// The left operand.
        left: Box<Expr>,
        /// The right operand.
        right: Box<Expr>,
    },
    /// `base ^ exponent` with an integer exponent.
    Power {
        /// The base.
        base: Box<Expr>,
        /// The integer exponent.
        exponent: i32,
    },
    /// An expression in parentheses (kept for the formatter).
    Paren(Box<Expr>),
}

/// An arithmetic operator.
#[derive(Clone, Copy, Debug, PartialEq, Eq)]
pub enum BinaryOp {
    /// `+`
    Add,
    /// `-`
    Sub,
    /// `*`
    Mul,
    /// `/`
    Div,
}

impl BinaryOp {
    /// The operator as written.
    pub fn symbol(self) -> &'static str {
        match self {
            BinaryOp::Add => "+",
            BinaryOp::Sub => "-",
            BinaryOp::Mul => "*",
            BinaryOp::Div => "/",
        }
    }
}

/// A curve table: columns with units, rows of cells.
#[derive(Clone, Debug, PartialEq)]
pub struct Table {
    /// The header: one column per quantity.
    pub columns: Vec<Column>,
    /// One row per point.
    pub rows: Vec<Row>,
    /// The whole table.
    pub span: Span,
}

/// A header cell: a column name and its unit (`flow gpm`).
#[derive(Clone, Debug, PartialEq)]
pub struct Column {
    /// The column's name (`flow`, `head`).
    pub name: Ident,
    /// Its unit.
    pub unit: UnitText,
    /// Name and unit.
    pub span: Span,
}

/// One row of a curve table.
#[derive(Clone, Debug, PartialEq)]
pub struct Row {
    /// The cells in column order.
    pub cells: Vec<Cell>,
    /// The whole row.
    pub span: Span,
}

/// One cell of a row.
#[derive(Clone, Debug, PartialEq)]
pub struct Cell {
    /// `None` for a dash: no value in this column.
    pub value: Option<Number>,
    /// Where the cell is written.
    pub span: Span,
}
