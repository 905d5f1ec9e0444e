//! The subcommands behind the binary: each takes its parsed arguments and a writer,
//! and returns what the process should exit with.

pub mod board;
pub mod calc;
pub mod check;
pub mod metar;
pub mod output;
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

/// Writes a decoded report's groups in column order, each with its meaning, aligned;
/// a group longer than 24 characters gets its meaning on the next line.
pub(crate) fn write_groups(
    mut lines: Vec<(usize, String, String)>,
    out: &mut dyn std::io::Write,
) -> std::io::Result<()> {
    lines.sort_by_key(|(column, _, _)| *column);
    let width = lines
        .iter()
        .map(|(_, t, _)| t.chars().count())
        .filter(|n| *n <= 24)
        .max()
        .unwrap_or(8);
    for (_, text, meaning) in &lines {
        if text.chars().count() > 24 {
            writeln!(out, "  {text}")?;
            writeln!(out, "  {:width$}  {meaning}", "")?;
        } else {
            writeln!(out, "  {text:width$}  {meaning}")?;
        }
    }
    Ok(())
}
