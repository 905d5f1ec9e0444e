//! `rhoboard log verify|show`: checks the sign-off chain (read-only) and lists records.

use std::io::Write;
use std::path::PathBuf;

use chrono::NaiveDate;
use serde_json::json;

use crate::commands::Outcome;
use crate::commands::signoff::{log_for, operator_dir};
use crate::signoff::{Head, Kind};

/// Arguments of `rhoboard log`.
#[derive(Debug, Clone, clap::Args)]
pub struct Args {
    /// What to do.
    #[command(subcommand)]
    pub action: Action,
}

/// `log` subcommands.
#[derive(Debug, Clone, clap::Subcommand)]
pub enum Action {
    /// Checks the chain, read-only: exit 0 sound, 1 broken (naming file and line).
    Verify {
        /// The operator folder (default: the configured one, else the built-in demo).
        #[arg(long, value_name = "DIR")]
        ops: Option<PathBuf>,
        /// A head printed earlier (a briefing sheet, the board): SEQ:HASH.
        #[arg(long, value_name = "SEQ:HASH")]
        head: Option<String>,
    },
    /// Lists the records.
    Show {
        /// The operator folder (default: the configured one, else the built-in demo).
        #[arg(long, value_name = "DIR")]
        ops: Option<PathBuf>,
        /// Only legs of this UTC date (YYYY-MM-DD).
        #[arg(long, value_name = "DATE")]
        date: Option<String>,
        /// Only this leg.
        #[arg(long, value_name = "ID")]
        leg: Option<String>,
        /// Print JSON.
        #[arg(long)]
        json: bool,
    },
}

/// Runs `rhoboard log`.
pub fn run(args: &Args, out: &mut dyn Write) -> anyhow::Result<Outcome> {
    match &args.action {
        Action::Verify { ops, head } => {
            let head: Option<Head> = head
                .as_deref()
                .map(str::parse)
                .transpose()
                .map_err(|e: String| anyhow::anyhow!("--head: {e}"))?;
            let log = log_for(operator_dir(ops.as_deref()).as_deref())?;
            let chain = log.read()?;
            writeln!(
                out,
                "sign-off log {}: {} record(s) in {} monthly file(s)",
                log.dir().display(),
                chain.entries.len(),
                chain.files.len()
            )?;
            let mut problems: Vec<String> = chain.problems.iter().map(|p| p.to_string()).collect();
            if let Some(t) = &chain.torn {
                problems.push(t.to_string());
            }
            if let Some(h) = &head
                && let Some(p) = chain.check_head(h)
            {
                problems.push(p.to_string());
            }
            for p in &problems {
                writeln!(out, "✗ {p}")?;
            }
            for s in &chain.set_aside {
                writeln!(
                    out,
                    "note: {s} holds torn line(s) set aside by an earlier sign-off"
                )?;
            }
            match chain.head() {
                Some(h) => writeln!(out, "head {h}")?,
                None => writeln!(out, "head: none (the log is empty)")?,
            }
            if problems.is_empty() {
                writeln!(out, "✓ sound")?;
                Ok(Outcome::Success)
            } else {
                writeln!(out, "✗ broken: {} problem(s)", problems.len())?;
                Ok(Outcome::Findings)
            }
        }
        Action::Show {
            ops,
            date,
            leg,
            json,
        } => {
            let date: Option<NaiveDate> = date
                .as_deref()
                .map(|d| {
                    NaiveDate::parse_from_str(d, "%Y-%m-%d").map_err(|e| {
                        anyhow::anyhow!("--date '{d}': {e}; expected YYYY-MM-DD, e.g. 2026-06-14")
                    })
                })
                .transpose()?;
            let log = log_for(operator_dir(ops.as_deref()).as_deref())?;
            let chain = log.read()?;
            let shown: Vec<_> = chain
                .entries
                .iter()
                .filter(|e| date.is_none_or(|d| e.record.leg_date == d))
                .filter(|e| leg.as_ref().is_none_or(|l| &e.record.leg == l))
                .collect();
            let status = |e: &crate::signoff::Entry| match e.record.kind {
                Kind::Revocation => "revocation",
                Kind::SignOff => match chain.in_force(&e.record.leg, e.record.leg_date) {
                    Some(c) if c.record.seq == e.record.seq => "in force",
                    _ => {
                        if chain.entries.iter().any(|x| {
                            x.record.kind == Kind::Revocation
                                && x.record.revokes_seq == Some(e.record.seq)
                        }) {
                            "revoked"
                        } else {
                            "superseded"
                        }
                    }
                },
            };
            if *json {
                let v: Vec<_> = shown
                    .iter()
                    .map(|e| {
                        json!({
                            "file": e.file,
                            "line": e.line,
                            "sha256": e.sha256,
                            "status": status(e),
                            "record": e.record,
                        })
                    })
                    .collect();
                serde_json::to_writer_pretty(&mut *out, &v)?;
                writeln!(out)?;
            } else {
                writeln!(
                    out,
                    "{:>4}  {:<17}  {:<5} {:<10}  {:<12} {:<10} {:<12} {:<10}  instructor / note",
                    "seq", "signed (UTC)", "leg", "date", "category", "state", "basis", "status"
                )?;
                for e in &shown {
                    let r = &e.record;
                    let state = match (&r.kind, &r.figures) {
                        (Kind::Revocation, _) => "revokes".to_string(),
                        (_, Some(f)) => f.state.clone(),
                        (_, None) => "—".to_string(),
                    };
                    let mut who = r.instructor.clone();
                    if let Some(o) = &r.override_reason {
                        who.push_str(&format!(" — OVERRIDE: {o}"));
                    }
                    if let Some(s) = r.revokes_seq {
                        who.push_str(&format!(" — revokes {s}"));
                    }
                    if let Some(s) = r.supersedes_seq {
                        who.push_str(&format!(" — supersedes {s}"));
                    }
                    if !r.note.is_empty() {
                        who.push_str(&format!(" — {}", r.note));
                    }
                    writeln!(
                        out,
                        "{:>4}  {:<17}  {:<5} {:<10}  {:<12} {:<10} {:<12} {:<10}  {}",
                        r.seq,
                        r.signed_at.format("%Y-%m-%d %H:%M"),
                        r.leg,
                        r.leg_date,
                        r.category.name(),
                        state,
                        r.basis_at.format("as of %H%MZ"),
                        status(e),
                        who
                    )?;
                }
                if shown.is_empty() {
                    writeln!(out, "(no records)")?;
                }
                if !chain.is_sound() {
                    writeln!(
                        out,
                        "warning: the log does not verify — run `rhoboard log verify`"
                    )?;
                }
            }
            Ok(Outcome::Success)
        }
    }
}
