//! `rhoboard log verify|show`: checks the sign-off chain (read-only) and lists records.

use std::io::Write;
use std::path::PathBuf;

use chrono::NaiveDate;
use serde_json::json;

use std::collections::HashMap;

use crate::assess::{Context, DaySettings, Model, assess_leg};
use crate::commands::Outcome;
use crate::commands::signoff::{load_operator, log_for, operator_dir};
use crate::signoff::{Head, Kind, Standing, standing};

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
        /// Reference time for the re-check of sign-offs in force (as for `check`).
        #[arg(long, value_name = "TIME")]
        at: Option<String>,
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
            at,
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
            // A sign-off in force is re-checked the way the board and the report do
            // (`signoff::standing` on the leg assessed now): its reasons by seq.
            let mut rechecks: HashMap<u64, Vec<String>> = HashMap::new();
            let mut recheck_note = None;
            let in_force: Vec<_> = shown
                .iter()
                .filter(|e| {
                    e.record.kind == Kind::SignOff
                        && chain
                            .in_force(&e.record.leg, e.record.leg_date)
                            .is_some_and(|c| c.record.seq == e.record.seq)
                })
                .collect();
            if !in_force.is_empty() {
                match load_operator(ops.as_deref(), at.as_deref()) {
                    Ok((_, loaded)) => {
                        let o = &loaded.ops;
                        for e in in_force {
                            let Some(i) = o.legs.iter().position(|l| {
                                l.id == e.record.leg
                                    && l.departs_utc().date_naive() == e.record.leg_date
                            }) else {
                                continue;
                            };
                            let model = Model::new(o, &DaySettings::for_date(o, e.record.leg_date));
                            let ctx = Context {
                                ops: o,
                                model: &model,
                                store: &loaded.store,
                                at: loaded.at,
                            };
                            if let Some(r) = assess_leg(&ctx, i)
                                && let Standing::Recheck(_, why) = standing(&chain, o, &r)
                            {
                                rechecks.insert(e.record.seq, why);
                            }
                        }
                    }
                    Err(err) => {
                        recheck_note = Some(format!(
                            "note: sign-offs in force not re-checked: the operator data did not load ({err:#})"
                        ));
                    }
                }
            }
            let status = |e: &crate::signoff::Entry| match e.record.kind {
                Kind::Revocation => "revocation",
                Kind::SignOff => match chain.in_force(&e.record.leg, e.record.leg_date) {
                    Some(c) if c.record.seq == e.record.seq => {
                        if rechecks.contains_key(&e.record.seq) {
                            "re-check"
                        } else {
                            "in force"
                        }
                    }
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
                            "recheck": rechecks.get(&e.record.seq),
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
                    if let Some(why) = rechecks.get(&r.seq) {
                        who.push_str(&format!(" — ↻ needs a re-check: {}", why.join("; ")));
                    }
                    writeln!(
                        out,
                        "{:>4}  {:<17}  {:<5} {:<10}  {:<12} {:<10} {:<12} {:<10}  {}",
                        r.seq,
                        r.signed_at.format("%Y-%m-%d %H:%M"),
                        r.leg,
                        r.leg_date,
                        r.category.words(),
                        state,
                        r.basis_at.format("as of %H%MZ"),
                        status(e),
                        who
                    )?;
                }
                if shown.is_empty() {
                    // A leg asked for by id that the operator does not have: say so, not
                    // just that the log holds nothing for it (a typo reads as "unsigned").
                    let unknown = leg.as_ref().and_then(|l| {
                        let (_, loaded) = load_operator(ops.as_deref(), at.as_deref()).ok()?;
                        let known = loaded.ops.legs.iter().any(|x| &x.id == l);
                        (!known).then(|| {
                            let mut ids: Vec<&str> =
                                loaded.ops.legs.iter().map(|x| x.id.as_str()).collect();
                            ids.sort_unstable();
                            ids.dedup();
                            format!(
                                "(no records: {l} is not one of the operator's legs; they are {})",
                                ids.join(", ")
                            )
                        })
                    });
                    writeln!(
                        out,
                        "{}",
                        unknown.unwrap_or_else(|| "(no records)".to_string())
                    )?;
                }
                if let Some(n) = &recheck_note {
                    writeln!(out, "{n}")?;
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
