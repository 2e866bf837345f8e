//! The spanned syntax tree of a design file.
//!
//! The tree is generic: statements are `let`s, field assignments, conditions
//! (`flow >= 260 gpm for normal`), curve tables, and keyword blocks with
//! arguments and an optional body. The model stage gives keywords meaning.

use crate::diagnostics::Span;

/// A whole design file.
#[derive(Clone, Debug, PartialEq)]
pub struct File {
    pub statements: Vec<Statement>,
}

/// A name with its place.
#[derive(Clone, Debug, PartialEq)]
pub struct Ident {
    pub name: String,
    pub span: Span,
}

/// A dotted path such as `sump.level` or `discharge.1.length`.
#[derive(Clone, Debug, PartialEq)]
pub struct Path {
    pub parts: Vec<Ident>,
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

#[derive(Clone, Debug, PartialEq)]
pub struct Statement {
    pub kind: StatementKind,
    pub span: Span,
}

#[derive(Clone, Debug, PartialEq)]
pub enum StatementKind {
    /// `let name = expr`
    Let { name: Ident, value: Expr },
    /// `path = expr`
    Assign { path: Path, value: Expr },
    /// `path [at node] >= expr [for case, case]`
    Condition {
        path: Path,
        /// The network node of `pressure at NODE >= ...`, when given.
        at: Option<Ident>,
        op: CompareOp,
        value: Expr,
        cases: Vec<Ident>,
    },
    /// `keyword arg arg { body }`
    Block {
        keyword: Ident,
        args: Vec<Arg>,
        body: Option<Vec<Statement>>,
    },
    /// `curve arg arg { table }`
    Curve {
        keyword: Ident,
        args: Vec<Arg>,
        table: Option<Table>,
    },
}

#[derive(Clone, Copy, Debug, PartialEq, Eq)]
pub enum CompareOp {
    AtLeast,
    AtMost,
}

impl CompareOp {
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
    pub kind: ArgKind,
    pub span: Span,
}

#[derive(Clone, Debug, PartialEq)]
pub enum ArgKind {
    Word(String),
    Number(Number),
    /// A number (or nominal fraction such as `1-1/2`) with a unit.
    Quantity {
        value: Number,
        unit: UnitText,
    },
    Text(String),
    Date(String),
    Star,
}

/// A numeric literal: its text as written and its value.
#[derive(Clone, Debug, PartialEq)]
pub struct Number {
    pub text: String,
    pub value: f64,
}

/// A unit as written, with its place.
#[derive(Clone, Debug, PartialEq)]
pub struct UnitText {
    pub text: String,
    pub span: Span,
}

/// An expression on quantities.
#[derive(Clone, Debug, PartialEq)]
pub struct Expr {
    pub kind: ExprKind,
    pub span: Span,
}

#[derive(Clone, Debug, PartialEq)]
pub enum ExprKind {
    Number(Number),
    Quantity {
        value: Number,
        unit: UnitText,
    },
    Text(String),
    Date(String),
    /// A name: a `let` constant or a keyword value such as `aged` or `nema`.
    Name(Path),
    Neg(Box<Expr>),
    Binary {
        op: BinaryOp,
        left: Box<Expr>,
        right: Box<Expr>,
    },
    Power {
        base: Box<Expr>,
        exponent: i32,
    },
    Paren(Box<Expr>),
}

#[derive(Clone, Copy, Debug, PartialEq, Eq)]
pub enum BinaryOp {
    Add,
    Sub,
    Mul,
    Div,
}

impl BinaryOp {
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
    pub columns: Vec<Column>,
    pub rows: Vec<Row>,
    pub span: Span,
}

#[derive(Clone, Debug, PartialEq)]
pub struct Column {
    pub name: Ident,
    pub unit: UnitText,
    pub span: Span,
}

#[derive(Clone, Debug, PartialEq)]
pub struct Row {
    pub cells: Vec<Cell>,
    pub span: Span,
}

#[derive(Clone, Debug, PartialEq)]
pub struct Cell {
    /// `None` for a dash: no value in this column.
    pub value: Option<Number>,
    pub span: Span,
}
