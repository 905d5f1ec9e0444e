//! The subcommands behind the binary: each takes its parsed arguments and a writer,
//! and returns what the process should exit with.

pub mod board;
pub mod calc;
pub mod check;
pub mod metar;
pub mod overview;
pub mod runway;
pub mod taf;

use std::process::ExitCode;

pub mod init;
pub mod leg;
pub mod log;
pub mod report;
pub mod signoff;
pub mod validate;

/// How a command ended, mapped to the process exit status (DESIGN.md "Command line").
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum Outcome {
    /// Success; every leg meets the minimums.
    Success,
    /// The command ran, but at least one leg is `below` or `no-data`, or a check failed.
    Findings,
    /// Bad usage or bad input.
    BadInput,
}

impl Outcome {
    /// The exit status for this outcome: 0, 1 or 2.
    pub const fn code(self) -> u8 {
        match self {
            Outcome::Success => 0,
            Outcome::Findings => 1,
            Outcome::BadInput => 2,
        }
    }
}

impl From<Outcome> for ExitCode {
    fn from(o: Outcome) -> Self {
        ExitCode::from(o.code())
    }
}
