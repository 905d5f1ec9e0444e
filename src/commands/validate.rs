//! `rhoboard validate [--ops DIR]`: checks an operator folder and reports every problem,
//! each with file, line, column and field path; warnings listed apart. Exit 0 when
//! there are no errors (warnings allowed), 2 otherwise.

use std::io::Write;
use std::path::PathBuf;

use crate::commands::Outcome;
use crate::ops::config::{self, Choice};
use crate::ops::{Loaded, Ops, Report, demo, load_dir};

/// Arguments of `rhoboard validate`.
#[derive(Debug, Clone, clap::Args)]
pub struct Args {
    /// The operator folder (default: the configured one, else the built-in demo).
    #[arg(long, value_name = "DIR")]
    pub ops: Option<PathBuf>,
    /// Print the report as JSON: `{"source", "ok", "errors": […], "warnings": […]}`,
    /// each problem with `severity`, `file`, `path`, `line`, `column`, `message`.
    #[arg(long)]
    pub json: bool,
}

/// Writes a report: errors, then warnings, each one a line.
pub fn write_report(report: &Report, out: &mut dyn Write) -> std::io::Result<()> {
    if !report.errors.is_empty() {
        writeln!(out, "{} error(s):", report.errors.len())?;
        for d in &report.errors {
            writeln!(out, "  {d}")?;
        }
    }
    if !report.warnings.is_empty() {
        writeln!(out, "{} warning(s):", report.warnings.len())?;
        for d in &report.warnings {
            writeln!(out, "  {d}")?;
        }
    }
    Ok(())
}

fn summary(ops: &Ops) -> String {
    format!(
        "{} aircraft type(s), {} aircraft, {} pilot(s), {} airfield(s), {} leg(s), {} observation and forecast file(s)",
        ops.types.len(),
        ops.aircraft.len(),
        ops.pilots.len(),
        ops.airfields.len(),
        ops.legs.len(),
        ops.observations.len()
    )
}

/// Validates and prints; the outcome is `Success` when there are no errors.
pub fn run(args: &Args, out: &mut dyn Write) -> anyhow::Result<Outcome> {
    let choice = config::choose(args.ops.as_deref(), config::config_file().as_deref());
    let (what, loaded): (String, Loaded) = match &choice {
        Choice::Explicit(d) | Choice::Configured(d) => (d.display().to_string(), load_dir(d)?),
        Choice::Demo => ("the built-in demo operator".to_string(), demo::load()),
    };
    if args.json {
        let v = serde_json::json!({
            "source": what,
            "ok": loaded.ops.is_some(),
            "errors": loaded.report.errors,
            "warnings": loaded.report.warnings,
        });
        writeln!(out, "{}", serde_json::to_string_pretty(&v)?)?;
        return Ok(if loaded.ops.is_some() {
            Outcome::Success
        } else {
            Outcome::BadInput
        });
    }
    writeln!(out, "Checking {what}")?;
    write_report(&loaded.report, out)?;
    match &loaded.ops {
        Some(ops) => {
            if loaded.report.warnings.is_empty() {
                writeln!(out, "All is well: {}.", summary(ops))?;
            } else {
                writeln!(
                    out,
                    "No errors ({} warning(s) above): {}.",
                    loaded.report.warnings.len(),
                    summary(ops)
                )?;
            }
            Ok(Outcome::Success)
        }
        None => {
            writeln!(
                out,
                "Fix the errors above and run `rhoboard validate{}` again.",
                // The same folder again, as typed.
                args.ops
                    .as_ref()
                    .map_or(String::new(), |d| format!(" --ops {}", d.display()))
            )?;
            Ok(Outcome::BadInput)
        }
    }
}
