//! Errors that stop a whole sheet. A bad row never does: it is reported in
//! its own `status` and `message` cells.

use std::path::PathBuf;
use thiserror::Error;

/// Why a sheet could not be processed.
///
/// [`SheetError::exit_code`] gives the command's exit code: 2 when the
/// sheet could not be started (unreadable input, a header without a unit,
/// no pair of carbonate parameters, a bad option), 1 when it failed part-way
/// (a read or write error after the first row; no output file is left).
///
/// # Example
/// ```
/// use travertine::sheet::{process, SheetError, SheetOptions};
/// let err = process(&SheetOptions::default(), &b""[..], Vec::new()).unwrap_err();
/// assert!(matches!(err, SheetError::Empty));
/// assert_eq!(err.exit_code(), 2);
/// ```
#[derive(Debug, Error)]
#[non_exhaustive]
pub enum SheetError {
    /// The input has no header row.
    #[error("the input is empty: a sheet needs a header row naming its columns")]
    Empty,
    /// The input could not be opened or read at all.
    #[error("cannot read {what}: {source}")]
    Unreadable {
        /// The input, as named by the user.
        what: String,
        /// The cause.
        source: std::io::Error,
    },
    /// The input is in UTF-16 (as some spreadsheet programs save "Unicode
    /// text"), which the sheet does not read.
    #[error(
        "{what} is in UTF-16 ({order}), not UTF-8: save it as UTF-8 (in a spreadsheet, \
         \"CSV UTF-8\"), or convert it, for example `iconv -f {iconv} -t UTF-8 FILE > FILE-utf8.csv`"
    )]
    Utf16 {
        /// The input, as named by the user.
        what: String,
        /// `little-endian` or `big-endian`, and whether it has a byte-order
        /// mark.
        order: &'static str,
        /// The name `iconv` knows this encoding by.
        iconv: &'static str,
    },
    /// A header names a known quantity without a unit that can be read.
    #[error(
        "column `{header}`: {problem}; accepted: {accepted}. Write the unit in the header \
         (for example `{canonical}`), or map the column by hand: --map {canonical}=\"{header}\""
    )]
    HeaderUnit {
        /// The header as written.
        header: String,
        /// What is wrong with its unit.
        problem: String,
        /// The units the quantity accepts.
        accepted: String,
        /// A canonical column name for the quantity.
        canonical: &'static str,
    },
    /// Two columns give the same quantity.
    #[error("columns `{first}` and `{second}` both give {field}; keep one, or pass one through with --map ignore=\"{second}\"")]
    DuplicateColumn {
        /// The quantity.
        field: &'static str,
        /// The first column.
        first: String,
        /// The second column.
        second: String,
    },
    /// No pair of carbonate parameters can be formed from the header.
    #[error("{0}")]
    NoPair(String),
    /// A required condition (temperature) has neither a column nor a value.
    #[error("{0}")]
    Missing(String),
    /// Two sources give the same thing, such as a pH column that names its
    /// scale and a `ph_scale` column.
    #[error("{0}")]
    Conflict(String),
    /// A `--map`, `--set`, `--pair`, `--columns` or other option is wrong.
    #[error("{option}: {message}")]
    BadOption {
        /// The option.
        option: &'static str,
        /// What is wrong.
        message: String,
    },
    /// The output would replace the input.
    #[error("refusing to write the output over the input file {}", .0.display())]
    OverwriteInput(PathBuf),
    /// The output file could not be created or completed.
    #[error("cannot write {}: {source}", .path.display())]
    Output {
        /// The output file.
        path: PathBuf,
        /// The cause.
        source: std::io::Error,
    },
    /// Reading failed part-way.
    #[error("reading stopped at line {line}: {source}")]
    ReadFailed {
        /// The line reached.
        line: u64,
        /// The cause.
        source: std::io::Error,
    },
    /// Writing failed part-way.
    #[error("writing the output failed: {0}")]
    WriteFailed(std::io::Error),
}

impl SheetError {
    /// The exit code of the command for this error: 1 for a failure
    /// part-way, 2 otherwise.
    ///
    /// ```
    /// # use travertine::sheet::SheetError;
    /// assert_eq!(SheetError::NoPair("no pair".into()).exit_code(), 2);
    /// ```
    pub fn exit_code(&self) -> u8 {
        match self {
            SheetError::ReadFailed { .. } | SheetError::WriteFailed(_) => 1,
            _ => 2,
        }
    }

    /// Whether the output was closed by its reader (for example `| head`):
    /// not a failure of the sheet.
    ///
    /// ```
    /// # use travertine::sheet::SheetError;
    /// let e = SheetError::WriteFailed(std::io::ErrorKind::BrokenPipe.into());
    /// assert!(e.is_broken_pipe());
    /// ```
    pub fn is_broken_pipe(&self) -> bool {
        matches!(self, SheetError::WriteFailed(e) if e.kind() == std::io::ErrorKind::BrokenPipe)
    }
}
