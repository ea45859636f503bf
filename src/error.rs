//! The three kinds of failure, kept apart: the user's input was wrong, the outside world
//! failed, or segmask has a bug.

use std::path::PathBuf;

/// One problem in a layout file, located as precisely as known.
#[derive(Debug, Clone, PartialEq)]
pub struct InputProblem {
    /// Layout (or font) file.
    pub file: PathBuf,
    /// 1-based line, when known.
    pub line: Option<usize>,
    /// 1-based column, when known.
    pub column: Option<usize>,
    /// Key path such as `digits[2].height` (empty for file-level problems).
    pub key: String,
    /// What is wrong.
    pub message: String,
    /// What is allowed, when there is a short answer.
    pub allowed: Option<String>,
}

impl InputProblem {
    /// A problem with a command-line argument (`key` is the option, e.g. `--date`).
    pub fn on_command_line(key: &str, message: String, allowed: &str) -> InputProblem {
        InputProblem {
            file: "command line".into(),
            line: None,
            column: None,
            key: key.into(),
            message,
            allowed: Some(allowed.into()),
        }
    }
}

impl std::fmt::Display for InputProblem {
    fn fmt(&self, f: &mut std::fmt::Formatter<'_>) -> std::fmt::Result {
        write!(f, "{}", self.file.display())?;
        if let Some(l) = self.line {
            write!(f, ":{l}")?;
            if let Some(c) = self.column {
                write!(f, ":{c}")?;
            }
        }
        write!(f, ": error")?;
        if !self.key.is_empty() {
            write!(f, " in `{}`", self.key)?;
        }
        write!(f, ": {}", self.message)?;
        if let Some(a) = &self.allowed {
            write!(f, " (allowed: {a})")?;
        }
        Ok(())
    }
}

/// Everything that can stop segmask.
#[derive(Debug, thiserror::Error)]
pub enum Error {
    /// The layout is wrong; every problem found is listed.
    #[error("{}", .0.iter().map(|p| p.to_string()).collect::<Vec<_>>().join("\n"))]
    Input(Vec<InputProblem>),
    /// Reading or writing a file failed.
    #[error("{}: {source}", path.display())]
    Io {
        /// The file.
        path: PathBuf,
        /// The cause.
        #[source]
        source: std::io::Error,
    },
    /// segmask itself went wrong.
    #[error("internal error (a bug in segmask, please report it): {0}")]
    Bug(String),
}

impl Error {
    /// One input problem.
    pub fn input(p: InputProblem) -> Error {
        Error::Input(vec![p])
    }
    /// An I/O failure on `path`.
    pub fn io(path: impl Into<PathBuf>, source: std::io::Error) -> Error {
        Error::Io { path: path.into(), source }
    }
}

/// Result with segmask's error.
pub type Result<T> = std::result::Result<T, Error>;
