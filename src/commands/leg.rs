//! `rhoboard leg set LEG …`: re-plan one leg from the command line — see the new
//! assessment beside the old, then (without `--dry-run`) save the day's legs file safely.

use std::io::Write;
use std::path::PathBuf;

use anyhow::{Context as _, bail};
use chrono::{DateTime, NaiveTime, Utc};

use crate::assess::{Context, DaySettings, LegResult, Model, assess_leg};
use crate::commands::Outcome;
use crate::commands::check::{
    headroom_text, leg_json, load, unknown_aircraft, unknown_airfield, unknown_leg,
};
use crate::display::Show;
use crate::ops::config::{self, Choice};
use crate::ops::legs::LegsFile;
use crate::replan::{self, Edit, Saved};
use crate::units;

/// `rhoboard leg …`.
#[derive(Debug, Clone, clap::Args)]
pub struct Args {
    /// What to do.
    #[command(subcommand)]
    pub action: Action,
}

/// Leg actions.
#[derive(Debug, Clone, clap::Subcommand)]
pub enum Action {
    /// Change a leg and see it re-assessed; saves unless --dry-run.
    Set(SetArgs),
}

/// Arguments of `rhoboard leg set`.
#[derive(Debug, Clone, clap::Args)]
pub struct SetArgs {
    /// The leg id, e.g. L16.
    pub leg: String,
    /// Another aircraft (registration).
    #[arg(long, value_name = "REG")]
    pub aircraft: Option<String>,
    /// Another departure time: `08:00Z` on the leg's day, or RFC 3339. The duration is kept.
    #[arg(long, value_name = "TIME")]
    pub etd: Option<String>,
    /// Another departure airfield.
    #[arg(long, value_name = "FIELD")]
    pub from: Option<String>,
    /// Another destination.
    #[arg(long, value_name = "FIELD")]
    pub to: Option<String>,
    /// Another pilot id.
    #[arg(long, value_name = "ID")]
    pub pilot: Option<String>,
    /// Load a station: `STATION=MASS` (e.g. baggage=15kg) or `STATION=Nadults`.
    #[arg(long, value_name = "STATION=LOAD")]
    pub load: Vec<String>,
    /// Empty a station.
    #[arg(long, value_name = "STATION")]
    pub unload: Vec<String>,
    /// Fuel at engine start, e.g. 120L or 32usgal.
    #[arg(long, value_name = "VOLUME")]
    pub fuel: Option<String>,
    /// A fixed takeoff mass, for a leg that gives no loads, e.g. 1450kg.
    #[arg(long, value_name = "MASS")]
    pub takeoff_mass: Option<String>,
    /// Show the re-assessment, write nothing.
    #[arg(long)]
    pub dry_run: bool,
    /// Print the before/after assessment, warnings and what was saved as JSON.
    #[arg(long)]
    pub json: bool,
    /// The operator folder (default: the configured one, else the built-in demo).
    #[arg(long, value_name = "DIR")]
    pub ops: Option<PathBuf>,
    /// Reference time for the assessment (as for `check`).
    #[arg(long, value_name = "TIME")]
    pub at: Option<String>,
}

fn parse_load(text: &str) -> anyhow::Result<Edit> {
    let (station, load) = text.split_once('=').ok_or_else(|| {
        anyhow::anyhow!(
            "--load '{text}': expected STATION=MASS or STATION=Nadults, e.g. baggage=15kg"
        )
    })?;
    if let Some(n) = load
        .strip_suffix("adults")
        .or_else(|| load.strip_suffix("adult"))
    {
        let adults: u32 = n
            .trim()
            .parse()
            .map_err(|_| anyhow::anyhow!("--load '{text}': '{n}' is not a number of adults"))?;
        return Ok(Edit::Load {
            station: station.to_string(),
            mass_kg: None,
            adults,
        });
    }
    let kg = units::parse_mass_kg(load).map_err(|e| anyhow::anyhow!("--load {e}"))?;
    Ok(Edit::Load {
        station: station.to_string(),
        mass_kg: Some(kg),
        adults: 0,
    })
}

fn summary(r: &LegResult, show: Show) -> String {
    format!(
        "{} {}, headroom {}",
        r.state,
        // `XHIG density altitude -9 ft`; a hard limit names only the check.
        show.limiting_words(r),
        headroom_text(r, show)
    )
}

/// Runs `rhoboard leg`.
pub fn run(args: &Args, out: &mut dyn Write) -> anyhow::Result<Outcome> {
    let Action::Set(a) = &args.action;
    let loaded = load(a.ops.as_deref(), &[], a.at.as_deref(), Utc::now())?;
    let mut ops = loaded.ops;
    let index = ops
        .legs
        .iter()
        .position(|l| l.id == a.leg)
        .ok_or_else(|| anyhow::anyhow!("{}", unknown_leg(&ops, &a.leg, loaded.at)))?;
    let day = ops.legs[index].departs_utc().date_naive();
    let mut edits = Vec::new();
    if let Some(r) = &a.aircraft {
        if ops.aircraft(r).is_none() {
            bail!("--aircraft '{r}': {}", unknown_aircraft(&ops, r));
        }
        edits.push(Edit::Aircraft(r.clone()));
    }
    if let Some(t) = &a.etd {
        let when = match DateTime::parse_from_rfc3339(t) {
            Ok(t) => t.with_timezone(&Utc),
            Err(_) => {
                let hm = t.trim_end_matches(['Z', 'z']);
                let time = NaiveTime::parse_from_str(hm, "%H:%M")
                    .or_else(|_| NaiveTime::parse_from_str(hm, "%H%M"))
                    .map_err(|_| {
                        anyhow::anyhow!("--etd '{t}': expected 08:00Z or an RFC 3339 time")
                    })?;
                day.and_time(time).and_utc()
            }
        };
        edits.push(Edit::Departs(when.fixed_offset()));
    }
    for (flag, v, make) in [
        ("from", &a.from, Edit::From as fn(String) -> Edit),
        ("to", &a.to, Edit::To as fn(String) -> Edit),
    ] {
        if let Some(f) = v {
            if ops.airfield(f).is_none() {
                bail!("--{flag}: {}", unknown_airfield(&ops, f));
            }
            edits.push(make(f.clone()));
        }
    }
    if let Some(p) = &a.pilot {
        if ops.pilot(p).is_none() {
            bail!(
                "--pilot '{p}': not in pilots.json{}",
                crate::ops::validate::suggestion(p, ops.pilots.iter().map(|x| x.id.as_str()))
            );
        }
        edits.push(Edit::Pilot(p.clone()));
    }
    for l in &a.load {
        edits.push(parse_load(l)?);
    }
    for s in &a.unload {
        edits.push(Edit::Unload(s.clone()));
    }
    if let Some(f) = &a.fuel {
        edits.push(Edit::FuelL(
            units::parse_volume_l(f).map_err(|e| anyhow::anyhow!("--fuel {e}"))?,
        ));
    }
    if let Some(m) = &a.takeoff_mass {
        edits.push(Edit::TakeoffMass(
            units::parse_mass_kg(m).map_err(|e| anyhow::anyhow!("--takeoff-mass {e}"))?,
        ));
    }
    if edits.is_empty() {
        bail!(
            "nothing to change: give --aircraft, --etd, --from, --to, --pilot, --load, --unload, --fuel or --takeoff-mass"
        );
    }

    let before = {
        let model = Model::new(&ops, &DaySettings::for_date(&ops, day));
        let ctx = Context {
            ops: &ops,
            model: &model,
            store: &loaded.store,
            at: loaded.at,
        };
        assess_leg(&ctx, index).context("assessing the leg")?
    };
    let mut leg = ops.legs[index].clone();
    for e in &edits {
        replan::apply(&mut leg, e)?;
    }
    // What `validate` would call an error is never written (nor shown as a plan); its
    // new warnings go to standard error and into the JSON.
    let vetting = replan::vet(&ops, index, &leg);
    if !vetting.allowed() {
        bail!(
            "leg {} not changed:\n{}",
            a.leg,
            vetting
                .refusals
                .iter()
                .map(|r| format!("  - {r}"))
                .collect::<Vec<_>>()
                .join("\n")
        );
    }
    for w in &vetting.warnings {
        eprintln!("rhoboard: warning: {w}");
    }
    // A departure moved to a time already past on the assessment's clock, as the
    // board's what-if warns.
    // Not for a leg of another day assessed without --at (a folder planned ahead, or
    // the demo's day): "now" is then no clock for it.
    let same_day = leg.departs_utc().date_naive() == loaded.at.date_naive();
    if a.etd.is_some() && leg.departs_utc() < loaded.at && (a.at.is_some() || same_day) {
        eprintln!(
            "rhoboard: warning: the new departure {} is before the assessment's time {} (--at, default now): the leg would already have left",
            leg.departs_utc().format("%Y-%m-%d %H%MZ"),
            loaded.at.format("%Y-%m-%d %H%MZ")
        );
    }
    ops.legs[index] = leg.clone();
    let after = {
        let model = Model::new(&ops, &DaySettings::for_date(&ops, day));
        let ctx = Context {
            ops: &ops,
            model: &model,
            store: &loaded.store,
            at: loaded.at,
        };
        assess_leg(&ctx, index).context("assessing the changed leg")?
    };
    let outcome = if after.state.meets_minimums() {
        Outcome::Success
    } else {
        Outcome::Findings
    };
    let mut json = a.json.then(|| {
        serde_json::json!({
            "leg": a.leg,
            "at": loaded.at.to_rfc3339(),
            "before": leg_json(&ops, &before),
            "after": leg_json(&ops, &after),
            "warnings": vetting.warnings,
            "dry_run": a.dry_run,
            "saved": serde_json::Value::Null,
        })
    });
    if let Some(j) = &json
        && a.dry_run
    {
        writeln!(out, "{}", serde_json::to_string_pretty(j)?)?;
        return Ok(outcome);
    }
    if json.is_some() {
        // Printed once the save is known.
    } else {
        print_plain(a, day, &loaded.at, &before, &after, Show::of(&ops), out)?;
    }
    if a.dry_run {
        writeln!(out, "Dry run: nothing written.")?;
        return Ok(outcome);
    }
    let choice = config::choose(a.ops.as_deref(), config::config_file().as_deref());
    let dir = match choice {
        Choice::Explicit(d) | Choice::Configured(d) => d,
        Choice::Demo => bail!(
            "the built-in demo has no legs file to change; use --dry-run, or write a folder with `rhoboard init DIR` and pass --ops DIR"
        ),
    };
    let (rel, _) = ops
        .leg_files
        .get(index)
        .cloned()
        .context("the leg's file is not known")?;
    let path = dir.join(&rel);
    let text =
        std::fs::read_to_string(&path).with_context(|| format!("reading {}", path.display()))?;
    // The file as loaded: its hash is what a save must still find on disk.
    let mut file: LegsFile =
        serde_json::from_str(&text).with_context(|| format!("reading {}", path.display()))?;
    let hash = replan::content_hash(&text);
    let Some(slot) = file.legs.iter_mut().find(|l| l.id == a.leg) else {
        bail!("{} no longer holds leg {}", path.display(), a.leg);
    };
    *slot = leg;
    let line = match replan::save_legs(&path, &hash, &file)
        .with_context(|| format!("saving {}", path.display()))?
    {
        Saved::Written { backup, .. } => {
            if let Some(j) = &mut json {
                j["saved"] = serde_json::json!({
                    "file": path.display().to_string(),
                    "backup": backup.display().to_string(),
                });
            }
            format!(
                "Saved {} (previous version kept as {}).",
                path.display(),
                backup.display()
            )
        }
        Saved::Unchanged => format!("{} already holds this; nothing written.", path.display()),
        Saved::Conflict { .. } => bail!(
            "{} changed on disk while this ran; nothing was written — run the command again",
            path.display()
        ),
    };
    match &json {
        Some(j) => writeln!(out, "{}", serde_json::to_string_pretty(j)?)?,
        None => writeln!(out, "{line}")?,
    }
    Ok(outcome)
}

/// The readable before/after of `leg set`.
fn print_plain(
    a: &SetArgs,
    day: chrono::NaiveDate,
    at: &DateTime<Utc>,
    before: &LegResult,
    after: &LegResult,
    show: Show,
    out: &mut dyn Write,
) -> anyhow::Result<()> {
    if day == at.date_naive() {
        writeln!(out, "{} as of {}:", a.leg, at.format("%Y-%m-%d %H%MZ"))?;
    } else {
        // A leg on another day than the assessment's (no --at): say both.
        writeln!(
            out,
            "{} of {day}, assessed on the reports known at {} (--at for another time):",
            a.leg,
            at.format("%Y-%m-%d %H%MZ")
        )?;
    }
    writeln!(out, "  before: {}", summary(before, show))?;
    writeln!(out, "  after:  {}", summary(after, show))?;
    if let Some(p) = &after.payload_headroom {
        // Rounded the safe way in the display unit: room down, what must come off up.
        let (room, mass) = show.payload(p.kg);
        let word = if room { "room for" } else { "remove" };
        writeln!(out, "  payload: {word} {mass} at {}", p.station)?;
    }
    for why in show.reasons(after) {
        writeln!(out, "    - {why}")?;
    }
    writeln!(out, "{}", crate::CAUTION)?;
    Ok(())
}
