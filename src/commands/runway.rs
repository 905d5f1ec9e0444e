//! `rhoboard runway FIELD END …`: today's runway state — a closure, reduced declared
//! distances, the surface condition, the end in use — kept in the operator folder as
//! `runway-state/<date>.json`. With no change given, prints the day's state of that end.

use std::io::Write;
use std::path::{Path, PathBuf};

use anyhow::{Context as _, bail};
use chrono::{DateTime, NaiveDate, NaiveTime, Utc};

use crate::commands::Outcome;
use crate::ops::airfield::Surface;
use crate::ops::config::{self, Choice};
use crate::ops::runway_state::{DayCondition, EndState, RunwayStateFile};
use crate::units;

/// Arguments of `rhoboard runway`.
#[derive(Debug, Clone, clap::Args)]
pub struct Args {
    /// Airfield id, e.g. XSEA.
    pub field: String,
    /// Runway end designator, e.g. 27.
    pub end: String,
    /// Close the end (until `--until`, else all day).
    #[arg(long, conflicts_with = "open")]
    pub closed: bool,
    /// Open it again.
    #[arg(long)]
    pub open: bool,
    /// The closure ends at this time: `18:00Z` on the day, or RFC 3339.
    #[arg(long, value_name = "TIME")]
    pub until: Option<String>,
    /// Reduced take-off run available, e.g. 900m or 2950ft.
    #[arg(long, value_name = "LENGTH")]
    pub tora: Option<String>,
    /// Reduced take-off distance available.
    #[arg(long, value_name = "LENGTH")]
    pub toda: Option<String>,
    /// Reduced accelerate-stop distance available.
    #[arg(long, value_name = "LENGTH")]
    pub asda: Option<String>,
    /// Reduced landing distance available (a displaced threshold).
    #[arg(long, value_name = "LENGTH")]
    pub lda: Option<String>,
    /// Surface condition for the day: dry, wet, soft (ground), long-grass, water.
    #[arg(long, value_name = "CONDITION")]
    pub condition: Option<String>,
    /// Make this the end in use for the day.
    #[arg(long)]
    pub in_use: bool,
    /// Why (works, rain overnight …).
    #[arg(long, value_name = "TEXT")]
    pub note: Option<String>,
    /// Who sets it.
    #[arg(long, value_name = "NAME")]
    pub by: Option<String>,
    /// The UTC date (default today).
    #[arg(long, value_name = "YYYY-MM-DD")]
    pub date: Option<String>,
    /// The operator folder (default: the configured one).
    #[arg(long, value_name = "DIR")]
    pub ops: Option<PathBuf>,
}

fn length_m(flag: &str, text: &Option<String>) -> anyhow::Result<Option<f64>> {
    match text {
        None => Ok(None),
        Some(t) => {
            let m = units::parse_length(t)
                .map_err(|e| anyhow::anyhow!("--{flag} {e}"))?
                .m();
            if !(m > 0.0 && m < 10_000.0) {
                bail!("--{flag} '{t}' is outside 0 to 10,000 m");
            }
            Ok(Some(m))
        }
    }
}

fn parse_until(text: &str, date: NaiveDate) -> anyhow::Result<DateTime<Utc>> {
    if let Ok(t) = DateTime::parse_from_rfc3339(text) {
        return Ok(t.with_timezone(&Utc));
    }
    let hm = text.trim_end_matches(['Z', 'z']);
    let time = NaiveTime::parse_from_str(hm, "%H:%M")
        .or_else(|_| NaiveTime::parse_from_str(hm, "%H%M"))
        .map_err(|_| {
            anyhow::anyhow!(
                "--until '{text}': expected a UTC time such as 18:00Z or an RFC 3339 time"
            )
        })?;
    Ok(date.and_time(time).and_utc())
}

/// Writes `text` to `path` safely: a temporary file in the same folder, synced, then
/// renamed over the original.
pub fn write_atomically(path: &Path, text: &str) -> anyhow::Result<()> {
    let dir = path.parent().context("no folder for the runway state")?;
    std::fs::create_dir_all(dir).with_context(|| format!("creating {}", dir.display()))?;
    let tmp = dir.join(format!(
        ".{}.tmp-{}",
        path.file_name().and_then(|n| n.to_str()).unwrap_or("state"),
        std::process::id()
    ));
    {
        let mut f =
            std::fs::File::create(&tmp).with_context(|| format!("writing {}", tmp.display()))?;
        f.write_all(text.as_bytes())
            .and_then(|_| f.sync_all())
            .with_context(|| format!("writing {}", tmp.display()))?;
    }
    std::fs::rename(&tmp, path).with_context(|| format!("replacing {}", path.display()))?;
    if let Ok(d) = std::fs::File::open(dir) {
        let _ = d.sync_all();
    }
    Ok(())
}

/// Runs `rhoboard runway`.
pub fn run(args: &Args, out: &mut dyn Write) -> anyhow::Result<Outcome> {
    let choice = config::choose(args.ops.as_deref(), config::config_file().as_deref());
    let dir = match &choice {
        Choice::Explicit(d) | Choice::Configured(d) => d.clone(),
        Choice::Demo => bail!(
            "the built-in demo has no operator folder to keep a runway state in; write one with `rhoboard init DIR` and pass --ops DIR"
        ),
    };
    let (ops, _) = config::load_for_use(&choice)?;
    let date = match &args.date {
        Some(d) => NaiveDate::parse_from_str(d, "%Y-%m-%d")
            .map_err(|_| anyhow::anyhow!("--date '{d}': expected YYYY-MM-DD"))?,
        None => Utc::now().date_naive(),
    };
    let field = ops.airfield(&args.field).ok_or_else(|| {
        anyhow::anyhow!(
            "unknown airfield '{}'; it needs airfields/{}.json",
            args.field,
            args.field
        )
    })?;
    let Some(end) = field.runway_ends.iter().find(|e| e.designator == args.end) else {
        let known: Vec<&str> = field
            .runway_ends
            .iter()
            .map(|e| e.designator.as_str())
            .collect();
        bail!(
            "{} has no runway end '{}' (it has: {})",
            field.id,
            args.end,
            known.join(", ")
        );
    };
    let condition = match &args.condition {
        None => None,
        Some(c) => {
            let c = DayCondition::parse(c).ok_or_else(|| {
                anyhow::anyhow!("--condition '{c}': expected dry, wet, soft, long-grass or water")
            })?;
            if end.surface == Surface::Paved
                && matches!(c, DayCondition::SoftGround | DayCondition::LongGrass)
            {
                bail!(
                    "--condition '{}' is for grass; {} {} is paved",
                    c.word(),
                    field.id,
                    end.designator
                );
            }
            Some(c)
        }
    };
    let until = args
        .until
        .as_deref()
        .map(|u| parse_until(u, date))
        .transpose()?;
    if until.is_some() && !args.closed {
        bail!("--until goes with --closed");
    }
    let entry = EndState {
        airfield: field.id.clone(),
        end: end.designator.clone(),
        closed: if args.closed {
            Some(true)
        } else if args.open {
            Some(false)
        } else {
            None
        },
        until,
        tora_m: length_m("tora", &args.tora)?,
        toda_m: length_m("toda", &args.toda)?,
        asda_m: length_m("asda", &args.asda)?,
        lda_m: length_m("lda", &args.lda)?,
        condition,
        in_use: args.in_use.then_some(true),
        note: args.note.clone().unwrap_or_default(),
        set_by: args.by.clone().unwrap_or_default(),
    };
    let path = dir.join("runway-state").join(format!("{date}.json"));
    let mut state = match std::fs::read_to_string(&path) {
        Ok(text) => serde_json::from_str::<RunwayStateFile>(&text).with_context(|| {
            format!(
                "{} is not a runway state file; run `rhoboard validate --ops {}`",
                path.display(),
                dir.display()
            )
        })?,
        Err(e) if e.kind() == std::io::ErrorKind::NotFound => RunwayStateFile::new(date),
        Err(e) => return Err(e).with_context(|| format!("reading {}", path.display())),
    };
    let changes = entry.closed.is_some()
        || entry.tora_m.is_some()
        || entry.toda_m.is_some()
        || entry.asda_m.is_some()
        || entry.lda_m.is_some()
        || entry.condition.is_some()
        || entry.in_use.is_some();
    if changes {
        state.entries.push(entry);
        let text = serde_json::to_string_pretty(&state)? + "\n";
        write_atomically(&path, &text)?;
        writeln!(out, "Saved in {}.", path.display())?;
    }
    match state.end(&field.id, &end.designator) {
        Some(s) => writeln!(
            out,
            "{} {} on {date}: {}{}",
            field.id,
            end.designator,
            crate::assess::model::describe(&s),
            if state.in_use(&field.id).as_deref() == Some(end.designator.as_str()) {
                "; in use"
            } else {
                ""
            }
        )?,
        None => writeln!(
            out,
            "{} {} on {date}: as declared (no change for the day)",
            field.id, end.designator
        )?,
    }
    Ok(Outcome::Success)
}
