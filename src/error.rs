//! Errors for users, and the exit code each class of failure maps to.
//!
//! Every message names the input that was wrong and what was expected, so a
//! user can fix it without reading the source. Exit codes:
//!
//! | code | meaning |
//! | --- | --- |
//! | 0 | success, nothing to report |
//! | 1 | the work ran but found problems (audit findings, unmatched join) |
//! | 2 | bad input: a command-line argument, a colour, a file that cannot be read or parsed |
//! | 3 | output could not be written |
//! | 4 | internal error (a bug in hueproof; please report it) |
//! | 130 | a batch run was interrupted (SIGINT or SIGTERM) |

use std::fmt;
use std::path::PathBuf;

/// The class of an outcome, which decides the process exit code.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum ExitKind {
    /// Everything ran and nothing was found.
    Success,
    /// The work ran and found problems the user asked to be told about.
    Findings,
    /// The input (arguments or files) was wrong.
    BadInput,
    /// An output could not be written.
    OutputFailed,
    /// A bug in hueproof.
    Internal,
    /// The run was interrupted (SIGINT or SIGTERM) before it finished.
    Interrupted,
}

impl ExitKind {
    /// The numeric process exit code.
    pub fn code(self) -> u8 {
        match self {
            ExitKind::Success => 0,
            ExitKind::Findings => 1,
            ExitKind::BadInput => 2,
            ExitKind::OutputFailed => 3,
            ExitKind::Internal => 4,
            ExitKind::Interrupted => 130,
        }
    }
}

/// Everything that can go wrong, with messages written for the user.
#[derive(Debug)]
#[non_exhaustive]
pub enum Error {
    /// A command-line value was wrong (`what` names the option).
    Usage {
        /// The option or argument, e.g. `--views`.
        what: String,
        /// What was wrong and what was expected.
        message: String,
    },
    /// A colour could not be parsed.
    Color(crate::color::ParseColorError),
    /// A view name in a view list could not be parsed.
    View(crate::vision::ParseViewError),
    /// A file could not be read.
    Read {
        /// The file.
        path: PathBuf,
        /// The operating system's reason.
        source: std::io::Error,
    },
    /// A file could not be written.
    Write {
        /// The file.
        path: PathBuf,
        /// The operating system's reason.
        source: std::io::Error,
    },
    /// A file was read but its content was not what was expected.
    Invalid {
        /// The file.
        path: PathBuf,
        /// Where in the file (line, key or record), if known.
        location: Option<String>,
        /// What was wrong and what was expected.
        message: String,
    },
    /// A bug: an invariant of hueproof itself did not hold.
    Internal(String),
}

impl Error {
    /// Which exit code this error maps to.
    pub fn exit_kind(&self) -> ExitKind {
        match self {
            Error::Usage { .. }
            | Error::Color(_)
            | Error::View(_)
            | Error::Read { .. }
            | Error::Invalid { .. } => ExitKind::BadInput,
            Error::Write { .. } => ExitKind::OutputFailed,
            Error::Internal(_) => ExitKind::Internal,
        }
    }
}

impl fmt::Display for Error {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        match self {
            Error::Usage { what, message } => write!(f, "{what}: {message}"),
            Error::Color(e) => write!(f, "{e}"),
            Error::View(e) => write!(f, "{e}"),
            Error::Read { path, source } => {
                write!(f, "cannot read '{}': {source}", path.display())
            }
            Error::Write { path, source } => {
                write!(f, "cannot write '{}': {source}", path.display())
            }
            Error::Invalid {
                path,
                location,
                message,
            } => match location {
                Some(loc) => write!(f, "{}: {loc}: {message}", path.display()),
                None => write!(f, "{}: {message}", path.display()),
            },
            Error::Internal(m) => write!(
                f,
                "internal error (a bug in hueproof, please report it): {m}"
            ),
        }
    }
}

impl std::error::Error for Error {
    fn source(&self) -> Option<&(dyn std::error::Error + 'static)> {
        match self {
            Error::Read { source, .. } | Error::Write { source, .. } => Some(source),
            Error::Color(e) => Some(e),
            Error::View(e) => Some(e),
            _ => None,
        }
    }
}

impl From<crate::color::ParseColorError> for Error {
    fn from(e: crate::color::ParseColorError) -> Self {
        Error::Color(e)
    }
}

impl From<crate::vision::ParseViewError> for Error {
    fn from(e: crate::vision::ParseViewError) -> Self {
        Error::View(e)
    }
}

/// Shorthand for results whose error is [`Error`].
pub type Result<T> = std::result::Result<T, Error>;
