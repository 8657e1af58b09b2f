//! The error type: every problem a user can meet, with where it happened.
//!
//! Input problems carry the file, the line and the column so a planner can go
//! straight to the cell. `main` maps each kind to the documented exit code.

use std::fmt;
use std::path::{Path, PathBuf};

/// Where in an input file a problem sits. Line and column are 1-based; the
/// column also carries the header name when there is one.
#[derive(Debug, Clone, PartialEq, Eq)]
pub struct Location {
    pub file: PathBuf,
    pub line: Option<u64>,
    pub column: Option<(usize, String)>,
}

impl Location {
    pub fn file(file: &Path) -> Self {
        Location {
            file: file.to_path_buf(),
            line: None,
            column: None,
        }
    }

    pub fn line(file: &Path, line: u64) -> Self {
        Location {
            file: file.to_path_buf(),
            line: Some(line),
            column: None,
        }
    }

    pub fn cell(file: &Path, line: u64, column: usize, name: &str) -> Self {
        Location {
            file: file.to_path_buf(),
            line: Some(line),
            column: Some((column, name.to_string())),
        }
    }
}

impl fmt::Display for Location {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        write!(f, "{}", self.file.display())?;
        if let Some(line) = self.line {
            write!(f, ", line {line}")?;
        }
        if let Some((number, name)) = &self.column {
            if name.is_empty() {
                write!(f, ", column {number}")?;
            } else {
                write!(f, ", column {number} ({name})")?;
            }
        }
        Ok(())
    }
}

/// Everything that can go wrong. `Input` and `Usage` are the user's to fix
/// (exit code 2); `Output` is a file that could not be written; `Internal` is
/// ours (exit code 3).
#[derive(Debug, thiserror::Error)]
pub enum Error {
    #[error("{location}: {message}")]
    Input { location: Location, message: String },
    #[error("{0}")]
    Usage(String),
    #[error("cannot write {path}: {message}")]
    Output { path: PathBuf, message: String },
    #[error("internal error: {0}")]
    Internal(String),
}

impl Error {
    pub fn input(location: Location, message: impl Into<String>) -> Self {
        Error::Input {
            location,
            message: message.into(),
        }
    }

    pub fn usage(message: impl Into<String>) -> Self {
        Error::Usage(message.into())
    }

    /// The process exit code the command line documents for this error.
    pub fn exit_code(&self) -> i32 {
        match self {
            Error::Input { .. } | Error::Usage(_) | Error::Output { .. } => 2,
            Error::Internal(_) => 3,
        }
    }
}

pub type Result<T> = std::result::Result<T, Error>;
