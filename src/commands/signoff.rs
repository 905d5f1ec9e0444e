//! `rhoboard signoff LEG --instructor NAME …`: assesses the leg against the reports
//! known at `--at`, refuses what the rules refuse, and appends the sign-off (or, with
//! `--revoke`, a revocation) to the operator's log.

use std::io::Write;
use std::path::{Path, PathBuf};
use std::time::Duration;

use chrono::{DateTime, Utc};

use crate::assess::{Context, DaySettings, Model, assess_leg};
use crate::commands::Outcome;
use crate::commands::check::{self, Loaded};
use crate::ops::config::{self, Choice};
use crate::ops::{Ops, OpsFiles, demo};
use crate::signoff::log::{AppendOptions, Log, LogError};
use crate::signoff::{DataHashes, Kind, Request};

pub use crate::signoff::{revoke, sign};

/// Arguments of `rhoboard signoff`.
#[derive(Debug, Clone, clap::Args)]
pub struct Args {
    /// The leg id (e.g. L09).
    #[arg(value_name = "LEG")]
    pub leg: String,
    /// The instructor signing.
    #[arg(long, value_name = "NAME")]
    pub instructor: String,
    /// A note kept with the record.
    #[arg(long, value_name = "TEXT", default_value = "")]
    pub note: String,
    /// Sign a `below` or `no-data` leg anyway, where the policy allows it for the
    /// leg's category; the reason is recorded.
    #[arg(long = "override", value_name = "REASON")]
    pub override_reason: Option<String>,
    /// Withdraw the sign-off in force for the leg (a new record; `--note` says why).
    #[arg(long, conflicts_with = "override_reason")]
    pub revoke: bool,
    /// The operator folder (default: the configured one, else the built-in demo).
    #[arg(long, value_name = "DIR")]
    pub ops: Option<PathBuf>,
    /// Sign against the reports known at this time (RFC 3339). Default: now; for the
    /// built-in demo, 08:00Z on its demo day.
    #[arg(long, value_name = "TIME")]
    pub at: Option<String>,
    /// Print JSON: `{"signed": {file, line, sha256, record}}` or `{"refused": REASON}`.
    #[arg(long)]
    pub json: bool,
}

/// The operator folder to use: `--ops`, else the configured one, else `None` (the
/// demo). A configured folder that fails to load is an error here, never a silent
/// switch to the demo: a sign-off or a sheet must be of the operator meant.
pub fn operator_dir(explicit: Option<&Path>) -> Option<PathBuf> {
    match config::choose(explicit, config::config_file().as_deref()) {
        Choice::Explicit(d) | Choice::Configured(d) => Some(d),
        Choice::Demo => None,
    }
}

/// Where the log of an operator lives: `DIR/signoffs`, or for the built-in demo
/// `<data dir>/demo/signoffs` (the platform data dir via `directories`, or
/// `RHOBOARD_DATA_DIR` when set).
pub fn log_for(ops_dir: Option<&Path>) -> anyhow::Result<Log> {
    match ops_dir {
        Some(d) => Ok(Log::of_operator(d)),
        None => {
            let base = match std::env::var_os("RHOBOARD_DATA_DIR") {
                Some(d) if !d.is_empty() => PathBuf::from(d),
                _ => directories::ProjectDirs::from("", "", "rhoboard")
                    .map(|d| d.data_dir().to_path_buf())
                    .ok_or_else(|| {
                        anyhow::anyhow!(
                            "no platform data folder for the demo's sign-off log; set RHOBOARD_DATA_DIR or use --ops DIR"
                        )
                    })?,
            };
            Ok(Log::of_operator(&base.join("demo")))
        }
    }
}

/// The SHA-256 of every operator data file the assessment read.
pub fn data_hashes(ops_dir: Option<&Path>) -> anyhow::Result<DataHashes> {
    let files = match ops_dir {
        Some(d) => OpsFiles::read_dir(d)?.0,
        None => demo::files(),
    };
    Ok(DataHashes::of(&files))
}

/// The index of leg `id` to sign on the basis time: the one departing on that UTC date,
/// else the only leg with that id.
pub fn leg_index(ops: &Ops, id: &str, at: DateTime<Utc>) -> anyhow::Result<usize> {
    let all: Vec<usize> = (0..ops.legs.len())
        .filter(|&i| ops.legs[i].id == id)
        .collect();
    if let Some(&i) = all
        .iter()
        .find(|&&i| ops.legs[i].departs_utc().date_naive() == at.date_naive())
    {
        return Ok(i);
    }
    match all.as_slice() {
        [] => anyhow::bail!("{}", crate::commands::check::unknown_leg(ops, id, at)),
        [i] => Ok(*i),
        _ => anyhow::bail!(
            "leg '{id}' is planned on {} days and none on {}; give --at on the leg's day",
            all.len(),
            at.date_naive()
        ),
    }
}

/// The test hook of the crash test: `RHOBOARD_TEST_SPLIT_WRITE_MS=N` writes each line
/// in two halves N ms apart, so a writer can be killed mid-line.
pub fn append_options_from_env() -> AppendOptions {
    AppendOptions {
        split_write_pause: std::env::var("RHOBOARD_TEST_SPLIT_WRITE_MS")
            .ok()
            .and_then(|v| v.parse::<u64>().ok())
            .map(Duration::from_millis),
    }
}

/// Loads the operator of `--ops` (or the configured one, or the demo) at `--at`.
pub fn load_operator(
    explicit: Option<&Path>,
    at: Option<&str>,
) -> anyhow::Result<(Option<PathBuf>, Loaded)> {
    let dir = operator_dir(explicit);
    let loaded = check::load(dir.as_deref(), &[], at, Utc::now())?;
    for w in &loaded.warnings {
        eprintln!("rhoboard: warning: {w}");
    }
    Ok((dir, loaded))
}

/// What a signer is told before the record is written: a leg already gone at the
/// assessment's time, and an override given where nothing needs one.
pub fn sign_warnings(
    leg: &crate::ops::legs::Leg,
    result: &crate::assess::LegResult,
    req: &Request<'_>,
) -> Vec<String> {
    let mut warnings = Vec::new();
    if leg.departs_utc() < req.basis_at {
        warnings.push(format!(
            "leg {} departed at {}, before the assessment's time {} (--at): this signs off on the reports known then, after the leg left",
            leg.id,
            leg.departs_utc().format("%H%MZ"),
            req.basis_at.format("%H%MZ")
        ));
    }
    if req.override_reason.is_some()
        && !matches!(
            result.state,
            crate::assess::State::Below | crate::assess::State::NoData
        )
    {
        warnings.push(format!(
            "--override on a leg that is {}, neither below nor no-data: no override is needed; the reason is recorded with the sign-off",
            result.state.word()
        ));
    }
    warnings
}

/// Runs `rhoboard signoff`.
pub fn run(args: &Args, out: &mut dyn Write) -> anyhow::Result<Outcome> {
    // An empty name is bad input (exit 2), not a refusal of the leg.
    if args.instructor.trim().is_empty() {
        anyhow::bail!("--instructor: give the name of the instructor signing");
    }
    let (dir, loaded) = load_operator(args.ops.as_deref(), args.at.as_deref())?;
    let ops = &loaded.ops;
    let index = leg_index(ops, &args.leg, loaded.at)?;
    let data = data_hashes(dir.as_deref())?;
    let log = log_for(dir.as_deref())?;
    let req = Request {
        instructor: &args.instructor,
        note: &args.note,
        override_reason: args.override_reason.as_deref(),
        signed_at: Utc::now(),
        basis_at: loaded.at,
        data: &data,
    };
    let opts = append_options_from_env();
    let done = if args.revoke {
        revoke(&log, ops, index, &req, &opts)
    } else {
        let model = Model::new(ops, &DaySettings::default());
        let ctx = Context {
            ops,
            model: &model,
            store: &loaded.store,
            at: loaded.at,
        };
        let result = assess_leg(&ctx, index)
            .ok_or_else(|| anyhow::anyhow!("leg '{}' could not be assessed", args.leg))?;
        for w in sign_warnings(&ops.legs[index], &result, &req) {
            eprintln!("rhoboard: warning: {w}");
        }
        sign(&log, ops, &result, &req, &opts)
    };
    match done {
        Ok(a) => {
            if let Some(t) = &a.set_aside {
                eprintln!("rhoboard: warning: {t} — done before this record was written");
            }
            let r = &a.entry.record;
            if args.json {
                let v = serde_json::json!({
                    "signed": {
                        "file": log.dir().join(&a.entry.file),
                        "line": a.entry.line,
                        "sha256": a.entry.sha256,
                        "head": format!("{}:{}", r.seq, a.entry.sha256),
                        "set_aside_torn_line": a.set_aside.as_ref().map(|t| t.to_string()),
                        "record": r,
                    },
                    "caution": crate::CAUTION,
                });
                serde_json::to_writer_pretty(&mut *out, &v)?;
                writeln!(out)?;
                return Ok(Outcome::Success);
            }
            let what = match r.kind {
                Kind::SignOff => {
                    let state = r.figures.as_ref().map_or("", |f| f.state.as_str());
                    let mut s = format!("signed {} of {} ({state})", r.leg, r.leg_date);
                    if let Some(o) = &r.override_reason {
                        s.push_str(&format!(", OVERRIDE: {o}"));
                    }
                    if let Some(p) = r.supersedes_seq {
                        s.push_str(&format!(", supersedes record {p}"));
                    }
                    s
                }
                Kind::Revocation => format!(
                    "revoked the sign-off of {} of {} (record {})",
                    r.leg,
                    r.leg_date,
                    r.revokes_seq.unwrap_or(0)
                ),
            };
            writeln!(
                out,
                "{what} by {} on the reports known at {} — record {} in {} line {}",
                r.instructor,
                r.basis_at.format("%Y-%m-%dT%H:%MZ"),
                r.seq,
                log.dir().join(&a.entry.file).display(),
                a.entry.line
            )?;
            writeln!(out, "log head {}:{}", r.seq, a.entry.sha256)?;
            writeln!(out, "{}", crate::CAUTION)?;
            Ok(Outcome::Success)
        }
        Err(LogError::Refused(why)) => {
            if args.json {
                serde_json::to_writer_pretty(
                    &mut *out,
                    &serde_json::json!({ "refused": why.to_string(), "caution": crate::CAUTION }),
                )?;
                writeln!(out)?;
            } else {
                writeln!(out, "refused: {why}")?;
                writeln!(out, "{}", crate::CAUTION)?;
            }
            Ok(Outcome::Findings)
        }
        Err(e) => Err(anyhow::Error::new(e).context(format!(
            "writing the sign-off log in {}",
            log.dir().display()
        ))),
    }
}
