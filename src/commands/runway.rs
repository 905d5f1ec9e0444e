//! `rhoboard runway FIELD END …`: today's runway state — a closure, reduced declared
//! distances, the surface condition, the end in use — kept in the operator folder as
//! `runway-state/<date>.json`. With no change given, prints the day's state of that end.

use std::io::Write;
use std::path::{Path, PathBuf};

use anyhow::{Context as _, bail};
use chrono::{DateTime, DurationRound, NaiveDate, NaiveTime, Utc};

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
    /// Close the end (from `--from`, else the day's start; until `--until`, else all day).
    #[arg(long, conflicts_with = "open")]
    pub closed: bool,
    /// Open it again.
    #[arg(long)]
    pub open: bool,
    /// The change holds from this time: `13:00Z` on the day, or RFC 3339 (none: the whole
    /// day). Legs before it keep the state they flew in (give it for a change made during
    /// the day, so the morning's flown legs are not re-graded).
    #[arg(long, value_name = "TIME")]
    pub from: Option<String>,
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
    /// Make this the end in use (from --from, else the whole day).
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

fn length_m(flag: &str, text: Option<&str>) -> anyhow::Result<Option<f64>> {
    match text.map(str::trim).filter(|t| !t.is_empty()) {
        None => Ok(None),
        Some(t) => {
            let m = units::parse_length(t)
                .map_err(|e| anyhow::anyhow!("{flag} {e}"))?
                .m();
            if !(m > 0.0 && m < 10_000.0) {
                bail!("{flag} '{t}' is outside 0 to 10,000 m");
            }
            Ok(Some(m))
        }
    }
}

fn parse_until(flag: &str, text: &str, date: NaiveDate) -> anyhow::Result<DateTime<Utc>> {
    if let Ok(t) = DateTime::parse_from_rfc3339(text) {
        return Ok(t.with_timezone(&Utc));
    }
    let hm = text.trim_end_matches(['Z', 'z']);
    let time = NaiveTime::parse_from_str(hm, "%H:%M")
        .or_else(|_| NaiveTime::parse_from_str(hm, "%H%M"))
        .map_err(|_| {
            anyhow::anyhow!(
                "{flag} '{text}': expected a UTC time such as 18:00Z or an RFC 3339 time"
            )
        })?;
    Ok(date.and_time(time).and_utc())
}

/// One change to one runway end as typed — the command's flags or the board's form.
#[derive(Debug, Clone, Default, PartialEq)]
pub struct Request {
    /// `Some(true)` closes the end, `Some(false)` opens it again.
    pub closed: Option<bool>,
    /// When the closure starts (`13:00Z`, `1300` or RFC 3339); none: the day's start.
    pub from: Option<String>,
    /// When the closure ends (`18:00Z`, `1800` or RFC 3339).
    pub until: Option<String>,
    /// Reduced take-off run available (`900m`, `2950ft`).
    pub tora: Option<String>,
    /// Reduced take-off distance available.
    pub toda: Option<String>,
    /// Reduced accelerate-stop distance available.
    pub asda: Option<String>,
    /// Reduced landing distance available.
    pub lda: Option<String>,
    /// Surface condition word: dry, wet, soft, long-grass, water.
    pub condition: Option<String>,
    /// Make the end the one in use (from its start, else the whole day).
    pub in_use: bool,
    /// Why.
    pub note: String,
    /// Who sets it.
    pub by: String,
}

/// How a [`Request`]'s inputs are named in messages: the command's flags (`--tora`)
/// or the board form's labels (`TORA`).
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum Names {
    /// `--tora`, `--until`, `--condition`.
    Flags,
    /// `TORA`, `until`, `condition`.
    Labels,
}

impl Names {
    fn of(self, flag: &'static str) -> String {
        match self {
            Names::Flags => format!("--{flag}"),
            Names::Labels => match flag {
                "tora" | "toda" | "asda" | "lda" => flag.to_ascii_uppercase(),
                other => other.to_string(),
            },
        }
    }
}

/// Checks a request against the operator's airfields and builds the entry for
/// `date`: the airfield and end must exist, lengths carry a unit, grass conditions
/// need grass, `until` goes with closing.
pub fn entry(
    ops: &crate::ops::Ops,
    field: &str,
    end: &str,
    date: NaiveDate,
    req: &Request,
    names: Names,
) -> anyhow::Result<EndState> {
    let field = ops.airfield(field.trim()).ok_or_else(|| {
        let id = field.trim();
        match names {
            Names::Flags => {
                anyhow::anyhow!("{}", crate::commands::check::unknown_airfield(ops, id))
            }
            Names::Labels => {
                let known: Vec<&str> = ops.airfields.iter().map(|a| a.id.as_str()).collect();
                anyhow::anyhow!(
                    "unknown airfield '{id}' (the operator's: {})",
                    known.join(", ")
                )
            }
        }
    })?;
    let Some(end) = field
        .runway_ends
        .iter()
        .find(|e| e.designator == end.trim())
    else {
        let known: Vec<&str> = field
            .runway_ends
            .iter()
            .map(|e| e.designator.as_str())
            .collect();
        bail!(
            "{} has no runway end '{}' (it has: {})",
            field.id,
            end.trim(),
            known.join(", ")
        );
    };
    let condition = match req
        .condition
        .as_deref()
        .map(str::trim)
        .filter(|c| !c.is_empty())
    {
        None => None,
        Some(c) => {
            let flag = names.of("condition");
            let typed = c;
            let c = DayCondition::parse(c).ok_or_else(|| {
                anyhow::anyhow!("{flag} '{c}': expected dry, wet, soft, long-grass or water")
            })?;
            if end.surface == Surface::Paved
                && matches!(c, DayCondition::SoftGround | DayCondition::LongGrass)
            {
                // Quoted as typed, with what it means.
                bail!(
                    "{flag} '{typed}' ({}) is for grass; {} {} is paved",
                    c.word(),
                    field.id,
                    end.designator
                );
            }
            Some(c)
        }
    };
    let until = req
        .until
        .as_deref()
        .map(str::trim)
        .filter(|u| !u.is_empty())
        .map(|u| parse_until(&names.of("until"), u, date))
        .transpose()?;
    if until.is_some() && req.closed != Some(true) {
        bail!("{} goes with {}", names.of("until"), names.of("closed"));
    }
    let from = req
        .from
        .as_deref()
        .map(str::trim)
        .filter(|f| !f.is_empty())
        .map(|f| parse_until(&names.of("from"), f, date))
        .transpose()?;
    // A day's runway state holds for its own UTC day: times on it (until may be the
    // midnight that ends it).
    let start = date.and_time(NaiveTime::MIN).and_utc();
    let day_end = start + chrono::TimeDelta::days(1);
    for (name, t) in [("from", from), ("until", until)] {
        if let Some(t) = t
            && (t < start || t > day_end || (name == "from" && t == day_end))
        {
            bail!(
                "{} {} is not on {date}: a day's runway state holds for its own UTC day",
                names.of(name),
                t.format("%Y-%m-%d %H%MZ")
            );
        }
    }
    if let (Some(f), Some(u)) = (from, until)
        && f >= u
    {
        bail!(
            "{} {} is not before {} {}: the closure would never start",
            names.of("from"),
            f.format("%H%MZ"),
            names.of("until"),
            u.format("%H%MZ")
        );
    }
    let reduced = |name: &'static str,
                   text: Option<&str>,
                   declared: f64|
     -> anyhow::Result<Option<f64>> {
        let flag = names.of(name);
        let v = length_m(&flag, text)?;
        if let Some(m) = v
            && m > declared + 0.5
        {
            bail!(
                "{flag} {m:.0} m is more than the declared {declared:.0} m of {} {}; a day's state only reduces distances",
                field.id,
                end.designator
            );
        }
        Ok(v)
    };
    Ok(EndState {
        airfield: field.id.clone(),
        end: end.designator.clone(),
        closed: req.closed,
        from,
        until,
        tora_m: reduced("tora", req.tora.as_deref(), end.tora_m)?,
        toda_m: reduced("toda", req.toda.as_deref(), end.toda_m)?,
        asda_m: reduced("asda", req.asda.as_deref(), end.asda_m)?,
        lda_m: reduced("lda", req.lda.as_deref(), end.lda_m)?,
        condition,
        in_use: req.in_use.then_some(true),
        note: req.note.trim().to_string(),
        set_by: req.by.trim().to_string(),
    })
}

/// Whether an entry changes anything (a note alone does not).
pub fn changes_something(e: &EndState) -> bool {
    e.closed.is_some()
        || e.tora_m.is_some()
        || e.toda_m.is_some()
        || e.asda_m.is_some()
        || e.lda_m.is_some()
        || e.condition.is_some()
        || e.in_use.is_some()
}

/// `DIR/runway-state/<date>.json`.
pub fn state_path(dir: &Path, date: NaiveDate) -> PathBuf {
    dir.join("runway-state").join(format!("{date}.json"))
}

/// The day's state file as it is in the folder now (empty when there is none).
pub fn read_state(dir: &Path, date: NaiveDate) -> anyhow::Result<RunwayStateFile> {
    let path = state_path(dir, date);
    match std::fs::read_to_string(&path) {
        Ok(text) => serde_json::from_str::<RunwayStateFile>(&text).with_context(|| {
            format!(
                "{} is not a runway state file; run `rhoboard validate --ops {}`",
                path.display(),
                dir.display()
            )
        }),
        Err(e) if e.kind() == std::io::ErrorKind::NotFound => Ok(RunwayStateFile::new(date)),
        Err(e) => Err(e).with_context(|| format!("reading {}", path.display())),
    }
}

/// Appends `entry` to the day's state in `dir` (read afresh, so changes made meanwhile
/// by someone else are kept) and writes it atomically; returns the path and the new state.
pub fn append_entry(
    dir: &Path,
    date: NaiveDate,
    entry: EndState,
) -> anyhow::Result<(PathBuf, RunwayStateFile)> {
    let path = state_path(dir, date);
    let mut state = read_state(dir, date)?;
    state.entries.push(entry);
    let text = serde_json::to_string_pretty(&state)? + "\n";
    write_atomically(&path, &text)?;
    Ok((path, state))
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

/// Without `--date` the state is today's: where the folder has no legs today but has
/// some on other days (a folder planned ahead, or the demo's day), say so, so that a
/// closure does not silently miss the day it was meant for.
fn warn_if_no_legs_that_day(ops: &crate::ops::Ops, date: NaiveDate) {
    let days = ops.leg_days();
    if days.is_empty() || days.contains(&date) {
        return;
    }
    let list: Vec<String> = days.iter().take(3).map(ToString::to_string).collect();
    let more = if days.len() > 3 { ", …" } else { "" };
    eprintln!(
        "rhoboard: note: dated today, {date} (UTC); this folder has no legs that day. Its legs are on {}{more}: --date {} for that day.",
        list.join(", "),
        days[0]
    );
}

/// Runs `rhoboard runway`.
/// `" (closed that day: 27)"`: the field's ends a closure names, for a message about
/// opening the wrong one; empty when none is.
pub fn closed_elsewhere(ops: &crate::ops::Ops, state: &RunwayStateFile, field: &str) -> String {
    let closed: Vec<&str> = ops
        .airfields
        .iter()
        .find(|a| a.id == field)
        .map(|a| {
            a.runway_ends
                .iter()
                .map(|e| e.designator.as_str())
                .filter(|d| state.end(field, d).is_some_and(|s| s.closed == Some(true)))
                .collect()
        })
        .unwrap_or_default();
    if closed.is_empty() {
        String::new()
    } else {
        format!(" (closed that day: {})", closed.join(", "))
    }
}

/// Why opening `field end` from `at` (`None`: the day's start) is refused, if it is:
/// the end is not closed then. An opening is written after the closures, so it would
/// win over one that starts later and cancel it unseen; one from that closure's start
/// on ends it as meant. `None` when the end is closed at `at`.
pub fn open_refusal(
    ops: &crate::ops::Ops,
    state: &RunwayStateFile,
    field: &str,
    end: &str,
    at: Option<DateTime<Utc>>,
) -> Option<String> {
    let then = state.as_of(at).end(field, end);
    let closed_then = then.is_some_and(|s| {
        s.closed == Some(true) && s.until.is_none_or(|u| at.is_none_or(|t| t < u))
    });
    if closed_then {
        return None;
    }
    let when = at.map_or(format!("at the start of {}", state.date), |t| {
        format!("at {}", t.format("%H%MZ"))
    });
    let later = state
        .entries
        .iter()
        .filter(|e| e.airfield == field && e.end == end && e.closed == Some(true))
        .filter_map(|e| e.from)
        .filter(|f| at.is_none_or(|t| *f > t))
        .min();
    Some(match later {
        Some(f) => format!(
            "{field} {end} is not closed {when}: its closure starts at {}, and opening it earlier would cancel that closure; to end the closure, open it from {} or later (--from {})",
            f.format("%H%MZ"),
            f.format("%H%MZ"),
            f.format("%H:%MZ")
        ),
        None => format!(
            "{field} {end} is not closed {when}, so there is nothing to open{}",
            closed_elsewhere(ops, state, field)
        ),
    })
}

/// One end's state through the day, as the assessment reads it at each time: from the
/// day's start, then from each change's start where it differs. One line when it holds
/// all day (`XSEA 27 on 2026-06-14: closed until 1500Z (works)`), else a line per time.
fn write_through_the_day(
    state: &RunwayStateFile,
    field: &str,
    end: &str,
    date: NaiveDate,
    out: &mut dyn Write,
) -> anyhow::Result<()> {
    let words = |at: Option<DateTime<Utc>>| {
        let said = state
            .as_of(at)
            .end(field, end)
            .map(|mut s| {
                // A closure whose window has ended by `at` no longer says anything.
                if s.closed == Some(true) && s.until.is_some_and(|u| at.is_some_and(|t| t >= u)) {
                    s.closed = None;
                    s.from = None;
                    s.until = None;
                    s.note.clear();
                }
                crate::assess::model::describe(&s)
            })
            .unwrap_or_default();
        // Nothing in words (a note alone): as declared, never an empty line.
        if said.is_empty() {
            "as declared".to_string()
        } else {
            said
        }
    };
    // Each change's start, and each closure's end.
    let mut starts: Vec<DateTime<Utc>> = state
        .entries
        .iter()
        .filter(|e| e.airfield == field && e.end == end)
        .flat_map(|e| [e.from, e.until.filter(|_| e.closed == Some(true))])
        .flatten()
        .collect();
    starts.sort_unstable();
    starts.dedup();
    let mut segments: Vec<(Option<DateTime<Utc>>, String)> = vec![(None, words(None))];
    for t in starts {
        let said = words(Some(t));
        if segments.last().is_none_or(|(_, s)| *s != said) {
            segments.push((Some(t), said));
        }
    }
    if let [(_, said)] = &segments[..] {
        let said = if state
            .entries
            .iter()
            .any(|e| e.airfield == field && e.end == end)
        {
            said.clone()
        } else {
            "as declared (no change for the day)".to_string()
        };
        writeln!(out, "{field} {end} on {date}: {said}")?;
        return Ok(());
    }
    writeln!(out, "{field} {end} on {date}, through the day:")?;
    for (at, said) in segments {
        let when = at.map_or("from the day's start".to_string(), |t| {
            format!("from {}", t.format("%H%MZ"))
        });
        writeln!(out, "  {when}: {said}")?;
    }
    Ok(())
}

pub fn run(args: &Args, out: &mut dyn Write) -> anyhow::Result<Outcome> {
    let choice = config::choose(args.ops.as_deref(), config::config_file().as_deref());
    let dir = match &choice {
        Choice::Explicit(d) | Choice::Configured(d) => d.clone(),
        Choice::Demo => bail!(
            "the built-in demo has no operator folder to keep a runway state in; write one with `rhoboard init DIR` and pass --ops DIR"
        ),
    };
    let ops = config::load_for_use(&choice)?;
    let date = match &args.date {
        Some(d) => NaiveDate::parse_from_str(d, "%Y-%m-%d")
            .map_err(|_| anyhow::anyhow!("--date '{d}': expected YYYY-MM-DD"))?,
        None => Utc::now().date_naive(),
    };
    let req = Request {
        closed: if args.closed {
            Some(true)
        } else if args.open {
            Some(false)
        } else {
            None
        },
        from: args.from.clone(),
        until: args.until.clone(),
        tora: args.tora.clone(),
        toda: args.toda.clone(),
        asda: args.asda.clone(),
        lda: args.lda.clone(),
        condition: args.condition.clone(),
        in_use: args.in_use,
        note: args.note.clone().unwrap_or_default(),
        by: args.by.clone().unwrap_or_default(),
    };
    let entry = entry(&ops, &args.field, &args.end, date, &req, Names::Flags)?;
    // Opened again on today's date with no --from: from now, so the legs flown under
    // the closure keep it (and whatever else the same entry sets starts then too).
    let today = Utc::now();
    let mut entry = entry;
    if entry.closed == Some(false) && entry.from.is_none() && today.date_naive() == date {
        entry.from = Some(
            today
                .duration_trunc(chrono::TimeDelta::minutes(1))
                .unwrap_or(today),
        );
    }
    // A closure over one already written: said, since the later one wins where both
    // hold (its window replaces the earlier one's from its start).
    if entry.closed == Some(true) {
        let before = read_state(&dir, date)?;
        if let Some(s) = before
            .end(&entry.airfield, &entry.end)
            .filter(|s| s.closed == Some(true))
        {
            eprintln!(
                "rhoboard: note: {} {} already has a closure that day ({}); this one is written after it and wins where both hold",
                entry.airfield,
                entry.end,
                crate::assess::model::describe(&s)
            );
        }
    }
    // Opening an end that is not closed then (the wrong end, a second time, or before a
    // closure set to start later, which it would cancel) saves nothing.
    if entry.closed == Some(false) {
        let before = read_state(&dir, date)?;
        if let Some(why) = open_refusal(&ops, &before, &entry.airfield, &entry.end, entry.from) {
            bail!("{why}; nothing was saved");
        }
    }
    if changes_something(&entry) && entry.from.is_none() {
        let what = match (entry.closed, entry.until) {
            (Some(true), Some(u)) => format!(
                "this closure holds from the start of {date} until {}",
                u.format("%H%MZ")
            ),
            (Some(true), None) => format!("this closure holds for the whole of {date}"),
            _ => format!("this holds for the whole of {date}"),
        };
        eprintln!(
            "rhoboard: note: with no --from, {what}: the legs already flown that day are graded with it too (--from HH:MMZ starts it then)"
        );
    }
    if args.date.is_none() {
        warn_if_no_legs_that_day(&ops, date);
    }
    let (field, end) = (entry.airfield.clone(), entry.end.clone());
    let state = if changes_something(&entry) {
        let (path, state) = append_entry(&dir, date, entry)?;
        writeln!(out, "Saved in {}.", path.display())?;
        state
    } else {
        read_state(&dir, date)?
    };
    write_through_the_day(&state, &field, &end, date, out)?;
    Ok(Outcome::Success)
}
